package materials

import (
	"fmt"
	"regexp"
	"sort"
	"strings"
)

// Names people type. Lookup resolves a name to an entry only when it means
// that entry and nothing else: the entry's own name, or an alias for the
// same substance (perspex is PMMA, glycerine is glycerol, lake ice is
// freshwater ice). A word that names a class (steel, sand, oil, ice) is
// refused with the entries of that class; an unknown name gets a
// suggestion only when it is close in spelling and not a different
// substance of similar spelling.

// alias maps other names of the same substance to library names.
func alias(key string) string {
	switch key {
	case "fresh_water", "freshwater", "tap_water", "distilled_water", "pure_water":
		return "water"
	case "sea_water", "ocean_water":
		return "seawater"
	case "glycerine", "glycerin", "pure_glycerol", "pure_glycerine":
		return "glycerol"
	case "glycerol_water", "water_glycerine", "glycerine_water", "water_glycerin", "aqueous_glycerol",
		"glycerol_solution", "glycerol_mixture":
		return "water_glycerol"
	case "nacl_solution", "salt_solution", "sodium_chloride_solution", "nacl_brine", "salt_brine":
		return "brine"
	case "co2":
		return "carbon_dioxide"
	case "n2":
		return "nitrogen"
	case "he":
		return "helium"
	case "acrylic", "perspex", "plexiglas", "plexiglass", "acrylic_glass", "acrylic_sheet":
		return "pmma"
	case "mild_steel", "carbon_steel", "s355":
		return "structural_steel"
	case "stainless", "ss304", "304_stainless", "stainless_304":
		return "stainless_steel"
	case "aluminium_6061", "aluminum_6061", "aluminum_6061_t6", "6061_t6", "al_6061":
		return "aluminium_6061_t6"
	case "aluminum_5083", "al_5083":
		return "aluminium_5083"
	case "ti6al4v", "ti_6al_4v":
		return "titanium_ti6al4v"
	case "nylon_6/6", "nylon66", "pa66":
		return "nylon_66"
	case "plaster_of_paris", "gypsum":
		return "gypsum_plaster"
	case "kaolin", "kaolin_clay":
		return "lab_kaolin"
	case "lake_ice", "river_ice", "fresh_water_ice", "freshwater_lake_ice":
		return "freshwater_ice"
	case "saline_ice", "first_year_ice":
		return "sea_ice"
	case "fibreglass", "fiberglass", "grp", "gfrp":
		return "glass_fibre_laminate"
	case "cfrp", "carbon_fibre", "carbon_fiber":
		return "carbon_fibre_laminate"
	}
	return key
}

// nameGroup is a word that names a class of entries, or a substance the
// library has only a relative of (titanium: the library has an alloy).
type nameGroup struct {
	words   []string
	entries []string
	note    string
}

func nameGroups() []nameGroup {
	oils := []string{"silicone_oil_1cst", "silicone_oil_5cst", "silicone_oil_10cst", "silicone_oil_50cst", "silicone_oil_100cst", "silicone_oil_1000cst"}
	return []nameGroup{
		{[]string{"steel", "steels"}, []string{"structural_steel", "stainless_steel"}, ""},
		{[]string{"aluminium", "aluminum", "alu", "alloy"}, []string{"aluminium_6061_t6", "aluminium_5083"}, ""},
		{[]string{"titanium"}, []string{"titanium_ti6al4v"}, "the library has the alloy Ti-6Al-4V, not pure titanium"},
		{[]string{"nylon"}, []string{"nylon_66"}, "the library has nylon 6/6"},
		{[]string{"rubber"}, []string{"silicone_rubber", "natural_rubber"}, ""},
		{[]string{"foam"}, []string{"rigid_pu_foam", "pvc_foam"}, ""},
		{[]string{"wood", "timber"}, []string{"balsa", "spruce", "plywood"}, ""},
		{[]string{"laminate", "composite"}, []string{"glass_fibre_laminate", "carbon_fibre_laminate"}, ""},
		{[]string{"plaster"}, []string{"gypsum_plaster"}, "the library's plaster is gypsum plaster (plaster of Paris)"},
		{[]string{"sand"}, []string{"dry_dense_sand", "dry_loose_sand"}, ""},
		{[]string{"clay"}, []string{"soft_clay", "lab_kaolin"}, ""},
		{[]string{"soil"}, []string{"dry_dense_sand", "dry_loose_sand", "soft_clay", "lab_kaolin"}, ""},
		{[]string{"ice"}, []string{"sea_ice", "freshwater_ice", "model_ice"}, ""},
		{[]string{"oil", "oils", "silicone_oil", "pdms", "silicone_fluid"}, oils, "the library's oils are silicone oils (PDMS) by grade"},
		{[]string{"silicone"}, append(append([]string(nil), oils...), "silicone_rubber"), ""},
		{[]string{"salt_water", "saltwater", "salty_water"}, []string{"seawater", "brine"}, "seawater of standard composition, or brine (sodium chloride solution)"},
		{[]string{"gas"}, []string{"air", "nitrogen", "helium", "carbon_dioxide"}, ""},
		{[]string{"glycol"}, []string{"glycerol", "water_glycerol"}, "the library has glycerol, not the glycols"},
	}
}

// siliconeGradeName reads "silicone oil 100 cSt", "silicone_oil_100cst",
// "PDMS 100" and the like.
var siliconeGradeName = regexp.MustCompile(`^(silicone_oil|silicone_fluid|silicone|pdms|oil)_?([0-9]+(?:\.[0-9]+)?)_?(cst|cs|mm2/s|mm\^2/s)?$`)

// lookupName resolves a normalized key: the entry key, or an error saying
// why not, with the entries meant.
func (l *Library) lookupName(name, key string) (string, error) {
	if _, ok := l.byKey[key]; ok {
		return key, nil
	}
	if a := alias(key); a != key {
		if _, ok := l.byKey[a]; ok {
			return a, nil
		}
	}
	if m := siliconeGradeName.FindStringSubmatch(key); m != nil {
		grade := "silicone_oil_" + m[2] + "cst"
		_, ok := l.byKey[grade]
		switch {
		case ok && m[1] != "oil":
			return grade, nil
		case ok:
			return "", fmt.Errorf("unknown material or medium %q (did you mean %s? the library's oils are silicone oils)", name, grade)
		default:
			return "", fmt.Errorf("unknown material or medium %q: no %s cSt grade in the library (grades: %s); add it as the study's own fluid", name, m[2], strings.Join(l.siliconeGrades(), ", "))
		}
	}
	for _, g := range nameGroups() {
		for _, w := range g.words {
			if key == w {
				return "", l.groupError(name, g, true)
			}
		}
	}
	tokens := strings.Split(key, "_")
	for _, g := range nameGroups() {
		for _, w := range g.words {
			for i := range tokens {
				for j := i + 1; j <= len(tokens); j++ {
					if strings.Join(tokens[i:j], "_") == w {
						return "", l.groupError(name, g, false)
					}
				}
			}
		}
	}
	return "", fmt.Errorf("unknown material or medium %q%s", name, l.spellingSuggestion(key))
}

func (l *Library) siliconeGrades() []string {
	var out []string
	for _, k := range l.Names() {
		if strings.HasPrefix(k, "silicone_oil_") {
			out = append(out, k)
		}
	}
	return out
}

// groupError refuses a class word (exact) or a name containing one,
// naming the entries meant.
func (l *Library) groupError(name string, g nameGroup, exact bool) error {
	var have []string
	for _, e := range g.entries {
		if _, ok := l.byKey[e]; ok {
			have = append(have, e)
		}
	}
	note := ""
	if g.note != "" {
		note = "; " + g.note
	}
	switch {
	case len(have) == 1:
		return fmt.Errorf("unknown material or medium %q (did you mean %s?%s)", name, have[0], note)
	case exact:
		return fmt.Errorf("material or medium %q names several entries: give one of %s%s", name, strings.Join(have, ", "), note)
	default:
		return fmt.Errorf("unknown material or medium %q (the nearest in the library: %s%s)", name, strings.Join(have, ", "), note)
	}
}

// spellingSuggestion suggests the entry nearest in spelling, only within a
// small edit distance (one edit up to 5 letters, two up to 10, three
// beyond), so that a different substance of similar spelling (oil and air)
// is not offered.
func (l *Library) spellingSuggestion(key string) string {
	limit := 3
	switch n := len([]rune(key)); {
	case n <= 5:
		limit = 1
	case n <= 10:
		limit = 2
	}
	type cand struct {
		name string
		d    int
	}
	var cs []cand
	for _, k := range l.Names() {
		if d := levenshtein(key, k); d <= limit {
			cs = append(cs, cand{k, d})
		}
	}
	if len(cs) == 0 {
		return ""
	}
	sort.SliceStable(cs, func(i, j int) bool { return cs[i].d < cs[j].d })
	return fmt.Sprintf(" (did you mean %s?)", cs[0].name)
}

// levenshtein is the edit distance between a and b, over runes.
func levenshtein(a, b string) int {
	ra, rb := []rune(a), []rune(b)
	row := make([]int, len(rb)+1)
	for j := range row {
		row[j] = j
	}
	for i := 1; i <= len(ra); i++ {
		diag := row[0]
		row[0] = i
		for j := 1; j <= len(rb); j++ {
			cost := 1
			if ra[i-1] == rb[j-1] {
				cost = 0
			}
			up := row[j]
			row[j] = min(row[j]+1, row[j-1]+1, diag+cost)
			diag = up
		}
	}
	return row[len(rb)]
}
