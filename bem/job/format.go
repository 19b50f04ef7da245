package job

import (
	"fmt"
	"math"
	"strconv"
	"strings"

	"github.com/rimfield/rimfield/bem/draw"
	"github.com/rimfield/rimfield/geom"
	"gonum.org/v1/gonum/spatial/r2"
)

// FormatNumber writes v with 4 significant digits and a short exponent
// outside [1e-4, 1e4): "5.043e6", "2.361e-8"; "n/a" when v is not finite.
func FormatNumber(v float64) string {
	if math.IsNaN(v) || math.IsInf(v, 0) {
		return "n/a"
	}
	s := strconv.FormatFloat(v, 'g', 4, 64)
	m, e, ok := strings.Cut(s, "e")
	if !ok {
		return s
	}
	sign := ""
	if strings.HasPrefix(e, "-") {
		sign = "-"
	}
	return m + "e" + sign + strings.TrimLeft(e, "+-0")
}

// Noise is the magnitude, relative to the largest entry of its set, below
// which a computed value is taken as rounding noise and shown as 0: sums
// that cancel (the charge on an enclosing conductor's far side, a
// to-ground capacitance inside a closed box) come out near 1e-16 of the
// terms, and a genuine value a billion times smaller than its neighbours
// has no meaning at the default accuracy of 1e-3 (common practice).
const Noise = 1e-9

// Denoise returns v, or 0 when it is below Noise times the largest
// magnitude in set.
func Denoise(v float64, set []float64) float64 {
	if math.Abs(v) < Noise*MaxAbs(set) {
		return 0
	}
	return v
}

// MaxAbs returns the largest finite magnitude of vs (0 for none).
func MaxAbs(vs []float64) float64 {
	m := 0.0
	for _, v := range vs {
		if IsFinite(v) {
			m = math.Max(m, math.Abs(v))
		}
	}
	return m
}

// IsFinite reports whether v is neither NaN nor infinite.
func IsFinite(v float64) bool { return !math.IsNaN(v) && !math.IsInf(v, 0) }

// FormatColumn formats a column of SI values in one display unit, chosen by the
// largest; values below Noise times the largest show as 0.
func FormatColumn(vals []float64, unit string) (cells []string, disp draw.Display) {
	disp = draw.DisplayFor(unit, MaxAbs(vals))
	for _, v := range vals {
		cells = append(cells, disp.Number(Denoise(v, vals)))
	}
	return cells, disp
}

// Head writes a column header with its display unit: "charge (nC/m)", or
// the name alone for a dimensionless column.
func Head(name string, d draw.Display) string {
	if d.Unit == "" {
		return name
	}
	return name + " (" + d.Unit + ")"
}

// SceneUnit returns the scene's coordinate unit and metres per unit ("m"
// and 1 when the scene gives none).
func SceneUnit(sc *geom.Scene) (string, float64) {
	if s := sc.Problem.Scale; s > 0 && sc.Problem.Unit != "" {
		return sc.Problem.Unit, s
	}
	return "m", 1
}

// Where writes a point given in metres in the scene's unit, with no-break
// spaces so that it stays on one line: "(-36, 62) mm".
func Where(sc *geom.Scene, p r2.Vec) string {
	unit, s := SceneUnit(sc)
	return fmt.Sprintf("(%s,\u00a0%s)\u00a0%s", FormatNumber(p.X/s), FormatNumber(p.Y/s), unit)
}

// Capitalise returns s with its first letter in upper case.
func Capitalise(s string) string {
	if s == "" {
		return s
	}
	return strings.ToUpper(s[:1]) + s[1:]
}

// DescribeCondition spells a boundary condition with its SI unit, in
// generic words: "potential 5 V", "flux 0.2 m/s", "insulated (flux 0)",
// "floating, net inflow 0 C/m".
func DescribeCondition(c geom.Condition, u Units) string {
	switch c.Kind {
	case geom.Potential:
		return fmt.Sprintf("potential %g %s", c.Value, u.Potential)
	case geom.Flux:
		if c.Value == 0 {
			return "insulated (flux 0)"
		}
		return fmt.Sprintf("flux %g %s", c.Value, u.InflowDensity)
	case geom.Floating:
		return fmt.Sprintf("floating, net inflow %g %s", c.NetInflow, u.Inflow)
	}
	return "none"
}

// DescribeMaterial spells a region's conductivity: "k 2e-05 m/s", or per
// axis when it is anisotropic. name is the trade's symbol ("k").
func DescribeMaterial(m geom.Material, name, unit string) string {
	k := func(v float64) string {
		if unit == "" || unit == "1" {
			return fmt.Sprintf("%s %g", name, v)
		}
		return fmt.Sprintf("%s %g %s", name, v, unit)
	}
	if m.Isotropic() {
		return k(m.Kx)
	}
	return "x: " + k(m.Kx) + ", y: " + k(m.Ky)
}
