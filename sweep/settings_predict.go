package sweep

import (
	"strings"

	"scaleplan/feasibility"
	"scaleplan/sweep/study"
)

// parsePredict reads the predict setting: quantities, separated by commas
// or semicolons, whose prediction rules the memo lists besides those the
// study measures (the quantities its prototype items scale as and those of
// its measures). An unknown name is a problem at the setting's cell.
func parsePredict(v string, at study.Cell, ps *study.Problems) []string {
	var out []string
	for _, q := range strings.FieldsFunc(v, func(r rune) bool { return r == ',' || r == ';' }) {
		q = strings.TrimSpace(q)
		if q == "" {
			continue
		}
		if _, ok := feasibility.QuantityNamed(q); !ok {
			ps.Add(at, "predict: %q is not a quantity%s", q, feasibility.Suggest(q, feasibility.QuantityNames()))
			continue
		}
		out = append(out, q)
	}
	return out
}
