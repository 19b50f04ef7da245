package bem

import (
	"math"
	"math/rand/v2"
	"testing"

	"gonum.org/v1/gonum/integrate/quad"
	"gonum.org/v1/gonum/spatial/r2"
)

// quadPanel integrates f(s) over s in [0, l] by Gauss-Legendre on pieces
// graded geometrically toward s0, the foot of the target, so that
// near-singular integrands are resolved. It is the independent check of the
// closed forms.
func quadPanel(f func(s float64) float64, l, s0, d float64) float64 {
	cuts := []float64{0, l}
	if s0 > 0 && s0 < l {
		cuts = append(cuts, s0)
	}
	h := d
	if h == 0 {
		h = math.Max(math.Max(-s0, s0-l), 1e-3*l)
	}
	for k := 0; k < 80; k++ {
		for _, c := range []float64{s0 - h, s0 + h} {
			if c > 0 && c < l {
				cuts = append(cuts, c)
			}
		}
		h *= 2
		if h > l {
			break
		}
	}
	sortFloats(cuts)
	sum := 0.0
	for i := 0; i+1 < len(cuts); i++ {
		if cuts[i+1] > cuts[i] {
			sum += quad.Fixed(f, cuts[i], cuts[i+1], 30, quad.Legendre{}, 0)
		}
	}
	return sum
}

func sortFloats(v []float64) {
	for i := 1; i < len(v); i++ {
		for j := i; j > 0 && v[j] < v[j-1]; j-- {
			v[j], v[j-1] = v[j-1], v[j]
		}
	}
}

// The closed forms against Gauss-Legendre quadrature of the kernels
// G = -(1/2pi) ln r and dG/dn_y = -(1/2pi) (y-x).n / r^2 (the definitions),
// for targets far, near (down to 1e-6 of the panel length) and on the
// panel's line. Tolerance 1e-10 absolute: quadrature on graded pieces
// reaches about 1e-13 here.
func TestIntegralsAgainstQuadrature(t *testing.T) {
	rng := rand.New(rand.NewPCG(1, 1))
	for trial := 0; trial < 300; trial++ {
		a := r2.Vec{X: rng.NormFloat64(), Y: rng.NormFloat64()}
		b := r2.Add(a, r2.Vec{X: rng.NormFloat64(), Y: rng.NormFloat64()})
		p := newFrame(a, b)
		// Target: foot position along the panel and distance off it.
		s0 := p.l * (rng.Float64()*1.6 - 0.3)
		d := p.l * math.Pow(10, -6+7*rng.Float64())
		if trial%3 == 0 {
			d = -d
		}
		if trial%10 == 0 {
			d = 0
			if s0 > 0 && s0 < p.l {
				s0 = p.l + 0.1*p.l*rng.Float64() + 1e-3
			}
		}
		x := r2.Add(r2.Add(a, r2.Scale(s0, p.t)), r2.Scale(d, p.n))
		sl, dl := p.integrals(x, false)
		y := func(s float64) r2.Vec { return r2.Add(a, r2.Scale(s, p.t)) }
		wantSL := quadPanel(func(s float64) float64 {
			return -inv2Pi * math.Log(r2.Norm(r2.Sub(y(s), x)))
		}, p.l, s0, math.Abs(d))
		wantDL := quadPanel(func(s float64) float64 {
			r := r2.Sub(y(s), x)
			return -inv2Pi * r2.Dot(r, p.n) / r2.Norm2(r)
		}, p.l, s0, math.Abs(d))
		if math.Abs(sl-wantSL) > 1e-10*math.Max(1, math.Abs(wantSL)) {
			t.Errorf("trial %d: single layer %.15g, quadrature %.15g (d/l=%g)", trial, sl, wantSL, d/p.l)
		}
		if math.Abs(dl-wantDL) > 1e-10 {
			t.Errorf("trial %d: double layer %.15g, quadrature %.15g (d/l=%g)", trial, dl, wantDL, d/p.l)
		}
	}
}

// The self integral at the panel's midpoint: int_{-h}^{h} ln|s| ds =
// 2h (ln h - 1), elementary.
func TestSelfIntegral(t *testing.T) {
	p := newFrame(r2.Vec{X: 1, Y: 2}, r2.Vec{X: 4, Y: 6}) // length 5
	sl, dl := p.integrals(r2.Vec{X: 2.5, Y: 4}, true)
	want := -inv2Pi * 5 * (math.Log(2.5) - 1)
	if math.Abs(sl-want) > 1e-15 || dl != 0 {
		t.Fatalf("self: sl=%v dl=%v, want %v, 0", sl, dl, want)
	}
	// The general formula, approached from just off the panel, agrees.
	sl2, _ := p.integrals(r2.Add(r2.Vec{X: 2.5, Y: 4}, r2.Scale(1e-12, p.n)), false)
	if math.Abs(sl2-want) > 1e-11 {
		t.Fatalf("near self: %v, want %v", sl2, want)
	}
	// At an endpoint: int_0^l ln s ds = l ln l - l.
	sl3, dl3 := p.integrals(p.a, false)
	if math.Abs(sl3-(-inv2Pi*(5*math.Log(5)-5))) > 1e-14 || dl3 != 0 {
		t.Fatalf("endpoint: %v %v", sl3, dl3)
	}
}

// The one-pass evaluation: its integrals equal the separate closed forms,
// its gradients match central differences of them (relative 1e-6:
// differences with step 1e-6 of the distance).
func TestGradientsAgainstDifferences(t *testing.T) {
	rng := rand.New(rand.NewPCG(2, 2))
	for trial := 0; trial < 200; trial++ {
		a := r2.Vec{X: rng.NormFloat64(), Y: rng.NormFloat64()}
		b := r2.Add(a, r2.Vec{X: rng.NormFloat64(), Y: rng.NormFloat64()})
		p := newFrame(a, b)
		x := r2.Add(a, r2.Vec{X: 3 * rng.NormFloat64(), Y: 3 * rng.NormFloat64()})
		dist := math.Min(r2.Norm(r2.Sub(x, a)), r2.Norm(r2.Sub(x, b)))
		h := 1e-6 * dist
		sl0, dl0 := p.integrals(x, false)
		sl1, dl1, gsl, gdl := p.all(x)
		if math.Abs(sl1-sl0) > 1e-15*math.Max(1, math.Abs(sl0)) || dl1 != dl0 {
			t.Fatalf("trial %d: one pass %v %v, separate %v %v", trial, sl1, dl1, sl0, dl0)
		}
		for k, e := range []r2.Vec{{X: 1}, {Y: 1}} {
			sp, dp := p.integrals(r2.Add(x, r2.Scale(h, e)), false)
			sm, dm := p.integrals(r2.Sub(x, r2.Scale(h, e)), false)
			fs := (sp - sm) / (2 * h)
			fd := (dp - dm) / (2 * h)
			gs := []float64{gsl.X, gsl.Y}[k]
			gd := []float64{gdl.X, gdl.Y}[k]
			if math.Abs(fs-gs) > 1e-6*math.Max(1, math.Abs(gs)) {
				t.Errorf("trial %d: d(sl)/dx%d = %v, differences %v", trial, k, gs, fs)
			}
			if math.Abs(fd-gd) > 1e-6*math.Max(1/dist, math.Abs(gd)) && math.Abs(fd-gd) > 1e-6 {
				t.Errorf("trial %d: d(dl)/dx%d = %v, differences %v", trial, k, gd, fd)
			}
		}
	}
}

// Green's third identity with u = 1: the double-layer integral over a closed
// boundary equals -c, c = 1 inside, theta/(2 pi) at a corner of interior angle
// theta, 0 outside (Jaswon & Symm, Integral Equation Methods in Potential
// Theory and Elastostatics, 1977; from memory). Checked on an L-shaped
// hexagon at every corner, inside and outside, to 1e-14 (closed form: only
// rounding).
func TestDoubleLayerFreeTerm(t *testing.T) {
	ring := []r2.Vec{{X: 0, Y: 0}, {X: 2, Y: 0}, {X: 2, Y: 1}, {X: 1, Y: 1}, {X: 1, Y: 2}, {X: 0, Y: 2}}
	angles := []float64{math.Pi / 2, math.Pi / 2, math.Pi / 2, 3 * math.Pi / 2, math.Pi / 2, math.Pi / 2}
	var frames []panelFrame
	for i := range ring {
		pts := split(ring[i], ring[(i+1)%len(ring)], 7, true)
		for k := 0; k+1 < len(pts); k++ {
			frames = append(frames, newFrame(pts[k], pts[k+1]))
		}
	}
	sum := func(x r2.Vec) float64 {
		s := 0.0
		for i := range frames {
			_, dl := frames[i].integrals(x, false)
			s += dl
		}
		return s
	}
	for i, v := range ring {
		if got, want := sum(v), -angles[i]/(2*math.Pi); math.Abs(got-want) > 1e-14 {
			t.Errorf("corner %d: double layer %v, want %v", i, got, want)
		}
	}
	if got := sum(r2.Vec{X: 0.5, Y: 0.5}); math.Abs(got+1) > 1e-14 {
		t.Errorf("inside: %v, want -1", got)
	}
	if got := sum(r2.Vec{X: 1.5, Y: 1.5}); math.Abs(got) > 1e-14 {
		t.Errorf("outside: %v, want 0", got)
	}
}

// The linear-density double layer against quadrature of its definition
// int (s - L/2) dG/dn_y ds, and its gradient against differences.
func TestLinearDensity(t *testing.T) {
	rng := rand.New(rand.NewPCG(4, 4))
	for trial := 0; trial < 200; trial++ {
		a := r2.Vec{X: rng.NormFloat64(), Y: rng.NormFloat64()}
		b := r2.Add(a, r2.Vec{X: rng.NormFloat64(), Y: rng.NormFloat64()})
		p := newFrame(a, b)
		s0 := p.l * (rng.Float64()*1.6 - 0.3)
		d := p.l * math.Pow(10, -4+5*rng.Float64())
		if trial%2 == 0 {
			d = -d
		}
		x := r2.Add(r2.Add(a, r2.Scale(s0, p.t)), r2.Scale(d, p.n))
		d1, g1 := p.linear(x)
		want := quadPanel(func(s float64) float64 {
			r := r2.Sub(r2.Add(a, r2.Scale(s, p.t)), x)
			return (s - p.l/2) * -inv2Pi * r2.Dot(r, p.n) / r2.Norm2(r)
		}, p.l, s0, math.Abs(d))
		if math.Abs(d1-want) > 1e-10*math.Max(1, p.l) {
			t.Errorf("trial %d: %v, quadrature %v", trial, d1, want)
		}
		hh := 1e-6 * math.Abs(d)
		for k, e := range []r2.Vec{{X: 1}, {Y: 1}} {
			dp, _ := p.linear(r2.Add(x, r2.Scale(hh, e)))
			dm, _ := p.linear(r2.Sub(x, r2.Scale(hh, e)))
			fd := (dp - dm) / (2 * hh)
			gk := []float64{g1.X, g1.Y}[k]
			if math.Abs(fd-gk) > 1e-5*math.Max(1, math.Abs(gk)) {
				t.Errorf("trial %d: gradient %d %v, differences %v", trial, k, gk, fd)
			}
		}
	}
}
