package draw

import (
	"bytes"
	"encoding/xml"
	"image/color"
	"image/png"
	"io"
	"math"
	"os"
	"path/filepath"
	"testing"

	"github.com/rimfield/rimfield/bem"
	"github.com/rimfield/rimfield/bem/grid"
	"github.com/rimfield/rimfield/geom"
	"github.com/rimfield/rimfield/mesh"
	"gonum.org/v1/gonum/spatial/r2"
)

// Pictures are checked by the numbers behind them (package grid) and here
// by a smoke test: the PNG decodes at the requested size and is not blank,
// the SVG is well-formed XML. Set RIMFIELD_PICTURES to a directory to keep
// the pictures for a look.

func pot(v float64) geom.Condition { return geom.Condition{Kind: geom.Potential, Value: v} }

func rect(x0, y0, x1, y1 float64) geom.Ring {
	return geom.Ring{{X: x0, Y: y0}, {X: x1, Y: y0}, {X: x1, Y: y1}, {X: x0, Y: y1}}
}

// seepageScene is an invented weir section: a soil layer 40 m wide and
// 10 m deep under a 8 m floor with a sheet pile, 6 m of head.
func seepageScene() *geom.Scene {
	return &geom.Scene{
		Problem: geom.Problem{Physics: geom.Seepage, Unit: "m", Scale: 1},
		Regions: []geom.Region{{Name: "sand", Polygons: []geom.Polygon{{rect(-20, -10, 20, 0)}}, Material: geom.Material{Kx: 1e-5, Ky: 1e-5}}},
		Bodies: []geom.Body{
			{Name: "weir", Feature: 1, Polygons: []geom.Polygon{{rect(-4, 0, 4, 2.5)}}, Cond: geom.Insulated},
			{Name: "sheet pile", Feature: 2, Polygons: []geom.Polygon{{rect(-4, -5, -3.8, 0)}}, Cond: geom.Insulated},
		},
		Edges: []geom.Edge{
			{Name: "upstream bed", Feature: 3, Cond: pot(6), Lines: []geom.Line{{{X: -4, Y: 0}, {X: -20, Y: 0}}}},
			{Name: "downstream bed", Feature: 4, Cond: pot(0), Lines: []geom.Line{{{X: 20, Y: 0}, {X: 4, Y: 0}}}},
		},
	}
}

type solved struct {
	sc   *geom.Scene
	sol  *bem.Solution
	g    *grid.Grid
	net  *grid.FlowNet
	cont []geom.LevelLine
}

func solveScene(t testing.TB, sc *geom.Scene, nx int) *solved {
	t.Helper()
	lay, err := sc.Layout()
	if err != nil {
		t.Fatal(err)
	}
	m, err := mesh.Build(lay, mesh.Options{})
	if err != nil {
		t.Fatal(err)
	}
	sol, err := bem.Solve(m, nil)
	if err != nil {
		t.Fatal(err)
	}
	w := grid.Auto(m)
	nxx, ny := w.Shape(nx * nx * 2 / 3)
	g := grid.Sample(sol, w, nxx, ny, grid.Options{})
	lo, hi := grid.BoundaryRange(sol)
	k := 9
	return &solved{sc: sc, sol: sol, g: g,
		net:  grid.Trace(sol, w, k+1, grid.TraceOptions{}),
		cont: grid.Contours(g, grid.Levels(lo, hi, k), "m")}
}

func (s *solved) potentialMap() *Map {
	var lines [][]r2.Vec
	for _, l := range s.net.Lines {
		lines = append(lines, l.Points)
	}
	lo, hi := grid.BoundaryRange(s.sol)
	return &Map{Grid: s.g, Values: s.g.U, Lo: lo, Hi: hi, Label: "total head (m)",
		Title: "Total head: discharge 2.1e-5 m^2/s per metre", Subtitle: "flow net: 4.2 channels, 10 drops",
		Contours: s.cont, Lines: lines, Scene: s.sc}
}

func (s *solved) fieldMap() *Map {
	mag := s.g.Magnitude()
	peak, at := grid.Peak(mag)
	i, j := at%s.g.NX, at/s.g.NX
	return &Map{Grid: s.g, Values: mag, Clip: 0.99, FromZero: true, Label: "hydraulic gradient (1)",
		Title: "Hydraulic gradient", Scene: s.sc,
		Marker: &Marker{At: s.g.Point(i, j), Text: "peak " + formatValue(peak)}}
}

func keep(t *testing.T, name string, data []byte) {
	if dir := os.Getenv("RIMFIELD_PICTURES"); dir != "" {
		if err := os.WriteFile(filepath.Join(dir, name), data, 0o644); err != nil {
			t.Fatal(err)
		}
	}
}

// checkPNG decodes a PNG and checks its size and that it holds at least
// minColours distinct colours (a blank or single-colour picture fails).
// Chosen well below what the pictures hold and well above a blank one: a
// field map shows hundreds of colour-map entries (50 asked), a chart its
// series colours, grey grid and anti-aliased text (8 asked), a blank
// picture one.
func checkPNG(t *testing.T, data []byte, w, h, minColours int) {
	t.Helper()
	img, err := png.Decode(bytes.NewReader(data))
	if err != nil {
		t.Fatalf("not a PNG: %v", err)
	}
	if b := img.Bounds(); b.Dx() != w || b.Dy() != h {
		t.Fatalf("PNG is %d x %d, want %d x %d", b.Dx(), b.Dy(), w, h)
	}
	seen := map[color.RGBA]bool{}
	b := img.Bounds()
	for y := b.Min.Y; y < b.Max.Y; y += 3 {
		for x := b.Min.X; x < b.Max.X; x += 3 {
			r, g, bb, a := img.At(x, y).RGBA()
			seen[color.RGBA{uint8(r >> 8), uint8(g >> 8), uint8(bb >> 8), uint8(a >> 8)}] = true
		}
	}
	if len(seen) < minColours {
		t.Errorf("only %d distinct colours, want at least %d", len(seen), minColours)
	}
}

// checkSVG parses an SVG document as XML down to its end.
func checkSVG(t *testing.T, data []byte) {
	t.Helper()
	d := xml.NewDecoder(bytes.NewReader(data))
	root := ""
	for {
		tok, err := d.Token()
		if err == io.EOF {
			break
		}
		if err != nil {
			t.Fatalf("SVG is not well-formed XML: %v", err)
		}
		if se, ok := tok.(xml.StartElement); ok && root == "" {
			root = se.Name.Local
		}
	}
	if root != "svg" {
		t.Fatalf("root element %q, want svg", root)
	}
}

func TestMapPictures(t *testing.T) {
	s := solveScene(t, seepageScene(), 120)
	for name, m := range map[string]*Map{"potential": s.potentialMap(), "field": s.fieldMap()} {
		var buf bytes.Buffer
		if err := m.PNG(&buf, 900, 500); err != nil {
			t.Fatal(err)
		}
		checkPNG(t, buf.Bytes(), 900, 500, 50)
		keep(t, name+".png", buf.Bytes())
		buf.Reset()
		if err := m.SVG(&buf, 900, 500); err != nil {
			t.Fatal(err)
		}
		checkSVG(t, buf.Bytes())
		keep(t, name+".svg", buf.Bytes())
	}
}

func TestMapErrors(t *testing.T) {
	s := &Map{}
	if err := s.PNG(io.Discard, 900, 500); err == nil {
		t.Error("a map without a grid must fail")
	}
	g := &grid.Grid{Window: grid.Window{Max: r2.Vec{X: 1, Y: 1}}, NX: 2, NY: 2, U: []float64{0, 1, 2, math.NaN()}}
	s = &Map{Grid: g, Values: g.U}
	if err := s.PNG(io.Discard, 50, 50); err == nil {
		t.Error("a 50 x 50 picture must fail")
	}
}

func TestBoundaryCharts(t *testing.T) {
	s := solveScene(t, seepageScene(), 40)
	pot, in := BoundarySeries(s.sol)
	if len(pot) != 4 || len(in) != 4 {
		t.Fatalf("%d and %d series, want one per body and edge (4)", len(pot), len(in))
	}
	// The upstream bed is held at 6 m of head: its series is flat at 6.
	for _, sr := range pot {
		if sr.Name != "upstream bed" {
			continue
		}
		for _, v := range sr.Y {
			if v != 6 {
				t.Fatalf("upstream bed potential %v, want 6", v)
			}
		}
	}
	cs := Charts{
		{Title: "Potential along the boundaries", XLabel: "arc length (m)", YLabel: "total head (m)", Series: pot},
		{Title: "Inflow density", XLabel: "arc length (m)", YLabel: "inflow (m/s)", Series: in, Clip: 0.98},
	}
	var buf bytes.Buffer
	if err := cs.PNG(&buf, 800, 700); err != nil {
		t.Fatal(err)
	}
	checkPNG(t, buf.Bytes(), 800, 700, 8)
	keep(t, "boundary.png", buf.Bytes())
	buf.Reset()
	if err := cs.SVG(&buf, 800, 700); err != nil {
		t.Fatal(err)
	}
	checkSVG(t, buf.Bytes())
	bad := &Chart{Series: []Series{{Name: "x", X: []float64{1}, Y: nil}}}
	if err := bad.PNG(io.Discard, 400, 300); err == nil {
		t.Error("a series with mismatched lengths must fail")
	}
}
