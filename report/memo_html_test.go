package report_test

import (
	"bytes"
	"context"
	"encoding/base64"
	"os"
	"path/filepath"
	"regexp"
	"strconv"
	"strings"
	"testing"

	"scaleplan/report"
)

var dataURIRE = regexp.MustCompile(`src="data:image/png;base64,([A-Za-z0-9+/=]+)"`)

// TestMemoHTMLEveryScenario writes every built-in scenario and checks its
// HTML memo: one self-contained page that embeds every PNG map of the
// study as a data URI (each a PNG), with real tables, and shows no raw
// identifier of the label table and no E-notation; the Markdown memo
// links the same maps with numbered captions.
func TestMemoHTMLEveryScenario(t *testing.T) {
	for _, sc := range wbScenarios(t) {
		t.Run(sc.Name, func(t *testing.T) {
			res := wbRunScenario(t, sc.Name)
			dir := t.TempDir()
			files, err := report.WriteStudy(context.Background(), dir, res)
			if err != nil {
				t.Fatal(err)
			}
			var pngs []string
			var page, memo []byte
			for _, f := range files {
				switch {
				case strings.HasSuffix(f, ".png"):
					pngs = append(pngs, filepath.Base(f))
				case strings.HasSuffix(f, ".memo.html"):
					page, err = os.ReadFile(f)
				case strings.HasSuffix(f, ".memo.md"):
					memo, err = os.ReadFile(f)
				}
				if err != nil {
					t.Fatal(err)
				}
			}
			if page == nil || memo == nil {
				t.Fatalf("no HTML or Markdown memo among %v", files)
			}
			if len(pngs) == 0 {
				t.Fatal("the study wrote no map")
			}
			uris := dataURIRE.FindAllSubmatch(page, -1)
			if len(uris) != len(pngs) {
				t.Errorf("the HTML memo embeds %d figures, the study wrote %d maps", len(uris), len(pngs))
			}
			for _, u := range uris {
				img, err := base64.StdEncoding.DecodeString(string(u[1]))
				if err != nil || !bytes.HasPrefix(img, []byte("\x89PNG\r\n\x1a\n")) {
					t.Errorf("an embedded figure is not a PNG (%v)", err)
				}
			}
			if bytes.Contains(page, []byte(`src="`+pngs[0])) || bytes.Contains(page, []byte("<link")) || bytes.Contains(page, []byte("<script")) {
				t.Error("the HTML memo refers to files beside it: it must stand alone")
			}
			if !bytes.Contains(page, []byte("<table>")) || !bytes.Contains(page, []byte("<th>")) {
				t.Error("the HTML memo has no real table")
			}
			text := dataURIRE.ReplaceAll(page, nil)
			for _, id := range report.RawIdentifiers() {
				if regexp.MustCompile(`\b` + regexp.QuoteMeta(id) + `\b`).Match(text) {
					t.Errorf("the HTML memo shows the raw identifier %q", id)
				}
			}
			if m := regexp.MustCompile(`[0-9]e[+-][0-9]`).Find(text); m != nil {
				t.Errorf("the HTML memo uses E-notation: %q", m)
			}
			if regexp.MustCompile(`k_[a-z]`).Match(text) {
				t.Error("the HTML memo shows a scale law with raw symbols (k_…)")
			}
			// Tables a document converter keeps whole: at most five columns.
			for _, line := range strings.Split(string(memo), "\n") {
				if strings.HasPrefix(line, "|") {
					if n := strings.Count(strings.ReplaceAll(line, `\|`, ""), "|") - 1; n > 5 {
						t.Errorf("the Markdown memo has a table of %d columns: %s", n, line)
					}
				}
			}
			for i, p := range pngs {
				link := "](" + p + ")"
				if !bytes.Contains(memo, []byte(link)) {
					t.Errorf("the Markdown memo does not link map %s", p)
				}
				if !bytes.Contains(memo, []byte("*Figure "+strconv.Itoa(i+1)+". ")) {
					t.Errorf("the Markdown memo has no caption for figure %d", i+1)
				}
			}
		})
	}
}

// TestMemoPredictSetting: the prediction rules cover the quantities the
// study measures, and those its predict setting adds (a resistance test
// predicts force and power from the model).
func TestMemoPredictSetting(t *testing.T) {
	s := wbLoad(t, "tug")
	before := report.Memo(wbRun(t, s))
	if strings.Contains(before, "| force |") || !strings.Contains(before, "| length |") {
		t.Fatalf("the tug's memo without predict: want rules for length, none for force:\n%s", before)
	}
	set := s.Settings["predict"]
	set.Name, set.Value = "predict", "force, power"
	set.Cell.Sheet, set.Cell.Row, set.Cell.Col = "Study", 40, 2
	s.Settings["predict"] = set
	after := report.Memo(wbRun(t, s))
	// Froude scaling: force ∝ kL³·kρ·kg and power ∝ kL^(7/2)·kρ·kg^(3/2)
	// (common practice).
	for _, want := range []string{"| force | kL^3 · k(density) · k(gravity) |", "| power | kL^(7/2) · k(density) · k(gravity)^(3/2) |"} {
		if !strings.Contains(after, want) {
			t.Errorf("with predict = force, power the memo lacks %q", want)
		}
	}
}
