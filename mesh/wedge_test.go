package mesh

import (
	"math"
	"testing"
)

// One sector: lambda = pi/beta with fixed potentials on both faces, pi/(2
// beta) with an insulated far face (separable solutions in a wedge;
// Jackson, Classical Electrodynamics, 1999, sec. 2.11). Splitting a sector
// into two of equal conductivity changes nothing; an interface
// perpendicular to a flat fixed face leaves lambda = 1 (the uniform field
// satisfies every condition). Tolerance 1e-9: bisection to rounding.
func TestWedgeExponent(t *testing.T) {
	for _, beta := range []float64{math.Pi / 3, math.Pi / 2, 0.75 * math.Pi, 0.8 * math.Pi, math.Pi, 1.5 * math.Pi, 2 * math.Pi} {
		if got, want := WedgeExponent([]Sector{{beta, 1}}, false), math.Min(math.Pi/beta, wedgeTop); math.Abs(got-want) > 1e-9 {
			t.Errorf("fixed faces, beta %.4f: lambda %.12f, want %.12f", beta, got, want)
		}
		if got, want := WedgeExponent([]Sector{{beta, 1}}, true), math.Pi/(2*beta); math.Abs(got-want) > 1e-9 {
			t.Errorf("insulated far face, beta %.4f: lambda %.12f, want %.12f", beta, got, want)
		}
		if got, want := WedgeExponent([]Sector{{0.3 * beta, 2}, {0.7 * beta, 2}}, false), math.Min(math.Pi/beta, wedgeTop); math.Abs(got-want) > 1e-9 {
			t.Errorf("split sector, beta %.4f: lambda %.12f, want %.12f", beta, got, want)
		}
	}
	if l := WedgeExponent([]Sector{{math.Pi / 2, 1}, {math.Pi / 2, 4.5}}, false); math.Abs(l-1) > 1e-9 {
		t.Errorf("perpendicular interface: lambda %.12f, want 1", l)
	}
	// Two sectors against the explicit junction condition above, solved
	// here by a plain scan of its sign: air (1) over 53.13 degrees next to
	// the fixed face, epoxy (4.5) over 126.87 degrees; and two soils (1 and
	// 5) over right angles.
	for _, c := range []struct{ w1, w2, k1, k2 float64 }{
		{math.Atan2(4, 3), math.Pi - math.Atan2(4, 3), 1, 4.5},
		{math.Pi / 2, math.Pi / 2, 1, 5},
	} {
		got := WedgeExponent([]Sector{{c.w1, c.k1}, {c.w2, c.k2}}, false)
		g := func(l float64) float64 {
			return c.k1*math.Sin(l*c.w2)*math.Cos(l*c.w1) + c.k2*math.Sin(l*c.w1)*math.Cos(l*c.w2)
		}
		if math.Abs(g(got)) > 1e-9 {
			t.Errorf("junction %+v: lambda %.6f leaves %g", c, got, g(got))
		}
		for l := 0.01; l < got-1e-6; l += 1e-4 {
			if (g(l) < 0) != (g(0.01) < 0) {
				t.Fatalf("junction %+v: a smaller root near %.4f than %.6f", c, l, got)
			}
		}
	}
}
