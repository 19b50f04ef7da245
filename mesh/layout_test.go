package mesh

import (
	"math"

	"github.com/rimfield/rimfield/geom"
	"gonum.org/v1/gonum/spatial/r2"
)

// Test layouts are built here by hand, ring by ring, as geom would hand
// them out: boundary pieces oriented with the domain on their Left.

// ring returns the closed ring pts (no repeated closing vertex) as pieces
// in walking order.
func ring(pts []r2.Vec, left, right, owner int, c geom.Condition) []geom.Piece {
	out := make([]geom.Piece, len(pts))
	for k := range pts {
		out[k] = geom.Piece{A: pts[k], B: pts[(k+1)%len(pts)], Left: left, Right: right, Owner: owner, Cond: c}
	}
	return out
}

// line returns the open polyline pts as pieces in walking order.
func line(pts []r2.Vec, left, right, owner int, c geom.Condition) []geom.Piece {
	out := make([]geom.Piece, len(pts)-1)
	for k := range out {
		out[k] = geom.Piece{A: pts[k], B: pts[k+1], Left: left, Right: right, Owner: owner, Cond: c}
	}
	return out
}

// rect returns the corners of a rectangle counter-clockwise.
func rect(x0, y0, x1, y1 float64) []r2.Vec {
	return []r2.Vec{{X: x0, Y: y0}, {X: x1, Y: y0}, {X: x1, Y: y1}, {X: x0, Y: y1}}
}

// reversed returns pts in the opposite order (clockwise for a rect).
func reversed(pts []r2.Vec) []r2.Vec {
	out := make([]r2.Vec, len(pts))
	for k, p := range pts {
		out[len(pts)-1-k] = p
	}
	return out
}

// ngon returns n points on the circle of radius r about c, counter-clockwise.
func ngon(c r2.Vec, r float64, n int) []r2.Vec {
	out := make([]r2.Vec, n)
	for k := range out {
		a := 2 * math.Pi * float64(k) / float64(n)
		out[k] = r2.Vec{X: c.X + r*math.Cos(a), Y: c.Y + r*math.Sin(a)}
	}
	return out
}

// layout wraps pieces into a Layout with nOwners owners and nRegions
// regions, and the diagonal of their bounding box.
func layout(pieces []geom.Piece, nOwners, nRegions int, open bool) *geom.Layout {
	l := &geom.Layout{Pieces: pieces, Open: open}
	for i := 0; i < nOwners; i++ {
		l.Owners = append(l.Owners, geom.Owner{Name: string(rune('a' + i)), Part: geom.PartBody, Index: i})
	}
	for i := 0; i < nRegions; i++ {
		l.Regions = append(l.Regions, geom.Domain{Name: string(rune('A' + i)), Feature: i, Material: geom.Material{Kx: 1, Ky: 1}})
	}
	lo := r2.Vec{X: math.Inf(1), Y: math.Inf(1)}
	hi := r2.Vec{X: math.Inf(-1), Y: math.Inf(-1)}
	for _, p := range pieces {
		for _, v := range [2]r2.Vec{p.A, p.B} {
			lo.X, lo.Y = math.Min(lo.X, v.X), math.Min(lo.Y, v.Y)
			hi.X, hi.Y = math.Max(hi.X, v.X), math.Max(hi.Y, v.Y)
		}
	}
	l.Diagonal = r2.Norm(r2.Sub(hi, lo))
	return l
}

var (
	fixed1 = geom.Condition{Kind: geom.Potential, Value: 1}
	fixed2 = geom.Condition{Kind: geom.Potential, Value: 2}
)

// squareRegion: the unit square as a closed region with insulated walls.
func squareRegion() *geom.Layout {
	return layout(ring(rect(0, 0, 1, 1), 0, geom.Outside, -1, geom.Insulated), 0, 1, false)
}

// circleBody: an n-gon conductor of radius 1 in an open scene (the domain is
// outside, so the ring runs clockwise).
func circleBody(n int) *geom.Layout {
	return layout(ring(reversed(ngon(r2.Vec{}, 1, n)), 0, geom.Outside, 0, fixed1), 1, 1, true)
}

// lShape: an L-shaped closed region with its re-entrant corner at (1, 1).
func lShape() *geom.Layout {
	pts := []r2.Vec{{X: 0, Y: 0}, {X: 2, Y: 0}, {X: 2, Y: 1}, {X: 1, Y: 1}, {X: 1, Y: 2}, {X: 0, Y: 2}}
	return layout(ring(pts, 0, geom.Outside, -1, geom.Insulated), 0, 1, false)
}

// stepLine: a 4 x 1 region whose bottom carries condition left on x < 2
// (owner 0) and right on x > 2 (owner 1); the other walls are insulated.
func stepLine(left, right geom.Condition) *geom.Layout {
	ps := []geom.Piece{
		{A: r2.Vec{X: 0, Y: 0}, B: r2.Vec{X: 2, Y: 0}, Left: 0, Right: geom.Outside, Owner: 0, Cond: left},
		{A: r2.Vec{X: 2, Y: 0}, B: r2.Vec{X: 4, Y: 0}, Left: 0, Right: geom.Outside, Owner: 1, Cond: right},
	}
	ps = append(ps, line([]r2.Vec{{X: 4, Y: 0}, {X: 4, Y: 1}, {X: 0, Y: 1}, {X: 0, Y: 0}}, 0, geom.Outside, -1, geom.Insulated)...)
	return layout(ps, 2, 1, false)
}

// thinSheet: a 100 m x 100 m closed region holding an insulated sheet
// 10 mm thick and 10 m deep (a hole, so its ring runs clockwise).
func thinSheet() *geom.Layout {
	ps := ring(rect(0, 0, 100, 100), 0, geom.Outside, -1, geom.Insulated)
	ps = append(ps, ring(reversed(rect(50, 40, 50.01, 50)), 0, geom.Outside, 0, geom.Insulated)...)
	return layout(ps, 1, 1, false)
}

// twoRegions: the squares [0,1]x[0,1] (region 0) and [1,2]x[0,1] (region 1)
// sharing the interface x = 1, which may bend to x = 1+bend at y = 0.5.
func twoRegions(bend float64) *geom.Layout {
	ps := []geom.Piece{
		{A: r2.Vec{X: 0, Y: 0}, B: r2.Vec{X: 1, Y: 0}, Left: 0, Right: geom.Outside, Owner: -1, Cond: geom.Insulated},
	}
	ps = append(ps, line([]r2.Vec{{X: 1, Y: 0}, {X: 2, Y: 0}, {X: 2, Y: 1}, {X: 1, Y: 1}}, 1, geom.Outside, -1, geom.Insulated)...)
	ps = append(ps, line([]r2.Vec{{X: 1, Y: 1}, {X: 0, Y: 1}, {X: 0, Y: 0}}, 0, geom.Outside, -1, geom.Insulated)...)
	ps = append(ps, line([]r2.Vec{{X: 1, Y: 0}, {X: 1 + bend, Y: 0.5}, {X: 1, Y: 1}}, 0, 1, -1, geom.Condition{})...)
	return layout(ps, 0, 2, false)
}

// benchLayout: an L-shaped region 20 m across with a circular conductor
// (200-gon) cut out of it.
func benchLayout() *geom.Layout {
	pts := []r2.Vec{{X: 0, Y: 0}, {X: 20, Y: 0}, {X: 20, Y: 10}, {X: 10, Y: 10}, {X: 10, Y: 20}, {X: 0, Y: 20}}
	ps := ring(pts, 0, geom.Outside, -1, geom.Insulated)
	ps = append(ps, ring(reversed(ngon(r2.Vec{X: 5, Y: 5}, 2, 200)), 0, geom.Outside, 0, fixed1)...)
	return layout(ps, 1, 1, false)
}
