package main

import (
	"fmt"
	"math"

	"github.com/rimfield/rimfield/bem/electro"
	"github.com/rimfield/rimfield/geom"
)

// refineLimit is the largest panel count for which solve runs the peak
// refinement study (a second solve with about twice the panels, some eight
// times the work of the first). Beyond it the study is skipped with a
// warning.
const refineLimit = 2500

func init() {
	physicsHooks[geom.Electrostatic] = physicsHook{
		results: electroResults,
		columns: electroColumns,
	}
}

// electroExtras is what the electrostatic section of results.json holds
// beyond the contract's capacitance and peak_field. Every value is SI.
type electroExtras struct {
	// PartialCapacitance splits the Maxwell matrix into the capacitances
	// between conductors and to the rest.
	PartialCapacitance *partialCapacitance `json:"partial_capacitance,omitempty"`
	// CapacitanceAsymmetry is max|C_ij - C_ji| / max|C_ii| (exact: 0).
	CapacitanceAsymmetry *number `json:"capacitance_asymmetry,omitempty"`
	// EnergyJPerM is the stored energy per metre (null when infinite).
	EnergyJPerM number `json:"energy_J_per_m"`
	// Forces is the force per metre on each conductor.
	Forces []electroForce `json:"forces"`
	// Breakdown compares the regions that have a breakdown field with it.
	Breakdown []breakdownMargin `json:"breakdown"`
	// PeakRefinement is the peak field on a mesh with the panels halved.
	PeakRefinement *peakRefinement `json:"peak_refinement,omitempty"`
	// SingularCorners lists the conductors' corners where the field is
	// infinite in theory.
	SingularCorners []singularCorner `json:"singular_corners"`
	// Warnings are the electrostatic concerns (also in the top-level list).
	Warnings []string `json:"warnings"`
}

// partialCapacitance is c_ij = -C_ij between conductors i != j (0 on the
// diagonal) and c_i0 = sum_j C_ij to everything else, F/m.
type partialCapacitance struct {
	Conductors []string   `json:"conductors"`
	Mutual     [][]number `json:"mutual"`
	ToGround   []number   `json:"to_ground"`
}

// electroForce is the force per metre on one conductor, N/m.
type electroForce struct {
	Name string `json:"name"`
	Fx   number `json:"fx"`
	Fy   number `json:"fy"`
}

// breakdownMargin is the peak field of a region against its breakdown
// field, V/m; x and y in metres.
type breakdownMargin struct {
	Region         string `json:"region"`
	BreakdownField number `json:"breakdown_field"`
	PeakField      number `json:"peak_field"`
	X              number `json:"x"`
	Y              number `json:"y"`
	Ratio          number `json:"ratio"`
	Exceeded       bool   `json:"exceeded"`
}

// peakRefinement is the conductor peak field (V/m) on the mesh solved and
// on one with the panels halved, and their ratio.
type peakRefinement struct {
	Coarse       number `json:"coarse"`
	Fine         number `json:"fine"`
	Ratio        number `json:"ratio"`
	CoarsePanels int    `json:"coarse_panels"`
	FinePanels   int    `json:"fine_panels"`
}

// singularCorner is a corner of a conductor where |E| ~ r^exponent; x, y in
// metres; opening_deg is the field-side opening angle. Kind is "corner" (a
// sharp edge of the conductor), "electrode_edge" (the conductor ends on an
// insulated boundary) or "junction" (a dielectric interface meets the
// conductor there).
type singularCorner struct {
	Boundary   string `json:"boundary"`
	Kind       string `json:"kind"`
	X          number `json:"x"`
	Y          number `json:"y"`
	OpeningDeg number `json:"opening_deg"`
	Exponent   number `json:"exponent"`
}

// noSystem is the warning for a job without an assembled system (built by
// hand), which cannot give the electrostatic section.
const noSystem = "the electrostatic section (capacitance matrix, peak field) was not computed: the job has no assembled system"

// electroResults fills the electrostatic section of results.json.
func electroResults(j *job, r *results) error {
	if j.system == nil {
		r.Warnings = append(r.Warnings, noSystem)
		return nil
	}
	sec, extras, err := electroSection(j)
	if err != nil {
		return err
	}
	sec.electroExtras = extras
	r.Electrostatic = sec
	r.Warnings = append(r.Warnings, extras.Warnings...)
	return nil
}

// electroSection runs the electrostatic analysis of a solved job and
// returns the contract's section and the extras.
func electroSection(j *job) (*electrostaticSection, *electroExtras, error) {
	o := electro.Options{Refine: len(j.mesh.Panels) <= refineLimit, AirDefault: j.airBreakdown}
	rep, err := electro.Analyse(j.scene, j.system, j.sol, o)
	if err != nil {
		return nil, nil, fmt.Errorf("electrostatic results: %w", err)
	}
	sec := &electrostaticSection{}
	ex := &electroExtras{
		EnergyJPerM:     number(rep.Energy),
		Forces:          []electroForce{},
		Breakdown:       []breakdownMargin{},
		SingularCorners: []singularCorner{},
		Warnings:        append([]string{}, rep.Warnings...),
	}
	if cm := rep.Capacitance; cm != nil {
		sec.Capacitance = &capacitance{Conductors: cm.Names, Matrix: numbers2(cm.C)}
		mutual, ground := cm.Partial()
		ex.PartialCapacitance = &partialCapacitance{Conductors: cm.Names, Mutual: numbers2(mutual), ToGround: numbers(ground)}
		a := number(cm.Asymmetry)
		ex.CapacitanceAsymmetry = &a
	}
	if pk := rep.Peak; pk != nil {
		sec.PeakField = &peakField{Value: number(pk.Value), X: number(pk.At.X), Y: number(pk.At.Y), Boundary: pk.Boundary}
		if rf := rep.Refinement; rf != nil {
			ex.PeakRefinement = &peakRefinement{
				Coarse: number(rf.Coarse.Value), Fine: number(rf.Fine.Value), Ratio: number(rf.Ratio),
				CoarsePanels: rf.CoarsePanels, FinePanels: rf.FinePanels,
			}
		} else {
			w := fmt.Sprintf("the peak field was not checked on a finer mesh (%d panels, more than %d): compare with a run at --panels %d before trusting it",
				len(j.mesh.Panels), refineLimit, 2*len(j.mesh.Panels))
			ex.Warnings = append(ex.Warnings, w)
		}
	}
	for _, f := range rep.Forces {
		ex.Forces = append(ex.Forces, electroForce{Name: f.Name, Fx: number(f.F.X), Fy: number(f.F.Y)})
	}
	for _, m := range rep.Margins {
		ex.Breakdown = append(ex.Breakdown, breakdownMargin{
			Region: m.Region, BreakdownField: number(m.Strength), PeakField: number(m.Peak),
			X: number(m.At.X), Y: number(m.At.Y), Ratio: number(m.Ratio), Exceeded: m.Exceeded,
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
		ex.SingularCorners = append(ex.SingularCorners, singularCorner{
			Boundary: c.Boundary, Kind: kind, X: number(c.At.X), Y: number(c.At.Y),
			OpeningDeg: number(c.Opening * 180 / math.Pi), Exponent: number(c.Exponent),
		})
	}
	return sec, ex, nil
}

// electroColumns returns the electrostatic columns of boundary.csv: the
// free surface charge density (the inflow density on boundaries, 0 on
// interfaces), the normal field on the panel's region side (positive out
// of a conductor into the field) and the field strength there. They come
// with the electrostatic section: none for a job without a system.
func electroColumns(j *job) ([]csvColumn, error) {
	if j.system == nil {
		return nil, nil
	}
	f := electro.PanelFields(j.sol)
	mag := make([]float64, len(f.Normal))
	for i, p := range j.mesh.Panels {
		mag[i] = f.Magnitude(i, p.Left)
	}
	return []csvColumn{
		{"charge_density_C_per_m2", f.Charge},
		{"field_normal_V_per_m", f.Normal},
		{"field_V_per_m", mag},
	}, nil
}

func numbers(v []float64) []number {
	out := make([]number, len(v))
	for i, x := range v {
		out[i] = number(x)
	}
	return out
}

func numbers2(m [][]float64) [][]number {
	out := make([][]number, len(m))
	for i, row := range m {
		out[i] = numbers(row)
	}
	return out
}
