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
		out[k.Owner] = row{kind: rowKutta, owner: k.Owner, pa: pa, pb: pb, scale: pr.length / kbar}
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
