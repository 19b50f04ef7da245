package gemm

import (
	"runtime"
	"sync"
	"sync/atomic"

	"gonum.org/v1/gonum/blas"
	"gonum.org/v1/gonum/blas/blas64"
	"gonum.org/v1/gonum/blas/gonum"
)

// Block sizes: a register tile of mr x nr, A blocks of mc x kc (in the
// second-level cache) and B blocks of kc x nc (in the last-level one).
const (
	mr = 4
	nr = 8
	kc = 256
	mc = 128
	nc = 2048
)

// minFlops is the product size, m n k, below which gonum's own code is
// quicker than packing.
const minFlops = 32 * 32 * 32

var install sync.Once

// Install makes the fast product gonum's BLAS for the whole process, where
// the processor supports it; elsewhere it does nothing. It is safe to call
// more than once and from several goroutines.
func Install() {
	install.Do(func() {
		if Supported() {
			blas64.Use(Implementation{})
		}
	})
}

// Supported reports whether the fast kernel runs on this processor.
func Supported() bool { return haveKernel }

// Implementation is gonum's BLAS with the fast Dgemm.
type Implementation struct {
	gonum.Implementation
}

// Dgemm computes C = alpha A B + beta C (with A or B transposed as tA and
// tB say), A m x k, B k x n and C m x n, all row-major.
func (im Implementation) Dgemm(tA, tB blas.Transpose, m, n, k int, alpha float64, a []float64, lda int, b []float64, ldb int, beta float64, c []float64, ldc int) {
	if !haveKernel || tA != blas.NoTrans || tB != blas.NoTrans || m <= 0 || n <= 0 || k <= 0 || alpha == 0 ||
		m*n*k < minFlops || lda < k || ldb < n || ldc < n ||
		len(a) < (m-1)*lda+k || len(b) < (k-1)*ldb+n || len(c) < (m-1)*ldc+n {
		// gonum's code does these, and checks and reports bad arguments.
		im.Implementation.Dgemm(tA, tB, m, n, k, alpha, a, lda, b, ldb, beta, c, ldc)
		return
	}
	if beta != 1 {
		for i := range m {
			row := c[i*ldc : i*ldc+n]
			if beta == 0 {
				clear(row)
				continue
			}
			for j := range row {
				row[j] *= beta
			}
		}
	}
	product(m, n, k, alpha, a, lda, b, ldb, c, ldc)
}

// buffers are packing buffers reused between products, so that the large
// ones are not faulted in afresh each time.
var buffers = sync.Pool{New: func() any { return new([]float64) }}

func buffer(n int) *[]float64 {
	p := buffers.Get().(*[]float64)
	if cap(*p) < n {
		*p = make([]float64, n)
	}
	*p = (*p)[:n]
	return p
}

// product adds alpha A B to C.
func product(m, n, k int, alpha float64, a []float64, lda int, b []float64, ldb int, c []float64, ldc int) {
	workers := min(runtime.GOMAXPROCS(0), (m+mc-1)/mc)
	bp := buffer(kc * roundUp(min(n, nc), nr))
	defer buffers.Put(bp)
	aps := make([]*[]float64, workers)
	for w := range aps {
		aps[w] = buffer(mc * kc)
	}
	defer func() {
		for _, p := range aps {
			buffers.Put(p)
		}
	}()
	for jc := 0; jc < n; jc += nc {
		nb := min(nc, n-jc)
		for pc := 0; pc < k; pc += kc {
			kb := min(kc, k-pc)
			packB(*bp, b[pc*ldb+jc:], ldb, kb, nb)
			var next atomic.Int64
			run := func(ap []float64) {
				for {
					ic := int(next.Add(mc)) - mc
					if ic >= m {
						return
					}
					mb := min(mc, m-ic)
					packA(ap, a[ic*lda+pc:], lda, mb, kb)
					block(mb, nb, kb, alpha, ap, *bp, c[ic*ldc+jc:], ldc)
				}
			}
			if workers == 1 {
				run(*aps[0])
				continue
			}
			var wg sync.WaitGroup
			for w := 1; w < workers; w++ {
				wg.Add(1)
				go func() {
					defer wg.Done()
					run(*aps[w])
				}()
			}
			run(*aps[0])
			wg.Wait()
		}
	}
}

// block adds alpha times the packed mb x kb block of A times the packed
// kb x nb block of B to C.
func block(mb, nb, kb int, alpha float64, ap, bp []float64, c []float64, ldc int) {
	var edge [mr * nr]float64
	for jr := 0; jr < nb; jr += nr {
		bs := bp[jr*kb:]
		nn := min(nr, nb-jr)
		for ir := 0; ir < mb; ir += mr {
			as := ap[ir*kb:]
			mm := min(mr, mb-ir)
			if mm == mr && nn == nr {
				kernel(kb, &as[0], &bs[0], &c[ir*ldc+jr], ldc, alpha)
				continue
			}
			clear(edge[:])
			kernel(kb, &as[0], &bs[0], &edge[0], nr, alpha)
			for i := range mm {
				row := c[(ir+i)*ldc+jr:]
				for j := range nn {
					row[j] += edge[i*nr+j]
				}
			}
		}
	}
}

// packA copies the mb x kb block of A (stride lda) into strips of mr rows,
// each stored column after column (kb x mr), the last one padded with
// zeros.
func packA(dst, a []float64, lda, mb, kb int) {
	for ir := 0; ir < mb; ir += mr {
		s := dst[ir*kb : ir*kb+mr*kb]
		mm := min(mr, mb-ir)
		if mm < mr {
			clear(s)
		}
		for i := range mm {
			row := a[(ir+i)*lda : (ir+i)*lda+kb]
			for p, v := range row {
				s[p*mr+i] = v
			}
		}
	}
}

// packB copies the kb x nb block of B (stride ldb) into strips of nr
// columns, each stored row after row (kb x nr), the last one padded with
// zeros.
func packB(dst, b []float64, ldb, kb, nb int) {
	for jr := 0; jr < nb; jr += nr {
		s := dst[jr*kb : jr*kb+nr*kb]
		nn := min(nr, nb-jr)
		for p := range kb {
			row := b[p*ldb+jr : p*ldb+jr+nn]
			d := s[p*nr : p*nr+nr]
			copy(d, row)
			if nn < nr {
				clear(d[nn:])
			}
		}
	}
}

func roundUp(n, m int) int { return (n + m - 1) / m * m }
