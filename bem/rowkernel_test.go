package bem

import (
	"math"
	"testing"
)

// The fast closed forms of the row kernel (the series of atan and atanh
// for panels seen under small angles) against integrals, for every pair of
// a collocation point and a panel (and its image) of every case of the
// fast solver's tests: the single layer within 1e-14 of |sl| + L/(2 pi)
// (observed 6.7e-16), the double layer within 1e-14 of its own size
// (observed 3.5e-16: the series and atan2 are both correctly rounded to a
// few ulp). Then the whole rows against coefficients, which subtracts
// images as the kernel does: within 1e-14 of the row's largest
// coefficient where there are no images (observed 1.7e-15, ln rho carried
// along the chain), and within
// 1e-9 of it over a grounded plane, where a row's coefficients can be 1e-3
// of the single layers they are differences of (observed 1.8e-11, a few
// ulp of those; both forms carry that rounding).
func TestRowKernel(t *testing.T) {
	for _, c := range fastCases(t) {
		pr, err := newProblem(c.m, c.kutta...)
		if err != nil {
			t.Fatal(err)
		}
		var s rowScratch
		worstSL, worstDL, worstRow := 0.0, 0.0, 0.0
		image := false
		for _, rw := range pr.rows {
			if rw.kind != rowCollocation {
				continue
			}
			r := &pr.parts[rw.region]
			image = image || r.image
			me := &r.sides[rw.side]
			x := pr.m.Panels[me.panel].Mid()
			X := r.transform(x)
			for k := range r.sides {
				if k == rw.side || k == me.twin {
					continue
				}
				frames := []*panelFrame{&r.sides[k].frame}
				if r.image {
					frames = append(frames, &r.sides[k].image)
				}
				for _, f := range frames {
					sl, dl := f.integrals(X, false)
					fsl, fdl := f.fast(X)
					worstSL = math.Max(worstSL, math.Abs(fsl-sl)/(math.Abs(sl)+f.l*inv2Pi))
					if dl != 0 {
						worstDL = math.Max(worstDL, math.Abs(fdl-dl)/math.Abs(dl))
					}
				}
			}
			r.rowCoefficients(x, rw.side, me.twin, &s)
			var mu, mf float64
			cu := make([]float64, len(r.sides))
			cf := make([]float64, len(r.sides))
			for k := range r.sides {
				cu[k], cf[k] = r.coefficients(&r.sides[k], x, k == rw.side || k == me.twin)
				mu, mf = math.Max(mu, math.Abs(cu[k])), math.Max(mf, math.Abs(cf[k]))
			}
			for k := range r.sides {
				worstRow = math.Max(worstRow, math.Max(math.Abs(s.cu[k]-cu[k])/mu, math.Abs(s.cf[k]-cf[k])/mf))
			}
		}
		rowTol := 1e-14
		if image {
			rowTol = 1e-9
		}
		t.Logf("%s: single layers within %.2g, double layers within %.2g, rows within %.2g", c.name, worstSL, worstDL, worstRow)
		if worstSL > 1e-14 || worstDL > 1e-14 || worstRow > rowTol {
			t.Errorf("%s: fast forms off by %.3g (single), %.3g (double), rows by %.3g", c.name, worstSL, worstDL, worstRow)
		}
	}
}
