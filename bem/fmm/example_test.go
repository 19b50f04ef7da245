package fmm_test

import (
	"fmt"
	"math"

	"github.com/rimfield/rimfield/bem/fmm"
	"gonum.org/v1/gonum/spatial/r2"
)

// A uniform single layer of unit density on a circle of radius R (here a
// polygon of 4000 panels) has the potential -R ln R inside and
// -R ln |x| outside (the logarithmic potential of a uniform ring, e.g.
// Kellogg, Foundations of Potential Theory, 1929): -2 ln 2 = -1.38629 at the
// centre and -2 ln 5 = -3.21888 at distance 5. Both targets are far from
// every panel, so the far part is the whole potential.
func Example() {
	const n, rad = 4000, 2.0
	panels := make([]fmm.Panel, n)
	for k := range panels {
		a, b := 2*math.Pi*float64(k)/n, 2*math.Pi*float64(k+1)/n
		panels[k] = fmm.Panel{A: r2.Vec{X: rad * math.Cos(a), Y: rad * math.Sin(a)},
			B: r2.Vec{X: rad * math.Cos(b), Y: rad * math.Sin(b)}}
	}
	targets := []r2.Vec{{X: 0, Y: 0}, {X: 3, Y: 4}}
	tr, err := fmm.New(panels, nil, targets, &fmm.Options{Tol: 1e-10})
	if err != nil {
		fmt.Println(err)
		return
	}
	s := make([]float64, n)
	for k := range s {
		s[k] = 1
	}
	u := make([]float64, len(targets))
	tr.Apply(u, nil, fmm.Density{Single: s})
	fmt.Printf("centre %.5f, at distance 5 %.5f, near panels %d and %d\n", u[0], u[1],
		len(tr.NearPanels(0)), len(tr.NearPanels(1)))
	// Output:
	// centre -1.38629, at distance 5 -3.21888, near panels 0 and 0
}
