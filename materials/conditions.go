package materials

import (
	"fmt"
	"math"
	"strings"

	"scaleplan/feasibility"
)

// Condition names a state variable an entry's properties may depend on.
type Condition string

// The conditions, in the order they are printed.
const (
	Temperature  Condition = "temperature"   // K
	Pressure     Condition = "pressure"      // Pa, absolute
	Salinity     Condition = "salinity"      // kg of salt per kg of seawater (or of brine)
	MassFraction Condition = "mass_fraction" // kg of glycerol per kg of mixture
)

// AllConditions returns every condition in printing order.
func AllConditions() []Condition {
	return []Condition{Temperature, Pressure, Salinity, MassFraction}
}

// Conditions is the state at which properties are wanted, in SI. A
// condition not given (its Has flag false) takes the entry's default.
type Conditions struct {
	Temperature  float64 // K
	Pressure     float64 // Pa, absolute
	Salinity     float64 // kg/kg (35 g/kg = 0.035)
	MassFraction float64 // glycerol mass fraction, 0–1

	HasTemperature, HasPressure, HasSalinity, HasMassFraction bool
}

// Get returns the value of a condition and whether it is given.
func (c Conditions) Get(k Condition) (float64, bool) {
	switch k {
	case Temperature:
		return c.Temperature, c.HasTemperature
	case Pressure:
		return c.Pressure, c.HasPressure
	case Salinity:
		return c.Salinity, c.HasSalinity
	case MassFraction:
		return c.MassFraction, c.HasMassFraction
	}
	return 0, false
}

// With returns a copy of the conditions with one condition given.
func (c Conditions) With(k Condition, v float64) Conditions {
	switch k {
	case Temperature:
		c.Temperature, c.HasTemperature = v, true
	case Pressure:
		c.Pressure, c.HasPressure = v, true
	case Salinity:
		c.Salinity, c.HasSalinity = v, true
	case MassFraction:
		c.MassFraction, c.HasMassFraction = v, true
	}
	return c
}

// Without returns a copy of the conditions with one condition removed.
func (c Conditions) Without(k Condition) Conditions {
	switch k {
	case Temperature:
		c.Temperature, c.HasTemperature = 0, false
	case Pressure:
		c.Pressure, c.HasPressure = 0, false
	case Salinity:
		c.Salinity, c.HasSalinity = 0, false
	case MassFraction:
		c.MassFraction, c.HasMassFraction = 0, false
	}
	return c
}

// Given lists the conditions that are given, in printing order.
func (c Conditions) Given() []Condition {
	var out []Condition
	for _, k := range AllConditions() {
		if _, ok := c.Get(k); ok {
			out = append(out, k)
		}
	}
	return out
}

// String prints the given conditions in the units people use, e.g.
// "20 °C, 101.325 kPa, 35 g/kg"; no conditions print as "".
func (c Conditions) String() string {
	var parts []string
	for _, k := range c.Given() {
		v, _ := c.Get(k)
		parts = append(parts, FormatCondition(k, v))
	}
	return strings.Join(parts, ", ")
}

// FormatCondition prints one condition value (SI) in the unit people use:
// temperature in °C, pressure in kPa or MPa, salinity in g/kg, the mass
// fraction as w = 0.5.
func FormatCondition(k Condition, v float64) string {
	switch k {
	case Temperature:
		return fmt.Sprintf("%s °C", num(v-273.15))
	case Pressure:
		if math.Abs(v) >= 1e6 {
			return fmt.Sprintf("%s MPa", num(v/1e6))
		}
		return fmt.Sprintf("%s kPa", num(v/1e3))
	case Salinity:
		return fmt.Sprintf("%s g/kg", num(v*1e3))
	case MassFraction:
		return fmt.Sprintf("w = %s", num(v))
	}
	return num(v)
}

// FormatRange prints the range of a condition, e.g. "0–40 °C" (a mass
// fraction as "0–1").
func FormatRange(k Condition, lo, hi float64) string {
	a, b := FormatCondition(k, lo), FormatCondition(k, hi)
	if k == MassFraction {
		return fmt.Sprintf("%s–%s", num(lo), num(hi))
	}
	// "0 °C" and "40 °C" share the unit: print it once.
	if i := strings.LastIndexByte(a, ' '); i > 0 && strings.HasSuffix(b, a[i:]) {
		if strings.HasPrefix(a, "-") {
			return a[:i] + " to " + b // "-20 to 120 °C", not "-20–120 °C"
		}
		return a[:i] + "–" + b
	}
	return a + " – " + b
}

// num prints a number with up to 6 significant digits, without float noise.
func num(v float64) string {
	if math.Abs(v) < 1e-9 {
		v = 0
	}
	return fmt.Sprintf("%.6g", v)
}

// ParseConditions reads conditions written as comma-separated parts, each a
// value with a unit or a KEY=VALUE pair:
//
//	20C   293.15K   68F         temperature (any temperature unit)
//	3bar  101325Pa  14.7psi     pressure, absolute (any pressure unit)
//	35g/kg  35‰                 salinity (a dimensionless unit of 1e-3)
//	50%                         glycerol mass fraction (a dimensionless unit of 1e-2)
//	T=20C  p=3bar  S=35  w=0.5  the same with keys
//
// Keys (case-insensitive): T, temp, temperature; p, pressure; S, salinity;
// w, mass_fraction, glycerol. With a key, a bare salinity number is read in
// g/kg (S=35), and a bare salinity between 0 and 1 (S=0.035, a fraction
// written without its unit) is refused with the ways to write it; a bare
// mass fraction is a fraction (w=0.5); temperature
// and pressure always need a unit. Salinity and mass fraction are told apart
// by their unit without a key: g/kg and ‰ mean salinity, % means the
// glycerol mass fraction; any other dimensionless value needs its key.
// An empty string gives no conditions (every entry takes its defaults).
func ParseConditions(s string) (Conditions, error) {
	var c Conditions
	text := strings.TrimSpace(s)
	if text == "" {
		return c, nil
	}
	parts := strings.FieldsFunc(text, func(r rune) bool { return r == ',' || r == ';' })
	for _, part := range parts {
		part = strings.TrimSpace(part)
		k, v, err := parseCondition(part)
		if err != nil {
			if len(parts) > 1 {
				return Conditions{}, fmt.Errorf("conditions %q, part %q: %v", text, part, err)
			}
			return Conditions{}, fmt.Errorf("conditions %q: %v", text, err)
		}
		if _, dup := c.Get(k); dup {
			return Conditions{}, fmt.Errorf("conditions %q: %s is given twice", text, k)
		}
		c = c.With(k, v)
	}
	if strings.Count(text, ",")+strings.Count(text, ";")+1 != len(c.Given()) {
		return Conditions{}, fmt.Errorf("conditions %q: an empty part between separators", text)
	}
	return c, nil
}

// conditionKey reads the key of a KEY=VALUE part.
func conditionKey(key string) (Condition, bool) {
	switch strings.ToLower(strings.TrimSpace(key)) {
	case "t", "temp", "temperature":
		return Temperature, true
	case "p", "pressure":
		return Pressure, true
	case "s", "sal", "salinity":
		return Salinity, true
	case "w", "mass_fraction", "glycerol":
		return MassFraction, true
	}
	return "", false
}

func dimTemperature() feasibility.Dimension { return feasibility.Dim(0, 0, 0, 1) }
func dimPressure() feasibility.Dimension    { return feasibility.Dim(1, -1, -2, 0) }

// parseCondition reads one part of a conditions string.
func parseCondition(part string) (Condition, float64, error) {
	if part == "" {
		return "", 0, fmt.Errorf("an empty part between separators")
	}
	key, val, keyed := strings.Cut(part, "=")
	if keyed {
		k, ok := conditionKey(key)
		if !ok {
			return "", 0, fmt.Errorf("unknown condition %q (use T, p, S or w)", strings.TrimSpace(key))
		}
		v, u, err := feasibility.ParseValue(val)
		if err != nil {
			return "", 0, err
		}
		bare := u.Text == ""
		switch {
		case k == Temperature && (bare || !u.Dim.Equal(dimTemperature())):
			return "", 0, fmt.Errorf("give the temperature with its unit, e.g. T=20C or T=293.15K")
		case k == Pressure && (bare || !u.Dim.Equal(dimPressure())):
			return "", 0, fmt.Errorf("give the absolute pressure with its unit, e.g. p=3bar or p=101325Pa")
		case (k == Salinity || k == MassFraction) && !u.Dim.IsDimensionless():
			return "", 0, fmt.Errorf("%s is dimensionless (unit %q is not)", k, u.Text)
		case k == Salinity && bare && v > 0 && v < 1:
			// S=0.035 is a fraction written without its unit, not 0.035 g/kg.
			return "", 0, fmt.Errorf("salinity S=%s: a bare salinity is read in g/kg, and %s g/kg is fresh water; for a fraction write S=%s%% or S=%sg/kg (or S=%sg/kg if you do mean grams per kilogram)",
				num(v), num(v), num(v*100), num(v*1000), num(v))
		case k == Salinity && bare:
			v *= 1e-3 // S=35 means 35 g/kg
		}
		return k, v, checkCondition(k, v)
	}
	v, u, err := feasibility.ParseValue(part)
	if err != nil {
		return "", 0, err
	}
	var k Condition
	switch {
	case u.Text == "":
		return "", 0, fmt.Errorf("a bare number is ambiguous; give a unit (20C, 3bar, 35g/kg, 50%%) or a key (T=, p=, S=, w=)")
	case u.Dim.Equal(dimTemperature()):
		k = Temperature
	case u.Dim.Equal(dimPressure()):
		k = Pressure
	case u.Dim.IsDimensionless() && sameValue(u.Factor, 1e-3):
		k = Salinity
	case u.Dim.IsDimensionless() && sameValue(u.Factor, 1e-2):
		k = MassFraction
	case u.Dim.IsDimensionless():
		return "", 0, fmt.Errorf("say which fraction it is: S=%s for salinity or w=%s for the glycerol mass fraction", part, part)
	default:
		return "", 0, fmt.Errorf("unit %q (%s) is not a condition; conditions are a temperature, a pressure, a salinity (g/kg) or a glycerol mass fraction (%%)", u.Text, u.Dim)
	}
	return k, v, checkCondition(k, v)
}

// checkCondition refuses values that no entry could take.
func checkCondition(k Condition, v float64) error {
	switch k {
	case Temperature:
		if v <= 0 {
			return fmt.Errorf("temperature %s is not above absolute zero", FormatCondition(k, v))
		}
	case Pressure:
		if v <= 0 {
			return fmt.Errorf("pressure %s is not positive (give the absolute pressure)", FormatCondition(k, v))
		}
	case Salinity:
		if v < 0 || v >= 1 {
			return fmt.Errorf("salinity %s is outside 0–1000 g/kg", FormatCondition(k, v))
		}
	case MassFraction:
		if v < 0 || v > 1 {
			if v > 1 && v <= 100 {
				return fmt.Errorf("mass fraction %s is outside 0–1 (for %s %% write w=%s or w=%s%%)", num(v), num(v), num(v/100), num(v))
			}
			return fmt.Errorf("mass fraction %s is outside 0–1", num(v))
		}
	}
	return nil
}
