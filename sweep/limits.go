package sweep

import (
	"context"
	"errors"
	"fmt"
	"math"
	"sort"
	"strconv"
	"strings"

	"scaleplan/feasibility"
	"scaleplan/sweep/study"
)

// compiled is a limit ready to evaluate for one combination.
type compiled struct {
	info  LimitInfo
	lim   *feasibility.Limit
	forms map[string]linForm
	terms []feasibility.NameCoef // of a products-of-powers limit
	// vals and set are, for a limit that is not a product of powers, its
	// margin at every grid point and its feasible set.
	vals []float64
	set  []uInterval
	// concave says the sampled margins are concave along the grid (a run
	// length: a sum of products of powers against one): peak.go.
	concave bool
	// lower/upper range limits of a tuned property are built directly.
	// band is set on a limit that checks a candidate's own value against
	// the value the strategy requires (substitute.go).
	band *band
	// fn, when set, gives the margin of a limit that is no expression (a
	// joint recipe, recipe_joint.go).
	fn func(u float64) float64
}

// newCompiled readies a limit whose names resolve to forms; a product of
// powers gets its linear margin A + B·log10 kL.
func newCompiled(info LimitInfo, l *feasibility.Limit, forms map[string]linForm) compiled {
	c := compiled{info: info, lim: l, forms: forms}
	if k, terms, ok := l.LogLinear(); ok {
		c.terms = terms
		c.info.Linear = true
		c.info.A = k
		for _, t := range terms {
			e := t.Exp.Float64()
			f := forms[t.Name]
			c.info.A += e * f.C / math.Ln10
			c.info.B += e * f.E
		}
	}
	return c
}

// limitsFor collects the limits that apply to a combination: the facility
// type's defaults (unless the study overrides them by name), the study's
// limits, and the ranges of tuned properties.
func (x *combo) limitsFor() (out []compiled, notes []string, err error) {
	p := x.plan
	notes = append(notes, x.cas.Solution.Warnings...)
	applies := func(a string) bool {
		return a == "all" || (x.fac != nil && (a == x.fac.Type || a == x.fac.Name))
	}
	overridden := map[string]bool{}
	for _, l := range p.Limits {
		if applies(l.AppliesTo) {
			overridden[l.Name] = true
		}
	}
	out, skipped := x.defaultLimits(overridden)
	addSkipped := func(notes []string) []string {
		if len(skipped) > 0 {
			notes = append(notes, "default limits not applied, their names are not in the study: "+strings.Join(skipped, ", "))
		}
		return notes
	}
	for _, l := range p.Limits {
		if !applies(l.AppliesTo) {
			continue
		}
		forms, err := x.forms(l.Limit)
		if err != nil {
			return nil, addSkipped(nil), fmt.Errorf("%s: %v", study.At("Limits", l.Row, "expression"), err)
		}
		out = append(out, newCompiled(LimitInfo{Name: l.Name, Expression: l.Limit.Text, Source: l.Source}, l.Limit, forms))
	}
	tuned, tunedNotes, err := x.tunedLimits()
	notes = append(notes, tunedNotes...)
	if err != nil {
		return nil, addSkipped(nil), err
	}
	out = append(out, tuned...)
	bands, bandNotes, err := x.bandLimits()
	if err != nil {
		return nil, addSkipped(nil), err
	}
	return append(out, bands...), addSkipped(append(notes, bandNotes...)), nil
}

// forms resolves every name a limit uses for the combination.
func (x *combo) forms(l *feasibility.Limit) (map[string]linForm, error) {
	forms := map[string]linForm{}
	for _, n := range l.Names() {
		f, err := x.form(n)
		if err != nil {
			return nil, err
		}
		forms[n] = f
	}
	return forms, nil
}

// defaultLimits are the default limits of the combination's facility type
// that the study does not override, and the names of those skipped because
// they name something the study does not have.
func (x *combo) defaultLimits(overridden map[string]bool) (out []compiled, skipped []string) {
	if x.fac == nil {
		return nil, nil
	}
	for _, d := range x.plan.Catalog.DefaultLimits(x.fac.Type) {
		if overridden[d.Name] {
			continue
		}
		forms, err := x.forms(d.Limit)
		if err != nil {
			var un unknownNameError
			if errors.As(err, &un) {
				skipped = append(skipped, fmt.Sprintf("%s (needs %s)", d.Name, un.name))
			} else {
				skipped = append(skipped, fmt.Sprintf("%s (%v)", d.Name, err))
			}
			continue
		}
		out = append(out, newCompiled(LimitInfo{Name: d.Name, Expression: d.Expression, Source: d.Source}, d.Limit, forms))
	}
	return out, skipped
}

// tunedLimits are the limits of the range a candidate states for each
// property the strategy tunes (a note for a tuned property without one).
func (x *combo) tunedLimits() (out []compiled, notes []string, err error) {
	for _, q := range x.cas.Solution.Strategy.Tuned {
		pr, ok := x.props[q]
		if !ok || !(pr.Max > pr.Min) {
			notes = append(notes, fmt.Sprintf("tuned %s: the candidate states no range, so none is checked", q))
			continue
		}
		unit := quantityUnit(q)
		for _, side := range []struct {
			op, what string
			v        float64
		}{{">=", "min", pr.Min}, {"<=", "max", pr.Max}} {
			text := fmt.Sprintf("%s %s %s", q, side.op, formatSI(side.v, unit))
			l, err := feasibility.ParseLimit(text)
			if err != nil {
				return nil, notes, err
			}
			forms, err := x.forms(l)
			if err != nil {
				return nil, notes, err
			}
			out = append(out, newCompiled(LimitInfo{Name: "tuned " + q + " " + side.what, Expression: text, Source: "range of " + describePair(x.medium, x.material)}, l, forms))
		}
	}
	return out, notes, nil
}

func quantityUnit(q string) string {
	if qq, ok := feasibility.QuantityNamed(q); ok {
		return qq.SI
	}
	return ""
}

func formatSI(v float64, unit string) string {
	s := fmt.Sprintf("%.6g", v)
	if unit != "" && unit != "1" {
		s += " " + unit
	}
	return s
}

// sampleCache keeps, across the second axis, the grid margins of limits
// that are not products of powers: when a limit's names resolve to the same
// forms at the next axis value, nothing is evaluated again.
type sampleCache map[string]*compiled

func sameForms(a, b map[string]linForm) bool {
	if len(a) != len(b) {
		return false
	}
	for k, v := range a {
		if w, ok := b[k]; !ok || w != v {
			return false
		}
	}
	return true
}

// sample fills vals and set of every limit that is not a product of
// powers, from the cache where it can.
func sample(ctx context.Context, limits []compiled, us []float64, cache sampleCache) error {
	for j := range limits {
		l := &limits[j]
		if l.info.Linear {
			continue
		}
		if c, ok := cache[l.info.Name]; ok && sameForms(c.forms, l.forms) {
			l.vals, l.set, l.concave = c.vals, c.set, c.concave
			continue
		}
		lc := *l
		margin := func(u float64) float64 { return lc.margin(u) }
		l.vals = make([]float64, len(us))
		for i, u := range us {
			if i%65536 == 0 {
				if err := ctx.Err(); err != nil {
					return err
				}
			}
			l.vals[i] = margin(u)
		}
		l.concave = concaveSamples(us, l.vals)
		l.set = sampledFrom(us, l.vals, margin, l.info.Name)
		if l.set == nil {
			l.set = []uInterval{}
		}
		cache[l.info.Name] = l
	}
	return nil
}

// margin evaluates a limit's margin at u = log10 kL.
func (l compiled) margin(u float64) float64 {
	if l.info.Linear {
		return l.info.A + l.info.B*u
	}
	if l.fn != nil {
		return l.fn(u)
	}
	ln := u * math.Ln10
	return l.lim.Margin(func(n string) float64 { return l.forms[n].at(ln) })
}

func (p *Plan) prepareLimits(ps *study.Problems) {
	seen := map[string]bool{}
	for _, r := range p.Study.Limits {
		name := strings.TrimSpace(r.Limit)
		applies := strings.TrimSpace(r.AppliesTo)
		if applies == "" {
			applies = "all"
		}
		if name == "" {
			ps.Add(study.At("Limits", r.Row, "limit"), "the limit has no name")
			continue
		}
		key := applies + "\x00" + name
		if seen[key] {
			ps.Add(study.At("Limits", r.Row, "limit"), "limit %q for %s appears twice", name, applies)
			continue
		}
		seen[key] = true
		if applies != "all" && !p.Catalog.HasType(applies) && p.facility(applies) == nil {
			var known []string
			known = append(known, "all")
			known = append(known, p.Catalog.Types()...)
			for _, f := range p.Facilities {
				known = append(known, f.Name)
			}
			ps.Add(study.At("Limits", r.Row, "applies_to"), "%q is neither all, a facility type nor a facility of the study%s", applies, feasibility.Suggest(applies, known))
			continue
		}
		l, err := feasibility.ParseLimit(r.Expression)
		if err != nil {
			ps.Add(study.At("Limits", r.Row, "expression"), "%v", err)
			continue
		}
		pl := &PlanLimit{AppliesTo: applies, Name: name, Source: strings.TrimSpace(r.Source), Limit: l, Row: r.Row}
		if pl.Source == "" {
			pl.Source = "study"
		}
		// Dimension-check against every facility it applies to (or none).
		var targets []*Facility
		for _, f := range p.Facilities {
			if applies == "all" || applies == f.Type || applies == f.Name {
				targets = append(targets, f)
			}
		}
		if len(targets) == 0 {
			targets = []*Facility{nil}
		}
		for _, f := range targets {
			if err := l.Check(p.dimResolver(f)); errors.Is(err, errFailedName) {
				break // reported at its own row
			} else if err != nil {
				where := ""
				if f != nil {
					where = " (for facility " + strconv.Quote(f.Name) + ")"
				}
				ps.Add(study.At("Limits", r.Row, "expression"), "%v%s", err, where)
				break
			}
		}
		p.Limits = append(p.Limits, pl)
	}
}

// Constants usable in measures.
var constants = map[string]struct {
	value float64
	dim   feasibility.Dimension
}{
	"g_n": {StandardGravity, feasibility.Dim(0, 1, -2, 0)},
	"pi":  {math.Pi, feasibility.Dimension{}},
}

// names returns every name a measure may use for a facility, for
// suggestions.
func (p *Plan) names(f *Facility) []string {
	var out []string
	out = append(out, p.ItemOrder...)
	if f != nil {
		for c := range f.Caps {
			out = append(out, c)
		}
	}
	for _, q := range feasibility.Quantities() {
		if q.Kind == feasibility.Property {
			out = append(out, q.Name)
		}
	}
	for c := range constants {
		out = append(out, c)
	}
	sort.Strings(out)
	return out
}

// dimResolver gives the dimension of a name in a measure: a prototype item
// (at model scale), a capability of the facility, a model property or a
// constant.
func (p *Plan) dimResolver(f *Facility) func(string) (feasibility.Dimension, error) {
	return func(name string) (feasibility.Dimension, error) {
		if it, ok := p.Items[name]; ok {
			return it.Dim, nil
		}
		if f != nil {
			if _, ok := f.Caps[name]; ok {
				cp, _ := p.Catalog.Capability(f.Type, name)
				return cp.Dim, nil
			}
		}
		if q, ok := feasibility.QuantityNamed(name); ok && q.Kind == feasibility.Property {
			return q.Dim, nil
		}
		if c, ok := constants[name]; ok {
			return c.dim, nil
		}
		if name == "g_level" { // every facility's g-level, 1 unless stated or tied
			return feasibility.Dimension{}, nil
		}
		if p.failed.has(name) || f != nil && p.failed.has(f.Name, name) {
			return feasibility.Dimension{}, errFailedName
		}
		return feasibility.Dimension{}, unknownName(name, func() []string { return p.names(f) })
	}
}

type unknownNameError struct {
	name  string
	known func() []string
}

func (e unknownNameError) Error() string {
	hint := feasibility.Suggest(e.name, e.known())
	if strings.HasPrefix(hint, " (known") {
		hint = ""
	}
	return "unknown name " + strconv.Quote(e.name) + hint + ": use a prototype item, a facility capability, a property (density, kinematic_viscosity, ...) or g_n"
}

// unknownName reports a name no measure may use; the suggestion is worked
// out only when the message is printed.
func unknownName(name string, known func() []string) error {
	return unknownNameError{name, known}
}

// checkDim dimension-checks a measure for every facility it may be
// evaluated with: a name it cannot resolve is reported at exprCell, a
// dimension other than want at unitCell (one problem at most).
func (p *Plan) checkDim(ps *study.Problems, e *feasibility.Expr, targets []*Facility, want feasibility.Dimension, exprCell, unitCell study.Cell, mismatch func(feasibility.Dimension) string) {
	for _, f := range targets {
		d, err := e.Dim(p.dimResolver(f))
		if errors.Is(err, errFailedName) {
			return // reported at its own row
		}
		if err != nil {
			ps.Add(exprCell, "%v", err)
			return
		}
		if !d.Equal(want) {
			ps.Add(unitCell, "%s", mismatch(d))
			return
		}
	}
}
