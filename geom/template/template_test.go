package template_test

import (
	"bytes"
	"errors"
	"math"
	"strings"
	"testing"

	"github.com/rimfield/rimfield/bem"
	"github.com/rimfield/rimfield/bem/electro"
	"github.com/rimfield/rimfield/geom"
	"github.com/rimfield/rimfield/geom/template"
	"github.com/rimfield/rimfield/mesh"
)

// tol is the accuracy asserted on capacitances solved from the templates
// at the default mesh: 1e-3 relative (the default mesh's promise; observed
// near 1e-5, the order of the 512-gons' own deficit of 1.25e-5).
const tol = 1e-3

// solve reads the scene file, checks its unit and returns its Maxwell
// matrix over eps0 and the scene.
func solve(t *testing.T, data []byte, unit string) ([][]float64, []string, *geom.Scene) {
	t.Helper()
	sc, err := geom.Read(bytes.NewReader(data))
	if err != nil {
		t.Fatal(err)
	}
	if sc.Problem.Unit != unit || sc.Problem.Physics != geom.Electrostatic || len(sc.Warnings) != 0 {
		t.Errorf("problem %+v, warnings %q", sc.Problem, sc.Warnings)
	}
	lay, err := sc.Layout()
	if err != nil {
		t.Fatal(err)
	}
	m, err := mesh.Build(lay, mesh.Options{})
	if err != nil {
		t.Fatal(err)
	}
	sys, err := bem.Assemble(m, nil)
	if err != nil {
		t.Fatal(err)
	}
	cm, err := electro.Capacitance(sys, m)
	if err != nil {
		t.Fatal(err)
	}
	out := make([][]float64, len(cm.C))
	for i, row := range cm.C {
		out[i] = make([]float64, len(row))
		for j, v := range row {
			out[i][j] = v / geom.Eps0
		}
	}
	return out, cm.Names, sc
}

func relErr(got, want float64) float64 { return math.Abs(got-want) / math.Abs(want) }

func TestCoaxial(t *testing.T) {
	// Eccentric coaxial line: C = 2 pi eps / acosh((a^2+b^2-d^2)/(2ab))
	// (Smythe, Static and Dynamic Electricity, 1950 [from memory];
	// REFERENCES.md: a=1, b=3, d=1 gives 6.528503), here in inches with
	// eps_r = 2.1; the unit must not matter.
	data, err := template.Coaxial{Unit: "in", Inner: 1, Outer: 3, Offset: 1, Permittivity: 2.1, Voltage: 5}.Bytes()
	if err != nil {
		t.Fatal(err)
	}
	c, names, sc := solve(t, data, "in")
	if want := 2.1 * 6.528503; relErr(c[0][0], want) > tol {
		t.Errorf("C/eps0 = %.6f, want %.6f", c[0][0], want)
	}
	if strings.Join(names, ",") != "inner,shield" || sc.Bodies[0].Cond.Value != 5 {
		t.Errorf("conductors %v, inner at %v V", names, sc.Bodies[0].Cond.Value)
	}
	// 512 vertices by default, the first on the x axis.
	if r := sc.Bodies[0].Polygons[0][0]; len(r) != template.DefaultSides || math.Abs(r[0].X-2*0.0254) > 1e-15 || r[0].Y != 0 {
		t.Errorf("inner ring has %d vertices, first %v", len(r), r[0])
	}
}

func TestTwoWire(t *testing.T) {
	// Balanced two-wire line, radius a, spacing D, open space:
	// C = pi eps / acosh(D/2a) (REFERENCES.md: a=1, D=4 gives 2.385492);
	// the Maxwell matrix is [[C, -C], [-C, C]].
	data, err := template.TwoWire{Radius: 1, Spacing: 4, Voltage: 2, Permittivity: 1}.Bytes()
	if err != nil {
		t.Fatal(err)
	}
	c, _, sc := solve(t, data, "mm")
	if relErr(c[0][0], 2.385492) > tol || relErr(-c[0][1], 2.385492) > tol {
		t.Errorf("C/eps0 = %v, want +-2.385492", c)
	}
	if sc.Bodies[0].Cond.Value != 1 || sc.Bodies[1].Cond.Value != -1 || !sc.Problem.Open {
		t.Errorf("potentials %v, %v; open %v", sc.Bodies[0].Cond.Value, sc.Bodies[1].Cond.Value, sc.Problem.Open)
	}
}

func TestWireOverGround(t *testing.T) {
	// Wire radius a, centre h above a grounded plane: C = 2 pi eps /
	// acosh(h/a) (REFERENCES.md: a=1, h=2 gives 4.770984), in centimetres
	// with a background permittivity of 3.
	data, err := template.WireOverGround{Unit: "cm", Radius: 1, Height: 2, Voltage: 1, Permittivity: 3}.Bytes()
	if err != nil {
		t.Fatal(err)
	}
	c, _, sc := solve(t, data, "cm")
	if relErr(c[0][0], 3*4.770984) > tol {
		t.Errorf("C/eps0 = %.6f, want %.6f", c[0][0], 3*4.770984)
	}
	if sc.Problem.Ground == nil || sc.Problem.Ground.Y != 0 {
		t.Errorf("ground %v", sc.Problem.Ground)
	}
}

func TestShieldedPair(t *testing.T) {
	// Thin wires (radius a) at +-s inside a grounded cylinder of radius R:
	// the image of a line charge at z0 inside the cylinder is at
	// R^2/conj(z0) (method of images; Smythe 1950 [from memory]), so the
	// potential coefficients are p11 = ln((R^2 - s^2)/(a R)) / (2 pi eps)
	// and p12 = ln((R^2 + s^2)/(2 s R)) / (2 pi eps), and the wires' block
	// of the Maxwell matrix is P^-1. The thin-wire idealisation is off by
	// about (a/2s)^2 / ln(2s/a) (compare pi eps/acosh(D/2a) with
	// pi eps/ln(D/a)): 1.7e-4 at a = 0.05, s = 1, inside the tolerance.
	const a, s, r = 0.05, 1.0, 3.0
	data, err := template.ShieldedPair{Radius: a, Spacing: 2 * s, Shield: r, Voltage: 1, Permittivity: 2}.Bytes()
	if err != nil {
		t.Fatal(err)
	}
	c, names, _ := solve(t, data, "mm")
	if strings.Join(names, ",") != "left,right,shield" {
		t.Fatalf("conductors %v", names)
	}
	p11 := math.Log((r*r-s*s)/(a*r)) / (2 * math.Pi * 2)
	p12 := math.Log((r*r+s*s)/(2*s*r)) / (2 * math.Pi * 2)
	det := p11*p11 - p12*p12
	c11, c12 := p11/det, -p12/det
	t.Logf("wire block %v, thin-wire %.6f %.6f", c, c11, c12)
	if relErr(c[0][0], c11) > tol || relErr(c[1][1], c11) > tol || relErr(c[0][1], c12) > tol {
		t.Errorf("wire block %v, want [[%.6f %.6f] [%.6f %.6f]]", c, c11, c12, c12, c11)
	}
	// The shield takes every field line: rows sum to zero.
	for i, row := range c {
		if sum := row[0] + row[1] + row[2]; math.Abs(sum) > tol*c11 {
			t.Errorf("row %d sums to %g", i, sum)
		}
	}
}

func TestErrors(t *testing.T) {
	// Each bad request gets one error naming the template and what to fix.
	// The error is an *Error naming the parameter at fault.
	cases := []struct {
		t     interface{ Bytes() ([]byte, error) }
		param string
		want  []string
	}{
		{template.Coaxial{Inner: 2, Outer: 3, Offset: 1}, "Outer", []string{"template: coaxial:", "reaches the shield", "outer radius larger"}},
		{template.Coaxial{Inner: -1, Outer: 3}, "Inner", []string{"inner radius", "positive length in mm"}},
		{template.Coaxial{Inner: 1, Outer: 3, Offset: -1}, "Offset", []string{"offset", "0 or more"}},
		{template.Coaxial{Inner: 1, Outer: 3, Sides: 8}, "Sides", []string{"8 vertices", "at least 16"}},
		{template.Coaxial{Inner: 1, Outer: 3, Unit: "furlong"}, "Unit", []string{"template: coaxial:", "furlong", `"mm"`}},
		{template.Coaxial{Inner: 1, Outer: 3, Permittivity: 0.5}, "Permittivity", []string{"relative permittivity 0.5"}},
		{template.TwoWire{Radius: 1, Spacing: 2}, "Spacing", []string{"template: two-wire:", "touch", "more than twice the radius"}},
		{template.WireOverGround{Radius: 1, Height: 1}, "Height", []string{"touches the ground plane"}},
		{template.WireOverGround{Radius: 1, Height: 2, Voltage: math.NaN()}, "Voltage", []string{"voltage", "finite"}},
		{template.ShieldedPair{Radius: 1, Spacing: 4, Shield: 2.5}, "Shield", []string{"template: shielded-pair:", "reach the shield"}},
		{template.ShieldedPair{Radius: 1, Spacing: 4, Shield: math.Inf(1)}, "Shield", []string{"shield radius"}},
	}
	for _, c := range cases {
		_, err := c.t.Bytes()
		var te *template.Error
		if !errors.As(err, &te) {
			t.Errorf("%+v: error %v, want a *template.Error", c.t, err)
			continue
		}
		if te.Param != c.param {
			t.Errorf("%+v: parameter %q, want %q", c.t, te.Param, c.param)
		}
		for _, w := range c.want {
			if !strings.Contains(err.Error(), w) {
				t.Errorf("%+v: error %q lacks %q", c.t, err, w)
			}
		}
	}
}
