package seep

import (
	"math"

	"github.com/rimfield/rimfield/geom"
	"gonum.org/v1/gonum/integrate/quad"
	"gonum.org/v1/gonum/spatial/r2"
)

// heaveNodes: Gauss-Legendre nodes along the base of the heave prism.
const heaveNodes = 16

// Heave is Terzaghi's check of the soil prism beside a structure (a sheet
// pile, a cutoff) on the exit side: the prism is d/2 wide and d deep, d
// the structure's embedment below the exit face at its edge, and it heaves
// when the excess head at its base lifts more than its submerged weight:
//
//	FS = gamma' d / (gw h_a) = i_c d / h_a
//
// with h_a the mean head above the exit face's head along the base and
// gamma'/gw = i_c (Terzaghi, Theoretical Soil Mechanics, 1943, from
// memory; for a single sheet pile on deep soil h_a = 0.353961 H).
type Heave struct {
	// Structure is the body beside the prism, Face the exit face above it.
	Structure, Face string
	// Corner is where the structure meets the exit face (m).
	Corner r2.Vec
	// Depth is the embedment d below the exit face (m), Width the prism's
	// width d/2 (m).
	Depth, Width float64
	// Tailwater is the exit face's head and ExcessHead the mean head above
	// it at the prism's base, h_a (m).
	Tailwater, ExcessHead float64
	// Safety is i_c d / h_a; +Inf when the excess head is not positive.
	Safety float64
}

// heave checks the prism beside every structure that reaches below an
// exit face at a vertex where the two meet.
func (a *analysis) heave(exits []Exit) []Heave {
	m := a.m
	var out []Heave
	seen := map[[2]int]bool{}
	for _, e := range exits {
		for _, c := range e.Corners {
			o := c.neighbourOwner
			if o < 0 || a.lay.Owners[o].Part != geom.PartBody || seen[[2]int{o, e.Owner}] {
				continue
			}
			deepest := math.Inf(1)
			for _, p := range m.Panels {
				if p.Owner == o && !p.Interface() {
					deepest = math.Min(deepest, math.Min(p.A.Y, p.B.Y))
				}
			}
			d := c.At.Y - deepest
			if !(d > 1e-9*a.lay.Diagonal) || math.Abs(c.exitDir.X) < 0.5 {
				continue
			}
			seen[[2]int{o, e.Owner}] = true
			side := math.Copysign(1, c.exitDir.X)
			y := c.At.Y - d
			xs := make([]float64, heaveNodes)
			ws := make([]float64, heaveNodes)
			quad.Legendre{}.FixedLocations(xs, ws, 0, d/2)
			sum, wsum := 0.0, 0.0
			for k, s := range xs {
				pt := a.sol.Eval(r2.Vec{X: c.At.X + side*s, Y: y})
				if math.IsNaN(pt.U) {
					continue
				}
				sum += ws[k] * pt.U
				wsum += ws[k]
			}
			if wsum < 0.5*d/2 {
				continue // the prism's base lies mostly outside the soil
			}
			h := Heave{Structure: a.lay.Owners[o].Name, Face: e.Boundary, Corner: c.At, Depth: d, Width: d / 2,
				Tailwater: e.Head, ExcessHead: sum/wsum - e.Head}
			h.Safety = math.Inf(1)
			if h.ExcessHead > 0 {
				h.Safety = a.ic * d / h.ExcessHead
			}
			out = append(out, h)
		}
	}
	return out
}
