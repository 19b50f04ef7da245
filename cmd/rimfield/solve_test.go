package main

import (
	"encoding/csv"
	"encoding/json"
	"errors"
	"math"
	"os"
	"path/filepath"
	"strconv"
	"strings"
	"testing"

	"github.com/rimfield/rimfield/geom"
)

// repoPath returns a path relative to the repository root (tests run in
// cmd/rimfield).
func repoPath(parts ...string) string {
	return filepath.Join(append([]string{"..", ".."}, parts...)...)
}

// badScenes returns the shared bad scene files.
func badScenes(t *testing.T) []string {
	t.Helper()
	out, err := filepath.Glob(repoPath("testdata", "scenes", "bad", "*.geojson"))
	if err != nil {
		t.Fatal(err)
	}
	if len(out) == 0 {
		t.Fatal("no bad scenes in testdata/scenes/bad")
	}
	return out
}

// A bad scene is one error line naming what is wrong, and leaves the output
// directory exactly as it was (or absent).
func TestSolveBadScene(t *testing.T) {
	for _, path := range badScenes(t) {
		t.Run(filepath.Base(path), func(t *testing.T) {
			parent := t.TempDir()
			fresh := filepath.Join(parent, "fresh")
			_, _, err := runArgs(t, "solve", path, "-o", fresh)
			wantOneLine(t, err, filepath.Base(path))
			if _, err := os.Stat(fresh); !os.IsNotExist(err) {
				t.Errorf("a bad scene created the output directory (stat: %v)", err)
			}

			old := filepath.Join(parent, "old")
			before := map[string]string{"results.json": `{"files": ["results.json", "boundary.csv"]}`, "boundary.csv": "old"}
			writeTree(t, old, before)
			if _, _, err := runArgs(t, "solve", path, "-o", old); err == nil {
				t.Fatal("no error")
			}
			got := readTree(t, parent)
			want := map[string]string{}
			for k, v := range before {
				want["old/"+k] = v
			}
			sameTree(t, got, want)

			_, _, err = runArgs(t, "check", path)
			wantOneLine(t, err, filepath.Base(path))
		})
	}
}

// The command line passes the reader's message through whole, on one line:
// feature, member, fault and fix.
func TestBadSceneMessages(t *testing.T) {
	cases := map[string][]string{
		"key_typo.geojson":   {"key_typo.geojson", `feature 2 ("top")`, `"potental"`, `did you mean "potential"`},
		"no_physics.geojson": {"no_physics.geojson", "problem.physics", "missing"},
		"syntax.geojson":     {"syntax.geojson", "invalid JSON", "line 3"},
	}
	for file, fragments := range cases {
		_, _, err := runArgs(t, "check", repoPath("testdata", "scenes", "bad", file))
		wantOneLine(t, err, fragments...)
	}
}

// End to end: the coaxial example against the closed form of a coaxial
// line's capacitance per metre, C = 2 pi eps0 eps_r / ln(b/a) (any
// electromagnetics text, e.g. Jackson, Classical Electrodynamics, 3rd ed.,
// 1999, sec. 1.13). With 1 V on the pin its charge per metre, the inflow
// through it, is C.
func TestSolveCoaxialExample(t *testing.T) {
	const (
		a, b = 1.2e-3, 4e-3 // m: the pin and bore radii of examples/coaxial
		epsr = 2.1
	)
	// Tolerance 1e-3 relative: what the default mesh is meant to deliver for
	// engineering use; the 512-gons contribute about 1e-5 (their logarithmic
	// capacity is 1.25e-5 below the circles', equally for both).
	const tol = 1e-3
	want := 2 * math.Pi * geom.Eps0 * epsr / math.Log(b/a)

	dir := filepath.Join(t.TempDir(), "out")
	stdout, _, err := runArgs(t, "solve", repoPath("examples", "coaxial", "scene.geojson"), "-o", dir, "--quiet", "--levels", "7")
	if err != nil {
		t.Fatal(err)
	}
	if stdout != "" {
		t.Errorf("--quiet printed %q", stdout)
	}
	r := readJSON(t, filepath.Join(dir, "results.json"))
	byName := map[string]any{}
	for i := range get(t, r, "boundaries").([]any) {
		byName[str(t, r, "boundaries", i, "name")] = get(t, r, "boundaries", i)
	}
	pin, bore := byName["pin"], byName["bore"]
	if pin == nil || bore == nil {
		t.Fatalf("boundaries lack pin or bore: %v", get(t, r, "boundaries"))
	}
	if q := num(t, pin, "inflow"); math.Abs(q-want) > tol*want {
		t.Errorf("charge on the pin %.7g C/m, want %.7g (relative error %.2g, tolerance %g)", q, want, math.Abs(q-want)/want, tol)
	}
	if q := num(t, bore, "inflow"); math.Abs(q+want) > tol*want {
		t.Errorf("charge on the bore %.7g C/m, want %.7g", q, -want)
	}
	// The conditions come back: the potentials are the fixed values.
	if u := num(t, pin, "potential"); math.Abs(u-1) > 1e-12 {
		t.Errorf("pin potential %v, want 1", u)
	}
	if u := num(t, bore, "potential"); math.Abs(u) > 1e-12 {
		t.Errorf("bore potential %v, want 0", u)
	}
	// Lengths: perimeters of the 512-gons, 2 n r sin(pi/n).
	for name, rad := range map[string]float64{"pin": a, "bore": b} {
		n := 512.0
		if l, w := num(t, byName[name], "length"), 2*n*rad*math.Sin(math.Pi/n); math.Abs(l-w) > 1e-9*w {
			t.Errorf("%s length %v m, want %v", name, l, w)
		}
	}
	if str(t, r, "unit") != "mm" || str(t, r, "physics") != "electrostatic" {
		t.Errorf("unit %v, physics %v", r["unit"], r["physics"])
	}

	f, err := os.Open(filepath.Join(dir, "boundary.csv"))
	if err != nil {
		t.Fatal(err)
	}
	defer f.Close()
	rows, err := csv.NewReader(f).ReadAll()
	if err != nil {
		t.Fatal(err)
	}
	checkCoaxialContours(t, dir, a, b, 7)
	if len(rows)-1 != int(num(t, r, "panels")) {
		t.Errorf("boundary.csv has %d rows for %v panels", len(rows)-1, r["panels"])
	}
	// Midpoints are in metres, on the polygons: between the inscribed
	// radius r cos(pi/n) and r of their circle.
	for i, row := range rows[1:] {
		rad := map[string]float64{"pin": a, "bore": b}[row[0]]
		if rad == 0 {
			t.Fatalf("row %d: unexpected boundary %q", i, row[0])
		}
		x, errx := strconv.ParseFloat(row[1], 64)
		y, erry := strconv.ParseFloat(row[2], 64)
		if errx != nil || erry != nil {
			t.Fatalf("row %d: %v", i, row)
		}
		if d := math.Hypot(x, y); d < rad*math.Cos(math.Pi/512)*(1-1e-9) || d > rad*(1+1e-9) {
			t.Errorf("row %d (%s): midpoint at %g m from the centre, want about %g", i, row[0], d, rad)
		}
	}
}

// contoursFile is contours.geojson as read back.
type contoursFile struct {
	Type     string `json:"type"`
	Features []struct {
		Geometry struct {
			Type        string       `json:"type"`
			Coordinates [][2]float64 `json:"coordinates"`
		} `json:"geometry"`
		Properties struct {
			Level *float64 `json:"level"`
			Unit  string   `json:"unit"`
		} `json:"properties"`
	} `json:"features"`
}

// checkCoaxialContours checks contours.geojson of the coaxial example: the
// equipotential u of a coaxial line is the circle r = b (a/b)^u, from
// u = ln(b/r) / ln(b/a) (same source as the capacitance), in the scene's
// unit (mm).
func checkCoaxialContours(t *testing.T, dir string, a, b float64, levels int) {
	t.Helper()
	data, err := os.ReadFile(filepath.Join(dir, "contours.geojson"))
	if err != nil {
		t.Fatal(err)
	}
	var c contoursFile
	if err := json.Unmarshal(data, &c); err != nil {
		t.Fatal(err)
	}
	// Marching squares interpolates u linearly along grid edges of length h;
	// for u = c ln r that misplaces a crossing by at most h^2/(8 r) (Taylor
	// remainder of the linear interpolant). The default grid has h = 0.04
	// mm here, 1.1e-4 of the innermost line's radius (1.3 mm); 5e-4 leaves
	// room for a coarser default grid.
	const tol = 5e-4
	seen := map[float64]bool{}
	for i, f := range c.Features {
		if f.Geometry.Type != "LineString" || f.Properties.Level == nil || f.Properties.Unit != "V" {
			t.Fatalf("feature %d: %s, level %v, unit %q", i, f.Geometry.Type, f.Properties.Level, f.Properties.Unit)
		}
		u := *f.Properties.Level
		seen[u] = true
		pts := f.Geometry.Coordinates
		if len(pts) < 4 || pts[0] != pts[len(pts)-1] {
			t.Errorf("level %g: an equipotential of a coaxial line is a closed ring, got %d points", u, len(pts))
		}
		want := b * math.Pow(a/b, u) * 1e3 // mm
		for _, p := range pts {
			if r := math.Hypot(p[0], p[1]); math.Abs(r-want) > tol*want {
				t.Fatalf("level %g: point at radius %g mm, want %g mm", u, r, want)
			}
		}
	}
	if len(seen) != levels {
		t.Errorf("%d distinct levels, want %d", len(seen), levels)
	}
	for k := 1; k <= levels; k++ {
		u := float64(k) / float64(levels+1)
		found := false
		for v := range seen {
			found = found || math.Abs(v-u) < 1e-12
		}
		if !found {
			t.Errorf("level %g missing (levels evenly spaced between 0 and 1 V)", u)
		}
	}
}

func TestCheckCoaxialExample(t *testing.T) {
	out, _, err := runArgs(t, "check", repoPath("examples", "coaxial", "scene.geojson"))
	if err != nil {
		t.Fatal(err)
	}
	for _, want := range []string{"electrostatic", "mm", "closed", "1 body, 1 region, 1 edge", "ptfe", "permittivity 2.1", "pin", "potential 1 V", "bore", "potential 0 V", "2d_idealisation"} {
		if !strings.Contains(out, want) {
			t.Errorf("check output lacks %q:\n%s", want, out)
		}
	}
}

// A physics without a job in the table is refused by solve, with no files
// written, and check prints its summary and says that solve would refuse
// it, exiting non-zero.
func TestPhysicsWithoutJob(t *testing.T) {
	saved := jobs[geom.Seepage]
	delete(jobs, geom.Seepage)
	defer func() { jobs[geom.Seepage] = saved }()
	out := filepath.Join(t.TempDir(), "out")
	_, _, err := runArgs(t, "solve", pictureScene, "-o", out)
	wantOneLine(t, err, "solve: seepage scenes cannot be solved by this version yet")
	if _, err := os.Stat(out); !errors.Is(err, os.ErrNotExist) {
		t.Errorf("solve wrote %s for a refused scene", out)
	}
	stdout, _, err := runArgs(t, "check", pictureScene)
	wantOneLine(t, err, "check: the scene is valid, but solve would refuse it", "seepage scenes cannot be solved")
	if !strings.Contains(stdout, "solve would refuse this scene") || !strings.Contains(stdout, "panels") {
		t.Errorf("check summary:\n%s", stdout)
	}
}

// A region's hole that nothing fills is reported by check and in
// results.json's warnings.
func TestEmptyHoleWarning(t *testing.T) {
	scene := filepath.Join(t.TempDir(), "holed.geojson")
	err := os.WriteFile(scene, []byte(`{"type": "FeatureCollection", "problem": {"physics": "laplace"},
 "features": [
  {"type": "Feature", "properties": {"part": "region", "name": "plate"}, "geometry": {"type": "Polygon", "coordinates": [[[0, 0], [10, 0], [10, 5], [0, 5], [0, 0]], [[4, 1], [4, 3], [6, 3], [6, 1], [4, 1]]]}},
  {"type": "Feature", "properties": {"part": "edge", "name": "left", "potential": 1}, "geometry": {"type": "LineString", "coordinates": [[0, 5], [0, 0]]}},
  {"type": "Feature", "properties": {"part": "edge", "name": "right", "potential": 0}, "geometry": {"type": "LineString", "coordinates": [[10, 0], [10, 5]]}}
 ]}`), 0o666)
	if err != nil {
		t.Fatal(err)
	}
	out, _, err := runArgs(t, "check", scene)
	if err != nil || !strings.Contains(out, `region 0 ("plate") has a hole`) {
		t.Errorf("check: %v\n%s", err, out)
	}
	dir := filepath.Join(t.TempDir(), "out")
	if _, _, err := runArgs(t, "solve", scene, "-o", dir, "--no-images", "-q"); err != nil {
		t.Fatal(err)
	}
	if w := strings.Join(stringList(t, get(t, readJSON(t, filepath.Join(dir, resultsName)), "warnings")), "\n"); !strings.Contains(w, "has a hole") {
		t.Errorf("results.json warnings lack the hole:\n%s", w)
	}
}

// A pile 1 um thick in a 40 m section stops check and solve at once with
// one line naming it, its thickness and the way out, and writes nothing.
func TestTooFineFeature(t *testing.T) {
	dir := t.TempDir()
	scene := filepath.Join(dir, "tiny.geojson")
	if _, _, err := runArgs(t, "new", "sheet-pile", "--thickness", "1e-6", "--depth", "5", "--layer", "15", "--upstream", "20", "--downstream", "20", "-o", scene); err != nil {
		t.Fatal(err)
	}
	_, _, err := runArgs(t, "check", scene)
	wantOneLine(t, err, `body "sheet pile" is 1e-06 m thick`, "draw it as a line")
	out := filepath.Join(dir, "out")
	_, _, err = runArgs(t, "solve", scene, "-o", out)
	wantOneLine(t, err, `body "sheet pile" is 1e-06 m thick`)
	if _, err := os.Stat(out); !errors.Is(err, os.ErrNotExist) {
		t.Errorf("solve wrote %s", out)
	}
}

// check and results.json list the same singular corners: the sensor
// example's, with the exponent of each, and none of a 32-gon's vertices
// nor the right angles where an electrode meets an insulated face.
func TestCornersAgree(t *testing.T) {
	scene := repoPath("examples", "sensor", "scene.geojson")
	out, _, err := runArgs(t, "check", scene)
	if err != nil {
		t.Fatal(err)
	}
	var fromCheck []string
	for _, l := range strings.Split(out, "\n") {
		l = strings.TrimSpace(l)
		if strings.HasPrefix(l, "at x = ") && strings.Contains(l, "field ~ r^") {
			fromCheck = append(fromCheck, strings.Fields(l)[3]+" "+strings.Fields(l)[7])
		}
	}
	dir := filepath.Join(t.TempDir(), "out")
	if _, _, err := runArgs(t, "solve", scene, "-o", dir, "--no-images", "-q"); err != nil {
		t.Fatal(err)
	}
	r := readJSON(t, filepath.Join(dir, resultsName))
	var fromResults []string
	for _, c := range get(t, r, "cautions").([]any) {
		if str(t, c, "topic") != "singular_corners" {
			continue
		}
		for _, w := range get(t, c, "where").([]any) {
			fromResults = append(fromResults, strconv.FormatFloat(num(t, w, "x"), 'g', 6, 64)+" "+strconv.FormatFloat(num(t, w, "y"), 'g', 6, 64))
			if e := num(t, w, "exponent"); !(e < -0.1 && e > -1) {
				t.Errorf("corner %v: exponent %g", w, e)
			}
		}
	}
	if len(fromCheck) == 0 || strings.Join(fromCheck, ";") != strings.Join(fromResults, ";") {
		t.Errorf("check lists %q\nresults.json %q", fromCheck, fromResults)
	}
}
