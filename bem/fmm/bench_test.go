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

// BenchmarkNew measures building the tree (quadtree, lists, near lists) on
// all workers; B/op over panels is the memory of set-up.
func BenchmarkNew(b *testing.B) {
	for _, n := range []int{100000, 200000, 400000, 800000} {
		b.Run(fmt.Sprintf("n=%d", n), func(b *testing.B) {
			ps, ts := benchBoundary(n)
			b.ReportAllocs()
			b.ResetTimer()
			var tr *Tree
			for range b.N {
				var err error
				tr, err = New(ps, nil, ts, &Options{Tol: 1e-10})
				if err != nil {
					b.Fatal(err)
				}
			}
			sec := b.Elapsed().Seconds() / float64(b.N)
			b.ReportMetric(sec/float64(len(ps))*1e9, "ns/panel")
			b.ReportMetric(float64(tr.Stats().Bytes)/float64(len(ps)), "treeB/panel")
		})
	}
}

// BenchmarkProduct measures the whole fast product a GMRES iteration uses:
// the far part (Apply, both layers) and the stored near block (AddTo), on
// all workers. The block's coefficients are placeholders (their values do
// not change the cost); B/panel is the tree, one workspace and the block.
func BenchmarkProduct(b *testing.B) {
	for _, tol := range []float64{1e-6, 1e-10} {
		for _, n := range []int{100000, 200000, 400000, 800000} {
			b.Run(fmt.Sprintf("tol=%g/n=%d", tol, n), func(b *testing.B) {
				ps, ts := benchBoundary(n)
				tr, err := New(ps, nil, ts, &Options{Tol: tol})
				if err != nil {
					b.Fatal(err)
				}
				blk := tr.NewBlock(true, true, func(i int, panels []int32, s, d []float64) {
					for k, j := range panels {
						s[k] = 1 / float64(1+abs(i-int(j)))
						d[k] = 0.5 * s[k]
					}
				})
				d := benchDensity(len(ps))
				u := make([]float64, len(ts))
				tr.Apply(u, nil, d)
				b.ReportAllocs()
				b.ResetTimer()
				for range b.N {
					tr.Apply(u, nil, d)
					blk.AddTo(u, d)
				}
				sink += u[0]
				sec := b.Elapsed().Seconds() / float64(b.N)
				b.ReportMetric(float64(len(ts))/sec/float64(runtime.GOMAXPROCS(0)), "points/s/core")
				b.ReportMetric(float64(tr.Stats().Bytes+blk.Bytes())/float64(len(ps)), "B/panel")
			})
		}
	}
}

func abs(i int) int {
	if i < 0 {
		return -i
	}
	return i
}

// BenchmarkGrid measures a picture grid: potential and gradient at 512 x 512
// points over the scene of benchBoundary, far part only (a grid point within
// a leaf's reach of a panel takes its near panels from the caller). The cost
// per grid point should not grow with the panel count.
func BenchmarkGrid(b *testing.B) {
	for _, n := range []int{10000, 40000, 160000} {
		b.Run(fmt.Sprintf("panels=%d", n), func(b *testing.B) {
			ps, _ := benchBoundary(n)
			const g = 512
			var ts []r2.Vec
			for i := range g {
				for j := range g {
					ts = append(ts, r2.Vec{X: -0.5 + 4*float64(i)/g, Y: -0.5 + 4*float64(j)/g})
				}
			}
			tr, err := New(ps, nil, ts, &Options{Tol: 1e-6})
			if err != nil {
				b.Fatal(err)
			}
			d := benchDensity(len(ps))
			u := make([]float64, len(ts))
			grad := make([]r2.Vec, len(ts))
			tr.Apply(u, grad, d) // workspace allocated once
			b.ReportAllocs()
			b.ResetTimer()
			for range b.N {
				tr.Apply(u, grad, d)
			}
			sink += u[0]
			b.ReportMetric(b.Elapsed().Seconds()/float64(b.N)/float64(len(ts))*1e9, "ns/point")
			b.ReportMetric(float64(tr.NearPairs())/float64(len(ts)), "near/point")
		})
	}
}
