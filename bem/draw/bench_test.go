package draw

import (
	"fmt"
	"io"
	"math"
	"testing"

	"github.com/rimfield/rimfield/bem/grid"
	"gonum.org/v1/gonum/spatial/r2"
)

// BenchmarkMapPNG measures drawing and encoding a field map of a 300 x 200
// grid (u = x^2 - y^2, no scene) at several picture widths.
func BenchmarkMapPNG(b *testing.B) {
	w := grid.Window{Min: r2.Vec{X: -3, Y: -2}, Max: r2.Vec{X: 3, Y: 2}}
	g := &grid.Grid{Window: w, NX: 300, NY: 200, U: make([]float64, 300*200)}
	for j := range g.NY {
		for i := range g.NX {
			p := g.Point(i, j)
			g.U[g.Index(i, j)] = p.X*p.X - p.Y*p.Y
		}
	}
	m := &Map{Grid: g, Values: g.U, Label: "u", Title: "benchmark"}
	for _, width := range []int{700, 1400, 2800} {
		b.Run(fmt.Sprintf("width=%d", width), func(b *testing.B) {
			b.ReportAllocs()
			for i := 0; i < b.N; i++ {
				if err := m.PNG(io.Discard, width, int(math.Round(float64(width)*2/3))); err != nil {
					b.Fatal(err)
				}
			}
		})
	}
}
