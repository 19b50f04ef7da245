package geom

import (
	"math"

	"gonum.org/v1/gonum/spatial/r2"
)

// Physics names the job a scene is for. The zero value is invalid so that a
// missing problem.physics is caught by validation.
type Physics uint8

const (
	Laplace       Physics = iota + 1 // generic: u, k
	Electrostatic                    // volts, permittivity
	Seepage                          // metres of total head, hydraulic conductivity
	Flow                             // ideal flow around bodies
)

// String returns the name used in scene files.
func (p Physics) String() string {
	switch p {
	case Laplace:
		return "laplace"
	case Electrostatic:
		return "electrostatic"
	case Seepage:
		return "seepage"
	case Flow:
		return "flow"
	}
	return "invalid"
}

// Eps0 is the permittivity of free space in F/m (CODATA 2018).
const Eps0 = 8.8541878128e-12

// Kind is the kind of a boundary condition. The zero value means "no
// condition given".
type Kind uint8

const (
	Potential Kind = iota + 1 // fixed potential (volts, metres of head, u)
	Flux                      // prescribed inflow density g = k du/dn, n the domain's outward normal
	Floating                  // unknown constant potential with a given total inflow per metre
)

// String returns the scene-file key of the condition.
func (k Kind) String() string {
	switch k {
	case Potential:
		return "potential"
	case Flux:
		return "flux"
	case Floating:
		return "floating"
	}
	return "none"
}

// Condition is a boundary condition in SI units.
type Condition struct {
	Kind Kind
	// Value is the fixed potential (Potential) or the inflow density
	// (Flux: C/m^2 in electrostatics, m/s in seepage). Unused for Floating.
	Value float64
	// NetInflow is the total inflow per metre into the domain through a
	// Floating boundary (C/m in electrostatics). Unused otherwise.
	NetInflow float64
}

// Insulated is the condition of a boundary with no condition of its own:
// zero flux.
var Insulated = Condition{Kind: Flux}

// Material is the conductivity tensor of a region, diagonal in x and y, in
// the units that make k du/dn the inflow density: hydraulic conductivity in
// m/s for seepage, absolute permittivity eps0*eps_r in F/m for
// electrostatics, the plain k for laplace and flow.
type Material struct {
	Kx, Ky float64
}

// Isotropic reports whether Kx == Ky.
func (m Material) Isotropic() bool { return m.Kx == m.Ky }

// Ring is a closed ring of vertices in metres, without the repeated closing
// vertex. After reading, outer rings run counter-clockwise and holes
// clockwise, so the material of the polygon is always on the left.
type Ring []r2.Vec

// Polygon is an outer ring followed by its holes.
type Polygon []Ring

// Line is an open or closed polyline in metres (closed: first == last).
type Line []r2.Vec

// Body is a feature with part "body": not part of the domain. A body is
// a solid (Polygons) or a sheet of zero thickness (Lines: a trace, a thin
// electrode, a sheet pile, a baffle, a plate or a sail), whose two faces
// both carry its condition; never both.
type Body struct {
	Feature  int // index of the feature in the file
	Name     string
	Polygons []Polygon
	// Lines are the lines of a sheet, as for an edge (closed: first ==
	// last); nil for a solid.
	Lines []Line
	Cond  Condition // Insulated when the body sets none (every body is a wall in Flow)
	Kutta *Kutta    // flow only: the circulation is fixed by the Kutta condition
}

// Kutta asks for the Kutta condition at a trailing edge.
type Kutta struct {
	Auto  bool   // find the sharpest vertex automatically
	Point r2.Vec // the trailing-edge point in metres when !Auto
}

// Region is a feature with part "region": material that is part of the domain.
type Region struct {
	Feature  int
	Name     string
	Polygons []Polygon
	Material Material
	// Permittivity is the relative permittivity as given (electrostatic only).
	Permittivity float64
	// BreakdownField is the optional dielectric strength in V/m (0: not given).
	BreakdownField float64
}

// Edge is a feature with part "edge": a stretch of boundary with its own condition.
type Edge struct {
	Feature int
	Name    string
	Lines   []Line
	Cond    Condition
}

// Stream is the uniform stream at infinity of a flow problem.
type Stream struct {
	Speed    float64 // m/s
	AngleDeg float64 // degrees from the x axis, anticlockwise
}

// Ground is an infinite grounded plane y = Y (potential 0) bounding an open
// scene from below; the scene lies above it.
type Ground struct {
	Y float64 // metres
}

// Problem holds the scene-wide settings in SI units.
type Problem struct {
	Physics Physics
	Unit    string  // the coordinate unit as written ("mm"); coordinates are already in metres
	Scale   float64 // metres per coordinate unit
	Open    bool    // the domain extends to infinity
	// Background is the material of the unbounded background of an open
	// scene (eps0*background_permittivity, or background_k).
	Background Material
	// BackgroundPermittivity is the relative permittivity as given.
	BackgroundPermittivity float64

	UnitWeightWater  float64 // kN/m^3, seepage (default 9.81)
	CriticalGradient float64 // seepage (default 1.0)

	Stream *Stream // flow
	Chord  float64 // flow: reference chord in metres (0: found from the geometry)
	// Density is the fluid density of a flow scene in kg/m^3 (default 1.225).
	Density float64
	Ground  *Ground // electrostatic: grounded plane; flow: slip wall; nil when none
}

// Scene is a validated scene: the problem as the user states it, in SI units.
type Scene struct {
	Problem  Problem
	Bodies   []Body
	Regions  []Region
	Edges    []Edge
	Warnings []string // unknown property keys and similar, one sentence each
}

// Area returns the area the ring encloses, positive whatever its direction.
func (r Ring) Area() float64 {
	a := 0.0
	for i := range r {
		p, q := r[i], r[(i+1)%len(r)]
		a += p.X*q.Y - q.X*p.Y
	}
	return math.Abs(a) / 2
}

// Contains reports whether p lies inside the ring (crossing number; a point
// on the ring may get either answer).
func (r Ring) Contains(p r2.Vec) bool {
	in := false
	for i, j := 0, len(r)-1; i < len(r); j, i = i, i+1 {
		a, b := r[i], r[j]
		if (a.Y > p.Y) != (b.Y > p.Y) && p.X < a.X+(p.Y-a.Y)*(b.X-a.X)/(b.Y-a.Y) {
			in = !in
		}
	}
	return in
}

// Contains reports whether p lies inside the polygon: inside its outer ring
// and outside its holes (even-odd over all rings).
func (pg Polygon) Contains(p r2.Vec) bool {
	in := false
	for _, r := range pg {
		if r.Contains(p) {
			in = !in
		}
	}
	return in
}
