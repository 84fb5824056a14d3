package feasibility

import (
	"fmt"
	"math"
	"strings"
)

// FormatProduct prints a product of powers of the parameters, e.g.
// "kL^1/2 · k_gravity^1/2"; an empty product prints as "1".
func FormatProduct(params []Param, exp []Rat) string {
	var parts []string
	for j, e := range exp {
		switch {
		case e.IsZero():
		case e.Cmp(Int(1)) == 0:
			parts = append(parts, params[j].Symbol())
		default:
			parts = append(parts, params[j].Symbol()+"^"+e.String())
		}
	}
	if len(parts) == 0 {
		return "1"
	}
	return strings.Join(parts, " · ")
}

// String prints the law as "k_velocity = kL^1/2 · k_gravity^1/2".
func (sol *Solution) LawString(quantity string) string {
	l, ok := sol.Law(quantity)
	if !ok {
		return ""
	}
	switch l.Status {
	case Unset:
		return "k_" + quantity + " is not set by this strategy"
	case Free:
		return "k_" + quantity + " is a free choice"
	}
	return "k_" + quantity + " = " + FormatProduct(sol.Params, l.Exp)
}

// Equation prints a condition solved for its most specific parameter: the
// last given quantity it involves, or the length scale when it involves
// nothing else ("k_viscosity = k_density · kL^3/2 · k_gravity^1/2",
// "kL = 1").
func (c Condition) Equation(params []Param) string {
	subj := c.Subject()
	if subj < 0 {
		return "1 = 1"
	}
	rest := make([]Rat, len(c.Exp))
	for j, e := range c.Exp {
		if j != subj {
			rest[j] = e.Neg().Div(c.Exp[subj])
		}
	}
	return params[subj].Symbol() + " = " + FormatProduct(params, rest)
}

// Subject is the index of the parameter a condition is solved for: the
// last one it involves (-1 for an empty condition).
func (c Condition) Subject() int {
	for j := len(c.Exp) - 1; j >= 0; j-- {
		if !c.Exp[j].IsZero() {
			return j
		}
	}
	return -1
}

// Sentence explains the condition in one plain sentence.
func (c Condition) Sentence(params []Param) string {
	if c.Law == "" {
		return fmt.Sprintf("The given scale factors must respect %s: %s.", c.Protects, c.Equation(params))
	}
	return fmt.Sprintf("Keeping the %s similar (law %s retained) needs %s; otherwise relax %s or choose a medium or material that satisfies it.",
		c.Protects, c.Law, c.Equation(params), c.Law)
}

// Values holds numeric scale factors k of parameters, by quantity name
// ("length" for kL).
type Values map[string]float64

func (sol *Solution) logParams(v Values) ([]float64, []bool, error) {
	logp := make([]float64, len(sol.Params))
	known := make([]bool, len(sol.Params))
	for q, k := range v {
		j := sol.ParamIndex(q)
		if j < 0 {
			return nil, nil, fmt.Errorf("%s is not a parameter of this strategy (parameters: %s)", q, sol.paramNames())
		}
		if !(k > 0) || math.IsInf(k, 0) {
			return nil, nil, fmt.Errorf("scale factor of %s must be a positive number, got %v", q, k)
		}
		logp[j], known[j] = math.Log(k), true
	}
	return logp, known, nil
}

func (sol *Solution) paramNames() string {
	names := make([]string, len(sol.Params))
	for j, p := range sol.Params {
		names[j] = p.Quantity
	}
	return strings.Join(names, ", ")
}

// dot returns Σ exp·logp and whether every parameter it needs is known.
func dot(exp []Rat, logp []float64, known []bool) (float64, bool) {
	s := 0.0
	for j, e := range exp {
		if e.IsZero() {
			continue
		}
		if !known[j] {
			return 0, false
		}
		s += e.Float64() * logp[j]
	}
	return s, true
}

// Factors evaluates the scale factor of every quantity whose parameters are
// all in v. Quantities that are unset, or depend on a parameter missing
// from v, are left out.
func (sol *Solution) Factors(v Values) (map[string]float64, error) {
	logp, known, err := sol.logParams(v)
	if err != nil {
		return nil, err
	}
	out := map[string]float64{}
	for _, l := range sol.Laws {
		if l.Status == Unset {
			continue
		}
		if s, ok := dot(l.Exp, logp, known); ok {
			out[l.Quantity] = math.Exp(s)
		}
	}
	return out, nil
}

// ConditionCheck is a condition evaluated at numeric scale factors.
type ConditionCheck struct {
	Condition
	// Known is false when a parameter other than the length scale is
	// missing, so nothing can be said.
	Known bool
	// Holds reports whether the condition is met (to 1e-9 in log).
	Holds bool
	// Off is the given value of the condition's subject divided by the
	// value the condition needs (1 when it holds).
	Off float64
	// PinsLength reports that the condition fixes the length scale; Length
	// is then the only kL at which it holds.
	PinsLength bool
	Length     float64
}

// Check evaluates every condition at v. The length scale may be absent from
// v: a condition that involves it then tells the only kL that satisfies it.
func (sol *Solution) Check(v Values) ([]ConditionCheck, error) {
	logp, known, err := sol.logParams(v)
	if err != nil {
		return nil, err
	}
	var out []ConditionCheck
	for _, c := range sol.Conditions {
		cc := ConditionCheck{Condition: c}
		aL := c.Exp[0]
		if !aL.IsZero() {
			rest := append([]Rat{{}}, c.Exp[1:]...)
			if s, ok := dot(rest, logp, known); ok {
				cc.PinsLength = true
				cc.Length = math.Exp(-s / aL.Float64())
			}
		}
		if s, ok := dot(c.Exp, logp, known); ok {
			cc.Known = true
			cc.Holds = math.Abs(s) <= 1e-9
			cc.Off = math.Exp(s / c.Exp[c.Subject()].Float64())
		}
		out = append(out, cc)
	}
	return out, nil
}

// MismatchValue evaluates a relaxed law's group mismatch π_p/π_m at v; ok
// is false when a quantity or parameter it needs is missing.
func (sol *Solution) MismatchValue(m Mismatch, v Values) (float64, bool, error) {
	if len(m.Missing) > 0 {
		return 0, false, nil
	}
	logp, known, err := sol.logParams(v)
	if err != nil {
		return 0, false, err
	}
	s, ok := dot(m.Exp, logp, known)
	if !ok {
		return 0, false, nil
	}
	return math.Exp(s), true, nil
}
