package bem

import (
	"fmt"
	"testing"

	"gonum.org/v1/gonum/spatial/r2"
)

// sheetBenchMesh is an impervious plate of n panels (both faces) in the
// open plane: every row but the balance is a sheet's.
func sheetBenchMesh(n int) *builder {
	b := newBuilder(true)
	bg := b.region("background", 1, 1, true)
	o := b.owner("plate", flux(0))
	ts := make([]float64, n/2+1)
	for i := range ts {
		ts[i] = float64(i) / float64(n/2)
	}
	b.sheet(r2.Vec{}, r2.Vec{X: 1}, ts, bg, o, flux(0))
	return b
}

// BenchmarkAssembleSheet measures filling the matrix of a sheet: half the
// rows are conormal rows (the gradients of every panel's integrals), to
// compare per entry with BenchmarkAssemble.
func BenchmarkAssembleSheet(b *testing.B) {
	for _, n := range []int{500, 1000, 2000, 4000} {
		b.Run(fmt.Sprintf("panels=%d", n), func(b *testing.B) {
			pr, err := newProblem(sheetBenchMesh(n).mesh())
			if err != nil {
				b.Fatal(err)
			}
			b.ReportAllocs()
			b.ResetTimer()
			for i := 0; i < b.N; i++ {
				as, err := pr.assemble(0, nil)
				if err != nil {
					b.Fatal(err)
				}
				sink += as.a.At(0, 0)
			}
			b.ReportMetric(float64(b.Elapsed().Nanoseconds())/float64(b.N)/float64(pr.nUnk*pr.nUnk), "ns/entry")
		})
	}
}
