package mesh

import (
	"math"

	"github.com/rimfield/rimfield/geom"
	"gonum.org/v1/gonum/spatial/r2"
)

// Panel is one straight boundary element. Its Left side is a region of the
// domain; its outward normal (out of Left) is the right normal of B-A.
type Panel struct {
	A, B        r2.Vec
	Left, Right int // indices into Layout.Regions; Right is geom.Outside on a boundary
	Owner       int // index into Layout.Owners, or -1
	Cond        geom.Condition
	Piece       int     // index of the layout piece the panel came from
	S           float64 // arc length at the midpoint along its owner's (or piece chain's) boundary, metres
}

// Mid returns the midpoint of the panel, its collocation point.
func (p Panel) Mid() r2.Vec { return r2.Scale(0.5, r2.Add(p.A, p.B)) }

// Length returns the panel's length in metres.
func (p Panel) Length() float64 { return r2.Norm(r2.Sub(p.B, p.A)) }

// Tangent returns the unit vector from A to B.
func (p Panel) Tangent() r2.Vec { return r2.Unit(r2.Sub(p.B, p.A)) }

// Normal returns the unit outward normal of the Left region: the tangent
// rotated clockwise.
func (p Panel) Normal() r2.Vec {
	t := p.Tangent()
	return r2.Vec{X: t.Y, Y: -t.X}
}

// Interface reports whether both sides of the panel are domain.
func (p Panel) Interface() bool { return p.Right != geom.Outside }

// Mesh is the discretised boundary with the layout it came from.
type Mesh struct {
	Panels []Panel
	Layout *geom.Layout
	// Size is the nominal panel length used, in metres.
	Size float64
}

// Bounds returns the bounding box of the panels.
func (m *Mesh) Bounds() (min, max r2.Vec) {
	min = r2.Vec{X: math.Inf(1), Y: math.Inf(1)}
	max = r2.Vec{X: math.Inf(-1), Y: math.Inf(-1)}
	for _, p := range m.Panels {
		for _, v := range [2]r2.Vec{p.A, p.B} {
			min.X, min.Y = math.Min(min.X, v.X), math.Min(min.Y, v.Y)
			max.X, max.Y = math.Max(max.X, v.X), math.Max(max.Y, v.Y)
		}
	}
	return min, max
}
