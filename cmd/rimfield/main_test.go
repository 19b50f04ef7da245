package main

import (
	"bytes"
	"errors"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"github.com/spf13/pflag"
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

// --solver fast is part of the command line but not built yet: a clear
// error pointing to dense, before any work.
func TestSolverFastNotAvailable(t *testing.T) {
	out := filepath.Join(t.TempDir(), "out")
	_, _, err := runArgs(t, "solve", "no-such-scene.geojson", "-o", out, "--solver", "fast")
	wantOneLine(t, err, "--solver fast is not available yet", "--solver dense")
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
	if len(templates) == 0 && !strings.Contains(err.Error(), "none yet") {
		t.Errorf("with no templates the error should say so: %v", err)
	}
}

// A template registered the way real ones are: its flags reach the
// builder, help lists them, -o writes a file, bad values are errors.
func TestNewTemplateRegistry(t *testing.T) {
	registerTemplate("test-strip", template{
		summary: "a strip for this test",
		flags: func(fs *pflag.FlagSet) func() ([]byte, error) {
			width := fs.Float64("width", 1, "strip width, mm")
			return func() ([]byte, error) {
				if *width <= 0 {
					return nil, errors.New("--width must be positive")
				}
				return []byte("strip " + pflagValue(fs, "width") + "\n"), nil
			}
		},
	})
	t.Cleanup(func() { delete(templates, "test-strip") })

	out, _, err := runArgs(t, "new", "test-strip", "--width", "2.5")
	if err != nil || out != "strip 2.5\n" {
		t.Fatalf("got %q, %v", out, err)
	}
	out, _, err = runArgs(t, "new", "test-strip", "--help")
	if err != nil || !strings.Contains(out, "--width") || !strings.Contains(out, "mm") || !strings.Contains(out, "--output") {
		t.Errorf("template help: %q, %v", out, err)
	}
	out, _, err = runArgs(t, "new")
	if err != nil || !strings.Contains(out, "test-strip") || !strings.Contains(out, "a strip for this test") {
		t.Errorf("template list: %q, %v", out, err)
	}
	file := filepath.Join(t.TempDir(), "scene.geojson")
	if _, _, err := runArgs(t, "new", "test-strip", "-o", file); err != nil {
		t.Fatal(err)
	}
	if data, err := os.ReadFile(file); err != nil || string(data) != "strip 1\n" {
		t.Errorf("file holds %q, %v", data, err)
	}
	_, _, err = runArgs(t, "new", "test-strip", "--width", "-1")
	wantOneLine(t, err, "new test-strip", "--width must be positive")
	_, _, err = runArgs(t, "new", "test-strip", "--depth", "3")
	wantUsageError(t, err, "unknown flag: --depth")
}

func pflagValue(fs *pflag.FlagSet, name string) string { return fs.Lookup(name).Value.String() }

// A panic anywhere below run is turned into one error line asking for a bug
// report, not a trace.
func TestPanicBecomesError(t *testing.T) {
	registerTemplate("test-panic", template{
		summary: "panics",
		flags: func(fs *pflag.FlagSet) func() ([]byte, error) {
			return func() ([]byte, error) { panic("index out of range") }
		},
	})
	t.Cleanup(func() { delete(templates, "test-panic") })
	_, _, err := runArgs(t, "new", "test-panic")
	wantOneLine(t, err, "internal error", "index out of range", "report")
}

func TestOneLine(t *testing.T) {
	if got := oneLine("geom: feature 2:\n  bad ring\n"); got != "geom: feature 2:; bad ring" {
		t.Errorf("got %q", got)
	}
}
