package feasibility

import (
	"errors"
	"fmt"
	"math"
	"math/big"
	"strconv"
	"strings"
)

// Exact exponent arithmetic, bounded so that it never panics; evaluation,
// dimensions, products of powers and the canonical text of an expression
// tree (exprNode).

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
