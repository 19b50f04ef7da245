package electro

import (
	"math"

	"github.com/rimfield/rimfield/bem"
	"github.com/rimfield/rimfield/geom"
	"github.com/rimfield/rimfield/mesh"
	"gonum.org/v1/gonum/spatial/r2"
)

// Energy returns the stored electrostatic energy per metre of length in
// J/m, W = 1/2 sum_i V_i Q_i over the conductors, computed as 1/2 of the
// integral of u times the inflow density over every boundary panel (which
// also counts charge prescribed on flux boundaries; interfaces carry no
// free charge). It returns NaN when the energy is infinite: an open scene
// without a ground plane whose boundaries carry a net charge (in two
// dimensions the field of a net line charge stores infinite energy).
func Energy(sol *bem.Solution) float64 {
	m := sol.Mesh
	lay := m.Layout
	w, q, scale := 0.0, 0.0, 0.0
	for j, p := range m.Panels {
		if p.Interface() {
			continue
		}
		l := p.Length()
		w += 0.5 * sol.U[j] * sol.F[j] * l
		q += sol.F[j] * l
		scale += math.Abs(sol.F[j]) * l
	}
	if lay.Open && lay.Ground == nil && math.Abs(q) > 1e-9*scale {
		return math.NaN()
	}
	return w
}

// Force is the electric force per metre of length on one conductor.
type Force struct {
	Name  string
	Owner int    // index into Layout.Owners
	F     r2.Vec // N/m
}

// Forces returns the force per metre on every conductor (body or edge at a
// fixed or floating potential) from the Maxwell stress on its surface. On a
// conductor the field is normal, E = E_n, and the stress is a pull of
// D.E/2 = F^2 / (2 n.K.n) per unit area along the normal out of the
// conductor, which is -n for the panel normal n (the domain's outward
// normal points into the conductor):
//
//	f = -sum_j F_j^2 / (2 n_j.K.n_j) n_j L_j
//
// (Maxwell stress tensor T = E D^T - (E.D/2) I, e.g. Jackson, Classical
// Electrodynamics, 3rd ed., 1999, sec. 6.7 [from memory]; the sign is
// checked against virtual work in the tests). Near a singular corner the
// pull grows like r^(2p) and the panels touching the vertex cannot follow
// it (constant elements): on the straight panels within the corner's inner
// distance, F^2 L is replaced by the integral of (n.K.n A r^p)^2 with the
// fitted corner coefficient A, which brings the force from a 1 % to a
// 0.1 % error at the default mesh on a square conductor. The force on a
// conductor embedded in a solid dielectric is what the field exerts on the
// conductor's surface; the dielectric takes part of it up.
func (f *Fields) Forces() []Force {
	sol := f.Sol
	m := sol.Mesh
	lay := m.Layout
	out := make([]Force, 0, len(lay.Owners))
	index := make([]int, len(lay.Owners))
	for o, ow := range lay.Owners {
		index[o] = -1
		if ow.Cond.Kind == geom.Potential || ow.Cond.Kind == geom.Floating {
			index[o] = len(out)
			out = append(out, Force{Name: ow.Name, Owner: o})
		}
	}
	corners := f.Corners()
	for j, p := range m.Panels {
		if !conductor(p) || index[p.Owner] < 0 {
			continue
		}
		n := p.Normal()
		kn, _ := knn(material(sol, p.Left), n, p.Tangent())
		pull := sol.F[j] * sol.F[j] / (2 * kn) * p.Length()
		for _, c := range corners {
			if ip, ok := cornerPull(c, p, kn); ok {
				pull = ip
				break
			}
		}
		fc := &out[index[p.Owner]]
		fc.F = r2.Sub(fc.F, r2.Scale(pull, n))
	}
	return out
}

// cornerPull returns the integral of the pull (n.K.n) (A r^p)^2 / 2 over
// panel p if it lies on a straight line from corner c's vertex within the
// corner's inner distance, and false otherwise.
func cornerPull(c Corner, p mesh.Panel, kn float64) (float64, bool) {
	if p.Owner != c.Owner || math.IsNaN(c.Coefficient) {
		return 0, false
	}
	ra, rb := r2.Norm(r2.Sub(p.A, c.At)), r2.Norm(r2.Sub(p.B, c.At))
	if ra > rb {
		ra, rb = rb, ra
	}
	// On the line through the vertex: the far end is as far as the near
	// end plus the panel (to rounding).
	if ra >= c.inner || rb-ra < (1-1e-9)*p.Length() {
		return 0, false
	}
	q := 2*c.Exponent + 1
	if q <= 0 && ra == 0 {
		// p <= -1/2 (a thin edge, or an electrode's end on an insulated
		// line): the ideal pull is not integrable at the vertex; keep the
		// panel's own value.
		return 0, false
	}
	var integral float64
	if math.Abs(q) < 1e-9 {
		integral = math.Log(rb / ra)
	} else {
		integral = (math.Pow(rb, q) - math.Pow(ra, q)) / q
	}
	return 0.5 * kn * c.Coefficient * c.Coefficient * integral, true
}
