package feasibility

import (
	"errors"
	"fmt"
	"math/big"
	"sort"
	"strings"
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
// One exception to "one non-repeating variable per group": a lone slope
// (a dimensionless tan α) is combined with a wave steepness group into the
// Iribarren number.
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
	combineIribarren(res.Groups, index, dims)
	combineBuoyancy(res.Groups, index, dims)
	return res, nil
}

// convectionName names the groups of free convection (Incropera & DeWitt,
// Fundamentals of Heat and Mass Transfer, ch. 9; from memory): the Grashof
// number g·β·ΔT·L³/ν² and the Rayleigh number g·β·ΔT·L³/(ν·α), α a thermal
// diffusivity, each up to a power. ok is false when the group does not
// have their dimensions; a group of that shape built on α alone
// (g·β·ΔT·L³/α² = Ra/Pr) is left unnamed.
func convectionName(g PiGroup, dimOf func(VarExp) Dimension) (string, bool) {
	var k Rat
	sum := map[Dimension]Rat{}
	var kin []VarExp
	for _, e := range g.Exponents {
		d := dimOf(e)
		sum[d] = sum[d].Add(e.Exp)
		if d == pdKinematic {
			kin = append(kin, e)
		}
	}
	k = sum[pdAccel]
	if k.IsZero() || len(sum) != 5 || sum[pdExpansion].Cmp(k) != 0 || sum[pdTemperature].Cmp(k) != 0 ||
		sum[pdLength].Cmp(k.Mul(Int(3))) != 0 || sum[pdKinematic].Cmp(k.Mul(Int(-2))) != 0 {
		return "", false
	}
	var alpha, nu []VarExp
	for _, e := range kin {
		if matchHints(e.Name, diffusionHints) {
			alpha = append(alpha, e)
		} else {
			nu = append(nu, e)
		}
	}
	switch {
	case len(alpha) == 0:
		return powName("Grashof number", k), true
	case len(alpha) == 1 && len(nu) == 1 && alpha[0].Exp.Cmp(k.Neg()) == 0 && nu[0].Exp.Cmp(k.Neg()) == 0:
		return powName("Rayleigh number", k), true
	}
	return "", true
}

// combineBuoyancy multiplies a Galileo-type group g·L³/ν² (or g·L³/α²) by
// the group β·ΔT of a thermal expansion and a temperature difference when
// both are in the basis, giving the Grashof number (or the Rayleigh number
// with a thermal diffusivity), the groups of free convection.
func combineBuoyancy(groups []PiGroup, index map[string]int, dims []Dimension) {
	var bt []VarExp // the β·ΔT group
	for _, g := range groups {
		if len(g.Exponents) != 2 {
			continue
		}
		d0, d1 := dims[index[g.Exponents[0].Name]], dims[index[g.Exponents[1].Name]]
		if (d0 == pdExpansion && d1 == pdTemperature) || (d0 == pdTemperature && d1 == pdExpansion) {
			bt = g.Exponents
			break
		}
	}
	if bt == nil {
		return
	}
	k := bt[0].Exp // β·ΔT raised to k
	for i, g := range groups {
		var m Rat // exponent of the acceleration
		for _, e := range g.Exponents {
			if dims[index[e.Name]] == pdAccel {
				m = e.Exp
			}
		}
		if m.IsZero() {
			continue
		}
		p := m.Div(k)
		out := PiGroup{Dim: g.Dim}
		for _, e := range bt {
			out.Exponents = append(out.Exponents, VarExp{e.Name, e.Exp.Mul(p)})
		}
		out.Exponents = append(out.Exponents, g.Exponents...)
		if n := recogniseGroup(out, index, dims); strings.Contains(n, "Grashof") || strings.Contains(n, "Rayleigh") {
			out.Name = n
			groups[i] = out
		}
	}
	// With a Prandtl group ν/α in the basis as well, Gr·Pr = Ra is the
	// group free convection is characterised by.
	for i, g := range groups {
		if !strings.HasPrefix(g.Name, "Grashof number") {
			continue
		}
		for _, pr := range groups {
			if !strings.Contains(pr.Name, "Prandtl number") || len(pr.Exponents) != 2 {
				continue
			}
			var prPow Rat // pr is Pr^prPow; the α exponent is −prPow
			for _, e := range pr.Exponents {
				if matchHints(e.Name, diffusionHints) {
					prPow = e.Exp.Neg()
				}
			}
			if prPow.IsZero() {
				continue
			}
			var k Rat // g is Gr^k: the acceleration exponent
			for _, e := range g.Exponents {
				if dims[index[e.Name]] == pdAccel {
					k = e.Exp
				}
			}
			p := k.Div(prPow)
			out := PiGroup{Dim: g.Dim, Exponents: append([]VarExp(nil), g.Exponents...)}
			for _, e := range pr.Exponents {
				merged := false
				for j := range out.Exponents {
					if out.Exponents[j].Name == e.Name {
						out.Exponents[j].Exp = out.Exponents[j].Exp.Add(e.Exp.Mul(p))
						merged = true
					}
				}
				if !merged {
					out.Exponents = append(out.Exponents, VarExp{e.Name, e.Exp.Mul(p)})
				}
			}
			if n := recogniseGroup(out, index, dims); strings.HasPrefix(n, "Rayleigh number") {
				out.Name = n
				groups[i] = out
			}
			break
		}
	}
}

// combineIribarren replaces the group of a lone slope (a dimensionless
// variable named tan_a, slope, …) by the Iribarren number when another
// group is a wave steepness: slope · steepness^(-1/2k) for a steepness
// raised to k. The basis stays a basis (one group times a power of
// another), and it is the group coastal engineers use.
func combineIribarren(groups []PiGroup, index map[string]int, dims []Dimension) {
	for i, g := range groups {
		if len(g.Exponents) != 1 || !dims[index[g.Exponents[0].Name]].IsDimensionless() || !matchHints(g.Exponents[0].Name, slopeHints) {
			continue
		}
		for _, st := range groups {
			k, ok := steepnessPower(st.Name)
			if !ok {
				continue
			}
			p := R(-1, 2).Div(k)
			out := PiGroup{Exponents: []VarExp{g.Exponents[0]}, Dim: g.Dim}
			for _, e := range st.Exponents {
				out.Exponents = append(out.Exponents, VarExp{e.Name, e.Exp.Mul(p)})
			}
			out.Name = recogniseGroup(out, index, dims)
			if out.Name != "" {
				groups[i] = out
			}
			break
		}
	}
}

// steepnessPower returns k of a group named "wave steepness" raised to k.
func steepnessPower(name string) (Rat, bool) {
	switch {
	case name == "wave steepness":
		return Int(1), true
	case name == "inverse wave steepness":
		return Int(-1), true
	}
	if r, ok := strings.CutPrefix(name, "wave steepness^"); ok {
		k, err := ParseRat(r)
		return k, err == nil && !k.IsZero()
	}
	return Rat{}, false
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
	pdExpansion   = Dim(0, 0, 0, -1)  // thermal expansion coefficient 1/K
	pdNone        = Dim(0, 0, 0, 0)   // a dimensionless variable (a slope)
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
