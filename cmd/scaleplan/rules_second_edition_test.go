package main

import (
	"bytes"
	"encoding/json"
	"math"
	"slices"
	"strings"
	"testing"
)

// The reference cases of spec §3.6 through `rules --json`. Expected values
// are computed from the published scale relations (sources beside each);
// the JSON factors are rounded to 12 significant digits, so 1e-9 holds.
func TestRulesSecondEditionCases(t *testing.T) {
	cases := []struct {
		name, source, args string
		factors            map[string]float64
		consistent         bool
		required           string
		condition          string
	}{
		{
			name:   "distorted river model",
			source: "Hughes 1993 ch. 2; Chanson 2004 ch. 14 (distorted Froude models; chapters from memory)",
			args:   "scaleplan rules --retain inertia,hydrostatic,bed_friction --untie thickness --given density=1,gravity=1,thickness=50 --length 500 --json",
			factors: map[string]float64{"velocity": math.Sqrt(50), "discharge": 500 * math.Pow(50, 1.5),
				"time": 500 / math.Sqrt(50), "roughness": math.Pow(50, 2.0/3) / math.Sqrt(500)},
			consistent: true, required: "roughness",
		},
		{
			name:       "centrifuge, same soil: inconsistent",
			source:     "Garnier et al. 2007, IJPMG 7(3), table of scaling laws (from memory)",
			args:       "scaleplan rules --retain inertia,gravity,consolidation --given density=1,gravity=1/50,consolidation_coefficient=1 --length 50 --json",
			factors:    map[string]float64{"time": 50, "velocity": 1},
			consistent: false, condition: "time factor",
		},
		{
			name:       "centrifuge, viscous pore fluid",
			source:     "Garnier et al. 2007 (from memory): c_v,m = c_v,p/N with a pore fluid N times more viscous",
			args:       "scaleplan rules --retain inertia,gravity,consolidation --given density=1,gravity=1/50 --length 50 --json",
			factors:    map[string]float64{"consolidation_coefficient": 50, "time": 50},
			consistent: true, required: "consolidation_coefficient",
		},
		{
			name:       "depressurised tank",
			source:     "ITTC Recommended Procedures, cavitation tests (from memory): (p − p_v) scales as kL",
			args:       "scaleplan rules --retain inertia,gravity,cavitation --given density=1,gravity=1 --length 25 --json",
			factors:    map[string]float64{"pressure": 25, "velocity": 5},
			consistent: true, required: "pressure",
		},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			var out, errb bytes.Buffer
			if code := run(strings.Fields(c.args), &out, &errb); code != 0 {
				t.Fatalf("exit %d: %s", code, errb.String())
			}
			var got struct {
				Consistent bool               `json:"consistent"`
				Conditions []string           `json:"conditions"`
				Required   []string           `json:"required"`
				Factors    map[string]float64 `json:"factors"`
			}
			if err := json.Unmarshal(out.Bytes(), &got); err != nil {
				t.Fatal(err)
			}
			for q, w := range c.factors {
				if f, ok := got.Factors[q]; !ok || math.Abs(f-w) > 1e-9*w {
					t.Errorf("%s = %v (present %v), want %v [%s]", q, f, ok, w, c.source)
				}
			}
			if got.Consistent != c.consistent {
				t.Errorf("consistent = %v, want %v", got.Consistent, c.consistent)
			}
			if c.required != "" && !slices.Contains(got.Required, c.required) {
				t.Errorf("required = %v, want %s", got.Required, c.required)
			}
			if c.condition != "" && (len(got.Conditions) != 1 || !strings.HasPrefix(got.Conditions[0], c.condition+":")) {
				t.Errorf("conditions = %v, want one protecting the %s", got.Conditions, c.condition)
			}
		})
	}
}

// Without a given vertical scale, a distorted model's free choice is the
// vertical scale itself, and the velocity follows it (k_V = kz^1/2).
func TestRulesDistortedFreeVerticalScale(t *testing.T) {
	var out, errb bytes.Buffer
	args := "scaleplan rules --retain inertia,hydrostatic,bed_friction --untie thickness --given density=1,gravity=1 --json"
	if code := run(strings.Fields(args), &out, &errb); code != 0 {
		t.Fatalf("exit %d: %s", code, errb.String())
	}
	var got struct {
		Free      []string                     `json:"free"`
		Exponents map[string]map[string]string `json:"exponents"`
	}
	if err := json.Unmarshal(out.Bytes(), &got); err != nil {
		t.Fatal(err)
	}
	if !slices.Equal(got.Free, []string{"thickness"}) {
		t.Errorf("free = %v, want [thickness]", got.Free)
	}
	if e := got.Exponents["velocity"]["thickness"]; e != "1/2" {
		t.Errorf("velocity exponent of k_thickness = %q, want 1/2", e)
	}
}
