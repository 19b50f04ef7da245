package flow

import (
	"fmt"

	"github.com/rimfield/rimfield/geom"
)

// SweepPoint is the result of one incidence of a sweep.
type SweepPoint struct {
	AngleDeg float64 // stream angle, degrees anticlockwise from x
	// Whole holds the whole's coefficients at this angle; Bodies each
	// body's, in System.Bodies order.
	Whole  Coefficients
	Bodies []Coefficients
}

// Sweep solves the scene's stream speed at each stream angle (degrees) on
// the one factorisation of fs and returns the coefficients per angle: an
// incidence sweep, each angle costing one back-substitution. The chord
// lines stay those of the scene's own stream (a body without a Kutta
// condition keeps the trailing end found for it). Over a ground plane the
// stream must run along the plane, so a sweep is refused there: pitch the
// section and solve each angle as a scene of its own.
func (fs *System) Sweep(angles []float64) ([]SweepPoint, error) {
	speed := 1.0
	if st := fs.Scene.Problem.Stream; st != nil {
		speed = st.Speed
	}
	if fs.ground != nil && len(angles) > 0 {
		return nil, fmt.Errorf("flow: an incidence sweep turns the stream, and over a ground plane the stream must run along the plane; pitch the section instead and solve each angle as its own scene")
	}
	out := make([]SweepPoint, len(angles))
	for i, a := range angles {
		sol, err := fs.Solve(geom.Stream{Speed: speed, AngleDeg: a})
		if err != nil {
			return nil, err
		}
		rep, err := fs.Analyse(sol)
		if err != nil {
			return nil, err
		}
		out[i] = SweepPoint{AngleDeg: a, Whole: rep.Whole, Bodies: make([]Coefficients, len(rep.Bodies))}
		for k, b := range rep.Bodies {
			out[i].Bodies[k] = b.Coefficients
		}
	}
	return out, nil
}
