package mesh

import "math"

// Sector is one material sector of a wedge around a vertex: its opening
// angle in radians and its conductivity (permittivity, hydraulic
// conductivity), in the order met sweeping from the wedge's first face.
type Sector struct {
	Width, K float64
}

// wedgeTop is the largest exponent WedgeExponent looks for.
const wedgeTop = 4.0

// WedgeExponent returns the smallest lambda in (0, 4] for which the wedge
// of sectors, swept from a face with a fixed potential at theta = 0, has a
// separable potential u - u0 = r^lambda f(theta) vanishing on that face
// and, at the far face, vanishing too (a face at the same fixed potential)
// or with zero normal derivative (an insulated face, neumannEnd). The
// gradient then goes like r^(lambda - 1): infinite at the vertex for
// lambda < 1, finite for lambda = 1, zero beyond. In each sector
// f = a cos(lambda t) + b sin(lambda t), t the angle from the sector's
// start; across an interface f and K f' are continuous (potential and
// normal flux). For one sector this gives pi/beta and pi/(2 beta) (the
// separable solutions of Laplace's equation in a wedge: Jackson,
// Classical Electrodynamics, 3rd ed., 1999, sec. 2.11); for two sectors
// between fixed faces the condition reduces to
//
//	K1 sin(lambda w2) cos(lambda w1) + K2 sin(lambda w1) cos(lambda w2) = 0,
//
// the classic condition at a conductor-dielectric triple junction. It
// returns 4 when there is no root below 4.
func WedgeExponent(sectors []Sector, neumannEnd bool) float64 {
	end := func(lambda float64) float64 {
		a, b := 0.0, 1.0 // f(0) = 0, f'(0) = lambda: normalised
		for i, s := range sectors {
			c, sn := math.Cos(lambda*s.Width), math.Sin(lambda*s.Width)
			f := a*c + b*sn
			df := -a*sn + b*c // f' / lambda
			if i+1 < len(sectors) {
				a, b = f, df*s.K/sectors[i+1].K
				continue
			}
			if neumannEnd {
				return df
			}
			return f
		}
		return 0
	}
	const step = 1e-3
	prev := end(step)
	for l := 2 * step; l <= wedgeTop; l += step {
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
	return wedgeTop
}
