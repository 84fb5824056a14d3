package sweep

import (
	"fmt"
	"math"
	"strconv"

	"scaleplan/feasibility"
	"scaleplan/materials"
)

// linForm is a model-scale value as a log-linear form in the length scale:
// ln v = C + E · ln kL. Every prototype item, capability, property and
// constant a measure names resolves to one.
type linForm struct{ C, E float64 }

func (f linForm) at(lnKL float64) float64 { return math.Exp(f.C + f.E*lnKL) }

// combo is one combination of a case, a candidate pair and a facility, at
// one value of the second axis.
type combo struct {
	plan     *Plan
	cas      *PlanCase
	medium   *Candidate2
	material *Candidate2
	fac      *Facility
	axis     float64 // NaN without an axis
	// logp holds ln of each solution parameter; entry 0 (the length
	// scale) is swept and left 0 here.
	logp   []float64
	values feasibility.Values // numeric factors of the parameters except length
	props  map[string]materials.Property
	caps   map[string]float64
	gEnv   float64
	// pert multiplies inputs for one draw of the uncertain inputs (nil
	// for the nominal values); candFactor is the factor on the model's
	// own value of each property, from the candidate that supplies it.
	pert       map[inputKey]float64
	candFactor map[string]float64
	// byCand holds each candidate's own properties, as drawn and at the
	// axis value (candidateValue reads them).
	byCand map[*Candidate2]map[string]materials.Property
	// limitPlan, when set, holds the limits compiled once for every axis
	// value (analytic.go); windowOnly stops sweep at the window.
	limitPlan  *limitPlan
	windowOnly bool
	peakBuf    *[]float64 // scratch for the margin peak (peak.go)
	// unmet is set by bandFailing: the requirement no candidate meets and
	// what the library can do about it (recipe_search.go).
	unmet *Unmet
}

// factor returns the multiplier a draw puts on an input (1 when none).
func (x *combo) factor(key inputKey) float64 {
	if f, ok := x.pert[key]; ok {
		return f
	}
	return 1
}

// proto is the prototype value of a property, as drawn.
func (x *combo) proto(q string) (float64, bool) {
	v, ok := x.plan.Proto[q]
	return v * x.factor(inputKey{inputProto, "", q}), ok
}

// newCombo fixes every parameter of the case's solution for a candidate
// pair, a facility and an axis value.
func (p *Plan) newCombo(c *PlanCase, medium, material *Candidate2, fac *Facility, axis float64) (*combo, error) {
	return p.newComboDrawn(c, medium, material, fac, axis, nil)
}

// newComboDrawn is newCombo with the inputs multiplied as one draw of the
// uncertain inputs says.
func (p *Plan) newComboDrawn(c *PlanCase, medium, material *Candidate2, fac *Facility, axis float64, pert map[inputKey]float64) (*combo, error) {
	x := &combo{plan: p, cas: c, medium: medium, material: material, fac: fac, axis: axis,
		values: feasibility.Values{}, props: map[string]materials.Property{}, caps: map[string]float64{}, gEnv: StandardGravity,
		pert: pert, candFactor: map[string]float64{}, byCand: map[*Candidate2]map[string]materials.Property{}}
	x.setCaps()
	if err := x.setCandidates(); err != nil {
		return nil, err
	}
	if err := x.setParams(); err != nil {
		return nil, err
	}
	return x, nil
}

// setCaps sets the facility's capabilities as drawn, the axis value where
// the axis is one of them, and the gravity of a g-level.
func (x *combo) setCaps() {
	p, fac, axis := x.plan, x.fac, x.axis
	if fac != nil {
		for k, v := range fac.Caps {
			x.caps[k] = v * x.factor(inputKey{inputCapability, fac.Name, k})
		}
	}
	ax := p.Settings.Axis
	if !math.IsNaN(axis) {
		if _, ok := x.caps[ax]; ok || (fac != nil && p.isCapability(fac, ax)) {
			x.caps[ax] = axis
		}
	}
	if g, ok := x.caps["g_level"]; ok {
		x.gEnv = StandardGravity * g
	}
}

// setCandidates sets the candidates' properties as drawn, re-evaluated
// when the axis is a medium condition.
func (x *combo) setCandidates() error {
	ax, axis := x.plan.Settings.Axis, x.axis
	hasAxis := !math.IsNaN(axis)
	for _, cand := range []*Candidate2{x.material, x.medium} {
		if cand == nil {
			continue
		}
		props := cand.Props
		if hasAxis && isCondition(ax) && cand.Role == "medium" {
			cond := cand.cond
			if err := setCondition(&cond, ax, axis); err != nil {
				return err
			}
			list, err := cand.entry.At(cond)
			if err != nil {
				return fmt.Errorf("medium %q at %s = %s: %v", cand.Name, ax, strconv.FormatFloat(axis, 'g', 6, 64), err)
			}
			props = map[string]materials.Property{}
			for _, pr := range list {
				props[pr.Quantity] = pr
			}
		}
		own := map[string]materials.Property{}
		for q, pr := range props {
			f := x.factor(inputKey{inputCandidate, cand.Name, q})
			pr.Value *= f
			x.props[q] = pr // the medium, set last, wins
			x.candFactor[q] = f
			own[q] = pr
		}
		x.byCand[cand] = own
	}
	return nil
}

// setParams fixes the solution's scale factors: the given ones from the
// prototype and the model's properties, the free ones from the case's
// fixed values or the axis.
func (x *combo) setParams() error {
	c, ax, axis := x.cas, x.plan.Settings.Axis, x.axis
	hasAxis := !math.IsNaN(axis)
	sol := c.Solution
	x.logp = make([]float64, len(sol.Params))
	for j, par := range sol.Params {
		if j == 0 {
			continue
		}
		var k float64
		switch par.Role {
		case "given":
			proto, ok := x.proto(par.Quantity)
			if !ok {
				return fmt.Errorf("the prototype has no %s", par.Quantity)
			}
			model, ok := x.modelProperty(par.Quantity)
			if !ok {
				return fmt.Errorf("%s is given but %s has none", par.Quantity, describePair(x.medium, x.material))
			}
			k = proto / model
		case "free":
			if v, ok := c.Fix[par.Quantity]; ok {
				k = v
			} else if hasAxis && ax == par.Quantity {
				k = axis
			} else {
				return fmt.Errorf("the %s scale is a free choice: fix it or sweep it", par.Quantity)
			}
		}
		if !(k > 0) || math.IsInf(k, 0) {
			return fmt.Errorf("scale factor of %s is %v", par.Quantity, k)
		}
		x.logp[j] = math.Log(k)
		x.values[par.Quantity] = k
	}
	return nil
}

func (x *combo) factorOr1(q string) float64 {
	if f, ok := x.candFactor[q]; ok {
		return f
	}
	return 1
}

// modelProperty is the model's own value of a property, from its medium or
// material or, for gravity, from the facility.
func (x *combo) modelProperty(q string) (float64, bool) {
	if q == "gravity" {
		return x.gEnv, true
	}
	pr, ok := x.props[q]
	if !ok {
		return 0, false
	}
	return pr.Value, true
}

// lnK returns ln k of a quantity as a form in ln kL.
func (x *combo) lnK(q string) (linForm, bool) {
	law, ok := x.cas.Solution.Law(q)
	if !ok || law.Status == feasibility.Unset {
		return linForm{}, false
	}
	f := linForm{E: law.Exp[0].Float64()}
	for j := 1; j < len(law.Exp); j++ {
		f.C += law.Exp[j].Float64() * x.logp[j]
	}
	return f, true
}

// form resolves a name of a measure to its model-scale value.
func (x *combo) form(name string) (linForm, error) {
	p := x.plan
	if it, ok := p.Items[name]; ok {
		v := it.Value * x.factor(inputKey{inputItem, "", name})
		if it.ScalesAs == "" {
			return linForm{C: math.Log(v)}, nil
		}
		k, ok := x.lnK(it.ScalesAs)
		if !ok {
			return linForm{}, fmt.Errorf("item %s scales as %s, which strategy %q does not set", name, it.ScalesAs, x.cas.Strategy)
		}
		return linForm{C: math.Log(v) - k.C, E: -k.E}, nil
	}
	if f, ok := x.tiedGLevel(name); ok {
		return f, nil
	}
	if v, ok := x.caps[name]; ok {
		return linForm{C: math.Log(v)}, nil
	}
	if q, ok := feasibility.QuantityNamed(name); ok && q.Kind == feasibility.Property {
		law, _ := x.cas.Solution.Law(name)
		if law.Status == feasibility.Determined || law.Status == feasibility.Free {
			if proto, ok := x.proto(name); ok {
				// A drawn candidate factor says how far the model's
				// achieved value misses the value it is set to.
				proto *= x.factorOr1(name)
				k, _ := x.lnK(name)
				return linForm{C: math.Log(proto) - k.C, E: -k.E}, nil
			}
		}
		if v, ok := x.modelProperty(name); ok {
			return linForm{C: math.Log(v)}, nil
		}
		if law.Status == feasibility.Determined {
			return linForm{}, fmt.Errorf("the model %s is solved for but the prototype has none: give the prototype's %s", name, name)
		}
		return linForm{}, fmt.Errorf("%s has no %s", describePair(x.medium, x.material), name)
	}
	if c, ok := constants[name]; ok {
		return linForm{C: math.Log(c.value)}, nil
	}
	return linForm{}, unknownName(name, func() []string { return p.names(x.fac) })
}

func (p *Plan) isCapability(f *Facility, name string) bool {
	_, ok := p.Catalog.Capability(f.Type, name)
	return ok
}

// Conditions a second axis may sweep on every medium.
var conditionAxes = []string{"temperature", "pressure", "salinity"}

func isCondition(name string) bool {
	for _, c := range conditionAxes {
		if c == name {
			return true
		}
	}
	return false
}

func setCondition(c *materials.Conditions, name string, v float64) error {
	switch name {
	case "temperature":
		c.Temperature, c.HasTemperature = v, true
	case "pressure":
		c.Pressure, c.HasPressure = v, true
	case "salinity":
		c.Salinity, c.HasSalinity = v, true
	default:
		return fmt.Errorf("unknown condition %q", name)
	}
	return nil
}
