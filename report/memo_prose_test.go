package report

import "testing"

// TestProseText: identifiers of the label table become readable names
// only where they stand as whole words, E-notation becomes a number for
// people, scale symbols are named, and the names a user typed stay as
// typed even where they look like an identifier.
func TestProseText(t *testing.T) {
	keep := []string{"towing_tank", "Tank A"}
	cases := []struct{ in, want string }{
		{"section_height of Aero tunnel is stated", "test-section height of Aero tunnel is stated"},
		// Whole words only: a longer name that contains an identifier is left.
		{"tank_width_2 and my_tank_width", "tank_width_2 and my_tank_width"},
		{"default limits of Tank A (a towing_tank)", "default limits of Tank A (a towing_tank)"},
		{"default limits of X (a wave_basin)", "default limits of X (a wave basin)"},
		// 1.68e-08 = 1.68 × 10⁻⁸; 8.05e+04 = 80,500 (three figures, separators);
		// a caret power is a superscript.
		{"needs 1.68e-08 m^2/s; has 8.05e+04 Pa", "needs 1.68 × 10⁻⁸ m²/s; has 80,500 Pa"},
		{"over k_density = 2.5", "over k(density) = 2.5"},
		{"tuned consolidation_coefficient min", "tuned coefficient of consolidation min"},
		// A law that is no quantity gets the law's name.
		{"relaxes bed_friction", "relaxes bed-friction law"},
		// Scales and plain numbers are left alone.
		{"at 1:17.1, 0.35 s", "at 1:17.1, 0.35 s"},
	}
	for _, c := range cases {
		if got := proseText(c.in, keep); got != c.want {
			t.Errorf("proseText(%q) = %q, want %q", c.in, got, c.want)
		}
	}
}
