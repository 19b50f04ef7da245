package flow

import (
	"bytes"
	"math"
	"strconv"
	"testing"

	"github.com/rimfield/rimfield/geom"
	"github.com/rimfield/rimfield/mesh"
	"gonum.org/v1/gonum/spatial/r2"
)

// builder is a template: a scene file generator.
type builder interface{ Bytes() ([]byte, error) }

// scene reads the scene file a template makes.
func scene(t *testing.T, b builder) *geom.Scene {
	t.Helper()
	data, err := b.Bytes()
	if err != nil {
		t.Fatal(err)
	}
	sc, err := geom.Read(bytes.NewReader(data))
	if err != nil {
		t.Fatal(err)
	}
	return sc
}

// solve lays out, meshes (o; the zero value is the default mesh) and
// analyses the scene for its own stream.
func solve(t *testing.T, sc *geom.Scene, o mesh.Options) *Report {
	t.Helper()
	lay, err := sc.Layout()
	if err != nil {
		t.Fatal(err)
	}
	m, err := mesh.Build(lay, o)
	if err != nil {
		t.Fatal(err)
	}
	rep, err := Analyse(sc, m, Options{})
	if err != nil {
		t.Fatal(err)
	}
	return rep
}

func relErr(got, want float64) float64 { return math.Abs(got-want) / math.Abs(want) }

// speedAt returns the surface speed at the outline vertex v of body b
// (a panel end): the magnitude of the mean tangential velocity of the two
// panels meeting there, second-order accurate at v (the signed mean, so
// that it holds next to a stagnation point too).
func speedAt(t *testing.T, rep *Report, b int, v r2.Vec) float64 {
	t.Helper()
	sum, n := 0.0, 0
	for j, p := range rep.Solution.Mesh.Panels {
		if rep.Panels[j].Body == b && (p.A == v || p.B == v) {
			sum += rep.Panels[j].Tangential
			n++
		}
	}
	if n != 2 {
		t.Fatalf("%d panels meet at %v", n, v)
	}
	return math.Abs(sum / 2)
}

// ringOf returns the outline of body i of a scene.
func ringOf(sc *geom.Scene, i int) geom.Ring { return sc.Bodies[i].Polygons[0][0] }

// vertexNear returns the outline vertex nearest to p.
func vertexNear(ring geom.Ring, p r2.Vec) r2.Vec { return ring[nearest(ring, p)] }

func fmtG(x float64) string { return strconv.FormatFloat(x, 'f', 12, 64) }

func bytesReader(b []byte) *bytes.Reader { return bytes.NewReader(b) }
