package flow

import (
	"math"
	"math/cmplx"

	"github.com/rimfield/rimfield/geom"
	"gonum.org/v1/gonum/spatial/r2"
)

// Exact references by conformal mapping. A circle of radius R about mu in
// the zeta plane, through the trailing-edge point zeta = 1, is mapped onto
// the section by the Karman-Trefftz map
//
//	z = n ((zeta+1)^n + (zeta-1)^n) / ((zeta+1)^n - (zeta-1)^n),  n = 2 - tau/pi,
//
// tau the trailing-edge angle (von Karman & Trefftz, Potentialstroemung um
// gegebene Tragflaechenquerschnitte, Z. Flugtech. Motorluftschiff. 9,
// 1918; Milne-Thomson, Theoretical Aerodynamics, 1958, ch. 7 [from
// memory]); n = 2 is Joukowski's z = zeta + 1/zeta. Written with
// w = (zeta-1)/(zeta+1), z = n (1 + w^n)/(1 - w^n) and
// dz/dzeta = 4 n^2 w^(n-1) / ((1 - w^n)^2 (zeta+1)^2); w^n takes the
// principal branch, which is continuous outside the circle because the
// circle encloses the segment [-1, 1] where w is negative.
//
// The flow past the circle at incidence alpha with clockwise circulation
// Gamma has the complex velocity (Milne-Thomson, Theoretical
// Hydrodynamics, 1968, sec. 6.21 [from memory])
//
//	dW/dzeta = U (e^(-i alpha) - R^2 e^(i alpha) / (zeta-mu)^2) + i Gamma / (2 pi (zeta-mu)),
//
// and the Kutta condition (dW/dzeta = 0 at zeta = 1, where dz/dzeta
// vanishes) gives Gamma = 4 pi U R sin(alpha + beta), beta = -arg(1 - mu).
// The surface speed of the section is |dW/dzeta| / |dz/dzeta| at the
// image of each circle point.
type mapped struct {
	n  float64    // 2 - tau/pi
	mu complex128 // circle centre
	R  float64
}

func newMapped(tauDeg float64, mu complex128) mapped {
	return mapped{n: 2 - tauDeg/180, mu: mu, R: cmplx.Abs(1 - mu)}
}

// zeta returns the circle point at angle theta.
func (c mapped) zeta(theta float64) complex128 {
	return c.mu + complex(c.R, 0)*cmplx.Exp(complex(0, theta))
}

// thetaTE is the circle angle of the trailing-edge point zeta = 1.
func (c mapped) thetaTE() float64 { return cmplx.Phase(1 - c.mu) }

func (c mapped) z(zeta complex128) complex128 {
	if zeta == 1 {
		return complex(c.n, 0)
	}
	wn := cmplx.Pow((zeta-1)/(zeta+1), complex(c.n, 0))
	return complex(c.n, 0) * (1 + wn) / (1 - wn)
}

func (c mapped) dz(zeta complex128) complex128 {
	w := (zeta - 1) / (zeta + 1)
	wn := cmplx.Pow(w, complex(c.n, 0))
	wn1 := cmplx.Pow(w, complex(c.n-1, 0))
	d := (1 - wn) * (zeta + 1)
	return complex(4*c.n*c.n, 0) * wn1 / (d * d)
}

// gamma returns the clockwise circulation of the Kutta condition.
func (c mapped) gamma(U, alphaDeg float64) float64 {
	a := alphaDeg * math.Pi / 180
	return 4 * math.Pi * U * c.R * math.Sin(a-c.thetaTE())
}

// speed returns the exact surface speed at the image of circle angle theta.
func (c mapped) speed(U, alphaDeg, theta float64) float64 {
	a := alphaDeg * math.Pi / 180
	zt := c.zeta(theta)
	d := zt - c.mu
	g := c.gamma(U, alphaDeg)
	dw := complex(U, 0)*(cmplx.Exp(complex(0, -a))-complex(c.R*c.R, 0)*cmplx.Exp(complex(0, a))/(d*d)) + complex(0, g/(2*math.Pi))/d
	return cmplx.Abs(dw) / cmplx.Abs(c.dz(zt))
}

// ring returns the section as a polygon of n vertices, the images of
// equally spaced circle points starting at the trailing edge, scaled by s
// and shifted by off (so that a scene can be drawn in another unit).
func (c mapped) ring(n int, s float64, off r2.Vec) geom.Ring {
	out := make(geom.Ring, n)
	t0 := c.thetaTE()
	for k := range out {
		z := c.z(c.zeta(t0 + 2*math.Pi*float64(k)/float64(n)))
		if k == 0 {
			z = complex(c.n, 0)
		}
		out[k] = r2.Vec{X: off.X + s*real(z), Y: off.Y + s*imag(z)}
	}
	return out
}

// pressure integrates the exact surface pressure round the section by the
// trapezoidal rule in theta (spectrally accurate: the integrand is smooth
// and periodic), returning the force coefficient vector per unit chord
// and dynamic pressure, F / (q c), and the anticlockwise moment
// coefficient about ref, M_z / (q c^2), with c the chord argument.
func (c mapped) pressure(U, alphaDeg float64, ref r2.Vec, chord float64, steps int) (r2.Vec, float64) {
	var f r2.Vec
	var mz float64
	t0 := c.thetaTE()
	h := 2 * math.Pi / float64(steps)
	for k := 1; k < steps; k++ { // the trailing edge (k = 0) has dz = 0: no weight
		th := t0 + h*float64(k)
		zt := c.zeta(th)
		z := c.z(zt)
		// The outline's step dz = dz/dzeta i (zeta - mu) dtheta runs
		// anticlockwise; i dz points into the body, with length |dz|.
		dzt := c.dz(zt) * complex(0, 1) * (zt - c.mu) * complex(h, 0)
		v := c.speed(U, alphaDeg, th) / U
		cp := 1 - v*v
		nIn := complex(0, 1) * dzt
		df := r2.Vec{X: cp * real(nIn), Y: cp * imag(nIn)}
		f = r2.Add(f, df)
		mz += r2.Cross(r2.Sub(r2.Vec{X: real(z), Y: imag(z)}, ref), df)
	}
	return r2.Scale(1/chord, f), mz / (chord * chord)
}
