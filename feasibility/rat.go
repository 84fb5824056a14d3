package feasibility

import (
	"fmt"
	"math"
	"math/big"
	"strconv"
	"strings"
)

// Rat is an exact rational number, small enough to be a value type. It is
// used for exponents: of a dimension, of a unit, of a scale law. The zero
// value is 0. Rats are always kept in lowest terms with a positive
// denominator.
type Rat struct {
	num, den int64
}

// R returns the rational num/den. It panics if den is zero: that is a
// programming error, never a user input (parsers use ParseRat).
func R(num, den int64) Rat {
	if den == 0 {
		panic("feasibility: zero denominator")
	}
	return norm(num, den)
}

// Int returns the rational n/1.
func Int(n int64) Rat { return Rat{n, 1} }

func gcd(a, b int64) int64 {
	if a < 0 {
		a = -a
	}
	if b < 0 {
		b = -b
	}
	for b != 0 {
		a, b = b, a%b
	}
	return a
}

func norm(num, den int64) Rat {
	if num == 0 {
		return Rat{0, 1}
	}
	if den < 0 {
		num, den = -num, -den
	}
	g := gcd(num, den)
	return Rat{num / g, den / g}
}

// fromBig converts an exact big rational; ok is false when it does not fit.
func fromBig(b *big.Rat) (Rat, bool) {
	if !b.Num().IsInt64() || !b.Denom().IsInt64() {
		return Rat{}, false
	}
	return norm(b.Num().Int64(), b.Denom().Int64()), true
}

func (r Rat) big() *big.Rat {
	d := r.den
	if d == 0 {
		d = 1
	}
	return big.NewRat(r.num, d)
}

// mustFit converts a big rational produced by our own arithmetic on small
// exponents; the values involved are tiny, so overflow means a bug.
func mustFit(b *big.Rat) Rat {
	r, ok := fromBig(b)
	if !ok {
		panic("feasibility: rational exponent out of range: " + b.String())
	}
	return r
}

// Num and Den return the numerator and the (positive) denominator.
func (r Rat) Num() int64 { return r.num }

// Den returns the positive denominator.
func (r Rat) Den() int64 {
	if r.den == 0 {
		return 1
	}
	return r.den
}

// IsZero reports whether r is 0.
func (r Rat) IsZero() bool { return r.num == 0 }

// IsInt reports whether r is an integer.
func (r Rat) IsInt() bool { return r.Den() == 1 }

// Add returns r+s.
func (r Rat) Add(s Rat) Rat { return mustFit(new(big.Rat).Add(r.big(), s.big())) }

// Sub returns r-s.
func (r Rat) Sub(s Rat) Rat { return mustFit(new(big.Rat).Sub(r.big(), s.big())) }

// Mul returns r·s.
func (r Rat) Mul(s Rat) Rat { return mustFit(new(big.Rat).Mul(r.big(), s.big())) }

// Div returns r/s; s must not be zero.
func (r Rat) Div(s Rat) Rat {
	if s.IsZero() {
		panic("feasibility: division by zero exponent")
	}
	return mustFit(new(big.Rat).Quo(r.big(), s.big()))
}

// Neg returns -r.
func (r Rat) Neg() Rat { return Rat{-r.num, r.Den()} }

// Cmp compares r and s and returns -1, 0 or +1.
func (r Rat) Cmp(s Rat) int { return r.big().Cmp(s.big()) }

// Float64 returns the nearest float64.
func (r Rat) Float64() float64 { return float64(r.num) / float64(r.Den()) }

// String prints the rational as an integer or as p/q ("3/2", "-1/2").
func (r Rat) String() string {
	if r.Den() == 1 {
		return strconv.FormatInt(r.num, 10)
	}
	return fmt.Sprintf("%d/%d", r.num, r.Den())
}

// ParseRat reads an integer, a fraction p/q or a terminating decimal
// ("2", "-3/2", "0.5") exactly. Numerators and denominators are bounded
// so that arithmetic on exponents stays exact.
func ParseRat(s string) (Rat, error) {
	t := strings.TrimSpace(s)
	if t == "" {
		return Rat{}, fmt.Errorf("empty exponent")
	}
	b, ok := new(big.Rat).SetString(t)
	if !ok {
		return Rat{}, fmt.Errorf("%q is not an exact number (write 3/2 or 1.5)", s)
	}
	if strings.Count(t, "/") > 0 && b.Denom().Sign() == 0 {
		return Rat{}, fmt.Errorf("%q has a zero denominator", s)
	}
	r, ok := fromBig(b)
	if !ok || abs64(r.num) > maxExpPart || r.Den() > maxExpPart {
		return Rat{}, fmt.Errorf("exponent %q is too large (at most %d in numerator and denominator)", s, maxExpPart)
	}
	return r, nil
}

const maxExpPart = 1000

func abs64(a int64) int64 {
	if a < 0 {
		return -a
	}
	return a
}

// RatFromFloat returns the rational with denominator at most maxDen
// closest to f, and whether it matches f to within tol.
func RatFromFloat(f float64, maxDen int64, tol float64) (Rat, bool) {
	if math.IsNaN(f) || math.IsInf(f, 0) {
		return Rat{}, false
	}
	best := Rat{}
	bestErr := math.Inf(1)
	for d := int64(1); d <= maxDen; d++ {
		n := math.Round(f * float64(d))
		if math.Abs(n) > 1e15 {
			break
		}
		e := math.Abs(f - n/float64(d))
		if e < bestErr-1e-15 {
			best, bestErr = norm(int64(n), d), e
		}
	}
	return best, bestErr <= tol
}
