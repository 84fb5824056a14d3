package report

import (
	"fmt"
	"io"
	"strings"
	"text/tabwriter"

	"scaleplan/feasibility"
)

// GroupsReport is the data behind `scaleplan groups`.
type GroupsReport struct {
	Rank       int          `json:"rank"`
	Dimensions []string     `json:"dimensions"`
	Repeating  []string     `json:"repeating"`
	Count      int          `json:"count"`
	Groups     []GroupEntry `json:"groups"`

	vars []feasibility.Variable
}

// GroupEntry is one pi group.
type GroupEntry struct {
	Exponents map[string]string `json:"exponents"`
	Name      string            `json:"name"`
	Text      string            `json:"text"`
}

// NewGroupsReport formats a pi analysis.
func NewGroupsReport(vars []feasibility.Variable, res feasibility.PiResult) *GroupsReport {
	r := &GroupsReport{Rank: res.Rank, Dimensions: nonNil(res.Dimensions), Repeating: nonNil(res.Repeating),
		Count: len(res.Groups), Groups: []GroupEntry{}, vars: vars}
	for _, g := range res.Groups {
		e := GroupEntry{Exponents: map[string]string{}, Name: g.Name, Text: g.String()}
		for _, ve := range g.Exponents {
			e.Exponents[ve.Name] = ve.Exp.String()
		}
		r.Groups = append(r.Groups, e)
	}
	return r
}

// WriteJSON writes the report as indented JSON.
func (r *GroupsReport) WriteJSON(w io.Writer) error { return writeJSON(w, r) }

// WriteText writes the report as a readable table.
func (r *GroupsReport) WriteText(w io.Writer) error {
	b := &strings.Builder{}
	b.WriteString("Variables:\n")
	tw := tabwriter.NewWriter(b, 2, 4, 2, ' ', 0)
	for _, v := range r.vars {
		fmt.Fprintf(tw, "  %s\t%s\n", v.Name, v.Dim)
	}
	tw.Flush()
	fmt.Fprintf(b, "Rank of the dimensional matrix: %d (dimensions %s)\n", r.Rank, strings.Join(r.Dimensions, ", "))
	fmt.Fprintf(b, "Independent groups: %d = %d variables − rank %d\n", r.Count, len(r.vars), r.Rank)
	fmt.Fprintf(b, "Repeating variables: %s\n\n", orNone(r.Repeating))
	tw = tabwriter.NewWriter(b, 2, 4, 2, ' ', 0)
	fmt.Fprintln(tw, "group\tproduct\trecognised as")
	for i, g := range r.Groups {
		name := g.Name
		if name == "" {
			name = "-"
		}
		fmt.Fprintf(tw, "π%d\t%s\t%s\n", i+1, g.Text, name)
	}
	tw.Flush()
	_, err := io.WriteString(w, b.String())
	return err
}
