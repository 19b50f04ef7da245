package electro

import (
	"math"
	"testing"

	"github.com/rimfield/rimfield/bem/job"
)

// The headline's capacitances, in pF/m with 4 digits. The values are those
// of two published configurations in air: a two-wire line, radius 0.5 mm
// at 3 mm centres, C = pi eps0 / acosh(d/2a) = 15.78 pF/m (Ramo, Whinnery
// and Van Duzer, Fields and Waves in Communication Electronics, 3rd ed.,
// 1994, table 5.11 [from memory]), and a coaxial pair of radii 1.2 mm and
// 4 mm, C = 2 pi eps0 / ln(b/a) = 46.21 pF/m (any electrostatics text);
// the three-conductor matrix puts the second between each wire and a
// shield. A wire of radius a at height h over a grounded plane has
// C = 2 pi eps0 / acosh(h/a) (the same table; the image method): 18.59 pF/m
// for 0.5 mm at 5 mm.
func TestCapacitanceText(t *testing.T) {
	const eps0 = 8.8541878128e-12 // F/m, CODATA 2018
	a := math.Pi * eps0 / math.Acosh(3)
	b := 2 * math.Pi * eps0 / math.Log(4/1.2)
	w := 2 * math.Pi * eps0 / math.Acosh(10) // wire of radius 0.5 mm, 5 mm above ground: its image 10 mm away
	sec := func(names []string, m [][]float64) *Section {
		return &Section{Capacitance: &SectionMatrix{Conductors: names, Matrix: job.Numbers2(m)}}
	}
	for _, c := range []struct {
		e    *Section
		want string
	}{
		{sec([]string{"left", "right"}, [][]float64{{a, -a}, {-a, a}}), `C = 15.78 pF/m between "left" and "right"`},
		{sec([]string{"left", "right", "shield"}, [][]float64{{a + b, -a, -b}, {-a, a + b, -b}, {-b, -b, 2 * b}}),
			"capacitances left–right 15.78, left–shield 46.21, right–shield 46.21 pF/m"},
		// A conductor shielded from another: their coupling is rounding.
		{sec([]string{"core", "outer", "can"}, [][]float64{{b, 1e-26, -b}, {1e-26, a, -a}, {-b, -a, a + b}}),
			"capacitances core–outer 0, core–can 46.21, outer–can 15.78 pF/m"},
		{sec([]string{"p", "q", "r", "s"}, [][]float64{{a + b, -a, -b, 0}, {-a, a, 0, 0}, {-b, 0, b, 0}, {0, 0, 0, 0}}),
			`self-capacitance C11 = 61.99 pF/m of "p" (4 conductors: matrix in the report)`},
		{sec([]string{"wire"}, [][]float64{{w}}), `C = 18.59 pF/m between "wire" and ground`},
		{sec([]string{"alone"}, [][]float64{{1e-26}}), ""}, // an open scene without ground
		{nil, ""},
	} {
		if got := capacitanceText(c.e); got != c.want {
			t.Errorf("capacitanceText = %q, want %q", got, c.want)
		}
	}
}
