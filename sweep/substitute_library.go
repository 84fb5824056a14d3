package sweep

import (
	"fmt"
	"math"

	"scaleplan/materials"
)

// Library entries judged against a combination's checks: which entries of a
// kind can stand in for a candidate, which meet a required property at the
// recommended scale (Match), and the closest entry where none does.

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
	v, err := e.ValuesAt(materials.Conditions{})
	if err != nil {
		return false
	}
	rho, ok := v["density"]
	return ok && rho < 100
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
	s := fmt.Sprintf("the closest %s in the library at its default conditions, %s, has %s", word, best.name, sig3(best.own, unit))
	if best.reqDiffersOwn {
		s += fmt.Sprintf(" (with its own properties it would need %s at %s)", sig3(best.req, unit), Scale(math.Pow(10, best.u)))
	}
	return s
}
