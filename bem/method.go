package bem

import "fmt"

// Method is a linear solver of the boundary element system.
type Method uint8

const (
	// Auto picks Dense or Fast by size and the number of right-hand sides
	// (Settings.RightHandSides): dense LU below the crossover measured on
	// the two-core machine (README, Performance), the fast solver above it
	// and whenever the dense system would exceed Settings.MaxUnknowns.
	Auto Method = iota
	// Dense assembles the whole matrix and factorises it by LU: exact to
	// rounding, memory 16 N^2 bytes, time growing as N^3; further
	// right-hand sides cost N^2 each.
	Dense
	// Fast applies the same matrix without storing it: the far field by
	// the fast multipole method (package bem/fmm), the near field from
	// the closed forms, and solves by preconditioned GMRES (package
	// bem/krylov) to Settings.Tol; memory and time per right-hand side
	// grow as N.
	Fast
)

func (m Method) String() string {
	switch m {
	case Auto:
		return "auto"
	case Dense:
		return "dense"
	case Fast:
		return "fast"
	}
	return fmt.Sprintf("Method(%d)", uint8(m))
}

// ParseMethod reads a method by its name: "auto", "dense" or "fast".
func ParseMethod(s string) (Method, error) {
	switch s {
	case "auto":
		return Auto, nil
	case "dense":
		return Dense, nil
	case "fast":
		return Fast, nil
	}
	return Auto, fmt.Errorf("bem: solver %q unknown; choose dense, fast or auto", s)
}
