package electro

import (
	"math"
	"testing"
)

func TestWedgeExponent(t *testing.T) {
	// One sector: lambda = pi/beta with a conductor on both faces, pi/(2
	// beta) with an insulated far face (Jackson, Classical
	// Electrodynamics, 1999, sec. 2.11). Splitting a sector into two of
	// equal permittivity changes nothing. A dielectric interface
	// perpendicular to a flat conductor leaves lambda = 1 (the uniform
	// field satisfies every condition). Tolerance 1e-9: bisection to
	// rounding.
	for _, beta := range []float64{math.Pi / 2, 0.8 * math.Pi, 1.5 * math.Pi, 2 * math.Pi} {
		if l := wedgeExponent([]sector{{beta, 1}}, false); math.Abs(l-math.Pi/beta) > 1e-9 && math.Pi/beta < 2 {
			t.Errorf("beta %.4f: lambda %.12f, want %.12f", beta, l, math.Pi/beta)
		}
		if l := wedgeExponent([]sector{{beta, 1}}, true); math.Abs(l-math.Pi/(2*beta)) > 1e-9 {
			t.Errorf("beta %.4f, insulated: lambda %.12f, want %.12f", beta, l, math.Pi/(2*beta))
		}
		if l := wedgeExponent([]sector{{0.3 * beta, 2}, {0.7 * beta, 2}}, false); math.Abs(l-math.Min(math.Pi/beta, 2)) > 1e-9 {
			t.Errorf("beta %.4f split: lambda %.12f", beta, l)
		}
	}
	if l := wedgeExponent([]sector{{math.Pi / 2, 1}, {math.Pi / 2, 4.5}}, false); math.Abs(l-1) > 1e-9 {
		t.Errorf("perpendicular interface: lambda %.12f, want 1", l)
	}
	// Two sectors against the explicit triple-junction condition above,
	// solved here by a plain scan of its sign: air (eps 1) over 53.13
	// degrees next to the conductor, epoxy (eps 4.5) over 126.87 degrees.
	w1, w2 := math.Atan2(4, 3), math.Pi-math.Atan2(4, 3)
	got := wedgeExponent([]sector{{w1, 1}, {w2, 4.5}}, false)
	g := func(l float64) float64 {
		return 1*math.Sin(l*w2)*math.Cos(l*w1) + 4.5*math.Sin(l*w1)*math.Cos(l*w2)
	}
	if math.Abs(g(got)) > 1e-9 || got >= 1 || got < 0.5 {
		t.Errorf("triple junction: lambda %.6f, condition %g", got, g(got))
	}
	for l := 0.01; l < got-1e-6; l += 1e-4 {
		if (g(l) < 0) != (g(0.01) < 0) {
			t.Fatalf("a smaller root near %.4f than %.6f", l, got)
		}
	}
	t.Logf("air-epoxy junction on a flat conductor: lambda %.6f", got)
}
