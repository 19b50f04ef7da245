package bem

import (
	"fmt"
	"math"

	"gonum.org/v1/gonum/spatial/r2"
)

// An incident field u0 (Data.Uniform) enters the collocation equations of
// the unbounded part only, as a known term. With u = u0 + w, the
// disturbance w satisfies the exterior identity
//
//	w(x)/2 + int w dG/dn - int G dw/dn - C = 0
//
// and u0, harmonic inside the bodies and inclusions, satisfies the interior
// identity over them, which on the same boundary (its outward normal is
// -n) reads u0(x)/2 - int u0 dG/dn + int G du0/dn = 0. Adding the two
// gives the equation for the total
//
//	u(x)/2 + int u dG/dn - int G du/dn - C = u0(x)
//
// (e.g. Brebbia, Telles & Wrobel, Boundary Element Techniques, 1984,
// ch. 2: the representation of a field scattered by an obstacle). It
// needs no panel values of u0, so it is exact for the discrete unknowns:
// a body held at a constant total potential (a streamline, a conductor)
// stays exactly constant. With a grounded plane the image kernel holds
// w = 0 on the plane, so u0 must vanish there too: u0 = g (y - Y0).

// incident returns u0 at x for the unbounded part r.
func (r *region) incident(g, x r2.Vec) float64 {
	if r.image {
		return g.Y * (x.Y - r.gy)
	}
	return g.X*x.X + g.Y*x.Y
}

// checkUniform refuses an incident field the problem cannot carry.
func (pr *problem) checkUniform(g r2.Vec) error {
	if g == (r2.Vec{}) {
		return nil
	}
	if math.IsNaN(g.X) || math.IsNaN(g.Y) || math.IsInf(g.X, 0) || math.IsInf(g.Y, 0) {
		return fmt.Errorf("bem: the incident field's gradient (%g, %g) is not finite", g.X, g.Y)
	}
	open := false
	for i := range pr.parts {
		if r := &pr.parts[i]; r.open {
			open = true
			if r.image && g.X != 0 {
				return fmt.Errorf("bem: an incident field along a grounded plane (gradient %g along x) would cross it; over a grounded plane the incident field must vary with height only", g.X)
			}
		}
	}
	if !open {
		return fmt.Errorf("bem: an incident field needs an open scene: it is applied at infinity")
	}
	return nil
}
