package mesh

import (
	"math"

	"gonum.org/v1/gonum/spatial/r2"
)

// Sheets: the two faces of a sheet (geom.Layout.Twin) are meshed alike.
// Each pair gets the nodes of whichever face asks for more panels, mirrored
// onto the other, so that the faces' panels have identical end points,
// reversed (Mesh.Twin pairs them). A sheet's free end is a vertex where its
// two faces meet turning back (graded as a tip, r^-1/2), and where it meets
// another boundary three or more pieces meet (graded too); a vertex where a
// straight sheet merely continues (two pairs of faces in line) is not.
// Across a sheet there is no gap: the faces behind a sheet's face are the
// same sheet, so only gaps across the domain size its panels.

// twinOf returns piece i's twin, or -1.
func (b *builder) twinOf(i int) int { return b.l.TwinOf(i) }

// mirrorTwins gives each pair of faces the nodes of the face with more
// panels (the first on a tie), mirrored, and updates their end lengths.
func (b *builder) mirrorTwins(nodes [][]float64, endLen [][2]float64) {
	if b.l.Twin == nil {
		return
	}
	for i := range nodes {
		j := b.twinOf(i)
		if j < i {
			continue
		}
		src, dst := i, j
		if len(nodes[j]) > len(nodes[i]) {
			src, dst = j, i
		}
		ts := nodes[src]
		L := b.lens[src]
		out := make([]float64, len(ts))
		for k, t := range ts {
			out[len(ts)-1-k] = L - t
		}
		out[0], out[len(out)-1] = 0, b.lens[dst]
		nodes[dst] = out
		endLen[dst] = [2]float64{out[1] - out[0], out[len(out)-1] - out[len(out)-2]}
	}
}

// pairPanels makes the panels of the second face of each pair the exact
// reverse of the first's (the nodes are mirrored already; this makes the
// end points identical to the last bit) and fills m.Twin.
func (b *builder) pairPanels(m *Mesh) {
	if b.l.Twin == nil {
		return
	}
	first := make([]int, b.n+1) // panels of piece i: first[i] .. first[i+1]-1
	for i := range first {
		first[i] = -1
	}
	for k := len(m.Panels) - 1; k >= 0; k-- {
		first[m.Panels[k].Piece] = k
	}
	first[b.n] = len(m.Panels)
	end := func(i int) int {
		for k := i + 1; k <= b.n; k++ {
			if first[k] >= 0 {
				return first[k]
			}
		}
		return len(m.Panels)
	}
	m.Twin = make([]int, len(m.Panels))
	for k := range m.Twin {
		m.Twin[k] = -1
	}
	for i := 0; i < b.n; i++ {
		j := b.twinOf(i)
		if j < i || first[i] < 0 || first[j] < 0 {
			continue
		}
		a0, a1 := first[i], end(i)
		c0, c1 := first[j], end(j)
		if a1-a0 != c1-c0 {
			panic("mesh: internal: the faces of a sheet have different panel counts")
		}
		n := a1 - a0
		for k := 0; k < n; k++ {
			p := m.Panels[a0+k]
			q := &m.Panels[c1-1-k]
			q.A, q.B = p.B, p.A
			m.Twin[a0+k], m.Twin[c1-1-k] = c1-1-k, a0+k
		}
	}
}

// sheetThrough reports whether the piece ends at a vertex are two pairs of
// sheet faces continuing in a straight line (within straightTol), where
// the solution is smooth: no grading.
func (b *builder) sheetThrough(ends []end) bool {
	if len(ends) != 4 || b.l.Twin == nil {
		return false
	}
	var dirs []r2.Vec
	for _, e := range ends {
		i := e.piece()
		j := b.twinOf(i)
		if j < 0 || b.l.Pieces[i].Owner != b.l.Pieces[j].Owner {
			return false
		}
		found := false
		for _, f := range ends {
			if f.piece() == j {
				found = true
			}
		}
		if !found {
			return false
		}
		dirs = append(dirs, b.dirFrom(e))
	}
	// Two directions, opposite each other.
	d0 := dirs[0]
	var d1 r2.Vec
	for _, d := range dirs[1:] {
		if r2.Dot(d, d0) < 0 {
			d1 = d
		}
	}
	angle := math.Atan2(r2.Cross(d0, d1), r2.Dot(d0, d1))
	return math.Abs(math.Abs(angle)-math.Pi) <= straightTol
}

// sheetPanels is the number of panels on each face of a sheet with domain
// on both faces below which the nominal size is not allowed to fall at the
// automatic size: the jump of potential across an impervious sheet
// converges as the square of its panels' length relative to the sheet's,
// and a sheet pile a few metres deep in a section a hundred metres wide
// would otherwise get ten panels, its exit gradient off by 1.3e-3 (4e-4
// with 32, measured with package bem/seep's sheet-pile tests).
const sheetPanels = 32

// sheetSize caps the nominal size hn on piece i when it is a face of a
// sheet: at most the sheet's length over sheetPanels at the automatic
// nominal size, in proportion to hn otherwise (a panel count or size
// asked for scales the sheet's panels with the rest).
func (b *builder) sheetSize(i int, hn float64) float64 {
	if b.l.Twin == nil || b.twinOf(i) < 0 {
		return hn
	}
	if b.sheetLen == nil {
		b.sheetLen = map[int]float64{}
		for k := range b.l.Pieces {
			if b.twinOf(k) >= 0 {
				b.sheetLen[b.l.Pieces[k].Owner] += b.lens[k] / 2
			}
		}
	}
	auto := b.total / autoPanels
	return math.Min(hn, b.sheetLen[b.l.Pieces[i].Owner]/float64(sheetPanels)*math.Max(1, hn/auto))
}
