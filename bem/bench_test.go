package bem

import (
	"flag"
	"fmt"
	"testing"

	"github.com/rimfield/rimfield/geom"
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

// busbarsMesh is the example busbars (conductors on dielectric standoffs in
// a grounded trough) meshed with about n panels.
func busbarsMesh(b *testing.B, n int) *mesh.Mesh {
	sc, err := geom.ReadFile("../examples/busbars/scene.geojson")
	if err != nil {
		b.Fatal(err)
	}
	return sceneMesh(b, sc, n)
}

// BenchmarkSolveScene measures a whole solve (assembly or set-up, and one
// right-hand side) of the example busbars by each solver: where the fast
// one overtakes the dense one, and the fast one's time per doubling of N.
// It reports the iterations and the system's memory.
func BenchmarkSolveScene(b *testing.B) {
	for _, c := range []struct {
		m     Method
		sizes []int
	}{{Dense, []int{1000, 2000, 4000}}, {Fast, []int{1000, 2000, 4000, 8000, 16000, 32000, 64000}}} {
		for _, n := range c.sizes {
			b.Run(fmt.Sprintf("solver=%v/panels=%d", c.m, n), func(b *testing.B) {
				m := busbarsMesh(b, n)
				b.ReportAllocs()
				b.ResetTimer()
				var sol *Solution
				var sys *System
				for i := 0; i < b.N; i++ {
					var err error
					if sys, err = Assemble(m, &Settings{Method: c.m}); err != nil {
						b.Fatal(err)
					}
					if sol, err = sys.Solve(nil); err != nil {
						b.Fatal(err)
					}
					sink += sol.F[0]
				}
				b.ReportMetric(float64(sol.Iterations), "iterations")
				b.ReportMetric(float64(sys.Bytes())/float64(len(m.Panels)), "bytes/panel")
				b.ReportMetric(float64(b.Elapsed().Nanoseconds())/float64(b.N)/float64(sys.Unknowns()), "ns/unknown")
			})
		}
	}
}

// million asks BenchmarkSolveMillion to run: it takes minutes and about
// 3.5 GB.
var million = flag.Bool("million", false, "run BenchmarkSolveMillion (a million panels: minutes, 3.5 GB)")

// BenchmarkSolveMillion solves the example busbars refined to a million
// panels by the fast solver and reports the process's peak memory:
//
//	go test -run='^$' -bench=SolveMillion -benchtime=1x -timeout=60m ./bem -million
func BenchmarkSolveMillion(b *testing.B) {
	if !*million {
		b.Skip("a million panels take minutes: pass -million")
	}
	m := busbarsMesh(b, 1000000)
	b.ResetTimer()
	var sol *Solution
	var sys *System
	for i := 0; i < b.N; i++ {
		var err error
		if sys, err = Assemble(m, &Settings{Method: Fast}); err != nil {
			b.Fatal(err)
		}
		if sol, err = sys.Solve(nil); err != nil {
			b.Fatal(err)
		}
	}
	b.ReportMetric(float64(sol.Iterations), "iterations")
	b.ReportMetric(float64(sys.Bytes())/(1<<20), "system-MiB")
	b.ReportMetric(float64(peakRSS())/(1<<20), "peak-MiB")
}
