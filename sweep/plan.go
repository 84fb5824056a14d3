package sweep

import (
	"scaleplan/feasibility"
	"scaleplan/materials"
	"scaleplan/sweep/study"
)

// StandardGravity is g_n = 9.80665 m/s² (CGPM 1901; NIST SP 811), the
// gravity of an ordinary facility and the unit of a centrifuge's g-level.
const StandardGravity = 9.80665

// Plan is a checked study, ready to run: numbers in SI, names resolved,
// each strategy and case solved once.
type Plan struct {
	Study      *study.Study
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
	Warnings study.Warnings
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
func Prepare(s *study.Study, lib *materials.Library, cat *FacilityCatalog) (*Plan, error) {
	var ps study.Problems
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
	p.Warnings = append(append(study.Warnings(nil), s.Warnings...), p.Warnings...) // reading first
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
