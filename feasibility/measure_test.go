package feasibility

import (
	"errors"
	"math"
	"math/rand/v2"
	"reflect"
	"strings"
	"testing"
)

// measureDims is the small dimension table the measure tests use.
var measureDims = map[string]Dimension{
	"design_speed":        Dim(0, 1, -1, 0),
	"hull_length":         Dim(0, 1, 0, 0),
	"kinematic_viscosity": Dim(0, 2, -1, 0),
	"beam":                Dim(0, 1, 0, 0),
	"draft":               Dim(0, 1, 0, 0),
	"basin_width":         Dim(0, 1, 0, 0),
	"basin_depth":         Dim(0, 1, 0, 0),
	"gravity":             Dim(0, 1, -2, 0),
	"depth":               Dim(0, 1, 0, 0),
	"density":             Dim(1, -3, 0, 0),
	"wave_period":         Dim(0, 0, 1, 0),
	"water_temperature":   Dim(0, 0, 0, 1),
	"model_mass":          Dim(1, 0, 0, 0),
	"max_force":           Dim(1, 1, -2, 0),
}

var errMeasureUnknown = errors.New("unknown name")

func measureDimOf(name string) (Dimension, error) {
	if d, ok := measureDims[name]; ok {
		return d, nil
	}
	return Dimension{}, errMeasureUnknown
}

func measureValues(m map[string]float64) func(string) float64 {
	return func(name string) float64 {
		v, ok := m[name]
		if !ok {
			return math.NaN()
		}
		return v
	}
}

func mustParseExpr(t *testing.T, s string) *Expr {
	t.Helper()
	e, err := ParseExpr(s)
	if err != nil {
		t.Fatalf("ParseExpr(%q): %v", s, err)
	}
	return e
}

func mustParseLimit(t *testing.T, s string) *Limit {
	t.Helper()
	l, err := ParseLimit(s)
	if err != nil {
		t.Fatalf("ParseLimit(%q): %v", s, err)
	}
	return l
}

func TestParseExprCanonical(t *testing.T) {
	tests := []struct{ in, want string }{
		{"design_speed*hull_length/kinematic_viscosity", "design_speed * hull_length / kinematic_viscosity"},
		{"beam * draft / (basin_width * basin_depth)", "beam * draft / (basin_width * basin_depth)"},
		{"  a+b*c  ", "a + b * c"},
		{"(a+b)*c", "(a + b) * c"},
		{"a-(b-c)", "a - (b - c)"},
		{"(a-b)-c", "a - b - c"},
		{"a/(b/c)", "a / (b / c)"},
		{"a/(b*c)", "a / (b * c)"},
		{"(a*b)/c", "a * b / c"},
		{"a+(b+c)", "a + (b + c)"},
		{"-x^2", "-x^2"},
		{"(-x)^2", "(-x)^2"},
		{"-(a*b)", "-(a * b)"},
		{"-a*b", "-a * b"},
		{"a*-b", "a * -b"},
		{"a - -b", "a - -b"},
		{"--x", "--x"},
		{"-(-x)", "--x"},
		{"-(-(3 [m]))", "--(3 [m])"},
		{"-(-3 [m])", "--3 [m]"},
		{"x^2", "x^2"},
		{"x ^ -1", "x^-1"},
		{"x^0.5", "x^(1/2)"},
		{"x^(1/2)", "x^(1/2)"},
		{"x^(-3/2)", "x^(-3/2)"},
		{"x^-(3/2)", "x^(-3/2)"},
		{"x^(0.5/2)", "x^(1/4)"},
		{"x^(4/2)", "x^2"},
		{"x^0", "x^0"},
		{"(x^2)^3", "(x^2)^3"},
		{"(a*b)^2", "(a * b)^2"},
		{"sqrt(gravity*depth)", "sqrt(gravity * depth)"},
		{"sqrt( x )^2", "sqrt(x)^2"},
		{"design_speed / (gravity * depth)^(1/2)", "design_speed / (gravity * depth)^(1/2)"},
		{"2", "2"},
		{"0.35", "0.35"},
		{"2e6", "2e6"},
		{"2E+06", "2e6"},
		{"1.5E-3", "0.0015"},
		{"1.5e-7", "1.5e-7"},
		{".5", "0.5"},
		{"2.", "2"},
		{"1e21", "1e21"},
		{"123456789", "123456789"},
		{"1000", "1000"},
		{"10000", "1e4"},
		{"0.0001", "1e-4"},
		{"1e-300", "1e-300"},
		{"10800", "10800"},
		{"9.80665 [m/s^2]", "9.80665 [m/s^2]"},
		{"3[ h ]", "3 [h]"},
		{"-2 [°C]", "-2 [°C]"},
		{"- 2 [°C]", "-2 [°C]"},
		{"-(2 [°C])", "-(2 [°C])"},
		{"(3 [m])^2", "(3 [m])^2"},
		{"a * -3 [°C]", "a * -3 [°C]"},
		{"v × L ⋅ 2 − 1", "v * L * 2 - 1"},
		{"v · L", "v * L"},
		{"_x1 * X_2", "_x1 * X_2"},
		{"((((x))))", "x"},
	}
	for _, tt := range tests {
		e, err := ParseExpr(tt.in)
		if err != nil {
			t.Errorf("ParseExpr(%q): %v", tt.in, err)
			continue
		}
		if got := e.String(); got != tt.want {
			t.Errorf("ParseExpr(%q).String() = %q, want %q", tt.in, got, tt.want)
			continue
		}
		again := mustParseExpr(t, tt.want)
		if got := again.String(); got != tt.want {
			t.Errorf("canonical %q reads back as %q", tt.want, got)
		}
	}
}

func TestExprNames(t *testing.T) {
	tests := []struct {
		in   string
		want []string
	}{
		{"design_speed * hull_length / kinematic_viscosity", []string{"design_speed", "hull_length", "kinematic_viscosity"}},
		{"b * a / b + a - c^2", []string{"b", "a", "c"}},
		{"sqrt(g * h) / g", []string{"g", "h"}},
		{"9.80665 [m/s^2] * 2", nil},
	}
	for _, tt := range tests {
		if got := mustParseExpr(t, tt.in).Names(); !reflect.DeepEqual(got, tt.want) {
			t.Errorf("Names(%q) = %v, want %v", tt.in, got, tt.want)
		}
	}
}

func TestExprDim(t *testing.T) {
	tests := []struct {
		in   string
		want Dimension
	}{
		{"design_speed * hull_length / kinematic_viscosity", Dimension{}},
		{"beam * draft / (basin_width * basin_depth)", Dimension{}},
		{"design_speed / sqrt(gravity * depth)", Dimension{}},
		{"design_speed / (gravity * depth)^(1/2)", Dimension{}},
		{"sqrt(gravity * depth)", Dim(0, 1, -1, 0)},
		{"density * design_speed^2", Dim(1, -1, -2, 0)},
		{"9.80665 [m/s^2] * model_mass", Dim(1, 1, -2, 0)},
		{"3 [h]", Dim(0, 0, 1, 0)},
		{"wave_period + 3 [h] - 0.35 [s]", Dim(0, 0, 1, 0)},
		{"-hull_length", Dim(0, 1, 0, 0)},
		{"2 * beam + draft", Dim(0, 1, 0, 0)},
		{"depth^(-3/2)", Dimension{Int(0), R(-3, 2), Int(0), Int(0)}},
		{"water_temperature - 2 [°C]", Dim(0, 0, 0, 1)},
		{"depth^0", Dimension{}},
		{"2e6", Dimension{}},
	}
	for _, tt := range tests {
		got, err := mustParseExpr(t, tt.in).Dim(measureDimOf)
		if err != nil {
			t.Errorf("Dim(%q): %v", tt.in, err)
			continue
		}
		if !got.Equal(tt.want) {
			t.Errorf("Dim(%q) = %s, want %s", tt.in, got, tt.want)
		}
	}
}

func TestExprDimErrors(t *testing.T) {
	tests := []struct{ in, want string }{
		{"design_speed + depth", `expression "design_speed + depth": cannot add L T^-1 to L`},
		{"hull_length * (design_speed - depth)", `expression "hull_length * (design_speed - depth)": cannot subtract L from L T^-1 in "design_speed - depth"`},
		{"depth + 1", `expression "depth + 1": cannot add L to 1`},
		{"wave_period + 3 [m]", `expression "wave_period + 3 [m]": cannot add T to L`},
		{"depth * speed", `expression "depth * speed": unknown name`},
	}
	for _, tt := range tests {
		_, err := mustParseExpr(t, tt.in).Dim(measureDimOf)
		if err == nil || err.Error() != tt.want {
			t.Errorf("Dim(%q) error = %v, want %s", tt.in, err, tt.want)
		}
	}
	// dimOf's error is wrapped.
	_, err := mustParseExpr(t, "depth * speed").Dim(measureDimOf)
	if !errors.Is(err, errMeasureUnknown) {
		t.Errorf("Dim error %v does not wrap dimOf's error", err)
	}
	// Exponents that would overflow are refused, never a panic.
	deep := "depth"
	for _, p := range []string{"(1/997)", "(1/991)", "(1/983)", "(1/977)", "(1/971)", "(1/967)", "(1/953)"} {
		deep = "(" + deep + ")^" + p
	}
	_, err = mustParseExpr(t, deep).Dim(measureDimOf)
	if err == nil || !strings.Contains(err.Error(), "grow too large") {
		t.Errorf("Dim of nested powers: %v, want an exponent error", err)
	}
	if _, _, ok := mustParseExpr(t, deep).Product(); ok {
		t.Errorf("Product of nested powers with huge denominators: ok, want not ok")
	}
}

func TestExprProduct(t *testing.T) {
	type np = NamePower
	tests := []struct {
		in     string
		coef   float64
		powers []NamePower
		ok     bool
	}{
		{"design_speed / (gravity * depth)^(1/2)", 1, []np{{"design_speed", Int(1)}, {"gravity", R(-1, 2)}, {"depth", R(-1, 2)}}, true},
		{"design_speed / sqrt(gravity * depth)", 1, []np{{"design_speed", Int(1)}, {"gravity", R(-1, 2)}, {"depth", R(-1, 2)}}, true},
		{"design_speed * hull_length / kinematic_viscosity", 1, []np{{"design_speed", Int(1)}, {"hull_length", Int(1)}, {"kinematic_viscosity", Int(-1)}}, true},
		{"x * x", 1, []np{{"x", Int(2)}}, true},
		{"x / x * y", 1, []np{{"y", Int(1)}}, true},
		{"x / x", 1, []np{}, true},
		{"x^0 * 3", 3, []np{}, true},
		{"2 * x^2 / 4", 0.5, []np{{"x", Int(2)}}, true},
		{"sqrt(4 * x)", 2, []np{{"x", R(1, 2)}}, true},
		{"(x^2 * y)^(1/2)", 1, []np{{"x", Int(1)}, {"y", R(1, 2)}}, true},
		{"3 [h] * rate", 10800, []np{{"rate", Int(1)}}, true},
		{"0.5 [m] / x", 0.5, []np{{"x", Int(-1)}}, true},
		{"2e6", 2e6, []np{}, true},
		{"a + b", 0, nil, false},
		{"a - b", 0, nil, false},
		{"a * (b + c)", 0, nil, false},
		{"-a", 0, nil, false},
		{"-2 * a", 0, nil, false},
		{"0 * a", 0, nil, false},
		{"(-a)^2", 0, nil, false},
		{"1e300 * 1e300 * a", 0, nil, false}, // the coefficient overflows
	}
	for _, tt := range tests {
		coef, powers, ok := mustParseExpr(t, tt.in).Product()
		if ok != tt.ok {
			t.Errorf("Product(%q) ok = %v, want %v", tt.in, ok, tt.ok)
			continue
		}
		if !ok {
			continue
		}
		if math.Abs(coef-tt.coef) > 1e-15*tt.coef {
			t.Errorf("Product(%q) coef = %v, want %v", tt.in, coef, tt.coef)
		}
		if len(powers) != len(tt.powers) {
			t.Errorf("Product(%q) powers = %v, want %v", tt.in, powers, tt.powers)
			continue
		}
		for i := range powers {
			if powers[i].Name != tt.powers[i].Name || powers[i].Exp.Cmp(tt.powers[i].Exp) != 0 {
				t.Errorf("Product(%q) powers = %v, want %v", tt.in, powers, tt.powers)
				break
			}
		}
	}
}

func TestExprEval(t *testing.T) {
	vals := measureValues(map[string]float64{
		"design_speed": 2, "gravity": 9.81, "depth": 4, "x": 3, "y": 2,
		"hull_length": 5, "kinematic_viscosity": 1e-6,
	})
	tests := []struct {
		in   string
		want float64
	}{
		{"design_speed / sqrt(gravity * depth)", 2 / math.Sqrt(9.81*4)},
		{"design_speed / (gravity * depth)^(1/2)", 2 / math.Sqrt(9.81*4)},
		{"design_speed * hull_length / kinematic_viscosity", 1e7},
		{"1 + 2 * 3", 7},
		{"2 - 3 - 4", -5},
		{"2 / 4 / 8", 1.0 / 16},
		{"-x^2", -9},
		{"(-x)^2", 9},
		{"x^-1", 1.0 / 3},
		{"x^(-3/2)", math.Pow(3, -1.5)},
		{"-x * y", -6},
		{"9.80665 [m/s^2]", 9.80665},
		{"3 [h]", 10800},
		{"6 [km/h] / 2", 6000.0 / 3600 / 2},
		{"-2 [°C]", 271.15},
		{"-(2 [°C])", -275.15},
		{"20 [°C] - 10 [°C]", 10}, // two absolute temperatures
		{"(2 [m])^2", 4},
		{"unknown_name", math.NaN()},
	}
	for _, tt := range tests {
		got := mustParseExpr(t, tt.in).Eval(vals)
		if !(math.Abs(got-tt.want) <= 1e-12*math.Abs(tt.want)) && !(math.IsNaN(got) && math.IsNaN(tt.want)) {
			t.Errorf("Eval(%q) = %v, want %v", tt.in, got, tt.want)
		}
	}
}

func TestParseExprErrors(t *testing.T) {
	tests := []struct {
		in, want string
		col      int
	}{
		{"a * / b", `expression "a * / b": unexpected "/" at column 5`, 5},
		{"", `expression "": empty expression`, 0},
		{"   ", `expression "": empty expression`, 0},
		{"a +", `expression "a +": missing operand after "+" at column 3`, 3},
		{"(a + b", `expression "(a + b": unbalanced parenthesis at column 1 ("(" is never closed)`, 1},
		{"a + b)", `expression "a + b)": unbalanced parenthesis at column 6 (")" without "(")`, 6},
		{"sqrt(a", `expression "sqrt(a": unbalanced parenthesis at column 5 ("(" is never closed)`, 5},
		{"x^(1/2", `expression "x^(1/2": unbalanced parenthesis at column 3 ("(" is never closed)`, 3},
		{"()", `expression "()": empty parentheses at column 1`, 1},
		{"log(x)", `expression "log(x)": unknown function "log" at column 1 (known: sqrt)`, 1},
		{"a * sqr(x)", `expression "a * sqr(x)": unknown function "sqr" at column 5 (did you mean sqrt?)`, 5},
		{"sqrt * x", `expression "sqrt * x": sqrt needs parentheses, as sqrt(x), at column 1`, 1},
		{"x^y", `expression "x^y": the power after "^" at column 2 must be a constant such as 2, -1, 0.5 or (1/2)`, 2},
		{"x^(1/y)", `expression "x^(1/y)": the power after "^" at column 2 must be a constant such as 2, -1, 0.5 or (1/2)`, 2},
		{"x^(1+2)", `expression "x^(1+2)": the power after "^" at column 2 must be a constant such as 2, -1, 0.5 or (1/2)`, 2},
		{"x^", `expression "x^": missing power after "^" at column 2`, 2},
		{"x^2^3", `expression "x^2^3": a second power at column 4; use parentheses, as (x^2)^3`, 4},
		{"x^(1/0)", `expression "x^(1/0)": zero denominator in the power after "^" at column 2`, 2},
		{"x^1e3", `expression "x^1e3": write the power after "^" at column 2 without an exponent (as 2, 0.5 or (1/2))`, 2},
		{"x^2 [m]", `expression "x^2 [m]": the power after "^" at column 2 cannot carry a unit`, 2},
		{"x^2000", `expression "x^2000": the power after "^" at column 2: exponent "2000" is too large (at most 1000 in numerator and denominator)`, 2},
		{"2x", `expression "2x": unexpected "x" at column 2 (is an operator such as * missing?)`, 2},
		{"a b", `expression "a b": unexpected "b" at column 3 (is an operator such as * missing?)`, 3},
		{"2 (a)", `expression "2 (a)": unexpected "(" at column 3 (is an operator such as * missing?)`, 3},
		{"a ** 2", `expression "a ** 2": unexpected "*" at column 4 (write powers with ^)`, 4},
		{"+a", `expression "+a": unexpected "+" at column 1`, 1},
		{"x [m]", `expression "x [m]": a unit in brackets must follow a number, at column 3`, 3},
		{"[m]", `expression "[m]": a unit in brackets must follow a number, at column 1`, 1},
		{"3 [m]^2", `expression "3 [m]^2": a power of a number with a unit needs parentheses, as (3 [m])^2, at column 6`, 6},
		{"-3 [m]^2", `expression "-3 [m]^2": a power of a number with a unit needs parentheses, as (-3 [m])^2, at column 7`, 7},
		{"2 [m", `expression "2 [m": unclosed "[" at column 3`, 3},
		{"2 []", `expression "2 []": empty unit in brackets at column 3`, 3},
		{"2 [sec]", `expression "2 [sec]": in the unit at column 3: unit "sec": unknown symbol "sec" at column 1 (did you mean s?)`, 3},
		{"a ] b", `expression "a ] b": unexpected "]" at column 3 (no "[" before it)`, 3},
		{"1,5 * a", `expression "1,5 * a": unexpected "," at column 2 (write the decimal separator as a point)`, 2},
		{"ρ * v", `expression "ρ * v": unexpected "ρ" at column 1 (names use only A-Z, a-z, 0-9 and _)`, 1},
		{"a $ b", `expression "a $ b": unexpected "$" at column 3`, 3},
		{"a <= b", `expression "a <= b": unexpected "<" at column 3 (a comparison belongs in a limit, not in an expression)`, 3},
		{"1e400 * a", `expression "1e400 * a": number 1e400 at column 1 is out of range`, 1},
		{"1e300 [km^3]", `expression "1e300 [km^3]": number 1e300 [km^3] at column 1 is out of range in SI`, 1},
		// The earlier error is reported first, even when a later character is not allowed.
		{"a * / b $", `expression "a * / b $": unexpected "/" at column 5`, 5},
	}
	for _, tt := range tests {
		_, err := ParseExpr(tt.in)
		if err == nil {
			t.Errorf("ParseExpr(%q): no error, want %s", tt.in, tt.want)
			continue
		}
		if err.Error() != tt.want {
			t.Errorf("ParseExpr(%q) error:\n got %s\nwant %s", tt.in, err, tt.want)
		}
		var ee *ExprError
		if !errors.As(err, &ee) || ee.Column != tt.col {
			t.Errorf("ParseExpr(%q): column %v, want %d", tt.in, ee, tt.col)
		}
	}
}

func TestExprInputBounds(t *testing.T) {
	long := strings.Repeat("x + ", 250) + "x" // 1001 runes
	if _, err := ParseExpr(long); err == nil || !strings.Contains(err.Error(), "too long (1001 characters, at most 1000)") {
		t.Errorf("long expression: %v", err)
	}
	if _, err := ParseLimit(long + " <= 1"); err == nil || !strings.Contains(err.Error(), "too long") {
		t.Errorf("long limit: %v", err)
	}
	sum := strings.Repeat("x + ", 249) + "x" // 997 runes, 250 terms
	if got := mustParseExpr(t, sum).Eval(func(string) float64 { return 2 }); got != 500 {
		t.Errorf("long sum = %v, want 500", got)
	}
	grown := "AA+" + strings.Repeat("W", 995) + "+A" // 1000 runes, 1004 once written out
	if _, err := ParseExpr(grown); err == nil || !strings.Contains(err.Error(), "too long (1004 characters once written out canonically, at most 1000)") {
		t.Errorf("expression growing past the bound: %v", err)
	}
	if _, err := ParseLimit(grown[:996] + "<=1"); err == nil || !strings.Contains(err.Error(), "once written out canonically") {
		t.Errorf("limit growing past the bound: %v", err)
	}
	ok := strings.Repeat("(", 100) + "x" + strings.Repeat(")", 100)
	mustParseExpr(t, ok)
	deep := strings.Repeat("(", 101) + "x" + strings.Repeat(")", 101)
	if _, err := ParseExpr(deep); err == nil || err.Error() != `expression "`+strings.Repeat("(", 80)+`…": nested too deeply at column 101 (at most 100 levels)` {
		t.Errorf("deep parentheses: %v", err)
	}
	minus := strings.Repeat("-", 200) + "x"
	if _, err := ParseExpr(minus); err == nil || !strings.Contains(err.Error(), "nested too deeply") {
		t.Errorf("deep unary minus: %v", err)
	}
	sq := strings.Repeat("sqrt(", 120) + "x" + strings.Repeat(")", 120)
	if _, err := ParseExpr(sq); err == nil || !strings.Contains(err.Error(), "nested too deeply") {
		t.Errorf("deep sqrt: %v", err)
	}
}

func TestParseLimit(t *testing.T) {
	tests := []struct {
		in          string
		left, right string
		upper       bool
		canonical   string
	}{
		{"design_speed * hull_length / kinematic_viscosity >= 2e6", "design_speed * hull_length / kinematic_viscosity", "2e6", false, "design_speed * hull_length / kinematic_viscosity >= 2e6"},
		{"beam * draft / (basin_width * basin_depth) <= 0.01", "beam * draft / (basin_width * basin_depth)", "0.01", true, "beam * draft / (basin_width * basin_depth) <= 0.01"},
		// Strict and non-strict comparisons are treated alike.
		{"a < b", "a", "b", true, "a <= b"},
		{"a > b", "a", "b", false, "a >= b"},
		{"a ≤ b", "a", "b", true, "a <= b"},
		{"a ≥ b", "a", "b", false, "a >= b"},
		{"a<=b", "a", "b", true, "a <= b"},
		// Bounds with units, written plainly or in brackets.
		{"wave_period >= 0.35 s", "wave_period", "0.35 [s]", false, "wave_period >= 0.35 [s]"},
		{"carriage_speed <= 6 m/s", "carriage_speed", "6 [m/s]", true, "carriage_speed <= 6 [m/s]"},
		{"water_depth >= 0.02 m", "water_depth", "0.02 [m]", false, "water_depth >= 0.02 [m]"},
		{"water_temperature >= -2 °C", "water_temperature", "-2 [°C]", false, "water_temperature >= -2 [°C]"},
		{"run_time <= 3 [h]", "run_time", "3 [h]", true, "run_time <= 3 [h]"},
		{"x <= -2", "x", "-2", true, "x <= -2"},
		{"x <= +2", "x", "2", true, "x <= 2"},
		{"0.35 s <= wave_period", "0.35 [s]", "wave_period", true, "0.35 [s] <= wave_period"},
		// An expression on the right.
		{"model_length <= basin_length / 2", "model_length", "basin_length / 2", true, "model_length <= basin_length / 2"},
		{"x >= 2 * y", "x", "2 * y", false, "x >= 2 * y"},
		// A unit may not start with an operator: 2 / s is 2 divided by s.
		{"x <= 2 / s", "x", "2 / s", true, "x <= 2 / s"},
		{"0 >= 0 / 1", "0", "0 / 1", false, "0 >= 0 / 1"},
		// A name after a number is a unit: 2 h is two hours.
		{"x >= 2 h", "x", "2 [h]", false, "x >= 2 [h]"},
	}
	for _, tt := range tests {
		l, err := ParseLimit(tt.in)
		if err != nil {
			t.Errorf("ParseLimit(%q): %v", tt.in, err)
			continue
		}
		if l.Left.String() != tt.left || l.Right.String() != tt.right || l.Upper != tt.upper || l.String() != tt.canonical {
			t.Errorf("ParseLimit(%q) = %q | %q upper=%v (%q), want %q | %q upper=%v (%q)",
				tt.in, l.Left, l.Right, l.Upper, l.String(), tt.left, tt.right, tt.upper, tt.canonical)
		}
		if l.Text != strings.TrimSpace(tt.in) {
			t.Errorf("ParseLimit(%q).Text = %q", tt.in, l.Text)
		}
		if again := mustParseLimit(t, l.String()); again.String() != l.String() {
			t.Errorf("canonical limit %q reads back as %q", l.String(), again.String())
		}
	}
}

func TestLimitNames(t *testing.T) {
	l := mustParseLimit(t, "beam * draft / (basin_width * beam) <= draft / basin_depth")
	want := []string{"beam", "draft", "basin_width", "basin_depth"}
	if got := l.Names(); !reflect.DeepEqual(got, want) {
		t.Errorf("Names = %v, want %v", got, want)
	}
}

func TestLimitBoundUnits(t *testing.T) {
	tests := []struct {
		in   string
		si   float64
		dim  Dimension
		text string
	}{
		{"wave_period >= 0.35 s", 0.35, Dim(0, 0, 1, 0), "0.35 [s]"},
		{"carriage_speed <= 6 m/s", 6, Dim(0, 1, -1, 0), "6 [m/s]"},
		{"speed <= 5 kn", 5 * 1852.0 / 3600, Dim(0, 1, -1, 0), "5 [kn]"},
		{"run_time <= 3 [h]", 10800, Dim(0, 0, 1, 0), "3 [h]"},
		{"depth >= 2 cm", 0.02, Dim(0, 1, 0, 0), "2 [cm]"},
		{"water_temperature >= 20 °C", 293.15, Dim(0, 0, 0, 1), "20 [°C]"},
		{"water_temperature >= -2 °C", 271.15, Dim(0, 0, 0, 1), "-2 [°C]"},
		{"reynolds >= 2e6", 2e6, Dimension{}, "2e6"},
		{"ratio <= 0.01", 0.01, Dimension{}, "0.01"},
	}
	for _, tt := range tests {
		l := mustParseLimit(t, tt.in)
		r := l.Right
		if got := r.String(); got != tt.text {
			t.Errorf("%q: right side %q, want %q", tt.in, got, tt.text)
		}
		if names := r.Names(); len(names) != 0 {
			t.Errorf("%q: right side names %v, want none", tt.in, names)
		}
		if got := r.Eval(nil); math.Abs(got-tt.si) > 1e-12*tt.si {
			t.Errorf("%q: right side = %v, want %v", tt.in, got, tt.si)
		}
		coef, powers, ok := r.Product()
		if !ok || len(powers) != 0 || math.Abs(coef-tt.si) > 1e-12*tt.si {
			t.Errorf("%q: right side product = %v %v %v, want the constant %v", tt.in, coef, powers, ok, tt.si)
		}
		d, err := r.Dim(nil)
		if err != nil || !d.Equal(tt.dim) {
			t.Errorf("%q: right side dimension %v %v, want %v", tt.in, d, err, tt.dim)
		}
	}
}

func TestParseLimitErrors(t *testing.T) {
	tests := []struct {
		in, want string
		col      int
	}{
		{"a b", `limit "a b": a limit needs a comparison such as <= or >=`, 0},
		{"", `limit "": empty limit`, 0},
		{"0 <= x <= 1", `limit "0 <= x <= 1": two comparisons, at columns 3 and 8; a limit has one (write a range as two limits)`, 8},
		{"a < b < c < d", `limit "a < b < c < d": 3 comparisons (the second at column 7); a limit has one`, 7},
		{"a = b", `limit "a = b": unexpected "=" at column 3: a limit needs a comparison such as <= or >= (an equality is not a limit)`, 3},
		{"a == b", `limit "a == b": unexpected "=" at column 3: a limit needs a comparison such as <= or >= (an equality is not a limit)`, 3},
		{"a => b", `limit "a => b": write ">=" instead of "=>" at column 3`, 3},
		{"<= 2", `limit "<= 2": nothing on the left of "<=" at column 1`, 1},
		{"a >=  ", `limit "a >=": nothing on the right of ">=" at column 3`, 3},
		{"a * / b <= 2", `limit "a * / b <= 2": unexpected "/" at column 5`, 5},
		{"a <= b * / c", `limit "a <= b * / c": unexpected "/" at column 10`, 10},
		{"a <= (b", `limit "a <= (b": unbalanced parenthesis at column 6 ("(" is never closed)`, 6},
		{"a) <= b", `limit "a) <= b": unbalanced parenthesis at column 2 (")" without "(")`, 2},
		{"x >= 2 *", `limit "x >= 2 *": missing operand after "*" at column 8`, 8},
		{"f(x) >= 1", `limit "f(x) >= 1": unknown function "f" at column 1 (known: sqrt)`, 1},
		// A number with a misspelt unit gets the unit's message.
		{"wave_period >= 0.35 sec", `limit "wave_period >= 0.35 sec": the value "0.35 sec" at column 16: unit "sec": unknown symbol "sec" at column 1 (did you mean s?)`, 16},
		{"x >= 2,5", `limit "x >= 2,5": the value "2,5" at column 6: value "2,5": write the decimal separator as a point (2.5…)`, 6},
	}
	for _, tt := range tests {
		_, err := ParseLimit(tt.in)
		if err == nil {
			t.Errorf("ParseLimit(%q): no error, want %s", tt.in, tt.want)
			continue
		}
		if err.Error() != tt.want {
			t.Errorf("ParseLimit(%q) error:\n got %s\nwant %s", tt.in, err, tt.want)
		}
		var ee *ExprError
		if !errors.As(err, &ee) || ee.Column != tt.col {
			t.Errorf("ParseLimit(%q): column %v, want %d", tt.in, ee, tt.col)
		}
	}
}

func TestLimitCheck(t *testing.T) {
	tests := []struct{ in, want string }{
		{"design_speed * hull_length / kinematic_viscosity >= 2e6", ""},
		{"beam * draft / (basin_width * basin_depth) <= 0.01", ""},
		{"wave_period >= 0.35 s", ""},
		{"design_speed <= 6 m/s", ""},
		{"9.80665 [m/s^2] * model_mass <= max_force", ""},
		{"water_temperature >= -2 °C", ""},
		{"design_speed <= depth", `limit "design_speed <= depth": the two sides have different dimensions: L T^-1 and L`},
		{"wave_period >= 0.35 m", `limit "wave_period >= 0.35 m": the two sides have different dimensions: T and L`},
		{"design_speed * hull_length >= 2e6", `limit "design_speed * hull_length >= 2e6": the two sides have different dimensions: L^2 T^-1 and 1`},
		{"design_speed + depth <= 1", `limit "design_speed + depth <= 1": left side: cannot add L T^-1 to L`},
		{"1 <= depth / (beam - wave_period)", `limit "1 <= depth / (beam - wave_period)": right side: cannot subtract T from L in "beam - wave_period"`},
		{"speed <= 6 m/s", `limit "speed <= 6 m/s": left side: unknown name`},
	}
	for _, tt := range tests {
		err := mustParseLimit(t, tt.in).Check(measureDimOf)
		got := ""
		if err != nil {
			got = err.Error()
		}
		if got != tt.want {
			t.Errorf("Check(%q) = %q, want %q", tt.in, got, tt.want)
		}
	}
	if err := mustParseLimit(t, "speed <= 6 m/s").Check(measureDimOf); !errors.Is(err, errMeasureUnknown) {
		t.Errorf("Check does not wrap dimOf's error: %v", err)
	}
}

func TestLimitMargin(t *testing.T) {
	tests := []struct {
		name  string
		limit string
		vals  map[string]float64
		want  float64
	}{
		// Hand values (spec §2): log10(bound/value) for an upper bound.
		{"upper, half the bound", "x <= 1", map[string]float64{"x": 0.5}, 0.30102999566398120},
		// log10(value/bound) for a lower bound: 3e6 against 2e6.
		{"lower, Reynolds 3e6", "design_speed * hull_length / kinematic_viscosity >= 2e6",
			map[string]float64{"design_speed": 1.5, "hull_length": 2, "kinematic_viscosity": 1e-6}, 0.17609125905568124},
		{"upper, at the bound", "x <= 2", map[string]float64{"x": 2}, 0},
		{"strict at the bound", "x < 2", map[string]float64{"x": 2}, 0},
		{"upper, violated", "x <= 1", map[string]float64{"x": 10}, -1},
		{"lower, violated", "x >= 100", map[string]float64{"x": 1}, -2},
		{"bound with unit", "wave_period >= 0.35 s", map[string]float64{"wave_period": 3.5}, 1},
		{"bound in hours", "run_time <= 1 h", map[string]float64{"run_time": 360}, 1},
		{"huge ratio", "x <= 1e300", map[string]float64{"x": 1e-300}, 600},
		{"tiny ratio", "x >= 1e300", map[string]float64{"x": 1e-300}, -600},
		{"zero side", "x <= 1", map[string]float64{"x": 0}, math.Inf(-1)},
		{"negative side", "x >= 1", map[string]float64{"x": -3}, math.Inf(-1)},
		{"negative bound", "x <= -1", map[string]float64{"x": 3}, math.Inf(-1)},
		{"NaN side", "x <= 1", map[string]float64{}, math.Inf(-1)},
		{"infinite value, upper", "x <= 1", map[string]float64{"x": math.Inf(1)}, math.Inf(-1)},
		{"infinite value, lower", "x >= 1", map[string]float64{"x": math.Inf(1)}, math.Inf(1)},
		{"two infinities", "x >= y", map[string]float64{"x": math.Inf(1), "y": math.Inf(1)}, math.Inf(-1)},
	}
	for _, tt := range tests {
		got := mustParseLimit(t, tt.limit).Margin(measureValues(tt.vals))
		if math.IsNaN(got) || math.Abs(got-tt.want) > 1e-12 && got != tt.want {
			t.Errorf("%s: Margin(%q) = %v, want %v", tt.name, tt.limit, got, tt.want)
		}
	}
}

func TestLimitLogLinear(t *testing.T) {
	l := mustParseLimit(t, "design_speed / sqrt(gravity * depth) <= 0.7")
	c, terms, ok := l.LogLinear()
	want := []NameCoef{{"design_speed", Int(-1)}, {"gravity", R(1, 2)}, {"depth", R(1, 2)}}
	if !ok || math.Abs(c-math.Log10(0.7)) > 1e-15 || !reflect.DeepEqual(terms, want) {
		t.Errorf("LogLinear = %v %v %v, want %v %v", c, terms, ok, math.Log10(0.7), want)
	}
	l = mustParseLimit(t, "design_speed * hull_length / kinematic_viscosity >= 2e6")
	c, terms, ok = l.LogLinear()
	want = []NameCoef{{"design_speed", Int(1)}, {"hull_length", Int(1)}, {"kinematic_viscosity", Int(-1)}}
	if !ok || math.Abs(c+math.Log10(2e6)) > 1e-15 || !reflect.DeepEqual(terms, want) {
		t.Errorf("LogLinear = %v %v %v, want %v %v", c, terms, ok, -math.Log10(2e6), want)
	}
	// A name on both sides cancels.
	_, terms, ok = mustParseLimit(t, "x * y <= 2 * x").LogLinear()
	if !ok || !reflect.DeepEqual(terms, []NameCoef{{"y", Int(-1)}}) {
		t.Errorf("LogLinear of x*y <= 2*x: %v %v", terms, ok)
	}
	for _, s := range []string{"a + b <= 1", "x >= -2", "x - 1 >= 0", "-x <= 3", "x <= 0"} {
		if _, _, ok := mustParseLimit(t, s).LogLinear(); ok {
			t.Errorf("LogLinear(%q) ok, want not ok", s)
		}
	}
}

// TestLimitLogLinearMatchesMargin compares the log-linear form with the
// direct margin at random positive values.
func TestLimitLogLinearMatchesMargin(t *testing.T) {
	limits := []string{
		"design_speed * hull_length / kinematic_viscosity >= 2e6",
		"beam * draft / (basin_width * basin_depth) <= 0.01",
		"design_speed / sqrt(gravity * depth) <= 0.7",
		"design_speed / (gravity * depth)^(1/2) < 0.7",
		"wave_period >= 0.35 s",
		"model_length <= basin_length / 2",
		"9.80665 [m/s^2] * model_mass <= max_force",
		"x^(-3/2) * y^0.5 / 3 [h] ≥ z^2 * 1.5e-3",
		"sqrt(x * y) * x <= 4 * y^-1",
	}
	rng := rand.New(rand.NewPCG(1, 2))
	for _, s := range limits {
		l := mustParseLimit(t, s)
		c, terms, ok := l.LogLinear()
		if !ok {
			t.Errorf("LogLinear(%q) not ok", s)
			continue
		}
		for range 200 {
			vals := map[string]float64{}
			for _, n := range l.Names() {
				vals[n] = math.Pow(10, rng.Float64()*8-4)
			}
			lin := c
			for _, term := range terms {
				lin += term.Exp.Float64() * math.Log10(vals[term.Name])
			}
			m := l.Margin(measureValues(vals))
			if math.Abs(lin-m) > 1e-12 {
				t.Errorf("%q at %v: log-linear %v, margin %v (difference %g)", s, vals, lin, m, lin-m)
				break
			}
		}
	}
}

// TestMeasureFuzzRegressions holds inputs the fuzzer once found, and other
// awkward inputs: they must neither panic nor break the round trip.
func TestMeasureFuzzRegressions(t *testing.T) {
	inputs := []string{
		// Found by the fuzzer: a 1000-character input whose canonical text
		// (with spaces around "+") was longer than the input bound.
		"AA+" + strings.Repeat("W", 995) + "+A",
		// Would nest deeper once written out, if "--x" printed as "-(-x)".
		strings.Repeat("-", 100) + "x", strings.Repeat("-", 99) + "3 [m] >= x",
		// Found by the fuzzer: "0 / 1" read back as the value 0 in the unit "/ 1".
		"0>0/1E0", "x <= 2 / s",
		"\xff", "x^(-0)", "-0 [m] <= x", "0.0 >= -0", "x^(1/1000) >= 1", "x^(-1000/1) <= 1",
		"5e-324 <= x", "1e-400 <= x", "1e308 * 10 >= x", "(-(-(3 [°C])))^2 <= x",
		"sqrt(-1) >= x", "x <= 20C", "x <= 1 °", "x <= 1 ° C", "[ ] <= 1", "x <=\t2\n",
	}
	for _, s := range inputs {
		if e, err := ParseExpr(s); err == nil {
			checkExprStable(t, "expression "+s, e)
		}
		l, err := ParseLimit(s)
		if err != nil {
			continue
		}
		checkExprStable(t, "left side of "+s, l.Left)
		checkExprStable(t, "right side of "+s, l.Right)
		if again, err := ParseLimit(l.String()); err != nil || again.String() != l.String() {
			t.Errorf("%q: canonical %q reads back as %v, %v", s, l.String(), again, err)
		}
		if m := l.Margin(measureFuzzValue); math.IsNaN(m) {
			t.Errorf("%q: NaN margin", s)
		}
		_, _, _ = l.LogLinear()
		_ = l.Check(measureFuzzDim)
	}
}

func TestMeasureNilSafety(t *testing.T) {
	var e *Expr
	var l *Limit
	if e.String() != "" || e.Names() != nil || !math.IsNaN(e.Eval(nil)) {
		t.Error("nil *Expr methods")
	}
	if _, err := e.Dim(nil); err == nil {
		t.Error("nil *Expr Dim: no error")
	}
	if _, _, ok := e.Product(); ok {
		t.Error("nil *Expr Product ok")
	}
	if l.String() != "" || l.Names() != nil || l.Check(nil) == nil || !math.IsInf(l.Margin(nil), -1) {
		t.Error("nil *Limit methods")
	}
	if _, _, ok := l.LogLinear(); ok {
		t.Error("nil *Limit LogLinear ok")
	}
}
