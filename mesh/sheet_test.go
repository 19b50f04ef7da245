package mesh

import (
	"math"
	"testing"

	"github.com/rimfield/rimfield/geom"
	"gonum.org/v1/gonum/spatial/r2"
)

// sheetScene is a block 20 m x 10 m with a sheet driven 6 m from its top
// (the heads on the top either side), and a free baffle: line, inside it.
func sheetScene(baffle geom.Line) *geom.Layout {
	sc := &geom.Scene{
		Problem: geom.Problem{Physics: geom.Seepage, Scale: 1},
		Regions: []geom.Region{{Name: "soil", Polygons: []geom.Polygon{{rect(-10, -10, 10, 0)}}, Material: geom.Material{Kx: 1, Ky: 1}}},
		Bodies: []geom.Body{
			{Name: "pile", Feature: 1, Lines: []geom.Line{{{X: 0, Y: 0}, {X: 0, Y: -6}}}, Cond: geom.Insulated},
			{Name: "baffle", Feature: 2, Lines: []geom.Line{baffle}, Cond: geom.Insulated},
		},
		Edges: []geom.Edge{
			{Name: "up", Feature: 3, Cond: geom.Condition{Kind: geom.Potential, Value: 1}, Lines: []geom.Line{{{X: -10, Y: 0}, {X: 0, Y: 0}}}},
			{Name: "down", Feature: 4, Cond: geom.Condition{Kind: geom.Potential}, Lines: []geom.Line{{{X: 0, Y: 0}, {X: 10, Y: 0}}}},
		},
	}
	l, err := sc.Layout()
	if err != nil {
		panic(err)
	}
	return l
}

// The two faces of every sheet panel have the same end points, reversed,
// to the last bit, and are marked as twins.
func TestSheetTwinPanels(t *testing.T) {
	l := sheetScene(geom.Line{{X: 4, Y: -8}, {X: 6, Y: -8}, {X: 8, Y: -6}})
	for _, o := range []Options{{}, {Panels: 300}, {Size: 0.7, Grading: 1.5}} {
		m := mustBuild(t, l, o)
		if m.Twin == nil || len(m.Twin) != len(m.Panels) {
			t.Fatalf("%+v: twins %d for %d panels", o, len(m.Twin), len(m.Panels))
		}
		faces := 0
		for j, p := range m.Panels {
			k := m.TwinOf(j)
			sheet := p.Owner == 0 || p.Owner == 1
			if !sheet {
				if k >= 0 {
					t.Fatalf("%+v: panel %d of owner %d has a twin", o, j, p.Owner)
				}
				continue
			}
			faces++
			if k < 0 || m.TwinOf(k) != j {
				t.Fatalf("%+v: sheet panel %d has twin %d", o, j, k)
			}
			q := m.Panels[k]
			if q.A != p.B || q.B != p.A || q.Owner != p.Owner || q.Piece != l.TwinOf(p.Piece) {
				t.Fatalf("%+v: panel %d %v->%v and its twin %d %v->%v", o, j, p.A, p.B, k, q.A, q.B)
			}
		}
		if faces == 0 || faces%2 != 0 {
			t.Errorf("%+v: %d sheet faces", o, faces)
		}
	}
}

// Panels grade toward a sheet's free ends and toward where it meets the
// surface, to the smallest size, and nowhere else along a straight sheet:
// behind a sheet's face is the sheet itself, no gap, and a straight sheet
// split at a vertex is no corner. A kink is.
func TestSheetGrading(t *testing.T) {
	// The baffle is straight but drawn in two segments.
	l := sheetScene(geom.Line{{X: 3, Y: -7}, {X: 5, Y: -7}, {X: 8, Y: -7}})
	m := mustBuild(t, l, Options{})
	hmin := defaultSmallest * m.Size
	sizeAt := func(owner int, p r2.Vec) float64 {
		best, at := math.Inf(1), 0.0
		for _, pn := range m.Panels {
			if pn.Owner != owner {
				continue
			}
			if d := r2.Norm(r2.Sub(pn.Mid(), p)); d < best {
				best, at = d, pn.Length()
			}
		}
		return at
	}
	for _, c := range []struct {
		what  string
		owner int
		at    r2.Vec
		small bool
	}{
		{"the pile's tip", 0, r2.Vec{Y: -6}, true},
		{"the pile's head on the surface", 0, r2.Vec{}, true},
		{"the middle of the pile", 0, r2.Vec{Y: -3}, false},
		{"the baffle's ends", 1, r2.Vec{X: 3, Y: -7}, true},
		{"the baffle's other end", 1, r2.Vec{X: 8, Y: -7}, true},
		{"the baffle's straight vertex", 1, r2.Vec{X: 5, Y: -7}, false},
	} {
		h := sizeAt(c.owner, c.at)
		// Graded: within a few times the smallest size (the panel nearest
		// the point); not graded: at least a third of the nominal size.
		if c.small && h > 4*hmin || !c.small && h < m.Size/3 {
			t.Errorf("at %s: panel %.3g m (nominal %.3g m, smallest %.3g m)", c.what, h, m.Size, hmin)
		}
	}
	for _, v := range m.Singular {
		if v == (r2.Vec{X: 5, Y: -7}) {
			t.Error("the straight vertex of the baffle is graded")
		}
	}
	kinked := mustBuild(t, sheetScene(geom.Line{{X: 3, Y: -7}, {X: 5, Y: -7}, {X: 5, Y: -4}}), Options{})
	found := false
	for _, v := range kinked.Singular {
		found = found || v == (r2.Vec{X: 5, Y: -7})
	}
	if !found {
		t.Error("the kink of a bent baffle is not graded")
	}
}

// At the automatic size a sheet gets at least sheetPanels panels a face,
// however small it is in its scene; with a count asked for, in proportion.
func TestSheetPanelCount(t *testing.T) {
	l := sheetScene(geom.Line{{X: 4, Y: -8}, {X: 4.4, Y: -8}})
	for _, c := range []struct {
		o     Options
		least int
	}{{Options{}, sheetPanels}, {Options{Panels: 2000}, sheetPanels}} {
		m := mustBuild(t, l, c.o)
		n := 0
		for _, p := range m.Panels {
			if p.Owner == 1 {
				n++
			}
		}
		if n/2 < c.least {
			t.Errorf("%+v: the 0.4 m baffle has %d panels a face, want at least %d", c.o, n/2, c.least)
		}
	}
}
