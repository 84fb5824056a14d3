package sweep

import (
	"errors"
	"fmt"
	"math"
	"slices"
	"sort"
	"strconv"
	"strings"

	"scaleplan/feasibility"
	"scaleplan/materials"
)

// StandardGravity is g_n = 9.80665 m/s² (CGPM 1901; NIST SP 811), the
// gravity of an ordinary facility and the unit of a centrifuge's g-level.
const StandardGravity = 9.80665

// Techniques label strategies in the report (spec §4).
var Techniques = []string{"complete", "dominant", "special_cases", "distorted", "simulated", "substitute"}

// Corrections a strategy may ask for.
var Corrections = []string{"ittc1957"}

// Plan is a checked study, ready to run: numbers in SI, names resolved,
// each strategy and case solved once.
type Plan struct {
	Study      *Study
	Settings   Settings
	Items      map[string]ProtoItem
	ItemOrder  []string
	Proto      map[string]float64 // prototype property values, SI
	ProtoSrc   map[string]string
	Media      []*Candidate2
	Materials  []*Candidate2
	Facilities []*Facility
	Strategies []*PlanStrategy
	Limits     []*PlanLimit // study limits (added or overriding)
	Costs      []*PlanCost
	Measures   []*PlanMeasure
	Uncertain  []*Uncertain
	Catalog    *FacilityCatalog
	Library    *materials.Library
	Grid       []float64 // kL values
	AxisValues []float64 // second-axis values in SI, nil without an axis
	// ProtoMaterial holds the prototype material's own properties (Proto
	// lets the prototype medium's win), SI.
	ProtoMaterial map[string]float64
	// Unballasted names the candidates whose mass cannot be ballasted
	// (free bodies, grains: the Study setting unballasted).
	Unballasted map[string]bool
	// Warnings are the study's warnings: from reading, then from
	// checking (see warnings.go).
	Warnings Warnings
	// failed names the prototype items and facility capabilities whose
	// rows failed a check: still known names, so other checks do not
	// report them again as unknown (see failedNames).
	failed failedNames
	// recipes memoises what tunable candidates reach (recipe.go).
	recipes *recipeMemo
}

// ProtoItem is a prototype item in SI.
type ProtoItem struct {
	Name     string
	Value    float64
	Unit     string
	ScalesAs string // a quantity, or "" for a count that does not scale
	Dim      feasibility.Dimension
	Row      int
}

// Candidate2 is a model medium or material resolved in the library.
type Candidate2 struct {
	Name, Entry, Conditions string
	Role                    string // "medium" or "material"
	Props                   map[string]materials.Property
	Row                     int
	cond                    materials.Conditions
	entry                   materials.Entry
	// tune holds the conditions the row gives as ranges (recipe.go).
	tune map[materials.Condition]materials.Range
}

// Facility is a named facility with its capabilities in SI.
type Facility struct {
	Name, Type string
	Caps       map[string]float64
	CapUnits   map[string]string
	Row        int
}

// PlanStrategy is a strategy with its cases, each solved.
type PlanStrategy struct {
	Name, Technique string
	Cases           []*PlanCase
}

// PlanCase is one strategy row: a strategy, or one case of it.
type PlanCase struct {
	Strategy, Case, Technique string
	Solution                  *feasibility.Solution
	Fix                       map[string]float64
	Media, Materials          []*Candidate2
	Facilities                []*Facility
	Correction                string
	// RelaxPoisson is set by "poisson" in the relax column: transverse
	// deformation is not modelled, so no Poisson's-ratio mismatch is
	// flagged.
	RelaxPoisson bool
	Row          int
}

// PlanLimit is a limit of the study sheet.
type PlanLimit struct {
	AppliesTo, Name, Source string
	Limit                   *feasibility.Limit
	Row                     int
}

// PlanCost is a cost item.
type PlanCost struct {
	Item        string
	Coefficient float64
	Per         feasibility.Unit
	Measure     *feasibility.Expr
	Facility    string
	Row         int
}

// PlanMeasure is a measure to report, in its unit.
type PlanMeasure struct {
	Name string
	Expr *feasibility.Expr
	Unit feasibility.Unit
	Row  int
}

// Prepare checks a study against the library, the laws, the facility
// catalogue and the units, and returns every problem at once.
func Prepare(s *Study, lib *materials.Library, cat *FacilityCatalog) (*Plan, error) {
	var ps Problems
	p := &Plan{Study: s, Library: lib, Catalog: cat, Items: map[string]ProtoItem{}, Proto: map[string]float64{}, ProtoSrc: map[string]string{}, recipes: &recipeMemo{}}
	p.Settings = parseSettings(s, &ps)
	p.prepareCustom(&ps)
	p.prepareItems(&ps)
	p.Media = p.prepareCandidates(s.Media, "Media", "medium", &ps)
	p.Materials = p.prepareCandidates(s.Materials, "Materials", "material", &ps)
	p.prepareProto(&ps)
	p.prepareUnballasted(&ps)
	p.prepareFacilities(&ps)
	p.prepareStrategies(&ps)
	p.prepareLimits(&ps)
	p.prepareCosts(&ps)
	p.prepareMeasures(&ps)
	p.prepareUncertain(&ps)
	p.Warnings = append(append(Warnings(nil), s.Warnings...), p.Warnings...) // reading first
	p.warnDefaultLimits()
	p.warnUnusedCapabilities()
	p.checkDomain(&ps)
	if len(ps) == 0 {
		p.checkMemory(&ps)
	}
	if len(ps) == 0 {
		p.buildGrid(&ps)
	}
	if len(ps) == 0 {
		p.checkLimitsFinite(&ps)
	}
	if err := ps.Err(); err != nil {
		return nil, err
	}
	return p, nil
}

func (p *Plan) prepareCustom(ps *Problems) {
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
			ps.Add(At("Custom", r.Row, "entry"), "the entry name is empty")
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
			ps.Add(At("Custom", a.row, "entry"), "%v", err)
		}
	}
}

func (p *Plan) prepareItems(ps *Problems) {
	for _, it := range p.Study.Prototype {
		name := strings.TrimSpace(it.Name)
		cell := At("Prototype", it.Row, "item")
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
			ps.Add(At("Prototype", it.Row, "scales_as"), "say which quantity %s scales as (e.g. length, velocity) or none for a count", name)
			fail()
			continue
		default:
			q, err := feasibility.LookupQuantity(scales)
			if err != nil {
				ps.Add(At("Prototype", it.Row, "scales_as"), "%v", err)
				fail()
				continue
			}
			qdim = q.Dim
		}
		value, unit, err := timeValue(it.Value, it.Unit, qdim)
		if err != nil {
			ps.Add(At("Prototype", it.Row, "value"), "%v", err)
			fail()
			continue
		}
		v, u, err := feasibility.ParseValue(strings.TrimSpace(value + " " + unit))
		if err != nil {
			ps.Add(At("Prototype", it.Row, "value"), "%v", err)
			fail()
			continue
		}
		dim := u.Dim
		if scales != "" {
			if u.Text == "" {
				dim = qdim
			} else if !u.Dim.Equal(qdim) {
				ps.Add(At("Prototype", it.Row, "unit"), "unit %q does not fit %s (needs %s, got %s)", u.Text, scales, qdim, u.Dim)
				fail()
				continue
			}
		}
		if !(v > 0) {
			ps.Add(At("Prototype", it.Row, "value"), "%s must be positive, got %v", name, v)
			fail()
			continue
		}
		p.Items[name] = ProtoItem{name, v, strings.TrimSpace(unit), scales, dim, it.Row}
		p.ItemOrder = append(p.ItemOrder, name)
	}
	if len(p.Items) == 0 {
		ps.Add(Cell{Sheet: "Prototype"}, "no prototype items: add at least the characteristic length (e.g. hull_length, 30, m, length)")
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

func (p *Plan) prepareCandidates(rows []Candidate, sheet, role string, ps *Problems) []*Candidate2 {
	var out []*Candidate2
	seen := map[string]bool{}
	for _, r := range rows {
		name := strings.TrimSpace(r.Name)
		entry := strings.TrimSpace(r.Entry)
		if name == "" {
			name = entry
		}
		if name == "" {
			ps.Add(At(sheet, r.Row, "name"), "the %s has no name and no library entry", role)
			continue
		}
		if seen[name] {
			ps.Add(At(sheet, r.Row, "name"), "%s %q appears twice", role, name)
			continue
		}
		seen[name] = true
		if entry == "" {
			entry = name
		}
		stated, tune, rerr := tunableConditions(r.Conditions)
		props, e, cond, err := p.entryProps(entry, stated)
		if err == nil {
			err = rerr
		}
		if err != nil {
			col := "library_entry"
			if _, lerr := p.Library.Lookup(entry); lerr == nil {
				col = "conditions"
			}
			ps.Add(At(sheet, r.Row, col), "%v", err)
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

func (p *Plan) prepareProto(ps *Problems) {
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

func (p *Plan) prepareFacilities(ps *Problems) {
	byName := map[string]*Facility{}
	for _, r := range p.Study.Facilities {
		name := strings.TrimSpace(r.Facility)
		if name == "" {
			ps.Add(At("Facilities", r.Row, "facility"), "the facility name is empty")
			continue
		}
		f, ok := byName[name]
		typ := strings.TrimSpace(r.Type)
		if !ok {
			if !p.Catalog.HasType(typ) {
				ps.Add(At("Facilities", r.Row, "type"), "unknown facility type %q%s", typ, feasibility.Suggest(typ, p.Catalog.Types()))
				byName[name] = &Facility{Name: name}
				continue
			}
			f = &Facility{Name: name, Type: typ, Caps: map[string]float64{}, CapUnits: map[string]string{}, Row: r.Row}
			byName[name] = f
			p.Facilities = append(p.Facilities, f)
		} else if f.Type == "" {
			continue
		} else if typ != "" && typ != f.Type {
			ps.Add(At("Facilities", r.Row, "type"), "facility %q is a %s on row %d; one facility has one type", name, f.Type, f.Row)
			continue
		}
		capName := strings.TrimSpace(r.Capability)
		cp, ok := p.Catalog.Capability(f.Type, capName)
		if !ok {
			ps.Add(At("Facilities", r.Row, "capability"), "a %s has no capability %q%s", f.Type, capName, feasibility.Suggest(capName, p.Catalog.CapabilityNames(f.Type)))
			continue
		}
		if _, dup := f.Caps[capName]; dup {
			ps.Add(At("Facilities", r.Row, "capability"), "capability %s of %q is set twice", capName, name)
			continue
		}
		value, unit, err := timeValue(r.Value, r.Unit, cp.Dim)
		if err != nil {
			ps.Add(At("Facilities", r.Row, "value"), "%v", err)
			p.failed.add(name, capName)
			continue
		}
		v, u, err := feasibility.ParseValue(strings.TrimSpace(value + " " + unit))
		if err != nil {
			ps.Add(At("Facilities", r.Row, "value"), "%v", err)
			p.failed.add(name, capName)
			continue
		}
		if u.Text != "" && !u.Dim.Equal(cp.Dim) {
			ps.Add(At("Facilities", r.Row, "unit"), "unit %q does not fit %s (needs %s, got %s; e.g. %s)", u.Text, capName, cp.Dim, u.Dim, cp.Unit)
			p.failed.add(name, capName)
			continue
		}
		if !(v > 0) {
			ps.Add(At("Facilities", r.Row, "value"), "%s must be positive, got %v", capName, v)
			p.failed.add(name, capName)
			continue
		}
		f.Caps[capName] = v
		f.CapUnits[capName] = cp.Unit
	}
}

func splitNames(s string) []string {
	var out []string
	for _, f := range strings.FieldsFunc(s, func(r rune) bool { return r == ',' || r == ';' || r == '\n' }) {
		if f = strings.TrimSpace(f); f != "" {
			out = append(out, f)
		}
	}
	return out
}

func (p *Plan) prepareStrategies(ps *Problems) {
	byName := map[string]*PlanStrategy{}
	for _, r := range p.Study.Strategies {
		name := strings.TrimSpace(r.Strategy)
		if name == "" {
			ps.Add(At("Strategies", r.Row, "strategy"), "the strategy name is empty")
			continue
		}
		c := &PlanCase{Strategy: name, Case: strings.TrimSpace(r.Case), Technique: strings.TrimSpace(r.Technique), Row: r.Row, Fix: map[string]float64{}}
		if !slices.Contains(Techniques, c.Technique) {
			ps.Add(At("Strategies", r.Row, "technique"), "unknown technique %q%s", c.Technique, feasibility.Suggest(c.Technique, Techniques))
		}
		ok := true
		lawCol := func(col, text string) []string {
			names := splitNames(text)
			for _, n := range names {
				if _, err := feasibility.LookupLaw(n); err != nil {
					ps.Add(At("Strategies", r.Row, col), "%v", err)
					ok = false
				}
			}
			return names
		}
		qCol := func(col, text string) []string {
			names := splitNames(text)
			for _, n := range names {
				if _, err := feasibility.LookupQuantity(n); err != nil {
					ps.Add(At("Strategies", r.Row, col), "%v", err)
					ok = false
				}
			}
			return names
		}
		relax := splitNames(r.Relax)
		if i := slices.Index(relax, "poisson"); i >= 0 {
			c.RelaxPoisson = true
			relax = slices.Delete(relax, i, i+1)
		}
		strat := feasibility.Strategy{
			Retain: lawCol("retain", r.Retain), Relax: lawCol("relax", strings.Join(relax, ",")),
			Untie: qCol("untie", r.Untie), Given: qCol("given", r.Given), Tuned: qCol("tuned", r.Tuned),
		}
		for _, item := range splitNames(r.Fix) {
			if tie, isTie, err := gLevelTie(item); isTie {
				if err != nil {
					ps.Add(At("Strategies", r.Row, "fix"), "%v", err)
					ok = false
				}
				strat.Tied = append(strat.Tied, tie)
				continue
			}
			q, val, found := strings.Cut(item, "=")
			k, err := strconv.ParseFloat(val, 64)
			if !found || err != nil || !(k > 0) || math.IsInf(k, 0) {
				ps.Add(At("Strategies", r.Row, "fix"), "%q is not QUANTITY=FACTOR with a positive factor (e.g. velocity=2)", item)
				ok = false
				continue
			}
			if _, err := feasibility.LookupQuantity(q); err != nil {
				ps.Add(At("Strategies", r.Row, "fix"), "%v", err)
				ok = false
				continue
			}
			p.addFix(c, q, k, ps)
		}
		strat.PreferFree = p.preferFree(c.Fix, strat.Untie)
		c.Correction = strings.TrimSpace(r.Correction)
		if c.Correction != "" && !slices.Contains(Corrections, c.Correction) {
			ps.Add(At("Strategies", r.Row, "correction"), "unknown correction %q%s", c.Correction, feasibility.Suggest(c.Correction, Corrections))
		}
		c.Media = pickCandidates(p.Media, r.Media, "Media", At("Strategies", r.Row, "media"), ps)
		c.Materials = pickCandidates(p.Materials, r.Materials, "Materials", At("Strategies", r.Row, "materials"), ps)
		c.Facilities = p.pickFacilities(r.Facilities, At("Strategies", r.Row, "facilities"), ps)
		if !ok {
			continue
		}
		sol, err := feasibility.Solve(strat)
		if err != nil {
			ps.Add(At("Strategies", r.Row, "retain"), "%v", err)
			continue
		}
		c.Solution = sol
		for _, f := range sol.Free {
			if _, fixed := c.Fix[f]; fixed || p.Settings.Axis == f {
				continue
			}
			ps.Add(At("Strategies", r.Row, "fix"), "strategy %q leaves the %s scale free: fix it here (fix: %s=1) or sweep it as the second axis (Study: axis = %s)", name, f, f, f)
		}
		for q := range c.Fix {
			if !slices.Contains(sol.Free, q) {
				ps.Add(At("Strategies", r.Row, "fix"), "%s is not a free choice of this strategy (free: %s)", q, orNone(sol.Free))
			}
		}
		p.checkGiven(c, strat.Given, ps)
		st, ok2 := byName[name]
		if !ok2 {
			st = &PlanStrategy{Name: name, Technique: c.Technique}
			byName[name] = st
			p.Strategies = append(p.Strategies, st)
		}
		for _, other := range st.Cases {
			if other.Case == c.Case {
				ps.Add(At("Strategies", r.Row, "case"), "strategy %q has case %q twice; name each case", name, c.Case)
			}
		}
		st.Cases = append(st.Cases, c)
	}
	if len(p.Study.Strategies) == 0 {
		ps.Add(Cell{Sheet: "Strategies"}, "no strategy: add at least one row")
	}
}

func orNone(s []string) string {
	if len(s) == 0 {
		return "none"
	}
	return strings.Join(s, ", ")
}

// checkGiven makes sure every given quantity has a prototype value and a
// model value from each candidate the case may use.
func (p *Plan) checkGiven(c *PlanCase, given []string, ps *Problems) {
	cell := At("Strategies", c.Row, "given")
	for _, q := range given {
		if _, ok := p.Proto[q]; !ok {
			ps.Add(cell, "%s is given but the prototype has no %s: set prototype_medium or prototype_material on the Study sheet, or add an item %s (scales_as %s) to the Prototype sheet", q, q, q, q)
			continue
		}
		if q == "gravity" {
			continue
		}
		for _, m := range candidatesOrNil(c.Media) {
			for _, mat := range candidatesOrNil(c.Materials) {
				if _, ok := modelProp(q, m, mat); !ok {
					ps.Add(cell, "%s is given but %s has none: choose a medium or material that states %s", q, describePair(m, mat), q)
				}
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

func pickCandidates(all []*Candidate2, list, sheet string, cell Cell, ps *Problems) []*Candidate2 {
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

func (p *Plan) pickFacilities(list string, cell Cell, ps *Problems) []*Facility {
	names := splitNames(list)
	if len(names) == 0 {
		return p.Facilities
	}
	known := make([]string, len(p.Facilities))
	for i, f := range p.Facilities {
		known[i] = f.Name
	}
	var out []*Facility
	for _, n := range names {
		i := slices.Index(known, n)
		if i < 0 {
			ps.Add(cell, "no facility named %q on the Facilities sheet%s", n, feasibility.Suggest(n, known))
			continue
		}
		out = append(out, p.Facilities[i])
	}
	return out
}

func (p *Plan) prepareLimits(ps *Problems) {
	seen := map[string]bool{}
	for _, r := range p.Study.Limits {
		name := strings.TrimSpace(r.Limit)
		applies := strings.TrimSpace(r.AppliesTo)
		if applies == "" {
			applies = "all"
		}
		if name == "" {
			ps.Add(At("Limits", r.Row, "limit"), "the limit has no name")
			continue
		}
		key := applies + "\x00" + name
		if seen[key] {
			ps.Add(At("Limits", r.Row, "limit"), "limit %q for %s appears twice", name, applies)
			continue
		}
		seen[key] = true
		if applies != "all" && !p.Catalog.HasType(applies) && p.facility(applies) == nil {
			var known []string
			known = append(known, "all")
			known = append(known, p.Catalog.Types()...)
			for _, f := range p.Facilities {
				known = append(known, f.Name)
			}
			ps.Add(At("Limits", r.Row, "applies_to"), "%q is neither all, a facility type nor a facility of the study%s", applies, feasibility.Suggest(applies, known))
			continue
		}
		l, err := feasibility.ParseLimit(r.Expression)
		if err != nil {
			ps.Add(At("Limits", r.Row, "expression"), "%v", err)
			continue
		}
		pl := &PlanLimit{AppliesTo: applies, Name: name, Source: strings.TrimSpace(r.Source), Limit: l, Row: r.Row}
		if pl.Source == "" {
			pl.Source = "study"
		}
		// Dimension-check against every facility it applies to (or none).
		var targets []*Facility
		for _, f := range p.Facilities {
			if applies == "all" || applies == f.Type || applies == f.Name {
				targets = append(targets, f)
			}
		}
		if len(targets) == 0 {
			targets = []*Facility{nil}
		}
		for _, f := range targets {
			if err := l.Check(p.dimResolver(f)); errors.Is(err, errFailedName) {
				break // reported at its own row
			} else if err != nil {
				where := ""
				if f != nil {
					where = " (for facility " + strconv.Quote(f.Name) + ")"
				}
				ps.Add(At("Limits", r.Row, "expression"), "%v%s", err, where)
				break
			}
		}
		p.Limits = append(p.Limits, pl)
	}
}

func (p *Plan) facility(name string) *Facility {
	for _, f := range p.Facilities {
		if f.Name == name {
			return f
		}
	}
	return nil
}

// Constants usable in measures.
var constants = map[string]struct {
	value float64
	dim   feasibility.Dimension
}{
	"g_n": {StandardGravity, feasibility.Dim(0, 1, -2, 0)},
	"pi":  {math.Pi, feasibility.Dimension{}},
}

// names returns every name a measure may use for a facility, for
// suggestions.
func (p *Plan) names(f *Facility) []string {
	var out []string
	out = append(out, p.ItemOrder...)
	if f != nil {
		for c := range f.Caps {
			out = append(out, c)
		}
	}
	for _, q := range feasibility.Quantities() {
		if q.Kind == feasibility.Property {
			out = append(out, q.Name)
		}
	}
	for c := range constants {
		out = append(out, c)
	}
	sort.Strings(out)
	return out
}

// dimResolver gives the dimension of a name in a measure: a prototype item
// (at model scale), a capability of the facility, a model property or a
// constant.
func (p *Plan) dimResolver(f *Facility) func(string) (feasibility.Dimension, error) {
	return func(name string) (feasibility.Dimension, error) {
		if it, ok := p.Items[name]; ok {
			return it.Dim, nil
		}
		if f != nil {
			if _, ok := f.Caps[name]; ok {
				cp, _ := p.Catalog.Capability(f.Type, name)
				return cp.Dim, nil
			}
		}
		if q, ok := feasibility.QuantityNamed(name); ok && q.Kind == feasibility.Property {
			return q.Dim, nil
		}
		if c, ok := constants[name]; ok {
			return c.dim, nil
		}
		if name == "g_level" { // every facility's g-level, 1 unless stated or tied
			return feasibility.Dimension{}, nil
		}
		if p.failed.has(name) || f != nil && p.failed.has(f.Name, name) {
			return feasibility.Dimension{}, errFailedName
		}
		return feasibility.Dimension{}, unknownName(name, func() []string { return p.names(f) })
	}
}

type unknownNameError struct {
	name  string
	known func() []string
}

func (e unknownNameError) Error() string {
	hint := feasibility.Suggest(e.name, e.known())
	if strings.HasPrefix(hint, " (known") {
		hint = ""
	}
	return "unknown name " + strconv.Quote(e.name) + hint + ": use a prototype item, a facility capability, a property (density, kinematic_viscosity, ...) or g_n"
}

// unknownName reports a name no measure may use; the suggestion is worked
// out only when the message is printed.
func unknownName(name string, known func() []string) error {
	return unknownNameError{name, known}
}

func (p *Plan) prepareCosts(ps *Problems) {
	for _, r := range p.Study.Costs {
		c := &PlanCost{Item: strings.TrimSpace(r.Item), Facility: strings.TrimSpace(r.Facility), Row: r.Row}
		k, err := strconv.ParseFloat(strings.TrimSpace(r.Coefficient), 64)
		if err != nil || math.IsNaN(k) || math.IsInf(k, 0) || k < 0 {
			ps.Add(At("Costs", r.Row, "coefficient"), "%q is not a non-negative number", r.Coefficient)
			continue
		}
		c.Coefficient = k
		c.Per = feasibility.Unit{Factor: 1}
		if s := strings.TrimSpace(r.Per); s != "" && s != "1" {
			u, err := feasibility.ParseUnit(s)
			if err != nil {
				ps.Add(At("Costs", r.Row, "per"), "%v", err)
				continue
			}
			c.Per = u
		}
		e, err := feasibility.ParseExpr(r.Measure)
		if err != nil {
			ps.Add(At("Costs", r.Row, "measure"), "%v", err)
			continue
		}
		c.Measure = e
		var f *Facility
		if c.Facility != "" {
			if f = p.facility(c.Facility); f == nil {
				ps.Add(At("Costs", r.Row, "facility"), "no facility named %q", c.Facility)
				continue
			}
		}
		targets := []*Facility{f}
		if f == nil && len(p.Facilities) > 0 {
			targets = p.Facilities
		}
		p.checkDim(ps, e, targets, c.Per.Dim, At("Costs", r.Row, "measure"), At("Costs", r.Row, "per"),
			func(d feasibility.Dimension) string {
				return fmt.Sprintf("the measure has dimension %s but per is %q (%s)", d, r.Per, c.Per.Dim)
			})
		p.Costs = append(p.Costs, c)
	}
}

func (p *Plan) buildGrid(ps *Problems) {
	st := p.Settings
	total := st.Points
	if st.Axis != "" {
		total *= st.AxisPoints
	}
	combos := 0
	for _, s := range p.Strategies {
		for _, c := range s.Cases {
			combos += max(1, len(c.Media)) * max(1, len(c.Materials)) * max(1, len(c.Facilities))
		}
	}
	if n := float64(total) * float64(combos); n > float64(st.MaxPoints) {
		ps.Add(st.Cell("points"), "the sweep has %.3g points (%d grid points × %d combinations), more than %d: %s", n, total, combos, st.MaxPoints, tooManyPoints(n))
		return
	}
	p.Grid = geomGrid(st.ScaleFrom, st.ScaleTo, st.Points)
	if st.Axis != "" {
		from, to := st.AxisUnit.ToSI(st.AxisFrom), st.AxisUnit.ToSI(st.AxisTo)
		if st.AxisLinear {
			p.AxisValues = make([]float64, st.AxisPoints)
			for i := range p.AxisValues {
				p.AxisValues[i] = from + (to-from)*float64(i)/float64(st.AxisPoints-1)
			}
		} else {
			p.AxisValues = geomGrid(from, to, st.AxisPoints)
		}
	}
}

// geomGrid returns n log-spaced values from a to b, stepped by
// multiplication, with the end points exact.
func geomGrid(a, b float64, n int) []float64 {
	g := make([]float64, n)
	r := math.Pow(b/a, 1/float64(n-1))
	x := a
	for i := range g {
		g[i] = x
		x *= r
	}
	g[n-1] = b
	return g
}

func (p *Plan) prepareMeasures(ps *Problems) {
	for _, r := range p.Study.Measures {
		m := &PlanMeasure{Name: strings.TrimSpace(r.Measure), Row: r.Row, Unit: feasibility.Unit{Factor: 1}}
		if m.Name == "" {
			ps.Add(At("Measures", r.Row, "measure"), "the measure has no name")
			continue
		}
		e, err := feasibility.ParseExpr(r.Expression)
		if err != nil {
			ps.Add(At("Measures", r.Row, "expression"), "%v", err)
			continue
		}
		m.Expr = e
		if u := strings.TrimSpace(r.Unit); u != "" && u != "1" {
			pu, err := feasibility.ParseUnit(u)
			if err != nil {
				ps.Add(At("Measures", r.Row, "unit"), "%v", err)
				continue
			}
			m.Unit = pu
		}
		targets := p.Facilities
		if len(targets) == 0 {
			targets = []*Facility{nil}
		}
		p.checkDim(ps, e, targets, m.Unit.Dim, At("Measures", r.Row, "expression"), At("Measures", r.Row, "unit"),
			func(d feasibility.Dimension) string {
				return fmt.Sprintf("the measure has dimension %s but the unit %q is %s", d, r.Unit, m.Unit.Dim)
			})
		p.Measures = append(p.Measures, m)
	}
}

// checkDim dimension-checks a measure for every facility it may be
// evaluated with: a name it cannot resolve is reported at exprCell, a
// dimension other than want at unitCell (one problem at most).
func (p *Plan) checkDim(ps *Problems, e *feasibility.Expr, targets []*Facility, want feasibility.Dimension, exprCell, unitCell Cell, mismatch func(feasibility.Dimension) string) {
	for _, f := range targets {
		d, err := e.Dim(p.dimResolver(f))
		if errors.Is(err, errFailedName) {
			return // reported at its own row
		}
		if err != nil {
			ps.Add(exprCell, "%v", err)
			return
		}
		if !d.Equal(want) {
			ps.Add(unitCell, "%s", mismatch(d))
			return
		}
	}
}

// rangeMiddle is the geometric middle of a tunable range written as two
// numbers with the same unit, as text; the bounds as given when either is
// not a bare positive number (the range check then names the cell).
func rangeMiddle(lo, hi string) string {
	a, errA := strconv.ParseFloat(lo, 64)
	b, errB := strconv.ParseFloat(hi, 64)
	if errA != nil || errB != nil || !(a > 0) || !(b > 0) {
		return lo
	}
	return strconv.FormatFloat(math.Sqrt(a*b), 'g', 6, 64)
}
