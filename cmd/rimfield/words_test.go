package main

import (
	"os"
	"path/filepath"
	"regexp"
	"strings"
	"testing"

	"github.com/rimfield/rimfield/bem/job"
)

// solvedTask runs solve's pipeline on a scene in memory, without writing
// files, and returns the task with its results set.
func solvedTask(t *testing.T, scene string, panels int) *task {
	t.Helper()
	sc, m, mo, err := prepare(scene, panels)
	if err != nil {
		t.Fatal(err)
	}
	j, err := newJobs().forScene(sc.Problem.Physics)
	if err != nil {
		t.Fatal(err)
	}
	tk := &task{scenePath: scene, scene: sc, mesh: m, job: j, words: j.Words(), levels: 11}
	if tk.out, err = j.Solve(&job.Setup{Scene: sc, Mesh: m, MeshOptions: mo}); err != nil {
		t.Fatal(err)
	}
	res, err := buildResults(tk)
	if err != nil {
		t.Fatal(err)
	}
	pj, err := tk.pictureJob()
	if err != nil {
		t.Fatal(err)
	}
	pj.res = res
	return tk
}

// pictureText gathers every word the three pictures show.
func pictureText(t *testing.T, tk *task) string {
	t.Helper()
	ps, err := pictureSpecs(tk)
	if err != nil {
		t.Fatal(err)
	}
	text := []string{ps.potentialCaption, ps.fieldCaption, ps.chartsCaption}
	for _, m := range []struct{ title, sub, label, ground string }{
		{ps.potential.Title, ps.potential.Subtitle, ps.potential.Label, ps.potential.Ground},
		{ps.field.Title, ps.field.Subtitle, ps.field.Label, ps.field.Ground},
	} {
		text = append(text, m.title, m.sub, m.label, m.ground)
	}
	for _, c := range ps.charts {
		text = append(text, c.Title, c.XLabel, c.YLabel)
	}
	return strings.Join(text, "\n")
}

// reportText returns the words of report.html for a scene, without its tags
// and embedded pictures.
func reportText(t *testing.T, scene string, panels string) string {
	t.Helper()
	dir := filepath.Join(t.TempDir(), "out")
	if _, _, err := runArgs(t, "solve", scene, "-o", dir, "--panels", panels, "--no-images", "--report", "-q"); err != nil {
		t.Fatal(err)
	}
	data, err := os.ReadFile(filepath.Join(dir, reportName))
	if err != nil {
		t.Fatal(err)
	}
	return regexp.MustCompile(`<[^>]*>`).ReplaceAllString(string(data), " ")
}

// wantWords checks that text speaks the trade's words and none of
// another's.
func wantWords(t *testing.T, what, text string, good, bad []string) {
	t.Helper()
	low := strings.ToLower(text)
	for _, w := range good {
		if !strings.Contains(low, w) {
			t.Errorf("%s lacks %q:\n%s", what, w, text)
		}
	}
	for _, w := range bad {
		// Whole words: "discharge" is not "charge".
		if regexp.MustCompile(`\b` + regexp.QuoteMeta(w)).MatchString(low) {
			t.Errorf("%s says %q:\n%s", what, w, text)
		}
	}
}

// The electrostatic pictures and report speak of field lines, flux tubes,
// charge and permittivity, with units; never of flow channels, heads or
// hydraulic conductivity.
func TestElectrostaticWords(t *testing.T) {
	scene := repoPath("examples", "busbars", "scene.geojson")
	bad := []string{"flow channel", "flow net", "flow line", "hydraulic", "conductivity", "total head", "discharge", "seepage", "potential drops"}
	tk := solvedTask(t, scene, 400)
	wantWords(t, "electrostatic pictures", pictureText(t, tk),
		[]string{"field lines", "flux tubes", "potential steps", "c/ε", "surface charge density", "field strength |e|", "kv/mm", "pf/m"}, bad)
	wantWords(t, "electrostatic report", reportText(t, scene, "400"),
		[]string{"field plot", "flux tubes", "field lines", "permittivity", "charge", "capacitance matrix"}, bad)
}

// The seepage pictures speak of total head, flow channels, equipotential
// drops and the hydraulic gradient; never of charge, field lines or
// permittivity.
func TestSeepageWords(t *testing.T) {
	tk := solvedTask(t, pictureScene, 300)
	bad := []string{"charge", "field line", "flux tube", "permittivity", "capacitance", "potential steps"}
	wantWords(t, "seepage pictures", pictureText(t, tk),
		[]string{"total head", "flow lines", "flow channels", "equipotential drops", "q/(k h)", "hydraulic gradient"}, bad)
	wantWords(t, "seepage report", reportText(t, pictureScene, "300"),
		[]string{"flow net", "flow channels", "hydraulic conductivity", "seepage inflow", "total head"}, bad)
}
