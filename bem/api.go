package bem

import (
	"github.com/rimfield/rimfield/geom"
	"github.com/rimfield/rimfield/mesh"
	"gonum.org/v1/gonum/spatial/r2"
)

// Settings tunes assembly and solution. The zero value (or a nil *Settings)
// means the defaults given with each field.
type Settings struct {
	// Workers is the number of goroutines that assemble rows; 0 means
	// runtime.GOMAXPROCS(0). Results do not depend on it.
	Workers int
	// CondLimit is the estimated condition number above which the solution
	// carries a warning; 0 means 1e10.
	CondLimit float64
	// Progress, when not nil, is called from assembly with the number of
	// rows done out of the total. It must be safe for concurrent use.
	Progress func(done, total int)
	// MaxUnknowns bounds the dense system: 16 bytes per entry (the matrix
	// and its LU factors) and a factorisation time growing as the cube.
	// 0 means 16000 (about 4 GB and a few minutes on two cores).
	MaxUnknowns int
}

// Data overrides the values of the owners' conditions for one solve, so
// that one factorised system serves several right-hand sides. Kinds must
// match the mesh's: only values change.
type Data struct {
	// Owners has one condition per Layout.Owners entry; a nil Data or a nil
	// slice means the conditions of the mesh.
	Owners []geom.Condition
}

// Solution is u and the inflow density on every panel plus the extra
// unknowns, for one right-hand side.
type Solution struct {
	Mesh *mesh.Mesh
	// U is the potential at each panel's midpoint.
	U []float64
	// F is the inflow density into each panel's Left region, n.K grad u with
	// n the outward normal of Left (C/m^2, m/s ...): positive where flux
	// enters the domain.
	F []float64
	// Floating holds the potential of each owner (index into Layout.Owners);
	// meaningful for floating owners, NaN for the others.
	Floating []float64
	// Const holds, per region, the constant of its representation: the
	// potential at infinity for the background of an open scene, a
	// discretisation residual (ideally 0) for a closed region (the largest
	// over its connected parts).
	Const []float64
	// Cond is the estimated condition number (1-norm) of the scaled system.
	Cond float64
	// Warnings lists numerical concerns, one sentence each.
	Warnings []string

	pr        *problem
	partConst []float64   // per connected part: its constant
	slopes    [][]float64 // per part, per side: du/ds for the near-field correction
}

// OwnerResult is the integrated result on one body or edge.
type OwnerResult struct {
	Name      string
	Potential float64 // length-weighted mean potential
	Inflow    float64 // total inflow into the domain per metre (C/m, m^2/s)
	Length    float64 // length bounding the domain, metres
}

// Point is a value at a point of the plane.
type Point struct {
	U      float64 // potential
	Grad   r2.Vec  // gradient of the potential
	Region int     // index into Layout.Regions, or geom.Outside
}
