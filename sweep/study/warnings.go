package study

import (
	"fmt"
	"path"
	"slices"
	"strings"

	"scaleplan/feasibility"
)

// Warning is something a study says that scaleplan does not use, or uses
// in a way the user may not expect (§8.1: nothing is dropped silently). A
// warning does not stop the study; an ambiguous input is a Problem instead.
type Warning struct {
	Cell     Cell   // where, when a place is known (Sheet empty otherwise)
	Strategy string // the strategy it concerns, "" for the whole study
	Msg      string
}

// String prints the warning with its place: "Strategies!I4: …".
func (w Warning) String() string {
	if w.Cell.Sheet == "" {
		return w.Msg
	}
	return w.Cell.String() + ": " + w.Msg
}

// Text is the warning as every output says it: a strategy's own warning
// begins with the strategy's name.
func (w Warning) Text() string {
	if w.Strategy != "" {
		return "strategy " + w.Strategy + ": " + w.String()
	}
	return w.String()
}

// Warnings is a list of warnings in the order they were found.
type Warnings []Warning

// Add records a warning of the whole study.
func (ws *Warnings) Add(c Cell, format string, args ...any) {
	*ws = append(*ws, Warning{Cell: c, Msg: fmt.Sprintf(format, args...)})
}

// Study returns the warnings that concern the whole study.
func (ws Warnings) Study() Warnings {
	var out Warnings
	for _, w := range ws {
		if w.Strategy == "" {
			out = append(out, w)
		}
	}
	return out
}

// Of returns the warnings of one strategy.
func (ws Warnings) Of(strategy string) Warnings {
	var out Warnings
	for _, w := range ws {
		if w.Strategy != "" && w.Strategy == strategy {
			out = append(out, w)
		}
	}
	return out
}

// Strings returns the warnings as text, each with its place.
func (ws Warnings) Strings() []string {
	out := make([]string, len(ws))
	for i, w := range ws {
		out[i] = w.String()
	}
	return out
}

// ignoredFile reports whether a file in a study folder is one a user does
// not put there on purpose: hidden files (.gitkeep, .DS_Store) and the
// lock files office programs leave beside an open file (~$Limits.csv,
// .~lock.Limits.csv#).
func ignoredFile(name string) bool {
	return strings.HasPrefix(name, ".") || strings.HasPrefix(name, "~$")
}

// sheetSuggestion says which sheet a stray name may have meant, or lists
// the sheets.
func sheetSuggestion(name string, sheets []string) string {
	s := feasibility.Suggest(name, sheets)
	if strings.HasPrefix(s, " (did you mean ") {
		return "; did you mean " + strings.TrimSuffix(strings.TrimPrefix(s, " (did you mean "), ")")
	}
	return " (the sheets are " + strings.Join(sheets, ", ") + ")"
}

// strayCSVFiles warns of every file in a CSV study folder that is no sheet
// of the study (a misspelt Limit.csv would otherwise be ignored and the
// window widen), and refuses a sheet present twice under names that differ
// only in case (Limits.csv and limits.csv: which one counts is ambiguous).
func strayCSVFiles(names []string, s *Study, ps *Problems) {
	files := make([]string, len(SheetNames))
	for i, sh := range SheetNames {
		files[i] = sh + ".csv"
	}
	for _, n := range names {
		if ignoredFile(n) {
			continue
		}
		if !slices.ContainsFunc(files, func(f string) bool { return strings.EqualFold(f, n) }) {
			msg := n + " is not a sheet of a study"
			if strings.EqualFold(path.Ext(n), ".csv") {
				msg += sheetSuggestion(n, files)
			} else {
				msg += " and is not read"
			}
			s.Warnings.Add(Cell{}, "%s", msg)
		}
	}
	refuseCaseTwins(names, files, "the folder holds", ps)
}

// strayWorksheets does the same for the worksheets of a workbook. The
// Instructions and Lists sheets of the template are part of it.
func strayWorksheets(list []string, s *Study, ps *Problems) {
	known := append(append([]string(nil), SheetNames...), instrSheet, listsSheet, choicesSheet)
	for _, n := range list {
		if !slices.ContainsFunc(known, func(f string) bool { return strings.EqualFold(f, n) }) {
			s.Warnings.Add(Cell{}, "the worksheet %q is not a sheet of a study and is not read%s", n, sheetSuggestion(n, SheetNames))
		}
	}
	refuseCaseTwins(list, SheetNames, "the workbook holds the worksheets", ps)
}

// refuseCaseTwins refuses two names that differ only in case and both
// stand for one sheet.
func refuseCaseTwins(names, sheets []string, what string, ps *Problems) {
	for _, sh := range sheets {
		var same []string
		for _, n := range names {
			if strings.EqualFold(n, sh) {
				same = append(same, n)
			}
		}
		if len(same) > 1 {
			sheet := strings.TrimSuffix(sh, ".csv")
			ps.Add(Cell{Sheet: sheet}, "%s %s: names that differ only in case are one sheet, so which one counts is ambiguous; keep one of them", what, strings.Join(same, " and "))
		}
	}
}
