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
	check      report every problem and warning of studies with sheet and cell
	rules      solve the scale laws of one strategy
	groups     Buckingham pi groups of a list of variables
	materials  the library of model materials and media
	version    print the version recorded in the build (also: scaleplan --version)
	completion print a bash completion script: source <(scaleplan completion)

Every command takes --help. Commands whose output is data take --json.
In a terminal, run shows its progress on stderr (silent when stderr is a
file or a pipe).

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
NAME.xlsx, NAME.memo.md and the feasibility maps (with two strategies or
more, also NAME.tradeoffs.png: each strategy's scale against its worst
relaxed mismatch); a short table per study is printed, with the strategies
ranked, the recommendation and why, what each recommendation assumes and
the study's warnings. Outputs are written to a hidden staging folder and
moved into place when complete, so an interrupt leaves nothing
half-written; an output folder that would hold an input is refused. A
sweep larger than max_points (1e8 by default) is refused; --max-points
raises the bound.

The recommendation weighs scale effects: a feasible strategy whose relaxed
laws stay within a mismatch factor of mismatch_threshold (10 unless the
Study sheet says otherwise) ranks before one beyond it, whatever the model
sizes; a law listed in weak_laws never counts, one in governing_laws
always does; within a class the larger model ranks first (the cheaper with
recommend = cheapest), and infeasible strategies come last.

With --json the same is printed as data, a list with one object per study:

	study, convention   the study's name and the scale convention
	axis                {name, unit} of the second axis, or null
	warnings            the study's warnings (text with the place)
	strategies          one object per strategy:
	  name, technique, feasible, rank
	  reason            why it ranks there (or what closes its window)
	  warnings          the strategy's own warnings
	  relaxed           [{law, group, ratio (π_p/π_m, null if unknown), weak}]
	  fixed             [{quantity, factor}]: the free choices it fixes
	  best              null, or its recommended combination:
	    case, medium, material, facility
	    axis_value      the second-axis value assumed (SI), or null
	    window          [{from_kL, to_kL, large_model_edge, small_model_edge}]
	    recommended_kL, recommended_scale, model_length_m, cost
	    cheapest_kL, cheapest_cost   within this combination's window
	    cheapest_option {medium, material, facility, kL, scale, cost}:
	                    the cheapest over every combination, or null
	    robust_window   as window, or null without uncertain inputs
	    required        [{quantity, unit, at_recommended,
	                      matches: [{entry, conditions, value}]}]
	    larger_model    {kL, scale, limit, needs: [{capability, unit,
	                     at_least, value, have, limit}]}: what the next
	                    larger scale would need, or null
	ranking             [{strategy, rank, reason}], best first
	outputs             the files written

A study that cannot run appears as {study, error}. Numbers that do not
exist are null. An invented drag anchor in clay, where a centrifuge that
relaxes nothing outranks a larger 1 g model whose Froude number is eleven
times too large:

	$ scaleplan run testdata/drag-anchor --json --out scaleplan-out

With --no-files the studies are swept and the table (or the JSON, without
its outputs key) is printed, but nothing is written and no output folder is
made: for scripts that read the summary, and for timing the sweep alone.

# init and check

	scaleplan init FILE [--scenario NAME]
	scaleplan init FILE --synthetic POINTSxAXISxCANDIDATESxSTRATEGIES
	scaleplan check STUDY ... [--json]

init writes a filled study (a workbook when FILE ends in .xlsx, otherwise a
folder of .csv sheets) and never writes over a file. check loads each study
and reports every problem at once, each with its sheet and cell, and every
warning: a file or worksheet that is no sheet of a study, a default
facility limit not applied because the study lacks the item it names, a
facility capability no limit uses, a free choice fixed twice with the same
factor. Problems (also a sheet present twice under names that differ only
in case, a fix given twice with different factors, an uncertain input given
twice) make check exit 1; warnings alone exit 0, and check says how many.
With --json, one object per study: study, ok, problems ([{place,
message}]) and warnings. The scenarios:

	$ scaleplan init --list

	$ scaleplan check testdata/drag-anchor testdata/anchor-with-strays

	$ scaleplan check testdata/drag-anchor testdata/anchor-with-strays --json

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

A distorted river model, 1:500 in plan and 1:50 in depth (velocity follows
the vertical scale; Manning's n is required):

	$ scaleplan rules --retain inertia,hydrostatic,bed_friction --untie thickness --given density=1,gravity=1,thickness=50 --length 500 --json

Retaining gravity instead leaves the velocity on the horizontal scale; the
output warns that no retained law uses the untied thickness:

	$ scaleplan rules --retain inertia,gravity --untie thickness --given density=1,gravity=1,thickness=50 --length 500

Consolidation in a centrifuge at N = kL = 50 g with the prototype soil and
pore water (inconsistent: the time factor needs c_v scaled by kL), and with
the consolidation coefficient left to the model (a pore fluid 50 times more
viscous):

	$ scaleplan rules --retain inertia,gravity,consolidation --given density=1,gravity=1/50,consolidation_coefficient=1 --length 50 --json
	$ scaleplan rules --retain inertia,gravity,consolidation --given density=1,gravity=1/50 --length 50 --json

A propeller in a depressurised tank at 1:25 (the margin p − p_v of the
ambient pressure scales as kL):

	$ scaleplan rules --retain inertia,gravity,cavitation --given density=1,gravity=1 --length 25 --json

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

Waves breaking on a slope (a dimensionless tan_a is combined with the wave
steepness into the Iribarren number), and free convection (β·ΔT joins
g·L³/ν² into the Grashof number, and Gr·Pr gives the Rayleigh number):

	$ scaleplan groups tan_a=1 H=m lambda=m
	$ scaleplan groups beta=1/K g=m/s^2 dT=K L=m nu=m^2/s alpha=m^2/s --repeat dT,L,nu

# version

	$ scaleplan version
*/
package main
