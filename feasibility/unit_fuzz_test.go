package feasibility

import (
	"errors"
	"math"
	"testing"
	"unicode/utf8"
)

// FuzzParseUnit checks that ParseUnit and ParseValue never panic, that
// every unit they accept has a finite positive factor and a finite offset,
// that error columns point inside the text, and that ToSI(FromSI(x))
// round-trips for finite results.
func FuzzParseUnit(f *testing.F) {
	for _, s := range []string{
		"kg/m^3", "m2/s", "m/s/s", "J/(kg*°C)", "°C", "20 °C", "N·m", "m^(1/2)", "s⁻¹",
		"kn", "lbf*ft/in^2", "((m))^-3", "1/s", "Nm", "kg/mx^3", "m^1/2", "mA", "1e3 kPa",
		"-3 bar", "35g/kg", "° C", "cSt", "rpm", "m**2", "N-m", "m^2.s",
	} {
		f.Add(s)
	}
	f.Fuzz(func(t *testing.T, s string) {
		u, err := ParseUnit(s)
		if err != nil {
			checkUnitError(t, s, err)
		} else {
			checkUnit(t, s, u)
		}
		for _, in := range []string{s, "1.5 " + s, "-7" + s} {
			v, u, err := ParseValue(in)
			if err != nil {
				checkUnitError(t, in, err)
				continue
			}
			if math.IsNaN(v) || math.IsInf(v, 0) {
				t.Fatalf("ParseValue(%q) = %v", in, v)
			}
			checkUnit(t, in, u)
			roundTrip(t, in, u, v)
		}
	})
}

func checkUnit(t *testing.T, s string, u Unit) {
	t.Helper()
	if !(u.Factor > 0) || math.IsInf(u.Factor, 0) || math.IsNaN(u.Offset) || math.IsInf(u.Offset, 0) {
		t.Fatalf("%q: bad unit %+v", s, u)
	}
	for _, x := range []float64{0, 1, -40, 293.15, 1e6, -1e-6} {
		roundTrip(t, s, u, x)
	}
}

// roundTrip checks ToSI(FromSI(x)) ≈ x whenever the intermediate value is
// a finite normal number.
func roundTrip(t *testing.T, s string, u Unit, x float64) {
	t.Helper()
	y := u.FromSI(x)
	if math.IsNaN(y) || math.IsInf(y, 0) || (y != 0 && math.Abs(y) < 0x1p-1022) {
		return
	}
	z := u.ToSI(y)
	scale := math.Max(math.Abs(x), math.Abs(u.Offset))
	if math.Abs(z-x) > 1e-12*scale+1e-300 {
		t.Fatalf("%q (%+v): ToSI(FromSI(%g)) = %g", s, u, x, z)
	}
}

func checkUnitError(t *testing.T, s string, err error) {
	t.Helper()
	if err.Error() == "" {
		t.Fatalf("%q: empty error", s)
	}
	var ue *UnitError
	if errors.As(err, &ue) {
		if ue.Column < 0 || ue.Column > utf8.RuneCountInString(ue.Text)+1 {
			t.Fatalf("%q: column %d outside %q", s, ue.Column, ue.Text)
		}
	}
}
