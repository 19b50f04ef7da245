package grid

import (
	"math"
	"sort"

	"github.com/rimfield/rimfield/bem"
	"github.com/rimfield/rimfield/geom"
	"gonum.org/v1/gonum/spatial/r2"
)

// Levels returns k levels evenly spaced strictly between lo and hi: they
// divide [lo, hi] into k+1 equal potential drops. It returns nil when k < 1
// or the range is empty or not finite.
func Levels(lo, hi float64, k int) []float64 {
	if k < 1 || !(hi > lo) || math.IsInf(lo, 0) || math.IsInf(hi, 0) {
		return nil
	}
	out := make([]float64, k)
	for i := range out {
		out[i] = lo + (hi-lo)*float64(i+1)/float64(k+1)
	}
	return out
}

// BoundaryRange returns the lowest and highest potential on the boundary
// panels of sol (interfaces between regions excluded) and on the grounded
// plane of an open scene (potential 0), if it has one. In a closed scene and
// in an open one with no net inflow these bound the potential everywhere
// (maximum principle).
func BoundaryRange(sol *bem.Solution) (lo, hi float64) {
	lo, hi = math.Inf(1), math.Inf(-1)
	if lay := sol.Mesh.Layout; lay != nil && lay.Open && lay.Ground != nil {
		lo, hi = 0, 0
	}
	for j, p := range sol.Mesh.Panels {
		if p.Interface() {
			continue
		}
		u := sol.U[j]
		if math.IsNaN(u) || math.IsInf(u, 0) {
			continue
		}
		lo, hi = math.Min(lo, u), math.Max(hi, u)
	}
	return lo, hi
}

// Contours traces the level curves of g.U at the given levels by marching
// squares: in every cell whose four corners are all finite, the crossing
// points on the cell's edges are interpolated linearly and joined; a saddle
// cell (two opposite corners above the level, two below) is decided by the
// average of its four corners, the bilinear interpolant's value at the
// centre. Cells with a masked corner are skipped, so lines stop within one
// cell of the boundary. Segments are joined into polylines; a closed line
// repeats its first point at the end. Every line gets the unit given.
//
// Lines come in the order of levels, and for one level in a fixed order (by
// their first cell), so the result does not depend on anything but g.
func Contours(g *Grid, levels []float64, unit string) []geom.LevelLine {
	var out []geom.LevelLine
	for _, lv := range levels {
		if math.IsNaN(lv) || math.IsInf(lv, 0) {
			continue
		}
		for _, pts := range contourLevel(g, lv) {
			out = append(out, geom.LevelLine{Level: lv, Unit: unit, Points: pts})
		}
	}
	return out
}

// Edge numbering: horizontal edge (i, j)-(i+1, j) is j*(NX-1)+i; vertical
// edge (i, j)-(i, j+1) is nh + j*NX + i, nh the number of horizontal edges.
type cellEdges struct{ nx, nh int }

func (e cellEdges) bottom(i, j int) int { return j*(e.nx-1) + i }
func (e cellEdges) top(i, j int) int    { return (j+1)*(e.nx-1) + i }
func (e cellEdges) left(i, j int) int   { return e.nh + j*e.nx + i }
func (e cellEdges) right(i, j int) int  { return e.nh + j*e.nx + i + 1 }

// segment joins the crossings on two edges of one cell.
type segment struct{ a, b int }

func contourLevel(g *Grid, lv float64) [][]r2.Vec {
	nx, ny := g.NX, g.NY
	ed := cellEdges{nx: nx, nh: (nx - 1) * ny}
	pos := map[int]r2.Vec{} // crossing point on each edge
	var segs []segment
	cross := func(edge, k0, k1 int, p0, p1 r2.Vec) int {
		if _, ok := pos[edge]; !ok {
			u0, u1 := g.U[k0], g.U[k1]
			t := (lv - u0) / (u1 - u0)
			t = math.Min(1, math.Max(0, t))
			pos[edge] = r2.Add(p0, r2.Scale(t, r2.Sub(p1, p0)))
		}
		return edge
	}
	for j := 0; j < ny-1; j++ {
		for i := 0; i < nx-1; i++ {
			k00, k10 := g.Index(i, j), g.Index(i+1, j)
			k01, k11 := g.Index(i, j+1), g.Index(i+1, j+1)
			u00, u10, u01, u11 := g.U[k00], g.U[k10], g.U[k01], g.U[k11]
			if math.IsNaN(u00) || math.IsNaN(u10) || math.IsNaN(u01) || math.IsNaN(u11) {
				continue
			}
			c := 0
			if u00 >= lv {
				c |= 1
			}
			if u10 >= lv {
				c |= 2
			}
			if u11 >= lv {
				c |= 4
			}
			if u01 >= lv {
				c |= 8
			}
			if c == 0 || c == 15 {
				continue
			}
			p00, p10, p01, p11 := g.Point(i, j), g.Point(i+1, j), g.Point(i, j+1), g.Point(i+1, j+1)
			bot := func() int { return cross(ed.bottom(i, j), k00, k10, p00, p10) }
			rgt := func() int { return cross(ed.right(i, j), k10, k11, p10, p11) }
			top := func() int { return cross(ed.top(i, j), k01, k11, p01, p11) }
			lft := func() int { return cross(ed.left(i, j), k00, k01, p00, p01) }
			add := func(a, b int) { segs = append(segs, segment{a, b}) }
			switch c {
			case 1, 14:
				add(lft(), bot())
			case 2, 13:
				add(bot(), rgt())
			case 3, 12:
				add(lft(), rgt())
			case 4, 11:
				add(rgt(), top())
			case 6, 9:
				add(bot(), top())
			case 7, 8:
				add(lft(), top())
			case 5, 10:
				// Saddle: corners 00 and 11 on one side, 10 and 01 on the
				// other. If the centre is on the side of 00 and 11, those
				// two corners connect through the cell and the lines cut
				// off the other two corners.
				centre := 0.25*(u00+u10+u01+u11) >= lv
				highDiag := c == 5 // 00 and 11 above
				if centre == highDiag {
					add(bot(), rgt()) // cut off corner 10
					add(top(), lft()) // cut off corner 01
				} else {
					add(lft(), bot()) // cut off corner 00
					add(rgt(), top()) // cut off corner 11
				}
			}
		}
	}
	return join(segs, pos)
}

// join links segments sharing an edge crossing into polylines: open chains
// first (from their lower-numbered free end), then closed loops.
func join(segs []segment, pos map[int]r2.Vec) [][]r2.Vec {
	at := map[int][]int{} // edge -> segments touching it (at most 2)
	for s, sg := range segs {
		at[sg.a] = append(at[sg.a], s)
		at[sg.b] = append(at[sg.b], s)
	}
	used := make([]bool, len(segs))
	walk := func(start int) []int {
		chain := []int{start}
		cur := start
		for {
			next := -1
			for _, s := range at[cur] {
				if !used[s] {
					next = s
					break
				}
			}
			if next < 0 {
				return chain
			}
			used[next] = true
			sg := segs[next]
			if sg.a == cur {
				cur = sg.b
			} else {
				cur = sg.a
			}
			chain = append(chain, cur)
		}
	}
	// Free ends: edges touched by one segment, in a fixed order.
	var ends []int
	for e, ss := range at {
		if len(ss) == 1 {
			ends = append(ends, e)
		}
	}
	sort.Ints(ends)
	var chains [][]int
	for _, e := range ends {
		if !used[at[e][0]] {
			chains = append(chains, walk(e))
		}
	}
	for s := range segs {
		if !used[s] {
			chains = append(chains, walk(segs[s].a))
		}
	}
	out := make([][]r2.Vec, 0, len(chains))
	for _, ch := range chains {
		pts := make([]r2.Vec, 0, len(ch))
		for _, e := range ch {
			p := pos[e]
			if n := len(pts); n > 0 && pts[n-1] == p {
				continue
			}
			pts = append(pts, p)
		}
		if len(pts) >= 2 {
			out = append(out, pts)
		}
	}
	return out
}
