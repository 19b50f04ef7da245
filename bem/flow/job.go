package flow

// This file is the ideal-flow job of the command line (package job's
// interface): it solves a scene with Assemble and Solve, analyses it, and
// presents the results in the words of aerodynamics (present.go).

import (
	"fmt"
	"math"
	"strconv"
	"strings"

	"github.com/rimfield/rimfield/bem/draw"
	"github.com/rimfield/rimfield/bem/job"
	"github.com/rimfield/rimfield/geom"
	"gonum.org/v1/gonum/spatial/r2"
)

// Job is the ideal-flow job: surface pressure, lift with the Kutta
// condition, moments, several bodies and incidence sweeps.
type Job struct {
	// Sweep is the incidence sweep asked for (--sweep), FROM:TO:STEP in
	// degrees of the stream's angle; "" for none.
	Sweep string
}

// NewJob returns the flow job with its defaults.
func NewJob() job.Job { return &Job{} }

var flowUnits = job.Units{Potential: "m^2/s", InflowDensity: "m/s", Inflow: "m^2/s", Conductivity: "1", Length: "m",
	PotentialCSV: "m2_per_s", DensityCSV: "m_per_s"}

var flowWords = job.Words{
	Units:         flowUnits,
	Potential:     "stream function ψ",
	Field:         "speed |v|",
	FieldUnit:     "m/s",
	Inflow:        "anticlockwise circulation",
	InflowDensity: "surface velocity dψ/dn",
	InflowNote:    "Anticlockwise circulation: the line integral of the velocity round the body (the flux of the stream function through the surface); the circulation Γ of the results, positive clockwise (lifting), is its negative.",
	Conductivity:  "conductivity",
	Material:      func(geom.Material) string { return "fluid" },
	Condition:     func(geom.Condition) string { return "wall (a streamline)" },
	FluxLines:     "equipotentials of the velocity potential",
	Contours:      "streamlines",
	Ground:        "slip wall (ground)",
	Unoriented:    true,
	// The streamlines over the speed: how a flow is read.
	ContoursOnField: true,
}

// Words returns the words of aerodynamics: stream function, speed,
// circulation, streamlines and equipotentials.
func (*Job) Words() *job.Words { return &flowWords }

// Options returns --sweep.
func (j *Job) Options() []job.Option {
	return []job.Option{{
		Name:  "sweep",
		Usage: "flow: incidence sweep over stream angles `FROM:TO:STEP` in degrees (e.g. -4:12:2), on the scene's one factorisation; writes sweep.csv and sweep.png and results.json flow.sweep (not over a ground plane)",
		Value: &j.Sweep,
	}}
}

// sweepAngles parses --sweep: FROM:TO:STEP in degrees, at most 721 angles.
func sweepAngles(s string) ([]float64, error) {
	if s == "" {
		return nil, nil
	}
	bad := fmt.Errorf("--sweep %q: give FROM:TO:STEP in degrees with STEP > 0 and FROM <= TO, e.g. -4:12:2", s)
	parts := strings.Split(s, ":")
	if len(parts) != 3 {
		return nil, bad
	}
	var v [3]float64
	for i, p := range parts {
		x, err := strconv.ParseFloat(strings.TrimSpace(p), 64)
		if err != nil || math.IsNaN(x) || math.IsInf(x, 0) {
			return nil, bad
		}
		v[i] = x
	}
	from, to, step := v[0], v[1], v[2]
	if !(step > 0) || from > to {
		return nil, bad
	}
	n := int(math.Floor((to-from)/step+1e-9)) + 1
	if n > 721 {
		return nil, fmt.Errorf("--sweep %q gives %d angles; at most 721 (a step of 0.5 degrees over a full turn)", s, n)
	}
	out := make([]float64, n)
	for i := range out {
		out[i] = from + float64(i)*step
	}
	return out, nil
}

// Check lists the stream, the density, the ground plane and each body's
// trailing edge and chord, and refuses what the formulation does not take.
func (j *Job) Check(s *job.Setup) (*job.Checked, error) {
	c := &job.Checked{}
	if _, err := sweepAngles(j.Sweep); err != nil {
		c.Refusal = err
	}
	sc := s.Scene
	p := sc.Problem
	density := p.Density
	if !(density > 0) {
		density = DefaultDensity
	}
	if st := p.Stream; st != nil {
		c.Lines = append(c.Lines, fmt.Sprintf("stream %g m/s at %g degrees (anticlockwise from x), density %g kg/m^3", st.Speed, st.AngleDeg, density))
	}
	if g := p.Ground; g != nil {
		c.Lines = append(c.Lines, fmt.Sprintf("slip wall (ground) y = %s, by images", sceneLength(sc, g.Y)))
	}
	bodies, whole, err := Inspect(sc, s.Mesh)
	c.Cautions = cautions(s, trailingEdges(bodies))
	if err != nil {
		c.Refusal = err
		return c, nil
	}
	for _, b := range bodies {
		if b.Kutta {
			edge := fmt.Sprintf("a sharp trailing edge of %.3g degrees", b.Angle)
			if sc.Bodies[bodyIndex(sc, b)].Sheet() {
				edge = "the sheet's free end"
			}
			if b.Blunt {
				edge = fmt.Sprintf("a blunt trailing edge (base %s long)", sceneLength(sc, math.Hypot(b.Base[1].X-b.Base[0].X, b.Base[1].Y-b.Base[0].Y)))
			}
			c.Lines = append(c.Lines, fmt.Sprintf("body %q: Kutta condition at %s, %s; chord %s", b.Name,
				job.Where(sc, b.Chord.TrailingEdge), edge, sceneLength(sc, b.Chord.Length)))
			continue
		}
		c.Lines = append(c.Lines, fmt.Sprintf("body %q: no circulation (no kutta); reference length %s", b.Name, sceneLength(sc, b.Chord.Length)))
	}
	if len(bodies) > 1 {
		c.Lines = append(c.Lines, fmt.Sprintf("whole: chord %s from %s to %s", sceneLength(sc, whole.Length), job.Where(sc, whole.LeadingEdge), job.Where(sc, whole.TrailingEdge)))
	}
	return c, nil
}

// sceneLength writes a length given in metres in the scene's unit.
func sceneLength(sc *geom.Scene, l float64) string {
	unit, s := job.SceneUnit(sc)
	return job.FormatNumber(l/s) + " " + unit
}

// trailingEdges returns the points of the bodies' Kutta conditions, where
// the speed stays finite however sharp the edge.
func trailingEdges(bodies []Body) []r2.Vec {
	var out []r2.Vec
	for _, b := range bodies {
		if b.Kutta {
			out = append(out, b.Base[0], b.Base[1])
		}
	}
	return out
}

// cautions are the common cautions, but for the trailing edges, and the
// one on ideal flow.
func cautions(s *job.Setup, edges []r2.Vec) []job.Caution {
	return append(job.CommonCautions(s.Mesh, edges...), job.Caution{
		Topic: "ideal_flow",
		Text:  "ideal flow has no viscosity: no boundary layer, separation, stall or drag; a good guide to surface pressures and lift of streamlined sections in attached flow at moderate incidence and low Mach number, not near or beyond the stall",
	})
}

// Solve assembles the scene once, solves it for its stream (and the sweep's
// angles on the same factorisation) and presents the results.
func (j *Job) Solve(s *job.Setup) (*job.Outcome, error) {
	angles, err := sweepAngles(j.Sweep)
	if err != nil {
		return nil, fmt.Errorf("flow: %w", err)
	}
	sc := s.Scene
	if sc.Problem.Stream == nil {
		return nil, &geom.Error{Feature: -1, Member: "problem.stream", Msg: `missing; add "stream": {"speed": 1, "angle_deg": 0}`}
	}
	fs, err := Assemble(sc, s.Mesh, s.Settings)
	if err != nil {
		return nil, err
	}
	sol, err := fs.Solve(*sc.Problem.Stream)
	if err != nil {
		return nil, err
	}
	rep, err := fs.Analyse(sol)
	if err != nil {
		return nil, err
	}
	var sweep []SweepPoint
	if len(angles) > 0 {
		if sweep, err = fs.Sweep(angles); err != nil {
			return nil, err
		}
	}
	sec := newSection(sc, rep, sweep)
	out := &job.Outcome{
		System:   fs.System(),
		Solution: sol,
		Solver:   "dense",
		Section:  &job.Section{Key: "flow", Value: sec},
		Warnings: sec.Warnings,
		Cautions: cautions(s, trailingEdges(fs.Bodies)),
		Columns:  columns(rep),
		Results:  "Ideal-flow results",
	}
	present(out, sc, rep, sweep)
	sec.Warnings = out.Warnings
	return out, nil
}

// angleText writes an angle in degrees for people.
func angleText(deg float64) string { return job.FormatNumber(deg) + "°" }

// speedText writes a speed with its unit.
func speedText(v float64) string { return draw.FormatSI(v, "m/s") }

// bodyIndex returns the index into sc.Bodies of the body b.
func bodyIndex(sc *geom.Scene, b Body) int {
	for i := range sc.Bodies {
		if sc.Bodies[i].Name == b.Name {
			return i
		}
	}
	return 0
}
