package report

import (
	"regexp"
	"sort"
	"strings"
)

// labels gives the readable name of every identifier the tool uses for
// quantities, laws, facility capabilities and settings. Documents for
// people (the memo, its HTML twin) use these; snake_case stays in the
// machine outputs (JSON, workbook columns a program reads).
var labels = map[string]string{
	// Quantities.
	"length": "length", "thickness": "thickness", "area_moment": "second moment of area",
	"strain": "strain", "time": "time", "frequency": "frequency", "acceleration": "acceleration",
	"force": "force", "moment": "moment", "pressure": "pressure", "mass": "mass",
	"power": "power", "energy": "energy", "stiffness": "spring stiffness",
	"kinematic_viscosity": "kinematic viscosity", "flexural_rigidity": "flexural rigidity",
	"viscosity": "dynamic viscosity", "surface_tension": "surface tension",
	"sound_speed": "speed of sound", "modulus": "Young's modulus", "strength": "strength",
	"cohesion": "cohesion", "friction": "friction coefficient", "poisson": "Poisson's ratio",
	"temperature": "temperature", "gravity": "gravity", "density": "density", "velocity": "speed",
	"discharge": "discharge", "roughness": "Manning roughness", "consolidation_coefficient": "coefficient of consolidation",
	"permeability": "permeability", "vapour_pressure": "vapour pressure",
	// Facility capabilities.
	"tank_length": "tank length", "tank_width": "tank width", "tank_depth": "water depth",
	"carriage_speed_min": "lowest carriage speed", "carriage_speed_max": "highest carriage speed",
	"wave_period_min": "shortest wave period", "wave_period_max": "longest wave period",
	"wave_height_max": "highest wave", "hourly_rate": "hourly rate",
	"ice_thickness_min": "thinnest model ice", "ice_thickness_max": "thickest model ice",
	"ice_strength_min": "weakest model ice", "ice_strength_max": "strongest model ice",
	"section_width": "test-section width", "section_height": "test-section height",
	"speed_min": "lowest wind speed", "speed_max": "highest wind speed",
	"bin_length": "soil-bed length", "bin_width": "soil-bed width", "soil_depth": "soil depth",
	"carriage_force_max": "highest carriage force", "g_level_max": "highest g-level",
	"bucket_length": "bucket length", "bucket_height": "bucket height", "capacity": "payload capacity",
	"radius": "radius", "payload_max": "largest payload", "frequency_min": "lowest table frequency",
	"frequency_max": "highest table frequency", "acceleration_max": "highest table acceleration",
	"stroke": "table stroke", "platform_length": "platform length",
	"force_resolution": "force-transducer resolution", "pressure_resolution": "pressure-transducer resolution",
	"g_level": "g-level", "g_level_min": "lowest g-level", "actuator_frequency_max": "highest actuator frequency",
	"ambient_pressure_min": "lowest ambient pressure", "ambient_pressure_max": "highest ambient pressure",
	"floor_length": "floor length", "floor_width": "floor width", "floor_area": "floor area",
	"pump_discharge_max": "largest pump discharge",
	// Facility types.
	"towing_tank": "towing tank", "wave_basin": "wave basin", "ice_tank": "ice tank",
	"wind_tunnel": "wind tunnel", "soil_bin": "soil bin", "shaking_table": "shaking table", "centrifuge": "centrifuge",
	"cavitation_tunnel": "cavitation tunnel", "depressurised_tank": "depressurised tank", "model_hall": "model hall",
	// Techniques.
	"special_cases": "special cases",
	// Settings a memo may name.
	"design_speed": "design speed", "reference_length": "reference length", "reference_speed": "reference speed",
	"scale_from": "smallest kL", "scale_to": "largest kL", "inputs_date": "inputs date",
}

// lawLabels are the readable names of the similitude laws.
var lawLabels = map[string]string{
	"surface_tension": "surface-tension law", "viscosity": "viscosity law", "gravity": "gravity law",
	"inertia": "inertia law", "elasticity": "elasticity law", "compressibility": "compressibility law",
	"pressure": "pressure law", "cohesion": "cohesion law", "friction": "friction law",
	"bending": "bending law", "flexure": "flexure law", "strength": "strength law", "spring": "spring law",
	"hydrostatic": "hydrostatic law", "bed_friction": "bed-friction law", "consolidation": "consolidation law",
	"cavitation": "cavitation law",
}

// Label is the readable name of an identifier: from the table, or the
// identifier with its underscores as spaces (a name typed in a study).
func Label(id string) string {
	if l, ok := labels[id]; ok {
		return l
	}
	return strings.ReplaceAll(id, "_", " ")
}

// LawLabel is the readable name of a law ("the viscosity law").
func LawLabel(law string) string {
	if l, ok := lawLabels[law]; ok {
		return l
	}
	return Label(law) + " law"
}

// RawIdentifiers lists the identifiers whose readable name differs from
// them (snake_case names): a document for people must not show them.
func RawIdentifiers() []string {
	var out []string
	for id, l := range labels {
		if id != l && strings.Contains(id, "_") {
			out = append(out, id)
		}
	}
	for id := range lawLabels {
		if strings.Contains(id, "_") {
			out = append(out, id)
		}
	}
	sort.Strings(out)
	return out
}

var (
	scaleSymbolRE = regexp.MustCompile(`k_([a-z_]+)`)
	exponentRE    = regexp.MustCompile(`\^(-?[0-9]+(?:/[0-9]+)?)`)
)

// ReadableLaw rewrites a scale law for people: "k_power = kL^7/2 ·
// k_density" becomes "kL^(7/2) · k(density)", the right-hand side with the
// quantities named; a law that only says a factor is itself (a property
// the chosen medium or material gives) comes back as "".
func ReadableLaw(law string) string {
	lhs, rhs, ok := strings.Cut(law, " = ")
	if !ok {
		return lawProse(law)
	}
	if strings.TrimSpace(lhs) == strings.TrimSpace(rhs) {
		return ""
	}
	return lawProse(rhs)
}

// lawProse rewrites the scale factors and exponents of a law or condition
// for people: "k_viscosity = kL^3/2" becomes "k(dynamic viscosity) =
// kL^(3/2)".
func lawProse(law string) string {
	law = exponentRE.ReplaceAllStringFunc(law, func(e string) string {
		if strings.ContainsAny(e, "/-") {
			return "^(" + e[1:] + ")"
		}
		return e
	})
	return scaleSymbolRE.ReplaceAllStringFunc(law, symbolLabel)
}

func symbolLabel(sym string) string {
	return "k(" + Label(strings.TrimPrefix(sym, "k_")) + ")"
}
