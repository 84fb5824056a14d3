package main

import (
	"errors"
	"fmt"
	"io"
	"strings"

	"github.com/urfave/cli/v2"

	"scaleplan/materials"
	"scaleplan/report"
	"scaleplan/sweep"
	"scaleplan/sweep/study"
)

func checkCommand() *cli.Command {
	return &cli.Command{
		Name:      "check",
		Usage:     "check studies and report every problem and warning with its sheet and cell",
		UsageText: "scaleplan check STUDY ... [--json]",
		Description: "Loads each STUDY (an .xlsx workbook or a folder of .csv sheets) and checks it against the library,\n" +
			"the laws, the facility catalogue and the units without sweeping it. Problems stop a study and\n" +
			"make check exit 1; warnings (something the study says but scaleplan does not use) are printed\n" +
			"and check exits 0 when there is nothing else.",
		Flags: []cli.Flag{
			&cli.BoolFlag{Name: "json", Usage: "print, per study, its problems and warnings as JSON"},
		},
		Action: func(c *cli.Context) error {
			if c.NArg() == 0 {
				return usagef("check needs at least one STUDY (an .xlsx workbook or a folder of .csv sheets)")
			}
			paths := c.Args().Slice()
			if err := refuseRepeatedInputs(paths); err != nil {
				return usageError{err.Error()}
			}
			cat, err := sweep.NewFacilityCatalog()
			if err != nil {
				return err
			}
			var checks []checkResult
			for _, p := range paths {
				checks = append(checks, checkStudy(p, cat))
			}
			bad := 0
			for _, r := range checks {
				if len(r.Problems) > 0 {
					bad++
				}
			}
			if c.Bool("json") {
				if err := report.WriteRunJSON(c.App.Writer, checkData(checks)); err != nil {
					return err
				}
			} else {
				writeCheckText(c.App.Writer, c.App.ErrWriter, checks)
			}
			switch {
			case bad == 0:
				return nil
			case len(checks) == 1:
				return fmt.Errorf("%s: %d problems", checks[0].Study, len(checks[0].Problems))
			default:
				return fmt.Errorf("%d of %d studies have problems (listed above)", bad, len(checks))
			}
		},
	}
}

// checkResult is what check finds in one study.
type checkResult struct {
	Study      string
	Problems   study.Problems
	Warnings   study.Warnings
	Strategies int
	Points     int
}

// checkStudy loads and prepares one study.
func checkStudy(path string, cat *sweep.FacilityCatalog) checkResult {
	r := checkResult{Study: path}
	s, err := study.Load(path)
	if s != nil {
		r.Warnings = s.Warnings
	}
	if err == nil {
		var lib *materials.Library
		lib, err = materials.Default()
		if err == nil {
			var plan *sweep.Plan
			plan, err = sweep.Prepare(s, lib, cat)
			if err == nil {
				r.Warnings, r.Strategies, r.Points = plan.Warnings, len(plan.Strategies), len(plan.Grid)
				return r
			}
		}
	}
	var ps study.Problems
	if errors.As(err, &ps) {
		r.Problems = ps
	} else {
		r.Problems = study.Problems{{Msg: err.Error()}}
	}
	return r
}

// writeCheckText prints each study's verdict: "no problems", its warnings
// (on stdout, with their count) and its problems (on stderr).
func writeCheckText(stdout, stderr io.Writer, checks []checkResult) {
	for _, r := range checks {
		if len(r.Problems) > 0 {
			lines := make([]string, len(r.Problems))
			for i, p := range r.Problems {
				lines[i] = "  " + strings.TrimPrefix(p.Error(), ": ")
			}
			fmt.Fprintf(stderr, "%s:\n%s\n", r.Study, strings.Join(lines, "\n"))
		}
		if len(r.Warnings) > 0 {
			fmt.Fprintf(stdout, "%s: %d %s:\n", r.Study, len(r.Warnings), plural(len(r.Warnings), "warning", "warnings"))
			for _, w := range r.Warnings {
				fmt.Fprintf(stdout, "  %s\n", w.Text())
			}
		}
		if len(r.Problems) == 0 {
			fmt.Fprintf(stdout, "%s: no problems (%d strategies, %d grid points)", r.Study, r.Strategies, r.Points)
			if n := len(r.Warnings); n > 0 {
				fmt.Fprintf(stdout, ", %d %s", n, plural(n, "warning", "warnings"))
			}
			fmt.Fprintln(stdout)
		}
	}
}

// plural picks the word for a count (used by check and the progress line).
func plural(n int, one, many string) string {
	if n == 1 {
		return one
	}
	return many
}

// JSON shapes of `scaleplan check --json`: per study, its problems with
// their places and its warnings.
type checkJSON struct {
	Study    string        `json:"study"`
	OK       bool          `json:"ok"`
	Problems []problemJSON `json:"problems"`
	Warnings []string      `json:"warnings"`
}

type problemJSON struct {
	Place   string `json:"place"`
	Message string `json:"message"`
}

func checkData(checks []checkResult) []any {
	var out []any
	for _, r := range checks {
		j := checkJSON{Study: r.Study, OK: len(r.Problems) == 0, Problems: []problemJSON{}, Warnings: []string{}}
		for _, p := range r.Problems {
			j.Problems = append(j.Problems, problemJSON{Place: p.Cell.String(), Message: p.Msg})
		}
		for _, w := range r.Warnings {
			j.Warnings = append(j.Warnings, w.Text())
		}
		out = append(out, j)
	}
	return out
}
