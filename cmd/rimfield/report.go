package main

import (
	"bytes"
	"encoding/base64"
	"encoding/json"
	"fmt"
	htmltemplate "html/template"
	"math"
	"sort"
	"strings"
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

// reportData is what the report template shows.
type reportData struct {
	Title    string
	Headline string
	Inputs   [][2]string
	Regions  []regionRow
	Units    quantityUnits
	Bounds   []boundary
	Infinity string
	Physics  []valueRow
	Matrix   *matrixTable
	FlowNet  []valueRow
	Pictures []reportPicture
	NoPics   bool
	Warnings []string
	Cautions []caution
	Version  string
}

type regionRow struct {
	Name, Kx, Ky string
}

type valueRow struct {
	Key, Value, Unit string
}

type matrixTable struct {
	Names []string
	Rows  [][]string
}

type reportPicture struct {
	Name, Caption string
	Src           htmltemplate.URL
}

// physicsUnits gives the unit of each key of the physics sections of
// results.json (README.md), by the key's last name under its section.
var physicsUnits = map[string]string{
	"discharge": "m^2/s", "exit_gradient.value": "1", "exit_gradient.x": "m", "exit_gradient.y": "m",
	"piping_safety": "1", "uplift_force": "kN/m", "uplift_x": "m",
	"peak_field.value": "V/m", "peak_field.x": "m", "peak_field.y": "m",
	"lift_coefficient": "1", "circulation": "m^2/s", "moment_coefficient": "1", "reference_chord": "m",
	// electrostatic keys beyond the contract (electro.go)
	"partial_capacitance.mutual": "F/m", "partial_capacitance.to_ground": "F/m", "capacitance_asymmetry": "1",
	"energy_J_per_m": "J/m", "forces.fx": "N/m", "forces.fy": "N/m",
	"breakdown.breakdown_field": "V/m", "breakdown.peak_field": "V/m", "breakdown.x": "m", "breakdown.y": "m", "breakdown.ratio": "1",
	"peak_refinement.coarse": "V/m", "peak_refinement.fine": "V/m", "peak_refinement.ratio": "1",
	"singular_corners.x": "m", "singular_corners.y": "m", "opening_deg": "degrees", "exponent": "1",
}

func buildReport(j *job) (*reportData, error) {
	pj := j.pics
	r := pj.res
	u := r.Units
	d := &reportData{Title: "rimfield report: " + j.scenePath, Headline: headline(j), Units: u, Version: r.Version}
	domain := "closed (inside the regions)"
	if r.Open {
		domain = "open (extends to infinity)"
	}
	d.Inputs = [][2]string{
		{"scene file", j.scenePath},
		{"physics", r.Physics},
		{"coordinate unit", r.Unit + " (every result is SI)"},
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
	for _, rg := range r.Regions {
		name := rg.Name
		if rg.Background && !strings.Contains(name, "background") {
			name += " (background)"
		}
		d.Regions = append(d.Regions, regionRow{name, fmtNum(float64(rg.Kx)), fmtNum(float64(rg.Ky))})
	}
	d.Bounds = r.Boundaries
	if r.PotentialAtInfinity != nil {
		d.Infinity = fmtNum(float64(*r.PotentialAtInfinity)) + " " + u.Potential
	}
	for _, sec := range []struct {
		name string
		v    any
	}{{"electrostatic", r.Electrostatic}, {"seepage", r.Seepage}, {"flow", r.Flow}} {
		rows, m, err := flatten(sec.name, sec.v)
		if err != nil {
			return nil, err
		}
		d.Physics = append(d.Physics, rows...)
		if m != nil {
			d.Matrix = m
		}
	}
	if n := pj.net; n != nil && n.Channels > 0 {
		d.FlowNet = []valueRow{
			{"flow channels N_f (total inflow over the flux per channel k ΔH)", fmtNum(n.Channels), "1"},
			{"potential drops N_d", fmt.Sprint(n.Drops), "1"},
			{"shape factor N_f/N_d = q/(k H)", fmtNum(n.ShapeFactor), "1"},
			{"total inflow q through the sources", fmtNum(n.Inflow), u.Inflow},
			{"potential difference H", fmtNum(n.Head), u.Potential},
			{"conductivity k of the net (sqrt(kx ky))", fmtNum(n.Conductivity), u.Conductivity},
			{"flux between neighbouring flux lines drawn", fmtNum(n.Step), u.Inflow},
		}
	}
	for _, p := range pj.pictures {
		d.Pictures = append(d.Pictures, reportPicture{Name: p.name, Caption: p.caption,
			Src: htmltemplate.URL("data:image/png;base64," + base64.StdEncoding.EncodeToString(p.png))})
	}
	d.NoPics = len(d.Pictures) == 0
	d.Warnings = append(append([]string(nil), r.Warnings...), j.warnings...)
	d.Cautions = r.Cautions
	return d, nil
}

// flatten turns a physics section into rows of key, value and unit, by way
// of its JSON form so that keys added later show too; a capacitance matrix
// becomes a table of its own.
func flatten(section string, v any) ([]valueRow, *matrixTable, error) {
	raw, err := json.Marshal(v)
	if err != nil {
		return nil, nil, fmt.Errorf("internal error: report: %w", err)
	}
	var tree any
	if err := json.Unmarshal(raw, &tree); err != nil || tree == nil {
		return nil, nil, nil
	}
	var rows []valueRow
	var mat *matrixTable
	var walk func(path, last string, x any)
	walk = func(path, last string, x any) {
		switch t := x.(type) {
		case map[string]any:
			if path == section+".capacitance" {
				mat = capacitanceTable(t)
				if mat != nil {
					return
				}
			}
			keys := make([]string, 0, len(t))
			for k := range t {
				keys = append(keys, k)
			}
			sort.Strings(keys)
			for _, k := range keys {
				if k == "warnings" {
					continue // listed with the other warnings
				}
				walk(path+"."+k, k, t[k])
			}
		case []any:
			for i, e := range t {
				walk(fmt.Sprintf("%s[%d]", path, i), last, e)
			}
		default:
			unit := physicsUnits[last]
			if parts := strings.Split(path, "."); len(parts) >= 2 {
				if u, ok := physicsUnits[strings.TrimRight(parts[len(parts)-2], "[]0123456789")+"."+last]; ok {
					unit = u
				}
			}
			val := "null (not a finite number)"
			switch y := x.(type) {
			case float64:
				val = fmtNum(y)
			case string:
				val = y
			case bool:
				val = fmt.Sprint(y)
			}
			rows = append(rows, valueRow{path, val, unit})
		}
	}
	walk(section, section, tree)
	return rows, mat, nil
}

// capacitanceTable reads {conductors, matrix} into a table in F/m.
func capacitanceTable(t map[string]any) *matrixTable {
	names, _ := t["conductors"].([]any)
	rows, _ := t["matrix"].([]any)
	if len(names) == 0 || len(rows) != len(names) {
		return nil
	}
	m := &matrixTable{}
	for _, n := range names {
		m.Names = append(m.Names, fmt.Sprint(n))
	}
	for _, row := range rows {
		cells, _ := row.([]any)
		var out []string
		for _, c := range cells {
			if f, ok := c.(float64); ok && !math.IsNaN(f) {
				out = append(out, fmtNum(f))
			} else {
				out = append(out, "null")
			}
		}
		m.Rows = append(m.Rows, out)
	}
	return m
}

// RowName returns the name of row i of a matrix table.
func (m *matrixTable) RowName(i int) string { return m.Names[i] }

var reportTemplate = htmltemplate.Must(htmltemplate.New("report").Funcs(htmltemplate.FuncMap{
	"num": func(n number) string { return fmtNum(float64(n)) },
	"where": func(ls []location) string {
		var parts []string
		for _, l := range ls {
			s := fmt.Sprintf("(%s, %s) m", fmtNum(float64(l.X)), fmtNum(float64(l.Y)))
			if l.Boundary != "" {
				s += " on " + l.Boundary
			}
			parts = append(parts, s)
		}
		return strings.Join(parts, "; ")
	},
}).Parse(`<!DOCTYPE html>
<html lang="en">
<head>
<meta charset="utf-8">
<title>{{.Title}}</title>
<style>
body { font-family: sans-serif; max-width: 1100px; margin: 2em auto; padding: 0 1em; color: #222; line-height: 1.4; }
h1 { font-size: 1.5em; } h2 { font-size: 1.2em; margin-top: 1.8em; border-bottom: 1px solid #ccc; }
table { border-collapse: collapse; margin: 0.5em 0; }
th, td { border: 1px solid #ccc; padding: 0.25em 0.6em; text-align: left; vertical-align: top; }
td.n { text-align: right; font-variant-numeric: tabular-nums; }
figure { margin: 1em 0; } figure img { max-width: 100%; border: 1px solid #ddd; }
figcaption { color: #555; font-size: 0.9em; }
.note { background: #f6f6f6; border-left: 4px solid #888; padding: 0.5em 1em; }
</style>
</head>
<body>
<h1>{{.Title}}</h1>
<p><strong>{{.Headline}}</strong></p>

<h2>Inputs</h2>
<table>
{{range .Inputs}}<tr><th>{{index . 0}}</th><td>{{index . 1}}</td></tr>
{{end}}</table>
<table>
<tr><th>region</th><th>kx ({{.Units.Conductivity}})</th><th>ky ({{.Units.Conductivity}})</th></tr>
{{range .Regions}}<tr><td>{{.Name}}</td><td class="n">{{.Kx}}</td><td class="n">{{.Ky}}</td></tr>
{{end}}</table>

<h2>Results per body and edge</h2>
<table>
<tr><th>boundary</th><th>part</th><th>condition</th><th>potential ({{.Units.Potential}})</th><th>inflow ({{.Units.Inflow}})</th><th>length (m)</th></tr>
{{range .Bounds}}<tr><td>{{.Name}}</td><td>{{.Part}}</td><td>{{.Condition}}</td><td class="n">{{num .Potential}}</td><td class="n">{{num .Inflow}}</td><td class="n">{{num .Length}}</td></tr>
{{end}}</table>
<p>Potential: length-weighted mean over the boundary. Inflow: total flux entering the domain through it per metre of length (positive in).</p>
{{if .Infinity}}<p>Potential at infinity: {{.Infinity}}</p>{{end}}
{{if .Matrix}}
<h3>Capacitance matrix (F/m)</h3>
<table>
<tr><th></th>{{range .Matrix.Names}}<th>{{.}}</th>{{end}}</tr>
{{range $i, $row := .Matrix.Rows}}<tr><th>{{$.Matrix.RowName $i}}</th>{{range $row}}<td class="n">{{.}}</td>{{end}}</tr>
{{end}}</table>
<p>Entry (i, j): charge per metre on i with 1 V on j and 0 V on the other fixed conductors.</p>
{{end}}
{{if .Physics}}
<h3>Physics results</h3>
<table>
<tr><th>result</th><th>value</th><th>unit</th></tr>
{{range .Physics}}<tr><td>{{.Key}}</td><td class="n">{{.Value}}</td><td>{{.Unit}}</td></tr>
{{end}}</table>
{{end}}
{{if .FlowNet}}
<h3>Flow net</h3>
<table>
{{range .FlowNet}}<tr><td>{{.Key}}</td><td class="n">{{.Value}}</td><td>{{.Unit}}</td></tr>
{{end}}</table>
<p>With equipotentials at equal potential drops and flux lines at equal flux k ΔH, the net is made of curvilinear squares and q = k H N_f/N_d.</p>
{{end}}

<h2>Pictures</h2>
{{if .NoPics}}<p>No pictures: they were not drawn (--no-images).</p>{{end}}
{{range .Pictures}}<figure><img src="{{.Src}}" alt="{{.Name}}"><figcaption>{{.Name}}: {{.Caption}}</figcaption></figure>
{{end}}

<h2>Warnings</h2>
{{if .Warnings}}<ul>{{range .Warnings}}<li>{{.}}</li>{{end}}</ul>{{else}}<p>None.</p>{{end}}

<h2>Cautions</h2>
<p class="note">rimfield is an engineering aid. It solves an idealised mathematical model accurately; whether that model describes your structure, and whether a computed number is acceptable, are questions for licensed engineering judgement. It is not a substitute for that judgement, nor for the codes and standards that apply where you work. Where this report and a code or standard disagree, the code or standard governs.</p>
<p>These limits of the model apply to this scene (CAUTIONS.md explains each topic):</p>
<ul>
{{range .Cautions}}<li><strong>{{.Topic}}</strong>: {{.Text}}{{if .Where}} Where: {{where .Where}}.{{end}}</li>
{{end}}</ul>

<p style="color:#777;font-size:0.85em">Written by rimfield {{.Version}}. Every number is SI.</p>
</body>
</html>
`))
