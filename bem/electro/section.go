package electro

import (
	"fmt"
	"math"

	"github.com/rimfield/rimfield/bem/job"
)

// Section is the electrostatic section of results.json. Capacitance and
// PeakField are the keys of the results contract; the others may grow.
// Every value is SI.
type Section struct {
	Capacitance *SectionMatrix `json:"capacitance,omitempty"`
	PeakField   *SectionPeak   `json:"peak_field,omitempty"`
	// PartialCapacitance splits the Maxwell matrix into the capacitances
	// between conductors and to the rest.
	PartialCapacitance *SectionPartial `json:"partial_capacitance,omitempty"`
	// CapacitanceAsymmetry is max|C_ij - C_ji| / max|C_ii| (exact: 0).
	CapacitanceAsymmetry *job.Number `json:"capacitance_asymmetry,omitempty"`
	// EnergyJPerM is the stored energy per metre (null when infinite).
	EnergyJPerM job.Number `json:"energy_J_per_m"`
	// Forces is the force per metre on each conductor.
	Forces []SectionForce `json:"forces"`
	// Breakdown compares the regions that have a breakdown field with it.
	Breakdown []SectionMargin `json:"breakdown"`
	// PeakRefinement is the peak field on a mesh with the panels halved.
	PeakRefinement *SectionRefinement `json:"peak_refinement,omitempty"`
	// SingularCorners lists the conductors' corners where the field is
	// infinite in theory.
	SingularCorners []SectionCorner `json:"singular_corners"`
	// Warnings are the electrostatic concerns (also in the top-level list).
	Warnings []string `json:"warnings"`
}

// SectionMatrix is the Maxwell capacitance matrix per metre: entry (i, j)
// is the charge per metre on conductor i with 1 V on j and 0 V on the
// others.
type SectionMatrix struct {
	Conductors []string       `json:"conductors"`
	Matrix     [][]job.Number `json:"matrix"` // F/m
}

// SectionPeak is the largest field strength on a conductor.
type SectionPeak struct {
	Value    job.Number `json:"value"` // V/m
	X        job.Number `json:"x"`     // m
	Y        job.Number `json:"y"`     // m
	Boundary string     `json:"boundary"`
}

// SectionPartial is c_ij = -C_ij between conductors i != j (0 on the
// diagonal) and c_i0 = sum_j C_ij to everything else, F/m.
type SectionPartial struct {
	Conductors []string       `json:"conductors"`
	Mutual     [][]job.Number `json:"mutual"`
	ToGround   []job.Number   `json:"to_ground"`
}

// SectionForce is the force per metre on one conductor, N/m.
type SectionForce struct {
	Name string     `json:"name"`
	Fx   job.Number `json:"fx"`
	Fy   job.Number `json:"fy"`
}

// SectionMargin is the peak field of a region against its breakdown
// field, V/m; x and y in metres.
type SectionMargin struct {
	Region         string     `json:"region"`
	BreakdownField job.Number `json:"breakdown_field"`
	PeakField      job.Number `json:"peak_field"`
	X              job.Number `json:"x"`
	Y              job.Number `json:"y"`
	Ratio          job.Number `json:"ratio"`
	Exceeded       bool       `json:"exceeded"`
}

// SectionRefinement is the conductor peak field (V/m) on the mesh solved
// and on one with the panels halved, and their ratio.
type SectionRefinement struct {
	Coarse       job.Number `json:"coarse"`
	Fine         job.Number `json:"fine"`
	Ratio        job.Number `json:"ratio"`
	CoarsePanels int        `json:"coarse_panels"`
	FinePanels   int        `json:"fine_panels"`
}

// SectionCorner is a corner of a conductor where |E| ~ r^exponent; x, y in
// metres; opening_deg is the field-side opening angle. Kind is "corner" (a
// sharp edge of the conductor), "electrode_edge" (the conductor ends on an
// insulated boundary) or "junction" (a dielectric interface meets the
// conductor there).
type SectionCorner struct {
	Boundary   string     `json:"boundary"`
	Kind       string     `json:"kind"`
	X          job.Number `json:"x"`
	Y          job.Number `json:"y"`
	OpeningDeg job.Number `json:"opening_deg"`
	Exponent   job.Number `json:"exponent"`
}

// NewSection turns a Report into the section of results.json. panels is the
// number of panels solved, for the warning when the refinement study was
// skipped (refined is false).
func NewSection(rep *Report, panels int, refined bool) *Section {
	sec := &Section{
		EnergyJPerM:     job.Number(rep.Energy),
		Forces:          []SectionForce{},
		Breakdown:       []SectionMargin{},
		SingularCorners: []SectionCorner{},
		Warnings:        append([]string{}, rep.Warnings...),
	}
	if cm := rep.Capacitance; cm != nil {
		sec.Capacitance = &SectionMatrix{Conductors: cm.Names, Matrix: job.Numbers2(cm.C)}
		mutual, ground := cm.Partial()
		sec.PartialCapacitance = &SectionPartial{Conductors: cm.Names, Mutual: job.Numbers2(mutual), ToGround: job.Numbers(ground)}
		a := job.Number(cm.Asymmetry)
		sec.CapacitanceAsymmetry = &a
	}
	if pk := rep.Peak; pk != nil {
		sec.PeakField = &SectionPeak{Value: job.Number(pk.Value), X: job.Number(pk.At.X), Y: job.Number(pk.At.Y), Boundary: pk.Boundary}
		if rf := rep.Refinement; rf != nil {
			sec.PeakRefinement = &SectionRefinement{
				Coarse: job.Number(rf.Coarse.Value), Fine: job.Number(rf.Fine.Value), Ratio: job.Number(rf.Ratio),
				CoarsePanels: rf.CoarsePanels, FinePanels: rf.FinePanels,
			}
		} else if !refined {
			w := fmt.Sprintf("the peak field was not checked on a finer mesh (%d panels, more than %d): compare with a run at --panels %d before trusting it",
				panels, RefineLimit, 2*panels)
			sec.Warnings = append(sec.Warnings, w)
		}
	}
	for _, f := range rep.Forces {
		sec.Forces = append(sec.Forces, SectionForce{Name: f.Name, Fx: job.Number(f.F.X), Fy: job.Number(f.F.Y)})
	}
	for _, m := range rep.Margins {
		sec.Breakdown = append(sec.Breakdown, SectionMargin{
			Region: m.Region, BreakdownField: job.Number(m.Strength), PeakField: job.Number(m.Peak),
			X: job.Number(m.At.X), Y: job.Number(m.At.Y), Ratio: job.Number(m.Ratio), Exceeded: m.Exceeded,
		})
	}
	for _, c := range rep.Corners {
		kind := "corner"
		switch {
		case c.Junction:
			kind = "junction"
		case c.Mixed:
			kind = "electrode_edge"
		}
		sec.SingularCorners = append(sec.SingularCorners, SectionCorner{
			Boundary: c.Boundary, Kind: kind, X: job.Number(c.At.X), Y: job.Number(c.At.Y),
			OpeningDeg: job.Number(c.Opening * 180 / math.Pi), Exponent: job.Number(c.Exponent),
		})
	}
	return sec
}
