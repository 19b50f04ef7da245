package fmm

import (
	"math"
	"math/cmplx"
	"math/rand/v2"
	"testing"

	"gonum.org/v1/gonum/spatial/r2"
)

// cluster is a handful of sources inside the disk |z - c| <= r.
type cluster struct {
	panels []Panel
	s, d   []float64
	points []complex128
	q      []float64
}

func newCluster(rng *rand.Rand, c complex128, r float64) *cluster {
	cl := &cluster{}
	in := func() complex128 {
		rr, th := 0.7*r*math.Sqrt(rng.Float64()), 2*math.Pi*rng.Float64()
		return c + cmplx.Rect(rr, th)
	}
	for range 6 {
		a := in()
		b := a + cmplx.Rect(0.25*r*rng.Float64(), 2*math.Pi*rng.Float64())
		cl.panels = append(cl.panels, Panel{A: r2.Vec{X: real(a), Y: imag(a)}, B: r2.Vec{X: real(b), Y: imag(b)}})
		cl.s = append(cl.s, 2*rng.Float64()-1)
		cl.d = append(cl.d, 2*rng.Float64()-1)
	}
	for range 3 {
		cl.points = append(cl.points, in())
		cl.q = append(cl.q, 2*rng.Float64()-1)
	}
	return cl
}

// exact returns Re w and w' of the cluster at z (u = -(1/2 pi) Re w), from
// the test's closed forms.
func (cl *cluster) exact(z complex128) (float64, complex128) {
	x := r2.Vec{X: real(z), Y: imag(z)}
	var u float64
	var g r2.Vec
	for j, p := range cl.panels {
		sl, dl, gsl, gdl := closedPanel(x, p)
		u += cl.s[j]*sl + cl.d[j]*dl
		g = r2.Add(g, r2.Add(r2.Scale(cl.s[j], gsl), r2.Scale(cl.d[j], gdl)))
	}
	w := -2 * math.Pi * u
	dw := complex(-2*math.Pi*g.X, 2*math.Pi*g.Y)
	for k, y := range cl.points {
		w += cl.q[k] * math.Log(cmplx.Abs(z-y))
		dw += complex(cl.q[k], 0) / (z - y)
	}
	return w, dw
}

func (cl *cluster) multipole(e *expander, c complex128, r float64) []complex128 {
	m := make([]complex128, e.p+1)
	for j, p := range cl.panels {
		e.addPanel(m, c, r, cplx(p.A), cplx(p.B), cl.s[j], cl.d[j], 0)
	}
	for k, y := range cl.points {
		e.addPoint(m, c, r, y, cl.q[k])
	}
	return m
}

// TestTranslations checks each operator of Greengard & Rokhlin (1987,
// Lemmas 2.1-2.5) against the closed-form potential of the same sources: the
// multipole of a cluster evaluated outside it, moved to a parent centre,
// translated into a local expansion, shifted to a child, and evaluated, each
// with well separated boxes (ratios 1/4) so that order 40 truncates below
// 1e-20; observed 4.4e-16 relative (rounding), required 1e-13.
func TestTranslations(t *testing.T) {
	rng := rand.New(rand.NewPCG(4, 1))
	e := newExpander(40)
	c1, r1 := complex(0.3, -0.2), 1e-3
	cl := newCluster(rng, c1, r1)
	m1 := cl.multipole(e, c1, r1)
	check := func(what string, z complex128, w float64, dw complex128) {
		t.Helper()
		ew, edw := cl.exact(z)
		scale := 0.0
		for _, q := range append(append([]float64{}, cl.s...), cl.q...) {
			scale += math.Abs(q)
		}
		if math.Abs(w-ew) > 1e-13*math.Max(math.Abs(ew), 1e-3*scale) || cmplx.Abs(dw-edw) > 1e-13*cmplx.Abs(edw) {
			t.Errorf("%s at %v: w %.15g %v, exact %.15g %v", what, z, w, dw, ew, edw)
		}
	}
	z := c1 + cmplx.Rect(4*r1, 1)
	w, dw := e.evalMultipole(m1, c1, r1, z, true)
	check("multipole", z, w, dw)

	// Parent centres: offset, very close (the direct branch of m2m), equal.
	for _, off := range []complex128{complex(0.6*r1, -0.5*r1), complex(1e-5*r1, 0), 0} {
		c0 := c1 + off
		r0 := 2 * r1
		m0 := make([]complex128, e.p+1)
		e.m2m(m0, m1, c0, c1, r0, r1, make([]complex128, e.p+1))
		z := c0 + cmplx.Rect(8*r0, -2)
		w, dw := e.evalMultipole(m0, c0, r0, z, true)
		check("multipole to multipole", z, w, dw)

		c2, r2 := c0+cmplx.Rect(8*r0, 0.7), 0.9*r0
		loc := make([]complex128, e.p+1)
		e.m2l(loc, m0, c2, c0, r2, r0, newM2LScratch(e.p))
		zt := c2 + cmplx.Rect(r2, 2.5)
		lw, ldw := e.evalLocal(loc, c2, r2, zt)
		check("multipole to local", zt, real(lw), ldw)
		if u := e.evalLocalU(loc, c2, r2, zt); u != real(lw) {
			t.Errorf("evalLocalU %v, evalLocal %v", u, real(lw))
		}

		// Children: offset, very close (the direct branch of l2l), equal.
		for _, coff := range []complex128{complex(-0.4*r2, 0.5*r2), complex(0, 1e-6*r2), 0} {
			c3, r3 := c2+coff, 0.5*r2
			loc3 := make([]complex128, e.p+1)
			e.l2l(loc3, loc, c2, c3, r2, r3, make([]complex128, e.p+1))
			zt := c3 + cmplx.Rect(0.9*r3, -1)
			lw, ldw := e.evalLocal(loc3, c3, r3, zt)
			check("local to local", zt, real(lw), ldw)
		}
	}
}

// TestShortPanelMoments: a panel 1e-9 long at the edge of its box has the
// multipole of a point charge s L and a point dipole at its midpoint up to
// (L/r)^2 = 1e-18; the recurrence of addPanel keeps that to rounding
// (3.4e-15 observed, 1e-13 required), where B^(k+1) - A^(k+1) would lose
// nine digits.
func TestShortPanelMoments(t *testing.T) {
	e := newExpander(30)
	c, r := complex(1, 1), 1.0
	a := c + complex(0.6, 0.7)
	b := a + cmplx.Rect(1e-9, 0.4)
	l := cmplx.Abs(b - a) // the represented panel, not the requested 1e-9
	mp := make([]complex128, e.p+1)
	e.addPanel(mp, c, r, a, b, 0.7, 0, 0)
	mq := make([]complex128, e.p+1)
	e.addPoint(mq, c, r, 0.5*(a+b), 0.7*l)
	for k := range mp {
		if cmplx.Abs(mp[k]-mq[k]) > 1e-13*cmplx.Abs(mq[k]) {
			t.Errorf("k=%d: panel %v, point %v", k, mp[k], mq[k])
		}
	}
	// Double layer: the multipole of a dipole mu = d L nu at the midpoint is
	// A_k = -mu ((y-c)/r)^(k-1) / r.
	md := make([]complex128, e.p+1)
	e.addPanel(md, c, r, a, b, 0, 0.7, 0)
	nu := -1i * (b - a) / complex(l, 0)
	mu := complex(0.7*l, 0) * nu
	y := (0.5*(a+b) - c) / complex(r, 0)
	for k := 1; k <= e.p; k++ {
		want := -mu * cmplx.Pow(y, complex(float64(k-1), 0)) / complex(r, 0)
		if cmplx.Abs(md[k]-want) > 1e-13*cmplx.Abs(want) {
			t.Errorf("double layer k=%d: %v, dipole %v", k, md[k], want)
		}
	}
}

// TestOrder: the order follows the bound; the bound decreases with p and
// meets the tolerance.
func TestOrder(t *testing.T) {
	prev := math.Inf(1)
	for p := 2; p < 60; p++ {
		b := bound(p, rho)
		if !(b < prev) {
			t.Fatalf("bound not decreasing at p=%d", p)
		}
		prev = b
	}
	for _, tol := range []float64{1e-3, 1e-6, 1e-10, 1e-12} {
		p := order(tol, rho)
		if bound(p, rho) > tol || bound(p-1, rho) <= tol {
			t.Errorf("tol %g: order %d is not the smallest meeting the bound", tol, p)
		}
	}
}
