package electro

import (
	"math"

	"github.com/rimfield/rimfield/geom"
	"gonum.org/v1/gonum/spatial/r2"
)

// AirStrength is the breakdown field of air assumed when asked for a
// default, in V/m: about 3 kV/mm for dry air at standard temperature and
// pressure over gaps of centimetres (common practice). Real breakdown
// depends on the gap, the pressure, humidity and the state of the surfaces.
const AirStrength = 3e6

// Strengths returns the breakdown field in V/m of each region of lay (0 when
// not known): the region's breakdown_field from the scene. With airDefault,
// a region without one whose relative permittivity is 1, and the background
// of an open scene when its relative permittivity is 1, get AirStrength.
// sc must be the scene lay was arranged from.
func Strengths(sc *geom.Scene, lay *geom.Layout, airDefault bool) []float64 {
	out := make([]float64, len(lay.Regions))
	for i, d := range lay.Regions {
		epsr := 0.0
		switch {
		case d.Background:
			epsr = sc.Problem.BackgroundPermittivity
		case i < len(sc.Regions):
			out[i] = sc.Regions[i].BreakdownField
			epsr = sc.Regions[i].Permittivity
		}
		if out[i] == 0 && airDefault && epsr == 1 {
			out[i] = AirStrength
		}
	}
	return out
}

// Margin is the peak field of one region against its breakdown field.
type Margin struct {
	Region   string
	Index    int     // index into Layout.Regions
	Strength float64 // breakdown field, V/m
	Peak     float64 // largest |E| on the region's boundary, V/m
	At       r2.Vec  // where, metres
	Ratio    float64 // Peak / Strength
	Exceeded bool    // Ratio > 1
}

// Breakdown compares the peak field of every region with a breakdown field
// (strength[i] for Layout.Regions[i], V/m; regions with 0 are skipped). The
// peak field of a region is the largest |E| over the panels that bound it,
// seen from its side: |grad u| is subharmonic, so its maximum over a region
// lies on the region's boundary (maximum principle). At a singular corner
// that value grows without bound as the mesh is refined: read it with the
// corner warnings and the refinement study.
func (f *Fields) Breakdown(strength []float64) []Margin {
	m := f.Sol.Mesh
	lay := m.Layout
	if len(strength) != len(lay.Regions) {
		panic("electro: Breakdown needs one strength per region")
	}
	peak := make([]float64, len(lay.Regions))
	at := make([]r2.Vec, len(lay.Regions))
	for j, p := range m.Panels {
		for _, reg := range [2]int{p.Left, p.Right} {
			if reg < 0 || strength[reg] == 0 {
				continue
			}
			if e := f.Magnitude(j, reg); e > peak[reg] {
				peak[reg], at[reg] = e, p.Mid()
			}
		}
	}
	var out []Margin
	for i, s := range strength {
		if s == 0 {
			continue
		}
		r := peak[i] / s
		out = append(out, Margin{
			Region: lay.Regions[i].Name, Index: i, Strength: s,
			Peak: peak[i], At: at[i], Ratio: r, Exceeded: r > 1 || math.IsNaN(r),
		})
	}
	return out
}
