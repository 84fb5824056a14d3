package feasibility

import "strings"

// Base dimensions. Every quantity's dimension is a product of powers of
// these four; electrical and photometric dimensions play no part in model
// testing and are refused by the unit parser.
const (
	Mass = iota
	Length
	Time
	Temperature
	numBase
)

var baseSymbols = [numBase]string{"M", "L", "T", "Θ"}

// Dimension is a product of powers of mass, length, time and temperature,
// indexed by Mass, Length, Time and Temperature. The zero value is
// dimensionless.
type Dimension [numBase]Rat

// Dim builds a dimension from integer exponents of M, L, T and Θ.
func Dim(m, l, t, th int64) Dimension {
	return Dimension{Int(m), Int(l), Int(t), Int(th)}
}

// Mul returns the dimension of a product.
func (d Dimension) Mul(e Dimension) Dimension {
	var out Dimension
	for i := range d {
		out[i] = d[i].Add(e[i])
	}
	return out
}

// Div returns the dimension of a quotient.
func (d Dimension) Div(e Dimension) Dimension {
	var out Dimension
	for i := range d {
		out[i] = d[i].Sub(e[i])
	}
	return out
}

// Pow returns the dimension raised to a rational power.
func (d Dimension) Pow(p Rat) Dimension {
	var out Dimension
	for i := range d {
		out[i] = d[i].Mul(p)
	}
	return out
}

// IsDimensionless reports whether every exponent is zero.
func (d Dimension) IsDimensionless() bool {
	for _, e := range d {
		if !e.IsZero() {
			return false
		}
	}
	return true
}

// Equal reports whether two dimensions are the same.
func (d Dimension) Equal(e Dimension) bool {
	for i := range d {
		if d[i].Cmp(e[i]) != 0 {
			return false
		}
	}
	return true
}

// String prints the dimension as a product of base symbols, e.g.
// "M L^-1 T^-2"; a dimensionless one prints as "1".
func (d Dimension) String() string {
	var parts []string
	for i, e := range d {
		switch {
		case e.IsZero():
		case e.Cmp(Int(1)) == 0:
			parts = append(parts, baseSymbols[i])
		default:
			parts = append(parts, baseSymbols[i]+"^"+e.String())
		}
	}
	if len(parts) == 0 {
		return "1"
	}
	return strings.Join(parts, " ")
}
