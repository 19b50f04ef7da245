package grid_test

import (
	"fmt"

	"github.com/rimfield/rimfield/bem"
	"github.com/rimfield/rimfield/bem/grid"
	"github.com/rimfield/rimfield/geom"
	"github.com/rimfield/rimfield/mesh"
)

// A flow net through a rectangle of soil 4 m long and 2 m deep with 1 m of
// head across its short sides: 2.5 channels over 5 potential drops, shape
// factor 2/4 (uniform flow: q = k H width/length by Darcy's law; common
// practice).
func ExampleTrace() {
	sc := &geom.Scene{
		Problem: geom.Problem{Physics: geom.Seepage, Unit: "m", Scale: 1},
		Regions: []geom.Region{{Name: "soil", Material: geom.Material{Kx: 1e-5, Ky: 1e-5},
			Polygons: []geom.Polygon{{geom.Ring{{X: 0, Y: 0}, {X: 4, Y: 0}, {X: 4, Y: 2}, {X: 0, Y: 2}}}}}},
		Edges: []geom.Edge{
			{Name: "upstream", Feature: 1, Cond: geom.Condition{Kind: geom.Potential, Value: 1}, Lines: []geom.Line{{{X: 0, Y: 2}, {X: 0, Y: 0}}}},
			{Name: "downstream", Feature: 2, Cond: geom.Condition{Kind: geom.Potential, Value: 0}, Lines: []geom.Line{{{X: 4, Y: 0}, {X: 4, Y: 2}}}},
		},
	}
	lay, err := sc.Layout()
	if err != nil {
		fmt.Println(err)
		return
	}
	m, err := mesh.Build(lay, mesh.Options{})
	if err != nil {
		fmt.Println(err)
		return
	}
	sol, err := bem.Solve(m, nil)
	if err != nil {
		fmt.Println(err)
		return
	}
	net := grid.Trace(sol, grid.Auto(m), 5, grid.TraceOptions{MinLines: 2})
	fmt.Printf("%.4g channels, %d drops, shape factor %.4g, %d lines\n", net.Channels, net.Drops, net.ShapeFactor, len(net.Lines))
	// Output:
	// 2.5 channels, 5 drops, shape factor 0.5, 2 lines
}
