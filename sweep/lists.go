package sweep

import (
	"scaleplan/feasibility"
	"scaleplan/materials"
	"scaleplan/sweep/study"
)

// DefaultLists are the lists a template offers: the laws, quantities,
// library entries, facility types with their capabilities and techniques.
func DefaultLists(lib *materials.Library, cat *FacilityCatalog) study.Lists {
	var entries []string
	for _, e := range lib.Entries() {
		entries = append(entries, e.Name)
	}
	caps := map[string][]string{}
	for _, t := range cat.Types() {
		caps[t] = cat.CapabilityNames(t)
	}
	return study.Lists{Laws: feasibility.LawNames(), Quantities: feasibility.QuantityNames(), Entries: entries,
		FacilityTypes: cat.Types(), Techniques: study.Techniques, Capabilities: caps}
}
