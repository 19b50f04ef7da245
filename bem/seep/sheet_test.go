package seep

import (
	"math"
	"testing"

	"github.com/rimfield/rimfield/geom"
	"github.com/rimfield/rimfield/mesh"
	"gonum.org/v1/gonum/integrate/quad"
	"gonum.org/v1/gonum/mathext"
)

// Sheet piles drawn as lines (sheets of zero thickness).

// sheet adds an impervious sheet.
func (s *section) sheet(name string, l geom.Line) *section {
	s.sc.Bodies = append(s.sc.Bodies, geom.Body{Feature: s.feature(), Name: name, Lines: []geom.Line{l}, Cond: geom.Insulated})
	return s
}

// sheetPileLayer is a sheet pile of zero thickness driven d into a layer
// of depth T, the section 4 T wide on either side (the cut sides change q
// by about exp(-4 pi)), head H upstream and 0 downstream; k = 1e-5 m/s.
func sheetPileLayer(T, d, H float64) *section {
	W := 4 * T
	return newTestSection().
		soil("sand", 1e-5, 1e-5, rect(-W, -T, W, 0)).
		sheet("pile", line(0, 0, 0, -d)).
		bed("upstream bed", H, line(-W, 0, 0, 0)).
		bed("downstream bed", 0, line(0, 0, W, 0))
}

// The whole section with the pile as a sheet, both faces in the soil, at
// default settings: the discharge and the exit gradient at the pile
// against the zero-thickness references (pileRef), the exit gradient at
// the finite corner where the bed meets the pile, and the horizontal
// thrust of the water on the pile, gw H int_0^d (1 - F(phi(y), m)/K(m)) dy
// with m = sin^2(pi d/2T) and sin(phi) = sin(pi y/2T)/sin(pi d/2T): the
// difference of the heads on its faces by the conformal map of the half
// layer (derived with the head on the faces in package bem's tests).
func TestSheetPileAsSheet(t *testing.T) {
	const T, H, k = 10.0, 3.0, 1e-5
	for _, dT := range []float64{0.25, 0.5, 0.75} {
		d := dT * T
		s := sheetPileLayer(T, d, H).solve(t, mesh.Options{})
		qkH, iTH := pileRef(dT)
		q := s.rep.Discharge / (k * H)
		e := s.exit(t, "downstream bed")
		i := e.Value * T / H
		m := math.Pow(math.Sin(math.Pi*dT/2), 2)
		thrust := quad.Fixed(func(u float64) float64 {
			y := d * (1 - u*u) // y = d (1 - u^2): smooth at the tip
			phi := math.Asin(math.Min(1, math.Sin(math.Pi*y/(2*T))/math.Sqrt(m)))
			return (1 - mathext.EllipticF(phi, m)/mathext.CompleteK(m)) * 2 * d * u
		}, 0, 1, 64, nil, 0) * 9.81 * H
		st := s.structure(t, "pile")
		t.Logf("d/T = %v, %d panels: q/kH = %.6f (error %.2g), i T/H = %.6f (error %.2g, spread %.2g), thrust %.5f kN/m (error %.2g)",
			dT, len(s.sol.Mesh.Panels), q, relErr(q, qkH), i, relErr(i, iTH), e.Spread, st.Horizontal, relErr(st.Horizontal, thrust))
		// Tolerances: observed 7.4e-5 (discharge), 4.0e-4 (exit gradient)
		// and 1.6e-5 (thrust) at worst, 2.5x and 3x margin; the product's 1e-3.
		if relErr(q, qkH) > 2e-4 {
			t.Errorf("d/T = %v: q/kH = %.6f, want %.6f", dT, q, qkH)
		}
		if relErr(i, iTH) > 1e-3 || !e.Corner || e.At.X != 0 || e.At.Y != 0 {
			t.Errorf("d/T = %v: exit gradient i T/H = %.6f at (%g, %g), corner %v; want %.6f at the pile's foot on the bed", dT, i, e.At.X, e.At.Y, e.Corner, iTH)
		}
		if relErr(st.Horizontal, thrust) > 5e-5 || st.Uplift != 0 {
			t.Errorf("d/T = %v: thrust %.5f kN/m, uplift %g; want %.5f and 0", dT, st.Horizontal, st.Uplift, thrust)
		}
	}
}
