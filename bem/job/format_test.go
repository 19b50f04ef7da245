package job

import (
	"math"
	"testing"

	"github.com/rimfield/rimfield/geom"
	"github.com/rimfield/rimfield/mesh"
	"gonum.org/v1/gonum/spatial/r2"
)

// Numbers without a prefix keep 4 significant digits and a short exponent.
func TestFormatNumber(t *testing.T) {
	for v, want := range map[float64]string{5.043479e6: "5.043e6", 2.3613e-8: "2.361e-8", 0.3924: "0.3924", 12: "12", math.NaN(): "n/a", math.Inf(-1): "n/a"} {
		if got := FormatNumber(v); got != want {
			t.Errorf("FormatNumber(%g) = %q, want %q", v, got, want)
		}
	}
}

// A column shares one display unit chosen by its largest value; values
// below Noise of it are rounding and show as 0.
func TestFormatColumn(t *testing.T) {
	cells, d := FormatColumn([]float64{4.9e-7, -4.9e-7, 7e-17}, "C/m")
	if d.Unit != "nC/m" || cells[0] != "490" || cells[1] != "-490" || cells[2] != "0" {
		t.Errorf("cells %q in %q", cells, d.Unit)
	}
}

// Points are written in the scene's unit, on one line.
func TestWhere(t *testing.T) {
	sc := &geom.Scene{Problem: geom.Problem{Unit: "mm", Scale: 1e-3}}
	if got := Where(sc, r2.Vec{X: -0.036, Y: 0.062}); got != "(-36,\u00a062)\u00a0mm" {
		t.Errorf("got %q", got)
	}
	if got := Where(&geom.Scene{}, r2.Vec{X: 1.5, Y: 2}); got != "(1.5,\u00a02)\u00a0m" {
		t.Errorf("got %q", got)
	}
}

// Every panel is named by the boundary it belongs to.
func TestBoundaryName(t *testing.T) {
	lay := &geom.Layout{
		Owners:  []geom.Owner{{Name: "trace"}},
		Regions: []geom.Domain{{Name: "substrate"}, {Name: "background", Background: true}},
	}
	for _, c := range []struct {
		p    mesh.Panel
		want string
	}{
		{mesh.Panel{Owner: 0, Left: 0, Right: geom.Outside}, "trace"},
		{mesh.Panel{Owner: -1, Left: 0, Right: 1}, "interface:substrate|background"},
		{mesh.Panel{Owner: -1, Left: 0, Right: geom.Outside, Cond: geom.Insulated}, "wall:substrate"},
		{mesh.Panel{Owner: -1, Left: 0, Right: geom.Outside, Cond: geom.Condition{Kind: geom.Potential}}, "ground"},
	} {
		if got := BoundaryName(lay, c.p); got != c.want {
			t.Errorf("got %q, want %q", got, c.want)
		}
	}
}
