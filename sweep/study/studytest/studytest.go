// Package studytest gives tests studies as files: a minimal valid folder
// study, a folder written from its sheets, and checks of the problems and
// warnings that reading and preparing report. It does not import package
// study, so that the tests of study itself may use it.
package studytest

import (
	"errors"
	"fmt"
	"os"
	"path/filepath"
	"strings"
	"testing"
)

// MinimalCSV is a valid folder study, sheet by sheet (name → content).
func MinimalCSV() map[string]string {
	return map[string]string{
		"Study":      "setting,value,unit,note\nname,mini,,\nscale_from,10,,\nscale_to,50,,\n",
		"Prototype":  "item,value,unit,scales_as,note\nhull_length,120,m,length,\n",
		"Strategies": "strategy,case,technique,retain,relax,untie,given,tuned,fix,media,materials,facilities,correction,note\nfroude,,dominant,\"inertia, gravity\",viscosity,,,,,,,,,\n",
	}
}

// WriteFolder writes the sheets (name → content) as NAME.csv in a new
// folder and returns it.
func WriteFolder(t testing.TB, sheets map[string]string) string {
	t.Helper()
	dir := filepath.Join(t.TempDir(), "study")
	if err := os.Mkdir(dir, 0o755); err != nil {
		t.Fatal(err)
	}
	for name, content := range sheets {
		if err := os.WriteFile(filepath.Join(dir, name+".csv"), []byte(content), 0o644); err != nil {
			t.Fatal(err)
		}
	}
	return dir
}

// ProblemLines is the problems of err (study.Problems), one line each; it
// fails the test when err is not nil and not a list of problems.
func ProblemLines(t testing.TB, err error) []string {
	t.Helper()
	if err == nil {
		return nil
	}
	var ps interface{ Lines() []string }
	if !errors.As(err, &ps) {
		t.Fatalf("error is not Problems: %v", err)
	}
	return ps.Lines()
}

// CheckProblems checks that every wanted problem was reported, and that
// there are no problems when none are wanted.
func CheckProblems(t testing.TB, err error, want []string) {
	t.Helper()
	got := ProblemLines(t, err)
	if len(want) == 0 && len(got) > 0 {
		t.Fatalf("unexpected problems:\n%s", strings.Join(got, "\n"))
	}
	for _, w := range want {
		found := false
		for _, g := range got {
			if g == w {
				found = true
			}
		}
		if !found {
			t.Errorf("missing problem\n  %s\ngot:\n  %s", w, strings.Join(got, "\n  "))
		}
	}
}

// HasWarning fails the test unless exactly one warning holds every part.
func HasWarning[W fmt.Stringer](t testing.TB, ws []W, parts ...string) W {
	t.Helper()
	var found []W
	all := make([]string, len(ws))
	for i, w := range ws {
		all[i] = w.String()
		ok := true
		for _, p := range parts {
			ok = ok && strings.Contains(w.String(), p)
		}
		if ok {
			found = append(found, w)
		}
	}
	if len(found) != 1 {
		t.Fatalf("want one warning with %q, got %d in %q", parts, len(found), all)
	}
	return found[0]
}
