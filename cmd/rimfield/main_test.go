package main

import (
	"bytes"
	"errors"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"github.com/rimfield/rimfield/bem/job"
	"github.com/rimfield/rimfield/geom"
	tpl "github.com/rimfield/rimfield/geom/template"
)

// runArgs runs the command line and returns what it printed.
func runArgs(t *testing.T, args ...string) (stdout, stderr string, err error) {
	t.Helper()
	var o, e bytes.Buffer
	err = run(args, &o, &e)
	return o.String(), e.String(), err
}

// wantUsageError checks that err is a one-line usage error containing each
// of the fragments.
func wantUsageError(t *testing.T, err error, fragments ...string) {
	t.Helper()
	var ue *usageError
	if !errors.As(err, &ue) {
		t.Fatalf("got error %v (%T), want a usage error", err, err)
	}
	wantOneLine(t, err, fragments...)
}

func wantOneLine(t *testing.T, err error, fragments ...string) {
	t.Helper()
	if err == nil {
		t.Fatalf("got no error, want one containing %q", fragments)
	}
	msg := err.Error()
	if strings.ContainsAny(msg, "\r\n") {
		t.Errorf("error is not one line: %q", msg)
	}
	for _, f := range fragments {
		if !strings.Contains(msg, f) {
			t.Errorf("error %q does not contain %q", msg, f)
		}
	}
}

func TestTopHelp(t *testing.T) {
	for _, args := range [][]string{{"--help"}, {"-h"}, {"help"}} {
		out, _, err := runArgs(t, args...)
		if err != nil {
			t.Fatalf("%v: %v", args, err)
		}
		for _, want := range []string{"solve", "check", "new", "version", "--help", "--version"} {
			if !strings.Contains(out, want) {
				t.Errorf("%v: help does not mention %q:\n%s", args, want, out)
			}
		}
	}
}

// Every flag of every command is explained by its --help, with the unit or
// kind of value where it has one.
func TestCommandHelp(t *testing.T) {
	cases := map[string][]string{
		"solve":   {"--output", "-o", "--panels", "--levels", "--no-images", "--solver", "--quiet", "dense", "fast", "auto", "count", "results.json", "boundary.csv"},
		"check":   {"--panels", "count"},
		"new":     {"TEMPLATE", "--help"},
		"version": {"--help"},
	}
	for cmd, wants := range cases {
		for _, args := range [][]string{{cmd, "--help"}, {cmd, "-h"}, {"help", cmd}} {
			out, _, err := runArgs(t, args...)
			if err != nil {
				t.Fatalf("%v: %v", args, err)
			}
			for _, want := range wants {
				if !strings.Contains(out, want) {
					t.Errorf("%v: help does not mention %q:\n%s", args, want, out)
				}
			}
		}
	}
}

func TestUnknownCommand(t *testing.T) {
	_, _, err := runArgs(t, "solev", "scene.geojson")
	wantUsageError(t, err, `unknown command "solev"`, "available: solve, check, new, version, help")
	_, _, err = runArgs(t)
	wantUsageError(t, err, "no command", "available: solve, check, new, version, help")
	_, _, err = runArgs(t, "--panels", "3")
	wantUsageError(t, err, "--panels", "available commands")
	_, _, err = runArgs(t, "help", "solev")
	wantUsageError(t, err, `unknown command "solev"`)
}

func TestVersion(t *testing.T) {
	for _, args := range [][]string{{"version"}, {"--version"}} {
		out, _, err := runArgs(t, args...)
		if err != nil {
			t.Fatal(err)
		}
		if !strings.HasPrefix(out, "rimfield ") || !strings.Contains(out, "go1.") {
			t.Errorf("%v printed %q", args, out)
		}
	}
	_, _, err := runArgs(t, "version", "extra")
	wantUsageError(t, err, `unexpected argument "extra"`)
}

func TestSolveFlagErrors(t *testing.T) {
	dir := t.TempDir()
	out := filepath.Join(dir, "out")
	cases := []struct {
		args      []string
		fragments []string
	}{
		{[]string{"solve", "s.geojson"}, []string{"no output directory", "-o DIR"}},
		{[]string{"solve", "-o", out}, []string{"missing SCENE"}},
		{[]string{"solve", "a.geojson", "b.geojson", "-o", out}, []string{`unexpected argument "b.geojson"`}},
		{[]string{"solve", "s.geojson", "-o", out, "--panels", "-4"}, []string{"--panels -4", "negative"}},
		{[]string{"solve", "s.geojson", "-o", out, "--panels", "many"}, []string{"--panels", "many"}},
		{[]string{"solve", "s.geojson", "-o", out, "--levels", "0"}, []string{"--levels 0"}},
		{[]string{"solve", "s.geojson", "-o", out, "--solver", "sparse"}, []string{`--solver "sparse" unknown`, "dense, fast, auto"}},
		{[]string{"solve", "s.geojson", "-o", out, "--colour"}, []string{"unknown flag: --colour", "rimfield solve --help"}},
		{[]string{"check"}, []string{"missing SCENE"}},
		{[]string{"check", "s.geojson", "--panels=-1"}, []string{"negative"}},
	}
	for _, c := range cases {
		_, _, err := runArgs(t, c.args...)
		wantUsageError(t, err, c.fragments...)
	}
	if _, err := os.Stat(out); !errors.Is(err, os.ErrNotExist) {
		t.Errorf("a usage error created the output directory (stat: %v)", err)
	}
}

func TestSolveMissingScene(t *testing.T) {
	dir := t.TempDir()
	out := filepath.Join(dir, "out")
	for _, cmd := range [][]string{
		{"solve", filepath.Join(dir, "missing.geojson"), "-o", out},
		{"check", filepath.Join(dir, "missing.geojson")},
	} {
		_, _, err := runArgs(t, cmd...)
		wantOneLine(t, err, "missing.geojson", "no such file")
	}
	_, _, err := runArgs(t, "solve", dir, "-o", out)
	wantOneLine(t, err, "is a directory", "scene.geojson")
	if _, err := os.Stat(out); !errors.Is(err, os.ErrNotExist) {
		t.Errorf("a failed solve created the output directory (stat: %v)", err)
	}
}

func TestSolveOutputIsAFile(t *testing.T) {
	file := filepath.Join(t.TempDir(), "taken")
	if err := os.WriteFile(file, []byte("mine"), 0o666); err != nil {
		t.Fatal(err)
	}
	_, _, err := runArgs(t, "solve", "whatever.geojson", "-o", file)
	wantOneLine(t, err, "not a directory")
}

func TestNewUnknownTemplate(t *testing.T) {
	_, _, err := runArgs(t, "new", "no-such-template")
	wantUsageError(t, err, `template "no-such-template" unknown; available: `+templateNames())
}

// The templates' parameters are flags of rimfield new: they reach the
// builder, help lists them with their units, the list shows every
// template's summary, -o writes the file stdout would get, and an unknown
// flag is a usage error.
func TestNewTemplateFlags(t *testing.T) {
	def, _, err := runArgs(t, "new", "coaxial", "--sides", "16")
	if err != nil {
		t.Fatal(err)
	}
	out, _, err := runArgs(t, "new", "coaxial", "--sides", "16", "--outer", "7.5")
	if err != nil || out == def || !strings.Contains(out, "7.5") || strings.Contains(def, "7.5") {
		t.Fatalf("--outer 7.5 did not reach the scene: %v\n%s", err, out)
	}
	out, _, err = runArgs(t, "new", "coaxial", "--help")
	if err != nil || !strings.Contains(out, "--outer") || !strings.Contains(out, "in --unit") || !strings.Contains(out, "--output") {
		t.Errorf("template help: %q, %v", out, err)
	}
	out, _, err = runArgs(t, "new")
	for _, e := range tpl.Entries() {
		if err != nil || !strings.Contains(out, e.Name) || !strings.Contains(out, e.Summary) {
			t.Errorf("template list lacks %s: %q, %v", e.Name, out, err)
		}
	}
	file := filepath.Join(t.TempDir(), "scene.geojson")
	if _, _, err := runArgs(t, "new", "coaxial", "--sides", "16", "-o", file); err != nil {
		t.Fatal(err)
	}
	if data, err := os.ReadFile(file); err != nil || string(data) != def {
		t.Errorf("file holds %q, %v", data, err)
	}
	_, _, err = runArgs(t, "new", "coaxial", "--depth", "3")
	wantUsageError(t, err, "unknown flag: --depth")
}

// A panic anywhere below run is turned into one error line asking for a bug
// report, not a trace.
func TestPanicBecomesError(t *testing.T) {
	saved := jobs[geom.Seepage]
	jobs[geom.Seepage] = func() job.Job { return panicJob{saved()} }
	defer func() { jobs[geom.Seepage] = saved }()
	_, _, err := runArgs(t, "solve", pictureScene, "-o", filepath.Join(t.TempDir(), "out"), "--panels", "200")
	wantOneLine(t, err, "internal error", "index out of range", "report")
}

// panicJob is a job whose Solve panics, as a bug would.
type panicJob struct{ job.Job }

func (panicJob) Solve(*job.Setup) (*job.Outcome, error) { panic("index out of range") }

func TestOneLine(t *testing.T) {
	if got := oneLine("geom: feature 2:\n  bad ring\n"); got != "geom: feature 2:; bad ring" {
		t.Errorf("got %q", got)
	}
}
