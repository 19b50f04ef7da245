package seep

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
	"gonum.org/v1/gonum/spatial/r2"
)

// present fills the parts of out meant for people: the headline discharge
// in the units practitioners use, the exit gradient and uplift lines, the
// report's tables, the exit point marked, the water levels over the beds,
// the head and pore pressure along the structures and the uplift diagram.
func present(out *job.Outcome, sc *geom.Scene, rep *Report, sec *Section, tr *TruncationStudy) {
	q := rep.Discharge
	out.Headline = fmt.Sprintf("discharge %s m³/day per metre (%s L/s per metre)", job.FormatNumber(q*86400), job.FormatNumber(q*1000))
	if g := rep.ExitGradient; g != nil {
		line := fmt.Sprintf("exit gradient %s on %q", job.FormatNumber(g.Value), g.Boundary)
		if g.Singular {
			line = fmt.Sprintf("exit gradient %s on %q, the mean over %s (infinite at %s)", job.FormatNumber(g.Value), g.Boundary, length(sc, g.AveragedOver), job.Where(sc, g.At))
		}
		out.Lines = append(out.Lines, line+fmt.Sprintf("; piping safety %s (least acceptable %s)",
			job.FormatNumber(rep.PipingSafety), job.FormatNumber(float64(sec.PipingSafetyRequired))))
		text := "exit gradient " + job.FormatNumber(g.Value)
		if g.Singular {
			text = fmt.Sprintf("mean exit gradient %s over %s", job.FormatNumber(g.Value), length(sc, g.AveragedOver))
		}
		out.Peak = &job.Mark{At: g.At, Value: g.Value, Unit: "1", Boundary: g.Boundary, Text: text, Title: text + fmt.Sprintf(" on %q", g.Boundary),
			Caption: "the circle marks the governing exit gradient (results.json exit_gradient)"}
	}
	var up []string
	for _, s := range rep.Structures {
		if s.Uplift > 0 {
			up = append(up, fmt.Sprintf("%s %s at x = %s", s.Name, draw.FormatSI(s.Uplift*1e3, "N/m"), length(sc, s.UpliftX)))
		}
	}
	if len(up) > 0 {
		out.Lines = append(out.Lines, "uplift: "+strings.Join(up, "; "))
	}
	out.Tables = tables(sc, rep, sec, tr)
	out.Window = view(rep.Solution)
	out.Overlays, out.Extent = waterLevels(sc, rep.Solution, out.Window)
	out.Charts = contactCharts(rep)
	if p := upliftPlot(sc, rep); p != nil {
		out.Plots = append(out.Plots, *p)
	}
}

// view is the default window of a seepage section: the structures and
// twice the soil's depth on either side of them, from the section's bottom
// up to the top of the structures, within the section; nil when the
// structures take up most of the section anyway (or there are none).
func view(sol *bem.Solution) *grid.Window {
	m := sol.Mesh
	lo, hi := m.Bounds()
	slo := r2.Vec{X: math.Inf(1), Y: math.Inf(1)}
	shi := r2.Vec{X: math.Inf(-1), Y: math.Inf(-1)}
	for _, p := range m.Panels {
		if p.Owner < 0 || m.Layout.Owners[p.Owner].Part != geom.PartBody {
			continue
		}
		for _, v := range []r2.Vec{p.A, p.B} {
			slo = r2.Vec{X: math.Min(slo.X, v.X), Y: math.Min(slo.Y, v.Y)}
			shi = r2.Vec{X: math.Max(shi.X, v.X), Y: math.Max(shi.Y, v.Y)}
		}
	}
	if math.IsInf(slo.X, 1) {
		return nil
	}
	depth := shi.Y - lo.Y
	x0, x1 := math.Max(lo.X, slo.X-2*depth), math.Min(hi.X, shi.X+2*depth)
	if x1-x0 > 0.6*(hi.X-lo.X) {
		return nil
	}
	margin := 0.04 * (x1 - x0)
	return &grid.Window{Min: r2.Vec{X: x0, Y: lo.Y - margin}, Max: r2.Vec{X: x1, Y: math.Max(hi.Y, shi.Y) + margin}}
}

// length writes a length given in metres in the scene's unit.
func length(sc *geom.Scene, l float64) string {
	unit, s := job.SceneUnit(sc)
	return job.FormatNumber(l/s) + " " + unit
}

// exitText describes an exit gradient and where it is.
func exitText(sc *geom.Scene, e *Exit) string {
	switch {
	case e.Singular:
		return fmt.Sprintf("exit gradient infinite in theory at %s on %q (r^%.2g): %s averaged over %s of the face",
			job.Where(sc, e.At), e.Boundary, e.Exponent, job.FormatNumber(e.Value), length(sc, e.AveragedOver))
	case e.Corner:
		return fmt.Sprintf("exit gradient %s at the corner %s of %q", job.FormatNumber(e.Value), job.Where(sc, e.At), e.Boundary)
	}
	return fmt.Sprintf("exit gradient %s at %s on %q", job.FormatNumber(e.Value), job.Where(sc, e.At), e.Boundary)
}

// tables builds the report's seepage parts.
func tables(sc *geom.Scene, rep *Report, sec *Section, tr *TruncationStudy) []job.Table {
	q := rep.Discharge
	qd := draw.DisplayFor("m^2/s", q)
	out := []job.Table{{Title: "Discharge", Rows: [][]string{
		{"discharge per metre width", qd.Format(q)},
		{"in m³ per day per metre", job.FormatNumber(q * 86400)},
		{"in litres per second per metre", job.FormatNumber(q * 1000)},
		{"water leaving the soil (a check: equal in theory)", qd.Format(rep.Outflow)},
	}, Notes: []string{"The discharge is the water entering the soil through the beds; it is proportional to the hydraulic conductivity, rarely known within a factor of ten: run the range of plausible values."}}}

	if len(rep.Exits) > 0 {
		t := job.Table{Title: "Exit gradients and piping", Head: []string{"exit face", "exit gradient", "at", "how", "piping safety i_c/i"},
			Num: []bool{false, true, false, false, true}}
		for i := range rep.Exits {
			e := &rep.Exits[i]
			how := "largest panel value on the face"
			switch {
			case e.Singular:
				how = fmt.Sprintf("infinite in theory (r^%.2g): mean over %s of the face", e.Exponent, length(sc, e.AveragedOver))
			case e.Corner:
				how = "limit at the corner (local expansion of the head)"
			}
			t.Rows = append(t.Rows, []string{e.Boundary, job.FormatNumber(e.Value), job.Where(sc, e.At), how, job.FormatNumber(rep.CriticalGradient / e.Value)})
		}
		t.Notes = []string{fmt.Sprintf("Critical gradient i_c = %s (problem.critical_gradient); least acceptable piping safety %s (common practice: 3 to 4 against the exit gradient in sands, from memory; your code governs).",
			job.FormatNumber(rep.CriticalGradient), job.FormatNumber(float64(sec.PipingSafetyRequired)))}
		for _, w := range rep.Warnings {
			if strings.Contains(w, "piping") || strings.Contains(w, "exit gradient") {
				t.Warnings = append(t.Warnings, w)
			}
		}
		out = append(out, t)
	}
	if len(rep.Structures) > 0 {
		t := job.Table{Title: "Uplift on the structures", Head: []string{"structure", "uplift (kN/m)", "line of action x (" + sceneUnit(sc) + ")", "horizontal (kN/m)", "contact length (" + sceneUnit(sc) + ")"},
			Num: []bool{false, true, true, true, true}}
		_, s := job.SceneUnit(sc)
		for _, st := range rep.Structures {
			x := "–"
			if st.Uplift != 0 {
				x = job.FormatNumber(st.UpliftX / s)
			}
			t.Rows = append(t.Rows, []string{st.Name, job.FormatNumber(st.Uplift), x, job.FormatNumber(st.Horizontal), job.FormatNumber(st.Contact / s)})
		}
		t.Notes = []string{fmt.Sprintf("Pore pressure p = γw (h − y), γw = %s kN/m³, integrated over each structure's contact with the soil: uplift positive up, horizontal positive toward +x. It acts with the other loads in the stability check your code prescribes.", job.FormatNumber(rep.UnitWeight))}
		out = append(out, t)
	}
	if len(rep.Heave) > 0 {
		t := job.Table{Title: "Heave beside the structures (Terzaghi)", Head: []string{"structure", "exit face", "embedment d (" + sceneUnit(sc) + ")", "prism width d/2", "excess head h_a (m)", "safety i_c d / h_a"},
			Num: []bool{false, false, true, true, true, true}}
		_, s := job.SceneUnit(sc)
		for _, h := range rep.Heave {
			fs := "no excess head"
			if job.IsFinite(h.Safety) {
				fs = job.FormatNumber(h.Safety)
			}
			t.Rows = append(t.Rows, []string{h.Structure, h.Face, job.FormatNumber(h.Depth / s), job.FormatNumber(h.Width / s), job.FormatNumber(h.ExcessHead), fs})
		}
		t.Notes = []string{fmt.Sprintf("The soil prism d deep and d/2 wide beside the structure on the exit side heaves when the excess head at its base outweighs it (Terzaghi, Theoretical Soil Mechanics, 1943); the submerged unit weight is taken as i_c γw. Usual least factors 1.5 to 2 (common practice, from memory); this run warns below %s.", job.FormatNumber(DefaultHeaveSafety))}
		out = append(out, t)
	}
	if c := rep.Creep; c != nil {
		t := job.Table{Title: "Lane's weighted creep (a cross-check)", Rows: [][]string{
			{"structures counted", strings.Join(c.Structures, ", ")},
			{"contact steeper than 45°", length(sc, c.Vertical)},
			{"contact flatter than 45° (counted one third)", length(sc, c.Horizontal)},
			{"weighted creep length Lw", length(sc, c.Weighted)},
			{"head difference H", job.FormatNumber(c.Head) + " m"},
			{"weighted creep ratio Lw/H", job.FormatNumber(c.Ratio)},
		}}
		if c.Required > 0 {
			t.Rows = append(t.Rows, []string{"least safe ratio for the soil named", job.FormatNumber(c.Required)})
		}
		safe := "none of Lane's soils"
		if len(c.SafeFor) > 0 {
			safe = strings.Join(c.SafeFor, ", ")
		}
		t.Rows = append(t.Rows, []string{"safe by Lane's table for", safe})
		t.Notes = []string{"Lane, Security from under-seepage: masonry dams on earth foundations, Trans. ASCE 100, 1935 (ratios from memory, as commonly tabulated). An empirical rule, independent of the computed flow: where the two disagree, find out why before relying on either."}
		out = append(out, t)
	}
	if tr != nil {
		t := job.Table{Title: "Truncation check: outer walls moved out", Rows: [][]string{
			{"walls moved", strings.Join(tr.Moved, ", ")},
			{"distance to the walls multiplied by", job.FormatNumber(tr.Factor)},
			{"discharge", fmt.Sprintf("%s → %s (%+.2f %%)", qd.Format(tr.Discharge), qd.Format(tr.MovedDischarge), 100*tr.DischargeChange)},
			{"exit gradient", fmt.Sprintf("%s → %s (%+.2f %%)", job.FormatNumber(tr.ExitGradient), job.FormatNumber(tr.MovedExitGradient), 100*tr.ExitGradientChange)},
			{"panels of the moved section", fmt.Sprint(tr.Panels)},
		}}
		t.Warnings = tr.Warnings
		out = append(out, t)
	}
	return out
}

func sceneUnit(sc *geom.Scene) string {
	u, _ := job.SceneUnit(sc)
	return u
}

// columns returns the seepage columns of boundary.csv: the total head, the
// pore pressure and the hydraulic gradient across the boundary.
func columns(rep *Report) []job.Column {
	return []job.Column{
		{Header: "head_m", Values: rep.Head},
		{Header: "pore_pressure_kPa", Values: rep.PorePressure},
		{Header: "normal_gradient", Values: rep.NormalGradient},
	}
}

// waterLevels draws the water surface over every bed at a fixed head that
// lies above it: a level line at the head's elevation over the bed's
// extent (within the view win, if any), the highest named headwater and
// the lowest tailwater; and the points the pictures must take in.
func waterLevels(sc *geom.Scene, sol *bem.Solution, win *grid.Window) ([]draw.Overlay, []r2.Vec) {
	lay := sol.Mesh.Layout
	type bed struct {
		name      string
		head      float64
		lo, hi, y float64
	}
	var beds []bed
	hi, lo := math.Inf(-1), math.Inf(1) // over every fixed head, drawn or not
	for o, ow := range lay.Owners {
		if ow.Cond.Kind == geom.Potential {
			hi, lo = math.Max(hi, ow.Cond.Value), math.Min(lo, ow.Cond.Value)
		}
		if ow.Part != geom.PartEdge || ow.Cond.Kind != geom.Potential {
			continue
		}
		b := bed{name: ow.Name, head: ow.Cond.Value, lo: math.Inf(1), hi: math.Inf(-1), y: math.Inf(-1)}
		for _, p := range sol.Mesh.Panels {
			if p.Owner == o && !p.Interface() {
				for _, v := range []r2.Vec{p.A, p.B} {
					b.lo, b.hi, b.y = math.Min(b.lo, v.X), math.Max(b.hi, v.X), math.Max(b.y, v.Y)
				}
			}
		}
		if b.hi > b.lo && b.head > b.y {
			beds = append(beds, b)
		}
	}
	if len(beds) == 0 {
		return nil, nil
	}
	var ovs []draw.Overlay
	var ext []r2.Vec
	for _, b := range beds {
		label := fmt.Sprintf("%s: head %s m", b.name, job.FormatNumber(b.head))
		switch {
		case b.head == hi && hi > lo:
			label = "headwater: head " + job.FormatNumber(b.head) + " m"
		case b.head == lo && hi > lo:
			label = "tailwater: head " + job.FormatNumber(b.head) + " m"
		}
		if win != nil {
			// Within the view: the pictures show the water over the beds
			// near the structures.
			b.lo, b.hi = math.Max(b.lo, win.Min.X), math.Min(b.hi, win.Max.X)
			if !(b.hi > b.lo) {
				continue
			}
		}
		pts := []r2.Vec{{X: b.lo, Y: b.head}, {X: b.hi, Y: b.head}}
		ovs = append(ovs, draw.Overlay{Points: pts, Label: label})
		ext = append(ext, pts...)
	}
	return ovs, ext
}

// contactCharts are the head and the pore pressure along every
// structure's contact with the soil, against the arc length along it (m).
func contactCharts(rep *Report) []*draw.Chart {
	var head, pres []draw.Series
	for _, s := range rep.Structures {
		if len(s.Profile) == 0 {
			continue
		}
		h, p := draw.Series{Name: s.Name}, draw.Series{Name: s.Name}
		for k, c := range s.Profile {
			if k > 0 && c.S-s.Profile[k-1].S > 0 && c.Panel != s.Profile[k-1].Panel+1 && c.Panel != s.Profile[k-1].Panel-1 {
				// Not the neighbouring panel: a gap between pieces.
				prevEnd := s.Profile[k-1]
				if math.Hypot(c.X-prevEnd.X, c.Y-prevEnd.Y) > 2*(c.S-prevEnd.S) {
					h.X, h.Y = append(h.X, math.NaN()), append(h.Y, math.NaN())
					p.X, p.Y = append(p.X, math.NaN()), append(p.Y, math.NaN())
				}
			}
			h.X, h.Y = append(h.X, c.S), append(h.Y, c.Head)
			p.X, p.Y = append(p.X, c.S), append(p.Y, c.Pressure)
		}
		head, pres = append(head, h), append(pres, p)
	}
	if len(head) == 0 {
		return nil
	}
	return []*draw.Chart{
		{Title: "Total head along each structure's contact with the soil", YLabel: "total head", YUnit: "m", Series: head},
		{Title: "Pore pressure along each structure's contact with the soil", YLabel: "pore pressure (kPa)", Series: pres},
	}
}

// upliftPlot is the uplift diagram: the pore pressure on the base of each
// structure (its underside, flatter than 45 degrees) against x.
func upliftPlot(sc *geom.Scene, rep *Report) *job.Plot {
	unit, s := job.SceneUnit(sc)
	var series []draw.Series
	for _, st := range rep.Structures {
		var pts []ContactPoint
		for _, c := range st.Profile {
			if c.Base {
				pts = append(pts, c)
			}
		}
		if len(pts) == 0 {
			continue
		}
		slices.SortStableFunc(pts, func(a, b ContactPoint) int { return cmp.Compare(a.X, b.X) })
		sr := draw.Series{Name: st.Name}
		for _, c := range pts {
			sr.X, sr.Y = append(sr.X, c.X/s), append(sr.Y, c.Pressure)
		}
		series = append(series, sr)
	}
	if len(series) == 0 {
		return nil
	}
	return &job.Plot{Name: "uplift", Caption: "The uplift diagram: the pore pressure on the base of each structure against x.",
		Charts: draw.Charts{{Title: "Uplift: pore pressure on the base of each structure", XLabel: "x (" + unit + ")", YLabel: "pore pressure (kPa)", Series: series}}}
}
