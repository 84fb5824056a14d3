package feasibility

import (
	"errors"
	"math"
	"testing"
	"unicode/utf8"
)

// measureFuzzDim gives every name a dimension that depends only on the
// name, so that the fuzzer meets both consistent and inconsistent sums.
func measureFuzzDim(name string) (Dimension, error) {
	switch len(name) % 5 {
	case 0:
		return Dimension{}, nil
	case 1:
		return Dim(0, 1, 0, 0), nil
	case 2:
		return Dim(0, 1, -1, 0), nil
	case 3:
		return Dim(1, -3, 0, 0), nil
	}
	return Dimension{}, errors.New("no such name")
}

func measureFuzzValue(name string) float64 { return 1 + 0.37*float64(len(name)%7) }

// sameFloat reports whether a and b are the same value, NaN equal to NaN.
func sameFloat(a, b float64) bool { return a == b || math.IsNaN(a) && math.IsNaN(b) }

// checkExprStable checks that e's canonical text reads back to an
// expression that prints, evaluates and dimensions the same.
func checkExprStable(t *testing.T, what string, e *Expr) {
	t.Helper()
	s := e.String()
	e2, err := ParseExpr(s)
	if err != nil {
		t.Fatalf("%s: canonical text %q does not parse: %v", what, s, err)
	}
	if s2 := e2.String(); s2 != s {
		t.Fatalf("%s: round trip %q -> %q", what, s, s2)
	}
	if v1, v2 := e.Eval(measureFuzzValue), e2.Eval(measureFuzzValue); !sameFloat(v1, v2) {
		t.Fatalf("%s: %q evaluates to %v, its canonical text to %v", what, e.text, v1, v2)
	}
	d1, err1 := e.Dim(measureFuzzDim)
	d2, err2 := e2.Dim(measureFuzzDim)
	if (err1 == nil) != (err2 == nil) || err1 == nil && !d1.Equal(d2) {
		t.Fatalf("%s: dimension changes on round trip: %v %v / %v %v", what, d1, err1, d2, err2)
	}
	c1, p1, ok1 := e.Product()
	c2, p2, ok2 := e2.Product()
	if ok1 != ok2 || ok1 && (c1 != c2 || len(p1) != len(p2)) {
		t.Fatalf("%s: product changes on round trip: %v %v %v / %v %v %v", what, c1, p1, ok1, c2, p2, ok2)
	}
	if ok1 {
		for _, p := range p1 {
			if p.Exp.IsZero() {
				t.Fatalf("%s: zero exponent kept in %v", what, p1)
			}
		}
	}
	seen := map[string]bool{}
	for _, n := range e.Names() {
		if seen[n] {
			t.Fatalf("%s: duplicate name %q in %v", what, n, e.Names())
		}
		seen[n] = true
	}
}

func checkExprError(t *testing.T, s string, err error) {
	t.Helper()
	var ee *ExprError
	if !errors.As(err, &ee) {
		t.Fatalf("%q: error %v is not an *ExprError", s, err)
	}
	if ee.Column < 0 || ee.Column > utf8.RuneCountInString(ee.Text)+1 {
		t.Fatalf("%q: column %d outside the text (%v)", s, ee.Column, err)
	}
}

// FuzzParseLimit checks that ParseLimit and ParseExpr never panic, that
// what they accept prints to a canonical text that reads back the same, and
// that the methods of what they return never panic and agree.
func FuzzParseLimit(f *testing.F) {
	// The seed corpus is in testdata/fuzz/FuzzParseLimit.
	f.Fuzz(func(t *testing.T, s string) {
		if e, err := ParseExpr(s); err != nil {
			checkExprError(t, s, err)
		} else {
			checkExprStable(t, "expression", e)
		}
		l, err := ParseLimit(s)
		if err != nil {
			checkExprError(t, s, err)
			return
		}
		checkExprStable(t, "left side", l.Left)
		checkExprStable(t, "right side", l.Right)
		cs := l.String()
		l2, err := ParseLimit(cs)
		if err != nil {
			t.Fatalf("canonical limit %q does not parse: %v", cs, err)
		}
		if cs2 := l2.String(); cs2 != cs || l2.Upper != l.Upper {
			t.Fatalf("limit round trip %q -> %q", cs, cs2)
		}
		_ = l.Check(measureFuzzDim)
		_ = l.Names()
		m := l.Margin(measureFuzzValue)
		if math.IsNaN(m) {
			t.Fatalf("%q: NaN margin", s)
		}
		if m2 := l2.Margin(measureFuzzValue); m2 != m {
			t.Fatalf("%q: margin %v, after round trip %v", s, m, m2)
		}
		c, terms, ok := l.LogLinear()
		if !ok {
			return
		}
		lin, scale := c, 1+math.Abs(c)
		for _, term := range terms {
			if term.Exp.IsZero() {
				t.Fatalf("%q: zero coefficient kept in %v", s, terms)
			}
			x := term.Exp.Float64() * math.Log10(measureFuzzValue(term.Name))
			lin += x
			scale += math.Abs(x)
		}
		left, right := l.Left.Eval(measureFuzzValue), l.Right.Eval(measureFuzzValue)
		moderate := func(v float64) bool { return v > 1e-300 && v < 1e300 }
		if !moderate(left) || !moderate(right) || math.IsInf(m, 0) {
			return // overflow or subnormal rounding in Eval: nothing to compare
		}
		if math.Abs(lin-m) > 1e-9*scale {
			t.Fatalf("%q: log-linear margin %v, direct margin %v", s, lin, m)
		}
	})
}
