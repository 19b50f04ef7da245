package mesh

import (
	"errors"
	"fmt"
	"math"

	"github.com/rimfield/rimfield/geom"
	"gonum.org/v1/gonum/spatial/r2"
)

// Defaults and tuning constants. They are collected here so that they can be
// tuned against the accuracy tests of package bem.
const (
	// autoPanels sets the automatic nominal size: the total length of all
	// pieces divided by autoPanels.
	autoPanels = 400
	// autoPerComponent caps the automatic nominal size on each connected
	// group of pieces at its own length divided by autoPerComponent, so that
	// a small body far from everything still gets a fair share of panels.
	autoPerComponent = 24

	defaultGrading     = 1.25 // Options.Grading
	defaultSmallest    = 1e-3 // Options.Smallest
	defaultGapFactor   = 1.0  // Options.GapFactor
	defaultMinPerPiece = 1    // Options.MinPerPiece

	// straightTol: a vertex whose domain-side angle is within straightTol
	// of pi (and where the condition does not change) is not graded.
	straightTol = 10 * math.Pi / 180

	// gapDetour: a point q of another piece counts fully as a gap seen
	// from p when the boundary path from p to q is at least gapDetour*|p-q|
	// long (q lies across a thin gap), less and less as the path shortens
	// to |p-q| (q is just further along the same boundary, as on a finely
	// divided circle). See gapAt.
	gapDetour = 2.0
	// gapReach: the gap search from a piece looks no further than
	// gapReach times the piece's length over GapFactor (beyond that the gap
	// cannot cost more than a fraction of a panel).
	gapReach = 4.0
	// gapSampling: the gap is sampled along a piece with spacing at most
	// gapSampling times the distance to the nearest piece that does not
	// touch it, and interpolated linearly.
	gapSampling = 0.25
	// bodyFraction and bodyFloor: across a body (the thickness of a sheet
	// pile, a thin plate or a slot outside the domain) the potential jumps
	// from one face to the other, and each face sees the other's
	// piecewise-constant potential from a distance g. Panels there are held
	// to bodyFraction*g, but not below bodyFloor times the nominal size
	// unless g itself is shorter: max(bodyFraction*g, min(g, bodyFloor*h0)).
	// Measured on sheet piles in a 100 m section (bem/seep,
	// TestDischargeBesidePiles): with panels as long as the thickness
	// (GapFactor 1 alone) the discharge was 6e-4 off beside a 0.2 m pile
	// and 5.6e-4 beside a 1 m pile (whose faces had the nominal 0.64 m),
	// the error falling about as the square of panel length over
	// thickness; with this rule 6e-5 and 1.4e-4. The floor keeps piles a
	// few centimetres thick, whose faces would otherwise need tens of
	// thousands of panels, at panels as long as their thickness (2e-4 at
	// 5 cm, 1e-4 at 2 cm).
	bodyFraction = 0.25
	bodyFloor    = 1.0 / 16

	// floorRatio: no size target falls below floorRatio times the smallest
	// graded size, nor below floorDiag times the scene diagonal.
	floorRatio = 1e-3
	floorDiag  = 1e-9

	// mergeTol: piece endpoints closer than mergeTol times the diagonal are
	// the same vertex.
	mergeTol = 1e-12

	// panelsAim: with Options.Panels the search for the nominal size stops
	// when the count is within panelsAim (relative) of the request;
	// panelsAccept is the largest miss accepted without an error.
	panelsAim    = 0.05
	panelsAccept = 0.10

	// stepsPerPanel: integration steps of 1/h per local panel length.
	stepsPerPanel = 8
	// capPasses: passes that grade pieces down to a short neighbouring
	// piece's panels (see place).
	capPasses = 4

	// maxPanels: Build refuses to make more panels than this (a size
	// given in the wrong unit, say).
	maxPanels = 4_000_000
)

// Options controls panel sizes. The zero value gives automatic sizing with
// the documented defaults.
type Options struct {
	// Panels is the approximate total number of panels; the nominal size is
	// searched for so that the count lands within about 10% of it. 0: the
	// nominal size comes from Size or is automatic.
	Panels int
	// Size is the nominal panel length in metres. 0: automatic, the total
	// length of all pieces over 400, and on each connected group of pieces
	// at most the group's length over 24. Panels wins if both are set.
	Size float64
	// Grading is the size ratio between neighbouring panels toward a
	// singular vertex (> 1). 0: 1.25.
	Grading float64
	// Smallest is the length of the panels at a singular vertex as a
	// fraction of the nominal size, in (0, 1]. 0: 1e-3. 1 turns grading off.
	Smallest float64
	// GapFactor bounds the panel length by GapFactor times the local gap:
	// the distance to the nearest boundary across the domain, and across a
	// body (for a thin sheet, its thickness) a quarter of GapFactor times
	// it, though not below a sixteenth of the nominal size unless the gap
	// itself is shorter (see the package documentation). Must be > 0. 0: 1.
	GapFactor float64
	// MinPerPiece is the least number of panels on each layout piece. 0: 1.
	MinPerPiece int
	// MaxPanels is the most panels the mesh may make: a feature so thin or
	// a gap so narrow that panels no longer than it would make more stops
	// Build at once with a *TooFineError naming it. 0: 20 000 for an
	// automatic mesh (about what the dense solver takes), four times Panels
	// (at least 20 000) when Panels is given, a few million with Size.
	MaxPanels int
}

// resolve fills in the defaults and checks the options.
func (o Options) resolve() (Options, error) {
	if o.Panels < 0 {
		return o, fmt.Errorf("mesh: panel count %d is negative; ask for a positive count or 0 for automatic", o.Panels)
	}
	if !(o.Size >= 0) || math.IsInf(o.Size, 1) {
		return o, fmt.Errorf("mesh: panel size %g m is not a positive finite length; give one or 0 for automatic", o.Size)
	}
	if o.Grading == 0 {
		o.Grading = defaultGrading
	}
	if !(o.Grading > 1) || math.IsInf(o.Grading, 1) {
		return o, fmt.Errorf("mesh: grading ratio %g must be a finite number above 1 (0 for the default %g)", o.Grading, defaultGrading)
	}
	if o.Smallest == 0 {
		o.Smallest = defaultSmallest
	}
	if !(o.Smallest > 0 && o.Smallest <= 1) {
		return o, fmt.Errorf("mesh: smallest panel fraction %g must lie in (0, 1] (0 for the default %g)", o.Smallest, defaultSmallest)
	}
	if o.GapFactor == 0 {
		o.GapFactor = defaultGapFactor
	}
	if !(o.GapFactor > 0) || math.IsInf(o.GapFactor, 1) {
		return o, fmt.Errorf("mesh: gap factor %g must be a positive finite number (0 for the default %g)", o.GapFactor, defaultGapFactor)
	}
	if o.MinPerPiece < 0 {
		return o, fmt.Errorf("mesh: minimum panels per piece %d is negative; give a positive number or 0 for the default", o.MinPerPiece)
	}
	if o.MinPerPiece == 0 {
		o.MinPerPiece = defaultMinPerPiece
	}
	return o, nil
}

// Build splits every piece of the layout into straight panels.
//
// The target panel length at a point p of a piece is
//
//	h(p) = min(h0, GapFactor*gap(p), body(GapFactor*bgap(p)), min over singular vertices v of max(hmin, ln(Grading)*|p-v|))
//
// with h0 the nominal size, hmin = Smallest*h0, gap(p) the distance across
// the domain to the nearest piece that neither touches p's piece nor
// continues it along the boundary (see gapDetour), bgap(p) the same across
// a body (see gapAt) and body(g) = max(bodyFraction*g, min(g, bodyFloor*h0)).
// The gap terms are limited to grow no faster than the grading term along
// the boundary. The term ln(Grading)*r makes the
// lengths of consecutive panels toward v a geometric series of ratio
// Grading. A piece gets ceil(integral of 1/h) panels (at least MinPerPiece),
// with nodes placed at equal steps of that integral.
//
// Singular vertices are those where the domain-side opening angle exceeds
// pi by more than 10 degrees (re-entrant corners, tips; either side of an
// interface), where the condition changes between two boundary pieces, where
// three or more pieces meet, and where a chain of pieces ends.
//
// A piece next to a much shorter one is divided again so that its panels
// grade down to the short piece's (see place).
//
// Panels come grouped by piece in the layout's order, each piece's panels
// from A to B, and inherit Left, Right, Owner and Cond.
//
// Build returns an error for a nil or empty layout, non-finite coordinates,
// a zero-length piece, invalid options, a panel count below what the layout
// needs, and sizes that would make more than a few million panels.
func Build(l *geom.Layout, o Options) (*Mesh, error) {
	if l == nil || len(l.Pieces) == 0 {
		return nil, errors.New("mesh: the layout has no boundary pieces; the scene needs at least one body or region")
	}
	o, err := o.resolve()
	if err != nil {
		return nil, err
	}
	b, err := newBuilder(l, o)
	if err != nil {
		return nil, err
	}
	b.classify()
	if err := b.sampleGaps(); err != nil {
		return nil, err
	}

	h0, scale := b.nominal()
	if o.Panels > maxPanels {
		return nil, fmt.Errorf("mesh: %d panels asked for, more than the %d this program makes; ask for fewer", o.Panels, maxPanels)
	}
	if o.Panels == 0 && b.total/h0 > maxPanels {
		return nil, fmt.Errorf("mesh: panel size %g m would make more than %d panels on %g m of boundary; give a larger size (in metres) or a panel count", h0, maxPanels, b.total)
	}
	if o.Panels > 0 {
		h0, err = b.searchPanels(o.Panels, scale)
		if err != nil {
			return nil, err
		}
	}
	if limit := o.limit(); o.Panels == 0 {
		if n := b.count(h0, scale); n > limit {
			return nil, b.tooMany(h0, scale, n)
		}
	}
	m := &Mesh{Layout: l, Size: h0}
	for _, v := range b.singular {
		m.Singular = append(m.Singular, b.verts[v])
	}
	sStart := b.arcStarts()
	nodes, _ := b.place(h0, scale, true)
	for i, ts := range nodes {
		pc := l.Pieces[i]
		d := r2.Sub(pc.B, pc.A)
		prev := pc.A
		for k := 1; k < len(ts); k++ {
			next := pc.B
			if k < len(ts)-1 {
				next = r2.Add(pc.A, r2.Scale(ts[k]/b.lens[i], d))
			}
			t := 0.5 * (ts[k-1] + ts[k])
			s := sStart[i] + t
			if pc.Drawn {
				// Along the owner as drawn, from its first point.
				s = pc.SA + (pc.SB-pc.SA)*t/b.lens[i]
			}
			m.Panels = append(m.Panels, Panel{
				A: prev, B: next,
				Left: pc.Left, Right: pc.Right,
				Owner: pc.Owner, Cond: pc.Cond,
				Piece: i,
				S:     s,
			})
			prev = next
		}
	}
	b.pairPanels(m)
	return m, nil
}

// end is one end of a piece at a vertex: piece index*2, +1 for the B end.
type end int32

func (e end) piece() int { return int(e) / 2 }
func (e end) isB() bool  { return e%2 == 1 }

type builder struct {
	l     *geom.Layout
	o     Options
	n     int
	lens  []float64
	total float64
	diag  float64
	lo    r2.Vec // bounding box corner

	verts  []r2.Vec
	vA, vB []int
	inc    [][]end // incident piece ends per vertex

	comp    []int     // connected component of each piece
	compLen []float64 // total length per component

	singular []int // vertex ids, ascending
	sgrid    *pointGrid

	grid *segGrid
	gapT [][]float64 // per piece: sample positions along the piece
	gapH [][]float64 // per piece: GapFactor*gap across the domain, slope-limited
	gapB [][]float64 // per piece: GapFactor*gap across a body or outside the domain, slope-limited
	lg   float64     // ln(Grading)
	flo  float64     // absolute size floor from the diagonal

	sheetLen map[int]float64 // per owner: the length of its sheet with domain on both faces (sheet.go)
}

func newBuilder(l *geom.Layout, o Options) (*builder, error) {
	n := len(l.Pieces)
	b := &builder{l: l, o: o, n: n, lens: make([]float64, n), lg: math.Log(o.Grading)}
	lo := r2.Vec{X: math.Inf(1), Y: math.Inf(1)}
	hi := r2.Vec{X: math.Inf(-1), Y: math.Inf(-1)}
	for i, p := range l.Pieces {
		for _, v := range [2]r2.Vec{p.A, p.B} {
			if math.IsNaN(v.X) || math.IsNaN(v.Y) || math.IsInf(v.X, 0) || math.IsInf(v.Y, 0) {
				return nil, fmt.Errorf("mesh: piece %d has a non-finite coordinate (%g, %g); the geometry must be finite", i, v.X, v.Y)
			}
			lo.X, lo.Y = math.Min(lo.X, v.X), math.Min(lo.Y, v.Y)
			hi.X, hi.Y = math.Max(hi.X, v.X), math.Max(hi.Y, v.Y)
		}
		b.lens[i] = r2.Norm(r2.Sub(p.B, p.A))
		if math.IsInf(b.lens[i], 0) {
			return nil, fmt.Errorf("mesh: piece %d is too long to measure; check the coordinate unit", i)
		}
		b.total += b.lens[i]
	}
	b.lo = lo
	b.diag = r2.Norm(r2.Sub(hi, lo))
	b.flo = floorDiag * b.diag
	tol := mergeTol * b.diag
	for i, p := range l.Pieces {
		if b.lens[i] <= tol {
			return nil, fmt.Errorf("mesh: piece %d from (%g, %g) to (%g, %g) has zero length; remove repeated vertices", i, p.A.X, p.A.Y, p.B.X, p.B.Y)
		}
	}
	b.vertices(tol)
	b.grid = newSegGrid(l.Pieces, b.lens, lo, hi, b.total)
	return b, nil
}

// vertices merges piece endpoints into vertices: exact equality first, then
// anything within tol.
func (b *builder) vertices(tol float64) {
	exact := make(map[r2.Vec]int)
	type key struct{ x, y int64 }
	cells := make(map[key][]int)
	cellOf := func(p r2.Vec) key {
		return key{int64(math.Floor((p.X - b.lo.X) / tol)), int64(math.Floor((p.Y - b.lo.Y) / tol))}
	}
	find := func(p r2.Vec) int {
		if id, ok := exact[p]; ok {
			return id
		}
		if tol > 0 {
			c := cellOf(p)
			for dx := int64(-1); dx <= 1; dx++ {
				for dy := int64(-1); dy <= 1; dy++ {
					for _, id := range cells[key{c.x + dx, c.y + dy}] {
						if r2.Norm(r2.Sub(b.verts[id], p)) <= tol {
							exact[p] = id
							return id
						}
					}
				}
			}
		}
		id := len(b.verts)
		b.verts = append(b.verts, p)
		b.inc = append(b.inc, nil)
		exact[p] = id
		if tol > 0 {
			c := cellOf(p)
			cells[c] = append(cells[c], id)
		}
		return id
	}
	b.vA = make([]int, b.n)
	b.vB = make([]int, b.n)
	for i, p := range b.l.Pieces {
		b.vA[i] = find(p.A)
		b.vB[i] = find(p.B)
		b.inc[b.vA[i]] = append(b.inc[b.vA[i]], end(2*i))
		b.inc[b.vB[i]] = append(b.inc[b.vB[i]], end(2*i+1))
	}

	// Connected components by union-find over vertices.
	parent := make([]int, len(b.verts))
	for i := range parent {
		parent[i] = i
	}
	var root func(int) int
	root = func(v int) int {
		for parent[v] != v {
			parent[v] = parent[parent[v]]
			v = parent[v]
		}
		return v
	}
	for i := 0; i < b.n; i++ {
		ra, rb := root(b.vA[i]), root(b.vB[i])
		if ra != rb {
			parent[ra] = rb
		}
	}
	ids := make(map[int]int)
	b.comp = make([]int, b.n)
	for i := 0; i < b.n; i++ {
		r := root(b.vA[i])
		c, ok := ids[r]
		if !ok {
			c = len(b.compLen)
			ids[r] = c
			b.compLen = append(b.compLen, 0)
		}
		b.comp[i] = c
		b.compLen[c] += b.lens[i]
	}
}

// dirFrom returns the unit direction of the piece leaving the vertex at end e.
func (b *builder) dirFrom(e end) r2.Vec {
	p := b.l.Pieces[e.piece()]
	if e.isB() {
		return r2.Unit(r2.Sub(p.A, p.B))
	}
	return r2.Unit(r2.Sub(p.B, p.A))
}

// ccwRegion is the region in the sector counter-clockwise of the piece's
// direction at end e; cwRegion the one clockwise of it.
func (b *builder) ccwRegion(e end) int {
	p := b.l.Pieces[e.piece()]
	if e.isB() {
		return p.Right
	}
	return p.Left
}

func (b *builder) cwRegion(e end) int {
	p := b.l.Pieces[e.piece()]
	if e.isB() {
		return p.Left
	}
	return p.Right
}

// classify finds the singular vertices.
func (b *builder) classify() {
	for v, ends := range b.inc {
		if b.singularAt(ends) {
			b.singular = append(b.singular, v)
		}
	}
	pts := make([]r2.Vec, len(b.singular))
	for k, v := range b.singular {
		pts[k] = b.verts[v]
	}
	b.sgrid = newPointGrid(pts, b.grid)
}

func (b *builder) singularAt(ends []end) bool {
	if len(ends) != 2 {
		// A chain ends here, or three or more pieces meet (a straight
		// sheet merely continuing is no corner: sheet.go).
		return !b.sheetThrough(ends)
	}
	e1, e2 := ends[0], ends[1]
	p1, p2 := b.l.Pieces[e1.piece()], b.l.Pieces[e2.piece()]
	if !p1.Interface() && !p2.Interface() && condChange(p1, p2) {
		return true
	}
	if b.ccwRegion(e1) != b.cwRegion(e2) || b.ccwRegion(e2) != b.cwRegion(e1) {
		return true // inconsistent sides: grade rather than guess
	}
	d1, d2 := b.dirFrom(e1), b.dirFrom(e2)
	a := math.Atan2(d1.X*d2.Y-d1.Y*d2.X, d1.X*d2.X+d1.Y*d2.Y) // angle from d1 to d2, (-pi, pi]
	if a == 0 {
		return true // the pieces leave in the same direction: a cusp or a slit tip
	}
	if a < 0 {
		a += 2 * math.Pi
	}
	// Sector counter-clockwise from d1 to d2 has angle a, the other 2pi-a.
	if b.ccwRegion(e1) != geom.Outside && a > math.Pi+straightTol {
		return true
	}
	if b.ccwRegion(e2) != geom.Outside && 2*math.Pi-a > math.Pi+straightTol {
		return true
	}
	return false
}

// condChange reports whether the boundary condition changes between two
// boundary pieces: a different kind, or a different owner with a different
// value (separate floating boundaries always differ: each has its own
// unknown potential).
func condChange(p, q geom.Piece) bool {
	if p.Cond.Kind != q.Cond.Kind {
		return true
	}
	if p.Owner == q.Owner {
		return false
	}
	if p.Cond.Kind == geom.Floating {
		return true
	}
	return p.Cond.Value != q.Cond.Value
}

// nominal returns the automatic nominal size and the per-component factor
// applied to any nominal size (all ones when the user gave Size).
func (b *builder) nominal() (float64, []float64) {
	scale := make([]float64, len(b.compLen))
	for c := range scale {
		scale[c] = 1
	}
	if b.o.Size > 0 && b.o.Panels == 0 {
		return b.o.Size, scale
	}
	h0 := b.total / autoPanels
	for c, L := range b.compLen {
		scale[c] = math.Min(1, L/autoPerComponent/h0)
	}
	return h0, scale
}

// count returns the total panel count for nominal size h0.
func (b *builder) count(h0 float64, scale []float64) int {
	_, n := b.place(h0, scale, false)
	return n
}

// place divides every piece for nominal size h0 (times the component's
// scale) and returns the nodes of each piece (when keep is set) and the
// total panel count.
//
// A piece can only be divided into whole panels, so a piece shorter than
// the local size (or a little longer) gets panels shorter than its
// neighbours'. Where, at a vertex, a piece's end panel is more than Grading
// times longer than the shortest end panel s there, a further pass divides
// that piece again with h <= s + ln(Grading)*d, d the distance from the
// vertex, so that it grades down to its short neighbour; up to capPasses
// passes, as a piece divided again may leave a shorter end panel.
func (b *builder) place(h0 float64, scale []float64, keep bool) ([][]float64, int) {
	var ev evaluator
	nodes := make([][]float64, b.n)
	endLen := make([][2]float64, b.n)
	for i := 0; i < b.n; i++ {
		ts := b.pieceNodes(&ev, i, b.sheetSize(i, h0*scale[b.comp[i]]), noCaps)
		nodes[i] = ts
		endLen[i] = [2]float64{ts[1] - ts[0], ts[len(ts)-1] - ts[len(ts)-2]}
	}
	b.mirrorTwins(nodes, endLen)
	caps := make([][2]float64, b.n)
	for i := range caps {
		caps[i] = noCaps
	}
	changed := make([]bool, b.n)
	for pass := 0; pass < capPasses; pass++ {
		again := false
		for _, ends := range b.inc {
			s := math.Inf(1)
			for _, e := range ends {
				s = math.Min(s, endLen[e.piece()][btoi(e.isB())])
			}
			for _, e := range ends {
				i, k := e.piece(), btoi(e.isB())
				if endLen[i][k] > b.o.Grading*s && s < caps[i][k] {
					caps[i][k] = s
					changed[i], again = true, true
				}
			}
		}
		if !again {
			break
		}
		for i := range changed {
			if changed[i] {
				ts := b.pieceNodes(&ev, i, b.sheetSize(i, h0*scale[b.comp[i]]), caps[i])
				nodes[i] = ts
				endLen[i] = [2]float64{ts[1] - ts[0], ts[len(ts)-1] - ts[len(ts)-2]}
				changed[i] = false
			}
		}
		b.mirrorTwins(nodes, endLen)
	}
	total := 0
	for _, ts := range nodes {
		total += len(ts) - 1
	}
	if !keep {
		nodes = nil
	}
	return nodes, total
}

// noCaps: no size caps at a piece's ends.
var noCaps = [2]float64{math.Inf(1), math.Inf(1)}

func btoi(b bool) int {
	if b {
		return 1
	}
	return 0
}

// searchPanels finds the nominal size giving about want panels. The count
// does not increase with h0.
func (b *builder) searchPanels(want int, scale []float64) (float64, error) {
	hBig := 2 * math.Max(b.total, b.diag) / b.o.Smallest
	cMin := b.count(hBig, scale)
	if cMin >= want {
		if float64(cMin) > (1+panelsAccept)*float64(want) {
			return 0, fmt.Errorf("mesh: %d panels asked for, but this layout needs at least %d (at least %d per piece on %d pieces, more where boundaries are close); ask for %d or more",
				want, cMin, b.o.MinPerPiece, b.n, cMin)
		}
		return b.shrink(hBig, cMin, scale), nil
	}
	good := func(c int) bool { return math.Abs(float64(c-want)) <= panelsAim*float64(want) }
	// Bracket: hLo gives at least want panels, hHi fewer.
	hHi, cHi := hBig, cMin
	hLo := b.total / float64(want)
	cLo := b.count(hLo, scale)
	for k := 0; cLo < want && k < 80; k++ {
		if good(cLo) {
			return hLo, nil
		}
		hHi, cHi = hLo, cLo
		hLo /= 2
		cLo = b.count(hLo, scale)
	}
	best, bestC := hLo, cLo
	for k := 0; k < 60; k++ {
		if good(cLo) {
			return hLo, nil
		}
		if good(cHi) {
			if hHi == hBig {
				return b.shrink(hBig, cMin, scale), nil
			}
			return hHi, nil
		}
		// Secant on log(count) against log(h0), kept inside the bracket.
		lh, lH := math.Log(hLo), math.Log(hHi)
		f := (math.Log(float64(want)) - math.Log(float64(cLo))) / (math.Log(float64(cHi)) - math.Log(float64(cLo)))
		if !(f > 0.05 && f < 0.95) || k%3 == 2 {
			f = 0.5
		}
		h := math.Exp(lh + f*(lH-lh))
		c := b.count(h, scale)
		if math.Abs(float64(c-want)) < math.Abs(float64(bestC-want)) {
			best, bestC = h, c
		}
		if c >= want {
			hLo, cLo = h, c
		} else {
			hHi, cHi = h, c
		}
		if hHi/hLo < 1+1e-9 {
			break
		}
	}
	if math.Abs(float64(bestC-want)) > panelsAccept*float64(want) {
		return 0, fmt.Errorf("mesh: no panel size gives about %d panels (closest: %d); ask for a different count", want, bestC)
	}
	return best, nil
}

// shrink returns the smallest nominal size (within 1%) below h that still
// gives c panels, so that a mesh with as few panels as the layout allows
// does not report an arbitrary huge nominal size.
func (b *builder) shrink(h float64, c int, scale []float64) float64 {
	lo, hi := h/2, h
	for b.count(lo, scale) == c && lo > b.flo {
		hi, lo = lo, lo/2
	}
	for hi/lo > 1.01 {
		m := math.Sqrt(lo * hi)
		if b.count(m, scale) == c {
			hi = m
		} else {
			lo = m
		}
	}
	return hi
}

// evaluator holds scratch space for placing nodes on one piece at a time.
type evaluator struct {
	near []int32
	ts   []float64
	fs   []float64
}

// pieceNodes returns the node positions (distance from A, first 0, last the
// piece length) on piece i for the nominal size hn, with the size growing
// from at most caps[0] at A and caps[1] at B at the grading rate.
func (b *builder) pieceNodes(ev *evaluator, i int, hn float64, caps [2]float64) []float64 {
	L := b.lens[i]
	hmin := b.o.Smallest * hn
	floor := math.Max(floorRatio*hmin, b.flo)
	pc := b.l.Pieces[i]
	dir := r2.Scale(1/L, r2.Sub(pc.B, pc.A))
	ev.near = ev.near[:0]
	if hmin < hn {
		ev.near = b.sgrid.near(ev.near, pc.A, pc.B, hn/b.lg)
	}
	gt, gh, gb := b.gapT[i], b.gapH[i], b.gapB[i]
	k := 0
	h := func(t float64) float64 {
		p := r2.Add(pc.A, r2.Scale(t, dir))
		s := hn
		for _, j := range ev.near {
			if g := math.Max(hmin, b.lg*r2.Norm(r2.Sub(p, b.sgrid.pts[j]))); g < s {
				s = g
			}
		}
		s = math.Min(s, math.Min(caps[0]+b.lg*t, caps[1]+b.lg*(L-t)))
		for k+2 < len(gt) && gt[k+1] < t {
			k++
		}
		w := (t - gt[k]) / (gt[k+1] - gt[k])
		w = math.Max(0, math.Min(1, w))
		if !math.IsInf(gh[k], 1) && !math.IsInf(gh[k+1], 1) {
			if g := gh[k] + w*(gh[k+1]-gh[k]); g < s {
				s = g
			}
		}
		if !math.IsInf(gb[k], 1) && !math.IsInf(gb[k+1], 1) {
			g := gb[k] + w*(gb[k+1]-gb[k])
			if g = math.Max(bodyFraction*g, math.Min(g, bodyFloor*hn)); g < s {
				s = g
			}
		}
		return math.Max(s, floor)
	}
	ev.ts = append(ev.ts[:0], 0)
	ev.fs = append(ev.fs[:0], 0)
	t, ht, F := 0.0, h(0), 0.0
	for t < L {
		dt := ht / stepsPerPanel
		tn := t + dt
		if tn > L || L-tn < 1e-3*dt {
			tn = L
		}
		hNext := h(tn)
		F += 0.5 * (tn - t) * (1/ht + 1/hNext)
		t, ht = tn, hNext
		ev.ts = append(ev.ts, t)
		ev.fs = append(ev.fs, F)
	}
	n := int(math.Ceil(F * (1 - 1e-9)))
	if n < b.o.MinPerPiece {
		n = b.o.MinPerPiece
	}
	nodes := make([]float64, n+1)
	j := 0
	for m := 1; m < n; m++ {
		target := F * float64(m) / float64(n)
		for j+2 < len(ev.fs) && ev.fs[j+1] < target {
			j++
		}
		f0, f1 := ev.fs[j], ev.fs[j+1]
		w := 0.0
		if f1 > f0 {
			w = (target - f0) / (f1 - f0)
		}
		nodes[m] = ev.ts[j] + w*(ev.ts[j+1]-ev.ts[j])
	}
	nodes[n] = L
	return nodes
}

// arcStarts returns, for each piece, the arc length at its A end along its
// owner's boundary: the owner's pieces are walked as connected chains
// (following pieces end to start), cumulative over the owner's chains in
// the order their first pieces appear. Pieces with Owner -1 are walked in
// chains of pieces with the same sides, each chain starting from 0.
func (b *builder) arcStarts() []float64 {
	type group struct {
		owner, left, right int
	}
	keyOf := func(i int) group {
		p := b.l.Pieces[i]
		if p.Owner >= 0 {
			return group{owner: p.Owner}
		}
		return group{owner: -1, left: p.Left, right: p.Right}
	}
	s := make([]float64, b.n)
	done := make([]bool, b.n)
	total := make(map[group]float64)
	// next returns an unvisited piece of the same group starting where
	// piece i ends, preferring the next piece in layout order.
	next := func(i int, seen []bool) int {
		k := keyOf(i)
		if j := i + 1; j < b.n && !seen[j] && b.vA[j] == b.vB[i] && keyOf(j) == k {
			return j
		}
		for _, e := range b.inc[b.vB[i]] {
			j := e.piece()
			if !e.isB() && !seen[j] && keyOf(j) == k {
				return j
			}
		}
		return -1
	}
	prev := func(i int, seen []bool) int {
		k := keyOf(i)
		if j := i - 1; j >= 0 && !seen[j] && b.vB[j] == b.vA[i] && keyOf(j) == k {
			return j
		}
		for _, e := range b.inc[b.vA[i]] {
			j := e.piece()
			if e.isB() && !seen[j] && keyOf(j) == k {
				return j
			}
		}
		return -1
	}
	back := make([]bool, b.n)
	var touched []int
	for i := 0; i < b.n; i++ {
		if done[i] {
			continue
		}
		// Walk back to the start of the chain (or once round a loop).
		start := i
		back[i] = true
		touched = append(touched[:0], i)
		for {
			j := prev(start, done)
			if j == i {
				start = i // a closed loop: start where the layout starts it
				break
			}
			if j < 0 || back[j] {
				break
			}
			back[j] = true
			touched = append(touched, j)
			start = j
		}
		for _, j := range touched {
			back[j] = false
		}
		k := keyOf(start)
		acc := 0.0
		if k.owner >= 0 {
			acc = total[k]
		}
		for j := start; j >= 0; j = next(j, done) {
			done[j] = true
			s[j] = acc
			acc += b.lens[j]
		}
		if k.owner >= 0 {
			total[k] = acc
		}
	}
	return s
}

// segGrid is a uniform grid over the layout's bounding box; each cell lists
// the pieces that pass through it.
type segGrid struct {
	lo     r2.Vec
	cell   float64
	nx, ny int
	cells  [][]int32
}

func newSegGrid(pieces []geom.Piece, lens []float64, lo, hi r2.Vec, total float64) *segGrid {
	n := float64(len(pieces))
	w, h := hi.X-lo.X, hi.Y-lo.Y
	// About 4 cells per piece at most, and at most about 8 cells crossed
	// per piece on average.
	cell := math.Max(math.Sqrt(w*h/(4*n)), total/(8*n))
	g := &segGrid{lo: lo, cell: cell, nx: int(w/cell) + 1, ny: int(h/cell) + 1}
	g.cells = make([][]int32, g.nx*g.ny)
	for i, p := range pieces {
		// Cover the piece by sub-segments no longer than half a cell; the
		// bounding box of each covers it.
		m := int(math.Ceil(2*lens[i]/cell)) + 1
		d := r2.Sub(p.B, p.A)
		a := p.A
		for k := 1; k <= m; k++ {
			c := p.B
			if k < m {
				c = r2.Add(p.A, r2.Scale(float64(k)/float64(m), d))
			}
			x0, y0 := g.index(r2.Vec{X: math.Min(a.X, c.X), Y: math.Min(a.Y, c.Y)})
			x1, y1 := g.index(r2.Vec{X: math.Max(a.X, c.X), Y: math.Max(a.Y, c.Y)})
			for x := x0; x <= x1; x++ {
				for y := y0; y <= y1; y++ {
					l := g.cells[y*g.nx+x]
					if len(l) == 0 || l[len(l)-1] != int32(i) {
						g.cells[y*g.nx+x] = append(l, int32(i))
					}
				}
			}
			a = c
		}
	}
	return g
}

// index returns the cell of p, clamped to the grid.
func (g *segGrid) index(p r2.Vec) (int, int) {
	x := int((p.X - g.lo.X) / g.cell)
	y := int((p.Y - g.lo.Y) / g.cell)
	return min(max(x, 0), g.nx-1), min(max(y, 0), g.ny-1)
}

// pointGrid holds points (singular vertices, size sources) on the cells of
// a segGrid.
type pointGrid struct {
	g     *segGrid
	pts   []r2.Vec
	cells map[int][]int32
}

func newPointGrid(pts []r2.Vec, g *segGrid) *pointGrid {
	pg := &pointGrid{g: g, pts: pts, cells: make(map[int][]int32)}
	for k, p := range pts {
		x, y := g.index(p)
		pg.cells[y*g.nx+x] = append(pg.cells[y*g.nx+x], int32(k))
	}
	return pg
}

// near appends to dst the indices of the points within distance r of
// segment ab.
func (pg *pointGrid) near(dst []int32, a, b r2.Vec, r float64) []int32 {
	if len(pg.pts) == 0 {
		return dst
	}
	g := pg.g
	x0, y0 := g.index(r2.Vec{X: math.Min(a.X, b.X) - r, Y: math.Min(a.Y, b.Y) - r})
	x1, y1 := g.index(r2.Vec{X: math.Max(a.X, b.X) + r, Y: math.Max(a.Y, b.Y) + r})
	if (x1-x0+1)*(y1-y0+1) > len(pg.pts) {
		for k, p := range pg.pts {
			if d, _ := segDist(p, a, b); d <= r {
				dst = append(dst, int32(k))
			}
		}
		return dst
	}
	for x := x0; x <= x1; x++ {
		for y := y0; y <= y1; y++ {
			for _, k := range pg.cells[y*g.nx+x] {
				if d, _ := segDist(pg.pts[k], a, b); d <= r {
					dst = append(dst, k)
				}
			}
		}
	}
	return dst
}

// segDist returns the distance from p to segment ab and the distance from a
// of the nearest point along the segment.
func segDist(p, a, b r2.Vec) (float64, float64) {
	d := r2.Sub(b, a)
	L2 := r2.Dot(d, d)
	t := r2.Dot(r2.Sub(p, a), d) / L2
	t = math.Max(0, math.Min(1, t))
	q := r2.Add(a, r2.Scale(t, d))
	return r2.Norm(r2.Sub(p, q)), t * math.Sqrt(L2)
}

// gapSearch holds scratch space for the gap computation of one piece.
type gapSearch struct {
	stamp  []int32 // per piece: last query that saw it
	query  int32
	distA  []float64 // per vertex: boundary distance from the piece's A end
	distB  []float64
	vstamp []int32 // per vertex: piece whose Dijkstra filled distA/distB
	heap   vheap
}

// sampleGaps samples GapFactor*gap along every piece and limits its growth
// to the grading rate along the boundary. Samples are spaced by at most
// gapSampling times the distance to the nearest piece not touching this one
// (a bound that varies no faster than the position), so that a gap that
// opens only away from the piece's ends is not missed.
func (b *builder) sampleGaps() error {
	b.gapT = make([][]float64, b.n)
	b.gapH = make([][]float64, b.n)
	b.gapB = make([][]float64, b.n)
	nv := len(b.verts)
	gs := &gapSearch{
		stamp:  make([]int32, b.n),
		distA:  make([]float64, nv),
		distB:  make([]float64, nv),
		vstamp: make([]int32, nv),
	}
	for i := range gs.vstamp {
		gs.vstamp[i] = -1
	}
	minStep := math.Max(b.flo, 1e-12*b.diag)
	budget := samplesPerPanel * b.o.limit()
	for i := 0; i < b.n; i++ {
		L := b.lens[i]
		rcap := math.Min(gapReach*L/b.o.GapFactor, b.diag)
		b.boundaryDistances(gs, i, gapDetour*rcap)
		ts := []float64{0}
		g0, gb0, r0 := b.gapAt(gs, i, 0, rcap)
		hs, bs := []float64{g0}, []float64{gb0}
		// The narrowest gap seen: where, how wide, and whether across a
		// body, for the error when the samples outrun the budget.
		narrow, narrowT, narrowBody := math.Inf(1), 0.0, false
		note := func(t, g, gb float64) {
			if m := math.Min(g, gb); m < narrow {
				narrow, narrowT, narrowBody = m, t, gb < g
			}
		}
		note(0, g0, gb0)
		over := false
		var refine func(t0, r0, t1, r1 float64, depth int)
		refine = func(t0, r0, t1, r1 float64, depth int) {
			if over || t1-t0 <= gapSampling*math.Min(r0, r1) || t1-t0 <= minStep || depth > 60 {
				return
			}
			if len(ts) > budget {
				over = true
				return
			}
			tm := 0.5 * (t0 + t1)
			gm, gbm, rm := b.gapAt(gs, i, tm, rcap)
			note(tm, gm, gbm)
			refine(t0, r0, tm, rm, depth+1)
			ts = append(ts, tm)
			hs = append(hs, gm)
			bs = append(bs, gbm)
			refine(tm, rm, t1, r1, depth+1)
		}
		gL, gbL, rL := b.gapAt(gs, i, L, rcap)
		note(L, gL, gbL)
		refine(0, r0, L, rL, 0)
		if over {
			return b.tooFine(i, narrowT, narrow, narrowBody, int(math.Min(1e12, L/math.Max(narrow, minStep))))
		}
		ts = append(ts, L)
		hs = append(hs, gL)
		bs = append(bs, gbL)
		for k := range hs {
			hs[k] *= b.o.GapFactor
			bs[k] *= b.o.GapFactor
		}
		b.gapT[i], b.gapH[i], b.gapB[i] = ts, hs, bs
	}
	b.limitGaps(b.gapH)
	b.limitGaps(b.gapB)
	return nil
}

// gapAt returns the gaps at distance t from A along piece i, across the
// domain and across a body (+Inf when none is found within rcap), and the
// distance to the nearest piece that does not touch piece i (at most rcap).
//
// A point q of another piece at distance d from p, joined to p by a
// boundary path of length ρd, counts as a gap of d*max(1, (gapDetour-1)/(ρ-1)):
// fully when the boundary makes a detour of gapDetour or more between p and
// q (across a thin sheet), not at all when the boundary runs straight from p
// to q (further along a finely divided circle), and smoothly in between.
//
// The gap is across a body when q lies on the outer side of piece i (not
// inside the domain as seen from p: (q-p).n >= 0 with n the domain's outward
// normal) and p on the outer side of piece j: the two faces of a sheet pile,
// or the beds on either side of one. Interfaces have no outer side. Such a
// gap is sought bodyFraction times as far, as it sets panels bodyFraction
// times as long (see bodyFraction).
func (b *builder) gapAt(gs *gapSearch, i int, t, rcap float64) (gap, body, raw float64) {
	pc := b.l.Pieces[i]
	L := b.lens[i]
	p := r2.Add(pc.A, r2.Scale(t/L, r2.Sub(pc.B, pc.A)))
	ni := normalOf(pc)
	g := b.grid
	gs.query++
	q := gs.query
	best, bestB, raw := rcap, rcap, rcap
	cx, cy := g.index(p)
	for r := 0; ; r++ {
		for x := cx - r; x <= cx+r; x++ {
			if x < 0 || x >= g.nx {
				continue
			}
			step := 2 * r
			if x == cx-r || x == cx+r || r == 0 {
				step = 1
			}
			for y := cy - r; y <= cy+r; y += step {
				if y < 0 || y >= g.ny {
					continue
				}
				for _, j32 := range g.cells[y*g.nx+x] {
					j := int(j32)
					if gs.stamp[j] == q {
						continue
					}
					gs.stamp[j] = q
					if j == i || b.touches(i, j) {
						continue
					}
					qj := b.l.Pieces[j]
					d, s := segDist(p, qj.A, qj.B)
					raw = math.Min(raw, d)
					if d >= math.Max(best, bestB) {
						continue
					}
					v := r2.Sub(r2.Add(qj.A, r2.Scale(s/b.lens[j], r2.Sub(qj.B, qj.A))), p)
					across := !pc.Interface() && !qj.Interface() &&
						r2.Dot(v, ni) >= -1e-9*d && r2.Dot(v, normalOf(qj)) <= 1e-9*d
					if across && (b.twinOf(i) >= 0 || b.twinOf(j) >= 0) {
						continue // behind a sheet's face is the sheet (sheet.go)
					}
					if across && d >= bestB || !across && d >= best {
						continue
					}
					// Boundary path from p to the nearest point of piece j.
					path := math.Min(b.pathTo(gs, i, t, b.vA[j])+s, b.pathTo(gs, i, t, b.vB[j])+b.lens[j]-s)
					if rho := path / d; rho < gapDetour {
						d *= (gapDetour - 1) / math.Max(rho-1, 1e-300)
					}
					if across {
						bestB = math.Min(bestB, d)
					} else {
						best = math.Min(best, d)
					}
				}
			}
		}
		// Nothing unseen is nearer than r cells; a body gap matters only
		// up to 1/bodyFraction times the domain gap.
		reach := math.Max(best, math.Min(bestB, best/bodyFraction))
		if reach <= float64(r)*g.cell || (r > cx && r > cy && r >= g.nx-cx && r >= g.ny-cy) {
			break
		}
	}
	raw = math.Min(raw, math.Min(best, bestB))
	if best >= rcap {
		best = math.Inf(1)
	}
	if bestB >= rcap || bestB*bodyFraction >= best {
		bestB = math.Inf(1)
	}
	return best, bestB, raw
}

// normalOf returns the unit outward normal of the domain on a piece: the
// right normal of B-A.
func normalOf(p geom.Piece) r2.Vec {
	d := r2.Unit(r2.Sub(p.B, p.A))
	return r2.Vec{X: d.Y, Y: -d.X}
}

// pathTo returns the boundary distance from the point at t along piece i
// to vertex v, +Inf when v is beyond the search cutoff.
func (b *builder) pathTo(gs *gapSearch, i int, t float64, v int) float64 {
	if gs.vstamp[v] != int32(i) {
		return math.Inf(1)
	}
	return math.Min(t+gs.distA[v], b.lens[i]-t+gs.distB[v])
}

func (b *builder) touches(i, j int) bool {
	return b.vA[i] == b.vA[j] || b.vA[i] == b.vB[j] || b.vB[i] == b.vA[j] || b.vB[i] == b.vB[j]
}

// boundaryDistances fills gs.distA and gs.distB with the shortest distance
// along pieces from piece i's A and B vertices to every vertex within
// cutoff (+Inf beyond).
func (b *builder) boundaryDistances(gs *gapSearch, i int, cutoff float64) {
	// Vertices are reset lazily: one whose stamp is not i reads as +Inf.
	b.dijkstra(gs, b.vA[i], cutoff, gs.distA, int32(i))
	b.dijkstra(gs, b.vB[i], cutoff, gs.distB, int32(i))
}

func (b *builder) dijkstra(gs *gapSearch, src int, cutoff float64, dist []float64, id int32) {
	// A vertex is known for piece id when vstamp == id; the first visit
	// sets both arrays to +Inf before writing dist.
	get := func(v int) float64 {
		if gs.vstamp[v] != id {
			return math.Inf(1)
		}
		return dist[v]
	}
	set := func(v int, d float64) {
		if gs.vstamp[v] != id {
			gs.vstamp[v] = id
			gs.distA[v] = math.Inf(1)
			gs.distB[v] = math.Inf(1)
		}
		dist[v] = d
	}
	gs.heap = gs.heap[:0]
	set(src, 0)
	gs.heap.push(vitem{src, 0})
	for len(gs.heap) > 0 {
		it := gs.heap.pop()
		if it.d > get(it.v) {
			continue
		}
		for _, e := range b.inc[it.v] {
			j := e.piece()
			w := b.vB[j]
			if e.isB() {
				w = b.vA[j]
			}
			d := it.d + b.lens[j]
			if d <= cutoff && d < get(w) {
				set(w, d)
				gs.heap.push(vitem{w, d})
			}
		}
	}
}

type vitem struct {
	v int
	d float64
}

// vheap is a binary min-heap of vertices by distance.
type vheap []vitem

func (h *vheap) push(it vitem) {
	*h = append(*h, it)
	s := *h
	k := len(s) - 1
	for k > 0 {
		p := (k - 1) / 2
		if s[p].d <= s[k].d {
			break
		}
		s[p], s[k] = s[k], s[p]
		k = p
	}
}

func (h *vheap) pop() vitem {
	s := *h
	top := s[0]
	n := len(s) - 1
	s[0] = s[n]
	s = s[:n]
	k := 0
	for {
		l, r, m := 2*k+1, 2*k+2, k
		if l < n && s[l].d < s[m].d {
			m = l
		}
		if r < n && s[r].d < s[m].d {
			m = r
		}
		if m == k {
			break
		}
		s[k], s[m] = s[m], s[k]
		k = m
	}
	*h = s
	return top
}

// limitGaps makes a gap term (per piece, at the positions gapT) grow no
// faster than ln(Grading) per metre along each piece and across vertices,
// so that panel sizes change smoothly where the gap jumps.
func (b *builder) limitGaps(gaps [][]float64) {
	a := b.lg
	vcap := make([]float64, len(b.verts))
	for v := range vcap {
		vcap[v] = math.Inf(1)
	}
	queue := make([]int, 0, b.n)
	inQueue := make([]bool, b.n)
	for i := 0; i < b.n; i++ {
		queue = append(queue, i)
		inQueue[i] = true
	}
	for len(queue) > 0 {
		i := queue[0]
		queue = queue[1:]
		inQueue[i] = false
		ts, hs := b.gapT[i], gaps[i]
		last := len(hs) - 1
		hs[0] = math.Min(hs[0], vcap[b.vA[i]])
		hs[last] = math.Min(hs[last], vcap[b.vB[i]])
		for k := 1; k <= last; k++ {
			hs[k] = math.Min(hs[k], hs[k-1]+a*(ts[k]-ts[k-1]))
		}
		for k := last - 1; k >= 0; k-- {
			hs[k] = math.Min(hs[k], hs[k+1]+a*(ts[k+1]-ts[k]))
		}
		for _, vh := range [2]struct {
			v int
			h float64
		}{{b.vA[i], hs[0]}, {b.vB[i], hs[last]}} {
			if vh.h < vcap[vh.v]*(1-1e-12) {
				vcap[vh.v] = vh.h
				for _, e := range b.inc[vh.v] {
					if j := e.piece(); !inQueue[j] {
						queue = append(queue, j)
						inQueue[j] = true
					}
				}
			}
		}
	}
}
