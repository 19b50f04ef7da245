package fmm

import (
	"fmt"
	"math"
	"runtime"
	"slices"
	"sync"
	"unsafe"

	"gonum.org/v1/gonum/spatial/r2"
)

// Panel is a straight source panel from A to B (metres, or any length unit
// used throughout). Its normal is the right normal of B - A, the normal of
// the double layer.
type Panel struct {
	A, B r2.Vec
}

// Density holds the source strengths of one product. A nil slice means zero
// strengths; a non-nil slice must have one value per panel (per point).
type Density struct {
	// Single is the single-layer density s_j of each panel (per unit length).
	Single []float64
	// Double is the double-layer density d_j of each panel (per unit length).
	Double []float64
	// Linear is the slope g_j of a double layer of linear density
	// g_j (s - L_j/2) on each panel, s the arc length from A (a potential
	// reconstructed linearly along the panel). Apply includes it in the far
	// field only: Block and AddNear leave its near part to the caller.
	Linear []float64
	// Point is the strength q_k of each point source.
	Point []float64
}

// Options tunes a Tree. The zero value (or a nil *Options) gives the defaults.
type Options struct {
	// Tol is the requested precision: the bound of every far-field
	// interaction relative to its own size (see the package documentation).
	// From 1e-12 to 1e-3; 0 means 1e-10.
	Tol float64
	// LeafSize is the largest number of targets or sources in a leaf box;
	// 0 means 24. Larger leaves make the far field cheaper and the near
	// lists longer: at 24, about 50 near panels per collocation point of a
	// boundary mesh (the panel's own leaf and its neighbours along the
	// boundary).
	LeafSize int
	// Workers is the number of goroutines used to build the tree and in
	// every product; 0 means runtime.GOMAXPROCS(0). Results do not depend on
	// it, to the last bit.
	Workers int
}

const (
	defaultTol      = 1e-10
	minTol          = 1e-12
	maxTol          = 1e-3
	defaultLeafSize = 24
)

// Tree is the fast multipole product of a fixed set of source panels and
// point sources onto a fixed set of targets. Build it once with New, then
// Apply it to any number of densities. A Tree is safe for concurrent use.
type Tree struct {
	np, nq, nt int
	tol        float64
	e          *expander
	par        pool

	tree  *quadtree
	lists interactions

	// Sources in tree order: panel ends (a point source has both at its
	// position) and the item each came from (panels 0..np-1, then points).
	sa, sb []complex128
	// Targets in tree order.
	tz []complex128
	// targetLeaf[i] is the leaf of target i (original numbering).
	targetLeaf []int32
	// nearPanels lists, per target leaf, the panels (original numbering,
	// ascending) of its near source leaves.
	nearPanels csr
	panels     []Panel
	targets    []r2.Vec

	mu   sync.Mutex
	free []*work
}

// work is the memory of one product.
type work struct {
	mp, lc  []complex128
	s, d, g []float64 // densities in source tree order (a point's strength in s)
	pw      [][]complex128
	m2l     []*m2lScratch
}

// New builds the tree of panels and point sources (either may be empty) over
// targets. It returns an error for non-finite coordinates, zero-length
// panels and options out of range.
func New(panels []Panel, points, targets []r2.Vec, o *Options) (*Tree, error) {
	var opt Options
	if o != nil {
		opt = *o
	}
	if opt.Tol == 0 {
		opt.Tol = defaultTol
	}
	if !(opt.Tol >= minTol && opt.Tol <= maxTol) {
		return nil, fmt.Errorf("fmm: tolerance %g is out of range: choose Options.Tol from %g to %g (0 for %g)",
			opt.Tol, minTol, maxTol, defaultTol)
	}
	if opt.LeafSize < 0 {
		return nil, fmt.Errorf("fmm: Options.LeafSize %d is negative: use a positive size or 0 for %d", opt.LeafSize, defaultLeafSize)
	}
	if opt.LeafSize == 0 {
		opt.LeafSize = defaultLeafSize
	}
	if opt.Workers < 0 {
		return nil, fmt.Errorf("fmm: Options.Workers %d is negative: use a positive count or 0 for all processors", opt.Workers)
	}
	if opt.Workers == 0 {
		opt.Workers = runtime.GOMAXPROCS(0)
	}
	if n := len(panels) + len(points); n > math.MaxInt32-1 || len(targets) > math.MaxInt32-1 {
		return nil, fmt.Errorf("fmm: %d sources and %d targets exceed the limit of %d each", n, len(targets), math.MaxInt32-1)
	}
	for j, p := range panels {
		if !finite(p.A) || !finite(p.B) {
			return nil, fmt.Errorf("fmm: panel %d has a non-finite end point (%v, %v)", j, p.A, p.B)
		}
		if p.A == p.B {
			return nil, fmt.Errorf("fmm: panel %d has zero length (both ends at %v): drop it or give it distinct ends", j, p.A)
		}
	}
	for k, y := range points {
		if !finite(y) {
			return nil, fmt.Errorf("fmm: point source %d is not finite (%v)", k, y)
		}
	}
	for i, x := range targets {
		if !finite(x) {
			return nil, fmt.Errorf("fmm: target %d is not finite (%v)", i, x)
		}
	}
	p := order(opt.Tol, rho)
	t := &Tree{np: len(panels), nq: len(points), nt: len(targets), tol: opt.Tol,
		e: expanderFor(p), par: pool{workers: opt.Workers},
		panels: slices.Clone(panels), targets: slices.Clone(targets)}

	ns := t.np + t.nq
	pos := make([]complex128, ns)
	ea := make([]complex128, ns)
	eb := make([]complex128, ns)
	for j, pn := range panels {
		ea[j], eb[j] = cplx(pn.A), cplx(pn.B)
		pos[j] = 0.5 * (ea[j] + eb[j])
	}
	for k, y := range points {
		z := cplx(y)
		pos[t.np+k], ea[t.np+k], eb[t.np+k] = z, z, z
	}
	tp := make([]complex128, t.nt)
	for i, x := range targets {
		tp[i] = cplx(x)
	}
	q := buildTree(pos, ea, eb, tp, opt.LeafSize, &t.par)
	t.tree = q
	t.sa = make([]complex128, ns)
	t.sb = make([]complex128, ns)
	for k, it := range q.src {
		t.sa[k], t.sb[k] = ea[it], eb[it]
	}
	t.tz = make([]complex128, t.nt)
	for k, it := range q.tgt {
		t.tz[k] = tp[it]
	}
	t.targetLeaf = make([]int32, t.nt)
	for _, li := range q.leaves {
		nd := &q.nodes[li]
		for _, it := range q.tgt[nd.tlo:nd.thi] {
			t.targetLeaf[it] = li
		}
	}

	t.lists = traverse(q, t.tz, rho, p/8)
	t.buildNearPanels()
	return t, nil
}

func finite(v r2.Vec) bool {
	return !math.IsNaN(v.X) && !math.IsInf(v.X, 0) && !math.IsNaN(v.Y) && !math.IsInf(v.Y, 0)
}

func cplx(v r2.Vec) complex128 { return complex(v.X, v.Y) }

// buildNearPanels gathers, for every target leaf, the panels of its near
// source leaves.
func (t *Tree) buildNearPanels() {
	q := t.tree
	n := len(q.nodes)
	c := csr{start: make([]int32, n+1)}
	lists := make([][]int32, n)
	t.par.run(len(q.leaves), 16, func(lo, hi, _ int) {
		for _, li := range q.leaves[lo:hi] {
			var ps []int32
			for _, si := range t.lists.near.at(li) {
				nd := &q.nodes[si]
				for _, it := range q.src[nd.slo:nd.shi] {
					if int(it) < t.np {
						ps = append(ps, it)
					}
				}
			}
			slices.Sort(ps)
			lists[li] = ps
		}
	})
	total := 0
	for i, l := range lists {
		total += len(l)
		c.start[i+1] = int32(total)
	}
	if total > math.MaxInt32 {
		// Start offsets are int32; a near list this long means the leaves
		// hold far too many panels: not reachable with LeafSize defaults.
		panic("fmm: near lists exceed 2^31 entries")
	}
	c.idx = make([]int32, 0, total)
	for _, l := range lists {
		c.idx = append(c.idx, l...)
	}
	t.nearPanels = c
}

// Order returns the expansion order chosen for the tolerance.
func (t *Tree) Order() int { return t.e.p }

// Tol returns the precision the tree was built for.
func (t *Tree) Tol() float64 { return t.tol }

// NearPanels returns the panels whose interaction with target i the product
// leaves out (ascending). The caller adds them exactly; see Block. The slice
// is shared by the targets of one leaf and must not be modified.
func (t *Tree) NearPanels(i int) []int32 {
	return t.nearPanels.at(t.targetLeaf[i])
}

// NearPairs returns the number of (target, near panel) pairs.
func (t *Tree) NearPairs() int {
	n := 0
	for _, li := range t.tree.leaves {
		nd := &t.tree.nodes[li]
		n += int(nd.targets()) * len(t.nearPanels.at(li))
	}
	return n
}

// Stats describes a tree.
type Stats struct {
	Order      int // expansion order p
	Boxes      int
	Leaves     int // leaves holding targets
	Depth      int // depth of the deepest box (root 0)
	M2L        int // multipole-to-local translations per product
	M2P        int // multipoles evaluated directly at a target leaf
	NearLeaves int // (target leaf, source leaf) pairs left to the near field
	NearPairs  int // (target, panel) pairs left to the near field
	Bytes      int // memory held by the tree and one product's workspace
}

// Stats returns the tree's statistics.
func (t *Tree) Stats() Stats {
	q := t.tree
	s := Stats{Order: t.e.p, Boxes: len(q.nodes), Leaves: len(q.leaves), Depth: max(len(q.levels)-2, 0),
		M2L: len(t.lists.m2l.idx), M2P: len(t.lists.m2p.idx), NearLeaves: len(t.lists.near.idx),
		NearPairs: t.NearPairs()}
	cs := func(c csr) int { return 4 * (len(c.start) + len(c.idx)) }
	s.Bytes = int(unsafe.Sizeof(node{}))*len(q.nodes) +
		4*(len(q.src)+len(q.tgt)+len(q.leaves)+len(q.levels)) +
		16*(len(t.sa)+len(t.sb)+len(t.tz)) + 4*len(t.targetLeaf) +
		cs(t.lists.m2l) + cs(t.lists.m2p) + cs(t.lists.near) + cs(t.nearPanels) +
		32*len(t.panels) + 16*len(t.targets) + // the copies kept for Panel and Target
		2*16*(t.e.p+1)*len(q.nodes) + 16*len(t.sa) // one workspace
	return s
}

func (t *Tree) acquire() *work {
	t.mu.Lock()
	if n := len(t.free); n > 0 {
		w := t.free[n-1]
		t.free = t.free[:n-1]
		t.mu.Unlock()
		return w
	}
	t.mu.Unlock()
	n := t.e.p + 1
	w := &work{mp: make([]complex128, n*len(t.tree.nodes)), lc: make([]complex128, n*len(t.tree.nodes)),
		s: make([]float64, len(t.sa)), d: make([]float64, len(t.sa)), g: make([]float64, len(t.sa))}
	for g := 0; g < t.par.workers; g++ {
		w.pw = append(w.pw, make([]complex128, n))
		w.m2l = append(w.m2l, newM2LScratch(t.e.p))
	}
	return w
}

func (t *Tree) release(w *work) {
	t.mu.Lock()
	t.free = append(t.free, w)
	t.mu.Unlock()
}

func (t *Tree) checkDensity(d Density) {
	if d.Single != nil && len(d.Single) != t.np {
		panic(fmt.Sprintf("fmm: Density.Single has %d values for %d panels", len(d.Single), t.np))
	}
	if d.Double != nil && len(d.Double) != t.np {
		panic(fmt.Sprintf("fmm: Density.Double has %d values for %d panels", len(d.Double), t.np))
	}
	if d.Linear != nil && len(d.Linear) != t.np {
		panic(fmt.Sprintf("fmm: Density.Linear has %d values for %d panels", len(d.Linear), t.np))
	}
	if d.Point != nil && len(d.Point) != t.nq {
		panic(fmt.Sprintf("fmm: Density.Point has %d values for %d point sources", len(d.Point), t.nq))
	}
}

func (t *Tree) checkOut(u []float64, grad []r2.Vec) {
	if u != nil && len(u) != t.nt {
		panic(fmt.Sprintf("fmm: potential slice has %d values for %d targets", len(u), t.nt))
	}
	if grad != nil && len(grad) != t.nt {
		panic(fmt.Sprintf("fmm: gradient slice has %d values for %d targets", len(grad), t.nt))
	}
}

// Apply sets u[i] (and grad[i] when grad is not nil) to the far part of the
// potential (and its gradient) at target i of the sources with density d:
//
//	u(x) = sum_j s_j int G ds + sum_j d_j int dG/dn_y ds + sum_k q_k G(x, y_k),  G = -(1/2 pi) ln r,
//
// leaving out, for panels, the pairs listed by NearPanels; the near point
// sources are included exactly (a target at a point source gets nothing from
// it). u may be nil when only the gradient is wanted.
func (t *Tree) Apply(u []float64, grad []r2.Vec, d Density) {
	t.checkDensity(d)
	t.checkOut(u, grad)
	if t.nt == 0 {
		return
	}
	if len(t.sa) == 0 {
		clear(u)
		clear(grad)
		return
	}
	w := t.acquire()
	defer t.release(w)
	t.gather(w, d)
	t.upward(w)
	t.translate(w)
	t.downward(w)
	t.evaluate(w, u, grad)
}

// gather puts the densities in source tree order.
func (t *Tree) gather(w *work, d Density) {
	t.par.run(len(t.sa), 4096, func(lo, hi, _ int) {
		for k := lo; k < hi; k++ {
			it := int(t.tree.src[k])
			var s, dd, g float64
			if it < t.np {
				if d.Single != nil {
					s = d.Single[it]
				}
				if d.Double != nil {
					dd = d.Double[it]
				}
				if d.Linear != nil {
					g = d.Linear[it]
				}
			} else if d.Point != nil {
				s = d.Point[it-t.np]
			}
			w.s[k], w.d[k], w.g[k] = s, dd, g
		}
	})
}

// upward forms the multipoles: panels and points into the leaves, then
// children into parents, deepest level first.
func (t *Tree) upward(w *work) {
	n := t.e.p + 1
	q := t.tree
	for lv := len(q.levels) - 2; lv >= 0; lv-- {
		lo, hi := int(q.levels[lv]), int(q.levels[lv+1])
		t.par.run(hi-lo, 8, func(a, b, g int) {
			for i := lo + a; i < lo+b; i++ {
				nd := &q.nodes[i]
				m := w.mp[i*n : i*n+n]
				clear(m)
				if !nd.hasSources() {
					continue
				}
				if nd.leaf() {
					for k := nd.slo; k < nd.shi; k++ {
						s, d, gl := w.s[k], w.d[k], w.g[k]
						if s == 0 && d == 0 && gl == 0 {
							continue
						}
						if int(q.src[k]) < t.np {
							t.e.addPanel(m, nd.sc, nd.sr, t.sa[k], t.sb[k], s, d, gl)
						} else {
							t.e.addPoint(m, nd.sc, nd.sr, t.sa[k], s)
						}
					}
					continue
				}
				for c := nd.first; c < nd.first+nd.nchild; c++ {
					ch := &q.nodes[c]
					if ch.hasSources() {
						t.e.m2m(m, w.mp[int(c)*n:int(c)*n+n], nd.sc, ch.sc, nd.sr, ch.sr, w.pw[g])
					}
				}
			}
		})
	}
}

// translate forms each target box's own local expansion from its list of
// well-separated source boxes.
func (t *Tree) translate(w *work) {
	n := t.e.p + 1
	q := t.tree
	t.par.run(len(q.nodes), 4, func(a, b, g int) {
		for i := a; i < b; i++ {
			nd := &q.nodes[i]
			loc := w.lc[i*n : i*n+n]
			clear(loc)
			for _, si := range t.lists.m2l.at(int32(i)) {
				sn := &q.nodes[si]
				t.e.m2l(loc, w.mp[int(si)*n:int(si)*n+n], nd.tc, sn.sc, nd.tr, sn.sr, w.m2l[g])
			}
		}
	})
}

// downward adds each parent's local expansion to its children's, top first.
func (t *Tree) downward(w *work) {
	n := t.e.p + 1
	q := t.tree
	for lv := 1; lv < len(q.levels)-1; lv++ {
		lo, hi := int(q.levels[lv]), int(q.levels[lv+1])
		t.par.run(hi-lo, 16, func(a, b, g int) {
			for i := lo + a; i < lo+b; i++ {
				nd := &q.nodes[i]
				if !nd.hasTargets() {
					continue
				}
				pi := int(nd.parent)
				pn := &q.nodes[pi]
				t.e.l2l(w.lc[i*n:i*n+n], w.lc[pi*n:pi*n+n], pn.tc, nd.tc, pn.tr, nd.tr, w.pw[g])
			}
		})
	}
}

// evaluate sums, at every target, its leaf's local expansion, the multipoles
// of its list 3 and its near point sources.
func (t *Tree) evaluate(w *work, u []float64, grad []r2.Vec) {
	n := t.e.p + 1
	q := t.tree
	wantGrad := grad != nil
	t.par.run(len(q.leaves), 4, func(a, b, _ int) {
		for _, li := range q.leaves[a:b] {
			nd := &q.nodes[li]
			loc := w.lc[int(li)*n : int(li)*n+n]
			m2p := t.lists.m2p.at(li)
			near := t.lists.near.at(li)
			for k := nd.tlo; k < nd.thi; k++ {
				z := t.tz[k]
				var wr float64
				var dw complex128
				if wantGrad {
					var lw complex128
					lw, dw = t.e.evalLocal(loc, nd.tc, nd.tr, z)
					wr = real(lw)
				} else {
					wr = t.e.evalLocalU(loc, nd.tc, nd.tr, z)
				}
				for _, si := range m2p {
					sn := &q.nodes[si]
					ur, g := t.e.evalMultipole(w.mp[int(si)*n:int(si)*n+n], sn.sc, sn.sr, z, wantGrad)
					wr += ur
					dw += g
				}
				if t.nq > 0 {
					for _, si := range near {
						sn := &q.nodes[si]
						for j := sn.slo; j < sn.shi; j++ {
							if int(q.src[j]) < t.np || w.s[j] == 0 {
								continue
							}
							dz := z - t.sa[j]
							if dz == 0 {
								continue
							}
							qj := w.s[j]
							if u != nil {
								wr += qj * 0.5 * math.Log(abs2(dz))
							}
							if wantGrad {
								dw += complex(qj, 0) * inv(dz)
							}
						}
					}
				}
				i := q.tgt[k]
				if u != nil {
					u[i] = -inv2Pi * wr
				}
				if wantGrad {
					grad[i] = r2.Vec{X: -inv2Pi * real(dw), Y: inv2Pi * imag(dw)}
				}
			}
		}
	})
}

const inv2Pi = 1 / (2 * math.Pi)
