package report

import (
	"math"
	"testing"
)

// Expected strings written by hand: three significant figures, commas
// between thousands, words for millions, a written power of ten for tiny
// values.
func TestHumanNumber(t *testing.T) {
	for _, tc := range []struct {
		x    float64
		want string
	}{
		{0, "0"}, {1, "1"}, {11.4, "11.4"}, {2.4456, "2.45"}, {0.296, "0.296"}, {0.0015264, "0.00153"},
		{134.2, "134"}, {1530.4, "1,530"}, {17000, "17,000"}, {17496, "17,500"}, {999.6, "1,000"},
		{4.25e6, "4.25 million"}, {1.449e8, "145 million"}, {2.5e9, "2.5 billion"},
		{1.234e-5, "1.23 × 10⁻⁵"}, {3e13, "3 × 10¹³"}, {-0.5, "−0.5"}, {math.NaN(), "–"},
	} {
		if got := HumanNumber(tc.x); got != tc.want {
			t.Errorf("HumanNumber(%v) = %q, want %q", tc.x, got, tc.want)
		}
	}
}

func TestHumanMoney(t *testing.T) {
	for _, tc := range []struct {
		x    float64
		want string
	}{
		{468698, "468,700 EUR"}, {16068.2, "16,070 EUR"}, {9876.4, "9,876 EUR"}, {1234567, "1,235,000 EUR"},
		{0, "0 EUR"}, {math.NaN(), "–"},
	} {
		if got := HumanMoney(tc.x, "EUR"); got != tc.want {
			t.Errorf("HumanMoney(%v) = %q, want %q", tc.x, got, tc.want)
		}
	}
}

func TestReadableLaw(t *testing.T) {
	for law, want := range map[string]string{
		"k_density = k_density":                              "",
		"k_power = kL^7/2 · k_density · k_gravity^3/2":       "kL^(7/2) · k(density) · k(gravity)^(3/2)",
		"k_kinematic_viscosity = k_density^-1 · k_viscosity": "k(density)^(-1) · k(dynamic viscosity)",
		"k_length = kL": "kL",
		"k_strain = 1":  "1",
	} {
		if got := ReadableLaw(law); got != want {
			t.Errorf("ReadableLaw(%q) = %q, want %q", law, got, want)
		}
	}
}

func TestShortName(t *testing.T) {
	for _, tc := range []struct {
		in   string
		n    int
		want string
	}{
		{"Froude scaling", 25, "Froude scaling"},
		{"pressure model at velocity of the prototype", 25, "pressure model at…"},
		{"abcdefghijklmnopqrstuvwxyzabcdef", 10, "abcdefghi…"},
	} {
		if got := shortName(tc.in, tc.n); got != tc.want || len([]rune(got)) > tc.n {
			t.Errorf("shortName(%q, %d) = %q, want %q", tc.in, tc.n, got, tc.want)
		}
	}
}

// TestRequireKind: requirement maps are named by capability and limit,
// with hyphens, and a limit named like its capability is not repeated.
func TestRequireKind(t *testing.T) {
	for _, tc := range []struct{ capability, limit, want string }{
		{"tank_width", "blockage", "require-tank-width-blockage"},
		{"wave_height_max", "wave_height_max", "require-wave-height-max"},
		{"wave_height_max", "wave height max", "require-wave-height-max"},
	} {
		if got := requireKind(RequirementSeries{Capability: tc.capability, Limit: tc.limit}); got != tc.want {
			t.Errorf("requireKind(%s, %s) = %q, want %q", tc.capability, tc.limit, got, tc.want)
		}
	}
}

// TestSigFormat: the display formats show four significant figures
// (formats written by hand for each magnitude).
func TestSigFormat(t *testing.T) {
	for x, want := range map[float64]string{
		0: "0", 11.43: "0.00", 2.456: "0.000", 0.1234: "0.0000", 0.001234: "0.000000", 123.4: "0.0",
		1234.5: "#,##0", 123456: "#,##0", 1.2e-5: "0.000E+00", 3e10: "0.000E+00", -45.67: "0.00",
	} {
		if got := sigFormat(x); got != want {
			t.Errorf("sigFormat(%v) = %q, want %q", x, got, want)
		}
	}
}

// TestSameCurve: a requirement curve equal to an earlier one is found (so
// it is drawn dashed over it), a different one is not.
func TestSameCurve(t *testing.T) {
	a := RequirementCurve{Label: "a", Needed: []float64{1, 2, math.NaN()}}
	b := RequirementCurve{Label: "b", Needed: []float64{1, 2.5, 3}}
	if got := sameCurve([]RequirementCurve{b, a}, []float64{1, 2, math.NaN()}); got != 1 {
		t.Errorf("sameCurve found %d, want 1", got)
	}
	if got := sameCurve([]RequirementCurve{a}, []float64{1, 2, 3}); got != -1 {
		t.Errorf("sameCurve found %d for a different curve, want -1", got)
	}
}

// Cost-axis ticks group thousands like the memo's money (by hand).
func TestMoneyTick(t *testing.T) {
	for v, want := range map[float64]string{0: "0", 950: "950", 1200: "1,200", 120000: "120,000", -35000: "−35,000", 2.5: "2.5", 1234567: "1,234,567"} {
		if got := moneyTick(v); got != want {
			t.Errorf("moneyTick(%v) = %q, want %q", v, got, want)
		}
	}
}
