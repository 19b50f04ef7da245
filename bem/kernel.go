package bem

import (
	"math"

	"gonum.org/v1/gonum/spatial/r2"
)

// Closed-form integrals of the logarithmic kernel G = -(1/2pi) ln r and of
// its normal derivative over a straight panel from a to b, for any target x
// (on the panel, near it or far away). The panel's normal n is the right
// normal of b-a. In the panel's frame, with t = (b-a)/L, the target sits at
// xi0 = (x-a).t, eta0 = (x-a).n, and with alpha = -xi0, beta = L - xi0,
// rho_a = |x-a|, rho_b = |x-b| and theta the signed angle subtended by the
// panel at x (positive when x lies on the left, the -n side):
//
//	int ln r ds            = beta ln rho_b - alpha ln rho_a - L - eta0 theta
//	int dG/dn_y ds         = -theta / (2 pi)
//	grad_x int G ds        = (t ln(rho_b/rho_a) + n theta) / (2 pi)
//	grad_x int dG/dn_y ds  = (t eta0 (1/rho_a^2 - 1/rho_b^2) + n (alpha/rho_a^2 - beta/rho_b^2)) / (2 pi)
//
// These follow by elementary integration of ln sqrt(tau^2 + eta0^2) and
// eta0/(tau^2 + eta0^2); see e.g. Brebbia, Telles & Wrobel, Boundary Element
// Techniques, 1984, ch. 2, for the constant-element forms.

const inv2Pi = 1 / (2 * math.Pi)

// panelFrame is a panel reduced to what the integrals need.
type panelFrame struct {
	a, b r2.Vec
	t, n r2.Vec
	l    float64
}

func newFrame(a, b r2.Vec) panelFrame {
	d := r2.Sub(b, a)
	l := r2.Norm(d)
	t := r2.Scale(1/l, d)
	return panelFrame{a: a, b: b, t: t, n: r2.Vec{X: t.Y, Y: -t.X}, l: l}
}

// subtended returns the signed angle under which the segment a-b is seen from
// x, positive when x is on the left of a->b. It is 0 on the segment's line
// outside the segment.
func subtended(x, a, b r2.Vec) float64 {
	da := r2.Sub(a, x)
	db := r2.Sub(b, x)
	return math.Atan2(r2.Cross(da, db), r2.Dot(da, db))
}

// local returns the target's place in the panel's frame: eta0 = (x-a).n,
// alpha = -xi0 and beta = L - xi0 with xi0 = (x-a).t, and the squared
// distances rho_a^2 and rho_b^2 to the ends.
func (p *panelFrame) local(x r2.Vec) (eta0, alpha, beta, ra2, rb2 float64) {
	xa := r2.Sub(x, p.a)
	xi0 := r2.Dot(xa, p.t)
	eta0 = r2.Dot(xa, p.n)
	alpha, beta = -xi0, p.l-xi0
	return eta0, alpha, beta, xi0*xi0 + eta0*eta0, beta*beta + eta0*eta0
}

// logRatio returns ln(rho_b/rho_a) given rho_a^2 and the exact difference
// rho_b^2 - rho_a^2, accurately also when the two are close.
func logRatio(ra2, diff float64) float64 {
	return 0.5 * math.Log1p(diff/ra2)
}

// integrals returns the single-layer integral int G ds and the double-layer
// integral int dG/dn_y ds of the panel at x. If self is true, x is the
// panel's own midpoint (the principal value of the double layer is 0).
func (p *panelFrame) integrals(x r2.Vec, self bool) (sl, dl float64) {
	if self {
		h := 0.5 * p.l
		return -inv2Pi * (p.l*math.Log(h) - p.l), 0
	}
	eta0, alpha, beta, ra2, rb2 := p.local(x)
	theta := subtended(x, p.a, p.b)
	var lnInt float64
	switch {
	case ra2 == 0: // x at a
		lnInt = p.l*math.Log(p.l) - p.l
	default:
		if rb2 == 0 { // x at b
			lnInt = -alpha*0.5*math.Log(ra2) - p.l
			break
		}
		// beta ln rho_b - alpha ln rho_a = beta ln(rho_b/rho_a) + L ln rho_a,
		// with rho_b^2 - rho_a^2 = beta^2 - alpha^2 = L (beta + alpha).
		lr := logRatio(ra2, p.l*(beta+alpha))
		lnInt = beta*lr + p.l*0.5*math.Log(ra2) - p.l
	}
	lnInt -= eta0 * theta
	return -inv2Pi * lnInt, -inv2Pi * theta
}

// all returns the single- and double-layer integrals and their gradients at
// x in one pass (one arctangent, two logarithms). x must not lie on the
// panel's closed segment.
func (p *panelFrame) all(x r2.Vec) (sl, dl float64, gsl, gdl r2.Vec) {
	eta0, alpha, beta, ra2, rb2 := p.local(x)
	theta := subtended(x, p.a, p.b)
	lr := logRatio(ra2, p.l*(beta+alpha))
	lnInt := beta*lr + p.l*0.5*math.Log(ra2) - p.l - eta0*theta
	sl = -inv2Pi * lnInt
	dl = -inv2Pi * theta
	gsl = r2.Scale(inv2Pi, r2.Add(r2.Scale(lr, p.t), r2.Scale(theta, p.n)))
	ct := eta0 * (1/ra2 - 1/rb2)
	cn := alpha/ra2 - beta/rb2
	gdl = r2.Scale(inv2Pi, r2.Add(r2.Scale(ct, p.t), r2.Scale(cn, p.n)))
	return sl, dl, gsl, gdl
}

// linear returns the double-layer integral of the density s - L/2 (s the
// arc length from a) and its gradient at x off the panel:
//
//	int (s - L/2) dG/dn_y ds = (xi0 - L/2) D + eta0 ln(rho_b/rho_a) / (2 pi)
//
// with D the constant-density double layer, from
// int tau eta0/(tau^2 + eta0^2) dtau = eta0 ln(rho_b/rho_a).
func (p *panelFrame) linear(x r2.Vec) (d1 float64, g1 r2.Vec) {
	_, dl, _, gdl := p.all(x)
	xa := r2.Sub(x, p.a)
	xb := r2.Sub(x, p.b)
	xi0 := r2.Dot(xa, p.t)
	eta0 := r2.Dot(xa, p.n)
	ra2 := r2.Norm2(xa)
	rb2 := r2.Norm2(xb)
	lr := 0.5 * math.Log(rb2/ra2)
	c := xi0 - 0.5*p.l
	d1 = c*dl + inv2Pi*eta0*lr
	// grad lr = (x-b)/rho_b^2 - (x-a)/rho_a^2.
	glr := r2.Sub(r2.Scale(1/rb2, xb), r2.Scale(1/ra2, xa))
	g1 = r2.Add(r2.Add(r2.Scale(dl, p.t), r2.Scale(c, gdl)),
		r2.Add(r2.Scale(inv2Pi*lr, p.n), r2.Scale(inv2Pi*eta0, glr)))
	return d1, g1
}
