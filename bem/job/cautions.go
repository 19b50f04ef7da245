package job

import (
	"fmt"

	"github.com/rimfield/rimfield/geom"
	"github.com/rimfield/rimfield/mesh"
	"gonum.org/v1/gonum/spatial/r2"
)

// maxWhere is the number of locations listed with one caution.
const maxWhere = 10

// CommonCautions returns the limits of the model that follow from a meshed
// scene whatever its physics: the 2D idealisation, singular corners,
// insulated walls that may truncate a larger domain, anisotropy.
// CAUTIONS.md explains each topic at length. Corners at the points of
// except are left out of the singular ones (a trailing edge whose Kutta
// condition keeps the speed finite there).
func CommonCautions(m *mesh.Mesh, except ...r2.Vec) []Caution {
	lay := m.Layout
	out := []Caution{{
		Topic: "2d_idealisation",
		Text:  "the cross-section is taken as infinitely long: results are per metre of length, and ends and 3D effects are ignored",
	}}
	if c, ok := singularCorners(m, except); ok {
		out = append(out, c)
	}
	if c, ok := truncatedDomain(m); ok {
		out = append(out, c)
	}
	for _, d := range lay.Regions {
		if !d.Material.Isotropic() {
			out = append(out, Caution{
				Topic: "anisotropy",
				Text:  "a region is anisotropic with principal axes along x and y; check that the soil or material really is, and how well kx and ky are known",
			})
			break
		}
	}
	return out
}

// singularCorners reports the corners of the boundary where the field (or
// flux) is infinite in theory, mesh.SingularCorners: corners that stick
// into the domain, tips, changes of condition on a straight line,
// junctions. Near a corner with domain-side opening beta the field goes
// like r^(pi/beta - 1), and where a fixed potential meets a fixed flux
// like r^(pi/(2 beta) - 1): the local separable solutions of Laplace's
// equation in a wedge (any potential-theory text; e.g. Jackson, Classical
// Electrodynamics, sec. 2.11). Each location names its boundary and the
// exponent.
func singularCorners(m *mesh.Mesh, except []r2.Vec) (Caution, bool) {
	var cs []mesh.Corner
	for _, c := range m.SingularCorners() {
		skip := false
		for _, e := range except {
			if r2.Norm(r2.Sub(c.At, e)) <= 1e-9*m.Layout.Diagonal {
				skip = true
			}
		}
		if !skip {
			cs = append(cs, c)
		}
	}
	if len(cs) == 0 {
		return Caution{}, false
	}
	// The boundary at each corner: a body or edge among its two faces
	// rather than a wall.
	var where []Location
	for _, c := range cs {
		if len(where) == maxWhere {
			break
		}
		in, out := m.Panels[c.In], m.Panels[c.Out]
		name := BoundaryName(m.Layout, in)
		if in.Owner < 0 && out.Owner >= 0 {
			name = BoundaryName(m.Layout, out)
		}
		e := Number(c.Exponent())
		where = append(where, Location{X: Number(c.At.X), Y: Number(c.At.Y), Boundary: name, Exponent: &e})
	}
	text := fmt.Sprintf("%d corner(s), tip(s) or change(s) of condition where the field is infinite in theory (it grows like r to the exponent given at each): values on the panels next to them depend on the mesh; round sharp corners (or read values a little away from them) and re-run with more panels to see how much they move", len(cs))
	if len(cs) > len(where) {
		text += fmt.Sprintf(" (the first %d are listed)", len(where))
	}
	return Caution{Topic: "singular_corners", Text: text, Where: where}, true
}

// truncatedDomain reports insulated walls of a closed scene: the outer
// boundary of a region that no edge covers. They are exact for impervious
// boundaries and symmetry lines, but a finite box cut out of a larger domain
// changes the answer.
func truncatedDomain(m *mesh.Mesh) (Caution, bool) {
	lay := m.Layout
	if lay.Open {
		return Caution{}, false
	}
	total := 0.0
	regions := map[string]bool{}
	var names []string
	for _, p := range m.Panels {
		if p.Interface() || p.Owner >= 0 {
			continue
		}
		total += p.Length()
		if p.Left >= 0 && p.Left < len(lay.Regions) {
			if n := lay.Regions[p.Left].Name; !regions[n] {
				regions[n] = true
				names = append(names, n)
			}
		}
	}
	if total == 0 {
		return Caution{}, false
	}
	return Caution{
		Topic: "truncated_domain",
		Text: fmt.Sprintf("%.4g m of insulated (zero-flux) wall bounds the domain (regions %q): exact for impervious boundaries and symmetry lines, but if a wall only cuts a larger domain short, the results depend on where it is; move it farther out and re-run to see how much",
			total, names),
	}, true
}

// BoundaryName names the boundary a panel belongs to: its body or edge,
// "interface:<left>|<right>" between two regions (inflow is then into the
// left one), "ground" under a region resting on the grounded plane, or
// "wall:<region>" for a region's insulated outer boundary that no edge
// covers.
func BoundaryName(lay *geom.Layout, p mesh.Panel) string {
	region := func(i int) string {
		if i >= 0 && i < len(lay.Regions) {
			return lay.Regions[i].Name
		}
		return fmt.Sprintf("region%d", i)
	}
	switch {
	case p.Owner >= 0 && p.Owner < len(lay.Owners) && !p.Interface():
		return lay.Owners[p.Owner].Name
	case p.Interface():
		return "interface:" + region(p.Left) + "|" + region(p.Right)
	case p.Owner < 0 && p.Cond.Kind == geom.Potential:
		return "ground"
	}
	return "wall:" + region(p.Left)
}
