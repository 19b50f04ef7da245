package electro

import (
	"errors"
	"fmt"

	"github.com/rimfield/rimfield/bem"
	"github.com/rimfield/rimfield/mesh"
)

// Refinement compares the peak conductor field on a mesh and on one with
// about twice as many panels.
type Refinement struct {
	Coarse, Fine             Peak
	CoarsePanels, FinePanels int
	// Ratio is Fine.Value / Coarse.Value. Near 1 on a smooth surface; at a
	// singular corner with field exponent p the halved smallest panel
	// raises the peak by about 2^(-p) (2^(1/3) = 1.26 at a square corner):
	// the peak is then a property of the mesh, not of the device.
	Ratio float64
}

// PeakStudy re-meshes the layout of coarse with every panel about halved,
// solves it with the layout's own boundary conditions (coarse must be the
// solution for those, not for other Data) and reports the conductor peak
// field of both. o are the options coarse's mesh was built with; the fine
// mesh halves the nominal size (and with it the smallest graded panel at
// singular vertices) and doubles the least number of panels per piece, so
// that pieces held by that minimum, such as the sides of a polygonal
// circle, are split too. That is about twice the panels, fewer where
// grading makes up much of the mesh.
func PeakStudy(coarse *bem.Solution, o mesh.Options, s *bem.Settings) (*Refinement, error) {
	m := coarse.Mesh
	pc, ok := PanelFields(coarse).Peak()
	if !ok {
		return nil, errors.New("electro: the scene has no conductor surface to take a peak field on")
	}
	fo := o
	fo.Panels = 0
	fo.Size = reachOf(m) / 2
	fo.MinPerPiece = 2 * max(o.MinPerPiece, 1)
	fm, err := mesh.Build(m.Layout, fo)
	if err != nil {
		return nil, fmt.Errorf("electro: refined mesh: %w", err)
	}
	// One solve: the layout's own boundary conditions.
	one := bem.Settings{}
	if s != nil {
		one = *s
	}
	one.RightHandSides = 1
	sys, err := bem.Assemble(fm, &one)
	if err != nil {
		return nil, err
	}
	fine, err := sys.Solve(nil)
	if err != nil {
		return nil, err
	}
	pf, _ := PanelFields(fine).Peak()
	return &Refinement{
		Coarse: pc, Fine: pf,
		CoarsePanels: len(m.Panels), FinePanels: len(fm.Panels),
		Ratio: pf.Value / pc.Value,
	}, nil
}
