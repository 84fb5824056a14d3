package report_test

import (
	"bytes"
	"encoding/json"
	"path/filepath"
	"strings"
	"testing"

	"scaleplan/report"
)

// TestRecipesInEveryOutput: the slurry scenario's water–glycerol candidate
// is tuned per band of scales (sweep/recipe.go); its recipe must appear in
// the terminal (short form), the memo (a sentence naming the fraction per
// band), the Windows sheet (a column for the required property) and
// --json (required[].recipe and recipes[]). The tug's substitute, which no
// recipe reaches, gives its unmet requirement in --json.
func TestRecipesInEveryOutput(t *testing.T) {
	res := wbRunScenario(t, "slurry")
	var text bytes.Buffer
	if err := report.WriteRunText(&text, res); err != nil {
		t.Fatal(err)
	}
	if !strings.Contains(text.String(), "kinematic_viscosity at 1:2.5: water_glycerol: 20 °C, w = 0.8") {
		t.Errorf("terminal lacks the recipe at the recommended scale:\n%s", text.String())
	}
	memo := report.Memo(res)
	if !strings.Contains(memo, "Mix water and glycerol (w: mass fraction of glycerol) at 20 °C: w = 0.792 for scales 1:2.5 to") {
		t.Errorf("memo lacks the recipe sentence:\n%s", memo)
	}
	path := filepath.Join(t.TempDir(), "slurry.xlsx")
	if err := report.WriteWorkbook(path, res); err != nil {
		t.Fatal(err)
	}
	rows := wbRows(t, wbOpen(t, path), "Windows")
	col := -1
	for i, h := range rows[0] {
		if h == "recipe per scale band: kinematic_viscosity" {
			col = i
		}
	}
	if col < 0 {
		t.Fatalf("Windows header %v lacks the recipe column", rows[0])
	}
	found := false
	for _, r := range rows[1:] {
		if wbAt(r, 3) == "loop mix" {
			found = strings.HasPrefix(wbAt(r, col), "1:2.5–1:2.84 water_glycerol: 20 °C, w = 0.79")
			if !found {
				t.Errorf("loop mix recipe cell %q", wbAt(r, col))
			}
		}
	}
	if !found {
		t.Error("no loop mix row with its recipes")
	}
	var data struct {
		Strategies []struct {
			Best *struct {
				Required []struct {
					Quantity string `json:"quantity"`
					Recipe   *struct {
						Entry, Conditions string
					} `json:"recipe"`
					Recipes []struct {
						From float64 `json:"from_kL"`
						To   float64 `json:"to_kL"`
					} `json:"recipes"`
				} `json:"required"`
			} `json:"best"`
			Unmet []struct {
				Quantity string `json:"quantity"`
				Reason   string `json:"reason"`
			} `json:"unmet"`
		} `json:"strategies"`
	}
	decode := func(v any, into any) {
		t.Helper()
		b, err := json.Marshal(v)
		if err != nil {
			t.Fatal(err)
		}
		if err := json.Unmarshal(b, into); err != nil {
			t.Fatal(err)
		}
	}
	decode(report.RunData(res, nil), &data)
	req := data.Strategies[0].Best.Required[0]
	if req.Quantity != "kinematic_viscosity" || req.Recipe == nil || req.Recipe.Entry != "water_glycerol" || len(req.Recipes) < 2 || req.Recipes[0].From != 2.5 {
		t.Errorf("--json required[0] = %+v, want water_glycerol recipes from 1:2.5", req)
	}
	tug := wbRunScenario(t, "tug")
	data.Strategies = nil
	decode(report.RunData(tug, nil), &data)
	unmet := false
	for _, s := range data.Strategies {
		for _, u := range s.Unmet {
			unmet = unmet || (u.Quantity == "kinematic_viscosity" && strings.Contains(u.Reason, "least viscous liquid the library can make"))
		}
	}
	if !unmet {
		t.Error("tug --json lacks the unmet viscosity with the least viscous liquid")
	}
}
