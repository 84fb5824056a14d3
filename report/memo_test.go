package report_test

import (
	"math"
	"regexp"
	"strconv"
	"strings"
	"testing"

	"scaleplan/report"
	"scaleplan/sweep"
)

// wbMemoSection returns the text of a "## title" section of the memo.
func wbMemoSection(t *testing.T, memo, title string) string {
	t.Helper()
	_, rest, ok := strings.Cut(memo, "\n## "+title+"\n")
	if !ok {
		t.Fatalf("the memo has no section %q:\n%s", title, memo)
	}
	if i := strings.Index(rest, "\n## "); i >= 0 {
		rest = rest[:i]
	}
	return rest
}

// wbMemoTable splits the rows of the first Markdown table of a section
// into cells (header and rule rows left out).
func wbMemoTable(section string) [][]string {
	var rows [][]string
	for _, line := range strings.Split(section, "\n") {
		if !strings.HasPrefix(line, "|") {
			if len(rows) > 0 {
				break
			}
			continue
		}
		// Cells are split at unescaped bars.
		line = strings.TrimSuffix(strings.TrimPrefix(line, "|"), "|")
		var cells []string
		var cur strings.Builder
		for i := 0; i < len(line); i++ {
			switch {
			case line[i] == '\\' && i+1 < len(line) && line[i+1] == '|':
				cur.WriteByte('|')
				i++
			case line[i] == '|':
				cells = append(cells, strings.TrimSpace(cur.String()))
				cur.Reset()
			default:
				cur.WriteByte(line[i])
			}
		}
		cells = append(cells, strings.TrimSpace(cur.String()))
		rows = append(rows, cells)
	}
	if len(rows) >= 2 {
		rows = rows[2:] // header and |---|
	}
	return rows
}

// wbMemoMoney parses a cost as the memo prints it ("16,070 EUR").
func wbMemoMoney(s, currency string) (float64, bool) {
	v, err := strconv.ParseFloat(strings.ReplaceAll(strings.TrimSuffix(s, " "+currency), ",", ""), 64)
	return v, err == nil
}

// wbCheckMemo checks that the memo tells the same story as the workbook:
// the same window, edges, recommended scale and cost per strategy as the
// Summary sheet, the strategy recommended by the rule of the study, and
// the cautions.
func wbCheckMemo(t *testing.T, memo string, res *sweep.Result, sum wbSummary) {
	t.Helper()
	st := res.Plan.Settings
	if !strings.HasPrefix(memo, "# Model test proposal: "+res.Name+"\n") {
		t.Errorf("the memo does not open with the study %q", res.Name)
	}
	if st.Purpose != "" && !strings.Contains(memo, st.Purpose) {
		t.Errorf("the memo does not state the purpose %q", st.Purpose)
	}
	if !strings.Contains(memo, "k = prototype value / model value") {
		t.Error("the memo does not state the scale convention")
	}

	// The table of strategies against the Summary sheet.
	rows := wbMemoTable(wbMemoSection(t, memo, "Strategies compared"))
	if len(rows) != len(res.Strategies) {
		t.Fatalf("the memo compares %d strategies, the study has %d", len(rows), len(res.Strategies))
	}
	for i, sr := range res.Strategies {
		row := rows[i]
		if len(row) != 5 {
			t.Errorf("memo row %q: %d cells, want 5 (a document converter breaks wider tables)", row, len(row))
			continue
		}
		if want := sr.Name + " (" + report.Label(sr.Technique) + ")"; row[0] != want {
			t.Errorf("memo row %d: %q, want %q", i+1, row[0], want)
		}
		if sr.Best == nil {
			if row[1] != "none" || sum.cell(i, "window (1:x)") != "none" {
				t.Errorf("memo row %q: window %q, Summary %q, want none in both", sr.Name, row[1], sum.cell(i, "window (1:x)"))
			}
			continue
		}
		if got, want := row[1], sum.cell(i, "window (1:x)"); got != want {
			t.Errorf("strategy %q: the memo says window %q, the Summary %q", sr.Name, got, want)
		}
		// The memo names the limits in its own words (labels for the
		// identifiers sweep puts into generated limit names).
		if got, want := row[2], report.MemoWords(res, sum.cell(i, "large-model edge")+" / "+sum.cell(i, "small-model edge")); got != want {
			t.Errorf("strategy %q: the memo says the edges are set by %q, the Summary %q", sr.Name, got, want)
		}
		if got, want := row[3], sum.cell(i, "recommended (1:x)"); got != want {
			t.Errorf("strategy %q: the memo recommends %q, the Summary %q", sr.Name, got, want)
		}
		wbCheckMemoCost(t, "strategy "+sr.Name+" in the memo's table", row[4], sum.cell(i, "cost ["), st.Currency)
	}

	// The recommendation.
	rec := wbMemoSection(t, memo, "Recommendation")
	name, ok := wbRecommended[res.Name]
	if !ok {
		t.Fatalf("no recommendation worked out by hand for study %q", res.Name)
	}
	var best *sweep.StrategyResult
	for _, sr := range res.Strategies {
		if sr.Name == name {
			best = sr
		}
	}
	if name != "" && (best == nil || best.Best == nil) {
		t.Fatalf("study %q: strategy %q, recommended by hand, has no feasible scale", res.Name, name)
	}
	if best == nil {
		if !strings.Contains(rec, "No strategy has a feasible scale") {
			t.Errorf("no strategy is feasible, but the memo recommends:\n%s", rec)
		}
	} else {
		i := -1
		for j, sr := range res.Strategies {
			if sr == best {
				i = j
			}
		}
		c := best.Best
		large, small := report.Edges(c.Window)
		for _, want := range []string{"**" + best.Name + "**", "**" + sweep.Scale(c.Recommended) + "**",
			report.WindowText(c.Window), report.MemoWords(res, large), report.MemoWords(res, small), report.Candidate(c)} {
			if !strings.Contains(rec, want) {
				t.Errorf("the recommendation does not say %q:\n%s", want, rec)
			}
		}
		if sum.cell(i, "recommended (1:x)") != sweep.Scale(c.Recommended) || sum.cell(i, "window (1:x)") != report.WindowText(c.Window) {
			t.Errorf("the Summary row of the recommended strategy %q disagrees with the memo", best.Name)
		}
		if !math.IsNaN(c.ModelLength) {
			m := regexp.MustCompile(`a model (\S+) m long`).FindStringSubmatch(rec)
			wb, err := strconv.ParseFloat(sum.cell(i, "model length [m]"), 64)
			if m == nil || err != nil {
				t.Errorf("model length: memo %q, Summary %q", m, sum.cell(i, "model length [m]"))
			} else if v, err := strconv.ParseFloat(m[1], 64); err != nil || math.Abs(v-wb) > 0.006*math.Abs(wb) {
				t.Errorf("model length: the memo says %s m, the Summary %s m", m[1], sum.cell(i, "model length [m]"))
			}
		}
		if !math.IsNaN(c.Cost) {
			m := regexp.MustCompile(`estimated at (\S+ \S+) at this scale`).FindStringSubmatch(rec)
			if m == nil {
				t.Errorf("the recommendation states no cost:\n%s", rec)
			} else {
				wbCheckMemoCost(t, "the recommendation", m[1], sum.cell(i, "cost ["), st.Currency)
			}
		}
	}

	cautions := wbMemoSection(t, memo, "Cautions")
	for _, c := range report.Cautions {
		if !strings.Contains(cautions, c) {
			t.Errorf("the memo's cautions lack %q (§13)", c)
		}
	}
}

// wbCheckMemoCost checks a cost the memo prints (to four significant
// figures) against the Summary cell.
func wbCheckMemoCost(t *testing.T, where, memo, cell, currency string) {
	t.Helper()
	if cell == "" {
		if memo != "–" && memo != "" {
			t.Errorf("%s: cost %q, but the Summary has none", where, memo)
		}
		return
	}
	v, ok := wbMemoMoney(memo, currency)
	w, err := strconv.ParseFloat(cell, 64)
	if !ok || err != nil || math.Abs(v-w) > 0.5*math.Max(1, math.Pow(10, math.Floor(math.Log10(math.Abs(w)))-3)) {
		t.Errorf("%s: cost %q, the Summary %q %s (want it to four significant figures)", where, memo, cell, currency)
	}
}
