// Package materials is scaleplan's library of candidate model materials and
// media: solids, fluids, soils and ices, each property in SI with its
// source. Solids, soils and ices have fixed properties read from CSV files
// embedded in the binary; fresh water, seawater, the gases, glycerol,
// water–glycerol mixtures, brine and the silicone oils are functions of
// their state (temperature, pressure, salinity, mass fraction), each valid
// in a stated range and refused outside it, never extrapolated: water by
// Tanaka et al. (2001) for density, IAPWS R12-08 for viscosity and IAPWS
// R1-76(2014) for surface tension; seawater by Sharqawy, Lienhard & Zubair
// (2010); gases as ideal gases with Sutherland's law (air per ISO 2533);
// glycerol and its mixtures by Cheng (2008) for viscosity and Volk &
// Kähler (2018) for density; brine (NaCl solution, its salt mass fraction
// in the Salinity condition) by Laliberté & Cooper (2004) and Laliberté
// (2007); silicone oils by grade, over temperature by their
// viscosity–temperature coefficient.
//
// # Names and recipes
//
// Lookup resolves names people type to the same substance only (perspex
// is pmma, glycerine is glycerol; glycerol is never the mixture) and
// refuses class words (steel, sand, oil) with the entries they could mean
// (names.go). A mixture whose fraction is not given takes its default, and
// Entry.DefaultNote says so for printing beside the conditions.
//
// Entry.Recipe finds the conditions at which an entry meets a required
// property (a fixed value, or one depending on the entry's own properties)
// within tolerance, every other required property holding at the same
// conditions: the study's temperature is kept and the mixture knob solved
// first, the temperature moved only if needed; an unmet requirement gives
// the nearest conditions. Library.FindRecipes searches every entry,
// Library.Extreme finds the extreme value the library can make (the least
// viscous liquid), and Entry.ValuesAt evaluates an entry cheaply at given
// conditions (recipe.go). A Searcher (Library.Searcher) runs those
// searches remembering each entry's extremes, and does not solve an entry
// whose range cannot reach a constant requirement: a sweep asks the same
// question at many scales (recipe_searcher.go).
// Kinematic viscosity is always viscosity/density (or the other of the
// three derived from two). A property may carry a tunable range [Min, Max]:
// model ice strength and modulus, lab kaolin strength, and for a fluid the
// range its properties sweep when its tunable condition (water temperature,
// gas pressure, glycerol fraction, brine salinity, oil temperature) moves
// over its valid range. A Library
// holds no global state: Default builds a fresh one from the embedded data,
// Add puts a study's own validated entries in it, overriding an entry of
// the same name, and Meeting finds entries meeting a required property.
//
// # Data files
//
// data/entries.csv lists every entry (name, kind, description); names are
// lower case with underscores and are what users type (matching ignores
// case, spaces and hyphens). data/solids.csv, fluids.csv, soils.csv and
// ices.csv hold the fixed properties of the entries of that kind, one row
// per property: name, quantity, value, min, max, unit, source. The quantity
// is a material property of package feasibility (density, modulus,
// poisson, strength, friction, cohesion, viscosity, kinematic_viscosity,
// surface_tension, ...); value, min and max are in the row's unit, any unit
// scaleplan reads, checked against the quantity's dimension; min and max are
// both empty for a fixed property. friction is tan φ with φ in the source;
// for clays cohesion is the undrained shear strength. Entries computed from
// their state have no rows. Lines starting with # are comments. Every value
// names its source, "from memory" where it was not checked against a
// publication.
//
// # Conditions
//
// ParseConditions reads comma-separated parts, each a value whose unit
// tells what it is (20C, 293.15K: temperature; 3bar, 101325Pa: absolute
// pressure; 35g/kg or 35‰: salinity; 50%: glycerol mass fraction) or a
// KEY=VALUE pair (T=20C, p=3bar, S=35 in g/kg, w=0.5; a bare S between 0
// and 1 is refused as ambiguous). Conditions not given take the entry's
// defaults (20 °C, 101325 Pa, 35 g/kg, w = 0.5; 25 °C for the silicone
// oils). Entry.At
// refuses a condition the entry does not take (fixed entries take none) and
// a value outside its valid range; Meeting instead ignores conditions an
// entry does not take and leaves out entries whose range excludes them.
package materials
