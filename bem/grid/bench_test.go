package grid

import (
	"fmt"
	"testing"

	"github.com/rimfield/rimfield/mesh"
)

var sink float64

// BenchmarkSample measures sampling a 100 x 100 grid (both cores); the
// ns/point/panel metric is what DefaultPoints' budget assumes (150 ns on
// one core, so about 75 ns with two).
func BenchmarkSample(b *testing.B) {
	for _, n := range []int{500, 1000, 2000} {
		b.Run(fmt.Sprintf("panels=%d", n), func(b *testing.B) {
			sol := solve(b, coaxScene(0.5, 2, 0.8, 256), mesh.Options{Panels: n})
			w := Auto(sol.Mesh)
			b.ReportAllocs()
			b.ResetTimer()
			for i := 0; i < b.N; i++ {
				g := Sample(sol, w, 100, 100, Options{})
				sink += g.U[5050]
			}
			np := float64(len(sol.Mesh.Panels))
			b.ReportMetric(float64(b.Elapsed().Nanoseconds())/float64(b.N)/1e4/np, "ns/point/panel")
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
