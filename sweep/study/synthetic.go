package study

import (
	"fmt"
	"strconv"
)

// Synthetic builds a large invented study for benchmarks and for
// reproducing performance figures: the harbour-tug setting with `points`
// length scales, an optional second axis of `axis` tank depths (0 for
// none), `candidates` tank waters at different temperatures, and
// `strategies` strategies cycling through four kinds. It is what
// `scaleplan init DIR --synthetic PxAxCxS` writes.
func Synthetic(points, axis, candidates, strategies int) *Study {
	s := &Study{Name: "synthetic", Settings: map[string]Setting{}}
	row := 2
	set := func(name, value string) {
		s.Settings[name] = Setting{Name: name, Value: value, Cell: Cell{"Study", row, 2}}
		row++
	}
	set("name", fmt.Sprintf("synthetic-%dx%dx%dx%d", points, axis, candidates, strategies))
	set("purpose", "an invented large study for performance figures")
	set("scale_from", "4")
	set("scale_to", "80")
	set("points", strconv.Itoa(points))
	if axis > 0 {
		set("axis", "tank_depth")
		set("axis_from", "2")
		s.Settings["axis_from"] = Setting{Name: "axis_from", Value: "2", Unit: "m", Cell: s.Settings["axis_from"].Cell}
		set("axis_to", "10")
		set("axis_points", strconv.Itoa(axis))
	}
	set("prototype_medium", "seawater")
	set("prototype_medium_conditions", "15C,35g/kg")
	set("currency", "EUR")
	set("max_points", "1000000000")
	items := [][]string{
		{"hull_length", "28", "m", "length"}, {"beam", "11", "m", "length"}, {"draft", "4.8", "m", "length"},
		{"design_speed", "12", "kn", "velocity"}, {"measuring_time", "60", "s", "time"}, {"runs", "80", "", "none"},
	}
	for i, it := range items {
		s.Prototype = append(s.Prototype, Item{Name: it[0], Value: it[1], Unit: it[2], ScalesAs: it[3], Row: i + 2})
	}
	for i := 0; i < candidates; i++ {
		t := 1 + 38*float64(i)/float64(max(1, candidates-1))
		s.Media = append(s.Media, Candidate{Name: fmt.Sprintf("water %02d", i+1), Entry: "water", Conditions: fmt.Sprintf("%.2fC", t), Row: i + 2})
	}
	caps := [][]string{
		{"tank_length", "220", "m"}, {"tank_width", "9", "m"}, {"tank_depth", "4.5", "m"},
		{"carriage_speed_min", "0.1", "m/s"}, {"carriage_speed_max", "2.2", "m/s"}, {"hourly_rate", "620", ""},
	}
	for i, c := range caps {
		s.Facilities = append(s.Facilities, FacilityRow{Facility: "Deepwater tank", Type: "towing_tank", Capability: c[0], Value: c[1], Unit: c[2], Row: i + 2})
	}
	kinds := []StrategyRow{
		{Technique: "dominant", Retain: "inertia, gravity", Relax: "viscosity, surface_tension", Given: "density, gravity, viscosity, surface_tension", Correction: "ittc1957"},
		{Technique: "substitute", Retain: "inertia, gravity, viscosity", Given: "density, gravity"},
		{Technique: "complete", Retain: "inertia, gravity, viscosity", Given: "density, gravity, viscosity"},
		{Technique: "dominant", Retain: "inertia, gravity", Relax: "viscosity", Given: "density, gravity, viscosity"},
	}
	for i := 0; i < strategies; i++ {
		r := kinds[i%len(kinds)]
		r.Strategy = fmt.Sprintf("strategy %d (%s)", i+1, r.Technique)
		r.Row = i + 2
		s.Strategies = append(s.Strategies, r)
	}
	s.Costs = []CostRow{
		{Item: "model manufacture", Coefficient: "2600", Per: "m^2", Measure: "hull_length * beam", Row: 2},
		{Item: "tank time", Coefficient: "1", Per: "h", Measure: "hourly_rate * runs * (tank_length / design_speed + 600 [s])", Row: 3},
	}
	return s
}
