// Package report turns results into what a person reads: the terminal
// tables and JSON of the commands, the study workbook, the feasibility maps
// and the proposal memo. It formats; it computes nothing that the sweep or
// the similitude core has not already decided (the scale factors of a case
// at the recommended scale, for one, come from
// sweep.StrategyResult.CaseFactors).
package report
