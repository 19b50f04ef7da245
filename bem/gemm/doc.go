// Package gemm makes gonum's dense matrix product, and with it the LU
// factorisation of the dense solver, several times faster on amd64
// processors with AVX2 and FMA.
//
// Install replaces gonum's BLAS implementation (blas64.Use) with one that
// is gonum's in everything but Dgemm without transposes, the product that
// dominates a blocked LU (the rank-64 updates of gonum's Dgetrf). That
// product follows the layered scheme of Goto and van de Geijn (Anatomy of
// high-performance matrix multiplication, ACM TOMS 34(3), 2008): blocks of
// B packed for the last-level cache, blocks of A packed for the second,
// and a 4 x 8 register kernel in assembly that keeps eight accumulators of
// four doubles in flight through fused multiply-adds. Row blocks are shared
// among the cores.
//
// Elsewhere (other architectures, processors without AVX2 and FMA, small or
// transposed products) gonum's own code runs, so results are the same to
// rounding everywhere; the kernel's sums differ from gonum's only in the
// order of the additions (TestDgemm).
package gemm
