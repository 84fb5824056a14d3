// Package feasibility is the similitude core of scaleplan: physical
// quantities and their dimensions over mass, length, time and temperature,
// the laws (characteristic forces) a model test may retain or relax, units
// for inputs, Buckingham pi groups, and the exact solver that turns a
// relaxation strategy into scale laws.
//
// Scale factors follow one convention throughout: k = prototype value /
// model value, so a model built at scale 1:25 has kL = 25. Scale laws are
// linear in log k; the solver works on them with exact rational arithmetic
// and reports every exponent as a fraction (3/2, never 1.4999). A solved
// strategy is evaluated at any length scale by a matrix–vector product on
// logarithms, so a sweep never re-solves anything per point.
package feasibility
