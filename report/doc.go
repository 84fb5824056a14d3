// Package report turns results into what a person reads: the terminal
// tables and JSON of the commands, the study workbook, the feasibility maps
// and the proposal memo. It formats; it computes nothing that the sweep or
// the similitude core has not already decided (the scale factors of a case
// at the recommended scale, for one, come from
// sweep.StrategyResult.CaseFactors, the recommendation from sweep's rank).
//
//	res, _ := plan.Run(ctx)
//	files, err := report.WriteStudy(ctx, dir, res, "png") // workbook, maps, memos
//	err = report.WriteRunText(os.Stdout, res)             // the table of `run`
//
// Every output goes through WriteFileAtomic (the one atomic writer of
// package study), into a staging folder that WriteStudy renames into place
// with a manifest, so an interrupted run leaves no half-written file. Every
// output says the study's warnings once and the cautions of a planning aid.
//
// # Where things are
//
//	study.go, manifest.go, atomic.go  the outputs of a study on disk
//	run.go, runjson.go, verdicts.go   the text and JSON of `run`, verdict lines
//	workbook.go, workbook_inputs.go,  the study workbook (Summary, Windows, maps,
//	xlsxlayout.go                     requirements, Limits, Inputs echo)
//	plot*.go, palette.go, thin.go,    the maps (band, contour, cost, requirement),
//	placement.go, fonts.go            one margin palette for maps and workbook
//	memo.go, memo_figures.go,         the proposal memo (Markdown, HTML)
//	memo_html.go, tradeoff.go
//	labels.go, numfmt.go, matches.go  names and numbers as people read them
//	rules.go, groups.go               the reports of the rules and groups commands
//	cautions.go, version.go           cautions, build version
package report
