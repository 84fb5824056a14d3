// Package sweep runs studies: it reads a study (an .xlsx workbook or a
// folder of .csv sheets), checks it, solves each strategy once with the
// similitude core, sweeps the length scale (and optionally one more input)
// over every candidate medium and material and every facility, evaluates
// every limit's margin, and finds the feasible windows, what limits them,
// the recommended scale and the cost. A candidate that must supply a
// property the strategy requires, or a free body's density, is checked
// against the requirement with limits of their own (substitute.go).
package sweep
