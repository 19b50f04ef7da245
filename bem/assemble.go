package bem

import (
	"fmt"
	"math"
	"runtime"
	"sync"

	"github.com/rimfield/rimfield/geom"
	"github.com/rimfield/rimfield/mesh"
	"gonum.org/v1/gonum/mat"
	"gonum.org/v1/gonum/spatial/r2"
)

// region is one subdomain as the integral equation sees it: its material
// transform and the panels that bound it, each oriented with the region on
// its left.
type region struct {
	kbar  float64 // sqrt(kx ky)
	ax    float64 // transform T' = diag(ax, 1/ax), ax = (ky/kx)^(1/4); det T' = 1
	image bool    // grounded plane y = groundY: image kernel
	gy    float64
	open  bool // unbounded (the background of an open scene)
	reg   int  // index of the layout region (a part knows the region it belongs to)
	// constCol is the column of the region's constant, or -1 when it is fixed at 0.
	constCol int
	// sides lists the bounding panels.
	sides []side
}

// side is a panel seen from one region.
type side struct {
	panel int
	sign  float64    // +1 if the region is the panel's Left, -1 if its Right
	frame panelFrame // in the region's transformed frame, oriented with the region on the left
	image panelFrame // the mirror image in the grounded plane (transformed frame), if any
	scale float64    // original length over transformed length, over kbar
	// prev and next are the sides that share this side's start and end
	// points (walking with the region on the left), or -1.
	prev, next int
	// twin is the side of the same part that is this side's other face
	// (a sheet; see sheet.go), or -1.
	twin int
	// sheet is true when the panel has a twin in the mesh (in this part or
	// another).
	sheet bool
	// anchor is -1 (+1) on a face of an impervious pair whose start (end)
	// is where the sheet meets another boundary: its potential, as the
	// collocation rows and Eval see it, is linear there, through the
	// neighbour's value at that end (sheet.go); 0 elsewhere.
	anchor int8
}

// transform maps a point into the region's isotropic frame.
func (r *region) transform(p r2.Vec) r2.Vec { return r2.Vec{X: r.ax * p.X, Y: p.Y / r.ax} }

// coefficients returns, for the target x (original coordinates), the
// coefficient of the panel's potential (the double layer) and of its inflow
// density into this region (the single layer, scaled by the material).
func (r *region) coefficients(s *side, x r2.Vec, self bool) (cu, cf float64) {
	X := r.transform(x)
	sl, dl := s.frame.integrals(X, self)
	if r.image {
		isl, idl := s.image.integrals(X, false)
		sl -= isl
		dl -= idl
	}
	return dl, sl * s.scale
}

// fieldCoefficients returns the two coefficients of coefficients and their
// gradients (original coordinates) at a point x off the boundary.
func (r *region) fieldCoefficients(s *side, x r2.Vec) (cu, cf float64, gu, gf r2.Vec) {
	X := r.transform(x)
	sl, dl, gsl, gdl := s.frame.all(X)
	if r.image {
		isl, idl, igsl, igdl := s.image.all(X)
		sl -= isl
		dl -= idl
		gsl = r2.Sub(gsl, igsl)
		gdl = r2.Sub(gdl, igdl)
	}
	// grad_x = T' grad_X, T' diagonal.
	back := func(v r2.Vec) r2.Vec { return r2.Vec{X: r.ax * v.X, Y: v.Y / r.ax} }
	return dl, sl * s.scale, back(gdl), r2.Scale(s.scale, back(gsl))
}

// slot tells where a panel's potential or inflow lives: an unknown column,
// or a known value given per owner.
type slot struct {
	col   int // unknown column, or -1 when known
	owner int // owner whose condition value this is when known (-1: zero)
}

// problem is the discrete problem: regions, slots, extra unknowns and rows.
// A layout region may fall into several connected parts (a MultiPolygon
// region, a cavity in a body); each part has its own integral equation and
// constant, so that each stays regular at the degenerate scale.
type problem struct {
	m       *mesh.Mesh
	regions []region // per layout region: material, and all its sides
	parts   []region // the connected parts of the regions, each with its own sides
	uSlot   []slot
	fSlot   []slot
	fScale  []float64 // column scale: F = fScale * x
	nUnk    int
	// rows: one per (region, side), then the extra equations.
	rows     []row
	floatCol []int // per owner: column of its floating potential, or -1
	length   float64
	nOwners  int
}

type rowKind uint8

const (
	rowCollocation rowKind = iota + 1
	rowFloating            // total inflow through a floating owner
	rowBalance             // zero total inflow into a region
	rowKutta               // Kutta condition: replaces a floating owner's total inflow
	rowSheetFlux           // conormal derivative on the second face of a sheet pair (sheet.go)
)

type row struct {
	kind   rowKind
	region int     // index into parts (collocation, balance)
	side   int     // index into parts[region].sides (collocation)
	owner  int     // floating owner
	scale  float64 // the row is multiplied by this
	// pa and pb are the two panels of a Kutta condition (rowKutta).
	pa, pb int
	// terms, when not nil, replace pa and pb: the panels of a Kutta
	// condition at a sheet's tip and their weights (kutta.go).
	terms []kuttaTerm
}

// newProblem numbers the unknowns and equations of the mesh; each Kutta
// condition replaces the total-inflow equation of its floating owner.
func newProblem(m *mesh.Mesh, kutta ...Kutta) (*problem, error) {
	lay := m.Layout
	if lay == nil {
		return nil, fmt.Errorf("bem: mesh has no layout")
	}
	if len(m.Panels) == 0 {
		return nil, fmt.Errorf("bem: mesh has no panels")
	}
	pr := &problem{m: m, nOwners: len(lay.Owners)}
	pr.length = lay.Diagonal
	if !(pr.length > 0) {
		lo, hi := m.Bounds()
		pr.length = r2.Norm(r2.Sub(hi, lo))
	}
	pr.regions = make([]region, len(lay.Regions))
	// Some potential is fixed on a panel (an owner whose pieces are all
	// covered by other bodies has no panels and fixes nothing).
	anyFixed := false
	for _, p := range m.Panels {
		if !p.Interface() && p.Cond.Kind == geom.Potential {
			anyFixed = true
		}
	}
	for i, d := range lay.Regions {
		kx, ky := d.Material.Kx, d.Material.Ky
		if !(kx > 0) || !(ky > 0) || math.IsInf(kx, 0) || math.IsInf(ky, 0) {
			return nil, fmt.Errorf("bem: region %q has a non-positive material (kx=%g, ky=%g)", d.Name, kx, ky)
		}
		r := &pr.regions[i]
		r.kbar = math.Sqrt(kx * ky)
		r.ax = math.Pow(ky/kx, 0.25)
		r.open = d.Background
		if r.open && lay.Ground != nil {
			r.image = true
			r.gy = lay.Ground.Y
		}
	}

	np := len(m.Panels)
	pr.uSlot = make([]slot, np)
	pr.fSlot = make([]slot, np)
	pr.fScale = make([]float64, np)
	pr.floatCol = make([]int, len(lay.Owners))
	for i := range pr.floatCol {
		pr.floatCol[i] = -1
	}
	col := 0
	newCol := func() int { col++; return col - 1 }
	for j, p := range m.Panels {
		if p.Left < 0 || p.Left >= len(pr.regions) || p.Right >= len(pr.regions) {
			return nil, fmt.Errorf("bem: panel %d has no valid region on its left", j)
		}
		if p.Length() == 0 || math.IsNaN(p.Length()) {
			return nil, fmt.Errorf("bem: panel %d has zero or undefined length", j)
		}
		pr.fScale[j] = pr.regions[p.Left].kbar / pr.length
		if p.Interface() {
			pr.uSlot[j] = slot{col: newCol()}
			pr.fSlot[j] = slot{col: newCol()}
			continue
		}
		switch p.Cond.Kind {
		case geom.Potential:
			pr.uSlot[j] = slot{col: -1, owner: p.Owner}
			pr.fSlot[j] = slot{col: newCol()}
		case geom.Flux:
			pr.uSlot[j] = slot{col: newCol()}
			pr.fSlot[j] = slot{col: -1, owner: p.Owner}
		case geom.Floating:
			if p.Owner < 0 {
				return nil, fmt.Errorf("bem: panel %d is floating but belongs to no body or edge", j)
			}
			if pr.floatCol[p.Owner] < 0 {
				pr.floatCol[p.Owner] = newCol()
			}
			pr.uSlot[j] = slot{col: pr.floatCol[p.Owner]}
			pr.fSlot[j] = slot{col: newCol()}
		default:
			return nil, fmt.Errorf("bem: panel %d has no boundary condition", j)
		}
		if p.Cond.Kind != geom.Floating && p.Owner < 0 && p.Cond.Value != 0 {
			return nil, fmt.Errorf("bem: panel %d has a non-zero condition but no owner", j)
		}
	}
	if err := pr.checkTwins(); err != nil {
		return nil, err
	}
	// Sides of each region.
	for j, p := range m.Panels {
		pr.addSide(p.Left, j, +1)
		if p.Interface() {
			pr.addSide(p.Right, j, -1)
		}
	}
	for i := range pr.regions {
		pr.regions[i].reg = i
		pr.regions[i].link()
		if len(pr.regions[i].sides) > 0 {
			pr.parts = append(pr.parts, pr.regions[i].components()...)
		}
	}
	pr.pairTwins()
	pr.anchorSheets()
	// Constants: the potential at infinity of the unbounded part (an
	// unknown when some potential is fixed and no grounded plane holds it at
	// 0), the residual constant of every bounded part.
	for i := range pr.parts {
		r := &pr.parts[i]
		r.constCol = -1
		if !r.open || (anyFixed && !r.image) {
			r.constCol = newCol()
		}
	}
	pr.nUnk = col
	// Rows.
	for i := range pr.parts {
		r := &pr.parts[i]
		for s := range r.sides {
			rw := row{kind: r.sheetRowKind(s), region: i, side: s, scale: 1}
			if rw.kind == rowSheetFlux {
				rw.scale = pr.sheetRowScale(r, s)
			}
			pr.rows = append(pr.rows, rw)
		}
	}
	kuttaRows, err := pr.kuttaRows(kutta)
	if err != nil {
		return nil, err
	}
	for o, c := range pr.floatCol {
		if c < 0 {
			continue
		}
		if rw, ok := kuttaRows[o]; ok {
			pr.rows = append(pr.rows, rw)
			continue
		}
		// Scale: inflow/kbar of the region the owner bounds, per unit length.
		k := 0.0
		for _, p := range m.Panels {
			if p.Owner == o {
				k = pr.regions[p.Left].kbar
				break
			}
		}
		pr.rows = append(pr.rows, row{kind: rowFloating, owner: o, scale: 1 / k})
	}
	for i := range pr.parts {
		if pr.parts[i].constCol >= 0 {
			pr.rows = append(pr.rows, row{kind: rowBalance, region: i, scale: 1 / pr.parts[i].kbar})
		}
	}
	if len(pr.rows) != pr.nUnk {
		return nil, fmt.Errorf("bem: internal: %d equations for %d unknowns", len(pr.rows), pr.nUnk)
	}
	return pr, nil
}

func (pr *problem) addSide(reg, j int, sign float64) {
	r := &pr.regions[reg]
	p := pr.m.Panels[j]
	a, b := p.A, p.B
	if sign < 0 {
		a, b = b, a
	}
	ta, tb := r.transform(a), r.transform(b)
	s := side{panel: j, sign: sign, frame: newFrame(ta, tb), twin: -1, sheet: pr.m.TwinOf(j) >= 0}
	s.scale = r2.Norm(r2.Sub(b, a)) / s.frame.l / r.kbar
	if r.image {
		// The mirror of a->b in the plane, traversed b*->a* so that its
		// normal is the mirror of the panel's normal.
		gy := r.gy / r.ax
		mirror := func(v r2.Vec) r2.Vec { return r2.Vec{X: v.X, Y: 2*gy - v.Y} }
		s.image = newFrame(mirror(tb), mirror(ta))
	}
	r.sides = append(r.sides, s)
}

// system holds the assembled matrices: A x = rhs0 - B v, with v the owners'
// condition values and rhs0 the floating owners' net inflows.
type assembled struct {
	a *mat.Dense // nUnk x nUnk
	b *mat.Dense // nUnk x nOwners: coefficients of the owners' known values
}

// assemble fills the matrices, rows spread over workers goroutines.
// A panic in a worker (a bug) is turned into an error rather than left to
// crash the caller's process from a goroutine it cannot recover in.
func (pr *problem) assemble(workers int, progress func(done, total int)) (*assembled, error) {
	n := pr.nUnk
	as := &assembled{a: mat.NewDense(n, n, nil)}
	nb := pr.nOwners
	if nb == 0 {
		nb = 1
	}
	as.b = mat.NewDense(n, nb, nil)
	if workers <= 0 {
		workers = runtime.GOMAXPROCS(0)
	}
	var wg sync.WaitGroup
	var mu sync.Mutex
	done := 0
	next := 0
	var failure error
	const chunk = 16
	for w := 0; w < workers; w++ {
		wg.Add(1)
		go func() {
			defer wg.Done()
			var scratch rowScratch
			defer func() {
				if r := recover(); r != nil {
					mu.Lock()
					if failure == nil {
						failure = fmt.Errorf("bem: internal error while assembling the system: %v; please report it with the scene", r)
					}
					next = n
					mu.Unlock()
				}
			}()
			for {
				mu.Lock()
				lo := next
				next += chunk
				mu.Unlock()
				if lo >= n {
					return
				}
				hi := min(lo+chunk, n)
				for i := lo; i < hi; i++ {
					pr.fillRowWith(i, as.a.RawRowView(i), as.b.RawRowView(i), &scratch)
				}
				if progress != nil {
					mu.Lock()
					done += hi - lo
					d := done
					mu.Unlock()
					progress(d, n)
				}
			}
		}()
	}
	wg.Wait()
	if failure != nil {
		return nil, failure
	}
	return as, nil
}

// fillRow writes equation i into arow (unknown coefficients) and brow
// (coefficients of the owners' known values).
func (pr *problem) fillRow(i int, arow, brow []float64) {
	pr.fillRowWith(i, arow, brow, &rowScratch{})
}

// fillRowWith is fillRow with a worker's scratch memory.
func (pr *problem) fillRowWith(i int, arow, brow []float64, scratch *rowScratch) {
	rw := pr.rows[i]
	put := func(s slot, c float64) {
		if s.col >= 0 {
			arow[s.col] += c
		} else if s.owner >= 0 {
			brow[s.owner] += c
		}
	}
	switch rw.kind {
	case rowCollocation:
		r := &pr.parts[rw.region]
		me := r.sides[rw.side]
		x := pr.m.Panels[me.panel].Mid()
		// 1/2 u(x) + sum_k dl_k u_k - sum_k sl_k F_k - C = 0, with F_k the
		// inflow into this region (sign * panel inflow into its Left). At
		// a sheet pair the free term is the faces' mean and the twin's
		// integrals are the self ones (sheet.go).
		put(pr.uSlot[me.panel], 0.5)
		if me.twin >= 0 {
			put(pr.uSlot[r.sides[me.twin].panel], 0.5)
		}
		r.rowCoefficients(x, rw.side, me.twin, scratch)
		for k := range r.sides {
			s := &r.sides[k]
			cu, cf := scratch.cu[k], scratch.cf[k]
			// put, inlined: the row's inner loop.
			if us := pr.uSlot[s.panel]; us.col >= 0 {
				arow[us.col] += cu
			} else if us.owner >= 0 {
				brow[us.owner] += cu
			}
			if fs := pr.fSlot[s.panel]; fs.col >= 0 {
				arow[fs.col] -= cf * s.sign * pr.fScale[s.panel]
			} else if fs.owner >= 0 {
				brow[fs.owner] -= cf * s.sign
			}
			if s.anchor != 0 {
				pr.putAnchored(r, k, r.linearCoefficient(s, x, k == rw.side || k == me.twin), put)
			}
		}
		if r.constCol >= 0 {
			arow[r.constCol] -= 1
		}
	case rowFloating:
		for j, p := range pr.m.Panels {
			if p.Owner == rw.owner && !p.Interface() {
				put(pr.fSlot[j], rw.scale*p.Length()*pr.colScale(j))
			}
		}
	case rowKutta:
		if rw.terms != nil {
			for _, t := range rw.terms {
				put(pr.fSlot[t.panel], rw.scale*t.weight*pr.colScale(t.panel))
			}
			break
		}
		put(pr.fSlot[rw.pa], rw.scale*pr.colScale(rw.pa))
		put(pr.fSlot[rw.pb], rw.scale*pr.colScale(rw.pb))
	case rowSheetFlux:
		pr.fillSheetFlux(rw, put)
	case rowBalance:
		r := &pr.parts[rw.region]
		for k := range r.sides {
			s := &r.sides[k]
			put(pr.fSlot[s.panel], rw.scale*s.sign*pr.m.Panels[s.panel].Length()*pr.colScale(s.panel))
		}
	}
}

// colScale is the factor between an inflow unknown's column value and the
// inflow density: F = colScale * x for unknown columns; known values enter
// unscaled.
func (pr *problem) colScale(j int) float64 {
	if pr.fSlot[j].col >= 0 {
		return pr.fScale[j]
	}
	return 1
}

// link finds each side's neighbours along the boundary: the side whose end
// is this side's start and the side whose start is its end. Panels of a
// mesh share their endpoints exactly. Where several sides start at a
// side's end (boundaries meeting at a vertex, a sheet ending on another
// boundary), the next is the one that keeps the region on the left: the
// first met turning clockwise from the way back.
func (r *region) link() {
	starts := make(map[r2.Vec][]int, len(r.sides))
	for k := range r.sides {
		a := r.sides[k].frame.a
		starts[a] = append(starts[a], k)
		r.sides[k].prev, r.sides[k].next = -1, -1
	}
	for k := range r.sides {
		cands := starts[r.sides[k].frame.b]
		n := -1
		switch {
		case len(cands) == 1:
			n = cands[0]
		case len(cands) > 1:
			back := r2.Scale(-1, r.sides[k].frame.t)
			best := math.Inf(1)
			for _, c := range cands {
				t := r.sides[c].frame.t
				cw := -math.Atan2(r2.Cross(back, t), r2.Dot(back, t))
				if cw <= 0 {
					cw += 2 * math.Pi
				}
				if cw < best {
					n, best = c, cw
				}
			}
		}
		if n >= 0 && n != k {
			r.sides[k].next = n
			r.sides[n].prev = k
		}
	}
}

// components splits a region's sides into its connected parts. The sides
// form closed loops (region on the left); a counter-clockwise loop is the
// outer boundary of a bounded part and a clockwise loop a hole, which
// belongs to the smallest counter-clockwise loop around it, or to the
// unbounded part of an open region when none is. If some side is on no
// closed loop, or a hole of a bounded region has no outer loop, the region
// stays in one piece (as sound, only without the per-part constants).
func (r *region) components() []region {
	whole := []region{*r}
	seen := make([]bool, len(r.sides))
	var loops [][]int
	for k := range r.sides {
		if seen[k] {
			continue
		}
		var loop []int
		for c := k; !seen[c]; c = r.sides[c].next {
			seen[c] = true
			loop = append(loop, c)
			if r.sides[c].next < 0 {
				return whole
			}
		}
		if loop[0] != k || r.sides[loop[len(loop)-1]].next != k {
			return whole
		}
		loops = append(loops, loop)
	}
	if len(loops) == 1 {
		return whole
	}
	area := make([]float64, len(loops))
	for i, l := range loops {
		for _, k := range l {
			area[i] += 0.5 * r2.Cross(r.sides[k].frame.a, r.sides[k].frame.b)
		}
	}
	// owner[i]: the outer loop a hole belongs to, -1 for the unbounded part.
	owner := make([]int, len(loops))
	for i, l := range loops {
		owner[i] = i
		if area[i] > 0 {
			continue
		}
		owner[i] = -1
		probe := r.holeProbe(l)
		best := math.Inf(1)
		for j, m := range loops {
			if area[j] > 0 && area[j] < best && r.loopWinding(m, probe) == 1 {
				owner[i], best = j, area[j]
			}
		}
		if owner[i] < 0 && !r.open {
			return whole
		}
	}
	var parts []region
	index := map[int]int{} // outer loop (or -1) -> part
	for i := range loops {
		o := owner[i]
		if _, ok := index[o]; !ok {
			index[o] = len(parts)
			p := *r
			p.sides = nil
			p.open = o < 0
			parts = append(parts, p)
		}
		p := &parts[index[o]]
		for _, k := range loops[i] {
			p.sides = append(p.sides, r.sides[k])
		}
	}
	for i := range parts {
		parts[i].link()
	}
	return parts
}

// loopWinding returns the winding number of the loop of sides about p.
func (r *region) loopWinding(loop []int, p r2.Vec) int {
	w := 0
	for _, k := range loop {
		w += crossing(r.sides[k].frame.a, r.sides[k].frame.b, p)
	}
	return w
}

// holeProbe returns a point of a hole loop for the test of which outer
// loop holds it: the midpoint of its first side that is not a sheet face,
// or, on a loop of sheet faces alone (a sheet lying in the region, a
// closed sheet seen from outside), a point just off the first side on the
// region's side, which lies on neither face.
func (r *region) holeProbe(loop []int) r2.Vec {
	for _, k := range loop {
		if f := r.sides[k].frame; !r.sides[k].sheet {
			return r2.Scale(0.5, r2.Add(f.a, f.b))
		}
	}
	f := r.sides[loop[0]].frame
	mid := r2.Scale(0.5, r2.Add(f.a, f.b))
	return r2.Sub(mid, r2.Scale(1e-6*f.l, f.n))
}
