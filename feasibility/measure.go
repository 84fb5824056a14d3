package feasibility

// Measures and limits (spec §6 and §9).
//
// A measure is a small arithmetic expression over named values (model-scale
// items, medium and material properties, facility capabilities) and
// constants, in our own syntax; a limit is an inequality between two
// measures; a cost item is built from measures. Values are SI throughout.
//
// Expression syntax (informal):
//
//	sum     = product { ("+" | "-") product }          left associative
//	product = unary { ("*" | "/") unary }              left associative
//	unary   = "-" unary | power
//	power   = primary [ "^" const ]
//	primary = number [ "[" unit "]" ] | name | "sqrt(" sum ")" | "(" sum ")"
//	const   = [ "-" ] ( decimal | "(" [ "-" ] decimal [ "/" decimal ] ")" )
//	name    = [A-Za-z_][A-Za-z0-9_]*
//	number  = 2 | 0.35 | .5 | 2e6 | 1.5E-3
//
// Choices:
//
//   - The power is an exact constant (^2, ^-1, ^0.5, ^(1/2), ^(-3/2)), read
//     with ParseRat; a power made of names or operators is an error. A second
//     power needs parentheses: (x^2)^3, never x^2^3.
//   - Powers bind tighter than the unary minus: -x^2 is -(x^2).
//   - sqrt(x) is x^(1/2). It is the only function, and "sqrt" is reserved.
//   - A number may carry a unit in square brackets, "9.80665 [m/s^2]",
//     "3 [h]": its value is SI and its dimension the unit's (ParseUnit). The
//     unit binds to its number together with a minus sign written directly
//     before it, so "-2 [°C]" is the temperature 271.15 K, not -(275.15 K).
//     A power of such a number needs parentheses: (3 [m])^2.
//   - "·", "×" and "⋅" are read as "*", and "−" (U+2212) as "-"; the
//     canonical text (String) uses ASCII, single spaces around binary
//     operators, only the parentheses the structure needs ("--x", not
//     "-(-x)"), the shortest number that reads back to the same float64
//     (0.35, 0.0015, 1000, but 2e6 and 1e-4 where the exponent form is at
//     least two characters shorter), powers as ^2, ^-1 or ^(1/2), and units
//     in brackets as typed ("0.35 [s]"). ParseExpr reads it back to the same
//     expression.
//   - Inputs are bounded: at most 1000 characters, before and after being
//     written out canonically, and 100 levels of nesting (parentheses, sqrt,
//     unary minus); derived exponents stay within ±10^6 in numerator and
//     denominator. Nothing panics on any input.
//   - Errors are *ExprError values that name the column (1-based, in
//     characters of the trimmed text): expression "a * / b": unexpected "/"
//     at column 5.
//
// Limits. A limit is LEFT OP RIGHT with OP one of <=, >=, <, >, ≤, ≥. The
// strict and the non-strict forms are treated alike: at a margin of exactly
// zero the two cannot be told apart in floating point, and a planning tool
// should not pretend otherwise; a limit sitting exactly on its bound counts
// as satisfied. Either side that reads as a plain value with ParseValue
// ("2e6", "0.35 s", "6 m/s", "-2 °C") is that constant; otherwise it is an
// expression. So a name after a number is a unit ("2 h" is two hours): a
// product of a number and a name is written with "*". A unit that starts
// with an operator is not taken: "2 / s" is 2 divided by s, never 2 Hz.

import (
	"errors"
	"fmt"
	"math"
	"strconv"
	"strings"
	"unicode"
	"unicode/utf8"
)

const (
	maxExprRunes = 1000    // longest expression or limit accepted
	maxExprDepth = 100     // deepest nesting of parentheses, sqrt and unary minus
	maxExprExp   = 1000000 // bound on numerator and denominator of derived exponents
)

// ExprError is the error of ParseExpr and ParseLimit. Column is the 1-based
// rune position in Text the error points at, 0 when it concerns the whole
// text; Msg already names the column.
type ExprError struct {
	Kind   string // "expression" or "limit"
	Text   string
	Column int
	Msg    string
}

func (e *ExprError) Error() string {
	return fmt.Sprintf("%s %q: %s", e.Kind, shorten(e.Text, 80), e.Msg)
}

// Expr is a parsed measure.
type Expr struct {
	root *exprNode
	text string // the text as typed, trimmed
}

// NamePower is one factor name^Exp of a product of powers.
type NamePower struct {
	Name string
	Exp  Rat
}

// NameCoef is one term of a log-linear margin: the margin gains
// Exp·log10(value of Name).
type NameCoef struct {
	Name string
	Exp  Rat
}

type exprOp uint8

const (
	opNum exprOp = iota
	opName
	opNeg
	opAdd
	opSub
	opMul
	opDiv
	opPow
	opSqrt
)

type exprNode struct {
	op   exprOp
	lit  float64 // opNum: the number as written, in its unit
	si   float64 // opNum: its SI value
	unit *Unit   // opNum: its unit, nil for a plain number
	name string  // opName
	pow  Rat     // opPow
	a, b *exprNode
}

// ParseExpr reads a measure such as "design_speed * hull_length /
// kinematic_viscosity" or "design_speed / sqrt(gravity * depth)". See the
// top of measure.go for the syntax.
func ParseExpr(s string) (*Expr, error) {
	text := strings.TrimSpace(s)
	if n := utf8.RuneCountInString(text); n > maxExprRunes {
		return nil, &ExprError{Kind: "expression", Text: text, Msg: fmt.Sprintf("too long (%d characters, at most %d)", n, maxExprRunes)}
	}
	if text == "" {
		return nil, &ExprError{Kind: "expression", Text: text, Msg: "empty expression"}
	}
	r := []rune(text)
	root, err := parseExprSegment("expression", text, r, 0, len(r))
	if err != nil {
		return nil, err
	}
	e := &Expr{root: root, text: text}
	// The canonical text must read back too, so it is bounded like the input.
	if n := utf8.RuneCountInString(e.String()); n > maxExprRunes {
		return nil, &ExprError{Kind: "expression", Text: text, Msg: fmt.Sprintf("too long (%d characters once written out canonically, at most %d)", n, maxExprRunes)}
	}
	return e, nil
}

// String returns the canonical text, which ParseExpr reads back to the same
// expression.
func (e *Expr) String() string {
	if e == nil || e.root == nil {
		return ""
	}
	var b strings.Builder
	e.root.write(&b)
	return b.String()
}

// Names returns the names used, in order of first appearance, without
// duplicates.
func (e *Expr) Names() []string {
	if e == nil || e.root == nil {
		return nil
	}
	var out []string
	seen := map[string]bool{}
	e.root.names(&out, seen)
	return out
}

// Dim returns the dimension of the expression, given the dimension of every
// name. It fails when a sum or difference mixes dimensions ("cannot add
// L T^-1 to L") or when dimOf fails (its error is wrapped).
func (e *Expr) Dim(dimOf func(name string) (Dimension, error)) (Dimension, error) {
	if e == nil || e.root == nil {
		return Dimension{}, errors.New("empty expression")
	}
	d, err := e.root.dim(dimOf, map[string]Dimension{}, e.root)
	if err != nil {
		return Dimension{}, fmt.Errorf("expression %q: %w", shorten(e.text, 80), err)
	}
	return d, nil
}

// Eval returns the value of the expression, in SI, given the value of every
// name. Constants with a unit are taken in SI. A nil valueOf makes every
// name NaN.
func (e *Expr) Eval(valueOf func(name string) float64) float64 {
	if e == nil || e.root == nil {
		return math.NaN()
	}
	if valueOf == nil {
		valueOf = func(string) float64 { return math.NaN() }
	}
	return e.root.eval(valueOf)
}

// Product reports whether the expression is a product of powers of names
// and constants, and if so returns it: value = coef · Π name^Exp, names in
// order of first appearance. Sums, differences, negations and constants
// that are not positive (a zero constant included) make ok false, as do
// exponents beyond ±10^6 and a coefficient that over- or underflows. sqrt
// folds into the exponents, repeated names merge (x*x is x^2) and zero
// exponents drop (x/x leaves no powers and coef 1).
func (e *Expr) Product() (coef float64, powers []NamePower, ok bool) {
	if e == nil || e.root == nil {
		return 0, nil, false
	}
	coef, powers, ok = e.root.product()
	if !ok || !(coef > 0) || math.IsInf(coef, 0) {
		return 0, nil, false
	}
	return coef, dropZero(powers), true
}

// Limit is an inequality between two measures.
type Limit struct {
	Text        string // the text as typed, trimmed
	Left, Right *Expr
	Upper       bool // true for <= (Left must stay at or below Right), false for >=
}

// ParseLimit reads a limit such as "design_speed * hull_length /
// kinematic_viscosity >= 2e6", "wave_period >= 0.35 s" or "beam * draft /
// (basin_width * basin_depth) <= 0.01". A side that reads as a value with
// ParseValue is that constant; otherwise it is an expression. Strict and
// non-strict comparisons are treated alike.
func ParseLimit(s string) (*Limit, error) {
	text := strings.TrimSpace(s)
	fail := func(col int, msg string) error {
		return &ExprError{Kind: "limit", Text: text, Column: col, Msg: msg}
	}
	if n := utf8.RuneCountInString(text); n > maxExprRunes {
		return nil, fail(0, fmt.Sprintf("too long (%d characters, at most %d)", n, maxExprRunes))
	}
	if text == "" {
		return nil, fail(0, "empty limit")
	}
	r := []rune(text)
	type cmp struct {
		pos, width int
		upper      bool
	}
	var cmps []cmp
	for i := 0; i < len(r); i++ {
		switch c := r[i]; c {
		case '<', '>':
			w := 1
			if i+1 < len(r) && r[i+1] == '=' {
				w = 2
			}
			cmps = append(cmps, cmp{i, w, c == '<'})
			i += w - 1
		case '≤', '≥':
			cmps = append(cmps, cmp{i, 1, c == '≤'})
		case '=':
			if i+1 < len(r) && (r[i+1] == '<' || r[i+1] == '>') {
				return nil, fail(i+1, fmt.Sprintf("write %q instead of %q at column %d", string(r[i+1])+"=", "="+string(r[i+1]), i+1))
			}
			return nil, fail(i+1, fmt.Sprintf("unexpected \"=\" at column %d: a limit needs a comparison such as <= or >= (an equality is not a limit)", i+1))
		}
	}
	switch len(cmps) {
	case 0:
		return nil, fail(0, "a limit needs a comparison such as <= or >=")
	case 1:
	case 2:
		return nil, fail(cmps[1].pos+1, fmt.Sprintf("two comparisons, at columns %d and %d; a limit has one (write a range as two limits)", cmps[0].pos+1, cmps[1].pos+1))
	default:
		return nil, fail(cmps[1].pos+1, fmt.Sprintf("%d comparisons (the second at column %d); a limit has one", len(cmps), cmps[1].pos+1))
	}
	c := cmps[0]
	opText := string(r[c.pos : c.pos+c.width])
	left, err := parseLimitSide(text, r, 0, c.pos)
	if err != nil {
		return nil, err
	}
	if left == nil {
		return nil, fail(c.pos+1, fmt.Sprintf("nothing on the left of %q at column %d", opText, c.pos+1))
	}
	right, err := parseLimitSide(text, r, c.pos+c.width, len(r))
	if err != nil {
		return nil, err
	}
	if right == nil {
		return nil, fail(c.pos+1, fmt.Sprintf("nothing on the right of %q at column %d", opText, c.pos+1))
	}
	l := &Limit{Text: text, Left: left, Right: right, Upper: c.upper}
	if n := utf8.RuneCountInString(l.String()); n > maxExprRunes {
		return nil, fail(0, fmt.Sprintf("too long (%d characters once written out canonically, at most %d)", n, maxExprRunes))
	}
	return l, nil
}

// parseLimitSide reads one side of a limit, runes [start, end) of r; it
// returns nil, nil for a blank side.
func parseLimitSide(text string, r []rune, start, end int) (*Expr, error) {
	for start < end && unicode.IsSpace(r[start]) {
		start++
	}
	for end > start && unicode.IsSpace(r[end-1]) {
		end--
	}
	if start == end {
		return nil, nil
	}
	seg := string(r[start:end])
	_, u, verr := ParseValue(seg)
	if verr == nil && !startsWithOperator(u.Text) {
		// ParseValue reads "2 / s" as 2 s^-1; an expression reads it as 2
		// divided by the value named s. A unit that starts with an
		// operator is left to the expression syntax.
		if n, ok := valueNode(seg, u); ok {
			return &Expr{root: n, text: seg}, nil
		}
	}
	root, err := parseExprSegment("limit", text, r, start, end)
	if err != nil {
		// A number followed by something the expression syntax cannot take
		// is most likely a value with a misspelt unit ("0.35 sec"): the
		// unit's message helps more than "unexpected name".
		var ee *ExprError
		if j := afterLeadingNumber(r, start, end); verr != nil && j >= 0 && errors.As(err, &ee) && ee.Column-1 == j && !strings.ContainsRune(exprOperatorRunes+"()[]", r[j]) {
			return nil, &ExprError{Kind: "limit", Text: text, Column: start + 1,
				Msg: fmt.Sprintf("the value %q at column %d: %v", seg, start+1, verr)}
		}
		return nil, err
	}
	return &Expr{root: root, text: seg}, nil
}

// afterLeadingNumber returns the rune index of the first non-space rune
// after a leading (optionally signed) number in r[start:end], or -1 when
// the segment does not start with a number or nothing follows it.
func afterLeadingNumber(r []rune, start, end int) int {
	i := start
	if i < end && (r[i] == '-' || r[i] == '+' || r[i] == '−') {
		i++
	}
	j := scanNumber(r, i, end)
	if j == i {
		return -1
	}
	for j < end && unicode.IsSpace(r[j]) {
		j++
	}
	if j == end {
		return -1
	}
	return j
}

// scanNumber returns the end of the number starting at r[i] (i itself when
// there is none): digits, an optional fraction, an optional exponent taken
// only when digits follow the e. It reads numbers as ParseValue does.
func scanNumber(r []rune, i, end int) int {
	j, digits := i, 0
	for j < end && isDigit(r[j]) {
		j++
		digits++
	}
	if j < end && r[j] == '.' {
		j++
		for j < end && isDigit(r[j]) {
			j++
			digits++
		}
	}
	if digits == 0 {
		return i
	}
	if j < end && (r[j] == 'e' || r[j] == 'E') {
		k := j + 1
		if k < end && (r[k] == '+' || r[k] == '-') {
			k++
		}
		if k < end && isDigit(r[k]) {
			for k < end && isDigit(r[k]) {
				k++
			}
			j = k
		}
	}
	return j
}

// exprOperatorRunes are the binary and unary operators of the expression
// syntax.
const exprOperatorRunes = "+-*/^−·×⋅"

func startsWithOperator(s string) bool {
	c, _ := utf8.DecodeRuneInString(s)
	return s != "" && strings.ContainsRune(exprOperatorRunes, c)
}

// valueNode builds the constant of a side that ParseValue accepted, with
// the unit u ParseValue returned.
func valueNode(seg string, u Unit) (*exprNode, bool) {
	r := []rune(seg)
	i, neg := 0, false
	if len(r) > 0 && (r[0] == '-' || r[0] == '+' || r[0] == '−') {
		neg = r[0] != '+'
		i = 1
	}
	j := scanNumber(r, i, len(r))
	if j == i {
		return nil, false
	}
	lit, err := strconv.ParseFloat(string(r[i:j]), 64)
	if err != nil || math.IsInf(lit, 0) {
		return nil, false
	}
	rest := strings.TrimSpace(string(r[j:]))
	if rest == "" {
		n := &exprNode{op: opNum, lit: lit, si: lit}
		if neg {
			n = &exprNode{op: opNeg, a: n}
		}
		return n, true
	}
	if u.Text != rest {
		return nil, false
	}
	if neg {
		lit = -lit
	}
	si := u.ToSI(lit)
	if math.IsInf(si, 0) || math.IsNaN(si) {
		return nil, false
	}
	uu := u
	return &exprNode{op: opNum, lit: lit, si: si, unit: &uu}, true
}

// String returns the canonical text of the limit, "LEFT <= RIGHT" or
// "LEFT >= RIGHT", which ParseLimit reads back to the same limit.
func (l *Limit) String() string {
	if l == nil {
		return ""
	}
	op := " >= "
	if l.Upper {
		op = " <= "
	}
	return l.Left.String() + op + l.Right.String()
}

// Names returns the names used on either side, left first, in order of
// first appearance, without duplicates.
func (l *Limit) Names() []string {
	if l == nil {
		return nil
	}
	var out []string
	seen := map[string]bool{}
	for _, e := range []*Expr{l.Left, l.Right} {
		if e != nil && e.root != nil {
			e.root.names(&out, seen)
		}
	}
	return out
}

// Check dimension-checks both sides: each must be consistent, and the two
// must have the same dimension.
func (l *Limit) Check(dimOf func(string) (Dimension, error)) error {
	if l == nil || l.Left == nil || l.Right == nil || l.Left.root == nil || l.Right.root == nil {
		return errors.New("incomplete limit")
	}
	dl, err := l.Left.root.dim(dimOf, map[string]Dimension{}, l.Left.root)
	if err != nil {
		return fmt.Errorf("limit %q: left side: %w", shorten(l.Text, 80), err)
	}
	dr, err := l.Right.root.dim(dimOf, map[string]Dimension{}, l.Right.root)
	if err != nil {
		return fmt.Errorf("limit %q: right side: %w", shorten(l.Text, 80), err)
	}
	if !dl.Equal(dr) {
		return fmt.Errorf("limit %q: the two sides have different dimensions: %s and %s", shorten(l.Text, 80), dl, dr)
	}
	return nil
}

// Margin returns the margin in decades (spec §2): log10(right/left) for an
// upper bound, log10(left/right) for a lower bound; ≥ 0 is satisfied. A
// side that is not a positive number (zero, negative or NaN) gives -Inf, as
// do two infinite sides; a margin is never NaN.
func (l *Limit) Margin(valueOf func(string) float64) float64 {
	if l == nil {
		return math.Inf(-1)
	}
	return limitMargin(l.Upper, l.Left.Eval(valueOf), l.Right.Eval(valueOf))
}

func limitMargin(upper bool, left, right float64) float64 {
	num, den := right, left
	if !upper {
		num, den = left, right
	}
	if !(num > 0) || !(den > 0) {
		return math.Inf(-1)
	}
	var m float64
	if q := num / den; q >= 0x1p-1022 && !math.IsInf(q, 0) { // a normal float64
		m = math.Log10(q)
	} else {
		m = math.Log10(num) - math.Log10(den)
	}
	if math.IsNaN(m) {
		return math.Inf(-1)
	}
	return m
}

// LogLinear returns the margin as a log-linear function when both sides are
// products of powers (see Expr.Product): margin = c + Σ terms[i].Exp ·
// log10(value of terms[i].Name). Names come left side first, in order of
// first appearance; zero coefficients drop. ok is false otherwise.
func (l *Limit) LogLinear() (c float64, terms []NameCoef, ok bool) {
	if l == nil {
		return 0, nil, false
	}
	cl, pl, okl := l.Left.Product()
	cr, pr, okr := l.Right.Product()
	if !okl || !okr {
		return 0, nil, false
	}
	// Upper: margin = log10(R) - log10(L); lower: the opposite.
	var sign int64 = 1
	if !l.Upper {
		sign = -1
	}
	acc := make([]NamePower, 0, len(pl)+len(pr))
	acc, ok = mergePowers(acc, pl, -sign)
	if !ok {
		return 0, nil, false
	}
	acc, ok = mergePowers(acc, pr, sign)
	if !ok {
		return 0, nil, false
	}
	c = float64(sign) * (math.Log10(cr) - math.Log10(cl))
	if math.IsNaN(c) || math.IsInf(c, 0) {
		return 0, nil, false
	}
	acc = dropZero(acc)
	terms = make([]NameCoef, len(acc))
	for i, p := range acc {
		terms[i] = NameCoef(p)
	}
	return c, terms, true
}
