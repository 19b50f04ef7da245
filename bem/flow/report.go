package flow

import (
	"fmt"
	"math"
	"strings"

	"github.com/rimfield/rimfield/bem"
	"github.com/rimfield/rimfield/geom"
	"github.com/rimfield/rimfield/mesh"
	"gonum.org/v1/gonum/spatial/r2"
)

// Options tunes Analyse. The zero value means the defaults.
type Options struct {
	// Settings for the assembly; nil: defaults.
	Settings *bem.Settings
}

// Side tells which surface of a section a panel lies on.
type Side uint8

const (
	Upper Side = iota + 1 // from the leading edge to the trailing edge, walking with the fluid on the left
	Lower                 // from the trailing edge back to the leading edge
	Inner                 // a cavity inside the body (still fluid)
	Base                  // the base of a blunt trailing edge
)

// String names the side for tables and CSV files.
func (s Side) String() string {
	switch s {
	case Upper:
		return "upper"
	case Lower:
		return "lower"
	case Inner:
		return "inner"
	case Base:
		return "base"
	}
	return "invalid"
}

// Coefficients are the integrated results of one body or of the whole.
type Coefficients struct {
	// Circulation Gamma in m^2/s, positive clockwise (the aerodynamic
	// convention), so that a positive Gamma lifts: L' = rho U Gamma.
	// The anticlockwise line integral of the velocity round the body is
	// -Gamma.
	Circulation float64
	// CL is the lift coefficient from Kutta-Joukowski, 2 Gamma / (U c).
	CL float64
	// CLPressure and CD are the lift and drag coefficients of the
	// integrated surface pressure, F.e / (q c), with e across and along
	// the stream and q = rho U^2 / 2.
	CLPressure, CD float64
	// CM is the moment coefficient of the surface pressure about the
	// quarter-chord point, positive nose-up: -M_z / (q c^2) with M_z the
	// anticlockwise moment.
	CM float64
	// Lift is rho U Gamma in N/m.
	Lift float64
	// Force is the integrated surface pressure on the body (bodies) in N/m.
	Force r2.Vec
	// MomentZ is the anticlockwise moment of the surface pressure about
	// the quarter-chord point in N m/m.
	MomentZ float64
}

// BodyResult is one body's results.
type BodyResult struct {
	Body
	Coefficients
	// Stagnation lists the points of the body's outline where the
	// surface velocity changes direction (found between panel midpoints
	// by linear interpolation), in walking order from the leading edge
	// over the upper surface; for a body with a Kutta condition its
	// trailing edge comes last (a stagnation point at a finite angle; at a
	// cusp the flow leaves it at finite speed).
	Stagnation []r2.Vec
}

// PanelResult is the surface flow on one panel, at its midpoint.
type PanelResult struct {
	Body  int     // index into Report.Bodies (-1: none)
	Speed float64 // |v| in m/s
	// Tangential is the velocity along the panel's tangent (from A to B),
	// m/s: the surface velocity is Tangential times the tangent.
	Tangential float64
	// Cp is the pressure coefficient 1 - (|v|/U)^2.
	Cp float64
	// XOverC is the position along the body's chord line from its
	// leading edge, over its chord (0 at the leading edge, 1 at the
	// trailing edge); WholeXOverC the same on the whole's chord line.
	XOverC, WholeXOverC float64
	Side                Side
}

// Report gathers the results of a solved flow scene, in SI units.
type Report struct {
	System   *System
	Solution *bem.Solution
	// Stream is the uniform stream of the solution.
	Stream geom.Stream
	// Density in kg/m^3 and dynamic pressure q = rho U^2 / 2 in Pa.
	Density, Dynamic float64
	Bodies           []BodyResult
	// Whole sums the bodies: circulation, forces and moment about the
	// quarter-chord point of WholeChord, coefficients on its chord.
	Whole      Coefficients
	WholeChord Chord
	// Panels has one entry per panel of Solution.Mesh.
	Panels []PanelResult
	// Warnings, one sentence each, for a person.
	Warnings []string
}

// Analyse assembles the scene sc with its mesh m, solves it for the
// scene's stream and analyses the solution.
func Analyse(sc *geom.Scene, m *mesh.Mesh, o Options) (*Report, error) {
	fs, err := Assemble(sc, m, o.Settings)
	if err != nil {
		return nil, err
	}
	if sc.Problem.Stream == nil {
		return nil, &geom.Error{Feature: -1, Member: "problem.stream", Msg: `missing; add "stream": {"speed": 1, "angle_deg": 0}`}
	}
	sol, err := fs.Solve(*sc.Problem.Stream)
	if err != nil {
		return nil, err
	}
	return fs.Analyse(sol)
}

// StreamOf returns the uniform stream a solution of the system was solved
// for (its incident stream function's gradient).
func StreamOf(sol *bem.Solution) geom.Stream {
	g := sol.Uniform
	// grad psi_inf = U (-sin alpha, cos alpha).
	return geom.Stream{Speed: r2.Norm(g), AngleDeg: math.Atan2(-g.X, g.Y) * 180 / math.Pi}
}

// Analyse computes the surface flow, forces, moments and stagnation points
// of sol, a solution of fs.
func (fs *System) Analyse(sol *bem.Solution) (*Report, error) {
	if sol.Mesh != fs.Mesh {
		panic("flow: Analyse needs a solution of this system")
	}
	st := StreamOf(sol)
	if !(st.Speed > 0) {
		return nil, fmt.Errorf("flow: the solution has no stream")
	}
	rep := &Report{System: fs, Solution: sol, Stream: st, Density: fs.Density}
	U := st.Speed
	rep.Dynamic = 0.5 * fs.Density * U * U
	sn, cs := sincosDeg(st.AngleDeg)
	along, across := r2.Vec{X: cs, Y: sn}, r2.Vec{X: -sn, Y: cs}
	m := fs.Mesh
	owners := sol.Owners()
	rep.Panels = make([]PanelResult, len(m.Panels))
	body := make([]int, len(m.Layout.Owners))
	for i := range body {
		body[i] = -1
	}
	for i, b := range fs.Bodies {
		body[b.Owner] = i
	}
	for j, p := range m.Panels {
		f := sol.F[j]
		rep.Panels[j] = PanelResult{Body: -1, Speed: math.Abs(f), Tangential: -f, Cp: 1 - (f/U)*(f/U)}
		if p.Owner >= 0 {
			rep.Panels[j].Body = body[p.Owner]
		}
	}
	rep.Bodies = make([]BodyResult, len(fs.Bodies))
	var whole Coefficients
	for i, b := range fs.Bodies {
		br := BodyResult{Body: b}
		// The total inflow of the stream function is the anticlockwise
		// circulation.
		gamma := -owners[b.Owner].Inflow
		br.Stagnation = fs.surface(rep, i)
		br.Coefficients = fs.coefficients(rep, b.Chord, gamma, func(j int) bool { return m.Panels[j].Owner == b.Owner }, along, across)
		rep.Bodies[i] = br
		whole.Circulation += gamma
	}
	rep.WholeChord = fs.Whole
	rep.Whole = fs.coefficients(rep, fs.Whole, whole.Circulation, func(int) bool { return true }, along, across)
	e := r2.Unit(r2.Sub(fs.Whole.TrailingEdge, fs.Whole.LeadingEdge))
	for j := range rep.Panels {
		rep.Panels[j].WholeXOverC = r2.Dot(r2.Sub(m.Panels[j].Mid(), fs.Whole.LeadingEdge), e) / fs.Whole.Length
	}
	if w := rep.Whole.CD; math.Abs(w) > DragWarning {
		rep.Warnings = append(rep.Warnings, fs.dragWarning(w))
	}
	if fs.ground != nil {
		rep.Warnings = append(rep.Warnings, "near a ground plane the Kutta-Joukowski lift rho U Gamma is not the force on the bodies (their images pull on them): read the lift from the surface pressure")
	} else if len(fs.Bodies) > 1 {
		rep.Warnings = append(rep.Warnings, "with several bodies, rho U Gamma of one body is not the force on it (the others' flow acts on it too); the totals agree")
	}
	rep.Warnings = append(rep.Warnings, sol.Warnings...)
	return rep, nil
}

// coefficients integrates the surface pressure over the panels in and
// forms the coefficients on chord c with circulation gamma (clockwise).
func (fs *System) coefficients(rep *Report, c Chord, gamma float64, in func(int) bool, along, across r2.Vec) Coefficients {
	m := fs.Mesh
	q := rep.Dynamic
	U := rep.Stream.Speed
	var force r2.Vec
	var mz float64
	for j, p := range m.Panels {
		if !in(j) {
			continue
		}
		// The pressure pushes on the body along the domain's outward
		// normal; the free-stream pressure integrates to zero round a
		// closed outline.
		f := r2.Scale(q*rep.Panels[j].Cp*p.Length(), p.Normal())
		force = r2.Add(force, f)
		mz += r2.Cross(r2.Sub(p.Mid(), c.QuarterChord), f)
	}
	// The suction at the free ends of sheets without a Kutta condition
	// there (sheet.go).
	for i, b := range fs.Bodies {
		sb := &fs.Scene.Bodies[i]
		for _, e := range freeEnds(sb) {
			if b.Kutta && e == b.Chord.TrailingEdge {
				continue
			}
			in1 := false
			for j, p := range m.Panels {
				if p.Owner == b.Owner && in(j) {
					in1 = true
					break
				}
			}
			if !in1 {
				continue
			}
			f, mf := fs.edgeForce(rep, b, sb, e, c.QuarterChord)
			force = r2.Add(force, f)
			mz += mf
		}
	}
	qc := q * c.Length
	return Coefficients{
		Circulation: gamma,
		CL:          2 * gamma / (U * c.Length),
		CLPressure:  r2.Dot(force, across) / qc,
		CD:          r2.Dot(force, along) / qc,
		CM:          -mz / (qc * c.Length),
		Lift:        rep.Density * U * gamma,
		Force:       force,
		MomentZ:     mz,
	}
}

// surface walks body i's outline from its leading edge, marks each
// panel's side and x/c, and returns the stagnation points.
func (fs *System) surface(rep *Report, i int) []r2.Vec {
	b := fs.Bodies[i]
	m := fs.Mesh
	start := map[r2.Vec][]int{}
	for j, p := range m.Panels {
		if p.Owner == b.Owner {
			start[p.A] = append(start[p.A], j)
			rep.Panels[j].Side = Inner
		}
	}
	e := r2.Unit(r2.Sub(b.Chord.TrailingEdge, b.Chord.LeadingEdge))
	for j, p := range m.Panels {
		if p.Owner == b.Owner {
			rep.Panels[j].XOverC = r2.Dot(r2.Sub(p.Mid(), b.Chord.LeadingEdge), e) / b.Chord.Length
		}
	}
	// The first panel from the leading edge: of several (a sheet's end
	// has one, a vertex inside it two), the one with the fluid on the
	// left of the way from the trailing edge.
	if len(start[b.Chord.LeadingEdge]) == 0 {
		return nil
	}
	j0 := start[b.Chord.LeadingEdge][0]
	for _, j := range start[b.Chord.LeadingEdge] {
		if m.TwinOf(j) >= 0 && r2.Dot(m.Panels[j].Tangent(), e) > 0 {
			j0 = j
		}
	}
	var loop []int
	side := Upper
	for j := j0; ; {
		p := m.Panels[j]
		if b.Kutta && p.A == b.Base[1] {
			side = Lower
		}
		loop = append(loop, j)
		rep.Panels[j].Side = side
		if b.Kutta && p.B == b.Base[0] && b.Blunt {
			side = Base
		} else if p.B == b.Chord.TrailingEdge && !b.Blunt {
			side = Lower
		}
		n := nextPanel(m, start, j)
		if n < 0 || n == j0 || len(loop) > len(m.Panels) {
			break
		}
		j = n
	}
	// Sign changes of the velocity along the walk; the trailing edge of a
	// Kutta condition last.
	var stag []r2.Vec
	te := false
	for k, j := range loop {
		n := loop[(k+1)%len(loop)]
		s0, s1 := rep.Panels[j].Tangential, rep.Panels[n].Tangential
		if s0 == 0 || s1 == 0 || (s0 > 0) == (s1 > 0) {
			continue
		}
		pj, pn := m.Panels[j], m.Panels[n]
		if b.Kutta && !b.Blunt && pj.B == b.Chord.TrailingEdge {
			te = true
			continue
		}
		lj, ln := pj.Length(), pn.Length()
		d := s0 / (s0 - s1) * 0.5 * (lj + ln)
		if d <= 0.5*lj {
			stag = append(stag, r2.Add(pj.Mid(), r2.Scale(d, pj.Tangent())))
		} else {
			stag = append(stag, r2.Add(pj.B, r2.Scale(d-0.5*lj, pn.Tangent())))
		}
	}
	if te {
		stag = append(stag, b.Chord.TrailingEdge)
	}
	return stag
}

// Velocity returns the flow velocity (m/s) at p from a solution of a flow
// system: the stream function psi is the solved potential, so v =
// (d psi/dy, -d psi/dx), its contours are the streamlines and |grad psi|
// is the speed. ok is false outside the fluid (inside a body, below the
// ground plane) and on the boundary itself.
func Velocity(sol *bem.Solution, p r2.Vec) (v r2.Vec, ok bool) {
	pt := sol.Eval(p)
	if pt.Region == geom.Outside || math.IsNaN(pt.U) {
		return r2.Vec{X: math.NaN(), Y: math.NaN()}, false
	}
	return r2.Vec{X: pt.Grad.Y, Y: -pt.Grad.X}, true
}

// DragWarning is the size of the whole's pressure drag coefficient (zero
// in theory) above which Analyse warns. The reference sections of the
// tests stay below 4e-5 at the default mesh.
const DragWarning = 1e-3

// dragWarning explains a pressure drag: almost always a sharp convex
// corner other than a Kutta trailing edge, round which the flow turns
// with infinite speed; the suction concentrated there is integrable but
// converges very slowly with the panels (as the smallest panel to the
// power 2 pi/beta - 1, beta the fluid-side opening).
func (fs *System) dragWarning(cd float64) string {
	var at []string
	unit, scale := fs.Scene.Problem.Unit, fs.Scene.Problem.Scale
	if unit == "" || !(scale > 0) {
		unit, scale = "m", 1
	}
	for i, b := range fs.Bodies {
		if fs.Scene.Bodies[i].Sheet() {
			continue // a sheet's free ends carry their suction (sheet.go)
		}
		ring := fs.Scene.Bodies[i].Polygons[0][0]
		for v := range ring {
			if b.Kutta && ring[v] == b.Chord.TrailingEdge {
				continue
			}
			if a := angleAt(ring, v); a < math.Pi-10*math.Pi/180 && len(at) < 3 {
				at = append(at, fmt.Sprintf("%q at (%.4g, %.4g) %s", b.Name, ring[v].X/scale, ring[v].Y/scale, unit))
			}
		}
	}
	msg := fmt.Sprintf("the pressure drag coefficient is %.3g, where ideal flow has none: the surface pressure is integrated poorly", cd)
	if len(at) == 0 {
		return msg + "; raise the panel count and compare; the Kutta-Joukowski lift is the better one"
	}
	return msg + " near sharp corners that are not trailing edges (" + strings.Join(at, ", ") + "), where the flow turns with infinite speed; the pressure lift and drag carry an error of that size, the Kutta-Joukowski lift does not; rounding those corners removes it"
}
