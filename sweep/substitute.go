package sweep

import (
	"fmt"
	"math"
	"slices"
	"strconv"
	"strings"

	"scaleplan/feasibility"
	"scaleplan/materials"
)

// Candidates judged against what the strategy requires (spec §8.1).
//
// Where a strategy requires a property of the model (a substitute fluid's
// kinematic viscosity, a polymer's modulus) and a candidate supplies it,
// the candidate belongs to the window only where its own value lies within
// the study's tolerance of the requirement:
//
//	required·(1 − tol) ≤ own ≤ required·(1 + tol).
//
// The requirement is a product of powers of kL, so each side is a limit
// with a linear margin in log10 kL and an exact edge; the two are added to
// the combination's limits ("match" limits), which puts them in the
// window, its edge labels, the margin maps and the robust window. A free
// body or grain (Study setting unballasted) is checked the same way on its
// density: ρ_model = ρ_prototype / k_density ("density" limits).

// Match is a library entry that meets a required property at the
// recommended scale, within the study's tolerance, with every property the
// strategy gives taken from the same entry.
type Match struct {
	Entry, Conditions string
	Value             float64 // the entry's own value (SI); NaN when it states none
}

// deviceSupplied are the required properties a simulated strategy gets
// from a device rather than from its candidates (spec §4).
var deviceSupplied = map[string]string{
	"density":           "added mass",
	"stiffness":         "springs",
	"flexural_rigidity": "a backbone beam",
	"gravity":           "the g-level",
}

// check is one property a candidate must meet: its own value against the
// model value the strategy requires, ln req = C + E·ln kL.
type check struct {
	kind  string // "match" (a required property) or "density" (a free body)
	q     string
	cand  *Candidate2 // nil when the facility supplies it (gravity)
	who   string
	own   float64
	conds string
	req   linForm
	// protoValue is the prototype value the requirement scales from.
	protoValue float64
	// tune is set when the candidate can be brought to other values of q
	// (recipe.go): own is then its value at the stated conditions.
	tune *tuning
}

// band marks a limit built from a check, with the side it bounds.
type band struct {
	check
	upper bool // own ≤ req·(1+tol); else own ≥ req·(1−tol)
}

// candidateValue is a candidate's own value of a property and the
// conditions it holds at. It is the one place that says what a candidate
// can supply: today its stated conditions (and the axis value, for a
// medium swept over a condition).
func (x *combo) candidateValue(c *Candidate2, q string) (float64, string, bool) {
	pr, ok := x.byCand[c][q]
	if !ok {
		return 0, "", false
	}
	conds := c.Conditions
	if !math.IsNaN(x.axis) && isCondition(x.plan.Settings.Axis) && c.Role == "medium" {
		a := fmt.Sprintf("%s %s (axis)", x.plan.Settings.Axis, strconv.FormatFloat(x.axis, 'g', 6, 64))
		if conds == "" {
			conds = a
		} else {
			conds += ", " + a
		}
	}
	if conds == "" {
		conds = "its default conditions"
	}
	return pr.Value, conds, true
}

// supplier is the candidate whose value of a property the model has: the
// medium if it states it, else the material (as modelProperty).
func (x *combo) supplier(q string) *Candidate2 {
	for _, c := range []*Candidate2{x.medium, x.material} {
		if c == nil {
			continue
		}
		if _, ok := x.byCand[c][q]; ok {
			return c
		}
	}
	return nil
}

func (x *combo) unballasted(c *Candidate2) bool {
	return c != nil && x.plan.Unballasted[c.Name]
}

// requiredForm is the model value of a property the strategy requires, as
// a form in ln kL: the prototype's value over its scale factor.
func (x *combo) requiredForm(q string) (linForm, bool) {
	proto, ok := x.proto(q)
	if !ok || !(proto > 0) {
		return linForm{}, false
	}
	k, ok := x.lnK(q)
	if !ok {
		return linForm{}, false
	}
	return linForm{C: math.Log(proto) - k.C, E: -k.E}, true
}

// checks lists what the combination's candidates must meet. blocked says
// why no candidate can: a required property none of them states.
func (x *combo) checks() (out []check, blocked string, notes []string) {
	sol := x.cas.Solution
	tuned := func(q string) bool { return slices.Contains(sol.Strategy.Tuned, q) }
	// Free bodies and grains: density as the prototype's over k_density.
	for _, c := range []*Candidate2{x.material, x.medium} {
		if !x.unballasted(c) || tuned("density") {
			continue
		}
		own, conds, ok := x.candidateValue(c, "density")
		if !ok || !(own > 0) {
			blocked = fmt.Sprintf("%s cannot be ballasted (Study: unballasted) but states no density", c.Name)
			continue
		}
		proto, okP := x.proto("density")
		if c.Role == "material" {
			proto, okP = x.plan.ProtoMaterial["density"]
		}
		k, okK := x.lnK("density")
		if !okP || !okK {
			notes = append(notes, fmt.Sprintf("density of %s (unballasted) not checked: the strategy sets no density scale, or the prototype %s has no density", c.Name, c.Role))
			continue
		}
		req := linForm{C: math.Log(proto) - k.C, E: -k.E}
		if req.E == 0 && math.Abs(req.C-math.Log(own)) < 1e-12 {
			continue // it sets the density scale itself
		}
		out = append(out, check{kind: "density", q: "density", cand: c, who: c.Name, own: own, conds: conds, req: req, protoValue: proto})
	}
	densityDone := func(c *Candidate2) bool {
		for _, ch := range out {
			if ch.kind == "density" && ch.cand == c {
				return true
			}
		}
		return false
	}
	// Required properties, the defined ones (ν, E·I) first so that the
	// one a candidate states is checked and the other, linked to it, is not
	// checked twice.
	var order []string
	for _, q := range sol.Required {
		if feasibility.IsDefined(q) {
			order = append(order, q)
		}
	}
	for _, q := range sol.Required {
		if !feasibility.IsDefined(q) {
			order = append(order, q)
		}
	}
	required := func(t string) bool { return slices.Contains(sol.Required, t) }
	stated := func(t string) bool { return required(t) && x.supplier(t) != nil }
next:
	for _, q := range order {
		if tuned(q) {
			continue
		}
		sup := x.supplier(q)
		if q == "density" && sup != nil && densityDone(sup) {
			continue
		}
		if x.cas.Technique == "simulated" && deviceSupplied[q] != "" && !(q == "density" && x.unballasted(sup)) {
			continue
		}
		if q == "pressure" && slices.Contains(sol.Strategy.Retain, "cavitation") {
			// Under the cavitation law the required pressure is the
			// ambient pressure at the body, which the tunnel or tank
			// sets: its pressure range is a facility limit, not a
			// property of the fluid.
			continue
		}
		for _, ch := range out {
			if ch.kind == "match" && sol.Linked(q, ch.q) {
				continue next
			}
		}
		var ch check
		switch {
		case q == "gravity":
			ch = check{kind: "match", q: q, who: "the facility", own: x.gEnv, conds: "its gravity"}
		case sup != nil:
			own, conds, _ := x.candidateValue(sup, q)
			ch = check{kind: "match", q: q, cand: sup, who: sup.Name, own: own, conds: conds}
			ch.tune = x.tuningOf(sup, q, own)
		default:
			if sol.FollowsFrom(q, stated) || sol.FollowsFrom(q, required) {
				continue // judged through the property it is made of
			}
			if blocked == "" {
				blocked = fmt.Sprintf("the strategy requires the model's %s and %s states none: choose a candidate that does, or give %s", q, describePair(x.medium, x.material), q)
			}
			continue
		}
		if !(ch.own > 0) || math.IsInf(ch.own, 0) {
			notes = append(notes, fmt.Sprintf("%s of %s (%v) is not a positive value: not matched against the requirement", q, ch.who, ch.own))
			continue
		}
		req, ok := x.requiredForm(q)
		if !ok {
			continue // fill notes that the requirement cannot be evaluated
		}
		ch.req = req
		ch.protoValue, _ = x.proto(q)
		out = append(out, ch)
	}
	linkJoint(out)
	return out, blocked, notes
}

// bandLimits turns the checks into limits, two per check.
func (x *combo) bandLimits() ([]compiled, []string, error) {
	checks, _, notes := x.checks()
	var out []compiled
	for _, ch := range checks {
		for _, upper := range []bool{true, false} {
			c, err := x.bandLimit(ch, upper)
			if err != nil {
				return nil, nil, err
			}
			out = append(out, c)
		}
	}
	joint, err := x.jointLimits(checks)
	if err != nil {
		return nil, nil, err
	}
	return append(out, joint...), notes, nil
}

// bandLimit is one side of a check as a limit on the required value q:
// q ≥ own/(1+tol) (own not too high) or q ≤ own/(1−tol) (not too low).
func (x *combo) bandLimit(ch check, upper bool) (compiled, error) {
	tol := x.plan.Settings.Tolerance
	unit := quantityUnit(ch.q)
	own := ch.ownHigh()
	op, bound, side := "<=", own/(1-tol), "below"
	if upper {
		own = ch.ownLow()
		op, bound, side = ">=", own/(1+tol), "above"
	}
	exact := fmt.Sprintf("%s %s %s", ch.q, op, strconv.FormatFloat(bound, 'g', -1, 64))
	if unit != "" && unit != "1" {
		exact += " " + unit
	}
	l, err := feasibility.ParseLimit(exact)
	if err != nil {
		return compiled{}, fmt.Errorf("check of %s: %v", ch.q, err)
	}
	pct := strconv.FormatFloat(100*tol, 'g', 4, 64) + " %"
	name := fmt.Sprintf("%s of %s no more than %s %s need", ch.q, ch.who, pct, side)
	src := fmt.Sprintf("substitute check: %s has %s at %s; study tolerance %s", ch.who, formatSI(ch.own, unit), ch.conds, pct)
	if ch.tune != nil {
		src = fmt.Sprintf("substitute check: %s can be brought from %s to %s (%s); study tolerance %s", ch.who, formatSI(ch.tune.lo, unit), formatSI(ch.tune.hi, unit), ch.tune.knobsText, pct)
	}
	if ch.kind == "density" {
		name = fmt.Sprintf("density of %s (unballasted) no more than %s %s need", ch.who, pct, side)
		src = fmt.Sprintf("free body: %s cannot be ballasted, so its density %s must be the prototype's %s over k_density; study tolerance %s",
			ch.who, formatSI(ch.own, unit), formatSI(ch.protoValue, unit), pct)
	}
	sign := "+"
	if !upper {
		sign = "−"
	}
	expr := fmt.Sprintf("%s needed %s %s = %s/(1 %s %s)", ch.q, op, formatSI(bound, unit), strconv.FormatFloat(own, 'g', 6, 64), sign, strconv.FormatFloat(tol, 'g', 4, 64))
	c := newCompiled(LimitInfo{Name: name, Expression: expr, Source: src}, l, map[string]linForm{ch.q: ch.req})
	c.band = &band{check: ch, upper: upper}
	return c, nil
}

// bestPoint returns the u in the intervals where the smallest margin of
// the linear limits is largest, and that margin. The smallest of linear
// functions is concave, so its maximum lies at an interval's end or where
// two lines cross.
func bestPoint(limits []compiled, in []uInterval) (float64, float64) {
	minAt := func(u float64) float64 {
		m := math.Inf(1)
		for _, l := range limits {
			m = math.Min(m, l.info.A+l.info.B*u)
		}
		return m
	}
	bu, bm := math.NaN(), math.Inf(-1)
	try := func(u float64) {
		if m := minAt(u); m > bm {
			bu, bm = u, m
		}
	}
	for _, iv := range in {
		try(iv.lo)
		try(iv.hi)
		for i := range limits {
			for j := i + 1; j < len(limits); j++ {
				a, b := limits[i].info, limits[j].info
				if a.B == b.B {
					continue
				}
				if u := (b.A - a.A) / (a.B - b.B); u > iv.lo && u < iv.hi {
					try(u)
				}
			}
		}
	}
	return bu, bm
}

// bandFailing says why the checks empty a window the other limits leave
// open: what is needed at the nearest scale, what the candidate has, and
// the closest library entry. It returns "" when the other limits alone
// empty the window.
func (x *combo) bandFailing(limits []compiled, us []float64, condU float64) string {
	var bands []compiled
	for _, l := range limits {
		if l.band != nil {
			bands = append(bands, l)
		}
	}
	if len(bands) == 0 {
		return ""
	}
	others := limitWindow(limits, us, func(l compiled) bool { return l.band == nil })
	if !math.IsNaN(condU) {
		others = intersect(others, []uInterval{{condU, condU, "", ""}})
	}
	if len(others) == 0 {
		return ""
	}
	u, m := bestPoint(bands, others)
	if m >= 0 {
		return ""
	}
	worst := bands[0]
	for _, l := range bands {
		if l.info.A+l.info.B*u < worst.info.A+worst.info.B*u {
			worst = l
		}
	}
	ch := worst.band.check
	kL := math.Pow(10, u)
	req := ch.req.at(u * math.Ln10)
	unit := quantityUnit(ch.q)
	var b strings.Builder
	if ch.kind == "density" {
		fmt.Fprintf(&b, "%s cannot be ballasted (a free body or grain), so its density must be %s at %s (the prototype's %s over k_density = %.3g); it has %s",
			ch.who, sig3(req, unit), Scale(kL), sig3(ch.protoValue, unit), ch.protoValue/req, sig3(ch.own, unit))
		if s := x.submergedText(ch, req); s != "" {
			b.WriteString("; " + s)
		}
	} else {
		fmt.Fprintf(&b, "needs %s %s at %s; %s",
			strings.ReplaceAll(ch.q, "_", " "), sig3(req, unit), Scale(kL), ch.ownText(unit))
		// The library's recipes at this scale, or else the closest entry
		// and what the library can make at most (recipe_search.go).
		found := x.searchLibrary(ch, req)
		if s := x.closestEntry(ch, others); s != "" && len(found.matches) == 0 {
			b.WriteString("; " + s)
		}
		if found.text != "" {
			b.WriteString("; " + found.text)
			x.unmet = &Unmet{Quantity: ch.q, Required: req, KL: kL, Matches: found.matches, Reason: found.text}
		}
	}
	// Where would the candidate meet it at all?
	var own []compiled
	for _, l := range bands {
		if l.band.check == ch {
			own = append(own, l)
		}
	}
	if w := limitWindow(own, us, nil); len(w) > 0 {
		fmt.Fprintf(&b, " (it would meet it from %s to %s, which other limits rule out)", Scale(math.Pow(10, w[0].lo)), Scale(math.Pow(10, w[len(w)-1].hi)))
	} else {
		fmt.Fprintf(&b, " (it meets it nowhere from %s to %s)", Scale(math.Pow(10, us[0])), Scale(math.Pow(10, us[len(us)-1])))
	}
	return b.String()
}

// submergedText compares the relative submerged density (ρ_s/ρ_w − 1) of
// a free body in model and prototype, when both fluids are known.
func (x *combo) submergedText(ch check, req float64) string {
	if ch.cand == nil || ch.cand.Role != "material" || x.medium == nil {
		return ""
	}
	rhoP, ok1 := x.proto("density")
	rhoM, _, ok2 := x.candidateValue(x.medium, "density")
	if !ok1 || !ok2 {
		return ""
	}
	return fmt.Sprintf("relative submerged density (ρ_s/ρ_w − 1) %.3g in the model against %.3g in the prototype", ch.own/rhoM-1, ch.protoValue/rhoP-1)
}

// sig3 prints a value to three significant digits with its SI unit, for
// reasons.
func sig3(v float64, unit string) string {
	s := strconv.FormatFloat(v, 'g', 3, 64)
	if unit != "" && unit != "1" {
		s += " " + unit
	}
	return s
}

// kindWord names what an entry is, for a reason: a liquid, a gas, a solid.
func kindWord(e materials.Entry) string {
	if e.Kind == materials.Fluid {
		if isGas(e) {
			return "gas"
		}
		return "liquid"
	}
	return string(e.Kind)
}

// isGas tells a gas from a liquid by its density at default conditions:
// below 100 kg/m³ (gases near atmospheric pressure are about 0.1–2 kg/m³,
// liquids above about 600; common practice).
func isGas(e materials.Entry) bool {
	props, err := e.At(materials.Conditions{})
	if err != nil {
		return false
	}
	for _, pr := range props {
		if pr.Quantity == "density" {
			return pr.Value < 100
		}
	}
	return false
}

// compatible reports whether entry e could stand in for candidate c: the
// same kind, and for a fluid the same phase (no gas for a water tank).
func compatible(c *Candidate2, e materials.Entry) bool {
	if c.entry.Kind != e.Kind {
		return false
	}
	return e.Kind != materials.Fluid || isGas(e) == isGas(c.entry)
}

// withEntry is the combination with a library entry, at its default
// conditions, in place of one candidate: every given parameter is rebuilt
// from the entry's own properties.
func (x *combo) withEntry(role *Candidate2, e materials.Entry) (*combo, *Candidate2, bool) {
	list, err := e.At(materials.Conditions{})
	if err != nil {
		return nil, nil, false
	}
	props := map[string]materials.Property{}
	for _, pr := range list {
		props[pr.Quantity] = pr
	}
	c2 := &Candidate2{Name: e.Name, Entry: e.Name, Role: role.Role, Props: props, entry: e}
	med, mat := x.medium, x.material
	if role == x.medium {
		med = c2
	} else {
		mat = c2
	}
	y, err := x.plan.newComboDrawn(x.cas, med, mat, x.fac, x.axis, nil)
	if err != nil {
		return nil, nil, false
	}
	return y, c2, true
}

// entryChecks returns the checks an entry standing in for role must meet,
// one per check of role, or false when the entry lacks a property.
func (x *combo) entryChecks(role *Candidate2, e materials.Entry) ([]check, bool) {
	var want []check
	mine, _, _ := x.checks()
	for _, ch := range mine {
		if ch.cand == role {
			want = append(want, ch)
		}
	}
	if len(want) == 0 || !compatible(role, e) {
		return nil, false
	}
	y, c2, ok := x.withEntry(role, e)
	if !ok {
		return nil, false
	}
	theirs, blocked, _ := y.checks()
	if blocked != "" {
		return nil, false
	}
	var out []check
	for _, w := range want {
		found := false
		for _, ch := range theirs {
			if ch.cand == c2 && ch.q == w.q && ch.kind == w.kind {
				out, found = append(out, ch), true
			}
		}
		if !found {
			return nil, false
		}
	}
	return out, true
}

// meets reports whether a check holds at ln kL (to rounding).
func (x *combo) meets(ch check, ln float64) bool {
	tol := x.plan.Settings.Tolerance
	r := ch.req.at(ln)
	return ch.ownHigh() >= r*(1-tol)*(1-1e-12) && ch.ownLow() <= r*(1+tol)*(1+1e-12)
}

// libraryMatches lists the library entries that could replace the
// candidate supplying q at scale kL: every check of that candidate holds
// with the entry's own properties, the given parameters rebuilt from them.
func (x *combo) libraryMatches(q string, kL float64) []Match {
	mine, _, _ := x.checks()
	role := x.supplier(q)
	if role == nil {
		for _, ch := range mine {
			if ch.kind == "match" && ch.cand != nil {
				role = ch.cand
				break
			}
		}
	}
	if role == nil {
		return nil
	}
	ln := math.Log(kL)
	var out []Match
	for _, e := range x.plan.Library.Entries() {
		checks, ok := x.entryChecks(role, e)
		if !ok {
			continue
		}
		all := true
		for _, ch := range checks {
			all = all && x.meets(ch, ln)
		}
		if !all {
			continue
		}
		m := Match{Entry: e.Name, Conditions: "default conditions", Value: math.NaN()}
		if rc, err := e.Resolve(materials.Conditions{}); err == nil && rc.String() != "" {
			m.Conditions = rc.String()
		}
		if pr, err := e.Property(q, materials.Conditions{}); err == nil {
			m.Value = pr.Value
		}
		if rm, tuned, ok := recipeMatch(checks, q, ln); tuned {
			if !ok {
				continue
			}
			m.Conditions, m.Value = rm.Conditions, rm.Value
		}
		out = append(out, m)
	}
	return out
}

// closestEntry names the library entry, of the candidate's kind, that
// comes nearest to meeting the check at the scales the other limits allow.
func (x *combo) closestEntry(ch check, others []uInterval) string {
	if ch.cand == nil {
		return ""
	}
	type found struct {
		name          string
		own, req, u   float64
		margin        float64
		reqDiffersOwn bool
	}
	var best *found
	for _, e := range x.plan.Library.Entries() {
		if e.Name == ch.cand.entry.Name {
			continue // the candidate's own entry says nothing new
		}
		checks, ok := x.entryChecks(ch.cand, e)
		if !ok {
			continue
		}
		var lims []compiled
		var mine check
		for _, c := range checks {
			for _, upper := range []bool{true, false} {
				l, err := x.bandLimit(c, upper)
				if err != nil {
					return ""
				}
				lims = append(lims, l)
			}
			if c.q == ch.q {
				mine = c
			}
		}
		u, m := bestPoint(lims, others)
		if best == nil || m > best.margin || (m == best.margin && e.Name < best.name) {
			req := mine.req.at(u * math.Ln10)
			best = &found{name: e.Name, own: mine.own, req: req, u: u, margin: m,
				reqDiffersOwn: math.Abs(math.Log(req/ch.req.at(u*math.Ln10))) > 0.01}
		}
	}
	if best == nil {
		return ""
	}
	unit := quantityUnit(ch.q)
	word := kindWord(ch.cand.entry)
	if best.margin >= 0 {
		return fmt.Sprintf("the library's %s %s meets it at %s (%s): add it as a candidate", word, best.name, Scale(math.Pow(10, best.u)), sig3(best.own, unit))
	}
	s := fmt.Sprintf("the closest %s in the library, %s, has %s", word, best.name, sig3(best.own, unit))
	if best.reqDiffersOwn {
		s += fmt.Sprintf(" (with its own properties it would need %s at %s)", sig3(best.req, unit), Scale(math.Pow(10, best.u)))
	}
	return s
}
