package fmm

import (
	"math"
	"sync"
)

// Expansions of the complex potential
//
//	w(z) = sum_j s_j int log(z - zeta) ds - sum_j d_j nu_j int ds/(z - zeta) + sum_k q_k log(z - y_k)
//
// whose real part gives u = -(1/2 pi) Re w and whose derivative gives
// grad u = -(1/2 pi) conj(w'). Every expansion is stored scaled by the radius
// r of its box, so that boxes from 1e-9 to 1e3 of the root share one range of
// magnitudes:
//
//	multipole about c:  w(z) = a0 log(z - c) + sum_{k=1..p} A_k (r/(z - c))^k
//	local about c:      w(z) = sum_{l=0..p} L_l ((z - c)/r)^l
//
// The translations are those of Greengard & Rokhlin, A fast algorithm for
// particle simulations, J. Comput. Phys. 73 (1987) 325-348: Lemma 2.3
// (multipole to multipole), Lemma 2.4 (multipole to local), Lemma 2.5
// (local to local, done as a Horner Taylor shift), rewritten for the scaled
// coefficients. The constant a0 is real (densities are real), so only
// Re(a0 log) = a0 ln|.| is kept and branch cuts never arise; the imaginary
// part of L_0 is never used.

// expander holds the tables of one expansion order p.
type expander struct {
	p int
	// hank[l*(p+1)+k] = C(l+k-1, k-1), l = 0..p, k = 1..p: the multipole to
	// local matrix (Lemma 2.4).
	hank []float64
	// pasc[l*(p+1)+k] = C(l-1, k-1), l = 1..p, k = 1..l: the multipole to
	// multipole matrix (Lemma 2.3).
	pasc []float64
	// lbin[m*(p+1)+l] = C(l, m), l >= m: the local to local matrix
	// (Lemma 2.5).
	lbin   []float64
	invK   []float64 // 1/k
	invKK1 []float64 // 1/(k (k+1))
}

var (
	expandersMu sync.Mutex
	expanders   = map[int]*expander{}
)

// expanderFor returns the shared tables of order p.
func expanderFor(p int) *expander {
	expandersMu.Lock()
	defer expandersMu.Unlock()
	if e, ok := expanders[p]; ok {
		return e
	}
	e := newExpander(p)
	expanders[p] = e
	return e
}

func newExpander(p int) *expander {
	n := p + 1
	// Pascal's triangle up to 2p, exact in float64 while C < 2^53 and
	// correctly rounded beyond (each entry is a sum of two rounded ones; the
	// relative error stays below 2p ulps, far under any tolerance we offer).
	binom := make([][]float64, 2*p+1)
	for i := range binom {
		binom[i] = make([]float64, i+1)
		binom[i][0], binom[i][i] = 1, 1
		for j := 1; j < i; j++ {
			binom[i][j] = binom[i-1][j-1] + binom[i-1][j]
		}
	}
	e := &expander{p: p, hank: make([]float64, n*n), pasc: make([]float64, n*n), lbin: make([]float64, n*n),
		invK: make([]float64, n), invKK1: make([]float64, n)}
	for l := 0; l <= p; l++ {
		for k := 1; k <= p; k++ {
			e.hank[l*n+k] = binom[l+k-1][k-1]
		}
	}
	for l := 1; l <= p; l++ {
		for k := 1; k <= l; k++ {
			e.pasc[l*n+k] = binom[l-1][k-1]
		}
	}
	for m := 0; m <= p; m++ {
		for l := m; l <= p; l++ {
			e.lbin[m*n+l] = binom[l][m]
		}
	}
	for k := 1; k <= p; k++ {
		e.invK[k] = 1 / float64(k)
		e.invKK1[k] = 1 / float64(k*(k+1))
	}
	return e
}

// inv returns 1/z without the runtime's careful (slow) complex division; z is
// never 0, Inf or NaN here.
func inv(z complex128) complex128 {
	x, y := real(z), imag(z)
	d := 1 / (x*x + y*y)
	return complex(x*d, -y*d)
}

// addPanel adds to the multipole m (centre c, scale r) a straight panel from a
// to b carrying single-layer density s and double-layer density d. Its
// moments about c are exact: with A = (a-c)/r, B = (b-c)/r,
//
//	int ((zeta - c)/r)^k ds = L/(k+1) sum_{i=0..k} A^i B^(k-i) = L S_k/(k+1),
//
// since int_0^L (A r + tau e)^k dtau = r^k (B^(k+1) - A^(k+1)) L/((B - A)(k+1))
// with e the panel's unit tangent; the recurrence S_k = B S_{k-1} + A^k sums
// the geometric form without the cancellation of B^(k+1) - A^(k+1) on a short
// panel. The single layer adds -s L S_k/(k (k+1)) to A_k (from
// log(z - zeta) = log(z - c) - sum_k ((zeta-c)/(z-c))^k / k) and s L to a0;
// the double layer, whose kernel is the derivative along nu = -i e, adds
// -d nu L S_{k-1}/(k r) (from 1/(z - zeta) = sum_k (zeta-c)^(k-1)/(z-c)^k).
//
// A double layer of linear density g (s - L/2) (s the arc length from a)
// adds -g nu/r int (tau - L/2) u^(k-1) dtau, u = A + tau (B - A)/L; with
// tau - L/2 = L (u - M)/(B - A), M = (A + B)/2, the integral is
// (L^2/(B - A)) (S_k/(k+1) - M S_(k-1)/k), so A_k gains
// i g L (S_k/(k+1) - M S_(k-1)/k). The difference cancels to O(|B - A|^2)
// of its terms; its rounding, eps (r/L)^2 of the terms, is eps g L r at
// most against the panel's constant double layer of strength d L: far below
// any tolerance, since g L is a potential difference along one panel.
func (e *expander) addPanel(m []complex128, c complex128, r float64, a, b complex128, s, d, g float64) {
	p := e.p
	m = m[:p+1]
	ab := b - a
	l := math.Hypot(real(ab), imag(ab))
	ir := 1 / r
	A := (a - c) * complex(ir, 0)
	B := (b - c) * complex(ir, 0)
	m[0] += complex(s*l, 0)
	cs := -s * l
	// nu = -i e = -i (b-a)/L, so d nu L / r = -i d (b-a)/r.
	cd := complex(0, d*ir) * ab // -(d nu L / r)
	pw := complex(1, 0)         // A^k
	sk := complex(1, 0)         // S_k
	invK, invKK1 := e.invK[:p+1], e.invKK1[:p+1]
	switch {
	case g != 0:
		cg := complex(0, g*l)
		mid := 0.5 * (A + B)
		for k := 1; k <= p; k++ {
			prev := sk
			pw *= A
			sk = B*sk + pw
			lin := cg * (sk*complex(1/float64(k+1), 0) - mid*prev*complex(invK[k], 0))
			m[k] += complex(cs*invKK1[k], 0)*sk + complex(invK[k], 0)*(cd*prev) + lin
		}
	case d == 0:
		for k := 1; k <= p; k++ {
			pw *= A
			sk = B*sk + pw
			m[k] += complex(cs*invKK1[k], 0) * sk
		}
	case s == 0:
		for k := 1; k <= p; k++ {
			m[k] += complex(invK[k], 0) * (cd * sk)
			pw *= A
			sk = B*sk + pw
		}
	default:
		for k := 1; k <= p; k++ {
			prev := sk
			pw *= A
			sk = B*sk + pw
			m[k] += complex(cs*invKK1[k], 0)*sk + complex(invK[k], 0)*(cd*prev)
		}
	}
}

// addPoint adds to the multipole m (centre c, scale r) a point source of
// strength q at y: a0 += q, A_k += -q ((y-c)/r)^k / k.
func (e *expander) addPoint(m []complex128, c complex128, r float64, y complex128, q float64) {
	p := e.p
	m = m[:p+1]
	m[0] += complex(q, 0)
	z := (y - c) * complex(1/r, 0)
	pw := complex(1, 0)
	for k := 1; k <= p; k++ {
		pw *= z
		m[k] -= complex(q*e.invK[k], 0) * pw
	}
}

// m2m adds the multipole src (centre c1, scale r1) to dst (centre c0, scale
// r0) (Greengard & Rokhlin 1987, Lemma 2.3): with z = (c1 - c0)/r0 and
// A'_k = A_k (r1/r0)^k,
//
//	B_l = -a0 z^l / l + sum_{k=1..l} A'_k z^(l-k) C(l-1, k-1).
//
// When the centres are not too close (|c1 - c0| >= r1/8, so that no power
// below overflows or underflows) it is evaluated as
// B_l = z^l (-a0/l + sum_k C(l-1,k-1) alpha_k), alpha_k = A_k (r1/(c1-c0))^k:
// a real triangular matrix times a vector, the same products associated
// differently. pw is scratch of length p+1.
func (e *expander) m2m(dst, src []complex128, c0, c1 complex128, r0, r1 float64, pw []complex128) {
	p := e.p
	n := p + 1
	dst, src, pw = dst[:n], src[:n], pw[:n]
	a0 := real(src[0])
	dst[0] += complex(a0, 0)
	z0 := c1 - c0
	if z0 == 0 {
		sc := r1 / r0
		f := 1.0
		for k := 1; k <= p; k++ {
			f *= sc
			dst[k] += complex(f, 0) * src[k]
		}
		return
	}
	z := z0 * complex(1/r0, 0)
	if abs2(z0)*64 >= r1*r1 && abs2(z)*256 >= 1 {
		t := inv(z0) * complex(r1, 0)
		f := complex(1, 0)
		for k := 1; k <= p; k++ {
			f *= t
			pw[k] = f * src[k]
		}
		zl := complex(1, 0)
		for l := 1; l <= p; l++ {
			row := e.pasc[l*n : l*n+l+1]
			var br, bi float64
			for k := 1; k <= l; k++ {
				br += row[k] * real(pw[k])
				bi += row[k] * imag(pw[k])
			}
			zl *= z
			dst[l] += zl * complex(br-a0*e.invK[l], bi)
		}
		return
	}
	// Close centres: the direct sum with powers of z.
	sc := r1 / r0
	f := 1.0
	pw[0] = 1
	for k := 1; k <= p; k++ {
		pw[k] = pw[k-1] * z
	}
	for l := 1; l <= p; l++ {
		row := e.pasc[l*n : l*n+l+1]
		acc := -complex(a0*e.invK[l], 0) * pw[l]
		f = 1
		for k := 1; k <= l; k++ {
			f *= sc
			acc += complex(row[k]*f, 0) * src[k] * pw[l-k]
		}
		dst[l] += acc
	}
}

func abs2(z complex128) float64 { return real(z)*real(z) + imag(z)*imag(z) }

// m2lScratch is per-goroutine scratch for m2l.
type m2lScratch struct {
	ar, ai []float64
}

func newM2LScratch(p int) *m2lScratch {
	return &m2lScratch{ar: make([]float64, p+1), ai: make([]float64, p+1)}
}

// m2l adds to the local expansion loc (centre c0, scale r0) the multipole mp
// (centre c1, scale r1) (Greengard & Rokhlin 1987, Lemma 2.4): with
// z0 = c1 - c0, ts = r1/z0, tt = r0/z0 and alpha_k = (-ts)^k A_k,
//
//	L_0 += a0 ln|z0| + sum_k alpha_k
//	L_l += tt^l (-a0/l + sum_{k=1..p} C(l+k-1, k-1) alpha_k),  l >= 1.
func (e *expander) m2l(loc, mp []complex128, c0, c1 complex128, r0, r1 float64, s *m2lScratch) {
	p := e.p
	n := p + 1
	loc, mp = loc[:n], mp[:n]
	ar, ai := s.ar[:n], s.ai[:n]
	z0 := c1 - c0
	iz := inv(z0)
	mts := iz * complex(-r1, 0)
	tt := iz * complex(r0, 0)
	a0 := real(mp[0])
	pw := complex(1, 0)
	var s0r, s0i float64
	for k := 1; k <= p; k++ {
		pw *= mts
		al := pw * mp[k]
		ar[k], ai[k] = real(al), imag(al)
		s0r += real(al)
		s0i += imag(al)
	}
	loc[0] += complex(a0*0.5*math.Log(real(z0)*real(z0)+imag(z0)*imag(z0))+s0r, s0i)
	// beta_l = sum_k H[l][k] alpha_k, four rows at a time to keep eight
	// independent sums in flight.
	h := e.hank
	ttl := complex(1, 0)
	l := 1
	for ; l+3 <= p; l += 4 {
		r0w := h[l*n : l*n+n]
		r1w := h[(l+1)*n : (l+1)*n+n]
		r2w := h[(l+2)*n : (l+2)*n+n]
		r3w := h[(l+3)*n : (l+3)*n+n]
		var b0r, b0i, b1r, b1i, b2r, b2i, b3r, b3i float64
		for k := 1; k < n; k++ {
			xr, xi := ar[k], ai[k]
			c0k, c1k, c2k, c3k := r0w[k], r1w[k], r2w[k], r3w[k]
			b0r += c0k * xr
			b0i += c0k * xi
			b1r += c1k * xr
			b1i += c1k * xi
			b2r += c2k * xr
			b2i += c2k * xi
			b3r += c3k * xr
			b3i += c3k * xi
		}
		ttl *= tt
		loc[l] += ttl * complex(b0r-a0*e.invK[l], b0i)
		ttl *= tt
		loc[l+1] += ttl * complex(b1r-a0*e.invK[l+1], b1i)
		ttl *= tt
		loc[l+2] += ttl * complex(b2r-a0*e.invK[l+2], b2i)
		ttl *= tt
		loc[l+3] += ttl * complex(b3r-a0*e.invK[l+3], b3i)
	}
	for ; l <= p; l++ {
		row := h[l*n : l*n+n]
		var br, bi float64
		for k := 1; k < n; k++ {
			br += row[k] * ar[k]
			bi += row[k] * ai[k]
		}
		ttl *= tt
		loc[l] += ttl * complex(br-a0*e.invK[l], bi)
	}
}

// l2l adds the local expansion src (centre c0, scale r0) to dst (centre c1,
// scale r1) (Greengard & Rokhlin 1987, Lemma 2.5): the polynomial
// sum L_l x^l shifted to x + z, z = (c1 - c0)/r0, and rescaled,
//
//	L'_m = (r1/r0)^m sum_{l>=m} C(l, m) z^(l-m) L_l.
//
// When the centres are not too close it is evaluated as
// L'_m = (r1/(c1-c0))^m sum_l C(l, m) lambda_l with lambda_l = L_l z^l (a
// real triangular matrix times a vector), otherwise with powers of z. tmp is
// scratch of length p+1.
func (e *expander) l2l(dst, src []complex128, c0, c1 complex128, r0, r1 float64, tmp []complex128) {
	p := e.p
	n := p + 1
	dst, src, tmp = dst[:n], src[:n], tmp[:n]
	z0 := c1 - c0
	sc := r1 / r0
	if z0 == 0 {
		f := 1.0
		dst[0] += src[0]
		for m := 1; m <= p; m++ {
			f *= sc
			dst[m] += complex(f, 0) * src[m]
		}
		return
	}
	z := z0 * complex(1/r0, 0)
	if abs2(z0)*64 >= r1*r1 && abs2(z)*256 >= 1 {
		f := complex(1, 0)
		for l := 0; l <= p; l++ {
			tmp[l] = f * src[l]
			f *= z
		}
		t := inv(z0) * complex(r1, 0)
		f = 1
		for m := 0; m <= p; m++ {
			row := e.lbin[m*n : m*n+n]
			var br, bi float64
			for l := m; l <= p; l++ {
				br += row[l] * real(tmp[l])
				bi += row[l] * imag(tmp[l])
			}
			dst[m] += f * complex(br, bi)
			f *= t
		}
		return
	}
	tmp[0] = 1
	for k := 1; k <= p; k++ {
		tmp[k] = tmp[k-1] * z
	}
	f := 1.0
	for m := 0; m <= p; m++ {
		row := e.lbin[m*n : m*n+n]
		var acc complex128
		for l := m; l <= p; l++ {
			acc += complex(row[l], 0) * src[l] * tmp[l-m]
		}
		dst[m] += complex(f, 0) * acc
		f *= sc
	}
}

// evalLocal returns w and w' of the local expansion loc (centre c, scale r)
// at z (Horner).
func (e *expander) evalLocal(loc []complex128, c complex128, r float64, z complex128) (w, dw complex128) {
	p := e.p
	loc = loc[:p+1]
	u := (z - c) * complex(1/r, 0)
	w = loc[p]
	for l := p - 1; l >= 0; l-- {
		dw = dw*u + w
		w = w*u + loc[l]
	}
	return w, dw * complex(1/r, 0)
}

// evalLocalU returns Re w only.
func (e *expander) evalLocalU(loc []complex128, c complex128, r float64, z complex128) float64 {
	p := e.p
	loc = loc[:p+1]
	u := (z - c) * complex(1/r, 0)
	w := loc[p]
	for l := p - 1; l >= 0; l-- {
		w = w*u + loc[l]
	}
	return real(w)
}

// evalMultipole returns Re w and w' of the multipole mp (centre c, scale r)
// at z, |z - c| > r:
//
//	w  = a0 log(z - c) + sum_k A_k t^k,  t = r/(z - c)
//	w' = (a0 - sum_k k A_k t^k) / (z - c).
func (e *expander) evalMultipole(mp []complex128, c complex128, r float64, z complex128, grad bool) (u float64, dw complex128) {
	p := e.p
	mp = mp[:p+1]
	dz := z - c
	idz := inv(dz)
	t := idz * complex(r, 0)
	a0 := real(mp[0])
	var w, g complex128
	for k := p; k >= 1; k-- {
		w = (w + mp[k]) * t
	}
	u = a0*0.5*math.Log(real(dz)*real(dz)+imag(dz)*imag(dz)) + real(w)
	if !grad {
		return u, 0
	}
	for k := p; k >= 1; k-- {
		g = (g + complex(float64(k), 0)*mp[k]) * t
	}
	return u, (complex(a0, 0) - g) * idz
}
