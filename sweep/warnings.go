package sweep

import (
	"fmt"
	"slices"
	"sort"
	"strings"

	"scaleplan/feasibility"
	"scaleplan/sweep/study"
)

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
	// Facilities of one type missing the same items are named in one
	// warning, in the order of the Facilities sheet.
	type skip struct {
		typ, text string
		names     []string
	}
	var skips []*skip
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
		if len(skipped) == 0 {
			continue
		}
		text := strings.Join(skipped, "; ")
		i := slices.IndexFunc(skips, func(k *skip) bool { return k.typ == f.Type && k.text == text })
		if i < 0 {
			skips = append(skips, &skip{typ: f.Type, text: text})
			i = len(skips) - 1
		}
		skips[i].names = append(skips[i].names, f.Name)
	}
	for _, k := range skips {
		what := fmt.Sprintf("%s (a %s)", k.names[0], k.typ)
		if len(k.names) > 1 {
			what = fmt.Sprintf("%s and %s (each a %s)", strings.Join(k.names[:len(k.names)-1], ", "), k.names[len(k.names)-1], k.typ)
		}
		p.Warnings.Add(study.Cell{Sheet: "Prototype"}, "default limits of %s are not applied because the study has no item of that name: %s; add the items on the Prototype sheet, or give the limits on the Limits sheet in the study's own names",
			what, k.text)
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
			p.Warnings.Add(study.At("Facilities", row, "capability"), "%s of %s is stated but no limit, cost or measure uses it, so it limits nothing; add a limit on the Limits sheet that names it, or remove the row", c, f.Name)
		}
	}
}

// addFix records a fixed free choice of a case; the same quantity fixed
// twice in one cell is refused when the factors differ (which one holds is
// ambiguous) and a warning when they agree.
func (p *Plan) addFix(c *PlanCase, q string, k float64, ps *study.Problems) {
	cell := study.At("Strategies", c.Row, "fix")
	if prev, dup := c.Fix[q]; dup {
		if prev != k {
			ps.Add(cell, "%s is fixed twice, at %v and at %v: which one holds is ambiguous; keep one", q, prev, k)
			return
		}
		p.Warnings = append(p.Warnings, study.Warning{Cell: cell, Strategy: c.Strategy, Msg: fmt.Sprintf("%s=%v is given twice; it is taken once", q, k)})
		return
	}
	c.Fix[q] = k
}

// refuseTwiceUncertain refuses an uncertain input given a second time: its
// draws would count twice, or one spread would silently win.
func refuseTwiceUncertain(us []*Uncertain, u *Uncertain, ps *study.Problems) bool {
	for _, o := range us {
		if o.key == u.key {
			ps.Add(study.At("Uncertainty", u.Row, "input"), "%s is given uncertain twice (also on row %d): which spread holds is ambiguous; keep one row", u.Label, o.Row)
			return true
		}
	}
	return false
}
