package krylov

import (
	"fmt"
	"math"

	"gonum.org/v1/gonum/floats"
)

// Operator is a square linear operator A on R^n.
type Operator interface {
	// Dim returns n.
	Dim() int
	// Apply sets dst = A x. dst and x have length n and do not overlap.
	Apply(dst, x []float64)
}

// Settings tunes GMRES. The zero value (or a nil *Settings) gives the
// defaults.
type Settings struct {
	// Tol is the relative residual to reach: ||b - A x|| <= Tol ||b|| in
	// the Euclidean norm, whatever the preconditioners. 0 means 1e-10; it
	// must lie in (0, 1).
	Tol float64
	// Restart is the dimension m of the Krylov space before a restart.
	// Memory is (m + 1) n float64 values. 0 means min(50, n).
	Restart int
	// MaxIter bounds the total number of iterations (products with A
	// beyond one per restart). 0 means 1000.
	MaxIter int
	// Left and Right are optional preconditioners: Apply(dst, x) sets
	// dst = M^-1 x for an approximation M of A (from the left, M_L^-1 A x =
	// M_L^-1 b, or from the right, A M_R^-1 y = b, x = M_R^-1 y). nil means
	// none. Right preconditioning keeps the minimised residual the true
	// one and is the better default.
	Left, Right Operator
	// Progress, when not nil, is called after every iteration with the
	// iteration count and the estimated relative residual.
	Progress func(iter int, residual float64)
}

// Result reports a GMRES run.
type Result struct {
	// Iterations is the number of Arnoldi steps (products with A, apart from
	// the residual computed at each restart).
	Iterations int
	// Restarts is the number of restarts.
	Restarts int
	// Residual is the final true relative residual ||b - A x|| / ||b||,
	// computed from x.
	Residual float64
}

// Reason says why GMRES stopped short of the tolerance.
type Reason uint8

const (
	// IterationLimit: MaxIter iterations without reaching the tolerance.
	IterationLimit Reason = iota + 1
	// Stagnation: a whole restart cycle did not reduce the residual (a
	// restart too short for the operator, a singular or nearly singular
	// operator, or a tolerance below what rounding allows).
	Stagnation
	// Breakdown: the Krylov space became invariant with the residual still
	// above the tolerance: the operator is singular and b is not in its range
	// (on that space), or an operator returned a non-finite value.
	Breakdown
)

func (r Reason) String() string {
	switch r {
	case IterationLimit:
		return "iteration limit"
	case Stagnation:
		return "stagnation"
	case Breakdown:
		return "breakdown"
	}
	return fmt.Sprintf("Reason(%d)", uint8(r))
}

// NotConvergedError is returned when GMRES stops without meeting the
// tolerance; x then holds the best iterate found and Result its residual.
type NotConvergedError struct {
	Result
	Tol    float64
	Reason Reason
}

func (e *NotConvergedError) Error() string {
	hint := "raise Settings.MaxIter or Settings.Restart, or precondition the system"
	switch e.Reason {
	case Stagnation:
		hint = "raise Settings.Restart, precondition the system, or check that the operator is not singular"
	case Breakdown:
		hint = "the operator is singular (or not finite) on the Krylov space: check the formulation"
	}
	return fmt.Sprintf("krylov: GMRES stopped (%s) after %d iterations at relative residual %.3g, above the tolerance %.3g: %s",
		e.Reason, e.Iterations, e.Residual, e.Tol, hint)
}

const (
	defaultTol     = 1e-10
	defaultRestart = 50
	defaultMaxIter = 1000
)

// GMRES solves A x = b by the restarted generalised minimal residual method
// (Saad & Schultz, GMRES: a generalized minimal residual algorithm for
// solving nonsymmetric linear systems, SIAM J. Sci. Stat. Comput. 7, 1986):
// Arnoldi with modified Gram-Schmidt (repeated once when it cancels, the
// "twice is enough" rule of Giraud, Langou & Rozloznik, Comput. Math. Appl.
// 50, 2005), the Hessenberg least-squares problem updated by Givens
// rotations, restarts every Settings.Restart steps (Saad, Iterative Methods
// for Sparse Linear Systems, 2nd ed., 2003, Algorithms 6.9 and 9.5).
//
// x holds the initial guess (zeros for none) and receives the solution. A
// zero b gives x = 0 at once. When the tolerance is not met the error is a
// *NotConvergedError, x holds the best iterate and the Result its true
// residual. Lengths that do not match a.Dim() are caller bugs and panic.
func GMRES(a Operator, x, b []float64, s *Settings) (Result, error) {
	n := a.Dim()
	if len(x) != n || len(b) != n {
		panic(fmt.Sprintf("krylov: GMRES with x of length %d and b of length %d for an operator of dimension %d", len(x), len(b), n))
	}
	var set Settings
	if s != nil {
		set = *s
	}
	if set.Tol == 0 {
		set.Tol = defaultTol
	}
	if !(set.Tol > 0 && set.Tol < 1) {
		return Result{}, fmt.Errorf("krylov: Settings.Tol %g is out of range: use a relative residual in (0, 1), or 0 for %g", set.Tol, defaultTol)
	}
	if set.Restart < 0 || set.MaxIter < 0 {
		return Result{}, fmt.Errorf("krylov: Settings.Restart %d and MaxIter %d must not be negative (0 for the defaults)", set.Restart, set.MaxIter)
	}
	if set.Restart == 0 {
		set.Restart = defaultRestart
	}
	set.Restart = max(1, min(set.Restart, n))
	if set.MaxIter == 0 {
		set.MaxIter = defaultMaxIter
	}
	for _, p := range []Operator{set.Left, set.Right} {
		if p != nil && p.Dim() != n {
			panic(fmt.Sprintf("krylov: preconditioner of dimension %d for an operator of dimension %d", p.Dim(), n))
		}
	}
	bnorm := floats.Norm(b, 2)
	if n == 0 || bnorm == 0 {
		clear(x)
		return Result{}, nil
	}
	g := newSolver(a, &set, n)
	return g.solve(x, b, bnorm)
}

// solver holds the workspace of one GMRES run.
type solver struct {
	a        Operator
	set      *Settings
	n, m     int
	v        [][]float64 // Krylov basis, m+1 vectors
	h        [][]float64 // Hessenberg columns: h[j][i], i <= j+1
	cs, sn   []float64   // Givens rotations
	gv       []float64   // rotated right-hand side of the least-squares problem
	y        []float64
	r, t, z  []float64
	xb       []float64 // the iterate before the last correction
	iter     int
	restarts int
	// anorm is the largest ||M_L^-1 A M_R^-1 v|| seen, an estimate of the
	// operator's norm: the scale of a numerically zero pivot.
	anorm float64
}

func newSolver(a Operator, set *Settings, n int) *solver {
	m := set.Restart
	g := &solver{a: a, set: set, n: n, m: m,
		v: make([][]float64, m+1), h: make([][]float64, m),
		cs: make([]float64, m), sn: make([]float64, m), gv: make([]float64, m+1), y: make([]float64, m),
		r: make([]float64, n), t: make([]float64, n), z: make([]float64, n), xb: make([]float64, n)}
	for i := range g.v {
		g.v[i] = make([]float64, n)
	}
	for j := range g.h {
		g.h[j] = make([]float64, j+2)
	}
	return g
}

// residual sets g.r = b - A x and returns its norm.
func (g *solver) residual(x, b []float64) float64 {
	g.a.Apply(g.r, x)
	floats.SubTo(g.r, b, g.r)
	return floats.Norm(g.r, 2)
}

// precondLeft sets dst = M_L^-1 src (a copy without one).
func (g *solver) precondLeft(dst, src []float64) {
	if g.set.Left != nil {
		g.set.Left.Apply(dst, src)
		return
	}
	copy(dst, src)
}

func (g *solver) solve(x, b []float64, bnorm float64) (Result, error) {
	set := g.set
	target := set.Tol * bnorm
	rnorm := g.residual(x, b)
	res := func() Result {
		return Result{Iterations: g.iter, Restarts: g.restarts, Residual: rnorm / bnorm}
	}
	fail := func(why Reason) (Result, error) {
		r := res()
		return r, &NotConvergedError{Result: r, Tol: set.Tol, Reason: why}
	}
	if math.IsNaN(rnorm) || math.IsInf(rnorm, 0) {
		return fail(Breakdown)
	}
	for {
		if rnorm <= target {
			return res(), nil
		}
		if g.iter >= set.MaxIter {
			return fail(IterationLimit)
		}
		// The preconditioned residual and the factor that converts its
		// norm into the true one (exact without a left preconditioner).
		g.precondLeft(g.v[0], g.r)
		beta := floats.Norm(g.v[0], 2)
		if beta == 0 || math.IsNaN(beta) || math.IsInf(beta, 0) {
			return fail(Breakdown)
		}
		ratio := rnorm / beta
		floats.Scale(1/beta, g.v[0])
		k, broke := g.cycle(beta, target/ratio, ratio/bnorm)
		copy(g.xb, x)
		if k > 0 {
			g.update(x, k)
		}
		prev := rnorm
		rnorm = g.residual(x, b)
		if rnorm <= target {
			return res(), nil
		}
		// A correction that made things worse (rounding in a nearly
		// singular least-squares problem, or a non-finite operator value)
		// is undone: x keeps the best iterate.
		if !(rnorm <= prev) {
			copy(x, g.xb)
			rnorm = prev
			broke = broke || k == 0
		}
		if g.iter >= set.MaxIter {
			return fail(IterationLimit)
		}
		// A cycle that gains less than 1e-3 of the residual will not gain
		// more in the next one: it starts again from (nearly) the same
		// residual.
		if rnorm >= (1-1e-3)*prev {
			if broke {
				return fail(Breakdown)
			}
			return fail(Stagnation)
		}
		g.restarts++
	}
}

// cycle runs up to m Arnoldi steps from the unit vector v[0] with
// preconditioned residual norm beta, stopping when the estimated residual
// falls to target (in the preconditioned norm). It returns the number of
// usable columns and whether the Krylov space became invariant. scale turns
// the preconditioned estimate into the relative residual for Progress.
func (g *solver) cycle(beta, target, scale float64) (int, bool) {
	clear(g.gv)
	g.gv[0] = beta
	for j := 0; j < g.m; j++ {
		if g.iter >= g.set.MaxIter {
			return j, false
		}
		g.iter++
		w := g.v[j+1]
		if g.set.Right != nil {
			g.set.Right.Apply(g.z, g.v[j])
			g.a.Apply(g.t, g.z)
		} else {
			g.a.Apply(g.t, g.v[j])
		}
		g.precondLeft(w, g.t)
		h := g.h[j]
		before := floats.Norm(w, 2)
		if math.IsNaN(before) || math.IsInf(before, 0) {
			return j, true
		}
		g.anorm = math.Max(g.anorm, before)
		for i := 0; i <= j; i++ {
			h[i] = floats.Dot(w, g.v[i])
			floats.AddScaled(w, -h[i], g.v[i])
		}
		after := floats.Norm(w, 2)
		if after < 0.7*before {
			for i := 0; i <= j; i++ {
				c := floats.Dot(w, g.v[i])
				h[i] += c
				floats.AddScaled(w, -c, g.v[i])
			}
			after = floats.Norm(w, 2)
		}
		h[j+1] = after
		// Apply the earlier rotations to the new column, then the one that
		// annihilates h[j+1].
		for i := 0; i < j; i++ {
			hi, hk := h[i], h[i+1]
			h[i] = g.cs[i]*hi + g.sn[i]*hk
			h[i+1] = -g.sn[i]*hi + g.cs[i]*hk
		}
		d := math.Hypot(h[j], h[j+1])
		// A pivot at rounding level against the operator's norm: the
		// operator is (numerically) singular on the Krylov space. Keep the
		// columns so far.
		if d <= 1e-14*g.anorm {
			return j, true
		}
		g.cs[j], g.sn[j] = h[j]/d, h[j+1]/d
		h[j], h[j+1] = d, 0
		g.gv[j+1] = -g.sn[j] * g.gv[j]
		g.gv[j] *= g.cs[j]
		est := math.Abs(g.gv[j+1])
		if g.set.Progress != nil {
			g.set.Progress(g.iter, est*scale)
		}
		// Happy breakdown: the Krylov space is invariant and the least-squares
		// solution is exact on it.
		if after <= 1e-14*before {
			return j + 1, true
		}
		if est <= target {
			return j + 1, false
		}
		floats.Scale(1/after, w)
	}
	return g.m, false
}

// update adds the correction of the first k columns to x:
// x += M_R^-1 V_k y with R_k y = g_k.
func (g *solver) update(x []float64, k int) {
	for i := k - 1; i >= 0; i-- {
		s := g.gv[i]
		for l := i + 1; l < k; l++ {
			s -= g.h[l][i] * g.y[l]
		}
		g.y[i] = s / g.h[i][i]
	}
	clear(g.t)
	for i := 0; i < k; i++ {
		floats.AddScaled(g.t, g.y[i], g.v[i])
	}
	if g.set.Right != nil {
		g.set.Right.Apply(g.z, g.t)
		floats.Add(x, g.z)
		return
	}
	floats.Add(x, g.t)
}
