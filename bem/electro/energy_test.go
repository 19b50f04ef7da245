package electro

import (
	"math"
	"testing"

	"github.com/rimfield/rimfield/geom"
	"github.com/rimfield/rimfield/mesh"
	"gonum.org/v1/gonum/spatial/r2"
)

// tolForce is the accuracy asserted on forces and energies at the default
// mesh: 1e-3 relative, as for capacitance. The stress sums squared panel
// charges, so its error is about twice that of the field (observed 3e-5 to
// 1e-4).
const tolForce = 1e-3

func TestEnergyCoaxial(t *testing.T) {
	// W = C V^2 / 2 with the coaxial C = 2 pi eps / ln(b/a), here with the
	// core at 3 V and the shield at -1 V (V = 4): the sum 1/2 sum V_i Q_i
	// does not depend on the reference.
	const a, b = 1.0, 2.0
	sb := newScene(false).
		region("gap", 1, circle(r2.Vec{}, b, circleSides, 0)).
		body("core", fixed(3), circle(r2.Vec{}, a, circleSides, 0)).
		edge("shield", fixed(-1), closedRing(circle(r2.Vec{}, b, circleSides, 0))...)
	s := sb.solve(t, mesh.Options{})
	want := 0.5 * 2 * math.Pi * geom.Eps0 / math.Log(b/a) * 16
	if w := Energy(s.sol); relErr(w, want) > tolForce {
		t.Errorf("W = %.7g J/m, want %.7g", w, want)
	}
	// Symmetry: no net force on either conductor, to the field accuracy
	// times the size of one side's pull.
	side := want / a // order of the pull on half the core, N/m
	for _, f := range PanelFields(s.sol).Forces() {
		if r2.Norm(f.F) > 1e-6*side {
			t.Errorf("net force on %s: %v N/m", f.Name, f.F)
		}
	}
}

func TestEnergyUnbounded(t *testing.T) {
	// A lone charged conductor in open 2D space stores infinite energy (the
	// field of a line charge falls as 1/r): NaN, not a number that depends
	// on the gauge.
	sb := newScene(true).body("f", geom.Condition{Kind: geom.Floating, NetInflow: 1e-9}, circle(r2.Vec{}, 1, 64, 0))
	s := sb.solve(t, mesh.Options{})
	if w := Energy(s.sol); !math.IsNaN(w) {
		t.Errorf("W = %g, want NaN", w)
	}
}

// cylinders is two parallel cylinders of radius 1, the first at the origin
// at 1 V, the second at (d, 0) at 0 V, in open space.
func cylinders(d float64) *sceneBuilder {
	return newScene(true).
		body("left", fixed(1), circle(r2.Vec{}, 1, circleSides, 0)).
		body("right", fixed(0), circle(r2.Vec{X: d}, 1, circleSides, 0))
}

func TestForceTwoCylinders(t *testing.T) {
	// Two cylinders a = 1, centres D = 4 apart, 1 V between them:
	// C = pi eps / acosh(D/2a) (REFERENCES.md; Smythe 1950 [from memory]),
	// and at fixed potentials the force on the right one along x is
	// +dW/dD = V^2/2 dC/dD = -pi eps V^2 / (2 acosh(D/2a)^2 sqrt(D^2-4a^2))
	// (virtual work; attractive). Check the Maxwell-stress force against
	// that closed form, against a central difference of the computed
	// energy at D +- 0.05 (the meshes are the same panels translated, so
	// their discretisation errors cancel; the difference's own error is
	// (0.05/2)^2/6 = 1e-4 relative), and Newton's third law.
	const d, delta = 4.0, 0.05
	s := cylinders(d).solve(t, mesh.Options{})
	fs := PanelFields(s.sol).Forces()
	if len(fs) != 2 {
		t.Fatalf("%d forces", len(fs))
	}
	want := -math.Pi * geom.Eps0 / (2 * math.Pow(math.Acosh(d/2), 2) * math.Sqrt(d*d-4))
	right := fs[1].F
	if e := relErr(right.X, want); e > tolForce {
		t.Errorf("force on the right cylinder %.7g N/m, want %.7g (rel. error %.2g)", right.X, want, e)
	}
	if math.Abs(right.Y) > 1e-6*math.Abs(want) {
		t.Errorf("force along y %g N/m, want 0", right.Y)
	}
	if r2.Norm(r2.Add(fs[0].F, right)) > 1e-4*math.Abs(want) {
		t.Errorf("forces %v and %v do not balance", fs[0].F, right)
	}
	wp := Energy(cylinders(d+delta).solve(t, mesh.Options{}).sol)
	wm := Energy(cylinders(d-delta).solve(t, mesh.Options{}).sol)
	vw := (wp - wm) / (2 * delta)
	if e := relErr(right.X, vw); e > tolForce {
		t.Errorf("Maxwell stress %.7g N/m, virtual work %.7g N/m (rel. difference %.2g)", right.X, vw, e)
	}
	// The energy itself: W = C V^2 / 2.
	if w, cw := Energy(s.sol), 0.5*math.Pi*geom.Eps0/math.Acosh(d/2); relErr(w, cw) > tolForce {
		t.Errorf("W = %.7g J/m, want %.7g", w, cw)
	}
}

func TestForceOverGround(t *testing.T) {
	// Cylinder a = 1 at height h = 2 over a grounded plane at 1 V:
	// F_y = V^2/2 dC/dh = -pi eps V^2 / (acosh(h/a)^2 sqrt(h^2-a^2)),
	// pulling it down (C = 2 pi eps / acosh(h/a), image line charge; the
	// derivative by virtual work at fixed potential).
	const h = 2.0
	sb := newScene(true).body("wire", fixed(1), circle(r2.Vec{Y: h}, 1, circleSides, 0))
	sb.sc.Problem.Ground = &geom.Ground{Y: 0}
	s := sb.solve(t, mesh.Options{})
	want := -math.Pi * geom.Eps0 / (math.Pow(math.Acosh(h), 2) * math.Sqrt(h*h-1))
	f := PanelFields(s.sol).Forces()[0].F
	if e := relErr(f.Y, want); e > tolForce || math.Abs(f.X) > 1e-6*math.Abs(want) {
		t.Errorf("force %v N/m, want (0, %.7g) (rel. error %.2g)", f, want, e)
	}
}

func TestForceFloatingDielectric(t *testing.T) {
	// An uncharged floating square slab in a dielectric between two plates
	// at 0 and 1 V, below the middle: the stress force on it against the
	// virtual work of the energy at fixed plate potentials (the slab keeps
	// zero charge, so dW/dy at fixed potentials is still the force; any
	// text on energy methods, e.g. Jackson 1999 sec. 4.7 [from memory]).
	// The derivative is a Richardson-extrapolated central difference (steps
	// 0.02 and 0.04 m), leaving an error of order (0.04/0.5)^4. The slab's
	// corners are singular and carry much of the pull: the tolerance 5e-3
	// is 3 times the difference observed with the corner integration
	// (1.7e-3; 1.2e-2 with plain panel sums). The net force is about a
	// hundredth of the pull on either face, which magnifies errors.
	scene := func(y float64) *sceneBuilder {
		return newScene(false).
			region("fill", 3, rectangle(-2, 0, 2, 2)).
			edge("bottom", fixed(0), r2.Vec{X: -2}, r2.Vec{X: 2}).
			edge("top", fixed(1), r2.Vec{X: 2, Y: 2}, r2.Vec{X: -2, Y: 2}).
			body("slab", geom.Condition{Kind: geom.Floating}, rectangle(-0.5, y-0.2, 0.5, y+0.2))
	}
	const y, delta = 0.7, 0.02
	s := scene(y).solve(t, mesh.Options{})
	var f r2.Vec
	for _, fc := range PanelFields(s.sol).Forces() {
		if fc.Name == "slab" {
			f = fc.F
		}
	}
	energy := func(y float64) float64 { return Energy(scene(y).solve(t, mesh.Options{}).sol) }
	d1 := (energy(y+delta) - energy(y-delta)) / (2 * delta)
	d2 := (energy(y+2*delta) - energy(y-2*delta)) / (4 * delta)
	vw := (4*d1 - d2) / 3
	t.Logf("stress %.6g, virtual work %.6g N/m", f.Y, vw)
	if e := relErr(f.Y, vw); e > 5e-3 {
		t.Errorf("stress force %.6g N/m, virtual work %.6g N/m (rel. difference %.2g)", f.Y, vw, e)
	}
	if math.Abs(f.X) > 1e-3*math.Abs(f.Y) {
		t.Errorf("force along x %g N/m on a symmetric scene", f.X)
	}
}
