package sweep

import (
	"fmt"
	"math"
	"strings"

	"scaleplan/feasibility"
)

// gLevelTie reads a `fix` item that ties the test's g-level to the length
// scale, the centrifuge rule: "g_level=kL" runs the model at N = kL times
// standard gravity, "g_level=kL^1/2" at N = kL^1/2. The model's gravity then
// follows the scale (k_gravity = kL^-p) instead of coming from a fixed
// facility g-level, and the facility's g-level range bounds it through its
// limits. ok is false when the item is not a g-level tie at all.
func gLevelTie(item string) (tie feasibility.LengthTie, ok bool, err error) {
	q, val, found := strings.Cut(item, "=")
	if !found || strings.TrimSpace(q) != "g_level" {
		return tie, false, nil
	}
	v := strings.ReplaceAll(strings.TrimSpace(val), " ", "")
	rest, isKL := strings.CutPrefix(v, "kL")
	if !isKL {
		return tie, true, fmt.Errorf("%q: g_level is tied to the length scale as g_level=kL or g_level=kL^P (P a number or p/q, e.g. kL^1/2); a fixed g-level is a capability of the facility (g_level)", item)
	}
	p := feasibility.Int(1)
	if rest != "" {
		e, cut := strings.CutPrefix(rest, "^")
		e = strings.TrimSuffix(strings.TrimPrefix(e, "("), ")")
		r, perr := feasibility.ParseRat(e)
		if !cut || perr != nil {
			return tie, true, fmt.Errorf("%q: the power of kL must be a number or p/q (e.g. g_level=kL^1/2)", item)
		}
		p = r
	}
	if p.IsZero() {
		return tie, true, fmt.Errorf("%q: g_level=kL^0 is a g-level of 1; leave the g-level to the facility instead", item)
	}
	return feasibility.LengthTie{Quantity: "gravity", Exp: p.Neg()}, true, nil
}

// tiedGLevel resolves the name g_level: when the strategy ties the g-level
// to the scale, N = g_model/g_n = 1/k_gravity, a power of kL, in place of
// the facility's fixed g_level; otherwise the facility's g_level, 1 when
// it states none (the capability's default).
func (x *combo) tiedGLevel(name string) (linForm, bool) {
	if name != "g_level" {
		return linForm{}, false
	}
	for _, t := range x.cas.Solution.Strategy.Tied {
		if t.Quantity == "gravity" {
			k, ok := x.lnK("gravity")
			return linForm{C: -k.C, E: -k.E}, ok
		}
	}
	if v, ok := x.caps[name]; ok {
		return linForm{C: math.Log(v)}, true
	}
	return linForm{}, true
}
