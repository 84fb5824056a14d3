// Package materials is scaleplan's library of candidate model materials and
// media: solids, fluids, soils and ices, each property in SI with its
// source. Solids, soils, ices and silicone oils have fixed properties read
// from CSV files embedded in the binary; fresh water, seawater, the gases
// and water–glycerol mixtures are functions of their state (temperature,
// pressure, salinity, glycerol mass fraction), each valid in a stated range
// and refused outside it, never extrapolated: water by Tanaka et al. (2001)
// for density, IAPWS R12-08 for viscosity and IAPWS R1-76(2014) for surface
// tension; seawater by Sharqawy, Lienhard & Zubair (2010); gases as ideal
// gases with Sutherland's law (air per ISO 2533); mixtures by Cheng (2008).
// Kinematic viscosity is always viscosity/density (or the other of the
// three derived from two). A property may carry a tunable range [Min, Max]:
// model ice strength and modulus, lab kaolin strength, and for a fluid the
// range its properties sweep when its tunable condition (water temperature,
// gas pressure, glycerol fraction) moves over its valid range. A Library
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
// KEY=VALUE pair (T=20C, p=3bar, S=35 in g/kg, w=0.5). Conditions not given
// take the entry's defaults (20 °C, 101325 Pa, 35 g/kg, w = 0.5). Entry.At
// refuses a condition the entry does not take (fixed entries take none) and
// a value outside its valid range; Meeting instead ignores conditions an
// entry does not take and leaves out entries whose range excludes them.
package materials
