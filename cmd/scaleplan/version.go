package main

import (
	"fmt"

	"github.com/urfave/cli/v2"
)

// version is the release of this build.
const version = "0.1.0"

func versionCommand() *cli.Command {
	return &cli.Command{
		Name:  "version",
		Usage: "print the version",
		Action: func(c *cli.Context) error {
			fmt.Fprintln(c.App.Writer, "scaleplan "+version)
			return nil
		},
	}
}
