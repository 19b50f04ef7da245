package fmm

import (
	"math"
)

// node is a box of the adaptive quadtree over sources and targets.
type node struct {
	// Sources: expansion centre (middle of the bounding box of the panel
	// ends and points) and radius about it of everything in the subtree
	// (floored); the radius is also the multipole's scale.
	sc complex128
	sr float64
	// Targets: the same for the target points.
	tc complex128
	tr float64
	// The box's sources are src[slo:shi] and its targets tgt[tlo:thi] (tree
	// order).
	slo, shi, tlo, thi int32
	first, nchild      int32 // children are nodes[first:first+nchild]; first < 0 for a leaf
	parent, depth      int32
}

func (n *node) leaf() bool       { return n.first < 0 }
func (n *node) sources() int32   { return n.shi - n.slo }
func (n *node) targets() int32   { return n.thi - n.tlo }
func (n *node) hasSources() bool { return n.shi > n.slo }
func (n *node) hasTargets() bool { return n.thi > n.tlo }

// quadtree is an adaptive quadtree over sources and targets together
// (Carrier, Greengard & Rokhlin, A fast adaptive multipole algorithm for
// particle simulations, SIAM J. Sci. Stat. Comput. 9 (1988) 669-686,
// section 3): a box is split into its four quadrants while it holds more than
// leafSize sources or more than leafSize targets. Empty quadrants get no box,
// and a box whose items all fall in one quadrant is shrunk to it without a
// box of its own (a compressed quadtree), so strongly clustered items do not
// make long chains of boxes. Nodes are stored in breadth-first order: the
// boxes of each depth are contiguous.
type quadtree struct {
	nodes  []node
	src    []int32 // tree order -> source item
	tgt    []int32 // tree order -> target
	levels []int32 // boxes of depth d are nodes[levels[d]:levels[d+1]]
	leaves []int32 // leaves holding targets
}

// maxShrink bounds the number of halvings below the root's half-width:
// boxes narrower than 2^-maxShrink of the root are leaves whatever they hold
// (coincident items), and radii are floored at that width.
const maxShrink = 46

// buildTree builds the quadtree of sources placed at spos (a panel's
// midpoint, a point source's position) with extents ea, eb (the panel's ends,
// or the point twice) and of targets at tpos, then measures every box.
func buildTree(spos, ea, eb, tpos []complex128, leafSize int, par *pool) *quadtree {
	ns, nt := len(spos), len(tpos)
	q := &quadtree{src: make([]int32, ns), tgt: make([]int32, nt)}
	if ns+nt == 0 {
		return q
	}
	for i := range q.src {
		q.src[i] = int32(i)
	}
	for i := range q.tgt {
		q.tgt[i] = int32(i)
	}
	first := spos
	if ns == 0 {
		first = tpos
	}
	xmin, xmax := real(first[0]), real(first[0])
	ymin, ymax := imag(first[0]), imag(first[0])
	for _, set := range [2][]complex128{spos, tpos} {
		for _, z := range set {
			xmin, xmax = math.Min(xmin, real(z)), math.Max(xmax, real(z))
			ymin, ymax = math.Min(ymin, imag(z)), math.Max(ymax, imag(z))
		}
	}
	h0 := 0.5 * math.Max(xmax-xmin, ymax-ymin)
	if h0 == 0 {
		h0 = math.Max(1, math.Max(math.Abs(xmax), math.Abs(ymax)))
	}
	h0 *= 1 + 1e-9
	hmin := math.Ldexp(h0, -maxShrink)
	type box struct {
		c complex128
		h float64
	}
	boxes := []box{{complex(0.5*(xmin+xmax), 0.5*(ymin+ymax)), h0}}
	q.nodes = append(q.nodes, node{slo: 0, shi: int32(ns), tlo: 0, thi: int32(nt), first: -1, parent: -1})
	sp := &partition{pos: spos, tmp: make([]int32, ns), quad: make([]uint8, ns)}
	tp := &partition{pos: tpos, tmp: make([]int32, nt), quad: make([]uint8, nt)}
	for i := 0; i < len(q.nodes); i++ {
		nd := q.nodes[i]
		bx := boxes[i]
		sItems, tItems := q.src[nd.slo:nd.shi], q.tgt[nd.tlo:nd.thi]
		if len(sItems) <= leafSize && len(tItems) <= leafSize {
			continue
		}
		for bx.h > hmin {
			sp.classify(sItems, nd.slo, bx.c)
			tp.classify(tItems, nd.tlo, bx.c)
			full := -1
			for k := range 4 {
				if sp.cnt[k]+tp.cnt[k] == len(sItems)+len(tItems) {
					full = k
				}
			}
			if full < 0 {
				break
			}
			bx = box{quadrantCentre(bx.c, bx.h, full), 0.5 * bx.h}
		}
		if bx.h <= hmin {
			continue
		}
		sStart := sp.sort(sItems, nd.slo)
		tStart := tp.sort(tItems, nd.tlo)
		q.nodes[i].first = int32(len(q.nodes))
		for k := range 4 {
			if sp.cnt[k]+tp.cnt[k] == 0 {
				continue
			}
			slo, tlo := nd.slo+int32(sStart[k]), nd.tlo+int32(tStart[k])
			q.nodes = append(q.nodes, node{slo: slo, shi: slo + int32(sp.cnt[k]),
				tlo: tlo, thi: tlo + int32(tp.cnt[k]), first: -1, parent: int32(i), depth: nd.depth + 1})
			boxes = append(boxes, box{quadrantCentre(bx.c, bx.h, k), 0.5 * bx.h})
			q.nodes[i].nchild++
		}
	}
	depth := int32(-1)
	for i := range q.nodes {
		nd := &q.nodes[i]
		for nd.depth > depth {
			q.levels = append(q.levels, int32(i))
			depth++
		}
		if nd.leaf() && nd.hasTargets() {
			q.leaves = append(q.leaves, int32(i))
		}
	}
	q.levels = append(q.levels, int32(len(q.nodes)))
	rmin := math.Ldexp(h0, -maxShrink)
	par.run(len(q.nodes), 64, func(lo, hi, _ int) {
		for i := lo; i < hi; i++ {
			nd := &q.nodes[i]
			nd.sc, nd.sr = measure(q.src[nd.slo:nd.shi], ea, eb, rmin)
			nd.tc, nd.tr = measure(q.tgt[nd.tlo:nd.thi], tpos, tpos, rmin)
		}
	})
	return q
}

// partition sorts the items of one box by quadrant.
type partition struct {
	pos  []complex128
	tmp  []int32
	quad []uint8
	cnt  [4]int
}

func (p *partition) classify(items []int32, off int32, c complex128) {
	p.cnt = [4]int{}
	cx, cy := real(c), imag(c)
	for j, it := range items {
		z := p.pos[it]
		k := uint8(0)
		if real(z) >= cx {
			k = 1
		}
		if imag(z) >= cy {
			k |= 2
		}
		p.quad[int(off)+j] = k
		p.cnt[k]++
	}
}

// sort orders items by quadrant (stably) and returns where each quadrant
// starts.
func (p *partition) sort(items []int32, off int32) [4]int {
	var start [4]int
	for k := 1; k < 4; k++ {
		start[k] = start[k-1] + p.cnt[k-1]
	}
	at := start
	for j, it := range items {
		k := p.quad[int(off)+j]
		p.tmp[at[k]] = it
		at[k]++
	}
	copy(items, p.tmp[:len(items)])
	return start
}

func quadrantCentre(c complex128, h float64, k int) complex128 {
	dx, dy := -0.5*h, -0.5*h
	if k&1 != 0 {
		dx = 0.5 * h
	}
	if k&2 != 0 {
		dy = 0.5 * h
	}
	return c + complex(dx, dy)
}

// measure returns the centre of the bounding box of the items' extents and
// the largest distance from it to an extent (at least rmin). Coordinates are
// finite (checked by New), so plain comparisons do.
func measure(items []int32, ea, eb []complex128, rmin float64) (complex128, float64) {
	if len(items) == 0 {
		return 0, rmin
	}
	z := ea[items[0]]
	xmin, xmax, ymin, ymax := real(z), real(z), imag(z), imag(z)
	for _, it := range items {
		for _, z := range [2]complex128{ea[it], eb[it]} {
			x, y := real(z), imag(z)
			if x < xmin {
				xmin = x
			}
			if x > xmax {
				xmax = x
			}
			if y < ymin {
				ymin = y
			}
			if y > ymax {
				ymax = y
			}
		}
	}
	c := complex(0.5*(xmin+xmax), 0.5*(ymin+ymax))
	r2 := 0.0
	for _, it := range items {
		if d := abs2(ea[it] - c); d > r2 {
			r2 = d
		}
		if d := abs2(eb[it] - c); d > r2 {
			r2 = d
		}
	}
	// The square root may round down: widen by a few ulps so that the
	// radius is a true bound.
	return c, math.Max(math.Sqrt(r2)*(1+1e-15), rmin)
}
