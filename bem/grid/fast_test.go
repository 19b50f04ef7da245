package grid

import (
	"math"
	"testing"

	"github.com/rimfield/rimfield/geom"
	"github.com/rimfield/rimfield/mesh"
	"gonum.org/v1/gonum/spatial/r2"
)

// Sample goes through fast multipole trees over the grid's points; every
// sample must be Eval's at the same point: the same mask and region, the
// same potential and gradient, beside the boundary too (a fine grid over a
// seepage section with insulated sides, where the potential's linear part
// along the boundary enters, and over an anisotropic one; the off-centre
// coax). Relative to the largest |u| and |grad u| of the grid: observed at
// most 1.3e-14 and 5.9e-11; required 1e-9 (the trees run at 1e-10).
func TestSampleMatchesEval(t *testing.T) {
	aniso := rectScene(3, 1, 1)
	aniso.Regions[0].Material = gmat(4, 1)
	for _, c := range []struct {
		name string
		sc   *geom.Scene
	}{{"rect", rectScene(3, 1, 2e-4)}, {"anisotropic", aniso}, {"coax", coaxScene(0.5, 2, 0.8, 256)}} {
		sol := solve(t, c.sc, mesh.Options{})
		w := Auto(sol.Mesh)
		g := Sample(sol, w, 120, 90, Options{})
		var eu, eg, mu, mg float64
		n := 0
		near := nearDistance(sol, 0)
		segs := newSegments(sol)
		for j := range g.NY {
			for i := range g.NX {
				k := g.Index(i, j)
				p := g.Point(i, j)
				want := sol.Eval(p)
				if want.Region == geom.Outside || segs.within(p, near) {
					if !math.IsNaN(g.U[k]) || g.Region[k] != geom.Outside {
						t.Errorf("%s: sample %v is %g in region %d, want masked", c.name, p, g.U[k], g.Region[k])
					}
					continue
				}
				if g.Region[k] != want.Region {
					t.Errorf("%s: sample %v in region %d, Eval %d", c.name, p, g.Region[k], want.Region)
					continue
				}
				n++
				eu, mu = math.Max(eu, math.Abs(g.U[k]-want.U)), math.Max(mu, math.Abs(want.U))
				eg, mg = math.Max(eg, r2.Norm(r2.Sub(g.Grad[k], want.Grad))), math.Max(mg, r2.Norm(want.Grad))
			}
		}
		t.Logf("%s: %d samples in the domain: u within %.2g, grad within %.2g", c.name, n, eu/mu, eg/mg)
		if n == 0 || eu > 1e-9*mu || eg > 1e-9*mg {
			t.Errorf("%s: %d samples, Sample differs from Eval by %.3g (u) and %.3g (grad)", c.name, n, eu/mu, eg/mg)
		}
	}
}
