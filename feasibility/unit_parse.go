package feasibility

import (
	"errors"
	"fmt"
	"math"
	"strconv"
	"strings"
	"unicode"
	"unicode/utf8"
)

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
