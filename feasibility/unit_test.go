package feasibility

import (
	"errors"
	"go/format"
	"math"
	"os"
	"strings"
	"testing"

	gounit "gonum.org/v1/gonum/unit"
)

// relClose reports whether got is within rel (relative) of want.
func relClose(got, want, rel float64) bool {
	if want == 0 {
		return math.Abs(got) <= rel
	}
	return math.Abs(got-want) <= rel*math.Abs(want)
}

// Tolerances. NIST SP 811 Appendix B prints factors to 7 significant
// figures, exact ones in bold; a rounded 7-figure factor is within half a
// unit of its last digit, i.e. a relative 5e-7 at worst (1.000 000 E+00
// being the worst case).
const (
	exact   = 1e-15
	sevenSF = 5e-7
)

// TestUnitFactorsNIST checks conversion factors against NIST Special
// Publication 811 (2008), Guide for the Use of the SI, Appendix B.8
// ("Factors for units listed alphabetically") and the tables of chapter 5.
// The B.8 values were checked against quotations of the table found in
// public sources (the PDF itself was not opened); those marked "from
// memory" were not found quoted and are written from memory of SP 811.
func TestUnitFactorsNIST(t *testing.T) {
	tests := []struct {
		unit string
		want float64
		tol  float64
	}{
		{"ft", 3.048e-01, exact},                       // NIST SP 811 B.8: foot, 3.048 E-01 m (exact)
		{"in", 2.54e-02, exact},                        // NIST SP 811 B.8: inch, 2.54 E-02 m (exact)
		{"yd", 9.144e-01, exact},                       // NIST SP 811 B.8: yard, 9.144 E-01 m (exact)
		{"mi", 1.609344e+03, exact},                    // NIST SP 811 B.8: mile (international), 1.609 344 E+03 m (exact)
		{"nmi", 1.852e+03, exact},                      // NIST SP 811 Table 9 / B.8: nautical mile, 1852 m (exact)
		{"kn", 1852.0 / 3600, exact},                   // NIST SP 811 Table 9: knot = 1852/3600 m/s (exact)
		{"kn", 5.144444e-01, sevenSF},                  // NIST SP 811 B.8: knot, 5.144 444 E-01 m/s
		{"kt", 5.144444e-01, sevenSF},                  // same as kn (NIST SP 811 B.8)
		{"knots", 1852.0 / 3600, exact},                // NIST SP 811 Table 9: knot = 1852/3600 m/s (the word people type)
		{"knot", 5.144444e-01, sevenSF},                // NIST SP 811 B.8: knot, 5.144 444 E-01 m/s
		{"mph", 4.4704e-01, exact},                     // NIST SP 811 B.8: mile per hour, 4.4704 E-01 m/s (exact)
		{"ft/s", 3.048e-01, exact},                     // NIST SP 811 B.8: foot per second, 3.048 E-01 m/s (exact)
		{"ft/min", 5.08e-03, exact},                    // NIST SP 811 B.8: foot per minute, 5.08 E-03 m/s (exact)
		{"ft^2", 9.290304e-02, exact},                  // NIST SP 811 B.8: square foot, 9.290 304 E-02 m² (exact)
		{"lb", 4.5359237e-01, exact},                   // NIST SP 811 B.8: pound (avoirdupois), 4.535 923 7 E-01 kg (exact)
		{"lbm", 4.5359237e-01, exact},                  // same as lb (NIST SP 811 B.8)
		{"lbf", 4.448222e+00, sevenSF},                 // NIST SP 811 B.8: pound-force, 4.448 222 E+00 N
		{"lbf", 4.4482216152605, exact},                // lbf = lb · gn, gn = 9.806 65 m/s² (NIST SP 811 B.8, exact)
		{"kip", 4.448222e+03, sevenSF},                 // NIST SP 811 B.8: kip (1 kip = 1000 lbf), 4.448 222 E+03 N
		{"slug", 1.459390e+01, sevenSF},                // NIST SP 811 B.8: slug, 1.459 390 E+01 kg
		{"psi", 6.894757e+03, sevenSF},                 // NIST SP 811 B.8: pound-force per square inch, 6.894 757 E+03 Pa
		{"lbf/in^2", 6.894757e+03, sevenSF},            // same, spelled out (NIST SP 811 B.8)
		{"ksi", 6.894757e+06, sevenSF},                 // NIST SP 811 B.8: kip per square inch, 6.894 757 E+06 Pa
		{"lbf*ft", 1.355818e+00, sevenSF},              // NIST SP 811 B.8: pound-force foot, 1.355 818 E+00 N·m
		{"lb/ft^3", 1.601846e+01, sevenSF},             // NIST SP 811 B.8: pound per cubic foot, 1.601 846 E+01 kg/m³
		{"atm", 1.01325e+05, exact},                    // NIST SP 811 B.8: atmosphere, standard, 1.013 25 E+05 Pa (exact)
		{"bar", 1.0e+05, exact},                        // NIST SP 811 Table 9 / B.8: bar, 1.0 E+05 Pa (exact)
		{"mbar", 1.0e+02, exact},                       // NIST SP 811 B.8: millibar, 1.0 E+02 Pa (exact)
		{"L", 1.0e-03, exact},                          // NIST SP 811 Table 6 / B.8: liter, 1.0 E-03 m³ (exact) — from memory
		{"l", 1.0e-03, exact},                          // same (both symbols are accepted, NIST SP 811 Table 6) — from memory
		{"min", 60, exact},                             // NIST SP 811 Table 6: minute, 60 s — from memory
		{"h", 3600, exact},                             // NIST SP 811 Table 6: hour, 3600 s — from memory
		{"d", 86400, exact},                            // NIST SP 811 Table 6: day, 86 400 s — from memory
		{"deg", 1.745329e-02, sevenSF},                 // NIST SP 811 B.8: degree (angle), 1.745 329 E-02 rad — from memory
		{"°", math.Pi / 180, exact},                    // NIST SP 811 Table 6: 1° = (π/180) rad — from memory
		{"cSt", 1.0e-06, exact},                        // NIST SP 811 B.8: centistokes, 1.0 E-06 m²/s (exact) — from memory
		{"cP", 1.0e-03, exact},                         // NIST SP 811 B.8: centipoise, 1.0 E-03 Pa·s (exact) — from memory
		{"t", 1.0e+03, exact},                          // NIST SP 811 Table 6: tonne, 10³ kg — from memory
		{"rpm", 1.047198e-01 / (2 * math.Pi), sevenSF}, // NIST SP 811 B.8: revolution per minute, 1.047 198 E-01 rad/s; we count revolutions (÷2π)
		{"%", 1e-2, exact},                             // definition of per cent
		{"‰", 1e-3, exact},                             // definition of per mille
	}
	for _, tc := range tests {
		u, err := ParseUnit(tc.unit)
		if err != nil {
			t.Errorf("ParseUnit(%q): %v", tc.unit, err)
			continue
		}
		if !relClose(u.Factor, tc.want, tc.tol) {
			t.Errorf("ParseUnit(%q).Factor = %.17g, want %.17g (rel tol %g)", tc.unit, u.Factor, tc.want, tc.tol)
		}
		if u.Offset != 0 {
			t.Errorf("ParseUnit(%q).Offset = %g, want 0", tc.unit, u.Offset)
		}
	}
}

// TestUnitTemperatureNIST checks the temperature scales against the
// formulas of NIST SP 811 (2008) B.8: T/K = t/°C + 273.15 and
// T/K = (t/°F + 459.67)/1.8.
func TestUnitTemperatureNIST(t *testing.T) {
	celsius := func(c float64) float64 { return c + 273.15 }            // NIST SP 811 B.8
	fahrenheit := func(f float64) float64 { return (f + 459.67) / 1.8 } // NIST SP 811 B.8
	for _, sym := range []string{"°C", "degC", "C", "℃", "(°C)", "° C", "ºC"} {
		for _, c := range []float64{-40, 0, 20, 100, 1e4} {
			u, err := ParseUnit(sym)
			if err != nil {
				t.Fatalf("ParseUnit(%q): %v", sym, err)
			}
			if got, want := u.ToSI(c), celsius(c); !relClose(got, want, 1e-14) {
				t.Errorf("%g %s = %.17g K, want %.17g", c, sym, got, want)
			}
		}
	}
	for _, sym := range []string{"°F", "degF", "F", "℉"} {
		for _, f := range []float64{-459.67, -40, 32, 68, 212} {
			u, err := ParseUnit(sym)
			if err != nil {
				t.Fatalf("ParseUnit(%q): %v", sym, err)
			}
			if got, want := u.ToSI(f), fahrenheit(f); math.Abs(got-want) > 1e-12 {
				t.Errorf("%g %s = %.17g K, want %.17g", f, sym, got, want)
			}
		}
	}
	// −40 °C = −40 °F (follows from the two NIST formulas).
	c, _, _ := ParseValue("-40 °C")
	f, _, _ := ParseValue("-40 °F")
	if math.Abs(c-f) > 1e-12 || math.Abs(c-233.15) > 1e-12 {
		t.Errorf("-40 °C = %v K, -40 °F = %v K, want both 233.15", c, f)
	}
	// Kelvin has no offset.
	if u, _ := ParseUnit("K"); u.Factor != 1 || u.Offset != 0 {
		t.Errorf("K = %+v", u)
	}
}

// TestUnitTemperatureInCompounds: inside a compound or under a power, °C
// and °F are temperature differences (factor only, no offset). The
// expected factors follow from NIST SP 811 B.8: a difference of 1 °C is
// 1 K, of 1 °F is 1/1.8 K.
func TestUnitTemperatureInCompounds(t *testing.T) {
	tests := []struct {
		unit   string
		factor float64
		dim    Dimension
	}{
		{"J/(kg*°C)", 1, Dim(0, 2, -2, -1)}, // specific heat, = J/(kg*K)
		{"J/(kg*C)", 1, Dim(0, 2, -2, -1)},  // same, plain C
		{"1/°C", 1, Dim(0, 0, 0, -1)},       // expansion coefficient
		{"1/°F", 1.8, Dim(0, 0, 0, -1)},     // expansion coefficient per °F
		{"°F/s", 1 / 1.8, Dim(0, 0, -1, 1)}, // heating rate
		{"°C^1", 1, Dim(0, 0, 0, 1)},        // any power makes it a difference
		{"W/(m*°C)", 1, Dim(1, 1, -3, -1)},  // conductivity
		{"(°C)*(1)", 1, Dim(0, 0, 0, 1)},    // a product, even by 1
	}
	for _, tc := range tests {
		u, err := ParseUnit(tc.unit)
		if err != nil {
			t.Errorf("ParseUnit(%q): %v", tc.unit, err)
			continue
		}
		if u.Offset != 0 || !relClose(u.Factor, tc.factor, 1e-15) || !u.Dim.Equal(tc.dim) {
			t.Errorf("ParseUnit(%q) = %+v, want factor %g, no offset, dim %v", tc.unit, u, tc.factor, tc.dim)
		}
	}
}

// gonumDim converts gonum's dimensions to ours, failing on any dimension
// outside M, L, T, Θ.
func gonumDim(t *testing.T, u gounit.Uniter) Dimension {
	t.Helper()
	var d Dimension
	for k, p := range u.Unit().Dimensions() {
		switch k {
		case gounit.MassDim:
			d[Mass] = Int(int64(p))
		case gounit.LengthDim:
			d[Length] = Int(int64(p))
		case gounit.TimeDim:
			d[Time] = Int(int64(p))
		case gounit.TemperatureDim:
			d[Temperature] = Int(int64(p))
		default:
			t.Fatalf("gonum unit has dimension %v outside M, L, T, Θ", k)
		}
	}
	return d
}

// TestUnitDimensionsGonum checks the dimensions (and, where gonum defines
// them, the factors) of parsed units against gonum.org/v1/gonum/unit, an
// independent implementation.
func TestUnitDimensionsGonum(t *testing.T) {
	m := gounit.Metre.Unit()
	s := gounit.Second.Unit()
	kg := gounit.Kilogram.Unit()
	m3 := m.Copy().Mul(m).Mul(m)
	tests := []struct {
		unit string
		ref  gounit.Uniter
	}{
		{"N", gounit.Newton},                                         // gonum: Newton
		{"kg*m/s^2", gounit.Newton},                                  // gonum: Newton
		{"kg m s-2", gounit.Newton},                                  // gonum: Newton
		{"Pa", gounit.Pascal},                                        // gonum: Pascal
		{"N/m^2", gounit.Pascal},                                     // gonum: Pascal
		{"kg/(m*s^2)", gounit.Pascal},                                // gonum: Pascal
		{"J", gounit.Joule},                                          // gonum: Joule
		{"N·m", gounit.Joule},                                        // gonum: Joule (same dimension as torque)
		{"N*m", gounit.Newtonmetre},                                  // gonum: Newtonmetre
		{"W", gounit.Watt},                                           // gonum: Watt
		{"J/s", gounit.Watt},                                         // gonum: Watt
		{"m/s", m.Copy().Div(s)},                                     // gonum: Metre/Second
		{"kn", m.Copy().Div(s)},                                      // gonum: Metre/Second
		{"m/s/s", gounit.Metre.Unit().Div(s).Div(s)},                 // gonum: Metre/Second/Second
		{"kg/m^3", kg.Copy().Div(m3)},                                // gonum: Kilogram/Metre³
		{"kg/m3", kg.Copy().Div(m3)},                                 // gonum: Kilogram/Metre³
		{"Pa*s", gounit.Pascal.Unit().Mul(s)},                        // gonum: Pascal·Second
		{"cP", gounit.Pascal.Unit().Mul(s)},                          // gonum: Pascal·Second
		{"m2/s", m.Copy().Mul(m).Div(s)},                             // gonum: Metre²/Second
		{"cSt", m.Copy().Mul(m).Div(s)},                              // gonum: Metre²/Second
		{"N/m", gounit.Newton.Unit().Div(m)},                         // gonum: Newton/Metre
		{"Hz", gounit.Hertz},                                         // gonum: Hertz
		{"1/s", gounit.Hertz},                                        // gonum: Hertz
		{"rpm", gounit.Hertz},                                        // gonum: Hertz
		{"K", gounit.Kelvin},                                         // gonum: Kelvin
		{"°C", gounit.Kelvin},                                        // gonum: Kelvin
		{"L", gounit.Litre},                                          // gonum: Litre
		{"g", gounit.Gram},                                           // gonum: Gram
		{"min", gounit.Minute},                                       // gonum: Minute
		{"h", gounit.Hour},                                           // gonum: Hour
		{"m/s^2", gounit.Metre.Unit().Div(s).Div(s)},                 // gonum: acceleration
		{"N*m^2", gounit.Newton.Unit().Mul(m).Mul(m)},                // gonum: flexural rigidity
		{"J/(kg*K)", gounit.Joule.Unit().Div(kg).Div(gounit.Kelvin)}, // gonum: specific heat
	}
	for _, tc := range tests {
		u, err := ParseUnit(tc.unit)
		if err != nil {
			t.Errorf("ParseUnit(%q): %v", tc.unit, err)
			continue
		}
		if want := gonumDim(t, tc.ref); !u.Dim.Equal(want) {
			t.Errorf("ParseUnit(%q).Dim = %v, gonum says %v", tc.unit, u.Dim, want)
		}
	}
	// Factors that gonum defines.
	factors := []struct {
		unit string
		want float64
	}{
		{"L", float64(gounit.Litre)},    // gonum: Litre = 1e-3 m³
		{"g", float64(gounit.Gram)},     // gonum: Gram = 1e-3 kg
		{"min", float64(gounit.Minute)}, // gonum: Minute = 60 s
		{"h", float64(gounit.Hour)},     // gonum: Hour = 3600 s
	}
	for _, tc := range factors {
		u, _ := ParseUnit(tc.unit)
		if !relClose(u.Factor, tc.want, exact) {
			t.Errorf("ParseUnit(%q).Factor = %g, gonum says %g", tc.unit, u.Factor, tc.want)
		}
	}
}

// TestUnitPrefixesGonum checks every SI prefix against gonum's prefix
// constants (gonum.org/v1/gonum/unit prefixes.go).
func TestUnitPrefixesGonum(t *testing.T) {
	tests := []struct {
		unit string
		want float64
	}{
		{"Ym", gounit.Yotta}, {"Zm", gounit.Zetta}, {"Em", gounit.Exa}, {"Pm", gounit.Peta},
		{"Tm", gounit.Tera}, {"Gm", gounit.Giga}, {"Mm", gounit.Mega}, {"km", gounit.Kilo},
		{"hm", gounit.Hecto}, {"dam", gounit.Deca}, {"dm", gounit.Deci}, {"cm", gounit.Centi},
		{"mm", gounit.Milli}, {"µm", gounit.Micro}, {"μm", gounit.Micro}, {"um", gounit.Micro},
		{"nm", gounit.Nano}, {"pm", gounit.Pico}, {"fm", gounit.Femto}, {"am", gounit.Atto},
		{"zm", gounit.Zepto}, {"ym", gounit.Yocto},
		{"kg", 1}, {"mg", gounit.Milli * float64(gounit.Gram)}, {"Mg", 1e3},
		{"kN", gounit.Kilo}, {"MPa", gounit.Mega}, {"GPa", gounit.Giga}, {"hPa", gounit.Hecto},
		{"daN", gounit.Deca}, {"ms", gounit.Milli}, {"µs", gounit.Micro}, {"kHz", gounit.Kilo},
		{"mL", gounit.Milli * float64(gounit.Litre)}, {"dL", gounit.Deci * float64(gounit.Litre)},
		{"kJ", gounit.Kilo}, {"MW", gounit.Mega}, {"mK", gounit.Milli}, {"mrad", gounit.Milli},
		{"Mt", gounit.Mega * 1e3}, {"kbar", gounit.Kilo * 1e5},
		{"cm^3", gounit.Centi * gounit.Centi * gounit.Centi}, // prefix binds before the power (SI rule)
		{"km/h", gounit.Kilo / float64(gounit.Hour)},
	}
	for _, tc := range tests {
		u, err := ParseUnit(tc.unit)
		if err != nil {
			t.Errorf("ParseUnit(%q): %v", tc.unit, err)
			continue
		}
		if !relClose(u.Factor, tc.want, 1e-15) {
			t.Errorf("ParseUnit(%q).Factor = %.17g, want %.17g", tc.unit, u.Factor, tc.want)
		}
	}
}

// TestUnitGrammar covers the spellings the grammar accepts; the expected
// values follow from the definitions in the table (SI, NIST SP 811).
func TestUnitGrammar(t *testing.T) {
	tests := []struct {
		unit   string
		factor float64
		dim    Dimension
	}{
		{"m/s/s", 1, Dim(0, 1, -2, 0)},  // left associative
		{"m/(s/s)", 1, Dim(0, 1, 0, 0)}, // parentheses
		{"m/s^2", 1, Dim(0, 1, -2, 0)},
		{"m s^-2", 1, Dim(0, 1, -2, 0)},  // space juxtaposition
		{"m  s-2", 1, Dim(0, 1, -2, 0)},  // several spaces, trailing digits
		{"m·s⁻²", 1, Dim(0, 1, -2, 0)},   // middle dot, superscripts
		{"m⋅s^-2", 1, Dim(0, 1, -2, 0)},  // dot operator
		{"m×s**-2", 1, Dim(0, 1, -2, 0)}, // times sign, ** power
		{"N.m", 1, Dim(1, 2, -2, 0)},     // dot as product
		{"N-m", 1, Dim(1, 2, -2, 0)},     // hyphen before a letter is a product
		{"lbf-ft", 4.4482216152605 * 0.3048, Dim(1, 2, -2, 0)},
		{"m^2.s", 1, Dim(0, 2, 1, 0)}, // "." after an exponent is the product
		{"m2/s", 1, Dim(0, 2, -1, 0)},
		{"m3", 1, Dim(0, 3, 0, 0)},
		{"s-1", 1, Dim(0, 0, -1, 0)},
		{"1/s", 1, Dim(0, 0, -1, 0)},
		{"1", 1, Dimension{}},
		{"m^(1/2)", 1, Dimension{{}, R(1, 2), {}, {}}},
		{"m^0.5", 1, Dimension{{}, R(1, 2), {}, {}}},
		{"(m/s)^2", 1, Dim(0, 2, -2, 0)},
		{"(km)^(3/2)", math.Pow(1e3, 1.5), Dimension{{}, R(3, 2), {}, {}}},
		{"m^−1", 1, Dim(0, -1, 0, 0)}, // U+2212 minus sign
		{"((kg))/((m))^3", 1, Dim(1, -3, 0, 0)},
		{" kg / m^3 ", 1, Dim(1, -3, 0, 0)}, // trimmed, spaces around /
		{"g/kg", 1e-3, Dimension{}},         // salinity
		{"m^0", 1, Dimension{}},
		{"ft·lbf", 4.4482216152605 * 0.3048, Dim(1, 2, -2, 0)},
		{"kg/m^3/m^-3", 1, Dim(1, 0, 0, 0)},
		{"rad/s", 1, Dim(0, 0, -1, 0)}, // angles are dimensionless
		{"deg/s", math.Pi / 180, Dim(0, 0, -1, 0)},
		{"°", math.Pi / 180, Dimension{}}, // ° alone is the degree of angle
	}
	for _, tc := range tests {
		u, err := ParseUnit(tc.unit)
		if err != nil {
			t.Errorf("ParseUnit(%q): %v", tc.unit, err)
			continue
		}
		if !relClose(u.Factor, tc.factor, 1e-14) || !u.Dim.Equal(tc.dim) || u.Offset != 0 {
			t.Errorf("ParseUnit(%q) = %+v, want factor %g, dim %v", tc.unit, u, tc.factor, tc.dim)
		}
		if u.Text != strings.TrimSpace(tc.unit) {
			t.Errorf("ParseUnit(%q).Text = %q", tc.unit, u.Text)
		}
	}
}

// TestUnitAmbiguousSymbols pins the documented readings of symbols that
// could be read two ways (exact symbol first, prefix second).
func TestUnitAmbiguousSymbols(t *testing.T) {
	tests := []struct {
		unit   string
		factor float64
		dim    Dimension
		why    string
	}{
		{"d", 86400, Dim(0, 0, 1, 0), "d alone is the day, not deci"},
		{"dm", 0.1, Dim(0, 1, 0, 0), "d before a prefixable symbol is deci"},
		{"dL", 1e-4, Dim(0, 3, 0, 0), "decilitre"},
		{"h", 3600, Dim(0, 0, 1, 0), "h alone is the hour"},
		{"hPa", 100, Dim(1, -1, -2, 0), "h before a prefixable symbol is hecto"},
		{"min", 60, Dim(0, 0, 1, 0), "min is the minute, not milli-inch"},
		{"mi", 1609.344, Dim(0, 1, 0, 0), "mi is the mile"},
		{"nmi", 1852, Dim(0, 1, 0, 0), "nmi is the nautical mile"},
		{"ms", 1e-3, Dim(0, 0, 1, 0), "ms is the millisecond"},
		{"m s", 1, Dim(0, 1, 1, 0), "m s is metre-second"},
		{"kt", 1852.0 / 3600, Dim(0, 1, -1, 0), "kt is the knot, not a kilotonne"},
		{"Mt", 1e9, Dim(1, 0, 0, 0), "Mt is a megatonne"},
		{"ft", 0.3048, Dim(0, 1, 0, 0), "ft is the foot, not a femtotonne"},
		{"Pa", 1, Dim(1, -1, -2, 0), "Pa is the pascal"},
		{"P", 0.1, Dim(1, -1, -1, 0), "P alone is the poise"},
		{"PPa", 1e15, Dim(1, -1, -2, 0), "P before a prefixable symbol is peta"},
		{"C", 1, Dim(0, 0, 0, 1), "C is degree Celsius, there is no coulomb"},
		{"F", 1 / 1.8, Dim(0, 0, 0, 1), "F is degree Fahrenheit, there is no farad"},
		{"rpm", 1.0 / 60, Dim(0, 0, -1, 0), "rpm is 1/60 Hz (revolutions counted)"},
	}
	for _, tc := range tests {
		u, err := ParseUnit(tc.unit)
		if err != nil {
			t.Errorf("ParseUnit(%q) (%s): %v", tc.unit, tc.why, err)
			continue
		}
		if !relClose(u.Factor, tc.factor, 1e-15) || !u.Dim.Equal(tc.dim) {
			t.Errorf("ParseUnit(%q) = %+v: %s", tc.unit, u, tc.why)
		}
	}
	if u, _ := ParseUnit("C"); u.Offset != 273.15 {
		t.Errorf("C alone has offset %g, want 273.15", u.Offset)
	}
}

// TestUnitErrors checks the messages: the column is the 1-based rune
// position in the trimmed text.
func TestUnitErrors(t *testing.T) {
	tests := []struct {
		unit string
		want string // exact message, or a fragment when prefixed by "~"
		col  int
	}{
		{"kg/mx^3", `unit "kg/mx^3": unknown symbol "mx" at column 4 (did you mean m?)`, 4},
		{"Nm", `unit "Nm": unknown symbol "Nm" at column 1 (did you mean N*m?)`, 1},
		{"kgm/s", `~(did you mean kg*m?)`, 1},
		{"m/s*Kg", `unit "m/s*Kg": unknown symbol "Kg" at column 5 (did you mean kg?)`, 5},
		{"kpa", `~(did you mean kPa?)`, 1},
		{"  kg/ mx", `unit "kg/ mx": unknown symbol "mx" at column 5 (did you mean m?)`, 5},
		{"µm/xs", `~at column 4`, 4}, // µ is one rune (two bytes)
		{"°C/qq", `~at column 4`, 4}, // ° is one rune
		{"kg/m^3x", `unit "kg/m^3x": unexpected "x" at column 7`, 7},
		{"kft", `~prefix "k" does not apply to "ft"`, 1},
		{"m^1/2", `~write a fractional power with parentheses, as ^(1/2) at column 3`, 3},
		{"2/s", `~number "2" inside a unit (only 1 is allowed, as in 1/s) at column 1`, 1},
		{"(m/s", `unit "(m/s": missing ")" for this "(" at column 1`, 1},
		{"m))", `unit "m))": unmatched ")" at column 2`, 2},
		{"m^", `~missing exponent after ^ at column 3`, 3},
		{"m/", `~missing unit after "/"`, 2},
		{"m^2^3", `~a second power`, 4},
		{"()", `~empty parentheses at column 2`, 2},
		{"m^x", `~missing exponent`, 3},
		{"m^(1/0)", `~bad exponent`, 4},
		{"m^1001", `~too large`, 3},
		{"((m^1000)^1000)", `~exponent of L grows too large`, 0},
		{"Ym^100", `~conversion factor out of range`, 0},
		{"m#", `unit "m#": unexpected "#" at column 2`, 2},
		{"A", `~"A" is the ampere (electric current), outside the dimensions scaleplan uses (M, L, T, Θ) at column 1`, 1},
		{"mA", `~"mA" is a multiple of the ampere`, 1},
		{"kg/mol", `~"mol" is the mole (amount of substance)`, 4},
		{"cd", `~candela`, 1},
		{"V", `~volt`, 1},
		{"W/(m^2*sr)*A", `~unknown symbol "sr"`, 8},
		{"T", `~for tonnes write t`, 1},
		{"S", `~for seconds write s`, 1},
		{"Ω", `~ohm`, 1},
	}
	for _, tc := range tests {
		_, err := ParseUnit(tc.unit)
		if err == nil {
			t.Errorf("ParseUnit(%q) succeeded, want error %s", tc.unit, tc.want)
			continue
		}
		msg := err.Error()
		if frag, ok := strings.CutPrefix(tc.want, "~"); ok {
			if !strings.Contains(msg, frag) {
				t.Errorf("ParseUnit(%q) error %q, want it to contain %q", tc.unit, msg, frag)
			}
		} else if msg != tc.want {
			t.Errorf("ParseUnit(%q) error\n got %q\nwant %q", tc.unit, msg, tc.want)
		}
		var ue *UnitError
		if !errors.As(err, &ue) {
			t.Errorf("ParseUnit(%q) error is %T, want *UnitError", tc.unit, err)
			continue
		}
		if tc.col != 0 && ue.Column != tc.col {
			t.Errorf("ParseUnit(%q) column %d, want %d (%s)", tc.unit, ue.Column, tc.col, msg)
		}
	}
	if _, err := ParseUnit("  "); err == nil {
		t.Error("ParseUnit of blanks succeeded")
	}
	long := strings.Repeat("m*", 100) + "m" // 201 runes
	if _, err := ParseUnit(long); err == nil || !strings.Contains(err.Error(), "too long (201 characters, at most 200)") {
		t.Errorf("ParseUnit(201 runes) error %v", err)
	}
	ok := strings.Repeat("m*", 99) + "mm" // 200 runes
	if _, err := ParseUnit(ok); err != nil {
		t.Errorf("ParseUnit(200 runes): %v", err)
	}
	deep := strings.Repeat("(", 40) + "m" + strings.Repeat(")", 40)
	if _, err := ParseUnit(deep); err == nil || !strings.Contains(err.Error(), "nested too deep") {
		t.Errorf("ParseUnit(deep) error %v", err)
	}
}

// TestUnitAdversarial: inputs that could overflow exponents or factors, or
// that are not valid UTF-8, give errors (never panics). Found by reading
// the code and by FuzzParseUnit runs.
func TestUnitAdversarial(t *testing.T) {
	tests := []struct{ in, want string }{
		{"((((m^(1/997))^(1/991))^(1/983))^(1/977))", "exponent of L grows too large"},
		{"((m^(1/997))*(m^(1/991)))*(m^(1/983))", "exponent of L grows too large"},
		{"(slug^1000)/(slug^1000)", "conversion factor out of range"},
		{"Ym^1000/Ym^1000", "conversion factor out of range"},
		{"ym^9", "conversion factor 1e-216 is out of range"},
		{"m^(1e100000)", "too large"},
		{"\xff\xfe", "unexpected \"\ufffd\" at column 1"},
		{"m\xff", "at column 2"},
		{"(m^(999/1000))^(999/1000)^2", "a second power"},
		{"°C°C", "did you mean °C*°C?"},
		{"1.5/s", `number "1.5" inside a unit`},
	}
	for _, tc := range tests {
		_, err := ParseUnit(tc.in)
		if err == nil || !strings.Contains(err.Error(), tc.want) {
			t.Errorf("ParseUnit(%q) error %v, want %q", tc.in, err, tc.want)
		}
	}
	for _, in := range []string{"m^-0", "m^+2", "m^.5", "m^(-.5)", "1^2", "00001/s", "/s"} {
		if _, err := ParseUnit(in); err != nil {
			t.Errorf("ParseUnit(%q): %v", in, err)
		}
	}
}

func TestParseValue(t *testing.T) {
	tests := []struct {
		in   string
		si   float64
		unit string
	}{
		{"25", 25, ""},                                // bare number: already SI
		{"25 kn", 25 * 1852.0 / 3600, "kn"},           // NIST SP 811: knot = 1852/3600 m/s
		{"20C", 293.15, "C"},                          // NIST SP 811 B.8: T/K = t/°C + 273.15
		{"20 °C", 293.15, "°C"},                       // same
		{"20 ° C", 293.15, "° C"},                     // same, with a space after °
		{"68 °F", (68 + 459.67) / 1.8, "°F"},          // NIST SP 811 B.8: T/K = (t/°F + 459.67)/1.8
		{"3bar", 3e5, "bar"},                          // NIST SP 811: bar = 1E+05 Pa
		{"1.2e-6 m2/s", 1.2e-6, "m2/s"},               // SI
		{"35g/kg", 0.035, "g/kg"},                     // SI
		{"-3 bar", -3e5, "bar"},                       // NIST SP 811: bar = 1E+05 Pa
		{"+3 bar", 3e5, "bar"},                        // explicit plus
		{"−3 bar", -3e5, "bar"},                       // U+2212 minus sign
		{".5 m", 0.5, "m"},                            // no leading digit
		{"5. m", 5, "m"},                              // no trailing digit
		{"1e3m", 1e3, "m"},                            // exponent then unit
		{"2E3 Pa", 2e3, "Pa"},                         // capital E
		{"2 Em", 2e18, "Em"},                          // exametre: "E" not followed by a digit is not an exponent
		{"5%", 0.05, "%"},                             // per cent
		{"14.7 psi", 14.7 * 6894.757293168361, "psi"}, // NIST SP 811 B.8: psi = 6.894 757 E+03 Pa
		{"1 atm", 101325, "atm"},                      // NIST SP 811 B.8: atm = 1.013 25 E+05 Pa
		{"30 deg", math.Pi / 6, "deg"},                // NIST SP 811: 1° = π/180 rad
		{"1000 kg/m^3", 1000, "kg/m^3"},               // SI
		{"1 cSt", 1e-6, "cSt"},                        // NIST SP 811 B.8: centistokes = 1.0 E-06 m²/s
		{"120 rpm", 2, "rpm"},                         // 1 rpm = 1/60 Hz (revolutions counted)
	}
	for _, tc := range tests {
		v, u, err := ParseValue(tc.in)
		if err != nil {
			t.Errorf("ParseValue(%q): %v", tc.in, err)
			continue
		}
		if !relClose(v, tc.si, 1e-14) {
			t.Errorf("ParseValue(%q) = %.17g, want %.17g", tc.in, v, tc.si)
		}
		if u.Text != tc.unit {
			t.Errorf("ParseValue(%q) unit text %q, want %q", tc.in, u.Text, tc.unit)
		}
		if tc.unit == "" && (u.Factor != 1 || u.Offset != 0 || !u.Dim.IsDimensionless()) {
			t.Errorf("ParseValue(%q) unit %+v, want dimensionless Unit{Factor:1}", tc.in, u)
		}
	}
	errs := []struct{ in, want string }{
		{"", "empty value"},
		{"inf", `value "inf" is not a finite number`},
		{"-Inf m", `value "-Inf m" is not a finite number`},
		{"NaN", `value "NaN" is not a finite number`},
		{"+infinity", "not a finite number"},
		{"1e400", `value "1e400": number 1e400 is out of range`},
		{"1e200 Ym^5", "out of range"},
		{"kn", `value "kn": expected a number at column 1`},
		{"-", `value "-": expected a number at column 2`},
		{"1,5 m", "write the decimal separator as a point"},
		{"20 kg/mx", `unit "kg/mx": unknown symbol "mx" at column 4 (did you mean m?)`},
		{"3 mA", "ampere"},
		{strings.Repeat("1", 300), "too long"},
	}
	for _, tc := range errs {
		_, _, err := ParseValue(tc.in)
		if err == nil || !strings.Contains(err.Error(), tc.want) {
			t.Errorf("ParseValue(%q) error %v, want %q", tc.in, err, tc.want)
		}
	}
}

func TestParseValueFor(t *testing.T) {
	tests := []struct {
		in, quantity string
		want         float64
	}{
		{"3 kN", "force", 3000},
		{"3", "force", 3},                // bare number is SI
		{"20 °C", "temperature", 293.15}, // NIST SP 811 B.8
		{"293.15 K", "temperature", 293.15},
		{"5 %", "strain", 0.05},
		{"0.6", "friction", 0.6},
		{"1 cSt", "kinematic_viscosity", 1e-6}, // NIST SP 811 B.8 (from memory)
		{"1e-3 Pa*s", "viscosity", 1e-3},
		{"1025 kg/m3", "density", 1025},
		{"9.81 m/s^2", "gravity", 9.81},
		{"0.0728 N/m", "surface_tension", 0.0728},
		{"200 GPa", "modulus", 2e11},
		{"2 Hz", "frequency", 2},
		{"1 h", "time", 3600},
		{"10 kN*m", "moment", 1e4},
		{"1 kN/mm", "stiffness", 1e6},
		{"1 N*m^2", "flexural_rigidity", 1},
	}
	for _, tc := range tests {
		got, err := ParseValueFor(tc.in, tc.quantity)
		if err != nil {
			t.Errorf("ParseValueFor(%q, %q): %v", tc.in, tc.quantity, err)
			continue
		}
		if !relClose(got, tc.want, 1e-14) {
			t.Errorf("ParseValueFor(%q, %q) = %.17g, want %.17g", tc.in, tc.quantity, got, tc.want)
		}
	}
	errs := []struct{ in, quantity, want string }{
		{"3 m/s", "force", `unit "m/s" does not fit force (needs M L T^-2, got L T^-1)`},
		{"20 °C", "velocity", `unit "°C" does not fit velocity (needs L T^-1, got Θ)`},
		{"5 %", "length", `unit "%" does not fit length (needs L, got 1)`},
		{"3 m", "forse", `unknown quantity "forse" (did you mean force?)`},
		{"x m", "force", "expected a number"},
	}
	for _, tc := range errs {
		_, err := ParseValueFor(tc.in, tc.quantity)
		if err == nil || err.Error() != tc.want && !strings.Contains(err.Error(), tc.want) {
			t.Errorf("ParseValueFor(%q, %q) error %v, want %q", tc.in, tc.quantity, err, tc.want)
		}
	}
}

// TestUnitRoundTrip: FromSI inverts ToSI, and ParseValue then FromSI
// gives back the number typed.
func TestUnitRoundTrip(t *testing.T) {
	units := []string{"m", "km", "ft", "kn", "°C", "°F", "C", "F", "K", "bar", "psi", "kg/m^3",
		"m2/s", "cSt", "rpm", "deg", "%", "lbf*ft", "J/(kg*°C)", "ksi", "µm", "m^(1/2)"}
	values := []float64{0, 1, -1, 20, -40, 273.15, 1e-9, 1e9, 3.14159, -459.67}
	for _, us := range units {
		u, err := ParseUnit(us)
		if err != nil {
			t.Fatalf("ParseUnit(%q): %v", us, err)
		}
		for _, x := range values {
			if got := u.FromSI(u.ToSI(x)); !closeAbsRel(got, x, u) {
				t.Errorf("%s: FromSI(ToSI(%g)) = %.17g", us, x, got)
			}
			if got := u.ToSI(u.FromSI(x)); !closeAbsRel(got, x, u) {
				t.Errorf("%s: ToSI(FromSI(%g)) = %.17g", us, x, got)
			}
		}
		v, _, err := ParseValue("12.5 " + us)
		if err != nil {
			t.Fatalf("ParseValue(12.5 %s): %v", us, err)
		}
		if back := u.FromSI(v); !closeAbsRel(back, 12.5, u) {
			t.Errorf("12.5 %s → %g SI → %.17g", us, v, back)
		}
	}
}

// closeAbsRel compares round-trip results: the offset of a temperature
// scale costs a few ulps of the offset itself.
func closeAbsRel(got, want float64, u Unit) bool {
	scale := math.Max(math.Abs(want), math.Abs(u.Offset/u.Factor))
	return math.Abs(got-want) <= 1e-13*scale+1e-300
}

// TestUnitFilesGofmt checks that the unit files are gofmt-clean (go vet is
// run by the developer and CI; see the report).
func TestUnitFilesGofmt(t *testing.T) {
	for _, name := range []string{"unit.go", "unit_test.go", "unit_fuzz_test.go", "unit_example_test.go"} {
		src, err := os.ReadFile(name)
		if err != nil {
			t.Fatal(err)
		}
		out, err := format.Source(src)
		if err != nil {
			t.Fatalf("%s: %v", name, err)
		}
		if string(out) != string(src) {
			t.Errorf("%s is not gofmt-clean", name)
		}
	}
}

// TestShorten: user text quoted in an error is cut to n characters (not
// bytes) and an ellipsis.
func TestShorten(t *testing.T) {
	for _, c := range []struct {
		s    string
		n    int
		want string
	}{{"short", 40, "short"}, {"abcdef", 3, "abc…"}, {"ééééé", 2, "éé…"}, {"abc", 3, "abc"}} {
		if got := shorten(c.s, c.n); got != c.want {
			t.Errorf("shorten(%q, %d) = %q, want %q", c.s, c.n, got, c.want)
		}
	}
}
