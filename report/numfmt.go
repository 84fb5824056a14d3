package report

import (
	"math"
	"strconv"
	"strings"
)

// HumanNumber writes a number for a reader: three significant figures,
// thousands separators, "million" and "billion" for large values and a
// power of ten written out (1.2 × 10⁻⁵) for very small ones — never
// E-notation. NaN and infinities give "–".
func HumanNumber(x float64) string {
	switch {
	case math.IsNaN(x) || math.IsInf(x, 0):
		return "–"
	case x == 0:
		return "0"
	case x < 0:
		return "−" + HumanNumber(-x)
	}
	x = roundSig(x, 3)
	switch {
	case x >= 1e12:
		return powerOfTen(x)
	case x >= 1e9:
		return decimal(x/1e9) + " billion"
	case x >= 1e6:
		return decimal(x/1e6) + " million"
	case x >= 1000:
		return thousands(strconv.FormatFloat(x, 'f', 0, 64))
	case x >= 1e-3:
		return decimal(x)
	default:
		return powerOfTen(x)
	}
}

// HumanMoney writes an amount to four significant figures (whole units
// below 10,000) with thousands separators and the currency: "468,700 EUR".
func HumanMoney(x float64, currency string) string {
	if math.IsNaN(x) || math.IsInf(x, 0) {
		return "–"
	}
	neg := x < 0
	x = math.Abs(x)
	if x >= 10000 {
		x = roundSig(x, 4)
	}
	s := thousands(strconv.FormatFloat(math.Round(x), 'f', 0, 64))
	if neg {
		s = "−" + s
	}
	if currency != "" {
		s += " " + currency
	}
	return s
}

// roundSig rounds x > 0 to n significant figures.
func roundSig(x float64, n int) float64 {
	v, _ := strconv.ParseFloat(strconv.FormatFloat(x, 'e', n-1, 64), 64)
	return v
}

// decimal writes x (0.001 ≤ x < 1000, already rounded) with at most three
// significant figures and no trailing zeros.
func decimal(x float64) string {
	e := int(math.Floor(math.Log10(x)))
	d := max(0, 2-e)
	s := strconv.FormatFloat(x, 'f', d, 64)
	if strings.Contains(s, ".") {
		s = strings.TrimRight(strings.TrimRight(s, "0"), ".")
	}
	return s
}

// thousands puts commas between groups of three digits of an integer.
func thousands(s string) string {
	if len(s) <= 3 {
		return s
	}
	var b strings.Builder
	lead := len(s) % 3
	if lead > 0 {
		b.WriteString(s[:lead])
	}
	for i := lead; i < len(s); i += 3 {
		if b.Len() > 0 {
			b.WriteByte(',')
		}
		b.WriteString(s[i : i+3])
	}
	return b.String()
}

var superscripts = strings.NewReplacer("-", "⁻", "0", "⁰", "1", "¹", "2", "²", "3", "³", "4", "⁴", "5", "⁵", "6", "⁶", "7", "⁷", "8", "⁸", "9", "⁹")

// powerOfTen writes x as m × 10ⁿ with a three-figure mantissa.
func powerOfTen(x float64) string {
	e := int(math.Floor(math.Log10(x)))
	m := roundSig(x/math.Pow(10, float64(e)), 3)
	if m >= 10 {
		m, e = m/10, e+1
	}
	return decimal(m) + " × 10" + superscripts.Replace(strconv.Itoa(e))
}
