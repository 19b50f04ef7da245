package bem

import (
	"math"
	"math/rand/v2"
	"testing"

	"gonum.org/v1/gonum/spatial/r2"
)

// samplePoints returns points spread over the bounding box of the mesh
// (margin 30 %), some of them close to panels: at 1e-3, 1e-6 and 1e-9 of a
// panel's length off its midpoint and near its ends, on both sides.
func samplePoints(c fastCase, n int) []r2.Vec {
	rng := rand.New(rand.NewPCG(1, 1))
	lo, hi := c.m.Bounds()
	ext := r2.Sub(hi, lo)
	lo = r2.Sub(lo, r2.Scale(0.3, ext))
	ext = r2.Scale(1.6, ext)
	pts := make([]r2.Vec, 0, n)
	for range n {
		pts = append(pts, r2.Vec{X: lo.X + rng.Float64()*ext.X, Y: lo.Y + rng.Float64()*ext.Y})
	}
	for j := 0; j < len(c.m.Panels); j += max(1, len(c.m.Panels)/60) {
		p := c.m.Panels[j]
		for _, f := range []float64{1e-3, 1e-6, 1e-9, -1e-3, -1e-6} {
			for _, at := range []float64{0.5, 0.02} {
				x := r2.Add(p.A, r2.Scale(at, r2.Sub(p.B, p.A)))
				pts = append(pts, r2.Add(x, r2.Scale(-f*p.Length(), p.Normal())))
			}
		}
	}
	return pts
}

// EvalMany and Field give Eval's values at every point, near the boundary
// included (the near panels' closed forms and the linear reconstruction
// along flux boundaries are Eval's), and the same region, on every case of
// the fast solver's tests. Compared relative to the largest |u| and |grad u|
// of the points (the values near the boundary and at a corner can be much
// larger than elsewhere). Observed at most 4e-14 (potential) and 7.6e-11
// (gradient, over the grounded plane) for EvalMany and Field alike; required
// 1e-9 (the products run at 1e-10).
func TestEvalManyMatchesEval(t *testing.T) {
	for _, c := range fastCases(t) {
		sys, err := Assemble(c.m, &Settings{Method: Dense, Kutta: c.kutta})
		if err != nil {
			t.Fatal(err)
		}
		d := c.data
		if d == nil {
			d = []*Data{nil}
		}
		sol, err := sys.Solve(d[len(d)-1])
		if err != nil {
			t.Fatal(err)
		}
		pts := samplePoints(c, 3000)
		many := sol.EvalMany(pts, 0)
		fld := sol.Field()
		want := make([]Point, len(pts))
		var mu, mg float64
		for i, p := range pts {
			want[i] = sol.Eval(p)
			if !math.IsNaN(want[i].U) {
				mu = math.Max(mu, math.Abs(want[i].U))
				mg = math.Max(mg, r2.Norm(want[i].Grad))
			}
		}
		check := func(name string, got func(i int) Point) {
			var eu, eg float64
			inside := 0
			for i := range pts {
				g, w := got(i), want[i]
				if g.Region != w.Region {
					t.Errorf("%s %s: point %v in region %d, Eval says %d", c.name, name, pts[i], g.Region, w.Region)
					continue
				}
				if math.IsNaN(w.U) {
					if !math.IsNaN(g.U) {
						t.Errorf("%s %s: point %v has u = %g, Eval NaN", c.name, name, pts[i], g.U)
					}
					continue
				}
				inside++
				eu = math.Max(eu, math.Abs(g.U-w.U))
				eg = math.Max(eg, r2.Norm(r2.Sub(g.Grad, w.Grad)))
			}
			t.Logf("%s %s: %d points (%d in the domain): u within %.2g, grad within %.2g", c.name, name, len(pts), inside, eu/mu, eg/mg)
			if eu > 1e-9*mu || eg > 1e-9*mg {
				t.Errorf("%s %s: differs from Eval by %.3g (u) and %.3g (grad), relative", c.name, name, eu/mu, eg/mg)
			}
		}
		check("EvalMany", func(i int) Point { return many[i] })
		check("Field", func(i int) Point { return fld.Eval(pts[i]) })
	}
}
