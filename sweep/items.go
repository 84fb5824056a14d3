package sweep

import (
	"strings"

	"scaleplan/feasibility"
	"scaleplan/sweep/study"
)

// prepareItems checks the Prototype sheet: each item's name, the quantity
// it scales as and its value with its unit; then the items the reference
// length and speed name (or the first that fits).
func (p *Plan) prepareItems(ps *study.Problems) {
	for _, it := range p.Study.Prototype {
		name := strings.TrimSpace(it.Name)
		cell := study.At("Prototype", it.Row, "item")
		if !validName(name) {
			ps.Add(cell, "item name %q must be letters, digits and underscores, starting with a letter (it is used in limit expressions)", name)
			continue
		}
		if _, dup := p.Items[name]; dup {
			ps.Add(cell, "item %q appears twice", name)
			continue
		}
		item, ok := protoItem(it, name, ps)
		if !ok {
			p.failed.add(name)
			continue
		}
		p.Items[name] = item
		p.ItemOrder = append(p.ItemOrder, name)
	}
	if len(p.Items) == 0 {
		ps.Add(study.Cell{Sheet: "Prototype"}, "no prototype items: add at least the characteristic length (e.g. hull_length, 30, m, length)")
	}
	st := &p.Settings
	pick := func(setting, def, quantity string) string {
		if v := map[string]string{"reference_length": st.ReferenceLength, "reference_speed": st.ReferenceSpeed}[setting]; v != "" {
			if _, ok := p.Items[v]; !ok && len(p.Items) > 0 && !p.failed.has(v) {
				ps.Add(st.Cell(setting), "%s %q is not a prototype item%s", setting, v, feasibility.Suggest(v, p.ItemOrder))
			}
			return v
		}
		if _, ok := p.Items[def]; ok {
			return def
		}
		for _, n := range p.ItemOrder {
			if p.Items[n].ScalesAs == quantity {
				return n
			}
		}
		return ""
	}
	st.ReferenceLength = pick("reference_length", "hull_length", "length")
	st.ReferenceSpeed = pick("reference_speed", "design_speed", "velocity")
}

// protoItem reads the quantity a prototype item scales as and its value
// in SI. It returns false, with the problem at its cell, when the row is
// wrong.
func protoItem(it study.Item, name string, ps *study.Problems) (ProtoItem, bool) {
	scales := strings.TrimSpace(it.ScalesAs)
	var qdim feasibility.Dimension
	switch scales {
	case "none", "1", "-":
		scales = ""
	case "":
		ps.Add(study.At("Prototype", it.Row, "scales_as"), "say which quantity %s scales as (e.g. length, velocity) or none for a count", name)
		return ProtoItem{}, false
	default:
		q, err := feasibility.LookupQuantity(scales)
		if err != nil {
			ps.Add(study.At("Prototype", it.Row, "scales_as"), "%v", err)
			return ProtoItem{}, false
		}
		qdim = q.Dim
	}
	value, unit, err := study.TimeValue(it.Value, it.Unit, qdim)
	if err != nil {
		ps.Add(study.At("Prototype", it.Row, "value"), "%v", err)
		return ProtoItem{}, false
	}
	v, u, err := feasibility.ParseValue(strings.TrimSpace(value + " " + unit))
	if err != nil {
		ps.Add(study.At("Prototype", it.Row, "value"), "%v", err)
		return ProtoItem{}, false
	}
	dim := u.Dim
	if scales != "" {
		if u.Text == "" {
			dim = qdim
		} else if !u.Dim.Equal(qdim) {
			ps.Add(study.At("Prototype", it.Row, "unit"), "unit %q does not fit %s (needs %s, got %s)", u.Text, scales, qdim, u.Dim)
			return ProtoItem{}, false
		}
	}
	if !(v > 0) {
		ps.Add(study.At("Prototype", it.Row, "value"), "%s must be positive, got %v", name, v)
		return ProtoItem{}, false
	}
	return ProtoItem{name, v, strings.TrimSpace(unit), scales, dim, it.Row}, true
}

func validName(s string) bool {
	if s == "" {
		return false
	}
	for i, r := range s {
		ok := r == '_' || (r >= 'a' && r <= 'z') || (r >= 'A' && r <= 'Z') || (i > 0 && r >= '0' && r <= '9')
		if !ok {
			return false
		}
	}
	return true
}
