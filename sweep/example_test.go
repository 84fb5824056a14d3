package sweep_test

import (
	"context"
	"fmt"

	"scaleplan/materials"
	"scaleplan/sweep"
	"scaleplan/sweep/study"
)

// A study goes from its sheets to windows in three steps: load it (here a
// built-in scenario; sweep.Load reads an .xlsx workbook or a folder of
// .csv sheets), prepare a plan against a materials library and the
// facility catalogue (every problem of the study is reported here, with
// its cell), and run the plan. Each strategy's Best combination carries
// its feasible window of length scales, with the limit at each edge.
func Example() {
	s, err := study.LoadScenario("tug")
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
	for _, sr := range res.Strategies {
		if sr.Best == nil {
			fmt.Printf("%s: no feasible scale\n", sr.Name)
			continue
		}
		for _, iv := range sr.Best.Window {
			fmt.Printf("%s: %s to %s, large model stopped by %s, small by %s\n",
				sr.Name, sweep.Scale(iv.Lo), sweep.Scale(iv.Hi), iv.LoLimit, iv.HiLimit)
		}
		fmt.Printf("  recommended %s in %s\n", sweep.Scale(sr.Best.Recommended), sr.Best.Facility)
	}
	// Output:
	// complete similarity: no feasible scale
	// Froude scaling: 1:11.4 to 1:18.9, large model stopped by blockage, small by model Reynolds number
	//   recommended 1:11.4 in Deepwater tank
	// substitute fluid: no feasible scale
}

// A window is a list of disjoint intervals of kL = prototype / model; the
// largest model is at the smallest kL.
func ExampleWindow() {
	w := sweep.Window{
		{Lo: 8, Hi: 12, LoLimit: "blockage", HiLimit: "model Reynolds number"},
		{Lo: 20, Hi: 40, LoLimit: "carriage speed", HiLimit: "scale range"},
	}
	fmt.Println(sweep.Scale(w.Largest()), w.Contains(10), w.Contains(15))
	// Output:
	// 1:8 true false
}
