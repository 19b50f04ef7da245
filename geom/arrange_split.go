package geom

import (
	"math"
	"slices"

	"gonum.org/v1/gonum/spatial/r2"
)

// This file holds the noding half of the planar arrangement: snapping
// points closer than the coincidence tolerance into one vertex, and splitting
// segments at every crossing, touching point and collinear overlap until any
// two segments either share both vertices or meet only at vertices.

// vertexSet snaps points to vertices: a point within tol of an existing
// vertex becomes that vertex (the nearest one), otherwise a new vertex. Any
// two vertices are therefore more than tol apart.
type vertexSet struct {
	tol    float64
	origin r2.Vec
	pos    []r2.Vec
	grid   map[[2]int64][]int32
}

func newVertexSet(tol float64, origin r2.Vec, hint int) *vertexSet {
	return &vertexSet{
		tol:    tol,
		origin: origin,
		pos:    make([]r2.Vec, 0, hint),
		grid:   make(map[[2]int64][]int32, hint),
	}
}

func (vs *vertexSet) cell(p r2.Vec) [2]int64 {
	return [2]int64{
		int64(math.Floor((p.X - vs.origin.X) / vs.tol)),
		int64(math.Floor((p.Y - vs.origin.Y) / vs.tol)),
	}
}

// id returns the vertex for p, creating it when no vertex lies within tol.
func (vs *vertexSet) id(p r2.Vec) int32 {
	c := vs.cell(p)
	best, bestD := int32(-1), vs.tol*vs.tol
	for dx := int64(-1); dx <= 1; dx++ {
		for dy := int64(-1); dy <= 1; dy++ {
			for _, v := range vs.grid[[2]int64{c[0] + dx, c[1] + dy}] {
				if d := dist2(p, vs.pos[v]); d <= bestD {
					best, bestD = v, d
				}
			}
		}
	}
	if best >= 0 {
		return best
	}
	id := int32(len(vs.pos))
	vs.pos = append(vs.pos, p)
	vs.grid[c] = append(vs.grid[c], id)
	return id
}

func dist2(a, b r2.Vec) float64 {
	dx, dy := a.X-b.X, a.Y-b.Y
	return dx*dx + dy*dy
}

// orient is twice the signed area of the triangle a, b, c: positive when c
// lies to the left of a->b.
func orient(a, b, c r2.Vec) float64 {
	return (b.X-a.X)*(c.Y-a.Y) - (b.Y-a.Y)*(c.X-a.X)
}

// box is an axis-aligned bounding box.
type box struct{ minX, minY, maxX, maxY float64 }

func (b box) overlaps(c box) bool {
	return b.minX <= c.maxX && c.minX <= b.maxX && b.minY <= c.maxY && c.minY <= b.maxY
}

func (b box) union(c box) box {
	return box{math.Min(b.minX, c.minX), math.Min(b.minY, c.minY), math.Max(b.maxX, c.maxX), math.Max(b.maxY, c.maxY)}
}

func segBox(a, b r2.Vec, pad float64) box {
	return box{math.Min(a.X, b.X) - pad, math.Min(a.Y, b.Y) - pad, math.Max(a.X, b.X) + pad, math.Max(a.Y, b.Y) + pad}
}

// bvh is a bounding-volume hierarchy over boxes, used to find the pairs of
// boxes that overlap without testing every pair.
type bvh struct {
	boxes []box
	items []int32
	nodes []bvhNode
}

type bvhNode struct {
	box         box
	left, right int32 // children; -1 for a leaf
	start, end  int32 // leaf items: items[start:end]
}

const bvhLeafSize = 8

func buildBVH(boxes []box) *bvh {
	t := &bvh{boxes: boxes, items: make([]int32, len(boxes))}
	for i := range t.items {
		t.items[i] = int32(i)
	}
	if len(boxes) > 0 {
		t.nodes = make([]bvhNode, 0, 2*len(boxes)/bvhLeafSize+2)
		t.build(0, int32(len(boxes)))
	}
	return t
}

func (t *bvh) build(start, end int32) int32 {
	items := t.items[start:end]
	bb := t.boxes[items[0]]
	for _, i := range items[1:] {
		bb = bb.union(t.boxes[i])
	}
	n := int32(len(t.nodes))
	t.nodes = append(t.nodes, bvhNode{box: bb, left: -1, right: -1, start: start, end: end})
	if len(items) <= bvhLeafSize {
		return n
	}
	if bb.maxX-bb.minX >= bb.maxY-bb.minY {
		slices.SortFunc(items, func(i, j int32) int {
			return cmpFloat(t.boxes[i].minX+t.boxes[i].maxX, t.boxes[j].minX+t.boxes[j].maxX, i, j)
		})
	} else {
		slices.SortFunc(items, func(i, j int32) int {
			return cmpFloat(t.boxes[i].minY+t.boxes[i].maxY, t.boxes[j].minY+t.boxes[j].maxY, i, j)
		})
	}
	mid := start + int32(len(items)/2)
	l := t.build(start, mid)
	r := t.build(mid, end)
	t.nodes[n].left, t.nodes[n].right = l, r
	return n
}

func cmpFloat(a, b float64, i, j int32) int {
	switch {
	case a < b:
		return -1
	case a > b:
		return 1
	}
	return int(i) - int(j)
}

// pairs calls f(i, j) for every pair of distinct items whose boxes overlap,
// each pair once.
func (t *bvh) pairs(f func(i, j int32)) {
	if len(t.nodes) > 0 {
		t.self(0, f)
	}
}

func (t *bvh) self(n int32, f func(i, j int32)) {
	nd := &t.nodes[n]
	if nd.left < 0 {
		items := t.items[nd.start:nd.end]
		for a := range items {
			for b := a + 1; b < len(items); b++ {
				if t.boxes[items[a]].overlaps(t.boxes[items[b]]) {
					f(items[a], items[b])
				}
			}
		}
		return
	}
	t.self(nd.left, f)
	t.self(nd.right, f)
	t.cross(nd.left, nd.right, f)
}

func (t *bvh) cross(a, b int32, f func(i, j int32)) {
	na, nb := &t.nodes[a], &t.nodes[b]
	if !na.box.overlaps(nb.box) {
		return
	}
	switch {
	case na.left < 0 && nb.left < 0:
		for _, i := range t.items[na.start:na.end] {
			for _, j := range t.items[nb.start:nb.end] {
				if t.boxes[i].overlaps(t.boxes[j]) {
					f(i, j)
				}
			}
		}
	case na.left < 0 || (nb.left >= 0 && area(nb.box) > area(na.box)):
		t.cross(a, nb.left, f)
		t.cross(a, nb.right, f)
	default:
		t.cross(na.left, b, f)
		t.cross(na.right, b, f)
	}
}

func area(b box) float64 { return (b.maxX - b.minX) * (b.maxY - b.minY) }

// rawSeg is a segment between two vertices, in the direction of the ring or
// line it came from (src indexes the arrangement's sources).
type rawSeg struct {
	a, b  int32
	src   int32
	fresh bool // created in the last round: its pairs still need testing
}

// maxSplitRounds bounds the noding rounds. The first round splits the input
// at every crossing; later rounds only catch vertices that snapping moved
// within tol of a segment, and usually find nothing.
const maxSplitRounds = 6

// node splits segs until no vertex lies within tol of the interior of a
// segment and no two segments cross away from their vertices. It returns the
// split segments in input order (the pieces of a segment in its direction).
func node(vs *vertexSet, segs []rawSeg) []rawSeg {
	tol := vs.tol
	type split struct{ seg, v int32 }
	for round := 0; round < maxSplitRounds; round++ {
		boxes := make([]box, len(segs))
		for i, s := range segs {
			boxes[i] = segBox(vs.pos[s.a], vs.pos[s.b], tol)
		}
		var splits []split
		onSeg := func(w int32, s rawSeg) bool {
			if w == s.a || w == s.b {
				return false
			}
			A, B, W := vs.pos[s.a], vs.pos[s.b], vs.pos[w]
			d := r2.Sub(B, A)
			l2 := r2.Dot(d, d)
			t := r2.Dot(r2.Sub(W, A), d) / l2
			if t <= 0 || t >= 1 {
				return false
			}
			return dist2(W, r2.Add(A, r2.Scale(t, d))) <= tol*tol
		}
		buildBVH(boxes).pairs(func(i, j int32) {
			s, t := segs[i], segs[j]
			if !s.fresh && !t.fresh {
				return
			}
			touched := false
			for _, w := range [2]int32{t.a, t.b} {
				if onSeg(w, s) {
					splits = append(splits, split{i, w})
					touched = true
				}
			}
			for _, w := range [2]int32{s.a, s.b} {
				if onSeg(w, t) {
					splits = append(splits, split{j, w})
					touched = true
				}
			}
			if touched || s.a == t.a || s.a == t.b || s.b == t.a || s.b == t.b {
				return
			}
			A, B, C, D := vs.pos[s.a], vs.pos[s.b], vs.pos[t.a], vs.pos[t.b]
			o1, o2 := orient(A, B, C), orient(A, B, D)
			o3, o4 := orient(C, D, A), orient(C, D, B)
			if !(o1 > 0 && o2 < 0 || o1 < 0 && o2 > 0) || !(o3 > 0 && o4 < 0 || o3 < 0 && o4 > 0) {
				return
			}
			// Proper crossing: A + u (B-A) with u = o3 / (o3 - o4).
			u := o3 / (o3 - o4)
			x := r2.Add(A, r2.Scale(u, r2.Sub(B, A)))
			v := vs.id(x)
			if v != s.a && v != s.b {
				splits = append(splits, split{i, v})
			}
			if v != t.a && v != t.b {
				splits = append(splits, split{j, v})
			}
		})
		for i := range segs {
			segs[i].fresh = false
		}
		if len(splits) == 0 {
			break
		}
		slices.SortFunc(splits, func(p, q split) int {
			if p.seg != q.seg {
				return int(p.seg) - int(q.seg)
			}
			return int(p.v) - int(q.v)
		})
		out := make([]rawSeg, 0, len(segs)+2*len(splits))
		k := 0
		type at struct {
			t float64
			v int32
		}
		var pts []at
		for i, s := range segs {
			if k >= len(splits) || splits[k].seg != int32(i) {
				out = append(out, s)
				continue
			}
			A, B := vs.pos[s.a], vs.pos[s.b]
			d := r2.Sub(B, A)
			l2 := r2.Dot(d, d)
			pts = pts[:0]
			for ; k < len(splits) && splits[k].seg == int32(i); k++ {
				v := splits[k].v
				if len(pts) > 0 && pts[len(pts)-1].v == v {
					continue
				}
				pts = append(pts, at{r2.Dot(r2.Sub(vs.pos[v], A), d) / l2, v})
			}
			slices.SortFunc(pts, func(p, q at) int { return cmpFloat(p.t, q.t, p.v, q.v) })
			prev := s.a
			for _, p := range pts {
				if p.v == prev || p.v == s.b {
					continue
				}
				out = append(out, rawSeg{a: prev, b: p.v, src: s.src, fresh: true})
				prev = p.v
			}
			out = append(out, rawSeg{a: prev, b: s.b, src: s.src, fresh: true})
		}
		segs = out
	}
	return segs
}
