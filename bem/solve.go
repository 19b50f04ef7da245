package bem

import (
	"fmt"
	"math"
	"sync"
	"time"

	"github.com/rimfield/rimfield/geom"
	"github.com/rimfield/rimfield/mesh"
	"gonum.org/v1/gonum/mat"
	"gonum.org/v1/gonum/spatial/r2"
)

// System is an assembled and factorised boundary element system; it solves
// any number of right-hand sides (Data) for the same mesh and condition kinds.
type System struct {
	pr       *problem
	as       *assembled
	lu       mat.LU
	cond     float64
	warnings []string
	method   Method
	fast     *fastSolver // the fast solver (Method Fast), else nil
	timeMu   sync.Mutex
	timing   Timing
}

// SingularError reports a system that cannot be solved: typically a part of
// a closed domain with no fixed potential to refer to.
type SingularError struct {
	Cond float64
}

func (e *SingularError) Error() string {
	return fmt.Sprintf("bem: the system is singular (condition estimate %.3g): some part of the domain has no fixed potential to refer to, or boundaries overlap; fix a potential on a boundary of every separate part", e.Cond)
}

// TooLargeError reports a system too large for the dense solver.
type TooLargeError struct {
	Unknowns, Max int
}

func (e *TooLargeError) Error() string {
	gb := 16 * float64(e.Unknowns) * float64(e.Unknowns) / 1e9
	return fmt.Sprintf("bem: %d unknowns are too many for the dense solver (about %.0f GB of memory; the limit is %d unknowns): use the fast solver, or ask for fewer panels", e.Unknowns, gb, e.Max)
}

// Assemble builds the system for the mesh and prepares it for solving:
// with the dense solver it assembles and factorises the matrix, with the
// fast one it builds the multipole trees, near blocks and preconditioner
// (Settings.Method).
func Assemble(m *mesh.Mesh, s *Settings) (*System, error) {
	if s == nil {
		s = &Settings{}
	}
	start := time.Now()
	pr, err := newProblem(m, s.Kutta...)
	if err != nil {
		return nil, err
	}
	limit := s.MaxUnknowns
	if limit == 0 {
		limit = 16000
	}
	method, err := pr.choose(s, limit)
	if err != nil {
		return nil, err
	}
	if method == Fast {
		return assembleFast(pr, s, start)
	}
	sys := &System{pr: pr, method: Dense}
	if sys.as, err = pr.assemble(s.Workers, s.Progress); err != nil {
		return nil, err
	}
	sys.lu.Factorize(sys.as.a)
	sys.cond = sys.lu.Cond()
	if math.IsInf(sys.cond, 0) || math.IsNaN(sys.cond) || sys.cond > 1e15 {
		return nil, &SingularError{Cond: sys.cond}
	}
	condLimit := s.CondLimit
	if condLimit == 0 {
		condLimit = 1e10
	}
	if sys.cond > condLimit {
		sys.warnings = append(sys.warnings, fmt.Sprintf(
			"the system is poorly conditioned (estimate %.3g): results may carry fewer digits; look for nearly touching boundaries or extreme panel sizes", sys.cond))
	}
	sys.timing.Setup = time.Since(start)
	return sys, nil
}

// Unknowns returns the number of unknowns of the system.
func (sys *System) Unknowns() int { return sys.pr.nUnk }

// Cond returns the estimated condition number of the scaled system.
func (sys *System) Cond() float64 { return sys.cond }

// values returns the owners' condition values and the right-hand side.
func (sys *System) rhs(d *Data) (*mat.VecDense, []geom.Condition, error) {
	lay := sys.pr.m.Layout
	conds := make([]geom.Condition, len(lay.Owners))
	for i, o := range lay.Owners {
		conds[i] = o.Cond
	}
	if d != nil && d.Owners != nil {
		if len(d.Owners) != len(conds) {
			return nil, nil, fmt.Errorf("bem: data has %d owner conditions, the mesh %d", len(d.Owners), len(conds))
		}
		for i, c := range d.Owners {
			if c.Kind != conds[i].Kind {
				return nil, nil, fmt.Errorf("bem: data changes the kind of %q's condition from %v to %v", lay.Owners[i].Name, conds[i].Kind, c.Kind)
			}
			conds[i] = c
		}
	}
	n := sys.pr.nUnk
	v := mat.NewVecDense(max(len(conds), 1), nil)
	for i, c := range conds {
		if c.Kind == geom.Potential || c.Kind == geom.Flux {
			v.SetVec(i, c.Value)
		}
	}
	b := mat.NewVecDense(n, nil)
	if sys.fast != nil {
		sys.fast.known(b.RawVector().Data, v.AtVec)
	} else {
		b.MulVec(sys.as.b, v)
	}
	b.ScaleVec(-1, b)
	var uniform r2.Vec
	if d != nil {
		uniform = d.Uniform
	}
	if err := sys.pr.checkUniform(uniform); err != nil {
		return nil, nil, err
	}
	for i, rw := range sys.pr.rows {
		switch rw.kind {
		case rowFloating:
			b.SetVec(i, b.AtVec(i)+rw.scale*conds[rw.owner].NetInflow)
		case rowCollocation:
			// The incident field of the unbounded part: see incident.
			if r := &sys.pr.parts[rw.region]; r.open && uniform != (r2.Vec{}) {
				x := sys.pr.m.Panels[r.sides[rw.side].panel].Mid()
				b.SetVec(i, b.AtVec(i)+rw.scale*r.incident(uniform, x))
			}
		case rowSheetFlux:
			// Its conormal derivative on a sheet's face (sheet.go), a
			// constant.
			if r := &sys.pr.parts[rw.region]; r.open && uniform != (r2.Vec{}) {
				w := r.conormal(sys.pr, &r.sides[rw.side])
				b.SetVec(i, b.AtVec(i)+rw.scale*r2.Dot(w, r.incidentGrad(uniform)))
			}
		}
	}
	return b, conds, nil
}

// Solve solves for the data (nil: the mesh's own conditions).
func (sys *System) Solve(d *Data) (*Solution, error) {
	start := time.Now()
	b, conds, err := sys.rhs(d)
	if err != nil {
		return nil, err
	}
	if sys.fast != nil {
		return sys.solveFast(d, b, conds, start)
	}
	var x mat.VecDense
	if err := sys.lu.SolveVecTo(&x, false, b); err != nil {
		return nil, fmt.Errorf("bem: solve: %v", err)
	}
	s := sys.solution(x.RawVector().Data, conds)
	if d != nil {
		s.Uniform = d.Uniform
	}
	s.Method = Dense
	s.Residual = denseResidual(sys.as.a, &x, b)
	sys.addSolve(time.Since(start))
	return s, nil
}

// solution unpacks the unknown vector.
func (sys *System) solution(x []float64, conds []geom.Condition) *Solution {
	pr := sys.pr
	m := pr.m
	np := len(m.Panels)
	s := &Solution{
		Mesh:     m,
		U:        make([]float64, np),
		F:        make([]float64, np),
		Floating: make([]float64, len(conds)),
		Const:    make([]float64, len(pr.regions)),
		Cond:     sys.cond,
		Warnings: append([]string(nil), sys.warnings...),
		pr:       pr,
	}
	known := func(sl slot) float64 {
		if sl.owner < 0 {
			return 0
		}
		return conds[sl.owner].Value
	}
	for j := range m.Panels {
		if c := pr.uSlot[j].col; c >= 0 {
			s.U[j] = x[c]
		} else {
			s.U[j] = known(pr.uSlot[j])
		}
		if c := pr.fSlot[j].col; c >= 0 {
			s.F[j] = x[c] * pr.fScale[j]
		} else {
			s.F[j] = known(pr.fSlot[j])
		}
	}
	for o := range s.Floating {
		s.Floating[o] = math.NaN()
		if c := pr.floatCol[o]; c >= 0 {
			s.Floating[o] = x[c]
		}
	}
	s.partConst = make([]float64, len(pr.parts))
	for i, r := range pr.parts {
		if r.constCol >= 0 {
			s.partConst[i] = x[r.constCol]
		}
	}
	// Per layout region: the unbounded part's constant (the potential at
	// infinity) where there is one, else the largest residual of its parts.
	for i, r := range pr.parts {
		c := s.partConst[i]
		if r.open || (!pr.regions[r.reg].open && math.Abs(c) > math.Abs(s.Const[r.reg])) {
			s.Const[r.reg] = c
		}
	}
	s.computeSlopes()
	return s
}

// Solve assembles and solves the mesh with its own conditions.
func Solve(m *mesh.Mesh, s *Settings) (*Solution, error) {
	sys, err := Assemble(m, s)
	if err != nil {
		return nil, err
	}
	return sys.Solve(nil)
}

// SolveMany solves several right-hand sides with one factorisation.
func (sys *System) SolveMany(ds []Data) ([]*Solution, error) {
	out := make([]*Solution, len(ds))
	for i := range ds {
		s, err := sys.Solve(&ds[i])
		if err != nil {
			return nil, err
		}
		out[i] = s
	}
	return out, nil
}
