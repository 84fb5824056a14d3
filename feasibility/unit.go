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
	"unicode"
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

// uval is a partial result of the parser.
type uval struct {
	mant   float64
	decade int
	dim    Dimension
	scale  bool    // a temperature-scale symbol standing alone
	offset float64 // its offset
}

type unitParser struct {
	text  string
	r     []rune
	pos   int
	depth int
}

func (p *unitParser) errAt(pos int, format string, args ...any) error {
	msg := fmt.Sprintf(format, args...)
	return &UnitError{Text: p.text, Column: pos + 1, Msg: fmt.Sprintf("%s at column %d", msg, pos+1)}
}

func (p *unitParser) errAtHint(pos int, hint string, format string, args ...any) error {
	msg := fmt.Sprintf(format, args...)
	return &UnitError{Text: p.text, Column: pos + 1, Msg: fmt.Sprintf("%s at column %d%s", msg, pos+1, hint)}
}

// ParseUnit reads a unit such as "kg/m^3", "m2/s", "kn", "°C", "N*m",
// "J/(kg*K)" or "1/s". See the top of unit.go for the grammar and for how
// ambiguous symbols are read.
func ParseUnit(s string) (Unit, error) {
	text := strings.TrimSpace(s)
	if text == "" {
		return Unit{}, errors.New("empty unit")
	}
	if n := utf8.RuneCountInString(text); n > maxUnitRunes {
		return Unit{}, &UnitError{Text: shorten(text, 40), Msg: fmt.Sprintf("too long (%d characters, at most %d)", n, maxUnitRunes)}
	}
	p := &unitParser{text: text, r: []rune(text)}
	v, err := p.parseExpr()
	if err != nil {
		return Unit{}, err
	}
	if p.pos < len(p.r) {
		if p.r[p.pos] == ')' {
			return Unit{}, p.errAt(p.pos, "unmatched \")\"")
		}
		return Unit{}, p.errAt(p.pos, "unexpected %q", string(p.r[p.pos]))
	}
	f := v.mant * math.Pow10(v.decade)
	if !(f >= minFactor && f <= maxFactor) {
		return Unit{}, &UnitError{Text: text, Msg: fmt.Sprintf("conversion factor %g is out of range", f)}
	}
	u := Unit{Text: text, Factor: f, Dim: v.dim}
	if v.scale {
		u.Offset = v.offset
	}
	return u, nil
}

func (p *unitParser) peek(off int) rune {
	if i := p.pos + off; i < len(p.r) {
		return p.r[i]
	}
	return 0
}

func (p *unitParser) skipSpaces() bool {
	start := p.pos
	for p.pos < len(p.r) && unicode.IsSpace(p.r[p.pos]) {
		p.pos++
	}
	return p.pos > start
}

func isSymbolRune(r rune) bool {
	switch r {
	case '°', 'º', '˚', '%', '‰', '℃', '℉':
		return true
	}
	return unicode.IsLetter(r)
}

func isMulOp(r rune) bool {
	switch r {
	case '*', '·', '⋅', '×', '.':
		return true
	}
	return false
}

// startsTerm reports whether the rune at pos can begin a term.
func (p *unitParser) startsTerm() bool {
	r := p.peek(0)
	return r == '(' || isSymbolRune(r) || (r >= '0' && r <= '9')
}

func (p *unitParser) parseExpr() (uval, error) {
	var v uval
	if p.pos == 0 && p.peek(0) == '/' {
		// A leading "/" reads as "1/": "5/s" is 5 per second.
		v = uval{mant: 1}
	} else {
		var err error
		if v, err = p.parseTerm(); err != nil {
			return uval{}, err
		}
	}
	for {
		spaced := p.skipSpaces()
		if p.pos >= len(p.r) || p.r[p.pos] == ')' {
			return v, nil
		}
		r := p.r[p.pos]
		div := false
		switch {
		case r == '/':
			div = true
			p.pos++
		case r == '*' && p.peek(1) == '*':
			return uval{}, p.errAt(p.pos, "a power (**) must follow a symbol or \")\"")
		case isMulOp(r):
			p.pos++
		case r == '-' && isSymbolRune(p.peek(1)):
			p.pos++ // N-m
		case spaced && p.startsTerm():
			// juxtaposition with a space: "N m"
		default:
			return uval{}, p.errAt(p.pos, "unexpected %q", string(r))
		}
		p.skipSpaces()
		if p.pos >= len(p.r) {
			return uval{}, p.errAt(p.pos-1, "missing unit after %q", string(r))
		}
		t, err := p.parseTerm()
		if err != nil {
			return uval{}, err
		}
		if div {
			v, err = p.combine(v, t, -1, p.pos)
		} else {
			v, err = p.combine(v, t, 1, p.pos)
		}
		if err != nil {
			return uval{}, err
		}
	}
}

// combine returns a·b^sign.
func (p *unitParser) combine(a, b uval, sign int, pos int) (uval, error) {
	var out uval
	var dim Dimension
	if sign > 0 {
		out.mant = a.mant * b.mant
		out.decade = a.decade + b.decade
		dim = a.dim.Mul(b.dim)
	} else {
		out.mant = a.mant / b.mant
		out.decade = a.decade - b.decade
		dim = a.dim.Div(b.dim)
	}
	out.dim = dim
	return out, p.checkVal(out, pos)
}

func (p *unitParser) checkVal(v uval, pos int) error {
	for i, e := range v.dim {
		if abs64(e.Num()) > maxDimPart || e.Den() > maxDimPart {
			return p.errAt(pos-1, "exponent of %s grows too large (%s)", baseSymbols[i], e)
		}
	}
	if !(v.mant > 0) || math.IsInf(v.mant, 0) || v.decade > maxDecade || v.decade < -maxDecade {
		return p.errAt(pos-1, "conversion factor out of range")
	}
	return nil
}

func (p *unitParser) parseTerm() (uval, error) {
	start := p.pos
	v, isSym, err := p.parseFactor()
	if err != nil {
		return uval{}, err
	}
	var exp Rat
	has := false
	r := p.peek(0)
	switch {
	case r == '^' || (r == '*' && p.peek(1) == '*'):
		if r == '^' {
			p.pos++
		} else {
			p.pos += 2
		}
		exp, err = p.parseExponent()
		if err != nil {
			return uval{}, err
		}
		has = true
	case isSym && (isDigit(r) || (r == '-' && isDigit(p.peek(1)))):
		// trailing digits: m2, s-1
		j := p.pos
		if r == '-' {
			j++
		}
		for j < len(p.r) && isDigit(p.r[j]) {
			j++
		}
		exp, err = p.ratAt(string(p.r[p.pos:j]), p.pos)
		if err != nil {
			return uval{}, err
		}
		p.pos = j
		has = true
	case isSuperscript(r):
		var b strings.Builder
		j := p.pos
		for j < len(p.r) && isSuperscript(p.r[j]) {
			b.WriteRune(superscriptASCII(p.r[j]))
			j++
		}
		exp, err = p.ratAt(b.String(), p.pos)
		if err != nil {
			return uval{}, err
		}
		p.pos = j
		has = true
	}
	if !has {
		return v, nil
	}
	if r := p.peek(0); r == '^' || isSuperscript(r) {
		return uval{}, p.errAt(p.pos, "a second power; use parentheses, as (m^2)^3")
	}
	return p.power(v, exp, start)
}

func isSuperscript(r rune) bool {
	return superscriptASCII(r) != 0
}

func superscriptASCII(r rune) rune {
	switch r {
	case '⁰':
		return '0'
	case '¹':
		return '1'
	case '²':
		return '2'
	case '³':
		return '3'
	case '⁴':
		return '4'
	case '⁵':
		return '5'
	case '⁶':
		return '6'
	case '⁷':
		return '7'
	case '⁸':
		return '8'
	case '⁹':
		return '9'
	case '⁻':
		return '-'
	case '⁺':
		return '+'
	}
	return 0
}

func (p *unitParser) ratAt(s string, pos int) (Rat, error) {
	e, err := ParseRat(s)
	if err != nil {
		return Rat{}, p.errAt(pos, "bad exponent %q (%v)", s, err)
	}
	return e, nil
}

// parseExponent reads what follows ^: an integer or decimal, optionally
// signed, or a parenthesised rational.
func (p *unitParser) parseExponent() (Rat, error) {
	start := p.pos
	if p.peek(0) == '(' {
		j := p.pos + 1
		for j < len(p.r) && p.r[j] != ')' {
			j++
		}
		if j >= len(p.r) {
			return Rat{}, p.errAt(start, "missing \")\" after exponent")
		}
		e, err := p.ratAt(string(p.r[p.pos+1:j]), p.pos+1)
		if err != nil {
			return Rat{}, err
		}
		p.pos = j + 1
		return e, nil
	}
	j := p.pos
	if r := p.peek(0); r == '-' || r == '+' || r == '−' {
		j++
	}
	digits := 0
	for j < len(p.r) && (isDigit(p.r[j]) || p.r[j] == '.') {
		if isDigit(p.r[j]) {
			digits++
		}
		j++
	}
	if digits == 0 {
		return Rat{}, p.errAt(start, "missing exponent after ^")
	}
	txt := strings.Replace(string(p.r[p.pos:j]), "−", "-", 1)
	// A trailing '.' is the multiplication operator ("m^2.s"), not part
	// of the number.
	if strings.HasSuffix(txt, ".") {
		txt = strings.TrimSuffix(txt, ".")
		j--
	}
	e, err := p.ratAt(txt, start)
	if err != nil {
		return Rat{}, err
	}
	p.pos = j
	if p.peek(0) == '/' && isDigit(p.peek(1)) {
		return Rat{}, p.errAt(start, "write a fractional power with parentheses, as ^(%s/%s)", txt, string(p.peek(1)))
	}
	return e, nil
}

// power returns v^e.
func (p *unitParser) power(v uval, e Rat, pos int) (uval, error) {
	out := uval{dim: v.dim.Pow(e)}
	if e.IsInt() {
		n := e.Num()
		out.mant = math.Pow(v.mant, float64(n))
		out.decade = v.decade * int(n)
	} else {
		// Split decade·e into an integer power of ten and a remainder
		// folded into the mantissa.
		d := float64(v.decade) * e.Float64()
		fl := math.Floor(d)
		out.mant = math.Pow(v.mant, e.Float64()) * math.Pow(10, d-fl)
		out.decade = int(fl)
	}
	// The decade product is bounded (|decade| ≤ maxDecade, |e| ≤ 1000),
	// and the result is checked before it is used.
	if err := p.checkVal(out, pos+1); err != nil {
		return uval{}, err
	}
	return out, nil
}

// parseFactor reads a symbol, a parenthesised unit or the number 1.
func (p *unitParser) parseFactor() (uval, bool, error) {
	start := p.pos
	r := p.peek(0)
	switch {
	case r == '(':
		if p.depth >= maxParenDepth {
			return uval{}, false, p.errAt(start, "parentheses nested too deep")
		}
		p.depth++
		p.pos++
		p.skipSpaces()
		if p.peek(0) == ')' {
			return uval{}, false, p.errAt(p.pos, "empty parentheses")
		}
		v, err := p.parseExpr()
		if err != nil {
			return uval{}, false, err
		}
		if p.peek(0) != ')' {
			return uval{}, false, p.errAt(start, "missing \")\" for this \"(\"")
		}
		p.pos++
		p.depth--
		return v, false, nil
	case isDigit(r):
		j := p.pos
		for j < len(p.r) && (isDigit(p.r[j]) || p.r[j] == '.') {
			j++
		}
		num := string(p.r[p.pos:j])
		if f, err := strconv.ParseFloat(num, 64); err != nil || f != 1 {
			return uval{}, false, p.errAt(start, "number %q inside a unit (only 1 is allowed, as in 1/s)", num)
		}
		p.pos = j
		return uval{mant: 1}, false, nil
	case isSymbolRune(r):
		j := p.pos
		for j < len(p.r) && isSymbolRune(p.r[j]) {
			j++
		}
		sym := string(p.r[p.pos:j])
		// "° C" with a space is °C.
		if isDegreeSign(sym) {
			k := j
			for k < len(p.r) && unicode.IsSpace(p.r[k]) {
				k++
			}
			if k > j && k < len(p.r) && (p.r[k] == 'C' || p.r[k] == 'F') && (k+1 == len(p.r) || !isSymbolRune(p.r[k+1])) {
				sym = "°" + string(p.r[k])
				j = k + 1
			}
		}
		p.pos = j
		v, err := p.resolve(sym, start)
		return v, true, err
	case r == 0:
		return uval{}, false, p.errAt(start, "missing unit")
	case r == ')':
		return uval{}, false, p.errAt(start, "unexpected \")\"")
	default:
		return uval{}, false, p.errAt(start, "unexpected %q", string(r))
	}
}

func isDegreeSign(s string) bool { return s == "°" || s == "º" || s == "˚" }

// normalizeSymbol maps look-alike characters onto the table's spelling:
// the masculine ordinal º and the ring ˚ are often typed for °.
func normalizeSymbol(s string) string {
	if strings.ContainsAny(s, "º˚") {
		s = strings.NewReplacer("º", "°", "˚", "°").Replace(s)
	}
	return s
}

func fromDef(d unitDef, extraDecade int) uval {
	v := uval{mant: d.mant, decade: d.decade + extraDecade, dim: d.dim}
	if d.offset != 0 {
		v.scale = true
		v.offset = d.offset
	}
	return v
}

// lookupSymbol resolves a symbol without producing an error message: exact
// match first, then prefix + prefixable symbol.
func lookupSymbol(sym string) (uval, bool) {
	if d, ok := unitTable[sym]; ok {
		return fromDef(d, 0), true
	}
	for _, pre := range siPrefixes {
		rest, ok := strings.CutPrefix(sym, pre.sym)
		if !ok || rest == "" {
			continue
		}
		if d, ok := unitTable[rest]; ok && d.prefixable {
			return fromDef(d, pre.decade), true
		}
	}
	return uval{}, false
}

func (p *unitParser) resolve(raw string, pos int) (uval, error) {
	sym := normalizeSymbol(raw)
	if v, ok := lookupSymbol(sym); ok {
		return v, nil
	}
	if what, ok := refusedUnits[sym]; ok {
		return uval{}, p.errAt(pos, "%q is the %s, outside the dimensions scaleplan uses (M, L, T, Θ)", raw, what)
	}
	for _, pre := range siPrefixes {
		rest, ok := strings.CutPrefix(sym, pre.sym)
		if !ok || rest == "" {
			continue
		}
		if what, ok := refusedUnits[rest]; ok {
			return uval{}, p.errAt(pos, "%q is a multiple of the %s, outside the dimensions scaleplan uses (M, L, T, Θ)", raw, what)
		}
		if _, ok := unitTable[rest]; ok {
			return uval{}, p.errAt(pos, "prefix %q does not apply to %q in %q", pre.sym, rest, raw)
		}
	}
	// The right symbol in the wrong case: "KG", "kpa".
	for _, k := range knownUnits {
		if strings.EqualFold(k, sym) {
			return uval{}, p.errAtHint(pos, fmt.Sprintf(" (did you mean %s?)", k), "unknown symbol %q", raw)
		}
	}
	// Two symbols written together: suggest the product.
	rs := []rune(sym)
	for i := 1; i < len(rs); i++ {
		a, b := string(rs[:i]), string(rs[i:])
		if _, ok := lookupSymbol(a); !ok {
			continue
		}
		if _, ok := lookupSymbol(b); ok {
			return uval{}, p.errAtHint(pos, fmt.Sprintf(" (did you mean %s*%s?)", a, b), "unknown symbol %q", raw)
		}
	}
	hint := ""
	if len(rs) >= 2 { // a one-letter typo is as close to half the table
		hint = Suggest(sym, knownUnits)
	}
	return uval{}, p.errAtHint(pos, hint, "unknown symbol %q", raw)
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
