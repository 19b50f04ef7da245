package bem

import (
	"math"

	"github.com/rimfield/rimfield/geom"
	"github.com/rimfield/rimfield/mesh"
	"gonum.org/v1/gonum/spatial/r2"
)

// Sheets built by hand: both faces of a polyline, the second reversed,
// marked as twins, with the nodes graded geometrically toward chosen
// ends as mesh.Build grades toward tips.

// gradedNodes returns node positions in [0, L]: panels of at most h growing
// by the ratio q from hmin at each end asked for (atA, atB).
func gradedNodes(L, h, hmin, q float64, atA, atB bool) []float64 {
	size := func(d float64) float64 { return math.Min(h, math.Max(hmin, math.Log(q)*d)) }
	// Integrate 1/h(s) and place nodes at equal steps of it.
	const steps = 20000
	dist := func(s float64) float64 {
		d := math.Inf(1)
		if atA {
			d = s
		}
		if atB {
			d = math.Min(d, L-s)
		}
		return d
	}
	F := make([]float64, steps+1)
	for i := 1; i <= steps; i++ {
		s0, s1 := L*float64(i-1)/steps, L*float64(i)/steps
		F[i] = F[i-1] + 0.5*(s1-s0)*(1/size(dist(s0))+1/size(dist(s1)))
	}
	n := int(math.Ceil(F[steps]))
	out := []float64{0}
	j := 0
	for m := 1; m < n; m++ {
		t := F[steps] * float64(m) / float64(n)
		for F[j+1] < t {
			j++
		}
		w := (t - F[j]) / (F[j+1] - F[j])
		out = append(out, L*(float64(j)+w)/steps)
	}
	return append(out, L)
}

// sheet adds both faces of the segment p-q in region reg: face one from p
// to q (reg on its left), face two from q to p, with nodes at ts (distances
// from p), owner o and condition c. It returns the first panel index of
// each face.
func (b *builder) sheet(p, q r2.Vec, ts []float64, reg, o int, c geom.Condition) (int, int) {
	L := r2.Norm(r2.Sub(q, p))
	pt := func(t float64) r2.Vec {
		switch t {
		case 0:
			return p
		case L:
			return q
		}
		return r2.Add(p, r2.Scale(t/L, r2.Sub(q, p)))
	}
	n := len(ts) - 1
	one := len(b.panels)
	b.panels = append(b.panels, make([]mesh.Panel, 2*n)...)
	two := one + n
	for i := 0; i < n; i++ {
		a, e := pt(ts[i]), pt(ts[i+1])
		b.panels[one+i] = mesh.Panel{A: a, B: e, Left: reg, Right: geom.Outside, Owner: o, Cond: c}
		// Face two runs from q to p: its panel n-1-i is panel i reversed.
		b.panels[two+n-1-i] = mesh.Panel{A: e, B: a, Left: reg, Right: geom.Outside, Owner: o, Cond: c}
		b.twins = append(b.twins, [2]int{one + i, two + n - 1 - i})
	}
	return one, two
}

type geomCond = geom.Condition

func panelOf(a, b r2.Vec, reg, o int, c geom.Condition) mesh.Panel {
	return mesh.Panel{A: a, B: b, Left: reg, Right: geom.Outside, Owner: o, Cond: c}
}
