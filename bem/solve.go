package bem

import (
	"errors"

	"github.com/rimfield/rimfield/mesh"
	"gonum.org/v1/gonum/spatial/r2"
)

// System is an assembled and factorised boundary element system; it solves
// any number of right-hand sides (Data) for the same mesh and condition kinds.
type System struct {
	mesh *mesh.Mesh
}

// Assemble builds and factorises the system for the mesh.
func Assemble(m *mesh.Mesh, s *Settings) (*System, error) {
	return nil, errors.New("bem: assembly in progress")
}

// Solve solves for the data (nil: the mesh's own conditions).
func (sys *System) Solve(d *Data) (*Solution, error) {
	return nil, errors.New("bem: solve in progress")
}

// Solve assembles and solves the mesh with its own conditions.
func Solve(m *mesh.Mesh, s *Settings) (*Solution, error) {
	sys, err := Assemble(m, s)
	if err != nil {
		return nil, err
	}
	return sys.Solve(nil)
}

// Eval returns the potential and its gradient at p.
func (s *Solution) Eval(p r2.Vec) Point { return Point{} }

// Owners returns the integrated results per body and edge, in Layout.Owners order.
func (s *Solution) Owners() []OwnerResult { return nil }
