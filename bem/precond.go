package bem

import (
	"fmt"

	"github.com/rimfield/rimfield/bem/fmm"
	"gonum.org/v1/gonum/spatial/r2"
)

// Preconditioning the fast solver. The rows on a boundary with a fixed or
// floating potential are a first-kind equation for the inflow F (the single
// layer V, whose eigenvalues fall as 1/frequency: unpreconditioned GMRES
// needed 600-1700 iterations from 1000 to 4000 panels, growing with N, and
// stagnated on scenes with interfaces), while the rows on a flux boundary
// are of the second kind in u (1/2 + K). Three steps make the whole system
// behave as the second kind without changing its solution:
//
//  1. Pairing: rows are reordered so that row c is the equation of unknown
//     c (the collocation row of a panel with the panel's own unknown, the
//     floating total with the floating potential, the balance with the
//     part's constant). GMRES is not invariant under a reordering of rows
//     and needs the spectrum of the paired matrix.
//  2. Interfaces: the two rows of an interface panel (one per side, R_A in
//     its Left region, R_B in its Right one) become
//     S = (rho R_A + R_B)/(1 + rho) and D = (R_A - R_B)/(1 + rho), rho the
//     ratio of the two sides' single-layer scales (k_A/k_B when isotropic):
//     the panel's own single layer cancels in S, which is of the second kind
//     in u (the transmission form of, e.g., Steinbach, Numerical
//     Approximation Methods for Elliptic Boundary Value Problems, 2008,
//     ch. 6), and D is a first-kind equation in F like a Dirichlet row.
//  3. Calderon preconditioning from the right: the inflow columns of the
//     first-kind rows are fed through the hypersingular operator W of their
//     part, F = length W y (+ a rank-one term per connected run of such
//     panels, since W annihilates constants), so that the product V W =
//     I/4 - K^2 (the Calderon identity; Steinbach & Wendland, The
//     construction of some efficient preconditioners in the boundary
//     element method, Adv. Comput. Math. 9, 1998; Hiptmair, Operator
//     preconditioning, Comput. Math. Appl. 52, 2006) is of the second kind.
//     W acting on panel-wise constant values is, exactly, the conormal
//     derivative of their double layer: point vortices of strength
//     y_k - y_(k+1) at the panel ends (mirrored with the opposite sign over
//     a grounded plane), evaluated at the midpoints by a multipole product
//     of point sources, which needs no near block.
//
// Measured on dense copies of the systems (1000, 2000 and 4000 panels):
// three conductors in the open plane 18, 18, 18 iterations to 1e-10; a
// closed mixed problem 29-30; a dielectric disc with conductors 16; the
// example busbars 50-54, weir 76-78, sensor 61-67.

// A sheet pair (sheet.go) is preconditioned by its own Calderon pair. With
// inflow unknowns (a fixed or floating sheet) its collocation row is a
// first-kind equation for the sum of the faces' inflows (the single-layer
// density) and its conormal row is of the second kind in their difference:
// the sum goes through W of the sheet, the difference straight through.
// With potential unknowns (an impervious sheet) the conormal row is the
// hypersingular operator on the jump of potential and the collocation row
// of the second kind in the faces' mean: the jump goes through the single
// layer V of the sheet (W V = I/4 - K'^2), and the mean straight through.
// The conormal rows are scaled by their panel's length L_j (sheet.go), so
// the jump is V applied to y/L: the preconditioned rows are then
// L W V L^-1, similar to W V.

// precond is the row transform and the right preconditioner of a problem.
type precond struct {
	pr     *problem
	perm   []int // row paired with column c
	iface  []ifacePair
	parts  []*wPart
	sheets []*vPart
}

// ifacePair is an interface panel's two unknowns and the rows transformed
// with them.
type ifacePair struct {
	cu, cf int     // columns of u and F; perm[cu] is R_A, perm[cf] R_B
	rho    float64 // ratio of the Right side's single-layer scale to the Left's
}

// wPart is the hypersingular operator on the first-kind inflow columns of
// one part: the columns of its ordinary sides (col, with pair -1) and of
// its fixed and floating sheets (col the first face's, pair the second's:
// the sum goes through W, the difference through).
type wPart struct {
	tree    *fmm.Tree
	col     []int      // per target: its column
	pair    []int      // per target: the twin face's column, or -1
	tang    []r2.Vec   // per target: unit tangent in the part's frame
	length  []float64  // per target: its side's length in the part's frame
	ends    [][4]int32 // per target: its start, end, mirrored start, mirrored end points (-1 none)
	comp    []int      // per target: connected run
	compLen []float64  // per run: length in the part's frame
	scale   float64    // the problem's length scale
	points  int
}

// vPart is the single layer on the impervious sheets of one part: the
// first faces' potential columns (col; the mean) and the second faces'
// (pair; the jump through V).
type vPart struct {
	tree  *fmm.Tree
	block *fmm.Block
	col   []int
	pair  []int
	inv   []float64 // per target: 1 / the panel's length
	nSide int
	scale float64
}

// pairing returns, for every unknown column, the row that is its equation.
func (pr *problem) pairing() ([]int, error) {
	perm := make([]int, pr.nUnk)
	for i := range perm {
		perm[i] = -1
	}
	set := func(c, i int) error {
		if c < 0 || perm[c] >= 0 {
			return fmt.Errorf("bem: internal: cannot pair row %d with column %d", i, c)
		}
		perm[c] = i
		return nil
	}
	for i, rw := range pr.rows {
		var err error
		switch rw.kind {
		case rowCollocation, rowSheetFlux:
			s := pr.parts[rw.region].sides[rw.side]
			j := s.panel
			switch {
			case pr.m.Panels[j].Interface():
				if s.sign > 0 {
					err = set(pr.uSlot[j].col, i)
				} else {
					err = set(pr.fSlot[j].col, i)
				}
			case pr.fSlot[j].col >= 0:
				err = set(pr.fSlot[j].col, i)
			default:
				err = set(pr.uSlot[j].col, i)
			}
		case rowFloating, rowKutta:
			err = set(pr.floatCol[rw.owner], i)
		case rowBalance:
			err = set(pr.parts[rw.region].constCol, i)
		}
		if err != nil {
			return nil, err
		}
	}
	for c, i := range perm {
		if i < 0 {
			return nil, fmt.Errorf("bem: internal: column %d has no equation paired with it", c)
		}
	}
	return perm, nil
}

// newPrecond builds the transform and the preconditioner's operators.
func newPrecond(pr *problem, tol float64, workers int) (*precond, error) {
	perm, err := pr.pairing()
	if err != nil {
		return nil, err
	}
	pc := &precond{pr: pr, perm: perm}
	// Interface panels: the scales of their two sides.
	left := make(map[int]float64)
	right := make(map[int]float64)
	for i := range pr.parts {
		for _, s := range pr.parts[i].sides {
			if pr.m.Panels[s.panel].Interface() {
				if s.sign > 0 {
					left[s.panel] = s.scale
				} else {
					right[s.panel] = s.scale
				}
			}
		}
	}
	for j, p := range pr.m.Panels {
		if !p.Interface() {
			continue
		}
		pc.iface = append(pc.iface, ifacePair{cu: pr.uSlot[j].col, cf: pr.fSlot[j].col, rho: right[j] / left[j]})
	}
	for i := range pr.parts {
		wp, err := pr.newWPart(i, tol, workers)
		if err != nil {
			return nil, err
		}
		if wp != nil {
			pc.parts = append(pc.parts, wp)
		}
		vp, err := pr.newVPart(i, tol, workers)
		if err != nil {
			return nil, err
		}
		if vp != nil {
			pc.sheets = append(pc.sheets, vp)
		}
	}
	return pc, nil
}

// firstFace reports whether side k of r is the first face of a sheet pair
// (the one with the collocation row).
func (r *region) firstFace(k int) bool {
	s := &r.sides[k]
	return s.twin >= 0 && s.panel < r.sides[s.twin].panel
}

// wSides returns the sides of part i whose inflow columns the
// hypersingular operator maps: an unknown inflow on a boundary (taken on
// an interface in the part of its Left region only), and the first faces
// of sheet pairs with inflow unknowns.
func (pr *problem) wSides(i int) []int {
	r := &pr.parts[i]
	var out []int
	for k := range r.sides {
		s := &r.sides[k]
		if pr.fSlot[s.panel].col < 0 || s.sign < 0 || (s.twin >= 0 && !r.firstFace(k)) {
			continue
		}
		out = append(out, k)
	}
	return out
}

func (pr *problem) newWPart(pi int, tol float64, workers int) (*wPart, error) {
	r := &pr.parts[pi]
	ks := pr.wSides(pi)
	if len(ks) == 0 {
		return nil, nil
	}
	wp := &wPart{scale: pr.length}
	in := make(map[int]int, len(ks)) // side -> target
	for t, k := range ks {
		in[k] = t
	}
	index := make(map[r2.Vec]int32)
	var pts []r2.Vec
	point := func(v r2.Vec) int32 {
		if q, ok := index[v]; ok {
			return q
		}
		index[v] = int32(len(pts))
		pts = append(pts, v)
		return int32(len(pts) - 1)
	}
	tx := make([]r2.Vec, len(ks))
	gy := r.gy / r.ax
	mirror := func(v r2.Vec) r2.Vec { return r2.Vec{X: v.X, Y: 2*gy - v.Y} }
	for t, k := range ks {
		s := &r.sides[k]
		f := &s.frame
		tx[t] = r2.Scale(0.5, r2.Add(f.a, f.b))
		e := [4]int32{point(f.a), point(f.b), -1, -1}
		if r.image {
			e[2], e[3] = point(mirror(f.a)), point(mirror(f.b))
		}
		wp.ends = append(wp.ends, e)
		wp.col = append(wp.col, pr.fSlot[s.panel].col)
		pair := -1
		if s.twin >= 0 {
			pair = pr.fSlot[r.sides[s.twin].panel].col
		}
		wp.pair = append(wp.pair, pair)
		wp.tang = append(wp.tang, f.t)
		wp.length = append(wp.length, f.l)
	}
	// Connected runs along the boundary.
	wp.comp = make([]int, len(ks))
	for t := range wp.comp {
		wp.comp[t] = -1
	}
	for t, k := range ks {
		if wp.comp[t] >= 0 {
			continue
		}
		start := k
		for p := r.sides[start].prev; p >= 0 && p != k; p = r.sides[p].prev {
			tp, ok := in[p]
			if !ok || wp.comp[tp] >= 0 {
				break
			}
			start = p
		}
		c := len(wp.compLen)
		wp.compLen = append(wp.compLen, 0)
		for q := start; q >= 0; q = r.sides[q].next {
			tq, ok := in[q]
			if !ok || wp.comp[tq] >= 0 {
				break
			}
			wp.comp[tq] = c
			wp.compLen[c] += wp.length[tq]
		}
	}
	wp.points = len(pts)
	tree, err := fmm.New(nil, pts, tx, &fmm.Options{Tol: tol, Workers: workers})
	if err != nil {
		return nil, fmt.Errorf("bem: fast solver's preconditioner: %v", err)
	}
	wp.tree = tree
	return wp, nil
}

func (pr *problem) newVPart(pi int, tol float64, workers int) (*vPart, error) {
	r := &pr.parts[pi]
	var ks []int
	for k := range r.sides {
		if r.firstFace(k) && pr.uSlot[r.sides[k].panel].col >= 0 && pr.fSlot[r.sides[k].panel].col < 0 {
			ks = append(ks, k)
		}
	}
	if len(ks) == 0 {
		return nil, nil
	}
	vp := &vPart{nSide: len(ks), scale: pr.length}
	src := make([]fmm.Panel, 0, 2*len(ks))
	tx := make([]r2.Vec, len(ks))
	for t, k := range ks {
		s := &r.sides[k]
		src = append(src, fmm.Panel{A: s.frame.a, B: s.frame.b})
		tx[t] = r2.Scale(0.5, r2.Add(s.frame.a, s.frame.b))
		vp.col = append(vp.col, pr.uSlot[s.panel].col)
		vp.pair = append(vp.pair, pr.uSlot[r.sides[s.twin].panel].col)
		vp.inv = append(vp.inv, 1/pr.m.Panels[s.panel].Length())
	}
	if r.image {
		for _, k := range ks {
			src = append(src, fmm.Panel{A: r.sides[k].image.a, B: r.sides[k].image.b})
		}
	}
	tree, err := fmm.New(src, nil, tx, &fmm.Options{Tol: tol, Workers: workers})
	if err != nil {
		return nil, fmt.Errorf("bem: fast solver's preconditioner: %v", err)
	}
	vp.tree = tree
	n := len(ks)
	vp.block = tree.NewBlock(true, false, func(t int, panels []int32, single, _ []float64) {
		X := tx[t]
		for q, p := range panels {
			k := int(p)
			if k >= n {
				sl, _ := r.sides[ks[k-n]].image.integrals(X, false)
				single[q] = sl
				continue
			}
			sl, _ := r.sides[ks[k]].frame.integrals(X, k == t)
			single[q] = sl
		}
	})
	return vp, nil
}

// rowTransform sets dst (column order) to the transformed rows src (row
// order).
func (pc *precond) rowTransform(dst, src []float64) {
	for c, i := range pc.perm {
		dst[c] = src[i]
	}
	for _, p := range pc.iface {
		a, b := src[pc.perm[p.cu]], src[pc.perm[p.cf]]
		dst[p.cu] = (p.rho*a + b) / (1 + p.rho)
		dst[p.cf] = (a - b) / (1 + p.rho)
	}
}

// wWork is the memory of one preconditioner product.
type wWork struct {
	q    [][]float64
	grad [][]r2.Vec
	mean [][]float64
	vs   [][]float64 // per sheet part: densities
	vu   [][]float64 // per sheet part: single layer at the targets
}

func (pc *precond) newWork() *wWork {
	w := &wWork{}
	for _, wp := range pc.parts {
		w.q = append(w.q, make([]float64, wp.points))
		w.grad = append(w.grad, make([]r2.Vec, len(wp.col)))
		w.mean = append(w.mean, make([]float64, len(wp.compLen)))
	}
	for _, vp := range pc.sheets {
		w.vs = append(w.vs, make([]float64, vp.tree.Panels()))
		w.vu = append(w.vu, make([]float64, vp.tree.Targets()))
	}
	return w
}

// calderonAlpha weighs the rank-one term that stands in for the constants W
// annihilates (1: the iteration counts above; 0.3 to 3 changed them by at
// most 2).
const calderonAlpha = 1

// apply sets dst = P y.
func (pc *precond) apply(dst, y []float64, w *wWork) {
	copy(dst, y)
	for pi, wp := range pc.parts {
		q := w.q[pi]
		clear(q)
		mean := w.mean[pi]
		clear(mean)
		for t, c := range wp.col {
			v := y[c]
			e := wp.ends[t]
			q[e[1]] += v
			q[e[0]] -= v
			if e[2] >= 0 {
				q[e[2]] -= v
				q[e[3]] += v
			}
			mean[wp.comp[t]] += wp.length[t] * v
		}
		g := w.grad[pi]
		wp.tree.Apply(nil, g, fmm.Density{Point: q})
		for t, c := range wp.col {
			k := wp.comp[t]
			L := wp.compLen[k]
			sum := -wp.scale*r2.Dot(wp.tang[t], g[t]) + calderonAlpha*wp.scale/L*mean[k]/L
			if d := wp.pair[t]; d >= 0 {
				dst[c], dst[d] = 0.5*(sum-y[d]), 0.5*(sum+y[d])
				continue
			}
			dst[c] = sum
		}
	}
	for pi, vp := range pc.sheets {
		s, u := w.vs[pi], w.vu[pi]
		n := vp.nSide
		for t, d := range vp.pair {
			s[t] = y[d] * vp.inv[t]
			if len(s) > n {
				s[n+t] = -s[t]
			}
		}
		dens := fmm.Density{Single: s}
		vp.tree.Apply(u, nil, dens)
		vp.block.AddTo(u, dens)
		for t, c := range vp.col {
			mu := u[t] * sheetVSign
			dst[c], dst[vp.pair[t]] = y[c]+0.5*mu, y[c]-0.5*mu
		}
	}
}

// sheetVSign orients the single layer on impervious sheets so that the
// preconditioned conormal rows have a positive spectrum.
var sheetVSign = 1.0
