package krylov

import (
	"fmt"

	"gonum.org/v1/gonum/blas"
	"gonum.org/v1/gonum/blas/blas64"
	"gonum.org/v1/gonum/mat"
)

// Dense is a dense square matrix as an Operator (a stored system, and the
// reference of the tests).
type Dense struct {
	a blas64.General
}

// NewDense wraps a square matrix; it is used, not copied. A matrix that is
// not square is a caller bug and panics.
func NewDense(a *mat.Dense) *Dense {
	r, c := a.Dims()
	if r != c {
		panic(fmt.Sprintf("krylov: NewDense with a %d x %d matrix: an operator must be square", r, c))
	}
	return &Dense{a: a.RawMatrix()}
}

// Dim returns the matrix order.
func (d *Dense) Dim() int { return d.a.Rows }

// Apply sets dst = A x.
func (d *Dense) Apply(dst, x []float64) {
	n := d.a.Rows
	blas64.Gemv(blas.NoTrans, 1, d.a, blas64.Vector{N: n, Inc: 1, Data: x}, 0, blas64.Vector{N: n, Inc: 1, Data: dst})
}

// Diagonal is the operator x -> (d_i x_i): with d_i the inverses of a
// matrix's diagonal, the Jacobi preconditioner.
type Diagonal []float64

// Dim returns the length of d.
func (d Diagonal) Dim() int { return len(d) }

// Apply sets dst_i = d_i x_i.
func (d Diagonal) Apply(dst, x []float64) {
	for i, v := range d {
		dst[i] = v * x[i]
	}
}
