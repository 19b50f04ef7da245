package main

import (
	"bytes"
	"encoding/xml"
	"errors"
	"io"
	"math"
	"os"
	"path/filepath"
	"regexp"
	"strconv"
	"strings"
	"testing"
)

// The report is read back here as a person would read it: its headings,
// its tables and the numbers in them with the units of their headers. The
// expected numbers are results.json's from the same run (checked against
// published values by the electrostatic and pipeline tests); what is
// checked here is that the report shows them, in the right unit, rounded
// to 4 significant digits. SI prefixes: The International System of Units,
// 9th edition, BIPM 2019, Table 7.

// block is a heading, paragraph, list item, warning box or table of the
// report, in document order.
type block struct {
	tag, class, text string
	rows             [][]string // tables: the cells' text, header row first
}

// readReport parses report.html into blocks with encoding/xml in its HTML
// mode.
func readReport(t *testing.T, path string) []block {
	t.Helper()
	data, err := os.ReadFile(path)
	if err != nil {
		t.Fatal(err)
	}
	d := xml.NewDecoder(bytes.NewReader(data))
	d.Strict, d.AutoClose, d.Entity = false, xml.HTMLAutoClose, xml.HTMLEntity
	type open struct {
		tag, class string
		text       strings.Builder
	}
	var stack []*open
	var out []block
	var table *block
	for {
		tok, err := d.Token()
		if err == io.EOF {
			break
		}
		if err != nil {
			t.Fatalf("report.html does not parse: %v", err)
		}
		switch x := tok.(type) {
		case xml.StartElement:
			o := &open{tag: x.Name.Local}
			for _, a := range x.Attr {
				if a.Name.Local == "class" {
					o.class = a.Value
				}
			}
			stack = append(stack, o)
			switch o.tag {
			case "table":
				out = append(out, block{tag: "table"})
				table = &out[len(out)-1]
			case "tr":
				if table != nil {
					table.rows = append(table.rows, nil)
				}
			}
		case xml.CharData:
			for _, o := range stack {
				o.text.Write(x)
			}
		case xml.EndElement:
			if len(stack) == 0 {
				continue
			}
			o := stack[len(stack)-1]
			stack = stack[:len(stack)-1]
			text := strings.Join(strings.Fields(o.text.String()), " ")
			switch o.tag {
			case "td", "th":
				if table != nil && len(table.rows) > 0 {
					table.rows[len(table.rows)-1] = append(table.rows[len(table.rows)-1], text)
				}
			case "table":
				table = nil
			case "h1", "h2", "h3", "p", "li":
				out = append(out, block{tag: o.tag, class: o.class, text: text})
			case "div":
				if o.class == "warn" {
					out = append(out, block{tag: "div", class: "warn", text: text})
				}
			}
		}
	}
	return out
}

// section returns the blocks after the heading with the given text, up to
// the next heading; nil when there is no such heading.
func section(blocks []block, heading string) []block {
	for i, b := range blocks {
		if strings.HasPrefix(b.tag, "h") && b.text == heading {
			var out []block
			for _, c := range blocks[i+1:] {
				if strings.HasPrefix(c.tag, "h") {
					break
				}
				out = append(out, c)
			}
			if out == nil {
				out = []block{}
			}
			return out
		}
	}
	return nil
}

func firstTable(bs []block) [][]string {
	for _, b := range bs {
		if b.tag == "table" {
			return b.rows
		}
	}
	return nil
}

// siFactor returns the SI value of one of the display unit: "pF/m" 1e-12,
// "kV/mm" 1e6, "10^-6 m²/s" 1e-6.
func siFactor(t *testing.T, unit string) float64 {
	t.Helper()
	factor := 1.0
	if m := regexp.MustCompile(`^10\^?(-?[0-9]+) ?(.*)$`).FindStringSubmatch(unit); m != nil {
		e, _ := strconv.Atoi(m[1])
		factor, unit = math.Pow(10, float64(e)), m[2]
	}
	if unit == "kV/mm" {
		return factor * 1e6
	}
	bases := []string{"C/m²", "F/m", "C/m", "V/m", "N/m", "J/m", "V", "m²/s", "m/s", "m"}
	prefix := map[string]float64{"p": 1e-12, "n": 1e-9, "µ": 1e-6, "m": 1e-3, "": 1, "k": 1e3, "M": 1e6}
	for _, b := range bases {
		if p, ok := strings.CutSuffix(unit, b); ok {
			if f, ok := prefix[p]; ok {
				return factor * f
			}
		}
	}
	t.Fatalf("unknown unit %q", unit)
	return 0
}

// headerUnit returns the unit in the parentheses of a column header.
func headerUnit(t *testing.T, header string) string {
	t.Helper()
	m := regexp.MustCompile(`\(([^()]*)\)$`).FindStringSubmatch(header)
	if m == nil {
		t.Fatalf("header %q has no unit", header)
	}
	return m[1]
}

// cellValue parses a table cell shown in unit and returns it in SI.
func cellValue(t *testing.T, cell, unit string) float64 {
	t.Helper()
	v, err := strconv.ParseFloat(cell, 64)
	if err != nil {
		t.Fatalf("cell %q is not a number", cell)
	}
	return v * siFactor(t, unit)
}

// tolShown is the rounding of a number shown with 4 significant digits:
// half a unit in the 4th digit, at most 5e-4 of the value (1e-9 of slack).
const tolShown = 5e-4 + 1e-9

func closeShown(got, want float64) bool {
	return math.Abs(got-want) <= tolShown*math.Abs(want)
}

// The busbars example at 400 panels (coarse, to keep the test short: the
// peak field at the bar's junction then exceeds the air's breakdown field,
// which shows the flag): every electrostatic section with its numbers in
// the units its headers state.
func TestReportElectrostaticSections(t *testing.T) {
	dir := filepath.Join(t.TempDir(), "out")
	if _, _, err := runArgs(t, "solve", repoPath("examples", "busbars", "scene.geojson"), "-o", dir, "--panels", "400", "--no-images", "--report", "-q"); err != nil {
		t.Fatal(err)
	}
	r := readJSON(t, filepath.Join(dir, resultsName))
	blocks := readReport(t, filepath.Join(dir, reportName))
	e := get(t, r, "electrostatic")

	// The flat dump of JSON keys is gone.
	for _, b := range blocks {
		if strings.Contains(b.text, "electrostatic.") || strings.Contains(b.text, "breakdown[0]") {
			t.Fatalf("report shows raw JSON keys: %q", b.text)
		}
	}

	// Capacitance matrix: the unit in the heading.
	var matrix []block
	for _, b := range blocks {
		if strings.HasPrefix(b.text, "Capacitance matrix (") {
			matrix = section(blocks, b.text)
			unit := headerUnit(t, b.text)
			rows := firstTable(matrix)
			if len(rows) != 4 || strings.Join(rows[0], ",") != ",bar_a,bar_b,trough" {
				t.Fatalf("capacitance matrix table %v", rows)
			}
			for i := range 3 {
				for k := range 3 {
					want := num(t, e, "capacitance", "matrix", i, k)
					if got := cellValue(t, rows[i+1][k+1], unit); !closeShown(got, want) {
						t.Errorf("C[%d][%d] shown as %s %s, results.json %g F/m", i, k, rows[i+1][k+1], unit, want)
					}
				}
			}
		}
	}
	if matrix == nil {
		t.Fatal("no capacitance matrix section")
	}

	// Partial capacitances: between pairs -C_ij, to ground 0 (a closed
	// trough: rounding noise near 1e-26 F/m in results.json).
	rows := firstTable(section(blocks, "Partial capacitances"))
	if len(rows) != 7 {
		t.Fatalf("partial capacitances table %v, want 3 pairs and 3 to ground", rows)
	}
	unit := headerUnit(t, rows[0][1])
	for _, row := range rows[1:] {
		switch row[0] {
		case "bar_a – bar_b":
			if got, want := cellValue(t, row[1], unit), -num(t, e, "capacitance", "matrix", 0, 1); !closeShown(got, want) {
				t.Errorf("bar_a – bar_b %s %s, want %g F/m", row[1], unit, want)
			}
		case "bar_a – ground", "bar_b – ground", "trough – ground":
			if row[1] != "0" {
				t.Errorf("%s shown as %q, want 0 (rounding noise)", row[0], row[1])
			}
		}
	}

	// Peak field: value, boundary, location in mm, refinement, warning.
	pk := section(blocks, "Peak field on the conductors")
	cells := map[string]string{}
	for _, row := range firstTable(pk) {
		if len(row) == 2 {
			cells[row[0]] = row[1]
		}
	}
	val, unitPk, _ := strings.Cut(cells["peak field"], " ")
	if want := num(t, e, "peak_field", "value"); !closeShown(cellValue(t, val, unitPk), want) || unitPk != "kV/mm" {
		t.Errorf("peak field %q, want %g V/m in kV/mm", cells["peak field"], want)
	}
	if cells["on"] != str(t, e, "peak_field", "boundary") {
		t.Errorf("peak on %q", cells["on"])
	}
	var x, y float64
	if _, err := fmtSscan(cells["at"], &x, &y); err != nil {
		t.Errorf("peak location %q: %v", cells["at"], err)
	} else if !closeShown(x*1e-3, num(t, e, "peak_field", "x")) || !closeShown(y*1e-3, num(t, e, "peak_field", "y")) {
		t.Errorf("peak at %q, want results.json's (%g, %g) m in mm", cells["at"], num(t, e, "peak_field", "x"), num(t, e, "peak_field", "y"))
	}
	ratio := num(t, e, "peak_refinement", "ratio")
	if !strings.Contains(cells["refinement check"], strconv.FormatFloat(ratio, 'f', 3, 64)) {
		t.Errorf("refinement check %q lacks the ratio %.3f", cells["refinement check"], ratio)
	}
	if !strings.Contains(cells["singular corner"], "junction") {
		t.Errorf("singular corner %q: the peak sits on the bar's junction with the standoff", cells["singular corner"])
	}
	warned := false
	for _, b := range pk {
		warned = warned || (b.class == "warn" && strings.Contains(b.text, "infinite in theory"))
	}
	if !warned {
		t.Error("no singular-corner warning beside the peak field")
	}

	// Breakdown margins: air exceeded, standoffs not, ratio as results.json.
	rows = firstTable(section(blocks, "Breakdown margins"))
	if len(rows) != 4 {
		t.Fatalf("breakdown table %v, want air and two standoffs", rows)
	}
	for i, row := range rows[1:] {
		m := get(t, e, "breakdown", i)
		if row[0] != str(t, m, "region") {
			t.Errorf("breakdown row %d is %q, want %q", i, row[0], str(t, m, "region"))
		}
		if got, want := cellValue(t, row[1], headerUnit(t, rows[0][1])), num(t, m, "breakdown_field"); !closeShown(got, want) {
			t.Errorf("%s breakdown field %s, want %g V/m", row[0], row[1], want)
		}
		if got, want := cellValue(t, row[2], headerUnit(t, rows[0][2])), num(t, m, "peak_field"); !closeShown(got, want) {
			t.Errorf("%s peak field %s, want %g V/m", row[0], row[2], want)
		}
		if want := strconv.FormatFloat(num(t, m, "ratio"), 'f', 3, 64); row[4] != want {
			t.Errorf("%s ratio %s, want %s", row[0], row[4], want)
		}
		exceeded := get(t, m, "exceeded") == true
		if (row[5] == "EXCEEDED") != exceeded {
			t.Errorf("%s flag %q, results.json exceeded %v", row[0], row[5], exceeded)
		}
	}
	if rows[1][5] != "EXCEEDED" {
		t.Errorf("air at 400 panels: flag %q, want EXCEEDED", rows[1][5])
	}

	// Stored energy, with a prefix.
	var energy string
	if rows := firstTable(section(blocks, "Stored energy")); len(rows) == 1 && len(rows[0]) == 2 {
		energy = rows[0][1]
	}
	val, rest, _ := strings.Cut(energy, " ")
	unitE, _, _ := strings.Cut(rest, " ")
	if want := num(t, e, "energy_J_per_m"); unitE != "mJ/m" || !closeShown(cellValue(t, val, unitE), want) {
		t.Errorf("stored energy %q, want %g J/m in mJ/m", energy, want)
	}

	// Forces: each component as results.json, or 0 below 1e-4 of the
	// largest (the resolution the electrostatic job shows, a tenth of the
	// default mesh's 1e-3).
	const forceResolution = 1e-4
	rows = firstTable(section(blocks, "Forces on the conductors"))
	if len(rows) != 4 {
		t.Fatalf("forces table %v", rows)
	}
	largest := 0.0
	for i := range 3 {
		largest = math.Max(largest, math.Max(math.Abs(num(t, e, "forces", i, "fx")), math.Abs(num(t, e, "forces", i, "fy"))))
	}
	for i, row := range rows[1:] {
		for k, key := range []string{"fx", "fy"} {
			want := num(t, e, "forces", i, key)
			got := cellValue(t, row[k+1], headerUnit(t, rows[0][k+1]))
			if math.Abs(want) < forceResolution*largest {
				if row[k+1] != "0" {
					t.Errorf("%s %s = %s, want 0 (below the resolution: %g N/m)", row[0], key, row[k+1], want)
				}
			} else if !closeShown(got, want) {
				t.Errorf("%s %s = %s, want %g N/m", row[0], key, row[k+1], want)
			}
		}
	}

	// The warnings are listed before the inputs as well as at the end.
	top := false
	for _, b := range blocks {
		if b.tag == "h2" && b.text == "Inputs" {
			break
		}
		top = top || (b.class == "warn" && strings.Contains(b.text, "infinite in theory"))
	}
	if !top {
		t.Error("no warning box above the inputs")
	}
	if section(blocks, "Warnings") == nil || section(blocks, "Cautions") == nil {
		t.Error("no Warnings or Cautions section")
	}
}

// fmtSscan reads "(x, y) mm" with its no-break spaces.
func fmtSscan(s string, x, y *float64) (int, error) {
	s = strings.NewReplacer("\u00a0", " ", "(", "", ")", "", ",", "").Replace(s)
	f := strings.Fields(s)
	if len(f) != 3 || f[2] != "mm" {
		return 0, errNotLocation
	}
	var err error
	if *x, err = strconv.ParseFloat(f[0], 64); err != nil {
		return 0, err
	}
	if *y, err = strconv.ParseFloat(f[1], 64); err != nil {
		return 1, err
	}
	return 2, nil
}

var errNotLocation = errors.New("not a location (x, y) mm")
