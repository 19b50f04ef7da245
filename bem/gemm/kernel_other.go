//go:build !amd64 || purego

package gemm

// haveKernel is false: gonum's own product runs.
const haveKernel = false

// kernel is the register kernel in Go, for the build only: Dgemm never
// calls it without haveKernel.
func kernel(k int, a, b, c *float64, ldc int, alpha float64) {
	panic("gemm: no kernel on this platform")
}
