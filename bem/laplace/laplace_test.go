package laplace

import (
	"math"
	"strings"
	"testing"

	"github.com/rimfield/rimfield/bem/job"
	"github.com/rimfield/rimfield/geom"
	"github.com/rimfield/rimfield/mesh"
	"gonum.org/v1/gonum/spatial/r2"
)

func circle(r float64, n int) geom.Ring {
	out := make(geom.Ring, n)
	for k := range out {
		a := 2 * math.Pi * float64(k) / float64(n)
		out[k] = r2.Vec{X: r * math.Cos(a), Y: r * math.Sin(a)}
	}
	return out
}

func reverse(r geom.Ring) geom.Ring {
	out := make(geom.Ring, len(r))
	for k, v := range r {
		out[len(r)-1-k] = v
	}
	return out
}

// An annulus a = 1, b = 2 with u = 1 inside and 0 outside, k = 1: the
// inflow through the inner circle is 2 pi k / ln(b/a) (any potential-theory
// text, e.g. Kellogg, Foundations of Potential Theory, 1929), within 1e-3,
// the default mesh's promise (the 1024-gons add about 1e-5). The headline
// states it in generic words, and the check adds only the common cautions.
func TestJobAnnulus(t *testing.T) {
	outer, inner := circle(2, 1024), circle(1, 1024)
	sc := &geom.Scene{
		Problem: geom.Problem{Physics: geom.Laplace, Scale: 1},
		Regions: []geom.Region{{Name: "ring", Polygons: []geom.Polygon{{outer, reverse(inner)}}, Material: geom.Material{Kx: 1, Ky: 1}}},
		Edges: []geom.Edge{
			{Name: "inner", Lines: []geom.Line{append(geom.Line(inner), inner[0])}, Cond: geom.Condition{Kind: geom.Potential, Value: 1}},
			{Name: "outer", Lines: []geom.Line{append(geom.Line(outer), outer[0])}, Cond: geom.Condition{Kind: geom.Potential, Value: 0}},
		},
	}
	lay, err := sc.Layout()
	if err != nil {
		t.Fatal(err)
	}
	m, err := mesh.Build(lay, mesh.Options{})
	if err != nil {
		t.Fatal(err)
	}
	j := New()
	s := &job.Setup{Scene: sc, Mesh: m}
	out, err := j.Solve(s)
	if err != nil {
		t.Fatal(err)
	}
	want := 2 * math.Pi / math.Log(2)
	if got := out.Solution.Owners()[0].Inflow; math.Abs(got-want) > 1e-3*want {
		t.Errorf("inflow %.7g, want %.7g", got, want)
	}
	if out.Section != nil || len(out.Columns) != 0 || len(out.Tables) != 0 {
		t.Errorf("the generic job adds nothing: %+v", out)
	}
	if !strings.HasPrefix(out.Headline, "inflow 9.06") || !strings.Contains(out.Headline, `through "inner"`) {
		t.Errorf("headline %q", out.Headline)
	}
	c, err := j.Check(s)
	if err != nil || c.Refusal != nil || len(c.Lines) != 0 || len(c.Cautions) == 0 || c.Cautions[0].Topic != "2d_idealisation" {
		t.Errorf("check %+v, %v", c, err)
	}
}
