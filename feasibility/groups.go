package feasibility

import (
	"errors"
	"fmt"
	"math/big"
	"sort"
	"strings"
	"unicode"
)

// Variable is one physical variable of a pi analysis: a name as the user
// wrote it and its dimension.
type Variable struct {
	Name string
	Dim  Dimension
}

// VarExp is the exponent of one variable in a pi group.
type VarExp struct {
	Name string
	Exp  Rat
}

// PiGroup is one dimensionless product of powers of the variables.
//
// Exponents lists the variables in the order they were given to PiGroups,
// zero exponents left out. Exactly one non-repeating variable appears in
// each group, with exponent 1; the repeating variables carry exact, possibly
// fractional, exponents.
//
// Name is the classic group this one is, or "" when it is none we know.
// A group recognised up to a power is named with the power relative to the
// classic definition:
//
//	power 1            "Reynolds number"          (ρVL/μ)
//	power -1           "inverse Reynolds number"  (μ/(ρVL))
//	any other power    "Froude number^-2"         (gL/V², as Fr = V/√(gL))
//	                   "Cauchy number^1/2"        (V·√(ρ/E))
//
// Powers are printed like every exponent of the package (2, -2, 1/2, -3/2).
// When the dimensions and the variable names leave two classic groups
// possible, both are given, each with its own power, joined by " or "
// ("Euler number or inverse Cauchy number"). A ratio of two variables of the
// same dimension is named after that dimension ("length ratio", "velocity
// ratio") unless the names make it a classic group ("Mach number",
// "relative roughness").
//
// Dim is the dimension of the product; PiGroups guarantees it is
// dimensionless and keeps it so callers can check.
type PiGroup struct {
	Exponents []VarExp
	Name      string
	Dim       Dimension
}

// PiResult is a Buckingham pi analysis: the rank of the dimensional matrix,
// the base dimensions involved (in the order M, L, T, Θ), the repeating
// variables (in input order) and the n − rank independent groups, one per
// non-repeating variable, in input order.
type PiResult struct {
	Rank       int
	Dimensions []string
	Repeating  []string
	Groups     []PiGroup
}

// String prints the group as a product of powers in the order of the
// exponents, e.g. "F · rho^-1 · V^-2 · D^-2"; a fractional exponent prints
// as p/q ("g^-1/2"). An empty group prints as "1".
func (g PiGroup) String() string {
	if len(g.Exponents) == 0 {
		return "1"
	}
	parts := make([]string, len(g.Exponents))
	for i, e := range g.Exponents {
		parts[i] = powerString(e.Name, e.Exp)
	}
	return strings.Join(parts, " · ")
}

func powerString(name string, e Rat) string {
	if e.Cmp(Int(1)) == 0 {
		return name
	}
	return name + "^" + e.String()
}

// PiGroups performs a Buckingham pi analysis of vars.
//
// The rank r of the dimensional matrix (base dimensions × variables) is
// computed exactly, with rational arithmetic. r repeating variables are
// needed; repeat names them (by Variable.Name), or, when repeat is empty,
// they are chosen automatically by the rule a textbook reader expects:
//
//   - the first variable listed is taken to be the dependent one and is
//     considered last of all;
//   - first pass, at most one of each kind in turn: a length (dimension L),
//     a velocity (L T^-1), a mass-bearing variable (a density M L^-3 before
//     any other variable involving M), a frequency (T^-1); of each kind the
//     first in input order that raises the rank of those kept so far;
//   - second pass, while the rank is still short of r: any variable that
//     raises it, kinds in the order length, velocity, density, other
//     mass-bearing, frequency, the rest, input order within a kind, the
//     first variable last, so that it repeats only when nothing else will
//     do (e.g. it alone carries a base dimension).
//
// For flow past a body (F, ρ, V, D, μ) this picks D, V and ρ; for a pump
// (gH, Q, N, D, ρ, μ, P) it picks D, ρ and N. PiResult.Repeating lists the
// repeating variables in input order, however they were chosen.
//
// Each non-repeating variable q then gives one group q · Π rep_i^a_i with the
// unique exact exponents a_i that make it dimensionless. When every variable
// is dimensionless the rank is 0, nothing repeats and each variable is a
// group of its own.
//
// The errors name the variable and say why: no variables, a variable without
// a name, a name given twice, and for a user's choice of repeating
// variables an unknown name (with a suggestion), a name given twice, the
// wrong number, a dimensionless one, a base dimension that none of them
// involves although another variable does, or a dependent set.
func PiGroups(vars []Variable, repeat []string) (PiResult, error) {
	if len(vars) == 0 {
		return PiResult{}, errors.New("no variables: a pi analysis needs at least one variable with its unit")
	}
	names := make([]string, len(vars))
	dims := make([]Dimension, len(vars))
	index := make(map[string]int, len(vars))
	for i, v := range vars {
		name := strings.TrimSpace(v.Name)
		if name == "" {
			return PiResult{}, fmt.Errorf("variable %d has no name", i+1)
		}
		if j, dup := index[name]; dup {
			return PiResult{}, fmt.Errorf("variable %q is listed twice (as variables %d and %d)", name, j+1, i+1)
		}
		index[name] = i
		names[i] = name
		dims[i] = canonDim(v.Dim)
	}

	var res PiResult
	involved := make([]bool, numBase)
	for b := 0; b < numBase; b++ {
		for _, d := range dims {
			if !d[b].IsZero() {
				involved[b] = true
			}
		}
		if involved[b] {
			res.Dimensions = append(res.Dimensions, baseSymbols[b])
		}
	}

	// Rank: greedy basis over the input order.
	var basis []Dimension
	for _, d := range dims {
		if _, in := solveDims(basis, d); !in {
			basis = append(basis, d)
		}
	}
	res.Rank = len(basis)

	var rep []int
	var err error
	if len(repeat) == 0 {
		rep = autoRepeating(dims, res.Rank)
	} else {
		rep, err = checkRepeating(names, dims, index, involved, res.Rank, repeat)
		if err != nil {
			return PiResult{}, err
		}
	}
	sort.Ints(rep)
	isRep := make([]bool, len(vars))
	repDims := make([]Dimension, len(rep))
	for k, i := range rep {
		isRep[i] = true
		repDims[k] = dims[i]
		res.Repeating = append(res.Repeating, names[i])
	}

	for q := range vars {
		if isRep[q] {
			continue
		}
		coef, ok := solveDims(repDims, dims[q].Pow(Int(-1)))
		if !ok {
			// Cannot happen: the repeating variables span the columns.
			return PiResult{}, fmt.Errorf("internal error: %s cannot be made dimensionless with %s", names[q], piList(res.Repeating))
		}
		exps := make([]Rat, len(vars))
		exps[q] = Int(1)
		for k, i := range rep {
			r, fits := fromBig(coef[k])
			if !fits {
				return PiResult{}, fmt.Errorf("the exponent of %s in the group of %s is too large", names[i], names[q])
			}
			exps[i] = r
		}
		g := PiGroup{Dim: canonDim(Dimension{})}
		for i, e := range exps {
			if e.IsZero() {
				continue
			}
			g.Exponents = append(g.Exponents, VarExp{names[i], e})
			g.Dim = g.Dim.Mul(dims[i].Pow(e))
		}
		if !g.Dim.IsDimensionless() {
			return PiResult{}, fmt.Errorf("internal error: group %s has dimension %s", g, g.Dim)
		}
		g.Name = recogniseGroup(g, index, dims)
		res.Groups = append(res.Groups, g)
	}
	return res, nil
}

// canonDim returns d with every exponent in canonical form, so that equal
// dimensions compare equal with == and can be map keys.
func canonDim(d Dimension) Dimension {
	var out Dimension
	for i, e := range d {
		out[i] = norm(e.Num(), e.Den())
	}
	return out
}

// solveDims finds exact c with Σ c_k basis_k = target; in is false when
// target is not in the span of basis. Free coefficients (a dependent basis)
// are set to zero.
func solveDims(basis []Dimension, target Dimension) (c []*big.Rat, in bool) {
	n := len(basis)
	m := make([][]*big.Rat, numBase)
	for i := range m {
		row := make([]*big.Rat, n+1)
		for j, b := range basis {
			row[j] = b[i].big()
		}
		row[n] = target[i].big()
		m[i] = row
	}
	var pivots []int
	r := 0
	for col := 0; col < n && r < numBase; col++ {
		p := -1
		for i := r; i < numBase; i++ {
			if m[i][col].Sign() != 0 {
				p = i
				break
			}
		}
		if p < 0 {
			continue
		}
		m[r], m[p] = m[p], m[r]
		inv := new(big.Rat).Inv(m[r][col])
		for j := col; j <= n; j++ {
			m[r][j].Mul(m[r][j], inv)
		}
		for i := 0; i < numBase; i++ {
			if i == r || m[i][col].Sign() == 0 {
				continue
			}
			f := new(big.Rat).Set(m[i][col])
			for j := col; j <= n; j++ {
				m[i][j].Sub(m[i][j], new(big.Rat).Mul(f, m[r][j]))
			}
		}
		pivots = append(pivots, col)
		r++
	}
	for i := r; i < numBase; i++ {
		if m[i][n].Sign() != 0 {
			return nil, false
		}
	}
	c = make([]*big.Rat, n)
	for j := range c {
		c[j] = new(big.Rat)
	}
	for k, col := range pivots {
		c[col] = m[k][n]
	}
	return c, true
}

// Dimensions the pi analysis knows by kind (pd: pi dimension).
var (
	pdLength      = Dim(0, 1, 0, 0)
	pdVelocity    = Dim(0, 1, -1, 0)
	pdDensity     = Dim(1, -3, 0, 0)
	pdFrequency   = Dim(0, 0, -1, 0)
	pdTime        = Dim(0, 0, 1, 0)
	pdMass        = Dim(1, 0, 0, 0)
	pdViscosity   = Dim(1, -1, -1, 0)
	pdKinematic   = Dim(0, 2, -1, 0)
	pdAccel       = Dim(0, 1, -2, 0)
	pdTension     = Dim(1, 0, -2, 0)
	pdPressure    = Dim(1, -1, -2, 0)
	pdForce       = Dim(1, 1, -2, 0)
	pdPower       = Dim(1, 2, -3, 0)
	pdTorque      = Dim(1, 2, -2, 0)
	pdFlow        = Dim(0, 3, -1, 0)
	pdHead        = Dim(0, 2, -2, 0) // g·H, specific energy
	pdArea        = Dim(0, 2, 0, 0)
	pdVolume      = Dim(0, 3, 0, 0)
	pdTemperature = Dim(0, 0, 0, 1)
	pdConduct     = Dim(1, 1, -3, -1) // thermal conductivity W/(m·K)
	pdHeatCoef    = Dim(1, 0, -3, -1) // heat transfer coefficient W/(m²·K)
	pdSpecHeat    = Dim(0, 2, -2, -1) // specific heat J/(kg·K)
)

// repeatClass orders candidates for automatic repeating variables.
func repeatClass(d Dimension) int {
	switch {
	case d == pdLength:
		return 0
	case d == pdVelocity:
		return 1
	case d == pdDensity:
		return 2
	case !d[Mass].IsZero():
		return 3
	case d == pdFrequency:
		return 4
	default:
		return 5
	}
}

func autoRepeating(dims []Dimension, rank int) []int {
	order := make([]int, len(dims))
	for i := range order {
		order[i] = i
	}
	class := func(i int) int {
		if i == 0 && len(dims) > 1 {
			return 6 // the dependent variable, repeated only if it must be
		}
		return repeatClass(dims[i])
	}
	sort.SliceStable(order, func(a, b int) bool { return class(order[a]) < class(order[b]) })
	var rep []int
	var basis []Dimension
	taken := make([]bool, len(dims))
	try := func(i int) bool {
		if len(rep) == rank || taken[i] {
			return false
		}
		if _, in := solveDims(basis, dims[i]); in {
			return false
		}
		rep = append(rep, i)
		basis = append(basis, dims[i])
		taken[i] = true
		return true
	}
	// First pass: at most one length, one velocity, one density or other
	// mass-bearing variable, one frequency, in that order.
	for _, group := range [][]int{{0}, {1}, {2, 3}, {4}} {
		for _, i := range order {
			c := class(i)
			if (c == group[0] || c == group[len(group)-1]) && try(i) {
				break
			}
		}
	}
	// Second pass: anything else that raises the rank, in the same order.
	for _, i := range order {
		try(i)
	}
	return rep
}

func checkRepeating(names []string, dims []Dimension, index map[string]int, involved []bool, rank int, repeat []string) ([]int, error) {
	var rep []int
	seen := map[int]bool{}
	for _, raw := range repeat {
		name := strings.TrimSpace(raw)
		if name == "" {
			return nil, errors.New("a repeating variable has an empty name")
		}
		i, ok := index[name]
		if !ok {
			return nil, fmt.Errorf("repeating variable %q is not one of the variables%s", name, Suggest(name, names))
		}
		if seen[i] {
			return nil, fmt.Errorf("repeating variable %s is listed twice", name)
		}
		seen[i] = true
		rep = append(rep, i)
	}
	repNames := make([]string, len(rep))
	for k, i := range rep {
		repNames[k] = names[i]
	}
	if len(rep) != rank {
		var need string
		switch rank {
		case 0:
			return nil, fmt.Errorf("no repeating variables are needed: every variable is dimensionless (%s given)", piList(repNames))
		case 1:
			need = "1 repeating variable is needed: the matrix has rank 1"
		default:
			need = fmt.Sprintf("%d repeating variables are needed: the matrix has rank %d", rank, rank)
		}
		return nil, fmt.Errorf("%s (%d given: %s)", need, len(rep), piList(repNames))
	}
	for _, i := range rep {
		if dims[i].IsDimensionless() {
			return nil, fmt.Errorf("%s is dimensionless and cannot be a repeating variable", names[i])
		}
	}
	for b := 0; b < numBase; b++ {
		if !involved[b] {
			continue
		}
		has := false
		for _, i := range rep {
			if !dims[i][b].IsZero() {
				has = true
			}
		}
		if has {
			continue
		}
		for q := range names {
			if !dims[q][b].IsZero() {
				return nil, fmt.Errorf("none of the repeating variables %s involves %s, but %s (%s) does: its group could not be made dimensionless",
					piList(repNames), baseSymbols[b], names[q], dims[q])
			}
		}
	}
	var basis []Dimension
	for _, i := range rep {
		c, in := solveDims(basis, dims[i])
		if !in {
			basis = append(basis, dims[i])
			continue
		}
		var set, setDims, combo []string
		for j, cj := range c {
			if cj.Sign() == 0 {
				continue
			}
			set = append(set, names[rep[j]])
			setDims = append(setDims, dims[rep[j]].String())
			e, _ := fromBig(cj)
			combo = append(combo, powerString(names[rep[j]], e))
		}
		set = append(set, names[i])
		setDims = append(setDims, dims[i].String())
		return nil, fmt.Errorf("%s have dependent dimensions: %s (%s has the dimension of %s)",
			piList(set), piList(setDims), names[i], strings.Join(combo, " · "))
	}
	return rep, nil
}

// piList lists items as "a", "a and b", "a, b and c".
func piList(items []string) string {
	switch len(items) {
	case 0:
		return "none"
	case 1:
		return items[0]
	default:
		return strings.Join(items[:len(items)-1], ", ") + " and " + items[len(items)-1]
	}
}

// Recognition of classic groups.
//
// A group is reduced to its signature: the exponents summed per variable
// dimension (so D and L, both lengths, add up). It is a classic group raised
// to the power k when its signature is k times the classic pattern. Where
// patterns coincide, hints on the names of the variables of one dimension
// decide: a pressure named p, dp, Δp or …pressure… gives Euler, one named E,
// K or …modulus… gives Cauchy, p_v or …vapour… the cavitation number; a
// frequency named f, omega or …freq… gives Strouhal, one named n, N or rpm
// the advance ratio; a force named D, Fd or …drag… the drag coefficient
// (likewise lift, resistance R, thrust T); a speed named c, a or …sound…
// makes a velocity ratio the Mach number; a length named eps, ε, ks or
// …rough… makes a length ratio the relative roughness. A hint prefers a
// group among those the dimensions allow; with no hint, every general
// candidate is named ("Euler number or inverse Cauchy number") and the
// specialised ones (cavitation, drag, Keulegan–Carpenter, Péclet by α, …)
// are left out.

type sigTerm struct {
	dim Dimension
	exp Rat
}

type nameHints struct {
	words    []string // whole names or name tokens, compared in lower case
	contains []string // substrings of the lower-case name
}

type classicGroup struct {
	name  string
	terms []sigTerm
	// hintDim and hint, when hint is set: the group is preferred when a
	// variable of dimension hintDim has a matching name.
	hintDim Dimension
	hint    *nameHints
	// hintOnly: a specialised name, given only when the hint matches.
	hintOnly bool
}

func piTerm(d Dimension, num, den int64) sigTerm { return sigTerm{d, R(num, den)} }

var (
	pressureHints   = &nameHints{words: []string{"p", "dp", "δp", "deltap", "pd", "ps", "p0", "pinf"}, contains: []string{"pressure"}}
	cavitationHints = &nameHints{words: []string{"pv", "pvap", "p_v"}, contains: []string{"vapour", "vapor", "cavitation"}}
	modulusHints    = &nameHints{words: []string{"e", "k", "g", "ev", "kv", "ym"}, contains: []string{"modulus", "young", "elastic", "bulk"}}
	soundHints      = &nameHints{words: []string{"c", "a", "c0", "a0", "cs"}, contains: []string{"sound"}}
	frequencyHints  = &nameHints{words: []string{"f", "fs", "fn", "f0", "ω", "w"}, contains: []string{"freq", "omega", "shedding"}}
	rotationHints   = &nameHints{words: []string{"n", "rpm", "rps", "rot", "revs"}, contains: []string{"rotation", "shaft", "revolution"}}
	periodHints     = &nameHints{words: []string{"tp", "tz", "tw", "tm"}, contains: []string{"period"}}
	dragHints       = &nameHints{words: []string{"d", "fd", "cd"}, contains: []string{"drag"}}
	liftHints       = &nameHints{words: []string{"l", "fl"}, contains: []string{"lift"}}
	resistanceHints = &nameHints{words: []string{"r", "rt", "rf"}, contains: []string{"resistance"}}
	thrustHints     = &nameHints{words: []string{"t", "th"}, contains: []string{"thrust"}}
	diffusionHints  = &nameHints{words: []string{"α", "κ", "alpha", "kappa"}, contains: []string{"diffusiv"}}
	roughnessHints  = &nameHints{words: []string{"ε", "eps", "epsilon", "e", "ks"}, contains: []string{"rough"}}
)

var classicGroups = []classicGroup{
	{name: "Reynolds number", terms: []sigTerm{piTerm(pdDensity, 1, 1), piTerm(pdVelocity, 1, 1), piTerm(pdLength, 1, 1), piTerm(pdViscosity, -1, 1)}},
	{name: "Reynolds number", terms: []sigTerm{piTerm(pdVelocity, 1, 1), piTerm(pdLength, 1, 1), piTerm(pdKinematic, -1, 1)}},
	{name: "Péclet number", terms: []sigTerm{piTerm(pdVelocity, 1, 1), piTerm(pdLength, 1, 1), piTerm(pdKinematic, -1, 1)}, hintDim: pdKinematic, hint: diffusionHints, hintOnly: true},
	{name: "Reynolds number", terms: []sigTerm{piTerm(pdDensity, 1, 1), piTerm(pdFrequency, 1, 1), piTerm(pdLength, 2, 1), piTerm(pdViscosity, -1, 1)}},
	{name: "Reynolds number", terms: []sigTerm{piTerm(pdFrequency, 1, 1), piTerm(pdLength, 2, 1), piTerm(pdKinematic, -1, 1)}},
	{name: "Reynolds number", terms: []sigTerm{piTerm(pdDensity, 1, 1), piTerm(pdFlow, 1, 1), piTerm(pdLength, -1, 1), piTerm(pdViscosity, -1, 1)}},
	{name: "Reynolds number", terms: []sigTerm{piTerm(pdFlow, 1, 1), piTerm(pdLength, -1, 1), piTerm(pdKinematic, -1, 1)}},
	{name: "Froude number", terms: []sigTerm{piTerm(pdVelocity, 1, 1), piTerm(pdAccel, -1, 2), piTerm(pdLength, -1, 2)}},
	{name: "rotational Froude number", terms: []sigTerm{piTerm(pdFrequency, 2, 1), piTerm(pdLength, 1, 1), piTerm(pdAccel, -1, 1)}},
	{name: "Weber number", terms: []sigTerm{piTerm(pdDensity, 1, 1), piTerm(pdVelocity, 2, 1), piTerm(pdLength, 1, 1), piTerm(pdTension, -1, 1)}},
	{name: "Weber number", terms: []sigTerm{piTerm(pdDensity, 1, 1), piTerm(pdFrequency, 2, 1), piTerm(pdLength, 3, 1), piTerm(pdTension, -1, 1)}},
	{name: "Euler number", terms: []sigTerm{piTerm(pdPressure, 1, 1), piTerm(pdDensity, -1, 1), piTerm(pdVelocity, -2, 1)}, hintDim: pdPressure, hint: pressureHints},
	{name: "cavitation number", terms: []sigTerm{piTerm(pdPressure, 1, 1), piTerm(pdDensity, -1, 1), piTerm(pdVelocity, -2, 1)}, hintDim: pdPressure, hint: cavitationHints, hintOnly: true},
	{name: "Cauchy number", terms: []sigTerm{piTerm(pdDensity, 1, 1), piTerm(pdVelocity, 2, 1), piTerm(pdPressure, -1, 1)}, hintDim: pdPressure, hint: modulusHints},
	{name: "Strouhal number", terms: []sigTerm{piTerm(pdFrequency, 1, 1), piTerm(pdLength, 1, 1), piTerm(pdVelocity, -1, 1)}, hintDim: pdFrequency, hint: frequencyHints},
	{name: "advance ratio", terms: []sigTerm{piTerm(pdVelocity, 1, 1), piTerm(pdFrequency, -1, 1), piTerm(pdLength, -1, 1)}, hintDim: pdFrequency, hint: rotationHints},
	{name: "Strouhal number", terms: []sigTerm{piTerm(pdLength, 1, 1), piTerm(pdVelocity, -1, 1), piTerm(pdTime, -1, 1)}},
	{name: "Keulegan–Carpenter number", terms: []sigTerm{piTerm(pdVelocity, 1, 1), piTerm(pdTime, 1, 1), piTerm(pdLength, -1, 1)}, hintDim: pdTime, hint: periodHints, hintOnly: true},
	{name: "force coefficient", terms: []sigTerm{piTerm(pdForce, 1, 1), piTerm(pdDensity, -1, 1), piTerm(pdVelocity, -2, 1), piTerm(pdLength, -2, 1)}},
	{name: "drag coefficient", terms: []sigTerm{piTerm(pdForce, 1, 1), piTerm(pdDensity, -1, 1), piTerm(pdVelocity, -2, 1), piTerm(pdLength, -2, 1)}, hintDim: pdForce, hint: dragHints, hintOnly: true},
	{name: "lift coefficient", terms: []sigTerm{piTerm(pdForce, 1, 1), piTerm(pdDensity, -1, 1), piTerm(pdVelocity, -2, 1), piTerm(pdLength, -2, 1)}, hintDim: pdForce, hint: liftHints, hintOnly: true},
	{name: "resistance coefficient", terms: []sigTerm{piTerm(pdForce, 1, 1), piTerm(pdDensity, -1, 1), piTerm(pdVelocity, -2, 1), piTerm(pdLength, -2, 1)}, hintDim: pdForce, hint: resistanceHints, hintOnly: true},
	{name: "thrust coefficient", terms: []sigTerm{piTerm(pdForce, 1, 1), piTerm(pdDensity, -1, 1), piTerm(pdVelocity, -2, 1), piTerm(pdLength, -2, 1)}, hintDim: pdForce, hint: thrustHints, hintOnly: true},
	{name: "thrust coefficient", terms: []sigTerm{piTerm(pdForce, 1, 1), piTerm(pdDensity, -1, 1), piTerm(pdFrequency, -2, 1), piTerm(pdLength, -4, 1)}},
	{name: "torque coefficient", terms: []sigTerm{piTerm(pdTorque, 1, 1), piTerm(pdDensity, -1, 1), piTerm(pdFrequency, -2, 1), piTerm(pdLength, -5, 1)}},
	{name: "power number", terms: []sigTerm{piTerm(pdPower, 1, 1), piTerm(pdDensity, -1, 1), piTerm(pdFrequency, -3, 1), piTerm(pdLength, -5, 1)}},
	{name: "power coefficient", terms: []sigTerm{piTerm(pdPower, 1, 1), piTerm(pdDensity, -1, 1), piTerm(pdVelocity, -3, 1), piTerm(pdLength, -2, 1)}},
	{name: "flow coefficient", terms: []sigTerm{piTerm(pdFlow, 1, 1), piTerm(pdFrequency, -1, 1), piTerm(pdLength, -3, 1)}},
	{name: "head coefficient", terms: []sigTerm{piTerm(pdHead, 1, 1), piTerm(pdFrequency, -2, 1), piTerm(pdLength, -2, 1)}},
	{name: "head coefficient", terms: []sigTerm{piTerm(pdPressure, 1, 1), piTerm(pdDensity, -1, 1), piTerm(pdFrequency, -2, 1), piTerm(pdLength, -2, 1)}},
	{name: "discharge coefficient", terms: []sigTerm{piTerm(pdFlow, 1, 1), piTerm(pdAccel, -1, 2), piTerm(pdLength, -5, 2)}},
	{name: "capillary number", terms: []sigTerm{piTerm(pdViscosity, 1, 1), piTerm(pdVelocity, 1, 1), piTerm(pdTension, -1, 1)}},
	{name: "Bond number", terms: []sigTerm{piTerm(pdDensity, 1, 1), piTerm(pdAccel, 1, 1), piTerm(pdLength, 2, 1), piTerm(pdTension, -1, 1)}},
	{name: "Ohnesorge number", terms: []sigTerm{piTerm(pdViscosity, 1, 1), piTerm(pdDensity, -1, 2), piTerm(pdTension, -1, 2), piTerm(pdLength, -1, 2)}},
	{name: "Galileo number", terms: []sigTerm{piTerm(pdAccel, 1, 1), piTerm(pdLength, 3, 1), piTerm(pdKinematic, -2, 1)}},
	{name: "Galileo number", terms: []sigTerm{piTerm(pdAccel, 1, 1), piTerm(pdLength, 3, 1), piTerm(pdDensity, 2, 1), piTerm(pdViscosity, -2, 1)}},
	{name: "Prandtl number", terms: []sigTerm{piTerm(pdViscosity, 1, 1), piTerm(pdSpecHeat, 1, 1), piTerm(pdConduct, -1, 1)}},
	{name: "Nusselt number", terms: []sigTerm{piTerm(pdHeatCoef, 1, 1), piTerm(pdLength, 1, 1), piTerm(pdConduct, -1, 1)}},
	{name: "Péclet number", terms: []sigTerm{piTerm(pdDensity, 1, 1), piTerm(pdSpecHeat, 1, 1), piTerm(pdVelocity, 1, 1), piTerm(pdLength, 1, 1), piTerm(pdConduct, -1, 1)}},
	{name: "Fourier number", terms: []sigTerm{piTerm(pdKinematic, 1, 1), piTerm(pdTime, 1, 1), piTerm(pdLength, -2, 1)}, hintDim: pdKinematic, hint: diffusionHints, hintOnly: true},
}

// ratioNouns names a ratio of two variables of the same dimension.
var ratioNouns = map[Dimension]string{
	pdLength:      "length",
	pdArea:        "area",
	pdVolume:      "volume",
	pdVelocity:    "velocity",
	pdDensity:     "density",
	pdFrequency:   "frequency",
	pdTime:        "time",
	pdMass:        "mass",
	pdViscosity:   "viscosity",
	pdKinematic:   "kinematic viscosity",
	pdAccel:       "acceleration",
	pdTension:     "surface tension",
	pdPressure:    "pressure",
	pdForce:       "force",
	pdPower:       "power",
	pdTorque:      "energy",
	pdFlow:        "flow rate",
	pdTemperature: "temperature",
}

// matchHints reports whether a variable name fits the nameHints: the whole name,
// or one of its tokens (split at anything not a letter or digit), equals a
// word, or the name contains one of the longer stems.
func matchHints(name string, h *nameHints) bool {
	lower := strings.ToLower(name)
	tokens := strings.FieldsFunc(lower, func(r rune) bool { return !unicode.IsLetter(r) && !unicode.IsDigit(r) })
	compact := strings.Join(tokens, "")
	for _, w := range h.words {
		if lower == w || compact == w {
			return true
		}
		for _, tok := range tokens {
			if tok == w {
				return true
			}
		}
	}
	for _, s := range h.contains {
		if strings.Contains(lower, s) {
			return true
		}
	}
	return false
}

// powName names a classic group raised to the power k.
func powName(name string, k Rat) string {
	switch {
	case k.Cmp(Int(1)) == 0:
		return name
	case k.Cmp(Int(-1)) == 0:
		return "inverse " + name
	default:
		return name + "^" + k.String()
	}
}

func recogniseGroup(g PiGroup, index map[string]int, dims []Dimension) string {
	if len(g.Exponents) < 2 {
		return ""
	}
	dimOf := func(e VarExp) Dimension { return dims[index[e.Name]] }

	// Signature: exponents summed per dimension, zero sums dropped.
	var sig []sigTerm
	for _, e := range g.Exponents {
		d := dimOf(e)
		found := false
		for k := range sig {
			if sig[k].dim == d {
				sig[k].exp = sig[k].exp.Add(e.Exp)
				found = true
			}
		}
		if !found {
			sig = append(sig, sigTerm{d, e.Exp})
		}
	}
	nonzero := sig[:0]
	for _, s := range sig {
		if !s.exp.IsZero() {
			nonzero = append(nonzero, s)
		}
	}
	sig = nonzero

	if len(sig) == 0 {
		return ratioName(g, dimOf)
	}

	type match struct {
		c      classicGroup
		k      Rat
		hinted bool
	}
	var matches []match
	for _, c := range classicGroups {
		k, ok := proportional(sig, c.terms)
		if !ok {
			continue
		}
		hinted := false
		if c.hint != nil {
			for _, e := range g.Exponents {
				if dimOf(e) == c.hintDim && matchHints(e.Name, c.hint) {
					hinted = true
				}
			}
		}
		matches = append(matches, match{c, k, hinted})
	}
	// A hinted specialised name beats a hinted general one, which beats the
	// unhinted general names; specialised names need their hint.
	keep := func(m match) bool { return !m.c.hintOnly }
	anyHinted, anySpecial := false, false
	for _, m := range matches {
		if m.hinted {
			anyHinted = true
			if m.c.hintOnly {
				anySpecial = true
			}
		}
	}
	switch {
	case anySpecial:
		keep = func(m match) bool { return m.hinted && m.c.hintOnly }
	case anyHinted:
		keep = func(m match) bool { return m.hinted }
	}
	var out []string
	for _, m := range matches {
		if !keep(m) {
			continue
		}
		n := powName(m.c.name, m.k)
		dup := false
		for _, o := range out {
			if o == n {
				dup = true
			}
		}
		if !dup {
			out = append(out, n)
		}
	}
	return strings.Join(out, " or ")
}

// proportional returns k with sig = k·pattern, term by term.
func proportional(sig, pattern []sigTerm) (Rat, bool) {
	if len(sig) != len(pattern) {
		return Rat{}, false
	}
	var k Rat
	for i, p := range pattern {
		var s *sigTerm
		for j := range sig {
			if sig[j].dim == p.dim {
				s = &sig[j]
			}
		}
		if s == nil {
			return Rat{}, false
		}
		r := s.exp.Div(p.exp)
		if i == 0 {
			k = r
		} else if r.Cmp(k) != 0 {
			return Rat{}, false
		}
	}
	return k, true
}

// ratioName names a group whose variables all share one dimension: a ratio
// of two like variables.
func ratioName(g PiGroup, dimOf func(VarExp) Dimension) string {
	d := dimOf(g.Exponents[0])
	for _, e := range g.Exponents[1:] {
		if dimOf(e) != d {
			return ""
		}
	}
	// hinted returns the exponent of the one variable whose name fits h.
	hinted := func(h *nameHints) (Rat, bool) {
		var exp Rat
		n := 0
		for _, e := range g.Exponents {
			if matchHints(e.Name, h) {
				exp, n = e.Exp, n+1
			}
		}
		return exp, n == 1
	}
	switch d {
	case pdVelocity:
		// Mach number V/c: the power is minus the exponent of the speed of sound.
		if e, ok := hinted(soundHints); ok {
			return powName("Mach number", e.Neg())
		}
	case pdLength:
		// Relative roughness ε/D: the power is the exponent of the roughness.
		if e, ok := hinted(roughnessHints); ok {
			return powName("relative roughness", e)
		}
	}
	if noun, ok := ratioNouns[d]; ok {
		return noun + " ratio"
	}
	return ""
}
