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
	// Kutta lists the Kutta conditions of the problem (none by default).
	// Each replaces the total-inflow equation of a floating owner by the
	// condition that the inflow densities of the two panels meeting at a
	// vertex of its boundary are equal and opposite; see Kutta.
	Kutta []Kutta
	// Method chooses the linear solver: Auto (the zero value) takes Dense
	// up to the crossover where Fast is quicker (see Method) and hands
	// over to Fast above it and above MaxUnknowns; Dense and Fast force
	// one (Dense above MaxUnknowns is a *TooLargeError).
	Method Method
	// Tol is the relative residual ||b - A x|| / ||b|| the fast solver
	// iterates to, in the Euclidean norm of the scaled equations; 0 means
	// 1e-12, which agrees with the dense solver to a few parts in 1e9 on
	// every result, the peak field on a corner panel 3e-6 m long
	// included (1e-11 left 2e-8 there). From 1e-12 to 1e-3. The fast
	// multipole product runs at a tenth of it, 1e-12 at the finest. The
	// dense solver ignores it.
	Tol float64
	// RightHandSides is the number of right-hand sides the caller means to
	// solve with the system (a capacitance matrix needs one per
	// conductor, a sweep one per angle); Auto weighs it, since the dense
	// factorisation serves further ones almost free and the fast solver
	// iterates for each. 0 means one per owner with a fixed potential
	// plus one.
	RightHandSides int
}

// Kutta is a Kutta condition at a vertex of a floating owner's boundary:
// F_a + F_b = 0 on the panel a that ends at the vertex and the panel b that
// starts there (walking with the domain on the left). With the stream
// function of an ideal flow as the potential, F is the tangential velocity
// along the boundary (up to sign), and the condition makes the speeds on
// both faces of a trailing edge equal, so that the flow leaves it
// smoothly; the owner's circulation, its total inflow, becomes an unknown
// fixed by that condition (its NetInflow is not used). A blunt trailing
// edge (a short base between two corners) takes the condition across its
// base: panel a ends at At, panel b starts at To.
type Kutta struct {
	Owner int    // index into Layout.Owners of a floating owner
	At    r2.Vec // the vertex, metres: an end point of the owner's panels
	// Blunt takes panel b at To, the other end of the base (the corner
	// reached after At walking with the domain on the left), instead of
	// at At.
	Blunt bool
	To    r2.Vec
}

// Data overrides the values of the owners' conditions for one solve, so
// that one factorised system serves several right-hand sides. Kinds must
// match the mesh's: only values change.
type Data struct {
	// Owners has one condition per Layout.Owners entry; a nil Data or a nil
	// slice means the conditions of the mesh.
	Owners []geom.Condition
	// Uniform is the gradient of a uniform incident field u0 in the
	// unbounded background of an open scene (a uniform stream's stream
	// function, an applied electric field):
	//
	//	u0(x) = Uniform.X x + Uniform.Y (y - Y0)
	//
	// with Y0 the height of the grounded plane (0 without one). The
	// solution is then u = u0 + w with w, the disturbance, bounded at
	// infinity apart from the log term of a net inflow; every condition
	// applies to the total u, and Solution.U, F and Eval are totals. Over a
	// grounded plane Uniform.X must be 0 (a field along the plane would
	// cross it). The zero value means no incident field.
	Uniform r2.Vec
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
	// potential at infinity for the background of an open scene (of the
	// disturbance w when the data have an incident field), a
	// discretisation residual (ideally 0) for a closed region (the largest
	// over its connected parts).
	Const []float64
	// Cond is the estimated condition number (1-norm) of the scaled system.
	Cond float64
	// Warnings lists numerical concerns, one sentence each.
	Warnings []string
	// Uniform is the gradient of the incident field of the data (see
	// Data.Uniform); zero without one.
	Uniform r2.Vec
	// Method is the solver that ran: Dense or Fast.
	Method Method
	// Iterations is the number of GMRES iterations of the fast solver (0
	// for the dense one).
	Iterations int
	// Residual is the relative residual ||b - A x|| / ||b|| of the solution
	// in the scaled equations (Euclidean norm), computed from the solution:
	// rounding for the dense solver, about Settings.Tol for the fast one.
	Residual float64

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
