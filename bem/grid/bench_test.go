package grid

import (
	"fmt"
	"testing"

	"github.com/rimfield/rimfield/mesh"
)

var sink float64

// BenchmarkSample measures sampling a 200 x 200 grid (both cores): the
// ns/point metric should not grow with the panel count.
func BenchmarkSample(b *testing.B) {
	for _, n := range []int{500, 2000, 8000, 32000} {
		b.Run(fmt.Sprintf("panels=%d", n), func(b *testing.B) {
			sol := solve(b, coaxScene(0.5, 2, 0.8, 256), mesh.Options{Panels: n})
			w := Auto(sol.Mesh)
			b.ReportAllocs()
			b.ResetTimer()
			for i := 0; i < b.N; i++ {
				g := Sample(sol, w, 200, 200, Options{})
				sink += g.U[20100]
			}
			b.ReportMetric(float64(b.Elapsed().Nanoseconds())/float64(b.N)/4e4, "ns/point")
		})
	}
}

// BenchmarkTrace measures a flow net of about 20 lines.
func BenchmarkTrace(b *testing.B) {
	for _, n := range []int{500, 2000} {
		b.Run(fmt.Sprintf("panels=%d", n), func(b *testing.B) {
			sol := solve(b, coaxScene(0.5, 2, 0.8, 256), mesh.Options{Panels: n})
			w := Auto(sol.Mesh)
			b.ReportAllocs()
			b.ResetTimer()
			for i := 0; i < b.N; i++ {
				net := Trace(sol, w, 4, TraceOptions{})
				sink += net.Channels
			}
		})
	}
}
