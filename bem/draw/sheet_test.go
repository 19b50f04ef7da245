package draw

import (
	"testing"

	"github.com/rimfield/rimfield/bem/grid"
	"github.com/rimfield/rimfield/geom"
	"gonum.org/v1/gonum/spatial/r2"
)

// A body drawn as a line (a sheet) is drawn as a line and named like an
// edge; it has no polygon to fill.
func TestSheetInScene(t *testing.T) {
	sc := &geom.Scene{Problem: geom.Problem{Physics: geom.Flow, Open: true},
		Bodies: []geom.Body{
			{Name: "plate", Lines: []geom.Line{{{X: 0}, {X: 1}}}},
			{Name: "box", Polygons: []geom.Polygon{{geom.Ring{{X: 2}, {X: 3}, {X: 3, Y: 1}, {X: 2, Y: 1}}}}},
		}}
	m := &Map{Scene: sc}
	geo := m.sceneIn(grid.Window{Min: r2.Vec{X: -1, Y: -1}, Max: r2.Vec{X: 0.5, Y: 2}})
	if len(geo.sheets) != 1 || geo.sheets[0].name != "plate" || len(geo.sheets[0].lines) != 1 {
		t.Fatalf("sheets %+v", geo.sheets)
	}
	if l := geo.sheets[0].lines[0]; len(l) != 2 || l[1].X != 0.5 {
		t.Errorf("the plate clipped to the window: %v", l)
	}
	if len(geo.bodies) != 0 {
		t.Errorf("bodies in the window %+v, want none (the box lies outside)", geo.bodies)
	}
}
