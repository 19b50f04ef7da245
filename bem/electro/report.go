package electro

import (
	"errors"
	"fmt"
	"math"

	"github.com/rimfield/rimfield/bem"
	"github.com/rimfield/rimfield/geom"
	"github.com/rimfield/rimfield/mesh"
	"gonum.org/v1/gonum/spatial/r2"
)

// Options tunes Analyse. The zero value computes everything except the
// refinement study, with the breakdown fields given in the scene only.
type Options struct {
	// Mesh are the options the solution's mesh was built with; the
	// refinement study starts from them.
	Mesh mesh.Options
	// Settings for the refinement study's assembly; nil: defaults.
	Settings *bem.Settings
	// Refine runs PeakStudy when the scene has a conductor: one more
	// assembly and solve with about twice the panels (about 8 times the
	// work of the first solve).
	Refine bool
	// AirDefault assumes AirStrength for regions of relative permittivity
	// 1 that give no breakdown field.
	AirDefault bool
}

// Report gathers the electrostatic results of one solved scene.
type Report struct {
	// Capacitance is nil when no body or edge has a fixed potential.
	Capacitance *Matrix
	Fields      *Fields
	// Peak is the largest field on conductor surfaces; nil without
	// conductors.
	Peak *Peak
	// Corners are the singular corners of the conductors.
	Corners []Corner
	// Refinement is the peak on a mesh of halved panels; nil unless asked
	// for and there is a peak.
	Refinement *Refinement
	// Margins compare each region with a breakdown field to it.
	Margins []Margin
	// Energy is the stored energy in J/m; NaN when infinite.
	Energy float64
	// Forces per metre on each conductor.
	Forces []Force
	// Warnings, one sentence each, for a person.
	Warnings []string
}

// Analyse computes the capacitance matrix (one more solve per fixed
// conductor on sys's factorisation), the panel fields, the conductor peak
// field with the singular corners and their rounding radii, the breakdown
// margins, the energy and the forces of sol, the solution of sys for the
// scene's own conditions; sc is the scene the mesh was built from. With a
// nil sys the capacitance matrix is left out. Its warnings name conductors
// and place corners in the scene's unit.
func Analyse(sc *geom.Scene, sys *bem.System, sol *bem.Solution, o Options) (*Report, error) {
	rep := &Report{}
	if sys != nil {
		cm, err := Capacitance(sys, sol.Mesh)
		switch {
		case errors.Is(err, ErrNoConductors):
		case err != nil:
			return nil, err
		default:
			rep.Capacitance = cm
			rep.Warnings = append(rep.Warnings, cm.Warnings...)
		}
	}
	f := PanelFields(sol)
	rep.Fields = f
	rep.Corners = f.Corners()
	lay := sol.Mesh.Layout
	strength := Strengths(sc, lay, o.AirDefault)
	rep.Margins = f.Breakdown(strength)
	rep.Energy = Energy(sol)
	if math.IsNaN(rep.Energy) {
		rep.Warnings = append(rep.Warnings, "the stored energy is infinite: the conductors of this open scene carry a net charge, whose field in two dimensions falls off too slowly; add a ground plane or a return conductor")
	}
	rep.Forces = f.Forces()
	if pk, ok := f.Peak(); ok {
		rep.Peak = &pk
		if o.Refine {
			rf, err := PeakStudy(sol, o.Mesh, o.Settings)
			if err != nil {
				return nil, err
			}
			rep.Refinement = rf
		}
		switch rf := rep.Refinement; {
		case pk.Corner != nil:
			rep.Warnings = append(rep.Warnings, f.cornerWarning(sc, pk, strength, rf))
		case rf != nil && math.Abs(rf.Ratio-1) > 0.01:
			rep.Warnings = append(rep.Warnings, fmt.Sprintf(
				"the peak field changes by %.2g %% when the panels are halved: the mesh is too coarse for it; raise the panel count", 100*math.Abs(rf.Ratio-1)))
		}
	}
	for _, m := range rep.Margins {
		if m.Exceeded {
			rep.Warnings = append(rep.Warnings, fmt.Sprintf(
				"the field in %q reaches %.3g V/m at %s, %.2f times its breakdown field %.3g V/m",
				m.Region, m.Peak, where(sc, m.At), m.Ratio, m.Strength))
		}
	}
	return rep, nil
}

// unitOf returns the scene's coordinate unit and metres per unit.
func unitOf(sc *geom.Scene) (string, float64) {
	if sc.Problem.Unit == "" || !(sc.Problem.Scale > 0) {
		return "m", 1
	}
	return sc.Problem.Unit, sc.Problem.Scale
}

// where writes a point in the scene's unit.
func where(sc *geom.Scene, p r2.Vec) string {
	unit, scale := unitOf(sc)
	return fmt.Sprintf("(%.4g, %.4g) %s", p.X/scale, p.Y/scale, unit)
}

// smoothPeak returns the largest conductor field farther than one nominal
// panel size from every singular corner, or 0.
func (f *Fields) smoothPeak(corners []Corner) float64 {
	m := f.Sol.Mesh
	reach := reachOf(m)
	best := 0.0
	for j, p := range m.Panels {
		if !conductor(p) {
			continue
		}
		mid := p.Mid()
		near := false
		for _, c := range corners {
			if r2.Norm(r2.Sub(mid, c.At)) <= reach {
				near = true
				break
			}
		}
		if !near {
			best = math.Max(best, math.Abs(f.Normal[j]))
		}
	}
	return best
}

// cornerWarning explains a peak at a singular corner and suggests a
// rounding radius: the one that brings the corner down to the breakdown
// field of the region around it when that is known, else to the largest
// field on the smooth parts of the conductors.
// With a refinement study, the warning quotes its peak.
func (f *Fields) cornerWarning(sc *geom.Scene, pk Peak, strength []float64, rf *Refinement) string {
	c := pk.Corner
	kind := "sharp edge"
	switch {
	case c.Junction:
		kind = "junction with a dielectric interface"
	case c.Mixed:
		kind = "electrode edge on an insulated boundary"
	}
	msg := fmt.Sprintf("the peak field %.3g V/m on %q is at the %s %s, where the field is infinite in theory (|E| ~ r^%.2f): the value is the mesh's, not the device's",
		pk.Value, c.Boundary, kind, where(sc, c.At), c.Exponent)
	if c.Exponent > -0.15 {
		// A mild singularity: the value creeps up as the panels shrink
		// (by 2^-p per halving) rather than being an artefact.
		msg = fmt.Sprintf("the peak field %.3g V/m on %q is at the %s %s, where the field grows mildly without bound (|E| ~ r^%.2f): the value rises by about %.0f %% each time the panels there are halved",
			pk.Value, c.Boundary, kind, where(sc, c.At), c.Exponent, 100*(math.Pow(2, -c.Exponent)-1))
	}
	if rf != nil {
		msg += fmt.Sprintf(" (with the panels halved it reads %.3g V/m, %.2f times as much)", rf.Fine.Value, rf.Ratio)
	}
	if c.Junction {
		return msg + "; rounding the conductor does not remove a triple junction: change the angle at which the dielectric meets the conductor, or move the junction to where the field is low, and re-run"
	}
	target, what := 0.0, ""
	if c.Region >= 0 && c.Region < len(strength) && strength[c.Region] > 0 {
		target = strength[c.Region]
		what = fmt.Sprintf("the breakdown field of %q", f.Sol.Mesh.Layout.Regions[c.Region].Name)
	} else if sp := f.smoothPeak(f.Corners()); sp > 0 {
		target = sp
		what = "the largest field on the smooth parts of the conductors"
	}
	r := c.RoundingRadius(target)
	unit, scale := unitOf(sc)
	switch size := f.ownerLength(c.Owner) / (2 * math.Pi); {
	case r > 0.5*size:
		// The estimate holds for radii well below the conductor's size:
		// beyond it there is no radius to quote.
		msg += fmt.Sprintf("; rounding alone will hardly bring it down to %.3g V/m (%s): the radius would be comparable to the conductor itself; widen the gaps and re-run", target, what)
	case r > 0:
		msg += fmt.Sprintf("; round the edge with a radius of about %.2g %s to bring it down to %.3g V/m (%s) and re-run", r/scale, unit, target, what)
	default:
		msg += "; round the edge and re-run"
	}
	return msg
}

// ownerLength returns the length of the panels of owner o that bound the
// domain.
func (f *Fields) ownerLength(o int) float64 {
	l := 0.0
	for _, p := range f.Sol.Mesh.Panels {
		if p.Owner == o && !p.Interface() {
			l += p.Length()
		}
	}
	return l
}
