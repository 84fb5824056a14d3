package sweep

import (
	"strings"

	"scaleplan/feasibility"
	"scaleplan/sweep/study"
)

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
		fail := func() { p.failed.add(name) }
		scales := strings.TrimSpace(it.ScalesAs)
		var qdim feasibility.Dimension
		switch scales {
		case "none", "1", "-":
			scales = ""
		case "":
			ps.Add(study.At("Prototype", it.Row, "scales_as"), "say which quantity %s scales as (e.g. length, velocity) or none for a count", name)
			fail()
			continue
		default:
			q, err := feasibility.LookupQuantity(scales)
			if err != nil {
				ps.Add(study.At("Prototype", it.Row, "scales_as"), "%v", err)
				fail()
				continue
			}
			qdim = q.Dim
		}
		value, unit, err := study.TimeValue(it.Value, it.Unit, qdim)
		if err != nil {
			ps.Add(study.At("Prototype", it.Row, "value"), "%v", err)
			fail()
			continue
		}
		v, u, err := feasibility.ParseValue(strings.TrimSpace(value + " " + unit))
		if err != nil {
			ps.Add(study.At("Prototype", it.Row, "value"), "%v", err)
			fail()
			continue
		}
		dim := u.Dim
		if scales != "" {
			if u.Text == "" {
				dim = qdim
			} else if !u.Dim.Equal(qdim) {
				ps.Add(study.At("Prototype", it.Row, "unit"), "unit %q does not fit %s (needs %s, got %s)", u.Text, scales, qdim, u.Dim)
				fail()
				continue
			}
		}
		if !(v > 0) {
			ps.Add(study.At("Prototype", it.Row, "value"), "%s must be positive, got %v", name, v)
			fail()
			continue
		}
		p.Items[name] = ProtoItem{name, v, strings.TrimSpace(unit), scales, dim, it.Row}
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
