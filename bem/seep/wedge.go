package seep

import "math"

// sector is one soil sector of a wedge around a vertex: its opening angle
// (radians) and conductivity.
type sector struct {
	width, k float64
}

// wedgeExponent returns the smallest lambda in (0, 4] for which the wedge
// of sectors, swept from a fixed-head face at theta = 0, has a separable
// head u - u0 = r^lambda f(theta) vanishing on that face and, at the far
// face, vanishing too (a face at the same head) or with zero normal
// derivative (an impervious face, neumannEnd). The hydraulic gradient then
// goes like r^(lambda - 1). In each sector f = a cos(lambda t) + b sin(lambda t),
// t the angle from the sector's start; across an interface between soils f
// and k f' are continuous (head and normal flux). For one sector this gives
// pi/beta and pi/(2 beta): the separable solutions of Laplace's equation in
// a wedge (e.g. Jackson, Classical Electrodynamics, 3rd ed., 1999, sec.
// 2.11; Harr, Groundwater and Seepage, 1962, ch. 4, from memory). It
// returns 4 when there is no root below 4 (a gradient that vanishes at the
// vertex).
func wedgeExponent(sectors []sector, neumannEnd bool) float64 {
	end := func(lambda float64) float64 {
		a, b := 0.0, 1.0 // f(0) = 0, f'(0) = lambda: normalised
		for i, s := range sectors {
			c, sn := math.Cos(lambda*s.width), math.Sin(lambda*s.width)
			f := a*c + b*sn
			df := -a*sn + b*c // f' / lambda
			if i+1 < len(sectors) {
				a, b = f, df*s.k/sectors[i+1].k
				continue
			}
			if neumannEnd {
				return df
			}
			return f
		}
		return 0
	}
	const step, top = 1e-3, 4.0
	prev := end(step)
	for l := 2 * step; l <= top; l += step {
		v := end(l)
		if prev == 0 {
			return l - step
		}
		if (v < 0) != (prev < 0) {
			lo, hi := l-step, l
			for range 60 {
				mid := 0.5 * (lo + hi)
				if (end(mid) < 0) == (prev < 0) {
					lo = mid
				} else {
					hi = mid
				}
			}
			return 0.5 * (lo + hi)
		}
		prev = v
	}
	return top
}
