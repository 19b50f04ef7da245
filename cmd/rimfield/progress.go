package main

import (
	"fmt"
	"io"
	"os"
	"sync"

	"github.com/rimfield/rimfield/bem"
)

// progressPanels is the panel count from which a solve on a terminal shows
// what it is doing: below it the whole solve takes a second or two.
const progressPanels = 3000

// showProgress reports whether a solve of n panels should show progress on
// w: not quiet, large enough, and w a terminal (never in pipes, files or
// tests).
func showProgress(w io.Writer, n int, quiet bool) bool {
	if quiet || n < progressPanels {
		return false
	}
	f, ok := w.(*os.File)
	if !ok {
		return false
	}
	st, err := f.Stat()
	return err == nil && st.Mode()&os.ModeCharDevice != 0
}

// progressSettings returns the solver settings for a solve of n panels: a
// progress line on w while the system is assembled, then a note that the
// dense factorisation runs (it reports no progress of its own).
func progressSettings(w io.Writer, n int, quiet bool) *bem.Settings {
	if !showProgress(w, n, quiet) {
		return nil
	}
	var mu sync.Mutex
	last := -1
	return &bem.Settings{Progress: func(done, total int) {
		pct := 100 * done / total
		mu.Lock()
		defer mu.Unlock()
		if pct/5 == last/5 && done != total {
			return
		}
		last = pct
		if done == total {
			fmt.Fprintf(w, "\rrimfield: assembled %d equations; factorising (dense LU, grows as the cube of the size)...", total)
			return
		}
		fmt.Fprintf(w, "\rrimfield: assembling %d equations: %3d%%", total, pct)
	}}
}

// endProgress clears the progress line.
func endProgress(w io.Writer, n int, quiet bool) {
	if showProgress(w, n, quiet) {
		fmt.Fprintf(w, "\r%-100s\r", "")
	}
}
