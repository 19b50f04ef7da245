package electro

import (
	"fmt"

	"github.com/rimfield/rimfield/bem/job"
	"github.com/rimfield/rimfield/geom"
)

// RefineLimit is the largest panel count for which the electrostatic job
// runs the peak refinement study (a second solve with about twice the
// panels, some eight times the work of the first). Beyond it the study is
// skipped with a warning.
const RefineLimit = 2500

// Job is the electrostatic job of the command line: capacitance, fields,
// breakdown margins, energy and forces of an electrode or conductor
// layout, in the words of electrical engineering.
type Job struct {
	// AirBreakdown assumes AirStrength for regions of relative
	// permittivity 1 that give no breakdown field (--air-breakdown).
	AirBreakdown bool
}

// NewJob returns the electrostatic job with its defaults.
func NewJob() job.Job { return &Job{} }

var units = job.Units{Potential: "V", InflowDensity: "C/m^2", Inflow: "C/m", Conductivity: "F/m", Length: "m",
	PotentialCSV: "V", DensityCSV: "C_per_m2"}

var words = job.Words{
	Units:         units,
	Potential:     "potential",
	Field:         "field strength |E|",
	FieldUnit:     "V/m",
	Inflow:        "charge",
	InflowDensity: "surface charge density",
	InflowNote:    "Charge: per metre of length (the electric flux leaving the conductor into the field).",
	Conductivity:  "permittivity ε",
	Material:      describeMaterial,
	Condition:     describeCondition,
	Net:           "field plot",
	FluxLines:     "field lines",
	Channels:      "flux tubes",
	Drops:         "potential steps",
	ShapeFactor:   "C/ε",
	Ground:        "ground plane (0 V)",
}

// Words returns the words of electrostatics: potential in volts, field
// strength, charge, permittivity, field lines and flux tubes.
func (*Job) Words() *job.Words { return &words }

// describeMaterial spells a region's permittivity, relative and absolute.
func describeMaterial(m geom.Material) string {
	k := func(v float64) string {
		return fmt.Sprintf("permittivity %.6g (relative; %.6g F/m)", v/geom.Eps0, v)
	}
	if m.Isotropic() {
		return k(m.Kx)
	}
	return "x: " + k(m.Kx) + ", y: " + k(m.Ky)
}

// describeCondition spells a boundary condition in electrostatic words.
func describeCondition(c geom.Condition) string {
	switch c.Kind {
	case geom.Potential:
		return fmt.Sprintf("potential %g V", c.Value)
	case geom.Flux:
		if c.Value == 0 {
			return "insulated (no normal flux)"
		}
		return fmt.Sprintf("surface charge %g C/m^2", c.Value)
	case geom.Floating:
		return fmt.Sprintf("floating, charge %g C/m", c.NetInflow)
	}
	return "none"
}

// Options returns --air-breakdown.
func (j *Job) Options() []job.Option {
	return []job.Option{{
		Name:  "air-breakdown",
		Usage: "electrostatic: assume the breakdown field of air, 3 kV/mm = 3e6 V/m (dry air, standard conditions, gaps of centimetres; common practice), for every region of relative permittivity 1 without a breakdown_field, the background included",
		Value: &j.AirBreakdown,
	}}
}

// Check lists the grounded plane and the breakdown fields known, and the
// cautions of the scene.
func (j *Job) Check(s *job.Setup) (*job.Checked, error) {
	sc := s.Scene
	c := &job.Checked{Cautions: cautions(s)}
	if g := sc.Problem.Ground; g != nil {
		unit, scale := job.SceneUnit(sc)
		c.Lines = append(c.Lines, fmt.Sprintf("ground plane y = %.6g m (%.6g %s) at 0 V, by images", g.Y, g.Y/scale, unit))
	}
	strength := Strengths(sc, s.Mesh.Layout, j.AirBreakdown)
	for i, v := range strength {
		if v > 0 {
			c.Lines = append(c.Lines, fmt.Sprintf("breakdown field of %q %.4g V/m", s.Mesh.Layout.Regions[i].Name, v))
		}
	}
	return c, nil
}

// cautions are the common cautions and the one on breakdown.
func cautions(s *job.Setup) []job.Caution {
	return append(job.CommonCautions(s.Mesh), job.Caution{
		Topic: "breakdown",
		Text:  "whether a field strength is safe depends on gap, pressure, humidity and surface state, not on the field alone; use the clearances of the applicable electrical safety standards",
	})
}

// Solve solves the scene, computes the capacitance matrix (one more solve
// per fixed conductor on the same factorisation), the fields, the peak
// field with its refinement study (up to RefineLimit panels), the
// breakdown margins, energy and forces, and presents them.
func (j *Job) Solve(s *job.Setup) (*job.Outcome, error) {
	sys, sol, err := job.Solve(s)
	if err != nil {
		return nil, err
	}
	n := len(s.Mesh.Panels)
	refine := n <= RefineLimit
	rep, err := Analyse(s.Scene, sys, sol, Options{Refine: refine, AirDefault: j.AirBreakdown, Mesh: s.MeshOptions, Settings: s.Settings})
	if err != nil {
		return nil, fmt.Errorf("electrostatic results: %w", err)
	}
	sec := NewSection(rep, n, refine)
	out := &job.Outcome{
		System:   sys,
		Solution: sol,
		Solver:   "dense",
		Section:  &job.Section{Key: "electrostatic", Value: sec},
		Warnings: sec.Warnings,
		Cautions: cautions(s),
		Columns:  columns(sol, rep.Fields),
		Results:  "Electrostatic results",
	}
	present(out, s, sec, rep)
	return out, nil
}
