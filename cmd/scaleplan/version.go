package main

import (
	"fmt"

	"github.com/urfave/cli/v2"

	"scaleplan/report"
)

// versionLine is what both `scaleplan version` and `scaleplan --version`
// print.
func versionLine() string { return "scaleplan " + report.BuildVersion() }

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
