package seep

import (
	"math"

	"github.com/rimfield/rimfield/bem/job"
)

// Section is the seepage section of results.json. Discharge,
// ExitGradient, PipingSafety and Structures hold the keys of the results
// contract; the others may grow. Every value is SI (pressures in kPa,
// forces in kN/m as the contract states).
type Section struct {
	// Discharge is the seepage per metre width, m^2/s.
	Discharge job.Number `json:"discharge"`
	// ExitGradient is the governing exit gradient (1) and where it is (m);
	// nil when no water leaves through a fixed head.
	ExitGradient *SectionExit `json:"exit_gradient,omitempty"`
	// PipingSafety is critical gradient / exit gradient (1).
	PipingSafety *job.Number `json:"piping_safety,omitempty"`
	// Structures is the uplift on every structure in contact with the soil.
	Structures []SectionStructure `json:"structures"`

	// DischargeM3PerDay is the discharge in m^3/day per metre width.
	DischargeM3PerDay job.Number `json:"discharge_m3_per_day"`
	// Outflow is the water leaving the soil (m^2/s), Imbalance the relative
	// difference (discharge - outflow)/discharge: a check (0 in theory).
	Outflow   job.Number `json:"outflow"`
	Imbalance job.Number `json:"imbalance"`
	// UnitWeightWater (kN/m^3) and CriticalGradient (1) as used.
	UnitWeightWater  job.Number `json:"unit_weight_water"`
	CriticalGradient job.Number `json:"critical_gradient"`
	// PipingSafetyRequired is the least acceptable piping safety the
	// warnings compare with (1).
	PipingSafetyRequired job.Number `json:"piping_safety_required"`
	// Exits lists every face where water leaves the soil.
	Exits []SectionExit `json:"exits"`
	// Heave is Terzaghi's check beside each structure reaching below an
	// exit face.
	Heave []SectionHeave `json:"heave"`
	// Creep is Lane's weighted creep check; nil without a structure on a
	// bed.
	Creep *SectionCreep `json:"creep,omitempty"`
	// Truncation is the study with the outer walls moved out, when asked
	// for (--truncation-check).
	Truncation *SectionTruncation `json:"truncation,omitempty"`
	// Warnings are the seepage concerns (also in the top-level list).
	Warnings []string `json:"warnings"`
}

// SectionExit is the exit gradient of one exit face.
type SectionExit struct {
	Value job.Number `json:"value"` // 1
	X     job.Number `json:"x"`     // m
	Y     job.Number `json:"y"`     // m
	// Boundary is the exit face; Outflow the water leaving through it
	// (m^2/s).
	Boundary string     `json:"boundary"`
	Outflow  job.Number `json:"outflow"`
	// Corner tells that Value is the limit at a vertex of the face (from
	// the local expansion of the head), Singular that the gradient is
	// infinite there in theory and Value its mean over AveragedOver
	// metres of the face, growing like r^Exponent.
	Corner       bool        `json:"at_corner"`
	Singular     bool        `json:"singular"`
	AveragedOver *job.Number `json:"averaged_over,omitempty"`
	Exponent     *job.Number `json:"exponent,omitempty"`
	// PipingSafety is critical gradient / Value for this face.
	PipingSafety job.Number `json:"piping_safety"`
}

// SectionStructure is the uplift on one structure.
type SectionStructure struct {
	Name string `json:"name"`
	// UpliftForce is the vertical resultant of the pore pressure, up
	// (kN/m); UpliftX its line of action (m; null without uplift).
	UpliftForce job.Number `json:"uplift_force"`
	UpliftX     job.Number `json:"uplift_x"`
	// HorizontalForce is the horizontal resultant toward +x (kN/m).
	HorizontalForce job.Number `json:"horizontal_force"`
	// ContactLength and BaseLength (m): the contact with the soil and its
	// part facing the soil below.
	ContactLength job.Number `json:"contact_length"`
	BaseLength    job.Number `json:"base_length"`
}

// SectionHeave is Terzaghi's heave check of the prism beside a structure.
type SectionHeave struct {
	Structure  string     `json:"structure"`
	Face       string     `json:"face"`
	X          job.Number `json:"x"`           // m, where the structure meets the exit face
	Y          job.Number `json:"y"`           // m
	Depth      job.Number `json:"depth"`       // m, embedment d below the exit face
	Width      job.Number `json:"width"`       // m, d/2
	ExcessHead job.Number `json:"excess_head"` // m, mean head above the tailwater at the prism's base
	// Safety is i_c d / h_a (1); null when no excess head acts on the
	// prism.
	Safety *job.Number `json:"safety"`
}

// SectionCreep is Lane's weighted creep check.
type SectionCreep struct {
	Structures []string   `json:"structures"`
	Vertical   job.Number `json:"vertical"`   // m
	Horizontal job.Number `json:"horizontal"` // m
	Weighted   job.Number `json:"weighted"`   // m, Lw
	Head       job.Number `json:"head"`       // m, H
	Ratio      job.Number `json:"ratio"`      // 1, Lw/H
	Required   job.Number `json:"required"`   // 1, for the soil named (0: none)
	SafeFor    []string   `json:"safe_for"`
}

// SectionTruncation is the study with the outer walls moved out.
type SectionTruncation struct {
	Factor             job.Number `json:"factor"`
	Moved              []string   `json:"moved"`
	Panels             int        `json:"panels"`
	MovedDischarge     job.Number `json:"moved_discharge"`
	DischargeChange    job.Number `json:"discharge_change"`
	MovedExitGradient  job.Number `json:"moved_exit_gradient"`
	ExitGradientChange job.Number `json:"exit_gradient_change"`
}

func exitOf(e *Exit, ic float64) SectionExit {
	s := SectionExit{Value: job.Number(e.Value), X: job.Number(e.At.X), Y: job.Number(e.At.Y), Boundary: e.Boundary,
		Outflow: job.Number(e.Outflow), Corner: e.Corner, Singular: e.Singular, PipingSafety: job.Number(ic / e.Value)}
	if e.Singular {
		l, p := job.Number(e.AveragedOver), job.Number(e.Exponent)
		s.AveragedOver, s.Exponent = &l, &p
	}
	return s
}

// newSection turns a Report (and a truncation study) into the section of
// results.json.
func newSection(rep *Report, required float64, tr *TruncationStudy) *Section {
	sec := &Section{
		Discharge:            job.Number(rep.Discharge),
		Structures:           []SectionStructure{},
		DischargeM3PerDay:    job.Number(rep.Discharge * 86400),
		Outflow:              job.Number(rep.Outflow),
		Imbalance:            job.Number(rep.Imbalance),
		UnitWeightWater:      job.Number(rep.UnitWeight),
		CriticalGradient:     job.Number(rep.CriticalGradient),
		PipingSafetyRequired: job.Number(required),
		Exits:                []SectionExit{},
		Heave:                []SectionHeave{},
		Warnings:             append([]string{}, rep.Warnings...),
	}
	if math.IsNaN(rep.Imbalance) {
		sec.Imbalance = 0
	}
	if g := rep.ExitGradient; g != nil {
		e := exitOf(g, rep.CriticalGradient)
		sec.ExitGradient = &e
		ps := job.Number(rep.PipingSafety)
		sec.PipingSafety = &ps
	}
	for i := range rep.Exits {
		sec.Exits = append(sec.Exits, exitOf(&rep.Exits[i], rep.CriticalGradient))
	}
	for _, s := range rep.Structures {
		x := job.Number(s.UpliftX)
		if s.Uplift == 0 {
			x = 0
		}
		sec.Structures = append(sec.Structures, SectionStructure{Name: s.Name, UpliftForce: job.Number(s.Uplift), UpliftX: x,
			HorizontalForce: job.Number(s.Horizontal), ContactLength: job.Number(s.Contact), BaseLength: job.Number(s.Base)})
	}
	for _, h := range rep.Heave {
		var fs *job.Number
		if job.IsFinite(h.Safety) {
			v := job.Number(h.Safety)
			fs = &v
		}
		sec.Heave = append(sec.Heave, SectionHeave{Structure: h.Structure, Face: h.Face, X: job.Number(h.Corner.X), Y: job.Number(h.Corner.Y),
			Depth: job.Number(h.Depth), Width: job.Number(h.Width), ExcessHead: job.Number(h.ExcessHead), Safety: fs})
	}
	if c := rep.Creep; c != nil {
		sec.Creep = &SectionCreep{Structures: c.Structures, Vertical: job.Number(c.Vertical), Horizontal: job.Number(c.Horizontal),
			Weighted: job.Number(c.Weighted), Head: job.Number(c.Head), Ratio: job.Number(c.Ratio), Required: job.Number(c.Required),
			SafeFor: append([]string{}, c.SafeFor...)}
	}
	if tr != nil {
		sec.Truncation = &SectionTruncation{Factor: job.Number(tr.Factor), Moved: tr.Moved, Panels: tr.Panels,
			MovedDischarge: job.Number(tr.MovedDischarge), DischargeChange: job.Number(tr.DischargeChange),
			MovedExitGradient: job.Number(tr.MovedExitGradient), ExitGradientChange: job.Number(tr.ExitGradientChange)}
		sec.Warnings = append(sec.Warnings, tr.Warnings...)
	}
	return sec
}
