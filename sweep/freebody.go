package sweep

import (
	"strings"

	"scaleplan/feasibility"
	"scaleplan/sweep/study"
)

// prepareUnballasted reads the Study setting unballasted: the model media
// and materials whose mass cannot be ballasted (armour units, grains,
// soils, free bodies). Their density must be the prototype's over
// k_density within the study's tolerance (substitute.go checks it).
func (p *Plan) prepareUnballasted(ps *study.Problems) {
	raw := p.Settings.Unballasted
	if raw == "" {
		return
	}
	cell := p.Settings.Cell("unballasted")
	byName := map[string]*Candidate2{}
	var names []string
	for _, c := range append(append([]*Candidate2(nil), p.Media...), p.Materials...) {
		byName[c.Name] = c
		names = append(names, c.Name)
	}
	p.Unballasted = map[string]bool{}
	for _, n := range strings.FieldsFunc(raw, func(r rune) bool { return r == ',' || r == ';' }) {
		n = strings.TrimSpace(n)
		if n == "" {
			continue
		}
		c, ok := byName[n]
		switch {
		case !ok:
			ps.Add(cell, "unballasted: %q is not a candidate of the Media or Materials sheet%s", n, feasibility.Suggest(n, names))
			continue
		case p.Unballasted[n]:
			ps.Add(cell, "unballasted: %q is named twice", n)
			continue
		case c.Role == "material" && !hasKey(p.ProtoMaterial, "density"):
			ps.Add(cell, "unballasted: the density of material %q is checked against the prototype material's, but the prototype has none: set prototype_material", n)
		case !hasKey(c.Props, "density"):
			ps.Add(cell, "unballasted: %q states no density: add one (Custom sheet) or choose another entry", n)
		}
		p.Unballasted[n] = true
	}
}

func hasKey[V any](m map[string]V, k string) bool {
	_, ok := m[k]
	return ok
}
