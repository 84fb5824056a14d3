package report

import (
	"context"
	"html"
	"os"
	"os/exec"
	"path/filepath"
	"regexp"
	"strings"
	"testing"
	"time"
	"unicode"
)

// sysTool finds a program from the system's packages. Without it the test
// is skipped on a developer's machine and fails on CI, which must install
// the package (see .ci/run).
func sysTool(t *testing.T, name, pkg string) string {
	t.Helper()
	if p, err := exec.LookPath(name); err == nil {
		return p
	}
	if os.Getenv("CI") != "" {
		t.Fatalf("%s is not installed: CI must install %s (see .ci/run)", name, pkg)
	}
	t.Skipf("%s is not installed; install %s to run this test", name, pkg)
	return ""
}

// pdfText extracts the text of a PDF with pdftotext (poppler-utils).
func pdfText(t *testing.T, tool, path string) string {
	t.Helper()
	ctx, cancel := context.WithTimeout(context.Background(), 2*time.Minute)
	defer cancel()
	out, err := exec.CommandContext(ctx, tool, "-enc", "UTF-8", path, "-").Output()
	if err != nil {
		t.Fatalf("pdftotext %s: %v", path, err)
	}
	return string(out)
}

var svgTextRE = regexp.MustCompile(`<text[^>]*>([^<]*)</text>`)

// svgLabels lists the text drawn in an SVG map.
func svgLabels(svg string) []string {
	var out []string
	for _, m := range svgTextRE.FindAllStringSubmatch(svg, -1) {
		if s := strings.TrimSpace(html.UnescapeString(m[1])); s != "" {
			out = append(out, s)
		}
	}
	return out
}

// squeeze drops every space (ordinary, thin, no-break), since a text
// extractor lays out words by their positions.
func squeeze(s string) string {
	return strings.Map(func(r rune) rune {
		if unicode.IsSpace(r) || r == '\u2009' || r == '\u202f' || r == '\u00a0' {
			return -1
		}
		return r
	}, s)
}

// TestPDFMapsReadBack draws the same maps as SVG and as PDF and reads the
// PDF's text back: every label of the SVG, non-ASCII characters included
// (a medium named Øresund, the minus sign of the colour bar), is in the
// PDF's text.
func TestPDFMapsReadBack(t *testing.T) {
	tool := sysTool(t, "pdftotext", "poppler-utils")
	res := plotAxisResult(120, 8)
	res.Strategies[0].Combos[0].Medium = "Øresund brackish water"
	svgDir, pdfDir := t.TempDir(), t.TempDir()
	svgs, err := WritePlots(svgDir, "s", res, PlotSVG)
	if err != nil {
		t.Fatal(err)
	}
	pdfs, err := WritePlots(pdfDir, "s", res, PlotPDF)
	if err != nil {
		t.Fatal(err)
	}
	if len(svgs) != len(pdfs) || len(svgs) == 0 {
		t.Fatalf("%d SVG maps, %d PDF maps", len(svgs), len(pdfs))
	}
	var all string
	for i := range svgs {
		b, err := os.ReadFile(svgs[i])
		if err != nil {
			t.Fatal(err)
		}
		labels := svgLabels(string(b))
		if len(labels) < 5 {
			t.Fatalf("%s: only %d labels found in the SVG", svgs[i], len(labels))
		}
		text := pdfText(t, tool, pdfs[i])
		all += text
		flat := squeeze(text)
		for _, l := range labels {
			if !strings.Contains(flat, squeeze(l)) {
				t.Errorf("%s: label %q of the SVG is not in the PDF's text", filepath.Base(pdfs[i]), l)
			}
		}
	}
	for _, want := range []string{"Øresund", "−"} {
		if !strings.Contains(all, want) {
			t.Errorf("the PDF maps' text lacks %q", want)
		}
	}
}
