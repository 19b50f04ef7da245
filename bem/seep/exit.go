package seep

import (
	"cmp"
	"math"
	"slices"

	"github.com/rimfield/rimfield/bem/job"
	"github.com/rimfield/rimfield/geom"
	"github.com/rimfield/rimfield/mesh"
	"gonum.org/v1/gonum/integrate/quad"
	"gonum.org/v1/gonum/spatial/r2"
)

// Tuning of the exit gradient at corners; see the package documentation,
// "Exit gradient", for what each does and how it was measured.
const (
	// lambdaTol: a corner whose exponent lambda is within lambdaTol of 1
	// has a finite, non-zero gradient at its vertex (a fixed-head bed
	// meeting an impervious face at 90 degrees, within about half a
	// degree).
	lambdaTol = 0.005
	// arcPanels: the corner value is projected from an arc of radius
	// arcPanels times the local panel size,
	arcPanels = 4.0
	// arcFree: at most arcFree times the free radius of the wedge (the
	// distance from the vertex to the nearest other boundary inside it).
	arcFree = 1.0 / 3
	// arcNodes: Gauss-Legendre nodes on the arc.
	arcNodes = 24
	// zonePanels: panel values within zonePanels local panel sizes of a
	// graded vertex carry the constant elements' corner error (about 1e-3
	// at a panel size, 1e-2 and more on the smallest panels) and are not
	// read as exit gradients.
	zonePanels = 6.0
	// localReach: the local panel size at a vertex is the longest panel
	// of the exit face within localReach nominal sizes of it.
	localReach = 8.0
)

// CornerKind tells how the exit gradient behaves at a vertex of an exit
// face. The zero value is invalid.
type CornerKind uint8

const (
	// CornerFinite: finite and non-zero at the vertex (lambda = 1, a bed
	// meeting an impervious face at 90 degrees).
	CornerFinite CornerKind = iota + 1
	// CornerVanishing: zero at the vertex (lambda > 1, a corner of the soil
	// sharper than 90 degrees against an impervious face).
	CornerVanishing
	// CornerSingular: infinite at the vertex (lambda < 1: the toe of a floor
	// without a cutoff, r^-1/2).
	CornerSingular
)

// String names the kind.
func (k CornerKind) String() string {
	switch k {
	case CornerFinite:
		return "finite"
	case CornerVanishing:
		return "vanishing"
	case CornerSingular:
		return "singular"
	}
	return "invalid"
}

// Exit is the exit gradient on one fixed-head boundary through which water
// leaves the soil.
type Exit struct {
	Boundary string
	Owner    int     // index into Layout.Owners
	Head     float64 // the boundary's total head (m)
	// Outflow is the water leaving the soil through the boundary (m^2/s).
	Outflow float64
	// Value is the largest exit gradient on the boundary (1): the
	// hydraulic gradient normal to the face, |F| / (n.K.n). Where the
	// gradient is infinite in theory (Singular) it is the mean over
	// AveragedOver metres of the face from At.
	Value float64
	At    r2.Vec // where (m)
	// Corner is true when At is a vertex of the face and Value the limit
	// of the gradient there, from the local expansion of the head; false
	// when Value is a panel's value (or a mean from a singular vertex).
	Corner bool
	// Singular is true when the largest gradient is infinite in theory;
	// AveragedOver (m) is then the length of face Value is the mean over,
	// and Exponent the power of the distance the gradient grows with.
	Singular     bool
	AveragedOver float64
	Exponent     float64
	// Spread is, at a corner, the relative difference between the two
	// projections the corner value is the mean of: a measure of its
	// accuracy (NaN elsewhere).
	Spread float64
	// Corners lists the graded vertices of the face where water leaves.
	Corners []ExitCorner
}

// ExitCorner is a vertex of an exit face where its condition or direction
// changes.
type ExitCorner struct {
	At r2.Vec // metres
	// Neighbour names the boundary across the vertex (a body, an edge,
	// "wall:<region>").
	Neighbour string
	Kind      CornerKind
	// Opening is the soil-side opening angle beta (radians), in the soil's
	// isotropic frame when one soil fills the wedge (the transformed
	// section of an anisotropic soil).
	Opening float64
	// Lambda is the leading exponent of the head near the vertex,
	// h - h_face ~ r^Lambda: the gradient goes like r^(Lambda - 1).
	Lambda float64
	// Junction is true when interfaces between soils meet at the vertex.
	Junction bool
	// Value is the exit gradient at the vertex (CornerFinite), its mean
	// over AveragedOver metres of the face (CornerSingular), or 0.
	Value        float64
	AveragedOver float64
	// Radius is the radius (m, in the isotropic frame) of the arc the
	// finite corner value was projected from, Spread its relative
	// uncertainty (see Exit.Spread).
	Radius, Spread float64

	neighbourOwner int    // the owner across the vertex, or -1
	exitDir        r2.Vec // unit direction of the exit face from the vertex
}

// wedge is a vertex of the boundary seen from an exit panel.
type wedge struct {
	v          r2.Vec
	exit, next int  // the exit panel and the boundary panel across the vertex
	ccw        bool // the soil lies counter-clockwise of the exit panel's direction from v
	sectors    []mesh.Sector
	beta       float64 // opening, isotropic frame when one region
	region     int     // the region next to the exit panel
}

// exits finds the exit faces and their largest gradients.
func (a *analysis) exits() []Exit {
	m := a.m
	graded := map[r2.Vec]bool{}
	for _, v := range m.Singular {
		graded[v] = true
	}
	// leaving[o]: panels of a fixed-head owner where water leaves, by more
	// than the solver's rounding.
	eps := a.noise
	leaving := map[int][]int{}
	for j, p := range m.Panels {
		if p.Interface() || p.Owner < 0 || p.Cond.Kind != geom.Potential || a.sol.F[j] >= -eps {
			continue
		}
		leaving[p.Owner] = append(leaving[p.Owner], j)
	}
	// A face whose whole outflow is below a millionth of the section's is
	// rounding too (the bed upstream of a sheet pile, whose few panels next
	// to the pile's head let out 1e-10 of the discharge): not an exit.
	out, total := map[int]float64{}, 0.0
	for o, js := range leaving {
		for _, j := range js {
			q := -a.sol.F[j] * m.Panels[j].Length()
			out[o] += q
			total += q
		}
	}
	for o, q := range out {
		if q < exitShare*total {
			delete(leaving, o)
		}
	}
	if len(leaving) == 0 {
		return nil
	}
	wedges := map[int][]wedge{}
	for j, p := range m.Panels {
		if p.Interface() || !graded[p.B] {
			continue
		}
		w, ok := a.wedgeAt(j)
		if !ok {
			continue
		}
		// Either side of the vertex may be an exit face: the arriving
		// panel j (the soil clockwise of the way back along it) or the
		// leaving one (the soil counter-clockwise of it).
		for _, ccw := range []bool{false, true} {
			x := w
			if ccw {
				x.exit, x.next, x.ccw = w.next, j, true
				x.sectors = slices.Clone(w.sectors)
				slices.Reverse(x.sectors)
				x.region = m.Panels[w.next].Left
			}
			// Any vertex of a face that lets water out, even where the
			// gradient vanishes at it.
			q := m.Panels[x.exit]
			if _, ok := leaving[q.Owner]; !ok || q.Cond.Kind != geom.Potential || q.Interface() {
				continue
			}
			wedges[q.Owner] = append(wedges[q.Owner], x)
		}
	}
	owners := make([]int, 0, len(leaving))
	for o := range leaving {
		owners = append(owners, o)
	}
	slices.Sort(owners)
	var exits []Exit
	for _, o := range owners {
		exits = append(exits, a.exitFace(o, leaving[o], wedges[o]))
	}
	return exits
}

// exitShare is the least share of the section's outflow a fixed-head face
// must let out to be an exit face.
const exitShare = 1e-6

// fluxNoise returns the inflow density below which a panel's value is
// taken for rounding: 1e-5 of the largest conductivity times the largest
// of the head difference, the largest head and 1 m, over the section's
// diagonal (a section without flow gives inflows near 1e-7 of that).
func (a *analysis) fluxNoise() float64 {
	kmax := 0.0
	for _, r := range a.lay.Regions {
		kmax = math.Max(kmax, math.Max(r.Material.Kx, r.Material.Ky))
	}
	lo, hi, top := math.Inf(1), math.Inf(-1), 1.0
	for _, u := range a.sol.U {
		lo, hi, top = math.Min(lo, u), math.Max(hi, u), math.Max(top, math.Abs(u))
	}
	return 1e-5 * kmax * math.Max(hi-lo, top) / a.lay.Diagonal
}

// wedgeAt returns the wedge at the end B of boundary panel j: the next
// boundary panel clockwise from the way back along j (the one leaving the
// vertex with the smallest opening), the interfaces between, and the
// opening. The soil lies clockwise of the way back.
func (a *analysis) wedgeAt(j int) (wedge, bool) {
	m := a.m
	p := m.Panels[j]
	v := p.B
	back := r2.Scale(-1, p.Tangent())
	k, beta := -1, 0.0
	for _, c := range a.starts[v] {
		if ang := cw(m.Panels[c].Tangent(), back); k < 0 || ang < beta {
			k, beta = c, ang
		}
	}
	if k < 0 {
		return wedge{}, false
	}
	type ray struct {
		phi    float64
		beyond int // the region clockwise of the ray
	}
	var rays []ray
	for _, c := range a.joints[v] {
		ip := m.Panels[c]
		d, cwSide := ip.Tangent(), ip.Right
		if ip.B == v {
			d, cwSide = r2.Scale(-1, d), ip.Left
		}
		if phi := cw(d, back); phi < beta {
			rays = append(rays, ray{phi, cwSide})
		}
	}
	slices.SortFunc(rays, func(x, y ray) int { return cmp.Compare(x.phi, y.phi) })
	w := wedge{v: v, exit: j, next: k, region: p.Left}
	from, reg := 0.0, p.Left
	for _, r := range rays {
		w.sectors = append(w.sectors, mesh.Sector{Width: r.phi - from, K: a.kbar(reg)})
		from, reg = r.phi, r.beyond
	}
	w.sectors = append(w.sectors, mesh.Sector{Width: beta - from, K: a.kbar(reg)})
	w.beta = beta
	if len(rays) == 0 {
		// One soil: the opening in its isotropic frame.
		t := a.frame(p.Left)
		w.beta = cw(t.to(m.Panels[k].Tangent()), t.to(back))
		w.sectors[0].Width = w.beta
	}
	return w, true
}

// cw returns the clockwise angle in (0, 2 pi] from back to d.
func cw(d, back r2.Vec) float64 {
	a := math.Atan2(r2.Cross(d, back), r2.Dot(d, back))
	if a <= 0 {
		a += 2 * math.Pi
	}
	return a
}

func (a *analysis) kbar(reg int) float64 {
	k := a.lay.Regions[reg].Material
	return math.Sqrt(k.Kx * k.Ky)
}

// isoFrame is a region's isotropic frame: X = T x with T = diag(ax, 1/ax),
// ax = (ky/kx)^(1/4) (det T = 1), where the region's equation is Laplace's
// with conductivity kbar = sqrt(kx ky): the transformed section (Harr,
// Groundwater and Seepage, 1962, ch. 1, from memory; common practice).
type isoFrame struct{ ax, kbar float64 }

func (a *analysis) frame(reg int) isoFrame {
	k := a.lay.Regions[reg].Material
	return isoFrame{ax: math.Pow(k.Ky/k.Kx, 0.25), kbar: math.Sqrt(k.Kx * k.Ky)}
}

func (t isoFrame) to(x r2.Vec) r2.Vec   { return r2.Vec{X: t.ax * x.X, Y: x.Y / t.ax} }
func (t isoFrame) from(X r2.Vec) r2.Vec { return r2.Vec{X: X.X / t.ax, Y: X.Y * t.ax} }

// gradTo turns a gradient in the original coordinates into one in the
// isotropic frame: grad_X = T^-1 grad_x.
func (t isoFrame) gradTo(g r2.Vec) r2.Vec { return r2.Vec{X: g.X / t.ax, Y: g.Y * t.ax} }

// classify sets the corner's kind from its wedge.
func (a *analysis) classify(w wedge) ExitCorner {
	m := a.m
	q := m.Panels[w.next]
	c := ExitCorner{At: w.v, Neighbour: job.BoundaryName(a.lay, q), Opening: w.beta, Junction: len(w.sectors) > 1,
		Spread: math.NaN(), neighbourOwner: -1, exitDir: m.Panels[w.exit].Tangent()}
	if !w.ccw {
		c.exitDir = r2.Scale(-1, c.exitDir)
	}
	if !q.Interface() {
		c.neighbourOwner = q.Owner
	}
	switch {
	case q.Cond.Kind == geom.Flux:
		if len(w.sectors) == 1 {
			c.Lambda = math.Pi / (2 * w.beta)
		} else {
			c.Lambda = mesh.WedgeExponent(w.sectors, true)
		}
	case math.Abs(a.sol.U[w.next]-a.sol.U[w.exit]) <= 1e-9*(1+math.Abs(a.sol.U[w.exit])):
		if len(w.sectors) == 1 {
			c.Lambda = math.Pi / w.beta
		} else {
			c.Lambda = mesh.WedgeExponent(w.sectors, false)
		}
	default:
		c.Lambda = 0 // the head jumps at the vertex: gradient ~ 1/r
	}
	switch {
	case math.Abs(c.Lambda-1) <= lambdaTol:
		c.Kind = CornerFinite
	case c.Lambda < 1:
		c.Kind = CornerSingular
	default:
		c.Kind = CornerVanishing
	}
	return c
}

// exitFace finds the largest exit gradient on owner o, whose leaving
// panels are given, with the wedges at its graded vertices.
func (a *analysis) exitFace(o int, panels []int, wedges []wedge) Exit {
	m := a.m
	ex := Exit{Boundary: a.lay.Owners[o].Name, Owner: o, Head: a.lay.Owners[o].Cond.Value,
		Spread: math.NaN(), Exponent: 0}
	faceLen := 0.0
	for _, j := range panels {
		l := m.Panels[j].Length()
		ex.Outflow -= a.sol.F[j] * l
		faceLen += l
	}
	type candidate struct {
		value          float64
		at             r2.Vec
		corner, sing   bool
		over, exponent float64
		spread         float64
	}
	var cands []candidate
	for _, w := range wedges {
		c := a.classify(w)
		hLoc := a.localSize(w, panels)
		switch c.Kind {
		case CornerFinite:
			if len(w.sectors) == 1 {
				c.Value, c.Radius, c.Spread = a.project(w, c, hLoc)
				if c.Value > 0 {
					cands = append(cands, candidate{value: c.Value, at: w.v, corner: true, spread: c.Spread})
				}
			}
		case CornerSingular:
			c.Value, c.AveragedOver = a.average(w, faceLen)
			cands = append(cands, candidate{value: c.Value, at: w.v, sing: true, over: c.AveragedOver, exponent: c.Lambda - 1})
		}
		ex.Corners = append(ex.Corners, c)
	}
	// Panel values away from graded vertices.
	zones := make([]struct {
		v r2.Vec
		r float64
	}, 0, len(m.Singular))
	for _, v := range m.Singular {
		zones = append(zones, struct {
			v r2.Vec
			r float64
		}{v, zonePanels * a.sizeNear(v, panels)})
	}
	best := -1
	bestRaw := -1
	for _, j := range panels {
		mid := m.Panels[j].Mid()
		g := -a.sol.F[j] / a.nKn(j)
		if bestRaw < 0 || g > -a.sol.F[bestRaw]/a.nKn(bestRaw) {
			bestRaw = j
		}
		near := false
		for _, z := range zones {
			if r2.Norm(r2.Sub(mid, z.v)) < z.r {
				near = true
				break
			}
		}
		if !near && (best < 0 || g > -a.sol.F[best]/a.nKn(best)) {
			best = j
		}
	}
	if best >= 0 {
		cands = append(cands, candidate{value: -a.sol.F[best] / a.nKn(best), at: m.Panels[best].Mid()})
	}
	if len(cands) == 0 {
		// A short face inside the corner zones: its largest panel value.
		cands = append(cands, candidate{value: -a.sol.F[bestRaw] / a.nKn(bestRaw), at: m.Panels[bestRaw].Mid()})
	}
	k := 0
	for i, c := range cands {
		if c.value > cands[k].value {
			k = i
		}
	}
	c := cands[k]
	ex.Value, ex.At, ex.Corner, ex.Singular = c.value, c.at, c.corner, c.sing
	ex.AveragedOver, ex.Exponent, ex.Spread = c.over, c.exponent, c.spread
	if !c.corner {
		ex.Spread = math.NaN()
	}
	return ex
}

// sizeNear returns the local panel size at v: the longest panel of the
// face within localReach nominal sizes of v, at most the nominal size.
func (a *analysis) sizeNear(v r2.Vec, panels []int) float64 {
	h0 := a.m.Size
	if !(h0 > 0) {
		h0 = 0
		for _, p := range a.m.Panels {
			h0 = math.Max(h0, p.Length())
		}
	}
	h := 0.0
	for _, j := range panels {
		p := a.m.Panels[j]
		if r2.Norm(r2.Sub(p.Mid(), v)) <= localReach*h0 {
			h = math.Max(h, p.Length())
		}
	}
	if h == 0 || h > h0 {
		h = h0
	}
	return h
}

// localSize is sizeNear at the wedge's vertex, over the panels of both its
// faces.
func (a *analysis) localSize(w wedge, panels []int) float64 {
	h := a.sizeNear(w.v, panels)
	q := a.m.Panels[w.next]
	var same []int
	for j, p := range a.m.Panels {
		if p.Owner == q.Owner && p.Cond == q.Cond && p.Left == q.Left && !p.Interface() {
			same = append(same, j)
		}
	}
	return math.Max(h, a.sizeNear(w.v, same))
}

// project returns the exit gradient at a finite corner, the radius of the
// arc it was projected from and the relative spread of its two estimates.
//
// In the wedge's isotropic frame, with theta measured from the exit face
// into the soil, the head is h - h_face = sum_k c_k r^(lambda_k)
// sin(lambda_k theta), lambda_k = (2k+1) pi / (2 beta), and the gradient
// on the face at the vertex is c_0 lambda_0 r^(lambda_0 - 1), c_0 for
// lambda_0 = 1. The sines (and the cosines) are orthogonal on [0, beta], so
// on an arc of radius rho inside the wedge
//
//	c_0 lambda_0 rho^(lambda_0-1) = (2/beta) int_0^beta dh/dr sin(lambda_0 theta) dtheta
//	                              = (2/beta) int_0^beta (1/r) dh/dtheta cos(lambda_0 theta) dtheta
//
// whatever the higher terms. The two are the same for the exact head and
// differ for the computed one; their mean is the value, their difference
// its spread.
func (a *analysis) project(w wedge, c ExitCorner, hLoc float64) (value, radius, spread float64) {
	t := a.frame(w.region)
	e := a.m.Panels[w.exit]
	// Directions from the vertex in the isotropic frame: d0 along the exit
	// face, d1 a quarter turn toward the soil.
	dir := e.Tangent()
	if !w.ccw {
		dir = r2.Scale(-1, dir)
	}
	d0 := r2.Unit(t.to(dir))
	d1 := r2.Vec{X: -d0.Y, Y: d0.X}
	if !w.ccw {
		d1 = r2.Scale(-1, d1)
	}
	V := t.to(w.v)
	free := a.freeRadius(w, t, V, d0, d1, c.Opening)
	rho := math.Min(arcPanels*hLoc, arcFree*free)
	if !(rho > 0) || math.IsInf(rho, 0) {
		return 0, 0, math.NaN()
	}
	lambda, beta := c.Lambda, c.Opening
	xs := make([]float64, arcNodes)
	ws := make([]float64, arcNodes)
	quad.Legendre{}.FixedLocations(xs, ws, 0, beta)
	var g1, g2 float64
	for k, th := range xs {
		er := r2.Add(r2.Scale(math.Cos(th), d0), r2.Scale(math.Sin(th), d1))
		et := r2.Add(r2.Scale(-math.Sin(th), d0), r2.Scale(math.Cos(th), d1))
		pt := a.sol.Eval(t.from(r2.Add(V, r2.Scale(rho, er))))
		if pt.Region != w.region || math.IsNaN(pt.U) {
			return 0, rho, math.NaN()
		}
		g := t.gradTo(pt.Grad)
		g1 += ws[k] * r2.Dot(g, er) * math.Sin(lambda*th)
		g2 += ws[k] * r2.Dot(g, et) * math.Cos(lambda*th)
	}
	g1 *= 2 / beta
	g2 *= 2 / beta
	gm := 0.5 * (g1 + g2)
	// The inflow through the exit face is kbar g per unit length of the
	// isotropic frame: per metre, times the stretch of the face's
	// direction; the exit gradient is its size over n.K.n.
	stretch := r2.Norm(t.to(dir))
	value = t.kbar * gm * stretch / a.nKn(w.exit)
	spread = math.Abs(g1-g2) / math.Abs(gm)
	return value, rho, spread
}

// freeRadius returns the distance, in the isotropic frame, from the vertex
// V to the nearest boundary inside the wedge other than its two faces (the
// panels that continue the exit panel and its neighbour straight from the
// vertex with their conditions), or to the nearer end of those faces. The wedge of a finite corner is about a
// quarter plane: convex, the intersection of the half planes on the soil
// side of its faces.
func (a *analysis) freeRadius(w wedge, t isoFrame, V, d0, d1 r2.Vec, beta float64) float64 {
	onFace := map[int]bool{}
	// The faces end where they turn or change condition (the tip of a
	// sheet pile): the wedge's expansion holds no farther than the nearest
	// such end, so it bounds the free radius too.
	best := math.Inf(1)
	for _, face := range []int{w.exit, w.next} {
		run := 0.0
		for _, j := range a.chain(face, w.v) {
			onFace[j] = true
			p := a.m.Panels[j]
			run += r2.Norm(r2.Sub(t.to(p.B), t.to(p.A)))
		}
		best = math.Min(best, run)
	}
	// Inward normals of the faces along d0 and at beta from it.
	n1 := d1
	n2 := r2.Sub(r2.Scale(math.Sin(beta), d0), r2.Scale(math.Cos(beta), d1))
	tol := 1e-9 * a.lay.Diagonal
	// The back of a face of zero thickness (a sheet drawn as a line) lies
	// on the face itself, running the other way: not inside the wedge.
	backOf := func(p mesh.Panel, face int) bool {
		f := a.m.Panels[face]
		return r2.Dot(p.Tangent(), f.Tangent()) < -1+1e-9 &&
			math.Abs(r2.Cross(r2.Sub(p.A, w.v), f.Tangent())) <= tol && math.Abs(r2.Cross(r2.Sub(p.B, w.v), f.Tangent())) <= tol
	}
	// Another boundary that only touches the vertex (where a sheet ends
	// on the bed, the bed beyond it and the sheet's other face) lies
	// outside the wedge: the wedge's faces are the nearest ones round it.
	atVertex := func(p mesh.Panel) bool {
		return r2.Norm(r2.Sub(p.A, w.v)) <= tol || r2.Norm(r2.Sub(p.B, w.v)) <= tol
	}
	for j, p := range a.m.Panels {
		if onFace[j] || backOf(p, w.exit) || backOf(p, w.next) || atVertex(p) {
			continue
		}
		A, B := t.to(p.A), t.to(p.B)
		lo, hi := 0.0, 1.0
		for _, n := range []r2.Vec{n1, n2} {
			// Points on a face's line (to rounding) count as inside.
			fa, fb := r2.Dot(r2.Sub(A, V), n)+tol, r2.Dot(r2.Sub(B, V), n)+tol
			switch {
			case fa < 0 && fb < 0:
				lo, hi = 1, 0
			case fa < 0:
				lo = math.Max(lo, fa/(fa-fb))
			case fb < 0:
				hi = math.Min(hi, fa/(fa-fb))
			}
		}
		if lo > hi {
			continue
		}
		d, _ := segDistance(V, r2.Add(A, r2.Scale(lo, r2.Sub(B, A))), r2.Add(A, r2.Scale(hi, r2.Sub(B, A))))
		best = math.Min(best, d)
	}
	return best
}

// chain returns the panels that continue panel j straight away from its
// end v with its owner and condition, j first.
func (a *analysis) chain(j int, v r2.Vec) []int {
	m := a.m
	p0 := m.Panels[j]
	out := []int{j}
	forward := p0.A == v // the chain runs from A to B
	for len(out) <= len(m.Panels) {
		p := m.Panels[out[len(out)-1]]
		list, at := a.starts, p.B
		if !forward {
			list, at = a.ends, p.A
		}
		next := -1
		for _, c := range list[at] {
			q := m.Panels[c]
			if q.Owner == p0.Owner && q.Cond == p0.Cond && q.Left == p0.Left &&
				math.Abs(r2.Cross(q.Tangent(), p0.Tangent())) < 1e-9 && r2.Dot(q.Tangent(), p0.Tangent()) > 0 {
				next = c
				break
			}
		}
		if next < 0 {
			break
		}
		out = append(out, next)
	}
	return out
}

// segDistance returns the distance from p to segment ab and the distance
// from a of the nearest point along it.
func segDistance(p, a, b r2.Vec) (float64, float64) {
	d := r2.Sub(b, a)
	L2 := r2.Dot(d, d)
	if L2 == 0 {
		return r2.Norm(r2.Sub(p, a)), 0
	}
	t := math.Max(0, math.Min(1, r2.Dot(r2.Sub(p, a), d)/L2))
	q := r2.Add(a, r2.Scale(t, d))
	return r2.Norm(r2.Sub(p, q)), t * math.Sqrt(L2)
}

// average returns the mean exit gradient over the first stretch of the
// exit face from a singular vertex, and the stretch's length: Options'
// ExitLength, else DefaultExitFraction of the seepage path of the
// structure across the vertex (its contact with the soil), else of the
// exit face; never more than the face runs from the vertex.
func (a *analysis) average(w wedge, faceLen float64) (float64, float64) {
	m := a.m
	L := a.o.ExitLength
	if L == 0 {
		q := m.Panels[w.next]
		if q.Owner >= 0 && a.lay.Owners[q.Owner].Part == geom.PartBody {
			for _, p := range m.Panels {
				if p.Owner == q.Owner && !p.Interface() {
					L += p.Length()
				}
			}
		}
		if L == 0 {
			L = faceLen
		}
		L *= DefaultExitFraction
	}
	e := m.Panels[w.exit]
	// Walk the exit owner's panels from the vertex.
	forward := e.A == w.v
	j, sum, done := w.exit, 0.0, 0.0
	for steps := 0; j >= 0 && done < L && steps < len(m.Panels); steps++ {
		p := m.Panels[j]
		l := math.Min(p.Length(), L-done)
		sum += l * (-a.sol.F[j] / a.nKn(j))
		done += l
		list, at := a.starts, p.B
		if !forward {
			list, at = a.ends, p.A
		}
		j = -1
		for _, c := range list[at] {
			if q := m.Panels[c]; q.Owner == e.Owner && q.Cond == e.Cond {
				j = c
				break
			}
		}
	}
	if done == 0 {
		return 0, 0
	}
	return sum / done, done
}
