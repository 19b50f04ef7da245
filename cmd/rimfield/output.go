package main

import (
	"encoding/json"
	"errors"
	"fmt"
	"io"
	"io/fs"
	"os"
	"path/filepath"
	"strings"
)

// resultsName is the file of integrated results, which lists every file a
// run wrote (its manifest).
const resultsName = "results.json"

// outputFile is one file solve writes: its name in the output directory and
// how to write its content.
type outputFile struct {
	name  string
	write func(w io.Writer) error
}

// writeOutputs writes files into dir atomically per file: everything is
// first written into a fresh temporary directory next to dir (same parent,
// so same file system), and only when every file is complete is each one
// moved into dir with os.Rename, replacing the file of the same name.
// Files that the previous run listed in dir/results.json ("files") and this
// run does not write are removed; every other file in dir is left alone.
// On any error before the moves, nothing is left behind: no temporary
// directory, and dir and its parents only if they existed before.
func writeOutputs(dir string, files []outputFile) (err error) {
	dir = filepath.Clean(dir)
	if err := checkOutputDir(dir); err != nil {
		return err
	}
	for _, f := range files {
		if f.name != filepath.Base(f.name) || f.name == "." || f.name == ".." {
			return fmt.Errorf("internal error: output file name %q is not a plain name", f.name)
		}
	}
	var created []string // directories this call created, outermost first
	defer func() {
		if err != nil {
			for i := len(created) - 1; i >= 0; i-- {
				os.Remove(created[i]) // only removes it if still empty
			}
		}
	}()
	parent := filepath.Dir(dir)
	if created, err = mkdirAllTracked(parent); err != nil {
		return fmt.Errorf("cannot create output directory: %w", err)
	}
	tmp, err := os.MkdirTemp(parent, "."+filepath.Base(dir)+".rimfield-*")
	if err != nil {
		return fmt.Errorf("cannot write next to the output directory: %w", err)
	}
	defer os.RemoveAll(tmp)
	for _, f := range files {
		if err := writeFile(filepath.Join(tmp, f.name), f.write); err != nil {
			return fmt.Errorf("writing %s: %w", f.name, err)
		}
	}
	if _, err := os.Stat(dir); errors.Is(err, fs.ErrNotExist) {
		if err := os.Mkdir(dir, 0o777); err != nil {
			return fmt.Errorf("cannot create output directory: %w", err)
		}
		created = append(created, dir)
	}
	previous := previousFiles(dir)
	written := map[string]bool{}
	for _, f := range files {
		if err := os.Rename(filepath.Join(tmp, f.name), filepath.Join(dir, f.name)); err != nil {
			return fmt.Errorf("cannot move %s into %s: %w", f.name, dir, err)
		}
		written[f.name] = true
	}
	created = nil // dir now holds results: keep it whatever happens next
	for _, name := range previous {
		if !written[name] {
			if err := os.Remove(filepath.Join(dir, name)); err != nil && !errors.Is(err, fs.ErrNotExist) {
				return fmt.Errorf("cannot remove %s left by an earlier run: %w", name, err)
			}
		}
	}
	return nil
}

// checkOutputDir fails when dir exists and is not a directory.
func checkOutputDir(dir string) error {
	info, err := os.Stat(dir)
	switch {
	case errors.Is(err, fs.ErrNotExist):
		return nil
	case err != nil:
		return fmt.Errorf("output directory: %w", err)
	case !info.IsDir():
		return fmt.Errorf("output %s exists and is not a directory; give a directory with -o", dir)
	}
	return nil
}

// mkdirAllTracked is os.MkdirAll that returns the directories it created,
// outermost first.
func mkdirAllTracked(dir string) ([]string, error) {
	var missing []string
	for d := dir; ; d = filepath.Dir(d) {
		if _, err := os.Stat(d); err == nil {
			break
		} else if !errors.Is(err, fs.ErrNotExist) {
			return nil, err
		}
		missing = append(missing, d)
		if filepath.Dir(d) == d {
			break
		}
	}
	var created []string
	for i := len(missing) - 1; i >= 0; i-- {
		if err := os.Mkdir(missing[i], 0o777); err != nil {
			for k := len(created) - 1; k >= 0; k-- {
				os.Remove(created[k])
			}
			return nil, err
		}
		created = append(created, missing[i])
	}
	return created, nil
}

// writeFile creates path and writes it with write, closing it in any case.
func writeFile(path string, write func(io.Writer) error) error {
	f, err := os.OpenFile(path, os.O_WRONLY|os.O_CREATE|os.O_EXCL, 0o666)
	if err != nil {
		return err
	}
	if err := write(f); err != nil {
		f.Close()
		return err
	}
	return f.Close()
}

// previousFiles returns the plain file names listed under "files" in
// dir/results.json, or nil when there is no such readable list.
func previousFiles(dir string) []string {
	data, err := os.ReadFile(filepath.Join(dir, resultsName))
	if err != nil {
		return nil
	}
	var manifest struct {
		Files []string `json:"files"`
	}
	if json.Unmarshal(data, &manifest) != nil {
		return nil
	}
	var out []string
	for _, name := range manifest.Files {
		if name != "" && name == filepath.Base(name) && name != "." && name != ".." && !strings.ContainsAny(name, `/\`) {
			out = append(out, name)
		}
	}
	return out
}

// bytesFile is an output file with the given content.
func bytesFile(name string, data []byte) outputFile {
	return outputFile{name, func(w io.Writer) error {
		_, err := w.Write(data)
		return err
	}}
}
