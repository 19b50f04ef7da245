package template

import (
	"errors"
	"math"
	"math/cmplx"
	"strconv"
	"strings"

	"github.com/rimfield/rimfield/geom"
	"gonum.org/v1/gonum/spatial/r2"
)

// Section templates: flow scenes of one or two bodies in a uniform stream,
// each body with its Kutta condition where it has a trailing edge.
//
// Every section is drawn with its chord line along the x axis, the leading
// edge at the origin and the trailing edge at x = chord (the
// Joukowski-type sections: the leading edge, their farthest point from the
// trailing edge, at the origin and the mapping's axis along x), so that the
// stream angle is the angle of attack. Over a ground plane the stream must
// run along the plane: the section is then pitched nose-up by the angle of
// attack about its quarter-chord point instead.

// DefaultSectionPoints is the number of points per surface of a NACA
// section (cosine spacing) when a template does not say; the Joukowski,
// Karman-Trefftz and ellipse outlines get twice as many vertices.
const DefaultSectionPoints = 256

// minSectionPoints is the fewest points per surface accepted.
const minSectionPoints = 16

// Flow holds the settings every section template shares.
type Flow struct {
	Unit string // coordinate unit of the scene file; "" means mm
	// Speed is the stream speed in m/s; 0 means 1.
	Speed float64
	// AngleDeg is the angle of attack in degrees: the stream's angle to
	// the chord line, anticlockwise (positive lifts a section drawn with
	// its leading edge on the left).
	AngleDeg float64
	// Density is the fluid density in kg/m^3; 0 leaves it to the scene
	// default (1.225, air at sea level).
	Density float64
	// GroundHeight is the height of the quarter-chord point above a
	// ground plane (a slip wall) in Unit; 0 means no ground plane. With
	// one, the stream runs along the plane and the section is pitched by
	// AngleDeg.
	GroundHeight float64
}

// flowProblem is the problem member of a flow scene as written.
type flowProblem struct {
	Physics string     `json:"physics"`
	Unit    string     `json:"unit"`
	Stream  flowStream `json:"stream"`
	Density float64    `json:"density,omitempty"`
	Ground  *ground    `json:"ground,omitempty"`
}

type flowStream struct {
	Speed    float64 `json:"speed"`
	AngleDeg float64 `json:"angle_deg"`
}

type flowFeature struct {
	Type       string    `json:"type"`
	Properties flowProps `json:"properties"`
	Geometry   geometry  `json:"geometry"`
}

type flowProps struct {
	Part  string `json:"part"`
	Name  string `json:"name"`
	Kutta any    `json:"kutta,omitempty"` // true or a point
}

// section is one body's outline in scene units with its Kutta setting.
type section struct {
	name  string
	ring  []r2.Vec // counter-clockwise, without the closing vertex
	kutta any      // nil, true or a point
	// le and te are the ends of its chord line.
	le, te r2.Vec
}

// resolveFlow fills in the defaults and checks the shared settings.
func (f *Flow) resolve(name string) error {
	if f.Unit == "" {
		f.Unit = DefaultUnit
	}
	if f.Speed == 0 {
		f.Speed = 1
	}
	if !(f.Speed > 0) || math.IsInf(f.Speed, 0) {
		return errorf(name, "Speed", "the stream speed must be a positive number of m/s, got %g", f.Speed)
	}
	if math.IsNaN(f.AngleDeg) || math.Abs(f.AngleDeg) > 90 {
		return errorf(name, "AngleDeg", "the angle of attack must lie within -90 and 90 degrees, got %g", f.AngleDeg)
	}
	if !(f.Density >= 0) || math.IsInf(f.Density, 0) {
		return errorf(name, "Density", "the density must be a positive number of kg/m^3 (0 for the default 1.225), got %g", f.Density)
	}
	if !(f.GroundHeight >= 0) || math.IsInf(f.GroundHeight, 0) {
		return errorf(name, "GroundHeight", "the height above the ground plane must be a positive length in %s (0 for none), got %g", f.Unit, f.GroundHeight)
	}
	return nil
}

// encodeFlow places the sections in the stream (or pitches them over the
// ground plane), writes the scene and reads it back.
func encodeFlow(name string, f Flow, secs []section) ([]byte, error) {
	if err := f.resolve(name); err != nil {
		return nil, err
	}
	prob := flowProblem{Physics: geom.Flow.String(), Unit: f.Unit, Stream: flowStream{Speed: f.Speed, AngleDeg: f.AngleDeg}, Density: f.Density}
	if f.GroundHeight > 0 {
		// Pitch nose-up (clockwise) by the angle of attack about the
		// first section's quarter-chord point.
		qc := r2.Add(secs[0].le, r2.Scale(0.25, r2.Sub(secs[0].te, secs[0].le)))
		s, c := math.Sincos(-f.AngleDeg * math.Pi / 180)
		rot := func(v r2.Vec) r2.Vec {
			d := r2.Sub(v, qc)
			return r2.Add(qc, r2.Vec{X: c*d.X - s*d.Y, Y: s*d.X + c*d.Y})
		}
		low := math.Inf(1)
		for i := range secs {
			for k, v := range secs[i].ring {
				secs[i].ring[k] = rot(v)
				low = math.Min(low, secs[i].ring[k].Y)
			}
			if p, ok := secs[i].kutta.(point); ok {
				q := rot(r2.Vec{X: float64(p[0]), Y: float64(p[1])})
				secs[i].kutta = point{coord(q.X), coord(q.Y)}
			}
		}
		y0 := qc.Y - f.GroundHeight
		if low <= y0 {
			return nil, errorf(name, "GroundHeight", "the section reaches down to %.4g %s below its quarter-chord point, and the ground plane is %g %s below it; raise GroundHeight",
				qc.Y-low, f.Unit, f.GroundHeight, f.Unit)
		}
		prob.Ground = &ground{Y: coord(y0)}
		prob.Stream.AngleDeg = 0
	}
	features := make([]any, len(secs))
	for i, s := range secs {
		ring := make([]point, len(s.ring)+1)
		for k, v := range s.ring {
			ring[k] = point{coord(v.X), coord(v.Y)}
		}
		ring[len(s.ring)] = ring[0]
		features[i] = flowFeature{"Feature", flowProps{Part: "body", Name: s.name, Kutta: s.kutta}, geometry{Type: "Polygon", Rings: [][]point{ring}}}
	}
	return writeScene(name, prob, features)
}

// NACA4 is a NACA 4-digit section from the published equations (Abbott &
// von Doenhoff, Theory of Wing Sections, 1959, sec. 6.4): the thickness
//
//	y_t = 5 t (0.2969 sqrt(x) - 0.1260 x - 0.3516 x^2 + 0.2843 x^3 - 0.1015 x^4)
//
// (-0.1036 x^4 with ClosedTE, which closes the trailing edge to a point)
// laid perpendicular to the camber line y_c = m/p^2 (2 p x - x^2) ahead of
// x = p and m/(1-p)^2 (1 - 2p + 2 p x - x^2) behind it, x in chords, with
// points at cosine spacing x = (1 - cos beta)/2, beta evenly spaced: close
// together at the leading and trailing edges. Code "MPTT" gives the
// maximum camber m = M/100, its position p = P/10 and the thickness
// t = TT/100 (all in chords). Both trailing edges carry "kutta": true: the
// closed one is a sharp vertex, the open one a short base (0.25 % of the
// chord at 12 % thickness), a blunt trailing edge across which the flow
// leaves with equal speeds on both surfaces.
type NACA4 struct {
	Flow
	Code     string  // four digits, "0012", "2412"
	Chord    float64 // in Unit
	Points   int     // points per surface; 0 means DefaultSectionPoints
	ClosedTE bool    // close the trailing edge (-0.1036 instead of -0.1015)
}

// Bytes returns the scene file.
func (n NACA4) Bytes() ([]byte, error) {
	const name = "naca4"
	s, err := n.section(name, "section")
	if err != nil {
		return nil, err
	}
	return encodeFlow(name, n.Flow, []section{s})
}

// nacaCode decodes a 4-digit code.
func nacaCode(name, param, code string) (m, p, t float64, err error) {
	c := strings.TrimSpace(code)
	if len(c) != 4 || strings.Trim(c, "0123456789") != "" {
		return 0, 0, 0, errorf(name, param, "a NACA 4-digit code is four digits such as \"2412\" or \"0012\", got %q", code)
	}
	d := func(s string) float64 { v, _ := strconv.Atoi(s); return float64(v) }
	m, p, t = d(c[0:1])/100, d(c[1:2])/10, d(c[2:4])/100
	if t == 0 {
		return 0, 0, 0, errorf(name, param, "the section %q has zero thickness; the last two digits are the thickness in per cent of the chord", code)
	}
	if (m == 0) != (p == 0) {
		return 0, 0, 0, errorf(name, param, "the section %q has camber without a position (or a position without camber); a symmetric section is \"00TT\"", code)
	}
	return m, p, t, nil
}

// section returns the outline, leading edge at the origin.
func (n NACA4) section(name, body string) (section, error) {
	if err := positive(name, orDefault(n.Unit), quantity{"Chord", "chord", n.Chord}); err != nil {
		return section{}, err
	}
	pts, err := sectionPoints(name, n.Points)
	if err != nil {
		return section{}, err
	}
	m, p, t, err := nacaCode(name, "Code", n.Code)
	if err != nil {
		return section{}, err
	}
	a4 := -0.1015
	if n.ClosedTE {
		a4 = -0.1036
	}
	thick := func(x float64) float64 {
		return 5 * t * (0.2969*math.Sqrt(x) - 0.1260*x - 0.3516*x*x + 0.2843*x*x*x + a4*x*x*x*x)
	}
	camber := func(x float64) (yc, slope float64) {
		switch {
		case m == 0:
			return 0, 0
		case x < p:
			return m / (p * p) * (2*p*x - x*x), 2 * m / (p * p) * (p - x)
		}
		q := (1 - p) * (1 - p)
		return m / q * (1 - 2*p + 2*p*x - x*x), 2 * m / q * (p - x)
	}
	c := n.Chord
	upper := make([]r2.Vec, pts+1) // from the leading edge (k = 0) to the trailing edge
	lower := make([]r2.Vec, pts+1)
	for k := 0; k <= pts; k++ {
		x := 0.5 * (1 - math.Cos(math.Pi*float64(k)/float64(pts)))
		if k == pts {
			x = 1
		}
		yt := thick(x)
		yc, sl := camber(x)
		sn, cs := math.Sincos(math.Atan(sl))
		upper[k] = r2.Vec{X: c * (x - yt*sn), Y: c * (yc + yt*cs)}
		lower[k] = r2.Vec{X: c * (x + yt*sn), Y: c * (yc - yt*cs)}
	}
	upper[0], lower[0] = r2.Vec{}, r2.Vec{}
	s := section{name: body, le: r2.Vec{}, te: r2.Vec{X: c}}
	// Counter-clockwise: the upper surface from the trailing edge to the
	// leading edge, then the lower surface back.
	if n.ClosedTE {
		upper[pts], lower[pts] = r2.Vec{X: c}, r2.Vec{X: c}
		for k := pts; k >= 1; k-- {
			s.ring = append(s.ring, upper[k])
		}
		for k := 0; k < pts; k++ {
			s.ring = append(s.ring, lower[k])
		}
		s.kutta = true
		return s, nil
	}
	// The open trailing edge is a short base from the lower surface's
	// last point to the upper's: a blunt trailing edge, which "kutta":
	// true finds.
	for k := pts; k >= 1; k-- {
		s.ring = append(s.ring, upper[k])
	}
	for k := 0; k <= pts; k++ {
		s.ring = append(s.ring, lower[k])
	}
	s.kutta = true
	s.te = r2.Scale(0.5, r2.Add(upper[pts], lower[pts]))
	return s, nil
}

func orDefault(unit string) string {
	if unit == "" {
		return DefaultUnit
	}
	return unit
}

// sectionPoints resolves a points-per-surface count.
func sectionPoints(name string, n int) (int, error) {
	if n == 0 {
		return DefaultSectionPoints, nil
	}
	if n < minSectionPoints {
		return 0, errorf(name, "Points", "%d points per surface are too few: a section needs at least %d (%d recommended)", n, minSectionPoints, DefaultSectionPoints)
	}
	return n, nil
}

// Joukowski is the section that Joukowski's map z = zeta + 1/zeta makes
// of a circle in the zeta plane through zeta = 1 (the cusped trailing
// edge) with its centre at (CentreX, CentreY): CentreX < 0 gives
// thickness, CentreY camber (Joukowski, Z. Flugtech. Motorluftschiff. 1,
// 1910; Milne-Thomson, Theoretical Aerodynamics, 1958, ch. 7 [from
// memory]). The flow about it is known exactly, so it is a reference for
// checks: Gamma = 4 pi U R sin(alpha + beta), R the circle's radius and
// beta = -arg(1 - centre), in the map's units. The outline's vertices are
// the images of 2 Points equally spaced circle points, scaled so that the
// chord (trailing edge to farthest vertex) is Chord.
type Joukowski struct {
	Flow
	CentreX, CentreY float64 // circle centre in the map's units (e.g. -0.1, 0.1)
	Chord            float64 // in Unit
	Points           int     // half the vertex count; 0 means DefaultSectionPoints
}

// Bytes returns the scene file.
func (j Joukowski) Bytes() ([]byte, error) {
	const name = "joukowski"
	s, err := mappedSection(name, 0, j.CentreX, j.CentreY, j.Chord, j.Points, orDefault(j.Unit))
	if err != nil {
		return nil, err
	}
	return encodeFlow(name, j.Flow, []section{s})
}

// KarmanTrefftz is the section that the Karman-Trefftz map
//
//	z = k ((zeta+1)^k + (zeta-1)^k) / ((zeta+1)^k - (zeta-1)^k),  k = 2 - tau/pi,
//
// makes of the circle through zeta = 1 about (CentreX, CentreY): a
// Joukowski-like section with a trailing edge of finite angle tau (von
// Karman & Trefftz, Z. Flugtech. Motorluftschiff. 9, 1918 [from memory]).
// Its circulation under the Kutta condition is the circle's, as for
// Joukowski's section. Vertices and scaling as for Joukowski.
type KarmanTrefftz struct {
	Flow
	CentreX, CentreY  float64 // circle centre in the map's units
	TrailingEdgeAngle float64 // tau in degrees, in (0, 90)
	Chord             float64 // in Unit
	Points            int     // half the vertex count; 0 means DefaultSectionPoints
}

// Bytes returns the scene file.
func (k KarmanTrefftz) Bytes() ([]byte, error) {
	const name = "karman-trefftz"
	if !(k.TrailingEdgeAngle > 0 && k.TrailingEdgeAngle < 90) {
		return nil, errorf(name, "TrailingEdgeAngle", "the trailing-edge angle must lie between 0 and 90 degrees, got %g (0 is Joukowski's section)", k.TrailingEdgeAngle)
	}
	s, err := mappedSection(name, k.TrailingEdgeAngle, k.CentreX, k.CentreY, k.Chord, k.Points, orDefault(k.Unit))
	if err != nil {
		return nil, err
	}
	return encodeFlow(name, k.Flow, []section{s})
}

// MappedOutline returns the Karman-Trefftz outline (tau = 0: Joukowski's)
// of the circle through zeta = 1 about centre: n vertices, the images of
// equally spaced circle points starting at the trailing edge, in the
// map's units (trailing edge at z = 2 - tau/pi on the x axis), counter-
// clockwise. It is what the Joukowski and KarmanTrefftz templates scale
// and shift, and what checks compare with.
func MappedOutline(tauDeg float64, centre complex128, n int) []r2.Vec {
	k := 2 - tauDeg/180
	R := cmplx.Abs(1 - centre)
	t0 := cmplx.Phase(1 - centre)
	out := make([]r2.Vec, n)
	out[0] = r2.Vec{X: k}
	for i := 1; i < n; i++ {
		zeta := centre + complex(R, 0)*cmplx.Exp(complex(0, t0+2*math.Pi*float64(i)/float64(n)))
		wk := cmplx.Pow((zeta-1)/(zeta+1), complex(k, 0))
		z := complex(k, 0) * (1 + wk) / (1 - wk)
		out[i] = r2.Vec{X: real(z), Y: imag(z)}
	}
	return out
}

// mappedSection scales and shifts a mapped outline to the chord, leading
// edge (its farthest vertex from the trailing edge) at the origin.
func mappedSection(name string, tau, cx, cy, chord float64, points int, unit string) (section, error) {
	if err := positive(name, unit, quantity{"Chord", "chord", chord}); err != nil {
		return section{}, err
	}
	pts, err := sectionPoints(name, points)
	if err != nil {
		return section{}, err
	}
	if math.IsNaN(cx) || math.IsNaN(cy) || math.IsInf(cx, 0) || math.IsInf(cy, 0) {
		return section{}, errorf(name, "CentreX", "the circle centre must be finite, got (%g, %g)", cx, cy)
	}
	// The circle through zeta = 1 must enclose zeta = -1 (the other
	// critical point of the map), else the outline is no section: that is
	// CentreX < 0, and then it encloses the whole segment [-1, 1].
	if !(cx < 0) || cx <= -0.5 {
		return section{}, errorf(name, "CentreX", "the circle centre (%g, %g) gives no section: CentreX must lie between -0.5 and 0 (about -0.1 for a thickness near 12 %%)", cx, cy)
	}
	if math.Abs(cy) >= 0.5 {
		return section{}, errorf(name, "CentreY", "the circle centre's height %g gives no useful section: keep |CentreY| below 0.5 (about 0.1 for a camber near 5 %%)", cy)
	}
	ring := MappedOutline(tau, complex(cx, cy), 2*pts)
	te := ring[0]
	far, le := 0.0, te
	for _, v := range ring {
		if d := r2.Norm(r2.Sub(v, te)); d > far {
			far, le = d, v
		}
	}
	s := chord / far
	for i, v := range ring {
		ring[i] = r2.Scale(s, r2.Sub(v, le))
	}
	return section{name: "section", ring: ring, kutta: true, le: r2.Vec{}, te: ring[0]}, nil
}

// Circle is a circular cylinder of radius Radius about the origin: no
// circulation (none is fixed without a trailing edge), or with Kutta the
// rear stagnation point held at (Radius, 0), which gives the circulation
// 4 pi U R sin(alpha) (the Kutta condition at a smooth point).
type Circle struct {
	Flow
	Radius float64 // in Unit
	Sides  int     // vertices; 0 means DefaultSides
	Kutta  bool
}

// Bytes returns the scene file.
func (c Circle) Bytes() ([]byte, error) {
	const name = "circle"
	return Ellipse{Flow: c.Flow, SemiX: c.Radius, SemiY: c.Radius, Points: c.Sides, Kutta: c.Kutta}.bytes(name, "Radius", "Sides")
}

// Ellipse is an elliptic cylinder of semi-axes SemiX (along the stream at
// zero incidence) and SemiY about the origin, vertices at equal steps of
// the eccentric angle (x = a cos eta, y = b sin eta, a vertex at eta = 0).
// Kutta holds the rear stagnation point at (SemiX, 0): circulation
// 2 pi U (a + b) sin(alpha).
type Ellipse struct {
	Flow
	SemiX, SemiY float64 // in Unit
	Points       int     // vertices; 0 means DefaultSides
	Kutta        bool
}

// Bytes returns the scene file.
func (e Ellipse) Bytes() ([]byte, error) { return e.bytes("ellipse", "SemiX", "Points") }

func (e Ellipse) bytes(name, lenParam, ptsParam string) ([]byte, error) {
	unit := orDefault(e.Unit)
	if err := positive(name, unit, quantity{lenParam, "semi-axis", e.SemiX}, quantity{"SemiY", "semi-axis", e.SemiY}); err != nil {
		return nil, err
	}
	n := e.Points
	if n == 0 {
		n = DefaultSides
	}
	if n < minSides {
		return nil, errorf(name, ptsParam, "%d vertices is too few: the outline needs at least %d (%d recommended)", n, minSides, DefaultSides)
	}
	ring := make([]r2.Vec, n)
	for k := range ring {
		s, c := math.Sincos(2 * math.Pi * float64(k) / float64(n))
		if 4*k == n || 4*k == 3*n {
			c = 0
		}
		if 2*k == n {
			s = 0
		}
		ring[k] = r2.Vec{X: e.SemiX * c, Y: e.SemiY * s}
	}
	s := section{name: "body", ring: ring, le: r2.Vec{X: -e.SemiX}, te: r2.Vec{X: e.SemiX}}
	if name == "circle" {
		s.name = "cylinder"
	}
	if e.Kutta {
		s.kutta = point{coord(e.SemiX), 0}
	}
	return encodeFlow(name, e.Flow, []section{s})
}

// TwoElement is a main section with a slotted flap behind it, both NACA
// 4-digit sections with closed trailing edges, each with its own Kutta
// condition. The main element lies along the x axis from the origin to
// Chord. The flap, of chord FlapChord, is deflected trailing edge down by
// Deflection degrees about its own leading edge, which sits Overlap ahead
// of the main element's trailing edge (x = Chord - Overlap) and Gap below
// it. Gap and Overlap here place the flap's nose; the narrowest slot
// between the elements is smaller than Gap where the flap tucks under the
// main element.
type TwoElement struct {
	Flow
	Main, Flap string  // NACA 4-digit codes of the main element and the flap
	Chord      float64 // main element's chord, in Unit
	FlapChord  float64 // in Unit
	Gap        float64 // vertical offset of the flap's nose below the main trailing edge, in Unit
	Overlap    float64 // how far the flap's nose lies ahead of the main trailing edge, in Unit (negative: behind it)
	Deflection float64 // flap deflection in degrees, trailing edge down
	Points     int     // points per surface of each element; 0 means DefaultSectionPoints
}

// Bytes returns the scene file.
func (t TwoElement) Bytes() ([]byte, error) {
	const name = "two-element"
	unit := orDefault(t.Unit)
	if err := positive(name, unit, quantity{"Chord", "main chord", t.Chord}, quantity{"FlapChord", "flap chord", t.FlapChord}); err != nil {
		return nil, err
	}
	if !(t.Gap > 0) || math.IsInf(t.Gap, 0) {
		return nil, errorf(name, "Gap", "the gap must be a positive length in %s (the flap's nose below the main trailing edge), got %g", unit, t.Gap)
	}
	if math.IsNaN(t.Overlap) || math.Abs(t.Overlap) >= t.Chord {
		return nil, errorf(name, "Overlap", "the overlap must be a length in %s smaller than the main chord, got %g", unit, t.Overlap)
	}
	if math.IsNaN(t.Deflection) || t.Deflection <= -45 || t.Deflection >= 75 {
		return nil, errorf(name, "Deflection", "the flap deflection must lie between -45 and 75 degrees, got %g", t.Deflection)
	}
	main, err := NACA4{Flow: t.Flow, Code: t.Main, Chord: t.Chord, Points: t.Points, ClosedTE: true}.section(name, "main")
	if err != nil {
		var te *Error
		if errors.As(err, &te) && te.Param == "Code" {
			te.Param = "Main"
		}
		return nil, err
	}
	flap, err := NACA4{Flow: t.Flow, Code: t.Flap, Chord: t.FlapChord, Points: t.Points, ClosedTE: true}.section(name, "flap")
	if err != nil {
		var te *Error
		if errors.As(err, &te) {
			switch te.Param {
			case "Code":
				te.Param = "Flap"
			case "Chord":
				te.Param = "FlapChord"
			}
		}
		return nil, err
	}
	nose := r2.Vec{X: t.Chord - t.Overlap, Y: -t.Gap}
	s, c := math.Sincos(-t.Deflection * math.Pi / 180)
	place := func(v r2.Vec) r2.Vec { return r2.Add(nose, r2.Vec{X: c*v.X - s*v.Y, Y: s*v.X + c*v.Y}) }
	for i, v := range flap.ring {
		flap.ring[i] = place(v)
	}
	flap.le, flap.te = place(flap.le), place(flap.te)
	if d := ringDistance(main.ring, flap.ring); d <= 1e-6*t.Chord {
		return nil, errorf(name, "Gap", "the flap (nose %g %s below and %g %s ahead of the main trailing edge, deflected %g degrees) touches or cuts into the main element; make the gap larger or the overlap smaller",
			t.Gap, unit, t.Overlap, unit, t.Deflection)
	}
	return encodeFlow(name, t.Flow, []section{main, flap})
}

// ringDistance returns the least distance between two closed rings, 0 when
// they cross or one holds the other's vertices.
func ringDistance(a, b []r2.Vec) float64 {
	pa, pb := geom.Polygon{geom.Ring(a)}, geom.Polygon{geom.Ring(b)}
	if pa.Contains(b[0]) || pb.Contains(a[0]) {
		return 0
	}
	best := math.Inf(1)
	for i := range a {
		a0, a1 := a[i], a[(i+1)%len(a)]
		for j := range b {
			b0, b1 := b[j], b[(j+1)%len(b)]
			best = math.Min(best, segDistance(a0, a1, b0, b1))
		}
	}
	return best
}

// segDistance returns the distance between segments ab and cd (0 when
// they cross).
func segDistance(a, b, c, d r2.Vec) float64 {
	o := func(p, q, r r2.Vec) float64 { return r2.Cross(r2.Sub(q, p), r2.Sub(r, p)) }
	if o(a, b, c)*o(a, b, d) < 0 && o(c, d, a)*o(c, d, b) < 0 {
		return 0
	}
	pt := func(p, s0, s1 r2.Vec) float64 {
		v := r2.Sub(s1, s0)
		t := 0.0
		if l2 := r2.Norm2(v); l2 > 0 {
			t = math.Max(0, math.Min(1, r2.Dot(r2.Sub(p, s0), v)/l2))
		}
		return r2.Norm(r2.Sub(p, r2.Add(s0, r2.Scale(t, v))))
	}
	return math.Min(math.Min(pt(a, c, d), pt(b, c, d)), math.Min(pt(c, a, b), pt(d, a, b)))
}
