package fmm

import (
	"math"
	"slices"
)

// csr is a list of lists: the entries of list i are idx[start[i]:start[i+1]].
type csr struct {
	start []int32
	idx   []int32
}

func (c *csr) at(i int32) []int32 { return c.idx[c.start[i]:c.start[i+1]] }

// bucket builds a csr over n lists from (list, entry) pairs, each list
// sorted ascending so that the order never depends on how the pairs were
// found.
func bucket(n int, pairs [][2]int32) csr {
	c := csr{start: make([]int32, n+1), idx: make([]int32, len(pairs))}
	for _, pr := range pairs {
		c.start[pr[0]+1]++
	}
	for i := 0; i < n; i++ {
		c.start[i+1] += c.start[i]
	}
	off := slices.Clone(c.start[:n])
	for _, pr := range pairs {
		c.idx[off[pr[0]]] = pr[1]
		off[pr[0]]++
	}
	for i := 0; i < n; i++ {
		slices.Sort(c.idx[c.start[i]:c.start[i+1]])
	}
	return c
}

// interactions are the lists of the adaptive method (Carrier, Greengard &
// Rokhlin 1988, section 3), found by a dual traversal of the target and
// source trees: every pair (target leaf, source leaf) is covered exactly
// once, by the first pair of ancestors that is well separated or, failing
// that, as a near pair of leaves.
type interactions struct {
	m2l  csr // per target box: source boxes translated into its local expansion (CGR's list 2)
	m2p  csr // per target leaf: source boxes evaluated directly at its targets (list 3)
	near csr // per target leaf: source leaves left to the near field (list 1)
}

// separated is the acceptance test of a multipole-to-local translation
// between a target box (centre ct, radius rt) and a source box (cs, rs):
// with d = |ct - cs|,
//
//	rs / (d - rt) <= rho  and  rt / (d - rs) <= rho,
//
// the two ratios that bound the truncation errors of the multipole and of the
// local expansion (see order).
func separated(ct, cs complex128, rt, rs, rho float64) bool {
	dz := ct - cs
	d := math.Hypot(real(dz), imag(dz))
	return rs+rho*rt <= rho*d && rt+rho*rs <= rho*d
}

type walker struct {
	q              *quadtree
	tz             []complex128 // targets in tree order
	rho            float64
	m2pMax         int32
	m2l, m2p, near [][2]int32
}

func traverse(q *quadtree, tz []complex128, rho float64, m2pMax int) interactions {
	w := &walker{q: q, tz: tz, rho: rho, m2pMax: int32(m2pMax)}
	if len(q.nodes) > 0 && q.nodes[0].hasSources() && q.nodes[0].hasTargets() {
		w.interact(0, 0)
	}
	n := len(q.nodes)
	return interactions{m2l: bucket(n, w.m2l), m2p: bucket(n, w.m2p), near: bucket(n, w.near)}
}

// interact covers every pair of leaves below target box ti and source box si.
// When the two are not separated it splits the larger (or the only one that
// can be split), as in the dual tree walk of Dehnen, A hierarchical O(N)
// force calculation algorithm, J. Comput. Phys. 179 (2002) 27-42, section 3.
// A target leaf takes a source box's multipole at its targets directly
// (CGR's list 3) as soon as every one of its targets is separated from the
// box, even when the leaf as a whole is not.
func (w *walker) interact(ti, si int32) {
	nodes := w.q.nodes
	a := &nodes[ti]
	b := &nodes[si]
	if separated(a.tc, b.sc, a.tr, b.sr, w.rho) {
		if a.leaf() && a.targets() <= w.m2pMax {
			w.m2p = append(w.m2p, [2]int32{ti, si})
		} else {
			w.m2l = append(w.m2l, [2]int32{ti, si})
		}
		return
	}
	if a.leaf() {
		if w.pointsSeparated(a, b) {
			w.m2p = append(w.m2p, [2]int32{ti, si})
			return
		}
		if b.leaf() {
			w.near = append(w.near, [2]int32{ti, si})
			return
		}
	}
	if b.leaf() || (!a.leaf() && a.tr >= b.sr) {
		for c := a.first; c < a.first+a.nchild; c++ {
			if nodes[c].hasTargets() {
				w.interact(c, si)
			}
		}
		return
	}
	for c := b.first; c < b.first+b.nchild; c++ {
		if nodes[c].hasSources() {
			w.interact(ti, c)
		}
	}
}

// pointsSeparated reports whether every target of leaf a passes the
// acceptance test with source box b on its own (a target radius of 0:
// rs <= rho |z - cs|).
func (w *walker) pointsSeparated(a, b *node) bool {
	lim := b.sr * b.sr / (w.rho * w.rho)
	for _, z := range w.tz[a.tlo:a.thi] {
		if abs2(z-b.sc) < lim {
			return false
		}
	}
	return true
}
