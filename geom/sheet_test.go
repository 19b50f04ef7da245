package geom

import (
	"math"
	"strings"
	"testing"

	"gonum.org/v1/gonum/spatial/r2"
)

// Sheets: bodies drawn as lines.

func readTestSameLines(x, y []Line) bool {
	if len(x) != len(y) {
		return false
	}
	for i := range x {
		if !readTestSameVecs(x[i], y[i]) {
			return false
		}
	}
	return true
}

func sheetBody(feat int, name string, cond Condition, lines ...Line) Body {
	return Body{Feature: feat, Name: name, Cond: cond, Lines: lines}
}

func line(xy ...float64) Line {
	var l Line
	for i := 0; i+1 < len(xy); i += 2 {
		l = append(l, r2.Vec{X: xy[i], Y: xy[i+1]})
	}
	return l
}

// sheetLayout lays the scene out and checks every piece: beside its
// midpoint on the left lies its Left region (the oracle domainAt, which
// does not see sheets); a face with a twin has the twin's ends reversed,
// owner and condition, and the same stretch seen from the other side; a
// face without one has no domain on its right.
func sheetLayout(t *testing.T, sc *Scene) *Layout {
	t.Helper()
	l, err := sc.Layout()
	if err != nil {
		t.Fatalf("Layout: %v", err)
	}
	if l.Twin != nil && len(l.Twin) != len(l.Pieces) {
		t.Fatalf("%d twins for %d pieces", len(l.Twin), len(l.Pieces))
	}
	for i, p := range l.Pieces {
		L := pieceLen(p)
		d := r2.Scale(1/L, r2.Sub(p.B, p.A))
		n := r2.Vec{X: -d.Y, Y: d.X}
		m := r2.Scale(0.5, r2.Add(p.A, p.B))
		h := 1e-7 * L
		if got := domainAt(sc, r2.Add(m, r2.Scale(h, n))); got != p.Left {
			t.Errorf("piece %d %v->%v: left side is %d, piece says %d", i, p.A, p.B, got, p.Left)
		}
		tw := l.TwinOf(i)
		switch {
		case tw >= 0:
			q := l.Pieces[tw]
			if l.TwinOf(tw) != i || q.A != p.B || q.B != p.A || q.Owner != p.Owner || q.Cond != p.Cond || p.Right != Outside || q.Right != Outside {
				t.Errorf("piece %d %+v and its twin %d %+v are not two faces of one stretch", i, p, tw, q)
			}
			if got := domainAt(sc, r2.Sub(m, r2.Scale(h, n))); got != q.Left {
				t.Errorf("piece %d: the twin's side is %d, the twin says %d", i, got, q.Left)
			}
		case !p.Interface() && !(sc.Problem.Ground != nil && p.A.Y == sc.Problem.Ground.Y && p.B.Y == p.A.Y):
			if got := domainAt(sc, r2.Sub(m, r2.Scale(h, n))); got != Outside && !onSheet(sc, p) {
				t.Errorf("piece %d %v->%v: domain %d on its right and no twin", i, p.A, p.B, got)
			}
		}
	}
	return l
}

// onSheet reports whether piece p lies on a sheet (a face of one with no
// twin: the domain on its right is another region's, across the sheet).
func onSheet(sc *Scene, p Piece) bool {
	return p.Owner >= 0 && p.Owner < len(sc.Bodies) && sc.Bodies[p.Owner].Sheet()
}

// faces sums the lengths of the pieces of owner o with and without a twin.
func faces(l *Layout, o int) (twinned, single float64) {
	for i, p := range l.Pieces {
		if p.Owner != o {
			continue
		}
		if l.TwinOf(i) >= 0 {
			twinned += pieceLen(p)
		} else {
			single += pieceLen(p)
		}
	}
	return twinned, single
}

// A sheet pile driven from the surface of a closed block: both faces in
// the block, split where the pile starts on the surface edge, which is
// split there too.
func TestLayoutSheetInRegion(t *testing.T) {
	sc := &Scene{
		Problem: Problem{Physics: Seepage},
		Regions: []Region{region(0, "soil", Polygon{rect(0, 0, 10, 10)})},
		Bodies:  []Body{sheetBody(3, "pile", Insulated, line(5, 10, 5, 6))},
		Edges: []Edge{
			{Feature: 1, Name: "up", Lines: []Line{line(0, 10, 5, 10)}, Cond: pot(2)},
			{Feature: 2, Name: "down", Lines: []Line{line(5, 10, 10, 10)}, Cond: pot(0)},
		},
	}
	l := sheetLayout(t, sc)
	tw, single := faces(l, 0)
	if !near(tw, 8, 1e-12) || single != 0 {
		t.Errorf("pile faces: %g m with twins, %g m without; want 8 and 0", tw, single)
	}
	for i, p := range l.Pieces {
		if p.Owner == 0 && (p.Left != 0 || p.Cond != Insulated) {
			t.Errorf("pile face %d: %+v", i, p)
		}
	}
	// The domain's boundary is still closed: every vertex has as many
	// pieces leaving as arriving.
	balance := map[r2.Vec]int{}
	for _, p := range l.Pieces {
		balance[p.A]++
		balance[p.B]--
	}
	for v, b := range balance {
		if b != 0 {
			t.Errorf("vertex %v: %d more pieces leave than arrive", v, b)
		}
	}
}

// A sheet across an interface between two regions is split there, each
// part with its own region on both faces; a sheet along the interface has
// one face in each region, and replaces the interface there.
func TestLayoutSheetInterface(t *testing.T) {
	sc := &Scene{
		Problem: Problem{Physics: Electrostatic},
		Regions: []Region{
			region(0, "low", Polygon{rect(0, 0, 10, 5)}),
			region(1, "high", Polygon{rect(0, 5, 10, 10)}),
		},
		Bodies: []Body{
			sheetBody(2, "across", pot(1), line(2, 3, 2, 7)),
			sheetBody(3, "along", pot(1), line(6, 5, 9, 5)),
		},
		Edges: []Edge{{Feature: 4, Name: "case", Lines: []Line{line(0, 0, 10, 0, 10, 10, 0, 10, 0, 0)}, Cond: pot(0)}},
	}
	l := sheetLayout(t, sc)
	var inLow, inHigh, alongLow, alongHigh, iface float64
	for i, p := range l.Pieces {
		switch {
		case p.Owner == 0 && p.Left == 0:
			inLow += pieceLen(p)
		case p.Owner == 0 && p.Left == 1:
			inHigh += pieceLen(p)
		case p.Owner == 1 && p.Left == 0 && l.TwinOf(i) >= 0:
			alongLow += pieceLen(p)
		case p.Owner == 1 && p.Left == 1 && l.TwinOf(i) >= 0:
			alongHigh += pieceLen(p)
		case p.Interface():
			iface += pieceLen(p)
		}
	}
	if !near(inLow, 4, 1e-12) || !near(inHigh, 4, 1e-12) {
		t.Errorf("sheet across: %g m of faces in low, %g in high; want 4 and 4", inLow, inHigh)
	}
	if !near(alongLow, 3, 1e-12) || !near(alongHigh, 3, 1e-12) {
		t.Errorf("sheet along: %g m of faces in low, %g in high; want 3 and 3", alongLow, alongHigh)
	}
	if !near(iface, 7, 1e-12) {
		t.Errorf("interface %g m, want 7 (10 less the 3 the sheet covers)", iface)
	}
}

// A sheet along a region's outer boundary has one face in the domain (no
// twin) and sets the condition there like an edge; a sheet partly inside a
// solid body keeps only what lies in the domain; sheets crossing each
// other are split at the crossing.
func TestLayoutSheetFaces(t *testing.T) {
	sc := &Scene{
		Problem: Problem{Physics: Laplace},
		Regions: []Region{region(0, "block", Polygon{rect(0, 0, 10, 10)})},
		Bodies: []Body{
			sheetBody(1, "lid", pot(1), line(2, 10, 8, 10)),
			body(2, "core", pot(0), Polygon{rect(4, 2, 6, 4)}),
			sheetBody(3, "fin", pot(0), line(5, 3, 5, 7)),
			sheetBody(4, "cross", Insulated, line(3, 6, 7, 6)),
		},
	}
	l := sheetLayout(t, sc)
	if tw, single := faces(l, 0); tw != 0 || !near(single, 6, 1e-12) {
		t.Errorf("lid: %g m with twins, %g without; want 0 and 6", tw, single)
	}
	if tw, single := faces(l, 2); !near(tw, 6, 1e-12) || single != 0 {
		t.Errorf("fin: %g m with twins, %g without; want 6 (3 m outside the core, both faces) and 0", tw, single)
	}
	n := 0
	for _, p := range l.Pieces {
		if p.Owner == 3 {
			n++
		}
	}
	if n != 4 {
		t.Errorf("the crossing sheet has %d pieces, want 4 (two stretches, two faces)", n)
	}
}

// A closed sheet in an open scene (a thin shield round a cavity): its
// outer faces look at the background outside, its inner faces at the
// background inside, twins of each other.
func TestLayoutSheetClosed(t *testing.T) {
	sc := &Scene{
		Problem: Problem{Physics: Electrostatic, Open: true},
		Bodies: []Body{
			sheetBody(0, "shield", Condition{Kind: Floating}, line(0, 0, 4, 0, 4, 4, 0, 4, 0, 0)),
			body(1, "wire", pot(1), Polygon{rect(1, 1, 2, 2)}),
		},
	}
	l := sheetLayout(t, sc)
	if tw, single := faces(l, 0); !near(tw, 32, 1e-12) || single != 0 {
		t.Errorf("shield: %g m with twins, %g without; want 32 and 0", tw, single)
	}
	// The faces inside run counter-clockwise (the cavity on their left).
	area := 0.0
	for i, p := range l.Pieces {
		if p.Owner == 0 && l.TwinOf(i) > i {
			area += cross2(p) / 2
		}
	}
	if math.Abs(math.Abs(area)-16) > 1e-12 {
		t.Errorf("one face of each pair encloses %g m^2, want 16 in magnitude", area)
	}
}

// Shorts and conflicts of sheets with other features.
func TestLayoutSheetErrors(t *testing.T) {
	block := Polygon{rect(0, 0, 10, 10)}
	for _, c := range []struct {
		name string
		sc   *Scene
		says string
	}{
		{"crossing sheets at two potentials", &Scene{Problem: Problem{Physics: Electrostatic}, Regions: []Region{region(0, "air", block)},
			Bodies: []Body{sheetBody(1, "a", pot(1), line(2, 5, 8, 5)), sheetBody(2, "b", pot(0), line(5, 2, 5, 8))}},
			`touches or overlaps body 2 ("b") near (5, 5) m`},
		{"floating sheet on a conductor", &Scene{Problem: Problem{Physics: Electrostatic}, Regions: []Region{region(0, "air", block)},
			Bodies: []Body{body(1, "core", pot(1), Polygon{rect(4, 4, 6, 6)}), sheetBody(2, "fin", Condition{Kind: Floating}, line(6, 5, 8, 5))}},
			"is held at 1 V and touches or overlaps body 2"},
		{"sheet on the ground at 1 V", &Scene{Problem: Problem{Physics: Electrostatic, Open: true, Ground: &Ground{Y: 0}},
			Bodies: []Body{sheetBody(0, "leg", pot(1), line(0, 0, 0, 2))}},
			"touches the grounded plane y = 0 m at (0, 0) m but is held at 1"},
		{"sheet outside every region", &Scene{Problem: Problem{Physics: Laplace}, Regions: []Region{region(0, "block", block)},
			Bodies: []Body{sheetBody(1, "stray", pot(1), line(12, 0, 12, 5))}},
			"lies outside every region"},
	} {
		_, err := c.sc.Layout()
		e := geomError(t, err)
		if !strings.Contains(e.Error(), c.says) {
			t.Errorf("%s: %v, want %q", c.name, e, c.says)
		}
	}
}

// The reader takes sheets as bodies drawn as lines, in every physics.
func TestReadSheets(t *testing.T) {
	sc := readTestFile(t, "sheet_trace_mm.geojson")
	tr, sh := sc.Bodies[0], sc.Bodies[1]
	if !tr.Sheet() || len(tr.Polygons) != 0 || len(tr.Lines) != 1 || !readTestSameVecs(tr.Lines[0], []r2.Vec{{X: -1.5e-3, Y: 1.6e-3}, {X: 1.5e-3, Y: 1.6e-3}}) {
		t.Errorf("trace = %+v", tr)
	}
	if !sh.Sheet() || len(sh.Lines) != 2 || sh.Cond.Kind != Floating {
		t.Errorf("shield = %+v", sh)
	}
	l := sheetLayout(t, sc)
	// The trace lies on the substrate's top: one face in the substrate,
	// one in the air above, twins.
	var sub, air int
	for i, p := range l.Pieces {
		if p.Owner == 0 && l.TwinOf(i) >= 0 {
			if p.Left == 0 {
				sub++
			} else {
				air++
			}
		}
	}
	if sub == 0 || sub != air {
		t.Errorf("trace faces: %d in the substrate, %d in the air", sub, air)
	}
	fl := readTestFile(t, "flow_plate.geojson")
	if !fl.Bodies[0].Sheet() || fl.Bodies[0].Kutta == nil || !fl.Bodies[0].Kutta.Auto || fl.Bodies[1].Kutta == nil || fl.Bodies[1].Kutta.Auto {
		t.Errorf("flow sheets = %+v", fl.Bodies)
	}
	sp := readTestFile(t, "seepage_sheet_pile.geojson")
	if l := sheetLayout(t, sp); l.Twin == nil {
		t.Error("sheet pile without twin faces")
	}
	// A closed LineString sheet keeps its closing position, as an edge.
	src := readTestScene(`{"physics": "electrostatic"}`,
		`{"type": "Feature", "properties": {"part": "body", "name": "tube", "floating": true}, "geometry": {"type": "LineString", "coordinates": [[0, 0], [1, 0], [1, 1], [0, 0]]}}`,
		readTestPolygon(`{"part": "body", "potential": 1}`, `[[0.5, 0.1], [0.8, 0.1], [0.8, 0.4], [0.5, 0.1]]`))
	tube, err := Read(strings.NewReader(src))
	if err != nil {
		t.Fatal(err)
	}
	if l := tube.Bodies[0].Lines[0]; len(l) != 4 || l[0] != l[3] {
		t.Errorf("closed sheet line %v", l)
	}
}
