package main

import (
	"bytes"
	"encoding/base64"
	"encoding/json"
	"fmt"
	htmltemplate "html/template"
	"math"
	"regexp"
	"sort"
	"strings"

	"github.com/rimfield/rimfield/bem/draw"
	"github.com/rimfield/rimfield/geom"
)

// reportName is the self-contained HTML report written with --report.
const reportName = "report.html"

func init() {
	artifacts = append(artifacts, artifact{name: "report", files: reportFiles})
}

// reportFiles writes report.html when --report is given: the inputs, every
// result with its unit, the pictures (embedded, when drawn), the warnings
// and the cautions that apply, in one file with no outside references.
func reportFiles(j *job) ([]outputFile, error) {
	pj := j.pics
	if pj == nil || !pj.report {
		return nil, nil
	}
	if pj.res == nil {
		return nil, fmt.Errorf("internal error: the report has no results")
	}
	data, err := buildReport(j)
	if err != nil {
		return nil, err
	}
	var buf bytes.Buffer
	if err := reportTemplate.Execute(&buf, data); err != nil {
		return nil, fmt.Errorf("internal error: report: %w", err)
	}
	return []outputFile{bytesFile(reportName, buf.Bytes())}, nil
}

// reportData is what the report template shows. Numbers reach it as text,
// formatted for people: 4 significant digits, SI prefixes where the unit
// takes them (draw.DisplayFor), lengths in the scene's unit. results.json
// keeps every number SI at full precision.
type reportData struct {
	Title    string // the page's title: the headline
	Scene    string // the scene as named in titles
	Main     string // the main result
	Peak     string // the peak field, electrostatics only
	Inputs   [][2]string
	Regions  *table
	Bounds   *table
	Infinity string
	Electro  *electroReport
	Physics  []valueRow // physics without a curated section: key, value, unit
	FlowNet  []valueRow
	Pictures []reportPicture
	NoPics   bool
	Warnings []string
	Topics   []string // the cautions' topics, for the summary at the top
	Cautions []cautionRow
	Version  string
}

// table is a table of text cells under a header row; Num marks the
// columns that hold numbers (right-aligned).
type table struct {
	Head []string
	Rows [][]string
	Num  []bool
}

type valueRow struct {
	Key, Value, Unit string
}

type reportPicture struct {
	Name, Caption string
	Src           htmltemplate.URL
}

type cautionRow struct {
	Title, Key, Text, Where string
}

// electroReport holds the electrostatic sections.
type electroReport struct {
	Matrix      *table // Maxwell capacitance matrix
	MatrixUnit  string
	Asymmetry   string
	Partial     *table // partial capacitances between pairs and to ground
	Peak        *peakReport
	Margins     *table // breakdown margins
	MarginNotes []string
	Energy      string
	Forces      *table
	Corners     *table
}

// peakReport is the conductors' peak field with its refinement check.
type peakReport struct {
	Value, Boundary, Where string
	Coarse, Fine, Ratio    string
	CoarsePanels           int
	FinePanels             int
	Corner                 string // the singular corner the peak sits on, if any
	Warnings               []string
}

// physicsUnits gives the unit of each key of the physics sections of
// results.json (README.md) that have no curated section in the report, by
// the key's last name under its section.
var physicsUnits = map[string]string{
	"discharge": "m^2/s", "exit_gradient.value": "1", "exit_gradient.x": "m", "exit_gradient.y": "m",
	"piping_safety": "1", "uplift_force": "kN/m", "uplift_x": "m",
	"lift_coefficient": "1", "circulation": "m^2/s", "moment_coefficient": "1", "reference_chord": "m",
}

func buildReport(j *job) (*reportData, error) {
	pj := j.pics
	r := pj.res
	u := r.Units
	main, peak := mainResult(j)
	d := &reportData{Title: headline(j), Scene: sceneName(j.scenePath), Main: capitalise(main), Peak: capitalise(peak), Version: r.Version}
	domain := "closed (inside the regions)"
	if r.Open {
		domain = "open (extends to infinity)"
	}
	d.Inputs = [][2]string{
		{"scene file", j.scenePath},
		{"physics", r.Physics},
		{"coordinate unit", r.Unit + " (lengths and locations below are in it; results.json is SI throughout)"},
		{"domain", domain},
		{"bodies, regions, edges", fmt.Sprintf("%d, %d, %d", len(j.scene.Bodies), len(j.scene.Regions), len(j.scene.Edges))},
		{"panels", fmt.Sprint(r.Panels)},
		{"solver", fmt.Sprintf("%s, %d unknowns, condition estimate %s", r.Solver.Kind, r.Solver.Unknowns, fmtNum(float64(r.Solver.ConditionEstimate)))},
	}
	if pj.at != nil {
		d.Inputs = append(d.Inputs, [2]string{"equipotentials", "at " + pj.atText + " " + u.Potential})
	} else {
		d.Inputs = append(d.Inputs, [2]string{"equipotentials", fmt.Sprintf("%d evenly spaced", j.levels)})
	}
	d.Regions = regionTable(j, r)
	d.Bounds = boundsTable(j, r)
	if r.PotentialAtInfinity != nil {
		d.Infinity = draw.FormatSI(float64(*r.PotentialAtInfinity), u.Potential)
	}
	if e := r.Electrostatic; e != nil {
		d.Electro = electroSections(j, e)
	}
	for _, sec := range []struct {
		name string
		v    any
	}{{"seepage", r.Seepage}, {"flow", r.Flow}} {
		rows, err := flatten(sec.name, sec.v)
		if err != nil {
			return nil, err
		}
		d.Physics = append(d.Physics, rows...)
	}
	if n := pj.net; n != nil && n.Channels > 0 {
		d.FlowNet = []valueRow{
			{"flow channels N_f (total inflow over the flux per channel k ΔH)", fmtNum(n.Channels), "1"},
			{"potential drops N_d", fmt.Sprint(n.Drops), "1"},
			{"shape factor N_f/N_d = q/(k H)", fmtNum(n.ShapeFactor), "1"},
			siRow("total inflow q through the sources", n.Inflow, u.Inflow),
			siRow("potential difference H", n.Head, u.Potential),
			siRow("conductivity k of the net (sqrt(kx ky))", n.Conductivity, u.Conductivity),
			siRow("flux between neighbouring flux lines drawn", n.Step, u.Inflow),
		}
	}
	for _, p := range pj.pictures {
		d.Pictures = append(d.Pictures, reportPicture{Name: p.name, Caption: p.caption,
			Src: htmltemplate.URL("data:image/png;base64," + base64.StdEncoding.EncodeToString(p.png))})
	}
	d.NoPics = len(d.Pictures) == 0
	d.Warnings = append(append([]string(nil), r.Warnings...), j.warnings...)
	for _, c := range r.Cautions {
		title := strings.ReplaceAll(c.Topic, "_", " ")
		title = strings.Replace(title, "2d", "2D", 1)
		d.Topics = append(d.Topics, title)
		d.Cautions = append(d.Cautions, cautionRow{Title: capitalise(title), Key: c.Topic, Text: c.Text, Where: wherePoints(j.scene, c.Where)})
	}
	return d, nil
}

// siRow is a value row in the display unit that suits the value.
func siRow(key string, v float64, unit string) valueRow {
	disp := draw.DisplayFor(unit, v)
	return valueRow{key, disp.Number(v), unitText(disp.Unit)}
}

// unitText spells an empty display unit (a dimensionless value) as "1".
func unitText(u string) string {
	if u == "" {
		return "1"
	}
	return u
}

// column formats a column of SI values in one display unit, chosen by the
// largest; values below noise times the largest show as 0.
func column(vals []float64, unit string) (cells []string, disp draw.Display) {
	disp = draw.DisplayFor(unit, maxAbs(vals))
	for _, v := range vals {
		cells = append(cells, disp.Number(denoise(v, vals)))
	}
	return cells, disp
}

// head writes a column header with its unit: "charge (nC/m)".
func head(name string, d draw.Display) string {
	if d.Unit == "" {
		return name
	}
	return name + " (" + d.Unit + ")"
}

// scale returns the scene's unit and metres per unit.
func sceneScale(sc *geom.Scene) (string, float64) {
	if s := sc.Problem.Scale; s > 0 {
		return sceneUnit(sc), s
	}
	return "m", 1
}

// where writes a point given in metres in the scene's unit, with
// no-break spaces so that it stays on one line.
func where(sc *geom.Scene, x, y float64) string {
	unit, s := sceneScale(sc)
	return fmt.Sprintf("(%s,\u00a0%s)\u00a0%s", fmtNum(x/s), fmtNum(y/s), unit)
}

func wherePoints(sc *geom.Scene, ls []location) string {
	var parts []string
	for _, l := range ls {
		s := where(sc, float64(l.X), float64(l.Y))
		if l.Boundary != "" {
			s += " on " + l.Boundary
		}
		parts = append(parts, s)
	}
	return strings.Join(parts, "; ")
}

// regionTable lists the regions and their materials: relative permittivity
// in electrostatics (with the breakdown field where one is known), the
// conductivities otherwise.
func regionTable(j *job, r *results) *table {
	if len(r.Regions) == 0 {
		return nil
	}
	name := func(rg regionInfo) string {
		if rg.Background && !strings.Contains(rg.Name, "background") {
			return rg.Name + " (background)"
		}
		return rg.Name
	}
	if e := r.Electrostatic; e != nil {
		strength := map[string]float64{}
		if e.electroExtras != nil {
			for _, m := range e.Breakdown {
				strength[m.Region] = float64(m.BreakdownField)
			}
		}
		var fields []float64
		for _, rg := range r.Regions {
			fields = append(fields, strength[rg.Name])
		}
		disp := draw.DisplayFor("V/m", maxAbs(fields))
		withBD := maxAbs(fields) > 0 // a breakdown column only when some region has one
		t := &table{Head: []string{"region", "relative permittivity εr"}, Num: []bool{false, true}}
		if withBD {
			t.Head, t.Num = append(t.Head, head("breakdown field", disp)), append(t.Num, true)
		}
		for _, rg := range r.Regions {
			eps := fmtNum(float64(rg.Kx) / geom.Eps0)
			if rg.Kx != rg.Ky {
				eps = fmt.Sprintf("%s along x, %s along y", fmtNum(float64(rg.Kx)/geom.Eps0), fmtNum(float64(rg.Ky)/geom.Eps0))
			}
			row := []string{name(rg), eps}
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
	var ks []float64
	for _, rg := range r.Regions {
		ks = append(ks, float64(rg.Kx), float64(rg.Ky))
	}
	disp := draw.DisplayFor(r.Units.Conductivity, maxAbs(ks))
	t := &table{Head: []string{"region", head("kx", disp), head("ky", disp)}, Num: []bool{false, true, true}}
	for _, rg := range r.Regions {
		t.Rows = append(t.Rows, []string{name(rg), disp.Number(float64(rg.Kx)), disp.Number(float64(rg.Ky))})
	}
	return t
}

// boundsTable lists every body and edge with its potential, inflow and
// length.
func boundsTable(j *job, r *results) *table {
	u := r.Units
	var pots, flows []float64
	for _, b := range r.Boundaries {
		pots = append(pots, float64(b.Potential))
		flows = append(flows, float64(b.Inflow))
	}
	potCells, potDisp := column(pots, u.Potential)
	flowCells, flowDisp := column(flows, u.Inflow)
	inflow := "inflow"
	if r.Physics == geom.Electrostatic.String() {
		inflow = "charge"
	}
	unit, s := sceneScale(j.scene)
	t := &table{
		Head: []string{"boundary", "part", "condition", head("potential", potDisp), head(inflow, flowDisp), "length (" + unit + ")"},
		Num:  []bool{false, false, false, true, true, true},
	}
	for i, b := range r.Boundaries {
		t.Rows = append(t.Rows, []string{b.Name, b.Part, b.Condition, potCells[i], flowCells[i], fmtNum(float64(b.Length) / s)})
	}
	return t
}

// electroSections builds the electrostatic sections of the report from
// results.json's electrostatic section.
func electroSections(j *job, e *electrostaticSection) *electroReport {
	out := &electroReport{}
	sc := j.scene
	ex := e.electroExtras
	if ex == nil {
		ex = &electroExtras{}
	}
	var largestC float64
	if c := e.Capacitance; c != nil && len(c.Conductors) > 0 && len(c.Matrix) == len(c.Conductors) {
		var all []float64
		for _, row := range c.Matrix {
			for _, v := range row {
				all = append(all, float64(v))
			}
		}
		largestC = maxAbs(all)
		disp := draw.DisplayFor("F/m", largestC)
		out.MatrixUnit = disp.Unit
		t := &table{Head: append([]string{""}, c.Conductors...)}
		t.Num = make([]bool, len(t.Head))
		for k := 1; k < len(t.Num); k++ {
			t.Num[k] = true
		}
		for i, row := range c.Matrix {
			cells := []string{c.Conductors[i]}
			for _, v := range row {
				cells = append(cells, disp.Number(denoise(float64(v), all)))
			}
			t.Rows = append(t.Rows, cells)
		}
		out.Matrix = t
		if a := ex.CapacitanceAsymmetry; a != nil {
			out.Asymmetry = fmtNum(float64(*a))
		}
	}
	if p := ex.PartialCapacitance; p != nil && len(p.Mutual) == len(p.Conductors) && len(p.ToGround) == len(p.Conductors) {
		// Between each pair once, then to ground; one unit for all. A
		// to-ground value below noise times the matrix's largest entry is
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
			if math.Abs(v) < noise*largestC {
				v = 0
			}
			vals = append(vals, v)
		}
		disp := draw.DisplayFor("F/m", maxAbs(vals))
		t := &table{Head: []string{"between", head("capacitance", disp)}, Num: []bool{false, true}}
		for i, n := range names {
			t.Rows = append(t.Rows, []string{n, disp.Number(vals[i])})
		}
		out.Partial = t
	}
	if pk := e.PeakField; pk != nil && isFinite(float64(pk.Value)) {
		disp := draw.DisplayFor("V/m", float64(pk.Value))
		pr := &peakReport{Value: disp.Format(float64(pk.Value)), Boundary: pk.Boundary, Where: where(sc, float64(pk.X), float64(pk.Y))}
		if rf := ex.PeakRefinement; rf != nil {
			pr.Coarse, pr.Fine = disp.Format(float64(rf.Coarse)), disp.Format(float64(rf.Fine))
			pr.Ratio = fmt.Sprintf("%.3f", float64(rf.Ratio))
			pr.CoarsePanels, pr.FinePanels = rf.CoarsePanels, rf.FinePanels
		}
		if c := peakCorner(e, sceneSize(j)); c != nil {
			pr.Corner = fmt.Sprintf("%s with a field-side opening of %s°, where |E| ~ r^%.2f: infinite in theory, so the value depends on the mesh",
				cornerKind(c.Kind), fmtNum(float64(c.OpeningDeg)), float64(c.Exponent))
		}
		for _, w := range ex.Warnings {
			if strings.HasPrefix(w, "the peak field") {
				pr.Warnings = append(pr.Warnings, w)
			}
		}
		out.Peak = pr
	}
	if len(ex.Breakdown) > 0 {
		var fields []float64
		for _, m := range ex.Breakdown {
			fields = append(fields, float64(m.BreakdownField), float64(m.PeakField))
		}
		disp := draw.DisplayFor("V/m", maxAbs(fields))
		t := &table{
			Head: []string{"region", head("breakdown field", disp), head("peak field in the region", disp), "at", "peak / breakdown", "exceeded", "note"},
			Num:  []bool{false, true, true, false, true, false, false},
		}
		size := sceneSize(j)
		for _, m := range ex.Breakdown {
			flag := "no"
			if m.Exceeded {
				flag = "EXCEEDED"
			}
			note := ""
			if c := cornerAt(ex.SingularCorners, float64(m.X), float64(m.Y), size); c != nil {
				note = "at a " + cornerKind(c.Kind) + ": mesh-dependent"
			}
			t.Rows = append(t.Rows, []string{m.Region, disp.Number(float64(m.BreakdownField)), disp.Number(float64(m.PeakField)),
				where(sc, float64(m.X), float64(m.Y)), fmt.Sprintf("%.3f", float64(m.Ratio)), flag, note})
		}
		out.Margins = t
		for _, w := range ex.Warnings {
			if strings.HasPrefix(w, "the field in") {
				out.MarginNotes = append(out.MarginNotes, w)
			}
		}
	}
	if v := float64(ex.EnergyJPerM); isFinite(v) {
		out.Energy = draw.FormatSI(v, "J/m")
	} else if e.electroExtras != nil {
		out.Energy = "infinite (see the warnings)"
	}
	if len(ex.Forces) > 0 {
		var comps []float64
		for _, f := range ex.Forces {
			comps = append(comps, float64(f.Fx), float64(f.Fy))
		}
		disp := draw.DisplayFor("N/m", maxAbs(comps))
		t := &table{Head: []string{"conductor", head("Fx", disp), head("Fy", disp), head("|F|", disp)}, Num: []bool{false, true, true, true}}
		// A component below forceResolution of the largest is below the
		// solution's accuracy (a zero by symmetry comes out near 1e-7).
		res := forceResolution * maxAbs(comps)
		for _, f := range ex.Forces {
			fx, fy := float64(f.Fx), float64(f.Fy)
			if math.Abs(fx) < res {
				fx = 0
			}
			if math.Abs(fy) < res {
				fy = 0
			}
			t.Rows = append(t.Rows, []string{f.Name, disp.Number(fx), disp.Number(fy), disp.Number(math.Hypot(fx, fy))})
		}
		out.Forces = t
	}
	if len(ex.SingularCorners) > 0 {
		t := &table{Head: []string{"boundary", "kind", "at", "field-side opening (°)", "exponent of r in |E|"}, Num: []bool{false, false, false, true, true}}
		for _, c := range ex.SingularCorners {
			t.Rows = append(t.Rows, []string{c.Boundary, cornerKind(c.Kind), where(sc, float64(c.X), float64(c.Y)),
				fmtNum(float64(c.OpeningDeg)), fmt.Sprintf("%.3f", float64(c.Exponent))})
		}
		out.Corners = t
	}
	return out
}

// forceResolution is the smallest force component, relative to the
// largest, that the report shows: a tenth of the 1e-3 that the default mesh
// promises for integrated results (bem's pipeline tests), so that what
// shows is above the solution's error.
const forceResolution = 1e-4

// cornerKind names a kind of singular corner of results.json for people.
func cornerKind(kind string) string {
	switch kind {
	case "junction":
		return "junction with a dielectric interface"
	case "electrode_edge":
		return "electrode edge on an insulated boundary"
	}
	return "sharp edge"
}

// cornerAt returns the singular corner at (x, y) metres (within 1e-4 of the
// scene's size, as peakCorner), or nil.
func cornerAt(cs []singularCorner, x, y, size float64) *singularCorner {
	for i, c := range cs {
		if math.Hypot(float64(c.X)-x, float64(c.Y)-y) <= 1e-4*size {
			return &cs[i]
		}
	}
	return nil
}

// flatten turns a physics section without a curated part of the report
// into rows of a readable key, value and unit, by way of its JSON form so
// that keys added later show too.
func flatten(section string, v any) ([]valueRow, error) {
	raw, err := json.Marshal(v)
	if err != nil {
		return nil, fmt.Errorf("internal error: report: %w", err)
	}
	var tree any
	if err := json.Unmarshal(raw, &tree); err != nil || tree == nil {
		return nil, nil
	}
	var rows []valueRow
	readable := func(k string) string { return strings.ReplaceAll(k, "_", " ") }
	var walk func(label, parent, last string, x any)
	walk = func(label, parent, last string, x any) {
		switch t := x.(type) {
		case map[string]any:
			keys := make([]string, 0, len(t))
			for k := range t {
				keys = append(keys, k)
			}
			sort.Strings(keys)
			for _, k := range keys {
				if k == "warnings" {
					continue // listed with the other warnings
				}
				l := readable(k)
				if label != "" {
					l = label + ", " + l
				}
				walk(l, last, k, t[k])
			}
		case []any:
			for i, e := range t {
				// An entry named by its name or region, else by its number.
				l := fmt.Sprintf("%s %d", label, i+1)
				if m, ok := e.(map[string]any); ok {
					for _, key := range []string{"name", "region", "boundary"} {
						if n, ok := m[key].(string); ok {
							l = fmt.Sprintf("%s %q", label, n)
							break
						}
					}
				}
				walk(l, last, last, e)
			}
		default:
			unit, ok := physicsUnits[parent+"."+last]
			if !ok {
				unit = physicsUnits[last]
			}
			val := "n/a (not a finite number)"
			switch y := x.(type) {
			case float64:
				if unit != "" {
					disp := draw.DisplayFor(unit, y)
					val, unit = disp.Number(y), unitText(disp.Unit)
				} else {
					val = fmtNum(y)
				}
			case string:
				if last == "name" || last == "region" || last == "boundary" {
					return // named in the label
				}
				val = y
			case bool:
				val = fmt.Sprint(y)
			}
			rows = append(rows, valueRow{label, val, unit})
		}
	}
	walk("", section, section, tree)
	return rows, nil
}

// powerOfTen matches the factor of a display unit: "10^-6".
var powerOfTen = regexp.MustCompile(`10\^(-?[0-9]+)`)

var reportTemplate = htmltemplate.Must(htmltemplate.New("report").Funcs(htmltemplate.FuncMap{
	// unit writes a display unit with its power of ten as a superscript.
	"unit": func(s string) htmltemplate.HTML {
		return htmltemplate.HTML(powerOfTen.ReplaceAllString(htmltemplate.HTMLEscapeString(s), "10<sup>$1</sup>"))
	},
	"numcol":  func(t *table, k int) bool { return k < len(t.Num) && t.Num[k] },
	"flagged": func(s string) bool { return s == "EXCEEDED" },
}).Parse(`<!DOCTYPE html>
<html lang="en">
<head>
<meta charset="utf-8">
<title>{{.Title}}</title>
<style>
body { font-family: sans-serif; max-width: 1100px; margin: 2em auto; padding: 0 1em; color: #222; line-height: 1.4; }
h1 { font-size: 1.5em; margin-bottom: 0.2em; } h2 { font-size: 1.25em; margin-top: 1.8em; border-bottom: 1px solid #ccc; }
h3 { font-size: 1.05em; margin-top: 1.4em; }
.crumb { color: #666; margin: 0; }
.lead { font-size: 1.2em; margin: 0.6em 0; }
table { border-collapse: collapse; margin: 0.5em 0; }
th, td { border: 1px solid #ccc; padding: 0.25em 0.6em; text-align: left; vertical-align: top; }
th { background: #f4f4f4; }
td.n { text-align: right; font-variant-numeric: tabular-nums; white-space: nowrap; }
td.bad { color: #a00; font-weight: bold; }
figure { margin: 1em 0; } figure img { max-width: 100%; border: 1px solid #ddd; }
figcaption { color: #555; font-size: 0.9em; }
.note { background: #f6f6f6; border-left: 4px solid #888; padding: 0.5em 1em; }
.warn { background: #fff6e0; border-left: 4px solid #d08000; padding: 0.5em 1em; margin: 0.8em 0; }
.warn ul { margin: 0.3em 0; padding-left: 1.2em; }
.small { color: #555; font-size: 0.9em; }
</style>
</head>
<body>
<p class="crumb">rimfield report</p>
<h1>{{.Scene}}</h1>
{{if .Main}}<p class="lead"><strong>{{.Main}}</strong></p>{{end}}
{{if .Peak}}<p class="lead">{{.Peak}}</p>{{end}}
{{if .Warnings}}<div class="warn" id="warnings-summary"><strong>{{with len .Warnings}}{{if eq . 1}}1 warning{{else}}{{.}} warnings{{end}}{{end}}</strong> (listed under Warnings below):
<ul>{{range .Warnings}}<li>{{.}}</li>{{end}}</ul></div>{{end}}
{{if .Topics}}<p class="small">Cautions that apply to this scene (see Cautions at the end): {{range $i, $t := .Topics}}{{if $i}}, {{end}}{{$t}}{{end}}.</p>{{end}}

<h2>Inputs</h2>
<table>
{{range .Inputs}}<tr><th>{{index . 0}}</th><td>{{index . 1}}</td></tr>
{{end}}</table>
{{with .Regions}}{{template "table" .}}{{end}}

<h2>Results per body and edge</h2>
{{with .Bounds}}{{template "table" .}}{{end}}
<p class="small">Potential: length-weighted mean over the boundary. {{if .Electro}}Charge: per metre of length (the flux entering the domain through the boundary).{{else}}Inflow: total flux entering the domain through it per metre of length (positive in).{{end}} Length: of the pieces that bound the domain. Values below 10<sup>-9</sup> of the largest in their column are rounding and show as 0.</p>
{{if .Infinity}}<p>Potential at infinity: {{.Infinity}}</p>{{end}}

{{with .Electro}}
<h2>Electrostatic results</h2>
{{if .Matrix}}
<h3>Capacitance matrix ({{unit .MatrixUnit}})</h3>
{{template "table" .Matrix}}
<p class="small">Maxwell matrix: entry (i, j) is the charge per metre on i with 1 V on j and 0 V on the other fixed conductors.{{if .Asymmetry}} Symmetric to {{.Asymmetry}} of its largest diagonal entry (exact: 0).{{end}}</p>
{{end}}
{{if .Partial}}
<h3>Partial capacitances</h3>
{{template "table" .Partial}}
<p class="small">Between two conductors: c<sub>ij</sub> = −C<sub>ij</sub>. To ground: the row sum, the capacitance to everything that is not a fixed conductor of the matrix (a ground plane, infinity); 0 when the conductors enclose the field. Charges follow as Q<sub>i</sub> = c<sub>i0</sub> V<sub>i</sub> + Σ<sub>j</sub> c<sub>ij</sub> (V<sub>i</sub> − V<sub>j</sub>).</p>
{{end}}
{{with .Peak}}
<h3>Peak field on the conductors</h3>
<table>
<tr><th>peak field</th><td>{{.Value}}</td></tr>
<tr><th>on</th><td>{{.Boundary}}</td></tr>
<tr><th>at</th><td>{{.Where}}</td></tr>
{{if .Fine}}<tr><th>refinement check</th><td>{{.Coarse}} with {{.CoarsePanels}} panels, {{.Fine}} with {{.FinePanels}} panels (panels halved): ratio fine / coarse {{.Ratio}}</td></tr>{{end}}
{{if .Corner}}<tr><th>singular corner</th><td>{{.Corner}}</td></tr>{{end}}
</table>
{{if .Warnings}}<div class="warn">{{range .Warnings}}<p>{{.}}</p>{{end}}</div>{{end}}
{{end}}
{{if .Margins}}
<h3>Breakdown margins</h3>
{{template "table" .Margins}}
<p class="small">Peak field in each region that has a breakdown field, against it. A peak at a singular corner grows as the mesh is refined: compare it with care (see the peak field above and the cautions).</p>
{{if .MarginNotes}}<div class="warn">{{range .MarginNotes}}<p>{{.}}</p>{{end}}</div>{{end}}
{{end}}
{{if .Energy}}
<h3>Stored energy</h3>
<p>{{.Energy}} (per metre of length: ½ Σ V Q over the boundaries)</p>
{{end}}
{{if .Forces}}
<h3>Forces on the conductors</h3>
{{template "table" .Forces}}
<p class="small">Force per metre of length on each conductor (x right, y up). Components below 10<sup>-4</sup> of the largest are below the solution's accuracy and show as 0.</p>
{{end}}
{{if .Corners}}
<h3>Singular corners</h3>
{{template "table" .Corners}}
<p class="small">Near each, |E| grows like r to the exponent given (negative: infinite at the corner); values on the panels next to them depend on the mesh.</p>
{{end}}
{{end}}

{{if .Physics}}
<h2>Physics results</h2>
<table>
<tr><th>result</th><th>value</th><th>unit</th></tr>
{{range .Physics}}<tr><td>{{.Key}}</td><td class="n">{{.Value}}</td><td>{{unit .Unit}}</td></tr>
{{end}}</table>
{{end}}
{{if .FlowNet}}
<h2>Flow net</h2>
<table>
<tr><th>quantity</th><th>value</th><th>unit</th></tr>
{{range .FlowNet}}<tr><td>{{.Key}}</td><td class="n">{{.Value}}</td><td>{{unit .Unit}}</td></tr>
{{end}}</table>
<p class="small">With equipotentials at equal potential drops and flux lines at equal flux k ΔH, the net is made of curvilinear squares and q = k H N_f/N_d.</p>
{{end}}

<h2>Pictures</h2>
{{if .NoPics}}<p>No pictures: they were not drawn (--no-images).</p>{{end}}
{{range .Pictures}}<figure><img src="{{.Src}}" alt="{{.Name}}"><figcaption>{{.Name}}: {{.Caption}}</figcaption></figure>
{{end}}

<h2 id="warnings">Warnings</h2>
{{if .Warnings}}<ul>{{range .Warnings}}<li>{{.}}</li>{{end}}</ul>{{else}}<p>None.</p>{{end}}

<h2 id="cautions">Cautions</h2>
<p class="note">rimfield is an engineering aid. It solves an idealised mathematical model accurately; whether that model describes your structure, and whether a computed number is acceptable, are questions for licensed engineering judgement. It is not a substitute for that judgement, nor for the codes and standards that apply where you work. Where this report and a code or standard disagree, the code or standard governs.</p>
<p>These limits of the model apply to this scene (CAUTIONS.md explains each topic):</p>
<ul>
{{range .Cautions}}<li><strong>{{.Title}}</strong> [<code>{{.Key}}</code>]: {{.Text}}{{if .Where}}. Where: {{.Where}}.{{end}}</li>
{{end}}</ul>

<p style="color:#777;font-size:0.85em">Written by rimfield {{.Version}}. The numbers here are rounded to 4 significant digits with SI prefixes; results.json holds them in SI units at full precision.</p>
</body>
</html>
{{define "table"}}<table>
<tr>{{range .Head}}<th>{{unit .}}</th>{{end}}</tr>
{{range .Rows}}<tr>{{range $k, $c := .}}<td{{if flagged $c}} class="bad"{{else if numcol $ $k}} class="n"{{end}}>{{$c}}</td>{{end}}</tr>
{{end}}</table>{{end}}`))
