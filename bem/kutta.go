package bem

import (
	"fmt"
	"math"

	"github.com/rimfield/rimfield/geom"
	"gonum.org/v1/gonum/spatial/r2"
)

// kuttaTol is how far (relative to the scene's diagonal) a Kutta point may
// lie from the panel end point it names: the point comes from the scene's
// own vertices, so only rounding separates them.
const kuttaTol = 1e-9

// kuttaRows finds, for each Kutta condition, the two panels of its owner
// that meet at the vertex, and returns the rows that replace the owners'
// total-inflow equations, by owner.
//
// The row is F_a + F_b = 0, multiplied by length/kbar so that its
// coefficients on the scaled inflow columns are 1.
func (pr *problem) kuttaRows(ks []Kutta) (map[int]row, error) {
	if len(ks) == 0 {
		return nil, nil
	}
	lay := pr.m.Layout
	out := make(map[int]row, len(ks))
	for _, k := range ks {
		if k.Owner < 0 || k.Owner >= len(lay.Owners) {
			return nil, fmt.Errorf("bem: Kutta condition on owner %d, and the layout has %d owners", k.Owner, len(lay.Owners))
		}
		name := lay.Owners[k.Owner].Name
		if _, dup := out[k.Owner]; dup {
			return nil, fmt.Errorf("bem: %q has two Kutta conditions; a body has one trailing edge", name)
		}
		if pr.floatCol[k.Owner] < 0 {
			return nil, fmt.Errorf("bem: the Kutta condition on %q needs a floating boundary (an unknown constant potential whose total inflow the condition replaces)", name)
		}
		at, err := pr.panelEnd(k.Owner, k.At)
		if err != nil {
			return nil, err
		}
		to := at
		if k.Blunt {
			if to, err = pr.panelEnd(k.Owner, k.To); err != nil {
				return nil, err
			}
		}
		pa, pb, na, nb := -1, -1, 0, 0
		for j, p := range pr.m.Panels {
			if p.Owner != k.Owner || p.Interface() || p.Cond.Kind != geom.Floating {
				continue
			}
			if p.B == at {
				pa, na = j, na+1
			}
			if p.A == to {
				pb, nb = j, nb+1
			}
		}
		if na != 1 || nb != 1 {
			return nil, fmt.Errorf("bem: the Kutta point (%.6g, %.6g) m of %q is not a vertex where exactly two of its panels meet (%d end and %d start there); it must be a corner of the body that touches nothing else", at.X, at.Y, name, na, nb)
		}
		kbar := pr.regions[pr.m.Panels[pa].Left].kbar
		rw := row{kind: rowKutta, owner: k.Owner, pa: pa, pb: pb, scale: pr.length / kbar}
		if pr.m.TwinOf(pa) == pb {
			// The tip of a sheet: the two faces of one panel.
			rw.terms = pr.sheetKutta(pa, pb)
		}
		out[k.Owner] = rw
	}
	return out, nil
}

// panelEnd returns the end point of owner o's panels nearest to p, which
// must lie within kuttaTol of the scene's diagonal.
func (pr *problem) panelEnd(o int, p r2.Vec) (r2.Vec, error) {
	best, at := math.Inf(1), r2.Vec{}
	for _, pn := range pr.m.Panels {
		if pn.Owner != o || pn.Interface() {
			continue
		}
		for _, v := range [2]r2.Vec{pn.A, pn.B} {
			if d := r2.Norm(r2.Sub(v, p)); d < best {
				best, at = d, v
			}
		}
	}
	if best > kuttaTol*pr.length {
		return at, fmt.Errorf("bem: the Kutta point (%.6g, %.6g) m of %q is %.3g m from the nearest end of its panels; it must be a vertex of its boundary", p.X, p.Y, pr.m.Layout.Owners[o].Name, best)
	}
	return at, nil
}

// kuttaTerm is one panel's inflow in a Kutta condition, with its weight.
type kuttaTerm struct {
	panel  int
	weight float64
}

// sheetKuttaForm selects the discrete Kutta condition at a sheet's tip
// (see sheetKutta): 2 in use; 0 and 1 are kept for the test that measures
// the three (TestSheetKuttaForms).
var sheetKuttaForm = 2

// sheetKutta returns the Kutta condition at the tip of a sheet whose tip
// panel is pa on one face and pb (its twin) on the other.
//
// Near a sheet's free end at distance r the single-layer density (the sum
// of the faces' inflows, the jump of the tangential velocity across the
// sheet in ideal flow) behaves as sigma = A r^-1/2 + B r^1/2 + O(r^3/2),
// and the Kutta condition is A = 0: the flow leaves the tip smoothly, the
// density vanishing there like r^1/2 (e.g. Katz & Plotkin, Low-Speed
// Aerodynamics, 2001, sec. 5.2: the thin-airfoil vortex sheet vanishes at
// the trailing edge as sqrt(c - x)). Three discrete forms on the tip
// panel [0, h1] and the next one [h1, h1 + h2]:
//
//	0: sigma_1 = 0                                  (the tip panel's density)
//	1: sigma_1 b_2 - sigma_2 b_1 = 0,  b_k = mean of r^1/2 over panel k
//	2: sigma_1 sqrt(r_2) - sigma_2 sqrt(r_1) = 0,  r_k = the midpoints' distances
//
// Forms 1 and 2 hold the density to B r^1/2 across the two panels. All
// three leave an error in the circulation of the order of the tip
// panel's length, measured on the flat plate (2 pi sin alpha) as 0.84,
// 0.13 and 0.08 times h1/c: form 2 is used. At the default mesh (h1 about
// 5e-6 c) the three agree to 1e-5.
func (pr *problem) sheetKutta(pa, pb int) []kuttaTerm {
	ps := pr.m.Panels
	tip := []kuttaTerm{{pa, 1}, {pb, 1}}
	if sheetKuttaForm == 0 {
		return tip
	}
	// The panel before pa on its face, and its twin.
	qa := -1
	for j, p := range ps {
		if j != pb && p.B == ps[pa].A && p.Owner == ps[pa].Owner && pr.m.TwinOf(j) >= 0 && ps[pr.m.TwinOf(j)].A == ps[pb].B {
			qa = j
			break
		}
	}
	if qa < 0 {
		return tip // a sheet of one panel
	}
	qb := pr.m.TwinOf(qa)
	h1, h2 := ps[pa].Length(), ps[qa].Length()
	var w float64
	if sheetKuttaForm == 1 {
		mean := func(r0, r1 float64) float64 {
			return 2.0 / 3.0 * (math.Pow(r1, 1.5) - math.Pow(r0, 1.5)) / (r1 - r0)
		}
		w = mean(0, h1) / mean(h1, h1+h2)
	} else {
		w = math.Sqrt(0.5 * h1 / (h1 + 0.5*h2))
	}
	return []kuttaTerm{{pa, 1}, {pb, 1}, {qa, -w}, {qb, -w}}
}
