package bem

import (
	"fmt"
	"math"
	"time"

	"github.com/rimfield/rimfield/geom"
	"gonum.org/v1/gonum/floats"
	"gonum.org/v1/gonum/mat"
)

// Timing is where a System spent its time.
type Timing struct {
	// Setup is Assemble: the dense matrix and its LU factors, or the fast
	// solver's trees, near blocks and preconditioner.
	Setup time.Duration
	// Solves is the time of all Solve calls so far, Count their number.
	Solves time.Duration
	Count  int
}

// Method returns the solver the system uses: Dense or Fast.
func (sys *System) Method() Method { return sys.method }

// Timing returns the time spent so far in Assemble and in Solve.
func (sys *System) Timing() Timing {
	sys.timeMu.Lock()
	defer sys.timeMu.Unlock()
	return sys.timing
}

// Bytes returns the memory the system holds: the dense matrices and LU
// factors, or the fast solver's trees, near blocks and one GMRES
// workspace.
func (sys *System) Bytes() int {
	if sys.fast != nil {
		return sys.fast.bytes()
	}
	r, c := sys.as.a.Dims()
	_, nb := sys.as.b.Dims()
	return 8 * (2*r*c + r*nb)
}

func (sys *System) addSolve(d time.Duration) {
	sys.timeMu.Lock()
	sys.timing.Solves += d
	sys.timing.Count++
	sys.timeMu.Unlock()
}

// crossover returns the number of unknowns above which the fast solver is
// quicker than the dense one for nrhs right-hand sides, on the two-core
// machine of the README's performance table: there, dense assembly and LU
// and the fast set-up and one solve were measured on the example scenes and
// their refinements; each further right-hand side costs the dense solver a
// back-substitution (negligible) and the fast one a whole GMRES run.
func crossover(nrhs int) int {
	// Dense: about 1.2e-10 n^3 s (assembly and LU); fast: about 2e-4 n s
	// per right-hand side (the examples at 2000 panels: weir, flap,
	// busbars); equal at 1300 sqrt(nrhs).
	const one = 1300
	return int(one * math.Sqrt(float64(max(nrhs, 1))))
}

// rightHandSides returns the number of right-hand sides Auto assumes.
func (pr *problem) rightHandSides(s *Settings) int {
	if s.RightHandSides > 0 {
		return s.RightHandSides
	}
	n := 1
	for _, o := range pr.m.Layout.Owners {
		if o.Cond.Kind == geom.Potential {
			n++
		}
	}
	return n
}

// choose returns the method to use.
func (pr *problem) choose(s *Settings, limit int) (Method, error) {
	switch s.Method {
	case Dense:
		if pr.nUnk > limit {
			return Dense, &TooLargeError{Unknowns: pr.nUnk, Max: limit}
		}
		return Dense, nil
	case Fast:
		return Fast, nil
	case Auto:
		if pr.nUnk > limit || pr.nUnk > crossover(pr.rightHandSides(s)) {
			return Fast, nil
		}
		return Dense, nil
	}
	return Auto, fmt.Errorf("bem: Settings.Method %v is not a solver: use Auto, Dense or Fast", s.Method)
}

// assembleFast builds the fast solver's system.
func assembleFast(pr *problem, s *Settings, start time.Time) (*System, error) {
	fs, err := newFastSolver(pr, s)
	if err != nil {
		return nil, err
	}
	if s.Progress != nil {
		s.Progress(pr.nUnk, pr.nUnk)
	}
	sys := &System{pr: pr, method: Fast, fast: fs}
	sys.timing.Setup = time.Since(start)
	return sys, nil
}

// solveFast solves the right-hand side b by the fast solver.
func (sys *System) solveFast(d *Data, b *mat.VecDense, conds []geom.Condition, start time.Time) (*Solution, error) {
	x := make([]float64, sys.pr.nUnk)
	res, err := sys.fast.solve(x, b.RawVector().Data)
	if err != nil {
		return nil, err
	}
	s := sys.solution(x, conds)
	if d != nil {
		s.Uniform = d.Uniform
	}
	s.Method, s.Iterations, s.Residual = Fast, res.iterations, res.residual
	s.Cond = 0
	if !res.converged || res.residual > 10*sys.fast.tol {
		s.Warnings = append(s.Warnings, fmt.Sprintf(
			"the fast solver stopped after %d iterations at relative residual %.2g, above the %.2g asked for: results may carry fewer digits; try the dense solver (--solver dense) or report the scene",
			res.iterations, res.residual, sys.fast.tol))
	}
	sys.addSolve(time.Since(start))
	return s, nil
}

// denseResidual returns ||b - A x|| / ||b||.
func denseResidual(a *mat.Dense, x, b *mat.VecDense) float64 {
	var r mat.VecDense
	r.MulVec(a, x)
	r.SubVec(b, &r)
	bn := floats.Norm(b.RawVector().Data, 2)
	if bn == 0 {
		return 0
	}
	return floats.Norm(r.RawVector().Data, 2) / bn
}
