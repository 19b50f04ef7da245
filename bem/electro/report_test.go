package electro

import (
	"fmt"
	"math"
	"regexp"
	"strings"
	"testing"

	"github.com/rimfield/rimfield/geom"
	"github.com/rimfield/rimfield/mesh"
	"gonum.org/v1/gonum/spatial/r2"
)

// scaled multiplies every vertex of the ring by s (scene units to metres).
func scaled(r geom.Ring, s float64) geom.Ring {
	out := make(geom.Ring, len(r))
	for i, v := range r {
		out[i] = r2.Scale(s, v)
	}
	return out
}

func TestAnalyseSquareCoaxMillimetres(t *testing.T) {
	// The square coaxial line drawn in millimetres, 100 V on the core: the
	// capacitance per metre does not depend on the scale (10.234093 eps0,
	// Schwarz-Christoffel, REFERENCES.md), the fields scale as 1/size, the
	// peak sits at a core corner and the warning names the conductor, the
	// corner in mm and a rounding radius in mm, worked out here from the
	// corner's own coefficient (RoundingRadius is checked against rounded
	// geometry in TestRoundingRadius).
	const mm = 1e-3
	sb := newScene(false).
		region("gap", 1, scaled(rectangle(-2, -2, 2, 2), mm)).
		body("core", fixed(100), scaled(rectangle(-1, -1, 1, 1), mm)).
		edge("shield", fixed(0), closedRing(scaled(rectangle(-2, -2, 2, 2), mm))...)
	sb.sc.Problem.Unit, sb.sc.Problem.Scale = "mm", mm
	s := sb.solve(t, mesh.Options{})
	rep, err := Analyse(s.sc, s.sys, s.sol, Options{Refine: true})
	if err != nil {
		t.Fatal(err)
	}
	if c := rep.Capacitance.C[0][0] / geom.Eps0; relErr(c, 10.234093) > tolDefault {
		t.Errorf("C/eps0 = %.7f, want 10.234093", c)
	}
	// W = C V^2 / 2 (energy of a charged capacitor, any text).
	if w := 0.5 * 10.234093 * geom.Eps0 * 1e4; relErr(rep.Energy, w) > tolDefault {
		t.Errorf("W = %.6g J/m, want %.6g", rep.Energy, w)
	}
	if rep.Peak == nil || rep.Peak.Corner == nil || rep.Peak.Boundary != "core" {
		t.Fatalf("peak %+v, want at a corner of the core", rep.Peak)
	}
	if len(rep.Corners) != 4 {
		t.Errorf("%d corners, want 4", len(rep.Corners))
	}
	if rep.Refinement == nil || math.Abs(rep.Refinement.Ratio-math.Cbrt(2)) > 0.04 {
		t.Errorf("refinement %+v, want the ratio 2^(1/3) of a square corner", rep.Refinement)
	}
	var w string
	for _, s := range rep.Warnings {
		if strings.Contains(s, "infinite in theory") {
			w = s
		}
	}
	t.Log(w)
	if !regexp.MustCompile(`"core" is at the sharp edge \(-?1, -?1\) mm`).MatchString(w) {
		t.Errorf("warning %q does not place the corner in mm", w)
	}
	c := *rep.Peak.Corner
	target := rep.Fields.smoothPeak(rep.Corners)
	r := fmt.Sprintf("radius of about %.2g mm", c.RoundingRadius(target)/mm)
	if !(target > 0) || !strings.Contains(w, r) {
		t.Errorf("warning %q lacks %q", w, r)
	}
	// Forces balance by symmetry (to the field accuracy).
	for _, f := range rep.Forces {
		if r2.Norm(f.F) > 1e-6*rep.Energy/mm {
			t.Errorf("force on %s %v N/m, want 0 by symmetry", f.Name, f.F)
		}
	}
}

func TestAnalyseBreakdownWarning(t *testing.T) {
	// With a breakdown field on the region, the rounding radius aims at it
	// and the margin is flagged: the layered plates at 1 V (upper layer at
	// 0.889 V/m, see TestBreakdownLayers) against 0.5 V/m.
	sb := layeredPlates(2, 0.5, 1, 4, 1, 1)
	sb.sc.Regions[1].BreakdownField = 0.5
	s := sb.solve(t, mesh.Options{})
	rep, err := Analyse(s.sc, s.sys, s.sol, Options{})
	if err != nil {
		t.Fatal(err)
	}
	if len(rep.Margins) != 1 || !rep.Margins[0].Exceeded {
		t.Fatalf("margins %+v", rep.Margins)
	}
	found := false
	for _, w := range rep.Warnings {
		found = found || strings.Contains(w, `"upper" reaches`)
	}
	if !found {
		t.Errorf("warnings %q do not flag the upper layer", rep.Warnings)
	}
	if rep.Refinement != nil {
		t.Error("refinement ran without being asked for")
	}
}
