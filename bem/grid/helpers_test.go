package grid

import (
	"math"
	"testing"

	"github.com/rimfield/rimfield/bem"
	"github.com/rimfield/rimfield/geom"
	"github.com/rimfield/rimfield/mesh"
	"gonum.org/v1/gonum/spatial/r2"
)

// Test scenes, stated as a user would and run through layout, mesh and
// solver with their defaults unless said otherwise.

// circle returns n vertices of a circle of radius r about c, counter-clockwise.
func circle(c r2.Vec, r float64, n int) geom.Ring {
	v := make(geom.Ring, n)
	for i := range v {
		t := 2 * math.Pi * float64(i) / float64(n)
		v[i] = r2.Vec{X: c.X + r*math.Cos(t), Y: c.Y + r*math.Sin(t)}
	}
	return v
}

func closedLine(r geom.Ring) geom.Line {
	l := append(geom.Line{}, r...)
	return append(l, r[0])
}

func pot(v float64) geom.Condition { return geom.Condition{Kind: geom.Potential, Value: v} }

// coaxScene is the annulus between a circle of radius b about the origin
// (edge "outer", u = 0) and a body of radius a about (d, 0) ("inner",
// u = 1), each drawn with n vertices.
func coaxScene(a, b, d float64, n int) *geom.Scene {
	outer := circle(r2.Vec{}, b, n)
	return &geom.Scene{
		Problem: geom.Problem{Physics: geom.Laplace, Unit: "m", Scale: 1},
		Regions: []geom.Region{{Name: "gap", Polygons: []geom.Polygon{{outer}}, Material: geom.Material{Kx: 1, Ky: 1}}},
		Bodies:  []geom.Body{{Name: "inner", Feature: 1, Polygons: []geom.Polygon{{circle(r2.Vec{X: d}, a, n)}}, Cond: pot(1)}},
		Edges:   []geom.Edge{{Name: "outer", Feature: 2, Cond: pot(0), Lines: []geom.Line{closedLine(outer)}}},
	}
}

// rectScene is the rectangle [0, l] x [0, w] of conductivity k with u = 1 on
// x = 0 ("upstream"), u = 0 on x = l ("downstream") and insulated top and
// bottom.
func rectScene(l, w, k float64) *geom.Scene {
	return &geom.Scene{
		Problem: geom.Problem{Physics: geom.Seepage, Unit: "m", Scale: 1},
		Regions: []geom.Region{{Name: "soil", Polygons: []geom.Polygon{{geom.Ring{{X: 0, Y: 0}, {X: l, Y: 0}, {X: l, Y: w}, {X: 0, Y: w}}}},
			Material: geom.Material{Kx: k, Ky: k}}},
		Edges: []geom.Edge{
			{Name: "upstream", Feature: 1, Cond: pot(1), Lines: []geom.Line{{{X: 0, Y: w}, {X: 0, Y: 0}}}},
			{Name: "downstream", Feature: 2, Cond: pot(0), Lines: []geom.Line{{{X: l, Y: 0}, {X: l, Y: w}}}},
		},
	}
}

func solve(t testing.TB, sc *geom.Scene, o mesh.Options) *bem.Solution {
	t.Helper()
	lay, err := sc.Layout()
	if err != nil {
		t.Fatal(err)
	}
	m, err := mesh.Build(lay, o)
	if err != nil {
		t.Fatal(err)
	}
	sol, err := bem.Solve(m, nil)
	if err != nil {
		t.Fatal(err)
	}
	return sol
}

func owner(t testing.TB, sol *bem.Solution, name string) int {
	t.Helper()
	for i, o := range sol.Mesh.Layout.Owners {
		if o.Name == name {
			return i
		}
	}
	t.Fatalf("no owner %q", name)
	return -1
}

func gmat(kx, ky float64) geom.Material { return geom.Material{Kx: kx, Ky: ky} }
