package geom

import (
	"math"
	"testing"

	"gonum.org/v1/gonum/spatial/r2"
)

// Ring.Area is the shoelace formula (elementary): an L of six unit squares
// less one has area 3 in either direction; Polygon.Contains excludes holes.
func TestRingAreaContains(t *testing.T) {
	l := Ring{{X: 0, Y: 0}, {X: 2, Y: 0}, {X: 2, Y: 1}, {X: 1, Y: 1}, {X: 1, Y: 2}, {X: 0, Y: 2}}
	rev := Ring{l[5], l[4], l[3], l[2], l[1], l[0]}
	if a, b := l.Area(), rev.Area(); math.Abs(a-3) > 1e-15 || a != b {
		t.Errorf("areas %v, %v; want 3", a, b)
	}
	hole := Ring{{X: 0.25, Y: 0.25}, {X: 0.25, Y: 0.75}, {X: 0.75, Y: 0.75}, {X: 0.75, Y: 0.25}}
	pg := Polygon{l, hole}
	for _, c := range []struct {
		p    r2.Vec
		want bool
	}{{r2.Vec{X: 1.5, Y: 0.5}, true}, {r2.Vec{X: 0.5, Y: 0.5}, false}, {r2.Vec{X: 1.5, Y: 1.5}, false}, {r2.Vec{X: 0.5, Y: 1.5}, true}} {
		if got := pg.Contains(c.p); got != c.want {
			t.Errorf("Contains(%v) = %v, want %v", c.p, got, c.want)
		}
	}
}
