package main

import (
	"fmt"
	"maps"
	"slices"

	"github.com/rimfield/rimfield/bem/electro"
	"github.com/rimfield/rimfield/bem/flow"
	"github.com/rimfield/rimfield/bem/job"
	"github.com/rimfield/rimfield/bem/laplace"
	"github.com/rimfield/rimfield/bem/seep"
	"github.com/rimfield/rimfield/geom"
	"github.com/spf13/pflag"
)

// jobs is the table of physics: the job that solves and presents each
// problem.physics. A new physics is a package under bem/ and one line here.
var jobs = map[geom.Physics]func() job.Job{
	geom.Laplace:       laplace.New,
	geom.Electrostatic: electro.NewJob,
	geom.Seepage:       seep.NewJob,
	geom.Flow:          flow.NewJob,
}

// jobSet holds one job per physics, made before the flags are parsed so
// that every job's options are flags of the command.
type jobSet map[geom.Physics]job.Job

// newJobs makes one job per entry of the table.
func newJobs() jobSet {
	s := jobSet{}
	for p, mk := range jobs {
		s[p] = mk()
	}
	return s
}

// addFlags defines every job's options on fs, in the order of the physics.
func (s jobSet) addFlags(fs *pflag.FlagSet) {
	for _, p := range slices.Sorted(maps.Keys(s)) {
		for _, o := range s[p].Options() {
			addOption(fs, o.Name, o.Usage, o.Value)
		}
	}
}

// forScene returns the job of a physics and, when the table has none, the
// generic job with the reason solve refuses the scene.
func (s jobSet) forScene(p geom.Physics) (job.Job, error) {
	if j, ok := s[p]; ok {
		return j, nil
	}
	return laplace.New(), fmt.Errorf("%s scenes cannot be solved by this version yet (rimfield check validates the scene)", p)
}
