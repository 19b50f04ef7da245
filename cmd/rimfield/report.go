package main

import (
	"bytes"
	"encoding/base64"
	"fmt"
	htmltemplate "html/template"
	"regexp"
	"strings"

	"github.com/rimfield/rimfield/bem/draw"
	"github.com/rimfield/rimfield/bem/job"
	"github.com/rimfield/rimfield/geom"
	"gonum.org/v1/gonum/spatial/r2"
)

// reportName is the self-contained HTML report written with --report.
const reportName = "report.html"

func init() {
	artifacts = append(artifacts, artifact{name: "report", files: reportFiles})
}

// reportFiles writes report.html when --report is given: the inputs, every
// result with its unit, the pictures (embedded, when drawn), the warnings
// and the cautions that apply, in one file with no outside references.
func reportFiles(t *task) ([]outputFile, error) {
	pj := t.pics
	if pj == nil || !pj.report {
		return nil, nil
	}
	if pj.res == nil {
		return nil, fmt.Errorf("internal error: the report has no results")
	}
	data := buildReport(t)
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
	Title      string   // the page's title: the headline
	Scene      string   // the scene as named in titles
	Main       string   // the main result
	Lines      []string // the lines under it
	Inputs     [][2]string
	Regions    *job.Table
	Bounds     *job.Table
	BoundsNote string
	Infinity   string
	Results    string      // the heading of the job's tables
	Tables     []job.Table // the job's parts
	Net        string      // the flow net's heading
	NetNote    string
	FlowNet    []valueRow
	Pictures   []reportPicture
	NoPics     bool
	Warnings   []string
	Topics     []string // the cautions' topics, for the summary at the top
	Cautions   []cautionRow
	Version    string
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

func buildReport(t *task) *reportData {
	pj := t.pics
	r := pj.res
	w := t.words
	u := r.Units
	d := &reportData{Title: headline(t), Scene: sceneName(t.scenePath), Main: job.Capitalise(t.out.Headline), Version: r.Version}
	for _, l := range t.out.Lines {
		d.Lines = append(d.Lines, job.Capitalise(l))
	}
	domain := "closed (inside the regions)"
	if r.Open {
		domain = "open (extends to infinity)"
	}
	d.Inputs = [][2]string{
		{"scene file", t.scenePath},
		{"physics", r.Physics},
		{"coordinate unit", r.Unit + " (lengths and locations below are in it; results.json is SI throughout)"},
		{"domain", domain},
		{"bodies, regions, edges", fmt.Sprintf("%d, %d, %d", len(t.scene.Bodies), len(t.scene.Regions), len(t.scene.Edges))},
		{"panels", fmt.Sprint(r.Panels)},
		{"solver", fmt.Sprintf("%s, %d unknowns, condition estimate %s", r.Solver.Kind, r.Solver.Unknowns, job.FormatNumber(float64(r.Solver.ConditionEstimate)))},
	}
	if pj.at != nil {
		d.Inputs = append(d.Inputs, [2]string{w.ContourName(), "at " + pj.atText + " " + u.Potential})
	} else {
		d.Inputs = append(d.Inputs, [2]string{w.ContourName(), fmt.Sprintf("%d evenly spaced", t.levels)})
	}
	d.Regions = t.out.Regions
	if d.Regions == nil {
		d.Regions = regionTable(r)
	}
	d.Bounds = boundsTable(t, r)
	d.BoundsNote = job.Capitalise(w.Potential) + ": length-weighted mean over the boundary. " + w.InflowNote + " Length: of the pieces that bound the domain. Values below 10^-9 of the largest in their column are rounding and show as 0."
	if r.PotentialAtInfinity != nil {
		d.Infinity = draw.FormatSI(float64(*r.PotentialAtInfinity), u.Potential)
	}
	d.Results, d.Tables = t.out.Results, t.out.Tables
	if d.Results == "" {
		d.Results = "Results"
	}
	if n := pj.net; n != nil && n.Channels > 0 && w.Net != "" {
		d.Net = job.Capitalise(w.Net)
		d.NetNote = fmt.Sprintf("With equipotentials at equal %s and %s at equal flux, the %s is made of curvilinear squares, and the shape factor N_f/N_d = %s.", w.Drops, w.FluxLines, w.Net, w.ShapeFactor)
		d.FlowNet = []valueRow{
			{fmt.Sprintf("%s N_f (the total %s over the flux between neighbouring %s)", w.Channels, w.Inflow, w.FluxLines), job.FormatNumber(n.Channels), "1"},
			{w.Drops + " N_d", fmt.Sprint(n.Drops), "1"},
			{"shape factor N_f/N_d = " + w.ShapeFactor, job.FormatNumber(n.ShapeFactor), "1"},
			siRow("total "+w.Inflow+" at the sources", n.Inflow, u.Inflow),
			siRow(w.Potential+" difference between the highest and lowest boundary", n.Head, u.Potential),
			siRow(w.Conductivity+" of the net's region (geometric mean over x and y)", n.Conductivity, u.Conductivity),
			siRow("flux between neighbouring "+w.FluxLines+" drawn", n.Step, u.Inflow),
		}
	}
	for _, p := range pj.drawn {
		d.Pictures = append(d.Pictures, reportPicture{Name: p.name, Caption: p.caption,
			Src: htmltemplate.URL("data:image/png;base64," + base64.StdEncoding.EncodeToString(p.png))})
	}
	d.NoPics = len(d.Pictures) == 0
	d.Warnings = append(append([]string(nil), r.Warnings...), t.warnings...)
	for _, c := range r.Cautions {
		title := strings.ReplaceAll(c.Topic, "_", " ")
		title = strings.Replace(title, "2d", "2D", 1)
		d.Topics = append(d.Topics, title)
		d.Cautions = append(d.Cautions, cautionRow{Title: job.Capitalise(title), Key: c.Topic, Text: c.Text, Where: wherePoints(t.scene, c.Where)})
	}
	return d
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

func wherePoints(sc *geom.Scene, ls []job.Location) string {
	var parts []string
	for _, l := range ls {
		s := job.Where(sc, r2.Vec{X: float64(l.X), Y: float64(l.Y)})
		if l.Boundary != "" {
			s += " on " + l.Boundary
		}
		if l.Exponent != nil {
			s += fmt.Sprintf(" (r^%.2f)", float64(*l.Exponent))
		}
		parts = append(parts, s)
	}
	return strings.Join(parts, "; ")
}

// regionTable lists the regions and their conductivities along x and y.
func regionTable(r *results) *job.Table {
	if len(r.Regions) == 0 {
		return nil
	}
	var ks []float64
	for _, rg := range r.Regions {
		ks = append(ks, float64(rg.Kx), float64(rg.Ky))
	}
	disp := draw.DisplayFor(r.Units.Conductivity, job.MaxAbs(ks))
	t := &job.Table{Head: []string{"region", job.Head("kx", disp), job.Head("ky", disp)}, Num: []bool{false, true, true}}
	for _, rg := range r.Regions {
		name := rg.Name
		if rg.Background && !strings.Contains(name, "background") {
			name += " (background)"
		}
		t.Rows = append(t.Rows, []string{name, disp.Number(float64(rg.Kx)), disp.Number(float64(rg.Ky))})
	}
	return t
}

// boundsTable lists every body and edge with its potential, inflow and
// length, in the job's words.
func boundsTable(t *task, r *results) *job.Table {
	u := r.Units
	var pots, flows []float64
	for _, b := range r.Boundaries {
		pots = append(pots, float64(b.Potential))
		flows = append(flows, float64(b.Inflow))
	}
	potCells, potDisp := job.FormatColumn(pots, u.Potential)
	flowCells, flowDisp := job.FormatColumn(flows, u.Inflow)
	unit, s := job.SceneUnit(t.scene)
	tb := &job.Table{
		Head: []string{"boundary", "part", "condition", job.Head(t.words.Potential, potDisp), job.Head(t.words.Inflow, flowDisp), "length (" + unit + ")"},
		Num:  []bool{false, false, false, true, true, true},
	}
	for i, b := range r.Boundaries {
		tb.Rows = append(tb.Rows, []string{b.Name, b.Part, t.words.Condition(t.mesh.Layout.Owners[i].Cond), potCells[i], flowCells[i], job.FormatNumber(float64(b.Length) / s)})
	}
	return tb
}

// powerOfTen matches the factor of a display unit: "10^-6".
var powerOfTen = regexp.MustCompile(`10\^(-?[0-9]+)`)

var reportTemplate = htmltemplate.Must(htmltemplate.New("report").Funcs(htmltemplate.FuncMap{
	// unit writes a display unit with its power of ten as a superscript.
	"unit": func(s string) htmltemplate.HTML {
		return htmltemplate.HTML(powerOfTen.ReplaceAllString(htmltemplate.HTMLEscapeString(s), "10<sup>$1</sup>"))
	},
	// cell is the class of a table's cell: "bad" for the alarm, "n" for a
	// number, "" otherwise.
	"cell": func(t *job.Table, k int, c string) string {
		switch {
		case t.Alarm != "" && c == t.Alarm:
			return "bad"
		case k < len(t.Num) && t.Num[k]:
			return "n"
		}
		return ""
	},
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
{{range .Lines}}<p class="lead">{{.}}</p>
{{end}}
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
<p class="small">{{unit .BoundsNote}}</p>
{{if .Infinity}}<p>Potential at infinity: {{.Infinity}}</p>{{end}}

{{if .Tables}}
<h2>{{.Results}}</h2>
{{range .Tables}}
<h3>{{unit .Title}}</h3>
{{if .Head}}{{template "table" .}}{{else}}{{template "pairs" .}}{{end}}
{{range .Notes}}<p class="small">{{unit .}}</p>
{{end}}{{if .Warnings}}<div class="warn">{{range .Warnings}}<p>{{.}}</p>{{end}}</div>{{end}}
{{end}}
{{end}}

{{if .FlowNet}}
<h2>{{.Net}}</h2>
<table>
<tr><th>quantity</th><th>value</th><th>unit</th></tr>
{{range .FlowNet}}<tr><td>{{.Key}}</td><td class="n">{{.Value}}</td><td>{{unit .Unit}}</td></tr>
{{end}}</table>
<p class="small">{{.NetNote}}</p>
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
{{range .Rows}}<tr>{{range $k, $c := .}}{{with cell $ $k $c}}<td class="{{.}}">{{else}}<td>{{end}}{{$c}}</td>{{end}}</tr>
{{end}}</table>{{end}}
{{define "pairs"}}<table>
{{range .Rows}}<tr><th>{{index . 0}}</th>{{range $k, $c := .}}{{if $k}}<td>{{$c}}</td>{{end}}{{end}}</tr>
{{end}}</table>{{end}}`))
