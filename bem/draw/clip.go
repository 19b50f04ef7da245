package draw

import (
	"github.com/rimfield/rimfield/bem/grid"
	"github.com/rimfield/rimfield/geom"
	"gonum.org/v1/gonum/spatial/r2"
)

// clipRing clips a closed ring to the window (Sutherland & Hodgman,
// "Reentrant polygon clipping", CACM 17(1), 1974): the result may run along
// the window's edges, which is harmless for filling. It returns nil when
// nothing is left.
func clipRing(r geom.Ring, w grid.Window) geom.Ring {
	out := append(geom.Ring(nil), r...)
	for side := range 4 {
		in := out
		out = nil
		if len(in) == 0 {
			return nil
		}
		inside := func(p r2.Vec) bool {
			switch side {
			case 0:
				return p.X >= w.Min.X
			case 1:
				return p.X <= w.Max.X
			case 2:
				return p.Y >= w.Min.Y
			}
			return p.Y <= w.Max.Y
		}
		cross := func(a, b r2.Vec) r2.Vec {
			var t float64
			switch side {
			case 0:
				t = (w.Min.X - a.X) / (b.X - a.X)
			case 1:
				t = (w.Max.X - a.X) / (b.X - a.X)
			case 2:
				t = (w.Min.Y - a.Y) / (b.Y - a.Y)
			default:
				t = (w.Max.Y - a.Y) / (b.Y - a.Y)
			}
			return r2.Add(a, r2.Scale(t, r2.Sub(b, a)))
		}
		prev := in[len(in)-1]
		for _, p := range in {
			switch {
			case inside(p) && inside(prev):
				out = append(out, p)
			case inside(p):
				out = append(out, cross(prev, p), p)
			case inside(prev):
				out = append(out, cross(prev, p))
			}
			prev = p
		}
	}
	if len(out) < 3 {
		return nil
	}
	return out
}

// clipPolygon clips every ring of a polygon; it returns nil when the outer
// ring is gone.
func clipPolygon(pg geom.Polygon, w grid.Window) geom.Polygon {
	var out geom.Polygon
	for k, r := range pg {
		c := clipRing(r, w)
		if c == nil {
			if k == 0 {
				return nil
			}
			continue
		}
		out = append(out, c)
	}
	return out
}

// clipLine cuts a polyline to the window (Liang & Barsky, "A new concept
// and method for line clipping", ACM TOG 3(1), 1984, segment by segment),
// returning the pieces inside.
func clipLine(pts []r2.Vec, w grid.Window) [][]r2.Vec {
	var out [][]r2.Vec
	var cur []r2.Vec
	for i := 0; i+1 < len(pts); i++ {
		a, b, ok := clipSegment(pts[i], pts[i+1], w)
		if !ok {
			if len(cur) > 1 {
				out = append(out, cur)
			}
			cur = nil
			continue
		}
		if len(cur) == 0 || cur[len(cur)-1] != a {
			if len(cur) > 1 {
				out = append(out, cur)
			}
			cur = []r2.Vec{a}
		}
		cur = append(cur, b)
		if b != pts[i+1] { // left the window
			out = append(out, cur)
			cur = nil
		}
	}
	if len(cur) > 1 {
		out = append(out, cur)
	}
	return out
}

func clipSegment(a, b r2.Vec, w grid.Window) (r2.Vec, r2.Vec, bool) {
	t0, t1 := 0.0, 1.0
	d := r2.Sub(b, a)
	for _, c := range [4][2]float64{{-d.X, a.X - w.Min.X}, {d.X, w.Max.X - a.X}, {-d.Y, a.Y - w.Min.Y}, {d.Y, w.Max.Y - a.Y}} {
		p, q := c[0], c[1]
		if p == 0 {
			if q < 0 {
				return a, b, false
			}
			continue
		}
		t := q / p
		if p < 0 {
			t0 = max(t0, t)
		} else {
			t1 = min(t1, t)
		}
		if t0 > t1 {
			return a, b, false
		}
	}
	na, nb := a, b
	if t0 > 0 {
		na = r2.Add(a, r2.Scale(t0, d))
	}
	if t1 < 1 {
		nb = r2.Add(a, r2.Scale(t1, d))
	}
	return na, nb, true
}
