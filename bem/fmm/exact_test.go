package fmm

import (
	"math"
	"math/cmplx"
	"testing"

	"gonum.org/v1/gonum/integrate/quad"
	"gonum.org/v1/gonum/spatial/r2"
)

// Exact pair interactions for the tests, independent of the package's
// expansions. With z the target, the panel zeta = a + tau e (0 <= tau <= L,
// e the unit tangent, nu = -i e the right normal) and the complex potentials
// of unit densities
//
//	single layer: w_S = int log(z - zeta) ds,   u = -(1/2 pi) Re w_S
//	double layer: w_D = -nu int ds/(z - zeta),   u = -(1/2 pi) Re w_D
//
// (dG/dn_y = (1/2 pi) Re(nu/(z - zeta)) for G = -(1/2 pi) ln|z - zeta|), the
// integrals are elementary:
//
//	int log(z - zeta) ds = L log(z-a) - (z-b) Log((z-b)/(z-a))/e - L
//	int ds/(z - zeta)    = -Log((z-b)/(z-a))/e
//	int ds/(z - zeta)^2  = (1/(z-b) - 1/(z-a))/e
//
// (antiderivatives -(z-zeta)(log(z-zeta)-1)/e, -log(z-zeta)/e and
// 1/(e (z-zeta)); the principal Log of the ratio follows the argument of
// z - zeta continuously along the panel when z is off it). The gradient is
// -(1/2 pi) conj(w'). These agree with the real closed forms of Brebbia,
// Telles & Wrobel, Boundary Element Techniques, 1984, ch. 2
// (int ln r ds = beta ln rho_b - alpha ln rho_a - L - eta0 theta,
// int dG/dn ds = -theta/(2 pi)), checked in TestClosedFormsAgree.

// closedPanel returns the potentials at x of panel p with unit single- and
// double-layer densities and their gradients. On the panel itself the double
// layer is its principal value (0) and the gradients are not defined (NaN).
func closedPanel(x r2.Vec, p Panel) (sl, dl float64, gsl, gdl r2.Vec) {
	z, a, b := cplx(x), cplx(p.A), cplx(p.B)
	l := cmplx.Abs(b - a)
	e := (b - a) / complex(l, 0)
	nu := -1i * e
	ratio := (z - b) / (z - a)
	if z == a || z == b || (math.Abs(imag(ratio)) <= 1e-15*math.Abs(real(ratio)) && real(ratio) < 0) {
		// On the closed segment: ln r is integrable; take the limit of the
		// single layer, the principal value 0 of the double layer.
		var ls float64
		da, db := cmplx.Abs(z-a), cmplx.Abs(z-b)
		if da > 0 {
			ls += da*math.Log(da) - da
		}
		if db > 0 {
			ls += db*math.Log(db) - db
		}
		nan := math.NaN()
		return -inv2Pi * ls, 0, r2.Vec{X: nan, Y: nan}, r2.Vec{X: nan, Y: nan}
	}
	lr := cmplx.Log(ratio)
	wS := complex(l*math.Log(cmplx.Abs(z-a)), 0) - (z-b)*lr/e - complex(l, 0)
	i1 := -lr / e
	i2 := (1/(z-b) - 1/(z-a)) / e
	wD := -nu * i1
	dwD := nu * i2 // d/dz of -nu int (z-zeta)^-1 = nu int (z-zeta)^-2
	sl = -inv2Pi * real(wS)
	dl = -inv2Pi * real(wD)
	gsl = r2.Vec{X: -inv2Pi * real(i1), Y: inv2Pi * imag(i1)}
	gdl = r2.Vec{X: -inv2Pi * real(dwD), Y: inv2Pi * imag(dwD)}
	return sl, dl, gsl, gdl
}

// glNodes are the nodes and weights of 12-point Gauss-Legendre quadrature on
// [-1, 1] (gonum's integrate/quad). On a panel whose nearest point is at
// least 2.5 panel lengths away its error is below (2 * 5)^-24 relative
// (Trefethen, Is Gauss quadrature better than Clenshaw-Curtis?, SIAM Review
// 50, 2008, Theorem 4.5: the error decays as rho^-2n, rho the Bernstein
// ellipse parameter, here about 10).
var glX, glW = func() ([]float64, []float64) {
	x, w := make([]float64, 12), make([]float64, 12)
	quad.Legendre{}.FixedLocations(x, w, -1, 1)
	return x, w
}()

// gaussPanel returns what closedPanel does, by quadrature.
func gaussPanel(x r2.Vec, p Panel) (sl, dl float64, gsl, gdl r2.Vec) {
	z, a, b := cplx(x), cplx(p.A), cplx(p.B)
	mid, h := 0.5*(a+b), 0.5*(b-a)
	hl := cmplx.Abs(h)
	nu := -1i * h / complex(hl, 0)
	var ls float64
	var i1, i2 complex128
	for k, u := range glX {
		w := glW[k] * hl
		dz := z - (mid + complex(u, 0)*h)
		ls += w * math.Log(cmplx.Abs(dz))
		id := 1 / dz
		i1 += complex(w, 0) * id
		i2 += complex(w, 0) * id * id
	}
	wD := -nu * i1
	dwD := nu * i2
	sl = -inv2Pi * ls
	dl = -inv2Pi * real(wD)
	gsl = r2.Vec{X: -inv2Pi * real(i1), Y: inv2Pi * imag(i1)}
	gdl = r2.Vec{X: -inv2Pi * real(dwD), Y: inv2Pi * imag(dwD)}
	return sl, dl, gsl, gdl
}

// exactPanel uses quadrature where the panel is well separated from x
// (midpoint distance at least 3 lengths) and the closed forms elsewhere.
func exactPanel(x r2.Vec, p Panel) (sl, dl float64, gsl, gdl r2.Vec) {
	mid := r2.Scale(0.5, r2.Add(p.A, p.B))
	if r2.Norm(r2.Sub(x, mid)) >= 3*r2.Norm(r2.Sub(p.B, p.A)) {
		return gaussPanel(x, p)
	}
	return closedPanel(x, p)
}

// TestClosedFormsAgree checks the test's closed forms against the real forms
// of Brebbia, Telles & Wrobel (1984, ch. 2) and against quadrature.
func TestClosedFormsAgree(t *testing.T) {
	p := Panel{A: r2.Vec{X: 0.3, Y: -0.2}, B: r2.Vec{X: 1.1, Y: 0.4}}
	l := r2.Norm(r2.Sub(p.B, p.A))
	tt := r2.Scale(1/l, r2.Sub(p.B, p.A))
	n := r2.Vec{X: tt.Y, Y: -tt.X}
	for _, x := range []r2.Vec{{X: 0.5, Y: 0.7}, {X: -1, Y: -2}, {X: 0.7, Y: 0.1001}, {X: 3, Y: 2}} {
		sl, dl, _, _ := closedPanel(x, p)
		xa := r2.Sub(x, p.A)
		xi0, eta0 := r2.Dot(xa, tt), r2.Dot(xa, n)
		alpha, beta := -xi0, l-xi0
		ra, rb := r2.Norm(xa), r2.Norm(r2.Sub(x, p.B))
		da, db := r2.Sub(p.A, x), r2.Sub(p.B, x)
		theta := math.Atan2(r2.Cross(da, db), r2.Dot(da, db))
		lnInt := beta*math.Log(rb) - alpha*math.Log(ra) - l - eta0*theta
		wantS, wantD := -inv2Pi*lnInt, -inv2Pi*theta
		// Observed agreement 1e-16; 1e-13 allows for the logarithms.
		if math.Abs(sl-wantS) > 1e-13 || math.Abs(dl-wantD) > 1e-13 {
			t.Errorf("x=%v: closed forms %.16g %.16g, Brebbia's %.16g %.16g", x, sl, dl, wantS, wantD)
		}
	}
	// Quadrature against closed forms where both apply (3 lengths away):
	// observed 1e-16, allowed 1e-13.
	for _, x := range []r2.Vec{{X: 3.4, Y: 1.2}, {X: -2.5, Y: -1}, {X: 0.7, Y: 3}} {
		s1, d1, gs1, gd1 := closedPanel(x, p)
		s2, d2, gs2, gd2 := gaussPanel(x, p)
		if d := math.Max(math.Max(math.Abs(s1-s2), math.Abs(d1-d2)),
			math.Max(r2.Norm(r2.Sub(gs1, gs2)), r2.Norm(r2.Sub(gd1, gd2)))); d > 1e-13 {
			t.Errorf("x=%v: closed form and quadrature differ by %g", x, d)
		}
	}
	// The gradients are the derivatives of the potentials (central
	// differences, step 1e-5: truncation error ~1e-10).
	x := r2.Vec{X: 0.2, Y: 0.9}
	_, _, gs, gd := closedPanel(x, p)
	const hd = 1e-5
	for k, dx := range []r2.Vec{{X: hd}, {Y: hd}} {
		sp, dp, _, _ := closedPanel(r2.Add(x, dx), p)
		sm, dm, _, _ := closedPanel(r2.Sub(x, dx), p)
		fs, fd := (sp-sm)/(2*hd), (dp-dm)/(2*hd)
		ws, wd := gs.X, gd.X
		if k == 1 {
			ws, wd = gs.Y, gd.Y
		}
		if math.Abs(fs-ws) > 1e-8 || math.Abs(fd-wd) > 1e-8 {
			t.Errorf("component %d: gradient %g %g, differences %g %g", k, ws, wd, fs, fd)
		}
	}
}
