package bem

import (
	"errors"
	"math"
	"strings"
	"sync"
	"testing"

	"github.com/rimfield/rimfield/geom"
	"gonum.org/v1/gonum/spatial/r2"
)

// coax builds the annulus a < r < b with u = 1 on r = a and u = 0 on r = b,
// n panels on each circle (each panel one side of the polygon).
func coax(a, b float64, n int, k float64) *builder {
	bl := newBuilder(false)
	reg := bl.region("gap", k, k, false)
	in := bl.owner("inner", pot(1))
	out := bl.owner("outer", pot(0))
	// Domain on the left: the outer circle counter-clockwise, the inner clockwise.
	bl.ring(ngon(r2.Vec{}, b, n, true, 0), 1, false, reg, geom.Outside, out, pot(0))
	bl.ring(ngon(r2.Vec{}, a, n, false, 0), 1, false, reg, geom.Outside, in, pot(1))
	return bl
}

// Coaxial annulus, u=1 on r=a, u=0 on r=b: inflow through the inner circle
// 2 pi k / ln(b/a). Source: any potential-theory text (e.g. Kellogg,
// Foundations of Potential Theory, 1929). The inflow error, geometry
// (inscribed polygons) and discretisation together, must fall at least as
// h^2: observed order asserted in [1.8, 3.3] (observed 3.0: similar
// inscribed polygons keep ln(b/a) nearly exact, so only the discretisation
// shows); at 512 panels per circle the error must be below 1e-6 (observed
// 5e-8).
func TestCoaxialConvergence(t *testing.T) {
	a, b, k := 1.0, 2.0, 3.0
	want := 2 * math.Pi * k / math.Log(b/a)
	var errs []float64
	for _, n := range []int{64, 128, 256, 512} {
		sol, err := Solve(coax(a, b, n, k).mesh(), nil)
		if err != nil {
			t.Fatal(err)
		}
		res := sol.Owners()
		if r := relErr(res[0].Inflow, want); true {
			errs = append(errs, r)
		}
		// Charge balance: what enters at the inner circle leaves at the outer.
		if math.Abs(res[0].Inflow+res[1].Inflow) > 1e-9*want {
			t.Errorf("n=%d: inflows %v and %v do not balance", n, res[0].Inflow, res[1].Inflow)
		}
	}
	for i := 1; i < len(errs); i++ {
		order := math.Log2(errs[i-1] / errs[i])
		if order < 1.8 || order > 3.3 {
			t.Errorf("observed order %.3f between refinements %d and %d (errors %v)", order, i-1, i, errs)
		}
	}
	if errs[len(errs)-1] > 1e-6 {
		t.Errorf("error at 512 panels per circle %.3g, want < 1e-6", errs[len(errs)-1])
	}
	t.Logf("coax relative errors: %.3g", errs)
}

// Inside the annulus u(r) = ln(b/r)/ln(b/a) (same source); the evaluator must
// reproduce it at interior points, including one 1e-4 from the inner circle
// where a quadrature-based evaluator would fail. Tolerance 2e-4 absolute
// (the polygon's own error at 512 sides is ~2e-5; the point near the
// boundary sees the local panel's discretisation).
func TestCoaxialInterior(t *testing.T) {
	a, b := 1.0, 2.0
	sol, err := Solve(coax(a, b, 512, 1).mesh(), nil)
	if err != nil {
		t.Fatal(err)
	}
	for _, r := range []float64{1.2, 1.5, 1.9} {
		for _, th := range []float64{0.1, 2, 4} {
			p := r2.Vec{X: r * math.Cos(th), Y: r * math.Sin(th)}
			pt := sol.Eval(p)
			wantU := math.Log(b/r) / math.Log(b/a)
			wantG := -1 / (r * math.Log(b/a)) // du/dr
			if math.Abs(pt.U-wantU) > 2e-4 {
				t.Errorf("u(%v) = %v, want %v", p, pt.U, wantU)
			}
			gr := r2.Dot(pt.Grad, r2.Unit(p))
			if math.Abs(gr-wantG) > 2e-3*math.Abs(wantG) {
				t.Errorf("du/dr(%v) = %v, want %v", p, gr, wantG)
			}
			if pt.Region != 0 {
				t.Errorf("region of %v = %d", p, pt.Region)
			}
		}
	}
	if pt := sol.Eval(r2.Vec{X: 0.2}); pt.Region != geom.Outside || !math.IsNaN(pt.U) {
		t.Errorf("point inside the inner conductor: %+v", pt)
	}
}

// Degenerate scale: the first-kind log operator is singular when a
// boundary's logarithmic capacity is 1 (a circle of radius 1 m); the
// augmented formulation must stay exact there (Chen, Kao & Kuo, WIT Trans.
// Modelling & Simulation 56, 2013, from memory). Dirichlet data u = x + 2y on
// circles of radius 0.5, 1 and 2: the flux k du/dn = k (x + 2y)/R must come
// out to the same relative accuracy at every size (2e-3 with 256 panels,
// observed ~1e-4 at every radius; a singular operator gives O(1) errors).
func TestDegenerateScale(t *testing.T) {
	for _, R := range []float64{0.5, 1, 2} {
		bl := newBuilder(false)
		reg := bl.region("disc", 1, 1, false)
		// Potential varies along the boundary: one owner per panel is not
		// needed; use a flux-free trick: build Potential panels with values.
		v := ngon(r2.Vec{}, R, 256, true, 0.1)
		for i := range v {
			a, b := v[i], v[(i+1)%len(v)]
			m := r2.Scale(0.5, r2.Add(a, b))
			o := bl.owner("", pot(m.X+2*m.Y))
			bl.segment(a, b, 1, false, reg, geom.Outside, o, pot(m.X+2*m.Y))
		}
		msh := bl.mesh()
		sol, err := Solve(msh, nil)
		if err != nil {
			t.Fatalf("R=%v: %v", R, err)
		}
		worst := 0.0
		for j, p := range msh.Panels {
			n := p.Normal()
			want := n.X + 2*n.Y // grad u . n
			worst = math.Max(worst, math.Abs(sol.F[j]-want)/math.Sqrt(5))
		}
		if worst > 2e-3 {
			t.Errorf("R=%v: worst flux error %.3g relative to |grad u|", R, worst)
		}
		t.Logf("R=%v: worst flux error %.3g, residual constant %.2g", R, worst, sol.Const[0])
	}
}

// expCos solves the unit square for the manufactured harmonic function
// u = e^x cos y with potential data on x=0 and y=1 and flux data on x=1 and
// y=0, nside panels per side, and returns u(0.5, 0.5), the inflow through
// the sides x=0, x=1, y=1, and the worst potential error on the flux sides.
func expCos(t *testing.T, nside int, graded bool) (uc float64, in [3]float64, worstU float64) {
	u := func(p r2.Vec) float64 { return math.Exp(p.X) * math.Cos(p.Y) }
	grad := func(p r2.Vec) r2.Vec {
		return r2.Vec{X: math.Exp(p.X) * math.Cos(p.Y), Y: -math.Exp(p.X) * math.Sin(p.Y)}
	}
	bl := newBuilder(false)
	reg := bl.region("square", 1, 1, false)
	// Sides in order y=0, x=1, y=1, x=0: flux, flux, potential, potential.
	bl.manufactured(rect(0, 0, 1, 1), nside, graded, reg, u, grad, func(s int) bool { return s >= 2 })
	msh := bl.mesh()
	sol, err := Solve(msh, nil)
	if err != nil {
		t.Fatal(err)
	}
	uc = sol.Eval(r2.Vec{X: 0.5, Y: 0.5}).U
	for j, p := range msh.Panels {
		m := p.Mid()
		switch {
		case m.X < 1e-12:
			in[0] += sol.F[j] * p.Length()
		case m.X > 1-1e-12:
			in[1] += sol.F[j] * p.Length()
		case m.Y > 1-1e-12:
			in[2] += sol.F[j] * p.Length()
		}
		if p.Cond.Kind == geom.Flux {
			worstU = math.Max(worstU, math.Abs(sol.U[j]-u(m)))
		}
	}
	return uc, in, worstU
}

// Manufactured harmonic function u = e^x cos y on the unit square with mixed
// conditions: the exact normal derivatives are -cos y (x=0), e cos y (x=1),
// 0 (y=0), -e^x sin 1 (y=1), so the side inflows are -sin 1, e sin 1 and
// -(e-1) sin 1, and u(0.5, 0.5) = 1.44688904 (shared/REFERENCES.md,
// verified there). Panels graded toward the corners with the smallest panel
// shrinking as h^2. Constant elements carry an O(h_corner) error from the
// jump of the piecewise-constant potential seen across a corner where data
// vary along both sides; with that grading the observed order on the side
// inflows is 1.1 .. 2.8 (noisy: the corner and smooth parts of the error
// have opposite signs on some sides), so assert the overall error falls by
// at least 2^1 per halving on average and is below 3e-5 relative at 4 x 160
// panels (observed 2.6e-5). Real potential data are constant per
// conductor, where this term vanishes (see TestSquareCoaxConvergence).
func TestManufacturedExpCos(t *testing.T) {
	want := [3]float64{-math.Sin(1), math.E * math.Sin(1), -(math.E - 1) * math.Sin(1)}
	var errs []float64
	for _, n := range []int{20, 40, 80, 160} {
		uc, in, wu := expCos(t, n, true)
		e := math.Abs(uc - 1.44688904)
		for k := range in {
			e = math.Max(e, relErr(in[k], want[k]))
		}
		errs = append(errs, e)
		t.Logf("n=%d: centre %.8f, inflows %.8f, worst u on flux sides %.2g, error %.3g", n, uc, in, wu, e)
	}
	if order := math.Log2(errs[0]/errs[3]) / 3; order < 1.4 {
		t.Errorf("mean observed order %.3f (errors %.3g)", order, errs)
	}
	if errs[3] > 3e-5 {
		t.Errorf("error %.3g at 160 panels per side, want < 3e-5", errs[3])
	}
}

// Logarithmic capacity of the square: a lone conductor of side s carrying
// net inflow 1 (k = 1) in open space sits at -ln(cap)/(2 pi) with cap =
// 0.5901703 s (Ransford, Potential Theory in the Complex Plane, 1995, Table
// 5.1, from memory; shared/REFERENCES.md gives the Schwarz-Christoffel value).
// Graded panels resolve the r^(-1/3) corner singularity; tolerance 1e-4
// absolute on the potential (observed ~1e-5). Side 1.694426 is the
// degenerate scale (cap = 1): same accuracy required there.
func TestSquareLogCapacity(t *testing.T) {
	for _, side := range []float64{1, 1.694426, 3} {
		bl := newBuilder(true)
		bg := bl.region("air", 1, 1, true)
		o := bl.owner("square", floating(1))
		ring := reversed(rect(0, 0, side, side)) // domain outside: clockwise
		bl.ring(ring, 40, true, bg, geom.Outside, o, floating(1))
		sol, err := Solve(bl.mesh(), nil)
		if err != nil {
			t.Fatal(err)
		}
		want := -math.Log(0.5901703*side) / (2 * math.Pi)
		if d := math.Abs(sol.Floating[o] - want); d > 1e-4 {
			t.Errorf("side %v: potential %.7f, want %.7f", side, sol.Floating[o], want)
		}
		if q := sol.Owners()[o].Inflow; math.Abs(q-1) > 1e-12 {
			t.Errorf("side %v: net inflow %v, want 1", side, q)
		}
	}
}

// The charge density near a square conductor's corner (field-side opening
// 3 pi/2) behaves like r^(pi/beta - 1) = r^(-1/3) (e.g. Jackson, Classical
// Electrodynamics, sec. 2.11; from memory). Fit the exponent on the graded
// panels near a corner of the open-space square: must lie in [-0.38, -0.29].
func TestSquareCornerExponent(t *testing.T) {
	bl := newBuilder(true)
	bg := bl.region("air", 1, 1, true)
	// A lone conductor in open space carries charge only if it is given
	// some: floating with net inflow 1.
	o := bl.owner("square", floating(1))
	bl.ring(reversed(rect(0, 0, 1, 1)), 60, true, bg, geom.Outside, o, floating(1))
	msh := bl.mesh()
	sol, err := Solve(msh, nil)
	if err != nil {
		t.Fatal(err)
	}
	// Panels on the side y=0 near the corner (0,0), at distance r.
	var rs, fs []float64
	for j, p := range msh.Panels {
		m := p.Mid()
		if m.Y == 0 && m.X < 0.05 {
			rs = append(rs, m.X)
			fs = append(fs, math.Abs(sol.F[j]))
		}
	}
	if len(rs) < 4 {
		t.Fatalf("too few panels near the corner: %d", len(rs))
	}
	// Least squares slope of log f against log r, skipping the first panel.
	var sx, sy, sxx, sxy float64
	n := 0.0
	for i := range rs {
		if rs[i] < 1e-3 {
			continue
		}
		x, y := math.Log(rs[i]), math.Log(fs[i])
		sx, sy, sxx, sxy = sx+x, sy+y, sxx+x*x, sxy+x*y
		n++
	}
	slope := (n*sxy - sx*sy) / (n*sxx - sx*sx)
	if slope < -0.38 || slope > -0.29 {
		t.Errorf("corner exponent %.3f, want about -1/3", slope)
	}
	t.Logf("corner exponent %.4f from %v panels", slope, n)
}

// Serial and parallel assembly must give bit-identical results.
func TestSerialParallelIdentical(t *testing.T) {
	m := coax(1, 2, 200, 1).mesh()
	s1, err := Solve(m, &Settings{Workers: 1})
	if err != nil {
		t.Fatal(err)
	}
	s2, err := Solve(m, &Settings{Workers: 4})
	if err != nil {
		t.Fatal(err)
	}
	for j := range s1.F {
		if s1.F[j] != s2.F[j] || s1.U[j] != s2.U[j] {
			t.Fatalf("panel %d differs: %v vs %v", j, s1.F[j], s2.F[j])
		}
	}
}

// Square coaxial line, inner side a at 1 V inside outer side b at 0 V, b/a =
// 2: C/k = 8 K(3/4)/K(1/4) = 10.234093 exactly by Schwarz-Christoffel
// (tabulated in Gunston, Microwave Transmission-Line Impedance Data, 1972,
// sec. 3.3, from memory; value verified in shared/REFERENCES.md). The inner
// corners carry the r^(-1/3) singularity. With geometric grading whose
// smallest panel shrinks as h^2 the error must fall at order >= 1.7 per
// halving and be below 1e-4 at 4 x 64 panels per side (observed values
// logged).
func TestSquareCoaxConvergence(t *testing.T) {
	const want = 10.234093
	var errs []float64
	for _, n := range []int{16, 32, 64} {
		bl := newBuilder(false)
		reg := bl.region("gap", 1, 1, false)
		in := bl.owner("inner", pot(1))
		out := bl.owner("outer", pot(0))
		bl.ring(rect(-1, -1, 1, 1), 2*n, true, reg, geom.Outside, out, pot(0))
		bl.ring(reversed(rect(-0.5, -0.5, 0.5, 0.5)), n, true, reg, geom.Outside, in, pot(1))
		sol, err := Solve(bl.mesh(), nil)
		if err != nil {
			t.Fatal(err)
		}
		errs = append(errs, relErr(sol.Owners()[in].Inflow, want))
	}
	t.Logf("square coax relative errors %.3g", errs)
	for i := 1; i < len(errs); i++ {
		if order := math.Log2(errs[i-1] / errs[i]); order < 1.7 {
			t.Errorf("observed order %.3f (errors %.3g)", order, errs)
		}
	}
	if errs[len(errs)-1] > 1e-4 {
		t.Errorf("error %.3g, want < 1e-4", errs[len(errs)-1])
	}
}

// Manufactured harmonic function u = x^2 - y^2 (shared/REFERENCES.md) on an
// irregular convex pentagon with potential data on two sides and flux data
// on three: the potential at interior points and the flux on the potential
// sides must match the exact ones. Tolerance 5e-4 absolute at 64 graded
// panels per side (observed ~1e-5 inside).
func TestManufacturedSaddlePentagon(t *testing.T) {
	u := func(p r2.Vec) float64 { return p.X*p.X - p.Y*p.Y }
	grad := func(p r2.Vec) r2.Vec { return r2.Vec{X: 2 * p.X, Y: -2 * p.Y} }
	poly := []r2.Vec{{X: 0, Y: 0}, {X: 2, Y: -0.3}, {X: 2.4, Y: 1.2}, {X: 1.1, Y: 2.1}, {X: -0.4, Y: 1.3}}
	bl := newBuilder(false)
	reg := bl.region("pentagon", 1, 1, false)
	bl.manufactured(poly, 64, true, reg, u, grad, func(s int) bool { return s == 0 || s == 2 })
	msh := bl.mesh()
	sol, err := Solve(msh, nil)
	if err != nil {
		t.Fatal(err)
	}
	for _, p := range []r2.Vec{{X: 1, Y: 0.8}, {X: 0.3, Y: 0.4}, {X: 1.9, Y: 1}} {
		pt := sol.Eval(p)
		if math.Abs(pt.U-u(p)) > 5e-4 || r2.Norm(r2.Sub(pt.Grad, grad(p))) > 5e-3 {
			t.Errorf("at %v: u %v grad %v, want %v %v", p, pt.U, pt.Grad, u(p), grad(p))
		}
	}
	// Integrated flux on the potential sides (0 and 2) against the exact.
	var got, want float64
	for j, p := range msh.Panels {
		if p.Cond.Kind == geom.Potential {
			got += sol.F[j] * p.Length()
			want += r2.Dot(grad(p.Mid()), p.Normal()) * p.Length()
		}
	}
	if math.Abs(got-want) > 1e-3*math.Abs(want) {
		t.Errorf("inflow through the potential sides %v, want %v", got, want)
	}
}

// Near-boundary evaluation: u = e^x cos y on the unit square (flux data on
// three sides, potential on x=0; 50 uniform panels a side, h = 0.02),
// evaluated along lines 2h .. 0.1h above the flux side y=0, sweeping across
// panel joints. The gradient must stay within 5e-3 of the exact one
// relative (observed 5e-4 at 2h, 2.5e-3 at 0.1h; without the linear
// reconstruction of the potential along the panels it was 1.1 at 0.1h) and
// the potential within 1e-3 (the discretisation error, 3.3e-4 observed).
func TestNearBoundaryGradient(t *testing.T) {
	u := func(p r2.Vec) float64 { return math.Exp(p.X) * math.Cos(p.Y) }
	grad := func(p r2.Vec) r2.Vec {
		return r2.Vec{X: math.Exp(p.X) * math.Cos(p.Y), Y: -math.Exp(p.X) * math.Sin(p.Y)}
	}
	bl := newBuilder(false)
	reg := bl.region("square", 1, 1, false)
	n := 50
	bl.manufactured(rect(0, 0, 1, 1), n, false, reg, u, grad, func(s int) bool { return s == 3 })
	sol, err := Solve(bl.mesh(), nil)
	if err != nil {
		t.Fatal(err)
	}
	h := 1.0 / float64(n)
	for _, d := range []float64{2, 1, 0.5, 0.25, 0.1} {
		worstU, worstG := 0.0, 0.0
		for x := 0.2; x < 0.8; x += h / 7 {
			p := r2.Vec{X: x, Y: d * h}
			pt := sol.Eval(p)
			worstU = math.Max(worstU, math.Abs(pt.U-u(p)))
			worstG = math.Max(worstG, r2.Norm(r2.Sub(pt.Grad, grad(p)))/r2.Norm(grad(p)))
		}
		if worstU > 1e-3 || worstG > 5e-3 {
			t.Errorf("at %.2g panel lengths from the boundary: worst potential error %.2g, worst relative gradient error %.2g", d, worstU, worstG)
		}
	}
}

// The progress callback reports every row once and ends at the total.
func TestProgress(t *testing.T) {
	var mu sync.Mutex
	last, calls := 0, 0
	total := 0
	m := coax(1, 2, 100, 1).mesh()
	sys, err := Assemble(m, &Settings{Progress: func(done, n int) {
		mu.Lock()
		defer mu.Unlock()
		calls++
		last = max(last, done)
		total = n
	}})
	if err != nil {
		t.Fatal(err)
	}
	if calls == 0 || last != total || total != sys.Unknowns() {
		t.Errorf("progress: %d calls, last %d of %d, unknowns %d", calls, last, total, sys.Unknowns())
	}
}

// A system above Settings.MaxUnknowns is refused by the dense solver with
// a typed error before any memory is taken; Auto hands it to the fast
// solver.
func TestTooLarge(t *testing.T) {
	m := coax(1, 2, 100, 1).mesh()
	_, err := Assemble(m, &Settings{MaxUnknowns: 150, Method: Dense})
	var tl *TooLargeError
	if !errors.As(err, &tl) || tl.Unknowns <= 150 || !strings.Contains(err.Error(), "fewer panels") || !strings.Contains(err.Error(), "fast solver") {
		t.Fatalf("got %v, want a TooLargeError pointing to the fast solver or fewer panels", err)
	}
	sys, err := Assemble(m, &Settings{MaxUnknowns: 150})
	if err != nil || sys.Method() != Fast {
		t.Fatalf("Auto above the dense limit: %v, method %v; want the fast solver", err, sys.Method())
	}
}

// Points on the boundary itself, at a vertex or inside a panel, are not in
// the open domain: Eval returns NaN and Outside there, finite values just
// off it.
func TestEvalOnBoundary(t *testing.T) {
	sol, err := Solve(coax(1, 2, 64, 1).mesh(), nil)
	if err != nil {
		t.Fatal(err)
	}
	v := ngon(r2.Vec{}, 1, 64, false, 0)
	mid := r2.Scale(0.5, r2.Add(v[3], v[4]))
	for _, p := range []r2.Vec{v[3], mid} {
		if pt := sol.Eval(p); pt.Region != geom.Outside || !math.IsNaN(pt.U) {
			t.Errorf("on the boundary at %v: %+v", p, pt)
		}
		off := r2.Scale(1+1e-6, p)
		if pt := sol.Eval(off); pt.Region != 0 || math.IsNaN(pt.U) || math.IsInf(pt.Grad.X, 0) {
			t.Errorf("just off the boundary at %v: %+v", off, pt)
		}
	}
}
