package flow

import (
	"fmt"
	"testing"

	"github.com/rimfield/rimfield/geom"
	"github.com/rimfield/rimfield/geom/template"
	"github.com/rimfield/rimfield/mesh"
)

var sink float64

// benchSystem assembles a Karman-Trefftz section of about n panels.
func benchSystem(b *testing.B, n int) *System {
	b.Helper()
	data, err := template.KarmanTrefftz{Flow: template.Flow{Unit: "m", AngleDeg: 4}, CentreX: -0.1, CentreY: 0.1, TrailingEdgeAngle: 10, Chord: 1, Points: 64}.Bytes()
	if err != nil {
		b.Fatal(err)
	}
	sc, err := geom.Read(bytesReader(data))
	if err != nil {
		b.Fatal(err)
	}
	lay, err := sc.Layout()
	if err != nil {
		b.Fatal(err)
	}
	m, err := mesh.Build(lay, mesh.Options{Panels: n})
	if err != nil {
		b.Fatal(err)
	}
	fs, err := Assemble(sc, m, nil)
	if err != nil {
		b.Fatal(err)
	}
	return fs
}

// BenchmarkAssemble measures finding the trailing edges and chords,
// assembling and factorising (the LU dominates: n^3).
func BenchmarkAssemble(b *testing.B) {
	for _, n := range []int{400, 800, 1600} {
		b.Run(fmt.Sprintf("panels=%d", n), func(b *testing.B) {
			fs := benchSystem(b, n)
			b.ReportAllocs()
			b.ResetTimer()
			for range b.N {
				f, err := Assemble(fs.Scene, fs.Mesh, nil)
				if err != nil {
					b.Fatal(err)
				}
				sink += f.Whole.Length
			}
		})
	}
}

// BenchmarkAngle measures one angle of a sweep on the factorised system:
// a back-substitution (n^2) and the analysis (n).
func BenchmarkAngle(b *testing.B) {
	for _, n := range []int{400, 800, 1600} {
		b.Run(fmt.Sprintf("panels=%d", n), func(b *testing.B) {
			fs := benchSystem(b, n)
			b.ReportAllocs()
			b.ResetTimer()
			for i := range b.N {
				pts, err := fs.Sweep([]float64{float64(i % 10)})
				if err != nil {
					b.Fatal(err)
				}
				sink += pts[0].Whole.CL
			}
		})
	}
}
