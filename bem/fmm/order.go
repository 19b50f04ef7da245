package fmm

import "math"

// rho is the separation ratio of the acceptance test (see separated): a
// source box of radius rs and a target box of radius rt whose centres are d
// apart interact through expansions only when rs <= rho (d - rt) and
// rt <= rho (d - rs). Smaller values shorten the expansions and lengthen the
// near lists; 0.5 keeps the near field of a leaf to its neighbours.
const rho = 0.5

// maxOrder bounds the expansion order (1e-12 at rho = 0.5 needs 44).
const maxOrder = 80

// bound returns the truncation error bound of one far-field interaction at
// order p and separation ratio r, relative to the interaction's own size:
// |q|/(2 pi) for a charge q (of a point or a panel's single layer), and
// |mu|/(2 pi |z - zeta|) for a dipole mu (a piece of double layer) at
// distance |z - zeta|. For a charge at zeta (|zeta - cs| <= rs) seen from z
// (|z - ct| <= rt), truncating the multipole after p terms errs by at most
// sum_{k>p} rho^k/k, and truncating the local expansion of the truncated
// multipole by at most sum_{l>p} (rt/d)^l/l + rs/(d-rs) sum_{l>p} rho^l (the
// binomial sums of Greengard & Rokhlin 1987, Lemma 2.4, summed in closed form
// with sum_k C(l+k-1, l) x^k = x/(1-x)^(l+1)):
//
//	charge: rho^(p+1)/(1-rho) (2/(p+1) + rho/(1-rho))
//
// The dipole's expansion starts one power lower and is measured against
// 1/|z - zeta| >= 1/(d + rs + rt):
//
//	dipole: F rho^p (1+rho)/(1-rho),  F = 1 + rho + 2 rho/(1-rho)
//
// The bound is the larger of the two. Gradients are one derivative further:
// the same sums with a factor of at most about (p+1)/(1-rho) (observed:
// gradients meet the tolerance as well; see the tests).
func bound(p int, r float64) float64 {
	q := math.Pow(r, float64(p))
	charge := r * q / (1 - r) * (2/float64(p+1) + r/(1-r))
	f := 1 + r + 2*r/(1-r)
	dipole := f * q * (1 + r) / (1 - r)
	return math.Max(charge, dipole)
}

// order returns the smallest expansion order whose bound meets tol.
func order(tol, r float64) int {
	for p := 2; p < maxOrder; p++ {
		if bound(p, r) <= tol {
			return p
		}
	}
	return maxOrder
}
