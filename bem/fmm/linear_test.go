package fmm

import (
	"fmt"
	"math"
	"math/cmplx"
	"math/rand/v2"
	"testing"

	"gonum.org/v1/gonum/spatial/r2"
)

// The double layer of linear density (s - L/2) on a panel, in closed form:
// with m the midpoint, tau - L/2 = (zeta - m)/e, so
//
//	int (tau - L/2)/(z - zeta) dtau = ((z - m)(-Log((z-b)/(z-a))) - (b - a))/e^2
//
// (from (zeta - m)/(z - zeta) = (z - m)/(z - zeta) - 1), w_L = -nu times it,
// u = -(1/2 pi) Re w_L and grad u = -(1/2 pi) conj(w_L').
func closedLinear(x r2.Vec, p Panel) (float64, r2.Vec) {
	z, a, b := cplx(x), cplx(p.A), cplx(p.B)
	l := cmplx.Abs(b - a)
	e := (b - a) / complex(l, 0)
	nu := -1i * e
	m := 0.5 * (a + b)
	lr := cmplx.Log((z - b) / (z - a))
	e2 := e * e
	w := -nu * ((z-m)*(-lr) - (b - a)) / e2
	dw := -nu * (-lr - (z-m)*(1/(z-b)-1/(z-a))) / e2
	return -inv2Pi * real(w), r2.Vec{X: -inv2Pi * real(dw), Y: inv2Pi * imag(dw)}
}

// gaussLinear is closedLinear by 12-point Gauss-Legendre quadrature.
func gaussLinear(x r2.Vec, p Panel) (float64, r2.Vec) {
	z, a, b := cplx(x), cplx(p.A), cplx(p.B)
	mid, h := 0.5*(a+b), 0.5*(b-a)
	hl := cmplx.Abs(h)
	nu := -1i * h / complex(hl, 0)
	var i1, i2 complex128
	for k, u := range glX {
		w := complex(glW[k]*hl*u*hl, 0)
		id := 1 / (z - (mid + complex(u, 0)*h))
		i1 += w * id
		i2 += w * id * id
	}
	wl, dwl := -nu*i1, nu*i2
	return -inv2Pi * real(wl), r2.Vec{X: -inv2Pi * real(dwl), Y: inv2Pi * imag(dwl)}
}

// Apply's far field of linear double layers, plus their near field in
// closed form, against the direct sum (quadrature for panels at least three
// lengths away, the closed form nearer), on the random, corner-graded and
// thin scenes, each error relative to the largest value of the potential
// and of the gradient. Observed at most 7.9e-10 / 5.7e-10 (potential,
// gradient) at Tol 1e-6, 1e-13 / 1.4e-13 at 1e-10 and 1e-12 (the
// expansions are sized for constant densities; a linear one's multipole
// decays one order faster); required Tol, and 1e-11 at 1e-12 (the
// rounding of the closed forms beside the corner's 1e-6 panels).
func TestLinearDensity(t *testing.T) {
	// The closed form against quadrature well away from a panel (observed
	// 2e-18 on a value of 1e-3; required 1e-15).
	pn := Panel{A: r2.Vec{X: -0.1}, B: r2.Vec{X: 0.5, Y: 0.2}}
	q, qg := gaussLinear(r2.Vec{X: 3, Y: 2.5}, pn)
	c, cg := closedLinear(r2.Vec{X: 3, Y: 2.5}, pn)
	if math.Abs(q-c) > 1e-15 || r2.Norm(r2.Sub(qg, cg)) > 1e-15 {
		t.Fatalf("closed form %.17g %v, quadrature %.17g %v", c, cg, q, qg)
	}
	rng := rand.New(rand.NewPCG(1, 1))
	for _, s := range testScenes() {
		g := make([]float64, len(s.panels))
		for j := range g {
			g[j] = rng.NormFloat64() / r2.Norm(r2.Sub(s.panels[j].B, s.panels[j].A))
		}
		idx := sample(len(s.targets), 300)
		for _, tol := range []float64{1e-6, 1e-10, 1e-12} {
			t.Run(fmt.Sprintf("%s/tol=%g", s.name, tol), func(t *testing.T) {
				tr, err := New(s.panels, nil, s.targets, &Options{Tol: tol})
				if err != nil {
					t.Fatal(err)
				}
				u := make([]float64, len(s.targets))
				gr := make([]r2.Vec, len(s.targets))
				tr.Apply(u, gr, Density{Linear: g})
				var eu, eg, mu, mg float64
				for _, i := range idx {
					x := s.targets[i]
					near := map[int32]bool{}
					for _, j := range tr.NearPanels(i) {
						near[j] = true
					}
					var wu float64
					var wg r2.Vec
					for j, p := range s.panels {
						mid := r2.Scale(0.5, r2.Add(p.A, p.B))
						var v float64
						var d r2.Vec
						if r2.Norm(r2.Sub(x, mid)) >= 3*r2.Norm(r2.Sub(p.B, p.A)) {
							v, d = gaussLinear(x, p)
						} else {
							v, d = closedLinear(x, p)
						}
						wu += g[j] * v
						wg = r2.Add(wg, r2.Scale(g[j], d))
						if near[int32(j)] {
							nv, nd := closedLinear(x, p)
							u[i] += g[j] * nv
							gr[i] = r2.Add(gr[i], r2.Scale(g[j], nd))
						}
					}
					if s.gradAt[i] {
						eg = math.Max(eg, r2.Norm(r2.Sub(gr[i], wg)))
						mg = math.Max(mg, r2.Norm(wg))
					}
					eu = math.Max(eu, math.Abs(u[i]-wu))
					mu = math.Max(mu, math.Abs(wu))
				}
				t.Logf("potential within %.2g of its largest, gradient %.2g", eu/mu, eg/mg)
				lim := math.Max(tol, 1e-11)
				if eu > lim*mu || eg > lim*mg {
					t.Errorf("linear density: errors %.3g (potential) and %.3g (gradient) relative, above %g", eu/mu, eg/mg, lim)
				}
			})
		}
	}
}
