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
	// The conditions as people read them (18 °C, not the cell's 18C); a
	// medium swept over a condition holds at the axis value instead.
	cond := c.cond
	swept := !math.IsNaN(x.axis) && isCondition(x.plan.Settings.Axis) && c.Role == "medium"
	if swept {
		cond = cond.Without(materials.Condition(x.plan.Settings.Axis))
	}
	conds := cond.String()
	if conds == "" && !swept {
		conds = c.Conditions
	}
	if swept {
		a := materials.FormatCondition(materials.Condition(x.plan.Settings.Axis), x.axis) + " (axis)"
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
	out, blocked, notes = x.densityChecks()
	out, blocked, notes = x.requiredChecks(out, blocked, notes)
	linkJoint(out)
	return out, blocked, notes
}

// strategyTunes says whether the strategy tunes q (a device or the
// facility brings it to the required value).
func (x *combo) strategyTunes(q string) bool {
	return slices.Contains(x.cas.Solution.Strategy.Tuned, q)
}

// densityChecks are the checks of free bodies and grains: density as the
// prototype's over k_density.
func (x *combo) densityChecks() (out []check, blocked string, notes []string) {
	for _, c := range []*Candidate2{x.material, x.medium} {
		if !x.unballasted(c) || x.strategyTunes("density") {
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
	return out, blocked, notes
}

// requiredOrder lists the required properties, the defined ones (ν, E·I)
// first so that the one a candidate states is checked and the other,
// linked to it, is not checked twice.
func requiredOrder(required []string) []string {
	var order []string
	for _, q := range required {
		if feasibility.IsDefined(q) {
			order = append(order, q)
		}
	}
	for _, q := range required {
		if !feasibility.IsDefined(q) {
			order = append(order, q)
		}
	}
	return order
}

// skipsCheck says whether required q, supplied by sup, needs no check of
// its own beside those in out: tuned, already checked as a free body's
// density, supplied by a device, set by the facility, or linked to a
// property already matched.
func (x *combo) skipsCheck(q string, sup *Candidate2, out []check) bool {
	sol := x.cas.Solution
	if x.strategyTunes(q) {
		return true
	}
	if q == "density" && sup != nil && slices.ContainsFunc(out, func(ch check) bool { return ch.kind == "density" && ch.cand == sup }) {
		return true
	}
	if x.cas.Technique == "simulated" && deviceSupplied[q] != "" && !(q == "density" && x.unballasted(sup)) {
		return true
	}
	if q == "pressure" && slices.Contains(sol.Strategy.Retain, "cavitation") {
		// Under the cavitation law the required pressure is the
		// ambient pressure at the body, which the tunnel or tank
		// sets: its pressure range is a facility limit, not a
		// property of the fluid.
		return true
	}
	for _, ch := range out {
		if ch.kind == "match" && sol.Linked(q, ch.q) {
			return true
		}
	}
	return false
}

// requiredChecks appends to out the checks of the properties the strategy
// requires of the model, and says why one cannot be checked.
func (x *combo) requiredChecks(out []check, blocked string, notes []string) ([]check, string, []string) {
	sol := x.cas.Solution
	required := func(t string) bool { return slices.Contains(sol.Required, t) }
	stated := func(t string) bool { return required(t) && x.supplier(t) != nil }
	for _, q := range requiredOrder(sol.Required) {
		sup := x.supplier(q)
		if x.skipsCheck(q, sup, out) {
			continue
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
// the linear limits is largest, and that margin (peak.go).
func bestPoint(limits []compiled, in []uInterval) (float64, float64) {
	lines := make([]line, len(limits))
	for i, l := range limits {
		lines[i] = line{l.info.A, l.info.B}
	}
	bu, bm := math.NaN(), math.Inf(-1)
	for _, iv := range in {
		if u, m := concavePeak(lines, iv.lo, iv.hi); m > bm {
			bu, bm = u, m
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
