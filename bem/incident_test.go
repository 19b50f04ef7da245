package bem

import (
	"math"
	"strings"
	"testing"

	"github.com/rimfield/rimfield/geom"
	"gonum.org/v1/gonum/spatial/r2"
)

// An uncharged conducting cylinder of radius R about the origin in the
// uniform field of potential u0 = g x: u = g x (1 - R^2/r^2), the cylinder
// at 0 and the inflow density (n into the cylinder) F = -k du/dr =
// -2 k g cos(theta) (separation of variables in polar coordinates; e.g.
// Smythe, Static and Dynamic Electricity, 1950, sec. 4.07 [from memory]).
// R = 1 is the degenerate scale of the log kernel and is solved as well as
// the others. A 512-gon inscribed in the circle: observed 6.3e-6 of 2|g|
// on F (tolerance 3e-5), 1.2e-5 of |g| R on the potential at a point
// outside (tolerance 5e-5) and about 1e-5 on its gradient (tolerance 1e-4).
func TestIncidentFieldCylinder(t *testing.T) {
	g := r2.Vec{X: 0.8, Y: -0.6}
	gn := r2.Norm(g)
	for _, R := range []float64{0.3, 1, 2.5} {
		bl := newBuilder(true)
		bg := bl.region("air", 1, 1, true)
		o := bl.owner("rod", floating(0))
		bl.ring(ngon(r2.Vec{}, R, 512, false, 0), 1, false, bg, geom.Outside, o, floating(0))
		sys, err := Assemble(bl.mesh(), nil)
		if err != nil {
			t.Fatal(err)
		}
		sol, err := sys.Solve(&Data{Uniform: g})
		if err != nil {
			t.Fatal(err)
		}
		if sol.Uniform != g {
			t.Errorf("R=%v: solution's incident field %v, want %v", R, sol.Uniform, g)
		}
		if math.Abs(sol.Floating[o]) > 1e-9*gn*R {
			t.Errorf("R=%v: cylinder at %g, want 0", R, sol.Floating[o])
		}
		worst := 0.0
		for j, p := range sol.Mesh.Panels {
			m := p.Mid()
			want := -2 * r2.Dot(g, m) / r2.Norm(m)
			worst = math.Max(worst, math.Abs(sol.F[j]-want)/(2*gn))
		}
		t.Logf("R=%v: inflow density within %.2g of 2|g|, u within %.2g of |g| R", R, worst, math.Abs(sol.Eval(r2.Vec{X: 1.7 * R, Y: 0.4 * R}).U-r2.Dot(g, r2.Vec{X: 1.7 * R, Y: 0.4 * R})*(1-1/(1.7*1.7+0.4*0.4)))/(gn*R))
		if worst > 3e-5 {
			t.Errorf("R=%v: inflow density off by %.2g of 2|g|", R, worst)
		}
		x := r2.Vec{X: 1.7 * R, Y: 0.4 * R}
		r2x := r2.Norm2(x)
		pt := sol.Eval(x)
		want := r2.Dot(g, x) * (1 - R*R/r2x)
		if math.Abs(pt.U-want) > 5e-5*gn*R {
			t.Errorf("R=%v: u(%v) = %v, want %v", R, x, pt.U, want)
		}
		// grad u = g (1 - R^2/r^2) + 2 R^2 (g.x) x / r^4.
		wg := r2.Add(r2.Scale(1-R*R/r2x, g), r2.Scale(2*R*R*r2.Dot(g, x)/(r2x*r2x), x))
		t.Logf("R=%v: gradient within %.2g of |g|", R, r2.Norm(r2.Sub(pt.Grad, wg))/gn)
		if d := r2.Norm(r2.Sub(pt.Grad, wg)); d > 1e-4*gn {
			t.Errorf("R=%v: grad u(%v) = %v, want %v", R, x, pt.Grad, wg)
		}
		// The same system without the field: zero everywhere.
		zero, err := sys.Solve(nil)
		if err != nil {
			t.Fatal(err)
		}
		if pt := zero.Eval(x); math.Abs(pt.U) > 1e-12 {
			t.Errorf("R=%v: without the field u = %v", R, pt.U)
		}
	}
}

// A dielectric cylinder (k = eps, radius R) in the uniform field
// u0 = g x of a background k = 1: inside, the uniform u = 2/(1+eps) g x
// (e.g. Smythe 1950, sec. 4.07 [from memory]; continuity of u and k du/dr
// at r = R checks it). The incident field enters the background's
// equations only. 512-gon; observed 1.1e-6 of |g| R on u and 2e-6 of |g|
// on its gradient, tolerances 1e-5 and 2e-5.
func TestIncidentFieldDielectric(t *testing.T) {
	const eps, R = 4.0, 0.7
	g := r2.Vec{X: 1.5}
	bl := newBuilder(true)
	in := bl.region("rod", eps, eps, false)
	bg := bl.region("air", 1, 1, true)
	bl.ring(ngon(r2.Vec{}, R, 512, true, 0), 1, false, in, bg, -1, geom.Condition{})
	sys, err := Assemble(bl.mesh(), nil)
	if err != nil {
		t.Fatal(err)
	}
	sol, err := sys.Solve(&Data{Uniform: g})
	if err != nil {
		t.Fatal(err)
	}
	for _, x := range []r2.Vec{{X: 0.2, Y: 0.1}, {X: -0.4, Y: -0.3}} {
		pt := sol.Eval(x)
		want := 2 / (1 + eps) * g.X * x.X
		t.Logf("u(%v) within %.2g of |g| R, grad within %.2g", x, math.Abs(pt.U-want)/(g.X*R), r2.Norm(r2.Sub(pt.Grad, r2.Vec{X: 2 / (1 + eps) * g.X}))/g.X)
		if math.Abs(pt.U-want) > 1e-5*g.X*R || math.Abs(pt.Grad.X-2/(1+eps)*g.X) > 2e-5*g.X || math.Abs(pt.Grad.Y) > 2e-5*g.X {
			t.Errorf("u(%v) = %v grad %v, want %v grad (%v, 0)", x, pt.U, pt.Grad, want, 2/(1+eps)*g.X)
		}
	}
}

// A cylinder at height h over a grounded plane y = Y0 in the uniform field
// u0 = g (y - Y0) is the same as the cylinder and its mirror image in the
// open field u0 = g y, the pair drawn about y = 0: the image kernel is
// exact and the two discrete problems are the same up to rounding
// (observed 3.5e-12 on the densities; tolerance 1e-9 of |g| R).
func TestIncidentFieldOverGround(t *testing.T) {
	const R, h, y0 = 0.5, 0.8, -0.3
	g := r2.Vec{Y: 2}
	bl := newBuilder(true)
	bg := bl.region("air", 1, 1, true)
	o := bl.owner("rod", floating(0))
	bl.lay.Ground = &geom.Ground{Y: y0}
	c := r2.Vec{X: 0.2, Y: y0 + h}
	bl.ring(ngon(c, R, 256, false, 0), 1, false, bg, geom.Outside, o, floating(0))
	sys, err := Assemble(bl.mesh(), nil)
	if err != nil {
		t.Fatal(err)
	}
	sol, err := sys.Solve(&Data{Uniform: g})
	if err != nil {
		t.Fatal(err)
	}
	if _, err := sys.Solve(&Data{Uniform: r2.Vec{X: 1, Y: 2}}); err == nil || !strings.Contains(err.Error(), "grounded plane") {
		t.Errorf("a field along the plane: error %v, want one about the grounded plane", err)
	}

	// The pair, shifted so that the plane is y = 0.
	pb := newBuilder(true)
	pbg := pb.region("air", 1, 1, true)
	up := pb.owner("rod", floating(0))
	down := pb.owner("image", floating(0))
	cu := r2.Vec{X: c.X, Y: h}
	pb.ring(ngon(cu, R, 256, false, 0), 1, false, pbg, geom.Outside, up, floating(0))
	mirror := ngon(r2.Vec{X: c.X, Y: -h}, R, 256, false, 0)
	for i := range mirror { // the mirror image of the upper ring's vertices, clockwise again
		v := ngon(cu, R, 256, false, 0)[(256-i)%256]
		mirror[i] = r2.Vec{X: v.X, Y: -v.Y}
	}
	pb.ring(mirror, 1, false, pbg, geom.Outside, down, floating(0))
	psol, err := mustAssemble(t, pb).Solve(&Data{Uniform: g})
	if err != nil {
		t.Fatal(err)
	}
	tol := 1e-9 * r2.Norm(g) * R
	if d := math.Abs(sol.Floating[o] - psol.Floating[up]); d > tol {
		t.Errorf("cylinder at %.9g over the plane, %.9g in the pair", sol.Floating[o], psol.Floating[up])
	}
	worst := 0.0
	for j := range sol.Mesh.Panels {
		worst = math.Max(worst, math.Abs(sol.F[j]-psol.F[j]))
		if d := math.Abs(sol.F[j] - psol.F[j]); d > tol {
			t.Errorf("panel %d: inflow %.9g over the plane, %.9g in the pair", j, sol.F[j], psol.F[j])
			break
		}
	}
	t.Logf("inflow densities agree within %.2g, constants within %.2g", worst, math.Abs(sol.Floating[o]-psol.Floating[up]))
	x := r2.Vec{X: 1.1, Y: y0 + 0.2}
	if a, b := sol.Eval(x), psol.Eval(r2.Vec{X: x.X, Y: x.Y - y0}); math.Abs(a.U-b.U) > tol || r2.Norm(r2.Sub(a.Grad, b.Grad)) > tol {
		t.Errorf("at %v: %v over the plane, %v in the pair", x, a, b)
	}
}

func mustAssemble(t *testing.T, b *builder) *System {
	t.Helper()
	sys, err := Assemble(b.mesh(), nil)
	if err != nil {
		t.Fatal(err)
	}
	return sys
}

// Bad incident fields and Kutta conditions get errors, not panics.
func TestIncidentAndKuttaErrors(t *testing.T) {
	closed := coax(1, 2, 32, 1)
	sys := mustAssemble(t, closed)
	if _, err := sys.Solve(&Data{Uniform: r2.Vec{X: 1}}); err == nil || !strings.Contains(err.Error(), "open scene") {
		t.Errorf("incident field in a closed scene: %v", err)
	}
	bl := newBuilder(true)
	bg := bl.region("air", 1, 1, true)
	o := bl.owner("wedge", floating(0))
	fixed := bl.owner("wire", pot(1))
	wedge := []r2.Vec{{X: 1, Y: 0}, {X: -1, Y: -0.2}, {X: -1, Y: 0.2}} // clockwise: fluid outside
	bl.ring(wedge, 8, true, bg, geom.Outside, o, floating(0))
	bl.ring(ngon(r2.Vec{X: 0, Y: 3}, 0.3, 32, false, 0), 1, false, bg, geom.Outside, fixed, pot(1))
	m := bl.mesh()
	if _, err := sys.Solve(&Data{Uniform: r2.Vec{X: math.NaN()}}); err == nil {
		t.Errorf("NaN field: no error")
	}
	for _, c := range []struct {
		k    []Kutta
		says string
	}{
		{[]Kutta{{Owner: 7, At: wedge[0]}}, "owners"},
		{[]Kutta{{Owner: fixed, At: r2.Vec{X: 0.3, Y: 3}}}, "floating"},
		{[]Kutta{{Owner: o, At: r2.Vec{X: 0.9, Y: 0}}}, "vertex"},
		{[]Kutta{{Owner: o, At: wedge[0]}, {Owner: o, At: wedge[1]}}, "two Kutta"},
	} {
		if _, err := Assemble(m, &Settings{Kutta: c.k}); err == nil || !strings.Contains(err.Error(), c.says) {
			t.Errorf("Kutta %+v: error %v, want one saying %q", c.k, err, c.says)
		}
	}
	if _, err := Assemble(m, &Settings{Kutta: []Kutta{{Owner: o, At: wedge[0]}}}); err != nil {
		t.Errorf("a good Kutta condition: %v", err)
	}
	// Across the wedge's base, from wedge[1] to wedge[2] (walking with the
	// fluid on the left).
	if _, err := Assemble(m, &Settings{Kutta: []Kutta{{Owner: o, At: wedge[1], Blunt: true, To: wedge[2]}}}); err != nil {
		t.Errorf("a Kutta condition across a base: %v", err)
	}
	if _, err := Assemble(m, &Settings{Kutta: []Kutta{{Owner: o, At: wedge[1], Blunt: true, To: r2.Vec{X: 5}}}}); err == nil {
		t.Errorf("a base ending off the body: no error")
	}
}
