package geom

import (
	"bytes"
	"errors"
	"fmt"
	"math"
	"math/rand/v2"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"gonum.org/v1/gonum/spatial/r2"
)

const (
	readTestGood = "../testdata/scenes/good"
	readTestBad  = "../testdata/scenes/bad"
)

// Exact unit factors: 1 in = 0.0254 m and 1 ft = 0.3048 m by definition
// (NIST Special Publication 811, 2008 edition, Appendix B.8); cm, mm, um and
// km are SI prefixes (BIPM, The International System of Units, 9th edition,
// 2019, Table 7).
const (
	readTestInch = 0.0254
	readTestFoot = 0.3048
)

// readTestTol is the relative tolerance on converted coordinates: one
// rounded multiplication of a decimal-valued coordinate by an inexact
// factor, so a few ulps; 1e-15 leaves a margin of about 5 ulps.
const readTestTol = 1e-15

func readTestClose(got, want float64) bool {
	return got == want || math.Abs(got-want) <= readTestTol*math.Max(math.Abs(got), math.Abs(want))
}

// readTestArea is the shoelace area of a ring without closing vertex,
// positive counter-clockwise (common practice; written out here again so the
// test does not lean on the reader's own area).
func readTestArea(ring []r2.Vec) float64 {
	var s float64
	for i := range ring {
		j := (i + 1) % len(ring)
		s += ring[i].X*ring[j].Y - ring[j].X*ring[i].Y
	}
	return s / 2
}

func readTestFile(t *testing.T, name string) *Scene {
	t.Helper()
	sc, err := ReadFile(filepath.Join(readTestGood, name))
	if err != nil {
		t.Fatalf("ReadFile(%s): %v", name, err)
	}
	return sc
}

// readTestRing checks a ring's vertices, in scene units times scale, as a
// cyclic sequence in the given direction, starting anywhere.
func readTestRing(t *testing.T, what string, got Ring, scale float64, want [][2]float64) {
	t.Helper()
	if len(got) != len(want) {
		t.Fatalf("%s: %d vertices %v, want %d", what, len(got), got, len(want))
	}
	start := -1
	for i, v := range got {
		if readTestClose(v.X, want[0][0]*scale) && readTestClose(v.Y, want[0][1]*scale) {
			start = i
		}
	}
	if start < 0 {
		t.Fatalf("%s: vertex %v (scene units) missing from %v", what, want[0], got)
	}
	for k, w := range want {
		v := got[(start+k)%len(got)]
		if !readTestClose(v.X, w[0]*scale) || !readTestClose(v.Y, w[1]*scale) {
			t.Fatalf("%s: vertex %d is %v, want %v * %g", what, k, v, w, scale)
		}
	}
}

func TestReadElectrostaticMillimetres(t *testing.T) {
	sc := readTestFile(t, "electrostatic_mm.geojson")
	p := sc.Problem
	if p.Physics != Electrostatic || p.Unit != "mm" || p.Scale != 0.001 || !p.Open {
		t.Fatalf("problem = %+v", p)
	}
	if p.BackgroundPermittivity != 1.0006 || !readTestClose(p.Background.Kx, Eps0*1.0006) || !p.Background.Isotropic() {
		t.Errorf("background = %v, %v", p.BackgroundPermittivity, p.Background)
	}
	if p.Ground == nil || !readTestClose(p.Ground.Y, -0.002) {
		t.Errorf("ground = %+v, want y = -2 mm", p.Ground)
	}
	if len(sc.Bodies) != 3 || len(sc.Regions) != 1 || len(sc.Edges) != 0 {
		t.Fatalf("got %d bodies, %d regions, %d edges", len(sc.Bodies), len(sc.Regions), len(sc.Edges))
	}
	sleeve := sc.Bodies[0]
	if sleeve.Name != "sleeve" || sleeve.Feature != 0 || sleeve.Cond != (Condition{Kind: Potential, Value: 100}) {
		t.Errorf("sleeve = %+v", sleeve)
	}
	if len(sleeve.Polygons) != 1 || len(sleeve.Polygons[0]) != 2 {
		t.Fatalf("sleeve polygons = %v", sleeve.Polygons)
	}
	// The outer ring was written counter-clockwise and stays so; the hole
	// was written counter-clockwise too and must come back clockwise.
	readTestRing(t, "sleeve outer", sleeve.Polygons[0][0], 0.001, [][2]float64{{0, 0}, {10, 0}, {10, 6}, {0, 6}})
	readTestRing(t, "sleeve hole", sleeve.Polygons[0][1], 0.001, [][2]float64{{2, 2}, {2, 4}, {8, 4}, {8, 2}})
	if a := readTestArea(sleeve.Polygons[0][1]); !(a < 0) || math.Abs(a+12e-6) > 1e-18 {
		t.Errorf("hole area = %g m^2, want -12 mm^2 (clockwise)", a)
	}
	fl := sc.Bodies[1]
	if fl.Cond != (Condition{Kind: Floating, NetInflow: 1e-9}) {
		t.Errorf("floater condition = %+v", fl.Cond)
	}
	third := sc.Bodies[2]
	if third.Name != "body3" || third.Cond != Insulated || third.Feature != 3 {
		t.Errorf("unnamed body = %+v, want default name body3, insulated", third)
	}
	coat := sc.Regions[0]
	// eps = eps0 * eps_r, eps0 from CODATA 2018; one rounded product.
	if coat.Permittivity != 3.5 || !readTestClose(coat.Material.Kx, Eps0*3.5) || !coat.Material.Isotropic() || coat.BreakdownField != 2e7 {
		t.Errorf("coating = %+v", coat)
	}
	// Written clockwise, read counter-clockwise.
	readTestRing(t, "coating", coat.Polygons[0][0], 0.001, [][2]float64{{-1, -1}, {11, -1}, {11, 7}, {-1, 7}})
	if len(sc.Warnings) != 1 || !strings.Contains(sc.Warnings[0], `"fill"`) || !strings.Contains(sc.Warnings[0], "1 other feature") {
		t.Errorf("warnings = %q, want one about \"fill\" on two features", sc.Warnings)
	}
}

func TestReadSeepageFeet(t *testing.T) {
	sc := readTestFile(t, "seepage_ft.geojson")
	p := sc.Problem
	if p.Physics != Seepage || p.Unit != "ft" || p.Scale != readTestFoot || p.Open {
		t.Fatalf("problem = %+v", p)
	}
	// Defaults of Contract 1: unit weight of water 9.81 kN/m^3; the
	// critical gradient is given as 1.1.
	if p.UnitWeightWater != 9.81 || p.CriticalGradient != 1.1 {
		t.Errorf("unit weight %v, critical gradient %v", p.UnitWeightWater, p.CriticalGradient)
	}
	if len(sc.Regions) != 2 || len(sc.Bodies) != 1 || len(sc.Edges) != 2 {
		t.Fatalf("got %d regions, %d bodies, %d edges", len(sc.Regions), len(sc.Bodies), len(sc.Edges))
	}
	if m := sc.Regions[0].Material; m != (Material{Kx: 2e-5, Ky: 2e-5}) {
		t.Errorf("sand = %v", m)
	}
	if m := sc.Regions[1].Material; m != (Material{Kx: 4e-6, Ky: 1e-6}) || m.Isotropic() {
		t.Errorf("silt = %v, want kx 4e-6, ky 1e-6", m)
	}
	// 120 ft = 36.576 m, 30 ft = 9.144 m exactly.
	readTestRing(t, "sand", sc.Regions[0].Polygons[0][0], readTestFoot, [][2]float64{{0, 10}, {120, 10}, {120, 30}, {0, 30}})
	if v := sc.Regions[0].Polygons[0][0]; !readTestClose(v[2].X, 36.576) || !readTestClose(v[2].Y, 9.144) {
		t.Errorf("sand corner = %v, want (36.576, 9.144) m", v[2])
	}
	apron := sc.Bodies[0]
	if apron.Cond != Insulated || len(apron.Polygons) != 2 {
		t.Fatalf("apron = %+v", apron)
	}
	readTestRing(t, "pile", apron.Polygons[1][0], readTestFoot, [][2]float64{{59.5, 14}, {60.5, 14}, {60.5, 28}, {59.5, 28}})
	hw := sc.Edges[0]
	if hw.Name != "headwater" || hw.Cond != (Condition{Kind: Potential, Value: 6.1}) || len(hw.Lines) != 1 {
		t.Fatalf("headwater = %+v", hw)
	}
	if l := hw.Lines[0]; len(l) != 2 || l[0] != (r2.Vec{X: 0, Y: 30 * readTestFoot}) || !readTestClose(l[1].X, 50*readTestFoot) {
		t.Errorf("headwater line = %v", l)
	}
	if tw := sc.Edges[1]; len(tw.Lines) != 2 || tw.Feature != 4 {
		t.Errorf("tailwater = %+v, want 2 lines from feature 4", tw)
	}
	if len(sc.Warnings) != 1 || !strings.Contains(sc.Warnings[0], `"author"`) {
		t.Errorf("warnings = %q, want one about the problem member \"author\"", sc.Warnings)
	}
}

func TestReadFlowKutta(t *testing.T) {
	sc := readTestFile(t, "flow_kutta.geojson")
	p := sc.Problem
	if p.Physics != Flow || p.Scale != readTestInch || !p.Open {
		t.Fatalf("problem = %+v", p)
	}
	if p.Stream == nil || *p.Stream != (Stream{Speed: 12, AngleDeg: 4}) {
		t.Errorf("stream = %+v", p.Stream)
	}
	if !readTestClose(p.Chord, 0.1524) { // 6 in
		t.Errorf("chord = %v m, want 0.1524", p.Chord)
	}
	if p.Background != (Material{Kx: 1, Ky: 1}) {
		t.Errorf("background = %v, want k = 1", p.Background)
	}
	wing, flap := sc.Bodies[0], sc.Bodies[1]
	if wing.Kutta == nil || !wing.Kutta.Auto || wing.Cond != Insulated {
		t.Errorf("wing = %+v, want automatic Kutta point, wall", wing)
	}
	if flap.Kutta == nil || flap.Kutta.Auto || !readTestClose(flap.Kutta.Point.X, 0.2159) || !readTestClose(flap.Kutta.Point.Y, -0.01524) {
		t.Errorf("flap Kutta = %+v, want the point (8.5, -0.6) in = (0.2159, -0.01524) m", flap.Kutta)
	}
	// The wing was written clockwise (upper surface first, leading edge to
	// trailing edge): it must come back counter-clockwise.
	readTestRing(t, "wing", wing.Polygons[0][0], readTestInch,
		[][2]float64{{0, 0}, {1, -0.15}, {3, 0.1}, {6, 0}, {3, 0.6}, {1, 0.45}})
	if a := readTestArea(wing.Polygons[0][0]); !(a > 0) {
		t.Errorf("wing area %g, want positive", a)
	}
}

// A flow scene in millimetres over a ground plane (a slip wall), in water:
// the density is taken as given, the ground height and the Kutta point are
// converted to metres, and a scene without "density" gets 1.225 kg/m^3,
// air at sea level in the International Standard Atmosphere (ISO
// 2533:1975; common practice).
func TestReadFlowGroundMillimetres(t *testing.T) {
	sc := readTestFile(t, "flow_ground_mm.geojson")
	p := sc.Problem
	if p.Physics != Flow || p.Scale != 1e-3 || !p.Open || p.Density != 998.2 {
		t.Fatalf("problem = %+v", p)
	}
	if p.Ground == nil || !readTestClose(p.Ground.Y, -0.04) {
		t.Errorf("ground = %+v, want y = -0.04 m", p.Ground)
	}
	if k := sc.Bodies[0].Kutta; k == nil || k.Auto || !readTestClose(k.Point.X, 0.1) || k.Point.Y != 0 {
		t.Errorf("Kutta = %+v, want the point (0.1, 0) m", k)
	}
	if _, err := sc.Layout(); err != nil {
		t.Errorf("layout: %v", err)
	}
	if d := readTestFile(t, "flow_kutta.geojson").Problem.Density; d != 1.225 {
		t.Errorf("default density %g, want 1.225 kg/m^3", d)
	}
	// A stream along the plane either way is accepted.
	src := readTestScene(`{"physics": "flow", "stream": {"speed": 3, "angle_deg": -180}, "ground": {"y": -1}}`,
		readTestPolygon(`{"part": "body", "kutta": true}`, `[[0, 0], [1, 0.1], [2, 0], [1, -0.1], [0, 0]]`))
	if _, err := Read(strings.NewReader(src)); err != nil {
		t.Errorf("stream at -180 degrees over a ground plane: %v", err)
	}
}

func TestReadLaplaceClockwiseRepeated(t *testing.T) {
	sc := readTestFile(t, "laplace_cw.geojson")
	p := sc.Problem
	if p.Physics != Laplace || p.Scale != 0.01 || p.Open {
		t.Fatalf("problem = %+v, want laplace in cm, closed by default (it has regions)", p)
	}
	if p.UnitWeightWater != 0 || p.Stream != nil || p.Ground != nil {
		t.Errorf("settings of other physics set: %+v", p)
	}
	plate := sc.Regions[0]
	if plate.Material != (Material{Kx: 2.5, Ky: 2.5}) {
		t.Errorf("plate = %v", plate.Material)
	}
	// Outer ring written clockwise with repeated vertices: 4 vertices,
	// counter-clockwise. The hole was written clockwise and stays so.
	readTestRing(t, "plate outer", plate.Polygons[0][0], 0.01, [][2]float64{{0, 0}, {20, 0}, {20, 10}, {0, 10}})
	readTestRing(t, "plate hole", plate.Polygons[0][1], 0.01, [][2]float64{{5, 3}, {5, 7}, {9, 7}, {9, 3}})
	second := sc.Regions[1]
	if second.Name != "region1" || second.Material != (Material{Kx: 1, Ky: 1}) || len(second.Polygons) != 2 {
		t.Errorf("second region = %+v, want default name region1, k = 1, two polygons", second)
	}
	left := sc.Edges[0]
	if len(left.Lines[0]) != 3 {
		t.Errorf("left edge = %v, want the repeated vertex dropped", left.Lines[0])
	}
	heater := sc.Edges[2]
	l := heater.Lines[0]
	if heater.Cond != (Condition{Kind: Flux, Value: 0.5}) || len(l) != 5 || l[0] != l[4] {
		t.Errorf("heater = %+v, want a closed line of 5 positions, first == last", heater)
	}
	// Edge lines keep their direction as given.
	if l[1] != (r2.Vec{X: 0.09, Y: 0.03}) {
		t.Errorf("heater second vertex = %v, want (9, 3) cm", l[1])
	}
	if len(sc.Warnings) != 0 {
		t.Errorf("warnings = %q", sc.Warnings)
	}
}

// readBadCases lists every file of testdata/scenes/bad with the feature and
// member its error must name and a piece of the message.
var readBadCases = []struct {
	file    string
	feature int
	member  string
	says    string
}{
	{"array", -1, "", "JSON array"},
	{"background_k_in_electrostatic", -1, "problem.background_k", "background_permittivity"},
	{"bowtie", 3, "coordinates", "crosses or touches itself near (3, 3)"},
	{"breakdown_negative", 1, "breakdown_field", "must be positive"},
	{"closed_without_region", -1, "problem.open", `add a region, or set "open": true`},
	{"coincident", -1, "", "one point"},
	{"condition_on_region", 0, "potential", "region carries no boundary condition"},
	{"coordinate_absurd", 2, "coordinates", "beyond 1e+07 m"},
	{"coordinate_overflow", 2, "coordinates", "1e400"},
	{"coordinate_string", 0, "coordinates", `coordinates[0][1][0] must be a number, got "10"`},
	{"duplicate_default_name", 2, "name", "of feature 1"},
	{"duplicate_names", 2, "name", `"bottom" is also the name of feature 1`},
	{"edge_polygon", 2, "geometry", "LineString or MultiLineString, got Polygon"},
	{"edge_without_condition", 2, "", "must set a condition"},
	{"empty", -1, "", "empty"},
	{"empty_linestring", 2, "coordinates", "empty"},
	{"empty_polygon", 0, "coordinates", "empty"},
	{"empty_ring", 0, "coordinates", "coordinates[0] is empty"},
	{"feature_bbox_string", 1, "bbox", "must be an array of numbers"},
	{"feature_not_object", 1, "", "got 42"},
	{"feature_type_missing", 1, "type", "missing"},
	{"floating_false", 3, "floating", "remove it"},
	{"floating_string", 3, "floating", `got "yes"`},
	{"density_in_electrostatic", -1, "problem.density", "flow scenes"},
	{"flow_body_potential", 0, "potential", "wall"},
	{"flow_density_negative", -1, "problem.density", "must be positive"},
	{"flow_density_string", -1, "problem.density", "write it as 1.225"},
	{"flow_ground_incidence", -1, "problem.stream.angle_deg", "pitch the section"},
	{"flow_ground_touched", 0, "coordinates", "strictly above"},
	{"flow_no_stream", -1, "problem.stream", "missing"},
	{"flow_stream_speed_zero", -1, "problem.stream.speed", "positive"},
	{"geometry_collection", 0, "geometry", "GeometryCollection"},
	{"geometry_extra_member", 2, "", "cannot be read as a GeoJSON Feature"},
	{"geometry_type_typo", 0, "geometry", `did you mean "Polygon"?`},
	{"ground_closed", -1, "problem.ground", `"open": true`},
	{"ground_touched", 1, "geometry", "touches the grounded plane y = 0 m at (3, 0) m but is held at 1 V: a short circuit"},
	{"ground_in_seepage", -1, "problem.ground", "electrostatic and flow"},
	{"hole_crossing", 3, "coordinates", "crosses or touches the outer ring"},
	{"hole_outside", 3, "coordinates", "lies outside its outer ring"},
	{"k_and_kx", 0, "kx", "both set"},
	{"k_in_electrostatic", 0, "k", `"permittivity"`},
	{"k_negative_string", 0, "k", `must be a number, got "fast"`},
	{"k_zero", 0, "k", "must be positive, got 0"},
	{"key_case", 2, "Potential", `did you mean "potential"?`},
	{"key_typo", 2, "potental", `unknown key; did you mean "potential"?`},
	{"kutta_false", 0, "kutta", "remove it"},
	{"kutta_in_laplace", 3, "kutta", "flow"},
	{"kutta_on_edge", 1, "kutta", "not on an edge"},
	{"kutta_short_point", 0, "kutta", "[x, y]"},
	{"kx_without_ky", 0, "kx", `without "ky"`},
	{"material_on_body", 3, "k", "belongs on a region"},
	{"missing_coordinates", 1, "coordinates", "missing"},
	{"missing_part", 1, "part", `add "part"`},
	{"name_number", 1, "name", "must be a string"},
	{"nested_holes", 3, "coordinates", "another hole"},
	{"net_inflow_without_floating", 1, "net_inflow", `"floating": true`},
	{"no_features", -1, "features", "no features"},
	{"no_physics", -1, "problem.physics", "missing"},
	{"no_problem", -1, "problem", "missing"},
	{"no_reference_potential", -1, "", "no reference potential"},
	{"null_geometry", 1, "geometry", "missing"},
	{"null_properties", 2, "part", "missing"},
	{"open_string", -1, "problem.open", "true or false"},
	{"part_typo", 1, "part", `did you mean "edge"?`},
	{"permittivity_in_seepage", 0, "permittivity", "electrostatic"},
	{"physics_number", -1, "problem.physics", "must be a string"},
	{"pinched_ring", 3, "coordinates", "crosses or touches itself near (5, 3)"},
	{"position_short", 2, "coordinates", "coordinates[1] must be a position"},
	{"potential_bool", 2, "potential", "must be a number, got true"},
	{"potential_string", 2, "potential", `must be a number, got "5 V"; write it as 5`},
	{"problem_member_typo", -1, "problem.unti", `did you mean "unit"?`},
	{"problem_typo_key", -1, "Problem", `did you mean "problem"?`},
	{"properties_string", 2, "properties", "must be an object"},
	{"region_point", 0, "geometry", "got Point"},
	{"ring_single_position", 0, "coordinates", "a single position"},
	{"seepage_missing_k", 0, "k", "hydraulic conductivity"},
	{"single_feature", -1, "type", "single Feature"},
	{"spike", 3, "coordinates", "doubles back on itself at (7, 2)"},
	{"syntax", -1, "", "line 3, column 3"},
	{"two_conditions", 2, "flux", `"potential" and "flux" are both set`},
	{"two_vertex_ring", 3, "coordinates", "only 2 distinct vertices"},
	{"short_body_edge", 1, "geometry", `touches or crosses edge 2 ("case")`},
	{"region_linestring", 0, "geometry", "a region must be a Polygon or MultiPolygon, got LineString"},
	{"sheet_along_edge", 3, "geometry", `is a sheet, and edge 1 ("upstream bed") runs along it`},
	{"sheet_no_length", 2, "coordinates", "has no length (all its positions coincide"},
	{"sheet_on_ground", 1, "geometry", "is a sheet lying along the grounded plane"},
	{"sheet_self_overlap", 2, "coordinates", "the sheet overlaps itself along (4, 5)"},
	{"sheet_short_body", 0, "geometry", `touches or overlaps body 1 ("probe")`},
	{"sheet_short_edge", 2, "geometry", `is held at 5 V and touches or crosses edge 1 ("case"), held at 0 V`},
	{"sheet_spike", 2, "coordinates", "doubles back on itself at (8, 5)"},
	{"sheet_zero_segment", 2, "coordinates", "zero-length segment: positions 1 and 2 coincide at (5, 8)"},
	{"unclosed_ring", 0, "coordinates", "not closed"},
	{"unknown_part", 1, "part", `unknown part "conductor"`},
	{"unknown_physics", -1, "problem.physics", `did you mean "electrostatic"?`},
	{"unit_spelled_out", -1, "problem.unit", `unknown unit "metres" (did you mean "m"?)`},
	{"unknown_unit", -1, "problem.unit", `"m", "cm", "mm", "um", "km", "in" or "ft"`},
	{"zero_area_ring", 3, "coordinates", "encloses no area"},
}

func TestReadBad(t *testing.T) {
	listed := make(map[string]bool)
	for _, c := range readBadCases {
		listed[c.file+".geojson"] = true
		t.Run(c.file, func(t *testing.T) {
			path := filepath.Join(readTestBad, c.file+".geojson")
			// The reader's errors, or the arrangement's for scenes that read
			// well but cannot be laid out (the command line adds the file).
			sc, err := ReadFile(path)
			layout := false
			if err == nil {
				if _, err = sc.Layout(); err == nil {
					t.Fatalf("no error; scene %+v", sc)
				}
				layout = true
			}
			var e *Error
			if !errors.As(err, &e) {
				t.Fatalf("error %v is %T, want *geom.Error", err, err)
			}
			if layout && e.File == "" {
				e.File = path
			}
			msg := err.Error()
			if !strings.HasPrefix(msg, "geom: "+path+": ") {
				t.Errorf("message %q does not start with the package and file", msg)
			}
			if e.Feature != c.feature || e.Member != c.member {
				t.Errorf("error names feature %d member %q, want %d %q: %s", e.Feature, e.Member, c.feature, c.member, msg)
			}
			if !strings.Contains(msg, c.says) {
				t.Errorf("message %q does not say %q", msg, c.says)
			}
			if c.feature >= 0 && !strings.Contains(msg, fmt.Sprintf("feature %d", c.feature)) {
				t.Errorf("message %q does not name feature %d", msg, c.feature)
			}
			if c.member != "" && !strings.Contains(msg, fmt.Sprintf("%q", c.member)) {
				t.Errorf("message %q does not name member %q", msg, c.member)
			}
		})
	}
	files, err := filepath.Glob(filepath.Join(readTestBad, "*.geojson"))
	if err != nil || len(files) == 0 {
		t.Fatalf("no bad scenes: %v", err)
	}
	for _, f := range files {
		if !listed[filepath.Base(f)] {
			t.Errorf("%s has no expectation in readBadCases", f)
		}
	}
}

func TestErrorFormat(t *testing.T) {
	for _, c := range []struct {
		e    Error
		want string
	}{
		{Error{Feature: 3, Name: "gate", Member: "potential", Msg: `must be a number, got "5 V"; write it as 5`},
			`geom: feature 3 ("gate"), member "potential": must be a number, got "5 V"; write it as 5`},
		{Error{Feature: 0, Msg: "x"}, "geom: feature 0: x"},
		{Error{Feature: -1, Member: "problem.unit", Msg: "y"}, `geom: member "problem.unit": y`},
		{Error{File: "a.geojson", Feature: -1, Msg: "z"}, "geom: a.geojson: z"},
	} {
		if got := c.e.Error(); got != c.want {
			t.Errorf("Error() = %q, want %q", got, c.want)
		}
	}
}

// readTestScene wraps features in a laplace FeatureCollection.
func readTestScene(problem string, features ...string) string {
	return `{"type": "FeatureCollection", "problem": ` + problem + `, "features": [` + strings.Join(features, ",") + `]}`
}

func readTestPolygon(props string, rings ...string) string {
	return `{"type": "Feature", "properties": ` + props + `, "geometry": {"type": "Polygon", "coordinates": [` + strings.Join(rings, ",") + `]}}`
}

func TestReadUnits(t *testing.T) {
	for _, c := range []struct {
		unit  string
		scale float64
	}{
		{"m", 1}, {"cm", 0.01}, {"mm", 0.001}, {"um", 1e-6}, {"km", 1000},
		{"in", readTestInch}, {"ft", readTestFoot},
	} {
		src := readTestScene(`{"physics": "laplace", "unit": "`+c.unit+`"}`,
			readTestPolygon(`{"part": "body", "potential": 1}`, `[[1, 2], [3, 2], [3, 5], [1, 2]]`))
		sc, err := Read(strings.NewReader(src))
		if err != nil {
			t.Fatalf("%s: %v", c.unit, err)
		}
		if sc.Problem.Unit != c.unit || sc.Problem.Scale != c.scale {
			t.Errorf("%s: unit %q scale %v", c.unit, sc.Problem.Unit, sc.Problem.Scale)
		}
		readTestRing(t, c.unit, sc.Bodies[0].Polygons[0][0], c.scale, [][2]float64{{1, 2}, {3, 2}, {3, 5}})
		if !sc.Problem.Open {
			t.Errorf("%s: a scene with no region must default to open", c.unit)
		}
	}
}

func TestReadDefaultUnitAndNoWarnings(t *testing.T) {
	src := readTestScene(`{"physics": "electrostatic"}`,
		readTestPolygon(`{"part": "body", "potential": 1}`, `[[0, 1], [1, 1], [1, 2], [0, 1]]`),
		readTestPolygon(`{"part": "region"}`, `[[-1, 0.5], [2, 0.5], [2, 3], [-1, 0.5]]`))
	sc, err := Read(strings.NewReader(src))
	if err != nil {
		t.Fatal(err)
	}
	p := sc.Problem
	if p.Unit != "m" || p.Scale != 1 || p.Open || p.BackgroundPermittivity != 1 || p.Background.Kx != Eps0 {
		t.Errorf("defaults = %+v", p)
	}
	if r := sc.Regions[0]; r.Permittivity != 1 || r.Material.Kx != Eps0 || r.BreakdownField != 0 || r.Name != "region1" {
		t.Errorf("region defaults = %+v", r)
	}
	if sc.Warnings != nil {
		t.Errorf("warnings = %q", sc.Warnings)
	}
}

func TestReadNearMiss(t *testing.T) {
	for _, c := range []struct {
		key, want string
	}{
		{"potental", "potential"},
		{"potentail", "potential"}, // transposition
		{"Potential", "potential"},
		{"POTENTIAL", "potential"},
		{"netInflow", "net_inflow"},
		{"net-inflow", "net_inflow"},
		{"breakdown", ""},
		{"permitivity", "permittivity"},
		{"nme", "name"},
		{"K", "k"},
		{"Kx", "kx"},
		{"k_x", "kx"},
		{"kz", "kx"},
		{"x", ""}, // one-letter GIS attributes are not taken for "k"
		{"z", ""},
		{"id", ""},
		{"fid", ""},
		{"fill", ""},
		{"stroke", ""},
		{"flow", ""},
		{"OBJECTID", ""},
		{"Shape_Length", ""},
		{"description", ""},
	} {
		got, ok := readNearMiss(c.key, readPropertyKeys)
		if got != c.want || ok != (c.want != "") {
			t.Errorf("readNearMiss(%q) = %q, %v; want %q", c.key, got, ok, c.want)
		}
	}
	if got, _ := readNearMiss("units", readProblemKeys); got != "unit" {
		t.Errorf("problem key units -> %q, want unit", got)
	}
}

func TestReadNumberMessages(t *testing.T) {
	for _, c := range []struct {
		v    any
		want string
	}{
		{"5 V", `got "5 V"; write it as 5 `},
		{"2.5", `got "2.5"; write it as 2.5, without quotes`},
		{"-1e-3 C/m", "write it as -0.001 "},
		{"high", `got "high"; write a plain number`},
		{"1,5", "write it as 1.5, with a decimal point"},
		{true, "got true"},
		{nil, "got null"},
		{[]any{1.0}, "got an array"},
	} {
		if got := readNumberMsg(c.v); !strings.Contains(got, c.want) {
			t.Errorf("readNumberMsg(%v) = %q, want it to contain %q", c.v, got, c.want)
		}
	}
}

// A 10 mm sheet pile in a 100 m section is real geometry (Contract 1), and
// vertices closer than 1e-9 of the diagonal are one vertex.
func TestReadCoincidenceTolerance(t *testing.T) {
	src := readTestScene(`{"physics": "seepage"}`,
		readTestPolygon(`{"part": "region", "k": 1e-5}`, `[[0, 0], [100, 0], [100, 20], [0, 20], [0, 0]]`),
		readTestPolygon(`{"part": "body", "name": "pile"}`,
			`[[50, 5], [50.01, 5], [50.01, 25], [50.01, 25.00000000001], [50, 25], [50, 5.00000000001], [50, 5]]`),
		`{"type": "Feature", "properties": {"part": "edge", "potential": 0}, "geometry": {"type": "LineString", "coordinates": [[0, 20], [40, 20]]}}`)
	sc, err := Read(strings.NewReader(src))
	if err != nil {
		t.Fatal(err)
	}
	readTestRing(t, "pile", sc.Bodies[0].Polygons[0][0], 1, [][2]float64{{50, 5}, {50.01, 5}, {50.01, 25}, {50, 25}})
}

// readTestCircle returns a GeoJSON ring of n vertices on a circle of radius
// r about (cx, cy), closed, in the given direction.
func readTestCircle(n int, cx, cy, r float64, ccw bool) string {
	var b strings.Builder
	b.WriteString("[")
	for i := 0; i <= n; i++ {
		a := 2 * math.Pi * float64(i%n) / float64(n)
		if !ccw {
			a = -a
		}
		if i > 0 {
			b.WriteString(",")
		}
		fmt.Fprintf(&b, "[%.17g, %.17g]", cx+r*math.Cos(a), cy+r*math.Sin(a))
	}
	b.WriteString("]")
	return b.String()
}

func TestReadLargeRings(t *testing.T) {
	const n = 4000
	src := readTestScene(`{"physics": "electrostatic"}`,
		readTestPolygon(`{"part": "body", "potential": 1}`, readTestCircle(n, 0, 0, 2, false), readTestCircle(n, 0.1, 0, 1, true)))
	sc, err := Read(strings.NewReader(src))
	if err != nil {
		t.Fatal(err)
	}
	poly := sc.Bodies[0].Polygons[0]
	// Area of a regular n-gon inscribed in a circle of radius r:
	// (n/2) r^2 sin(2 pi/n) (elementary geometry, common practice).
	want := func(r float64) float64 { return n / 2 * r * r * math.Sin(2*math.Pi/n) }
	// Tolerance: rounding of n shoelace terms of size r^2/n, 1e-12 relative.
	if a := readTestArea(poly[0]); math.Abs(a-want(2)) > 1e-12*want(2) {
		t.Errorf("outer area %.15g, want %.15g (counter-clockwise)", a, want(2))
	}
	if a := readTestArea(poly[1]); math.Abs(a+want(1)) > 1e-12*want(1) {
		t.Errorf("hole area %.15g, want %.15g (clockwise)", a, -want(1))
	}
	// The same outline with one vertex pushed across the far side of the
	// ring must be found.
	ring := readTestCircle(n, 0, 0, 2, true)
	bad := strings.Replace(ring, fmt.Sprintf("[%.17g, %.17g]", 2*math.Cos(2*math.Pi*1000/n), 2*math.Sin(2*math.Pi*1000/n)), "[0.5, -2.5]", 1)
	if bad == ring {
		t.Fatal("test ring not modified")
	}
	_, err = Read(strings.NewReader(readTestScene(`{"physics": "electrostatic"}`, readTestPolygon(`{"part": "body", "potential": 1}`, bad))))
	if err == nil || !strings.Contains(err.Error(), "crosses or touches itself") {
		t.Errorf("crossing ring: error %v", err)
	}
}

// The sweep of readFirstContact must find a contact exactly when comparing
// every pair of sides does.
func TestReadContactSweepMatchesAllPairs(t *testing.T) {
	rng := rand.New(rand.NewPCG(1, 1))
	const tol = 1e-9
	var crossed, clean int
	for trial := 0; trial < 400; trial++ {
		n := 3 + rng.IntN(12)
		poly := make(Polygon, 1+rng.IntN(3))
		for ri := range poly {
			ring := make(Ring, n)
			for i := range ring {
				ring[i] = r2.Vec{X: float64(rng.IntN(10)), Y: float64(rng.IntN(10))}
			}
			poly[ri] = readDedupe(ring, tol)
			for len(poly[ri]) < 3 {
				poly[ri] = append(poly[ri], r2.Vec{X: float64(rng.IntN(10)) + 0.5, Y: float64(rng.IntN(10)) + 0.5})
			}
		}
		_, got := readFirstContact(poly, tol)
		want := false
		for ri, ring := range poly {
			m := len(ring)
			for i := range ring {
				prev, v, next := ring[(i+m-1)%m], ring[i], ring[(i+1)%m]
				if d, _ := readPointSeg(next, prev, v); d <= tol {
					want = true
				}
				if d, _ := readPointSeg(prev, v, next); d <= tol {
					want = true
				}
			}
			for rj := ri; rj < len(poly); rj++ {
				other := poly[rj]
				for i := range ring {
					for j := range other {
						if ri == rj && (j <= i || j == i+1 || (i == 0 && j == m-1)) {
							continue
						}
						if d, _ := readSegSeg(ring[i], ring[(i+1)%m], other[j], other[(j+1)%len(other)]); d <= tol {
							want = true
						}
					}
				}
			}
		}
		if got != want {
			t.Fatalf("trial %d: sweep says %v, all pairs say %v for %v", trial, got, want, poly)
		}
		if want {
			crossed++
		} else {
			clean++
		}
	}
	if crossed == 0 || clean == 0 {
		t.Errorf("trials not varied: %d with contact, %d without", crossed, clean)
	}
}

func TestReadWarningsAndNames(t *testing.T) {
	src := readTestScene(`{"physics": "laplace", "comment": "x", "open": true}`,
		readTestPolygon(`{"part": "body", "potential": 0, "fid": 1, "OBJECTID": 7}`, `[[0, 0], [1, 0], [0, 1], [0, 0]]`),
		readTestPolygon(`{"part": "body", "potential": 1, "fid": 2}`, `[[3, 0], [4, 0], [3, 1], [3, 0]]`),
		readTestPolygon(`{"part": "body", "name": "third", "floating": true, "fid": 3}`, `[[6, 0], [7, 0], [6, 1], [6, 0]]`))
	sc, err := Read(strings.NewReader(src))
	if err != nil {
		t.Fatal(err)
	}
	want := []string{
		`problem: unknown member "comment" ignored.`,
		`feature 0 ("body0"): unknown property "OBJECTID" ignored.`,
		`feature 0 ("body0"): unknown property "fid" ignored (also on 2 other features).`,
	}
	if strings.Join(sc.Warnings, "\n") != strings.Join(want, "\n") {
		t.Errorf("warnings:\n%s\nwant:\n%s", strings.Join(sc.Warnings, "\n"), strings.Join(want, "\n"))
	}
	if sc.Bodies[1].Name != "body1" || sc.Bodies[2].Name != "third" {
		t.Errorf("names %q %q", sc.Bodies[1].Name, sc.Bodies[2].Name)
	}
	if sc.Bodies[2].Cond != (Condition{Kind: Floating}) {
		t.Errorf("floating without net_inflow = %+v, want net inflow 0", sc.Bodies[2].Cond)
	}
}

func TestReadNeverPanicsOnOddInput(t *testing.T) {
	for _, src := range []string{
		`null`, `{}`, `"FeatureCollection"`, `{"type": "FeatureCollection"}`,
		`{"type": "FeatureCollection", "problem": {"physics": "laplace"}, "features": null}`,
		`{"type": "FeatureCollection", "problem": {"physics": "laplace"}, "features": {}}`,
		`{"type": "FeatureCollection", "problem": {"physics": "laplace"}, "features": [null]}`,
		`{"type": "FeatureCollection", "problem": null, "features": [{}]}`,
		`{"type": "FeatureCollection", "problem": [], "features": [{}]}`,
		`{"type": "FeatureCollection", "problem": {"physics": "laplace"}, "features": [{"type": "Feature", "properties": {"part": "body"}, "geometry": {"type": "Polygon", "coordinates": [[[0,0],[1,0],[0,1],[0,0]]], "bbox": [1e999]}}]}`,
		`{"type": "FeatureCollection", "problem": {"physics": "laplace"}, "features": [{"type": "Feature", "properties": {"part": "body"}, "geometry": {"type": "Polygon", "coordinates": [[[0,0],[1,0],[0,1],[0,0]]]}}], "bbox": "x"}`,
		`{"type": "FeatureCollection", "problem": {"physics": "laplace"}, "features": [{"type": "Feature", "properties": {"part": "body"}, "geometry": {"type": "Polygon", "coordinates": [[[0,0],[1,0],[0,1],[0,0]]]}, "id": {"a": 1e999}}]}`,
		`{"type": "FeatureCollection", "problem": {"physics": "flow", "stream": {"speed": "fast"}}, "features": []}`,
		`{"type": "FeatureCollection", "problem": {"physics": "electrostatic", "ground": {"y": "0"}}, "features": [{}]}`,
		strings.Repeat("[", 20000) + strings.Repeat("]", 20000),
	} {
		sc, err := Read(strings.NewReader(src))
		if err == nil {
			t.Errorf("%.60s: no error, scene %+v", src, sc)
			continue
		}
		var e *Error
		if !errors.As(err, &e) {
			t.Errorf("%.60s: error %v is %T, want *Error", src, err, err)
		}
	}
}

func TestWriteRoundTrip(t *testing.T) {
	files, err := filepath.Glob(filepath.Join(readTestGood, "*.geojson"))
	if err != nil || len(files) == 0 {
		t.Fatal("no good scenes")
	}
	for _, f := range files {
		sc, err := ReadFile(f)
		if err != nil {
			t.Fatal(err)
		}
		var buf bytes.Buffer
		if err := Write(&buf, sc); err != nil {
			t.Fatalf("%s: Write: %v", f, err)
		}
		back, err := Read(&buf)
		if err != nil {
			t.Fatalf("%s: reading back: %v\n%s", f, err, buf.String())
		}
		readTestSame(t, filepath.Base(f), sc, back)
	}
}

// readTestSame compares two scenes, coordinates to readTestTol (one
// division and one multiplication by the unit factor).
func readTestSame(t *testing.T, what string, a, b *Scene) {
	t.Helper()
	pa, pb := a.Problem, b.Problem
	pa.Stream, pb.Stream, pa.Ground, pb.Ground = nil, nil, nil, nil
	if pa != pb {
		t.Errorf("%s: problem %+v, read back %+v", what, pa, pb)
	}
	if (a.Problem.Stream == nil) != (b.Problem.Stream == nil) || a.Problem.Stream != nil && *a.Problem.Stream != *b.Problem.Stream {
		t.Errorf("%s: stream differs", what)
	}
	if (a.Problem.Ground == nil) != (b.Problem.Ground == nil) || a.Problem.Ground != nil && !readTestClose(a.Problem.Ground.Y, b.Problem.Ground.Y) {
		t.Errorf("%s: ground differs", what)
	}
	samePolys := func(x, y []Polygon) bool {
		if len(x) != len(y) {
			return false
		}
		for i := range x {
			if len(x[i]) != len(y[i]) {
				return false
			}
			for j := range x[i] {
				if !readTestSameVecs(x[i][j], y[i][j]) {
					return false
				}
			}
		}
		return true
	}
	if len(a.Bodies) != len(b.Bodies) || len(a.Regions) != len(b.Regions) || len(a.Edges) != len(b.Edges) {
		t.Fatalf("%s: feature counts differ", what)
	}
	for i := range a.Bodies {
		x, y := a.Bodies[i], b.Bodies[i]
		if x.Name != y.Name || x.Feature != y.Feature || x.Cond != y.Cond || !samePolys(x.Polygons, y.Polygons) || !readTestSameLines(x.Lines, y.Lines) ||
			(x.Kutta == nil) != (y.Kutta == nil) || x.Kutta != nil && (x.Kutta.Auto != y.Kutta.Auto || !readTestSameVecs([]r2.Vec{x.Kutta.Point}, []r2.Vec{y.Kutta.Point})) {
			t.Errorf("%s: body %d %+v, read back %+v", what, i, x, y)
		}
	}
	for i := range a.Regions {
		x, y := a.Regions[i], b.Regions[i]
		if x.Name != y.Name || x.Material != y.Material || x.Permittivity != y.Permittivity || x.BreakdownField != y.BreakdownField || !samePolys(x.Polygons, y.Polygons) {
			t.Errorf("%s: region %d %+v, read back %+v", what, i, x, y)
		}
	}
	for i := range a.Edges {
		x, y := a.Edges[i], b.Edges[i]
		same := x.Name == y.Name && x.Cond == y.Cond && len(x.Lines) == len(y.Lines)
		for j := 0; same && j < len(x.Lines); j++ {
			same = readTestSameVecs(x.Lines[j], y.Lines[j])
		}
		if !same {
			t.Errorf("%s: edge %d %+v, read back %+v", what, i, x, y)
		}
	}
}

func readTestSameVecs[S ~[]r2.Vec](x, y S) bool {
	if len(x) != len(y) {
		return false
	}
	for i := range x {
		if !readTestClose(x[i].X, y[i].X) || !readTestClose(x[i].Y, y[i].Y) {
			return false
		}
	}
	return true
}

func TestReadByteOrderMark(t *testing.T) {
	src := "\xef\xbb\xbf" + readTestScene(`{"physics": "laplace"}`,
		readTestPolygon(`{"part": "body", "potential": 1}`, `[[0, 0], [1, 0], [0, 1], [0, 0]]`))
	if _, err := Read(strings.NewReader(src)); err != nil {
		t.Errorf("scene with a UTF-8 byte order mark: %v", err)
	}
}

func TestReadFileMissing(t *testing.T) {
	_, err := ReadFile(filepath.Join(t.TempDir(), "none.geojson"))
	if err == nil || !strings.HasPrefix(err.Error(), "geom: ") || !errors.Is(err, os.ErrNotExist) {
		t.Errorf("error %v, want a geom: error wrapping os.ErrNotExist", err)
	}
}

var readBenchSink *Scene

// BenchmarkRead reads a conductor with a hole, both rings regular n-gons;
// the time per doubling of n shows the cost of the ring checks.
func BenchmarkRead(b *testing.B) {
	for _, n := range []int{500, 2000, 8000} {
		src := []byte(readTestScene(`{"physics": "electrostatic"}`,
			readTestPolygon(`{"part": "body", "potential": 1}`, readTestCircle(n, 0, 0, 2, true), readTestCircle(n, 0.1, 0, 1, false))))
		b.Run(fmt.Sprintf("vertices=%d", 2*n), func(b *testing.B) {
			b.ReportAllocs()
			b.SetBytes(int64(len(src)))
			for b.Loop() {
				sc, err := Read(bytes.NewReader(src))
				if err != nil {
					b.Fatal(err)
				}
				readBenchSink = sc
			}
		})
	}
}
