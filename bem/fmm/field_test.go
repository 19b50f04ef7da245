package fmm

import (
	"fmt"
	"math"
	"testing"

	"gonum.org/v1/gonum/spatial/r2"
)

// Field.At plus the exact near field of the panels it hands back, against
// the direct sum (exactPanel over every pair, point sources exactly), on
// the random, corner-graded and thin scenes with their densities (single,
// double and point), at the scenes' targets and at points off them. Each
// error relative to the largest value. Observed at most 3.6e-10 / 2.5e-10
// (potential, gradient) at Tol 1e-6 and 3.3e-14 / 2.4e-14 at 1e-10 (each
// point's own acceptance test is stricter than a target leaf's); required
// Tol.
func TestFieldMatchesDirect(t *testing.T) {
	for _, s := range testScenes() {
		for _, tol := range []float64{1e-6, 1e-10} {
			t.Run(fmt.Sprintf("%s/tol=%g", s.name, tol), func(t *testing.T) {
				tr, err := New(s.panels, s.points, nil, &Options{Tol: tol})
				if err != nil {
					t.Fatal(err)
				}
				f := tr.Field(s.dens)
				idx := sample(len(s.targets), 300)
				var eu, eg, mu, mg float64
				for _, i := range idx {
					for _, x := range []r2.Vec{s.targets[i], r2.Add(s.targets[i], r2.Vec{X: 1.3e-3, Y: -0.7e-3})} {
						seen := map[int]bool{}
						u, g := f.At(x, true, func(j int) {
							if seen[j] {
								t.Fatalf("panel %d handed back twice", j)
							}
							seen[j] = true
						})
						for j := range seen {
							sl, dl, gsl, gdl := exactPanel(x, s.panels[j])
							sj, dj := s.dens.Single[j], s.dens.Double[j]
							u += sj*sl + dj*dl
							g = r2.Add(g, r2.Add(r2.Scale(sj, gsl), r2.Scale(dj, gdl)))
						}
						var wu float64
						var wg r2.Vec
						for j, p := range s.panels {
							sl, dl, gsl, gdl := exactPanel(x, p)
							sj, dj := s.dens.Single[j], s.dens.Double[j]
							wu += sj*sl + dj*dl
							wg = r2.Add(wg, r2.Add(r2.Scale(sj, gsl), r2.Scale(dj, gdl)))
						}
						for k, y := range s.points {
							dz := r2.Sub(x, y)
							r := r2.Norm(dz)
							if r == 0 {
								continue
							}
							q := s.dens.Point[k]
							wu += -inv2Pi * q * math.Log(r)
							wg = r2.Add(wg, r2.Scale(-inv2Pi*q/(r*r), dz))
						}
						if math.IsNaN(wg.X) {
							continue // on a panel: no gradient
						}
						eu, mu = math.Max(eu, math.Abs(u-wu)), math.Max(mu, math.Abs(wu))
						eg, mg = math.Max(eg, r2.Norm(r2.Sub(g, wg))), math.Max(mg, r2.Norm(wg))
					}
				}
				t.Logf("potential within %.2g of its largest, gradient %.2g", eu/mu, eg/mg)
				if eu > tol*mu || eg > tol*mg {
					t.Errorf("errors %.3g (potential) and %.3g (gradient) relative, above %g", eu/mu, eg/mg, tol)
				}
			})
		}
	}
}
