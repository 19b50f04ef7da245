package seep_test

import (
	"fmt"
	"strings"

	"github.com/rimfield/rimfield/bem"
	"github.com/rimfield/rimfield/bem/seep"
	"github.com/rimfield/rimfield/geom"
	"github.com/rimfield/rimfield/mesh"
)

// A 1 m wide cutoff wall 5 m into a 10 m layer of sand (k = 1e-5 m/s), 3 m
// of head across it.
func ExampleAnalyse() {
	const scene = `{"type": "FeatureCollection", "problem": {"physics": "seepage"},
	 "features": [
	  {"type": "Feature", "properties": {"part": "region", "name": "sand", "k": 1e-5},
	   "geometry": {"type": "Polygon", "coordinates": [[[-40,-10],[40,-10],[40,0],[-40,0],[-40,-10]]]}},
	  {"type": "Feature", "properties": {"part": "body", "name": "cutoff"},
	   "geometry": {"type": "Polygon", "coordinates": [[[-0.5,-5],[0.5,-5],[0.5,1],[-0.5,1],[-0.5,-5]]]}},
	  {"type": "Feature", "properties": {"part": "edge", "name": "upstream bed", "potential": 3},
	   "geometry": {"type": "LineString", "coordinates": [[-40,0],[-0.5,0]]}},
	  {"type": "Feature", "properties": {"part": "edge", "name": "downstream bed", "potential": 0},
	   "geometry": {"type": "LineString", "coordinates": [[0.5,0],[40,0]]}}]}`
	sc, err := geom.Read(strings.NewReader(scene))
	if err != nil {
		panic(err)
	}
	lay, _ := sc.Layout()
	m, _ := mesh.Build(lay, mesh.Options{})
	sys, _ := bem.Assemble(m, nil)
	sol, _ := sys.Solve(nil)
	rep, err := seep.Analyse(sc, sys, sol, seep.Options{})
	if err != nil {
		panic(err)
	}
	e := rep.ExitGradient
	fmt.Printf("discharge %.4g m^2/s per metre\n", rep.Discharge)
	fmt.Printf("exit gradient %.4g at (%g, %g) m (a corner: %v)\n", e.Value, e.At.X, e.At.Y, e.Corner)
	fmt.Printf("piping safety %.3g\n", rep.PipingSafety)
	fmt.Printf("heave safety beside %q %.3g\n", rep.Heave[0].Structure, rep.Heave[0].Safety)
	// Output:
	// discharge 1.326e-05 m^2/s per metre
	// exit gradient 0.1552 at (0.5, 0) m (a corner: true)
	// piping safety 6.44
	// heave safety beside "cutoff" 5.69
}
