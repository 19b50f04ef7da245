package electro

import (
	"errors"
	"fmt"
	"math"

	"github.com/rimfield/rimfield/bem"
	"github.com/rimfield/rimfield/geom"
	"github.com/rimfield/rimfield/mesh"
)

// AsymmetryLimit is the measured asymmetry of a capacitance matrix,
// max|C_ij - C_ji| / max|C_ii|, above which Capacitance adds a warning. The
// exact matrix is symmetric (reciprocity); a discrete one is symmetric only
// to the accuracy of the mesh, so the asymmetry is a cheap error indicator.
const AsymmetryLimit = 1e-3

// ErrNoConductors is returned by Capacitance for a scene without any body or
// edge at a fixed potential.
var ErrNoConductors = errors.New("electro: the scene has no body or edge at a fixed potential, so it has no capacitance matrix; give the conductors a \"potential\"")

// Matrix is the Maxwell capacitance matrix per metre of length over the
// conductors at a fixed potential.
type Matrix struct {
	// Names are the conductors' names, in Layout.Owners order.
	Names []string
	// Owners are the conductors' indices into Layout.Owners.
	Owners []int
	// C is the matrix in F/m: C[i][j] is the charge per metre on conductor
	// i with 1 V on conductor j, 0 V on the other fixed conductors, every
	// floating conductor uncharged and every prescribed flux set to zero.
	// It is reported as solved, not symmetrised.
	C [][]float64
	// Asymmetry is max|C_ij - C_ji| / max|C_ii|.
	Asymmetry float64
	// Warnings lists concerns about the matrix, one sentence each.
	Warnings []string
}

// Capacitance returns the Maxwell capacitance matrix of the conductors of m
// at a fixed potential (bodies and edges with a "potential" condition). It
// solves one right-hand side per conductor on the one factorisation held by
// sys, which must have been assembled for m. It returns ErrNoConductors when
// there is no conductor at a fixed potential.
//
// In an open scene without a ground plane the total charge is zero for any
// potentials, so every row sums to zero. With a ground plane, or in a closed
// scene whose walls are not all conductors, the row sum is the capacitance
// of the conductor to the rest (see Partial).
func Capacitance(sys *bem.System, m *mesh.Mesh) (*Matrix, error) {
	if sys == nil || m == nil || m.Layout == nil {
		panic("electro: Capacitance needs a system and its mesh")
	}
	lay := m.Layout
	cm := &Matrix{}
	for o, ow := range lay.Owners {
		if ow.Cond.Kind == geom.Potential {
			cm.Names = append(cm.Names, ow.Name)
			cm.Owners = append(cm.Owners, o)
		}
	}
	if len(cm.Owners) == 0 {
		return nil, ErrNoConductors
	}
	data := make([]bem.Data, len(cm.Owners))
	for j, oj := range cm.Owners {
		conds := make([]geom.Condition, len(lay.Owners))
		for o, ow := range lay.Owners {
			// Fixed conductors at 0 V but conductor j at 1 V, floating ones
			// uncharged, prescribed fluxes zero: the zero values of each kind.
			conds[o] = geom.Condition{Kind: ow.Cond.Kind}
		}
		conds[oj].Value = 1
		data[j].Owners = conds
	}
	sols, err := sys.SolveMany(data)
	if err != nil {
		return nil, err
	}
	n := len(cm.Owners)
	cm.C = make([][]float64, n)
	for i := range cm.C {
		cm.C[i] = make([]float64, n)
	}
	for j, s := range sols {
		res := s.Owners()
		for i, oi := range cm.Owners {
			cm.C[i][j] = res[oi].Inflow
		}
	}
	diag := 0.0
	for i := range n {
		diag = math.Max(diag, math.Abs(cm.C[i][i]))
	}
	if diag > 0 {
		for i := range n {
			for j := range i {
				cm.Asymmetry = math.Max(cm.Asymmetry, math.Abs(cm.C[i][j]-cm.C[j][i])/diag)
			}
		}
	}
	if cm.Asymmetry > AsymmetryLimit {
		cm.Warnings = append(cm.Warnings, fmt.Sprintf(
			"the capacitance matrix is asymmetric by %.2g of its largest diagonal entry (exact: 0): the mesh is too coarse for the coupling between conductors; raise --panels", cm.Asymmetry))
	}
	return cm, nil
}

// Partial returns the partial capacitances per metre in F/m: mutual[i][j] =
// -C[i][j] between conductors i and j (i != j; mutual[i][i] is 0), and
// ground[i] = sum_j C[i][j], the capacitance of conductor i to everything
// that is not one of the fixed conductors (a ground plane, insulated walls
// at infinity). Charges follow as Q_i = ground[i] V_i + sum_j mutual[i][j]
// (V_i - V_j).
func (c *Matrix) Partial() (mutual [][]float64, ground []float64) {
	n := len(c.C)
	mutual = make([][]float64, n)
	ground = make([]float64, n)
	for i := range n {
		mutual[i] = make([]float64, n)
		for j := range n {
			ground[i] += c.C[i][j]
			if i != j {
				mutual[i][j] = -c.C[i][j]
			}
		}
	}
	return mutual, ground
}
