package seep

import (
	"math"
	"strconv"
	"strings"
	"testing"

	"github.com/rimfield/rimfield/geom"
	"github.com/rimfield/rimfield/mesh"
)

// The toe of a flat floor on deep soil: the exit gradient is infinite
// there, H / (pi sqrt(x^2 - l^2)) at x > l = b/2 (Harr, Groundwater and
// Seepage, 1962, ch. 5, from memory; verified in shared/REFERENCES.md), so
// the report flags it and gives the mean over the first L of the bed,
// (H / (pi L)) 2 asinh(sqrt(L / 2l)). b = 10 m, L = b/10 (a tenth of the
// floor's seepage path) and, with Options.ExitLength, 2.5 m. The section
// reaches 200 m beyond the floor; the truncation study (walls twice as
// far) moves the mean by 1e-4, and the tolerance is 1e-3 plus twice that
// (observed 1.8e-4 over b/10, 5.9e-4 over 2.5 m).
func TestSingularToeAverage(t *testing.T) {
	const b, H, L = 10.0, 3.0, 200.0
	sec := newTestSection().
		soil("sand", 1e-5, 1e-5, rect(-b/2-L, -L, b/2+L, 0)).
		body("floor", rect(-b/2, 0, b/2, 1)).
		bed("upstream bed", H, line(-b/2-L, 0, -b/2, 0)).
		bed("downstream bed", 0, line(b/2, 0, b/2+L, 0))
	s := sec.solve(t, mesh.Options{})
	st, err := Truncation(s.sc, s.rep, TruncationOptions{})
	if err != nil {
		t.Fatal(err)
	}
	tol := 1e-3 + 2*math.Abs(st.ExitGradientChange)
	mean := func(l float64) float64 { return H / (math.Pi * l) * 2 * math.Asinh(math.Sqrt(l/b)) }
	for _, o := range []Options{{}, {ExitLength: 2.5}} {
		rep, err := Analyse(s.sc, s.sys, s.sol, o)
		if err != nil {
			t.Fatal(err)
		}
		e := rep.ExitGradient
		want := mean(e.AveragedOver)
		t.Logf("%+v: mean exit gradient %.6f over %.3g m from (%g, %g) (theory %.6f, error %.2g; truncation %.2g)", o, e.Value, e.AveragedOver, e.At.X, e.At.Y, want, relErr(e.Value, want), st.ExitGradientChange)
		if !e.Singular || e.Corner || e.At.X != b/2 || math.Abs(e.Exponent+0.5) > 1e-9 {
			t.Errorf("%+v: exit %+v", o, *e)
		}
		if wantL := map[bool]float64{true: 2.5, false: b / 10}[o.ExitLength > 0]; math.Abs(e.AveragedOver-wantL) > 1e-9 {
			t.Errorf("%+v: averaged over %g m, want %g", o, e.AveragedOver, wantL)
		}
		if relErr(e.Value, want) > tol {
			t.Errorf("%+v: mean exit gradient %.6f, want %.6f", o, e.Value, want)
		}
		if !hasWarning(rep, "infinite in theory") {
			t.Errorf("%+v: warnings %q", o, rep.Warnings)
		}
	}
}

// A sloping downstream face: where a fixed-head bed meets an impervious
// face at an opening other than 90 degrees the gradient is singular
// (opening above 90 degrees) or vanishes (below), lambda = pi/(2 beta).
// A structure whose downstream face leans out at 45 degrees leaves the
// soil a 135 degree wedge at the toe (r^-1/3, singular); one that leans in
// leaves 45 degrees (lambda = 2: zero at the vertex).
func TestCornerKinds(t *testing.T) {
	for _, c := range []struct {
		name   string
		toe    geom.Ring
		kind   CornerKind
		lambda float64
	}{
		{"overhang", geom.Ring{{X: -5, Y: -2}, {X: 3, Y: -2}, {X: 5, Y: 0}, {X: 5, Y: 1}, {X: -5, Y: 1}}, CornerSingular, 2.0 / 3},
		{"batter", geom.Ring{{X: -5, Y: -2}, {X: 7, Y: -2}, {X: 5, Y: 0}, {X: 5, Y: 1}, {X: -5, Y: 1}}, CornerVanishing, 2},
	} {
		s := newTestSection().
			soil("sand", 1e-5, 1e-5, rect(-40, -20, 40, 0)).
			body("weir", c.toe).
			bed("upstream bed", 2, line(-40, 0, -5, 0)).
			bed("downstream bed", 0, line(5, 0, 40, 0)).
			solve(t, mesh.Options{})
		e := s.exit(t, "downstream bed")
		found := false
		for _, k := range e.Corners {
			if k.At.X == 5 && k.At.Y == 0 {
				found = true
				t.Logf("%s: corner %v, opening %.4g deg, lambda %.4f, value %.4g", c.name, k.Kind, k.Opening*180/math.Pi, k.Lambda, k.Value)
				if k.Kind != c.kind || math.Abs(k.Lambda-c.lambda) > 1e-9 || k.Neighbour != "weir" {
					t.Errorf("%s: corner %+v, want %v with lambda %g", c.name, k, c.kind, c.lambda)
				}
			}
		}
		if !found {
			t.Errorf("%s: no corner at the toe in %+v", c.name, e.Corners)
		}
	}
}

// Bad input gets one clear error; a scene of another physics is refused.
func TestAnalyseErrors(t *testing.T) {
	s := halfPile(40, 10, 5, 1, 1e-5, 1e-5).solve(t, mesh.Options{})
	for _, c := range []struct {
		o    Options
		want string
	}{
		{Options{ExitLength: -1}, "exit length"},
		{Options{PipingSafety: math.NaN()}, "piping safety"},
		{Options{HeaveSafety: math.Inf(1)}, "heave safety"},
		{Options{Soil: "loam"}, "Lane's table"},
	} {
		if _, err := Analyse(s.sc, s.sys, s.sol, c.o); err == nil || !strings.Contains(err.Error(), c.want) || !strings.HasPrefix(err.Error(), "seep: ") {
			t.Errorf("%+v: %v, want an error about %s", c.o, err, c.want)
		}
	}
	other := *s.sc
	other.Problem.Physics = geom.Laplace
	if _, err := Analyse(&other, s.sys, s.sol, Options{}); err != ErrNotSeepage {
		t.Errorf("laplace scene: %v", err)
	}
}

// Benchmarks: the analysis of a sheet pile section at increasing panel
// counts (the solve outside the timed loop).
func BenchmarkAnalyse(b *testing.B) {
	for _, n := range []int{500, 1000, 2000} {
		b.Run("panels="+strconv.Itoa(n), func(b *testing.B) {
			s := pileLayer(40, 10, 5, 0.5, 1).solve(b, mesh.Options{Panels: n})
			b.ReportAllocs()
			b.ResetTimer()
			for range b.N {
				rep, err := Analyse(s.sc, s.sys, s.sol, Options{})
				if err != nil {
					b.Fatal(err)
				}
				sinkReport = rep
			}
		})
	}
}

var sinkReport *Report

// A double-wall cofferdam, symmetric about x = 0: two sheet piles 0.5 m
// thick, 6 m into a 15 m layer, river at 4 m outside, the excavation
// between them pumped down to 0. Water leaves through the excavation's
// floor at both piles, one corner with the soil clockwise of the floor's
// direction, the other counter-clockwise: by symmetry the two corner
// values, the two heave checks and the two walls' uplifts must agree
// (observed to 1e-9 relative; the mesh is symmetric to rounding), and
// each wall is a seepage path of its own for Lane's check (exact lengths).
func TestCofferdamSymmetry(t *testing.T) {
	const w, d, gap = 0.5, 6.0, 8.0
	x1, x2 := gap/2, gap/2+w
	s := newTestSection().
		soil("sand", 1e-5, 1e-5, rect(-60, -15, 60, 0)).
		body("left wall", rect(-x2, -d, -x1, 1)).
		body("right wall", rect(x1, -d, x2, 1)).
		bed("river left", 4, line(-60, 0, -x2, 0)).
		bed("river right", 4, line(x2, 0, 60, 0)).
		bed("excavation", 0, line(-x1, 0, x1, 0)).
		solve(t, mesh.Options{})
	e := s.exit(t, "excavation")
	var vals []float64
	for _, c := range e.Corners {
		if c.Kind == CornerFinite && c.At.Y == 0 {
			vals = append(vals, c.Value)
		}
	}
	t.Logf("%d panels: exit gradient %.6f at (%g, %g); corners %v; heave %+v", len(s.sol.Mesh.Panels), e.Value, e.At.X, e.At.Y, vals, s.rep.Heave)
	if len(vals) != 2 || relErr(vals[0], vals[1]) > 1e-9 || !(vals[0] > 0) {
		t.Fatalf("finite corners of the excavation %v, want two equal values", vals)
	}
	if len(s.rep.Heave) != 2 || relErr(s.rep.Heave[0].Safety, s.rep.Heave[1].Safety) > 1e-9 {
		t.Errorf("heave checks %+v, want two equal ones", s.rep.Heave)
	}
	// Two structures, each its own seepage path: Lw = 2 d + w/3 under 4 m.
	if len(s.rep.Creeps) != 2 {
		t.Errorf("creep checks %+v, want one per wall", s.rep.Creeps)
	}
	for _, c := range s.rep.Creeps {
		if math.Abs(c.Weighted-(2*d+w/3)) > 1e-9 || c.Head != 4 || len(c.Structures) != 1 {
			t.Errorf("creep %+v, want Lw %g under 4 m", c, 2*d+w/3)
		}
	}
	l, r := s.structure(t, "left wall"), s.structure(t, "right wall")
	if relErr(l.Uplift, r.Uplift) > 1e-9 || math.Abs(l.UpliftX+r.UpliftX) > 1e-9 {
		t.Errorf("walls' uplift %v at %v and %v at %v", l.Uplift, l.UpliftX, r.Uplift, r.UpliftX)
	}
}
