package study

import (
	"sort"

	"scaleplan/materials"
)

// Techniques label strategies in the report (spec §4).
var Techniques = []string{"complete", "dominant", "special_cases", "distorted", "simulated", "substitute"}

// Corrections a strategy may ask for.
var Corrections = []string{"ittc1957"}

// Distributions an uncertain input may have.
var Distributions = []string{"normal", "lognormal", "uniform"}

// settingDefaults lists every setting with its default; an empty default
// means the setting is optional or required as noted in settingRequired.
var SettingDefaults = map[string]string{
	"name": "", "purpose": "", "scale_from": "", "scale_to": "", "points": "200",
	"axis": "", "axis_from": "", "axis_to": "", "axis_points": "25", "axis_spacing": "log",
	"tolerance": "0.1", "currency": "EUR", "recommend": "largest",
	"prototype_medium": "", "prototype_medium_conditions": "", "prototype_material": "", "prototype_material_conditions": "",
	"reference_length": "", "reference_speed": "", "max_points": "100000000", "inputs_date": "",
	"samples": "0", "seed": "1", "robust_level": "0.95", "unballasted": "",
	"weak_laws": "", "governing_laws": "", "mismatch_threshold": "10",
	"predict": "",
}

var SettingRequired = []string{"scale_from", "scale_to"}

// SettingNames lists every setting of the Study sheet, sorted.
func SettingNames() []string {
	names := make([]string, 0, len(SettingDefaults))
	for k := range SettingDefaults {
		names = append(names, k)
	}
	sort.Strings(names)
	return names
}

// materialKinds are the kinds a custom entry may be.
var materialKinds = kindNames()

func kindNames() []string {
	var kinds []string
	for _, k := range materials.Kinds() {
		kinds = append(kinds, string(k))
	}
	return kinds
}
