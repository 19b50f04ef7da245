package laplace

import (
	"github.com/rimfield/rimfield/bem/job"
	"github.com/rimfield/rimfield/geom"
)

// Job is the generic Laplace job. Its zero value is ready to use.
type Job struct{}

// New returns the generic Laplace job.
func New() job.Job { return &Job{} }

// units of the generic problem: u and k have no unit, so k du/dn is per
// metre and its integral along the boundary has no unit.
var units = job.Units{Potential: "1", InflowDensity: "1/m", Inflow: "1", Conductivity: "1", Length: "m",
	PotentialCSV: "", DensityCSV: "per_m"}

var words = job.Words{
	Units:         units,
	Potential:     "potential u",
	Field:         "|grad u|",
	FieldUnit:     "1/m",
	Inflow:        "inflow",
	InflowDensity: "inflow density",
	InflowNote:    "Inflow: the total flux k du/dn entering the domain through the boundary per metre of length (positive in).",
	Conductivity:  "conductivity k",
	Material:      func(m geom.Material) string { return job.DescribeMaterial(m, "k", "") },
	Condition:     func(c geom.Condition) string { return job.DescribeCondition(c, units) },
	Net:           "flow net",
	FluxLines:     "flux lines",
	Channels:      "flux channels",
	Drops:         "potential drops",
	ShapeFactor:   "q/(k H)",
	Ground:        "plane u = 0",
}

// Words returns the generic words: potential, flux, conductivity k.
func (*Job) Words() *job.Words { return &words }

// Options returns none: the generic job has no flags of its own.
func (*Job) Options() []job.Option { return nil }

// Check adds nothing to the summary but the common cautions.
func (*Job) Check(s *job.Setup) (*job.Checked, error) {
	return &job.Checked{Cautions: job.CommonCautions(s.Mesh)}, nil
}

// Solve solves the scene's own conditions; the headline is the inflow
// through the boundary at the highest fixed potential.
func (*Job) Solve(s *job.Setup) (*job.Outcome, error) {
	sys, sol, err := job.Solve(s)
	if err != nil {
		return nil, err
	}
	return &job.Outcome{
		System:   sys,
		Solution: sol,
		Solver:   "dense",
		Cautions: job.CommonCautions(s.Mesh),
		Headline: job.InflowHeadline(sol, &words),
	}, nil
}
