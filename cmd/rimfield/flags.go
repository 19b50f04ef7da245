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
	b.WriteString(c.fs.FlagUsagesWrapped(100))
	_, err := io.WriteString(w, b.String())
	return err
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
