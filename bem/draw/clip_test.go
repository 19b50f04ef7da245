package draw

import (
	"math"
	"testing"

	"github.com/rimfield/rimfield/bem/grid"
	"github.com/rimfield/rimfield/geom"
	"gonum.org/v1/gonum/spatial/r2"
)

// Clipping checked by area and by hand-computed pieces (elementary
// geometry).
func TestClip(t *testing.T) {
	w := grid.Window{Min: r2.Vec{X: 0, Y: 0}, Max: r2.Vec{X: 2, Y: 2}}
	// A square half out of the window keeps half its area.
	c := clipRing(geom.Ring{{X: 1, Y: 0.5}, {X: 3, Y: 0.5}, {X: 3, Y: 1.5}, {X: 1, Y: 1.5}}, w)
	if a := c.Area(); math.Abs(a-1) > 1e-12 {
		t.Errorf("clipped area %v, want 1", a)
	}
	if clipRing(geom.Ring{{X: 5, Y: 5}, {X: 6, Y: 5}, {X: 6, Y: 6}}, w) != nil {
		t.Error("a ring outside the window must vanish")
	}
	// A line in, out and in again gives two pieces.
	pieces := clipLine([]r2.Vec{{X: 0.5, Y: 1}, {X: 3, Y: 1}, {X: 3, Y: 0.5}, {X: 1, Y: 0.5}}, w)
	if len(pieces) != 2 {
		t.Fatalf("%d pieces, want 2: %v", len(pieces), pieces)
	}
	if p := pieces[0]; p[0] != (r2.Vec{X: 0.5, Y: 1}) || p[len(p)-1] != (r2.Vec{X: 2, Y: 1}) {
		t.Errorf("first piece %v", p)
	}
	if p := pieces[1]; p[0] != (r2.Vec{X: 2, Y: 0.5}) || p[len(p)-1] != (r2.Vec{X: 1, Y: 0.5}) {
		t.Errorf("second piece %v", p)
	}
}
