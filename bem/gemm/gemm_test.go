package gemm

import (
	"fmt"
	"math"
	"math/rand/v2"
	"testing"

	"gonum.org/v1/gonum/blas"
	"gonum.org/v1/gonum/blas/blas64"
	"gonum.org/v1/gonum/blas/gonum"
	"gonum.org/v1/gonum/mat"
)

// TestDgemm checks the product against gonum's reference Dgemm (a
// general-purpose library outside the project) on shapes that exercise
// every edge: partial register tiles, several A and B blocks, strided
// operands and each kind of beta.
func TestDgemm(t *testing.T) {
	if !Supported() {
		t.Skip("no AVX2 and FMA: gonum's own product runs")
	}
	rng := rand.New(rand.NewPCG(1, 2))
	shapes := [][3]int{{33, 33, 33}, {37, 41, 43}, {128, 8, 64}, {129, 9, 65}, {300, 2100, 64}, {5, 700, 300}, {700, 5, 300}, {257, 263, 513}, {64, 2050, 257}}
	for _, sh := range shapes {
		for _, beta := range []float64{0, 1, -0.5} {
			m, n, k := sh[0], sh[1], sh[2]
			lda, ldb, ldc := k+3, n+1, n+5
			a := random(rng, (m-1)*lda+k)
			b := random(rng, (k-1)*ldb+n)
			c := random(rng, (m-1)*ldc+n)
			want := append([]float64(nil), c...)
			got := append([]float64(nil), c...)
			alpha := -1.25
			gonum.Implementation{}.Dgemm(blas.NoTrans, blas.NoTrans, m, n, k, alpha, a, lda, b, ldb, beta, want, ldc)
			Implementation{}.Dgemm(blas.NoTrans, blas.NoTrans, m, n, k, alpha, a, lda, b, ldb, beta, got, ldc)
			worst := 0.0
			for i := range got {
				worst = math.Max(worst, math.Abs(got[i]-want[i]))
			}
			// Sums of k products of numbers in [-1, 1]: rounding of order
			// k eps.
			if tol := float64(k) * 1e-15; worst > tol {
				t.Errorf("m=%d n=%d k=%d beta=%g: largest difference %.3g, want below %.3g", m, n, k, beta, worst, tol)
			}
			// The padding between rows of C is untouched.
			for i := 0; i+1 < m; i++ {
				for j := n; j < ldc; j++ {
					if got[i*ldc+j] != c[i*ldc+j] {
						t.Fatalf("m=%d n=%d k=%d: C[%d] beyond the row written", m, n, k, i*ldc+j)
					}
				}
			}
		}
	}
}

// TestLU checks that gonum's LU with the fast product solves a random
// system as accurately as with its own.
func TestLU(t *testing.T) {
	if !Supported() {
		t.Skip("no AVX2 and FMA")
	}
	Install()
	rng := rand.New(rand.NewPCG(3, 4))
	n := 700
	a := mat.NewDense(n, n, random(rng, n*n))
	for i := range n {
		a.Set(i, i, a.At(i, i)+float64(n)/4)
	}
	x := mat.NewVecDense(n, random(rng, n))
	var b mat.VecDense
	b.MulVec(a, x)
	var lu mat.LU
	lu.Factorize(a)
	var got mat.VecDense
	if err := lu.SolveVecTo(&got, false, &b); err != nil {
		t.Fatal(err)
	}
	got.SubVec(&got, x)
	if e := mat.Norm(&got, math.Inf(1)); e > 1e-12 {
		t.Errorf("LU solve error %.3g, want below 1e-12", e)
	}
}

func random(rng *rand.Rand, n int) []float64 {
	v := make([]float64, n)
	for i := range v {
		v[i] = 2*rng.Float64() - 1
	}
	return v
}

// BenchmarkDgemm measures the rank-64 update of a blocked LU, the product
// that matters to the dense solver, against gonum's own.
func BenchmarkDgemm(b *testing.B) {
	rng := rand.New(rand.NewPCG(5, 6))
	for _, n := range []int{1000, 2000, 4000} {
		k := 64
		a, bb, c := random(rng, n*k), random(rng, k*n), random(rng, n*n)
		for _, im := range []struct {
			name string
			f    func(tA, tB blas.Transpose, m, n, k int, alpha float64, a []float64, lda int, b []float64, ldb int, beta float64, c []float64, ldc int)
		}{{"gonum", gonum.Implementation{}.Dgemm}, {"fast", Implementation{}.Dgemm}} {
			b.Run(fmt.Sprintf("impl=%s/n=%d", im.name, n), func(b *testing.B) {
				for range b.N {
					im.f(blas.NoTrans, blas.NoTrans, n, n, k, -1, a, k, bb, n, 1, c, n)
				}
				b.ReportMetric(2*float64(n)*float64(n)*float64(k)*float64(b.N)/b.Elapsed().Seconds()/1e9, "GFLOP/s")
			})
		}
	}
}

// BenchmarkLU measures gonum's LU factorisation with its own product and
// with the fast one.
func BenchmarkLU(b *testing.B) {
	rng := rand.New(rand.NewPCG(7, 8))
	for _, n := range []int{1000, 2000, 4000} {
		a := mat.NewDense(n, n, random(rng, n*n))
		for _, fast := range []bool{false, true} {
			b.Run(fmt.Sprintf("fast=%v/n=%d", fast, n), func(b *testing.B) {
				if fast {
					Install()
				}
				if !fast && installed() {
					b.Skip("the fast product is installed for the process: run this one alone")
				}
				var lu mat.LU
				for range b.N {
					lu.Factorize(a)
				}
				b.ReportMetric(2.0/3*float64(n)*float64(n)*float64(n)*float64(b.N)/b.Elapsed().Seconds()/1e9, "GFLOP/s")
			})
		}
	}
}

func installed() bool {
	_, ok := blas64.Implementation().(Implementation)
	return ok
}
