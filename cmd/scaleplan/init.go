package main

import (
	"fmt"
	"os"
	"strings"

	"github.com/urfave/cli/v2"

	"scaleplan/materials"
	"scaleplan/sweep"
	"scaleplan/sweep/study"
)

func initCommand() *cli.Command {
	return &cli.Command{
		Name:      "init",
		Usage:     "write a filled study template",
		UsageText: "scaleplan init FILE [--scenario NAME] | scaleplan init --list",
		Description: "Writes a built-in scenario as a study to fill in: a workbook when FILE ends in .xlsx, otherwise a\n" +
			"folder of .csv sheets. Existing files are never overwritten.",
		Flags: []cli.Flag{
			&cli.StringFlag{Name: "scenario", Usage: "the scenario to start from (see --list)"},
			&cli.BoolFlag{Name: "list", Usage: "name the built-in scenarios"},
			&cli.StringFlag{Name: "synthetic", Usage: "write a large invented study instead, POINTSxAXISxCANDIDATESxSTRATEGIES (e.g. 2000x100x40x4), for performance figures"},
		},
		Action: func(c *cli.Context) error {
			list, err := study.Scenarios()
			if err != nil {
				return err
			}
			if c.Bool("list") {
				for _, s := range list {
					fmt.Fprintf(c.App.Writer, "%-10s %s\n", s.Name, s.Description)
				}
				return nil
			}
			if c.NArg() != 1 {
				return usagef("init needs one FILE (a name ending in .xlsx for a workbook, otherwise a folder of .csv sheets)")
			}
			path := c.Args().First()
			if _, err := os.Stat(path); err == nil {
				return fmt.Errorf("%s exists: init never writes over a file; choose another name", path)
			}
			name := c.String("scenario")
			if name == "" {
				name = list[0].Name
			}
			var s *study.Study
			if spec := c.String("synthetic"); spec != "" {
				var n [4]int
				if k, err := fmt.Sscanf(spec, "%dx%dx%dx%d", &n[0], &n[1], &n[2], &n[3]); err != nil || k != 4 || n[0] < 2 || n[1] < 0 || n[2] < 1 || n[3] < 1 {
					return usagef("--synthetic wants POINTSxAXISxCANDIDATESxSTRATEGIES, e.g. 2000x100x40x4 (axis 0 for none), got %q", spec)
				}
				s, name = study.Synthetic(n[0], n[1], n[2], n[3]), "synthetic "+spec
			} else {
				s, err = study.LoadScenario(name)
				if err != nil {
					return err
				}
			}
			if strings.HasSuffix(strings.ToLower(path), ".xlsx") {
				lists, lerr := templateLists()
				if lerr != nil {
					return lerr
				}
				err = study.WriteXLSX(path, s, lists)
			} else {
				err = study.WriteCSV(path, s)
			}
			if err != nil {
				return err
			}
			fmt.Fprintf(c.App.Writer, "wrote %s (scenario %s): edit it, then run scaleplan check %s\n", path, name, path)
			return nil
		},
	}
}

func templateLists() (study.Lists, error) {
	lib, err := materials.Default()
	if err != nil {
		return study.Lists{}, err
	}
	cat, err := sweep.NewFacilityCatalog()
	if err != nil {
		return study.Lists{}, err
	}
	return sweep.DefaultLists(lib, cat), nil
}
