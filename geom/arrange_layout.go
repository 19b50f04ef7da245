package geom

import (
	"fmt"
	"math"
	"slices"

	"gonum.org/v1/gonum/spatial/r2"
)

// This file turns the classified sub-segments into the Layout: the
// cross-feature checks, one piece per sub-segment that bounds the domain or
// separates two regions, and the order of the pieces.

// rawPiece is a piece with its vertex ids, for chaining, and the index of
// its twin (the other face of a sheet) among the raw pieces, or -1.
type rawPiece struct {
	Piece
	va, vb int32
	twin   int
}

func (a *arrangement) mid(sg *subSeg) r2.Vec {
	A, B := a.pos[sg.lo], a.pos[sg.hi]
	return r2.Vec{X: 0.5 * (A.X + B.X), Y: 0.5 * (A.Y + B.Y)}
}

// domain reports whether a side is part of the domain.
func (a *arrangement) domain(sd side) bool {
	return len(sd.bodies) == 0 && (a.sc.Problem.Open || len(sd.regions) > 0)
}

// onGround reports whether a sub-segment lies on the grounded plane of an
// open scene, and which of its sides (0: left of lo->hi, 1: right) is below
// the plane.
func (a *arrangement) onGround(sg *subSeg) (below int, ok bool) {
	g := a.sc.Problem.Ground
	if g == nil || !a.sc.Problem.Open {
		return 0, false
	}
	lo, hi := a.pos[sg.lo], a.pos[sg.hi]
	if math.Abs(lo.Y-g.Y) > a.tol || math.Abs(hi.Y-g.Y) > a.tol {
		return 0, false
	}
	// Walking lo->hi eastwards, the left side is above.
	if hi.X > lo.X {
		return 1, true
	}
	return 0, true
}

// regionOf is the Layout.Regions index of a domain side.
func (a *arrangement) regionOf(sd side) int {
	if len(sd.regions) > 0 {
		return sd.regions[0]
	}
	return len(a.sc.Regions) // the background
}

func (a *arrangement) layout() (*Layout, error) {
	s := a.sc
	if g := a.badPoly; g >= 0 {
		p := a.polys[g]
		return nil, s.featErr(p.kind, p.feat, fmt.Sprintf("a polygon's rings cross themselves or each other near %s (a ring that loops over itself, a hole reaching outside its outer ring or overlapping another hole, or a ring running the wrong way round: outer rings counter-clockwise, holes clockwise); redraw the rings so that they do not cross, or split the polygon into separate ones", a.where(a.mid(&a.subs[a.badSub]))))
	}
	if err := a.checkRegions(); err != nil {
		return nil, err
	}
	if err := a.checkBodies(); err != nil {
		return nil, err
	}
	if err := a.checkEdges(); err != nil {
		return nil, err
	}
	nb := len(s.Bodies)
	var pieces []rawPiece
	edgeOn := make([]bool, len(s.Edges))  // some part of the edge bounds the domain
	bodyOn := make([]bool, len(s.Bodies)) // the body carries some piece
	bodyIn := make([]bool, len(s.Bodies)) // some side of the body\'s rings is in a region
	var edges, sheets []int               // scratch
	anyDomain := false
	for i := range a.subs {
		sg := &a.subs[i]
		edges, sheets = edges[:0], sheets[:0]
		inRegion := len(sg.sides[0].regions) > 0 || len(sg.sides[1].regions) > 0
		for _, c := range sg.contribs {
			switch src := a.sources[c.src]; src.kind {
			case srcEdge:
				edges = appendSet(edges, src.feat)
			case srcBody:
				bodyIn[src.feat] = bodyIn[src.feat] || inRegion
				if src.sheet {
					sheets = appendSet(sheets, src.feat)
				}
			}
		}
		if len(edges) > 1 {
			return nil, s.featErr(srcEdge, edges[0], fmt.Sprintf("overlaps %s near %s; a stretch of boundary takes one condition: shorten one of the two edges", s.featRef(srcEdge, edges[1]), a.where(a.mid(sg))))
		}
		dl, dr := a.domain(sg.sides[0]), a.domain(sg.sides[1])
		if len(sheets) > 0 {
			slices.Sort(sheets)
			ps, err := a.sheetPieces(sg, sheets, edges, dl, dr)
			if err != nil {
				return nil, err
			}
			if len(ps) > 0 {
				anyDomain = true
				bodyOn[sheets[0]] = true
			}
			if len(ps) == 2 {
				ps[0].twin, ps[1].twin = len(pieces)+1, len(pieces)
			}
			pieces = append(pieces, ps...)
			continue
		}
		ground := false
		if below, ok := a.onGround(sg); ok {
			// Below the grounded plane is not domain; a region resting on
			// the plane is bounded there by the plane itself, at 0.
			if below == 0 {
				dl = false
			} else {
				dr = false
			}
			ground = dl || dr
		}
		anyDomain = anyDomain || dl || dr
		switch {
		case !dl && !dr:
			continue
		case dl && dr:
			rl, rr := a.regionOf(sg.sides[0]), a.regionOf(sg.sides[1])
			if len(edges) > 0 {
				return nil, a.edgeInside(edges[0], sg, rl, rr)
			}
			if rl == rr {
				continue
			}
			A, B := a.pos[sg.lo], a.pos[sg.hi]
			va, vb := sg.lo, sg.hi
			if rl > rr { // interfaces run with the lower region index on the left
				A, B, va, vb, rl, rr = B, A, vb, va, rr, rl
			}
			pieces = append(pieces, rawPiece{Piece{A: A, B: B, Left: rl, Right: rr, Owner: -1}, va, vb, -1})
			continue
		}
		// A boundary piece: domain on the left.
		A, B, va, vb := a.pos[sg.lo], a.pos[sg.hi], sg.lo, sg.hi
		dom, out := sg.sides[0], sg.sides[1]
		if dr {
			A, B, va, vb = B, A, vb, va
			dom, out = out, dom
		}
		p := Piece{A: A, B: B, Left: a.regionOf(dom), Right: Outside, Owner: -1, Cond: Insulated}
		switch {
		case ground:
			p.Cond = Condition{Kind: Potential}
		case len(edges) > 0:
			p.Owner = nb + edges[0]
			p.Cond = s.Edges[edges[0]].Cond
			edgeOn[edges[0]] = true
		case len(out.bodies) > 0:
			b := out.bodies[0]
			if len(out.bodies) > 1 {
				for _, c := range sg.contribs {
					src := a.sources[c.src]
					if src.kind == srcBody && slices.Contains(out.bodies, src.feat) {
						b = src.feat
						break
					}
				}
			}
			p.Owner = b
			p.Cond = s.Bodies[b].Cond
			bodyOn[b] = true
		}
		pieces = append(pieces, rawPiece{p, va, vb, -1})
	}
	if !anyDomain {
		msg := "the domain is empty: the bodies cover every region; a body is not part of the domain, so draw the material around it as a region"
		if s.Problem.Open {
			msg = "the domain is empty: check the scene's geometry"
		}
		return nil, &Error{Feature: -1, Msg: msg}
	}
	for i, on := range edgeOn {
		if !on {
			return nil, s.featErr(srcEdge, i, "lies on no boundary of the domain (it is inside a body or outside every region); draw it along a region's outer boundary or a body's boundary where it meets the domain")
		}
	}
	for i, on := range bodyOn {
		switch b := s.Bodies[i]; {
		case on || b.Cond == Insulated:
		case !s.Problem.Open && !bodyIn[i]:
			return nil, s.featErr(srcBody, i, fmt.Sprintf("has the condition %q but lies outside every region, so it touches no part of the domain; move it into a region or delete it", b.Cond.Kind))
		case b.Cond.Kind == Floating:
			return nil, s.featErr(srcBody, i, "is floating but other bodies cover it entirely, so it has no boundary with the domain; delete it or give it a fixed potential")
		}
	}
	ordered, twins := orderPieces(pieces)
	lay := &Layout{
		Pieces:   ordered,
		Twin:     twins,
		Open:     s.Problem.Open,
		Ground:   s.Problem.Ground,
		Diagonal: a.diag,
		Warnings: a.emptyHoles(),
	}
	for i, b := range s.Bodies {
		lay.Owners = append(lay.Owners, Owner{Name: b.Name, Part: PartBody, Feature: b.Feature, Index: i, Cond: b.Cond})
	}
	for i, e := range s.Edges {
		lay.Owners = append(lay.Owners, Owner{Name: e.Name, Part: PartEdge, Feature: e.Feature, Index: i, Cond: e.Cond})
	}
	for _, r := range s.Regions {
		lay.Regions = append(lay.Regions, Domain{Name: r.Name, Feature: r.Feature, Material: r.Material})
	}
	if s.Problem.Open {
		lay.Regions = append(lay.Regions, Domain{Name: "background", Feature: -1, Background: true, Material: s.Problem.Background})
	}
	s.setArcs(lay)
	return lay, nil
}

// emptyHoles warns of the holes of regions in a closed scene that no
// region or body fills: they are outside the domain, so their rims are
// insulated walls, which a user who drew a hole for another material may
// not mean. One warning per region, at the first such rim found.
func (a *arrangement) emptyHoles() []string {
	s := a.sc
	if s.Problem.Open {
		return nil
	}
	seen := make([]bool, len(s.Regions))
	var out []string
	for i := range a.subs {
		sg := &a.subs[i]
		for _, c := range sg.contribs {
			src := a.sources[c.src]
			if src.kind != srcRegion || !src.hole || seen[src.feat] {
				continue
			}
			// The polygon's material is on the left of its rings: the hole
			// lies on the right of the ring's direction.
			in := sg.sides[1]
			if c.dir < 0 {
				in = sg.sides[0]
			}
			if len(in.regions) > 0 || len(in.bodies) > 0 {
				continue
			}
			seen[src.feat] = true
			out = append(out, fmt.Sprintf("%s has a hole near %s that no region or body fills: the hole is outside the domain and its rim an insulated (zero-flux) wall; to fill it with another material, draw a region over the hole (its outline the hole's ring), or drop the hole from the polygon",
				s.featRef(srcRegion, src.feat), a.where(a.mid(sg))))
		}
	}
	return out
}

// appendSet appends v to an unsorted small set unless it is there.
func appendSet(set []int, v int) []int {
	if slices.Contains(set, v) {
		return set
	}
	return append(set, v)
}

// edgeInside is the error of an edge lying inside the domain.
func (a *arrangement) edgeInside(e int, sg *subSeg, rl, rr int) error {
	s := a.sc
	name := func(r int) string {
		if r == len(s.Regions) {
			return "the background"
		}
		return s.featRef(srcRegion, r)
	}
	var what string
	if rl == rr {
		what = "runs through the inside of " + name(rl)
	} else {
		what = "runs along the interface between " + name(rl) + " and " + name(rr)
	}
	return s.featErr(srcEdge, e, fmt.Sprintf("%s near %s, where both sides are domain; an edge must lie on the domain's boundary: move it onto a region's outer boundary or a body's boundary, or split the region there", what, a.where(a.mid(sg))))
}

// checkRegions rejects overlapping regions: a side inside two regions.
func (a *arrangement) checkRegions() error {
	s := a.sc
	for i := range a.subs {
		sg := &a.subs[i]
		for _, sd := range sg.sides {
			if len(sd.regions) > 1 {
				return s.featErr(srcRegion, sd.regions[0], fmt.Sprintf("overlaps %s near %s; regions may touch but not overlap: cut one of them along the other's boundary", s.featRef(srcRegion, sd.regions[1]), a.where(a.mid(sg))))
			}
		}
	}
	return nil
}

// checkBodies rejects conductors in contact that cannot be: bodies at
// different fixed potentials, and a floating body touching another
// conductor, where they share a sub-segment or a vertex or overlap.
func (a *arrangement) checkBodies() error {
	s := a.sc
	var set []int
	check := func(set []int, p r2.Vec) error {
		for x := 0; x < len(set); x++ {
			for y := x + 1; y < len(set); y++ {
				if msg := a.contact(set[x], set[y], p); msg != "" {
					return s.featErr(srcBody, set[x], msg)
				}
			}
		}
		return nil
	}
	atVertex := make(map[int32][]int)
	for i := range a.subs {
		sg := &a.subs[i]
		set = set[:0]
		for _, c := range sg.contribs {
			src := a.sources[c.src]
			if src.kind == srcBody {
				set = appendSet(set, src.feat)
				atVertex[sg.lo] = appendSet(atVertex[sg.lo], src.feat)
				atVertex[sg.hi] = appendSet(atVertex[sg.hi], src.feat)
			}
		}
		for _, sd := range sg.sides {
			for _, b := range sd.bodies {
				set = appendSet(set, b)
			}
		}
		if len(set) > 1 {
			slices.Sort(set)
			if err := check(set, a.mid(sg)); err != nil {
				return err
			}
		}
	}
	vs := make([]int32, 0, len(atVertex))
	for v, set := range atVertex {
		if len(set) > 1 {
			vs = append(vs, v)
		}
	}
	slices.Sort(vs)
	for _, v := range vs {
		set := atVertex[v]
		slices.Sort(set)
		if err := check(set, a.pos[v]); err != nil {
			return err
		}
	}
	return nil
}

// checkEdges rejects conductors touching an edge that holds them at
// another potential: a body at a fixed potential that an edge at another
// potential runs along, crosses or touches at one vertex, and a floating
// body or edge in contact with a fixed or floating conductor. An edge
// overriding part of an insulated body, or a conductor at the edge's own
// potential, is harmless.
func (a *arrangement) checkEdges() error {
	s := a.sc
	if len(s.Edges) == 0 {
		return nil
	}
	type pair struct{ body, edge int }
	var bodies, edges []int
	first := map[pair]r2.Vec{} // the first point where each pair meets
	var order []pair
	meet := func(p r2.Vec) {
		for _, b := range bodies {
			for _, e := range edges {
				k := pair{b, e}
				if _, ok := first[k]; !ok {
					first[k] = p
					order = append(order, k)
				}
			}
		}
	}
	vertexBodies := make(map[int32][]int)
	vertexEdges := make(map[int32][]int)
	for i := range a.subs {
		sg := &a.subs[i]
		bodies, edges = bodies[:0], edges[:0]
		for _, c := range sg.contribs {
			src := a.sources[c.src]
			switch src.kind {
			case srcBody:
				bodies = appendSet(bodies, src.feat)
				vertexBodies[sg.lo] = appendSet(vertexBodies[sg.lo], src.feat)
				vertexBodies[sg.hi] = appendSet(vertexBodies[sg.hi], src.feat)
			case srcEdge:
				edges = appendSet(edges, src.feat)
				vertexEdges[sg.lo] = appendSet(vertexEdges[sg.lo], src.feat)
				vertexEdges[sg.hi] = appendSet(vertexEdges[sg.hi], src.feat)
			}
		}
		if len(edges) == 0 {
			continue
		}
		// An edge inside a body crosses it.
		for _, sd := range sg.sides {
			for _, b := range sd.bodies {
				bodies = appendSet(bodies, b)
			}
		}
		meet(a.mid(sg))
	}
	vs := make([]int32, 0, len(vertexEdges))
	for v := range vertexEdges {
		if len(vertexBodies[v]) > 0 {
			vs = append(vs, v)
		}
	}
	slices.Sort(vs)
	for _, v := range vs {
		bodies, edges = vertexBodies[v], vertexEdges[v]
		meet(a.pos[v])
	}
	for _, k := range order {
		if msg := a.edgeContact(k.body, k.edge, first[k]); msg != "" {
			return s.featErr(srcBody, k.body, msg)
		}
	}
	return nil
}

// edgeContact is the message for body b in contact with edge e at p, or ""
// when their contact is harmless.
func (a *arrangement) edgeContact(b, e int, p r2.Vec) string {
	s := a.sc
	cb, ce := s.Bodies[b].Cond, s.Edges[e].Cond
	edge := s.featRef(srcEdge, e)
	u := s.potUnit()
	switch {
	case cb.Kind == Potential && ce.Kind == Potential && cb.Value != ce.Value:
		return fmt.Sprintf("is held at %s%s and touches or crosses %s, held at %s%s, near %s: a short circuit; separate them (shorten the edge or move the body) or give them the same potential", fmtNum(cb.Value), u, edge, fmtNum(ce.Value), u, a.where(p))
	case cb.Kind == Floating && ce.Kind == Potential:
		return fmt.Sprintf("is floating and touches or crosses %s, held at %s%s, near %s; a conductor touching a fixed potential is at that potential: give this body the potential %s%s instead of floating, or separate them", edge, fmtNum(ce.Value), u, a.where(p), fmtNum(ce.Value), u)
	case cb.Kind == Potential && ce.Kind == Floating:
		return fmt.Sprintf("is held at %s%s and touches or crosses %s, which is floating, near %s; a conductor touching a fixed potential is at that potential: give the edge the potential %s%s instead of floating, or separate them", fmtNum(cb.Value), u, edge, a.where(p), fmtNum(cb.Value), u)
	case cb.Kind == Floating && ce.Kind == Floating:
		return fmt.Sprintf("is floating and touches or crosses %s, also floating, near %s: touching conductors are one conductor; give them one condition or separate them", edge, a.where(p))
	}
	return ""
}

// contact is the message for bodies i and j in contact at p, or "" when
// their contact is harmless.
func (a *arrangement) contact(i, j int, p r2.Vec) string {
	s := a.sc
	ci, cj := s.Bodies[i].Cond, s.Bodies[j].Cond
	other := s.featRef(srcBody, j)
	u := s.potUnit()
	switch {
	case ci.Kind == Potential && cj.Kind == Potential && ci.Value != cj.Value:
		return fmt.Sprintf("touches or overlaps %s near %s, but they are held at different potentials (%s%s and %s%s): a short circuit; separate them or give them the same potential", other, a.where(p), fmtNum(ci.Value), u, fmtNum(cj.Value), u)
	case ci.Kind == Floating && cj.Kind == Floating:
		return fmt.Sprintf("is floating and touches or overlaps %s, also floating, near %s: touching conductors are one conductor; merge them into one body or separate them", other, a.where(p))
	case ci.Kind == Floating && cj.Kind == Potential:
		return fmt.Sprintf("is floating and touches or overlaps %s, held at %s%s, near %s; a conductor touching a conductor at a fixed potential is at that potential: give this body the potential %s%s instead of floating, or separate them", other, fmtNum(cj.Value), u, a.where(p), fmtNum(cj.Value), u)
	case ci.Kind == Potential && cj.Kind == Floating:
		return fmt.Sprintf("is held at %s%s and touches or overlaps %s, which is floating, near %s; a conductor touching a conductor at a fixed potential is at that potential: give %s the potential %s%s instead of floating, or separate them", fmtNum(ci.Value), u, other, a.where(p), other, fmtNum(ci.Value), u)
	}
	return ""
}

// orderPieces groups the pieces (owners in order, then insulated walls, then
// interfaces by pair of regions) and orders each group along its chains:
// each chain starts at a piece no other piece of the group leads into, or,
// for closed loops, at the first remaining piece; at a branch the first
// piece in arrangement order is taken. It returns the pieces and, when some
// piece has a twin, the twin of each ordered piece (-1: none); nil when
// none has.
func orderPieces(ps []rawPiece) ([]Piece, []int) {
	type key struct{ class, owner, left, right int }
	keyOf := func(p Piece) key {
		switch {
		case p.Owner >= 0:
			return key{0, p.Owner, 0, 0}
		case !p.Interface():
			return key{1, 0, 0, 0}
		}
		return key{2, 0, p.Left, p.Right}
	}
	idx := make([]int, len(ps))
	for i := range idx {
		idx[i] = i
	}
	slices.SortStableFunc(idx, func(i, j int) int {
		ki, kj := keyOf(ps[i].Piece), keyOf(ps[j].Piece)
		for _, d := range [4]int{ki.class - kj.class, ki.owner - kj.owner, ki.left - kj.left, ki.right - kj.right} {
			if d != 0 {
				return d
			}
		}
		return 0
	})
	out := make([]Piece, 0, len(ps))
	at := make([]int, len(ps)) // raw index -> ordered index
	used := make([]bool, len(ps))
	for g := 0; g < len(idx); {
		h := g
		for h < len(idx) && keyOf(ps[idx[h]].Piece) == keyOf(ps[idx[g]].Piece) {
			h++
		}
		group := idx[g:h]
		from := make(map[int32][]int, len(group)) // start vertex -> pieces, in order
		into := make(map[int32]int, len(group))
		for _, i := range group {
			from[ps[i].va] = append(from[ps[i].va], i)
			into[ps[i].vb]++
		}
		walk := func(i int) {
			for i >= 0 {
				used[i] = true
				at[i] = len(out)
				out = append(out, ps[i].Piece)
				next := -1
				for _, j := range from[ps[i].vb] {
					if !used[j] {
						next = j
						break
					}
				}
				i = next
			}
		}
		for _, i := range group {
			if !used[i] && into[ps[i].va] == 0 {
				walk(i)
			}
		}
		for _, i := range group {
			if !used[i] {
				walk(i)
			}
		}
		g = h
	}
	var twins []int
	for i, p := range ps {
		if p.twin < 0 {
			continue
		}
		if twins == nil {
			twins = make([]int, len(out))
			for k := range twins {
				twins[k] = -1
			}
		}
		twins[at[i]] = at[p.twin]
	}
	return out, twins
}
