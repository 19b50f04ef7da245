package fmm

import (
	"fmt"
	"math"
	"math/rand/v2"
	"runtime"
	"testing"

	"gonum.org/v1/gonum/spatial/r2"
)

var sink float64

// benchBoundary is a boundary element mesh of n panels: 16 closed curves
// r = R (1 + 0.3 cos 5 theta) of different sizes on a 4 x 4 grid (a layout of
// conductors), collocation at the midpoints.
func benchBoundary(n int) ([]Panel, []r2.Vec) {
	var ps []Panel
	per := n / 16
	for c := range 16 {
		cx, cy := float64(c%4), float64(c/4)
		rad := 0.15 + 0.02*float64(c)
		pt := func(k int) r2.Vec {
			th := 2 * math.Pi * float64(k) / float64(per)
			r := rad * (1 + 0.3*math.Cos(5*th))
			return r2.Vec{X: cx + r*math.Cos(th), Y: cy + r*math.Sin(th)}
		}
		for k := range per {
			ps = append(ps, Panel{A: pt(k), B: pt(k + 1)})
		}
	}
	ts := make([]r2.Vec, len(ps))
	for j, p := range ps {
		ts[j] = r2.Scale(0.5, r2.Add(p.A, p.B))
	}
	return ps, ts
}

func benchDensity(n int) Density {
	rng := rand.New(rand.NewPCG(1, 1))
	d := Density{Single: make([]float64, n), Double: make([]float64, n)}
	for j := range n {
		d.Single[j] = rng.Float64()
		d.Double[j] = rng.Float64()
	}
	return d
}

// BenchmarkApply measures the far-field product (both layers, potential
// only) with the tree built outside the loop: points/s/core is targets per
// second divided by the workers.
func BenchmarkApply(b *testing.B) {
	for _, tol := range []float64{1e-6, 1e-10} {
		for _, n := range []int{100000, 200000, 400000, 800000} {
			for _, workers := range []int{1, runtime.GOMAXPROCS(0)} {
				b.Run(fmt.Sprintf("tol=%g/n=%d/workers=%d", tol, n, workers), func(b *testing.B) {
					ps, ts := benchBoundary(n)
					tr, err := New(ps, nil, ts, &Options{Tol: tol, Workers: workers})
					if err != nil {
						b.Fatal(err)
					}
					d := benchDensity(len(ps))
					u := make([]float64, len(ts))
					tr.Apply(u, nil, d) // workspace allocated once
					b.ReportAllocs()
					b.ResetTimer()
					for range b.N {
						tr.Apply(u, nil, d)
					}
					sink += u[0]
					sec := b.Elapsed().Seconds() / float64(b.N)
					b.ReportMetric(float64(len(ts))/sec/float64(workers), "points/s/core")
					st := tr.Stats()
					b.ReportMetric(float64(st.Bytes)/float64(len(ps)), "treeB/panel")
					b.ReportMetric(float64(st.NearPairs)/float64(len(ts)), "near/target")
				})
			}
		}
	}
}
