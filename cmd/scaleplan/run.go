package main

import (
	"context"
	"fmt"
	"math"
	"os"
	"os/signal"
	"path/filepath"
	"strconv"
	"strings"
	"syscall"

	"github.com/urfave/cli/v2"

	"scaleplan/report"
	"scaleplan/sweep"
	"scaleplan/sweep/study"
)

func runCommand() *cli.Command {
	return &cli.Command{
		Name:      "run",
		Usage:     "sweep studies and write workbooks, maps and memos",
		UsageText: "scaleplan run [STUDY ...] [--out DIR] [--json] [--max-points N] [--no-files]",
		Description: "Each STUDY is an .xlsx workbook or a folder of .csv sheets. With no STUDY the built-in demo\n" +
			"scenarios run. Studies run in parallel; per study a workbook is written to the output folder and\n" +
			"a short table is printed (--json prints the same as data). Outputs are written to temporary files\n" +
			"and renamed when complete; an interrupt (Ctrl-C) stops the batch and leaves no partial file.",
		Flags: []cli.Flag{
			&cli.StringFlag{Name: "out", Value: "scaleplan-out", Usage: "output folder"},
			&cli.BoolFlag{Name: "json", Usage: "print the results as JSON"},
			&cli.StringFlag{Name: "format", Value: "png", Usage: "format of the feasibility maps: png, svg or pdf (PNG maps are always written too, for the workbook)"},
			&cli.StringFlag{Name: "max-points", Usage: "allow sweeps of up to N points (grid points × combinations), overriding each study's max_points (default 1e8)"},
			&cli.BoolFlag{Name: "no-files", Usage: "sweep and print the summary (text or --json) without writing any file: for scripts and for timing the sweep alone"},
		},
		Action: func(c *cli.Context) error {
			maxPoints, err := parseMaxPoints(c.String("max-points"))
			if err != nil {
				return err
			}
			format, err := report.ParsePlotFormat(c.String("format"))
			if err != nil {
				return usagef("--format: %v", err)
			}
			cat, err := sweep.NewFacilityCatalog()
			if err != nil {
				return err
			}
			var jobs []sweep.Job
			var inputs []string
			if c.NArg() == 0 {
				list, err := study.Scenarios()
				if err != nil {
					return err
				}
				for _, s := range list {
					jobs = append(jobs, sweep.Job{Name: s.Name, Load: func() (*study.Study, error) { return study.LoadScenario(s.Name) }, MaxPoints: maxPoints})
				}
			}
			for _, path := range c.Args().Slice() {
				jobs = append(jobs, sweep.Job{Name: path, Load: func() (*study.Study, error) { return study.Load(path) }, MaxPoints: maxPoints})
				inputs = append(inputs, path)
			}
			out, noFiles := c.String("out"), c.Bool("no-files")
			if err := refuseInputAsOutput(out, inputs); !noFiles && err != nil {
				return err
			}
			if err := refuseRepeatedInputs(inputs); err != nil {
				return err
			}
			// An interrupt cancels ctx: the batch stops, and no output is
			// written after it (WriteStudy leaves no partial file).
			ctx, stop := signal.NotifyContext(context.Background(), os.Interrupt, syscall.SIGTERM)
			defer stop()
			prog := newProgress(c.App.ErrWriter, len(jobs))
			defer prog.clear()
			for i := range jobs {
				jobs[i].Done = func(o sweep.Outcome) { prog.swept(o.Name) }
			}
			outcomes := sweep.RunBatch(pauseAt(ctx, "batch", c.App.ErrWriter), jobs, cat)
			if ctx.Err() != nil {
				return interrupted(0, len(outcomes))
			}
			if err := refuseSharedOutputs(outcomes); !noFiles && err != nil {
				return err
			}
			var data []any
			var failed []string
			written := 0
			made := false
			wctx := pauseAt(ctx, "write", c.App.ErrWriter)
			for _, o := range outcomes {
				if o.Err != nil {
					failed = append(failed, fmt.Sprintf("%s:\n%s", o.Name, indent(o.Err.Error())))
					if c.Bool("json") {
						data = append(data, report.RunErrorData(o.Name, o.Err))
					}
					continue
				}
				// The output folder is made only when there is something
				// to put in it.
				if !made && !noFiles {
					if err := os.MkdirAll(out, 0o755); err != nil {
						return fmt.Errorf("output folder %s: %v", out, err)
					}
					made = true
				}
				var files []string
				if !noFiles {
					prog.writing(written+1, succeeded(outcomes), o.Name)
					files, err = report.WriteStudy(wctx, out, o.Result, format)
					prog.clear()
				}
				if err != nil {
					if ctx.Err() != nil {
						return interrupted(written, len(outcomes))
					}
					return err
				}
				written++
				if c.Bool("json") {
					data = append(data, report.RunData(o.Result, files))
				} else {
					if err := report.WriteRunText(c.App.Writer, o.Result); err != nil {
						return err
					}
					if !noFiles {
						fmt.Fprintf(c.App.Writer, "written: %s\n\n", strings.Join(files, ", "))
					} else {
						fmt.Fprintln(c.App.Writer)
					}
				}
			}
			prog.clear()
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

// succeeded counts the studies that ran.
func succeeded(outcomes []sweep.Outcome) int {
	n := 0
	for _, o := range outcomes {
		if o.Err == nil {
			n++
		}
	}
	return n
}

func indent(s string) string {
	return "  " + strings.ReplaceAll(s, "\n", "\n  ")
}

// parseMaxPoints reads --max-points: "" (the studies' own max_points), or
// a whole number from 1 to sweep.MaxPointsLimit, also written 1e9.
func parseMaxPoints(s string) (int, error) {
	s = strings.TrimSpace(s)
	if s == "" {
		return 0, nil
	}
	x, err := strconv.ParseFloat(s, 64)
	if err != nil || x != math.Trunc(x) || x < 1 || x > sweep.MaxPointsLimit {
		return 0, usagef("--max-points: %q must be a whole number from 1 to %d (e.g. 1e9)", s, sweep.MaxPointsLimit)
	}
	return int(x), nil
}

// interrupted is the error of a batch stopped by an interrupt.
func interrupted(written, total int) error {
	return fmt.Errorf("interrupted: %d of %d studies were written before the interrupt, the rest not at all (no partial file is left)", written, total)
}

// resolve is a path made absolute with its symbolic links followed, as far
// as it exists (an output folder may not exist yet).
func resolve(p string) (string, error) {
	a, err := filepath.Abs(p)
	if err != nil {
		return "", err
	}
	if r, err := filepath.EvalSymlinks(a); err == nil {
		return r, nil
	}
	parent := filepath.Dir(a)
	if parent == a {
		return a, nil
	}
	r, err := resolve(parent)
	if err != nil {
		return "", err
	}
	return filepath.Join(r, filepath.Base(a)), nil
}

// refuseRepeatedInputs refuses a study given twice, under any spelling of
// its path (through a link, a hard link, or in another case on a file
// system that ignores case): both would write the same outputs.
func refuseRepeatedInputs(inputs []string) error {
	type input struct {
		path, resolved string
		info           os.FileInfo
	}
	var seen []input
	for _, in := range inputs {
		r, err := resolve(in)
		if err != nil {
			return err
		}
		info, _ := os.Stat(in)
		for _, first := range seen {
			if first.resolved != r && (info == nil || first.info == nil || !os.SameFile(first.info, info)) {
				continue
			}
			if first.path == in {
				return fmt.Errorf("the study %s is given twice: give each study once", in)
			}
			return fmt.Errorf("the studies %s and %s are the same file or folder: give each study once", first.path, in)
		}
		seen = append(seen, input{in, r, info})
	}
	return nil
}

// refuseSharedOutputs refuses two studies whose outputs would have the same
// file names (the same study name, or names that differ only in case or in
// characters a file name cannot hold), before anything is written: the
// second would replace the first.
func refuseSharedOutputs(outcomes []sweep.Outcome) error {
	seen := map[string]sweep.Outcome{}
	for _, o := range outcomes {
		if o.Result == nil {
			continue
		}
		base := report.FileName(o.Result.Name)
		key := strings.ToLower(base)
		if first, dup := seen[key]; dup {
			return fmt.Errorf("the studies %s (name %q) and %s (name %q) would both write %s.xlsx: give one of them another name setting on its Study sheet", first.Name, first.Result.Name, o.Name, o.Result.Name, base)
		}
		seen[key] = o
	}
	return nil
}

// refuseInputAsOutput makes sure no output can be written over a study:
// the output folder may be neither a study folder nor hold an .xlsx study,
// whatever the spelling of the paths and the links on the way (each path
// is compared as given, made absolute, and with its links followed).
func refuseInputAsOutput(out string, inputs []string) error {
	outs, err := spellings(out)
	if err != nil {
		return err
	}
	for _, in := range inputs {
		ins, err := spellings(in)
		if err != nil {
			return err
		}
		xlsx := strings.EqualFold(filepath.Ext(in), ".xlsx")
		same := false
		if a, err := os.Stat(out); err == nil {
			if b, err := os.Stat(in); err == nil {
				same = os.SameFile(a, b) // also in another case on a file system that ignores case
			}
		}
		for _, o := range outs {
			for _, i := range ins {
				if same || i == o || xlsx && within(o, i) {
					return fmt.Errorf("the output folder %s holds the study %s: choose another --out so nothing is written over an input", out, in)
				}
			}
		}
	}
	return nil
}

// spellings is a path made absolute, and also with its links followed.
func spellings(p string) ([]string, error) {
	a, err := filepath.Abs(p)
	if err != nil {
		return nil, err
	}
	r, err := resolve(p)
	if err != nil {
		return nil, err
	}
	return []string{a, r}, nil
}

// within reports whether path p lies inside the folder dir (both absolute).
func within(dir, p string) bool {
	rel, err := filepath.Rel(dir, p)
	return err == nil && rel != "." && rel != ".." && !strings.HasPrefix(rel, ".."+string(filepath.Separator))
}
