package mesh

import (
	"fmt"
	"math"
	"strings"

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
	Piece       int // index of the layout piece the panel came from
	// S is the arc length at the midpoint, metres: along its body or edge
	// as drawn (geom.Piece SA, SB: from the first coordinate of an edge or
	// sheet, from the first vertex of a body's first ring), else along its
	// chain of walls or interface pieces.
	S float64
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
	// Size is the nominal panel length used, in metres. In automatic mode
	// a small separate group of pieces may use a smaller one.
	Size float64
	// Singular lists the vertices toward which panels were graded.
	Singular []r2.Vec
	// Twin pairs the two faces of a sheet (geom.Layout.Twin): when not nil
	// it has one entry per panel, the index of the panel with the same end
	// points reversed, on the sheet's other face, or -1. nil when no panel
	// has a twin.
	Twin []int
}

// TwinOf returns the index of panel j's twin, or -1.
func (m *Mesh) TwinOf(j int) int {
	if m.Twin == nil {
		return -1
	}
	return m.Twin[j]
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

// Summary describes a mesh in numbers.
type Summary struct {
	Panels int
	// PerOwner counts the panels of each owner, indexed like Layout.Owners.
	PerOwner []Count
	// Unowned counts the panels with Owner -1: insulated walls without an
	// edge, and interfaces.
	Unowned int
	// Interfaces counts the panels with domain on both sides.
	Interfaces int
	// PerRegion counts the panels with the region on either side, indexed
	// like Layout.Regions (an interface panel counts for both regions).
	PerRegion []Count
	// Smallest and Largest are the shortest and longest panel lengths in
	// metres (0 for an empty mesh).
	Smallest, Largest float64
	// Graded is the number of vertices toward which panels were graded.
	Graded int
	// Size is the nominal panel length in metres.
	Size float64
}

// Summary counts the panels by owner and region and reports the extremes of
// their lengths.
func (m *Mesh) Summary() Summary {
	s := Summary{Panels: len(m.Panels), Graded: len(m.Singular), Size: m.Size}
	if m.Layout != nil {
		s.PerOwner = make([]Count, len(m.Layout.Owners))
		for i, o := range m.Layout.Owners {
			s.PerOwner[i].Name = o.Name
		}
		s.PerRegion = make([]Count, len(m.Layout.Regions))
		for i, r := range m.Layout.Regions {
			s.PerRegion[i].Name = r.Name
		}
	}
	count := func(list []Count, i int) {
		if i >= 0 && i < len(list) {
			list[i].Panels++
		}
	}
	s.Smallest = math.Inf(1)
	for _, p := range m.Panels {
		if p.Owner < 0 {
			s.Unowned++
		}
		count(s.PerOwner, p.Owner)
		count(s.PerRegion, p.Left)
		if p.Interface() {
			s.Interfaces++
			count(s.PerRegion, p.Right)
		}
		l := p.Length()
		s.Smallest = math.Min(s.Smallest, l)
		s.Largest = math.Max(s.Largest, l)
	}
	if len(m.Panels) == 0 {
		s.Smallest = 0
	}
	return s
}

// Count is the number of panels of one named owner or region.
type Count struct {
	Name   string
	Panels int
}

// String writes the summary as a few lines of text.
func (s Summary) String() string {
	var b strings.Builder
	fmt.Fprintf(&b, "panels: %d (nominal size %.4g m, smallest %.4g m, largest %.4g m, %d graded vertices)\n",
		s.Panels, s.Size, s.Smallest, s.Largest, s.Graded)
	for _, c := range s.PerOwner {
		fmt.Fprintf(&b, "  %s: %d panels\n", c.Name, c.Panels)
	}
	if s.Unowned > 0 {
		fmt.Fprintf(&b, "  without owner: %d panels (%d on interfaces)\n", s.Unowned, s.Interfaces)
	}
	for _, c := range s.PerRegion {
		fmt.Fprintf(&b, "  region %s: %d panels\n", c.Name, c.Panels)
	}
	return b.String()
}
