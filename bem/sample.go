package bem

import (
	"math"
	"runtime"
	"sync"
	"sync/atomic"

	"github.com/rimfield/rimfield/bem/fmm"
	"github.com/rimfield/rimfield/geom"
	"gonum.org/v1/gonum/spatial/r2"
)

// Evaluation at many points. Eval sums the representation of the part
// that contains a point over all of the part's sides: O(panels) per point.
// EvalMany and Field give the same values through fast multipole trees
// (package bem/fmm), in each part's isotropic frame: the far field of the
// part's single and double layers, of the linear part of the potential
// along flux boundaries and interfaces (Density.Linear) and of their images,
// and the exact closed forms of Eval for the near panels, so that values
// beside the boundary are Eval's. The part that contains a point comes from
// the winding number of the part's boundary, which is minus the double layer
// of unit density over its sides (the sum of the angles they subtend over
// 2 pi), summed the same way and rounded.

// sampleTol is the precision of the multipole products of EvalMany and
// Field: far below what a picture or a flux line can show, so that their
// values are Eval's to about 1e-10 of the potential's range.
const sampleTol = 1e-10

// sources returns the part's sides and, over a grounded plane, their
// images, as multipole sources in the part's frame.
func (r *region) sources() []fmm.Panel {
	src := make([]fmm.Panel, 0, 2*len(r.sides))
	for k := range r.sides {
		src = append(src, fmm.Panel{A: r.sides[k].frame.a, B: r.sides[k].frame.b})
	}
	if r.image {
		for k := range r.sides {
			src = append(src, fmm.Panel{A: r.sides[k].image.a, B: r.sides[k].image.b})
		}
	}
	return src
}

// densities returns the layers of the representation of part k for the
// solution (evalIn): single scale F into the part, double -u, linear -slope,
// the images' single and double negated and their linear the same (the
// image panel runs the other way).
func (s *Solution) densities(k int) fmm.Density {
	r := &s.pr.parts[k]
	n := len(r.sides)
	m := n
	if r.image {
		m = 2 * n
	}
	d := fmm.Density{Single: make([]float64, m), Double: make([]float64, m), Linear: make([]float64, m)}
	slopes := s.slopes[k]
	for j := range r.sides {
		sd := &r.sides[j]
		d.Single[j] = sd.scale * sd.sign * s.F[sd.panel]
		d.Double[j] = -s.U[sd.panel]
		d.Linear[j] = -slopes[j]
		if r.image {
			d.Single[n+j], d.Double[n+j], d.Linear[n+j] = -d.Single[j], -d.Double[j], d.Linear[j]
		}
	}
	return d
}

// windingDensity is the unit double layer on the part's own sides.
func windingDensity(r *region) fmm.Density {
	n := len(r.sources())
	d := fmm.Density{Double: make([]float64, n)}
	for j := range r.sides {
		d.Double[j] = 1
	}
	return d
}

// nearValue returns the exact contribution of source q of part r (a side,
// or the image of side q - len(sides)) at X (the part's frame) for the
// densities d: the potential and its gradient in X.
func nearValue(r *region, q int, X r2.Vec, d fmm.Density, grad bool) (float64, r2.Vec) {
	n := len(r.sides)
	f := &r.sides[q%n].frame
	if q >= n {
		f = &r.sides[q-n].image
	}
	sl, dl, gsl, gdl := f.all(X)
	u := d.Single[q]*sl + d.Double[q]*dl
	var g r2.Vec
	if grad {
		g = r2.Add(r2.Scale(d.Single[q], gsl), r2.Scale(d.Double[q], gdl))
	}
	if m := d.Linear[q]; m != 0 {
		d1, g1 := f.linear(X)
		u += m * d1
		if grad {
			g = r2.Add(g, r2.Scale(m, g1))
		}
	}
	return u, g
}

// nearWinding returns the unit double layer of side q (not an image) at X.
func nearWinding(r *region, q int, X r2.Vec) float64 {
	if q >= len(r.sides) {
		return 0
	}
	f := &r.sides[q].frame
	return -inv2Pi * subtended(X, f.a, f.b)
}

// back maps a gradient in the part's frame to the original coordinates.
func (r *region) back(g r2.Vec) r2.Vec { return r2.Vec{X: r.ax * g.X, Y: g.Y / r.ax} }

// panelDistance2 returns the squared distance from p to panel j.
func (pr *problem) panelDistance2(j int, p r2.Vec) float64 {
	pn := &pr.m.Panels[j]
	d := r2.Sub(pn.B, pn.A)
	ap := r2.Sub(p, pn.A)
	t := r2.Dot(ap, d) / r2.Norm2(d)
	t = math.Max(0, math.Min(1, t))
	return r2.Norm2(r2.Sub(ap, r2.Scale(t, d)))
}

// partBox returns the bounding box of a part's panels, original
// coordinates.
func (pr *problem) partBox(r *region) (lo, hi r2.Vec) {
	lo = r2.Vec{X: math.Inf(1), Y: math.Inf(1)}
	hi = r2.Vec{X: math.Inf(-1), Y: math.Inf(-1)}
	for _, sd := range r.sides {
		p := pr.m.Panels[sd.panel]
		for _, v := range [2]r2.Vec{p.A, p.B} {
			lo = r2.Vec{X: math.Min(lo.X, v.X), Y: math.Min(lo.Y, v.Y)}
			hi = r2.Vec{X: math.Max(hi.X, v.X), Y: math.Max(hi.Y, v.Y)}
		}
	}
	return lo, hi
}

func inBox(p, lo, hi r2.Vec) bool { return p.X >= lo.X && p.X <= hi.X && p.Y >= lo.Y && p.Y <= hi.Y }

// parallel runs body(i) for i in [0, n) on all processors.
func parallel(n int, body func(i int)) {
	workers := min(runtime.GOMAXPROCS(0), max(n/64, 1))
	var next atomic.Int64
	var wg sync.WaitGroup
	for range workers {
		wg.Add(1)
		go func() {
			defer wg.Done()
			for {
				lo := int(next.Add(64) - 64)
				if lo >= n {
					return
				}
				for i := lo; i < min(lo+64, n); i++ {
					body(i)
				}
			}
		}()
	}
	wg.Wait()
}

// EvalMany returns Eval at every point of pts, through fast multipole trees
// over the points (one per connected part): the same values to about 1e-10
// of the potential's scale, at a cost per point nearly independent of the
// panel count. Points within near (metres) of a panel of the part that
// contains them are outside, as Eval's points on the boundary; near <= 0
// means Eval's 1e-12 of the scene's diagonal.
func (s *Solution) EvalMany(pts []r2.Vec, near float64) []Point {
	pr := s.pr
	if !(near > 0) {
		near = 1e-12 * pr.length
	}
	near2 := near * near
	out := make([]Point, len(pts))
	nan := math.NaN()
	for i := range out {
		out[i] = Point{U: nan, Grad: r2.Vec{X: nan, Y: nan}, Region: geom.Outside}
	}
	part := make([]int32, len(pts)) // the part holding each point, -1 none, -2 not yet known
	for i := range part {
		part[i] = -2
	}
	type partTree struct {
		tree *fmm.Tree
		idx  []int // target -> point
	}
	trees := make([]partTree, len(pr.parts))
	// locate assigns the points of candidate list idx that lie in part k
	// (winding want, not within near of its panels).
	locate := func(k int, idx []int, want int) {
		r := &pr.parts[k]
		if len(idx) == 0 {
			return
		}
		tx := make([]r2.Vec, len(idx))
		for t, i := range idx {
			tx[t] = r.transform(pts[i])
		}
		tree, err := fmm.New(r.sources(), nil, tx, &fmm.Options{Tol: sampleTol})
		if err != nil {
			return // non-finite points: they stay outside
		}
		trees[k] = partTree{tree: tree, idx: idx}
		w := make([]float64, len(idx))
		tree.Apply(w, nil, windingDensity(r))
		parallel(len(idx), func(t int) {
			i := idx[t]
			x := pts[i]
			touch := false
			for _, q := range tree.NearPanels(t) {
				w[t] += nearWinding(r, int(q), tx[t])
				if int(q) < len(r.sides) && pr.panelDistance2(r.sides[q].panel, x) <= near2 {
					touch = true
				}
			}
			if int(math.Round(-w[t])) != want {
				return
			}
			if r.open && r.image && x.Y <= r.gy {
				part[i] = -1
				return
			}
			if touch {
				part[i] = -1
				return
			}
			part[i] = int32(k)
		})
	}
	for k := range pr.parts {
		r := &pr.parts[k]
		if r.open {
			continue
		}
		lo, hi := pr.partBox(r)
		var idx []int
		for i, p := range pts {
			if part[i] == -2 && inBox(p, lo, hi) {
				idx = append(idx, i)
			}
		}
		locate(k, idx, 1)
	}
	for k := range pr.parts {
		r := &pr.parts[k]
		if !r.open {
			continue
		}
		var idx []int
		for i := range pts {
			if part[i] == -2 {
				idx = append(idx, i)
			}
		}
		locate(k, idx, 0)
	}
	for k, pt := range trees {
		if pt.tree == nil {
			continue
		}
		r := &pr.parts[k]
		d := s.densities(k)
		u := make([]float64, len(pt.idx))
		g := make([]r2.Vec, len(pt.idx))
		pt.tree.Apply(u, g, d)
		parallel(len(pt.idx), func(t int) {
			i := pt.idx[t]
			if part[i] != int32(k) {
				return
			}
			X := r.transform(pts[i])
			v, gv := u[t], g[t]
			for _, q := range pt.tree.NearPanels(t) {
				nu, ng := nearValue(r, int(q), X, d, true)
				v += nu
				gv = r2.Add(gv, ng)
			}
			out[i] = s.finish(k, pts[i], v, gv)
		})
	}
	return out
}

// finish adds the part's constant and the incident field to the layers'
// potential v and gradient g (the part's frame) at p.
func (s *Solution) finish(k int, p r2.Vec, v float64, g r2.Vec) Point {
	r := &s.pr.parts[k]
	u := s.partConst[k] + v
	grad := r.back(g)
	if r.open && s.Uniform != (r2.Vec{}) {
		u += r.incident(s.Uniform, p)
		grad = r2.Add(grad, s.Uniform)
	}
	return Point{U: u, Grad: grad, Region: r.reg}
}

// Field is a solution prepared for evaluation at points given one at a
// time (flux lines traced step by step, probes): per part, the multipoles
// of its layers and of its winding density, formed once, each point then
// walking the part's source boxes (fmm.Tree.Field). Values are Eval's to
// about 1e-10 of the potential's scale, at a cost per point growing as the
// logarithm of the panel count. A Field is safe for concurrent use.
type Field struct {
	s     *Solution
	parts []fieldPart
}

type fieldPart struct {
	sol, wind *fmm.Field
	dens      fmm.Density
	lo, hi    r2.Vec // bounding box, original coordinates (closed parts)
}

// Field returns the solution prepared for evaluation point by point.
func (s *Solution) Field() *Field {
	pr := s.pr
	f := &Field{s: s, parts: make([]fieldPart, len(pr.parts))}
	for k := range pr.parts {
		r := &pr.parts[k]
		tree, err := fmm.New(r.sources(), nil, nil, &fmm.Options{Tol: sampleTol})
		if err != nil {
			// Panels are finite and of positive length (newProblem checks
			// both), so a tree always builds.
			panic("bem: Field: " + err.Error())
		}
		fp := &f.parts[k]
		fp.dens = s.densities(k)
		fp.sol = tree.Field(fp.dens)
		fp.wind = tree.Field(windingDensity(r))
		fp.lo, fp.hi = pr.partBox(r)
	}
	return f
}

// winding returns the winding number of part k's boundary about p, and
// whether p lies within tol of one of its panels.
func (f *Field) winding(k int, p r2.Vec, tol float64) (int, bool) {
	pr := f.s.pr
	r := &pr.parts[k]
	X := r.transform(p)
	touch := false
	near := 0.0
	w, _ := f.parts[k].wind.At(X, false, func(q int) {
		near += nearWinding(r, q, X)
		if q < len(r.sides) && pr.panelDistance2(r.sides[q].panel, p) <= tol*tol {
			touch = true
		}
	})
	return int(math.Round(-(w + near))), touch
}

// locate returns the part containing p (Eval's rules) and whether p lies
// on its boundary (within 1e-12 of the scene's diagonal).
func (f *Field) locate(p r2.Vec) (int, bool) {
	pr := f.s.pr
	tol := 1e-12 * pr.length
	for k := range pr.parts {
		r := &pr.parts[k]
		if r.open || !inBox(p, f.parts[k].lo, f.parts[k].hi) {
			continue
		}
		if w, touch := f.winding(k, p, tol); w == 1 {
			return k, touch
		}
	}
	for k := range pr.parts {
		r := &pr.parts[k]
		if !r.open {
			continue
		}
		if r.image && p.Y <= r.gy {
			return -1, false
		}
		if w, touch := f.winding(k, p, tol); w == 0 {
			return k, touch
		}
	}
	return -1, false
}

// Locate returns the region of the domain that contains p, or geom.Outside,
// as Solution.Locate does.
func (f *Field) Locate(p r2.Vec) int {
	if k, _ := f.locate(p); k >= 0 {
		return f.s.pr.parts[k].reg
	}
	return geom.Outside
}

// Eval returns the potential and its gradient at p, as Solution.Eval does.
func (f *Field) Eval(p r2.Vec) Point {
	nan := math.NaN()
	k, touch := f.locate(p)
	if k < 0 || touch {
		return Point{U: nan, Grad: r2.Vec{X: nan, Y: nan}, Region: geom.Outside}
	}
	r := &f.s.pr.parts[k]
	fp := &f.parts[k]
	X := r.transform(p)
	var nu float64
	var ng r2.Vec
	v, g := fp.sol.At(X, true, func(q int) {
		a, b := nearValue(r, q, X, fp.dens, true)
		nu += a
		ng = r2.Add(ng, b)
	})
	return f.s.finish(k, p, v+nu, r2.Add(g, ng))
}
