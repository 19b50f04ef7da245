package geom

import (
	"math"

	"gonum.org/v1/gonum/spatial/r2"
)

// This file gives every piece of a body or edge its place along its owner
// as the user drew it: the arc length from the first coordinate of an edge
// or sheet (through its lines in order), or from the first vertex of a
// body's first ring, counter-clockwise (through its rings and polygons in
// order), so that an arc length read in results starts where the scene
// file does.

// arcLine is one drawn line or ring of an owner with its arc lengths.
type arcLine struct {
	pts []r2.Vec  // closed rings repeat their first point at the end
	cum []float64 // arc length at each point, from the owner's start
}

// ownerLines returns the drawn lines of owner o of the layout, rings
// closed, with the arc lengths running on from one line to the next.
func (s *Scene) ownerLines(lay *Layout, o int) []arcLine {
	var raw [][]r2.Vec
	ow := lay.Owners[o]
	switch ow.Part {
	case PartBody:
		b := s.Bodies[ow.Index]
		for _, pg := range b.Polygons {
			for _, r := range pg {
				raw = append(raw, append(append([]r2.Vec(nil), r...), r[0]))
			}
		}
		for _, l := range b.Lines {
			raw = append(raw, l)
		}
	case PartEdge:
		for _, l := range s.Edges[ow.Index].Lines {
			raw = append(raw, l)
		}
	}
	var out []arcLine
	s0 := 0.0
	for _, pts := range raw {
		cum := make([]float64, len(pts))
		cum[0] = s0
		for k := 1; k < len(pts); k++ {
			cum[k] = cum[k-1] + r2.Norm(r2.Sub(pts[k], pts[k-1]))
		}
		s0 = cum[len(cum)-1]
		out = append(out, arcLine{pts, cum})
	}
	return out
}

// setArcs sets SA and SB of every owned piece: the arc length along its
// owner as drawn at the piece's ends, found from the drawn segment its
// midpoint lies on (Drawn false for walls and interfaces, and for a piece
// not found on its owner's lines). Segments are looked up on a grid per
// owner, so the cost stays about linear in the number of pieces.
func (s *Scene) setArcs(lay *Layout) {
	byOwner := map[int][]int{}
	for i := range lay.Pieces {
		if o := lay.Pieces[i].Owner; o >= 0 {
			byOwner[o] = append(byOwner[o], i)
		}
	}
	tol := 1e-6 * lay.Diagonal
	for o, pieces := range byOwner {
		lines := s.ownerLines(lay, o)
		type seg struct{ line, k int }
		var segs []seg
		total := 0.0
		for li, l := range lines {
			for k := 0; k+1 < len(l.pts); k++ {
				segs = append(segs, seg{li, k})
				total += l.cum[k+1] - l.cum[k]
			}
		}
		if len(segs) == 0 {
			continue
		}
		cell := math.Max(total/float64(len(segs)), tol)
		type key struct{ x, y int64 }
		cellOf := func(p r2.Vec) key { return key{int64(math.Floor(p.X / cell)), int64(math.Floor(p.Y / cell))} }
		grid := map[key][]int{}
		for n, sg := range segs {
			a, b := lines[sg.line].pts[sg.k], lines[sg.line].pts[sg.k+1]
			lo, hi := cellOf(r2.Vec{X: math.Min(a.X, b.X), Y: math.Min(a.Y, b.Y)}), cellOf(r2.Vec{X: math.Max(a.X, b.X), Y: math.Max(a.Y, b.Y)})
			if (hi.x-lo.x+1)*(hi.y-lo.y+1) > 1e6 {
				continue // a segment far longer than the owner's others: found by the scan below
			}
			for x := lo.x; x <= hi.x; x++ {
				for y := lo.y; y <= hi.y; y++ {
					grid[key{x, y}] = append(grid[key{x, y}], n)
				}
			}
		}
		for _, i := range pieces {
			p := &lay.Pieces[i]
			mid := r2.Scale(0.5, r2.Add(p.A, p.B))
			c := cellOf(mid)
			best, bestN := math.Inf(1), -1
			try := func(n int) {
				sg := segs[n]
				a, b := lines[sg.line].pts[sg.k], lines[sg.line].pts[sg.k+1]
				if d := pointSegment(mid, a, b); d < best {
					best, bestN = d, n
				}
			}
			for dx := int64(-1); dx <= 1; dx++ {
				for dy := int64(-1); dy <= 1; dy++ {
					for _, n := range grid[key{c.x + dx, c.y + dy}] {
						try(n)
					}
				}
			}
			if best > tol {
				for n := range segs {
					try(n)
				}
			}
			if bestN < 0 || best > tol {
				continue
			}
			sg := segs[bestN]
			l := lines[sg.line]
			a, b := l.pts[sg.k], l.pts[sg.k+1]
			d := r2.Sub(b, a)
			sm := l.cum[sg.k] + r2.Dot(r2.Sub(mid, a), d)/r2.Norm(d)
			half := 0.5 * r2.Norm(r2.Sub(p.B, p.A))
			if r2.Dot(r2.Sub(p.B, p.A), d) >= 0 {
				p.SA, p.SB = sm-half, sm+half
			} else {
				p.SA, p.SB = sm+half, sm-half
			}
			p.Drawn = true
		}
	}
}

// pointSegment returns the distance from p to the segment ab.
func pointSegment(p, a, b r2.Vec) float64 {
	d := r2.Sub(b, a)
	L2 := r2.Dot(d, d)
	if L2 == 0 {
		return r2.Norm(r2.Sub(p, a))
	}
	t := math.Max(0, math.Min(1, r2.Dot(r2.Sub(p, a), d)/L2))
	return r2.Norm(r2.Sub(p, r2.Add(a, r2.Scale(t, d))))
}
