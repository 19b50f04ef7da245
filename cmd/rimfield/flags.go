package main

import (
	"errors"
	"fmt"
	"io"
	"strings"

	"github.com/spf13/pflag"
)

// commandLine is a subcommand's flag set with the text of its --help.
type commandLine struct {
	name  string // "solve"
	usage string // "rimfield solve SCENE -o DIR [flags]"
	about string // paragraphs explaining the command
	fs    *pflag.FlagSet
	help  *bool
}

func newCommandLine(name, usage, about string) *commandLine {
	fs := pflag.NewFlagSet(name, pflag.ContinueOnError)
	fs.SetOutput(io.Discard) // errors come back as values, help is printed by parse
	fs.Usage = func() {}
	fs.SortFlags = false
	c := &commandLine{name: name, usage: usage, about: about, fs: fs}
	c.help = fs.BoolP("help", "h", false, "explain this command and its flags")
	return c
}

// parse parses args. It returns helped = true when --help was given, after
// printing the help to stdout; the caller then returns nil.
func (c *commandLine) parse(args []string, stdout io.Writer) (helped bool, err error) {
	if err := c.fs.Parse(args); err != nil {
		if errors.Is(err, pflag.ErrHelp) {
			return true, c.printHelp(stdout)
		}
		return false, usagef("%s: %v (rimfield %s --help lists the flags)", c.name, err, c.name)
	}
	if *c.help {
		return true, c.printHelp(stdout)
	}
	return false, nil
}

func (c *commandLine) printHelp(w io.Writer) error {
	var b strings.Builder
	fmt.Fprintf(&b, "Usage:\n  %s\n\n", c.usage)
	if c.about != "" {
		b.WriteString(strings.TrimSpace(c.about))
		b.WriteString("\n\n")
	}
	b.WriteString("Flags:\n")
	b.WriteString(flagUsages(c.fs))
	_, err := io.WriteString(w, b.String())
	return err
}

// flagUsages lists the flags of fs, one paragraph each: names with the
// value's placeholder (the `quoted` word of the usage text), then the usage
// and the default when it is not the zero value, wrapped to 80 columns.
func flagUsages(fs *pflag.FlagSet) string {
	type entry struct{ names, usage string }
	var entries []entry
	width := 0
	fs.VisitAll(func(f *pflag.Flag) {
		names := "    --" + f.Name
		if f.Shorthand != "" {
			names = "-" + f.Shorthand + ", --" + f.Name
		}
		varname, usage := pflag.UnquoteUsage(f)
		if f.Value.Type() != "bool" && varname != "" {
			names += " " + varname
		}
		switch f.DefValue {
		case "", "0", "false", "[]", "NaN":
		default:
			usage += fmt.Sprintf(" (default %s)", f.DefValue)
		}
		entries = append(entries, entry{names, usage})
		width = max(width, len(names))
	})
	var b strings.Builder
	indent := 2 + width + 3
	for _, e := range entries {
		fmt.Fprintf(&b, "  %-*s   ", width, e.names)
		col := indent
		for i, word := range strings.Fields(e.usage) {
			if i > 0 && col+1+len(word) > 80 {
				fmt.Fprintf(&b, "\n%*s", indent, "")
				col = indent
			} else if i > 0 {
				b.WriteByte(' ')
				col++
			}
			b.WriteString(word)
			col += len(word)
		}
		b.WriteByte('\n')
	}
	return b.String()
}

// positional returns the positional arguments after checking that there
// are exactly n of them, named for the error message.
func (c *commandLine) positional(names ...string) ([]string, error) {
	args := c.fs.Args()
	switch {
	case len(args) < len(names):
		return nil, usagef("%s: missing %s (usage: %s)", c.name, names[len(args)], c.usage)
	case len(args) > len(names):
		return nil, usagef("%s: unexpected argument %q (usage: %s)", c.name, args[len(names)], c.usage)
	}
	return args, nil
}

// usageError is a mistake on the command line (exit status 2).
type usageError struct{ msg string }

func (e *usageError) Error() string { return e.msg }

func usagef(format string, args ...any) error {
	return &usageError{msg: fmt.Sprintf(format, args...)}
}

// addOption defines one flag bound to value, a pointer holding its default.
func addOption(fs *pflag.FlagSet, name, usage string, value any) {
	switch v := value.(type) {
	case *bool:
		fs.BoolVar(v, name, *v, usage)
	case *int:
		fs.IntVar(v, name, *v, usage)
	case *float64:
		fs.Float64Var(v, name, *v, usage)
	case *string:
		fs.StringVar(v, name, *v, usage)
	default:
		panic(fmt.Sprintf("rimfield: option --%s has a value of type %T", name, value))
	}
}
