package grid

import (
	"math"
	"runtime"
	"sort"
	"sync"
	"sync/atomic"

	"github.com/rimfield/rimfield/bem"
	"github.com/rimfield/rimfield/geom"
	"gonum.org/v1/gonum/spatial/r2"
)

// TraceOptions tunes Trace. The zero value means the defaults given with
// each field.
type TraceOptions struct {
	// Workers is the number of goroutines that trace lines; 0 means
	// runtime.GOMAXPROCS(0). Results do not depend on it.
	Workers int
	// Tol is the local error allowed per integration step, as a fraction of
	// the window's diagonal; 0 means 1e-5.
	Tol float64
	// MinLines and MaxLines bound the number of lines drawn; 0 means 4 and
	// 60. When the flow net's own spacing (one line per channel) would give
	// fewer or more, the spacing is divided or multiplied by a whole number
	// and FlowNet.Square is false.
	MinLines, MaxLines int
}

// Line is one flux line.
type Line struct {
	// Points run from the seed on the source boundary along the flux
	// -K grad u, in metres.
	Points []r2.Vec
	// Seed is the inflow through the source boundaries before the seed,
	// counted in the order of the seeds (inflow per metre).
	Seed float64
	// Source is the owner (index into Layout.Owners) the line starts on.
	Source int
	// End is the owner of the boundary the line ends on; -1 when it ends at
	// an insulated wall without owner, the grounded plane, the window's
	// edge, a stagnation point or the step limit.
	End int
	// Boundary reports whether the line ends on the boundary of the domain
	// (rather than at the window's edge, a stagnation point or the step limit).
	Boundary bool
}

// FlowNet is a set of flux lines seeded so that neighbouring lines carry
// equal flux, with the numbers a flow net is read by.
//
// With equipotentials at equal potential drops Drop and flux lines at equal
// flux Conductivity*Drop, the net is made of curvilinear squares; counting
// Channels flow channels and Drops potential drops, the flux is
// q = k H Channels/Drops, so ShapeFactor = Channels/Drops = q/(k H). Source:
// the flow-net method of seepage analysis, e.g. Cedergren, Seepage,
// Drainage, and Flow Nets, 1989, ch. 4; Harr, Groundwater and Seepage, 1962,
// ch. 2.
type FlowNet struct {
	Lines []Line
	// Inflow is the total flux entering the domain through the source
	// boundaries (inflow per metre): the positive part of the inflow over
	// the panels of bodies and edges with a fixed potential or flux.
	Inflow float64
	// Step is the flux between neighbouring lines.
	Step float64
	// Head is the difference between the highest and lowest boundary
	// potential, Drops the number of equal potential drops it is divided
	// into and Drop = Head/Drops.
	Head  float64
	Drops int
	Drop  float64
	// Conductivity is the k of the flow net, sqrt(kx ky) of the region the
	// first source panel faces (the transformed-section conductivity of an
	// anisotropic region).
	Conductivity float64
	// Channels = Inflow/(Conductivity*Drop), the number of flow channels of
	// the square net; generally fractional.
	Channels float64
	// ShapeFactor = Channels/Drops = Inflow/(Conductivity*Head).
	ShapeFactor float64
	// Square reports whether Step = Conductivity*Drop (one drawn line per
	// channel).
	Square bool
}

// Defaults of Trace.
const (
	defaultTol      = 1e-5
	defaultMinLines = 4
	defaultMaxLines = 60
	maxSteps        = 4000
	// endStep: below this step (fraction of the window diagonal) a line
	// that steps out of the domain ends on the boundary.
	endStep = 1e-4
	// floatingLines: lines drawn when only floating bodies emit flux.
	floatingLines = 24
	// uniformTol: a potential range below uniformTol times the largest
	// potential is taken as no potential difference (rounding).
	uniformTol = 1e-9
	// minStep: a line whose step the error control drives below this
	// fraction of the window diagonal has met a stagnation point and ends.
	minStep = 1e-7
	// denseSpacing: accepted steps are filled in with interpolated points
	// no farther apart than this fraction of the window diagonal.
	denseSpacing = 0.004
	// seedOffset: seeds start this fraction of their panel's length inside
	// the domain.
	seedOffset = 1e-3
)

// Trace seeds flux lines on the source boundaries of sol at equal
// increments of the cumulative inflow and integrates each along the unit
// flux direction with the Dormand–Prince 5(4) pair (Dormand & Prince, "A
// family of embedded Runge-Kutta formulae", J. Comp. Appl. Math. 6, 1980),
// with adaptive steps. A line stops where it steps out of the domain (on a
// sink boundary, found by bisection), at the edge of the window w, at a
// stagnation point or after a step limit; it crosses interfaces between
// regions. Seeds outside w get no line. Seeds sit at the middle of each flux increment: cumulative
// inflow (m+1/2)*Step for every whole channel, m = 0, 1, ... while
// (m+1)*Step <= the total inflow. Sources are all bodies and edges where
// flux enters the domain, floating ones included (in electrostatics, lines
// start on every positive surface charge); the flow net's numbers count the
// fixed-potential and flux boundaries only. When only floating bodies emit
// flux (a charged conductor alone), 24 lines are drawn and the flow net's
// numbers are zero.
//
// drops is the number of equal potential drops between the lowest and
// highest boundary potential (k equipotentials from Levels give k+1). Trace
// returns a FlowNet without lines when nothing flows in or the potential is
// uniform.
func Trace(sol *bem.Solution, w Window, drops int, o TraceOptions) *FlowNet {
	if o.Tol <= 0 {
		o.Tol = defaultTol
	}
	if o.MinLines <= 0 {
		o.MinLines = defaultMinLines
	}
	if o.MaxLines <= 0 {
		o.MaxLines = defaultMaxLines
	}
	o.MaxLines = max(o.MaxLines, o.MinLines)
	lo, hi := BoundaryRange(sol)
	net := &FlowNet{Drops: max(drops, 1), Head: hi - lo}
	net.Drop = net.Head / float64(net.Drops)
	src := sources(sol)
	m := sol.Mesh
	fixed, all := 0.0, 0.0 // inflow through fixed-potential and flux boundaries, and through all sources
	for _, j := range src {
		q := sol.F[j] * m.Panels[j].Length()
		all += q
		if k := m.Layout.Owners[m.Panels[j].Owner].Cond.Kind; k == geom.Potential || k == geom.Flux {
			fixed += q
		}
	}
	switch {
	case fixed > 0 && net.Head > uniformTol*math.Max(math.Abs(lo), math.Abs(hi)):
		net.Inflow = fixed
		mat := m.Layout.Regions[m.Panels[src[0]].Left].Material
		net.Conductivity = math.Sqrt(mat.Kx * mat.Ky)
		square := net.Conductivity * net.Drop
		net.Channels = net.Inflow / square
		net.ShapeFactor = net.Channels / float64(net.Drops)
		net.Step, net.Square = square, true
		if n := net.Channels; n < float64(o.MinLines) {
			net.Step = square / math.Ceil(float64(o.MinLines)/n)
			net.Square = false
		} else if n > float64(o.MaxLines) {
			net.Step = square * math.Ceil(n/float64(o.MaxLines))
			net.Square = false
		}
	case fixed == 0 && all > 0:
		// Only floating bodies emit flux (a charged conductor on its own):
		// field lines without a flow net.
		net.Step = all / float64(floatingLines)
	default:
		net.Head, net.Drop = 0, 0
		return net
	}

	var seeds []seed
	for _, sd := range placeSeeds(sol, src, net.Step, all) {
		if w.Contains(sd.at) { // a line seeded outside the window is not drawn
			seeds = append(seeds, sd)
		}
	}
	tr := newTracer(sol, w, o.Tol)
	net.Lines = make([]Line, len(seeds))
	parallel(len(seeds), o.Workers, func(i int) { net.Lines[i] = tr.trace(seeds[i]) })
	return net
}

// sources returns the panels where flux enters the domain through a body
// or edge (not an interface or an unowned wall), ordered by owner and then
// as the mesh walks its boundary (the panels of a piece from A to B, the
// pieces of an owner along their chains), so that the seeds placed along
// them run on from one panel to the next.
func sources(sol *bem.Solution) []int {
	m := sol.Mesh
	var out []int
	for j, p := range m.Panels {
		if p.Interface() || p.Owner < 0 || !(sol.F[j] > 0) {
			continue
		}
		out = append(out, j)
	}
	sort.SliceStable(out, func(a, b int) bool {
		pa, pb := m.Panels[out[a]], m.Panels[out[b]]
		return pa.Owner < pb.Owner
	})
	return out
}

// seed is where a line starts.
type seed struct {
	at      r2.Vec // on the boundary
	start   r2.Vec // just inside the domain
	flux    float64
	source  int
	against bool // trace against the flux, along K grad u
}

// Start is a point inside the domain that a line is traced from: along the
// flux -K grad u, or against it (Against).
type Start struct {
	At      r2.Vec
	Against bool
}

// TraceFrom traces one line from each start, within w, as Trace traces its
// flux lines (a start outside the domain or w gives a line of one point).
// A job draws lines of its own with it, such as the equipotentials of a
// flow seeded where the stream enters the window.
func TraceFrom(sol *bem.Solution, w Window, starts []Start, o TraceOptions) []Line {
	if o.Tol <= 0 {
		o.Tol = defaultTol
	}
	tr := newTracer(sol, w, o.Tol)
	out := make([]Line, len(starts))
	parallel(len(starts), o.Workers, func(i int) {
		st := starts[i]
		if !w.Contains(st.At) {
			out[i] = Line{Points: []r2.Vec{st.At}, Source: -1, End: -1}
			return
		}
		out[i] = tr.trace(seed{at: st.At, start: st.At, source: -1, against: st.Against})
	})
	return out
}

// parallel calls do(i) for every i below n on workers goroutines (0:
// GOMAXPROCS), each taking the next i as it is free.
func parallel(n, workers int, do func(i int)) {
	if workers <= 0 {
		workers = runtime.GOMAXPROCS(0)
	}
	var next atomic.Int64
	var wg sync.WaitGroup
	for range min(workers, n) {
		wg.Add(1)
		go func() {
			defer wg.Done()
			for {
				i := int(next.Add(1) - 1)
				if i >= n {
					return
				}
				do(i)
			}
		}()
	}
	wg.Wait()
}

// placeSeeds puts seeds at cumulative inflow (m+1/2)*step along the source
// panels, for every whole channel.
func placeSeeds(sol *bem.Solution, src []int, step, total float64) []seed {
	var out []seed
	cum := 0.0
	next := 0.5 * step
	for _, j := range src {
		p := sol.Mesh.Panels[j]
		q := sol.F[j] * p.Length()
		// A seed only for a whole channel: (m+1)*step within the total.
		for next < cum+q && next+0.5*step <= total*(1+1e-9) {
			t := (next - cum) / q
			at := r2.Add(p.A, r2.Scale(t, r2.Sub(p.B, p.A)))
			in := r2.Scale(-seedOffset*p.Length(), p.Normal())
			out = append(out, seed{at: at, start: r2.Add(at, in), flux: next, source: p.Owner})
			next += step
		}
		cum += q
	}
	return out
}

// tracer integrates flux lines of one solution.
type tracer struct {
	sol  *bem.Solution
	fld  *bem.Field // sol prepared for evaluation point by point
	w    Window
	segs *segments
	tol  float64 // absolute, metres
	hEnd float64
	hMax float64
	diag float64
}

func newTracer(sol *bem.Solution, w Window, tol float64) *tracer {
	d := w.Diagonal()
	return &tracer{sol: sol, fld: sol.Field(), w: w, segs: newSegments(sol), tol: tol * d, hEnd: endStep * d, hMax: 0.05 * d, diag: d}
}

// dir returns the unit flux direction at p, and false outside the domain or
// at a stagnation point.
func (tr *tracer) dir(p r2.Vec) (r2.Vec, bool) {
	pt := tr.fld.Eval(p)
	if pt.Region == geom.Outside || math.IsNaN(pt.Grad.X) || math.IsNaN(pt.Grad.Y) {
		return r2.Vec{}, false
	}
	m := tr.sol.Mesh.Layout.Regions[pt.Region].Material
	v := r2.Vec{X: -m.Kx * pt.Grad.X, Y: -m.Ky * pt.Grad.Y}
	n := math.Hypot(v.X, v.Y)
	if !(n > 0) || math.IsInf(n, 0) {
		return r2.Vec{}, false
	}
	return r2.Scale(1/n, v), true
}

// Dormand–Prince 5(4) tableau (Dormand & Prince 1980, table 2).
var (
	dpC = [7]float64{0, 1.0 / 5, 3.0 / 10, 4.0 / 5, 8.0 / 9, 1, 1}
	dpA = [7][6]float64{
		{},
		{1.0 / 5},
		{3.0 / 40, 9.0 / 40},
		{44.0 / 45, -56.0 / 15, 32.0 / 9},
		{19372.0 / 6561, -25360.0 / 2187, 64448.0 / 6561, -212.0 / 729},
		{9017.0 / 3168, -355.0 / 33, 46732.0 / 5247, 49.0 / 176, -5103.0 / 18656},
		{35.0 / 384, 0, 500.0 / 1113, 125.0 / 192, -2187.0 / 6784, 11.0 / 84},
	}
	// dpE = b5 - b4, the error weights.
	dpE = [7]float64{71.0 / 57600, 0, -71.0 / 16695, 71.0 / 1920, -17253.0 / 339200, 22.0 / 525, -1.0 / 40}
)

// trace integrates one line from its seed.
func (tr *tracer) trace(s seed) Line {
	ln := Line{Points: []r2.Vec{s.at, s.start}, Seed: s.flux, Source: s.source, End: -1}
	if s.at == s.start {
		ln.Points = ln.Points[:1]
	}
	x := s.start
	dir := tr.dir
	if s.against {
		dir = func(p r2.Vec) (r2.Vec, bool) {
			d, ok := tr.dir(p)
			return r2.Scale(-1, d), ok
		}
	}
	k1, ok := dir(x)
	if !ok {
		return ln
	}
	h := math.Min(tr.hMax, 0.01*tr.diag)
	length := 0.0
	maxLength := 4 * 2 * (tr.w.Size().X + tr.w.Size().Y)
	for step := 0; step < maxSteps && length < maxLength; step++ {
		var k [7]r2.Vec
		k[0] = k1
		var bad r2.Vec
		failed := false
		var xn r2.Vec
		for st := 1; st < 7; st++ {
			y := x
			for q := 0; q < st; q++ {
				if a := dpA[st][q]; a != 0 {
					y = r2.Add(y, r2.Scale(h*a, k[q]))
				}
			}
			if st == 6 {
				xn = y
			}
			d, ok := dir(y)
			if !ok {
				failed, bad = true, y
				break
			}
			k[st] = d
		}
		if failed {
			if h > tr.hEnd {
				h /= 4
				continue
			}
			end := tr.boundaryCrossing(x, bad)
			ln.Points = append(ln.Points, end)
			ln.Boundary = true
			ln.End = tr.ownerNear(end)
			return ln
		}
		var e r2.Vec
		for q := range 7 {
			e = r2.Add(e, r2.Scale(h*dpE[q], k[q]))
		}
		err := math.Hypot(e.X, e.Y)
		if err > tr.tol {
			h *= math.Max(0.2, 0.9*math.Pow(tr.tol/err, 0.2))
			if h < minStep*tr.diag {
				// The direction turns abruptly: a stagnation point, where
				// the line ends.
				return ln
			}
			continue
		}
		if !tr.w.Contains(xn) {
			ln.Points = append(ln.Points, tr.clip(x, xn))
			return ln
		}
		length += r2.Norm(r2.Sub(xn, x))
		ln.Points = tr.dense(ln.Points, x, xn, k[0], k[6], h)
		x = xn
		k1 = k[6] // first same as last
		grow := 5.0
		if err > 0 {
			grow = math.Min(5, 0.9*math.Pow(tr.tol/err, 0.2))
		}
		h = math.Min(tr.hMax, h*math.Max(1, grow))
	}
	return ln
}

// dense appends points within a step from x to xn (directions k0 and k1
// at its ends, length h) by cubic Hermite interpolation, so that long
// steps still draw as smooth curves (a point every 0.4% of the window
// diagonal at most), then xn itself.
func (tr *tracer) dense(pts []r2.Vec, x, xn, k0, k1 r2.Vec, h float64) []r2.Vec {
	n := min(int(math.Ceil(h/(denseSpacing*tr.diag))), 16)
	for i := 1; i < n; i++ {
		t := float64(i) / float64(n)
		t2, t3 := t*t, t*t*t
		p := r2.Scale(2*t3-3*t2+1, x)
		p = r2.Add(p, r2.Scale(h*(t3-2*t2+t), k0))
		p = r2.Add(p, r2.Scale(-2*t3+3*t2, xn))
		p = r2.Add(p, r2.Scale(h*(t3-t2), k1))
		pts = append(pts, p)
	}
	return append(pts, xn)
}

// boundaryCrossing returns the last point inside the domain on the segment
// from x (inside) to y (outside), by bisection to 1e-9 of the window.
func (tr *tracer) boundaryCrossing(x, y r2.Vec) r2.Vec {
	a, b := x, y
	for range 60 {
		if r2.Norm(r2.Sub(b, a)) < 1e-9*tr.diag {
			break
		}
		m := r2.Scale(0.5, r2.Add(a, b))
		if tr.fld.Locate(m) == geom.Outside {
			b = m
		} else {
			a = m
		}
	}
	return a
}

// clip returns the point where the segment from x (in the window) to y
// (outside) leaves the window.
func (tr *tracer) clip(x, y r2.Vec) r2.Vec {
	t := 1.0
	d := r2.Sub(y, x)
	lim := func(p, dp, lo, hi float64) {
		if dp > 0 && p+t*dp > hi {
			t = (hi - p) / dp
		}
		if dp < 0 && p+t*dp < lo {
			t = (lo - p) / dp
		}
	}
	lim(x.X, d.X, tr.w.Min.X, tr.w.Max.X)
	lim(x.Y, d.Y, tr.w.Min.Y, tr.w.Max.Y)
	return r2.Add(x, r2.Scale(math.Max(0, t), d))
}

// ownerNear returns the owner of the panel nearest to p, or -1 for none
// and for the grounded plane when that is nearer.
func (tr *tracer) ownerNear(p r2.Vec) int {
	k, d := tr.segs.nearest(p)
	if k < 0 {
		return -1
	}
	if lay := tr.sol.Mesh.Layout; lay.Open && lay.Ground != nil && math.Abs(p.Y-lay.Ground.Y) < d {
		return -1
	}
	return tr.sol.Mesh.Panels[k].Owner
}
