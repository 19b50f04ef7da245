package seep

import (
	"math"
	"strings"
	"testing"

	"github.com/rimfield/rimfield/geom"
	"github.com/rimfield/rimfield/mesh"
)

// An invented weir (a demo, no published answer) read from GeoJSON in
// centimetres: an 8 m floor on 10 m of sand with a 0.2 m sheet pile at its
// upstream end, 6 m of head. Checked: the invariants any answer must meet.
// Water in = water out (to rounding: each region's net inflow is held to
// zero); the uplift lies between
// the tailwater and the headwater pressure diagrams (0 < U < gw H b) with
// its line of action upstream of the centre (the head falls downstream);
// the downstream toe has no cutoff, so its exit gradient is singular and
// averaged over a tenth of the weir's seepage path; no heave check there;
// Lane's length counts both faces of the pile and a third of the floor,
// exactly; every number is SI though the scene is in cm, and warnings
// place points in cm.
const weirCM = `{"type": "FeatureCollection",
 "problem": {"physics": "seepage", "unit": "cm"},
 "features": [
  {"type": "Feature", "properties": {"part": "region", "name": "sand", "k": 2e-5},
   "geometry": {"type": "Polygon", "coordinates": [[[-2000,-1000],[2000,-1000],[2000,0],[-2000,0],[-2000,-1000]]]}},
  {"type": "Feature", "properties": {"part": "body", "name": "weir"},
   "geometry": {"type": "Polygon", "coordinates": [[[-400,0],[400,0],[400,250],[-400,250],[-400,0]]]}},
  {"type": "Feature", "properties": {"part": "body", "name": "sheet pile"},
   "geometry": {"type": "Polygon", "coordinates": [[[-400,-500],[-380,-500],[-380,0],[-400,0],[-400,-500]]]}},
  {"type": "Feature", "properties": {"part": "edge", "name": "upstream bed", "potential": 6},
   "geometry": {"type": "LineString", "coordinates": [[-2000,0],[-400,0]]}},
  {"type": "Feature", "properties": {"part": "edge", "name": "downstream bed", "potential": 0},
   "geometry": {"type": "LineString", "coordinates": [[400,0],[2000,0]]}}
 ]}`

func TestWeirFromGeoJSON(t *testing.T) {
	sc, err := geom.Read(strings.NewReader(weirCM))
	if err != nil {
		t.Fatal(err)
	}
	s := solveScene(t, sc, mesh.Options{})
	r := s.rep
	const gw, H, b = 9.81, 6.0, 8.0
	t.Logf("%d panels: discharge %.5g m^2/s (imbalance %.2g); warnings %q", len(s.sol.Mesh.Panels), r.Discharge, r.Imbalance, r.Warnings)
	if math.Abs(r.Imbalance) > 1e-9 {
		t.Errorf("imbalance %.2g", r.Imbalance)
	}
	w := s.structure(t, "weir")
	t.Logf("weir: uplift %.5g kN/m at x = %.4g m; pile: uplift %.4g kN/m", w.Uplift, w.UpliftX, s.structure(t, "sheet pile").Uplift)
	if !(w.Uplift > 0 && w.Uplift < gw*H*b) || !(w.UpliftX < 0 && w.UpliftX > -b/2) {
		t.Errorf("weir uplift %.5g kN/m at x = %.4g m", w.Uplift, w.UpliftX)
	}
	e := r.ExitGradient
	if e == nil || e.Boundary != "downstream bed" || !e.Singular || e.At.X != 4 || math.Abs(e.AveragedOver-0.1*w.Contact) > 1e-9 {
		t.Fatalf("exit %+v", e)
	}
	if len(r.Heave) != 0 {
		t.Errorf("heave checks %+v at a toe without a cutoff", r.Heave)
	}
	// The floor and the pile touch: one structure.
	if want := 2*5 + (0.2+7.8)/3; len(r.Creeps) != 1 || math.Abs(r.Creeps[0].Weighted-want) > 1e-9 || math.Abs(r.Creeps[0].Head-H) > 1e-12 || len(r.Creeps[0].Structures) != 2 {
		t.Errorf("creep %+v, want one structure of two bodies, Lw %g, H %g", r.Creeps, want, H)
	}
	var found bool
	for _, msg := range r.Warnings {
		if strings.Contains(msg, "(400, 0) cm") {
			found = true
		}
	}
	if !found {
		t.Errorf("no warning places the toe at (400, 0) cm: %q", r.Warnings)
	}
	if got, want := len(r.Head), len(s.sol.Mesh.Panels); got != want || len(r.PorePressure) != want || len(r.NormalGradient) != want {
		t.Errorf("per-panel slices of %d, %d, %d for %d panels", len(r.Head), len(r.PorePressure), len(r.NormalGradient), want)
	}
}
