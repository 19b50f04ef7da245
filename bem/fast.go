package bem

import (
	"fmt"
	"math"
	"runtime"
	"sync"

	"github.com/rimfield/rimfield/bem/fmm"
	"gonum.org/v1/gonum/spatial/r2"
)

// The fast operator applies the rows of fillRow to a vector without storing
// the matrix. Every row of a connected part is a linear function of the
// part's layer densities,
//
//	single_k = -sign_k F_k scale_k,   double_k = u_k   (side k of the part)
//
// (and, over a grounded plane, of their mirror images with the opposite
// signs): a collocation row is the potential of those layers at its point
// plus its free term, constant and anchored terms; a sheet's conormal row is
// their gradient along the conormal at its point plus its jump term. So each
// part gets one fast multipole tree (bem/fmm) with its sides (and images) as
// sources and its rows' points as targets, in the part's isotropic frame,
// and a stored near block of the same closed forms as the dense rows
// (integrals, finite parts, the anchored sides' linear layers). The other
// rows (floating totals, Kutta conditions, balances) are sparse sums over
// the panels' inflows. Values are handled in "value space": a potential and
// an inflow density per panel and a constant per part, whether unknown or
// known, so that the same product gives A x (unknowns in, knowns zero) and
// B v (knowns in, unknowns zero) of the dense system.

// fastLeaf is the leaf size of the operator's trees: at the products'
// order (44 at 1e-12) larger leaves than fmm's default trade translations
// for stored near pairs: 16, 24, 40 and 64 took 1.95, 1.58, 1.33 and 1.33 s
// for the 60 iterations of the example busbars at 16 000 panels, with 71,
// 76, 87 and 92 MB. Above bigLeafPanels the default 24 keeps the near
// blocks (8 bytes per near pair and layer) within the memory budget of a
// million panels.
const (
	fastLeaf      = 40
	bigLeafPanels = 200000
)

// fastOp is the matrix-free system of a problem.
type fastOp struct {
	pr      *problem
	parts   []*fastPart
	sparse  []sparseRow // floating, Kutta and balance rows
	workers int
	tol     float64 // precision of the multipole products
}

// fastPart is the multipole product of one connected part.
type fastPart struct {
	idx   int // index into pr.parts
	r     *region
	nSide int // sources 0..nSide-1 are the sides, nSide.. their images
	tree  *fmm.Tree
	block *fmm.Block
	// Per target: the row it computes, and for conormal rows the vector c
	// with row value c . grad_X (the far field's gradient in the part's
	// frame): rw.scale times K n mapped to that frame.
	row  []int
	cvec []r2.Vec
	grad bool // some target is a conormal row
	// anchors are the sides with a linear potential (sheet.go) and, per
	// target, the coefficient of their slope.
	anchors []anchorColumn
}

// anchorColumn is the linear layer of an anchored side at every target.
type anchorColumn struct {
	side int
	coef []float64 // per target (0 at conormal rows)
}

// sparseRow is a row that is a weighted sum of panels' inflow densities.
type sparseRow struct {
	row   int
	panel []int
	w     []float64
}

// newFastOp builds the trees and near blocks of every part.
func newFastOp(pr *problem, tol float64, workers int) (*fastOp, error) {
	if workers <= 0 {
		workers = runtime.GOMAXPROCS(0)
	}
	op := &fastOp{pr: pr, workers: workers, tol: tol}
	targets := make([][]int, len(pr.parts))
	for i, rw := range pr.rows {
		switch rw.kind {
		case rowCollocation, rowSheetFlux:
			targets[rw.region] = append(targets[rw.region], i)
		case rowFloating, rowKutta, rowBalance:
			op.sparse = append(op.sparse, pr.sparseRow(i))
		}
	}
	for pi := range pr.parts {
		if len(targets[pi]) == 0 {
			continue
		}
		fp, err := pr.newFastPart(pi, targets[pi], tol, workers)
		if err != nil {
			return nil, err
		}
		op.parts = append(op.parts, fp)
	}
	return op, nil
}

// sparseRow returns row i (floating, Kutta or balance) as weights on the
// panels' inflow densities, the coefficients fillRow puts on F.
func (pr *problem) sparseRow(i int) sparseRow {
	rw := pr.rows[i]
	sr := sparseRow{row: i}
	add := func(j int, w float64) {
		sr.panel = append(sr.panel, j)
		sr.w = append(sr.w, w)
	}
	switch rw.kind {
	case rowFloating:
		for j, p := range pr.m.Panels {
			if p.Owner == rw.owner && !p.Interface() {
				add(j, rw.scale*p.Length())
			}
		}
	case rowKutta:
		if rw.terms != nil {
			for _, t := range rw.terms {
				add(t.panel, rw.scale*t.weight)
			}
			break
		}
		add(rw.pa, rw.scale)
		add(rw.pb, rw.scale)
	case rowBalance:
		r := &pr.parts[rw.region]
		for k := range r.sides {
			s := &r.sides[k]
			add(s.panel, rw.scale*s.sign*pr.m.Panels[s.panel].Length())
		}
	}
	return sr
}

// target returns where row i is collocated, in original coordinates.
func (pr *problem) target(i int) r2.Vec {
	rw := pr.rows[i]
	r := &pr.parts[rw.region]
	if rw.kind == rowSheetFlux {
		x, _ := pr.sheetPoint(r, rw.side)
		return x
	}
	return pr.m.Panels[r.sides[rw.side].panel].Mid()
}

func (pr *problem) newFastPart(pi int, rows []int, tol float64, workers int) (*fastPart, error) {
	r := &pr.parts[pi]
	fp := &fastPart{idx: pi, r: r, nSide: len(r.sides), row: rows, cvec: make([]r2.Vec, len(rows))}
	src := make([]fmm.Panel, 0, 2*len(r.sides))
	for k := range r.sides {
		src = append(src, fmm.Panel{A: r.sides[k].frame.a, B: r.sides[k].frame.b})
	}
	if r.image {
		for k := range r.sides {
			src = append(src, fmm.Panel{A: r.sides[k].image.a, B: r.sides[k].image.b})
		}
	}
	tx := make([]r2.Vec, len(rows))
	xi := make([]float64, len(rows)) // a conormal row's place along its side
	for t, i := range rows {
		rw := pr.rows[i]
		if rw.kind == rowSheetFlux {
			x, f := pr.sheetPoint(r, rw.side)
			tx[t] = r.transform(x)
			xi[t] = f
			// c . grad_X = rw.scale w . back(grad_X), back = diag(ax, 1/ax).
			w := r.conormal(pr, &r.sides[rw.side])
			fp.cvec[t] = r2.Vec{X: rw.scale * w.X * r.ax, Y: rw.scale * w.Y / r.ax}
			fp.grad = true
			continue
		}
		tx[t] = r.transform(pr.m.Panels[r.sides[rw.side].panel].Mid())
	}
	leaf := fastLeaf
	if len(pr.m.Panels) > bigLeafPanels {
		leaf = 0
	}
	tree, err := fmm.New(src, nil, tx, &fmm.Options{Tol: tol, Workers: workers, LeafSize: leaf})
	if err != nil {
		return nil, fmt.Errorf("bem: fast solver: %v", err)
	}
	fp.tree = tree
	n := fp.nSide
	fp.block = tree.NewBlock(true, true, func(t int, panels []int32, single, double []float64) {
		rw := pr.rows[rows[t]]
		me := &r.sides[rw.side]
		X := tx[t]
		for q, p := range panels {
			k := int(p)
			img := k >= n
			if img {
				k -= n
			}
			s := &r.sides[k]
			pair := k == rw.side || k == me.twin
			if rw.kind != rowSheetFlux {
				var sl, dl float64
				if img {
					sl, dl = s.image.integrals(X, false)
				} else {
					sl, dl = s.frame.integrals(X, pair)
				}
				single[q], double[q] = sl, dl
				continue
			}
			var gsl, gdl r2.Vec
			switch {
			case img:
				_, _, gsl, gdl = s.image.all(X)
			case pair:
				x := xi[t] * s.frame.l
				gdl = r2.Scale(-(1/x+1/(s.frame.l-x))/(2*math.Pi), s.frame.n)
			default:
				_, _, gsl, gdl = s.frame.all(X)
			}
			c := fp.cvec[t]
			single[q], double[q] = r2.Dot(c, gsl), r2.Dot(c, gdl)
		}
	})
	for k := range r.sides {
		if r.sides[k].anchor == 0 {
			continue
		}
		col := anchorColumn{side: k, coef: make([]float64, len(rows))}
		for t, i := range rows {
			rw := pr.rows[i]
			if rw.kind == rowSheetFlux {
				continue
			}
			me := &r.sides[rw.side]
			col.coef[t] = r.linearCoefficient(&r.sides[k], pr.m.Panels[me.panel].Mid(), k == rw.side || k == me.twin)
		}
		fp.anchors = append(fp.anchors, col)
	}
	return fp, nil
}

// values holds a vector in value space.
type values struct {
	u, f []float64 // per panel: potential and inflow density
	c    []float64 // per part: constant
}

func (pr *problem) newValues() *values {
	np := len(pr.m.Panels)
	return &values{u: make([]float64, np), f: make([]float64, np), c: make([]float64, len(pr.parts))}
}

// unknowns sets v to the values of the unknown vector x, known values zero.
func (pr *problem) unknowns(v *values, x []float64) {
	for j := range pr.m.Panels {
		v.u[j], v.f[j] = 0, 0
		if c := pr.uSlot[j].col; c >= 0 {
			v.u[j] = x[c]
		}
		if c := pr.fSlot[j].col; c >= 0 {
			v.f[j] = x[c] * pr.fScale[j]
		}
	}
	for i := range pr.parts {
		v.c[i] = 0
		if c := pr.parts[i].constCol; c >= 0 {
			v.c[i] = x[c]
		}
	}
}

// knowns sets v to the owners' condition values, unknowns zero.
func (pr *problem) knowns(v *values, value func(owner int) float64) {
	for j := range pr.m.Panels {
		v.u[j], v.f[j] = 0, 0
		if s := pr.uSlot[j]; s.col < 0 && s.owner >= 0 {
			v.u[j] = value(s.owner)
		}
		if s := pr.fSlot[j]; s.col < 0 && s.owner >= 0 {
			v.f[j] = value(s.owner)
		}
	}
	clear(v.c)
}

// fastWork is the memory of one product.
type fastWork struct {
	single, double [][]float64 // per part: source densities
	pot            [][]float64 // per part: value per target
	grad           [][]r2.Vec
}

func (op *fastOp) newWork() *fastWork {
	w := &fastWork{}
	for _, fp := range op.parts {
		ns := fp.tree.Panels()
		nt := fp.tree.Targets()
		w.single = append(w.single, make([]float64, ns))
		w.double = append(w.double, make([]float64, ns))
		w.pot = append(w.pot, make([]float64, nt))
		var g []r2.Vec
		if fp.grad {
			g = make([]r2.Vec, nt)
		}
		w.grad = append(w.grad, g)
	}
	return w
}

// apply sets out (one value per row, in row order) to the rows applied to
// the values v.
func (op *fastOp) apply(out []float64, v *values, w *fastWork) {
	pr := op.pr
	for pi, fp := range op.parts {
		r := fp.r
		s, d := w.single[pi], w.double[pi]
		for k := range r.sides {
			sd := &r.sides[k]
			s[k] = -sd.sign * v.f[sd.panel] * sd.scale
			d[k] = v.u[sd.panel]
		}
		if r.image {
			n := fp.nSide
			for k := 0; k < n; k++ {
				s[n+k], d[n+k] = -s[k], -d[k]
			}
		}
		dens := fmm.Density{Single: s, Double: d}
		pot, grad := w.pot[pi], w.grad[pi]
		fp.tree.Apply(pot, grad, dens)
		if fp.grad {
			for t, c := range fp.cvec {
				if c != (r2.Vec{}) {
					pot[t] = r2.Dot(c, grad[t])
				}
			}
		}
		fp.block.AddTo(pot, dens)
		for t, i := range fp.row {
			rw := pr.rows[i]
			me := &r.sides[rw.side]
			y := pot[t]
			if rw.kind == rowSheetFlux {
				y += 0.5 * rw.scale * (v.f[me.panel] - v.f[r.sides[me.twin].panel])
				out[i] = y
				continue
			}
			y += 0.5 * v.u[me.panel]
			if me.twin >= 0 {
				y += 0.5 * v.u[r.sides[me.twin].panel]
			}
			if r.constCol >= 0 {
				y -= v.c[fp.idx]
			}
			out[i] = y
		}
		for _, a := range fp.anchors {
			cs, cn, nb := pr.anchorSlope(r, a.side)
			m := cs*v.u[r.sides[a.side].panel] + cn*v.u[r.sides[nb].panel]
			if m == 0 {
				continue
			}
			for t, c := range a.coef {
				out[fp.row[t]] += c * m
			}
		}
	}
	for _, sr := range op.sparse {
		var y float64
		for q, j := range sr.panel {
			y += sr.w[q] * v.f[j]
		}
		out[sr.row] = y
	}
}

// Bytes returns the memory held by the trees and near blocks.
func (op *fastOp) bytes() int {
	n := 0
	for _, fp := range op.parts {
		n += fp.tree.Stats().Bytes + fp.block.Bytes() + 24*len(fp.row)
		for _, a := range fp.anchors {
			n += 8 * len(a.coef)
		}
	}
	return n
}

// workPool hands out product workspaces.
type workPool struct {
	mu   sync.Mutex
	free []*fastWork
	op   *fastOp
}

func (p *workPool) get() *fastWork {
	p.mu.Lock()
	defer p.mu.Unlock()
	if n := len(p.free); n > 0 {
		w := p.free[n-1]
		p.free = p.free[:n-1]
		return w
	}
	return p.op.newWork()
}

func (p *workPool) put(w *fastWork) {
	p.mu.Lock()
	p.free = append(p.free, w)
	p.mu.Unlock()
}
