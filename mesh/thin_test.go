package mesh

import (
	"math"
	"testing"

	"github.com/rimfield/rimfield/geom"
	"gonum.org/v1/gonum/spatial/r2"
)

// The size rule across a body (see bodyFraction): panels on the faces of a
// body of thickness g are at most max(g/4, min(g, h0/16)) long, and so are
// the panels of the soil boundary that faces it across the body near it;
// gaps across the domain keep GapFactor*gap. 5% margin for the linear
// interpolation of the sampled gap.

// pileSection: a 100 m x 20 m soil box whose top is cut by a pile of
// thickness w and depth d: the top walls end at the pile, the pile's faces
// and tip bound the soil. All insulated (the size rules do not depend on
// the conditions), so nothing is graded at the pile's top.
func pileSection(w, d float64) *geom.Layout {
	x0, x1 := 50-w/2, 50+w/2
	pts := []r2.Vec{{X: 0, Y: 0}, {X: 100, Y: 0}, {X: 100, Y: 20}, {X: x1, Y: 20}, {X: x1, Y: 20 - d}, {X: x0, Y: 20 - d}, {X: x0, Y: 20}, {X: 0, Y: 20}}
	ps := ring(pts, 0, geom.Outside, -1, geom.Insulated)
	for i := 3; i <= 5; i++ {
		ps[i].Owner = 0 // the pile's faces and tip
	}
	return layout(ps, 1, 1, false)
}

func bodyTarget(g, h0 float64) float64 { return math.Max(g/4, math.Min(g, h0/16)) }

func TestBodyGapFraction(t *testing.T) {
	for _, w := range []float64{1, 0.2, 0.05, 0.01} {
		l := pileSection(w, 8)
		m := mustBuild(t, l, Options{})
		want := math.Min(bodyTarget(w, m.Size), m.Size)
		longest := 0.0
		for _, p := range m.Panels {
			if p.Owner == 0 && p.A.X == p.B.X {
				longest = math.Max(longest, p.Length())
			}
		}
		t.Logf("w = %g m: %d panels, nominal %.3g m, longest on the faces %.3g m (rule %.3g m)", w, len(m.Panels), m.Size, longest, want)
		if longest > 1.05*want || longest < 0.8*want {
			t.Errorf("w = %g m: longest face panel %.4g m, want about %.4g", w, longest, want)
		}
		// The top walls face each other across the pile: next to it their
		// panels follow the same rule.
		for _, p := range m.Panels {
			if p.Owner != -1 || p.A.Y != 20 || p.B.Y != 20 {
				continue
			}
			// The target grows from the pile at the grading rate: at the
			// panel's far end it is at most this.
			s := math.Max(math.Abs(p.A.X-50), math.Abs(p.B.X-50)) - w/2
			if lim := bodyTarget(w, m.Size) + math.Log(1.25)*s; p.Length() > 1.05*lim && s < 10*w {
				t.Errorf("w = %g m: top wall panel %.4g m at %.3g m from the pile, want <= %.4g", w, p.Length(), s, lim)
			}
		}
		if len(m.Panels) > 3000 {
			t.Errorf("w = %g m: %d panels", w, len(m.Panels))
		}
	}
}

// A thin strip of soil, 0.2 m thick (its two long walls face each other
// across the domain, where the head does not jump): panels as long as the
// gap, not a fraction of it.
func TestDomainGapUnchanged(t *testing.T) {
	ps := ring(rect(0, 0, 100, 0.2), 0, geom.Outside, -1, geom.Insulated)
	m := mustBuild(t, layout(ps, 0, 1, false), Options{})
	longest := 0.0
	for _, p := range m.Panels {
		longest = math.Max(longest, p.Length())
	}
	if longest < 0.19 || longest > 0.21 {
		t.Errorf("longest panel %.4g m across a 0.2 m strip of soil, want 0.2", longest)
	}
}
