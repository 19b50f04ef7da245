package seep

import (
	"cmp"
	"math"
	"slices"

	"github.com/rimfield/rimfield/geom"
)

// Structure is a body in contact with the soil (a weir, a floor, a sheet
// pile, a cutoff) and the pore pressure on that contact.
type Structure struct {
	Name  string
	Owner int // index into Layout.Owners
	// Uplift is the vertical resultant of the pore pressure on the
	// contact, positive up, in kN per metre of length; UpliftX its line of
	// action (m), NaN when Uplift is 0.
	Uplift, UpliftX float64
	// Horizontal is the horizontal resultant of the pore pressure, positive
	// toward +x (kN/m).
	Horizontal float64
	// Contact is the length of the contact with the soil (m), Base the part
	// of it that faces the soil below (flatter than 45 degrees).
	Contact, Base float64
	// Profile is the head and the pore pressure along the contact, one
	// point per panel in order of arc length (for an uplift diagram).
	Profile []ContactPoint
}

// ContactPoint is the head and pore pressure at the midpoint of one panel
// of a structure's contact with the soil.
type ContactPoint struct {
	Panel int     // index into the mesh's panels
	S     float64 // arc length along the structure's boundary (m)
	X, Y  float64 // midpoint (m)
	Head  float64 // total head (m)
	// Pressure is the pore pressure gw (h - y) in kPa.
	Pressure float64
	// Base is true where the panel faces the soil below the structure
	// (an underside flatter than 45 degrees).
	Base bool
}

// structures gathers the uplift on every body with panels.
//
// The pore pressure p acts on the structure along the domain's outward
// normal n (into the structure), so the force per metre is
// sum_j p_j n_j L_j; its vertical part is the uplift (an underside has
// n_y > 0) and sum_j p_j n_y,j L_j x_j / uplift its line of action.
func (a *analysis) structures() []Structure {
	var out []Structure
	byOwner := map[int]int{}
	for j, p := range a.m.Panels {
		if p.Owner < 0 || p.Interface() || a.lay.Owners[p.Owner].Part != geom.PartBody {
			continue
		}
		k, ok := byOwner[p.Owner]
		if !ok {
			k = len(out)
			byOwner[p.Owner] = k
			out = append(out, Structure{Name: a.lay.Owners[p.Owner].Name, Owner: p.Owner})
		}
		s := &out[k]
		mid, n, l := p.Mid(), p.Normal(), p.Length()
		h := a.sol.U[j]
		pr := a.gw * (h - mid.Y)
		base := n.Y >= math.Sqrt2/2
		s.Uplift += pr * n.Y * l
		s.UpliftX += pr * n.Y * l * mid.X
		s.Horizontal += pr * n.X * l
		s.Contact += l
		if base {
			s.Base += l
		}
		s.Profile = append(s.Profile, ContactPoint{Panel: j, S: p.S, X: mid.X, Y: mid.Y, Head: h, Pressure: pr, Base: base})
	}
	for i := range out {
		s := &out[i]
		if s.Uplift != 0 {
			s.UpliftX /= s.Uplift
		} else {
			s.UpliftX = math.NaN()
		}
		slices.SortStableFunc(s.Profile, func(p, q ContactPoint) int { return cmp.Compare(p.S, q.S) })
	}
	return out
}
