package job

import (
	"fmt"
	"math"

	"github.com/rimfield/rimfield/bem"
	"github.com/rimfield/rimfield/bem/draw"
	"github.com/rimfield/rimfield/geom"
)

// Solve assembles and factorises the system of s.Mesh and solves it for
// the scene's own conditions: the standard solve of every job whose
// boundary conditions are the scene's as written.
func Solve(s *Setup) (*bem.System, *bem.Solution, error) {
	sys, err := bem.Assemble(s.Mesh, s.Settings)
	if err != nil {
		return nil, nil, err
	}
	sol, err := sys.Solve(nil)
	if err != nil {
		return nil, nil, err
	}
	return sys, sol, nil
}

// InflowHeadline states, in the words w, what flows in through the body or
// edge at the highest fixed potential ("inflow 1.234 through "inlet" (u =
// 1)"), or with no fixed potential what the floating body with the largest
// net inflow carries and where it floats; "" when there is neither.
func InflowHeadline(sol *bem.Solution, w *Words) string {
	lay := sol.Mesh.Layout
	u := w.Units
	best, bestV := -1, math.Inf(-1)
	for i, o := range lay.Owners {
		if o.Cond.Kind == geom.Potential && o.Cond.Value > bestV {
			best, bestV = i, o.Cond.Value
		}
	}
	owners := sol.Owners()
	if best < 0 {
		f := -1
		for i, o := range lay.Owners {
			if o.Cond.Kind == geom.Floating && (f < 0 || math.Abs(o.Cond.NetInflow) > math.Abs(lay.Owners[f].Cond.NetInflow)) {
				f = i
			}
		}
		if f < 0 || f >= len(sol.Floating) {
			return ""
		}
		return fmt.Sprintf("%s %s on %q, floating at %s", w.Inflow, draw.FormatSI(owners[f].Inflow, u.Inflow),
			owners[f].Name, draw.FormatSI(sol.Floating[f], u.Potential))
	}
	res := owners[best]
	return fmt.Sprintf("%s %s through %q (%s %s)", w.Inflow, draw.FormatSI(res.Inflow, u.Inflow), res.Name,
		w.Potential, draw.FormatSI(bestV, u.Potential))
}
