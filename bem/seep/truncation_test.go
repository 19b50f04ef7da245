package seep

import (
	"math"
	"strings"
	"testing"

	"github.com/rimfield/rimfield/geom"
	"github.com/rimfield/rimfield/mesh"
)

// Truncate moves the side walls and the bottom out: the distances from the
// core (here the weir and the layer boundary) to each wall double, the
// beds that end on the side walls are extended with them, the upper layer
// keeps its thickness and the lower one deepens. Exact: the geometry is
// mapped piecewise linearly.
func TestTruncateGeometry(t *testing.T) {
	sec := newTestSection().
		soil("upper", 1e-5, 1e-5, rect(-30, -4, 30, 0)).
		soil("lower", 1e-6, 1e-6, rect(-30, -12, 30, -4)).
		body("weir", rect(-5, -2, 5, 1)).
		bed("upstream bed", 2, line(-30, 0, -5, 0)).
		bed("downstream bed", 0, line(5, 0, 30, 0))
	lay, err := sec.sc.Layout()
	if err != nil {
		t.Fatal(err)
	}
	out, walls, err := Truncate(&sec.sc, lay, 2)
	if err != nil {
		t.Fatal(err)
	}
	if strings.Join(walls, " ") != "left right bottom" {
		t.Errorf("moved %v", walls)
	}
	// The core spans x in [-5, 5] and reaches down to y = -4.
	wantUpper := rect(-55, -4, 55, 0)
	wantLower := rect(-55, -20, 55, -4)
	for i, want := range []geom.Ring{wantUpper, wantLower} {
		if got := out.Regions[i].Polygons[0][0]; !sameRing(got, want) {
			t.Errorf("region %d: %v, want %v", i, got, want)
		}
	}
	if got := out.Bodies[0].Polygons[0][0]; !sameRing(got, rect(-5, -2, 5, 1)) {
		t.Errorf("weir moved to %v", got)
	}
	if got := out.Edges[0].Lines[0]; got[0].X != -55 || got[1].X != -5 {
		t.Errorf("upstream bed %v, want from -55 to -5", got)
	}
	// The original is untouched.
	if sec.sc.Regions[0].Polygons[0][0][0].X != -30 || sec.sc.Edges[0].Lines[0][0].X != -30 {
		t.Error("Truncate changed its input")
	}
	if _, err := out.Layout(); err != nil {
		t.Errorf("moved section: %v", err)
	}
	// A sheet pile drawn as a line (zero thickness) at x = 20, deeper than
	// the layer boundary: it is part of the core, so only the soil beyond
	// it (x > 20: the right wall goes to 20 + 2 * 10) and below its tip
	// (y < -8: the bottom goes to -8 - 2 * 4) stretches, and the copy has
	// lines of its own.
	sec.sc.Bodies = append(sec.sc.Bodies, geom.Body{Feature: sec.feature(), Name: "sheet", Lines: []geom.Line{line(20, 0.5, 20, -8)}, Cond: geom.Insulated})
	if lay, err = sec.sc.Layout(); err != nil {
		t.Fatal(err)
	}
	if out, _, err = Truncate(&sec.sc, lay, 2); err != nil {
		t.Fatal(err)
	}
	if got := out.Regions[1].Polygons[0][0]; !sameRing(got, rect(-55, -16, 40, -4)) {
		t.Errorf("lower layer with the sheet: %v, want %v", got, rect(-55, -16, 40, -4))
	}
	if got := out.Bodies[1].Lines[0]; got[1].Y != -8 || &got[0] == &sec.sc.Bodies[1].Lines[0][0] {
		t.Errorf("sheet %v (or shared with the input)", got)
	}
}

func sameRing(a, b geom.Ring) bool {
	if len(a) != len(b) {
		return false
	}
	for i := range a {
		if math.Abs(a[i].X-b[i].X) > 1e-12 || math.Abs(a[i].Y-b[i].Y) > 1e-12 {
			return false
		}
	}
	return true
}

// The study on a floor with a cutoff: close walls (12 m beyond the
// structure) move the exit gradient by more than the default 2 % and warn;
// walls 200 m out move it by less than 1e-3 (see TestKhoslaBoseTaylor).
// The moved section keeps the base mesh's nominal size.
func TestTruncationStudy(t *testing.T) {
	weir := func(L float64) *section {
		return newTestSection().
			soil("sand", 1e-5, 1e-5, rect(-10-L, -L, 10+L, 0)).
			body("weir", geom.Ring{{X: -10, Y: 0}, {X: 9.9, Y: 0}, {X: 9.9, Y: -5}, {X: 10, Y: -5}, {X: 10, Y: 1}, {X: -10, Y: 1}}).
			bed("headwater bed", 4, line(-10-L, 0, -10, 0)).
			bed("tailwater bed", 0, line(10, 0, 10+L, 0))
	}
	s := weir(12).solve(t, mesh.Options{})
	st, err := Truncation(s.sc, s.rep, TruncationOptions{})
	if err != nil {
		t.Fatal(err)
	}
	t.Logf("walls 12 m out: exit gradient %.5f -> %.5f (%.3g %%), discharge %.4g -> %.4g (%.3g %%), %d panels; nominal sizes %.3g, %.3g m",
		st.ExitGradient, st.MovedExitGradient, 100*st.ExitGradientChange, st.Discharge, st.MovedDischarge, 100*st.DischargeChange,
		st.Panels, s.sol.Mesh.Size, st.Report.Solution.Mesh.Size)
	if !(math.Abs(st.ExitGradientChange) > 0.02) || len(st.Warnings) == 0 || !strings.Contains(st.Warnings[0], "truncated") {
		t.Errorf("close walls: change %.3g, warnings %q", st.ExitGradientChange, st.Warnings)
	}
	if st.Report.Solution.Mesh.Size != s.sol.Mesh.Size {
		t.Errorf("moved section meshed at %g m, base at %g m", st.Report.Solution.Mesh.Size, s.sol.Mesh.Size)
	}
	if _, err := Truncation(s.sc, s.rep, TruncationOptions{Factor: 0.5}); err == nil {
		t.Error("factor 0.5 accepted")
	}
}
