package main

import (
	"encoding/csv"
	"fmt"
	"io"
	"math"
	"strconv"

	"github.com/rimfield/rimfield/geom"
	"github.com/rimfield/rimfield/mesh"
)

// csvColumn is one column of boundary.csv: a header with its unit
// ("inflow_C_per_m2") and one value per panel.
type csvColumn struct {
	Header string
	Values []float64
}

// boundaryTable is boundary.csv before it is written: one row per panel.
type boundaryTable struct {
	names   []string // boundary name of each panel
	columns []csvColumn
}

// newBoundaryTable gathers the columns of boundary.csv for a solved job:
// boundary, x_m, y_m, s_m, length_m, potential_<unit>, inflow_<unit>, then
// the columns of the physics hook.
func newBoundaryTable(j *job) (*boundaryTable, error) {
	m, sol := j.mesh, j.sol
	n := len(m.Panels)
	if len(sol.U) != n || len(sol.F) != n {
		return nil, fmt.Errorf("internal error: solution has %d potentials and %d inflows for %d panels", len(sol.U), len(sol.F), n)
	}
	units := unitsOf(j.scene.Problem.Physics)
	t := &boundaryTable{names: make([]string, n)}
	x, y, s, l := make([]float64, n), make([]float64, n), make([]float64, n), make([]float64, n)
	for i, p := range m.Panels {
		t.names[i] = panelBoundaryName(m.Layout, p)
		mid := p.Mid()
		x[i], y[i], s[i], l[i] = mid.X, mid.Y, p.S, p.Length()
	}
	t.columns = []csvColumn{
		{"x_m", x}, {"y_m", y}, {"s_m", s}, {"length_m", l},
		{csvHeader("potential", units.potentialCol), sol.U},
		{csvHeader("inflow", units.densityCol), sol.F},
	}
	if h, ok := physicsHooks[j.scene.Problem.Physics]; ok && h.columns != nil {
		extra, err := h.columns(j)
		if err != nil {
			return nil, err
		}
		for _, c := range extra {
			if len(c.Values) != n {
				return nil, fmt.Errorf("internal error: column %s has %d values for %d panels", c.Header, len(c.Values), n)
			}
		}
		t.columns = append(t.columns, extra...)
	}
	return t, nil
}

// panelBoundaryName names the boundary a panel belongs to: its body or edge,
// "interface:<left>|<right>" between two regions (inflow is then into the
// left one), or "wall:<region>" for a region's insulated outer boundary that
// no edge covers.
func panelBoundaryName(lay *geom.Layout, p mesh.Panel) string {
	region := func(i int) string {
		if i >= 0 && i < len(lay.Regions) {
			return lay.Regions[i].Name
		}
		return fmt.Sprintf("region%d", i)
	}
	switch {
	case p.Owner >= 0 && p.Owner < len(lay.Owners) && !p.Interface():
		return lay.Owners[p.Owner].Name
	case p.Interface():
		return "interface:" + region(p.Left) + "|" + region(p.Right)
	}
	return "wall:" + region(p.Left)
}

// warnings names the columns that hold NaN or infinite values, which are
// written as empty cells.
func (t *boundaryTable) warnings() []string {
	var out []string
	for _, c := range t.columns {
		bad := 0
		for _, v := range c.Values {
			if math.IsNaN(v) || math.IsInf(v, 0) {
				bad++
			}
		}
		if bad > 0 {
			out = append(out, fmt.Sprintf("boundary.csv: %d values of %s are not finite numbers (left empty)", bad, c.Header))
		}
	}
	return out
}

// write writes the table as CSV with a header line. Numbers carry full
// float64 precision; NaN and infinities are empty cells.
func (t *boundaryTable) write(w io.Writer) error {
	cw := csv.NewWriter(w)
	rec := make([]string, 1+len(t.columns))
	rec[0] = "boundary"
	for k, c := range t.columns {
		rec[1+k] = c.Header
	}
	if err := cw.Write(rec); err != nil {
		return err
	}
	for i, name := range t.names {
		rec[0] = name
		for k, c := range t.columns {
			rec[1+k] = formatCell(c.Values[i])
		}
		if err := cw.Write(rec); err != nil {
			return err
		}
	}
	cw.Flush()
	return cw.Error()
}

func formatCell(v float64) string {
	if math.IsNaN(v) || math.IsInf(v, 0) {
		return ""
	}
	return strconv.FormatFloat(v, 'g', -1, 64)
}
