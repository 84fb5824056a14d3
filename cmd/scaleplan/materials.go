package main

import (
	"encoding/json"
	"fmt"
	"io"
	"strings"
	"text/tabwriter"

	"github.com/urfave/cli/v2"

	"scaleplan/feasibility"
	"scaleplan/materials"
)

func materialsCommand() *cli.Command {
	return &cli.Command{
		Name:      "materials",
		Usage:     "the library of model materials and media",
		UsageText: "scaleplan materials [NAME] [--at CONDITIONS] [--json]",
		Description: "Without NAME, lists the library by kind (solid, fluid, soil, ice) with the conditions each entry\n" +
			"takes. With NAME, prints the entry's properties in SI at the conditions, each with its source and,\n" +
			"where it can be tuned, its range. CONDITIONS are comma-separated values whose unit tells what they\n" +
			"are: 20C (temperature), 3bar (absolute pressure), 35g/kg (salinity), 50% (glycerol mass fraction),\n" +
			"or KEY=VALUE with T, p, S (g/kg) and w: --at 20C, --at 15C,35g/kg, --at 5bar, --at 20C,w=0.6.\n" +
			"Conditions not given take the entry's defaults (20 °C, 101325 Pa, 35 g/kg, w = 0.5; 25 °C for\n" +
			"the silicone oils), a default mixture fraction said beside the conditions; values outside an\n" +
			"entry's valid range are refused, never extrapolated. glycerol is pure glycerol; water_glycerol\n" +
			"and brine are mixtures (give w= or S=).",
		Flags: []cli.Flag{
			&cli.StringFlag{Name: "at", Usage: "conditions, e.g. 20C, 15C,35g/kg or 5bar"},
			&cli.BoolFlag{Name: "json", Usage: "print data as JSON"},
		},
		Action: func(c *cli.Context) error {
			lib, err := materials.Default()
			if err != nil {
				return err
			}
			if c.NArg() == 0 {
				if c.IsSet("at") {
					return usagef("--at needs a NAME: scaleplan materials NAME --at CONDITIONS")
				}
				if c.Bool("json") {
					return writeMaterialsListJSON(c.App.Writer, lib)
				}
				return writeMaterialsList(c.App.Writer, lib)
			}
			// "structural steel" may come as two arguments.
			e, err := lib.Lookup(strings.Join(c.Args().Slice(), " "))
			if err != nil {
				return err
			}
			cond, err := materials.ParseConditions(c.String("at"))
			if err != nil {
				return err
			}
			rc, err := e.Resolve(cond)
			if err != nil {
				return err
			}
			props, err := e.At(rc)
			if err != nil {
				return err
			}
			if c.Bool("json") {
				return writeMaterialJSON(c.App.Writer, e, rc, props, e.Defaulted(cond))
			}
			return writeMaterial(c.App.Writer, e, rc, props, e.DefaultNote(cond))
		},
	}
}

// materialUnit is the SI unit of a quantity, as in headers and JSON.
func materialUnit(quantity string) string {
	q, err := feasibility.LookupQuantity(quantity)
	if err != nil {
		return ""
	}
	return q.SI
}

// materialConditionsTaken describes the conditions an entry takes, e.g.
// "temperature 0–40 °C (tunable)", or "fixed".
func materialConditionsTaken(e materials.Entry) string {
	if len(e.Ranges) == 0 {
		return "fixed"
	}
	var parts []string
	for _, r := range e.Ranges {
		s := string(r.Condition) + " " + materials.FormatRange(r.Condition, r.Min, r.Max)
		if r.Tunable {
			s += " (tunable)"
		}
		parts = append(parts, s)
	}
	return strings.Join(parts, "; ")
}

func writeMaterialsList(w io.Writer, lib *materials.Library) error {
	tw := tabwriter.NewWriter(w, 0, 0, 2, ' ', 0)
	fmt.Fprintln(tw, "Library of model materials and media (scaleplan materials NAME [--at CONDITIONS] for properties)")
	var kind materials.Kind
	for _, e := range lib.Entries() {
		if e.Kind != kind {
			kind = e.Kind
			fmt.Fprintf(tw, "\n%s\n", kind)
			fmt.Fprintln(tw, "  NAME\tCONDITIONS\tDESCRIPTION")
		}
		desc := e.Description
		if e.Custom {
			desc += " [custom]"
		}
		fmt.Fprintf(tw, "  %s\t%s\t%s\n", e.Name, materialConditionsTaken(e), desc)
	}
	fmt.Fprintln(tw, "\nDefaults of conditions not given: 20 °C, 101.325 kPa, 35 g/kg, w = 0.5.")
	return tw.Flush()
}

type materialConditionRangeJSON struct {
	Condition string  `json:"condition"`
	Unit      string  `json:"unit"`
	Default   float64 `json:"default"`
	Min       float64 `json:"min"`
	Max       float64 `json:"max"`
	Tunable   bool    `json:"tunable"`
	Source    string  `json:"source"`
}

func materialConditionUnit(k materials.Condition) string {
	switch k {
	case materials.Temperature:
		return "K"
	case materials.Pressure:
		return "Pa"
	}
	return "1"
}

func materialRangesJSON(e materials.Entry) []materialConditionRangeJSON {
	out := []materialConditionRangeJSON{}
	for _, r := range e.Ranges {
		out = append(out, materialConditionRangeJSON{
			Condition: string(r.Condition), Unit: materialConditionUnit(r.Condition),
			Default: r.Default, Min: r.Min, Max: r.Max, Tunable: r.Tunable, Source: r.Source,
		})
	}
	return out
}

func writeMaterialsListJSON(w io.Writer, lib *materials.Library) error {
	type entryJSON struct {
		Name            string                       `json:"name"`
		Kind            string                       `json:"kind"`
		Description     string                       `json:"description"`
		Custom          bool                         `json:"custom"`
		Quantities      []string                     `json:"quantities"`
		ConditionRanges []materialConditionRangeJSON `json:"condition_ranges"`
	}
	out := []entryJSON{}
	for _, e := range lib.Entries() {
		out = append(out, entryJSON{
			Name: e.Name, Kind: string(e.Kind), Description: e.Description, Custom: e.Custom,
			Quantities: e.Quantities(), ConditionRanges: materialRangesJSON(e),
		})
	}
	return writeMaterialsData(w, out)
}

// writeMaterial prints an entry at resolved conditions; note says which
// mixture fraction was taken by default ("" when none).
func writeMaterial(w io.Writer, e materials.Entry, rc materials.Conditions, props []materials.Property, note string) error {
	fmt.Fprintf(w, "%s (%s): %s\n", e.Name, e.Kind, e.Description)
	if len(e.Ranges) == 0 {
		fmt.Fprintln(w, "conditions: none (fixed properties)")
	} else {
		if note != "" {
			note = " (" + note + ")"
		}
		fmt.Fprintf(w, "conditions: %s%s\nvalid: %s\n", rc, note, materialConditionsTaken(e))
	}
	fmt.Fprintln(w)
	tw := tabwriter.NewWriter(w, 0, 0, 2, ' ', 0)
	fmt.Fprintln(tw, "QUANTITY\tVALUE\tUNIT\tTUNABLE RANGE\tSOURCE")
	for _, p := range props {
		rng := ""
		if p.Tunable() {
			rng = fmt.Sprintf("%.6g – %.6g", p.Min, p.Max)
		}
		fmt.Fprintf(tw, "%s\t%.6g\t%s\t%s\t%s\n", p.Quantity, p.Value, materialUnit(p.Quantity), rng, p.Source)
	}
	return tw.Flush()
}

func writeMaterialJSON(w io.Writer, e materials.Entry, rc materials.Conditions, props []materials.Property, defaulted []materials.Condition) error {
	type rangeJSON struct {
		Min float64 `json:"min"`
		Max float64 `json:"max"`
	}
	out := struct {
		Name            string                       `json:"name"`
		Kind            string                       `json:"kind"`
		Description     string                       `json:"description"`
		Custom          bool                         `json:"custom"`
		Conditions      map[string]float64           `json:"conditions"`
		Defaulted       []string                     `json:"defaulted_mixture,omitempty"`
		ConditionRanges []materialConditionRangeJSON `json:"condition_ranges"`
		Properties      map[string]float64           `json:"properties"`
		Units           map[string]string            `json:"units"`
		Ranges          map[string]rangeJSON         `json:"ranges"`
		Sources         map[string]string            `json:"sources"`
	}{
		Name: e.Name, Kind: string(e.Kind), Description: e.Description, Custom: e.Custom,
		Conditions: map[string]float64{}, ConditionRanges: materialRangesJSON(e),
		Properties: map[string]float64{}, Units: map[string]string{},
		Ranges: map[string]rangeJSON{}, Sources: map[string]string{},
	}
	for _, k := range rc.Given() {
		v, _ := rc.Get(k)
		out.Conditions[string(k)] = v
	}
	for _, k := range defaulted {
		out.Defaulted = append(out.Defaulted, string(k))
	}
	for _, p := range props {
		out.Properties[p.Quantity] = p.Value
		out.Units[p.Quantity] = materialUnit(p.Quantity)
		out.Sources[p.Quantity] = p.Source
		if p.Tunable() {
			out.Ranges[p.Quantity] = rangeJSON{p.Min, p.Max}
		}
	}
	return writeMaterialsData(w, out)
}

func writeMaterialsData(w io.Writer, v any) error {
	enc := json.NewEncoder(w)
	enc.SetIndent("", "  ")
	enc.SetEscapeHTML(false)
	return enc.Encode(v)
}
