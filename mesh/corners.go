package mesh

import (
	"cmp"
	"math"
	"slices"

	"github.com/rimfield/rimfield/geom"
	"gonum.org/v1/gonum/spatial/r2"
)

// SingularLambda is the exponent below which a vertex counts as singular:
// the field (the gradient of the potential) goes like r^(lambda - 1) near
// it, so lambda < 1 makes it infinite at the vertex. Below 0.9 (a field
// growing at least like r^-0.1: the outer corner of a 16-gon and sharper)
// the corner is worth a warning; a polygon of 32 or more sides standing
// for a circle (lambda 0.94 at each vertex) is smooth for every practical
// purpose, and so is a right angle where a fixed potential meets an
// insulated face (lambda 1, a finite field).
const SingularLambda = 0.9

// Corner is a vertex of the boundary where two boundary panels meet, seen
// from the domain: the wedge between them and the exponent of the local
// separable solution of Laplace's equation.
type Corner struct {
	At r2.Vec // metres
	// In and Out are the boundary panels meeting at the vertex: In ends
	// there, Out starts there, the domain between them (clockwise from In
	// back to Out).
	In, Out int
	// Opening is the domain-side opening angle in radians.
	Opening float64
	// Lambda is the leading exponent of the potential, u - u_v ~
	// r^Lambda: the field goes like r^(Lambda - 1).
	Lambda float64
	// Mixed is true where a fixed potential meets a prescribed flux (an
	// insulated face); Junction where interfaces between regions leave the
	// vertex between the two faces.
	Mixed, Junction bool
	// Regions lists the regions of the wedge's sectors, from In to Out.
	Regions []int
}

// Singular reports whether the field is infinite at the corner enough to
// be worth a warning (Lambda < SingularLambda).
func (c Corner) Singular() bool { return c.Lambda < SingularLambda }

// Exponent is the power of the distance the field goes like near the
// corner, Lambda - 1.
func (c Corner) Exponent() float64 { return c.Lambda - 1 }

// fixedFace reports whether a boundary panel holds a fixed potential (a
// fixed or floating potential: a Dirichlet face of the local problem).
func fixedFace(p Panel) bool {
	return p.Cond.Kind == geom.Potential || p.Cond.Kind == geom.Floating
}

// Corners returns every vertex of the mesh's boundary where the field
// behaves like r^(Lambda - 1) with Lambda below 1 or not a straight
// continuation, each with its wedge and exponent, in the order of the
// panels: at each boundary panel's end the next boundary panel clockwise
// round the domain, the interfaces leaving the vertex between them split
// the wedge into sectors, and mesh.WedgeExponent gives Lambda: a fixed
// potential on both faces, on one (Mixed), or on none (two flux faces,
// whose exponents are those of the fixed-potential problem of the stream
// function, with each sector's conductivity inverted). Anisotropic
// materials enter with sqrt(kx ky), an approximation. Straight
// continuations with the same kind of condition are left out.
func (m *Mesh) Corners() []Corner {
	lay := m.Layout
	starts := map[r2.Vec][]int{}
	joints := map[r2.Vec][]int{}
	for k, p := range m.Panels {
		if p.Interface() {
			joints[p.A] = append(joints[p.A], k)
			joints[p.B] = append(joints[p.B], k)
		} else {
			starts[p.A] = append(starts[p.A], k)
		}
	}
	// cw is the clockwise angle in (0, 2 pi] from back to d.
	cw := func(d, back r2.Vec) float64 {
		a := math.Atan2(r2.Cross(d, back), r2.Dot(d, back))
		if a <= 0 {
			a += 2 * math.Pi
		}
		return a
	}
	kbar := func(reg int) float64 {
		if reg < 0 || reg >= len(lay.Regions) {
			return 1
		}
		k := lay.Regions[reg].Material
		return math.Sqrt(k.Kx * k.Ky)
	}
	var out []Corner
	for i, p := range m.Panels {
		if p.Interface() {
			continue
		}
		v := p.B
		back := r2.Scale(-1, p.Tangent())
		k, beta := -1, 0.0
		for _, c := range starts[v] {
			if a := cw(m.Panels[c].Tangent(), back); k < 0 || a < beta {
				k, beta = c, a
			}
		}
		if k < 0 {
			continue
		}
		q := m.Panels[k]
		fp, fq := fixedFace(p), fixedFace(q)
		type ray struct {
			phi   float64
			right int // the region clockwise of the ray
		}
		var rays []ray
		for _, c := range joints[v] {
			ip := m.Panels[c]
			d, cwSide := ip.Tangent(), ip.Right
			if ip.B == v {
				d, cwSide = r2.Scale(-1, d), ip.Left
			}
			if phi := cw(d, back); phi < beta {
				rays = append(rays, ray{phi, cwSide})
			}
		}
		if len(rays) == 0 && fp == fq && math.Abs(beta-math.Pi) < 1e-9 {
			continue // a straight continuation
		}
		slices.SortFunc(rays, func(a, b ray) int { return cmp.Compare(a.phi, b.phi) })
		c := Corner{At: v, In: i, Out: k, Opening: beta, Mixed: fp != fq, Junction: len(rays) > 0}
		secs := make([]Sector, 0, len(rays)+1)
		from, reg := 0.0, p.Left
		for _, r := range rays {
			secs = append(secs, Sector{Width: r.phi - from, K: kbar(reg)})
			c.Regions = append(c.Regions, reg)
			from, reg = r.phi, r.right
		}
		secs = append(secs, Sector{Width: beta - from, K: kbar(reg)})
		c.Regions = append(c.Regions, reg)
		switch {
		case fp && fq:
			c.Lambda = WedgeExponent(secs, false)
		case !fp && !fq:
			// Two flux faces: the stream function has fixed values on both,
			// and its conductivity is the inverse.
			for s := range secs {
				secs[s].K = 1 / secs[s].K
			}
			c.Lambda = WedgeExponent(secs, false)
		default:
			if !fp {
				slices.Reverse(secs)
			}
			c.Lambda = WedgeExponent(secs, true)
		}
		out = append(out, c)
	}
	return out
}

// SingularCorners returns the corners worth a warning: Corners with Lambda
// below SingularLambda.
func (m *Mesh) SingularCorners() []Corner {
	var out []Corner
	for _, c := range m.Corners() {
		if c.Singular() {
			out = append(out, c)
		}
	}
	return out
}
