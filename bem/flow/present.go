package flow

import (
	"bytes"
	"cmp"
	"encoding/csv"
	"fmt"
	"math"
	"slices"
	"strconv"

	"github.com/rimfield/rimfield/bem"
	"github.com/rimfield/rimfield/bem/draw"
	"github.com/rimfield/rimfield/bem/grid"
	"github.com/rimfield/rimfield/bem/job"
	"github.com/rimfield/rimfield/geom"
	"gonum.org/v1/gonum/spatial/r2"
)

// present fills the parts of out meant for people: the headline with C_L
// and C_m, the lines under it, the report's tables, the fluid's table,
// the suction peak and the stagnation points on the maps, the streamline
// levels, the velocity equipotentials, the -Cp chart and the sweep's
// plot and table.
func present(out *job.Outcome, sc *geom.Scene, rep *Report, sweep []SweepPoint) {
	w, c := rep.Whole, rep.WholeChord
	out.Headline = fmt.Sprintf("C_L = %s, C_m = %s (quarter chord, nose-up positive), Γ = %s", fixed(w.CL), fixed(w.CM), draw.FormatSI(w.Circulation, "m^2/s"))
	out.Lines = []string{
		fmt.Sprintf("stream %s at %s, chord %s; lift %s at %s kg/m³", speedText(rep.Stream.Speed), angleText(rep.Stream.AngleDeg),
			sceneLength(sc, c.Length), draw.FormatSI(w.Lift, "N/m"), job.FormatNumber(rep.Density)),
		fmt.Sprintf("from the surface pressure: C_L = %s, C_D = %s (zero in theory: a check of the panels)", fixed(w.CLPressure), job.FormatNumber(w.CD)),
	}
	out.Tables = tables(sc, rep, sweep)
	out.Regions = &job.Table{Head: []string{"fluid", job.Head("density", draw.DisplayFor("kg/m^3", rep.Density)), job.Head("dynamic pressure", draw.DisplayFor("Pa", rep.Dynamic))},
		Num: []bool{false, true, true}, Rows: [][]string{{"ideal (inviscid, incompressible)", job.FormatNumber(rep.Density), draw.DisplayFor("Pa", rep.Dynamic).Number(rep.Dynamic)}}}

	m := rep.System.Mesh
	best := -1
	for j, p := range rep.Panels {
		if p.Body >= 0 && (best < 0 || p.Speed > rep.Panels[best].Speed) {
			best = j
		}
	}
	if best >= 0 {
		pr := rep.Panels[best]
		p := m.Panels[best]
		out.Peak = &job.Mark{
			At: p.Mid(), Value: pr.Speed, Unit: "m/s", Boundary: rep.Bodies[pr.Body].Name,
			Text:    fmt.Sprintf("peak %s (Cp %s)", speedText(pr.Speed), fixed(pr.Cp)),
			Caption: "the circle marks the highest surface speed, the suction peak (lowest Cp); the stagnation points are marked too",
		}
		sharp := false
		edges := trailingEdges(rep.System.Bodies)
		for _, c := range m.SingularCorners() {
			if (c.At == p.A || c.At == p.B) && !slices.Contains(edges, c.At) {
				sharp = true
			}
		}
		if sharp {
			// At a sharp corner other than a trailing edge the speed is
			// infinite in theory: the value is the mesh's.
			out.Peak.Text = fmt.Sprintf("peak %s at a sharp corner (infinite in theory)", speedText(pr.Speed))
			out.Warnings = append(out.Warnings, fmt.Sprintf("the highest surface speed, %s on %q at %s, sits at a sharp corner where ideal flow turns with infinite speed: the value depends on the mesh; round the corner to read a suction peak",
				speedText(pr.Speed), rep.Bodies[pr.Body].Name, job.Where(sc, p.Mid())))
		}
	}
	for _, b := range rep.Bodies {
		for _, p := range b.Stagnation {
			out.Marks = append(out.Marks, job.Mark{At: p, Text: "stagnation"})
		}
	}
	// Streamlines: contours of psi spaced evenly over the window's range,
	// through the first body's own value (its dividing streamline).
	ref := 0.0
	if len(rep.Bodies) > 0 {
		ref = rep.Solution.Floating[rep.Bodies[0].Owner]
	}
	out.Levels = func(lo, hi float64, k int) []float64 { return streamLevels(lo, hi, k, ref) }
	sol := rep.Solution
	speed := rep.Stream.Speed
	out.FluxLines = func(win grid.Window, k int) [][]r2.Vec { return equipotentials(sol, win, k, speed) }

	if ch := pressureChart(rep); ch != nil {
		out.Plots = append(out.Plots, job.Plot{Name: "pressure", Caption: "−Cp against x/c along the chord line of each body, upper and lower surfaces told apart: the usual way a section's pressure distribution is read.", Charts: draw.Charts{ch}})
	}
	if len(sweep) > 0 {
		out.Plots = append(out.Plots, job.Plot{Name: "sweep", Caption: "The incidence sweep: lift and moment coefficients against the stream's angle, on the scene's one factorisation.", Charts: sweepCharts(sweep)})
		out.Files = append(out.Files, job.File{Name: "sweep.csv", Data: sweepCSV(sweep)})
	}
}

// fixed writes a coefficient with 4 decimals.
func fixed(v float64) string {
	if !job.IsFinite(v) {
		return "n/a"
	}
	return strconv.FormatFloat(v, 'f', 4, 64)
}

// streamLevels returns about k levels evenly spaced over (lo, hi), one of
// them ref.
func streamLevels(lo, hi float64, k int, ref float64) []float64 {
	if !(hi > lo) || k < 1 {
		return nil
	}
	step := (hi - lo) / float64(k+1)
	var out []float64
	for i := math.Ceil((lo - ref) / step); ; i++ {
		v := ref + i*step
		if v >= hi {
			break
		}
		if v > lo {
			out = append(out, v)
		}
	}
	return out
}

// equipotentials traces the lines of constant velocity potential across
// the window: orthogonal to the streamlines, seeded along the window's
// upper and lower edges at the spacing that makes the net of streamlines
// and equipotentials square far away (one step of psi over the speed).
// A line from the upper edge that ends on a body is completed by one from
// the lower edge.
func equipotentials(sol *bem.Solution, w grid.Window, k int, speed float64) [][]r2.Vec {
	size := w.Size()
	if k < 1 || !(size.X > 0) || !(size.Y > 0) {
		return nil
	}
	dx := size.Y / float64(k+1)
	inset := 1e-3 * size.Y
	var top, bottom []grid.Start
	for x := w.Min.X + 0.5*dx; x < w.Max.X; x += dx {
		top = append(top, grid.Start{At: r2.Vec{X: x, Y: w.Max.Y - inset}})
		bottom = append(bottom, grid.Start{At: r2.Vec{X: x, Y: w.Min.Y + inset}, Against: true})
	}
	// The flux -grad psi runs from the upper edge down for a stream from
	// the left; for one from the right the roles swap.
	if sol.Uniform.Y < 0 {
		for i := range top {
			top[i].Against, bottom[i].Against = true, false
		}
	}
	var out [][]r2.Vec
	var again []grid.Start
	for i, l := range grid.TraceFrom(sol, w, top, grid.TraceOptions{}) {
		if len(l.Points) > 1 {
			out = append(out, l.Points)
		}
		if l.Boundary || len(l.Points) <= 1 {
			again = append(again, bottom[i])
		}
	}
	for _, l := range grid.TraceFrom(sol, w, again, grid.TraceOptions{}) {
		if len(l.Points) > 1 {
			out = append(out, l.Points)
		}
	}
	return out
}

// tables builds the report's flow parts: the whole's coefficients, each
// body's, the stagnation points and the sweep.
func tables(sc *geom.Scene, rep *Report, sweep []SweepPoint) []job.Table {
	w, c := rep.Whole, rep.WholeChord
	lift := draw.DisplayFor("N/m", w.Lift)
	whole := job.Table{Title: "Lift, moment and circulation", Rows: [][]string{
		{"lift coefficient C_L (Kutta–Joukowski, 2 Γ / (U c))", fixed(w.CL)},
		{"lift coefficient from the surface pressure", fixed(w.CLPressure)},
		{"pressure drag coefficient C_D (zero in theory: a check of the panels)", job.FormatNumber(w.CD)},
		{"moment coefficient C_m about the quarter chord, nose-up positive", fixed(w.CM)},
		{"circulation Γ (clockwise positive)", draw.FormatSI(w.Circulation, "m^2/s")},
		{"lift per metre ρ U Γ", lift.Format(w.Lift)},
		{"stream", speedText(rep.Stream.Speed) + " at " + angleText(rep.Stream.AngleDeg) + " (anticlockwise from x)"},
		{"reference chord c", sceneLength(sc, c.Length)},
		{"chord line", "from " + job.Where(sc, c.LeadingEdge) + " to " + job.Where(sc, c.TrailingEdge) + "; quarter chord at " + job.Where(sc, c.QuarterChord)},
	}}
	whole.Notes = []string{"Ideal flow: no viscosity, so no boundary layer, separation, stall or skin friction; see the cautions."}
	out := []job.Table{whole}
	if len(rep.Bodies) > 1 || (len(rep.Bodies) == 1 && !rep.Bodies[0].Kutta) {
		t := job.Table{Title: "Bodies", Head: []string{"body", "Kutta condition", "chord (" + sceneUnit(sc) + ")", "Γ (m²/s)", "C_L", "C_L from pressure", "C_D", "C_m"},
			Num: []bool{false, false, true, true, true, true, true, true}}
		for _, b := range rep.Bodies {
			k := "none (no circulation)"
			if b.Kutta {
				k = "at " + job.Where(sc, b.Chord.TrailingEdge)
			}
			_, s := job.SceneUnit(sc)
			t.Rows = append(t.Rows, []string{b.Name, k, job.FormatNumber(b.Chord.Length / s), job.FormatNumber(b.Circulation), fixed(b.CL), fixed(b.CLPressure), job.FormatNumber(b.CD), fixed(b.CM)})
		}
		t.Notes = []string{"Each body's coefficients on its own chord, its moment about its own quarter chord."}
		out = append(out, t)
	}
	st := job.Table{Title: "Stagnation points", Head: []string{"body", "at"}}
	for _, b := range rep.Bodies {
		for _, p := range b.Stagnation {
			st.Rows = append(st.Rows, []string{b.Name, job.Where(sc, p)})
		}
	}
	if len(st.Rows) > 0 {
		st.Notes = []string{"Where the surface velocity changes direction; with a Kutta condition the trailing edge comes last."}
		out = append(out, st)
	}
	if len(sweep) > 0 {
		t := job.Table{Title: "Incidence sweep", Head: []string{"stream angle (°)", "C_L", "C_L from pressure", "C_D", "C_m", "Γ (m²/s)"},
			Num: []bool{true, true, true, true, true, true}}
		for _, p := range sweep {
			t.Rows = append(t.Rows, []string{job.FormatNumber(p.AngleDeg), fixed(p.Whole.CL), fixed(p.Whole.CLPressure), job.FormatNumber(p.Whole.CD), fixed(p.Whole.CM), job.FormatNumber(p.Whole.Circulation)})
		}
		t.Notes = []string{"One factorisation serves every angle; the chord lines stay those of the scene's own stream. Ideal flow does not stall: beyond a few degrees short of the section's stall these lift values are too high."}
		out = append(out, t)
	}
	return out
}

func sceneUnit(sc *geom.Scene) string {
	u, _ := job.SceneUnit(sc)
	return u
}

// columns returns the flow columns of boundary.csv: surface speed,
// tangential velocity (along the panel from its first point to its
// second), pressure coefficient, x/c on the body's chord line and the
// surface the panel is on.
func columns(rep *Report) []job.Column {
	n := len(rep.Panels)
	speed, tang, cp, xc := make([]float64, n), make([]float64, n), make([]float64, n), make([]float64, n)
	side := make([]string, n)
	for j, p := range rep.Panels {
		speed[j], tang[j], cp[j], xc[j] = p.Speed, p.Tangential, p.Cp, p.XOverC
		if p.Body < 0 {
			xc[j] = math.NaN()
			continue
		}
		side[j] = p.Side.String()
	}
	return []job.Column{
		{Header: "speed_m_per_s", Values: speed},
		{Header: "tangential_velocity_m_per_s", Values: tang},
		{Header: "pressure_coefficient", Values: cp},
		{Header: "x_over_c", Values: xc},
		{Header: "surface", Text: side},
	}
}

// pressureChart is -Cp against x/c, one series per body and surface, in
// chord order.
func pressureChart(rep *Report) *draw.Chart {
	var series []draw.Series
	for i, b := range rep.Bodies {
		for _, sd := range []Side{Upper, Lower} {
			var idx []int
			for j, p := range rep.Panels {
				if p.Body == i && p.Side == sd {
					idx = append(idx, j)
				}
			}
			if len(idx) == 0 {
				continue
			}
			slices.SortStableFunc(idx, func(a, b int) int { return cmp.Compare(rep.Panels[a].XOverC, rep.Panels[b].XOverC) })
			s := draw.Series{Name: b.Name + " " + sd.String()}
			for _, j := range idx {
				s.X = append(s.X, rep.Panels[j].XOverC)
				s.Y = append(s.Y, -rep.Panels[j].Cp)
			}
			series = append(series, s)
		}
	}
	if len(series) == 0 {
		return nil
	}
	return &draw.Chart{Title: "Pressure distribution: −Cp against x/c (suction up)", XLabel: "x/c along the chord line (leading edge 0, trailing edge 1)",
		YLabel: "−Cp", Series: series, Clip: 0.99}
}

// sweepCharts are C_L (both ways) and C_m against the stream's angle.
func sweepCharts(sweep []SweepPoint) draw.Charts {
	var a, kj, pr, cm []float64
	for _, p := range sweep {
		a = append(a, p.AngleDeg)
		kj = append(kj, p.Whole.CL)
		pr = append(pr, p.Whole.CLPressure)
		cm = append(cm, p.Whole.CM)
	}
	return draw.Charts{
		{Title: "Lift curve (ideal flow: no stall)", XLabel: "stream angle (degrees)", YLabel: "C_L",
			Series: []draw.Series{{Name: "Kutta–Joukowski", X: a, Y: kj}, {Name: "surface pressure", X: a, Y: pr}}},
		{Title: "Moment about the quarter chord (nose-up positive)", XLabel: "stream angle (degrees)", YLabel: "C_m",
			Series: []draw.Series{{Name: "C_m", X: a, Y: cm}}},
	}
}

// sweepCSV writes the sweep as CSV with units in the header.
func sweepCSV(sweep []SweepPoint) []byte {
	var b bytes.Buffer
	w := csv.NewWriter(&b)
	w.Write([]string{"angle_deg", "lift_coefficient", "lift_coefficient_pressure", "drag_coefficient", "moment_coefficient", "circulation_m2_per_s"})
	f := func(v float64) string { return strconv.FormatFloat(v, 'g', -1, 64) }
	for _, p := range sweep {
		w.Write([]string{f(p.AngleDeg), f(p.Whole.CL), f(p.Whole.CLPressure), f(p.Whole.CD), f(p.Whole.CM), f(p.Whole.Circulation)})
	}
	w.Flush()
	return b.Bytes()
}
