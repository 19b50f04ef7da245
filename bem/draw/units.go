package draw

import (
	"math"
	"strconv"
	"strings"
)

// Display is a unit in which values are shown to people: an SI unit with a
// prefix ("pF/m", "kV/mm") or, for a unit that does not take one, with a
// power-of-ten factor ("10^-6 m/s"). Values stay SI everywhere else; only
// the labels, tables and titles use a Display.
type Display struct {
	// Unit is the text after a number or inside an axis label's
	// parentheses: "pF/m", "kV/mm", "10^-6 m/s", "m". Empty for a
	// dimensionless quantity in its plain range.
	Unit string
	// Div is the SI value of one display unit: shown = SI value / Div.
	Div float64
}

// SI prefixes by power of ten, in steps of three (The International System
// of Units, 9th edition, BIPM 2019, Table 7).
var prefixes = map[int]string{
	-18: "a", -15: "f", -12: "p", -9: "n", -6: "µ", -3: "m",
	0: "", 3: "k", 6: "M", 9: "G", 12: "T", 15: "P",
}

// prefixable lists the units whose values take an SI prefix: units led by
// a unit symbol that is not itself prefixed or a length (lengths are shown
// in the scene's unit, and a prefix on a squared length would mislead).
var prefixable = map[string]bool{
	"V": true, "V/m": true, "C/m": true, "C/m^2": true, "F/m": true, "N/m": true,
	"J/m": true, "C": true, "F": true, "N": true, "J": true, "W": true, "A": true, "Pa": true,
}

// DisplayFor returns the unit in which to show values of the SI unit whose
// largest magnitude is largest, so that it reads with one to three digits
// before the decimal point:
//
//   - a unit that takes an SI prefix gets the one in steps of 1000 that
//     puts largest in [1, 1000): 9.7e-11 F/m as 97 pF/m, 2.4e-8 C/m as
//     24 nC/m;
//   - an electric field (V/m) of 1e5 V/m or more is shown in kV/mm
//     (= MV/m), the unit of dielectric strength in insulation practice
//     (common practice); below, kV/m, V/m or mV/m;
//   - any other unit keeps its name, with a factor 10^n (n a multiple of
//     3) in front when largest lies outside [1e-3, 1e5): 4e-6 m/s as
//     4 in 10^-6 m/s.
//
// A zero, infinite or NaN largest gives the unit as it is.
func DisplayFor(unit string, largest float64) Display {
	largest = math.Abs(largest)
	if largest == 0 || math.IsNaN(largest) || math.IsInf(largest, 0) {
		return Display{Unit: plainUnit(unit), Div: 1}
	}
	e3 := 3 * int(math.Floor(math.Log10(largest)/3+1e-9))
	if unit == "V/m" && largest >= 1e5*(1-1e-9) {
		return Display{Unit: "kV/mm", Div: 1e6}
	}
	if prefixable[unit] {
		e3 = min(max(e3, -18), 15)
		return Display{Unit: prefixes[e3] + readableUnit(unit), Div: math.Pow(10, float64(e3))}
	}
	if largest >= 1e-3 && largest < 1e5 {
		return Display{Unit: plainUnit(unit), Div: 1}
	}
	factor := "10^" + strconv.Itoa(e3)
	if u := plainUnit(unit); u != "" {
		factor += " " + u
	}
	return Display{Unit: factor, Div: math.Pow(10, float64(e3))}
}

// plainUnit drops the unit "1" of a dimensionless quantity and spells
// powers as superscripts.
func plainUnit(unit string) string {
	if unit == "1" {
		return ""
	}
	return readableUnit(unit)
}

// Number formats an SI value in the display unit with 4 significant digits,
// without the unit: 9.699e-11 F/m in pF/m is "96.99".
func (d Display) Number(v float64) string {
	if math.IsNaN(v) || math.IsInf(v, 0) {
		return "n/a"
	}
	div := d.Div
	if div == 0 {
		div = 1
	}
	return formatValue(v / div)
}

// Format formats an SI value in the display unit with 4 significant digits
// and the unit: "96.99 pF/m".
func (d Display) Format(v float64) string {
	s := d.Number(v)
	if d.Unit == "" || s == "n/a" {
		return s
	}
	return s + " " + d.Unit
}

// Label returns an axis or colour bar label: the quantity with the display
// unit in parentheses, "potential (kV)", or the quantity alone when the
// unit is empty.
func (d Display) Label(quantity string) string {
	if d.Unit == "" {
		return quantity
	}
	return quantity + " (" + d.Unit + ")"
}

// FormatSI formats one SI value of the given unit with 4 significant digits
// in the display unit that suits it: FormatSI(9.699e-11, "F/m") is
// "96.99 pF/m", FormatSI(2.318e6, "V/m") "2.318 kV/mm". A unit without a
// prefix keeps its name, and a value outside [1e-3, 1e5) is written with
// an exponent: FormatSI(4.709e-5, "m^2/s") is "4.709e-5 m²/s".
func FormatSI(v float64, unit string) string {
	d := DisplayFor(unit, v)
	if d.Div != 1 && !prefixable[unit] && unit != "V/m" {
		d = Display{Unit: plainUnit(unit), Div: 1}
	}
	return d.Format(v)
}

// readableUnit spells a unit for people: "m^2/s" as "m²/s", "C/m^2" as
// "C/m²".
func readableUnit(u string) string {
	return strings.NewReplacer("^2", "²", "^3", "³").Replace(u)
}
