package sweep

import (
	"fmt"
	"math"
	"strings"

	"scaleplan/feasibility"
	"scaleplan/materials"
)

// Joint recipes: a tunable candidate that must meet two required
// properties at once (a brine's density and its viscosity) meets each on
// its own within its band, but the two recipes need not coincide. Each
// such candidate gets one more limit, "recipe of X meets q1 and q2 at
// once", whose margin at a scale is the largest, over the conditions the
// candidate may move, of the smallest margin of its requirements (in
// decades, against 1 + tol above and 1 − tol below; the box sampled and refined
// by golden sections): it is not a product of powers, so it is sampled on
// the grid and its edges refined by bisection to 0.1 % in kL like every
// such limit, and the recipe per band meets all the properties together.

// alsoReq is another requirement a tunable candidate must meet at the
// same conditions.
type alsoReq struct {
	q      string
	req    linForm
	exps   map[string]float64
	own0   map[string]float64
	factor float64
}

// linkJoint tells every tunable check of a candidate the other match
// checks of that candidate, so that its recipes meet them too.
func linkJoint(out []check) {
	for i := range out {
		if out[i].tune == nil || out[i].kind != "match" {
			continue
		}
		var also []alsoReq
		for j := range out {
			if j == i || out[j].kind != "match" || out[j].cand != out[i].cand || out[j].cand == nil {
				continue
			}
			o := out[j]
			a := alsoReq{q: o.q, req: o.req, exps: map[string]float64{}, own0: out[i].tune.own0, factor: 1}
			if o.tune != nil {
				a.exps, a.factor = o.tune.exps, o.tune.factor
			} else if v := out[i].tune.own0[o.q]; v > 0 {
				a.factor = o.own / v
			}
			also = append(also, a)
		}
		t := *out[i].tune
		t.also = also
		out[i].tune = &t
	}
}

// target is the requirement a as a recipe target at ln kL.
func (a alsoReq) target(ln, tol float64) materials.Target {
	r0 := a.req.at(ln) / a.factor
	exps, own0 := a.exps, a.own0
	return materials.Target{Quantity: a.q, Tolerance: tol, Of: func(v map[string]float64) float64 {
		r := r0
		for Q, e := range exps {
			r *= math.Pow(v[Q]/own0[Q], e)
		}
		return r
	}}
}

// jointLimits adds, per tunable candidate with more than one requirement,
// the limit that its recipe meets all of them at once.
func (x *combo) jointLimits(checks []check) ([]compiled, error) {
	var out []compiled
	done := map[*Candidate2]bool{}
	for _, ch := range checks {
		if ch.tune == nil || len(ch.tune.also) == 0 || done[ch.cand] {
			continue
		}
		done[ch.cand] = true
		t, req := ch.tune, ch.req
		qs := []string{ch.q}
		forms := map[string]linForm{ch.q: req, "_axis": {C: x.axis}}
		for _, a := range t.also {
			qs = append(qs, a.q)
			forms[a.q] = a.req
		}
		text := fmt.Sprintf("%s >= 0 %s", ch.q, quantityUnit(ch.q))
		l, err := feasibility.ParseLimit(strings.TrimSuffix(text, " 1"))
		if err != nil {
			return nil, fmt.Errorf("joint recipe of %s: %v", ch.who, err)
		}
		name := fmt.Sprintf("recipe of %s meets %s at once", ch.who, strings.Join(qs, " and "))
		c := compiled{info: LimitInfo{Name: name,
			Expression: "a recipe of " + t.knobsText + " within the study's tolerance of every requirement",
			Source:     "recipe solved at each scale (materials solver); study tolerance " + fmt.Sprintf("%g %%", 100*t.tol)},
			lim: l, forms: forms}
		c.fn = func(u float64) float64 {
			m, _ := t.jointMargin(req, u*math.Ln10)
			if math.IsInf(m, -1) {
				return -1
			}
			return m
		}
		out = append(out, c)
	}
	return out, nil
}
