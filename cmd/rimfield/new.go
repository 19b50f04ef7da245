package main

import (
	"errors"
	"fmt"
	"io"
	"os"
	"path/filepath"
	"strings"

	tpl "github.com/rimfield/rimfield/geom/template"
)

// templateNames returns the registered template names in order, or "none
// yet".
func templateNames() string {
	var names []string
	for _, e := range tpl.Entries() {
		names = append(names, e.Name)
	}
	if len(names) == 0 {
		return "none yet"
	}
	return strings.Join(names, ", ")
}

const newAbout = `
Writes a starter scene (GeoJSON) for a common configuration to stdout, or to
FILE with -o. Edit it, check it with "rimfield check", solve it with
"rimfield solve". Each template has flags of its own: rimfield new TEMPLATE
--help lists them with their units. Without TEMPLATE, lists the templates.`

func runNew(args []string, stdout, stderr io.Writer) error {
	// The template's name comes first so that its flags can be defined
	// before parsing; anything else goes to the generic command line.
	if len(args) == 0 || strings.HasPrefix(args[0], "-") {
		cl := newCommandLine("new", "rimfield new TEMPLATE [flags]", newAbout)
		if helped, err := cl.parse(args, stdout); helped || err != nil {
			return err
		}
		if len(cl.fs.Args()) > 0 {
			return usagef("new: give the template name first: rimfield new TEMPLATE [flags]")
		}
		return listTemplates(stdout)
	}
	name := args[0]
	t, ok := tpl.Lookup(name)
	if !ok {
		return usagef("new: template %q unknown; available: %s", name, templateNames())
	}
	about := t.About
	if about == "" {
		about = t.Summary
	}
	cl := newCommandLine("new "+name, "rimfield new "+name+" [flags]", about)
	out := cl.fs.StringP("output", "o", "", "file to write the scene to (default: stdout); an existing file is replaced")
	params, build := t.New()
	for _, p := range params {
		addOption(cl.fs, p.Name, p.Usage, p.Value)
	}
	if helped, err := cl.parse(args[1:], stdout); helped || err != nil {
		return err
	}
	if _, err := cl.positional(); err != nil {
		return err
	}
	data, err := templateBytes(build())
	if err != nil {
		return fmt.Errorf("new %s: %w", name, err)
	}
	if *out == "" {
		_, err = stdout.Write(data)
		return err
	}
	if err := writeFileAtomic(*out, data); err != nil {
		return fmt.Errorf("new %s: %w", name, err)
	}
	return nil
}

func listTemplates(w io.Writer) error {
	entries := tpl.Entries()
	if len(entries) == 0 {
		_, err := fmt.Fprintln(w, "no templates yet")
		return err
	}
	for _, e := range entries {
		if _, err := fmt.Fprintf(w, "%-16s %s\n", e.Name, e.Summary); err != nil {
			return err
		}
	}
	return nil
}

// templateBytes turns a template's complaint about a parameter into a usage
// error naming the flag: each parameter's flag is its name in lower case.
func templateBytes(data []byte, err error) ([]byte, error) {
	var te *tpl.Error
	if errors.As(err, &te) {
		return nil, usagef("--%s: %s", strings.ToLower(te.Param), te.Msg)
	}
	return data, err
}

// writeFileAtomic writes data to path through a temporary file in the same
// directory, so that path is either the old file or the complete new one.
func writeFileAtomic(path string, data []byte) error {
	f, err := os.CreateTemp(filepath.Dir(path), "."+filepath.Base(path)+".rimfield-*")
	if err != nil {
		return err
	}
	tmp := f.Name()
	if _, err := f.Write(data); err != nil {
		f.Close()
		os.Remove(tmp)
		return err
	}
	if err := f.Close(); err != nil {
		os.Remove(tmp)
		return err
	}
	if err := os.Rename(tmp, path); err != nil {
		os.Remove(tmp)
		return err
	}
	return nil
}
