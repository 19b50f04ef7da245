package seep

import (
	"errors"
	"fmt"
	"math"

	"github.com/rimfield/rimfield/bem"
	"github.com/rimfield/rimfield/geom"
	"github.com/rimfield/rimfield/mesh"
)

// Defaults of the truncation study.
const (
	// DefaultTruncationFactor multiplies the distances from the
	// structures to the moved walls.
	DefaultTruncationFactor = 2.0
	// DefaultTruncationTolerance is the relative change of the discharge
	// or the exit gradient above which the study warns (a few per cent is
	// usual in practice; common practice).
	DefaultTruncationTolerance = 0.02
)

// TruncationOptions tunes Truncation. The zero value gives the defaults.
type TruncationOptions struct {
	// Factor (> 1) multiplies the distance from the core of the section
	// (everything that is not an outer wall) to each moved wall; 0:
	// DefaultTruncationFactor.
	Factor float64
	// Tolerance is the relative change above which the study warns; 0:
	// DefaultTruncationTolerance.
	Tolerance float64
	// Mesh are the options the base solution's mesh was built with. The
	// moved section is meshed with them at the base mesh's nominal size,
	// so that the structures keep their panels and the change is the
	// walls', not the mesh's.
	Mesh mesh.Options
	// Settings for the assembly of the moved section; nil: defaults.
	Settings *bem.Settings
	// Analysis are the options of the base report.
	Analysis Options
}

// TruncationStudy compares a section with the same section whose outer
// walls are moved out.
type TruncationStudy struct {
	// Factor is the factor the distances to the walls were multiplied by;
	// Moved names the walls that moved ("left", "right", "bottom").
	Factor float64
	Moved  []string
	// Scene is the moved section, Report its analysis and Panels its
	// panel count.
	Scene  *geom.Scene
	Report *Report
	Panels int
	// Discharge and ExitGradient are the base and the moved values (m^2/s;
	// 1), and their relative changes (moved/base - 1).
	Discharge, MovedDischarge, DischargeChange          float64
	ExitGradient, MovedExitGradient, ExitGradientChange float64
	// Warnings, one sentence each.
	Warnings []string
}

// Truncation re-solves the section of base (the report of sc's solution)
// with its outer insulated walls moved out (see Truncate) and reports how
// much the discharge and the governing exit gradient moved, with a
// warning when either changes by more than the tolerance. It works on a
// copy of sc and goes through Layout, mesh.Build, bem.Assemble and Solve
// again: about the cost of the first solve, more as the walls lengthen.
func Truncation(sc *geom.Scene, base *Report, o TruncationOptions) (*TruncationStudy, error) {
	if base == nil || base.Solution == nil {
		panic("seep: Truncation needs the base report of the scene's solution")
	}
	if o.Factor == 0 {
		o.Factor = DefaultTruncationFactor
	}
	if !(o.Factor > 1) || math.IsInf(o.Factor, 1) {
		return nil, fmt.Errorf("seep: truncation factor %g must be a finite number above 1 (0 for the default %g)", o.Factor, DefaultTruncationFactor)
	}
	if o.Tolerance == 0 {
		o.Tolerance = DefaultTruncationTolerance
	}
	if !(o.Tolerance > 0) {
		return nil, fmt.Errorf("seep: truncation tolerance %g must be positive (0 for the default %g)", o.Tolerance, DefaultTruncationTolerance)
	}
	moved, walls, err := Truncate(sc, base.Solution.Mesh.Layout, o.Factor)
	if err != nil {
		return nil, err
	}
	lay, err := moved.Layout()
	if err != nil {
		return nil, fmt.Errorf("seep: the section with its walls moved out: %w", err)
	}
	mo := o.Mesh
	mo.Panels = 0
	mo.Size = base.Solution.Mesh.Size
	m, err := mesh.Build(lay, mo)
	if err != nil {
		return nil, fmt.Errorf("seep: the section with its walls moved out: %w", err)
	}
	sys, err := bem.Assemble(m, o.Settings)
	if err != nil {
		return nil, err
	}
	sol, err := sys.Solve(nil)
	if err != nil {
		return nil, err
	}
	rep, err := Analyse(moved, sys, sol, o.Analysis)
	if err != nil {
		return nil, err
	}
	st := &TruncationStudy{Factor: o.Factor, Moved: walls, Scene: moved, Report: rep, Panels: len(m.Panels),
		Discharge: base.Discharge, MovedDischarge: rep.Discharge,
		ExitGradient: math.NaN(), MovedExitGradient: math.NaN()}
	st.DischargeChange = change(st.Discharge, st.MovedDischarge)
	if base.ExitGradient != nil {
		st.ExitGradient = base.ExitGradient.Value
	}
	if rep.ExitGradient != nil {
		st.MovedExitGradient = rep.ExitGradient.Value
	}
	st.ExitGradientChange = change(st.ExitGradient, st.MovedExitGradient)
	for _, c := range []struct {
		what   string
		change float64
	}{{"discharge", st.DischargeChange}, {"exit gradient", st.ExitGradientChange}} {
		if math.Abs(c.change) > o.Tolerance {
			st.Warnings = append(st.Warnings, fmt.Sprintf(
				"the %s changes by %.3g %% when the outer walls (%v) are moved %g times as far out: the section is truncated too close to the structures; widen or deepen it",
				c.what, 100*c.change, walls, o.Factor))
		}
	}
	return st, nil
}

func change(base, moved float64) float64 {
	if base == 0 || math.IsNaN(base) || math.IsNaN(moved) {
		return math.NaN()
	}
	return moved/base - 1
}

// Truncate returns a copy of sc whose outer insulated walls are moved out:
// the soil's bounding box has sides x = x0 and x = x1 and bottom y = y0;
// each of them that carries an insulated wall of lay (sc's layout) moves
// so that its distance from the core of the section (every vertex of every
// feature not on the bounding box's sides or bottom) is multiplied by
// factor. Coordinates between the core and a moved wall are stretched
// linearly: beds (edges) that end on a moved wall are extended with it,
// layers keep their thicknesses except the deepest, which deepens, and
// the structures, which lie in the core, do not move. The top is not
// moved. It also returns the names of the walls moved.
func Truncate(sc *geom.Scene, lay *geom.Layout, factor float64) (*geom.Scene, []string, error) {
	if !(factor > 1) {
		return nil, nil, fmt.Errorf("seep: truncation factor %g must be above 1", factor)
	}
	if len(sc.Regions) == 0 || lay.Open {
		return nil, nil, errors.New("seep: only a closed section (one with regions) has outer walls to move")
	}
	// The soil's bounding box (structures may stick out of it).
	x0, x1, y0 := math.Inf(1), math.Inf(-1), math.Inf(1)
	for _, r := range sc.Regions {
		for _, pg := range r.Polygons {
			for _, ring := range pg {
				for _, v := range ring {
					x0, x1, y0 = math.Min(x0, v.X), math.Max(x1, v.X), math.Min(y0, v.Y)
				}
			}
		}
	}
	tol := 1e-9 * lay.Diagonal
	// Which sides carry an insulated wall.
	var left, right, bottom bool
	for _, p := range lay.Pieces {
		if p.Interface() || p.Owner >= 0 {
			continue
		}
		switch {
		case math.Abs(p.A.X-x0) <= tol && math.Abs(p.B.X-x0) <= tol:
			left = true
		case math.Abs(p.A.X-x1) <= tol && math.Abs(p.B.X-x1) <= tol:
			right = true
		case math.Abs(p.A.Y-y0) <= tol && math.Abs(p.B.Y-y0) <= tol:
			bottom = true
		}
	}
	// The core: the vertices off the moved sides.
	cx0, cx1, cy0 := math.Inf(1), math.Inf(-1), math.Inf(1)
	eachVertex(sc, func(x, y float64) {
		if x > x0+tol && x < x1-tol {
			cx0, cx1 = math.Min(cx0, x), math.Max(cx1, x)
		}
		if y > y0+tol {
			cy0 = math.Min(cy0, y)
		}
	})
	if math.IsInf(cx0, 0) { // nothing inside: stretch about the middle
		cx0, cx1 = (x0+x1)/2, (x0+x1)/2
	}
	var walls []string
	mapX := func(x float64) float64 {
		switch {
		case left && x < cx0:
			return cx0 - factor*(cx0-x)
		case right && x > cx1:
			return cx1 + factor*(x-cx1)
		}
		return x
	}
	mapY := func(y float64) float64 {
		if bottom && y < cy0 {
			return cy0 - factor*(cy0-y)
		}
		return y
	}
	if left {
		walls = append(walls, "left")
	}
	if right {
		walls = append(walls, "right")
	}
	if bottom && !math.IsInf(cy0, 0) {
		walls = append(walls, "bottom")
	}
	if len(walls) == 0 {
		return nil, nil, errors.New("seep: the section has no insulated outer wall on its sides or bottom to move")
	}
	out := copyScene(sc)
	for i := range out.Regions {
		mapPolygons(out.Regions[i].Polygons, mapX, mapY)
	}
	mapLines := func(ls []geom.Line) {
		for _, l := range ls {
			for k := range l {
				l[k].X, l[k].Y = mapX(l[k].X), mapY(l[k].Y)
			}
		}
	}
	for i := range out.Bodies {
		mapPolygons(out.Bodies[i].Polygons, mapX, mapY)
		mapLines(out.Bodies[i].Lines)
	}
	for i := range out.Edges {
		mapLines(out.Edges[i].Lines)
	}
	return out, walls, nil
}

// eachVertex calls f with every vertex of the scene's regions, bodies and
// edges.
func eachVertex(sc *geom.Scene, f func(x, y float64)) {
	for _, r := range sc.Regions {
		for _, pg := range r.Polygons {
			for _, ring := range pg {
				for _, v := range ring {
					f(v.X, v.Y)
				}
			}
		}
	}
	for _, b := range sc.Bodies {
		for _, pg := range b.Polygons {
			for _, ring := range pg {
				for _, v := range ring {
					f(v.X, v.Y)
				}
			}
		}
		for _, l := range b.Lines {
			for _, v := range l {
				f(v.X, v.Y)
			}
		}
	}
	for _, e := range sc.Edges {
		for _, l := range e.Lines {
			for _, v := range l {
				f(v.X, v.Y)
			}
		}
	}
}

func mapPolygons(pgs []geom.Polygon, mapX, mapY func(float64) float64) {
	for _, pg := range pgs {
		for _, ring := range pg {
			for k := range ring {
				ring[k].X, ring[k].Y = mapX(ring[k].X), mapY(ring[k].Y)
			}
		}
	}
}

// copyScene returns a deep copy of the scene's geometry (the rest is
// copied by value).
func copyScene(sc *geom.Scene) *geom.Scene {
	out := *sc
	out.Regions = append([]geom.Region(nil), sc.Regions...)
	out.Bodies = append([]geom.Body(nil), sc.Bodies...)
	out.Edges = append([]geom.Edge(nil), sc.Edges...)
	out.Warnings = append([]string(nil), sc.Warnings...)
	for i := range out.Regions {
		out.Regions[i].Polygons = copyPolygons(sc.Regions[i].Polygons)
	}
	for i := range out.Bodies {
		out.Bodies[i].Polygons = copyPolygons(sc.Bodies[i].Polygons)
		out.Bodies[i].Lines = copyLines(sc.Bodies[i].Lines)
	}
	for i := range out.Edges {
		out.Edges[i].Lines = copyLines(sc.Edges[i].Lines)
	}
	return &out
}

func copyLines(ls []geom.Line) []geom.Line {
	if ls == nil {
		return nil
	}
	out := make([]geom.Line, len(ls))
	for k, l := range ls {
		out[k] = append(geom.Line(nil), l...)
	}
	return out
}

func copyPolygons(pgs []geom.Polygon) []geom.Polygon {
	out := make([]geom.Polygon, len(pgs))
	for i, pg := range pgs {
		out[i] = make(geom.Polygon, len(pg))
		for k, ring := range pg {
			out[i][k] = append(geom.Ring(nil), ring...)
		}
	}
	return out
}
