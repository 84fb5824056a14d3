package main

import (
	"encoding/json"
	"path/filepath"
	"strings"
	"testing"
)

// TestCheckWarningsExitZero: warnings alone are printed with their count
// and check exits 0; a problem in one of several studies exits 1 and names
// the study and the place.
func TestCheckWarningsExitZero(t *testing.T) {
	code, out, errs := hRun("check", "testdata/anchor-with-strays")
	if code != 0 || !strings.Contains(out, "testdata/anchor-with-strays: 2 warnings:") ||
		!strings.Contains(out, "  Limit.csv is not a sheet of a study; did you mean Limits.csv?") ||
		!strings.Contains(out, "no problems (3 strategies, 400 grid points), 2 warnings") {
		t.Errorf("exit %d\nstdout %s\nstderr %s", code, out, errs)
	}
	bad := filepath.Join("..", "..", "testdata", "hostile", "duplicates")
	code, out, errs = hRun("check", "testdata/drag-anchor", bad, "testdata/anchor-with-strays")
	if code != 1 {
		t.Errorf("exit %d, want 1", code)
	}
	if !strings.Contains(errs, bad+":\n  Study!A15: setting \"Points\" is given twice") ||
		!strings.Contains(errs, "scaleplan: 1 of 3 studies have problems") {
		t.Errorf("stderr %s", errs)
	}
	if !strings.Contains(out, "testdata/drag-anchor: no problems") || !strings.Contains(out, "anchor-with-strays: 2 warnings") {
		t.Errorf("stdout %s", out)
	}
	if code, _, _ := hRun("check"); code != 2 {
		t.Errorf("check without a study: exit %d, want 2", code)
	}
}

func TestCheckJSON(t *testing.T) {
	bad := filepath.Join("..", "..", "testdata", "hostile", "duplicates")
	code, out, _ := hRun("check", "testdata/anchor-with-strays", bad, "--json")
	if code != 1 {
		t.Errorf("exit %d, want 1", code)
	}
	var data []struct {
		Study    string
		OK       bool
		Problems []struct{ Place, Message string }
		Warnings []string
	}
	if err := json.Unmarshal([]byte(out), &data); err != nil {
		t.Fatalf("%v\n%s", err, out)
	}
	if len(data) != 2 || !data[0].OK || len(data[0].Warnings) != 2 || len(data[0].Problems) != 0 {
		t.Fatalf("%+v", data)
	}
	if data[1].OK || len(data[1].Problems) != 1 || data[1].Problems[0].Place != "Study!A15" ||
		!strings.Contains(data[1].Problems[0].Message, `setting "Points" is given twice`) {
		t.Errorf("%+v", data[1])
	}
}

// TestRunJSONKeys runs every built-in scenario (and a study that cannot
// run) with --json and walks the keys spec §10 lists.
func TestRunJSONKeys(t *testing.T) {
	if testing.Short() {
		t.Skip("runs every scenario")
	}
	dir := t.TempDir()
	code, out, errs := hRun("run", "--json", "--out", filepath.Join(dir, "out"))
	if code != 0 {
		t.Fatalf("exit %d: %s", code, errs)
	}
	var studies []map[string]any
	if err := json.Unmarshal([]byte(out), &studies); err != nil {
		t.Fatalf("%v\n%s", err, out)
	}
	if len(studies) != 9 {
		t.Errorf("%d studies, want the 9 scenarios", len(studies))
	}
	for _, s := range studies {
		walkStudy(t, s)
	}
	// A study that fails has error instead of strategies.
	code, out, _ = hRun("run", "--json", "--out", filepath.Join(dir, "out2"), filepath.Join("..", "..", "testdata", "hostile", "duplicates"))
	if code != 1 {
		t.Errorf("exit %d, want 1", code)
	}
	var failed []map[string]any
	if err := json.Unmarshal([]byte(out), &failed); err != nil || len(failed) != 1 {
		t.Fatalf("%v\n%s", err, out)
	}
	if _, ok := failed[0]["strategies"]; ok || !strings.Contains(str(failed[0]["error"]), `setting "Points" is given twice`) || failed[0]["study"] == nil {
		t.Errorf("failed study: %v", failed[0])
	}
}

func str(v any) string { s, _ := v.(string); return s }

// keys fails the test unless m has every key, of the kind given: "s"
// string, "n" number, "b" bool, "a" array, "o" object, "n?" number or
// null, "o?" object or null, "a?" array or null.
func keys(t *testing.T, where string, m map[string]any, want map[string]string) {
	t.Helper()
	for k, kind := range want {
		v, ok := m[k]
		if !ok {
			t.Errorf("%s: no key %q", where, k)
			continue
		}
		if strings.HasSuffix(kind, "?") && v == nil {
			continue
		}
		good := false
		switch strings.TrimSuffix(kind, "?") {
		case "s":
			_, good = v.(string)
		case "n":
			_, good = v.(float64)
		case "b":
			_, good = v.(bool)
		case "a":
			_, good = v.([]any)
		case "o":
			_, good = v.(map[string]any)
		}
		if !good {
			t.Errorf("%s: %q is %T (%v), want %s", where, k, v, v, kind)
		}
	}
}

func objects(v any) []map[string]any {
	var out []map[string]any
	list, _ := v.([]any)
	for _, x := range list {
		if m, ok := x.(map[string]any); ok {
			out = append(out, m)
		}
	}
	return out
}

func walkStudy(t *testing.T, s map[string]any) {
	t.Helper()
	name := str(s["study"])
	keys(t, name, s, map[string]string{"study": "s", "convention": "s", "axis": "o?", "warnings": "a", "strategies": "a", "ranking": "a", "outputs": "a"})
	if ax, ok := s["axis"].(map[string]any); ok {
		keys(t, name+" axis", ax, map[string]string{"name": "s", "unit": "s"})
	}
	strategies := objects(s["strategies"])
	if len(strategies) == 0 {
		t.Errorf("%s: no strategies", name)
	}
	for _, st := range strategies {
		where := name + "/" + str(st["name"])
		keys(t, where, st, map[string]string{"name": "s", "technique": "s", "feasible": "b", "reason": "s", "warnings": "a", "relaxed": "a", "best": "o?"})
		for _, r := range objects(st["relaxed"]) {
			keys(t, where+" relaxed", r, map[string]string{"law": "s", "group": "s", "ratio": "n?"})
		}
		best, ok := st["best"].(map[string]any)
		if feasible, _ := st["feasible"].(bool); feasible != ok {
			t.Errorf("%s: feasible %v but best %v", where, feasible, st["best"])
		}
		if !ok {
			continue
		}
		keys(t, where+" best", best, map[string]string{"medium": "s", "material": "s", "facility": "s", "axis_value": "n?",
			"window": "a", "recommended_kL": "n", "recommended_scale": "s", "model_length_m": "n?", "cost": "n?",
			"cheapest_kL": "n?", "cheapest_cost": "n?", "robust_window": "a?", "required": "a"})
		for _, field := range []string{"window", "robust_window"} {
			for _, iv := range objects(best[field]) {
				keys(t, where+" "+field, iv, map[string]string{"from_kL": "n", "to_kL": "n", "large_model_edge": "s", "small_model_edge": "s"})
			}
		}
		if len(objects(best["window"])) == 0 {
			t.Errorf("%s: a feasible strategy with an empty window", where)
		}
		for _, rq := range objects(best["required"]) {
			keys(t, where+" required", rq, map[string]string{"quantity": "s", "unit": "s", "at_recommended": "n?", "matches": "a"})
			for _, m := range objects(rq["matches"]) {
				keys(t, where+" match", m, map[string]string{"entry": "s", "conditions": "s", "value": "n?"})
			}
		}
	}
	ranking := objects(s["ranking"])
	if len(ranking) != len(strategies) {
		t.Errorf("%s: %d ranked, %d strategies", name, len(ranking), len(strategies))
	}
	for i, r := range ranking {
		keys(t, name+" ranking", r, map[string]string{"strategy": "s", "rank": "n", "reason": "s"})
		if r["rank"] != float64(i+1) {
			t.Errorf("%s: ranking %d has rank %v", name, i, r["rank"])
		}
	}
	if len(objects(s["outputs"])) != 0 || len(s["outputs"].([]any)) == 0 {
		t.Errorf("%s: outputs %v", name, s["outputs"])
	}
}
