package sweep

import (
	"slices"
	"strconv"
	"strings"

	"scaleplan/feasibility"
	"scaleplan/materials"
	"scaleplan/sweep/study"
)

func (p *Plan) prepareCustom(ps *study.Problems) {
	type acc struct {
		kind  string
		props []materials.CustomProperty
		row   int
	}
	byEntry := map[string]*acc{}
	var order []string
	for _, r := range p.Study.Custom {
		name := strings.TrimSpace(r.Entry)
		if name == "" {
			ps.Add(study.At("Custom", r.Row, "entry"), "the entry name is empty")
			continue
		}
		a, ok := byEntry[name]
		if !ok {
			a = &acc{kind: strings.TrimSpace(r.Kind), row: r.Row}
			byEntry[name] = a
			order = append(order, name)
		}
		cp := materials.CustomProperty{Quantity: strings.TrimSpace(r.Property), Value: strings.TrimSpace(r.Value), Unit: strings.TrimSpace(r.Unit), Source: strings.TrimSpace(r.Source)}
		// A value written "LO to HI" is a tunable range (a model bed
		// roughened as needed, a pore fluid mixed to a viscosity); its
		// nominal value is the range's geometric middle.
		if lo, hi, ok := strings.Cut(cp.Value, " to "); ok {
			cp.Min, cp.Max = strings.TrimSpace(lo), strings.TrimSpace(hi)
			cp.Value = rangeMiddle(cp.Min, cp.Max)
		}
		a.props = append(a.props, cp)
	}
	for _, name := range order {
		a := byEntry[name]
		if err := p.Library.Add(materials.CustomEntry{Name: name, Kind: a.kind, Properties: a.props}); err != nil {
			ps.Add(study.At("Custom", a.row, "entry"), "%v", err)
		}
	}
}

func (p *Plan) prepareCandidates(rows []study.Candidate, sheet, role string, ps *study.Problems) []*Candidate2 {
	var out []*Candidate2
	seen := map[string]bool{}
	for _, r := range rows {
		name := strings.TrimSpace(r.Name)
		entry := strings.TrimSpace(r.Entry)
		if name == "" {
			name = entry
		}
		if name == "" {
			ps.Add(study.At(sheet, r.Row, "name"), "the %s has no name and no library entry", role)
			continue
		}
		if seen[name] {
			ps.Add(study.At(sheet, r.Row, "name"), "%s %q appears twice", role, name)
			continue
		}
		seen[name] = true
		if entry == "" {
			entry = name
		}
		var at func(materials.Condition, float64, float64) float64
		if e, lerr := p.Library.Lookup(entry); lerr == nil {
			at = operatingPoint(e)
		}
		stated, tune, rerr := tunableConditions(r.Conditions, at)
		props, e, cond, err := p.entryProps(entry, stated)
		if err == nil {
			err = rerr
		}
		if err != nil {
			col := "library_entry"
			if _, lerr := p.Library.Lookup(entry); lerr == nil {
				col = "conditions"
			}
			ps.Add(study.At(sheet, r.Row, col), "%v", err)
			continue
		}
		out = append(out, &Candidate2{Name: name, Entry: entry, Conditions: strings.TrimSpace(r.Conditions), Role: role, Props: props, Row: r.Row, cond: cond, entry: e, tune: tune})
		p.warnDefaultedMixture(sheet, r.Row, name, e, cond)
	}
	return out
}

// entryProps returns a library entry's properties at conditions.
func (p *Plan) entryProps(entry, conditions string) (map[string]materials.Property, materials.Entry, materials.Conditions, error) {
	e, err := p.Library.Lookup(entry)
	if err != nil {
		return nil, materials.Entry{}, materials.Conditions{}, err
	}
	cond, err := materials.ParseConditions(strings.TrimSpace(conditions))
	if err != nil {
		return nil, e, cond, err
	}
	list, err := e.At(cond)
	if err != nil {
		return nil, e, cond, err
	}
	props := map[string]materials.Property{}
	for _, pr := range list {
		props[pr.Quantity] = pr
	}
	return props, e, cond, nil
}

func (p *Plan) prepareProto(ps *study.Problems) {
	st := p.Settings
	for _, src := range []struct{ name, at, setting string }{
		{st.PrototypeMaterial, st.PrototypeMaterialAt, "prototype_material"},
		{st.PrototypeMedium, st.PrototypeMediumAt, "prototype_medium"},
	} {
		if src.name == "" {
			continue
		}
		props, _, _, err := p.entryProps(src.name, src.at)
		if err != nil {
			ps.Add(st.Cell(src.setting), "%v", err)
			continue
		}
		for q, pr := range props {
			p.Proto[q] = pr.Value
			p.ProtoSrc[q] = src.name
			if src.setting == "prototype_material" {
				if p.ProtoMaterial == nil {
					p.ProtoMaterial = map[string]float64{}
				}
				p.ProtoMaterial[q] = pr.Value
			}
		}
	}
	p.Proto["gravity"] = StandardGravity
	p.ProtoSrc["gravity"] = "standard gravity"
	// Items named after a property override the library.
	for _, n := range p.ItemOrder {
		it := p.Items[n]
		if it.ScalesAs != "" && it.ScalesAs == n {
			if q, _ := feasibility.QuantityNamed(n); q.Kind == feasibility.Property {
				p.Proto[n] = it.Value
				p.ProtoSrc[n] = "Prototype sheet"
			}
		}
	}
}

func describePair(m, mat *Candidate2) string {
	var parts []string
	if m != nil {
		parts = append(parts, "medium "+strconv.Quote(m.Name))
	}
	if mat != nil {
		parts = append(parts, "material "+strconv.Quote(mat.Name))
	}
	if len(parts) == 0 {
		return "candidate (no medium or material listed)"
	}
	return strings.Join(parts, " with ")
}

func candidatesOrNil(cs []*Candidate2) []*Candidate2 {
	if len(cs) == 0 {
		return []*Candidate2{nil}
	}
	return cs
}

// modelProp returns the model value of a property from a candidate pair:
// the medium first (all densities share the medium's scale; a structure's
// mass is matched by ballast), then the material.
func modelProp(q string, medium, material *Candidate2) (materials.Property, bool) {
	for _, c := range []*Candidate2{medium, material} {
		if c == nil {
			continue
		}
		if pr, ok := c.Props[q]; ok {
			return pr, true
		}
	}
	return materials.Property{}, false
}

func pickCandidates(all []*Candidate2, list, sheet string, cell study.Cell, ps *study.Problems) []*Candidate2 {
	names := splitNames(list)
	if len(names) == 0 {
		return all
	}
	known := make([]string, len(all))
	for i, c := range all {
		known[i] = c.Name
	}
	var out []*Candidate2
	for _, n := range names {
		i := slices.Index(known, n)
		if i < 0 {
			ps.Add(cell, "no candidate named %q on the %s sheet%s", n, sheet, feasibility.Suggest(n, known))
			continue
		}
		out = append(out, all[i])
	}
	return out
}
