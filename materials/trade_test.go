package materials

import "testing"

// TestSpecificModulusOfMetals checks a fact of the trade (common practice):
// the structural metals have nearly the same specific modulus E/ρ, steels,
// aluminium alloys and titanium about 25e6 m²/s², copper alloys about half
// of that; across the library's structural metals it spans no more than a
// factor of about 3. A metal model of a metal prototype therefore cannot
// change E/ρ much.
func TestSpecificModulusOfMetals(t *testing.T) {
	l := defaultLibrary(t)
	lo, hi := 0.0, 0.0
	for _, name := range []string{"structural_steel", "stainless_steel", "aluminium_6061_t6", "aluminium_5083", "titanium_ti6al4v", "copper", "brass"} {
		e, err := l.Lookup(name)
		if err != nil {
			t.Fatal(err)
		}
		E, err := e.Property("modulus", Conditions{})
		if err != nil {
			t.Fatal(err)
		}
		rho, err := e.Property("density", Conditions{})
		if err != nil {
			t.Fatal(err)
		}
		s := E.Value / rho.Value
		if lo == 0 || s < lo {
			lo = s
		}
		if s > hi {
			hi = s
		}
	}
	if hi/lo > 3 {
		t.Errorf("specific modulus of the structural metals spans a factor %.2f (%.3g–%.3g m^2/s^2), want at most about 3", hi/lo, lo, hi)
	}
}
