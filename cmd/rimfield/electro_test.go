package main

import (
	"encoding/csv"
	"math"
	"os"
	"path/filepath"
	"strconv"
	"testing"

	"github.com/rimfield/rimfield/geom"
)

// The coaxial example (pin a = 1.2 mm, bore b = 4 mm, eps_r = 2.1, 1 V):
// C = 2 pi eps0 eps_r / ln(b/a) and the field at the pin's surface
// E = V / (a ln(b/a)) = 692.2 V/m (any electromagnetics text, e.g. Jackson,
// Classical Electrodynamics, 3rd ed., 1999, sec. 1.13 [from memory]).
// Tolerance 1e-3 relative, the default mesh's promise; the 512-gons
// contribute about 1e-5.
const (
	coaxA, coaxB, coaxEps = 1.2e-3, 4e-3, 2.1
	tolElectro            = 1e-3
)

func TestElectrostaticSection(t *testing.T) {
	dir := filepath.Join(t.TempDir(), "out")
	if _, _, err := runArgs(t, "solve", repoPath("examples", "coaxial", "scene.geojson"), "-o", dir, "--quiet", "--no-images"); err != nil {
		t.Fatal(err)
	}
	r := readJSON(t, filepath.Join(dir, "results.json"))
	c := 2 * math.Pi * geom.Eps0 * coaxEps / math.Log(coaxB/coaxA)
	e := 1 / (coaxA * math.Log(coaxB/coaxA))

	names := stringList(t, get(t, r, "electrostatic", "capacitance", "conductors"))
	if len(names) != 2 || names[0] != "pin" || names[1] != "bore" {
		t.Fatalf("conductors %v, want [pin bore]", names)
	}
	for i, want := range [][2]float64{{c, -c}, {-c, c}} {
		for k := range 2 {
			if got := num(t, r, "electrostatic", "capacitance", "matrix", i, k); math.Abs(got-want[k]) > tolElectro*c {
				t.Errorf("matrix[%d][%d] = %.7g F/m, want %.7g", i, k, got, want[k])
			}
		}
	}
	pk := get(t, r, "electrostatic", "peak_field")
	if v := num(t, pk, "value"); math.Abs(v-e) > tolElectro*e {
		t.Errorf("peak field %.6g V/m, want %.6g", v, e)
	}
	// x, y in metres, on the pin's 512-gon.
	if d := math.Hypot(num(t, pk, "x"), num(t, pk, "y")); d < coaxA*math.Cos(math.Pi/512)*(1-1e-9) || d > coaxA*(1+1e-9) {
		t.Errorf("peak at %g m from the axis, want on the pin (%g m)", d, coaxA)
	}
	if b := str(t, pk, "boundary"); b != "pin" {
		t.Errorf("peak on %q, want pin", b)
	}

	// boundary.csv: the charge density is the inflow density on the
	// conductors, the normal field on the pin E, and |E| the same there.
	f, err := os.Open(filepath.Join(dir, "boundary.csv"))
	if err != nil {
		t.Fatal(err)
	}
	defer f.Close()
	rows, err := csv.NewReader(f).ReadAll()
	if err != nil {
		t.Fatal(err)
	}
	col := map[string]int{}
	for i, h := range rows[0] {
		col[h] = i
	}
	for _, h := range []string{"inflow_C_per_m2", "charge_density_C_per_m2", "field_normal_V_per_m", "field_V_per_m"} {
		if _, ok := col[h]; !ok {
			t.Fatalf("boundary.csv lacks %s: %v", h, rows[0])
		}
	}
	val := func(row []string, h string) float64 {
		v, err := strconv.ParseFloat(row[col[h]], 64)
		if err != nil {
			t.Fatalf("%s: %v", h, err)
		}
		return v
	}
	for i, row := range rows[1:] {
		if val(row, "charge_density_C_per_m2") != val(row, "inflow_C_per_m2") {
			t.Errorf("row %d: charge density differs from the inflow density on a conductor", i)
		}
		if row[0] != "pin" {
			continue
		}
		if en, m := val(row, "field_normal_V_per_m"), val(row, "field_V_per_m"); math.Abs(en-e) > tolElectro*e || m != en {
			t.Errorf("row %d: normal field %.6g, |E| %.6g V/m, want %.6g", i, en, m, e)
		}
	}
}

// --air-breakdown assumes 3e6 V/m (3 kV/mm, dry air at standard conditions;
// common practice) for the open background of a wire over a grounded
// plane; without the flag the background has no breakdown field and no
// margin is listed. The ratio is the peak field over 3e6.
func TestAirBreakdownFlag(t *testing.T) {
	scene := filepath.Join(t.TempDir(), "wire.geojson")
	if _, _, err := runArgs(t, "new", "wire-over-ground", "--sides", "64", "-o", scene); err != nil {
		t.Fatal(err)
	}
	for _, air := range []bool{false, true} {
		dir := filepath.Join(t.TempDir(), "out")
		args := []string{"solve", scene, "-o", dir, "--quiet", "--no-images", "--panels", "128"}
		if air {
			args = append(args, "--air-breakdown")
		}
		if _, _, err := runArgs(t, args...); err != nil {
			t.Fatal(err)
		}
		r := readJSON(t, filepath.Join(dir, "results.json"))
		list, _ := get(t, r, "electrostatic", "breakdown").([]any)
		if !air {
			if len(list) != 0 {
				t.Errorf("without --air-breakdown: margins %v, want none", list)
			}
			continue
		}
		if len(list) != 1 {
			t.Fatalf("with --air-breakdown: margins %v, want one (the background)", list)
		}
		peak := num(t, r, "electrostatic", "peak_field", "value")
		if s := num(t, list[0], "breakdown_field"); s != 3e6 {
			t.Errorf("breakdown field %v, want 3e6 V/m", s)
		}
		if ratio := num(t, list[0], "ratio"); math.Abs(ratio-peak/3e6) > 1e-12*ratio {
			t.Errorf("ratio %v, want %v", ratio, peak/3e6)
		}
	}
}
