package bem

import (
	"fmt"
	"testing"

	"github.com/rimfield/rimfield/mesh"
	"gonum.org/v1/gonum/spatial/r2"
)

var sink float64

// benchMesh is a coaxial pair of circles with n panels in all.
func benchMesh(n int) *mesh.Mesh {
	return coax(1, 2, n/2, 1).mesh()
}

// BenchmarkAssemble measures filling the matrix (n^2 entries, both cores).
func BenchmarkAssemble(b *testing.B) {
	for _, n := range []int{500, 1000, 2000, 4000, 8000} {
		b.Run(fmt.Sprintf("panels=%d", n), func(b *testing.B) {
			m := benchMesh(n)
			pr, err := newProblem(m)
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

// BenchmarkSolve measures the whole Solve: assembly, LU and one right-hand side.
func BenchmarkSolve(b *testing.B) {
	for _, n := range []int{500, 1000, 2000, 4000, 8000} {
		b.Run(fmt.Sprintf("panels=%d", n), func(b *testing.B) {
			m := benchMesh(n)
			b.ReportAllocs()
			b.ResetTimer()
			for i := 0; i < b.N; i++ {
				s, err := Solve(m, nil)
				if err != nil {
					b.Fatal(err)
				}
				sink += s.F[0]
			}
		})
	}
}

// BenchmarkEval measures one evaluation of potential and gradient.
func BenchmarkEval(b *testing.B) {
	for _, n := range []int{500, 2000} {
		b.Run(fmt.Sprintf("panels=%d", n), func(b *testing.B) {
			s, err := Solve(benchMesh(n), nil)
			if err != nil {
				b.Fatal(err)
			}
			b.ReportAllocs()
			b.ResetTimer()
			for i := 0; i < b.N; i++ {
				sink += s.Eval(r2.Vec{X: 1.5, Y: 0.1}).U
			}
			b.ReportMetric(float64(b.Elapsed().Nanoseconds())/float64(b.N)/float64(n), "ns/panel")
		})
	}
}
