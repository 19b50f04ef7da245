package seep

// This file is the seepage job of the command line (package job's
// interface); the analysis it presents lives in the rest of the package.

import (
	"fmt"
	"strings"

	"github.com/rimfield/rimfield/bem/job"
	"github.com/rimfield/rimfield/geom"
)

// Job is the seepage job: confined steady seepage under structures, in the
// words of geotechnical and hydraulic engineering. Its fields hold its
// flags.
type Job struct {
	// Truncation re-solves the section with its outer walls moved out
	// (--truncation-check).
	Truncation bool
	// Soil names the soil of Lane's creep check (--soil).
	Soil string
	// ExitLength (m) is the length of exit face a singular exit gradient is
	// averaged over (--exit-length); 0: the default.
	ExitLength float64
	// PipingSafety is the least acceptable factor against piping
	// (--piping-safety); 0: DefaultPipingSafety.
	PipingSafety float64
}

// NewJob returns the seepage job with its defaults.
func NewJob() job.Job { return &Job{} }

var seepUnits = job.Units{Potential: "m", InflowDensity: "m/s", Inflow: "m^2/s", Conductivity: "m/s", Length: "m",
	PotentialCSV: "m", DensityCSV: "m_per_s"}

var seepWords = job.Words{
	Units:         seepUnits,
	Potential:     "total head",
	Field:         "hydraulic gradient |i|",
	FieldUnit:     "1",
	Inflow:        "seepage inflow",
	InflowDensity: "specific discharge into the soil",
	InflowNote:    "Seepage inflow: the discharge per metre width entering the soil through the boundary (negative where water leaves it).",
	Conductivity:  "hydraulic conductivity k",
	Material:      func(m geom.Material) string { return job.DescribeMaterial(m, "hydraulic conductivity k", "m/s") },
	Condition:     describeCondition,
	Net:           "flow net",
	FluxLines:     "flow lines",
	Channels:      "flow channels",
	Drops:         "equipotential drops",
	ShapeFactor:   "q/(k H)",
}

// describeCondition spells a boundary condition in seepage words.
func describeCondition(c geom.Condition) string {
	switch c.Kind {
	case geom.Potential:
		return fmt.Sprintf("total head %g m", c.Value)
	case geom.Flux:
		if c.Value == 0 {
			return "impervious (no flow)"
		}
		return fmt.Sprintf("inflow %g m/s", c.Value)
	case geom.Floating:
		return fmt.Sprintf("unknown constant head, net inflow %g m^2/s", c.NetInflow)
	}
	return "none"
}

// Words returns the words of seepage: total head, hydraulic gradient,
// hydraulic conductivity, flow lines, flow channels and equipotential
// drops.
func (*Job) Words() *job.Words { return &seepWords }

// Options returns the seepage flags.
func (j *Job) Options() []job.Option {
	return []job.Option{
		{Name: "truncation-check", Usage: "seepage: solve the section again with its outer walls (sides and bottom) moved twice as far out and report how much the discharge and the exit gradient move, with a warning above 2 %", Value: &j.Truncation},
		{Name: "soil", Usage: "seepage: the soil `NAME` of Lane's weighted creep check, one of " + laneNames(), Value: &j.Soil},
		{Name: "exit-length", Usage: fmt.Sprintf("seepage: length `L` of exit face in metres over which an exit gradient that is infinite in theory (the toe of a floor without a cutoff) is averaged; 0: %g of the structure's seepage path", DefaultExitFraction), Value: &j.ExitLength},
		{Name: "piping-safety", Usage: fmt.Sprintf("seepage: least acceptable factor of safety `F` against piping, critical gradient over exit gradient (default %g; take your code's)", DefaultPipingSafety), Value: &j.PipingSafety},
	}
}

// options are the analysis options of the flags.
func (j *Job) options() Options {
	return Options{ExitLength: j.ExitLength, PipingSafety: j.PipingSafety, Soil: j.Soil}
}

// Check lists the unit weight of water, the critical gradient, the soils
// and the structures, and refuses bad flags.
func (j *Job) Check(s *job.Setup) (*job.Checked, error) {
	p := s.Scene.Problem
	c := &job.Checked{
		Lines: []string{
			fmt.Sprintf("unit weight of water %g kN/m^3, critical gradient %g", p.UnitWeightWater, p.CriticalGradient),
		},
		Cautions: cautions(s),
	}
	if err := j.options().check(); err != nil {
		c.Refusal = err
	}
	if j.Soil != "" {
		if r, ok := laneRatio(j.Soil); ok {
			c.Lines = append(c.Lines, fmt.Sprintf("Lane's creep check against %q: weighted creep ratio of at least %g", j.Soil, r))
		}
	}
	var structures []string
	for _, b := range s.Scene.Bodies {
		structures = append(structures, fmt.Sprintf("%q", b.Name))
	}
	if len(structures) > 0 {
		c.Lines = append(c.Lines, "structures (impervious bodies): "+strings.Join(structures, ", "))
	}
	return c, nil
}

// cautions are the common cautions and those of seepage.
func cautions(s *job.Setup) []job.Caution {
	return append(job.CommonCautions(s.Mesh),
		job.Caution{
			Topic: "exit_gradient",
			Text:  "where a tailwater bed meets the end of an impervious floor on a straight line (no cutoff) the exit gradient is infinite in theory: rimfield reports its mean over a stated length of the bed instead; beside a cutoff's face it is finite; piping and heave checks need the safety factors of the applicable codes",
		},
		job.Caution{
			Topic: "steady_state",
			Text:  "seepage is steady and confined: no transient, no free surface, no change of permeability with time; hydraulic conductivity is rarely known within a factor of ten",
		})
}

// Solve solves the scene's heads, analyses them (discharge, uplift, exit
// gradients, piping, heave, creep), runs the truncation study when asked
// for, and presents the results.
func (j *Job) Solve(s *job.Setup) (*job.Outcome, error) {
	o := j.options()
	if err := o.check(); err != nil {
		return nil, err
	}
	sys, sol, err := job.Solve(s)
	if err != nil {
		return nil, err
	}
	rep, err := Analyse(s.Scene, sys, sol, o)
	if err != nil {
		return nil, fmt.Errorf("seepage results: %w", err)
	}
	var tr *TruncationStudy
	if j.Truncation {
		if tr, err = Truncation(s.Scene, rep, TruncationOptions{Mesh: s.MeshOptions, Analysis: o}); err != nil {
			return nil, fmt.Errorf("truncation check: %w", err)
		}
	}
	required := o.PipingSafety
	if required == 0 {
		required = DefaultPipingSafety
	}
	sec := newSection(rep, required, tr)
	out := &job.Outcome{
		System:   sys,
		Solution: sol,
		Solver:   "dense",
		Section:  &job.Section{Key: "seepage", Value: sec},
		Warnings: sec.Warnings,
		Cautions: cautions(s),
		Columns:  columns(rep),
		Results:  "Seepage results",
	}
	present(out, s.Scene, rep, sec, tr)
	return out, nil
}
