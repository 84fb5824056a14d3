package sweep

import (
	"strings"
	"testing"
)

func TestGLevelTie(t *testing.T) {
	cases := []struct {
		item    string
		isTie   bool
		exp     string // exponent of kL in k_gravity
		errPart string
	}{
		{"g_level=kL", true, "-1", ""},
		{"g_level = kL", true, "-1", ""},
		{"g_level=kL^1/2", true, "-1/2", ""},
		{"g_level=kL^(2/3)", true, "-2/3", ""},
		{"velocity=2", false, "", ""},
		{"g_level=50", true, "", "a fixed g-level is a capability"},
		{"g_level=kL^x", true, "", "number or p/q"},
		{"g_level=kL2", true, "", "number or p/q"},
		{"g_level=kL^0", true, "", "leave the g-level to the facility"},
	}
	for _, c := range cases {
		tie, isTie, err := gLevelTie(c.item)
		if isTie != c.isTie {
			t.Errorf("%q: is a tie %v, want %v", c.item, isTie, c.isTie)
			continue
		}
		if c.errPart != "" {
			if err == nil || !strings.Contains(err.Error(), c.errPart) {
				t.Errorf("%q: error %v, want one saying %q", c.item, err, c.errPart)
			}
			continue
		}
		if err != nil {
			t.Errorf("%q: %v", c.item, err)
			continue
		}
		if c.isTie && (tie.Quantity != "gravity" || tie.Exp.String() != c.exp) {
			t.Errorf("%q: tie %s = kL^%s, want gravity = kL^%s", c.item, tie.Quantity, tie.Exp, c.exp)
		}
	}
}

// A malformed tie is reported at its cell; gravity both given and tied is
// refused.
func TestGLevelTieProblems(t *testing.T) {
	s := scenario(t, "caisson")
	s.Strategies[1].Fix = "g_level=fast"
	s.Strategies[2].Given = "density, consolidation_coefficient, gravity"
	_, err := prepare(t, s)
	if err == nil {
		t.Fatal("want problems")
	}
	msg := err.Error()
	for _, want := range []string{"Strategies!I3", "Strategies!D4", "gravity"} {
		if !strings.Contains(msg, want) {
			t.Errorf("problems %q do not mention %q", msg, want)
		}
	}
}

// Without the second axis, a distorted model's free choice is its
// vertical scale, and the problem says so at the fix cell.
func TestDistortedFreeChoiceIsVerticalScale(t *testing.T) {
	s := scenario(t, "estuary")
	for name := range s.Settings {
		if strings.HasPrefix(name, "axis") {
			delete(s.Settings, name)
		}
	}
	_, err := prepare(t, s)
	if err == nil || !strings.Contains(err.Error(), "Strategies!I3") || !strings.Contains(err.Error(), "leaves the thickness scale free") {
		t.Errorf("problems %v, want the thickness scale named free at Strategies!I3", err)
	}
}
