package electro

import (
	"math"
	"testing"

	"github.com/rimfield/rimfield/bem"
	"github.com/rimfield/rimfield/geom"
	"github.com/rimfield/rimfield/mesh"
	"gonum.org/v1/gonum/spatial/r2"
)

// Test scenes are built as geom.Scene values (outer rings counter-clockwise,
// holes clockwise, as geom.Read leaves them) and go through the real
// arrangement and mesher with default options.

// circleSides is the number of polygon vertices per circle in the tests.
const circleSides = 512

// circle returns a regular n-gon inscribed in the circle of radius r about
// c, counter-clockwise, with a vertex at angle phase.
func circle(c r2.Vec, r float64, n int, phase float64) geom.Ring {
	out := make(geom.Ring, n)
	for k := range out {
		a := phase + 2*math.Pi*float64(k)/float64(n)
		out[k] = r2.Vec{X: c.X + r*math.Cos(a), Y: c.Y + r*math.Sin(a)}
	}
	return out
}

// rectangle returns the corners of an axis-aligned rectangle, counter-clockwise.
func rectangle(x0, y0, x1, y1 float64) geom.Ring {
	return geom.Ring{{X: x0, Y: y0}, {X: x1, Y: y0}, {X: x1, Y: y1}, {X: x0, Y: y1}}
}

// hole returns the ring reversed (clockwise for a counter-clockwise ring).
func hole(r geom.Ring) geom.Ring {
	out := make(geom.Ring, len(r))
	for k, v := range r {
		out[len(r)-1-k] = v
	}
	return out
}

func fixed(v float64) geom.Condition { return geom.Condition{Kind: geom.Potential, Value: v} }

func air(epsr float64) geom.Material {
	return geom.Material{Kx: epsr * geom.Eps0, Ky: epsr * geom.Eps0}
}

// sceneBuilder collects the features of a test scene.
type sceneBuilder struct{ sc geom.Scene }

func newScene(open bool) *sceneBuilder {
	return &sceneBuilder{sc: geom.Scene{Problem: geom.Problem{
		Physics: geom.Electrostatic, Unit: "m", Scale: 1, Open: open,
		Background: air(1), BackgroundPermittivity: 1,
	}}}
}

func (b *sceneBuilder) feature() int { return len(b.sc.Bodies) + len(b.sc.Regions) + len(b.sc.Edges) }

func (b *sceneBuilder) body(name string, c geom.Condition, rings ...geom.Ring) *sceneBuilder {
	b.sc.Bodies = append(b.sc.Bodies, geom.Body{Feature: b.feature(), Name: name, Polygons: []geom.Polygon{rings}, Cond: c})
	return b
}

func (b *sceneBuilder) region(name string, epsr float64, rings ...geom.Ring) *sceneBuilder {
	b.sc.Regions = append(b.sc.Regions, geom.Region{Feature: b.feature(), Name: name, Polygons: []geom.Polygon{rings}, Material: air(epsr), Permittivity: epsr})
	return b
}

func (b *sceneBuilder) edge(name string, c geom.Condition, pts ...r2.Vec) *sceneBuilder {
	b.sc.Edges = append(b.sc.Edges, geom.Edge{Feature: b.feature(), Name: name, Lines: []geom.Line{pts}, Cond: c})
	return b
}

// solved is a meshed, assembled and solved test scene.
type solved struct {
	sc  *geom.Scene
	m   *mesh.Mesh
	sys *bem.System
	sol *bem.Solution
}

func (b *sceneBuilder) solve(t testing.TB, o mesh.Options) *solved {
	t.Helper()
	lay, err := b.sc.Layout()
	if err != nil {
		t.Fatal(err)
	}
	m, err := mesh.Build(lay, o)
	if err != nil {
		t.Fatal(err)
	}
	sys, err := bem.Assemble(m, nil)
	if err != nil {
		t.Fatal(err)
	}
	sol, err := sys.Solve(nil)
	if err != nil {
		t.Fatal(err)
	}
	return &solved{sc: &b.sc, m: m, sys: sys, sol: sol}
}

func relErr(got, want float64) float64 { return math.Abs(got-want) / math.Abs(want) }
