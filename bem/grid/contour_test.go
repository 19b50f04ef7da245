package grid

import (
	"math"
	"testing"

	"github.com/rimfield/rimfield/mesh"
	"gonum.org/v1/gonum/spatial/r2"
)

// Coaxial annulus a < r < b, u = 1 on r = a and u = 0 on r = b:
// u = ln(b/r)/ln(b/a), so the level-u curve is the circle r = b (a/b)^u.
// Source: any potential-theory text (e.g. Kellogg, Foundations of Potential
// Theory, 1929).
//
// Tolerance on each contour vertex's radius, derived rather than tuned: a
// vertex is the linear interpolant's zero on a cell edge of length h, so
// its potential is off by at most h^2/8 |d2u/de2| <= h^2/(8 r^2 ln(b/a)) and
// its radius by that over |du/dr| = 1/(r ln(b/a)): h^2/(8a) at worst. The
// sampled potential itself is off the exact one by at most eu (measured
// below and itself held to 1e-3), which moves a level curve by
// eu r ln(b/a) <= eu b ln(b/a). The sum, times 1.5 for rounding of the
// argument, is the bound.
func TestContoursCoaxial(t *testing.T) {
	a, b := 1.0, 2.0
	sol := solve(t, coaxScene(a, b, 0, 256), mesh.Options{})
	w := Window{Min: r2.Vec{X: -2.1, Y: -2.1}, Max: r2.Vec{X: 2.1, Y: 2.1}}
	g := Sample(sol, w, 161, 161, Options{})
	eu := 0.0
	for j := range g.NY {
		for i := range g.NX {
			p := g.Point(i, j)
			r := r2.Norm(p)
			u := g.U[g.Index(i, j)]
			inside := r > a*1.001 && r < b*0.999
			if math.IsNaN(u) {
				if inside {
					t.Fatalf("sample at r=%v inside the annulus is masked", r)
				}
				continue
			}
			if r < a*0.999 || r > b*1.001 {
				t.Fatalf("sample at r=%v outside the annulus has u=%v", r, u)
			}
			if inside {
				eu = math.Max(eu, math.Abs(u-math.Log(b/r)/math.Log(b/a)))
			}
		}
	}
	if eu > 1e-3 {
		t.Fatalf("sampled potential off the exact one by %.3g, want < 1e-3", eu)
	}
	h := math.Max(g.Spacing().X, g.Spacing().Y)
	tol := 1.5 * (h*h/(8*a) + eu*b*math.Log(b/a))
	levels := Levels(0, 1, 9)
	lines := Contours(g, levels, "1")
	worst := 0.0
	count := map[float64]int{}
	for _, l := range lines {
		count[l.Level]++
		want := b * math.Pow(a/b, l.Level)
		if n := len(l.Points); l.Points[0] != l.Points[n-1] {
			t.Errorf("level %.2f: line of %d points is not closed", l.Level, n)
		}
		for _, p := range l.Points {
			worst = math.Max(worst, math.Abs(r2.Norm(p)-want))
		}
	}
	for _, lv := range levels {
		if count[lv] != 1 {
			t.Errorf("level %.2f: %d lines, want one closed circle", lv, count[lv])
		}
	}
	if worst > tol {
		t.Errorf("largest radius error %.3g, bound %.3g", worst, tol)
	}
	t.Logf("h=%.3g, potential error %.3g, radius error %.3g, bound %.3g", h, eu, worst, tol)
}

// synthetic returns a grid of f sampled over w.
func synthetic(w Window, nx, ny int, f func(p r2.Vec) float64) *Grid {
	g := &Grid{Window: w, NX: nx, NY: ny, U: make([]float64, nx*ny)}
	for j := range ny {
		for i := range nx {
			g.U[g.Index(i, j)] = f(g.Point(i, j))
		}
	}
	return g
}

// u = xy has a saddle at the origin; the level c > 0 is the hyperbola
// xy = c in the first and third quadrants (elementary). With the saddle
// inside a cell, the cell-centre average decides the topology: the two
// branches must come out as two separate lines, each in its own quadrant.
// Every vertex lies within the interpolation bound h^2/8 |d2u/de2| = 0 of
// the curve along grid lines (u is linear along them), so |xy - c| must be
// at rounding level.
func TestContoursSaddle(t *testing.T) {
	w := Window{Min: r2.Vec{X: -1.05, Y: -1.05}, Max: r2.Vec{X: 0.95, Y: 0.95}} // saddle inside a cell
	g := synthetic(w, 21, 21, func(p r2.Vec) float64 { return p.X * p.Y })
	for _, c := range []float64{0.0004, -0.0004, 0.2} {
		lines := Contours(g, []float64{c}, "")
		if len(lines) != 2 {
			t.Fatalf("level %g: %d lines, want 2", c, len(lines))
		}
		for _, l := range lines {
			sx, sy := math.Signbit(l.Points[0].X), math.Signbit(l.Points[0].Y)
			for _, p := range l.Points {
				if math.Signbit(p.X) != sx || math.Signbit(p.Y) != sy {
					t.Fatalf("level %g: a line crosses between quadrants at %v", c, p)
				}
				if math.Abs(p.X*p.Y-c) > 1e-12 {
					t.Errorf("level %g: vertex %v has xy = %g", c, p, p.X*p.Y)
				}
			}
		}
	}
}

// Masked samples: a cell with a NaN corner is skipped, so a level curve
// of u = x crossing a masked square is cut into two open lines that stop
// short of it. u is linear, so the interpolated vertices are exact up to
// rounding (1e-12).
func TestContoursMasked(t *testing.T) {
	w := Window{Min: r2.Vec{X: 0, Y: 0}, Max: r2.Vec{X: 1, Y: 1}}
	g := synthetic(w, 11, 11, func(p r2.Vec) float64 {
		if math.Abs(p.X-0.5) < 0.25 && math.Abs(p.Y-0.5) < 0.25 {
			return math.NaN()
		}
		return p.X
	})
	lines := Contours(g, []float64{0.55}, "m")
	if len(lines) != 2 {
		t.Fatalf("%d lines, want 2", len(lines))
	}
	for _, l := range lines {
		if l.Unit != "m" {
			t.Errorf("unit %q, want m", l.Unit)
		}
		for _, p := range l.Points {
			if math.Abs(p.X-0.55) > 1e-12 {
				t.Errorf("vertex %v off the line x = 0.55", p)
			}
			if p.Y > 0.2+1e-12 && p.Y < 0.8-1e-12 {
				t.Errorf("vertex %v inside the masked band", p)
			}
		}
	}
}

func TestLevels(t *testing.T) {
	got := Levels(0, 10, 4)
	want := []float64{2, 4, 6, 8}
	for i := range want {
		if math.Abs(got[i]-want[i]) > 1e-12 {
			t.Fatalf("Levels(0, 10, 4) = %v, want %v", got, want)
		}
	}
	if Levels(1, 1, 3) != nil || Levels(0, 1, 0) != nil {
		t.Error("empty range or k = 0 should give no levels")
	}
}
