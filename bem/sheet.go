package bem

import (
	"fmt"
	"math"

	"github.com/rimfield/rimfield/geom"
	"gonum.org/v1/gonum/spatial/r2"
)

// Sheets: bodies of zero thickness. Each panel of a sheet lying inside a
// connected part of the domain comes with its twin (mesh.Mesh.Twin): the
// same segment traversed the other way, seen from the other face. Both
// faces are sides of the part, with the part on their left, and each
// carries its own u and F (Solution.U and F), so that everything
// downstream reads a sheet's faces as it reads any other panels.
//
// At the common midpoint x of a pair (faces + and -, outward normals n and
// -n) the ordinary boundary identity, taken from either face, is one and the
// same equation: the double layers of the two faces jump by -1/2 and +1/2
// as x is approached from face +, so the free term is the mean
//
//	(u+ + u-)/2 + sum_j H_j u_j - sum_j G_j F_j - C = 0       (S)
//
// with the pair's own double layers taken by their principal value (0 on a
// straight panel) and both single layers by the self integral. Only the sum
// F+ + F- (the single-layer density) and the jump u+ - u- (the double-layer
// density) enter the other boundaries' equations. The second equation of a
// pair is the conormal derivative of the representation, F+ = n.K grad u on
// face + (Portela, Aliabadi & Rooke, "The dual boundary element method:
// effective implementation for crack problems", Int. J. Numer. Methods Eng.
// 33, 1992, eq. 4 and 6, for elasticity; here its scalar form):
//
//	(F+ - F-)/2 = n.K [ sum_j (grad SL_j) F_j - (grad DL_j) u_j ] + n.K grad u0     (D)
//
// where the single layer of the pair jumps by (F+ + F-)/2 (moved to the
// left) and is otherwise a principal value (0 at a straight panel's
// midpoint), and the pair's double layer is the Hadamard finite part of
// the hypersingular integral, which on a straight panel of length L at
// its midpoint is in closed form
//
//	n . grad_x FP int dG/dn_y ds = -2 / (pi L)
//
// (the limit eta0 -> 0 of the off-panel gradient of kernel.go, which is
// continuous across the panel's interior; e.g. Crouch, "Solution of plane
// elasticity problems by the displacement discontinuity method", Int. J.
// Numer. Methods Eng. 10, 1976, for the same kernel). Every other term is
// the closed-form gradient of an off-panel integral. In an anisotropic
// region the pair's terms are taken in the region's isotropic frame,
// where the factor kbar L'/L between n.K grad_x and N.grad_X makes the
// finite part 2 kbar/(pi L) in the original lengths.
//
// A pair with a fixed or floating potential (both faces equal) has the
// unknowns F+ and F-: (S) fixes their sum and (D) their difference, which
// is the field's difference between the faces (the charge on each face of
// a trace). A pair with a flux condition (impervious: F+ = F- = 0) has the
// unknowns u+ and u-: (D) is the hypersingular equation for the jump and
// (S) then gives the mean. One row of each kind replaces the two
// collocation rows of the faces, so the count of rows still matches the
// unknowns.
//
// A face whose twin lies in another part (a closed sheet around a cavity,
// or a sheet along an interface, each face in its own region) is an
// ordinary boundary panel of its part: its own collocation row serves.

// checkTwins validates the mesh's twin marking.
func (pr *problem) checkTwins() error {
	m := pr.m
	if m.Twin == nil {
		return nil
	}
	if len(m.Twin) != len(m.Panels) {
		return fmt.Errorf("bem: the mesh marks twins for %d panels and has %d", len(m.Twin), len(m.Panels))
	}
	for j, t := range m.Twin {
		if t < 0 {
			continue
		}
		if t >= len(m.Panels) || t == j || m.Twin[t] != j {
			return fmt.Errorf("bem: panel %d's twin %d is not a panel that has it for twin", j, t)
		}
		p, q := m.Panels[j], m.Panels[t]
		if p.A != q.B || p.B != q.A || p.Owner != q.Owner || p.Interface() || q.Interface() || p.Cond.Kind != q.Cond.Kind {
			return fmt.Errorf("bem: panels %d and %d are marked twins but are not the two faces of one sheet panel (the same end points reversed, owner and condition)", j, t)
		}
	}
	return nil
}

// pairTwins pairs the sides of each part whose panels are twins.
func (pr *problem) pairTwins() {
	m := pr.m
	if m.Twin == nil {
		return
	}
	for i := range pr.parts {
		r := &pr.parts[i]
		at := make(map[int]int, len(r.sides))
		for k := range r.sides {
			at[r.sides[k].panel] = k
		}
		for k := range r.sides {
			r.sides[k].twin = -1
			if t := m.Twin[r.sides[k].panel]; t >= 0 {
				if kt, ok := at[t]; ok {
					r.sides[k].twin = kt
				}
			}
		}
	}
}

// sheetRowKind returns the kind of the row of side k of part r: the
// collocation row for a side without a twin in the part and for the first
// face of a pair (the lower panel index), the conormal row (D) for the
// second.
func (r *region) sheetRowKind(k int) rowKind {
	s := &r.sides[k]
	if s.twin >= 0 && s.panel > r.sides[s.twin].panel {
		return rowSheetFlux
	}
	return rowCollocation
}

// sheetRowScale is the factor of a conormal row: length/kbar when the
// pair's inflows are the unknowns (its coefficients on the scaled inflow
// columns are then 1/2), the panel's length over kbar when its potentials
// are (the finite part's coefficient is then 2/pi).
func (pr *problem) sheetRowScale(r *region, k int) float64 {
	j := r.sides[k].panel
	if pr.m.Panels[j].Cond.Kind == geom.Flux {
		return pr.m.Panels[j].Length() / r.kbar
	}
	return pr.length / r.kbar
}

// conormal returns K n at a side of the region: F = (K n).grad u there.
func (r *region) conormal(pr *problem, s *side) r2.Vec {
	p := pr.m.Panels[s.panel]
	n := r2.Scale(s.sign, p.Normal())
	a2 := r.ax * r.ax
	return r2.Vec{X: r.kbar / a2 * n.X, Y: r.kbar * a2 * n.Y}
}

// gradCoefficients returns the gradients (original coordinates) of the
// coefficients of side s's potential (double layer) and inflow (single
// layer) at x. For a side of the pair that x lies on (pair true, at the
// fraction f of its length from either end) the direct parts are the
// principal value of the single layer's normal derivative (0) and the
// finite part of the double layer's,
//
//	N . grad FP int dG/dn_y ds = -(1/xi + 1/(L - xi)) / (2 pi),   xi = f L,
//
// -2/(pi L) at the midpoint; the images are off the panel either way.
func (r *region) gradCoefficients(s *side, x r2.Vec, pair bool, f float64) (gu, gf r2.Vec) {
	X := r.transform(x)
	var gsl, gdl r2.Vec
	if pair {
		xi := f * s.frame.l
		gdl = r2.Scale(-(1/xi+1/(s.frame.l-xi))/(2*math.Pi), s.frame.n)
	} else {
		_, _, gsl, gdl = s.frame.all(X)
	}
	if r.image {
		_, _, igsl, igdl := s.image.all(X)
		gsl = r2.Sub(gsl, igsl)
		gdl = r2.Sub(gdl, igdl)
	}
	back := func(v r2.Vec) r2.Vec { return r2.Vec{X: r.ax * v.X, Y: v.Y / r.ax} }
	return back(gdl), r2.Scale(s.scale, back(gsl))
}

// fillSheetFlux writes the conormal row (D) of side rw.side of its part.
func (pr *problem) fillSheetFlux(rw row, put func(slot, float64)) {
	r := &pr.parts[rw.region]
	me := &r.sides[rw.side]
	x, xi := pr.sheetPoint(r, rw.side)
	w := r.conormal(pr, me)
	put(pr.fSlot[me.panel], 0.5*rw.scale*pr.colScale(me.panel))
	put(pr.fSlot[r.sides[me.twin].panel], -0.5*rw.scale*pr.colScale(r.sides[me.twin].panel))
	for k := range r.sides {
		s := &r.sides[k]
		gu, gf := r.gradCoefficients(s, x, k == rw.side || k == me.twin, xi)
		put(pr.uSlot[s.panel], rw.scale*r2.Dot(w, gu))
		put(pr.fSlot[s.panel], -rw.scale*r2.Dot(w, gf)*s.sign*pr.colScale(s.panel))
	}
}

// Where a sheet meets another boundary (a sheet pile's head on the ground
// surface, a baffle on a wall) the jump of potential across it does not
// vanish: on an impervious pair each face's potential runs on into the
// neighbouring boundary's. With constant potentials, the faces' double
// layers and the neighbours' end at that vertex with unequal strengths,
// and the rows of the panels next to it (first-kind rows, which see the
// potential through its double layer) see a point source of the
// potential's change over half a panel: the inflow of the neighbour's
// panel at the vertex came out 25 % high beside a sheet pile, however
// small the panels. So on the face panel at such an end (anchor != 0)
// the potential those rows and Eval see is linear, u_j + m (s - l/2),
// through the potential at the vertex: the neighbour's own value where
// that is fixed or floating, else the interpolation between the two
// panels' midpoints. That panel's inflow is then 8 % high, the next ones
// 2.6 % and 0.8 % (as at a polygon's mixed corner, where constant
// elements leave errors of that size on the smallest panels); the
// conormal rows keep the constant potentials, the point vortices whose
// consistency sheetPoint provides (with the linear potential there too
// the panels beside the vertex came out 12 % high).

// anchorSheets marks the faces of impervious pairs at a sheet's end on
// another boundary.
func (pr *problem) anchorSheets() {
	for i := range pr.parts {
		r := &pr.parts[i]
		for k := range r.sides {
			s := &r.sides[k]
			s.anchor = 0
			if s.twin < 0 || !pr.varies(s.panel) {
				continue
			}
			junction := func(n int) bool { return n >= 0 && n != s.twin && !r.sides[n].sheet }
			switch a, b := junction(s.prev), junction(s.next); {
			case a && !b:
				s.anchor = -1
			case b && !a:
				s.anchor = 1
			}
		}
	}
}

// anchorSlope returns the slope (per length of the side's frame, from its
// start to its end) of the potential on the anchored side k of part r as
// cs u_k + cn u_n, and the neighbour n.
func (pr *problem) anchorSlope(r *region, k int) (cs, cn float64, n int) {
	s := &r.sides[k]
	n = s.prev
	if s.anchor > 0 {
		n = s.next
	}
	q := &r.sides[n]
	l := s.frame.l
	// The potential at the vertex: ws u_k + wn u_n.
	ws, wn := q.frame.l/(q.frame.l+l), l/(q.frame.l+l)
	if !pr.varies(q.panel) {
		ws, wn = 0, 1
	}
	// At the start, m = (u_k - u_v)/(l/2); at the end, (u_v - u_k)/(l/2).
	sg := float64(s.anchor)
	return sg * (ws - 1) / (l / 2), sg * wn / (l / 2), n
}

// putAnchored adds c times the anchored side k's slope to a row.
func (pr *problem) putAnchored(r *region, k int, c float64, put func(slot, float64)) {
	cs, cn, n := pr.anchorSlope(r, k)
	put(pr.uSlot[r.sides[k].panel], c*cs)
	put(pr.uSlot[r.sides[n].panel], c*cn)
}

// linearCoefficient returns the double layer of the density s - l/2 on
// side s at x (its images included); on the panel's own line (pair) the
// direct part is 0.
func (r *region) linearCoefficient(s *side, x r2.Vec, pair bool) float64 {
	X := r.transform(x)
	var d1 float64
	if !pair {
		d1, _ = s.frame.linear(X)
	}
	if r.image {
		id1, _ := s.image.linear(X)
		d1 += id1
	}
	return d1
}

// sheetPoint returns where the conormal row of side k of part r is
// collocated (original coordinates) and that point's distance from the
// side's start over its length.
//
// On a pair with fixed or floating potentials it is the midpoint. On an
// impervious pair the unknown is the jump mu of the potential, and the
// hypersingular row then acts on mu as point vortices of strength
// mu_k - mu_(k-1) at the panel ends (the discrete vortex method; e.g.
// Lifanov, Singular Integral Equations and Discrete Vortices, 1996,
// ch. 1). Collocated at the midpoints, that scheme is first order: the
// solution is that of a sheet whose ends sit about h/4 inside the real
// ones (h the panel length near the tips, or wherever the panel length
// changes). Moving the collocation point from the midpoint by
//
//	(h_A - h_B) / 16                      between two sheet panels,
//	h_A / 8, toward the tip,              on the panel at a free tip,
//
// with h_A and h_B the lengths of the neighbouring panels at the side's
// start and end, cancels that term: the error of the jump and of its
// moment then falls as h^2 on uniform and on geometrically graded
// meshes alike. (Found here by measurement on the flat plate across a
// uniform field, whose jump 2 sqrt(a^2 - x^2) is known; the coefficients
// are the zero crossings of the O(h) term, 1/16 and 1/8 to 3 digits;
// TestSheetCollocation.) A neighbour that is not a panel of the sheet
// (the sheet's end on another boundary) counts as a panel of the same
// length.
func (pr *problem) sheetPoint(r *region, k int) (r2.Vec, float64) {
	s := &r.sides[k]
	p := pr.m.Panels[s.panel]
	if !pr.varies(s.panel) || sheetMidpoints {
		return p.Mid(), 0.5
	}
	l := s.frame.l
	nb := func(n int) float64 {
		switch {
		case n == s.twin:
			return 0 // round the tip: the other face of the same panel
		case n < 0 || !r.sides[n].sheet:
			return l
		}
		return r.sides[n].frame.l
	}
	hA, hB := nb(s.prev), nb(s.next)
	var f float64
	switch {
	case hA == 0 && hB == 0:
		f = 0.5 // a sheet of one panel
	case hA == 0:
		f = 0.5 - hB/(8*l)
	case hB == 0:
		f = 0.5 + hA/(8*l)
	default:
		f = 0.5 + (hA-hB)/(16*l)
	}
	f = math.Max(0.05, math.Min(0.95, f))
	return r2.Add(p.A, r2.Scale(f, r2.Sub(p.B, p.A))), f
}

// sheetMidpoints collocates every conormal row at its panel's midpoint
// instead (for TestSheetCollocation, which measures the difference).
var sheetMidpoints = false

// varies reports whether panel j's potential is an unknown that varies
// along the boundary (a flux boundary or an interface).
func (pr *problem) varies(j int) bool {
	p := pr.m.Panels[j]
	return pr.uSlot[j].col >= 0 && (p.Interface() || p.Cond.Kind == geom.Flux)
}

// incidentGrad returns the gradient of the incident field u0 in the
// unbounded part r (see incident).
func (r *region) incidentGrad(g r2.Vec) r2.Vec {
	if r.image {
		return r2.Vec{Y: g.Y}
	}
	return g
}
