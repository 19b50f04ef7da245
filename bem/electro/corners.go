package electro

import (
	"math"
	"slices"

	"github.com/rimfield/rimfield/mesh"
	"gonum.org/v1/gonum/spatial/r2"
)

// Corner is a vertex of a conductor's surface where the field is infinite
// in theory.
type Corner struct {
	At       r2.Vec // metres
	Owner    int    // the conductor, index into Layout.Owners
	Boundary string // its name
	// Region is the region on the field side next to the conductor's
	// panel at the vertex, index into Layout.Regions.
	Region int
	// Opening is the field-side opening angle beta in radians (between
	// pi and 2 pi at a conductor's outer corner, 2 pi at a thin edge).
	Opening float64
	// Mixed is true where the conductor ends on an insulated boundary
	// (fixed potential meets zero flux) rather than at a corner of its own.
	Mixed bool
	// Junction is true where an interface between two dielectrics meets the
	// conductor at the vertex (a triple junction): the exponent then
	// depends on the permittivities and the angles of the sectors, and
	// rounding the conductor does not remove the singularity.
	Junction bool
	// Exponent p < 0 of the field near the vertex, |E| ~ A r^p: p = lambda
	// - 1 with lambda from the separable solution in the wedge (see
	// mesh.WedgeExponent): pi/beta - 1 at a corner in one dielectric,
	// pi/(2 beta) - 1 where the conductor meets an insulated boundary.
	Exponent float64
	// Coefficient A (V m^(-1-p)) fitted to the panels of the conductor near
	// the vertex; NaN when too few panels lie close enough to fit it.
	Coefficient float64
	// inner is the distance from the vertex within which the panels are
	// too coarse for the field's singularity: three times the length of the
	// conductor's panels that touch the vertex.
	inner float64
}

// FieldAt returns the asymptotic field A r^p at distance r (metres) from
// the vertex.
func (c Corner) FieldAt(r float64) float64 { return c.Coefficient * math.Pow(r, c.Exponent) }

// arcFactor is how much higher the peak of a circular round-off is than
// that of the ideal rounded wedge of the same tip radius: 1.20 to 1.21
// measured at a square corner for radii from 1/50 to 1/5 of the side
// (TestRoundingRadius), rounded up.
const arcFactor = 1.25

// RoundingRadius returns the radius (metres) of a circular round-off of the
// corner that brings its peak field down to about target (V/m). From the
// wedge asymptotics, a rounded edge of tip radius rho whose field far from
// the tip matches A r^p peaks at A (|p| rho)^p (see the package
// documentation); a circular arc peaks up to arcFactor higher, so
// rho = (target / (arcFactor A))^(1/p) / |p|. It returns 0 when the
// coefficient is unknown, target is not positive, or the corner is a
// junction with a dielectric interface (which rounding does not cure). The
// estimate holds for radii well below the conductor's size.
func (c Corner) RoundingRadius(target float64) float64 {
	if c.Junction || !(target > 0) || !(c.Coefficient > 0) || !(c.Exponent < 0) {
		return 0
	}
	return math.Pow(target/(arcFactor*c.Coefficient), 1/c.Exponent) / -c.Exponent
}

// Corners returns the singular vertices of the conductors' surfaces: the
// corners of the mesh (mesh.Corners: the wedge at every vertex between a
// boundary panel and the next one round the field side, split into
// sectors by the dielectric interfaces leaving it, and the exponent of the
// separable solution across them) where one face is a conductor and the
// field grows at least like r^-0.1 (mesh.SingularLambda). Without
// interfaces that is pi/beta - 1 (conductor on both sides) or
// pi/(2 beta) - 1 (conductor meets an insulated boundary), beta the
// field-side opening. Anisotropic materials enter with sqrt(kx ky), an
// approximation.
func (f *Fields) Corners() []Corner {
	if !f.found {
		f.corners, f.found = f.findCorners(), true
	}
	return slices.Clone(f.corners)
}

func (f *Fields) findCorners() []Corner {
	m := f.Sol.Mesh
	lay := m.Layout
	var out []Corner
	for _, mc := range m.SingularCorners() {
		p, q := m.Panels[mc.In], m.Panels[mc.Out]
		cp, cq := conductor(p), conductor(q)
		if !cp && !cq {
			continue
		}
		c := Corner{At: mc.At, Opening: mc.Opening, Mixed: mc.Mixed, Junction: mc.Junction, Exponent: mc.Exponent()}
		c.Owner, c.Region = p.Owner, p.Left
		if !cp {
			c.Owner, c.Region = q.Owner, q.Left
		}
		c.Boundary = lay.Owners[c.Owner].Name
		c.Coefficient, c.inner = f.fitCorner(c)
		out = append(out, c)
	}
	return out
}

// fitCorner fits A in |E| = A r^p to the conductor panels of the corner's
// owner that lie near its vertex: the median of |E_j| r_j^(-p) over the
// panels whose midpoints are between three times the length of the panels
// touching the vertex (the inner distance it also returns) and a quarter of
// the nominal panel size away. The panels at the vertex carry the largest
// discretisation error, since constant elements cannot follow r^p there;
// further out the field departs from the local asymptotics.
func (f *Fields) fitCorner(c Corner) (coef, inner float64) {
	m := f.Sol.Mesh
	type sample struct{ r, e float64 }
	var near []sample
	smallest := math.Inf(1)
	reach := reachOf(m)
	for j, p := range m.Panels {
		if !conductor(p) || p.Owner != c.Owner {
			continue
		}
		r := r2.Norm(r2.Sub(p.Mid(), c.At))
		if r <= reach {
			near = append(near, sample{r, math.Abs(f.Normal[j])})
			if p.A == c.At || p.B == c.At {
				smallest = math.Min(smallest, p.Length())
			}
		}
	}
	inner = 3 * smallest
	var as []float64
	for _, s := range near {
		if s.r >= inner && s.r <= 0.25*reach {
			as = append(as, s.e*math.Pow(s.r, -c.Exponent))
		}
	}
	if len(as) < 3 {
		return math.NaN(), inner
	}
	slices.Sort(as)
	return as[len(as)/2], inner
}

// reachOf returns the nominal panel size of the mesh, or the mean panel
// length when it is not recorded.
func reachOf(m *mesh.Mesh) float64 {
	if m.Size > 0 {
		return m.Size
	}
	total := 0.0
	for _, p := range m.Panels {
		total += p.Length()
	}
	return total / float64(max(len(m.Panels), 1))
}
