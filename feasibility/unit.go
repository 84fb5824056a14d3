package feasibility

// Units of user inputs.
//
// Every number a user gives may carry a unit (spec §2). ParseUnit reads the
// unit, ParseValue a number with an optional unit, ParseValueFor also checks
// the unit against a quantity's dimension. Internally everything is SI.
//
// Grammar (informal):
//
//	unit   = ["/"] term { op term }     left associative: m/s/s = m·s^-2; "/s" = 1/s
//	op     = "*" | "·" | "⋅" | "×" | "." | "/" | spaces | "-" before a letter (N-m)
//	term   = factor [ power ]
//	factor = symbol | "(" unit ")" | "1"   ("1/s")
//	power  = "^" exp | "**" exp | digits after a symbol (m2, s-1) | superscripts (m², s⁻¹)
//	exp    = integer | decimal | "(" rational ")"   (^-1, ^0.5, ^(1/2))
//
// A prefix binds to its symbol before the power, as in SI: cm^3 = (0.01 m)^3.
//
// Symbol resolution, and how ambiguities are settled:
//
//   - An exact symbol always wins over prefix + symbol. So "d" is the day,
//     "h" the hour, "min" the minute, "ft" the foot, "kt" the knot, "Pa" the
//     pascal, "mi" the mile, "nmi" the nautical mile. The deci and hecto
//     prefixes only exist attached to a prefixable symbol: "dm", "dL", "hPa".
//   - "kt" is the knot (sailors' spelling), never a kilotonne; "Mt" is a
//     megatonne.
//   - "ms" is the millisecond; the metre-second is written "m*s" or "m s".
//   - Juxtaposition needs a separator: "Nm" is refused (did you mean N*m?).
//   - "C" and "°C"/"degC" are degrees Celsius (there is no coulomb: electric
//     units play no part in model tests); "F", "°F", "degF" are degrees
//     Fahrenheit (there is no farad).
//   - rpm is one revolution per minute, counting the revolution as
//     dimensionless: 1 rpm = 1/60 Hz (dimension T^-1), not 2π/60 rad/s. A
//     frequency given in rpm therefore converts to revolutions per second.
//   - Angles are dimensionless: rad = 1, deg = ° = π/180.
//   - "°" standing alone is the degree of angle; "° C" (with a space) is
//     read as "°C".
//
// Temperature scales. °C and °F have an offset: value_SI = Factor*value +
// Offset. The offset only applies when the unit is the temperature symbol
// alone (possibly in parentheses). Inside any compound or under any power,
// ("J/(kg*°C)", "1/°F", "°C/s", "°C^1") the symbol is a temperature
// DIFFERENCE and only its factor is used: °C = 1 K, °F = 5/9 K. This is the
// reading every property table intends for a specific heat or an expansion
// coefficient; an absolute temperature in a compound has no meaning.
//
// Dimensions outside M, L, T, Θ (ampere, mole, candela and everything
// derived from them: V, Ω, S, H, T, Wb, lm, lx, ...) are refused with a
// message naming the unit. Inputs are bounded (200 runes, exponents through
// ParseRat, exponents of the result, factors within 1e±200), so no input
// makes the parser panic or produce an infinite or zero factor.

import (
	"errors"
	"fmt"
	"math"
	"strconv"
	"strings"
	"unicode/utf8"
)

// Unit is a parsed unit: value_SI = Factor*value + Offset (Offset non-zero only for °C and °F standing alone).
type Unit struct {
	Text   string // the text as typed, trimmed
	Factor float64
	Offset float64
	Dim    Dimension
}

// ToSI converts a value in the unit to SI.
func (u Unit) ToSI(v float64) float64 { return u.Factor*v + u.Offset }

// FromSI converts an SI value to the unit.
func (u Unit) FromSI(v float64) float64 { return (v - u.Offset) / u.Factor }

// UnitError is the error of ParseUnit (and of the unit part of ParseValue).
// Column is the 1-based rune position in Text the error points at, 0 when
// the error concerns the whole text.
type UnitError struct {
	Text   string
	Column int
	Msg    string // the message after `unit "Text": `, column included
}

func (e *UnitError) Error() string { return fmt.Sprintf("unit %q: %s", e.Text, e.Msg) }

const (
	maxUnitRunes  = 200   // longest unit accepted
	maxValueRunes = 256   // longest value (number and unit) accepted
	maxParenDepth = 32    // deepest parenthesis nesting accepted
	maxDimPart    = 10000 // bound on numerator and denominator of a resulting dimension exponent
	maxDecade     = 400   // bound on the power of ten carried while parsing
	minFactor     = 1e-200
	maxFactor     = 1e200
)

// unitDef is one symbol of the table. Its factor is mant·10^decade; a
// prefixable symbol adds the prefix's decade, so "kg", "mL" and "mbar" are
// exact powers of ten.
type unitDef struct {
	mant       float64
	decade     int
	dim        Dimension
	prefixable bool
	offset     float64 // for a temperature scale standing alone
}

var (
	dimNone = Dimension{}
	dimM    = Dim(1, 0, 0, 0)
	dimL    = Dim(0, 1, 0, 0)
	dimT    = Dim(0, 0, 1, 0)
	dimTh   = Dim(0, 0, 0, 1)
)

// Exact definitions of the customary units (NIST SP 811, 2008, App. B;
// the international foot, inch, pound and the standard acceleration of
// gravity are exact, the others follow from them).
const (
	footM      = 0.3048
	inchM      = 0.0254
	poundKg    = 0.45359237
	gravityStd = 9.80665
	poundForce = poundKg * gravityStd // 4.4482216152605 N
)

var unitTable = map[string]unitDef{
	// SI and SI-accepted, prefixable.
	"m":   {1, 0, dimL, true, 0},
	"g":   {1, -3, dimM, true, 0},
	"s":   {1, 0, dimT, true, 0},
	"K":   {1, 0, dimTh, true, 0},
	"N":   {1, 0, Dim(1, 1, -2, 0), true, 0},
	"Pa":  {1, 0, Dim(1, -1, -2, 0), true, 0},
	"J":   {1, 0, Dim(1, 2, -2, 0), true, 0},
	"W":   {1, 0, Dim(1, 2, -3, 0), true, 0},
	"Hz":  {1, 0, Dim(0, 0, -1, 0), true, 0},
	"L":   {1, -3, Dim(0, 3, 0, 0), true, 0},
	"l":   {1, -3, Dim(0, 3, 0, 0), true, 0},
	"t":   {1, 3, dimM, true, 0},
	"bar": {1, 5, Dim(1, -1, -2, 0), true, 0},
	"rad": {1, 0, dimNone, true, 0},
	"St":  {1, -4, Dim(0, 2, -1, 0), true, 0},  // stokes (cSt)
	"P":   {1, -1, Dim(1, -1, -1, 0), true, 0}, // poise (cP)

	// Not prefixable.
	"min":  {60, 0, dimT, false, 0},
	"h":    {3600, 0, dimT, false, 0},
	"hr":   {3600, 0, dimT, false, 0},
	"d":    {86400, 0, dimT, false, 0},
	"day":  {86400, 0, dimT, false, 0},
	"rpm":  {1.0 / 60, 0, Dim(0, 0, -1, 0), false, 0},
	"deg":  {math.Pi / 180, 0, dimNone, false, 0},
	"°":    {math.Pi / 180, 0, dimNone, false, 0},
	"%":    {1, -2, dimNone, false, 0},
	"‰":    {1, -3, dimNone, false, 0},
	"atm":  {101325, 0, Dim(1, -1, -2, 0), false, 0},
	"ft":   {footM, 0, dimL, false, 0},
	"in":   {inchM, 0, dimL, false, 0},
	"yd":   {3 * footM, 0, dimL, false, 0},
	"mi":   {5280 * footM, 0, dimL, false, 0},
	"nmi":  {1852, 0, dimL, false, 0},
	"kn":   {1852.0 / 3600, 0, Dim(0, 1, -1, 0), false, 0},
	"kt":   {1852.0 / 3600, 0, Dim(0, 1, -1, 0), false, 0},
	"kts":  {1852.0 / 3600, 0, Dim(0, 1, -1, 0), false, 0},
	"mph":  {5280 * footM / 3600, 0, Dim(0, 1, -1, 0), false, 0},
	"lbf":  {poundForce, 0, Dim(1, 1, -2, 0), false, 0},
	"lb":   {poundKg, 0, dimM, false, 0},
	"lbm":  {poundKg, 0, dimM, false, 0},
	"lbs":  {poundKg, 0, dimM, false, 0},
	"slug": {poundForce / footM, 0, dimM, false, 0},
	"kip":  {poundForce, 3, Dim(1, 1, -2, 0), false, 0},
	"psi":  {poundForce / (inchM * inchM), 0, Dim(1, -1, -2, 0), false, 0},
	"ksi":  {poundForce / (inchM * inchM), 3, Dim(1, -1, -2, 0), false, 0},
	"°C":   {1, 0, dimTh, false, 273.15},
	"degC": {1, 0, dimTh, false, 273.15},
	"C":    {1, 0, dimTh, false, 273.15},
	"℃":    {1, 0, dimTh, false, 273.15},
	"°F":   {1 / 1.8, 0, dimTh, false, 459.67 / 1.8},
	"degF": {1 / 1.8, 0, dimTh, false, 459.67 / 1.8},
	"F":    {1 / 1.8, 0, dimTh, false, 459.67 / 1.8},
	"℉":    {1 / 1.8, 0, dimTh, false, 459.67 / 1.8},

	// The knot spelled out, as people type it ("12 knots").
	"knot":  {1852.0 / 3600, 0, Dim(0, 1, -1, 0), false, 0},
	"knots": {1852.0 / 3600, 0, Dim(0, 1, -1, 0), false, 0},
}

// knownUnits is the list suggestions are drawn from, most common first (on
// a tie the earlier one is suggested).
var knownUnits = []string{
	"m", "s", "kg", "g", "K", "N", "Pa", "J", "W", "Hz", "L", "t", "bar",
	"mm", "cm", "km", "kN", "kPa", "MPa", "GPa", "kJ", "kW", "MW", "ms", "mL", "kHz",
	"min", "h", "d", "rpm", "deg", "°", "rad", "%", "‰", "atm",
	"ft", "in", "yd", "mi", "nmi", "kn", "kt", "mph", "lbf", "lb", "lbm", "slug",
	"psi", "ksi", "°C", "degC", "°F", "degF", "cSt", "cP",
}

// siPrefixes are tried in this order ("da" before "d").
var siPrefixes = []struct {
	sym    string
	decade int
}{
	{"da", 1}, {"Y", 24}, {"Z", 21}, {"E", 18}, {"P", 15}, {"T", 12}, {"G", 9}, {"M", 6},
	{"k", 3}, {"h", 2}, {"d", -1}, {"c", -2}, {"m", -3},
	{"\u00b5", -6}, {"\u03bc", -6}, {"u", -6}, // micro sign, Greek mu, ASCII u
	{"n", -9}, {"p", -12}, {"f", -15}, {"a", -18}, {"z", -21}, {"y", -24},
}

// refusedUnits are units of dimensions scaleplan does not use.
var refusedUnits = map[string]string{
	"A":      "ampere (electric current)",
	"mol":    "mole (amount of substance)",
	"cd":     "candela (luminous intensity)",
	"V":      "volt (electric potential)",
	"\u03a9": "ohm (electric resistance)", // Greek capital omega
	"\u2126": "ohm (electric resistance)", // ohm sign
	"ohm":    "ohm (electric resistance)",
	"S":      "siemens (electric conductance; for seconds write s)",
	"H":      "henry (inductance; for hours write h)",
	"T":      "tesla (magnetic flux density; for tonnes write t)",
	"Wb":     "weber (magnetic flux)",
	"lm":     "lumen (luminous flux)",
	"lx":     "lux (illuminance)",
	"kat":    "katal (catalytic activity)",
	"Bq":     "becquerel (radioactivity)",
	"Gy":     "gray (absorbed dose)",
	"Sv":     "sievert (dose equivalent)",
	"Ah":     "ampere-hour (electric charge)",
}

// ParseValue reads a number with an optional unit: "25", "25 kn", "20C", "20 °C", "3bar", "1.2e-6 m2/s", "35g/kg", "-3 bar". Returns the SI value and the unit (dimensionless Unit{Factor:1} when absent).
func ParseValue(s string) (float64, Unit, error) {
	text := strings.TrimSpace(s)
	if text == "" {
		return 0, Unit{}, errors.New("empty value")
	}
	if n := utf8.RuneCountInString(text); n > maxValueRunes {
		return 0, Unit{}, fmt.Errorf("value %q is too long (%d characters, at most %d)", shorten(text, 40), n, maxValueRunes)
	}
	i := 0
	neg := false
	if strings.HasPrefix(text, "−") { // U+2212 minus sign
		neg = true
		i = len("−")
	} else if text[0] == '-' || text[0] == '+' {
		neg = text[0] == '-'
		i = 1
	}
	body := text[i:]
	if low := strings.ToLower(body); strings.HasPrefix(low, "inf") || strings.HasPrefix(low, "nan") {
		return 0, Unit{}, fmt.Errorf("value %q is not a finite number", text)
	}
	j := 0
	digits := 0
	for j < len(body) && isDigit(rune(body[j])) {
		j++
		digits++
	}
	if j < len(body) && body[j] == '.' {
		j++
		for j < len(body) && isDigit(rune(body[j])) {
			j++
			digits++
		}
	}
	if digits == 0 {
		return 0, Unit{}, fmt.Errorf("value %q: expected a number at column %d", text, utf8.RuneCountInString(text[:i])+1)
	}
	if j < len(body) && (body[j] == 'e' || body[j] == 'E') {
		k := j + 1
		if k < len(body) && (body[k] == '+' || body[k] == '-') {
			k++
		}
		if k < len(body) && isDigit(rune(body[k])) {
			for k < len(body) && isDigit(rune(body[k])) {
				k++
			}
			j = k
		}
	}
	num := body[:j]
	v, err := strconv.ParseFloat(num, 64)
	if err != nil || math.IsInf(v, 0) || math.IsNaN(v) {
		return 0, Unit{}, fmt.Errorf("value %q: number %s is out of range", text, num)
	}
	if neg {
		v = -v
	}
	rest := body[j:]
	if len(rest) >= 2 && rest[0] == ',' && isDigit(rune(rest[1])) {
		return 0, Unit{}, fmt.Errorf("value %q: write the decimal separator as a point (%s.%s…)", text, num, rest[1:2])
	}
	rest = strings.TrimSpace(rest)
	if rest == "" {
		return v, Unit{Factor: 1}, nil
	}
	u, err := ParseUnit(rest)
	if err != nil {
		return 0, Unit{}, err
	}
	si := u.ToSI(v)
	if math.IsInf(si, 0) || math.IsNaN(si) {
		return 0, Unit{}, fmt.Errorf("value %q is out of range in SI", text)
	}
	return si, u, nil
}

// ParseValueFor reads a value and checks its unit against a quantity's dimension: an error like `unit "m/s" does not fit force (needs M L T^-2, got L T^-1)`. A bare number is taken as already SI.
func ParseValueFor(s string, quantity string) (float64, error) {
	q, err := LookupQuantity(quantity)
	if err != nil {
		return 0, err
	}
	v, u, err := ParseValue(s)
	if err != nil {
		return 0, err
	}
	if u.Text == "" {
		return v, nil
	}
	if !u.Dim.Equal(q.Dim) {
		return 0, fmt.Errorf("unit %q does not fit %s (needs %s, got %s)", u.Text, q.Name, q.Dim, u.Dim)
	}
	return v, nil
}
