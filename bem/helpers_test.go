package bem

import (
	"math"

	"github.com/rimfield/rimfield/geom"
	"github.com/rimfield/rimfield/mesh"
	"gonum.org/v1/gonum/spatial/r2"
)

// Test scaffolding: meshes built by hand, independent of package mesh, so
// that the numerics are checked on their own.

// ngon returns the vertices of a regular n-gon of circumradius r about c,
// counter-clockwise when ccw, starting at angle phase.
func ngon(c r2.Vec, r float64, n int, ccw bool, phase float64) []r2.Vec {
	v := make([]r2.Vec, n)
	for i := range v {
		t := phase + 2*math.Pi*float64(i)/float64(n)
		if !ccw {
			t = phase - 2*math.Pi*float64(i)/float64(n)
		}
		v[i] = r2.Vec{X: c.X + r*math.Cos(t), Y: c.Y + r*math.Sin(t)}
	}
	return v
}

// rect returns the corners of an axis-aligned rectangle, counter-clockwise.
func rect(x0, y0, x1, y1 float64) []r2.Vec {
	return []r2.Vec{{X: x0, Y: y0}, {X: x1, Y: y0}, {X: x1, Y: y1}, {X: x0, Y: y1}}
}

// reversed returns the ring in the opposite direction.
func reversed(v []r2.Vec) []r2.Vec {
	out := make([]r2.Vec, len(v))
	for i := range v {
		out[i] = v[len(v)-1-i]
	}
	return out
}

// split divides segment a-b into n panels, geometrically graded toward the
// ends when ratio > 1 (smallest panel at each end is about frac times the
// middle size).
func split(a, b r2.Vec, n int, graded bool) []r2.Vec {
	ts := make([]float64, n+1)
	if !graded {
		for i := range ts {
			ts[i] = float64(i) / float64(n)
		}
	} else {
		// Symmetric cosine-like geometric grading: sizes grow by q from each end.
		// Sizes grow by q = 1.25 from each end until the middle size is
		// reached, the smallest panel about 1/n of the middle ones, so that
		// the end panels shrink as h^2 under refinement.
		q := 1.25
		steps := int(math.Round(math.Log(float64(n)) / math.Log(q)))
		w := make([]float64, n)
		for i := 0; i < n; i++ {
			d := min(i, n-1-i, steps)
			w[i] = math.Pow(q, float64(d))
		}
		tot := 0.0
		for _, x := range w {
			tot += x
		}
		acc := 0.0
		for i := range w {
			ts[i] = acc / tot
			acc += w[i]
		}
		ts[n] = 1
	}
	out := make([]r2.Vec, n+1)
	for i, t := range ts {
		out[i] = r2.Add(a, r2.Scale(t, r2.Sub(b, a)))
	}
	out[0], out[n] = a, b // exactly, so that neighbouring panels share endpoints
	return out
}

// builder assembles a mesh by hand.
type builder struct {
	lay    geom.Layout
	panels []mesh.Panel
	twins  [][2]int // pairs of sheet faces (sheet_helpers_test.go)
}

func newBuilder(open bool) *builder {
	return &builder{lay: geom.Layout{Open: open}}
}

func (b *builder) region(name string, kx, ky float64, background bool) int {
	b.lay.Regions = append(b.lay.Regions, geom.Domain{Name: name, Feature: len(b.lay.Regions), Background: background,
		Material: geom.Material{Kx: kx, Ky: ky}})
	return len(b.lay.Regions) - 1
}

func (b *builder) owner(name string, c geom.Condition) int {
	b.lay.Owners = append(b.lay.Owners, geom.Owner{Name: name, Part: geom.PartBody, Index: len(b.lay.Owners), Cond: c})
	return len(b.lay.Owners) - 1
}

// ring adds the closed ring v (domain on the left of v's direction) with n
// panels per side.
func (b *builder) ring(v []r2.Vec, perSide int, graded bool, left, right, owner int, c geom.Condition) {
	for i := range v {
		b.segment(v[i], v[(i+1)%len(v)], perSide, graded, left, right, owner, c)
	}
}

func (b *builder) segment(p, q r2.Vec, n int, graded bool, left, right, owner int, c geom.Condition) {
	pts := split(p, q, n, graded)
	for i := 0; i < n; i++ {
		b.panels = append(b.panels, mesh.Panel{A: pts[i], B: pts[i+1], Left: left, Right: right, Owner: owner, Cond: c})
	}
}

func (b *builder) mesh() *mesh.Mesh {
	lay := b.lay
	m := &mesh.Mesh{Panels: b.panels, Layout: &lay}
	if len(b.twins) > 0 {
		m.Twin = make([]int, len(b.panels))
		for j := range m.Twin {
			m.Twin[j] = -1
		}
		for _, t := range b.twins {
			m.Twin[t[0]], m.Twin[t[1]] = t[1], t[0]
		}
	}
	lo, hi := m.Bounds()
	lay.Diagonal = r2.Norm(r2.Sub(hi, lo))
	return m
}

func pot(v float64) geom.Condition  { return geom.Condition{Kind: geom.Potential, Value: v} }
func flux(g float64) geom.Condition { return geom.Condition{Kind: geom.Flux, Value: g} }
func floating(q float64) geom.Condition {
	return geom.Condition{Kind: geom.Floating, NetInflow: q}
}

func relErr(got, want float64) float64 { return math.Abs(got-want) / math.Abs(want) }

// manufactured adds the closed polygon poly (domain on the left) with n
// panels a side and the data of an exact solution at each panel's
// midpoint: the potential u on the sides where potSide(side) is true, the
// conormal flux kgrad.n on the others. Each panel is its own owner, so data
// may vary along a side.
func (b *builder) manufactured(poly []r2.Vec, n int, graded bool, reg int,
	u func(r2.Vec) float64, kgrad func(r2.Vec) r2.Vec, potSide func(side int) bool) {
	for s := range poly {
		pts := split(poly[s], poly[(s+1)%len(poly)], n, graded)
		for i := 0; i+1 < len(pts); i++ {
			a, q := pts[i], pts[i+1]
			m := r2.Scale(0.5, r2.Add(a, q))
			c := pot(u(m))
			if !potSide(s) {
				nn := r2.Unit(r2.Vec{X: q.Y - a.Y, Y: a.X - q.X})
				c = flux(r2.Dot(kgrad(m), nn))
			}
			o := b.owner("", c)
			b.segment(a, q, 1, false, reg, geom.Outside, o, c)
		}
	}
}
