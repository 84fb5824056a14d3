package sweep

import (
	"os"
	"path/filepath"
	"strconv"
	"strings"
	"testing"

	"scaleplan/sweep/study"
	"scaleplan/sweep/study/studytest"
)

func TestWarnStrayCSVFile(t *testing.T) {
	sheets := studytest.MinimalCSV()
	sheets["Limit"] = "applies_to,limit,expression,source\nall,short,hull_length <= 1 m,\n"
	dir := studytest.WriteFolder(t, sheets)
	for _, f := range []string{"notes.txt", ".gitkeep", "~$Study.csv"} {
		if err := os.WriteFile(filepath.Join(dir, f), []byte("x"), 0o644); err != nil {
			t.Fatal(err)
		}
	}
	s, err := study.Load(dir)
	studytest.CheckProblems(t, err, nil)
	studytest.HasWarning(t, s.Warnings, "Limit.csv is not a sheet of a study; did you mean Limits.csv?")
	studytest.HasWarning(t, s.Warnings, "notes.txt is not a sheet of a study and is not read")
	if len(s.Warnings) != 2 {
		t.Errorf("hidden and lock files should pass silently: %q", s.Warnings.Strings())
	}
	// The warning reaches the plan, and so every output.
	anchor := filepath.Join(t.TempDir(), "anchor")
	if err := os.CopyFS(anchor, os.DirFS("testdata/anchor")); err != nil {
		t.Fatal(err)
	}
	if err := os.WriteFile(filepath.Join(anchor, "Limit.csv"), []byte(sheets["Limit"]), 0o644); err != nil {
		t.Fatal(err)
	}
	s, err = study.Load(anchor)
	studytest.CheckProblems(t, err, nil)
	plan, err := prepare(t, s)
	if err != nil {
		t.Fatal(err)
	}
	studytest.HasWarning(t, plan.Warnings, "Limit.csv is not a sheet")
}

func TestWarnDefaultLimitNotApplied(t *testing.T) {
	s := anchorStudy(t)
	for i, it := range s.Prototype {
		if it.Name == "design_force" {
			s.Prototype[i].Name = "design_forces"
		}
	}
	plan, err := prepare(t, s)
	if err != nil {
		t.Fatal(err)
	}
	// Both facilities state a force resolution, so the limit concerns
	// both; each is named once.
	for _, f := range []string{"Clay bin (a soil_bin)", "Beam centrifuge (a centrifuge)"} {
		studytest.HasWarning(t, plan.Warnings, "default limits of "+f, `"force above resolution"`, "needs the prototype item design_force (did you mean design_forces?)")
	}
	// The sweep skips the limit indeed: the small-model edge moves to the
	// end of the sweep.
	res, err := plan.Run(t.Context())
	if err != nil {
		t.Fatal(err)
	}
	if w := strategy(t, res, "1 g bin").Best.Window; !relClose(w[len(w)-1].Hi, 400, 1e-9) {
		t.Errorf("window %v: the limit should not apply", w)
	}
	if len(res.Warnings) != len(plan.Warnings) {
		t.Errorf("the result's warnings %q differ from the plan's", res.Warnings.Strings())
	}
	// With the item present, no such warning.
	plan, err = prepare(t, anchorStudy(t))
	if err != nil {
		t.Fatal(err)
	}
	if len(plan.Warnings) != 0 {
		t.Errorf("unexpected warnings %q", plan.Warnings.Strings())
	}
}

func TestWarnUnusedCapability(t *testing.T) {
	s := anchorStudy(t)
	s.Facilities = append(s.Facilities, study.FacilityRow{Facility: "Clay bin", Type: "soil_bin", Capability: "bin_length", Value: "30", Unit: "m", Row: 16})
	plan, err := prepare(t, s)
	if err != nil {
		t.Fatal(err)
	}
	w := studytest.HasWarning(t, plan.Warnings, "bin_length of Clay bin is stated but no limit, cost or measure uses it")
	if w.Cell.String() != "Facilities!C16" {
		t.Errorf("place %s", w.Cell)
	}
	// hourly_rate is used by a cost; g_level_max by a default limit:
	// neither warns.
	for _, w := range plan.Warnings {
		if strings.Contains(w.Msg, "hourly_rate") || strings.Contains(w.Msg, "g_level_max") {
			t.Errorf("used capability warned: %s", w)
		}
	}
}

// conductorFixed is the conductor with its velocity scale fixed in the
// Strategies cell instead of swept.
func conductorFixed(t *testing.T, fix string, keepAxis bool) *study.Study {
	s := scenario(t, "conductor")
	if !keepAxis {
		for _, k := range []string{"axis", "axis_from", "axis_to", "axis_points", "axis_spacing"} {
			delete(s.Settings, k)
		}
	}
	s.Strategies[0].Fix = fix
	return s
}

func TestFixGivenTwice(t *testing.T) {
	msg := prepareErr(t, conductorFixed(t, "velocity=2, velocity=3", false))
	if !strings.Contains(msg, "Strategies!I2: velocity is fixed twice, at 2 and at 3: which one holds is ambiguous; keep one") {
		t.Errorf("got %q", msg)
	}
	plan, err := prepare(t, conductorFixed(t, "velocity=2; velocity=2", false))
	if err != nil {
		t.Fatal(err)
	}
	w := studytest.HasWarning(t, plan.Warnings, "Strategies!I2: velocity=2 is given twice; it is taken once")
	if w.Strategy != "spring-mounted section" {
		t.Errorf("the warning belongs to the strategy: %+v", w)
	}
	if len(plan.Warnings.Of("spring-mounted section")) != 1 || len(plan.Warnings.Study()) != len(plan.Warnings)-1 {
		t.Errorf("split of warnings: %q", plan.Warnings.Strings())
	}
}

func TestUncertainGivenTwice(t *testing.T) {
	s := scenario(t, "tug")
	dup := s.Uncertain[0]
	dup.Spread, dup.Row = "8%", len(s.Uncertain)+2
	s.Uncertain = append(s.Uncertain, dup)
	msg := prepareErr(t, s)
	want := "Uncertainty!A" + strconv.Itoa(dup.Row) + ": design_speed is given uncertain twice (also on row 2): which spread holds is ambiguous; keep one row"
	if !strings.Contains(msg, want) {
		t.Errorf("got %q, want %q", msg, want)
	}
}

// TestAxisDoesNotApplyToAFixedCase: a case that fixes the axis quantity
// keeps its factor, so it has no axis value and no map over the axis.
func TestAxisDoesNotApplyToAFixedCase(t *testing.T) {
	res := runStudy(t, conductorFixed(t, "velocity=2", true))
	c := res.Strategies[0].Combos[0]
	if len(c.AxisWindows) != 0 || len(c.AxisMarginRows()) != 0 || !isNaN(c.Axis) {
		t.Errorf("a fixed case swept over the axis: axis %v, %d rows", c.Axis, len(c.AxisWindows))
	}
	free := runStudy(t, scenario(t, "conductor")).Strategies[0].Combos[0]
	if len(free.AxisWindows) < 2 || len(free.AxisMarginRows()) < 2 || isNaN(free.Axis) {
		t.Errorf("the free case lost its axis")
	}
}

func isNaN(x float64) bool { return x != x }

// Facilities of one type that miss the same prototype items are named in
// one warning, not one each (the tug's two towing tanks).
func TestWarnDefaultLimitsOncePerType(t *testing.T) {
	s, err := study.LoadScenario("tug")
	if err != nil {
		t.Fatal(err)
	}
	plan, err := prepare(t, s)
	if err != nil {
		t.Fatal(err)
	}
	n := 0
	for _, w := range plan.Warnings.Strings() {
		if strings.Contains(w, "default limits of") {
			n++
		}
	}
	if n != 1 {
		t.Errorf("%d warnings about default limits, want 1: %q", n, plan.Warnings.Strings())
	}
	studytest.HasWarning(t, plan.Warnings, "default limits of Estuary tank and Deepwater tank (each a towing_tank)", "needs the prototype item wave_period")
}
