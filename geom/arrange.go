package geom

import (
	"fmt"
	"math"
	"slices"
	"sort"
	"strconv"

	"gonum.org/v1/gonum/spatial/r2"
)

// CoincidenceTol is the coincidence tolerance relative to the scene's
// bounding-box diagonal: points closer than CoincidenceTol*Diagonal are one
// point, and anything thicker is real geometry.
const CoincidenceTol = 1e-9

// Layout works out the planar arrangement of the scene. The domain is the
// union of the regions (the whole plane when the scene is open) minus the
// union of the bodies. Every ring of every body and region and every edge
// line is split at every crossing, touching point and collinear overlap with
// every other, points closer than CoincidenceTol times the bounding-box
// diagonal are merged, and each resulting sub-segment is classified by what
// lies on either side:
//
//   - domain on one side only: a boundary piece, oriented so that the domain
//     is on its left, carrying the condition of the edge that covers it
//     (edges override bodies), else of the body on its other side, else
//     Insulated (a region's outer wall in a closed scene);
//   - different regions on the two sides: an interface piece (in an open
//     scene the outer boundary of a region is an interface with the
//     background);
//   - anything else (between two bodies, inside one region): dropped.
//
// A sheet (a body drawn as lines, of zero thickness) is split like any
// other line and encloses nothing. Each of its stretches gives one
// boundary piece per face that has domain in front of it, with the domain
// on its left and the sheet's condition: a sheet inside a region gives two
// pieces with that region on both (Layout.Twin pairs them), a sheet along
// an interface one in each region, a sheet along a region's outer
// boundary or a body's side one (it sets the condition there), a sheet
// inside a body none. A sheet may end on any boundary or cross other
// sheets; an edge along a sheet and a sheet along the grounded plane are
// refused, and a conductor sheet touching another conductor or an edge at
// another potential is a short circuit like any body.
//
// Users never cut notches: bodies may overlap regions, sit on their edges and
// stick out of them, and touching regions need not share vertices.
//
// Layout returns a *Error naming the feature and the fix when regions
// overlap, when bodies at different potentials touch (or a floating body
// touches another conductor), when an edge lies inside the domain or on no
// boundary of it, when two edges overlap, when a body with a condition lies
// nowhere on the domain's boundary, when a feature of an open scene with a
// ground plane reaches below it, and when the domain is empty.
//
// Pieces are grouped by owner (bodies, then edges, in scene order), then
// come the insulated walls, then the interfaces by pair of regions; within a
// group they follow each other along connected chains, so that arc length
// makes sense. Layout is deterministic.
func (s *Scene) Layout() (*Layout, error) {
	a, err := s.arrange()
	if err != nil {
		return nil, err
	}
	return a.layout()
}

// srcKind tells what a segment came from.
type srcKind uint8

const (
	srcBody srcKind = iota + 1
	srcRegion
	srcEdge
)

// source is one ring of a body or region polygon, one line of a sheet
// body, or one edge line.
type source struct {
	kind  srcKind
	feat  int  // index into Scene.Bodies, Scene.Regions or Scene.Edges
	poly  int  // index into arrangement.polys; -1 for an edge or sheet line
	hole  bool // a hole of its polygon (a ring after the first)
	sheet bool // a line of a sheet body (kind srcBody, poly -1)
}

// polyRef is one polygon of a body or region.
type polyRef struct {
	kind srcKind
	feat int
}

// contrib is one source that runs along a sub-segment, in the direction dir
// (+1: from lo to hi, -1: from hi to lo).
type contrib struct {
	src int32
	dir int8
}

// subSeg is a merged sub-segment between vertices lo < hi.
type subSeg struct {
	lo, hi   int32
	contribs []contrib
	// sides[0] is the left of lo->hi, sides[1] the right.
	sides [2]side
}

// side is what lies next to a sub-segment on one side: the bodies and
// regions whose polygons contain it (sorted, without repeats).
type side struct {
	bodies  []int
	regions []int
}

type arrangement struct {
	sc      *Scene
	tol     float64
	diag    float64
	pos     []r2.Vec
	sources []source
	polys   []polyRef
	subs    []subSeg
	// badPoly is the first polygon found with a winding number other than 0
	// or 1 somewhere (a ring crossing itself, a hole reaching out of its
	// polygon), beside sub-segment badSub; -1 when none.
	badPoly, badSub int
}

// arrange collects, nodes, merges and classifies the segments of the scene.
func (s *Scene) arrange() (*arrangement, error) {
	if !s.Problem.Open && len(s.Regions) == 0 {
		return nil, &Error{Feature: -1, Msg: "a closed scene needs at least one region (a feature with \"part\": \"region\"): add the material the field lives in, or set \"open\": true in problem"}
	}
	// Bounding box and input checks.
	lo := r2.Vec{X: math.Inf(1), Y: math.Inf(1)}
	hi := r2.Vec{X: math.Inf(-1), Y: math.Inf(-1)}
	npts := 0
	grow := func(p r2.Vec) {
		lo.X, lo.Y = math.Min(lo.X, p.X), math.Min(lo.Y, p.Y)
		hi.X, hi.Y = math.Max(hi.X, p.X), math.Max(hi.Y, p.Y)
		npts++
	}
	checkRing := func(kind srcKind, feat int, r Ring) error {
		if len(r) < 3 {
			return s.featErr(kind, feat, fmt.Sprintf("a ring has %d distinct vertices; a polygon ring needs at least 3", len(r)))
		}
		for _, p := range r {
			if !finite(p) {
				return s.featErr(kind, feat, "a coordinate is not a finite number")
			}
			grow(p)
		}
		return nil
	}
	checkLine := func(kind srcKind, feat int, l Line) error {
		if len(l) < 2 {
			return s.featErr(kind, feat, "a line has fewer than 2 points")
		}
		for _, p := range l {
			if !finite(p) {
				return s.featErr(kind, feat, "a coordinate is not a finite number")
			}
			grow(p)
		}
		return nil
	}
	for i, b := range s.Bodies {
		for _, pg := range b.Polygons {
			for _, r := range pg {
				if err := checkRing(srcBody, i, r); err != nil {
					return nil, err
				}
			}
		}
		for _, l := range b.Lines {
			if err := checkLine(srcBody, i, l); err != nil {
				return nil, err
			}
		}
	}
	for i, rg := range s.Regions {
		for _, pg := range rg.Polygons {
			for _, r := range pg {
				if err := checkRing(srcRegion, i, r); err != nil {
					return nil, err
				}
			}
		}
	}
	for i, e := range s.Edges {
		for _, l := range e.Lines {
			if err := checkLine(srcEdge, i, l); err != nil {
				return nil, err
			}
		}
	}
	if npts == 0 {
		return nil, &Error{Feature: -1, Msg: "the scene has no geometry: add a body, region or edge feature"}
	}
	diag := math.Hypot(hi.X-lo.X, hi.Y-lo.Y)
	if !(diag > 0) || math.IsInf(diag, 0) {
		return nil, &Error{Feature: -1, Msg: "the scene's features all sit at one point or span an infinite extent: check the coordinates"}
	}
	a := &arrangement{sc: s, diag: diag, tol: CoincidenceTol * diag, badPoly: -1}
	if err := a.checkGround(); err != nil {
		return nil, err
	}
	if err := a.checkFlat(); err != nil {
		return nil, err
	}

	// Segments, with vertices snapped as they come.
	vs := newVertexSet(a.tol, lo, npts)
	segs := make([]rawSeg, 0, npts)
	addRing := func(src int32, r []r2.Vec, closed bool) {
		n := len(r)
		ids := make([]int32, n)
		for k, p := range r {
			ids[k] = vs.id(p)
		}
		m := n
		if !closed {
			m = n - 1
		}
		for k := 0; k < m; k++ {
			u, v := ids[k], ids[(k+1)%n]
			if u != v {
				segs = append(segs, rawSeg{a: u, b: v, src: src, fresh: true})
			}
		}
	}
	addPolygons := func(kind srcKind, i int, pgs []Polygon) {
		for _, pg := range pgs {
			g := len(a.polys)
			a.polys = append(a.polys, polyRef{kind, i})
			for k, r := range pg {
				a.sources = append(a.sources, source{kind: kind, feat: i, poly: g, hole: k > 0})
				addRing(int32(len(a.sources)-1), r, true)
			}
		}
	}
	for i, b := range s.Bodies {
		addPolygons(srcBody, i, b.Polygons)
		for _, l := range b.Lines {
			a.sources = append(a.sources, source{kind: srcBody, feat: i, poly: -1, sheet: true})
			addRing(int32(len(a.sources)-1), l, false)
		}
	}
	for i, rg := range s.Regions {
		addPolygons(srcRegion, i, rg.Polygons)
	}
	for i, e := range s.Edges {
		for _, l := range e.Lines {
			a.sources = append(a.sources, source{kind: srcEdge, feat: i, poly: -1})
			addRing(int32(len(a.sources)-1), l, false)
		}
	}
	segs = node(vs, segs)
	a.pos = vs.pos

	// Merge coinciding sub-segments, keeping every contributor.
	index := make(map[uint64]int32, len(segs))
	for _, sg := range segs {
		lo, hi, dir := sg.a, sg.b, int8(1)
		if lo > hi {
			lo, hi, dir = hi, lo, -1
		}
		key := uint64(lo)<<32 | uint64(hi)
		k, ok := index[key]
		if !ok {
			k = int32(len(a.subs))
			index[key] = k
			a.subs = append(a.subs, subSeg{lo: lo, hi: hi})
		}
		a.subs[k].contribs = append(a.subs[k].contribs, contrib{sg.src, dir})
	}
	a.classify()
	return a, nil
}

func finite(p r2.Vec) bool {
	return !math.IsNaN(p.X) && !math.IsNaN(p.Y) && !math.IsInf(p.X, 0) && !math.IsInf(p.Y, 0)
}

// checkFlat rejects polygons whose outer ring encloses no area: thinner on
// average than the coincidence tolerance.
func (a *arrangement) checkFlat() error {
	s := a.sc
	flat := func(r Ring) bool {
		area, perim := 0.0, 0.0
		for i, p := range r {
			q := r[(i+1)%len(r)]
			area += (p.X-r[0].X)*(q.Y-r[0].Y) - (q.X-r[0].X)*(p.Y-r[0].Y)
			perim += math.Hypot(q.X-p.X, q.Y-p.Y)
		}
		return math.Abs(area)/2 <= a.tol*perim/2
	}
	const msg = "a polygon encloses no area (its outer ring folds back on itself); draw it with its real thickness, or use an edge for a line"
	for i, b := range s.Bodies {
		for _, pg := range b.Polygons {
			if len(pg) > 0 && flat(pg[0]) {
				return s.featErr(srcBody, i, msg)
			}
		}
	}
	for i, rg := range s.Regions {
		for _, pg := range rg.Polygons {
			if len(pg) > 0 && flat(pg[0]) {
				return s.featErr(srcRegion, i, msg)
			}
		}
	}
	return nil
}

// checkGround rejects features of an open scene that reach below its ground
// plane.
func (a *arrangement) checkGround() error {
	s := a.sc
	if !s.Problem.Open || s.Problem.Ground == nil {
		return nil
	}
	y := s.Problem.Ground.Y
	below := func(kind srcKind, feat int, pts []r2.Vec) error {
		for _, p := range pts {
			if p.Y < y-a.tol {
				return s.featErr(kind, feat, fmt.Sprintf("reaches below the ground plane y = %s m at %s; the scene lies above the ground: move the feature up or lower the ground", fmtNum(y), a.where(p)))
			}
		}
		return nil
	}
	for i, b := range s.Bodies {
		rings := make([][]r2.Vec, 0, len(b.Polygons)+len(b.Lines))
		for _, pg := range b.Polygons {
			for _, r := range pg {
				rings = append(rings, r)
			}
		}
		for _, l := range b.Lines {
			rings = append(rings, l)
		}
		for _, r := range rings {
			if err := below(srcBody, i, r); err != nil {
				return err
			}
			// A conductor resting on the grounded plane is at 0.
			for _, p := range r {
				if p.Y > y+a.tol {
					continue
				}
				switch c := b.Cond; {
				case c.Kind == Potential && c.Value != 0:
					return s.featErr(srcBody, i, fmt.Sprintf("touches the grounded plane y = %s m at %s but is held at %s%s: a short circuit; lift it off the ground or give it the potential 0", fmtNum(y), a.where(p), fmtNum(c.Value), s.potUnit()))
				case c.Kind == Floating:
					return s.featErr(srcBody, i, fmt.Sprintf("is floating and touches the grounded plane y = %s m at %s, which holds it at 0: lift it off the ground or give it the potential 0", fmtNum(y), a.where(p)))
				}
			}
		}
	}
	for i, rg := range s.Regions {
		for _, pg := range rg.Polygons {
			for _, r := range pg {
				if err := below(srcRegion, i, r); err != nil {
					return err
				}
			}
		}
	}
	for i, e := range s.Edges {
		for _, l := range e.Lines {
			if err := below(srcEdge, i, l); err != nil {
				return err
			}
		}
	}
	return nil
}

// classify finds, for every sub-segment, the bodies and regions on each
// side, exactly: the winding number of each polygon is counted along a ray
// from the sub-segment's midpoint, which lies on no other sub-segment, and
// the sub-segment's own contributors set the jump between its two sides.
func (a *arrangement) classify() {
	st := newStrips(a)
	np := len(a.polys)
	wind := make([]int, np) // winding just beside the midpoint, see below
	net := make([]int, np)  // net forward runs of the polygon along the sub-segment
	mark := make([]bool, np)
	var touched []int
	touch := func(g int) {
		if !mark[g] {
			mark[g] = true
			touched = append(touched, g)
		}
	}
	for i := range a.subs {
		sg := &a.subs[i]
		A, B := a.pos[sg.lo], a.pos[sg.hi]
		m := r2.Vec{X: 0.5 * (A.X + B.X), Y: 0.5 * (A.Y + B.Y)}
		touched = touched[:0]
		// Winding of every polygon at the point O' = m + (eta, delta),
		// 0 < delta << eta infinitesimal, by signed crossings of the ray
		// {y = m.Y + delta, x > m.X + eta} (half-open rule: a vertex at
		// height m.Y counts as below the ray). Only this sub-segment passes
		// through m, and the ray from O' does not meet it.
		for _, j := range st.at(m.Y) {
			if j == int32(i) {
				continue
			}
			t := &a.subs[j]
			U, V := a.pos[t.lo], a.pos[t.hi]
			if (U.Y > m.Y) == (V.Y > m.Y) || (U.X <= m.X && V.X <= m.X) {
				continue
			}
			o := orient(U, V, m)
			sgn := 0
			switch {
			case V.Y > U.Y && o > 0:
				sgn = 1 // upward, m on its left: crossing right of m
			case V.Y < U.Y && o < 0:
				sgn = -1
			}
			if sgn == 0 {
				continue
			}
			for _, c := range t.contribs {
				if g := a.sources[c.src].poly; g >= 0 {
					touch(g)
					wind[g] += sgn * int(c.dir)
				}
			}
		}
		for _, c := range sg.contribs {
			if g := a.sources[c.src].poly; g >= 0 {
				touch(g)
				net[g] += int(c.dir)
			}
		}
		// O' is on the right of lo->hi when it runs upward, or runs
		// horizontally towards -x; on the left otherwise. Across a
		// sub-segment the winding drops by net from left to right.
		dx, dy := B.X-A.X, B.Y-A.Y
		primeRight := dy > 0 || (dy == 0 && dx < 0)
		var sides [2]side
		slices.Sort(touched)
		for _, g := range touched {
			wl, wr := wind[g], wind[g]
			if primeRight {
				wl += net[g]
			} else {
				wr -= net[g]
			}
			if a.badPoly < 0 && (wl < 0 || wl > 1 || wr < 0 || wr > 1) {
				a.badPoly, a.badSub = g, i
			}
			p := a.polys[g]
			for k, w := range [2]int{wl, wr} {
				if w <= 0 {
					continue
				}
				sd := &sides[k]
				if p.kind == srcBody {
					sd.bodies = appendUnique(sd.bodies, p.feat)
				} else {
					sd.regions = appendUnique(sd.regions, p.feat)
				}
			}
			wind[g], net[g], mark[g] = 0, 0, false
		}
		sg.sides = sides
	}
}

// appendUnique appends v to a sorted list unless it is there; polygons are
// visited in index order, so features come in order.
func appendUnique(list []int, v int) []int {
	if n := len(list); n > 0 && list[n-1] == v {
		return list
	}
	return append(list, v)
}

// strips buckets sub-segments by height for the horizontal rays of
// classify: a sub-segment is listed in every strip its y-range meets. Strip
// boundaries are quantiles of the sub-segments' mid-heights, so strips adapt
// to where the geometry is dense.
type strips struct {
	bounds []float64 // strip k is [bounds[k-1], bounds[k]), with -Inf and +Inf at the ends
	lists  [][]int32
}

func newStrips(a *arrangement) *strips {
	// Horizontal sub-segments never cross a ray under the half-open rule:
	// leave them out.
	var mids []float64
	for _, sg := range a.subs {
		if y0, y1 := a.pos[sg.lo].Y, a.pos[sg.hi].Y; y0 != y1 {
			mids = append(mids, 0.5*(y0+y1))
		}
	}
	n := len(mids)
	slices.Sort(mids)
	ns := int(2*math.Sqrt(float64(n))) + 1
	st := &strips{}
	for k := 1; k < ns; k++ {
		b := mids[k*n/ns]
		if len(st.bounds) == 0 || b > st.bounds[len(st.bounds)-1] {
			st.bounds = append(st.bounds, b)
		}
	}
	st.lists = make([][]int32, len(st.bounds)+1)
	for i, sg := range a.subs {
		y0, y1 := a.pos[sg.lo].Y, a.pos[sg.hi].Y
		if y0 == y1 {
			continue
		}
		if y0 > y1 {
			y0, y1 = y1, y0
		}
		for k := st.strip(y0); k <= st.strip(y1); k++ {
			st.lists[k] = append(st.lists[k], int32(i))
		}
	}
	return st
}

func (st *strips) strip(y float64) int {
	return sort.Search(len(st.bounds), func(k int) bool { return st.bounds[k] > y })
}

// at lists the sub-segments that may cross height y.
func (st *strips) at(y float64) []int32 { return st.lists[st.strip(y)] }

// featErr is a geometry error of a body, region or edge.
func (s *Scene) featErr(kind srcKind, feat int, msg string) *Error {
	f, name := s.featID(kind, feat)
	return &Error{Feature: f, Name: name, Member: "geometry", Msg: msg}
}

// featID returns the file index and the name of a feature.
func (s *Scene) featID(kind srcKind, feat int) (int, string) {
	switch kind {
	case srcBody:
		return s.Bodies[feat].Feature, s.Bodies[feat].Name
	case srcRegion:
		return s.Regions[feat].Feature, s.Regions[feat].Name
	}
	return s.Edges[feat].Feature, s.Edges[feat].Name
}

// featRef names a feature in a message: `body 3 ("gate")`.
func (s *Scene) featRef(kind srcKind, feat int) string {
	f, name := s.featID(kind, feat)
	part := PartEdge
	switch kind {
	case srcBody:
		part = PartBody
	case srcRegion:
		part = PartRegion
	}
	return fmt.Sprintf("%s %d (%q)", part, f, name)
}

func fmtNum(v float64) string { return strconv.FormatFloat(v, 'g', 6, 64) }

// where formats a point in metres, and in the scene's unit when that is
// another.
func (a *arrangement) where(p r2.Vec) string {
	s := fmt.Sprintf("(%s, %s) m", fmtNum(p.X), fmtNum(p.Y))
	pr := a.sc.Problem
	if pr.Unit != "" && pr.Unit != "m" && pr.Scale > 0 {
		s += fmt.Sprintf(" = (%s, %s) %s", fmtNum(p.X/pr.Scale), fmtNum(p.Y/pr.Scale), pr.Unit)
	}
	return s
}

// potUnit is the unit of a potential in messages.
func (s *Scene) potUnit() string {
	switch s.Problem.Physics {
	case Electrostatic:
		return " V"
	case Seepage:
		return " m of head"
	}
	return ""
}
