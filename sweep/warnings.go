package sweep

import (
	"fmt"
	"path"
	"slices"
	"sort"
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

// warnDefaultLimits warns of every default facility limit that is not
// applied because it names something the study does not have (an item
// called significant_wave_height where the limit reads wave_height): the
// sweep skips such a limit, which widens the window. The test is the one
// the sweep makes (combo.form): a name that is no prototype item, no
// capability of the facility, no property and no constant.
func (p *Plan) warnDefaultLimits() {
	used := map[*Facility]bool{}
	for _, st := range p.Strategies {
		for _, c := range st.Cases {
			for _, f := range c.Facilities {
				used[f] = true
			}
		}
	}
	for _, f := range p.Facilities {
		if !used[f] || f.Type == "" {
			continue
		}
		overridden := map[string]bool{}
		for _, l := range p.Limits {
			if l.AppliesTo == "all" || l.AppliesTo == f.Type || l.AppliesTo == f.Name {
				overridden[l.Name] = true
			}
		}
		var skipped []string
		for _, d := range p.Catalog.DefaultLimits(f.Type) {
			if overridden[d.Name] {
				continue
			}
			// A limit on a capability the facility does not state (a
			// wavemaker's range in a tank without one) does not concern
			// it; one whose capabilities are all stated but whose item
			// is missing does.
			var missing []string
			stated := true
			for _, n := range d.Limit.Names() {
				if p.knownName(f, n) {
					continue
				}
				if p.isCapability(f, n) {
					stated = false
					break
				}
				hint := feasibility.Suggest(n, p.ItemOrder)
				if !strings.HasPrefix(hint, " (did you mean") {
					hint = ""
				}
				missing = append(missing, n+hint)
			}
			if stated && len(missing) > 0 {
				skipped = append(skipped, fmt.Sprintf("%q (%s) needs the prototype item %s", d.Name, d.Expression, strings.Join(missing, " and ")))
			}
		}
		if len(skipped) > 0 {
			p.Warnings.Add(Cell{Sheet: "Prototype"}, "default limits of %s (a %s) are not applied because the study has no item of that name: %s; add the items on the Prototype sheet, or give the limits on the Limits sheet in the study's own names",
				f.Name, f.Type, strings.Join(skipped, "; "))
		}
	}
}

// knownName reports whether a limit of facility f can use a name.
func (p *Plan) knownName(f *Facility, n string) bool {
	if _, ok := p.Items[n]; ok {
		return true
	}
	if _, ok := f.Caps[n]; ok {
		return true
	}
	if p.Settings.Axis == n && p.isCapability(f, n) {
		return true
	}
	if q, ok := feasibility.QuantityNamed(n); ok && q.Kind == feasibility.Property {
		return true
	}
	_, ok := constants[n]
	return ok
}

// warnUnusedCapabilities warns of every capability a facility states that
// no limit, cost, measure, uncertain input or axis uses: the user probably
// expects it to limit the model.
func (p *Plan) warnUnusedCapabilities() {
	for _, f := range p.Facilities {
		if f.Type == "" {
			continue
		}
		used := map[string]bool{"g_level": true} // sets the model's gravity
		use := func(names []string) {
			for _, n := range names {
				used[n] = true
			}
		}
		overridden := map[string]bool{}
		for _, l := range p.Limits {
			if l.AppliesTo == "all" || l.AppliesTo == f.Type || l.AppliesTo == f.Name {
				overridden[l.Name] = true
				use(l.Limit.Names())
			}
		}
		for _, d := range p.Catalog.DefaultLimits(f.Type) {
			if !overridden[d.Name] {
				use(d.Limit.Names())
			}
		}
		for _, c := range p.Costs {
			if c.Facility == "" || c.Facility == f.Name {
				use(c.Measure.Names())
			}
		}
		for _, m := range p.Measures {
			use(m.Expr.Names())
		}
		used[p.Settings.Axis] = true
		caps := make([]string, 0, len(f.Caps))
		for c := range f.Caps {
			caps = append(caps, c)
		}
		sort.Strings(caps)
		for _, c := range caps {
			if used[c] {
				continue
			}
			row := f.Row
			for _, r := range p.Study.Facilities {
				if strings.TrimSpace(r.Facility) == f.Name && strings.TrimSpace(r.Capability) == c {
					row = r.Row
				}
			}
			p.Warnings.Add(At("Facilities", row, "capability"), "%s of %s is stated but no limit, cost or measure uses it, so it limits nothing; add a limit on the Limits sheet that names it, or remove the row", c, f.Name)
		}
	}
}

// addFix records a fixed free choice of a case; the same quantity fixed
// twice in one cell is refused when the factors differ (which one holds is
// ambiguous) and a warning when they agree.
func (p *Plan) addFix(c *PlanCase, q string, k float64, ps *Problems) {
	cell := At("Strategies", c.Row, "fix")
	if prev, dup := c.Fix[q]; dup {
		if prev != k {
			ps.Add(cell, "%s is fixed twice, at %v and at %v: which one holds is ambiguous; keep one", q, prev, k)
			return
		}
		p.Warnings = append(p.Warnings, Warning{Cell: cell, Strategy: c.Strategy, Msg: fmt.Sprintf("%s=%v is given twice; it is taken once", q, k)})
		return
	}
	c.Fix[q] = k
}

// refuseTwiceUncertain refuses an uncertain input given a second time: its
// draws would count twice, or one spread would silently win.
func refuseTwiceUncertain(us []*Uncertain, u *Uncertain, ps *Problems) bool {
	for _, o := range us {
		if o.key == u.key {
			ps.Add(At("Uncertainty", u.Row, "input"), "%s is given uncertain twice (also on row %d): which spread holds is ambiguous; keep one row", u.Label, o.Row)
			return true
		}
	}
	return false
}
