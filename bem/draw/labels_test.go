package draw

import (
	"testing"

	"github.com/rimfield/rimfield/bem/grid"
	"github.com/rimfield/rimfield/geom"
	"gonum.org/v1/gonum/spatial/r2"
)

// Region names go inside their region where they fit and cover no body
// and no other label; the region that holds all the others (the medium)
// is not named. The scene is invented: a 10 m square of "fill" holding a
// 6 m by 3 m "block" and a 0.1 m "speck".
func TestRegionLabels(t *testing.T) {
	sc := &geom.Scene{
		Problem: geom.Problem{Physics: geom.Laplace, Unit: "m", Scale: 1},
		Regions: []geom.Region{
			{Name: "fill", Polygons: []geom.Polygon{{rect(0, 0, 10, 10)}}},
			{Name: "block", Polygons: []geom.Polygon{{rect(2, 1, 8, 4)}}},
			{Name: "speck", Polygons: []geom.Polygon{{rect(5, 7, 5.1, 7.1)}}},
		},
	}
	m := &Map{Scene: sc}
	w := grid.Window{Max: r2.Vec{X: 10, Y: 10}}
	geo := m.sceneIn(w)
	var names []string
	for _, n := range geo.named {
		names = append(names, n.name)
	}
	if len(names) != 2 || names[0] != "block" || names[1] != "speck" {
		t.Fatalf("regions to name: %v, want [block speck] (fill is the medium)", names)
	}
	c, err := newRaster(600, 600)
	if err != nil {
		t.Fatal(err)
	}
	f := frame{x0: 50, y0: 50, pw: 500, ph: 500, win: w, s: 50}
	st := style{font: 16, small: 13.6, title: 20.8, line: 1}
	b, ok := m.regionLabel(c, f, st, geo.named[0], nil, nil)
	if !ok {
		t.Fatal("block: a 300 x 150 pixel region must take its name")
	}
	// Inside the block's pixels: x 150..450, y 350..500.
	if b.x0 < 150 || b.x1 > 450 || b.y0 < 350 || b.y1 > 500 {
		t.Errorf("block's label %+v leaves the block", b)
	}
	if _, ok := m.regionLabel(c, f, st, geo.named[1], nil, nil); ok {
		t.Error("speck: a 5 pixel region cannot take its name")
	}
	// A body over the block's middle band, or a label already there,
	// pushes the name to another height or leaves it out.
	body := named{name: "slab", polygons: []geom.Polygon{{rect(2, 1, 8, 4)}}}
	if _, ok := m.regionLabel(c, f, st, geo.named[0], []named{body}, nil); ok {
		t.Error("block covered by a body: no label")
	}
	if b2, ok := m.regionLabel(c, f, st, geo.named[0], nil, []box{b}); ok && b2.overlaps(b) {
		t.Errorf("label %+v covers a label already placed at %+v", b2, b)
	}
}

// A subtitle too long for the picture breaks at a space into two lines;
// "\n" starts a new one.
func TestSubtitleLines(t *testing.T) {
	c, err := newRaster(400, 300)
	if err != nil {
		t.Fatal(err)
	}
	long := "Colours stop at the 99th percentile of the samples (arrow on the colour bar)."
	w, _ := c.measure(long, 12)
	lines := subtitleLines(c, "Peak field 2 kV/mm\n"+long, 12, 0.6*w)
	if len(lines) != 3 || lines[0] != "Peak field 2 kV/mm" {
		t.Fatalf("lines %q, want the peak line and the long one in two", lines)
	}
	for _, l := range lines[1:] {
		if lw, _ := c.measure(l, 12); lw > 0.6*w {
			t.Errorf("line %q is %g wide, more than %g", l, lw, 0.6*w)
		}
	}
}

// A chart with a unit shows its values in the display unit that suits the
// axis (SI Brochure, BIPM 2019, Table 7) and says so in the label; an arc
// length axis that starts near 0 starts at 0.
func TestChartUnits(t *testing.T) {
	c := &Chart{XLabel: "arc length (mm)", YLabel: "charge density", YUnit: "C/m^2",
		Series: []Series{{Name: "a", X: []float64{3, 350, 700}, Y: []float64{-5e-6, 1e-6, 6e-6}}}}
	p, leg, err := c.plot(12)
	if err != nil {
		t.Fatal(err)
	}
	if p.Y.Label.Text != "charge density (µC/m²)" {
		t.Errorf("y label %q", p.Y.Label.Text)
	}
	if p.X.Label.Text != "arc length (mm)" || p.X.Min != 0 || p.X.Max != 700 {
		t.Errorf("x axis %q over [%g, %g], want arc length (mm) over [0, 700]", p.X.Label.Text, p.X.Min, p.X.Max)
	}
	// The y axis holds -5 to 6 µC/m² with some room: between -6 and 7.
	if p.Y.Min > -5 || p.Y.Min < -6 || p.Y.Max < 6 || p.Y.Max > 7 {
		t.Errorf("y axis [%g, %g], want -5 to 6 with a little room", p.Y.Min, p.Y.Max)
	}
	if leg == nil {
		t.Error("no legend")
	}
}
