// Package sweep plans and runs studies. A study (read by package
// scaleplan/sweep/study) is checked by [Prepare], which solves each
// strategy once with the similitude core and returns a [Plan] or every
// problem at its cell. [Plan.Run] sweeps the length scale (and optionally
// one more input) over every candidate medium and material and every
// facility, evaluates every limit's margin, and finds the feasible
// windows, what limits them, the capabilities each scale needs, the
// robust windows under uncertain inputs, the recommended scale and the
// cost; [Plan.Rank] orders the strategies by one recommendation rule that
// every output uses. A candidate that must supply a property the strategy
// requires, or a free body's density, is checked against the requirement
// with limits of its own (substitute.go).
//
//	s, _ := study.Load("tug.xlsx")
//	plan, err := sweep.Prepare(s, lib, cat) // err lists problems by cell
//	res, err := plan.Run(ctx)               // res.Strategies[i].Best, …
//
// # Where things are
//
//	plan.go          the Plan and Prepare; settings.go, items.go,
//	                 properties.go, strategies.go, facility.go, limits.go,
//	                 costs.go, measures.go, grid.go check each sheet
//	run.go           running the plan: combinations across the cores
//	sweepcombo.go    one combination's sweep, window and results (fill)
//	analytic.go      the second axis and the margins kept
//	evaluate.go      names resolved to log-linear forms (linForm)
//	limits.go        limits compiled for a combination and sampled
//	window.go        windows (intervals of kL) and their edges
//	limiting.go      which limit stops each edge (LimitingSimilarity, …)
//	requirements.go  the capability each scale needs
//	robust.go        robust windows: draws of the uncertain inputs
//	inputkey.go      typed keys of the inputs a draw multiplies
//	substitute.go    substitutes and free bodies judged against candidates
//	corrections.go   the ITTC-1957 skin-friction correction
//	rank.go          the recommendation rule and the ranking
//	results.go       Result, StrategyResult, ComboResult
//	facility.go      the facility catalogue (types, capabilities, default
//	                 limits from data/*.csv) and the Facilities sheet's checks
//	lists.go         the names a template's drop-downs offer
//	batch.go         several studies in one run; domain.go bounds and memory
//	warnings.go      warnings of the plan; assumptions.go what is assumed
//
// # How a sweep is evaluated
//
// Every name a measure uses (a prototype item at model scale, a facility
// capability, a model property, a constant) resolves, for one combination,
// to a log-linear form ln v = C + E·ln kL (linForm), because every scale
// factor is a product of powers of the parameters. A limit that is a
// product of powers therefore has a margin A + B·log10 kL: its window edge
// is −A/B, exact, and the margin over the grid is one multiply-add per
// point. Other limits (sums) are evaluated on the grid once per
// combination, reused across the second axis when their forms do not
// change, and their edges are refined by bisection to 0.1 % in kL.
// Combinations run across the cores and are put back in a fixed order, so
// results are deterministic. The same linearity makes requirements (solve
// the margin for a capability) and robust windows (each uncertain input
// shifts A by a constant per decade) cheap.
//
// # The analytic path and what is kept (analytic.go)
//
// A combination's limits are compiled once (which apply, their names, the
// constant and exponents of each log-linear margin; limitPlan). At each
// second-axis value only the names' forms are resolved again; a limit
// whose forms did not change keeps its A, B. A medium condition as axis
// re-reads the candidate's properties and the tuned ranges built from
// them, so it compiles per axis value.
//
// Every axis value's window comes from A, B and the cached feasible sets
// of the other limits, without touching the grid (axisSweep.choose); the
// grid margins are computed once, at the chosen axis value (they feed the
// map sheets). The margins and measures at the other axis values are not
// kept: ComboResult.EachAxisMarginRow and EachAxisMeasureRow sweep them
// again on demand, a row at a time, for the one combination a contour map
// draws, which thins each row as it comes. The margin peak a contour map
// picks by is found with the windows (peak.go). Peak memory therefore does
// not grow with the number of axis values.
//
// Requirements: a products-of-powers limit gives required = have ·
// 10^(−(A + B·log10 kL)/e), kept as that form (Requirement.At); a limit whose capability stands alone in a
// side that is a product of powers ("a·b + 3·c <= tank_length") gives
// required = have · 10^(−margin/e) from its grid margins, exactly;
// bisection is left for the rest. requirementForms finds all this from
// the limits alone.
//
// Maps are drawn at display resolution (report/thin.go): at most
// DisplayColumns samples per axis, each the smallest margin of the points
// it stands for, so thinning never shows an infeasible point as feasible;
// a feasible stretch narrower than one sample still shows by the window's
// edge ticks, drawn at their exact scales.
//
// testdata/golden/scenarios.json holds every scenario's windows (edges at
// full precision), requirements, robust windows and digests of the grid
// margins; TestScenarioGolden keeps them unchanged. testdata/perf/compare.sh
// (at the top of the module) compares the sweep and the end-to-end run
// with a vectorised numpy reference and checks that the windows agree.
package sweep
