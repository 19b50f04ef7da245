package mesh

import (
	"math"
	"testing"

	"github.com/rimfield/rimfield/geom"
	"gonum.org/v1/gonum/spatial/r2"
)

// The corners of a mesh and their exponents (separable solutions in a
// wedge; Jackson, Classical Electrodynamics, 1999, sec. 2.11): a conductor
// square in a box has outer corners of opening 3 pi/2, lambda 2/3, field
// r^-1/3; the box's own inner corners (insulated walls meeting at a right
// angle) lambda 2, smooth; a 32-gon's vertices lambda 0.94, below the
// warning's threshold, a 16-gon's 0.89, above; where a fixed potential
// meets an insulated wall at a right angle lambda 1 (finite), on a straight
// line 1/2.
func TestCorners(t *testing.T) {
	ins := geom.Insulated
	// A square conductor (owner 0, fixed) in a box of insulated walls.
	ps := ring(rect(0, 0, 10, 10), 0, geom.Outside, -1, ins)
	ps = append(ps, ring(reversed(rect(4, 4, 6, 6)), 0, geom.Outside, 0, fixed1)...)
	m := mustBuild(t, layout(ps, 1, 1, false), Options{})
	got := map[r2.Vec]Corner{}
	for _, c := range m.Corners() {
		got[c.At] = c
	}
	for _, v := range []r2.Vec{{X: 4, Y: 4}, {X: 6, Y: 6}} {
		if c, ok := got[v]; !ok || math.Abs(c.Lambda-2.0/3) > 1e-9 || !c.Singular() || c.Mixed || math.Abs(c.Opening-1.5*math.Pi) > 1e-9 {
			t.Errorf("conductor corner %v: %+v", v, c)
		}
	}
	if c := got[r2.Vec{X: 0, Y: 0}]; math.Abs(c.Lambda-2) > 1e-9 || c.Singular() {
		t.Errorf("box corner: %+v", c)
	}
	if n := len(m.SingularCorners()); n != 4 {
		t.Errorf("%d singular corners, want the conductor's 4", n)
	}

	for _, c := range []struct {
		n    int
		sing bool
	}{{32, false}, {16, true}} {
		ps := ring(rect(-5, -5, 5, 5), 0, geom.Outside, -1, ins)
		ps = append(ps, ring(reversed(ngon(r2.Vec{}, 1, c.n)), 0, geom.Outside, 0, fixed1)...)
		m := mustBuild(t, layout(ps, 1, 1, false), Options{})
		want := math.Pi / (math.Pi + 2*math.Pi/float64(c.n))
		for _, cn := range m.Corners() {
			if math.Hypot(cn.At.X, cn.At.Y) > 1.01 {
				continue
			}
			if math.Abs(cn.Lambda-want) > 1e-9 || cn.Singular() != c.sing {
				t.Fatalf("%d-gon vertex %v: lambda %.6f, singular %v; want %.6f, %v", c.n, cn.At, cn.Lambda, cn.Singular(), want, c.sing)
			}
		}
	}

	// An electrode (fixed) ending on an insulated wall: at the box's
	// corner at a right angle, and on the straight bottom.
	ps = ring(rect(0, 0, 10, 10), 0, geom.Outside, -1, ins)
	ps[0] = geom.Piece{A: r2.Vec{X: 0, Y: 0}, B: r2.Vec{X: 5, Y: 0}, Left: 0, Right: geom.Outside, Owner: 0, Cond: fixed1}
	ps = append(ps[:1], append([]geom.Piece{{A: r2.Vec{X: 5, Y: 0}, B: r2.Vec{X: 10, Y: 0}, Left: 0, Right: geom.Outside, Owner: -1, Cond: ins}}, ps[1:]...)...)
	m = mustBuild(t, layout(ps, 1, 1, false), Options{})
	got = map[r2.Vec]Corner{}
	for _, c := range m.Corners() {
		got[c.At] = c
	}
	if c := got[r2.Vec{X: 0, Y: 0}]; !c.Mixed || math.Abs(c.Lambda-1) > 1e-9 || c.Singular() {
		t.Errorf("mixed right angle: %+v", c)
	}
	if c := got[r2.Vec{X: 5, Y: 0}]; !c.Mixed || math.Abs(c.Lambda-0.5) > 1e-9 || !c.Singular() {
		t.Errorf("mixed straight line: %+v", c)
	}
}
