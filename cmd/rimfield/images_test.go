package main

import (
	"bytes"
	"encoding/json"
	"encoding/xml"
	"image/color"
	"image/png"
	"io"
	"math"
	"os"
	"path/filepath"
	"regexp"
	"strconv"
	"strings"
	"testing"

	"github.com/rimfield/rimfield/bem/draw"
	"github.com/rimfield/rimfield/bem/job"
	"github.com/rimfield/rimfield/geom"
)

// The pictures are checked by the numbers behind them in bem/grid and
// bem/draw; here the command line's side: which files are written, at what
// size, and that they decode and are not blank.

// pictureScene is the invented weir of testdata/pictures, solved on a
// coarse mesh to keep the tests fast.
var pictureScene = repoPath("testdata", "pictures", "weir.geojson")

func readPNG(t *testing.T, path string) (w, h, colours int) {
	t.Helper()
	data, err := os.ReadFile(path)
	if err != nil {
		t.Fatal(err)
	}
	img, err := png.Decode(bytes.NewReader(data))
	if err != nil {
		t.Fatalf("%s: not a PNG: %v", path, err)
	}
	b := img.Bounds()
	seen := map[color.RGBA]bool{}
	for y := b.Min.Y; y < b.Max.Y; y += 4 {
		for x := b.Min.X; x < b.Max.X; x += 4 {
			r, g, bb, a := img.At(x, y).RGBA()
			seen[color.RGBA{uint8(r >> 8), uint8(g >> 8), uint8(bb >> 8), uint8(a >> 8)}] = true
		}
	}
	return b.Dx(), b.Dy(), len(seen)
}

func wellFormedXML(t *testing.T, path string) {
	t.Helper()
	data, err := os.ReadFile(path)
	if err != nil {
		t.Fatal(err)
	}
	d := xml.NewDecoder(bytes.NewReader(data))
	for {
		_, err := d.Token()
		if err == io.EOF {
			return
		}
		if err != nil {
			t.Fatalf("%s is not well-formed XML: %v", path, err)
		}
	}
}

func listedFiles(t *testing.T, dir string) []string {
	t.Helper()
	data, err := os.ReadFile(filepath.Join(dir, resultsName))
	if err != nil {
		t.Fatal(err)
	}
	var r struct {
		Files []string `json:"files"`
	}
	if err := json.Unmarshal(data, &r); err != nil {
		t.Fatal(err)
	}
	return r.Files
}

func TestPicturesWritten(t *testing.T) {
	dir := filepath.Join(t.TempDir(), "out")
	_, _, err := runArgs(t, "solve", pictureScene, "-o", dir, "--panels", "300", "--image-size", "900x600", "--svg", "-q")
	if err != nil {
		t.Fatal(err)
	}
	files := strings.Join(listedFiles(t, dir), " ")
	for _, name := range []string{"potential", "field", "boundary"} {
		for _, ext := range []string{".png", ".svg"} {
			if !strings.Contains(files, name+ext) {
				t.Errorf("results.json does not list %s%s (files: %s)", name, ext, files)
			}
		}
		w, h, n := readPNG(t, filepath.Join(dir, name+".png"))
		wantH := 600
		if name == "boundary" {
			// Charts: at least 350 high each: the potential, the inflow
			// density, and the seepage job's head and pore pressure along
			// its structures.
			wantH = 4 * 350
		}
		if w != 900 || h != wantH {
			t.Errorf("%s.png is %d x %d, want 900 x %d", name, w, h, wantH)
		}
		if n < 30 { // a blank picture has 1 colour, every real one hundreds
			t.Errorf("%s.png has %d distinct colours: blank?", name, n)
		}
		wellFormedXML(t, filepath.Join(dir, name+".svg"))
	}
	if _, err := os.Stat(filepath.Join(dir, reportName)); err == nil {
		t.Error("report.html written without --report")
	}
}

// --no-images writes no pictures, and removes those of an earlier run into
// the same folder (they are listed in its results.json and replaced as a
// group).
func TestNoImages(t *testing.T) {
	dir := filepath.Join(t.TempDir(), "out")
	args := []string{"solve", pictureScene, "-o", dir, "--panels", "200", "-q"}
	if _, _, err := runArgs(t, append(args, "--image-size", "400x300")...); err != nil {
		t.Fatal(err)
	}
	if _, err := os.Stat(filepath.Join(dir, "field.png")); err != nil {
		t.Fatalf("field.png not written: %v", err)
	}
	if _, _, err := runArgs(t, append(args, "--no-images")...); err != nil {
		t.Fatal(err)
	}
	for _, name := range []string{"potential.png", "field.png", "boundary.png"} {
		if _, err := os.Stat(filepath.Join(dir, name)); err == nil {
			t.Errorf("%s written with --no-images, or left from the earlier run", name)
		}
	}
	if _, err := os.Stat(filepath.Join(dir, contoursName)); err != nil {
		t.Errorf("--no-images must still write %s: %v", contoursName, err)
	}
}

// --at sets the equipotentials of contours.geojson exactly.
func TestContourLevelsAt(t *testing.T) {
	dir := filepath.Join(t.TempDir(), "out")
	_, _, err := runArgs(t, "solve", pictureScene, "-o", dir, "--panels", "200", "--at", "1.5, 3,4.5", "--no-images", "-q")
	if err != nil {
		t.Fatal(err)
	}
	data, err := os.ReadFile(filepath.Join(dir, contoursName))
	if err != nil {
		t.Fatal(err)
	}
	var fc struct {
		Features []struct {
			Properties struct {
				Level float64 `json:"level"`
				Unit  string  `json:"unit"`
			} `json:"properties"`
		} `json:"features"`
	}
	if err := json.Unmarshal(data, &fc); err != nil {
		t.Fatal(err)
	}
	seen := map[float64]bool{}
	for _, f := range fc.Features {
		seen[f.Properties.Level] = true
		if f.Properties.Unit != "m" {
			t.Errorf("unit %q, want m (metres of head)", f.Properties.Unit)
		}
	}
	for _, lv := range []float64{1.5, 3, 4.5} {
		if !seen[lv] {
			t.Errorf("no contour at %v (levels %v)", lv, seen)
		}
	}
	if len(seen) != 3 {
		t.Errorf("levels %v, want exactly 1.5, 3, 4.5", seen)
	}
	if w := strings.Join(stringList(t, get(t, readJSON(t, filepath.Join(dir, resultsName)), "warnings")), "\n"); strings.Contains(w, "--at") {
		t.Errorf("levels inside the heads 0 to 6 m warned of: %s", w)
	}
	// The weir's heads run from 0 to 6 m: 7.5 and -1 lie outside, and say so.
	_, _, err = runArgs(t, "solve", pictureScene, "-o", dir, "--panels", "200", "--at", "-1,3,7.5", "--no-images", "-q")
	if err != nil {
		t.Fatal(err)
	}
	w := strings.Join(stringList(t, get(t, readJSON(t, filepath.Join(dir, resultsName)), "warnings")), "\n")
	if !strings.Contains(w, "--at -1,7.5: outside the range of the boundary's total head (0 m to 6 m)") {
		t.Errorf("warnings lack the levels outside the range:\n%s", w)
	}
}

// --window limits contours.geojson to the area given, in the scene's unit.
func TestWindow(t *testing.T) {
	dir := filepath.Join(t.TempDir(), "out")
	_, _, err := runArgs(t, "solve", pictureScene, "-o", dir, "--panels", "200", "--window", "-10,-6,2,0.5", "--no-images", "-q")
	if err != nil {
		t.Fatal(err)
	}
	data, err := os.ReadFile(filepath.Join(dir, contoursName))
	if err != nil {
		t.Fatal(err)
	}
	var fc struct {
		Features []struct {
			Geometry struct {
				Coordinates [][2]float64 `json:"coordinates"`
			} `json:"geometry"`
		} `json:"features"`
	}
	if err := json.Unmarshal(data, &fc); err != nil {
		t.Fatal(err)
	}
	if len(fc.Features) == 0 {
		t.Fatal("no contours in the window")
	}
	for _, f := range fc.Features {
		for _, c := range f.Geometry.Coordinates {
			if c[0] < -10 || c[0] > 2 || c[1] < -6 || c[1] > 0.5 {
				t.Fatalf("contour point %v outside the window", c)
			}
		}
	}
}

func TestPictureFlagErrors(t *testing.T) {
	dir := filepath.Join(t.TempDir(), "out")
	for _, c := range []struct {
		args []string
		want string
	}{
		{[]string{"--at", "0.1,x"}, "--at"},
		{[]string{"--image-size", "10x10"}, "--image-size"},
		{[]string{"--image-size", "800"}, "--image-size"},
		{[]string{"--window", "0,0,1"}, "--window"},
		{[]string{"--window", "5,0,1,1"}, "--window"},
	} {
		_, _, err := runArgs(t, append([]string{"solve", pictureScene, "-o", dir}, c.args...)...)
		wantUsageError(t, err, c.want)
		if _, err := os.Stat(dir); err == nil {
			t.Fatalf("%v: output written despite the error", c.args)
		}
	}
}

// The report is one self-contained file: the pictures embedded, no outside
// references, every boundary with its numbers, the warnings and cautions.
func TestReport(t *testing.T) {
	dir := filepath.Join(t.TempDir(), "out")
	if _, _, err := runArgs(t, "solve", pictureScene, "-o", dir, "--panels", "300", "--image-size", "800x400", "--report", "-q"); err != nil {
		t.Fatal(err)
	}
	data, err := os.ReadFile(filepath.Join(dir, reportName))
	if err != nil {
		t.Fatal(err)
	}
	html := string(data)
	// The three maps and charts, and the seepage job's uplift diagram.
	if n := strings.Count(html, `src="data:image/png;base64,`); n != 4 {
		t.Errorf("%d embedded pictures, want 4", n)
	}
	for _, ref := range []string{`src="http`, `href="http`, `src="/`, `<link`, `<script`} {
		if strings.Contains(html, ref) {
			t.Errorf("report refers outside itself: %s", ref)
		}
	}
	var r struct {
		Boundaries []struct {
			Name   string  `json:"name"`
			Inflow float64 `json:"inflow"`
		} `json:"boundaries"`
		Cautions []struct {
			Topic string `json:"topic"`
		} `json:"cautions"`
		Warnings []string `json:"warnings"`
		Files    []string `json:"files"`
		FlowNet  *struct {
			Channels    float64 `json:"channels"`
			Drops       int     `json:"drops"`
			ShapeFactor float64 `json:"shape_factor"`
		} `json:"flow_net"`
	}
	raw, _ := os.ReadFile(filepath.Join(dir, resultsName))
	if err := json.Unmarshal(raw, &r); err != nil {
		t.Fatal(err)
	}
	// Every boundary with its inflow in the unit of the column's header,
	// to the 4 digits shown (report_test.go), or 0 below 1e-9 of the
	// largest.
	rows := firstTable(section(readReport(t, filepath.Join(dir, reportName)), "Results per body and edge"))
	if len(rows) != len(r.Boundaries)+1 {
		t.Fatalf("boundary table %v, want %d boundaries", rows, len(r.Boundaries))
	}
	largest := 0.0
	for _, b := range r.Boundaries {
		largest = math.Max(largest, math.Abs(b.Inflow))
	}
	unit := headerUnit(t, rows[0][4])
	for i, b := range r.Boundaries {
		row := rows[i+1]
		got := cellValue(t, row[4], unit)
		if row[0] != b.Name || (math.Abs(b.Inflow) >= 1e-9*largest && !closeShown(got, b.Inflow)) || (math.Abs(b.Inflow) < 1e-9*largest && got != 0) {
			t.Errorf("boundary row %v, want %q with inflow %g", row, b.Name, b.Inflow)
		}
	}
	for _, c := range r.Cautions {
		if !strings.Contains(html, "<code>"+c.Topic+"</code>") {
			t.Errorf("report lacks caution %q", c.Topic)
		}
	}
	for _, w := range r.Warnings {
		if !strings.Contains(html, htmlEscape(w)) {
			t.Errorf("report lacks warning %q", w)
		}
	}
	for _, want := range []string{"shape factor", "m²/s", "not a substitute"} {
		if !strings.Contains(html, want) {
			t.Errorf("report lacks %q", want)
		}
	}
	if !strings.Contains(strings.Join(r.Files, " "), reportName) {
		t.Errorf("results.json does not list %s", reportName)
	}

	// The flow net of the weir: the shape factor the report gives is the
	// discharge over k H (its definition: Cedergren, Seepage, Drainage, and
	// Flow Nets, 1989, ch. 4), checked against results.json's own inflow.
	q := math.NaN()
	for _, b := range r.Boundaries {
		if b.Name == "upstream bed" {
			q = b.Inflow
		}
	}
	k, head := 2e-5, 6.0 // the scene's conductivity and head difference
	if want := job.FormatNumber(q / (k * head)); math.IsNaN(q) || !strings.Contains(html, want) {
		t.Errorf("report does not show the shape factor q/(k H) = %s", want)
	}
	// results.json carries the same numbers: 11 levels give 12 drops, and
	// channels/drops is the shape factor (to rounding).
	if fn := r.FlowNet; fn == nil {
		t.Error("results.json has no flow_net")
	} else if want := q / (k * head); fn.Drops != 12 || math.Abs(fn.ShapeFactor-want) > 1e-12*want || math.Abs(fn.Channels/12-fn.ShapeFactor) > 1e-12*want {
		t.Errorf("flow_net %+v, want 12 drops and shape factor %g", *fn, want)
	}
}

func htmlEscape(s string) string {
	r := strings.NewReplacer("&", "&amp;", "<", "&lt;", ">", "&gt;", `"`, "&#34;", "'", "&#39;")
	return r.Replace(s)
}

// chartJob is a job that adds one chart of its own to boundary.png.
type chartJob struct {
	job.Job
	called *bool
}

func (c chartJob) Solve(s *job.Setup) (*job.Outcome, error) {
	out, err := c.Job.Solve(s)
	if err != nil {
		return nil, err
	}
	*c.called = true
	pot, _ := draw.BoundarySeries(out.Solution)
	out.Charts = append(out.Charts, &draw.Chart{Title: "pressure head", YLabel: "m", Series: pot})
	return out, nil
}

// A job adds its own charts to boundary.png through its outcome; the
// picture grows by one chart's height (350 pixels at least per chart at
// 900 pixels wide).
func TestJobChart(t *testing.T) {
	height := func() int {
		dir := filepath.Join(t.TempDir(), "out")
		if _, _, err := runArgs(t, "solve", pictureScene, "-o", dir, "--panels", "200", "--image-size", "900x600", "-q"); err != nil {
			t.Fatal(err)
		}
		w, h, _ := readPNG(t, filepath.Join(dir, "boundary.png"))
		if w != 900 {
			t.Errorf("boundary.png is %d wide, want 900", w)
		}
		return h
	}
	before := height()
	called := false
	saved := jobs[geom.Seepage]
	jobs[geom.Seepage] = func() job.Job { return chartJob{saved(), &called} }
	defer func() { jobs[geom.Seepage] = saved }()
	after := height()
	if !called {
		t.Fatal("the job's Solve was not called")
	}
	if after != before+350 {
		t.Errorf("boundary.png is %d high with the job's chart, %d without: want one chart (350 pixels) more", after, before)
	}
}

// With two fixed conductors the headline is the capacitance between them,
// -C12 of results.json's Maxwell matrix, in pF/m; with --no-images the
// report says that it has no pictures. For the coaxial example -C12 must also match
// 2 pi eps0 eps_r/ln(b/a) (any electrostatics text) within 1e-3, the
// default mesh's promised accuracy for integrated results (bem's pipeline
// tests).
func TestReportCapacitance(t *testing.T) {
	dir := filepath.Join(t.TempDir(), "out")
	scene := repoPath("examples", "coaxial", "scene.geojson")
	if _, _, err := runArgs(t, "solve", scene, "-o", dir, "--report", "--no-images", "-q"); err != nil {
		t.Fatal(err)
	}
	var r struct {
		Electrostatic struct {
			Capacitance struct {
				Matrix [][]float64 `json:"matrix"`
			} `json:"capacitance"`
		} `json:"electrostatic"`
	}
	raw, _ := os.ReadFile(filepath.Join(dir, resultsName))
	if err := json.Unmarshal(raw, &r); err != nil {
		t.Fatal(err)
	}
	m := r.Electrostatic.Capacitance.Matrix
	if len(m) != 2 || len(m[0]) != 2 {
		t.Fatalf("results.json has no 2 x 2 capacitance matrix")
	}
	c := -m[0][1]
	want := 2 * math.Pi * geom.Eps0 * 2.1 / math.Log(4/1.2) // the example's PTFE between r = 1.2 mm and 4 mm
	if math.Abs(c-want) > 1e-3*want {
		t.Errorf("-C12 = %g F/m, want %g", c, want)
	}
	data, err := os.ReadFile(filepath.Join(dir, reportName))
	if err != nil {
		t.Fatal(err)
	}
	html := string(data)
	// The headline leads with C = -C12 in pF/m, 4 digits: the formula's
	// value to the rounding of the digits shown and the mesh's 1e-3.
	hl := regexp.MustCompile(`C = ([0-9.]+) pF/m between &#34;pin&#34; and &#34;bore&#34;`).FindStringSubmatch(html)
	if hl == nil {
		t.Fatalf("report headline lacks C = ... pF/m between \"pin\" and \"bore\"")
	}
	if shown, _ := strconv.ParseFloat(hl[1], 64); math.Abs(shown*1e-12-want) > (1e-3+tolShown)*want {
		t.Errorf("headline C = %s pF/m, want %.4g pF/m", hl[1], want*1e12)
	}
	if !strings.Contains(html, "No pictures") || strings.Contains(html, "data:image/png") {
		t.Error("a report with --no-images must say it has no pictures and embed none")
	}
}
