//go:build amd64 && !purego

package gemm

// kernel adds alpha times the packed k x mr strip of A (a) times the
// packed k x nr strip of B (b) to the mr x nr block of C at c, whose rows
// are ldc elements apart. In kernel_amd64.s; it needs AVX2 and FMA.
//
//go:noescape
func kernel(k int, a, b, c *float64, ldc int, alpha float64)

// cpuid and xgetbv are the processor's instructions of those names.
func cpuid(leaf, sub uint32) (eax, ebx, ecx, edx uint32)
func xgetbv() (eax, edx uint32)

var haveKernel = detect()

// detect reports whether the processor has AVX2 and FMA and the operating
// system saves the 256-bit registers (Intel 64 and IA-32 Architectures
// Software Developer's Manual, vol. 1, 14.3, "Detection of Intel AVX
// instructions").
func detect() bool {
	maxLeaf, _, _, _ := cpuid(0, 0)
	if maxLeaf < 7 {
		return false
	}
	_, _, ecx1, _ := cpuid(1, 0)
	const fma, osxsave, avx = 1 << 12, 1 << 27, 1 << 28
	if ecx1&(fma|osxsave|avx) != fma|osxsave|avx {
		return false
	}
	if xcr0, _ := xgetbv(); xcr0&6 != 6 { // XMM and YMM state enabled
		return false
	}
	_, ebx7, _, _ := cpuid(7, 0)
	const avx2 = 1 << 5
	return ebx7&avx2 != 0
}
