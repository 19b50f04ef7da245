package fmm

import (
	"math"

	"gonum.org/v1/gonum/spatial/r2"
)

// Field is the far field of one density over a tree's sources, ready to be
// evaluated at any point, one at a time (a flux line traced step by step, a
// probe): the multipoles are formed once, and each point walks the source
// boxes from the root. A box whose radius is at most rho = 0.5 times the
// distance from the point to its centre gives its multipole (the
// acceptance test of the targets of a leaf in Apply, with the same error
// bound), a nearer box is opened, and the panels of the nearest leaves are
// handed to the caller for their exact near field; point sources there are
// summed exactly. The cost per point grows as the logarithm of the number
// of sources. A Field is safe for concurrent use.
type Field struct {
	t  *Tree
	mp []complex128
	s  []float64 // point strengths in source tree order (panels: unused)
}

// Field forms the multipoles of density d. The tree's targets are not
// used: build it with none (New(panels, points, nil, o)) when it serves
// only Fields.
func (t *Tree) Field(d Density) *Field {
	t.checkDensity(d)
	f := &Field{t: t}
	if len(t.sa) == 0 {
		return f
	}
	w := t.acquire()
	defer t.release(w)
	t.gather(w, d)
	t.upward(w)
	f.mp = append([]complex128(nil), w.mp...)
	if t.nq > 0 {
		f.s = append([]float64(nil), w.s...)
	}
	return f
}

// At returns the far part of the potential at x (and its gradient when grad
// is true) and calls near with each panel it leaves out, in no particular
// order: every panel of the source leaves whose boxes are too close to x for
// their multipoles. A panel that x lies on, or is nearer to than half its
// length, is always among them. near may be nil to drop the near field.
func (f *Field) At(x r2.Vec, grad bool, near func(panel int)) (u float64, g r2.Vec) {
	t := f.t
	if len(t.sa) == 0 {
		return 0, r2.Vec{}
	}
	q := t.tree
	n := t.e.p + 1
	z := cplx(x)
	lim := 1 / (rho * rho)
	var wr float64
	var dw complex128
	var stack [256]int32
	stack[0] = 0
	top := 1
	for top > 0 {
		top--
		i := stack[top]
		nd := &q.nodes[i]
		if !nd.hasSources() {
			continue
		}
		if abs2(z-nd.sc) >= nd.sr*nd.sr*lim {
			ur, gw := t.e.evalMultipole(f.mp[int(i)*n:int(i)*n+n], nd.sc, nd.sr, z, grad)
			wr += ur
			dw += gw
			continue
		}
		if nd.leaf() {
			for k := nd.slo; k < nd.shi; k++ {
				it := int(q.src[k])
				if it < t.np {
					if near != nil {
						near(it)
					}
					continue
				}
				dz := z - t.sa[k]
				if dz == 0 || f.s[k] == 0 {
					continue
				}
				wr += f.s[k] * 0.5 * math.Log(abs2(dz))
				if grad {
					dw += complex(f.s[k], 0) * inv(dz)
				}
			}
			continue
		}
		for c := nd.first; c < nd.first+nd.nchild; c++ {
			if top == len(stack) {
				// Deeper than any tree New builds (depth at most 46, at most
				// 3 siblings waiting a level): a bug if ever reached.
				panic("fmm: Field.At: tree walk overflow")
			}
			stack[top] = c
			top++
		}
	}
	u = -inv2Pi * wr
	if grad {
		g = r2.Vec{X: -inv2Pi * real(dw), Y: inv2Pi * imag(dw)}
	}
	return u, g
}
