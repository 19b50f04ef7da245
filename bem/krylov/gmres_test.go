package krylov

import (
	"errors"
	"math"
	"math/rand/v2"
	"strings"
	"testing"

	"gonum.org/v1/gonum/floats"
	"gonum.org/v1/gonum/mat"
)

// randomSystem is A = I + (c / sqrt n) R with R standard normal: by the
// circular law (Girko 1984; Bai, Ann. Probab. 25, 1997) its eigenvalues fill
// the disc |z - 1| <= c for large n, so for c = 0.5 it is well conditioned
// and GMRES contracts the residual by about c per step.
func randomSystem(rng *rand.Rand, n int, c float64) (*mat.Dense, []float64) {
	a := mat.NewDense(n, n, nil)
	for i := range n {
		for j := range n {
			v := c / math.Sqrt(float64(n)) * rng.NormFloat64()
			if i == j {
				v++
			}
			a.Set(i, j, v)
		}
	}
	b := make([]float64, n)
	for i := range b {
		b[i] = rng.NormFloat64()
	}
	return a, b
}

// luSolve is the reference: gonum's LU factorisation.
func luSolve(t *testing.T, a *mat.Dense, b []float64) []float64 {
	t.Helper()
	var lu mat.LU
	lu.Factorize(a)
	x := mat.NewVecDense(len(b), nil)
	if err := lu.SolveVecTo(x, false, mat.NewVecDense(len(b), b)); err != nil {
		t.Fatal(err)
	}
	return x.RawVector().Data
}

func relDiff(x, y []float64) float64 {
	d := make([]float64, len(x))
	floats.SubTo(d, x, y)
	return floats.Norm(d, 2) / floats.Norm(y, 2)
}

func trueResidual(a *mat.Dense, x, b []float64) float64 {
	r := make([]float64, len(b))
	NewDense(a).Apply(r, x)
	floats.Sub(r, b)
	return floats.Norm(r, 2) / floats.Norm(b, 2)
}

// TestAgainstLU: random well-conditioned systems, unrestarted and restarted,
// against gonum's LU solve.
func TestAgainstLU(t *testing.T) {
	rng := rand.New(rand.NewPCG(1, 1))
	for _, n := range []int{50, 300} {
		a, b := randomSystem(rng, n, 0.5)
		want := luSolve(t, a, b)
		for _, m := range []int{0, 10} {
			x := make([]float64, n)
			res, err := GMRES(NewDense(a), x, b, &Settings{Tol: 1e-12, Restart: m})
			if err != nil {
				t.Fatalf("n=%d m=%d: %v", n, m, err)
			}
			// The condition number is about (1+c)/(1-c) = 3 (circular
			// law); forward error <= cond * residual = 3e-12; observed
			// 1.2e-12, allowed 1e-11.
			if d := relDiff(x, want); d > 1e-11 {
				t.Errorf("n=%d m=%d: GMRES and LU differ by %.2e", n, m, d)
			}
			if r := trueResidual(a, x, b); r > 1e-12 || math.Abs(r-res.Residual) > 1e-14 {
				t.Errorf("n=%d m=%d: residual %.2e, reported %.2e", n, m, r, res.Residual)
			}
			// Contraction about c = 0.5 per step: 40 steps for 1e-12;
			// observed 30-38 unrestarted, 33-38 with m = 10; allowed 50.
			if res.Iterations > 50 {
				t.Errorf("n=%d m=%d: %d iterations", n, m, res.Iterations)
			}
			t.Logf("n=%d m=%d: %d iterations, %d restarts, residual %.2e", n, m, res.Iterations, res.Restarts, res.Residual)
		}
	}
}

// ellipse is the Nystrom discretisation (trapezoidal rule, n nodes) of the
// double-layer operator K of G = -(1/2 pi) ln r on the ellipse
// x = (a cos t, b sin t):
//
//	(K mu)(x) = int mu(y) dG/dn_y ds_y,  kernel (1/2 pi) n_y.(x - y)/|x - y|^2,
//
// with the limit -kappa/(4 pi) on the diagonal (kappa the curvature). The
// kernel is smooth, so the rule converges exponentially (Kress, Linear
// Integral Equations, 3rd ed., 2014, sec. 12.3).
func ellipse(n int, a, b float64) *mat.Dense {
	k := mat.NewDense(n, n, nil)
	h := 2 * math.Pi / float64(n)
	xs, ys, nx, ny, w, kap := make([]float64, n), make([]float64, n), make([]float64, n), make([]float64, n), make([]float64, n), make([]float64, n)
	for j := range n {
		t := h * float64(j)
		xs[j], ys[j] = a*math.Cos(t), b*math.Sin(t)
		sp := math.Hypot(a*math.Sin(t), b*math.Cos(t))
		nx[j], ny[j] = b*math.Cos(t)/sp, a*math.Sin(t)/sp
		w[j] = h * sp
		kap[j] = a * b / (sp * sp * sp)
	}
	for i := range n {
		for j := range n {
			if i == j {
				k.Set(i, j, -kap[i]/(4*math.Pi)*w[j])
				continue
			}
			dx, dy := xs[i]-xs[j], ys[i]-ys[j]
			k.Set(i, j, (nx[j]*dx+ny[j]*dy)/(dx*dx+dy*dy)/(2*math.Pi)*w[j])
		}
	}
	return k
}

// secondKind returns I/2 + s K for the ellipse (s = -1: the interior
// Dirichlet operator, invertible; s = +1: the exterior one, singular with
// the constants as null space, since K 1 = -1/2 on the boundary by Gauss's
// integral).
func secondKind(n int, s float64) *mat.Dense {
	k := ellipse(n, 2, 1)
	a := mat.NewDense(n, n, nil)
	a.Scale(s, k)
	for i := range n {
		a.Set(i, i, a.At(i, i)+0.5)
	}
	return a
}

// TestSecondKindBoundedIterations: I/2 - K on an ellipse with semi-axes 2
// and 1. The eigenvalues of K there are -1/2 (constants) and
// +-(1/2) q^m, q = (a-b)/(a+b) = 1/3, m >= 1 (Neumann's classical result;
// e.g. Ando & Kang, J. Math. Anal. Appl. 435, 2016, from memory): those of
// the system cluster at 1/2 geometrically, so GMRES converges
// superlinearly in a number of steps that does not grow with n.
func TestSecondKindBoundedIterations(t *testing.T) {
	rng := rand.New(rand.NewPCG(2, 1))
	var counts []int
	for _, n := range []int{64, 128, 256, 512} {
		a := secondKind(n, -1)
		b := make([]float64, n)
		for i := range b {
			th := 2 * math.Pi * float64(i) / float64(n)
			b[i] = math.Cos(3*th) + 0.3*rng.NormFloat64()
		}
		x := make([]float64, n)
		res, err := GMRES(NewDense(a), x, b, &Settings{Tol: 1e-10})
		if err != nil {
			t.Fatalf("n=%d: %v", n, err)
		}
		want := luSolve(t, a, b)
		// Condition number about 2 (eigenvalues in [1/3, 1]): forward error
		// at most cond * Tol = 2e-10, the requirement; observed 6e-12.
		if d := relDiff(x, want); d > 2e-10 {
			t.Errorf("n=%d: GMRES and LU differ by %.2e", n, d)
		}
		counts = append(counts, res.Iterations)
	}
	t.Logf("iterations for n = 64..512: %v", counts)
	// Observed 9 for every n (the random part of b excites all the
	// eigenvalues); allowed 15 and a spread of 2.
	lo, hi := counts[0], counts[0]
	for _, c := range counts {
		lo, hi = min(lo, c), max(hi, c)
	}
	if hi > 15 || hi-lo > 2 {
		t.Errorf("iterations %v: not bounded independently of n", counts)
	}
}

// TestRestarts: the same system with several restart lengths reaches the
// tolerance; unrestarted GMRES's residual never grows (it minimises over
// nested spaces, Saad & Schultz 1986), and it never needs more iterations
// than a restarted one.
func TestRestarts(t *testing.T) {
	rng := rand.New(rand.NewPCG(3, 1))
	a, b := randomSystem(rng, 120, 0.8)
	want := luSolve(t, a, b)
	full := 0
	for _, m := range []int{120, 30, 8, 3} {
		x := make([]float64, len(b))
		var hist []float64
		res, err := GMRES(NewDense(a), x, b, &Settings{Tol: 1e-10, Restart: m,
			Progress: func(_ int, r float64) { hist = append(hist, r) }})
		if err != nil {
			t.Fatalf("m=%d: %v", m, err)
		}
		// Condition number about 9 at c = 0.8: forward error at most
		// 9e-10; observed 1.4e-10, allowed 1e-9.
		if d := relDiff(x, want); d > 1e-9 {
			t.Errorf("m=%d: differs from LU by %.2e", m, d)
		}
		if len(hist) != res.Iterations {
			t.Errorf("m=%d: %d progress calls for %d iterations", m, len(hist), res.Iterations)
		}
		if wantRestarts := (res.Iterations - 1) / m; res.Restarts != wantRestarts {
			t.Errorf("m=%d: %d restarts for %d iterations", m, res.Restarts, res.Iterations)
		}
		if m == 120 {
			full = res.Iterations
			for i := 1; i < len(hist); i++ {
				if hist[i] > hist[i-1]*(1+1e-12) {
					t.Errorf("unrestarted residual grows at step %d: %g -> %g", i, hist[i-1], hist[i])
				}
			}
		} else if res.Iterations < full {
			t.Errorf("GMRES(%d) took %d iterations, fewer than unrestarted (%d)", m, res.Iterations, full)
		}
		t.Logf("m=%d: %d iterations", m, res.Iterations)
	}
	// Finite termination: on R^n GMRES without restarts finishes in at most
	// n steps (exactly, Saad & Schultz 1986, Proposition 2); a matrix whose
	// eigenvalues spread over [1, 1e3] needs them all.
	n := 25
	d := mat.NewDense(n, n, nil)
	q := randomOrthogonal(rng, n)
	for i := range n {
		d.Set(i, i, math.Pow(1e3, float64(i)/float64(n-1)))
	}
	var qd, aa mat.Dense
	qd.Mul(q, d)
	aa.Mul(&qd, q.T())
	bb := make([]float64, n)
	for i := range bb {
		bb[i] = 1
	}
	x := make([]float64, n)
	res, err := GMRES(NewDense(&aa), x, bb, &Settings{Tol: 1e-11})
	if err != nil {
		t.Fatal(err)
	}
	// At step n the residual is rounding; observed n steps, allowed n + 1.
	if res.Iterations > n+1 {
		t.Errorf("%d iterations on a system of order %d", res.Iterations, n)
	}
}

func randomOrthogonal(rng *rand.Rand, n int) *mat.Dense {
	g := mat.NewDense(n, n, nil)
	for i := range n {
		for j := range n {
			g.Set(i, j, rng.NormFloat64())
		}
	}
	var qr mat.QR
	qr.Factorize(g)
	var q mat.Dense
	qr.QTo(&q)
	return &q
}

// TestZeroRightHandSide: b = 0 gives x = 0 at once, whatever the guess.
func TestZeroRightHandSide(t *testing.T) {
	a, _ := randomSystem(rand.New(rand.NewPCG(4, 1)), 10, 0.5)
	x := []float64{1, 2, 3, 4, 5, 6, 7, 8, 9, 10}
	res, err := GMRES(NewDense(a), x, make([]float64, 10), nil)
	if err != nil || res.Iterations != 0 || res.Residual != 0 {
		t.Fatalf("zero b: %+v, %v", res, err)
	}
	for _, v := range x {
		if v != 0 {
			t.Fatalf("zero b gives x = %v", x)
		}
	}
}

// TestInitialGuess: starting from the solution costs no iteration.
func TestInitialGuess(t *testing.T) {
	rng := rand.New(rand.NewPCG(5, 1))
	a, b := randomSystem(rng, 40, 0.5)
	x := luSolve(t, a, b)
	res, err := GMRES(NewDense(a), x, b, &Settings{Tol: 1e-10})
	if err != nil || res.Iterations != 0 {
		t.Fatalf("exact guess: %+v, %v", res, err)
	}
}

// TestNotConverged: cases that cannot meet the tolerance return the typed
// error promptly instead of looping.
func TestNotConverged(t *testing.T) {
	rng := rand.New(rand.NewPCG(6, 1))
	a, b := randomSystem(rng, 60, 0.5)
	ones := func(n int) []float64 {
		v := make([]float64, n)
		for i := range v {
			v[i] = 1
		}
		return v
	}
	cases := []struct {
		name   string
		a      *mat.Dense
		b      []float64
		s      *Settings
		reason Reason
		maxIt  int
	}{
		// Too few iterations for 1e-12 (needs about 35, see TestAgainstLU).
		{"limit", a, b, &Settings{Tol: 1e-12, MaxIter: 5}, IterationLimit, 5},
		// A skew-symmetric matrix has r.Ar = 0: GMRES(1) cannot reduce the
		// residual at all (Embree, The tortoise and the hare restart GMRES,
		// SIAM Review 45, 2003, from memory).
		{"skew", mat.NewDense(2, 2, []float64{0, 1, -1, 0}), []float64{1, 0}, &Settings{Restart: 1}, Stagnation, 5},
		// The zero operator: the Krylov space is invariant at once.
		{"zero", mat.NewDense(5, 5, nil), ones(5), nil, Breakdown, 5},
		// The exterior Dirichlet operator I/2 + K is singular (constants in
		// its null space; the Nystrom matrix up to its 1e-10 or so
		// quadrature error) and b = 1 is that null vector: the estimates
		// fall, the true residual does not.
		{"nearly singular", secondKind(64, 1), ones(64), &Settings{Tol: 1e-10, Restart: 20}, 0, 200},
		// Q diag(1, 2, 3, 4, 0) Q^T and b = Q (1, 1, 1, 1, 1): the best
		// residual is the null component, 1/sqrt(5) of b, reached in 4
		// steps; the fifth finds the zero pivot, one more after the restart
		// finds nothing new.
		{"singular", singular5(rng), []float64{}, nil, Breakdown, 6},
	}
	q5 := singularQ
	cases[len(cases)-1].b = make([]float64, 5)
	for i := range 5 {
		for j := range 5 {
			cases[len(cases)-1].b[i] += q5.At(i, j)
		}
	}
	for _, c := range cases {
		x := make([]float64, len(c.b))
		res, err := GMRES(NewDense(c.a), x, c.b, c.s)
		var nc *NotConvergedError
		if !errors.As(err, &nc) {
			t.Errorf("%s: want a *NotConvergedError, got %v", c.name, err)
			continue
		}
		if c.reason != 0 && nc.Reason != c.reason {
			t.Errorf("%s: reason %v, want %v", c.name, nc.Reason, c.reason)
		}
		if res.Iterations > c.maxIt || nc.Iterations != res.Iterations || !strings.HasPrefix(err.Error(), "krylov: ") {
			t.Errorf("%s: %d iterations, error %v", c.name, res.Iterations, err)
		}
		// x is the best iterate: never worse than the start (x = 0).
		if r := trueResidual(c.a, x, c.b); math.Abs(r-res.Residual) > 1e-12 || res.Residual <= 1e-10 || res.Residual > 1 {
			t.Errorf("%s: reported residual %g, true %g", c.name, res.Residual, r)
		}
		if c.name == "singular" && math.Abs(res.Residual-1/math.Sqrt(5)) > 1e-12 {
			t.Errorf("singular: residual %.15g, least-squares minimum %.15g", res.Residual, 1/math.Sqrt(5))
		}
		t.Logf("%s: %v", c.name, err)
	}
}

var singularQ *mat.Dense

// singular5 returns Q diag(1, 2, 3, 4, 0) Q^T for a random orthogonal Q
// (kept in singularQ).
func singular5(rng *rand.Rand) *mat.Dense {
	q := randomOrthogonal(rng, 5)
	singularQ = q
	d := mat.NewDiagDense(5, []float64{1, 2, 3, 4, 0})
	var qd, a mat.Dense
	qd.Mul(q, d)
	a.Mul(&qd, q.T())
	return &a
}

// TestPreconditioners: a system with rows scaled over six decades converges
// slowly as it stands; Jacobi from the left or the right fixes it, and the
// tolerance still holds for the true residual.
func TestPreconditioners(t *testing.T) {
	rng := rand.New(rand.NewPCG(7, 1))
	n := 200
	a0, b := randomSystem(rng, n, 0.5)
	scale := make([]float64, n)
	inv := make(Diagonal, n)
	a := mat.NewDense(n, n, nil)
	for i := range n {
		scale[i] = math.Pow(10, 6*rng.Float64())
		for j := range n {
			a.Set(i, j, scale[i]*a0.At(i, j))
		}
		b[i] *= scale[i]
		inv[i] = 1 / a.At(i, i)
	}
	want := luSolve(t, a, b)
	plain := make([]float64, n)
	resPlain, _ := GMRES(NewDense(a), plain, b, &Settings{Tol: 1e-10, MaxIter: 400, Restart: 400})
	for _, side := range []string{"left", "right"} {
		s := &Settings{Tol: 1e-10}
		if side == "left" {
			s.Left = inv
		} else {
			s.Right = inv
		}
		x := make([]float64, n)
		res, err := GMRES(NewDense(a), x, b, s)
		if err != nil {
			t.Fatalf("%s: %v", side, err)
		}
		if r := trueResidual(a, x, b); r > 1e-10 {
			t.Errorf("%s: true residual %.2e above the tolerance", side, r)
		}
		// The preconditioned system is the well-conditioned a0 (up to the
		// diagonal), condition about 3: forward error ~3e-10; observed
		// 5.9e-10 (right) and 7e-11 (left), allowed 1e-8.
		if d := relDiff(x, want); d > 1e-8 {
			t.Errorf("%s: differs from LU by %.2e", side, d)
		}
		if res.Iterations >= resPlain.Iterations {
			t.Errorf("%s: %d iterations, %d without preconditioner", side, res.Iterations, resPlain.Iterations)
		}
		t.Logf("%s: %d iterations (%d without)", side, res.Iterations, resPlain.Iterations)
	}
}

// TestBadSettings: settings out of range get one clear error.
func TestBadSettings(t *testing.T) {
	a, b := randomSystem(rand.New(rand.NewPCG(8, 1)), 4, 0.5)
	for _, s := range []*Settings{{Tol: 1}, {Tol: -1e-3}, {Tol: math.NaN()}, {Restart: -1}, {MaxIter: -5}} {
		if _, err := GMRES(NewDense(a), make([]float64, 4), b, s); err == nil || !strings.HasPrefix(err.Error(), "krylov: Settings.") {
			t.Errorf("settings %+v: want an error, got %v", *s, err)
		}
	}
}
