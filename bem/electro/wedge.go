package electro

import "math"

// sector is one dielectric sector of a wedge around a vertex: its opening
// angle (radians) and permittivity.
type sector struct {
	width, eps float64
}

// wedgeExponent returns the smallest lambda in (0, 2] for which the wedge of
// sectors, swept from a conductor face at theta = 0, has a separable
// potential u = r^lambda f(theta) vanishing on that face and, at the far
// face, vanishing too (another conductor face) or with zero normal
// derivative (an insulated face, neumannEnd). The field then goes like
// r^(lambda - 1). In each sector f = a cos(lambda t) + b sin(lambda t), t
// the angle from the sector's start; across an interface f and eps f' are
// continuous (potential and normal displacement). For one sector this
// gives pi/beta and pi/(2 beta) (Jackson, Classical Electrodynamics, 1999,
// sec. 2.11); for two sectors the condition reduces to
//
//	eps1 sin(lambda w2) cos(lambda w1) + eps2 sin(lambda w1) cos(lambda w2) = 0
//
// (Dirichlet far face), the classic condition at a conductor-dielectric
// triple junction. It returns 2 when there is no root below 2 (a field
// that vanishes at the vertex at least linearly).
func wedgeExponent(sectors []sector, neumannEnd bool) float64 {
	end := func(lambda float64) float64 {
		a, b := 0.0, 1.0 // f(0) = 0, f'(0) = lambda: normalised
		for i, s := range sectors {
			c, sn := math.Cos(lambda*s.width), math.Sin(lambda*s.width)
			f := a*c + b*sn
			df := -a*sn + b*c // f' / lambda
			if i+1 < len(sectors) {
				a, b = f, df*s.eps/sectors[i+1].eps
				continue
			}
			if neumannEnd {
				return df
			}
			return f
		}
		return 0
	}
	const step, top = 1e-3, 2.0
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
