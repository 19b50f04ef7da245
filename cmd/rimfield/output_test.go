package main

import (
	"errors"
	"io"
	"os"
	"path/filepath"
	"strings"
	"testing"
)

func textFile(name, content string) outputFile {
	return outputFile{name, func(w io.Writer) error {
		_, err := io.WriteString(w, content)
		return err
	}}
}

func failingFile(name string) outputFile {
	return outputFile{name, func(w io.Writer) error {
		io.WriteString(w, "half")
		return errors.New("disk full")
	}}
}

func writeTree(t *testing.T, dir string, files map[string]string) {
	t.Helper()
	if err := os.MkdirAll(dir, 0o777); err != nil {
		t.Fatal(err)
	}
	for name, content := range files {
		if err := os.WriteFile(filepath.Join(dir, name), []byte(content), 0o666); err != nil {
			t.Fatal(err)
		}
	}
}

// readTree returns every file under dir (relative name -> content).
func readTree(t *testing.T, dir string) map[string]string {
	t.Helper()
	out := map[string]string{}
	err := filepath.WalkDir(dir, func(path string, d os.DirEntry, err error) error {
		if err != nil || d.IsDir() {
			return err
		}
		data, err := os.ReadFile(path)
		rel, _ := filepath.Rel(dir, path)
		out[rel] = string(data)
		return err
	})
	if err != nil {
		t.Fatal(err)
	}
	return out
}

func sameTree(t *testing.T, got, want map[string]string) {
	t.Helper()
	if len(got) != len(want) {
		t.Errorf("got files %v, want %v", keys(got), keys(want))
	}
	for name, content := range want {
		if got[name] != content {
			t.Errorf("%s holds %q, want %q", name, got[name], content)
		}
	}
}

func keys(m map[string]string) []string {
	var out []string
	for k := range m {
		out = append(out, k)
	}
	return out
}

// A new run replaces the files an earlier run wrote (as listed in its
// results.json), removes the ones it no longer writes, and leaves the
// user's own files alone; no temporary directory stays behind.
func TestWriteOutputsReplaces(t *testing.T) {
	parent := t.TempDir()
	dir := filepath.Join(parent, "out")
	writeTree(t, dir, map[string]string{
		"results.json":     `{"files": ["results.json", "boundary.csv", "old-picture.png", "../escape.txt"]}`,
		"boundary.csv":     "old csv",
		"old-picture.png":  "old png",
		"notes.txt":        "mine",
		"unlisted-old.png": "not listed, so not ours to remove",
	})
	writeTree(t, parent, map[string]string{"escape.txt": "outside"})
	err := writeOutputs(dir, []outputFile{
		textFile("boundary.csv", "new csv"),
		textFile("results.json", `{"files": ["results.json", "boundary.csv"]}`),
	})
	if err != nil {
		t.Fatal(err)
	}
	sameTree(t, readTree(t, parent), map[string]string{
		"out/results.json":     `{"files": ["results.json", "boundary.csv"]}`,
		"out/boundary.csv":     "new csv",
		"out/notes.txt":        "mine",
		"out/unlisted-old.png": "not listed, so not ours to remove",
		"escape.txt":           "outside",
	})
	if entries, _ := os.ReadDir(parent); len(entries) != 2 {
		t.Errorf("parent holds %d entries, want out/ and escape.txt only", len(entries))
	}
}

// When any file fails, the directory is exactly as before and nothing is
// left next to it.
func TestWriteOutputsErrorLeavesDirUntouched(t *testing.T) {
	parent := t.TempDir()
	dir := filepath.Join(parent, "out")
	before := map[string]string{
		"results.json": `{"files": ["results.json", "boundary.csv"]}`,
		"boundary.csv": "old csv",
		"notes.txt":    "mine",
	}
	writeTree(t, dir, before)
	err := writeOutputs(dir, []outputFile{
		textFile("boundary.csv", "new csv"),
		failingFile("picture.png"),
		textFile("results.json", "{}"),
	})
	if err == nil || !strings.Contains(err.Error(), "picture.png") || !strings.Contains(err.Error(), "disk full") {
		t.Fatalf("got error %v, want one naming picture.png and the cause", err)
	}
	got := readTree(t, parent)
	want := map[string]string{}
	for k, v := range before {
		want["out/"+k] = v
	}
	sameTree(t, got, want)
}

// A failed run into a directory that did not exist creates none of it.
func TestWriteOutputsErrorCreatesNothing(t *testing.T) {
	parent := t.TempDir()
	dir := filepath.Join(parent, "a", "b", "out")
	err := writeOutputs(dir, []outputFile{textFile("results.json", "{}"), failingFile("boundary.csv")})
	if err == nil {
		t.Fatal("no error")
	}
	if entries, _ := os.ReadDir(parent); len(entries) != 0 {
		t.Errorf("a failed run left %v behind", entries)
	}
	if err := writeOutputs(dir, []outputFile{textFile("results.json", "{}")}); err != nil {
		t.Fatal(err)
	}
	sameTree(t, readTree(t, parent), map[string]string{"a/b/out/results.json": "{}"})
}

func TestWriteOutputsRejectsFile(t *testing.T) {
	parent := t.TempDir()
	path := filepath.Join(parent, "out")
	writeTree(t, parent, map[string]string{"out": "a file"})
	err := writeOutputs(path, []outputFile{textFile("results.json", "{}")})
	if err == nil || !strings.Contains(err.Error(), "not a directory") {
		t.Fatalf("got %v", err)
	}
	sameTree(t, readTree(t, parent), map[string]string{"out": "a file"})
}

// rimfield new -o replaces a file whole, through a temporary file.
func TestWriteFileAtomic(t *testing.T) {
	dir := t.TempDir()
	path := filepath.Join(dir, "scene.geojson")
	writeTree(t, dir, map[string]string{"scene.geojson": "old"})
	if err := writeFileAtomic(path, []byte("new")); err != nil {
		t.Fatal(err)
	}
	sameTree(t, readTree(t, dir), map[string]string{"scene.geojson": "new"})
	if err := writeFileAtomic(filepath.Join(dir, "missing", "x.geojson"), []byte("new")); err == nil {
		t.Error("writing into a missing directory succeeded")
	}
}
