package report

import (
	"fmt"
	"io"
	"path/filepath"
	"regexp"
	"strconv"
	"strings"

	"scaleplan/feasibility"
	"scaleplan/sweep"
)

// Figure is a map placed in the memo: the file (beside the memo) and its
// caption.
type Figure struct {
	Path, Caption string
}

var mapNameRE = regexp.MustCompile(`\.(band|contour|cost|require-.+)-([0-9]+)-[^.]*\.[a-z]+$`)

// MemoFigures captions the maps WritePlots wrote for a study, in their
// order; files it does not recognise are left out.
func MemoFigures(res *sweep.Result, maps []string) []Figure {
	var out []Figure
	for _, p := range maps {
		if isTradeoffPlot(p) {
			out = append(out, Figure{Path: p, Caption: "The strategies side by side: each feasible strategy's recommended scale against its worst relaxed mismatch, labelled with its cost; the non-dominated ones dark and joined, the mismatch threshold dashed."})
			continue
		}
		m := mapNameRE.FindStringSubmatch(filepath.Base(p))
		if m == nil {
			continue
		}
		n, _ := strconv.Atoi(m[2])
		if n < 1 || n > len(res.Strategies) {
			continue
		}
		sr := res.Strategies[n-1]
		var what string
		switch kind := m[1]; kind {
		case "band":
			what = "Feasibility bands: the margin of every candidate against scale, the window edges marked"
		case "contour":
			what = "Margin contours over scale and " + Label(res.Plan.Settings.Axis) + ", the zero contour bold"
		case "cost":
			what = "Campaign cost against scale, the feasible window marked"
		default:
			what = "Facility requirement against scale"
			for _, rs := range RequirementData(res, sr) {
				if kind == requireKind(rs) {
					what = fmt.Sprintf("The %s a model needs against scale (limit %q), against each facility's", Label(rs.Capability), rs.Limit)
					break
				}
			}
		}
		out = append(out, Figure{Path: p, Caption: fmt.Sprintf("%s; strategy %s.", what, sr.Name)})
	}
	return out
}

// writeFigures writes the figures section: each map as a Markdown image
// link to the file beside the memo, with a numbered caption.
func writeFigures(b *strings.Builder, figures []Figure) {
	if len(figures) == 0 {
		return
	}
	b.WriteString("\n## Figures\n")
	for i, f := range figures {
		fmt.Fprintf(b, "\n![Figure %d](%s)\n\n*Figure %d. %s*\n", i+1, filepath.Base(f.Path), i+1, md(f.Caption))
	}
}

// measuredQuantities are the quantities the study measures: those its
// prototype items scale as, those of the dimension of each of its
// measures (the first response or geometry quantity of that dimension),
// and those its predict setting names. The memo's prediction rules are
// given for these.
func measuredQuantities(p *sweep.Plan) map[string]bool {
	keep := map[string]bool{}
	if p == nil {
		return keep
	}
	for _, q := range p.Settings.Predict {
		keep[q] = true
	}
	for _, it := range p.Items {
		if it.ScalesAs != "" {
			keep[it.ScalesAs] = true
		}
	}
	for _, m := range p.Measures {
		for _, q := range feasibility.Quantities() {
			if q.Kind != feasibility.Property && q.Dim == m.Unit.Dim {
				keep[q.Name] = true
				break
			}
		}
	}
	return keep
}

// WriteMemos writes the memo as Markdown at mdPath, with the maps as
// figures, and the same memo as one self-contained HTML file beside it
// (the maps embedded); it returns the two paths.
func WriteMemos(mdPath string, res *sweep.Result, maps []string) ([]string, error) {
	figures := MemoFigures(res, maps)
	text := memoText(res, figures)
	if err := WriteFileAtomic(mdPath, func(w io.Writer) error {
		_, err := w.Write([]byte(text))
		return err
	}); err != nil {
		return nil, err
	}
	htmlPath := strings.TrimSuffix(mdPath, ".md") + ".html"
	page, err := MemoHTML(res.Name, text, filepath.Dir(mdPath))
	if err != nil {
		return nil, err
	}
	if err := WriteFileAtomic(htmlPath, func(w io.Writer) error {
		_, err := w.Write(page)
		return err
	}); err != nil {
		return nil, err
	}
	return []string{mdPath, htmlPath}, nil
}

// requireKind names a requirement map in its file name: the capability
// with hyphens, then the limit when it is not named the same
// ("require-tank-width-blockage", "require-wave-height-max").
func requireKind(rs RequirementSeries) string {
	slug := func(s string) string { return strings.ReplaceAll(FileName(s), "_", "-") }
	kind := "require-" + slug(rs.Capability)
	if l := slug(rs.Limit); l != slug(rs.Capability) {
		kind += "-" + l
	}
	return kind
}
