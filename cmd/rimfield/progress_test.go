package main

import (
	"bytes"
	"os"
	"testing"
)

// Progress shows only on a terminal, for large solves, without --quiet:
// never in pipes, files or buffers (so never in tests or CI logs).
func TestShowProgress(t *testing.T) {
	var buf bytes.Buffer
	if showProgress(&buf, 10000, false) {
		t.Error("progress on a buffer")
	}
	f, err := os.CreateTemp(t.TempDir(), "log")
	if err != nil {
		t.Fatal(err)
	}
	defer f.Close()
	if showProgress(f, 10000, false) {
		t.Error("progress on a regular file")
	}
	if progressSettings(f, 10000, false) != nil {
		t.Error("settings with progress for a regular file")
	}
	if showProgress(os.Stderr, 10, false) || showProgress(os.Stderr, 10000, true) {
		t.Error("progress for a small or quiet solve")
	}
}
