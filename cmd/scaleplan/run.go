package main

import (
	"context"
	"fmt"
	"os"
	"os/signal"
	"path/filepath"
	"strings"

	"github.com/urfave/cli/v2"

	"scaleplan/report"
	"scaleplan/sweep"
)

func runCommand() *cli.Command {
	return &cli.Command{
		Name:      "run",
		Usage:     "sweep studies and write workbooks, maps and memos",
		UsageText: "scaleplan run [STUDY ...] [--out DIR] [--json]",
		Description: "Each STUDY is an .xlsx workbook or a folder of .csv sheets. With no STUDY the built-in demo\n" +
			"scenarios run. Studies run in parallel; per study a workbook is written to the output folder and\n" +
			"a short table is printed (--json prints the same as data).",
		Flags: []cli.Flag{
			&cli.StringFlag{Name: "out", Value: "scaleplan-out", Usage: "output folder"},
			&cli.BoolFlag{Name: "json", Usage: "print the results as JSON"},
		},
		Action: func(c *cli.Context) error {
			cat, err := sweep.NewFacilityCatalog()
			if err != nil {
				return err
			}
			var jobs []sweep.Job
			var inputs []string
			if c.NArg() == 0 {
				list, err := sweep.Scenarios()
				if err != nil {
					return err
				}
				for _, s := range list {
					jobs = append(jobs, sweep.Job{Name: s.Name, Load: func() (*sweep.Study, error) { return sweep.LoadScenario(s.Name) }})
				}
			}
			for _, path := range c.Args().Slice() {
				jobs = append(jobs, sweep.Job{Name: path, Load: func() (*sweep.Study, error) { return sweep.Load(path) }})
				inputs = append(inputs, path)
			}
			out := c.String("out")
			if err := refuseInputAsOutput(out, inputs); err != nil {
				return err
			}
			if err := os.MkdirAll(out, 0o755); err != nil {
				return fmt.Errorf("output folder %s: %v", out, err)
			}
			ctx, stop := signal.NotifyContext(context.Background(), os.Interrupt)
			defer stop()
			outcomes := sweep.RunBatch(ctx, jobs, cat)
			var data []any
			var failed []string
			for _, o := range outcomes {
				if o.Err != nil {
					failed = append(failed, fmt.Sprintf("%s:\n%s", o.Name, indent(o.Err.Error())))
					continue
				}
				files, err := report.WriteStudy(ctx, out, o.Result)
				if err != nil {
					return err
				}
				if c.Bool("json") {
					data = append(data, report.RunData(o.Result, files))
				} else {
					if err := report.WriteRunText(c.App.Writer, o.Result); err != nil {
						return err
					}
					fmt.Fprintf(c.App.Writer, "written: %s\n\n", strings.Join(files, ", "))
				}
			}
			if c.Bool("json") {
				if err := report.WriteRunJSON(c.App.Writer, data); err != nil {
					return err
				}
			}
			if len(failed) > 0 {
				fmt.Fprintln(c.App.ErrWriter, strings.Join(failed, "\n"))
				return fmt.Errorf("%d of %d studies could not run (problems listed above)", len(failed), len(outcomes))
			}
			return nil
		},
	}
}

func indent(s string) string {
	return "  " + strings.ReplaceAll(s, "\n", "\n  ")
}

// refuseInputAsOutput makes sure no output can be written over a study.
func refuseInputAsOutput(out string, inputs []string) error {
	o, err := filepath.Abs(out)
	if err != nil {
		return err
	}
	for _, in := range inputs {
		i, err := filepath.Abs(in)
		if err != nil {
			return err
		}
		if i == o || strings.HasPrefix(i, o+string(filepath.Separator)) && filepath.Ext(i) == ".xlsx" {
			return fmt.Errorf("the output folder %s holds the study %s: choose another --out so nothing is written over an input", out, in)
		}
	}
	return nil
}
