package materials

import "testing"

func TestMeeting(t *testing.T) {
	l := defaultLibrary(t)
	cases := []struct {
		name     string
		quantity string
		value    float64
		tol      float64
		at       string
		want     []string // names in order
		tuned    map[string]bool
	}{
		// Fresh water at 20 °C is 998.2 kg/m^3 (0.18 % off); the mixture
		// reaches 1000 by its glycerol fraction, brine by its salt.
		{"water density", "density", 1000, 0.005, "20C", []string{"brine", "water_glycerol", "water"},
			map[string]bool{"water_glycerol": true, "brine": true}},
		// Model ice is tuned to 40 kPa; no other ice is near.
		{"ice strength", "strength", 40e3, 0.1, "", []string{"model_ice"}, map[string]bool{"model_ice": true}},
		// A density nothing has: none exists.
		{"none", "density", 1e5, 0.1, "", nil, nil},
		// An unknown quantity meets nothing.
		{"unknown", "densty", 1000, 0.1, "", nil, nil},
		// Pure aluminium alloys by density, 2 %.
		{"aluminium", "density", 2.68e3, 0.02, "", []string{"aluminium_5083", "aluminium_6061_t6"}, nil},
	}
	for _, c := range cases {
		cond, err := ParseConditions(c.at)
		if err != nil {
			t.Fatal(err)
		}
		got := l.Meeting(c.quantity, c.value, c.tol, cond)
		var names []string
		for _, m := range got {
			names = append(names, m.Name)
			if m.Tuned != c.tuned[m.Name] {
				t.Errorf("%s: %s tuned = %v", c.name, m.Name, m.Tuned)
			}
		}
		if len(names) != len(c.want) {
			t.Errorf("%s: got %v, want %v", c.name, names, c.want)
			continue
		}
		for i := range names {
			if names[i] != c.want[i] {
				t.Errorf("%s: got %v, want %v", c.name, names, c.want)
				break
			}
		}
	}
}

func TestMeetingSkipsOutOfRange(t *testing.T) {
	l := defaultLibrary(t)
	// At 60 °C fresh water and seawater are outside their ranges and are
	// left out; the mixture (0–100 °C) still counts, and conditions an entry
	// does not take (temperature for solids) are ignored.
	cond, _ := ParseConditions("60C")
	for _, m := range l.Meeting("density", 1000, 0.05, cond) {
		if m.Name == "water" || m.Name == "seawater" {
			t.Errorf("%s should be left out at 60 °C", m.Name)
		}
	}
	found := false
	for _, m := range l.Meeting("density", 1190, 0.001, cond) {
		found = found || m.Name == "pmma"
	}
	if !found {
		t.Errorf("pmma should match whatever the temperature condition")
	}
}
