package feasibility

import (
	"fmt"
	"math"
	"math/big"
	"strconv"
	"strings"
	"unicode"
	"unicode/utf8"
)

// The lexer and the recursive-descent parser of expressions and limits.

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
