package sweep

import (
	"slices"

	"scaleplan/feasibility"
)

// preferFree lists the quantities a study sweeps (the second axis) or
// fixes, then those the strategy unties, so that the solver names them as
// the free choices when the retained laws leave a direction open: a
// distorted model gets its vertical scale (thickness), not the velocity,
// as its free choice.
func (p *Plan) preferFree(fix map[string]float64, untie []string) []string {
	var out []string
	if _, ok := feasibility.QuantityNamed(p.Settings.Axis); ok {
		out = append(out, p.Settings.Axis)
	}
	for _, q := range feasibility.QuantityNames() {
		if _, ok := fix[q]; ok && q != p.Settings.Axis {
			out = append(out, q)
		}
	}
	for _, q := range untie {
		if !slices.Contains(out, q) {
			out = append(out, q)
		}
	}
	return out
}
