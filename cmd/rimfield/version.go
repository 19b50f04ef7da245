package main

import (
	"fmt"
	"io"
	"runtime"
	"runtime/debug"
)

// versionOverride may be set at link time:
// go build -ldflags "-X main.versionOverride=v1.2.3" ./cmd/rimfield
var versionOverride string

// version returns the version of rimfield: the link-time override, the
// module version for an installed release, or "devel".
func version() string {
	if versionOverride != "" {
		return versionOverride
	}
	if info, ok := debug.ReadBuildInfo(); ok && info.Main.Version != "" && info.Main.Version != "(devel)" {
		return info.Main.Version
	}
	return "devel"
}

func runVersion(args []string, stdout, stderr io.Writer) error {
	cl := newCommandLine("version", "rimfield version", "Prints the version of rimfield and of the Go toolchain that built it.")
	if helped, err := cl.parse(args, stdout); helped || err != nil {
		return err
	}
	if _, err := cl.positional(); err != nil {
		return err
	}
	_, err := fmt.Fprintf(stdout, "rimfield %s (%s, %s/%s)\n", version(), runtime.Version(), runtime.GOOS, runtime.GOARCH)
	return err
}
