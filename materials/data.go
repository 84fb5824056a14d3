package materials

import (
	"embed"
	"encoding/csv"
	"errors"
	"fmt"
	"io"
	"strconv"
	"strings"
)

// The library's data files; doc.go describes their layout.
//
//go:embed data/*.csv
var dataFiles embed.FS

// propertyFiles maps each property file to the kind of its entries.
func propertyFiles() []struct {
	path string
	kind Kind
} {
	return []struct {
		path string
		kind Kind
	}{
		{"data/solids.csv", Solid},
		{"data/fluids.csv", Fluid},
		{"data/soils.csv", Soil},
		{"data/ices.csv", Ice},
	}
}

// stateModels are the entries computed from their state, by name.
func stateModels() map[string]Entry {
	m := map[string]Entry{
		"water":          waterEntry(),
		"seawater":       seawaterEntry(),
		"air":            airGas().entry(),
		"nitrogen":       nitrogenGas().entry(),
		"helium":         heliumGas().entry(),
		"carbon_dioxide": carbonDioxideGas().entry(),
		"water_glycerol": glycerolEntry(),
		"glycerol":       pureGlycerolEntry(),
		"brine":          brineEntry(),
	}
	for _, g := range siliconeGrades() {
		m[g.name] = g.entry()
	}
	return m
}

// readCSV reads a data file with the expected header; lines starting with
// # are comments. It returns the rows with their line numbers.
func readCSV(path string, header []string) ([][]string, []int, error) {
	f, err := dataFiles.Open(path)
	if err != nil {
		return nil, nil, err
	}
	defer f.Close()
	r := csv.NewReader(f)
	r.Comment = '#'
	r.FieldsPerRecord = len(header)
	var rows [][]string
	var lines []int
	first := true
	for {
		rec, err := r.Read()
		if errors.Is(err, io.EOF) {
			break
		}
		if err != nil {
			return nil, nil, fmt.Errorf("%s: %v", path, err)
		}
		line, _ := r.FieldPos(0)
		if first {
			first = false
			if strings.Join(rec, ",") != strings.Join(header, ",") {
				return nil, nil, fmt.Errorf("%s line %d: header %q, want %q", path, line, strings.Join(rec, ","), strings.Join(header, ","))
			}
			continue
		}
		for i := range rec {
			rec[i] = strings.TrimSpace(rec[i])
		}
		rows = append(rows, rec)
		lines = append(lines, line)
	}
	return rows, lines, nil
}

// loadEntries builds every entry of the embedded data.
func loadEntries() ([]Entry, error) {
	rows, lines, err := readCSV("data/entries.csv", []string{"name", "kind", "description"})
	if err != nil {
		return nil, err
	}
	models := stateModels()
	byName := map[string]*Entry{}
	var order []string
	for i, rec := range rows {
		kind, err := ParseKind(rec[1])
		if err != nil {
			return nil, fmt.Errorf("data/entries.csv line %d: %v", lines[i], err)
		}
		name := rec[0]
		if name != normalize(name) {
			return nil, fmt.Errorf("data/entries.csv line %d: name %q should be written %q", lines[i], name, normalize(name))
		}
		if _, dup := byName[name]; dup {
			return nil, fmt.Errorf("data/entries.csv line %d: %q is listed twice", lines[i], name)
		}
		e := Entry{Name: name, Kind: kind, Description: rec[2]}
		if m, ok := models[name]; ok {
			e.Ranges, e.model = m.Ranges, m.model
		}
		byName[name] = &e
		order = append(order, name)
	}
	for name := range models {
		if _, ok := byName[name]; !ok {
			return nil, fmt.Errorf("data/entries.csv: the computed entry %q is not listed", name)
		}
	}
	header := []string{"name", "quantity", "value", "min", "max", "unit", "source"}
	for _, pf := range propertyFiles() {
		rows, lines, err := readCSV(pf.path, header)
		if err != nil {
			return nil, err
		}
		for i, rec := range rows {
			at := fmt.Sprintf("%s line %d", pf.path, lines[i])
			e, ok := byName[rec[0]]
			switch {
			case !ok:
				return nil, fmt.Errorf("%s: entry %q is not listed in data/entries.csv", at, rec[0])
			case e.Kind != pf.kind:
				return nil, fmt.Errorf("%s: entry %q is a %s in data/entries.csv, not a %s", at, rec[0], e.Kind, pf.kind)
			case e.model != nil:
				return nil, fmt.Errorf("%s: entry %q is computed from its state; it takes no data rows", at, rec[0])
			}
			p, err := parseRow(rec)
			if err != nil {
				return nil, fmt.Errorf("%s: %s: %v", at, rec[0], err)
			}
			e.fixed = append(e.fixed, p)
		}
	}
	out := make([]Entry, 0, len(order))
	for _, name := range order {
		e := byName[name]
		if e.model == nil && len(e.fixed) == 0 {
			return nil, fmt.Errorf("data: entry %q has no properties", name)
		}
		if err := checkSet(e.fixed); err != nil {
			return nil, fmt.Errorf("data: entry %q: %v", name, err)
		}
		sortProperties(e.fixed)
		out = append(out, *e)
	}
	return out, nil
}

// parseRow reads one property row: name, quantity, value, min, max, unit, source.
func parseRow(rec []string) (Property, error) {
	number := func(field, s string) (float64, error) {
		v, err := strconv.ParseFloat(s, 64)
		if err != nil {
			return 0, fmt.Errorf("%s %q is not a number", field, s)
		}
		return v, nil
	}
	v, err := number("value", rec[2])
	if err != nil {
		return Property{}, err
	}
	var lo, hi float64
	hasRange := rec[3] != "" || rec[4] != ""
	if hasRange {
		if rec[3] == "" || rec[4] == "" {
			return Property{}, fmt.Errorf("%s: give both min and max, or neither", rec[1])
		}
		if lo, err = number("min", rec[3]); err != nil {
			return Property{}, err
		}
		if hi, err = number("max", rec[4]); err != nil {
			return Property{}, err
		}
	}
	if rec[6] == "" {
		return Property{}, fmt.Errorf("%s has no source", rec[1])
	}
	return buildProperty(rec[1], v, lo, hi, hasRange, rec[5], rec[6])
}
