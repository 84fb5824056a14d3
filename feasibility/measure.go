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
	"math/big"
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

// ---- exact exponent arithmetic, bounded so that it never panics ----

var bigMaxExprExp = big.NewInt(maxExprExp)

func ratBounded(b *big.Rat) (Rat, bool) {
	if new(big.Int).Abs(b.Num()).Cmp(bigMaxExprExp) > 0 || b.Denom().Cmp(bigMaxExprExp) > 0 {
		return Rat{}, false
	}
	return fromBig(b)
}

func ratBoundedOK(r Rat) bool {
	_, ok := ratBounded(r.big())
	return ok
}

func ratAddSafe(a, b Rat) (Rat, bool) { return ratBounded(new(big.Rat).Add(a.big(), b.big())) }
func ratSubSafe(a, b Rat) (Rat, bool) { return ratBounded(new(big.Rat).Sub(a.big(), b.big())) }
func ratMulSafe(a, b Rat) (Rat, bool) { return ratBounded(new(big.Rat).Mul(a.big(), b.big())) }

// mergePowers adds sign·b into acc, keeping the order of first appearance.
func mergePowers(acc, b []NamePower, sign int64) ([]NamePower, bool) {
	for _, p := range b {
		e := p.Exp
		if sign < 0 {
			var ok bool
			if e, ok = ratSubSafe(Rat{}, e); !ok {
				return nil, false
			}
		}
		found := false
		for i := range acc {
			if acc[i].Name == p.Name {
				s, ok := ratAddSafe(acc[i].Exp, e)
				if !ok {
					return nil, false
				}
				acc[i].Exp = s
				found = true
				break
			}
		}
		if !found {
			if !ratBoundedOK(e) {
				return nil, false
			}
			acc = append(acc, NamePower{p.Name, e})
		}
	}
	return acc, true
}

func dropZero(ps []NamePower) []NamePower {
	out := ps[:0:0]
	for _, p := range ps {
		if !p.Exp.IsZero() {
			out = append(out, p)
		}
	}
	return out
}

// ---- evaluation ----

func (n *exprNode) names(out *[]string, seen map[string]bool) {
	switch n.op {
	case opName:
		if !seen[n.name] {
			seen[n.name] = true
			*out = append(*out, n.name)
		}
	case opNum:
	default:
		if n.a != nil {
			n.a.names(out, seen)
		}
		if n.b != nil {
			n.b.names(out, seen)
		}
	}
}

func (n *exprNode) eval(v func(string) float64) float64 {
	switch n.op {
	case opNum:
		return n.si
	case opName:
		return v(n.name)
	case opNeg:
		return -n.a.eval(v)
	case opAdd:
		return n.a.eval(v) + n.b.eval(v)
	case opSub:
		return n.a.eval(v) - n.b.eval(v)
	case opMul:
		return n.a.eval(v) * n.b.eval(v)
	case opDiv:
		return n.a.eval(v) / n.b.eval(v)
	case opPow:
		return math.Pow(n.a.eval(v), n.pow.Float64())
	case opSqrt:
		return math.Sqrt(n.a.eval(v))
	}
	return math.NaN()
}

var half = Rat{1, 2}

// operandDims returns the dimensions of a binary node's two operands.
func (n *exprNode) operandDims(dimOf func(string) (Dimension, error), cache map[string]Dimension, root *exprNode) (Dimension, Dimension, error) {
	da, err := n.a.dim(dimOf, cache, root)
	if err != nil {
		return Dimension{}, Dimension{}, err
	}
	db, err := n.b.dim(dimOf, cache, root)
	return da, db, err
}

func (n *exprNode) dim(dimOf func(string) (Dimension, error), cache map[string]Dimension, root *exprNode) (Dimension, error) {
	where := func() string {
		if n == root {
			return ""
		}
		return fmt.Sprintf(" in %q", shorten(n.String(), 80))
	}
	tooLarge := func() error {
		return fmt.Errorf("exponents of the dimension grow too large (beyond ±%d)%s", maxExprExp, where())
	}
	switch n.op {
	case opNum:
		if n.unit == nil {
			return Dimension{}, nil
		}
		return n.unit.Dim, nil
	case opName:
		if d, ok := cache[n.name]; ok {
			return d, nil
		}
		if dimOf == nil {
			return Dimension{}, fmt.Errorf("no dimension known for %q", n.name)
		}
		d, err := dimOf(n.name)
		if err != nil {
			return Dimension{}, err
		}
		cache[n.name] = d
		return d, nil
	case opNeg:
		return n.a.dim(dimOf, cache, root)
	case opAdd, opSub:
		da, db, err := n.operandDims(dimOf, cache, root)
		if err != nil {
			return Dimension{}, err
		}
		if !da.Equal(db) {
			if n.op == opAdd {
				return Dimension{}, fmt.Errorf("cannot add %s to %s%s", da, db, where())
			}
			return Dimension{}, fmt.Errorf("cannot subtract %s from %s%s", db, da, where())
		}
		return da, nil
	case opMul, opDiv:
		da, db, err := n.operandDims(dimOf, cache, root)
		if err != nil {
			return Dimension{}, err
		}
		var out Dimension
		for i := range da {
			var ok bool
			if n.op == opMul {
				out[i], ok = ratAddSafe(da[i], db[i])
			} else {
				out[i], ok = ratSubSafe(da[i], db[i])
			}
			if !ok {
				return Dimension{}, tooLarge()
			}
		}
		return out, nil
	case opPow, opSqrt:
		da, err := n.a.dim(dimOf, cache, root)
		if err != nil {
			return Dimension{}, err
		}
		p := n.pow
		if n.op == opSqrt {
			p = half
		}
		var out Dimension
		for i := range da {
			var ok bool
			if out[i], ok = ratMulSafe(da[i], p); !ok {
				return Dimension{}, tooLarge()
			}
		}
		return out, nil
	}
	return Dimension{}, errors.New("bad expression")
}

func (n *exprNode) product() (float64, []NamePower, bool) {
	switch n.op {
	case opNum:
		if !(n.si > 0) || math.IsInf(n.si, 0) {
			return 0, nil, false
		}
		return n.si, nil, true
	case opName:
		return 1, []NamePower{{n.name, Int(1)}}, true
	case opMul, opDiv:
		ca, pa, ok := n.a.product()
		if !ok {
			return 0, nil, false
		}
		cb, pb, ok := n.b.product()
		if !ok {
			return 0, nil, false
		}
		var sign int64 = 1
		c := ca * cb
		if n.op == opDiv {
			sign, c = -1, ca/cb
		}
		if !(c > 0) || math.IsInf(c, 0) {
			return 0, nil, false
		}
		acc := append([]NamePower(nil), pa...)
		acc, ok = mergePowers(acc, pb, sign)
		return c, acc, ok
	case opPow, opSqrt:
		ca, pa, ok := n.a.product()
		if !ok {
			return 0, nil, false
		}
		p := n.pow
		if n.op == opSqrt {
			p = half
		}
		c := math.Pow(ca, p.Float64())
		if !(c > 0) || math.IsInf(c, 0) {
			return 0, nil, false
		}
		out := make([]NamePower, len(pa))
		for i, q := range pa {
			e, ok := ratMulSafe(q.Exp, p)
			if !ok {
				return 0, nil, false
			}
			out[i] = NamePower{q.Name, e}
		}
		return c, out, true
	}
	return 0, nil, false
}

// ---- canonical text ----

// prec is the binding strength of a node when printed: 1 sum, 2 product,
// 3 unary minus (and a number with a unit, which cannot take a power
// without parentheses), 4 power, 5 atom.
func (n *exprNode) prec() int {
	switch n.op {
	case opAdd, opSub:
		return 1
	case opMul, opDiv:
		return 2
	case opNeg:
		return 3
	case opPow:
		return 4
	case opNum:
		if n.unit != nil || math.Signbit(n.lit) {
			return 3
		}
	}
	return 5
}

func (n *exprNode) String() string {
	var b strings.Builder
	n.write(&b)
	return b.String()
}

func (n *exprNode) writeOperand(b *strings.Builder, min int) {
	if n.prec() < min {
		b.WriteByte('(')
		n.write(b)
		b.WriteByte(')')
		return
	}
	n.write(b)
}

func (n *exprNode) write(b *strings.Builder) {
	switch n.op {
	case opNum:
		b.WriteString(formatExprNumber(n.lit))
		if n.unit != nil {
			b.WriteString(" [")
			b.WriteString(n.unit.Text)
			b.WriteString("]")
		}
	case opName:
		b.WriteString(n.name)
	case opNeg:
		// "--x", not "-(-x)": the canonical text never nests deeper than
		// the input did. A number with a unit takes parentheses, or the
		// minus would bind to it: -(2 [°C]) is not -2 [°C].
		b.WriteByte('-')
		if n.a.op == opNum && n.a.unit != nil && !math.Signbit(n.a.lit) {
			n.a.writeOperand(b, 6)
		} else {
			n.a.writeOperand(b, 3)
		}
	case opAdd, opSub, opMul, opDiv:
		lmin, rmin, sym := 1, 2, " + "
		switch n.op {
		case opSub:
			sym = " - "
		case opMul:
			lmin, rmin, sym = 2, 3, " * "
		case opDiv:
			lmin, rmin, sym = 2, 3, " / "
		}
		n.a.writeOperand(b, lmin)
		b.WriteString(sym)
		n.b.writeOperand(b, rmin)
	case opPow:
		n.a.writeOperand(b, 5)
		b.WriteByte('^')
		if n.pow.IsInt() {
			b.WriteString(n.pow.String())
		} else {
			b.WriteString("(" + n.pow.String() + ")")
		}
	case opSqrt:
		b.WriteString("sqrt(")
		n.a.write(b)
		b.WriteByte(')')
	}
}

// formatExprNumber prints the shortest decimal that reads back to v, in
// plain notation unless a plain exponent is at least two characters shorter:
// 0.35, 0.0015, 1000, 123456789, but 2e6, 1e-4, 1.5e-7.
func formatExprNumber(v float64) string {
	plain := strconv.FormatFloat(v, 'f', -1, 64)
	s := strconv.FormatFloat(v, 'e', -1, 64)
	i := strings.IndexByte(s, 'e')
	mant, exp := s[:i], s[i+1:]
	sign := ""
	if exp[0] == '-' {
		sign = "-"
	}
	exp = strings.TrimLeft(exp[1:], "0")
	if exp == "" {
		exp = "0"
	}
	if e := mant + "e" + sign + exp; len(e)+2 <= len(plain) {
		return e
	}
	return plain
}

// ---- lexer ----

type exprTokKind uint8

const (
	tokEOF exprTokKind = iota
	tokNum
	tokName
	tokUnit
	tokOp
	tokErr
)

type exprTok struct {
	kind exprTokKind
	pos  int    // rune index of the first rune in the full text
	op   rune   // tokOp: one of + - * / ^ ( ), normalised
	raw  string // the token as typed
	num  float64
	unit Unit
	msg  string // tokErr: the message, column included
}

// lexExpr splits r[start:end) into tokens. It stops at the first lexical
// error, which becomes a tokErr token: the parser reports it only when it
// gets there, so an earlier syntax error is reported first.
func lexExpr(r []rune, start, end int) []exprTok {
	var toks []exprTok
	errTok := func(pos int, format string, args ...any) []exprTok {
		return append(toks, exprTok{kind: tokErr, pos: pos, msg: fmt.Sprintf(format, args...)})
	}
	i := start
	for i < end {
		c := r[i]
		switch {
		case unicode.IsSpace(c):
			i++
		case isDigit(c) || (c == '.' && i+1 < end && isDigit(r[i+1])):
			j := scanNumber(r, i, end)
			text := string(r[i:j])
			v, err := strconv.ParseFloat(text, 64)
			if err != nil || math.IsInf(v, 0) {
				return errTok(i, "number %s at column %d is out of range", text, i+1)
			}
			toks = append(toks, exprTok{kind: tokNum, pos: i, raw: text, num: v})
			i = j
		case c == '_' || (c < utf8.RuneSelf && unicode.IsLetter(c)):
			j := i + 1
			for j < end && (r[j] == '_' || isDigit(r[j]) || (r[j] < utf8.RuneSelf && unicode.IsLetter(r[j]))) {
				j++
			}
			toks = append(toks, exprTok{kind: tokName, pos: i, raw: string(r[i:j])})
			i = j
		case c == '[':
			j := i + 1
			for j < end && r[j] != ']' {
				j++
			}
			if j >= end {
				return errTok(i, "unclosed \"[\" at column %d", i+1)
			}
			content := strings.TrimSpace(string(r[i+1 : j]))
			if content == "" {
				return errTok(i, "empty unit in brackets at column %d", i+1)
			}
			u, err := ParseUnit(content)
			if err != nil {
				return errTok(i, "in the unit at column %d: %v", i+1, err)
			}
			toks = append(toks, exprTok{kind: tokUnit, pos: i, raw: string(r[i : j+1]), unit: u})
			i = j + 1
		default:
			op := rune(0)
			switch c {
			case '+', '-', '*', '/', '^', '(', ')':
				op = c
			case '−':
				op = '-'
			case '·', '×', '⋅':
				op = '*'
			}
			if op != 0 {
				toks = append(toks, exprTok{kind: tokOp, pos: i, op: op, raw: string(c)})
				i++
				continue
			}
			switch {
			case c == ',' && i > start && isDigit(r[i-1]) && i+1 < end && isDigit(r[i+1]):
				return errTok(i, "unexpected \",\" at column %d (write the decimal separator as a point)", i+1)
			case c == '<' || c == '>' || c == '=' || c == '≤' || c == '≥':
				return errTok(i, "unexpected %q at column %d (a comparison belongs in a limit, not in an expression)", string(c), i+1)
			case c == ']':
				return errTok(i, "unexpected \"]\" at column %d (no \"[\" before it)", i+1)
			case unicode.IsLetter(c):
				return errTok(i, "unexpected %q at column %d (names use only A-Z, a-z, 0-9 and _)", string(c), i+1)
			default:
				return errTok(i, "unexpected %q at column %d", string(c), i+1)
			}
		}
	}
	return append(toks, exprTok{kind: tokEOF, pos: end})
}

// ---- parser ----

type exprParser struct {
	kind  string // "expression" or "limit", for messages
	text  string // the full text, for messages
	toks  []exprTok
	i     int
	depth int // nesting of parentheses, sqrt and unary minus
	open  int // open parentheses
}

func parseExprSegment(kind, text string, r []rune, start, end int) (*exprNode, error) {
	p := &exprParser{kind: kind, text: text, toks: lexExpr(r, start, end)}
	if p.toks[0].kind == tokEOF {
		return nil, p.fail(0, "empty expression")
	}
	n, err := p.parseSum()
	if err != nil {
		return nil, err
	}
	t, err := p.cur()
	if err != nil {
		return nil, err
	}
	if t.kind != tokEOF {
		return nil, p.unexpectedAfterOperand(t)
	}
	return n, nil
}

func (p *exprParser) fail(pos int, msg string) error {
	col := pos + 1
	if pos < 0 {
		col = 0
	}
	return &ExprError{Kind: p.kind, Text: p.text, Column: col, Msg: msg}
}

func (p *exprParser) failf(pos int, format string, args ...any) error {
	return p.fail(pos, fmt.Sprintf(format, args...))
}

// cur returns the current token, or the lexical error it stands for.
func (p *exprParser) cur() (exprTok, error) {
	t := p.toks[p.i]
	if t.kind == tokErr {
		return t, p.fail(t.pos, t.msg)
	}
	return t, nil
}

func (p *exprParser) peekAt(k int) exprTok {
	if p.i+k < len(p.toks) {
		return p.toks[p.i+k]
	}
	return p.toks[len(p.toks)-1]
}

func (p *exprParser) advance() {
	if p.i < len(p.toks)-1 {
		p.i++
	}
}

func (t exprTok) isOp(op rune) bool { return t.kind == tokOp && t.op == op }

func (p *exprParser) enter(pos int) error {
	p.depth++
	if p.depth > maxExprDepth {
		return p.failf(pos, "nested too deeply at column %d (at most %d levels)", pos+1, maxExprDepth)
	}
	return nil
}

func (p *exprParser) parseSum() (*exprNode, error) {
	return p.parseLeftAssoc(p.parseProduct, '+', opAdd, '-', opSub)
}

func (p *exprParser) parseProduct() (*exprNode, error) {
	return p.parseLeftAssoc(p.parseUnary, '*', opMul, '/', opDiv)
}

// parseLeftAssoc parses operands joined by two left-associative operators
// of one precedence level.
func (p *exprParser) parseLeftAssoc(next func() (*exprNode, error), c1 rune, op1 exprOp, c2 rune, op2 exprOp) (*exprNode, error) {
	left, err := next()
	if err != nil {
		return nil, err
	}
	for {
		t, err := p.cur()
		if err != nil {
			return nil, err
		}
		if !t.isOp(c1) && !t.isOp(c2) {
			return left, nil
		}
		p.advance()
		right, err := next()
		if err != nil {
			return nil, err
		}
		op := op1
		if t.isOp(c2) {
			op = op2
		}
		left = &exprNode{op: op, a: left, b: right}
	}
}

func (p *exprParser) parseUnary() (*exprNode, error) {
	t, err := p.cur()
	if err != nil {
		return nil, err
	}
	if !t.isOp('-') {
		return p.parsePower()
	}
	p.advance()
	if err := p.enter(t.pos); err != nil {
		return nil, err
	}
	defer func() { p.depth-- }()
	// A minus directly before a number with a unit belongs to the number.
	if n1, n2 := p.peekAt(0), p.peekAt(1); n1.kind == tokNum && n2.kind == tokUnit {
		p.advance()
		p.advance()
		n, err := p.numberNode(n1, &n2, true)
		if err != nil {
			return nil, err
		}
		if nt := p.peekAt(0); nt.isOp('^') {
			return nil, p.failf(nt.pos, "a power of a number with a unit needs parentheses, as (%s)^2, at column %d", n.String(), nt.pos+1)
		}
		return n, nil
	}
	a, err := p.parseUnary()
	if err != nil {
		return nil, err
	}
	return &exprNode{op: opNeg, a: a}, nil
}

func (p *exprParser) numberNode(num exprTok, unit *exprTok, neg bool) (*exprNode, error) {
	n := &exprNode{op: opNum, lit: num.num, si: num.num}
	if unit == nil {
		return n, nil
	}
	if neg {
		n.lit = -n.lit
	}
	u := unit.unit
	n.unit = &u
	n.si = u.ToSI(n.lit)
	if math.IsInf(n.si, 0) || math.IsNaN(n.si) {
		return nil, p.failf(num.pos, "number %s %s at column %d is out of range in SI", num.raw, unit.raw, num.pos+1)
	}
	return n, nil
}

func (p *exprParser) parsePower() (*exprNode, error) {
	base, paren, err := p.parsePrimary()
	if err != nil {
		return nil, err
	}
	t, err := p.cur()
	if err != nil {
		return nil, err
	}
	if !t.isOp('^') {
		return base, nil
	}
	if base.op == opNum && base.unit != nil && !paren {
		return nil, p.failf(t.pos, "a power of a number with a unit needs parentheses, as (%s)^2, at column %d", base.String(), t.pos+1)
	}
	p.advance()
	pow, err := p.parseConstPower(t)
	if err != nil {
		return nil, err
	}
	if nt := p.peekAt(0); nt.isOp('^') {
		return nil, p.failf(nt.pos, "a second power at column %d; use parentheses, as (x^2)^3", nt.pos+1)
	}
	return &exprNode{op: opPow, a: base, pow: pow}, nil
}

// parseConstPower reads the constant after "^": [-]decimal or
// [-]"(" [-]decimal [ "/" decimal ] ")". Errors point at the "^".
func (p *exprParser) parseConstPower(caret exprTok) (Rat, error) {
	at := caret.pos
	notConst := func(t exprTok) error {
		if t.kind == tokEOF {
			return p.failf(at, "missing power after \"^\" at column %d", at+1)
		}
		return p.failf(at, "the power after \"^\" at column %d must be a constant such as 2, -1, 0.5 or (1/2)", at+1)
	}
	decimal := func() (Rat, error) {
		t, err := p.cur()
		if err != nil {
			return Rat{}, err
		}
		if t.kind != tokNum {
			return Rat{}, notConst(t)
		}
		if strings.ContainsAny(t.raw, "eE") {
			return Rat{}, p.failf(at, "write the power after \"^\" at column %d without an exponent (as 2, 0.5 or (1/2))", at+1)
		}
		if nt := p.peekAt(1); nt.kind == tokUnit {
			return Rat{}, p.failf(at, "the power after \"^\" at column %d cannot carry a unit", at+1)
		}
		p.advance()
		r, err := ParseRat(t.raw)
		if err != nil {
			return Rat{}, p.failf(at, "the power after \"^\" at column %d: %v", at+1, err)
		}
		return r, nil
	}
	negate := func() bool {
		if t := p.peekAt(0); t.isOp('-') {
			p.advance()
			return true
		}
		return false
	}
	neg := negate()
	open := p.peekAt(0)
	if !open.isOp('(') {
		r, err := decimal()
		if err != nil {
			return Rat{}, err
		}
		if neg {
			r = r.Neg()
		}
		return r, nil
	}
	p.advance()
	if negate() {
		neg = !neg
	}
	r, err := decimal()
	if err != nil {
		return Rat{}, err
	}
	if slash := p.peekAt(0); slash.isOp('/') {
		p.advance()
		den, err := decimal()
		if err != nil {
			return Rat{}, err
		}
		if den.IsZero() {
			return Rat{}, p.failf(at, "zero denominator in the power after \"^\" at column %d", at+1)
		}
		q, ok := ratBounded(new(big.Rat).Quo(r.big(), den.big()))
		if !ok || abs64(q.Num()) > maxExpPart || q.Den() > maxExpPart {
			return Rat{}, p.failf(at, "the power after \"^\" at column %d is too large (at most %d in numerator and denominator)", at+1, maxExpPart)
		}
		r = q
	}
	t, err := p.cur()
	if err != nil {
		return Rat{}, err
	}
	if !t.isOp(')') {
		if t.kind == tokEOF {
			return Rat{}, p.failf(open.pos, "unbalanced parenthesis at column %d (\"(\" is never closed)", open.pos+1)
		}
		return Rat{}, notConst(t)
	}
	p.advance()
	if neg {
		r = r.Neg()
	}
	return r, nil
}

// parsePrimary reads a number (with its unit), a name, sqrt(...) or a
// parenthesised sum; paren reports the parentheses.
func (p *exprParser) parsePrimary() (n *exprNode, paren bool, err error) {
	t, err := p.cur()
	if err != nil {
		return nil, false, err
	}
	switch t.kind {
	case tokNum:
		p.advance()
		var unit *exprTok
		if u := p.peekAt(0); u.kind == tokUnit {
			unit = &u
			p.advance()
		}
		n, err := p.numberNode(t, unit, false)
		return n, false, err
	case tokName:
		p.advance()
		next := p.peekAt(0)
		if t.raw == "sqrt" {
			if !next.isOp('(') {
				return nil, false, p.failf(t.pos, "sqrt needs parentheses, as sqrt(x), at column %d", t.pos+1)
			}
			inner, _, err := p.parseParen()
			if err != nil {
				return nil, false, err
			}
			return &exprNode{op: opSqrt, a: inner}, false, nil
		}
		if next.isOp('(') {
			return nil, false, p.failf(t.pos, "unknown function %q at column %d%s", t.raw, t.pos+1, Suggest(t.raw, []string{"sqrt"}))
		}
		return &exprNode{op: opName, name: t.raw}, false, nil
	case tokUnit:
		return nil, false, p.failf(t.pos, "a unit in brackets must follow a number, at column %d", t.pos+1)
	case tokEOF:
		if p.i == 0 {
			return nil, false, p.fail(-1, "empty expression")
		}
		prev := p.toks[p.i-1]
		if prev.isOp('(') {
			return nil, false, p.failf(prev.pos, "unbalanced parenthesis at column %d (\"(\" is never closed)", prev.pos+1)
		}
		return nil, false, p.failf(prev.pos, "missing operand after %q at column %d", prev.raw, prev.pos+1)
	}
	// An operator where an operand belongs.
	switch {
	case t.isOp('('):
		return p.parseParen()
	case t.isOp(')') && p.open == 0:
		return nil, false, p.failf(t.pos, "unbalanced parenthesis at column %d (\")\" without \"(\")", t.pos+1)
	case t.isOp('*') && p.i > 0 && p.toks[p.i-1].isOp('*'):
		return nil, false, p.failf(t.pos, "unexpected \"*\" at column %d (write powers with ^)", t.pos+1)
	}
	return nil, false, p.failf(t.pos, "unexpected %q at column %d", t.raw, t.pos+1)
}

// parseParen reads "(" sum ")" at the current token.
func (p *exprParser) parseParen() (*exprNode, bool, error) {
	open := p.peekAt(0)
	p.advance()
	if err := p.enter(open.pos); err != nil {
		return nil, false, err
	}
	p.open++
	if t := p.peekAt(0); t.isOp(')') {
		return nil, false, p.failf(open.pos, "empty parentheses at column %d", open.pos+1)
	}
	inner, err := p.parseSum()
	if err != nil {
		return nil, false, err
	}
	t, err := p.cur()
	if err != nil {
		return nil, false, err
	}
	switch {
	case t.isOp(')'):
		p.advance()
		p.open--
		p.depth--
		return inner, true, nil
	case t.kind == tokEOF:
		return nil, false, p.failf(open.pos, "unbalanced parenthesis at column %d (\"(\" is never closed)", open.pos+1)
	}
	return nil, false, p.unexpectedAfterOperand(t)
}

// unexpectedAfterOperand explains a token that follows a complete operand
// where an operator or the end was expected.
func (p *exprParser) unexpectedAfterOperand(t exprTok) error {
	switch {
	case t.kind == tokUnit:
		return p.failf(t.pos, "a unit in brackets must follow a number, at column %d", t.pos+1)
	case t.kind == tokName || t.kind == tokNum || t.isOp('('):
		return p.failf(t.pos, "unexpected %q at column %d (is an operator such as * missing?)", t.raw, t.pos+1)
	case t.isOp(')') && p.open == 0:
		return p.failf(t.pos, "unbalanced parenthesis at column %d (\")\" without \"(\")", t.pos+1)
	}
	return p.failf(t.pos, "unexpected %q at column %d", t.raw, t.pos+1)
}
