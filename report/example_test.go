package report_test

import (
	"context"
	"fmt"
	"os"

	"scaleplan/materials"
	"scaleplan/report"
	"scaleplan/sweep"
)

// report renders what sweep computed: here the terminal table that
// scaleplan run prints for a study (report.WriteStudy writes the
// workbook, the memo and the maps of the same result into a folder).
func ExampleWriteRunText() {
	study, err := sweep.LoadScenario("mast")
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
	plan, err := sweep.Prepare(study, lib, cat)
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
	// strategy         technique   window      large-model edge   small-model edge  recommended  model length  cost       best candidate
	// added mass       simulated   1:2.5–1:60  laboratory height  scale range       1:2.5        12 m          81000 EUR  steel model in Seismic table
	// softer material  substitute  1:2.5–1:60  laboratory height  scale range       1:2.5        12 m          81000 EUR  polycarbonate model in Seismic table
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
