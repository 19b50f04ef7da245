package main

import (
	"math"
	"testing"

	"github.com/rimfield/rimfield/bem"
)

// The surface-field chart of the coaxial example: one series per conductor,
// |E| = V/(a ln(b/a)) on the pin and V/(b ln(b/a)) on the bore, uniform
// (coaxial solution; any electromagnetics text), within 1e-3 relative; arc
// lengths in the scene's unit (mm) up to the circumference.
func TestElectroChart(t *testing.T) {
	sc, m, err := prepare(repoPath("examples", "coaxial", "scene.geojson"), 0)
	if err != nil {
		t.Fatal(err)
	}
	j := &job{scene: sc, mesh: m}
	if j.sol, err = bem.Solve(m, nil); err != nil {
		t.Fatal(err)
	}
	charts, err := electroCharts(j)
	if err != nil {
		t.Fatal(err)
	}
	if len(charts) != 1 || len(charts[0].Series) != 2 {
		t.Fatalf("charts %+v", charts)
	}
	want := map[string]struct{ e, r float64 }{
		"pin":  {1 / (coaxA * math.Log(coaxB/coaxA)), coaxA},
		"bore": {1 / (coaxB * math.Log(coaxB/coaxA)), coaxB},
	}
	for _, s := range charts[0].Series {
		w, ok := want[s.Name]
		if !ok {
			t.Fatalf("series %q", s.Name)
		}
		for i, y := range s.Y {
			if math.Abs(y-w.e) > 1e-3*w.e {
				t.Fatalf("%s: |E| = %v V/m at s = %v mm, want %v", s.Name, y, s.X[i], w.e)
			}
		}
		if last := s.X[len(s.X)-1]; last > 2*math.Pi*w.r*1e3 || last < 0.99*2*math.Pi*w.r*1e3 {
			t.Errorf("%s: last arc length %v mm, want about %v", s.Name, last, 2*math.Pi*w.r*1e3)
		}
	}
}
