package main

import (
	"bytes"
	"encoding/csv"
	"encoding/json"
	"math"
	"os"
	"path/filepath"
	"reflect"
	"strconv"
	"strings"
	"testing"

	"github.com/rimfield/rimfield/bem"
	"github.com/rimfield/rimfield/bem/electro"
	"github.com/rimfield/rimfield/bem/job"
	"github.com/rimfield/rimfield/bem/laplace"
	"github.com/rimfield/rimfield/bem/seep"
	"github.com/rimfield/rimfield/geom"
	"github.com/rimfield/rimfield/mesh"
	"gonum.org/v1/gonum/spatial/r2"
)

// fakeTask is a solved task built by hand, with numbers chosen so that
// every integrated result can be worked out on paper: a body "pin" (2
// panels of length 2, inflow density 0.25, potential 1) and an edge "bore"
// (4 panels of length 2, inflow density -0.125, potential 0) in region
// "oil", plus an insulated wall of region "paper" and an interface between
// the two. Its outcome carries the electrostatic words, the common cautions
// and one warning of its own, and no system.
func fakeTask() *task {
	pot := func(v float64) geom.Condition { return geom.Condition{Kind: geom.Potential, Value: v} }
	lay := &geom.Layout{
		Owners: []geom.Owner{
			{Name: "pin", Part: geom.PartBody, Cond: pot(1)},
			{Name: "bore", Part: geom.PartEdge, Cond: pot(0)},
		},
		Regions: []geom.Domain{
			{Name: "oil", Feature: 1, Material: geom.Material{Kx: 2.2 * geom.Eps0, Ky: 2.2 * geom.Eps0}},
			{Name: "paper", Feature: 2, Material: geom.Material{Kx: 3.5 * geom.Eps0, Ky: 3.5 * geom.Eps0}},
		},
	}
	seg := func(x0, x1, y float64, left, right, owner int) mesh.Panel {
		c := geom.Insulated
		if owner >= 0 {
			c = lay.Owners[owner].Cond
		}
		return mesh.Panel{A: r2.Vec{X: x0, Y: y}, B: r2.Vec{X: x1, Y: y}, Left: left, Right: right, Owner: owner, Cond: c, S: (x0 + x1) / 2}
	}
	m := &mesh.Mesh{Layout: lay, Panels: []mesh.Panel{
		seg(0, 2, 0, 0, geom.Outside, 0), seg(2, 4, 0, 0, geom.Outside, 0),
		seg(0, 2, 5, 0, geom.Outside, 1), seg(2, 4, 5, 0, geom.Outside, 1), seg(4, 6, 5, 0, geom.Outside, 1), seg(6, 8, 5, 0, geom.Outside, 1),
		seg(0, 3, 9, 1, geom.Outside, -1),
		seg(0, 1, 7, 0, 1, -1),
	}}
	sc := &geom.Scene{
		Problem:  geom.Problem{Physics: geom.Electrostatic, Unit: "mm", Scale: 1e-3},
		Bodies:   []geom.Body{{Name: "pin"}},
		Edges:    []geom.Edge{{Name: "bore"}},
		Regions:  []geom.Region{{Name: "oil"}, {Name: "paper"}},
		Warnings: []string{`feature 1 (pin): unknown property "colour" ignored`},
	}
	sol := &bem.Solution{
		Mesh:  m,
		U:     []float64{1, 1, 0, 0, 0, 0, 0.1 + 0.2, 0.5},
		F:     []float64{0.25, 0.25, -0.125, -0.125, -0.125, -0.125, 0, 1e-300},
		Cond:  123.4,
		Const: []float64{0, 0},
	}
	out := &job.Outcome{Solution: sol, Solver: "dense", Cautions: job.CommonCautions(m), Warnings: []string{"a warning of the job"}}
	return &task{scenePath: "fake.geojson", scene: sc, mesh: m, job: electro.NewJob(), words: electro.NewJob().Words(), out: out, levels: 11}
}

// solveFake writes the outputs of a task into a new directory and returns
// it. A hand-built solution cannot be evaluated away from the boundary, so
// the artifacts (contours, pictures) are left out.
func solveFake(t *testing.T, j *task) string {
	t.Helper()
	saved := artifacts
	artifacts = nil
	defer func() { artifacts = saved }()
	_, files, err := resultFiles(j, true)
	if err != nil {
		t.Fatal(err)
	}
	dir := filepath.Join(t.TempDir(), "out")
	if err := writeOutputs(dir, files); err != nil {
		t.Fatal(err)
	}
	return dir
}

func readJSON(t *testing.T, path string) map[string]any {
	t.Helper()
	data, err := os.ReadFile(path)
	if err != nil {
		t.Fatal(err)
	}
	var v map[string]any
	if err := json.Unmarshal(data, &v); err != nil {
		t.Fatalf("%s is not JSON: %v", path, err)
	}
	return v
}

// get walks a decoded JSON value by keys and indices ("boundaries", 0, "name").
func get(t *testing.T, v any, path ...any) any {
	t.Helper()
	for _, p := range path {
		switch k := p.(type) {
		case string:
			m, ok := v.(map[string]any)
			if !ok {
				t.Fatalf("%v: not an object at %q", path, k)
			}
			if v, ok = m[k]; !ok {
				t.Fatalf("%v: no key %q", path, k)
			}
		case int:
			a, ok := v.([]any)
			if !ok || k >= len(a) {
				t.Fatalf("%v: no element %d", path, k)
			}
			v = a[k]
		}
	}
	return v
}

func num(t *testing.T, v any, path ...any) float64 {
	t.Helper()
	f, ok := get(t, v, path...).(float64)
	if !ok {
		t.Fatalf("%v is %v, want a number", path, get(t, v, path...))
	}
	return f
}

func str(t *testing.T, v any, path ...any) string {
	t.Helper()
	s, ok := get(t, v, path...).(string)
	if !ok {
		t.Fatalf("%v is %v, want a string", path, get(t, v, path...))
	}
	return s
}

// The keys of results.json that other programs read (the results contract)
// exist with the right types, and the integrated values are the sums worked
// out by hand in fakeJob.
func TestResultsJSONContract(t *testing.T) {
	dir := solveFake(t, fakeTask())
	r := readJSON(t, filepath.Join(dir, "results.json"))

	if got := str(t, r, "physics"); got != "electrostatic" {
		t.Errorf("physics = %q", got)
	}
	if got := num(t, r, "panels"); got != 8 {
		t.Errorf("panels = %v, want 8", got)
	}
	if got := str(t, r, "unit_system"); got != "SI" {
		t.Errorf("unit_system = %q", got)
	}
	bs, ok := get(t, r, "boundaries").([]any)
	if !ok || len(bs) != 2 {
		t.Fatalf("boundaries = %v, want 2 entries", get(t, r, "boundaries"))
	}
	want := []struct {
		name, part, cond          string
		potential, inflow, length float64
	}{
		{"pin", "body", "potential", 1, 2 * 0.25 * 2, 4},
		{"bore", "edge", "potential", 0, 4 * -0.125 * 2, 8},
	}
	for i, w := range want {
		if str(t, bs[i], "name") != w.name || str(t, bs[i], "part") != w.part || str(t, bs[i], "condition") != w.cond {
			t.Errorf("boundaries[%d] = %v", i, bs[i])
		}
		// Sums of a few exactly representable products: exact.
		if p, q, l := num(t, bs[i], "potential"), num(t, bs[i], "inflow"), num(t, bs[i], "length"); p != w.potential || q != w.inflow || l != w.length {
			t.Errorf("boundaries[%d] potential, inflow, length = %v, %v, %v; want %v, %v, %v", i, p, q, l, w.potential, w.inflow, w.length)
		}
	}

	if str(t, r, "scene") != "fake.geojson" || str(t, r, "unit") != "mm" {
		t.Errorf("scene, unit = %v, %v", r["scene"], r["unit"])
	}
	if open, ok := get(t, r, "open").(bool); !ok || open {
		t.Errorf("open = %v, want false", r["open"])
	}
	if _, ok := r["potential_at_infinity"]; ok {
		t.Errorf("a closed scene has potential_at_infinity %v", r["potential_at_infinity"])
	}
	// No system came with the hand-built outcome: no unknowns to count.
	if str(t, r, "solver", "kind") != "dense" || num(t, r, "solver", "unknowns") != 0 || num(t, r, "solver", "condition_estimate") != 123.4 {
		t.Errorf("solver = %v", r["solver"])
	}
	if str(t, r, "units", "potential") != "V" || str(t, r, "units", "inflow") != "C/m" || str(t, r, "units", "inflow_density") != "C/m^2" {
		t.Errorf("units = %v", r["units"])
	}
	if kx := num(t, r, "regions", 1, "kx"); kx != 3.5*geom.Eps0 {
		t.Errorf("regions[1].kx = %v", kx)
	}

	warnings := strings.Join(stringList(t, get(t, r, "warnings")), "\n")
	for _, w := range []string{`unknown property "colour"`, "a warning of the job"} {
		if !strings.Contains(warnings, w) {
			t.Errorf("warnings lack %q:\n%s", w, warnings)
		}
	}
	var topics []string
	for i := range get(t, r, "cautions").([]any) {
		topics = append(topics, str(t, r, "cautions", i, "topic"))
		str(t, r, "cautions", i, "text")
	}
	for _, want := range []string{"2d_idealisation", "truncated_domain"} {
		if !strings.Contains(strings.Join(topics, " "), want) {
			t.Errorf("cautions %v lack %q", topics, want)
		}
	}
	if files := stringList(t, get(t, r, "files")); strings.Join(files, ",") != "results.json,boundary.csv" {
		t.Errorf("files = %v", files)
	}
}

func stringList(t *testing.T, v any) []string {
	t.Helper()
	a, ok := v.([]any)
	if !ok {
		t.Fatalf("%v is not an array", v)
	}
	out := make([]string, len(a))
	for i, e := range a {
		if out[i], ok = e.(string); !ok {
			t.Fatalf("element %d of %v is not a string", i, v)
		}
	}
	return out
}

func TestBoundaryCSV(t *testing.T) {
	j := fakeTask()
	dir := solveFake(t, j)
	f, err := os.Open(filepath.Join(dir, "boundary.csv"))
	if err != nil {
		t.Fatal(err)
	}
	defer f.Close()
	rows, err := csv.NewReader(f).ReadAll()
	if err != nil {
		t.Fatal(err)
	}
	header := "boundary,x_m,y_m,s_m,length_m,potential_V,inflow_C_per_m2"
	if got := strings.Join(rows[0], ","); got != header {
		t.Fatalf("header %q, want %q", got, header)
	}
	if len(rows) != 1+len(j.mesh.Panels) {
		t.Fatalf("%d rows for %d panels", len(rows)-1, len(j.mesh.Panels))
	}
	names := []string{"pin", "pin", "bore", "bore", "bore", "bore", "wall:paper", "interface:oil|paper"}
	for i, p := range j.mesh.Panels {
		row := rows[1+i]
		if row[0] != names[i] {
			t.Errorf("row %d boundary %q, want %q", i, row[0], names[i])
		}
		mid := p.Mid()
		// Every number reads back as the same float64: full precision.
		for k, want := range []float64{mid.X, mid.Y, p.S, p.Length(), j.sol().U[i], j.sol().F[i]} {
			got, err := strconv.ParseFloat(row[1+k], 64)
			if err != nil || got != want {
				t.Errorf("row %d column %s = %q, want %v", i, rows[0][1+k], row[1+k], want)
			}
		}
	}
}

// NaN and infinities never reach the files: null in JSON and an empty CSV
// cell, each with a warning naming the key or column.
func TestNonFiniteValues(t *testing.T) {
	j := fakeTask()
	j.sol().U[0] = math.NaN()
	j.sol().Cond = math.Inf(1)
	j.mesh.Layout.Open = true
	j.sol().Const = nil // no potential at infinity came back
	dir := solveFake(t, j)
	data, err := os.ReadFile(filepath.Join(dir, "results.json"))
	if err != nil {
		t.Fatal(err)
	}
	if bytes.Contains(data, []byte("NaN")) || bytes.Contains(data, []byte("Inf")) {
		t.Errorf("results.json holds a non-number:\n%s", data)
	}
	r := readJSON(t, filepath.Join(dir, "results.json"))
	for _, path := range [][]any{{"solver", "condition_estimate"}, {"potential_at_infinity"}, {"boundaries", 0, "potential"}} {
		if v := get(t, r, path...); v != nil {
			t.Errorf("%v = %v, want null", path, v)
		}
	}
	warnings := strings.Join(stringList(t, get(t, r, "warnings")), "\n")
	for _, w := range []string{"solver.condition_estimate", "potential_at_infinity", "boundaries[0].potential", "potential_V"} {
		if !strings.Contains(warnings, w) {
			t.Errorf("warnings do not name %s:\n%s", w, warnings)
		}
	}
	csvData, err := os.ReadFile(filepath.Join(dir, "boundary.csv"))
	if err != nil {
		t.Fatal(err)
	}
	lines := strings.Split(string(csvData), "\n")
	if fields := strings.Split(lines[1], ","); fields[5] != "" {
		t.Errorf("NaN potential written as %q, want an empty cell", fields[5])
	}
}

func TestOpenScenePotentialAtInfinity(t *testing.T) {
	j := fakeTask()
	lay := j.mesh.Layout
	lay.Open = true
	lay.Regions = append(lay.Regions, geom.Domain{Name: "background", Feature: -1, Background: true, Material: geom.Material{Kx: geom.Eps0, Ky: geom.Eps0}})
	j.sol().Const = []float64{0, 0, 0.375}
	r := readJSON(t, filepath.Join(solveFake(t, j), "results.json"))
	if v := num(t, r, "potential_at_infinity"); v != 0.375 {
		t.Errorf("potential_at_infinity = %v, want 0.375", v)
	}
	if open, _ := r["open"].(bool); !open {
		t.Error("open = false for an open scene")
	}
}

func TestCheckSummary(t *testing.T) {
	j := fakeTask()
	j.mesh.Singular = []r2.Vec{{X: 4, Y: 0}}
	c, err := j.job.Check(&job.Setup{Scene: j.scene, Mesh: j.mesh})
	if err != nil {
		t.Fatal(err)
	}
	// A corner as the job reports it (the hand-built mesh has none of its
	// own: its panels do not close round a vertex).
	p := number(-1.0 / 3)
	c.Cautions = append(c.Cautions, job.Caution{Topic: "singular_corners", Text: "a corner",
		Where: []job.Location{{X: 4, Y: 0, Boundary: "pin", Exponent: &p}}})
	out := checkSummary("fake.geojson", j.scene, j.mesh, j.words, c)
	for _, want := range []string{
		"electrostatic", "mm", "closed", "1 body, 2 regions, 1 edge",
		"pin", "body", "potential 1 V", "bore", "edge", "potential 0 V",
		"permittivity 3.5 (relative", "F/m",
		"panels   8 (1 on insulated walls, 1 on interfaces",
		"smallest 1 m, largest 3 m, graded toward 1 vertices",
		`unknown property "colour"`,
		"singular_corners", "x = 4 m, y = 0 m = (4000, 0) mm (pin, field ~ r^-0.33)", "truncated_domain",
	} {
		if !strings.Contains(out, want) {
			t.Errorf("summary lacks %q:\n%s", want, out)
		}
	}
}

// Each job spells conditions in its own words, with SI units.
func TestDescribeCondition(t *testing.T) {
	cases := []struct {
		words *job.Words
		want  map[string]geom.Condition
	}{
		{seep.NewJob().Words(), map[string]geom.Condition{
			"total head 12.5 m":    {Kind: geom.Potential, Value: 12.5},
			"inflow 1e-06 m/s":     {Kind: geom.Flux, Value: 1e-6},
			"impervious (no flow)": geom.Insulated,
		}},
		{laplace.New().Words(), map[string]geom.Condition{
			"potential 12.5 1":         {Kind: geom.Potential, Value: 12.5},
			"insulated (flux 0)":       geom.Insulated,
			"floating, net inflow 2 1": {Kind: geom.Floating, NetInflow: 2},
		}},
		{electro.NewJob().Words(), map[string]geom.Condition{
			"potential 5 V":              {Kind: geom.Potential, Value: 5},
			"floating, charge 2e-09 C/m": {Kind: geom.Floating, NetInflow: 2e-9},
		}},
	}
	for _, c := range cases {
		for want, cond := range c.want {
			if got := c.words.Condition(cond); got != want {
				t.Errorf("got %q, want %q", got, want)
			}
		}
	}
}

// The non-finite check finds numbers in nested sections, slices, pointers
// and embedded structs (whose keys JSON promotes), and names them as JSON
// keys.
func TestNonFiniteKeys(t *testing.T) {
	nan := number(math.NaN())
	type inner struct {
		Matrix [][]number `json:"matrix"`
	}
	type section struct {
		Capacitance *inner `json:"capacitance"`
		Energy      number `json:"energy_J_per_m"`
	}
	type outer struct {
		section
		Extra number `json:"extra"`
	}
	head := resultsHead{
		Boundaries:          []boundary{{Name: "a"}, {Name: "b", Inflow: number(math.Inf(-1))}},
		PotentialAtInfinity: &nan,
	}
	got := strings.Join(nonFinite(reflect.ValueOf(head), ""), " ")
	if want := "boundaries[1].inflow potential_at_infinity"; got != want {
		t.Errorf("got %q\nwant %q", got, want)
	}
	sec := outer{section: section{Capacitance: &inner{Matrix: [][]number{{1, nan}}}, Energy: nan}, Extra: 1}
	got = strings.Join(nonFinite(reflect.ValueOf(sec), "electrostatic"), " ")
	if want := "electrostatic.capacitance.matrix[0][1] electrostatic.energy_J_per_m"; got != want {
		t.Errorf("got %q\nwant %q", got, want)
	}
	r := &results{resultsHead: head, Section: &job.Section{Key: "electrostatic", Value: sec}}
	data, err := r.marshal()
	if err != nil {
		t.Fatal(err)
	}
	var back map[string]any
	if err := json.Unmarshal(data, &back); err != nil {
		t.Fatalf("%v:\n%s", err, data)
	}
	if e, ok := back["electrostatic"].(map[string]any); !ok || e["energy_J_per_m"] != nil || e["extra"] != 1.0 {
		t.Errorf("electrostatic section written as %v", back["electrostatic"])
	}
	if !strings.Contains(string(data), `"inflow": null`) {
		t.Errorf("results written as %s", data)
	}
}

// boundary.csv's s_m runs along an edge from its first coordinate as
// drawn: an edge drawn from right to left has s = x0 - x.
func TestArcLengthAsDrawn(t *testing.T) {
	scene := filepath.Join(t.TempDir(), "plate.geojson")
	err := os.WriteFile(scene, []byte(`{"type": "FeatureCollection", "problem": {"physics": "laplace"},
 "features": [
  {"type": "Feature", "properties": {"part": "region", "name": "plate"}, "geometry": {"type": "Polygon", "coordinates": [[[0, 0], [10, 0], [10, 5], [0, 5], [0, 0]]]}},
  {"type": "Feature", "properties": {"part": "edge", "name": "bottom", "potential": 1}, "geometry": {"type": "LineString", "coordinates": [[10, 0], [0, 0]]}},
  {"type": "Feature", "properties": {"part": "edge", "name": "top", "potential": 0}, "geometry": {"type": "LineString", "coordinates": [[0, 5], [10, 5]]}}
 ]}`), 0o666)
	if err != nil {
		t.Fatal(err)
	}
	dir := filepath.Join(t.TempDir(), "out")
	if _, _, err := runArgs(t, "solve", scene, "-o", dir, "--no-images", "-q"); err != nil {
		t.Fatal(err)
	}
	rows := readCSV(t, filepath.Join(dir, boundaryName))
	n := 0
	for _, row := range rows[1:] {
		x, _ := strconv.ParseFloat(row[1], 64)
		s, _ := strconv.ParseFloat(row[3], 64)
		switch row[0] {
		case "bottom":
			n++
			if math.Abs(s-(10-x)) > 1e-9 {
				t.Errorf("bottom at x = %g: s = %g, want %g", x, s, 10-x)
			}
		case "top":
			if math.Abs(s-x) > 1e-9 {
				t.Errorf("top at x = %g: s = %g, want %g", x, s, x)
			}
		}
	}
	if n == 0 {
		t.Error("no panels on the bottom edge")
	}
}
