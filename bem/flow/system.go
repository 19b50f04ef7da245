package flow

import (
	"cmp"
	"fmt"
	"math"
	"slices"

	"github.com/rimfield/rimfield/bem"
	"github.com/rimfield/rimfield/geom"
	"github.com/rimfield/rimfield/mesh"
	"gonum.org/v1/gonum/spatial/r2"
)

// DefaultDensity is the fluid density used when a scene gives none: air at
// sea level in the International Standard Atmosphere, 1.225 kg/m^3 (ISO
// 2533:1975; common practice).
const DefaultDensity = 1.225

// MaxTrailingEdgeAngle is the largest body-side angle, in degrees, of a
// corner that "kutta": true accepts as a trailing edge (for a blunt one,
// of the angle between the surfaces meeting its base). A rounded trailing
// edge is refused: close it to a vertex or name the point.
const MaxTrailingEdgeAngle = 90.0

// kuttaPointTol is how far, relative to the body's bounding-box diagonal,
// a "kutta": [x, y] point may lie from the vertex it names.
const kuttaPointTol = 1e-3

// tieTol is the angle, in radians, within which two corners are equally
// sharp; the more downstream one is then the trailing edge.
const tieTol = 1e-6

// System is a flow scene assembled and factorised once: it solves any
// incidence and any stream speed (Solve, Sweep).
type System struct {
	// Scene is the scene the mesh was built from.
	Scene *geom.Scene
	// Mesh is the stream-function mesh: the scene's panels with every body
	// a floating boundary (an unknown constant stream function). Solutions
	// refer to it.
	Mesh *mesh.Mesh
	// Bodies describes each body of the scene in scene order.
	Bodies []Body
	// Whole is the chord line of all the bodies together.
	Whole Chord
	// Density is the fluid density in kg/m^3.
	Density float64

	sys    *bem.System
	ground *geom.Ground
}

// Chord is a reference chord line: from the leading edge to the trailing
// edge, the quarter-chord point on it.
type Chord struct {
	// LeadingEdge is the point of the section farthest from the trailing
	// edge (metres).
	LeadingEdge r2.Vec
	// TrailingEdge is the Kutta vertex (the midpoint of a blunt trailing
	// edge's base), or for a body without one the downstream end of its
	// longest extent (metres).
	TrailingEdge r2.Vec
	// Length is the reference chord c in metres: problem.chord when the
	// scene gives one (for the whole, and for a body alone in its scene),
	// else |TrailingEdge - LeadingEdge|.
	Length float64
	// QuarterChord is the moment reference point, LeadingEdge + c/4 along
	// the chord line (metres).
	QuarterChord r2.Vec
}

// Body is one body of a flow scene.
type Body struct {
	Name  string
	Owner int // index into Mesh.Layout.Owners
	// Kutta is true when the body's circulation is fixed by the Kutta
	// condition at its trailing edge; without it the body carries none.
	Kutta bool
	// Angle is the body-side angle at the trailing edge in degrees (0 at a
	// cusp; at a blunt trailing edge the angle between the surfaces
	// meeting its base, the sum of its corners' angles less 180); NaN
	// without Kutta.
	Angle float64
	// Blunt is true for a blunt trailing edge: a short base from Base[0]
	// to Base[1] (in the order met walking with the fluid on the left,
	// from the upper surface to the lower); the Kutta condition holds
	// across it, and Chord.TrailingEdge is its midpoint. At a sharp
	// trailing edge both are the vertex.
	Blunt bool
	Base  [2]r2.Vec
	Chord Chord
}

// Assemble prepares a flow scene for solving: it finds each body's
// trailing edge (Kutta) and chord line, turns every body of the mesh m
// (built from sc's layout) into a floating boundary, and assembles and
// factorises the system with one Kutta condition per body that asks for
// one. s tunes the assembly (nil: defaults; its Kutta list is replaced).
func Assemble(sc *geom.Scene, m *mesh.Mesh, s *bem.Settings) (*System, error) {
	bodies, whole, err := Inspect(sc, m)
	if err != nil {
		return nil, err
	}
	fs := &System{Scene: sc, Bodies: bodies, Whole: whole, Density: sc.Problem.Density, ground: m.Layout.Ground}
	if !(fs.Density > 0) {
		fs.Density = DefaultDensity
	}
	fs.Mesh = floatingMesh(m)
	var settings bem.Settings
	if s != nil {
		settings = *s
	}
	settings.Kutta = nil
	for _, b := range bodies {
		if b.Kutta {
			settings.Kutta = append(settings.Kutta, bem.Kutta{Owner: b.Owner, At: b.Base[0], Blunt: b.Blunt, To: b.Base[1]})
		}
	}
	if fs.sys, err = bem.Assemble(fs.Mesh, &settings); err != nil {
		return nil, err
	}
	return fs, nil
}

// Inspect checks that the stream-function formulation takes the scene sc
// with its mesh m and returns what Assemble would find, without assembling:
// each body's trailing edge and chord line, and the whole's chord line. Its
// errors are Assemble's (a *geom.Error naming the feature for bad input).
func Inspect(sc *geom.Scene, m *mesh.Mesh) ([]Body, Chord, error) {
	if sc == nil || m == nil || m.Layout == nil {
		panic("flow: Inspect and Assemble need a scene and its mesh")
	}
	if err := check(sc, m); err != nil {
		return nil, Chord{}, err
	}
	dir := streamDir(sc)
	var bodies []Body
	for i := range sc.Bodies {
		b, err := newBody(sc, m, i, dir)
		if err != nil {
			return nil, Chord{}, err
		}
		bodies = append(bodies, b)
	}
	if len(bodies) == 1 {
		return bodies, bodies[0].Chord, nil
	}
	return bodies, wholeChord(sc, bodies, dir), nil
}

// System returns the factorised boundary element system.
func (fs *System) System() *bem.System { return fs.sys }

// Solve solves for the uniform stream st (speed in m/s, angle in degrees
// anticlockwise from the x axis) on the one factorisation. The solution's
// potential is the stream function psi in m^2/s, its inflow density
// d psi/dn, and a body's total inflow its anticlockwise circulation.
func (fs *System) Solve(st geom.Stream) (*bem.Solution, error) {
	if !(st.Speed > 0) || math.IsInf(st.Speed, 0) {
		return nil, fmt.Errorf("flow: the stream speed must be a positive number of m/s, got %g", st.Speed)
	}
	if math.IsNaN(st.AngleDeg) || math.IsInf(st.AngleDeg, 0) {
		return nil, fmt.Errorf("flow: the stream angle must be a finite number of degrees, got %g", st.AngleDeg)
	}
	sn, cs := sincosDeg(st.AngleDeg)
	if fs.ground != nil && math.Abs(sn) > 1e-12 {
		return nil, fmt.Errorf("flow: with a ground plane the stream must run along it (angle 0 or 180 degrees), got %g degrees; pitch the section instead", st.AngleDeg)
	}
	if fs.ground != nil {
		sn = 0
	}
	// psi_inf = U (y cos alpha - x sin alpha).
	return fs.sys.Solve(&bem.Data{Uniform: r2.Vec{X: -st.Speed * sn, Y: st.Speed * cs}})
}

// sincosDeg returns the sine and cosine of an angle in degrees, exact at
// multiples of 90 degrees.
func sincosDeg(deg float64) (sin, cos float64) {
	r := math.Mod(deg, 360)
	switch r {
	case 0:
		return 0, 1
	case 90, -270:
		return 1, 0
	case 180, -180:
		return 0, -1
	case 270, -90:
		return -1, 0
	}
	return math.Sincos(r * math.Pi / 180)
}

// streamDir returns the unit vector of the scene's stream (x without one).
func streamDir(sc *geom.Scene) r2.Vec {
	if sc.Problem.Stream == nil {
		return r2.Vec{X: 1}
	}
	s, c := sincosDeg(sc.Problem.Stream.AngleDeg)
	return r2.Vec{X: c, Y: s}
}

// check refuses what the stream-function formulation does not model.
func check(sc *geom.Scene, m *mesh.Mesh) error {
	lay := m.Layout
	if sc.Problem.Physics != geom.Flow {
		return fmt.Errorf("flow: the scene's physics is %s, not flow", sc.Problem.Physics)
	}
	if !lay.Open {
		return &geom.Error{Feature: -1, Member: "problem.open", Msg: "ideal flow is solved around bodies in an open stream; remove \"open\": false and the regions"}
	}
	if len(sc.Regions) > 0 {
		r := sc.Regions[0]
		return &geom.Error{Feature: r.Feature, Name: r.Name, Member: "part", Msg: "flow scenes have no regions: the fluid fills the plane around the bodies (a ground plane may bound it below); remove the region"}
	}
	if len(sc.Edges) > 0 {
		e := sc.Edges[0]
		return &geom.Error{Feature: e.Feature, Name: e.Name, Member: "part", Msg: "flow scenes have no edges: every body is a wall; remove the edge"}
	}
	if len(sc.Bodies) == 0 {
		return &geom.Error{Feature: -1, Member: "features", Msg: "a flow scene needs at least one body in the stream"}
	}
	for _, b := range sc.Bodies {
		if b.Sheet() && len(b.Lines) != 1 {
			return &geom.Error{Feature: b.Feature, Name: b.Name, Member: "geometry",
				Msg: fmt.Sprintf("a flow body is one wall with its own circulation, and this sheet has %d lines; give each line a body feature of its own, or join them into one LineString", len(b.Lines))}
		}
		if !b.Sheet() && len(b.Polygons) != 1 {
			return &geom.Error{Feature: b.Feature, Name: b.Name, Member: "geometry",
				Msg: fmt.Sprintf("a flow body is one solid with its own circulation, and this one has %d polygons; give each polygon a body feature of its own", len(b.Polygons))}
		}
	}
	if len(lay.Regions) != 1 || !lay.Regions[0].Background {
		return fmt.Errorf("flow: internal: the layout of an open flow scene should have the background alone")
	}
	// Each closed loop of panels must belong to one body: bodies that touch
	// or overlap form one solid, which needs one stream-function constant.
	// (Where two bodies share a vertex the map keeps one of the panels
	// starting there, and the walk crosses to the other body: caught.)
	next := map[r2.Vec]int{}
	for j, p := range m.Panels {
		next[p.A] = j
	}
	seen := make([]bool, len(m.Panels))
	for j := range m.Panels {
		if seen[j] {
			continue
		}
		owner := m.Panels[j].Owner
		for k := j; !seen[k]; {
			seen[k] = true
			if o := m.Panels[k].Owner; o != owner {
				a, b := lay.Owners[owner], lay.Owners[o]
				return &geom.Error{Feature: b.Feature, Name: b.Name, Member: "geometry",
					Msg: fmt.Sprintf("touches or overlaps body %q (feature %d): in ideal flow each solid is one body; merge them into one polygon or move them apart", a.Name, a.Feature)}
			}
			n, ok := next[m.Panels[k].B]
			if !ok {
				break
			}
			k = n
		}
	}
	return nil
}

// floatingMesh returns a copy of m whose bodies are floating boundaries
// with no net inflow: the stream function is constant along each body (a
// wall is a streamline) at a value found by the solve, and a body's total
// inflow is its circulation.
func floatingMesh(m *mesh.Mesh) *mesh.Mesh {
	fl := geom.Condition{Kind: geom.Floating}
	lay := *m.Layout
	lay.Owners = append([]geom.Owner(nil), m.Layout.Owners...)
	for i := range lay.Owners {
		lay.Owners[i].Cond = fl
	}
	out := *m
	out.Layout = &lay
	out.Panels = append([]mesh.Panel(nil), m.Panels...)
	for j := range out.Panels {
		out.Panels[j].Cond = fl
	}
	return &out
}

// newBody finds body i's owner, trailing edge and chord line.
func newBody(sc *geom.Scene, m *mesh.Mesh, i int, dir r2.Vec) (Body, error) {
	sb := sc.Bodies[i]
	b := Body{Name: sb.Name, Owner: -1, Angle: math.NaN()}
	for o, ow := range m.Layout.Owners {
		if ow.Part == geom.PartBody && ow.Index == i {
			b.Owner = o
		}
	}
	ferr := func(member, format string, args ...any) error {
		return &geom.Error{Feature: sb.Feature, Name: sb.Name, Member: member, Msg: fmt.Sprintf(format, args...)}
	}
	if b.Owner < 0 {
		return b, fmt.Errorf("flow: internal: body %q has no owner in the layout", sb.Name)
	}
	if sb.Sheet() {
		return sheetBody(sc, b, &sb, dir, ferr)
	}
	ring := sb.Polygons[0][0]
	scale := sc.Problem.Scale
	if !(scale > 0) {
		scale = 1
	}
	unit := sc.Problem.Unit
	if unit == "" {
		unit = "m"
	}
	var te r2.Vec
	switch k := sb.Kutta; {
	case k == nil:
		// The body's longest extent, trailing end downstream.
		p, q := diameter(ring, dir)
		if r2.Dot(p, dir) > r2.Dot(q, dir) {
			p, q = q, p
		}
		c := sc.Problem.Chord
		if len(sc.Bodies) > 1 {
			c = 0
		}
		b.Chord = chordLine(p, q, c)
		return b, nil
	case k.Auto:
		v, angle := sharpest(ring, dir)
		if e, eff := bluntest(ring, dir); e >= 0 && eff < angle-tieTol {
			v, angle = -1, eff
			b.Blunt, b.Base = true, [2]r2.Vec{ring[(e+1)%len(ring)], ring[e]}
			te = r2.Scale(0.5, r2.Add(b.Base[0], b.Base[1]))
		}
		if angle > MaxTrailingEdgeAngle*math.Pi/180 {
			at := te
			if v >= 0 {
				at = ring[v]
			}
			return b, ferr("kutta", "has no corner sharp enough for a trailing edge: the sharpest, at (%.6g, %.6g) %s, has a body-side angle of %.1f degrees, and a trailing edge must be sharper than %g degrees; close the trailing edge to one vertex, or give the point as \"kutta\": [x, y]",
				at.X/scale, at.Y/scale, unit, angle*180/math.Pi, MaxTrailingEdgeAngle)
		}
		if v >= 0 {
			te = ring[v]
			b.Base = [2]r2.Vec{te, te}
		}
		b.Kutta, b.Angle = true, angle*180/math.Pi
	default:
		v := nearest(ring, k.Point)
		lo, hi := bounds(ring)
		tol := kuttaPointTol * r2.Norm(r2.Sub(hi, lo))
		d := r2.Norm(r2.Sub(ring[v], k.Point))
		if d > tol {
			// On the base of a blunt trailing edge?
			if e := baseAt(ring, k.Point, tol); e >= 0 {
				n := len(ring)
				b.Blunt, b.Base = true, [2]r2.Vec{ring[(e+1)%n], ring[e]}
				te = r2.Scale(0.5, r2.Add(b.Base[0], b.Base[1]))
				b.Kutta, b.Angle = true, (angleAt(ring, e)+angleAt(ring, (e+1)%n)-math.Pi)*180/math.Pi
				break
			}
			return b, ferr("kutta", "the point (%.6g, %.6g) %s is %.3g %s from the nearest vertex of the body's outline, (%.6g, %.6g) %s; the trailing edge must be a vertex of the body or lie on the short base of a blunt one",
				k.Point.X/scale, k.Point.Y/scale, unit, d/scale, unit, ring[v].X/scale, ring[v].Y/scale, unit)
		}
		te, b.Kutta, b.Angle = ring[v], true, angleAt(ring, v)*180/math.Pi
		b.Base = [2]r2.Vec{te, te}
	}
	b.Chord = chordFrom(te, [][]r2.Vec{ring}, 0)
	if len(sc.Bodies) == 1 && sc.Problem.Chord > 0 {
		b.Chord = chordFrom(te, [][]r2.Vec{ring}, sc.Problem.Chord)
	}
	return b, nil
}

// wholeChord returns the chord line of several bodies: from the most
// downstream trailing edge of the bodies with a Kutta condition (of all
// bodies when none has one) to the farthest point of all the bodies.
func wholeChord(sc *geom.Scene, bodies []Body, dir r2.Vec) Chord {
	best, te := math.Inf(-1), r2.Vec{}
	anyKutta := false
	for _, b := range bodies {
		anyKutta = anyKutta || b.Kutta
	}
	for _, b := range bodies {
		if b.Kutta || !anyKutta {
			if d := r2.Dot(b.Chord.TrailingEdge, dir); d > best {
				best, te = d, b.Chord.TrailingEdge
			}
		}
	}
	var rings [][]r2.Vec
	for i := range sc.Bodies {
		rings = append(rings, outline(&sc.Bodies[i]))
	}
	return chordFrom(te, rings, sc.Problem.Chord)
}

// chordFrom returns the chord line from te to the farthest vertex of the
// rings, of length c (0: that distance).
func chordFrom(te r2.Vec, rings [][]r2.Vec, c float64) Chord {
	far, le := -1.0, te
	for _, r := range rings {
		for _, v := range r {
			if d := r2.Norm(r2.Sub(v, te)); d > far {
				far, le = d, v
			}
		}
	}
	return chordLine(le, te, c)
}

// chordLine returns the chord line from le to te of length c (0: their
// distance).
func chordLine(le, te r2.Vec, c float64) Chord {
	if c == 0 {
		c = r2.Norm(r2.Sub(te, le))
	}
	e := r2.Unit(r2.Sub(te, le))
	return Chord{LeadingEdge: le, TrailingEdge: te, Length: c, QuarterChord: r2.Add(le, r2.Scale(c/4, e))}
}

// diameter returns the two vertices of the ring farthest apart; of pairs
// equally far apart (to 1e-9, as on a polygon standing for a circle), the
// one most nearly along dir. The candidates are the antipodal pairs of the
// convex hull (Shamos, Computational Geometry, 1978 [from memory]).
func diameter(ring []r2.Vec, dir r2.Vec) (r2.Vec, r2.Vec) {
	h := convexHull(ring)
	if len(h) < 3 {
		return h[0], h[len(h)-1]
	}
	best, bp, bq := -1.0, h[0], h[1]
	try := func(p, q r2.Vec) {
		d := r2.Sub(q, p)
		l := r2.Norm(d)
		if l == 0 {
			return
		}
		score := l * (1 + 1e-9*math.Abs(r2.Dot(d, dir))/l)
		if score > best {
			best, bp, bq = score, p, q
		}
	}
	n := len(h)
	area := func(a, b, c r2.Vec) float64 { return math.Abs(r2.Cross(r2.Sub(b, a), r2.Sub(c, a))) }
	j := 1
	for i := range n {
		ni := (i + 1) % n
		for area(h[i], h[ni], h[(j+1)%n]) > area(h[i], h[ni], h[j]) {
			j = (j + 1) % n
		}
		for _, k := range [2]int{j, (j + 1) % n} {
			try(h[i], h[k])
			try(h[ni], h[k])
		}
	}
	return bp, bq
}

// convexHull returns the convex hull of the points, counter-clockwise,
// without collinear points (Andrew's monotone chain).
func convexHull(pts []r2.Vec) []r2.Vec {
	p := append([]r2.Vec(nil), pts...)
	slices.SortFunc(p, func(a, b r2.Vec) int {
		if c := cmp.Compare(a.X, b.X); c != 0 {
			return c
		}
		return cmp.Compare(a.Y, b.Y)
	})
	p = slices.Compact(p)
	if len(p) < 3 {
		return p
	}
	cross := func(o, a, b r2.Vec) float64 { return r2.Cross(r2.Sub(a, o), r2.Sub(b, o)) }
	h := make([]r2.Vec, 0, 2*len(p))
	for _, v := range p {
		for len(h) >= 2 && cross(h[len(h)-2], h[len(h)-1], v) <= 0 {
			h = h[:len(h)-1]
		}
		h = append(h, v)
	}
	lower := len(h) + 1
	for i := len(p) - 2; i >= 0; i-- {
		v := p[i]
		for len(h) >= lower && cross(h[len(h)-2], h[len(h)-1], v) <= 0 {
			h = h[:len(h)-1]
		}
		h = append(h, v)
	}
	return h[:len(h)-1]
}

// angleAt returns the body-side angle at vertex v of a counter-clockwise
// ring (material on the left), in radians in (0, 2 pi).
func angleAt(ring []r2.Vec, v int) float64 {
	n := len(ring)
	a, p, b := ring[(v+n-1)%n], ring[v], ring[(v+1)%n]
	d1, d2 := r2.Sub(p, a), r2.Sub(b, p)
	turn := math.Atan2(r2.Cross(d1, d2), r2.Dot(d1, d2))
	return math.Pi - turn
}

// sharpest returns the vertex with the smallest body-side angle and that
// angle; of equally sharp ones, the one farthest along dir.
func sharpest(ring []r2.Vec, dir r2.Vec) (int, float64) {
	best, angle := -1, math.Inf(1)
	for v := range ring {
		a := angleAt(ring, v)
		switch {
		case a < angle-tieTol:
			best, angle = v, a
		case a <= angle+tieTol && r2.Dot(ring[v], dir) > r2.Dot(ring[best], dir):
			best, angle = v, math.Min(a, angle)
		}
	}
	return best, angle
}

// MaxBase is the longest base of a blunt trailing edge, as a fraction of
// the body's bounding-box diagonal: an open NACA trailing edge is 0.25 %
// of the chord, a plate's end its thickness; a square's side is no base.
const MaxBase = 0.05

// isBase reports whether the ring's edge from vertex e to e+1 (counter-
// clockwise) can be the base of a blunt trailing edge: short, between two
// convex corners sharper than 170 degrees (the vertices of a polygon
// standing for a curve are no corners).
func isBase(ring []r2.Vec, e int, diag float64) bool {
	n := len(ring)
	f := (e + 1) % n
	const corner = math.Pi - 10*math.Pi/180
	return r2.Norm(r2.Sub(ring[f], ring[e])) <= MaxBase*diag && angleAt(ring, e) < corner && angleAt(ring, f) < corner
}

// bluntest returns the base (its first vertex, counter-clockwise) whose
// two corners are together the sharpest, and their angle less pi (the
// angle between the surfaces meeting the base), or -1; of equally sharp
// ones, the one farthest along dir.
func bluntest(ring []r2.Vec, dir r2.Vec) (int, float64) {
	lo, hi := bounds(ring)
	diag := r2.Norm(r2.Sub(hi, lo))
	n := len(ring)
	best, angle := -1, math.Inf(1)
	for e := range ring {
		if !isBase(ring, e, diag) {
			continue
		}
		f := (e + 1) % n
		a := angleAt(ring, e) + angleAt(ring, f) - math.Pi
		mid := r2.Dot(r2.Add(ring[e], ring[f]), dir)
		switch {
		case a < angle-tieTol:
			best, angle = e, a
		case a <= angle+tieTol && mid > r2.Dot(r2.Add(ring[best], ring[(best+1)%n]), dir):
			best, angle = e, math.Min(a, angle)
		}
	}
	return best, angle
}

// baseAt returns the base of a blunt trailing edge within tol of p, or -1.
func baseAt(ring []r2.Vec, p r2.Vec, tol float64) int {
	lo, hi := bounds(ring)
	diag := r2.Norm(r2.Sub(hi, lo))
	n := len(ring)
	for e := range ring {
		if !isBase(ring, e, diag) {
			continue
		}
		a, b := ring[e], ring[(e+1)%n]
		d := r2.Sub(b, a)
		t := math.Max(0, math.Min(1, r2.Dot(r2.Sub(p, a), d)/r2.Norm2(d)))
		if r2.Norm(r2.Sub(p, r2.Add(a, r2.Scale(t, d)))) <= tol {
			return e
		}
	}
	return -1
}

// nearest returns the index of the vertex nearest to p.
func nearest(ring []r2.Vec, p r2.Vec) int {
	best, at := math.Inf(1), 0
	for i, v := range ring {
		if d := r2.Norm(r2.Sub(v, p)); d < best {
			best, at = d, i
		}
	}
	return at
}

func bounds(ring []r2.Vec) (lo, hi r2.Vec) {
	lo = r2.Vec{X: math.Inf(1), Y: math.Inf(1)}
	hi = r2.Vec{X: math.Inf(-1), Y: math.Inf(-1)}
	for _, v := range ring {
		lo.X, lo.Y = math.Min(lo.X, v.X), math.Min(lo.Y, v.Y)
		hi.X, hi.Y = math.Max(hi.X, v.X), math.Max(hi.Y, v.Y)
	}
	return lo, hi
}
