package sweep

import (
	"context"
	"encoding/json"
	"math"
	"os"
	"testing"

	"scaleplan/feasibility"
	"scaleplan/sweep/study"
)

// TestWriteReferenceTerms writes what testdata/perf/reference.py needs to
// recompute a study's margins and windows with numpy: for every
// combination, its limits (as typed) and, at every second-axis value, the
// log-linear form ln v = C + E·ln kL of every name the limits use, with
// the similarity conditions evaluated; and scaleplan's own window of every
// combination, for the comparison. It runs only when the comparison
// script asks (SCALEPLAN_REFERENCE_STUDY and SCALEPLAN_REFERENCE_OUT).
func TestWriteReferenceTerms(t *testing.T) {
	studyPath, outPath := os.Getenv("SCALEPLAN_REFERENCE_STUDY"), os.Getenv("SCALEPLAN_REFERENCE_OUT")
	if studyPath == "" || outPath == "" {
		t.Skip("set SCALEPLAN_REFERENCE_STUDY and SCALEPLAN_REFERENCE_OUT (testdata/perf/compare.sh does)")
	}
	s, err := study.Load(studyPath)
	if err != nil {
		t.Fatal(err)
	}
	p, err := prepare(t, s)
	if err != nil {
		t.Fatal(err)
	}
	res, err := p.Run(context.Background())
	if err != nil {
		t.Fatal(err)
	}
	type limitJSON struct {
		Name, Text string
		Linear     bool
	}
	type condJSON struct {
		Pins   bool    `json:"pins,omitempty"`
		Length float64 `json:"length,omitempty"`
		Fails  bool    `json:"fails,omitempty"`
	}
	type axisJSON struct {
		Value      float64               `json:"value"`
		Forms      map[string][2]float64 `json:"forms"` // name → C, E
		Conditions []condJSON            `json:"conditions"`
	}
	type windowJSON struct {
		Lo, Hi           float64
		LoLimit, HiLimit string
	}
	type comboJSON struct {
		Strategy, Case, Medium, Material, Facility string
		Limits                                     []limitJSON
		Axis                                       []axisJSON
		Error                                      string `json:",omitempty"`
		// ScaleplanAxis and ScaleplanWindow are scaleplan's choice.
		ScaleplanAxis   float64
		ScaleplanWindow []windowJSON
	}
	out := struct {
		Grid   []float64
		Combos []comboJSON
	}{Grid: p.Grid}
	for si, st := range p.Strategies {
		k := 0
		for _, c := range st.Cases {
			for _, m := range candidatesOrNil(c.Media) {
				for _, mat := range candidatesOrNil(c.Materials) {
					for _, f := range facilitiesOrNil(c.Facilities) {
						r := res.Strategies[si].Combos[k]
						k++
						cj := comboJSON{Strategy: r.Strategy, Case: r.Case, Medium: r.Medium, Material: r.Material, Facility: r.Facility,
							ScaleplanAxis: r.Axis, ScaleplanWindow: []windowJSON{}}
						if math.IsNaN(cj.ScaleplanAxis) {
							cj.ScaleplanAxis = 0
						}
						for _, iv := range r.Window {
							cj.ScaleplanWindow = append(cj.ScaleplanWindow, windowJSON(iv))
						}
						axes := []float64{math.NaN()}
						if p.AxisValues != nil && p.axisApplies(c, f) {
							axes = p.AxisValues
						}
						for ai, a := range axes {
							x, err := p.newCombo(c, m, mat, f, a)
							if err == nil {
								var limits []compiled
								limits, _, err = x.limitsFor()
								if err == nil {
									aj := axisJSON{Value: a, Forms: map[string][2]float64{}}
									if math.IsNaN(a) {
										aj.Value = 0
									}
									for _, l := range limits {
										if ai == 0 {
											cj.Limits = append(cj.Limits, limitJSON{l.info.Name, l.lim.Text, l.info.Linear})
										}
										for n, fm := range l.forms {
											aj.Forms[n] = [2]float64{fm.C, fm.E}
										}
									}
									var checks []feasibility.ConditionCheck
									checks, err = x.cas.Solution.Check(x.values)
									for _, cc := range checks {
										aj.Conditions = append(aj.Conditions, condJSON{Pins: cc.PinsLength, Length: cc.Length, Fails: cc.Known && !cc.Holds && !cc.PinsLength})
									}
									cj.Axis = append(cj.Axis, aj)
								}
							}
							if err != nil {
								cj.Error = err.Error()
								break
							}
						}
						out.Combos = append(out.Combos, cj)
					}
				}
			}
		}
	}
	b, err := json.Marshal(out)
	if err != nil {
		t.Fatal(err)
	}
	if err := os.WriteFile(outPath, b, 0o644); err != nil {
		t.Fatal(err)
	}
}
