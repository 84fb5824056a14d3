/*
Scaleplan plans physical model tests: it sweeps the length scale of a model
against candidate materials, media and facilities, solves the similitude
scale laws of each relaxation strategy exactly, checks every dimensionless
group and facility limit, and reports the feasible scale window, what limits
it, the scale effects left, the prediction rules and the cost.

Scale factors follow one convention: k = prototype value / model value, so
a model at scale 1:25 has kL = 25 and a smaller model has a larger kL.

The results are a planning aid. Scale effects remain in every model test;
the final test plan and any design decision rest with qualified engineers,
the facility's operating rules and the applicable codes and classification
rules.

Usage:

	scaleplan COMMAND [options]

Commands:

	run        sweep studies; write workbooks, feasibility maps and memos
	init       write a built-in scenario as a study to edit
	check      report every problem of a study with its sheet and cell
	rules      solve the scale laws of one strategy
	groups     Buckingham pi groups of a list of variables
	materials  the library of model materials and media
	version    print the version

Every command takes --help. Commands whose output is data take --json.

Exit status: 0 on success (also when a request turns out infeasible: that
is a result), 1 on bad input (an unknown name, a malformed value, an
inconsistent request) and when a run is interrupted (Ctrl-C: the studies
already written stay, nothing half-written is left), 2 on bad usage (an
unknown command or flag, a missing required flag or flag value).

# run

	scaleplan run [STUDY ...] [--out DIR] [--format png|svg|pdf] [--json] [--max-points N] [--no-files]

Each STUDY is an .xlsx workbook or a folder of .csv sheets (the layout is in
the README); with none, the built-in scenarios run. Studies run in
parallel. For each, the output folder (default scaleplan-out) receives
NAME.xlsx, NAME.memo.md and the feasibility maps; a short table per study
is printed, or with --json the same as data (keys study, convention,
strategies: name, technique, feasible, reason, best: window with the limit
at each edge, recommended_kL, recommended_scale, model_length_m, cost).
Outputs are written to a hidden staging folder and moved into place when
complete, so an interrupt leaves nothing half-written; an output folder
that would hold an input is refused. A sweep larger than max_points
(1e8 by default) is refused; --max-points raises the bound.

With --no-files the studies are swept and the table (or the JSON, without
its outputs key) is printed, but nothing is written and no output folder is
made: for scripts that read the summary, and for timing the sweep alone.

# init and check

	scaleplan init FILE [--scenario NAME]
	scaleplan init FILE --synthetic POINTSxAXISxCANDIDATESxSTRATEGIES
	scaleplan check STUDY

init writes a filled study (a workbook when FILE ends in .xlsx, otherwise a
folder of .csv sheets) and never writes over a file. check loads a study
and reports every problem at once, each with its sheet and cell, and exits
1 if there is any. The scenarios:

	$ scaleplan init --list

# materials

	scaleplan materials [NAME] [--at CONDITIONS] [--json]

Without NAME, the library grouped by kind with the conditions each entry
takes; with NAME, its properties in SI at the conditions (20C, 15C,35g/kg,
3bar, 50% for a water–glycerol mass fraction), each with its source.

	$ scaleplan materials water --at 20C

# rules

	scaleplan rules --retain LAWS [--relax LAWS] [--given Q=K,...] [--untie Q,...] [--length K] [--json]

Prints the scale law of every quantity as exact exponents over the length
scale kL, the given scale factors and any free choice; the compatibility
conditions the given factors must meet, each named by the group it
protects; the free choices a study must fix or sweep; the properties the
model must be given (required); and for each relaxed law the mismatch
π_prototype/π_model of its group. With --length the factors are evaluated.
The JSON keys are retain, relax, untie, given, consistent, conditions,
explanations, only_length, free, exponents (quantity → parameter →
rational), laws, factors, required, unset and relaxed ({law, group,
scale_law, ratio, missing}).

A Froude-scaled model in the same water at 1:25:

	$ scaleplan rules --retain inertia,gravity --relax viscosity --given density=1,gravity=1,viscosity=1 --length 25

The same, asking for Reynolds similarity too:

	$ scaleplan rules --retain inertia,gravity,viscosity --given density=1,gravity=1 --length 25

A layer of ice of unchanged strength, with its thickness scaled apart:

	$ scaleplan rules --retain inertia,gravity,flexure --given density=1,gravity=1,strength=1 --untie thickness --length 50

# groups

	scaleplan groups NAME=UNIT ... [--repeat NAMES] [--json]

Gives the rank of the dimensional matrix of the variables, the number of
independent dimensionless groups (variables − rank), and a basis of groups
with exact exponents, each recognised by name where it is a classic group
(Reynolds, Froude, Weber, Euler, Cauchy, Mach, Strouhal, …) up to
inversion and powers. The first variable is taken as the dependent one;
the repeating variables are chosen among the others (a length, then a
speed, then a density) unless --repeat names them. Units follow the unit
syntax of studies (kg/m^3, Pa*s, m2/s, kn, psi, …); write 1 for a
dimensionless variable. The JSON keys are rank, dimensions, repeating,
count and groups ({exponents, name, text}).

Drag on a sphere:

	$ scaleplan groups F=N rho=kg/m^3 V=m/s D=m mu=Pa*s

Pressure drop in a rough pipe, with the repeating variables chosen:

	$ scaleplan groups dp=Pa rho=kg/m^3 V=m/s D=m mu=Pa*s L=m eps=m --repeat rho,V,D

# version

	$ scaleplan version
*/
package main
