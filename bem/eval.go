package bem

import (
	"math"

	"github.com/rimfield/rimfield/geom"
	"gonum.org/v1/gonum/spatial/r2"
)

// winding returns the winding number about p of the region's boundary, the
// sides taken as oriented edges (region on the left): 1 inside a closed
// region, 0 in an unbounded one, and 0 (closed) or -1 (unbounded) outside.
// Points on the boundary get either answer.
func (r *region) winding(pr *problem, p r2.Vec) int {
	w := 0
	for _, s := range r.sides {
		pn := pr.m.Panels[s.panel]
		a, b := pn.A, pn.B
		if s.sign < 0 {
			a, b = b, a
		}
		w += crossing(a, b, p)
	}
	return w
}

// crossing is the contribution of the oriented edge a->b to the winding
// number about p: +1 when it crosses the rightward ray from p upwards with p
// on its left, -1 when it crosses downwards with p on its right, else 0
// (Sunday's crossing rule; half-open in y so shared vertices count once).
func crossing(a, b, p r2.Vec) int {
	if a.Y <= p.Y {
		if b.Y > p.Y && r2.Cross(r2.Sub(b, a), r2.Sub(p, a)) > 0 {
			return 1
		}
	} else if b.Y <= p.Y && r2.Cross(r2.Sub(b, a), r2.Sub(p, a)) < 0 {
		return -1
	}
	return 0
}

// Locate returns the region of the domain that contains p, or geom.Outside
// (inside a body, outside every region of a closed scene, or below a
// grounded plane).
func (s *Solution) Locate(p r2.Vec) int {
	if k := s.locatePart(p); k >= 0 {
		return s.pr.parts[k].reg
	}
	return geom.Outside
}

// locatePart returns the index of the connected part that contains p, or -1.
func (s *Solution) locatePart(p r2.Vec) int {
	pr := s.pr
	for i := range pr.parts {
		r := &pr.parts[i]
		if !r.open && r.winding(pr, p) == 1 {
			return i
		}
	}
	for i := range pr.parts {
		r := &pr.parts[i]
		if !r.open {
			continue
		}
		if r.image && p.Y <= r.gy {
			return -1
		}
		if r.winding(pr, p) == 0 {
			return i
		}
	}
	return -1
}

// Eval returns the potential and its gradient at p, from the boundary
// integral representation of the region containing p. The integrals are
// exact for the discrete boundary values at any distance from the boundary.
// Outside the domain, and on the boundary itself (within 1e-12 of the
// scene's diagonal of a panel, where the boundary values Solution.U and F
// apply), it returns NaN values and Region geom.Outside.
func (s *Solution) Eval(p r2.Vec) Point {
	nan := math.NaN()
	outside := Point{U: nan, Grad: r2.Vec{X: nan, Y: nan}, Region: geom.Outside}
	k := s.locatePart(p)
	if k < 0 || s.pr.parts[k].touches(s.pr, p, 1e-12*s.pr.length) {
		return outside
	}
	u, g := s.evalIn(k, p)
	return Point{U: u, Grad: g, Region: s.pr.parts[k].reg}
}

// touches reports whether p lies within tol of one of the part's panels.
func (r *region) touches(pr *problem, p r2.Vec, tol float64) bool {
	tol2 := tol * tol
	for _, sd := range r.sides {
		pn := &pr.m.Panels[sd.panel]
		d := r2.Sub(pn.B, pn.A)
		ap := r2.Sub(p, pn.A)
		dot, dd := r2.Dot(ap, d), r2.Norm2(d)
		var near bool
		switch {
		case dot <= 0:
			near = r2.Norm2(ap) <= tol2
		case dot >= dd:
			near = r2.Norm2(r2.Sub(p, pn.B)) <= tol2
		default:
			c := r2.Cross(ap, d)
			near = c*c <= tol2*dd
		}
		if near {
			return true
		}
	}
	return false
}

// evalIn evaluates the representation of part k at p.
func (s *Solution) evalIn(k int, p r2.Vec) (float64, r2.Vec) {
	r := &s.pr.parts[k]
	u := s.partConst[k]
	var g r2.Vec
	if r.open && s.Uniform != (r2.Vec{}) {
		// The incident field (see incident.go): its gradient is
		// Uniform, only its height part over a grounded plane.
		u += r.incident(s.Uniform, p)
		g = s.Uniform
	}
	slopes := s.slopes[k]
	X := r.transform(p)
	for k := range r.sides {
		sd := &r.sides[k]
		cu, cf, gu, gf := r.fieldCoefficients(sd, p)
		uj := s.U[sd.panel]
		fj := sd.sign * s.F[sd.panel]
		u += cf*fj - cu*uj
		g = r2.Add(g, r2.Sub(r2.Scale(fj, gf), r2.Scale(uj, gu)))
		if m := slopes[k]; m != 0 {
			// The linear part of the potential along the panel (see
			// linear): without it the jumps of the piecewise-constant
			// potential between panels show as 1/r artefacts in the
			// gradient within a panel length of the boundary.
			d1, g1 := sd.frame.linear(X)
			if r.image {
				// The image panel runs the other way: its density is -(s' - L/2).
				id1, ig1 := sd.image.linear(X)
				d1 += id1
				g1 = r2.Add(g1, ig1)
			}
			u -= m * d1
			g = r2.Sub(g, r2.Scale(m, r2.Vec{X: r.ax * g1.X, Y: g1.Y / r.ax}))
		}
	}
	return u, g
}

// computeSlopes reconstructs, for every side of every region, the slope of
// the potential along the side (per transformed length) from the midpoint
// values of its neighbours, on the sides where the potential is an unknown
// that varies (flux boundaries and interfaces); fixed and floating
// potentials are constant per boundary and keep slope 0.
func (s *Solution) computeSlopes() {
	pr := s.pr
	s.slopes = make([][]float64, len(pr.parts))
	for i := range pr.parts {
		r := &pr.parts[i]
		sl := make([]float64, len(r.sides))
		for k := range r.sides {
			sd := &r.sides[k]
			p := pr.m.Panels[sd.panel]
			if !p.Interface() && p.Cond.Kind != geom.Flux {
				continue
			}
			if sd.anchor != 0 {
				// The linear potential of the system itself (sheet.go).
				cs, cn, n := pr.anchorSlope(r, k)
				sl[k] = cs*s.U[sd.panel] + cn*s.U[r.sides[n].panel]
				continue
			}
			u0 := s.U[sd.panel]
			var du, ds float64
			if sd.prev >= 0 {
				q := &r.sides[sd.prev]
				du += u0 - s.U[q.panel]
				ds += 0.5 * (q.frame.l + sd.frame.l)
			}
			if sd.next >= 0 {
				q := &r.sides[sd.next]
				du += s.U[q.panel] - u0
				ds += 0.5 * (q.frame.l + sd.frame.l)
			}
			if ds > 0 {
				sl[k] = du / ds
			}
		}
		s.slopes[i] = sl
	}
}

// Owners returns the integrated results per body and edge, in Layout.Owners
// order: the length-weighted mean potential, the total inflow into the
// domain and the length that bounds the domain.
func (s *Solution) Owners() []OwnerResult {
	lay := s.Mesh.Layout
	out := make([]OwnerResult, len(lay.Owners))
	for i, o := range lay.Owners {
		out[i].Name = o.Name
	}
	for j, p := range s.Mesh.Panels {
		if p.Owner < 0 || p.Interface() {
			continue
		}
		l := p.Length()
		o := &out[p.Owner]
		o.Length += l
		o.Inflow += s.F[j] * l
		o.Potential += s.U[j] * l
	}
	for i := range out {
		if out[i].Length > 0 {
			out[i].Potential /= out[i].Length
		} else {
			out[i].Potential = math.NaN()
		}
	}
	return out
}
