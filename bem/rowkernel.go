package bem

import (
	"math"

	"gonum.org/v1/gonum/spatial/r2"
)

// Assembling a collocation row costs, per entry, the closed forms of
// kernel.go: an arctangent and two logarithms (ln rho_a and
// ln(rho_b/rho_a)). Most panels of a row are seen under a small angle, and
// there both the angle and the ratio have fast odd series (parts); and
// since the start of a panel is the end of the previous one, ln rho_a is
// carried along the boundary, ln rho_b = ln rho_a + ln(rho_b/rho_a), taken
// afresh every chainMax panels. A row then needs a logarithm per chainMax
// panels and atan2 and log1p only for its near panels. The values are
// integrals' to rounding (TestRowKernel).

// rowScratch is the memory of one worker's rows.
type rowScratch struct {
	cu, cf []float64 // per side of the part: double- and single-layer coefficients
	part   []float64 // per side: beta ln(rho_b/rho_a) - L - eta0 theta, or NaN for a side done apart
	lr     []float64 // per side: ln(rho_b/rho_a)
	ra2    []float64 // per side: rho_a^2
}

func (s *rowScratch) size(n int) {
	if cap(s.cu) < n {
		s.cu, s.cf = make([]float64, n), make([]float64, n)
		s.part, s.lr, s.ra2 = make([]float64, n), make([]float64, n), make([]float64, n)
	}
	s.cu, s.cf, s.part, s.lr, s.ra2 = s.cu[:n], s.cf[:n], s.part[:n], s.lr[:n], s.ra2[:n]
}

// rowCoefficients fills s.cu and s.cf with coefficients(side k, x, pair)
// for every side k of r, for the collocation row at x of side me (pair:
// k == me or its twin). The panels' own terms come first, independent of
// one another; ln rho_a is then carried along the chain of sides in a
// second pass, so that the long latency of the first is not on a chain
// from panel to panel.
func (r *region) rowCoefficients(x r2.Vec, me, twin int, s *rowScratch) {
	n := len(r.sides)
	s.size(n)
	X := r.transform(x)
	r.ownTerms(X, me, twin, false, s)
	var pv r2.Vec
	var pln float64
	pn := chainMax
	for k := range r.sides {
		f := &r.sides[k].frame
		if math.IsNaN(s.part[k]) {
			pn = chainMax
			continue
		}
		var lna float64
		if pn < chainMax && pv == f.a {
			lna = pln
			pn++
		} else {
			lna = 0.5 * math.Log(s.ra2[k])
			pn = 0
		}
		pv, pln = f.b, lna+s.lr[k]
		s.cf[k] = -inv2Pi * (s.part[k] + f.l*lna)
	}
	if r.image {
		// The images run the other way: the image of a side ends where
		// the image of the previous side starts.
		r.ownTerms(X, me, twin, true, s)
		var iv r2.Vec
		var iln float64
		in := chainMax
		for k := range r.sides {
			im := &r.sides[k].image
			if math.IsNaN(s.part[k]) {
				in = chainMax
				continue
			}
			var lna float64
			if in < chainMax && iv == im.b {
				lna = iln - s.lr[k]
				in++
			} else {
				lna = 0.5 * math.Log(s.ra2[k])
				in = 0
			}
			iv, iln = im.a, lna
			s.cf[k] -= -inv2Pi * (s.part[k] + im.l*lna)
		}
	}
	for k := range r.sides {
		s.cf[k] *= r.sides[k].scale
	}
}

// ownTerms sets, for every side (its image when image), part, lr and ra2
// of parts, and adds the double layer to cu (sets it for the sides;
// subtracts the image's). A side done apart (the row's own pair, or one
// with an end at X) gets its whole integrals into cu and cf and part NaN.
func (r *region) ownTerms(X r2.Vec, me, twin int, image bool, s *rowScratch) {
	for k := range r.sides {
		f := &r.sides[k].frame
		if image {
			f = &r.sides[k].image
		}
		pair := !image && (k == me || k == twin)
		if pair || f.a == X || f.b == X {
			sl, dl := f.integrals(X, pair)
			if image {
				s.cu[k] -= dl
				s.cf[k] -= sl
			} else {
				s.cu[k], s.cf[k] = dl, sl
			}
			s.part[k] = math.NaN()
			continue
		}
		th, lr, g := f.parts(X)
		s.part[k] = g.beta*lr - f.l - g.eta0*th
		s.lr[k], s.ra2[k] = lr, g.ra2
		if image {
			s.cu[k] -= -inv2Pi * th
		} else {
			s.cu[k] = -inv2Pi * th
		}
	}
}

// chainMax is the number of panels over which ln rho is carried from
// vertex to vertex (ln rho_b = ln rho_a + ln(rho_b/rho_a)) before it is
// taken afresh: each step adds a rounding of about 1e-16 |ln rho|, so the
// carried value stays within about 1e-15 of a fresh one.
const chainMax = 32

// seriesSmall bounds the arguments of the series of atan and atanh in
// parts: 7 terms of t^(2k+1)/(2k+1) reach 0.05^14/15 < 1e-19.
const seriesSmall = 0.05

// oddSeries returns t (1 + s t^2/3 + t^4/5 + s t^6/7 ...) with s = -1
// (atan t) or s = 1 (atanh t), for |t| < seriesSmall: to t^15/15, or to
// t^9/9 when |t| < 0.005 (0.005^10/11 < 1e-23: the terms beyond are below
// rounding), which covers the far panels of a row.
func oddSeries(t, s float64) float64 {
	t2 := s * t * t
	if t*t < 2.5e-5 {
		p := 1.0 / 9
		p = p*t2 + 1.0/7
		p = p*t2 + 1.0/5
		p = p*t2 + 1.0/3
		return t + t*t2*p
	}
	p := 1.0 / 15
	p = p*t2 + 1.0/13
	p = p*t2 + 1.0/11
	p = p*t2 + 1.0/9
	p = p*t2 + 1.0/7
	p = p*t2 + 1.0/5
	p = p*t2 + 1.0/3
	return t + t*t2*p
}

// panelGeometry is what combine needs of a target beside a panel.
type panelGeometry struct {
	ra2, eta0, beta float64
}

// parts returns, for X off the panel, the angle theta = atan2(cross, dot)
// under which the panel's ends are seen and ln(rho_b/rho_a) = atanh(w),
// w = (rho_b^2 - rho_a^2)/(rho_b^2 + rho_a^2): by their odd series when
// the panel is seen under a small angle (most panels of a row), otherwise
// by atan2 and log1p as integrals does. The series are correctly rounded
// to about 1 ulp.
func (p *panelFrame) parts(X r2.Vec) (th, lr float64, g panelGeometry) {
	ax, ay := p.a.X-X.X, p.a.Y-X.Y
	bx, by := p.b.X-X.X, p.b.Y-X.Y
	cross := ax*by - ay*bx
	dot := ax*bx + ay*by
	// xi0 = (X - a).t, eta0 = (X - a).n, with X - a = -(ax, ay).
	xi0 := -(ax*p.t.X + ay*p.t.Y)
	g.eta0 = -(ax*p.n.X + ay*p.n.Y)
	g.ra2 = ax*ax + ay*ay
	g.beta = p.l - xi0
	// rho_b^2 - rho_a^2 = beta^2 - xi0^2 = L (beta - xi0), exactly in form.
	diff := p.l * (g.beta - xi0)
	den := 2*g.ra2 + diff
	if dot > 0 && math.Abs(cross) < seriesSmall*dot && math.Abs(diff) < seriesSmall*den {
		inv := 1 / (dot * den)
		return oddSeries(cross*den*inv, -1), oddSeries(diff*dot*inv, 1), g
	}
	return math.Atan2(cross, dot), logRatio(g.ra2, diff), g
}

// combine returns the single- and double-layer integrals from parts and
// ln rho_a.
func (p *panelFrame) combine(th, lr, lna float64, g panelGeometry) (sl, dl float64) {
	lnInt := g.beta*lr + p.l*lna - p.l - g.eta0*th
	return -inv2Pi * lnInt, -inv2Pi * th
}

// fast returns integrals(X, false) for X off the panel, by parts.
func (p *panelFrame) fast(X r2.Vec) (sl, dl float64) {
	th, lr, g := p.parts(X)
	return p.combine(th, lr, 0.5*math.Log(g.ra2), g)
}
