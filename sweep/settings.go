package sweep

import (
	"math"
	"strconv"
	"strings"

	"scaleplan/feasibility"
	"scaleplan/sweep/study"
)

// Settings are the parsed rows of the Study sheet.
type Settings struct {
	Name, Purpose       string
	ScaleFrom, ScaleTo  float64 // kL range of the sweep
	Points              int
	Axis                string // optional second axis: a free choice, a medium condition or a facility capability
	AxisFrom, AxisTo    float64
	AxisPoints          int
	AxisUnit            feasibility.Unit
	AxisLinear          bool
	Tolerance           float64 // relative tolerance for substitute materials
	Currency            string
	Recommend           string // "largest" or "cheapest"
	PrototypeMedium     string
	PrototypeMediumAt   string
	PrototypeMaterial   string
	PrototypeMaterialAt string
	ReferenceLength     string // prototype item giving the model length
	ReferenceSpeed      string // prototype item giving the test speed
	MaxPoints           int    // refuse sweeps larger than this
	InputsDate          string
	Samples             int      // draws of the uncertain inputs (0: none)
	Seed                uint64   // of the draws, for reproducible results
	RobustLevel         float64  // probability a robust scale must reach
	Unballasted         string   // candidates whose mass cannot be ballasted, comma separated
	Predict             []string // quantities the memo gives prediction rules for, besides the measured ones
	// WeakLaws may be relaxed at no cost, GoverningLaws never without
	// counting against a strategy; MismatchThreshold is the mismatch
	// beyond which a relaxed law is a scale effect (see rank.go).
	WeakLaws, GoverningLaws []string
	MismatchThreshold       float64
	cells                   map[string]study.Cell
}

func parseSettings(s *study.Study, ps *study.Problems) Settings {
	st := Settings{cells: map[string]study.Cell{}}
	r := &settingReader{s: s, st: &st, ps: ps}
	for name, v := range s.Settings {
		if _, ok := study.SettingDefaults[name]; !ok {
			ps.Add(study.Cell{Sheet: "Study", Row: v.Cell.Row, Col: 1}, "unknown setting %q%s", name, feasibility.Suggest(name, study.SettingNames()))
		}
	}
	for _, name := range study.SettingRequired {
		if _, ok := r.get(name); !ok {
			ps.Add(study.Cell{Sheet: "Study"}, "setting %q is missing: add a row %s with a positive number", name, name)
		}
	}
	st.Name = r.text("name")
	if strings.ContainsAny(st.Name, "\r\n") {
		ps.Add(st.Cell("name"), "the study name holds a line break: put it on one line (it heads every output)")
	}
	if st.Name == "" {
		st.Name = s.Name
	}
	st.Purpose = strings.Join(strings.Fields(r.text("purpose")), " ") // one paragraph in every output
	r.scales()
	st.Points = r.integer("points", 2, 10_000_000)
	st.Axis = r.text("axis")
	if st.Axis != "" {
		r.axis()
	}
	st.Tolerance = r.number("tolerance")
	if !(st.Tolerance >= 0 && st.Tolerance < 1) {
		c, _ := r.get("tolerance")
		ps.Add(c.Cell, "tolerance must be a fraction from 0 to 1 (0.1 for 10 %%)")
		st.Tolerance = 0.1
	}
	st.Currency = r.text("currency")
	st.Recommend = r.text("recommend")
	if st.Recommend != "largest" && st.Recommend != "cheapest" {
		c, _ := r.get("recommend")
		ps.Add(c.Cell, "recommend must be largest or cheapest, got %q", st.Recommend)
	}
	st.PrototypeMedium, st.PrototypeMediumAt = r.text("prototype_medium"), r.text("prototype_medium_conditions")
	st.PrototypeMaterial, st.PrototypeMaterialAt = r.text("prototype_material"), r.text("prototype_material_conditions")
	st.ReferenceLength, st.ReferenceSpeed = r.text("reference_length"), r.text("reference_speed")
	st.MaxPoints = r.integer("max_points", 1, math.MaxInt32)
	st.InputsDate = r.text("inputs_date")
	st.Unballasted = r.text("unballasted")
	if c, ok := r.get("predict"); ok {
		st.Predict = parsePredict(c.Value, c.Cell, ps)
	}
	st.Samples = r.integer("samples", 0, 10_000_000)
	st.Seed = uint64(r.integer("seed", 0, math.MaxInt32))
	st.RobustLevel = r.number("robust_level")
	if !(st.RobustLevel > 0 && st.RobustLevel < 1) {
		c, _ := r.get("robust_level")
		ps.Add(c.Cell, "robust_level must be a probability between 0 and 1 (0.95 for 95 %%)")
		st.RobustLevel = 0.95
	}
	parseRankSettings(s, &st, ps)
	return st
}

// settingReader reads the settings of a study's Study sheet, recording
// the place of every setting it reads and a problem at every value that
// does not fit.
type settingReader struct {
	s  *study.Study
	st *Settings
	ps *study.Problems
}

// get returns a setting, or its default (false) when it is missing or
// empty.
func (r *settingReader) get(name string) (study.Setting, bool) {
	v, ok := r.s.Settings[name]
	if ok {
		r.st.cells[name] = v.Cell
	}
	if !ok || strings.TrimSpace(v.Value) == "" {
		return study.Setting{Name: name, Value: study.SettingDefaults[name], Cell: study.Cell{Sheet: "Study"}}, false
	}
	return v, true
}

// number reads a number (NaN when empty or wrong).
func (r *settingReader) number(name string) float64 {
	v, _ := r.get(name)
	if v.Value == "" {
		return math.NaN()
	}
	x, err := strconv.ParseFloat(strings.TrimSpace(v.Value), 64)
	if err != nil {
		if y, ok := study.SettingNumber(name, v.Value); ok {
			return y
		}
		if msg := study.TypedAsClock(v.Value); msg != "" {
			r.ps.Add(v.Cell, "%s: %s", name, msg)
			return math.NaN()
		}
	}
	if err != nil || math.IsNaN(x) || math.IsInf(x, 0) {
		r.ps.Add(v.Cell, "%s: %q is not a number", name, v.Value)
		return math.NaN()
	}
	return x
}

// integer reads a whole number from lo to hi (lo when wrong).
func (r *settingReader) integer(name string, lo, hi int) int {
	v, _ := r.get(name)
	n, err := strconv.Atoi(strings.TrimSpace(v.Value))
	if err != nil || n < lo || n > hi {
		r.ps.Add(v.Cell, "%s: %q must be a whole number from %d to %d", name, v.Value, lo, hi)
		return lo
	}
	return n
}

// text reads a text, surrounding spaces removed.
func (r *settingReader) text(name string) string {
	v, _ := r.get(name)
	return strings.TrimSpace(v.Value)
}

// scales reads and checks the range of kL.
func (r *settingReader) scales() {
	st := r.st
	st.ScaleFrom, st.ScaleTo = r.number("scale_from"), r.number("scale_to")
	if !math.IsNaN(st.ScaleFrom) && !math.IsNaN(st.ScaleTo) {
		c, _ := r.get("scale_from")
		switch {
		case st.ScaleFrom <= 0 || st.ScaleTo <= 0:
			r.ps.Add(c.Cell, "the scale range must be positive (kL = prototype/model, e.g. 5 to 100 for 1:5 to 1:100), got %v to %v", st.ScaleFrom, st.ScaleTo)
		case st.ScaleFrom >= st.ScaleTo:
			r.ps.Add(c.Cell, "scale_from (%v) must be below scale_to (%v): kL grows as the model shrinks", st.ScaleFrom, st.ScaleTo)
		}
	}
}

// axis reads and checks the second axis: its range, points, spacing and
// unit.
func (r *settingReader) axis() {
	st, ps := r.st, r.ps
	st.AxisFrom, st.AxisTo = r.number("axis_from"), r.number("axis_to")
	st.AxisPoints = r.integer("axis_points", 2, 100_000)
	c, _ := r.get("axis_from")
	if math.IsNaN(st.AxisFrom) || math.IsNaN(st.AxisTo) {
		ps.Add(c.Cell, "axis %q needs axis_from and axis_to", st.Axis)
	} else if st.AxisFrom >= st.AxisTo {
		ps.Add(c.Cell, "axis_from (%v) must be below axis_to (%v)", st.AxisFrom, st.AxisTo)
	}
	switch r.text("axis_spacing") {
	case "log":
		if st.AxisFrom <= 0 {
			ps.Add(c.Cell, "a log-spaced axis needs a positive range; set axis_spacing to linear")
		}
	case "linear":
		st.AxisLinear = true
	default:
		v, _ := r.get("axis_spacing")
		ps.Add(v.Cell, "axis_spacing must be log or linear, got %q", v.Value)
	}
	st.AxisUnit = feasibility.Unit{Factor: 1}
	if v, ok := r.s.Settings["axis_from"]; ok && strings.TrimSpace(v.Unit) != "" {
		u, err := feasibility.ParseUnit(v.Unit)
		if err != nil {
			ps.Add(study.Cell{Sheet: "Study", Row: v.Cell.Row, Col: 3}, "%v", err)
		} else {
			st.AxisUnit = u
		}
	}
}

// Cell returns the place of a setting's value.
func (st Settings) Cell(name string) study.Cell {
	if c, ok := st.cells[name]; ok {
		return c
	}
	return study.Cell{Sheet: "Study"}
}
