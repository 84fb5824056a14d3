// Package report turns results into what a person reads: the terminal
// tables and JSON of the commands, the study workbook, the feasibility maps
// and the proposal memo. It formats; it computes nothing that the sweep or
// the similitude core has not already decided.
package report
