package main

import (
	"encoding/csv"
	"math"
	"os"
	"path/filepath"
	"strconv"
	"strings"
	"testing"
)

// End to end: a Joukowski section written by rimfield new (circle centre
// (-0.1, 0.1) through zeta = 1) at 5 degrees has C_L = 1.2180718 by
// conformal mapping (Katz & Plotkin, Low-Speed Aerodynamics, 2001 [from
// memory]; REFERENCES.md, verified there), whatever the chord and unit;
// 1e-3 is the default mesh's promise (bem/flow observed 2.6e-5). The
// results.json flow keys of the contract are there, boundary.csv has the
// surface columns, and a sweep through 5 degrees gives the same C_L at 5.
func TestFlowJoukowski(t *testing.T) {
	dir := t.TempDir()
	scene := filepath.Join(dir, "foil.geojson")
	if _, _, err := runArgs(t, "new", "joukowski", "--angle", "5", "--chord", "250", "--points", "128", "-o", scene); err != nil {
		t.Fatal(err)
	}
	out := filepath.Join(dir, "out")
	if _, _, err := runArgs(t, "solve", scene, "-o", out, "--no-images", "-q", "--sweep", "1:7:2"); err != nil {
		t.Fatal(err)
	}
	r := readJSON(t, filepath.Join(out, resultsName))
	const want = 1.2180718
	if cl := num(t, r, "flow", "lift_coefficient"); math.Abs(cl-want) > 1e-3*want {
		t.Errorf("C_L = %.7f, want %.7f", cl, want)
	}
	if c := num(t, r, "flow", "reference_chord"); math.Abs(c-0.25) > 1e-6 {
		t.Errorf("reference chord %g m, want 0.25 (250 mm)", c)
	}
	// C_L = 2 Gamma / (U c) with U = 1 m/s.
	c := num(t, r, "flow", "reference_chord")
	if g, cl := num(t, r, "flow", "circulation"), num(t, r, "flow", "lift_coefficient"); math.Abs(2*g/c-cl) > 1e-12 {
		t.Errorf("circulation %g m^2/s does not give C_L %g", g, cl)
	}
	num(t, r, "flow", "moment_coefficient")
	if cd := num(t, r, "flow", "drag_coefficient"); math.Abs(cd) > 1e-3 {
		t.Errorf("pressure drag %g, want about 0", cd)
	}
	sweep := get(t, r, "flow", "sweep").([]any)
	if len(sweep) != 4 || num(t, sweep[2], "angle_deg") != 5 {
		t.Fatalf("sweep %v, want 1, 3, 5, 7 degrees", sweep)
	}
	if d := num(t, sweep[2], "lift_coefficient") - num(t, r, "flow", "lift_coefficient"); math.Abs(d) > 1e-12 {
		t.Errorf("the sweep's C_L at 5 degrees differs from the solve's by %g", d)
	}

	rows := readCSV(t, filepath.Join(out, boundaryName))
	col := map[string]int{}
	for i, h := range rows[0] {
		col[h] = i
	}
	for _, h := range []string{"potential_m2_per_s", "speed_m_per_s", "pressure_coefficient", "x_over_c", "surface"} {
		if _, ok := col[h]; !ok {
			t.Fatalf("boundary.csv lacks %s: %v", h, rows[0])
		}
	}
	sides := map[string]bool{}
	for _, row := range rows[1:] {
		sides[row[col["surface"]]] = true
		v, err1 := strconv.ParseFloat(row[col["speed_m_per_s"]], 64)
		cp, err2 := strconv.ParseFloat(row[col["pressure_coefficient"]], 64)
		if err1 != nil || err2 != nil || math.Abs(cp-(1-v*v)) > 1e-12 {
			t.Fatalf("row %v: Cp is not 1 - (v/U)^2", row)
		}
	}
	if !sides["upper"] || !sides["lower"] {
		t.Errorf("surfaces %v, want upper and lower", sides)
	}
	sw := readCSV(t, filepath.Join(out, "sweep.csv"))
	if len(sw) != 5 || sw[0][0] != "angle_deg" || sw[0][1] != "lift_coefficient" {
		t.Errorf("sweep.csv %v", sw)
	}
}

func readCSV(t *testing.T, path string) [][]string {
	t.Helper()
	f, err := os.Open(path)
	if err != nil {
		t.Fatal(err)
	}
	defer f.Close()
	rows, err := csv.NewReader(f).ReadAll()
	if err != nil {
		t.Fatal(err)
	}
	return rows
}

// A bad sweep is refused before anything is solved or written.
func TestFlowSweepFlag(t *testing.T) {
	dir := t.TempDir()
	scene := filepath.Join(dir, "c.geojson")
	if _, _, err := runArgs(t, "new", "cylinder", "--sides", "64", "-o", scene); err != nil {
		t.Fatal(err)
	}
	_, _, err := runArgs(t, "solve", scene, "-o", filepath.Join(dir, "out"), "--sweep", "10:0:2")
	wantOneLine(t, err, "--sweep", "FROM:TO:STEP")
	if _, err := os.Stat(filepath.Join(dir, "out")); err == nil {
		t.Error("a refused sweep wrote files")
	}
	out, _, err := runArgs(t, "check", scene)
	if err != nil || !strings.Contains(out, "stream 1 m/s at 4 degrees") || !strings.Contains(out, `body "cylinder": no circulation`) {
		t.Errorf("check: %v\n%s", err, out)
	}
}

// The flow pictures and report speak of the stream function, speed,
// streamlines, circulation and lift; never of charge, heads or flow nets.
func TestFlowWords(t *testing.T) {
	dir := t.TempDir()
	scene := filepath.Join(dir, "foil.geojson")
	if _, _, err := runArgs(t, "new", "naca4", "--points", "64", "-o", scene); err != nil {
		t.Fatal(err)
	}
	tk := solvedTask(t, scene, 0)
	bad := []string{"charge", "field line", "flux tube", "permittivity", "total head", "flow channel", "flow net", "hydraulic", "inflow"}
	wantWords(t, "flow pictures", pictureText(t, tk),
		[]string{"stream function ψ", "speed |v|", "equipotentials of the velocity potential", "c_l", "c_m", "m/s"}, bad)
	wantWords(t, "flow report", reportText(t, scene, "0"),
		[]string{"lift coefficient", "circulation", "quarter chord", "stagnation", "ideal flow"}, bad)
}
