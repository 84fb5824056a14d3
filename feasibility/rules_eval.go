package feasibility

// RulesEvaluation is a solved strategy evaluated at the scale factors a
// user gives: the data `scaleplan rules` reports.
type RulesEvaluation struct {
	Solution *Solution
	// Given are the scale factors given, the length scale apart; Length
	// is the length scale, 0 when none was given.
	Given  map[string]float64
	Length float64
	// Factors are every scale factor at Length (nil without one).
	Factors map[string]float64
	// Checks are the compatibility conditions at the given factors.
	Checks []ConditionCheck
	// Mismatches are the relaxed laws' group mismatches, in the order of
	// Solution.Relaxed.
	Mismatches []MismatchAt
}

// MismatchAt is a relaxed law's group mismatch at the given factors;
// Known is false when a factor it needs is missing or it has no scale law.
type MismatchAt struct {
	Value float64
	Known bool
}

// EvaluateRules evaluates sol at the given scale factors and, when length
// is positive, at that length scale.
func EvaluateRules(sol *Solution, given map[string]float64, length float64) (*RulesEvaluation, error) {
	ev := &RulesEvaluation{Solution: sol, Given: given, Length: length}
	v := Values{}
	for q, k := range given {
		v[q] = k
	}
	if length > 0 {
		v["length"] = length
		f, err := sol.Factors(v)
		if err != nil {
			return nil, err
		}
		ev.Factors = f
	}
	checks, err := sol.Check(v)
	if err != nil {
		return nil, err
	}
	ev.Checks = checks
	for _, m := range sol.Relaxed {
		var at MismatchAt
		if len(m.Missing) == 0 {
			if x, ok, err := sol.MismatchValue(m, v); err == nil && ok {
				at = MismatchAt{Value: x, Known: true}
			}
		}
		ev.Mismatches = append(ev.Mismatches, at)
	}
	return ev, nil
}
