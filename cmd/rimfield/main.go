// Command rimfield solves two-dimensional potential problems (Laplace's
// equation in a cross-section) with the boundary element method: electrode
// and conductor layouts, ideal flow around bodies, confined seepage under
// structures, and equipotential pictures for reports.
//
// Usage:
//
//	rimfield solve SCENE -o DIR   solve a scene and write results into DIR
//	rimfield check SCENE          validate a scene and report its mesh
//	rimfield new TEMPLATE         write a starter scene
//	rimfield version              print the version
//
// Every command explains its flags with --help. See README.md for the scene
// file format and the files solve writes.
package main

import (
	"errors"
	"fmt"
	"io"
	"os"
	"sort"
	"strings"
)

func main() {
	adviseHugePages()
	err := run(os.Args[1:], os.Stdout, os.Stderr)
	if err == nil {
		return
	}
	fmt.Fprintln(os.Stderr, "rimfield:", oneLine(err.Error()))
	var ue *usageError
	if errors.As(err, &ue) {
		os.Exit(2)
	}
	os.Exit(1)
}

// command is one subcommand of rimfield.
type command struct {
	summary string
	run     func(args []string, stdout, stderr io.Writer) error
}

// commands lists the subcommands by name. It is filled in init to break the
// initialisation cycle through the help command.
var commands map[string]command

func init() {
	commands = map[string]command{
		"solve":   {"solve a scene and write results.json and boundary.csv into a directory", runSolve},
		"check":   {"validate a scene, build its mesh and print a summary without solving", runCheck},
		"new":     {"write a starter scene for a common configuration", runNew},
		"version": {"print the version of rimfield", runVersion},
		"help":    {"explain a command: rimfield help CMD", runHelp},
	}
}

// run executes the command line args (without the program name). It is main
// without the process: output goes to stdout and stderr, failure is the
// returned error.
func run(args []string, stdout, stderr io.Writer) (err error) {
	defer func() {
		if r := recover(); r != nil {
			err = fmt.Errorf("internal error: %v; this is a bug in rimfield, please report it with the scene file and the command line", r)
		}
	}()
	if len(args) == 0 {
		return usagef("no command given; available: %s (rimfield --help explains them)", commandNames())
	}
	switch args[0] {
	case "-h", "--help":
		return printTopHelp(stdout)
	case "--version":
		return runVersion(nil, stdout, stderr)
	}
	name := args[0]
	if strings.HasPrefix(name, "-") {
		return usagef("flag %s given before a command; available commands: %s", name, commandNames())
	}
	cmd, ok := commands[name]
	if !ok {
		return usagef("unknown command %q; available: %s", name, commandNames())
	}
	return cmd.run(args[1:], stdout, stderr)
}

// commandNames returns the subcommand names in a fixed, readable order.
func commandNames() string {
	order := []string{"solve", "check", "new", "version", "help"}
	names := make([]string, 0, len(commands))
	seen := map[string]bool{}
	for _, n := range order {
		if _, ok := commands[n]; ok {
			names = append(names, n)
			seen[n] = true
		}
	}
	var rest []string
	for n := range commands {
		if !seen[n] {
			rest = append(rest, n)
		}
	}
	sort.Strings(rest)
	return strings.Join(append(names, rest...), ", ")
}

func printTopHelp(w io.Writer) error {
	var b strings.Builder
	b.WriteString(`rimfield solves two-dimensional potential problems (Laplace's equation in a
cross-section) with the boundary element method: electrode and conductor
layouts, ideal flow, confined seepage, equipotential and flow-net pictures.

Usage:
  rimfield COMMAND [flags] [arguments]

Commands:
`)
	for _, n := range strings.Split(commandNames(), ", ") {
		fmt.Fprintf(&b, "  %-8s %s\n", n, commands[n].summary)
	}
	b.WriteString(`
Flags:
  -h, --help      explain rimfield (or, after a command, that command)
      --version   print the version

Scene files are GeoJSON FeatureCollections with a "problem" member; every
number rimfield writes is in SI units (metres, volts, metres of head, ...).
Run "rimfield COMMAND --help" for the flags of a command.
`)
	_, err := io.WriteString(w, b.String())
	return err
}

func runHelp(args []string, stdout, stderr io.Writer) error {
	if len(args) == 0 {
		return printTopHelp(stdout)
	}
	if len(args) > 1 {
		return usagef("help: one command at a time, got %d", len(args))
	}
	if args[0] == "help" {
		return printTopHelp(stdout)
	}
	cmd, ok := commands[args[0]]
	if !ok {
		return usagef("help: unknown command %q; available: %s", args[0], commandNames())
	}
	return cmd.run([]string{"--help"}, stdout, stderr)
}

// oneLine folds a multi-line message onto one line so that every error is a
// single line on stderr.
func oneLine(s string) string {
	s = strings.TrimSpace(s)
	if !strings.ContainsAny(s, "\r\n") {
		return s
	}
	fields := strings.FieldsFunc(s, func(r rune) bool { return r == '\n' || r == '\r' })
	for i := range fields {
		fields[i] = strings.TrimSpace(fields[i])
	}
	return strings.Join(fields, "; ")
}
