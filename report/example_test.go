package report_test

import (
	"context"
	"fmt"
	"os"

	"scaleplan/materials"
	"scaleplan/report"
	"scaleplan/sweep"
	"scaleplan/sweep/study"
)

// report renders what sweep computed: here the terminal table that
// scaleplan run prints for a study (report.WriteStudy writes the
// workbook, the memo and the maps of the same result into a folder).
func ExampleWriteRunText() {
	s, err := study.LoadScenario("mast")
	if err != nil {
		fmt.Println(err)
		return
	}
	lib, err := materials.Default()
	if err != nil {
		fmt.Println(err)
		return
	}
	cat, err := sweep.NewFacilityCatalog()
	if err != nil {
		fmt.Println(err)
		return
	}
	plan, err := sweep.Prepare(s, lib, cat)
	if err != nil {
		fmt.Println(err)
		return
	}
	res, err := plan.Run(context.Background())
	if err != nil {
		fmt.Println(err)
		return
	}
	if err := report.WriteRunText(os.Stdout, res); err != nil {
		fmt.Println(err)
	}
	// Output:
	// Study telecom-mast (k = prototype value / model value; scale 1:25 means kL = 25)
	// rank  strategy         technique   window         large-model edge                                             small-model edge                                             recommended  model length  cost       best candidate
	// 1     added mass       simulated   1:2.5–1:60     laboratory height                                            scale range                                                  1:2.5        12 m          81000 EUR  steel model in Seismic table
	// 2     softer material  substitute  1:12.2–1:14.9  density of polycarbonate model no more than 10 % above need  density of polycarbonate model no more than 10 % below need  1:12.2       2.47 m        42869 EUR  polycarbonate model in Seismic table
	// Recommended: added mass at 1:2.5 (relaxes no law)
	//   added mass: cheapest feasible option over all combinations: 1:60 with steel model in Seismic table, 35000 EUR
	//   added mass: a larger model (1:2.49) is stopped by "laboratory height", which no facility capability relieves
	//   softer material: cheapest feasible option over all combinations: 1:14.9 with polycarbonate model in Seismic table, 41074 EUR
	//   softer material: a larger model (1:12.1) is stopped by "density of polycarbonate model no more than 10 % above need", which no facility capability relieves
	// A planning aid: scale effects remain; the test plan rests with qualified engineers, facility rules and codes.
}

// A window prints as its intervals of 1:kL; Edges names the limits that
// stop the largest and the smallest model.
func ExampleWindowText() {
	w := sweep.Window{
		{Lo: 8, Hi: 12.5, LoLimit: "blockage", HiLimit: "model Reynolds number"},
		{Lo: 20, Hi: 40, LoLimit: "carriage speed", HiLimit: "scale range"},
	}
	large, small := report.Edges(w)
	fmt.Println(report.WindowText(w))
	fmt.Println("largest model stopped by", large+"; smallest by", small)
	fmt.Println(report.WindowText(nil))
	// Output:
	// 1:8–1:12.5, 1:20–1:40
	// largest model stopped by blockage; smallest by scale range
	// none
}

// Every margin (decades of room to the tightest limit; ≥ 0 is feasible)
// has one colour class, the same in the workbook's map sheets and in the
// PNG, SVG and PDF maps.
func ExampleMarginClass() {
	for _, m := range []float64{-2.5, -0.05, 0, 0.25, 3} {
		fmt.Println(m, report.MarginClass(m))
	}
	// Output:
	// -2.5 0
	// -0.05 4
	// 0 5
	// 0.25 6
	// 3 9
}
