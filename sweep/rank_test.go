package sweep

import (
	"math"
	"slices"
	"strings"
	"testing"

	"scaleplan/sweep/study"
)

// anchorStudy is an invented drag anchor in soft clay (testdata/anchor):
// a 1 g clay bin that relaxes gravity, a centrifuge that relaxes nothing,
// and full similarity at 1 g, which holds only at full scale. By hand,
// from the default limits and the scale laws (kρ = kc = 1, so kV = 1 and
// kF = kL²):
//   - 1 g bin: working_depth ≤ soil_depth/3 gives kL ≥ 12/(0.3/3) = 120;
//     design_force ≥ 100 × 1 N gives kL ≤ √(3e6/100) = 173.2.
//   - centrifuge: soil_block_length ≤ bucket_length gives kL ≥ 40/0.25 =
//     160, the same force edge 173.2; g-level kL ≤ 200 does not bind.
//   - the 1 g model's Froude number: Fr_p/Fr_m = kV/√(kg·kL) = 1/√120,
//     a mismatch of √120 ≈ 10.95, beyond the default threshold of 10.
func anchorStudy(t *testing.T, settings ...string) *study.Study {
	t.Helper()
	s, err := study.Load("testdata/anchor")
	if err != nil {
		t.Fatal(err)
	}
	for i := 0; i+1 < len(settings); i += 2 {
		name := settings[i]
		v, ok := s.Settings[name]
		if !ok {
			v = study.Setting{Name: name, Cell: study.Cell{Sheet: "Study", Row: 100 + i, Col: 2}}
		}
		v.Value = settings[i+1]
		s.Settings[name] = v
	}
	return s
}

func ranking(res *Result) []string {
	var out []string
	for _, e := range res.Ranking {
		out = append(out, e.Strategy)
	}
	return out
}

func TestAnchorWindowsByHand(t *testing.T) {
	res := runStudy(t, anchorStudy(t))
	bin := strategy(t, res, "1 g bin").Best
	cen := strategy(t, res, "centrifuge").Best
	if bin == nil || cen == nil {
		t.Fatal("a window is missing")
	}
	hi := math.Sqrt(3e6 / 100)
	for _, c := range []struct {
		got, want float64
	}{{bin.Window[0].Lo, 120}, {bin.Window[0].Hi, hi}, {cen.Window[0].Lo, 160}, {cen.Window[0].Hi, hi}} {
		if !relClose(c.got, c.want, 1e-9) {
			t.Errorf("edge %v, want %v", c.got, c.want)
		}
	}
	if strategy(t, res, "full similarity at 1 g").Best != nil {
		t.Error("full similarity at 1 g should have no window")
	}
}

func TestRankScaleEffectOutranksModelSize(t *testing.T) {
	res := runStudy(t, anchorStudy(t))
	if got, want := ranking(res), []string{"centrifuge", "1 g bin", "full similarity at 1 g"}; !slices.Equal(got, want) {
		t.Fatalf("ranking %v, want %v", got, want)
	}
	e := res.RankOf("1 g bin")
	if !e.ScaleEffect || e.WorstMismatch == nil || e.WorstMismatch.Law != "gravity" {
		t.Fatalf("1 g bin: %+v", e)
	}
	if want := math.Sqrt(120); !relClose(e.WorstMismatch.Size(), want, 1e-9) {
		t.Errorf("worst mismatch %v, want √120 = %v", e.WorstMismatch.Size(), want)
	}
	// The strategy does not give gravity, so the sweep cannot evaluate
	// the group; the ranking takes the model's gravity from the facility
	// (1 g), and the model's Froude number is the larger.
	if r := e.WorstMismatch.Ratio; !relClose(r, 1/math.Sqrt(120), 1e-9) {
		t.Errorf("ratio π_p/π_m %v, want 1/√120", r)
	}
	for _, want := range []string{"relaxes gravity", "model Froude number 11 times the prototype's", "beyond the threshold 10"} {
		if !strings.Contains(e.Reason, want) {
			t.Errorf("reason %q lacks %q", e.Reason, want)
		}
	}
	if c := res.RankOf("centrifuge"); c.Reason != "relaxes no law" || c.Rank != 1 || c.ScaleEffect {
		t.Errorf("centrifuge: %+v", c)
	}
	if f := res.RankOf("full similarity at 1 g"); f.Feasible || !strings.HasPrefix(f.Reason, "no feasible scale") {
		t.Errorf("full similarity: %+v", f)
	}
	if r := res.Recommended(); r == nil || r.Strategy != "centrifuge" {
		t.Errorf("recommended %+v", r)
	}
}

func TestRankSettings(t *testing.T) {
	cases := []struct {
		name     string
		settings []string
		want     []string
		reason   string // of the 1 g bin
	}{
		{"weak gravity: the larger 1 g model first", []string{"weak_laws", "gravity"},
			[]string{"1 g bin", "centrifuge", "full similarity at 1 g"}, "relaxes only laws the study marks weak (gravity)"},
		{"threshold above the mismatch: the larger model first", []string{"mismatch_threshold", "20"},
			[]string{"1 g bin", "centrifuge", "full similarity at 1 g"}, "within the threshold 20"},
		{"governing gravity counts whatever the threshold", []string{"mismatch_threshold", "20", "governing_laws", "gravity"},
			[]string{"centrifuge", "1 g bin", "full similarity at 1 g"}, "which the study marks governing"},
		// The 1 g bin is six times cheaper (1 500 against 9 000 EUR), yet
		// its scale effect keeps it second.
		{"cheapest does not override the scale effect", []string{"recommend", "cheapest"},
			[]string{"centrifuge", "1 g bin", "full similarity at 1 g"}, "beyond the threshold 10"},
		{"cheapest among strategies of one class", []string{"recommend", "cheapest", "weak_laws", "gravity, viscosity"},
			[]string{"1 g bin", "centrifuge", "full similarity at 1 g"}, "weak (gravity)"},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			res := runStudy(t, anchorStudy(t, c.settings...))
			if got := ranking(res); !slices.Equal(got, c.want) {
				t.Errorf("ranking %v, want %v", got, c.want)
			}
			if r := res.RankOf("1 g bin").Reason; !strings.Contains(r, c.reason) {
				t.Errorf("reason %q lacks %q", r, c.reason)
			}
		})
	}
}

// TestRankOrderOfRows reverses the Strategies sheet and asks for the
// cheapest: the pick stays the feasible strategy of the better class, and
// the infeasible one stays last.
func TestRankOrderOfRows(t *testing.T) {
	for _, cheapest := range []bool{false, true} {
		s := anchorStudy(t)
		if cheapest {
			s = anchorStudy(t, "recommend", "cheapest")
		}
		slices.Reverse(s.Strategies)
		res := runStudy(t, s)
		if got, want := ranking(res), []string{"centrifuge", "1 g bin", "full similarity at 1 g"}; !slices.Equal(got, want) {
			t.Errorf("cheapest=%v: ranking %v, want %v", cheapest, got, want)
		}
	}
}

func TestRankSettingProblems(t *testing.T) {
	cases := []struct {
		settings []string
		want     string
	}{
		{[]string{"weak_laws", "gravty"}, `weak_laws: unknown law "gravty" (did you mean gravity?)`},
		{[]string{"governing_laws", "viscosity, elastic"}, `governing_laws: unknown law "elastic" (did you mean elasticity?)`},
		{[]string{"weak_laws", "gravity", "governing_laws", "gravity"}, "gravity is both weak and governing"},
		{[]string{"mismatch_threshold", "0.5"}, "mismatch_threshold: \"0.5\" must be a factor of at least 1"},
	}
	for _, c := range cases {
		msg := prepareErr(t, anchorStudy(t, c.settings...))
		if !strings.Contains(msg, c.want) || !strings.Contains(msg, "Study!B10") {
			t.Errorf("%v: got %q, want %q with its cell", c.settings, msg, c.want)
		}
	}
}

// A strategy with no window is explained by the combination that comes
// closest to one (the largest margin over the grid), named when its
// combinations give different reasons; one reason shared by all is given
// alone.
func TestFailingReasonOfClosestCombination(t *testing.T) {
	s, err := study.LoadScenario("tug")
	if err != nil {
		t.Fatal(err)
	}
	res := runStudy(t, s)
	checked := 0
	for _, sr := range res.Strategies {
		if sr.Best != nil || len(sr.Combos) < 2 {
			continue
		}
		var closest *ComboResult
		peak := math.Inf(-1)
		reasons := map[string]bool{}
		for _, c := range sr.Combos {
			reasons[c.Failing] = true
			for _, m := range c.Margins {
				if m > peak {
					closest, peak = c, m
				}
			}
		}
		if closest == nil {
			t.Fatalf("%s: no combination has margins", sr.Name)
		}
		want := closest.Failing
		if len(reasons) > 1 {
			want = closest.Medium + " in " + closest.Facility + ": " + closest.Failing
		}
		if got := FailingReason(sr); got != want {
			t.Errorf("%s: reason\n%q, want that of the closest combination\n%q", sr.Name, got, want)
		}
		checked++
	}
	if checked < 2 {
		t.Errorf("only %d strategies without a window checked", checked)
	}
}
