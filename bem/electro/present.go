package electro

import (
	"cmp"
	"fmt"
	"math"
	"slices"
	"strings"

	"github.com/rimfield/rimfield/bem"
	"github.com/rimfield/rimfield/bem/draw"
	"github.com/rimfield/rimfield/bem/grid"
	"github.com/rimfield/rimfield/bem/job"
	"github.com/rimfield/rimfield/geom"
	"github.com/rimfield/rimfield/mesh"
	"gonum.org/v1/gonum/spatial/r2"
)

// present fills the parts of out meant for people from the section of
// results.json (so that the pictures and the report say what results.json
// says): the headline, the line under it, the report's tables, the table
// of regions, the surface-field chart and the peak's mark.
func present(out *job.Outcome, s *job.Setup, sec *Section, rep *Report) {
	size := sceneSize(s.Mesh)
	out.Headline = capacitanceText(sec)
	if out.Headline == "" {
		out.Headline = chargeHeadline(out.Solution)
	}
	if pk := sec.PeakField; pk != nil && job.IsFinite(float64(pk.Value)) {
		peak := fmt.Sprintf("peak field %s on %q", draw.FormatSI(float64(pk.Value), "V/m"), pk.Boundary)
		if peakMeshDependent(sec, size) {
			peak += " (mesh-dependent: see the warnings)"
		}
		out.Lines = append(out.Lines, peak)
		out.Peak = &job.Mark{
			At: r2.Vec{X: float64(pk.X), Y: float64(pk.Y)}, Value: float64(pk.Value), Unit: "V/m", Boundary: pk.Boundary,
			Caption: "the circle marks the peak on the conductors' surfaces (results.json peak_field)",
		}
	}
	out.Tables = tables(s.Scene, sec, size)
	out.Regions = regionTable(s, sec)
	if c := fieldChart(out.Solution, rep.Fields); c != nil {
		out.Charts = append(out.Charts, c)
	}
}

// sceneSize returns the diagonal of the area the pictures cover, metres.
func sceneSize(m *mesh.Mesh) float64 {
	s := grid.Auto(m).Size()
	return math.Hypot(s.X, s.Y)
}

// capacitanceText states the capacitances of the fixed conductors:
//
//   - two fixed conductors: the capacitance between them, -C12 of the
//     Maxwell matrix;
//   - three: the three partial capacitances between them;
//   - more: the first conductor's self-capacitance C11;
//   - one: its capacitance to ground when it has one (a ground plane);
//
// and "" when there are none (or one with nothing to return its field to).
func capacitanceText(e *Section) string {
	if e == nil || e.Capacitance == nil {
		return ""
	}
	c := e.Capacitance
	n := len(c.Conductors)
	if n < 1 || len(c.Matrix) != n {
		return ""
	}
	for _, row := range c.Matrix {
		if len(row) != n {
			return ""
		}
	}
	switch n {
	case 1:
		// One fixed conductor: its capacitance to ground (a ground plane,
		// a floating body's surroundings). Zero to rounding when nothing
		// takes its field lines back (an open scene without a ground):
		// C/eps0 is a shape factor of order 0.1 to 100 in two dimensions,
		// and 1e-6 would need a gap ratio of exp(2 pi 1e6).
		if v := float64(c.Matrix[0][0]); v > 1e-6*geom.Eps0 {
			return fmt.Sprintf("C = %s between %q and ground", draw.FormatSI(v, "F/m"), c.Conductors[0])
		}
		return ""
	case 2:
		return fmt.Sprintf("C = %s between %q and %q", draw.FormatSI(-float64(c.Matrix[0][1]), "F/m"), c.Conductors[0], c.Conductors[1])
	case 3:
		// The partial capacitances between the pairs, -C_ij, in one unit.
		var vals []float64
		var pairs []string
		for i := range 3 {
			for k := i + 1; k < 3; k++ {
				vals = append(vals, -float64(c.Matrix[i][k]))
				pairs = append(pairs, c.Conductors[i]+"–"+c.Conductors[k])
			}
		}
		d := draw.DisplayFor("F/m", job.MaxAbs(vals))
		parts := make([]string, len(vals))
		for i, v := range vals {
			parts[i] = pairs[i] + " " + d.Number(job.Denoise(v, vals))
		}
		return "capacitances " + strings.Join(parts, ", ") + " " + d.Unit
	}
	return fmt.Sprintf("self-capacitance C11 = %s of %q (%d conductors: matrix in the report)", draw.FormatSI(float64(c.Matrix[0][0]), "F/m"), c.Conductors[0], n)
}

// chargeHeadline states the charge on the conductor at the highest fixed
// potential, or on the floating conductor with the largest charge and the
// potential it floats at, when there is no capacitance to state.
func chargeHeadline(sol *bem.Solution) string {
	lay := sol.Mesh.Layout
	best, bestV := -1, math.Inf(-1)
	for i, o := range lay.Owners {
		if o.Cond.Kind == geom.Potential && o.Cond.Value > bestV {
			best, bestV = i, o.Cond.Value
		}
	}
	owners := sol.Owners()
	if best >= 0 {
		res := owners[best]
		return fmt.Sprintf("charge %s on %q (%s)", draw.FormatSI(res.Inflow, "C/m"), res.Name, draw.FormatSI(bestV, "V"))
	}
	f := -1
	for i, o := range lay.Owners {
		if o.Cond.Kind == geom.Floating && (f < 0 || math.Abs(o.Cond.NetInflow) > math.Abs(lay.Owners[f].Cond.NetInflow)) {
			f = i
		}
	}
	if f < 0 || f >= len(sol.Floating) {
		return ""
	}
	return fmt.Sprintf("charge %s on %q, floating at %s", draw.FormatSI(owners[f].Inflow, "C/m"), owners[f].Name, draw.FormatSI(sol.Floating[f], "V"))
}

// peakMeshDependent reports whether the conductors' peak field depends on
// the mesh: it sits on a singular corner, or the refinement study moved it
// by more than 1 % (the threshold of Analyse's warnings). size is the
// scene's size in metres.
func peakMeshDependent(e *Section, size float64) bool {
	if e.PeakField == nil {
		return false
	}
	if rf := e.PeakRefinement; rf != nil && math.Abs(float64(rf.Ratio)-1) > 0.01 {
		return true
	}
	return peakCorner(e, size) != nil
}

// peakCorner returns the singular corner at which the peak field sits, or
// nil. size is the scene's size in metres.
func peakCorner(e *Section, size float64) *SectionCorner {
	if e.PeakField == nil {
		return nil
	}
	px, py := float64(e.PeakField.X), float64(e.PeakField.Y)
	best, at := math.Inf(1), -1
	for i, c := range e.SingularCorners {
		if d := math.Hypot(float64(c.X)-px, float64(c.Y)-py); d < best {
			best, at = d, i
		}
	}
	// The peak is reported on the panel next to the corner, the corner at
	// the vertex: the same point to the first panel's size (observed 6e-6
	// of the scene's size in busbars), while distinct corners lie a
	// geometric feature apart (8 mm of 250 mm there): 1e-4 of the size
	// tells them apart.
	if at < 0 || best > 1e-4*size {
		return nil
	}
	return &e.SingularCorners[at]
}

// cornerAt returns the singular corner at (x, y) metres (within 1e-4 of the
// scene's size, as peakCorner), or nil.
func cornerAt(cs []SectionCorner, x, y, size float64) *SectionCorner {
	for i, c := range cs {
		if math.Hypot(float64(c.X)-x, float64(c.Y)-y) <= 1e-4*size {
			return &cs[i]
		}
	}
	return nil
}

// cornerKind names a kind of singular corner of the section for people.
func cornerKind(kind string) string {
	switch kind {
	case "junction":
		return "junction with a dielectric interface"
	case "electrode_edge":
		return "electrode edge on an insulated boundary"
	}
	return "sharp edge"
}

// forceResolution is the smallest force component, relative to the
// largest, that the report shows: a tenth of the 1e-3 that the default mesh
// promises for integrated results (bem's pipeline tests), so that what
// shows is above the solution's error.
const forceResolution = 1e-4

// tables builds the report's electrostatic parts from the section: the
// capacitance matrix, the partial capacitances, the peak field with its
// refinement check, the breakdown margins, the stored energy, the forces
// and the singular corners.
func tables(sc *geom.Scene, e *Section, size float64) []job.Table {
	var out []job.Table
	var largestC float64
	if c := e.Capacitance; c != nil && len(c.Conductors) > 0 && len(c.Matrix) == len(c.Conductors) {
		var all []float64
		for _, row := range c.Matrix {
			for _, v := range row {
				all = append(all, float64(v))
			}
		}
		largestC = job.MaxAbs(all)
		disp := draw.DisplayFor("F/m", largestC)
		t := job.Table{Title: "Capacitance matrix (" + disp.Unit + ")", Head: append([]string{""}, c.Conductors...)}
		t.Num = make([]bool, len(t.Head))
		for k := 1; k < len(t.Num); k++ {
			t.Num[k] = true
		}
		for i, row := range c.Matrix {
			cells := []string{c.Conductors[i]}
			for _, v := range row {
				cells = append(cells, disp.Number(job.Denoise(float64(v), all)))
			}
			t.Rows = append(t.Rows, cells)
		}
		note := "Maxwell matrix: entry (i, j) is the charge per metre on i with 1 V on j and 0 V on the other fixed conductors."
		if a := e.CapacitanceAsymmetry; a != nil {
			note += fmt.Sprintf(" Symmetric to %s of its largest diagonal entry (exact: 0).", job.FormatNumber(float64(*a)))
		}
		t.Notes = []string{note}
		out = append(out, t)
	}
	if p := e.PartialCapacitance; p != nil && len(p.Mutual) == len(p.Conductors) && len(p.ToGround) == len(p.Conductors) {
		// Between each pair once, then to ground; one unit for all. A
		// to-ground value below Noise times the matrix's largest entry is
		// rounding (a closed scene's conductors take every field line).
		var names []string
		var vals []float64
		for i := range p.Conductors {
			for k := i + 1; k < len(p.Conductors); k++ {
				if k < len(p.Mutual[i]) {
					names = append(names, p.Conductors[i]+" – "+p.Conductors[k])
					vals = append(vals, float64(p.Mutual[i][k]))
				}
			}
		}
		for i, c := range p.Conductors {
			names = append(names, c+" – ground")
			v := float64(p.ToGround[i])
			if math.Abs(v) < job.Noise*largestC {
				v = 0
			}
			vals = append(vals, v)
		}
		disp := draw.DisplayFor("F/m", job.MaxAbs(vals))
		t := job.Table{Title: "Partial capacitances", Head: []string{"between", job.Head("capacitance", disp)}, Num: []bool{false, true}}
		for i, n := range names {
			t.Rows = append(t.Rows, []string{n, disp.Number(vals[i])})
		}
		t.Notes = []string{"Between two conductors: c_ij = −C_ij. To ground: the row sum, the capacitance to everything that is not a fixed conductor of the matrix (a ground plane, infinity); 0 when the conductors enclose the field. Charges follow as Q_i = c_i0 V_i + Σ_j c_ij (V_i − V_j)."}
		out = append(out, t)
	}
	if pk := e.PeakField; pk != nil && job.IsFinite(float64(pk.Value)) {
		disp := draw.DisplayFor("V/m", float64(pk.Value))
		t := job.Table{Title: "Peak field on the conductors", Rows: [][]string{
			{"peak field", disp.Format(float64(pk.Value))},
			{"on", pk.Boundary},
			{"at", job.Where(sc, r2.Vec{X: float64(pk.X), Y: float64(pk.Y)})},
		}}
		if rf := e.PeakRefinement; rf != nil {
			t.Rows = append(t.Rows, []string{"refinement check", fmt.Sprintf("%s with %d panels, %s with %d panels (panels halved): ratio fine / coarse %.3f",
				disp.Format(float64(rf.Coarse)), rf.CoarsePanels, disp.Format(float64(rf.Fine)), rf.FinePanels, float64(rf.Ratio))})
		}
		if c := peakCorner(e, size); c != nil {
			t.Rows = append(t.Rows, []string{"singular corner", fmt.Sprintf("%s with a field-side opening of %s°, where |E| ~ r^%.2f: infinite in theory, so the value depends on the mesh",
				cornerKind(c.Kind), job.FormatNumber(float64(c.OpeningDeg)), float64(c.Exponent))})
		}
		for _, w := range e.Warnings {
			if strings.HasPrefix(w, "the peak field") {
				t.Warnings = append(t.Warnings, w)
			}
		}
		out = append(out, t)
	}
	if len(e.Breakdown) > 0 {
		var fields []float64
		for _, m := range e.Breakdown {
			fields = append(fields, float64(m.BreakdownField), float64(m.PeakField))
		}
		disp := draw.DisplayFor("V/m", job.MaxAbs(fields))
		t := job.Table{
			Title: "Breakdown margins",
			Head:  []string{"region", job.Head("breakdown field", disp), job.Head("peak field in the region", disp), "at", "peak / breakdown", "exceeded", "note"},
			Num:   []bool{false, true, true, false, true, false, false},
			Alarm: "EXCEEDED",
		}
		for _, m := range e.Breakdown {
			flag := "no"
			if m.Exceeded {
				flag = "EXCEEDED"
			}
			note := ""
			if c := cornerAt(e.SingularCorners, float64(m.X), float64(m.Y), size); c != nil {
				note = "at a " + cornerKind(c.Kind) + ": mesh-dependent"
			}
			t.Rows = append(t.Rows, []string{m.Region, disp.Number(float64(m.BreakdownField)), disp.Number(float64(m.PeakField)),
				job.Where(sc, r2.Vec{X: float64(m.X), Y: float64(m.Y)}), fmt.Sprintf("%.3f", float64(m.Ratio)), flag, note})
		}
		t.Notes = []string{"Peak field in each region that has a breakdown field, against it. A peak at a singular corner grows as the mesh is refined: compare it with care (see the peak field above and the cautions)."}
		for _, w := range e.Warnings {
			if strings.HasPrefix(w, "the field in") {
				t.Warnings = append(t.Warnings, w)
			}
		}
		out = append(out, t)
	}
	energy := "infinite (see the warnings)"
	if v := float64(e.EnergyJPerM); job.IsFinite(v) {
		energy = draw.FormatSI(v, "J/m")
	}
	out = append(out, job.Table{Title: "Stored energy", Rows: [][]string{{"energy per metre of length (½ Σ V Q over the boundaries)", energy}}})
	if len(e.Forces) > 0 {
		var comps []float64
		for _, f := range e.Forces {
			comps = append(comps, float64(f.Fx), float64(f.Fy))
		}
		disp := draw.DisplayFor("N/m", job.MaxAbs(comps))
		t := job.Table{Title: "Forces on the conductors", Head: []string{"conductor", job.Head("Fx", disp), job.Head("Fy", disp), job.Head("|F|", disp)}, Num: []bool{false, true, true, true}}
		// A component below forceResolution of the largest is below the
		// solution's accuracy (a zero by symmetry comes out near 1e-7).
		res := forceResolution * job.MaxAbs(comps)
		for _, f := range e.Forces {
			fx, fy := float64(f.Fx), float64(f.Fy)
			if math.Abs(fx) < res {
				fx = 0
			}
			if math.Abs(fy) < res {
				fy = 0
			}
			t.Rows = append(t.Rows, []string{f.Name, disp.Number(fx), disp.Number(fy), disp.Number(math.Hypot(fx, fy))})
		}
		t.Notes = []string{"Force per metre of length on each conductor (x right, y up). Components below 10^-4 of the largest are below the solution's accuracy and show as 0."}
		out = append(out, t)
	}
	if len(e.SingularCorners) > 0 {
		t := job.Table{Title: "Singular corners", Head: []string{"boundary", "kind", "at", "field-side opening (°)", "exponent of r in |E|"}, Num: []bool{false, false, false, true, true}}
		for _, c := range e.SingularCorners {
			t.Rows = append(t.Rows, []string{c.Boundary, cornerKind(c.Kind), job.Where(sc, r2.Vec{X: float64(c.X), Y: float64(c.Y)}),
				job.FormatNumber(float64(c.OpeningDeg)), fmt.Sprintf("%.3f", float64(c.Exponent))})
		}
		t.Notes = []string{"Near each, |E| grows like r to the exponent given (negative: infinite at the corner); values on the panels next to them depend on the mesh."}
		out = append(out, t)
	}
	return out
}

// regionTable lists the regions with their relative permittivity and,
// where one is known, their breakdown field.
func regionTable(s *job.Setup, e *Section) *job.Table {
	lay := s.Mesh.Layout
	if len(lay.Regions) == 0 {
		return nil
	}
	strength := map[string]float64{}
	for _, m := range e.Breakdown {
		strength[m.Region] = float64(m.BreakdownField)
	}
	var fields []float64
	for _, rg := range lay.Regions {
		fields = append(fields, strength[rg.Name])
	}
	disp := draw.DisplayFor("V/m", job.MaxAbs(fields))
	withBD := job.MaxAbs(fields) > 0 // a breakdown column only when some region has one
	t := &job.Table{Head: []string{"region", "relative permittivity εr"}, Num: []bool{false, true}}
	if withBD {
		t.Head, t.Num = append(t.Head, job.Head("breakdown field", disp)), append(t.Num, true)
	}
	for _, rg := range lay.Regions {
		name := rg.Name
		if rg.Background && !strings.Contains(name, "background") {
			name += " (background)"
		}
		m := rg.Material
		eps := job.FormatNumber(m.Kx / geom.Eps0)
		if !m.Isotropic() {
			eps = fmt.Sprintf("%s along x, %s along y", job.FormatNumber(m.Kx/geom.Eps0), job.FormatNumber(m.Ky/geom.Eps0))
		}
		row := []string{name, eps}
		if withBD {
			bd := "not given"
			if v := strength[rg.Name]; v > 0 {
				bd = disp.Number(v)
			}
			row = append(row, bd)
		}
		t.Rows = append(t.Rows, row)
	}
	return t
}

// columns returns the electrostatic columns of boundary.csv: the free
// surface charge density (the inflow density on boundaries, 0 on
// interfaces), the normal field on the panel's region side (positive out of
// a conductor into the field) and the field strength there.
func columns(sol *bem.Solution, f *Fields) []job.Column {
	mag := make([]float64, len(f.Normal))
	for i, p := range sol.Mesh.Panels {
		mag[i] = f.Magnitude(i, p.Left)
	}
	return []job.Column{
		{Header: "charge_density_C_per_m2", Values: f.Charge},
		{Header: "field_normal_V_per_m", Values: f.Normal},
		{Header: "field_V_per_m", Values: mag},
	}
}

// fieldChart is the field strength at the surface of every conductor
// (fixed or floating potential) against the arc length along it, in
// metres: where the field peaks along each conductor, and how sharply. Nil
// without conductors.
func fieldChart(sol *bem.Solution, f *Fields) *draw.Chart {
	m := sol.Mesh
	byOwner := make([][]int, len(m.Layout.Owners))
	for i, p := range m.Panels {
		if p.Owner < 0 || p.Interface() {
			continue
		}
		if k := p.Cond.Kind; k == geom.Potential || k == geom.Floating {
			byOwner[p.Owner] = append(byOwner[p.Owner], i)
		}
	}
	var series []draw.Series
	for o, idx := range byOwner {
		if len(idx) == 0 {
			continue
		}
		slices.SortStableFunc(idx, func(a, b int) int { return cmp.Compare(m.Panels[a].S, m.Panels[b].S) })
		s := draw.Series{Name: m.Layout.Owners[o].Name}
		for k, i := range idx {
			p := m.Panels[i]
			if k > 0 {
				q := m.Panels[idx[k-1]]
				if p.S-q.S > 0.75*(p.Length()+q.Length()) { // a gap between pieces: break the line
					s.X, s.Y = append(s.X, math.NaN()), append(s.Y, math.NaN())
				}
			}
			s.X = append(s.X, p.S)
			s.Y = append(s.Y, f.Magnitude(i, p.Left))
		}
		series = append(series, s)
	}
	if len(series) == 0 {
		return nil
	}
	return &draw.Chart{
		Title:  "Field strength at the conductors' surfaces (infinite in theory at sharp corners)",
		YLabel: "field strength |E|", YUnit: "V/m", Series: series, Clip: 0.98,
	}
}
