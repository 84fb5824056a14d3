package sweep

import (
	"crypto/sha256"
	"encoding/binary"
	"encoding/hex"
	"encoding/json"
	"flag"
	"fmt"
	"math"
	"os"
	"path/filepath"
	"sort"
	"strconv"
	"strings"
	"testing"

	"scaleplan/sweep/study"
)

// The scenario golden records every built-in scenario's windows (edges at
// full precision, with the limits that set them), requirements, robust
// windows and grid margins as the sweep found them before the analytic
// rewrite of issue 17, so that the rewrite can be checked to change none
// of them. Rewrite it with `go test ./sweep -run TestScenarioGolden -update`
// only for an intended change, and read the diff.

func init() {
	// Another test file may declare the same flag.
	if flag.Lookup("update") == nil {
		flag.Bool("update", false, "rewrite the golden files under testdata/golden")
	}
}

func updatingGolden() bool {
	f := flag.Lookup("update")
	return f != nil && f.Value.String() == "true"
}

const scenarioGoldenPath = "testdata/golden/scenarios.json"

type goldenInterval struct {
	Lo, Hi           string
	LoLimit, HiLimit string
}

type goldenRequirement struct {
	Capability, Limit string
	AtLeast, Exact    bool
	Values            string // space-separated, one per grid point
}

type goldenCombo struct {
	Strategy, Case, Medium, Material, Facility string
	Axis, Recommended, AnyFacility             string
	Window                                     []goldenInterval
	Failing                                    string
	Requirements                               []goldenRequirement `json:",omitempty"`
	Robust                                     []goldenInterval    `json:",omitempty"`
	RobustProbability                          string              `json:",omitempty"` // digest
	Margins                                    string              `json:",omitempty"` // digest of margins and limiting limits
	AxisMargins                                string              `json:",omitempty"` // digest
	AxisMeasures                               string              `json:",omitempty"` // digest
	Best                                       bool                `json:",omitempty"`
}

func fullPrecision(v float64) string { return strconv.FormatFloat(v, 'g', -1, 64) }

func goldenWindow(w Window) []goldenInterval {
	out := []goldenInterval{}
	for _, iv := range w {
		out = append(out, goldenInterval{fullPrecision(iv.Lo), fullPrecision(iv.Hi), iv.LoLimit, iv.HiLimit})
	}
	return out
}

// digest is a SHA-256 of the exact bits of float rows (and integers),
// for arrays too long to keep in the golden file.
func digest(rows [][]float64, ints []int) string {
	if rows == nil && ints == nil {
		return ""
	}
	h := sha256.New()
	var b [8]byte
	for _, r := range rows {
		binary.LittleEndian.PutUint64(b[:], uint64(len(r)))
		h.Write(b[:])
		for _, v := range r {
			binary.LittleEndian.PutUint64(b[:], math.Float64bits(v))
			h.Write(b[:])
		}
	}
	for _, v := range ints {
		binary.LittleEndian.PutUint64(b[:], uint64(int64(v)))
		h.Write(b[:])
	}
	return hex.EncodeToString(h.Sum(nil))[:24]
}

func goldenOf(c *ComboResult, best bool) goldenCombo {
	g := goldenCombo{Strategy: c.Strategy, Case: c.Case, Medium: c.Medium, Material: c.Material, Facility: c.Facility,
		Axis: fullPrecision(c.Axis), Recommended: fullPrecision(c.Recommended), AnyFacility: fullPrecision(c.AnyFacility),
		Window: goldenWindow(c.Window), Failing: c.Failing, Best: best}
	for _, r := range c.Requirements {
		gr := goldenRequirement{Capability: r.Capability, Limit: r.Limit, AtLeast: r.AtLeast, Exact: r.Exact}
		vs := make([]string, r.Len())
		for i, v := range r.All() {
			vs[i] = fullPrecision(v)
		}
		gr.Values = strings.Join(vs, " ")
		g.Requirements = append(g.Requirements, gr)
	}
	if c.Robust != nil {
		g.Robust = goldenWindow(c.Robust.Window)
		g.RobustProbability = digest([][]float64{c.Robust.Probability}, nil)
	}
	if c.Margins != nil {
		g.Margins = digest([][]float64{c.Margins}, c.Limiting)
	}
	g.AxisMargins = digest(c.AxisMarginRows(), nil)
	if ms := c.AxisMeasureRows(); ms != nil {
		names := make([]string, 0, len(ms))
		for n := range ms {
			names = append(names, n)
		}
		sort.Strings(names)
		var rows [][]float64
		for _, n := range names {
			rows = append(rows, ms[n]...)
		}
		g.AxisMeasures = digest(rows, nil)
	}
	return g
}

func scenarioGolden(t *testing.T) map[string][]goldenCombo {
	t.Helper()
	list, err := study.Scenarios()
	if err != nil {
		t.Fatal(err)
	}
	studies := map[string]*study.Study{}
	for _, sc := range list {
		studies[sc.Name] = scenario(t, sc.Name)
	}
	// A small synthetic study: a facility capability as second axis and a
	// limit that is a sum (the run length).
	studies["synthetic"] = study.Synthetic(60, 7, 3, 4)
	// A medium condition as second axis (limits compiled per axis value).
	tt := scenario(t, "tug")
	tt.Settings["axis"] = study.Setting{Name: "axis", Value: "temperature", Cell: study.Cell{Sheet: "Study", Row: 40, Col: 2}}
	tt.Settings["axis_from"] = study.Setting{Name: "axis_from", Value: "5", Unit: "C", Cell: study.Cell{Sheet: "Study", Row: 41, Col: 2}}
	tt.Settings["axis_to"] = study.Setting{Name: "axis_to", Value: "30", Unit: "C", Cell: study.Cell{Sheet: "Study", Row: 42, Col: 2}}
	tt.Settings["axis_points"] = study.Setting{Name: "axis_points", Value: "6", Cell: study.Cell{Sheet: "Study", Row: 43, Col: 2}}
	studies["tug-temperature-axis"] = tt
	out := map[string][]goldenCombo{}
	for name, s := range studies {
		res := runStudy(t, s)
		for _, sr := range res.Strategies {
			for _, c := range append(append([]*ComboResult(nil), sr.Combos...), sr.Joint...) {
				out[name] = append(out[name], goldenOf(c, c == sr.Best))
			}
		}
	}
	return out
}

// TestScenarioGolden compares every scenario's windows, requirements and
// robust windows with the golden file at full precision. Requirements the
// golden file records as found by bisection (to 0.1 % in the capability)
// may now be found exactly: they must agree within that bisection's
// half-bracket, 1.25e-4 in the log of the capability.
func TestScenarioGolden(t *testing.T) {
	got := scenarioGolden(t)
	if updatingGolden() {
		b, err := json.MarshalIndent(got, "", " ")
		if err != nil {
			t.Fatal(err)
		}
		if err := os.MkdirAll(filepath.Dir(scenarioGoldenPath), 0o755); err != nil {
			t.Fatal(err)
		}
		if err := os.WriteFile(scenarioGoldenPath, append(b, '\n'), 0o644); err != nil {
			t.Fatal(err)
		}
		return
	}
	b, err := os.ReadFile(scenarioGoldenPath)
	if err != nil {
		t.Fatalf("%v (write it with -update)", err)
	}
	var want map[string][]goldenCombo
	if err := json.Unmarshal(b, &want); err != nil {
		t.Fatal(err)
	}
	if len(got) != len(want) {
		t.Fatalf("%d scenarios, golden has %d", len(got), len(want))
	}
	for name, ws := range want {
		gs := got[name]
		if len(gs) != len(ws) {
			t.Errorf("%s: %d combinations, golden has %d", name, len(gs), len(ws))
			continue
		}
		for i := range ws {
			compareGolden(t, fmt.Sprintf("%s #%d (%s, %s, %s, %s)", name, i, ws[i].Strategy, ws[i].Case, ws[i].Medium, ws[i].Facility), gs[i], ws[i])
		}
	}
}

func compareGolden(t *testing.T, at string, g, w goldenCombo) {
	t.Helper()
	gr, wr := g.Requirements, w.Requirements
	g.Requirements, w.Requirements = nil, nil
	gj, _ := json.Marshal(g)
	wj, _ := json.Marshal(w)
	if string(gj) != string(wj) {
		t.Errorf("%s:\n got  %s\n want %s", at, gj, wj)
	}
	if len(gr) != len(wr) {
		t.Errorf("%s: %d requirements, golden has %d", at, len(gr), len(wr))
		return
	}
	for k := range wr {
		a, b := gr[k], wr[k]
		av, bv := strings.Fields(a.Values), strings.Fields(b.Values)
		if a.Capability != b.Capability || a.Limit != b.Limit || a.AtLeast != b.AtLeast || len(av) != len(bv) {
			t.Errorf("%s: requirement %d is %s (%s, at least %v, %d values), golden %s (%s, at least %v, %d values)",
				at, k, a.Capability, a.Limit, a.AtLeast, len(av), b.Capability, b.Limit, b.AtLeast, len(bv))
			continue
		}
		if b.Exact && !a.Exact {
			t.Errorf("%s: requirement %s (%s) was exact and is not any more", at, a.Capability, a.Limit)
		}
		for i := range bv {
			if b.Exact {
				if av[i] != bv[i] {
					t.Errorf("%s: %s (%s) at grid point %d is %s, golden %s", at, a.Capability, a.Limit, i, av[i], bv[i])
					break
				}
				continue
			}
			x, _ := strconv.ParseFloat(av[i], 64)
			y, _ := strconv.ParseFloat(bv[i], 64)
			if math.IsNaN(x) != math.IsNaN(y) || (!math.IsNaN(y) && math.Abs(math.Log(x/y)) > 1.25e-4*(1+1e-9)) {
				t.Errorf("%s: %s (%s) at grid point %d is %s, golden %s (found by bisection to 0.1 %%)", at, a.Capability, a.Limit, i, av[i], bv[i])
				break
			}
		}
	}
}
