package draw

import (
	"math"
	"testing"
)

// The SI prefixes in steps of 1000 and their powers of ten are those of The
// International System of Units, 9th edition, BIPM 2019, Table 7. kV/mm for
// strong electric fields (dielectric strength, breakdown) is common
// practice in insulation engineering.
func TestDisplayFor(t *testing.T) {
	for _, c := range []struct {
		unit    string
		largest float64
		want    string
		div     float64
	}{
		{"F/m", 9.7e-11, "pF/m", 1e-12},
		{"F/m", 1.2e-9, "nF/m", 1e-9},
		{"C/m", 4.9e-7, "nC/m", 1e-9},
		{"C/m^2", 5e-6, "µC/m²", 1e-6},
		{"V", 8000, "kV", 1e3},
		{"V", 5, "V", 1},
		{"V", 0.5, "mV", 1e-3},
		{"V/m", 2.3e6, "kV/mm", 1e6},
		{"V/m", 1e5, "kV/mm", 1e6},
		{"V/m", 6.8e4, "kV/m", 1e3},
		{"V/m", 740, "V/m", 1},
		{"N/m", 0.017, "mN/m", 1e-3},
		{"J/m", 3.9e-3, "mJ/m", 1e-3},
		{"m", 0.7, "m", 1},                    // lengths take no prefix here
		{"m^2/s", 4.7e-5, "10^-6 m²/s", 1e-6}, // nor do squared lengths: a factor
		{"m/s", 2e-5, "10^-6 m/s", 1e-6},
		{"m/s", 0.02, "m/s", 1},
		{"1", 0.4, "", 1},
		{"1", 2e-7, "10^-9", 1e-9},
		{"F/m", 0, "F/m", 1},
		{"F/m", math.NaN(), "F/m", 1},
	} {
		d := DisplayFor(c.unit, c.largest)
		if d.Unit != c.want || math.Abs(d.Div-c.div) > 1e-12*c.div {
			t.Errorf("DisplayFor(%q, %g) = %q / %g, want %q / %g", c.unit, c.largest, d.Unit, d.Div, c.want, c.div)
		}
	}
}

// Capacitance of a two-wire line per metre, C = pi eps0 / acosh(d / 2a)
// (Ramo, Whinnery and Van Duzer, Fields and Waves in Communication
// Electronics, 3rd ed., 1994, table 5.11 [from memory]): wires of radius
// 0.5 mm, 3 mm apart in air give 15.78 pF/m. The coaxial line of the
// example, 2 pi eps0 eps_r / ln(b/a) with eps_r 2.1, a 1.2 mm and b 4 mm,
// gives 97.04 pF/m.
func TestFormatSI(t *testing.T) {
	const eps0 = 8.8541878128e-12 // F/m, CODATA 2018
	for _, c := range []struct {
		v    float64
		unit string
		want string
	}{
		{math.Pi * eps0 / math.Acosh(3), "F/m", "15.78 pF/m"},
		{2 * math.Pi * eps0 * 2.1 / math.Log(4/1.2), "F/m", "97.04 pF/m"},
		{2.318293e6, "V/m", "2.318 kV/mm"},
		{-4.906548e-7, "C/m", "-490.7 nC/m"},
		{8000, "V", "8 kV"},
		{4.709e-5, "m^2/s", "4.709e-5 m²/s"}, // no prefix: an exponent
		{6, "m", "6 m"},
		{0.3924, "1", "0.3924"},
		{math.Inf(1), "J/m", "n/a"},
	} {
		if got := FormatSI(c.v, c.unit); got != c.want {
			t.Errorf("FormatSI(%g, %q) = %q, want %q", c.v, c.unit, got, c.want)
		}
	}
	if got := DisplayFor("kV", 1).Label("potential"); got != "potential (kV)" {
		t.Errorf("Label = %q", got)
	}
	if got := DisplayFor("1", 0.5).Label("hydraulic gradient |i|"); got != "hydraulic gradient |i|" {
		t.Errorf("Label without a unit = %q", got)
	}
}
