package flow

import (
	"github.com/rimfield/rimfield/bem/job"
	"github.com/rimfield/rimfield/geom"
)

// Section is the flow section of results.json. LiftCoefficient,
// Circulation, MomentCoefficient and ReferenceChord are the keys of the
// results contract (the whole's: all bodies together); the others may
// grow. Every value is SI; coefficients have no unit.
type Section struct {
	// LiftCoefficient is Kutta-Joukowski's 2 Gamma / (U c).
	LiftCoefficient job.Number `json:"lift_coefficient"`
	// Circulation is Gamma in m^2/s, positive clockwise (lifting).
	Circulation job.Number `json:"circulation"`
	// MomentCoefficient is about the quarter chord, positive nose-up.
	MomentCoefficient job.Number `json:"moment_coefficient"`
	// ReferenceChord is c in m: from the trailing edge to the farthest
	// point of the section unless problem.chord is given.
	ReferenceChord job.Number `json:"reference_chord"`

	// LiftCoefficientPressure and DragCoefficient come from the integrated
	// surface pressure (the drag is zero in theory: a check).
	LiftCoefficientPressure job.Number `json:"lift_coefficient_pressure"`
	DragCoefficient         job.Number `json:"drag_coefficient"`
	// LiftNPerM is rho U Gamma in N/m; ForceX and ForceY are the integrated
	// surface pressure in N/m.
	LiftNPerM job.Number `json:"lift_N_per_m"`
	ForceX    job.Number `json:"force_x_N_per_m"`
	ForceY    job.Number `json:"force_y_N_per_m"`
	// Stream is the uniform stream; Density (kg/m^3) and DynamicPressure
	// (Pa) the fluid's.
	Stream          SectionStream `json:"stream"`
	Density         job.Number    `json:"density"`
	DynamicPressure job.Number    `json:"dynamic_pressure_Pa"`
	// LeadingEdge, TrailingEdge and QuarterChord are the whole's chord
	// line (m).
	LeadingEdge  SectionPoint `json:"leading_edge"`
	TrailingEdge SectionPoint `json:"trailing_edge"`
	QuarterChord SectionPoint `json:"quarter_chord"`
	// Stagnation lists the stagnation points of every body (m).
	Stagnation []SectionPoint `json:"stagnation_points"`
	// Bodies holds the same per body.
	Bodies []SectionBody `json:"bodies"`
	// Sweep holds the incidence sweep, when asked for.
	Sweep []SectionSweep `json:"sweep,omitempty"`
	// Warnings are the flow concerns (also in the top-level list).
	Warnings []string `json:"warnings"`
}

// SectionStream is the uniform stream: speed in m/s, angle in degrees
// anticlockwise from the x axis.
type SectionStream struct {
	Speed    job.Number `json:"speed"`
	AngleDeg job.Number `json:"angle_deg"`
}

// SectionPoint is a point in metres, with the body it lies on.
type SectionPoint struct {
	X    job.Number `json:"x"`
	Y    job.Number `json:"y"`
	Body string     `json:"body,omitempty"`
}

// SectionBody is one body's results.
type SectionBody struct {
	Name string `json:"name"`
	// Kutta tells whether its circulation is fixed by the Kutta condition
	// at TrailingEdge (else it carries none); TrailingEdgeAngleDeg is the
	// body-side angle there (null without Kutta).
	Kutta                   bool         `json:"kutta"`
	TrailingEdge            SectionPoint `json:"trailing_edge"`
	LeadingEdge             SectionPoint `json:"leading_edge"`
	TrailingEdgeAngleDeg    *job.Number  `json:"trailing_edge_angle_deg,omitempty"`
	ReferenceChord          job.Number   `json:"reference_chord"`
	Circulation             job.Number   `json:"circulation"`
	LiftCoefficient         job.Number   `json:"lift_coefficient"`
	LiftCoefficientPressure job.Number   `json:"lift_coefficient_pressure"`
	DragCoefficient         job.Number   `json:"drag_coefficient"`
	MomentCoefficient       job.Number   `json:"moment_coefficient"`
	LiftNPerM               job.Number   `json:"lift_N_per_m"`
}

// SectionSweep is one angle of an incidence sweep (the whole's values).
type SectionSweep struct {
	AngleDeg                job.Number `json:"angle_deg"`
	LiftCoefficient         job.Number `json:"lift_coefficient"`
	LiftCoefficientPressure job.Number `json:"lift_coefficient_pressure"`
	DragCoefficient         job.Number `json:"drag_coefficient"`
	MomentCoefficient       job.Number `json:"moment_coefficient"`
	Circulation             job.Number `json:"circulation"`
}

func point(x, y float64, body string) SectionPoint {
	return SectionPoint{X: job.Number(x), Y: job.Number(y), Body: body}
}

// newSection turns a Report (and a sweep) into the section of results.json.
func newSection(sc *geom.Scene, rep *Report, sweep []SweepPoint) *Section {
	w, c := rep.Whole, rep.WholeChord
	sec := &Section{
		LiftCoefficient:         job.Number(w.CL),
		Circulation:             job.Number(w.Circulation),
		MomentCoefficient:       job.Number(w.CM),
		ReferenceChord:          job.Number(c.Length),
		LiftCoefficientPressure: job.Number(w.CLPressure),
		DragCoefficient:         job.Number(w.CD),
		LiftNPerM:               job.Number(w.Lift),
		ForceX:                  job.Number(w.Force.X),
		ForceY:                  job.Number(w.Force.Y),
		Stream:                  SectionStream{Speed: job.Number(rep.Stream.Speed), AngleDeg: job.Number(rep.Stream.AngleDeg)},
		Density:                 job.Number(rep.Density),
		DynamicPressure:         job.Number(rep.Dynamic),
		LeadingEdge:             point(c.LeadingEdge.X, c.LeadingEdge.Y, ""),
		TrailingEdge:            point(c.TrailingEdge.X, c.TrailingEdge.Y, ""),
		QuarterChord:            point(c.QuarterChord.X, c.QuarterChord.Y, ""),
		Stagnation:              []SectionPoint{},
		Bodies:                  []SectionBody{},
		Warnings:                append([]string{}, rep.Warnings...),
	}
	for _, b := range rep.Bodies {
		for _, p := range b.Stagnation {
			sec.Stagnation = append(sec.Stagnation, point(p.X, p.Y, b.Name))
		}
		bc := b.Chord
		var angle *job.Number
		if b.Kutta {
			a := job.Number(b.Angle)
			angle = &a
		}
		sec.Bodies = append(sec.Bodies, SectionBody{
			TrailingEdgeAngleDeg: angle,
			Name:                 b.Name, Kutta: b.Kutta,
			TrailingEdge:            point(bc.TrailingEdge.X, bc.TrailingEdge.Y, ""),
			LeadingEdge:             point(bc.LeadingEdge.X, bc.LeadingEdge.Y, ""),
			ReferenceChord:          job.Number(bc.Length),
			Circulation:             job.Number(b.Circulation),
			LiftCoefficient:         job.Number(b.CL),
			LiftCoefficientPressure: job.Number(b.CLPressure),
			DragCoefficient:         job.Number(b.CD),
			MomentCoefficient:       job.Number(b.CM),
			LiftNPerM:               job.Number(b.Lift),
		})
	}
	for _, p := range sweep {
		sec.Sweep = append(sec.Sweep, SectionSweep{
			AngleDeg: job.Number(p.AngleDeg), LiftCoefficient: job.Number(p.Whole.CL),
			LiftCoefficientPressure: job.Number(p.Whole.CLPressure), DragCoefficient: job.Number(p.Whole.CD),
			MomentCoefficient: job.Number(p.Whole.CM), Circulation: job.Number(p.Whole.Circulation),
		})
	}
	return sec
}
