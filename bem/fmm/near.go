package fmm

import (
	"fmt"

	"gonum.org/v1/gonum/spatial/r2"
)

// NearCoef fills the exact near-field coefficients of one target: for each
// k, single[k] and double[k] are the potentials at target of panel
// panels[k] carrying unit single-layer and unit double-layer density
// (int G ds and int dG/dn_y ds with the conventions of Apply). A slice is nil
// when the block does not store that layer. It is called concurrently for
// different targets and must not keep the slices.
type NearCoef func(target int, panels []int32, single, double []float64)

// Block is the sparse near-field matrix of a Tree: the exact coefficients of
// every (target, near panel) pair, built once and applied with every new
// density. Storage is one row per target over its leaf's near panels,
// 8 bytes per pair and stored layer.
type Block struct {
	t              *Tree
	off            []int // start of each target's row (tree order of targets)
	single, double []float64
}

// NewBlock fills a near-field block by calling coef once per target (in
// parallel). single and double choose the layers it stores; a layer that is
// not stored contributes nothing in AddTo.
func (t *Tree) NewBlock(single, double bool, coef NearCoef) *Block {
	b := &Block{t: t, off: make([]int, t.nt+1)}
	q := t.tree
	for _, li := range q.leaves {
		nd := &q.nodes[li]
		m := len(t.nearPanels.at(li))
		for k := nd.tlo; k < nd.thi; k++ {
			b.off[k+1] = m
		}
	}
	for k := 0; k < t.nt; k++ {
		b.off[k+1] += b.off[k]
	}
	if single {
		b.single = make([]float64, b.off[t.nt])
	}
	if double {
		b.double = make([]float64, b.off[t.nt])
	}
	t.par.run(len(q.leaves), 4, func(lo, hi, _ int) {
		for _, li := range q.leaves[lo:hi] {
			nd := &q.nodes[li]
			ps := t.nearPanels.at(li)
			for k := nd.tlo; k < nd.thi; k++ {
				var rs, rd []float64
				if single {
					rs = b.single[b.off[k]:b.off[k+1]]
				}
				if double {
					rd = b.double[b.off[k]:b.off[k+1]]
				}
				coef(int(q.tgt[k]), ps, rs, rd)
			}
		}
	})
	return b
}

// Bytes returns the memory held by the block's coefficients and offsets.
func (b *Block) Bytes() int {
	return 8 * (len(b.off) + len(b.single) + len(b.double))
}

// AddTo adds the near part of the potential of density d to dst (one value
// per target): dst[i] += sum over the near panels j of target i of
// single_ij s_j + double_ij d_j. Point sources are not part of it (Apply
// includes them in full).
func (b *Block) AddTo(dst []float64, d Density) {
	t := b.t
	t.checkDensity(d)
	if len(dst) != t.nt {
		panic(fmt.Sprintf("fmm: destination has %d values for %d targets", len(dst), t.nt))
	}
	s, dd := d.Single, d.Double
	if b.single == nil {
		s = nil
	}
	if b.double == nil {
		dd = nil
	}
	if s == nil && dd == nil {
		return
	}
	q := t.tree
	t.par.run(len(q.leaves), 8, func(lo, hi, _ int) {
		for _, li := range q.leaves[lo:hi] {
			nd := &q.nodes[li]
			ps := t.nearPanels.at(li)
			for k := nd.tlo; k < nd.thi; k++ {
				o := b.off[k]
				var sum float64
				switch {
				case dd == nil:
					row := b.single[o : o+len(ps)]
					for j, p := range ps {
						sum += row[j] * s[p]
					}
				case s == nil:
					row := b.double[o : o+len(ps)]
					for j, p := range ps {
						sum += row[j] * dd[p]
					}
				default:
					rs := b.single[o : o+len(ps)]
					rd := b.double[o : o+len(ps)]
					for j, p := range ps {
						sum += rs[j]*s[p] + rd[j]*dd[p]
					}
				}
				dst[q.tgt[k]] += sum
			}
		}
	})
}

// NearFunc returns the exact potentials at target of panel with unit
// single-layer and unit double-layer density and, when grad is true, their
// gradients at the target. It is called concurrently.
type NearFunc func(target, panel int, grad bool) (sl, dl float64, gsl, gdl r2.Vec)

// AddNear adds to u (and grad when not nil) the near part of density d,
// computed pair by pair by f: the complement of Apply, for evaluations that
// do not repeat (pictures, probes) or for tests.
func (t *Tree) AddNear(u []float64, grad []r2.Vec, d Density, f NearFunc) {
	t.checkDensity(d)
	t.checkOut(u, grad)
	if d.Single == nil && d.Double == nil {
		return
	}
	q := t.tree
	wantGrad := grad != nil
	t.par.run(len(q.leaves), 4, func(lo, hi, _ int) {
		for _, li := range q.leaves[lo:hi] {
			nd := &q.nodes[li]
			ps := t.nearPanels.at(li)
			for k := nd.tlo; k < nd.thi; k++ {
				i := int(q.tgt[k])
				var su float64
				var sg r2.Vec
				for _, p := range ps {
					var s, dd float64
					if d.Single != nil {
						s = d.Single[p]
					}
					if d.Double != nil {
						dd = d.Double[p]
					}
					if s == 0 && dd == 0 {
						continue
					}
					sl, dl, gsl, gdl := f(i, int(p), wantGrad)
					su += s*sl + dd*dl
					if wantGrad {
						sg = r2.Add(sg, r2.Add(r2.Scale(s, gsl), r2.Scale(dd, gdl)))
					}
				}
				if u != nil {
					u[i] += su
				}
				if wantGrad {
					grad[i] = r2.Add(grad[i], sg)
				}
			}
		}
	})
}

// Eval sets u (and grad when not nil) to the whole potential (and gradient)
// of density d at the targets: Apply's far part plus the near part computed
// by f.
func (t *Tree) Eval(u []float64, grad []r2.Vec, d Density, f NearFunc) {
	t.Apply(u, grad, d)
	t.AddNear(u, grad, d, f)
}

// Panel returns source panel j.
func (t *Tree) Panel(j int) Panel { return t.panels[j] }

// Target returns target i.
func (t *Tree) Target(i int) r2.Vec { return t.targets[i] }

// Targets returns the number of targets.
func (t *Tree) Targets() int { return t.nt }

// Panels returns the number of source panels.
func (t *Tree) Panels() int { return t.np }

// Points returns the number of point sources.
func (t *Tree) Points() int { return t.nq }
