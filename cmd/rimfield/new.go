package main

import (
	"fmt"
	"io"
	"os"
	"path/filepath"
	"sort"
	"strings"

	"github.com/spf13/pflag"
)

// template is a starter scene for a common configuration, written by
// rimfield new. Each template registers itself from an init function in its
// own file with registerTemplate.
type template struct {
	// summary is one line for the list of templates.
	summary string
	// about explains the configuration and its flags (shown by --help).
	about string
	// flags defines the template's flags on fs (each with its unit in the
	// usage text) and returns the builder, which reads them after parsing
	// and returns the scene file's bytes, or an error naming the flag at
	// fault.
	flags func(fs *pflag.FlagSet) (build func() ([]byte, error))
}

// templates holds the registered templates by name.
var templates = map[string]template{}

// registerTemplate adds a template. It panics on a duplicate name, a
// programming error found by any run.
func registerTemplate(name string, t template) {
	if _, dup := templates[name]; dup {
		panic("rimfield: template " + name + " registered twice")
	}
	templates[name] = t
}

// templateNames returns the registered names in order, or "none yet".
func templateNames() string {
	if len(templates) == 0 {
		return "none yet"
	}
	names := make([]string, 0, len(templates))
	for n := range templates {
		names = append(names, n)
	}
	sort.Strings(names)
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
	t, ok := templates[name]
	if !ok {
		return usagef("new: template %q unknown; available: %s", name, templateNames())
	}
	about := t.about
	if about == "" {
		about = t.summary
	}
	cl := newCommandLine("new "+name, "rimfield new "+name+" [flags]", about)
	out := cl.fs.StringP("output", "o", "", "file to write the scene to (default: stdout); an existing file is replaced")
	build := t.flags(cl.fs)
	if helped, err := cl.parse(args[1:], stdout); helped || err != nil {
		return err
	}
	if _, err := cl.positional(); err != nil {
		return err
	}
	data, err := build()
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
	if len(templates) == 0 {
		_, err := fmt.Fprintln(w, "no templates yet")
		return err
	}
	names := strings.Split(templateNames(), ", ")
	for _, n := range names {
		if _, err := fmt.Fprintf(w, "%-16s %s\n", n, templates[n].summary); err != nil {
			return err
		}
	}
	return nil
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
