package seep

import (
	"math"
	"strings"
	"testing"

	"github.com/rimfield/rimfield/bem"
	"github.com/rimfield/rimfield/mesh"
)

// Anisotropic soil by the transformed section (Harr, Groundwater and
// Seepage, 1962, ch. 1; common practice): with x' = x sqrt(ky/kx) the soil
// is isotropic with k' = sqrt(kx ky). A vertical sheet pile in a layer
// keeps its shape, so q = k' H Phi(d/T) and the exit gradient at the pile,
// a vertical gradient, is the isotropic one (pileRef); a floor of width b
// becomes one of width b sqrt(ky/kx) (floorRef). kx = 4 ky: the sections
// are 8 T wide beyond the structure (4 T once transformed). Default
// settings, the product's 1e-3 (observed: discharge 6e-5, exit gradient
// 1.3e-5).
func TestAnisotropicTransformedSection(t *testing.T) {
	const T, H, ky = 10.0, 2.0, 1e-5
	const kx = 4 * ky
	kp := math.Sqrt(kx * ky)
	// Sheet pile of zero thickness, d/T = 0.5.
	s := halfPile(8*T, T, 0.5*T, H, kx, ky).solve(t, mesh.Options{})
	qkH, iTH := pileRef(0.5)
	q := s.rep.Discharge / (kp * H)
	i := s.exit(t, "downstream bed").Value * T / H
	t.Logf("sheet pile, %d panels: q/k'H = %.6f (want %.6f, error %.2g), i T/H = %.6f (want %.6f, error %.2g)",
		len(s.sol.Mesh.Panels), q, qkH, relErr(q, qkH), i, iTH, relErr(i, iTH))
	if relErr(q, qkH) > 1e-3 || relErr(i, iTH) > 1e-3 {
		t.Errorf("anisotropic sheet pile: q/k'H = %.6f, i T/H = %.6f; want %.6f, %.6f", q, i, qkH, iTH)
	}
	// Floor of width 10 m on the 10 m layer: b'/T = 0.5 once transformed.
	const b = 10.0
	W := b/2 + 8*T
	f := newTestSection().
		soil("clay", kx, ky, rect(-W, -T, W, 0)).
		body("floor", rect(-b/2, 0, b/2, 0.5)).
		bed("upstream bed", H, line(-W, 0, -b/2, 0)).
		bed("downstream bed", 0, line(b/2, 0, W, 0)).
		solve(t, mesh.Options{})
	want := floorRef(b * math.Sqrt(ky/kx) / T)
	qf := f.rep.Discharge / (kp * H)
	t.Logf("floor, %d panels: q/k'H = %.6f (want %.6f, error %.2g)", len(f.sol.Mesh.Panels), qf, want, relErr(qf, want))
	if relErr(qf, want) > 1e-3 {
		t.Errorf("anisotropic floor: q/k'H = %.6f, want %.6f", qf, want)
	}
}

// Two soils in series: upward flow through a 20 m wide column of a lower
// layer (4 m, k1) and an upper one (2 m, k2), head H at the base and 0 at
// the surface, impervious sides: q = B H / (t1/k1 + t2/k2) (series
// resistances; Darcy's law, common practice) and the exit gradient at the
// surface q / (B k2) everywhere, including its corners with the side walls
// (finite corners, projected). Default settings, 1e-3 (observed: discharge
// 5.9e-5, exit gradient 3e-4).
func TestTwoLayersInSeries(t *testing.T) {
	const B, t1, t2, k1, k2, H = 20.0, 4.0, 2.0, 2e-5, 5e-6, 3.0
	s := newTestSection().
		soil("sand", k1, k1, rect(0, -t1-t2, B, -t2)).
		soil("silt", k2, k2, rect(0, -t2, B, 0)).
		bed("artesian base", H, line(0, -t1-t2, B, -t1-t2)).
		bed("surface", 0, line(0, 0, B, 0)).
		solve(t, mesh.Options{})
	q := B * H / (t1/k1 + t2/k2)
	i := q / (B * k2)
	e := s.exit(t, "surface")
	t.Logf("%d panels: q = %.6g m^2/s (want %.6g, error %.2g), exit gradient %.6f (want %.6f, error %.2g) at (%g, %g), corner %v",
		len(s.sol.Mesh.Panels), s.rep.Discharge, q, relErr(s.rep.Discharge, q), e.Value, i, relErr(e.Value, i), e.At.X, e.At.Y, e.Corner)
	if relErr(s.rep.Discharge, q) > 1e-3 || relErr(e.Value, i) > 1e-3 {
		t.Errorf("q = %.6g, exit gradient %.6f; want %.6g, %.6f", s.rep.Discharge, e.Value, q, i)
	}
	for _, c := range e.Corners {
		if c.Kind == CornerFinite && c.At.Y == 0 && relErr(c.Value, i) > 1e-3 {
			t.Errorf("corner at (%g, %g): exit gradient %.6f, want %.6f", c.At.X, c.At.Y, c.Value, i)
		}
	}
	if math.IsNaN(s.rep.PipingSafety) || relErr(s.rep.PipingSafety, 1/e.Value) > 1e-12 {
		t.Errorf("piping safety %v, want i_c / i = %v", s.rep.PipingSafety, 1/e.Value)
	}
}

// Without flow (both beds at 3 m) the pore pressure is hydrostatic,
// gw (h - y), and the uplift on a block whose base lies 1 m below the bed
// is gw (3 + 1) b (Archimedes and Pascal; any hydraulics text), centred,
// with no horizontal resultant. The heads and pressures are those of every
// panel. Tolerance 1e-9 relative: the solution of a constant head is exact
// to rounding.
func TestHydrostaticUplift(t *testing.T) {
	const b, gw = 6.0, 9.81
	s := newTestSection().
		soil("sand", 1e-5, 1e-5, rect(-30, -10, 30, 0)).
		body("block", rect(-b/2, -1, b/2, 2)).
		bed("left bed", 3, line(-30, 0, -b/2, 0)).
		bed("right bed", 3, line(b/2, 0, 30, 0)).
		solve(t, mesh.Options{})
	f := s.structure(t, "block")
	if relErr(f.Uplift, gw*4*b) > 1e-9 || math.Abs(f.UpliftX) > 1e-9 || math.Abs(f.Horizontal) > 1e-9*f.Uplift {
		t.Errorf("uplift %.10g kN/m at x = %g, horizontal %g; want %.10g at 0, 0", f.Uplift, f.UpliftX, f.Horizontal, gw*4*b)
	}
	for j, p := range s.sol.Mesh.Panels {
		if want := gw * (3 - p.Mid().Y); math.Abs(s.rep.PorePressure[j]-want) > 1e-9*want || math.Abs(s.rep.Head[j]-3) > 1e-9 {
			t.Fatalf("panel %d at %v: head %v, pore pressure %v kPa; want 3, %v", j, p.Mid(), s.rep.Head[j], s.rep.PorePressure[j], want)
		}
	}
	if len(s.rep.Exits) != 0 || s.rep.ExitGradient != nil || !math.IsNaN(s.rep.PipingSafety) {
		t.Errorf("exits %+v without flow", s.rep.Exits)
	}
	if math.Abs(f.Contact-(b+2)) > 1e-9 || math.Abs(f.Base-b) > 1e-9 {
		t.Errorf("contact %g m, base %g m; want %g, %g", f.Contact, f.Base, b+2, b)
	}
	if !hasWarning(s.rep, "no water flows") {
		t.Errorf("warnings %q", s.rep.Warnings)
	}
}

func hasWarning(r *Report, part string) bool {
	for _, w := range r.Warnings {
		if strings.Contains(w, part) {
			return true
		}
	}
	return false
}

// Lane's weighted creep length along a sheet pile 2 cm thick and 8 m deep
// (both faces vertical, the tip flat): Lw = 2 d + w/3, the ratio Lw/H, the
// soils it is safe for and a warning for a soil it is not (Lane, Trans.
// ASCE 100, 1935; the rule and the table from memory, see LaneRatios).
// Exact: the lengths are the geometry's.
func TestLaneCreep(t *testing.T) {
	const w, d, H = 0.02, 8.0, 2.5
	sec := pileLayer(30, 15, d, w, H)
	lay, err := sec.sc.Layout()
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
	sol, err := sys.Solve(nil)
	if err != nil {
		t.Fatal(err)
	}
	rep, err := Analyse(&sec.sc, sys, sol, Options{Soil: "fine sand"})
	if err != nil {
		t.Fatal(err)
	}
	if len(rep.Creeps) != 1 || rep.Creep != &rep.Creeps[0] {
		t.Fatalf("creep checks %+v, want one", rep.Creeps)
	}
	c := rep.Creep
	lw := 2*d + w/3
	if math.Abs(c.Vertical-2*d) > 1e-9 || math.Abs(c.Horizontal-w) > 1e-9 || math.Abs(c.Weighted-lw) > 1e-9 || math.Abs(c.Ratio-lw/H) > 1e-9 {
		t.Errorf("creep %+v; want vertical %g, horizontal %g, Lw %g, ratio %g", *c, 2*d, w, lw, lw/H)
	}
	if c.Required != 7.0 || !hasWarning(rep, "Lane's weighted creep ratio") {
		t.Errorf("required %g, warnings %q", c.Required, rep.Warnings)
	}
	for _, r := range LaneRatios {
		safe := false
		for _, s := range c.SafeFor {
			safe = safe || s == r.Soil
		}
		if safe != (lw/H >= r.Ratio) {
			t.Errorf("%s (%g): safe %v at ratio %g", r.Soil, r.Ratio, safe, lw/H)
		}
	}
	if _, err := Analyse(&sec.sc, sys, sol, Options{Soil: "quicksand"}); err == nil || !strings.Contains(err.Error(), "fine sand") {
		t.Errorf("unknown soil: %v", err)
	}
}
