package seep

// This file is the seepage job of the command line (package job's
// interface); the analysis it presents lives in the rest of the package.

import (
	"fmt"

	"github.com/rimfield/rimfield/bem/job"
	"github.com/rimfield/rimfield/geom"
)

// Job is the seepage job: confined steady seepage under structures, in the
// words of geotechnical and hydraulic engineering.
type Job struct{}

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

// Options returns none yet.
func (*Job) Options() []job.Option { return nil }

// Check lists the unit weight of water and the critical gradient.
func (*Job) Check(s *job.Setup) (*job.Checked, error) {
	p := s.Scene.Problem
	return &job.Checked{
		Lines: []string{
			fmt.Sprintf("unit weight of water %g kN/m^3, critical gradient %g", p.UnitWeightWater, p.CriticalGradient),
		},
		Cautions: cautions(s),
	}, nil
}

// cautions are the common cautions and those of seepage.
func cautions(s *job.Setup) []job.Caution {
	return append(job.CommonCautions(s.Mesh),
		job.Caution{
			Topic: "exit_gradient",
			Text:  "the exit gradient at the toe of a structure is infinite in theory and its computed value depends on the mesh; piping and heave checks need the safety factors of the applicable codes",
		},
		job.Caution{
			Topic: "steady_state",
			Text:  "seepage is steady and confined: no transient, no free surface, no change of permeability with time; hydraulic conductivity is rarely known within a factor of ten",
		})
}

// Solve solves the scene's heads.
func (*Job) Solve(s *job.Setup) (*job.Outcome, error) {
	sys, sol, err := job.Solve(s)
	if err != nil {
		return nil, err
	}
	return &job.Outcome{
		System:   sys,
		Solution: sol,
		Solver:   "dense",
		Cautions: cautions(s),
		Warnings: []string{"the seepage section (discharge, exit gradient, uplift) is not computed by this version yet"},
		Headline: job.InflowHeadline(sol, &seepWords),
	}, nil
}
