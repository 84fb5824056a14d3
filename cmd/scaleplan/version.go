package main

import (
	"fmt"
	"runtime/debug"
	"strings"

	"github.com/urfave/cli/v2"
)

// buildVersion is the version recorded in the build: the main module's
// version (a release tag, or the pseudo-version go build derives from the
// commit), else the commit it was built from (with "+dirty" when the
// working tree had changes), else "devel" (go test, go run, no VCS).
func buildVersion() string {
	info, ok := debug.ReadBuildInfo()
	if !ok {
		return "devel"
	}
	return versionOf(info)
}

// versionOf reads the version from build information.
func versionOf(info *debug.BuildInfo) string {
	if v := info.Main.Version; v != "" && v != "(devel)" {
		return v
	}
	var rev string
	dirty := false
	for _, s := range info.Settings {
		switch s.Key {
		case "vcs.revision":
			rev = s.Value
		case "vcs.modified":
			dirty = s.Value == "true"
		}
	}
	if rev == "" {
		return "devel"
	}
	if len(rev) > 12 {
		rev = rev[:12]
	}
	if dirty {
		rev += "+dirty"
	}
	return rev
}

// versionLine is what both `scaleplan version` and `scaleplan --version`
// print.
func versionLine() string { return "scaleplan " + strings.TrimSpace(buildVersion()) }

func versionCommand() *cli.Command {
	return &cli.Command{
		Name:  "version",
		Usage: "print the version recorded in the build (also: scaleplan --version)",
		Action: func(c *cli.Context) error {
			fmt.Fprintln(c.App.Writer, versionLine())
			return nil
		},
	}
}
