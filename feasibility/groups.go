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
	names, dims, index, err := piInputs(vars)
	if err != nil {
		return PiResult{}, err
	}
	var res PiResult
	var involved []bool
	involved, res.Dimensions = involvedBases(dims)
	res.Rank = dimensionRank(dims)

	var rep []int
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
		g, err := groupOf(q, names, dims, rep, repDims, res.Repeating)
		if err != nil {
			return PiResult{}, err
		}
		g.Name = recogniseGroup(g, index, dims)
		res.Groups = append(res.Groups, g)
	}
	combineIribarren(res.Groups, index, dims)
	combineBuoyancy(res.Groups, index, dims)
	return res, nil
}

// piInputs checks the variables' names (given, each once) and returns
// them with their dimensions and an index from name to position.
func piInputs(vars []Variable) ([]string, []Dimension, map[string]int, error) {
	if len(vars) == 0 {
		return nil, nil, nil, errors.New("no variables: a pi analysis needs at least one variable with its unit")
	}
	names := make([]string, len(vars))
	dims := make([]Dimension, len(vars))
	index := make(map[string]int, len(vars))
	for i, v := range vars {
		name := strings.TrimSpace(v.Name)
		if name == "" {
			return nil, nil, nil, fmt.Errorf("variable %d has no name", i+1)
		}
		if j, dup := index[name]; dup {
			return nil, nil, nil, fmt.Errorf("variable %q is listed twice (as variables %d and %d)", name, j+1, i+1)
		}
		index[name] = i
		names[i] = name
		dims[i] = canonDim(v.Dim)
	}
	return names, dims, index, nil
}

// involvedBases says which base dimensions the variables involve, and
// their symbols in base order.
func involvedBases(dims []Dimension) (involved []bool, symbols []string) {
	involved = make([]bool, numBase)
	for b := 0; b < numBase; b++ {
		for _, d := range dims {
			if !d[b].IsZero() {
				involved[b] = true
			}
		}
		if involved[b] {
			symbols = append(symbols, baseSymbols[b])
		}
	}
	return involved, symbols
}

// dimensionRank is the rank of the dimension matrix: a greedy basis over
// the input order.
func dimensionRank(dims []Dimension) int {
	var basis []Dimension
	for _, d := range dims {
		if _, in := solveDims(basis, d); !in {
			basis = append(basis, d)
		}
	}
	return len(basis)
}

// groupOf is the dimensionless group of variable q with the repeating
// variables rep (their dimensions repDims, their names repNames), unnamed.
func groupOf(q int, names []string, dims []Dimension, rep []int, repDims []Dimension, repNames []string) (PiGroup, error) {
	coef, ok := solveDims(repDims, dims[q].Pow(Int(-1)))
	if !ok {
		// Cannot happen: the repeating variables span the columns.
		return PiGroup{}, fmt.Errorf("internal error: %s cannot be made dimensionless with %s", names[q], piList(repNames))
	}
	exps := make([]Rat, len(names))
	exps[q] = Int(1)
	for k, i := range rep {
		r, fits := fromBig(coef[k])
		if !fits {
			return PiGroup{}, fmt.Errorf("the exponent of %s in the group of %s is too large", names[i], names[q])
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
		return PiGroup{}, fmt.Errorf("internal error: group %s has dimension %s", g, g.Dim)
	}
	return g, nil
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
