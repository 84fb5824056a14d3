package sweep

import (
	"os"
	"path/filepath"
	"strings"
	"testing"

	"scaleplan/sweep/study"
)

func prepareErr(t *testing.T, s *study.Study) string {
	t.Helper()
	_, err := prepare(t, s)
	if err == nil {
		return ""
	}
	return err.Error()
}

func setSetting(s *study.Study, name, value string) {
	v := s.Settings[name]
	v.Value = value
	s.Settings[name] = v
}

// TestStudyProblems checks that each kind of bad study input is reported
// with its sheet and cell and a suggestion where one helps.
func TestStudyProblems(t *testing.T) {
	cases := []struct {
		name  string
		edit  func(s *study.Study)
		wants []string
	}{
		{"unknown law", func(s *study.Study) { s.Strategies[1].Retain = "inertia, gravty" },
			[]string{`Strategies!D3: unknown law "gravty" (did you mean gravity?)`}},
		{"unknown quantity", func(s *study.Study) { s.Prototype[0].ScalesAs = "lenght" },
			[]string{`Prototype!D2: unknown quantity "lenght" (did you mean length?)`}},
		{"unknown library entry", func(s *study.Study) { s.Media[0].Entry = "watr" },
			[]string{`Media!B2: `, `"watr"`, `water`}},
		{"unknown facility type", func(s *study.Study) {
			for i := range s.Facilities {
				s.Facilities[i].Type = "towing_tnak"
			}
		}, []string{`Facilities!B2: unknown facility type "towing_tnak" (did you mean towing_tank?)`}},
		{"non-numeric value", func(s *study.Study) { s.Prototype[1].Value = "eleven" }, []string{`Prototype!B3: `, `eleven`}},
		{"unit does not fit", func(s *study.Study) { s.Prototype[3].Unit = "kg" },
			[]string{`Prototype!C5: unit "kg" does not fit velocity (needs L T^-1, got M)`}},
		{"limit with two dimensions", func(s *study.Study) {
			s.Limits = append(s.Limits, study.LimitRow{AppliesTo: "all", Limit: "odd", Expression: "design_speed <= 3 m", Row: 2})
		}, []string{`Limits!C2: `, `different dimensions`}},
		{"scale range reversed", func(s *study.Study) { setSetting(s, "scale_from", "80") },
			[]string{`scale_from (80) must be below scale_to (60)`}},
		{"scale range not positive", func(s *study.Study) { setSetting(s, "scale_from", "0") },
			[]string{`the scale range must be positive`}},
		{"free choice left open", func(s *study.Study) {
			s.Strategies = append(s.Strategies, study.StrategyRow{Strategy: "speed free", Technique: "dominant", Retain: "inertia, viscosity", Given: "viscosity", Row: 5})
		}, []string{`Strategies!I5: strategy "speed free" leaves the velocity scale free: fix it here (fix: velocity=1) or sweep it as the second axis (Study: axis = velocity)`}},
		{"given property without a source", func(s *study.Study) { s.Strategies[1].Given = "density, gravity, modulus" },
			[]string{`Strategies!G3: modulus is given but the prototype has no modulus`}},
		{"unknown technique", func(s *study.Study) { s.Strategies[0].Technique = "complet" },
			[]string{`Strategies!C2: unknown technique "complet" (did you mean complete?)`}},
		{"unknown setting", func(s *study.Study) {
			s.Settings["scale_form"] = study.Setting{Name: "scale_form", Value: "3", Cell: study.Cell{Sheet: "Study", Row: 20, Col: 2}}
		},
			[]string{`Study!A20: unknown setting "scale_form" (did you mean scale_from?)`}},
		{"unknown name in a limit", func(s *study.Study) {
			s.Limits = append(s.Limits, study.LimitRow{AppliesTo: "all", Limit: "odd", Expression: "hull_lenght <= 3 m", Row: 2})
		}, []string{`Limits!C2: `, `unknown name "hull_lenght" (did you mean hull_length?)`}},
		{"duplicate item", func(s *study.Study) { s.Prototype[1].Name = "hull_length" }, []string{`Prototype!A3: item "hull_length" appears twice`}},
		{"negative value", func(s *study.Study) { s.Prototype[2].Value = "-4.8" }, []string{`Prototype!B4: draft must be positive`}},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			s := scenario(t, "tug")
			c.edit(s)
			got := prepareErr(t, s)
			for _, w := range c.wants {
				if !strings.Contains(got, w) {
					t.Errorf("problems:\n%s\nwant %q", got, w)
				}
			}
		})
	}
	// Every problem is reported at once.
	s := scenario(t, "tug")
	s.Strategies[1].Retain = "inertia, gravty"
	s.Prototype[3].Unit = "kg"
	if got := prepareErr(t, s); strings.Count(got, "\n") < 1 {
		t.Errorf("want two problems at once, got %q", got)
	}
}

func TestMissingSheet(t *testing.T) {
	dir := t.TempDir()
	if err := study.WriteCSV(dir+"/study", scenario(t, "tug")); err != nil {
		t.Fatal(err)
	}
	if err := os.Remove(filepath.Join(dir, "study", "Strategies.csv")); err != nil {
		t.Fatal(err)
	}
	_, err := study.Load(dir + "/study")
	if err == nil || !strings.Contains(err.Error(), "Strategies") {
		t.Errorf("error %v, want the missing Strategies sheet named", err)
	}
}
