package bem

import (
	"errors"
	"fmt"
	"math"
	"sync"

	"github.com/rimfield/rimfield/bem/krylov"
	"gonum.org/v1/gonum/floats"
)

// Defaults of the fast solver.
const (
	defaultTol = 1e-12
	minTol     = 1e-12
	maxTol     = 1e-3
	// fmmFactor: the multipole products run at this fraction of the
	// residual asked for, so that their error stays below it.
	fmmFactor = 0.1
	// restartMax: the Krylov space kept before GMRES restarts; the
	// preconditioned systems converge in 15-90 iterations, so most solves
	// never restart, but a section with a cusped trailing edge needed 211
	// to 260 (2800 to 12 000 panels) and stagnated when restarted every
	// 100. restartBytes bounds its memory on large systems.
	restartMax   = 300
	restartBytes = 3 << 27
	maxIter      = 2000
	// precondTol is the precision of the preconditioner's products.
	precondTol = 1e-6
)

// fastSolver is the matrix-free system with its preconditioner.
type fastSolver struct {
	pr   *problem
	op   *fastOp
	pc   *precond
	tol  float64
	ops  workPool
	mu   sync.Mutex
	free []*fastRun
}

// fastRun is the workspace of one GMRES run.
type fastRun struct {
	v   *values
	w   *fastWork
	pw  *wWork
	tmp []float64
}

func newFastSolver(pr *problem, s *Settings) (*fastSolver, error) {
	tol := s.Tol
	if tol == 0 {
		tol = defaultTol
	}
	if !(tol >= minTol && tol <= maxTol) {
		return nil, fmt.Errorf("bem: Settings.Tol %g is out of range: choose a relative residual from %g to %g (0 for %g)", tol, minTol, maxTol, defaultTol)
	}
	ftol := math.Max(fmmFactor*tol, minTol)
	op, err := newFastOp(pr, ftol, s.Workers)
	if err != nil {
		return nil, err
	}
	// The preconditioner needs no more than a few digits: it is the same
	// linear operator at every iteration whatever its precision.
	pc, err := newPrecond(pr, math.Max(precondTol, ftol), s.Workers)
	if err != nil {
		return nil, err
	}
	fs := &fastSolver{pr: pr, op: op, pc: pc, tol: tol}
	fs.ops.op = op
	return fs, nil
}

func (fs *fastSolver) run() *fastRun {
	fs.mu.Lock()
	defer fs.mu.Unlock()
	if n := len(fs.free); n > 0 {
		r := fs.free[n-1]
		fs.free = fs.free[:n-1]
		return r
	}
	return &fastRun{v: fs.pr.newValues(), w: fs.op.newWork(), pw: fs.pc.newWork(), tmp: make([]float64, fs.pr.nUnk)}
}

func (fs *fastSolver) done(r *fastRun) {
	fs.mu.Lock()
	fs.free = append(fs.free, r)
	fs.mu.Unlock()
}

// known sets b to the rows applied to the owners' known values (the dense
// system's B v).
func (fs *fastSolver) known(b []float64, value func(owner int) float64) {
	r := fs.run()
	defer fs.done(r)
	fs.pr.knowns(r.v, value)
	fs.op.apply(b, r.v, r.w)
}

// product sets dst = A x (rows in row order).
func (fs *fastSolver) product(dst, x []float64, r *fastRun) {
	fs.pr.unknowns(r.v, x)
	fs.op.apply(dst, r.v, r.w)
}

// krylovOp is the transformed system T A as a krylov.Operator.
type krylovOp struct {
	fs *fastSolver
	r  *fastRun
}

func (k krylovOp) Dim() int { return k.fs.pr.nUnk }

func (k krylovOp) Apply(dst, x []float64) {
	k.fs.product(k.r.tmp, x, k.r)
	k.fs.pc.rowTransform(dst, k.r.tmp)
}

// krylovPre is the right preconditioner P as a krylov.Operator.
type krylovPre struct {
	fs *fastSolver
	r  *fastRun
}

func (k krylovPre) Dim() int { return k.fs.pr.nUnk }

func (k krylovPre) Apply(dst, y []float64) { k.fs.pc.apply(dst, y, k.r.pw) }

// fastResult reports one fast solve.
type fastResult struct {
	iterations int
	residual   float64 // ||b - A x|| / ||b|| of the original rows
	converged  bool
}

// solve solves A x = b (rows in row order) by GMRES on T A P y = T b.
func (fs *fastSolver) solve(x, b []float64) (fastResult, error) {
	n := fs.pr.nUnk
	r := fs.run()
	defer fs.done(r)
	tb := make([]float64, n)
	fs.pc.rowTransform(tb, b)
	restart := min(restartMax, max(20, restartBytes/(8*max(n, 1))))
	set := &krylov.Settings{Tol: fs.tol, Restart: restart, MaxIter: maxIter, Right: krylovPre{fs, r}}
	clear(x)
	res, err := krylov.GMRES(krylovOp{fs, r}, x, tb, set)
	out := fastResult{iterations: res.Iterations, converged: err == nil}
	var nc *krylov.NotConvergedError
	if err != nil && !errors.As(err, &nc) {
		return out, fmt.Errorf("bem: fast solver: %v", err)
	}
	// The residual of the original rows, from x.
	fs.product(r.tmp, x, r)
	floats.SubTo(r.tmp, b, r.tmp)
	if bn := floats.Norm(b, 2); bn > 0 {
		out.residual = floats.Norm(r.tmp, 2) / bn
	}
	if math.IsNaN(out.residual) {
		return out, fmt.Errorf("bem: fast solver: the iteration produced non-finite values; the geometry may be degenerate (coincident or overlapping boundaries)")
	}
	return out, nil
}

// bytes returns the memory of the solver's trees, blocks and one run.
func (fs *fastSolver) bytes() int {
	n := fs.op.bytes()
	for _, wp := range fs.pc.parts {
		n += wp.tree.Stats().Bytes
	}
	restart := min(restartMax, max(20, restartBytes/(8*max(fs.pr.nUnk, 1))))
	return n + 8*fs.pr.nUnk*(restart+8)
}
