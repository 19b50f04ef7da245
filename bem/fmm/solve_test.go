package fmm

import (
	"math"
	"testing"

	"github.com/rimfield/rimfield/bem/krylov"
	"gonum.org/v1/gonum/mat"
	"gonum.org/v1/gonum/spatial/r2"
)

// The use the package is built for: a second-kind boundary integral
// equation solved by GMRES over the fast product plus a stored near block.
// Interior Dirichlet problem on a smooth curve with the double layer
// u = int mu dG/dn_y ds: its interior limit gives
//
//	-mu(x)/2 + int mu dG/dn_y ds = f(x)  on the boundary
//
// (the jump relation of the double layer; e.g. Kress, Linear Integral
// Equations, 3rd ed., 2014, Theorem 6.18, with G = -(1/2 pi) ln r and the
// outward normal), discretised with constant densities on straight panels
// and collocation at the midpoints, where the self term is the principal
// value 0.

// curve is the counter-clockwise closed curve r = 1 + 0.25 cos 3t as n
// panels (the outward normal is each panel's right normal).
func curve(n int) []Panel {
	pt := func(k int) r2.Vec {
		t := 2 * math.Pi * float64(k) / float64(n)
		r := 1 + 0.25*math.Cos(3*t)
		return r2.Vec{X: r * math.Cos(t), Y: r * math.Sin(t)}
	}
	ps := make([]Panel, n)
	for k := range ps {
		ps[k] = Panel{A: pt(k), B: pt(k + 1)}
	}
	return ps
}

// harmonic is the exact solution: u = e^x cos y.
func harmonic(x r2.Vec) float64 { return math.Exp(x.X) * math.Cos(x.Y) }

// fastOperator is -I/2 + K with K = far product + near block.
type fastOperator struct {
	tr  *Tree
	blk *Block
}

func (o *fastOperator) Dim() int { return o.tr.Targets() }

func (o *fastOperator) Apply(dst, x []float64) {
	d := Density{Double: x}
	o.tr.Apply(dst, nil, d)
	o.blk.AddTo(dst, d)
	for i := range dst {
		dst[i] -= 0.5 * x[i]
	}
}

func midpoints(ps []Panel) []r2.Vec {
	ts := make([]r2.Vec, len(ps))
	for j, p := range ps {
		ts[j] = r2.Scale(0.5, r2.Add(p.A, p.B))
	}
	return ts
}

func fastSystem(t *testing.T, ps []Panel, tol float64) *fastOperator {
	ts := midpoints(ps)
	tr, err := New(ps, nil, ts, &Options{Tol: tol})
	if err != nil {
		t.Fatal(err)
	}
	blk := tr.NewBlock(false, true, func(i int, panels []int32, _, double []float64) {
		for k, j := range panels {
			if int(j) == i {
				double[k] = 0 // principal value at the panel's own midpoint
				continue
			}
			_, dl, _, _ := closedPanel(ts[i], ps[j])
			double[k] = dl
		}
	})
	return &fastOperator{tr: tr, blk: blk}
}

// TestSolveFastAgreesWithDense: the same system solved by GMRES over the
// fast operator and over the dense matrix of closed forms gives the same
// density (to the product's precision), and the potential inside matches
// e^x cos y.
func TestSolveFastAgreesWithDense(t *testing.T) {
	const n = 1000
	ps := curve(n)
	ts := midpoints(ps)
	f := make([]float64, n)
	for i, x := range ts {
		f[i] = harmonic(x)
	}
	a := mat.NewDense(n, n, nil)
	for i, x := range ts {
		for j, p := range ps {
			if i != j {
				_, dl, _, _ := closedPanel(x, p)
				a.Set(i, j, dl)
			}
		}
		a.Set(i, i, a.At(i, i)-0.5)
	}
	dense := make([]float64, n)
	rd, err := krylov.GMRES(krylov.NewDense(a), dense, f, &krylov.Settings{Tol: 1e-12})
	if err != nil {
		t.Fatal(err)
	}
	for _, tol := range []float64{1e-6, 1e-10} {
		op := fastSystem(t, ps, tol)
		mu := make([]float64, n)
		rf, err := krylov.GMRES(op, mu, f, &krylov.Settings{Tol: 1e-12})
		if err != nil {
			t.Fatal(err)
		}
		var dmax, mmax float64
		for i := range mu {
			dmax = math.Max(dmax, math.Abs(mu[i]-dense[i]))
			mmax = math.Max(mmax, math.Abs(dense[i]))
		}
		// The operator is well conditioned (second kind): the densities
		// differ by about the product's error. Observed 2.6e-10 at Tol 1e-6
		// and 1.3e-14 at 1e-10 (relative); required Tol/10.
		t.Logf("tol %g: %d iterations (dense %d), density difference %.2e relative", tol, rf.Iterations, rd.Iterations, dmax/mmax)
		if dmax > 0.1*tol*mmax {
			t.Errorf("tol %g: fast and dense densities differ by %.3g (relative %.3g)", tol, dmax, dmax/mmax)
		}
		if rf.Iterations > rd.Iterations+1 {
			t.Errorf("tol %g: %d iterations, dense %d", tol, rf.Iterations, rd.Iterations)
		}
	}
}

// TestSolveRefinement: over a refinement sequence the iteration count of the
// fast solve stays bounded (second kind) and the interior potential
// converges to e^x cos y at the order of the midpoint rule, h^2 (constant
// elements with midpoint collocation on a smooth curve; observed ratio 4.0
// per halving, required 3 to 5).
func TestSolveRefinement(t *testing.T) {
	probes := []r2.Vec{{X: 0.2, Y: 0.1}, {X: -0.5, Y: 0.4}, {X: 0.6, Y: -0.3}}
	var iters []int
	var errs []float64
	for _, n := range []int{500, 1000, 2000, 4000} {
		ps := curve(n)
		op := fastSystem(t, ps, 1e-10)
		f := make([]float64, n)
		for i, x := range midpoints(ps) {
			f[i] = harmonic(x)
		}
		mu := make([]float64, n)
		res, err := krylov.GMRES(op, mu, f, &krylov.Settings{Tol: 1e-12})
		if err != nil {
			t.Fatal(err)
		}
		iters = append(iters, res.Iterations)
		pr, err := New(ps, nil, probes, &Options{Tol: 1e-10})
		if err != nil {
			t.Fatal(err)
		}
		u := make([]float64, len(probes))
		pr.Eval(u, nil, Density{Double: mu}, func(i, j int, _ bool) (float64, float64, r2.Vec, r2.Vec) {
			return closedPanel(probes[i], ps[j])
		})
		e := 0.0
		for k, x := range probes {
			e = math.Max(e, math.Abs(u[k]-harmonic(x)))
		}
		errs = append(errs, e)
	}
	t.Logf("iterations %v, interior errors %.2e", iters, errs)
	for k := 1; k < len(errs); k++ {
		if r := errs[k-1] / errs[k]; r < 3 || r > 5 {
			t.Errorf("error ratio %.2f from %d to %d panels, want about 4", r, 500<<(k-1), 500<<k)
		}
		// Observed the same count at every size; allowed +-2.
		if d := iters[k] - iters[0]; d > 2 || d < -2 {
			t.Errorf("iterations %v grow with the panel count", iters)
		}
	}
}
