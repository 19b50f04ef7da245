package electro

import (
	"encoding/json"
	"math"
	"path/filepath"
	"strings"
	"testing"

	"github.com/rimfield/rimfield/bem/job"
	"github.com/rimfield/rimfield/geom"
	"github.com/rimfield/rimfield/mesh"
	"gonum.org/v1/gonum/spatial/r2"
)

// The coaxial example (pin a = 1.2 mm, bore b = 4 mm, eps_r = 2.1, 1 V):
// C = 2 pi eps0 eps_r / ln(b/a), the energy C V^2 / 2 and the field at the
// conductors' surfaces V / (r ln(b/a)) (any electromagnetics text, e.g.
// Jackson, Classical Electrodynamics, 3rd ed., 1999, sec. 1.13 [from
// memory]). Tolerance 1e-3 relative, the default mesh's promise; the
// 512-gons contribute about 1e-5.
const (
	coaxA, coaxB, coaxEps = 1.2e-3, 4e-3, 2.1
	tolCoax               = 1e-3
)

// exampleSetup reads, lays out and meshes an example scene at default
// settings, as the command line does.
func exampleSetup(t *testing.T, name string) *job.Setup {
	t.Helper()
	sc, err := geom.ReadFile(filepath.Join("..", "..", "examples", name, "scene.geojson"))
	if err != nil {
		t.Fatal(err)
	}
	lay, err := sc.Layout()
	if err != nil {
		t.Fatal(err)
	}
	m, err := mesh.Build(lay, mesh.Options{})
	if err != nil {
		t.Fatal(err)
	}
	return &job.Setup{Scene: sc, Mesh: m}
}

// decode returns a JSON value as generic maps and slices.
func decode(t *testing.T, v any) map[string]any {
	t.Helper()
	data, err := json.Marshal(v)
	if err != nil {
		t.Fatal(err)
	}
	var out map[string]any
	if err := json.Unmarshal(data, &out); err != nil {
		t.Fatal(err)
	}
	return out
}

func TestJobCoaxialExample(t *testing.T) {
	s := exampleSetup(t, "coaxial")
	out, err := NewJob().Solve(s)
	if err != nil {
		t.Fatal(err)
	}
	c := 2 * math.Pi * geom.Eps0 * coaxEps / math.Log(coaxB/coaxA)
	if out.Section == nil || out.Section.Key != "electrostatic" {
		t.Fatalf("section %+v", out.Section)
	}
	v := decode(t, out.Section.Value)
	num := func(path ...any) float64 {
		t.Helper()
		var x any = v
		for _, p := range path {
			switch k := p.(type) {
			case string:
				x = x.(map[string]any)[k]
			case int:
				x = x.([]any)[k]
			}
		}
		f, ok := x.(float64)
		if !ok {
			t.Fatalf("%v is %v", path, x)
		}
		return f
	}
	if got := -num("capacitance", "matrix", 0, 1); math.Abs(got-c) > tolCoax*c {
		t.Errorf("C = %.7g F/m, want %.7g", got, c)
	}
	if w := num("energy_J_per_m"); math.Abs(w-c/2) > tolCoax*c/2 {
		t.Errorf("energy %.7g J/m, want %.7g", w, c/2)
	}
	for i := range 2 {
		if g := num("partial_capacitance", "to_ground", i); math.Abs(g) > 1e-9*c {
			t.Errorf("to_ground[%d] = %g F/m, want 0 (the bore takes every field line)", i, g)
		}
		// No net force by symmetry; scale of the pull on half the pin:
		// sigma^2/(2 eps) times its diameter, about W/a.
		if fx, fy := num("forces", i, "fx"), num("forces", i, "fy"); math.Hypot(fx, fy) > 1e-6*c/coaxA {
			t.Errorf("force %d (%g, %g) N/m, want 0", i, fx, fy)
		}
	}
	if mu := num("partial_capacitance", "mutual", 0, 1); math.Abs(mu-c) > tolCoax*c {
		t.Errorf("mutual capacitance %.7g F/m, want %.7g", mu, c)
	}
	// A smooth surface: the peak does not move when the panels are halved.
	if r := num("peak_refinement", "ratio"); math.Abs(r-1) > tolCoax {
		t.Errorf("peak refinement ratio %.6f, want 1", r)
	}
	if n := len(v["singular_corners"].([]any)); n != 0 {
		t.Errorf("%d singular corners on circles", n)
	}
	if n := len(v["breakdown"].([]any)); n != 0 {
		t.Errorf("%d breakdown margins without breakdown fields", n)
	}

	// The surface-field chart: one series per conductor, uniform |E| =
	// V/(r ln(b/a)), arc lengths in metres up to the circumference.
	if len(out.Charts) != 1 || len(out.Charts[0].Series) != 2 {
		t.Fatalf("charts %+v", out.Charts)
	}
	want := map[string]float64{"pin": coaxA, "bore": coaxB}
	for _, sr := range out.Charts[0].Series {
		r, ok := want[sr.Name]
		if !ok {
			t.Fatalf("series %q", sr.Name)
		}
		e := 1 / (r * math.Log(coaxB/coaxA))
		for i, y := range sr.Y {
			if math.Abs(y-e) > tolCoax*e {
				t.Fatalf("%s: |E| = %v V/m at s = %v m, want %v", sr.Name, y, sr.X[i], e)
			}
		}
		if last := sr.X[len(sr.X)-1]; last > 2*math.Pi*r || last < 0.99*2*math.Pi*r {
			t.Errorf("%s: last arc length %v m, want about %v", sr.Name, last, 2*math.Pi*r)
		}
	}
	// boundary.csv columns: the charge density is the inflow density on
	// the conductors, and |E| on the pin is the normal field.
	cols := map[string][]float64{}
	for _, cl := range out.Columns {
		cols[cl.Header] = cl.Values
	}
	for _, h := range []string{"charge_density_C_per_m2", "field_normal_V_per_m", "field_V_per_m"} {
		if len(cols[h]) != len(s.Mesh.Panels) {
			t.Fatalf("column %s has %d values for %d panels", h, len(cols[h]), len(s.Mesh.Panels))
		}
	}
	e := 1 / (coaxA * math.Log(coaxB/coaxA))
	for i, p := range s.Mesh.Panels {
		if cols["charge_density_C_per_m2"][i] != out.Solution.F[i] {
			t.Errorf("panel %d: charge density differs from the inflow density on a conductor", i)
		}
		if s.Mesh.Layout.Owners[p.Owner].Name == "pin" {
			if en := cols["field_normal_V_per_m"][i]; math.Abs(en-e) > tolCoax*e || cols["field_V_per_m"][i] != en {
				t.Errorf("panel %d: normal field %.6g, |E| %.6g V/m, want %.6g", i, en, cols["field_V_per_m"][i], e)
			}
		}
	}
	// The headline is the capacitance between the two conductors; the
	// peak field follows, and the map marks it on the pin.
	if !strings.HasPrefix(out.Headline, "C = ") || !strings.Contains(out.Headline, `"pin" and "bore"`) {
		t.Errorf("headline %q", out.Headline)
	}
	if len(out.Lines) != 1 || !strings.HasPrefix(out.Lines[0], "peak field ") || out.Peak == nil || out.Peak.Boundary != "pin" {
		t.Errorf("lines %q, peak %+v", out.Lines, out.Peak)
	}
}

// The electrostatic job speaks of electrostatics: no word of seepage or
// flow in its words, headline, tables, charts or warnings.
func TestJobWords(t *testing.T) {
	s := exampleSetup(t, "busbars")
	j := NewJob()
	out, err := j.Solve(s)
	if err != nil {
		t.Fatal(err)
	}
	var text []string
	w := j.Words()
	text = append(text, w.Potential, w.Field, w.Inflow, w.InflowDensity, w.InflowNote, w.Conductivity,
		w.Net, w.FluxLines, w.Channels, w.Drops, w.ShapeFactor, w.Ground, out.Headline, out.Results)
	text = append(text, out.Lines...)
	text = append(text, out.Warnings...)
	for _, tb := range append(out.Tables, *out.Regions) {
		text = append(text, tb.Title)
		text = append(text, tb.Head...)
		text = append(text, tb.Notes...)
		for _, r := range tb.Rows {
			text = append(text, r...)
		}
	}
	for _, c := range out.Charts {
		text = append(text, c.Title, c.YLabel)
	}
	all := strings.ToLower(strings.Join(text, "\n"))
	for _, bad := range []string{"flow channel", "flow net", "hydraulic", "conductivity", "head", "discharge", "seepage", "streamline"} {
		if strings.Contains(all, bad) {
			t.Errorf("electrostatic text says %q:\n%s", bad, all)
		}
	}
	for _, good := range []string{"field lines", "flux tubes", "permittivity", "charge", "capacitance"} {
		if !strings.Contains(all, good) {
			t.Errorf("electrostatic text lacks %q", good)
		}
	}
}

// --air-breakdown assumes 3e6 V/m (3 kV/mm, dry air at standard
// conditions; common practice) for the open background of a wire over a
// grounded plane; without it the background has no breakdown field and no
// margin is listed. Check lists the ground plane and the field assumed.
func TestJobAirBreakdown(t *testing.T) {
	sc := &geom.Scene{
		Problem: geom.Problem{Physics: geom.Electrostatic, Open: true, Scale: 1, Background: air(1), BackgroundPermittivity: 1,
			Ground: &geom.Ground{Y: 0}},
		Bodies: []geom.Body{{Name: "wire", Polygons: []geom.Polygon{{circle(r2.Vec{X: 0, Y: 5}, 0.5, 64, 0)}}, Cond: fixed(1)}},
	}
	lay, err := sc.Layout()
	if err != nil {
		t.Fatal(err)
	}
	m, err := mesh.Build(lay, mesh.Options{Panels: 128})
	if err != nil {
		t.Fatal(err)
	}
	for _, on := range []bool{false, true} {
		j := &Job{AirBreakdown: on}
		s := &job.Setup{Scene: sc, Mesh: m}
		out, err := j.Solve(s)
		if err != nil {
			t.Fatal(err)
		}
		sec := out.Section.Value.(*Section)
		c, err := j.Check(s)
		if err != nil {
			t.Fatal(err)
		}
		lines := strings.Join(c.Lines, "\n")
		if !strings.Contains(lines, "ground plane y = 0 m") {
			t.Errorf("check lines %q lack the ground plane", lines)
		}
		if !on {
			if len(sec.Breakdown) != 0 || strings.Contains(lines, "breakdown") {
				t.Errorf("without --air-breakdown: margins %v, lines %q", sec.Breakdown, lines)
			}
			continue
		}
		if len(sec.Breakdown) != 1 || !strings.Contains(lines, "breakdown field") {
			t.Fatalf("with --air-breakdown: margins %v, lines %q", sec.Breakdown, lines)
		}
		mg := sec.Breakdown[0]
		if mg.BreakdownField != 3e6 || math.Abs(float64(mg.Ratio)-float64(sec.PeakField.Value)/3e6) > 1e-12*float64(mg.Ratio) {
			t.Errorf("margin %+v, peak %v", mg, sec.PeakField.Value)
		}
	}
}

// A conductor drawn as a 32-gon (a coarse circle: each vertex turns by
// 11.25 degrees, field ~ r^-0.06) has no singular corner worth a warning
// (mesh.SingularLambda): no corner in the section, the cautions or the
// warnings.
func TestJob32gonSmooth(t *testing.T) {
	sc := &geom.Scene{
		Problem: geom.Problem{Physics: geom.Electrostatic, Open: true, Scale: 1, Background: air(1), BackgroundPermittivity: 1,
			Ground: &geom.Ground{Y: 0}},
		Bodies: []geom.Body{{Name: "wire", Polygons: []geom.Polygon{{circle(r2.Vec{X: 0, Y: 3}, 1, 32, 0)}}, Cond: fixed(1)}},
	}
	lay, err := sc.Layout()
	if err != nil {
		t.Fatal(err)
	}
	m, err := mesh.Build(lay, mesh.Options{})
	if err != nil {
		t.Fatal(err)
	}
	out, err := NewJob().Solve(&job.Setup{Scene: sc, Mesh: m})
	if err != nil {
		t.Fatal(err)
	}
	sec := out.Section.Value.(*Section)
	if len(sec.SingularCorners) != 0 {
		t.Errorf("a 32-gon has singular corners %+v", sec.SingularCorners)
	}
	for _, c := range out.Cautions {
		if c.Topic == "singular_corners" {
			t.Errorf("a 32-gon gets the caution %q", c.Text)
		}
	}
	for _, w := range out.Warnings {
		if strings.Contains(w, "corner") || strings.Contains(w, "edge") {
			t.Errorf("a 32-gon gets the warning %q", w)
		}
	}
}
