package main

import (
	"encoding/csv"
	"fmt"
	"io"
	"math"
	"strconv"

	"github.com/rimfield/rimfield/bem/job"
)

// boundaryName is the file of values per panel.
const boundaryName = "boundary.csv"

// boundaryTable is boundary.csv before it is written: one row per panel.
type boundaryTable struct {
	names   []string // boundary name of each panel
	columns []job.Column
}

// newBoundaryTable gathers the columns of boundary.csv for a solved task:
// boundary, x_m, y_m, s_m, length_m, potential_<unit>, inflow_<unit>, then
// the job's columns.
func newBoundaryTable(t *task) (*boundaryTable, error) {
	m, sol := t.mesh, t.sol()
	n := len(m.Panels)
	if len(sol.U) != n || len(sol.F) != n {
		return nil, fmt.Errorf("internal error: solution has %d potentials and %d inflows for %d panels", len(sol.U), len(sol.F), n)
	}
	units := t.words.Units
	bt := &boundaryTable{names: make([]string, n)}
	x, y, s, l := make([]float64, n), make([]float64, n), make([]float64, n), make([]float64, n)
	for i, p := range m.Panels {
		bt.names[i] = job.BoundaryName(m.Layout, p)
		mid := p.Mid()
		x[i], y[i], s[i], l[i] = mid.X, mid.Y, p.S, p.Length()
	}
	bt.columns = []job.Column{
		{Header: "x_m", Values: x}, {Header: "y_m", Values: y}, {Header: "s_m", Values: s}, {Header: "length_m", Values: l},
		{Header: csvHeader("potential", units.PotentialCSV), Values: sol.U},
		{Header: csvHeader("inflow", units.DensityCSV), Values: sol.F},
	}
	for _, c := range t.out.Columns {
		if got := max(len(c.Values), len(c.Text)); got != n || (c.Values != nil && c.Text != nil) {
			return nil, fmt.Errorf("internal error: column %s has %d values for %d panels", c.Header, got, n)
		}
	}
	bt.columns = append(bt.columns, t.out.Columns...)
	return bt, nil
}

// csvHeader joins a quantity and its CSV unit: "potential_V", or "potential"
// for a quantity without a unit.
func csvHeader(quantity, unit string) string {
	if unit == "" {
		return quantity
	}
	return quantity + "_" + unit
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
			if c.Text != nil {
				rec[1+k] = c.Text[i]
				continue
			}
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
