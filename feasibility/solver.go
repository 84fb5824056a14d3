package feasibility

import (
	"fmt"
	"math/big"
	"slices"

	"gonum.org/v1/gonum/mat"
)

// Status tells how a quantity's scale factor is fixed by a strategy.
type Status int

const (
	// Unset quantities play no part in the strategy: nothing fixes them
	// and nothing retained depends on them.
	Unset Status = iota
	// Given quantities are parameters.
	Given
	// Determined quantities follow from the parameters (and the free
	// choices, if any).
	Determined
	// Free quantities are left undetermined by the strategy; the study
	// must fix or sweep them.
	Free
)

func (s Status) String() string {
	return [...]string{"unset", "given", "determined", "free choice"}[s]
}

// Param is a parameter of the scale laws: the length scale, a given
// quantity, or a free choice.
type Param struct {
	Quantity string
	Role     string // "length", "given" or "free"
}

// Symbol is the parameter's name in a printed law: kL for the length scale,
// k_<quantity> otherwise.
func (p Param) Symbol() string {
	if p.Quantity == "length" {
		return "kL"
	}
	return "k_" + p.Quantity
}

// ScaleLaw is one quantity's scale factor as a product of powers of the
// parameters: log k_q = Σ Exp[j] · log p_j.
type ScaleLaw struct {
	Quantity string
	Status   Status
	Exp      []Rat // one per parameter of the solution
}

// Condition is a relation the parameters must satisfy for similarity to be
// possible: Σ Exp[j] · log p_j = 0.
type Condition struct {
	// Protects names what the condition protects: the group of a retained
	// law ("Reynolds number"), a geometric tie or a definition.
	Protects string
	// Law is the retained law whose similarity requires the condition,
	// empty for a tie or a definition.
	Law string
	Exp []Rat
}

// Mismatch is the scale factor π_prototype/π_model of the group a relaxed
// law forms with the reference law, as a product of powers of the
// parameters. Missing lists the quantities that must be given before it
// can be evaluated.
type Mismatch struct {
	Law     string
	Group   string
	Exp     []Rat
	Missing []string
}

// Solution is a solved strategy. It is immutable; evaluate it with Eval.
type Solution struct {
	Strategy   Strategy
	Reference  string // the law relaxed groups are formed against
	Params     []Param
	Laws       []ScaleLaw // one per quantity, in Quantities() order
	Conditions []Condition
	Free       []string
	Required   []string // properties solved for (tuned ones included)
	Relaxed    []Mismatch
	// Warnings are things about the request a user should hear, said in
	// every output (an untied quantity no retained law uses).
	Warnings []string

	exp *mat.Dense // quantities × parameters, float exponents
}

// row is one linear equation over log k of the quantities (first
// len(quantities) entries) and log p of the parameters.
type row struct {
	c   []*big.Rat
	tag string // what the equation expresses, for naming conditions
	law string
	// pivot, when ≥ 0, is the quantity column the row pivots on if it is
	// still non-zero after reduction (a late definition pivots on the
	// quantity it defines).
	pivot int
}

func newRow(n int, tag, law string) row {
	r := row{c: make([]*big.Rat, n), tag: tag, law: law, pivot: -1}
	for i := range r.c {
		r.c[i] = new(big.Rat)
	}
	return r
}

// addProduct adds sign·(exponents of p) to the quantity columns.
func (r row) addProduct(p Product, sign int64) {
	for _, t := range p {
		e := t.Exp.big()
		e.Mul(e, big.NewRat(sign, 1))
		c := r.c[quantityIndex[t.Quantity]]
		c.Add(c, e)
	}
}

// Solve solves a strategy exactly. The result gives the scale law of every
// quantity over the parameters, the compatibility conditions, the free
// choices and the mismatch of every relaxed law. An error means the
// request itself is malformed (an unknown name, a law both retained and
// relaxed, ...); a strategy that cannot be similar is not an error but a
// solution with conditions.
func Solve(s Strategy) (*Solution, error) {
	if err := s.validate(); err != nil {
		return nil, err
	}
	nq := len(quantities)
	// Parameters: the length scale, then the given quantities in order.
	params := []Param{{"length", "length"}}
	for _, g := range s.Given {
		if g != "length" {
			params = append(params, Param{g, "given"})
		}
	}
	np := len(params)
	width := nq + np
	var rows []row
	for j, p := range params {
		r := newRow(width, "given "+p.Quantity, "")
		r.c[quantityIndex[p.Quantity]].SetInt64(1)
		r.c[nq+j].SetInt64(-1)
		rows = append(rows, r)
	}
	for _, t := range s.Tied {
		r := newRow(width, fmt.Sprintf("the tie k_%s = kL^%s", t.Quantity, t.Exp), "")
		r.c[quantityIndex[t.Quantity]].SetInt64(1)
		r.c[nq].Sub(r.c[nq], t.Exp.big())
		rows = append(rows, r)
	}
	for _, d := range definitions {
		r := newRow(width, "the definition "+d.Quantity+" = "+d.Of.String(), "")
		r.c[quantityIndex[d.Quantity]].SetInt64(1)
		r.addProduct(d.Of, -1)
		rows = append(rows, r)
	}
	for _, t := range ties {
		if slices.Contains(s.Untie, t.Quantity) {
			continue
		}
		of := t.Of.String()
		if of == "" {
			of = "1"
		}
		r := newRow(width, "the geometric tie "+t.Quantity+" = "+of+" (untie "+t.Quantity+" to scale it apart)", "")
		r.c[quantityIndex[t.Quantity]].SetInt64(1)
		r.addProduct(t.Of, -1)
		rows = append(rows, r)
	}
	for _, name := range s.Retain {
		l := laws[lawIndex[name]]
		tag := l.Group
		if tag == "" {
			tag = "the " + l.Name + " force"
		}
		r := newRow(width, tag, l.Name)
		r.c[quantityIndex["force"]].Add(r.c[quantityIndex["force"]], big.NewRat(1, 1))
		r.addProduct(l.Force, -1)
		rows = append(rows, r)
	}
	for _, d := range lateDefinitions {
		r := newRow(width, "the definition "+d.Quantity+" = "+d.Of.String(), "")
		r.pivot = quantityIndex[d.Quantity]
		r.c[r.pivot].SetInt64(1)
		r.addProduct(d.Of, -1)
		rows = append(rows, r)
	}

	avoid := make([]bool, nq)
	for _, q := range s.PreferFree {
		avoid[quantityIndex[q]] = true
	}
	ech := eliminate(rows, nq, avoid)
	sol := &Solution{Strategy: s, Reference: reference(s), Warnings: untieWarnings(s)}
	sol.classify(ech, params, nq)
	if err := sol.checkTuned(); err != nil {
		return nil, err
	}
	sol.findRequired()
	sol.mismatches()
	sol.buildMatrix()
	return sol, nil
}

// reference is the law relaxed groups are formed against: inertia if it is
// retained, otherwise the first retained law.
func reference(s Strategy) string {
	if slices.Contains(s.Retain, "inertia") {
		return "inertia"
	}
	return s.Retain[0]
}

// echelon is the result of exact elimination: pivot rows over the quantity
// columns and condition rows over the parameter columns only.
type echelon struct {
	pivots     []row
	pivotCol   []int
	conditions []row
	condCol    []int
}

// eliminate reduces the rows in order. A row that still involves a quantity
// becomes a pivot row (pivot on its first quantity column, so quantities
// late in the column order are the ones left free); a row left with
// parameters only is a compatibility condition and keeps the tag of the
// equation that produced it; a row reduced to nothing is redundant.
//
// avoid marks quantity columns to pivot on only when no other quantity
// column is left in the row, so that they stay free if anything does.
func eliminate(rows []row, nq int, avoid []bool) echelon {
	var e echelon
	tmp := new(big.Rat)
	reduce := func(r row, by []row, cols []int) {
		for i, p := range by {
			f := new(big.Rat).Set(r.c[cols[i]])
			if f.Sign() == 0 {
				continue
			}
			for k := range r.c {
				if p.c[k].Sign() != 0 {
					r.c[k].Sub(r.c[k], tmp.Mul(f, p.c[k]))
				}
			}
		}
	}
	normalise := func(r row, col int) {
		inv := new(big.Rat).Inv(r.c[col])
		for k := range r.c {
			r.c[k].Mul(r.c[k], inv)
		}
	}
	// firstNonZero is the first column in [from, to) with a coefficient.
	firstNonZero := func(r row, from, to int) int {
		for k := from; k < to; k++ {
			if r.c[k].Sign() != 0 {
				return k
			}
		}
		return -1
	}
	for _, r := range rows {
		reduce(r, e.pivots, e.pivotCol)
		col := firstNonZero(r, 0, nq)
		if col >= 0 && avoid[col] {
			for k := col + 1; k < nq; k++ {
				if !avoid[k] && r.c[k].Sign() != 0 {
					col = k
					break
				}
			}
		}
		if r.pivot >= 0 && r.c[r.pivot].Sign() != 0 {
			col = r.pivot
		}
		if col >= 0 {
			normalise(r, col)
			e.pivots = append(e.pivots, r)
			e.pivotCol = append(e.pivotCol, col)
			continue
		}
		reduce(r, e.conditions, e.condCol)
		if col := firstNonZero(r, nq, len(r.c)); col >= 0 {
			normalise(r, col)
			e.conditions = append(e.conditions, r)
			e.condCol = append(e.condCol, col)
		}
	}
	// Back-substitute so that every pivot row is free of the other pivot
	// columns (reduced row echelon form over the quantities).
	for i := len(e.pivots) - 1; i >= 0; i-- {
		for j := i + 1; j < len(e.pivots); j++ {
			f := new(big.Rat).Set(e.pivots[i].c[e.pivotCol[j]])
			if f.Sign() == 0 {
				continue
			}
			for k := range e.pivots[i].c {
				if e.pivots[j].c[k].Sign() != 0 {
					e.pivots[i].c[k].Sub(e.pivots[i].c[k], tmp.Mul(f, e.pivots[j].c[k]))
				}
			}
		}
	}
	return e
}

// classify turns the reduced system into scale laws, free choices and
// conditions.
func (sol *Solution) classify(e echelon, given []Param, nq int) {
	pivotOf := make([]int, nq) // quantity → pivot row index, or -1
	for i := range pivotOf {
		pivotOf[i] = -1
	}
	for i, c := range e.pivotCol {
		pivotOf[c] = i
	}
	// A free column is a free choice when the quantity itself describes the
	// model or the test, or when such a quantity depends on it; otherwise
	// it belongs to a property this strategy does not involve.
	isChoice := make([]bool, nq)
	for q := 0; q < nq; q++ {
		if pivotOf[q] >= 0 {
			continue
		}
		if quantities[q].Kind != Property {
			isChoice[q] = true
			continue
		}
		for i, c := range e.pivotCol {
			if quantities[c].Kind != Property && e.pivots[i].c[q].Sign() != 0 {
				isChoice[q] = true
				break
			}
		}
	}
	params := append([]Param(nil), given...)
	choiceParam := map[int]int{}
	for q := 0; q < nq; q++ {
		if pivotOf[q] < 0 && isChoice[q] {
			choiceParam[q] = len(params)
			params = append(params, Param{quantities[q].Name, "free"})
			sol.Free = append(sol.Free, quantities[q].Name)
		}
	}
	np := len(params)
	ng := len(given)
	givenSet := map[string]bool{}
	for _, p := range given {
		givenSet[p.Quantity] = true
	}
	sol.Params = params
	sol.Laws = make([]ScaleLaw, nq)
	for q := 0; q < nq; q++ {
		law := ScaleLaw{Quantity: quantities[q].Name, Exp: make([]Rat, np)}
		switch {
		case pivotOf[q] < 0 && isChoice[q]:
			law.Status = Free
			law.Exp[choiceParam[q]] = Int(1)
		case pivotOf[q] < 0:
			law.Status = Unset
		default:
			r := e.pivots[pivotOf[q]]
			law.Status = Determined
			if givenSet[law.Quantity] {
				law.Status = Given
			}
			for f := 0; f < nq; f++ {
				if f == q || r.c[f].Sign() == 0 {
					continue
				}
				j, ok := choiceParam[f]
				if !ok {
					law.Status = Unset
					break
				}
				law.Exp[j] = mustFit(new(big.Rat).Neg(r.c[f]))
			}
			if law.Status == Unset {
				law.Exp = make([]Rat, np)
				break
			}
			for j := 0; j < ng; j++ {
				law.Exp[j] = mustFit(new(big.Rat).Neg(r.c[nq+j]))
			}
		}
		sol.Laws[q] = law
	}
	for _, r := range e.conditions {
		c := Condition{Protects: r.tag, Law: r.law, Exp: make([]Rat, np)}
		for j := 0; j < ng; j++ {
			c.Exp[j] = mustFit(r.c[nq+j])
		}
		sol.Conditions = append(sol.Conditions, c)
	}
}

func (sol *Solution) checkTuned() error {
	for _, t := range sol.Strategy.Tuned {
		if l, _ := sol.Law(t); l.Status == Unset {
			return fmt.Errorf("tuned quantity %q is not fixed by the retained laws (%s): give it, or retain a law that involves it", t, joinNames(sol.Strategy.Retain))
		}
	}
	return nil
}

// findRequired lists the properties the strategy solves for: every
// property not given but determined, and the response quantities a
// retained law names (the stiffness of springs, an ambient pressure).
func (sol *Solution) findRequired() {
	inLaw := map[string]bool{}
	for _, n := range sol.Strategy.Retain {
		for _, t := range laws[lawIndex[n]].Force {
			inLaw[t.Quantity] = true
		}
	}
	req := map[string]bool{}
	for i, l := range sol.Laws {
		if l.Status != Determined || l.Quantity == "force" || l.Quantity == "velocity" || sol.Strategy.isTied(l.Quantity) {
			continue
		}
		if quantities[i].Kind == Property || (quantities[i].Kind == Response && inLaw[l.Quantity]) ||
			slices.Contains(sol.Strategy.Tuned, l.Quantity) {
			req[l.Quantity] = true
		}
	}
	// A derived property (kinematic viscosity, flexural rigidity) is
	// required only when one of the properties it is made of is: E·I of a
	// given modulus and a tied area moment asks nothing of the model.
	for _, d := range definitions {
		if !req[d.Quantity] || quantities[quantityIndex[d.Quantity]].Kind != Property {
			continue
		}
		needed := false
		for _, t := range d.Of {
			l, _ := sol.Law(t.Quantity)
			if req[t.Quantity] || l.Status == Unset || slices.Contains(sol.Strategy.Untie, t.Quantity) {
				needed = true
			}
		}
		req[d.Quantity] = needed
	}
	// A property the given quantities determine through the definitions
	// (viscosity from a given density and kinematic viscosity) asks
	// nothing of the model either; a tuned one is still set by a device.
	for q := range sol.fixedByGiven() {
		if !slices.Contains(sol.Strategy.Tuned, q) {
			delete(req, q)
		}
	}
	for _, l := range sol.Laws {
		if req[l.Quantity] {
			sol.Required = append(sol.Required, l.Quantity)
		}
	}
}

func (s Strategy) isTied(q string) bool {
	for _, t := range s.Tied {
		if t.Quantity == q {
			return true
		}
	}
	return false
}

// mismatches forms, for each relaxed law, the scale factor of its group
// against the reference law.
func (sol *Solution) mismatches() {
	ref := laws[lawIndex[sol.Reference]]
	for _, name := range sol.Strategy.Relax {
		l := laws[lawIndex[name]]
		m := Mismatch{Law: name, Exp: make([]Rat, len(sol.Params))}
		power := l.GroupPower
		m.Group = l.Group
		if ref.Name != "inertia" {
			power = Int(1)
			m.Group = fmt.Sprintf("%s/%s force ratio", ref.Name, l.Name)
		}
		// group = (F_ref / F_law)^power as exponents over quantities
		byQ := map[string]Rat{}
		var order []string
		add := func(p Product, sign Rat) {
			for _, t := range p {
				if _, ok := byQ[t.Quantity]; !ok {
					order = append(order, t.Quantity)
				}
				byQ[t.Quantity] = byQ[t.Quantity].Add(t.Exp.Mul(sign).Mul(power))
			}
		}
		add(ref.Force, Int(1))
		add(l.Force, Int(-1))
		for _, q := range order {
			e := byQ[q]
			if e.IsZero() {
				continue
			}
			law, _ := sol.Law(q)
			if law.Status == Unset {
				m.Missing = append(m.Missing, q)
				continue
			}
			for j := range m.Exp {
				m.Exp[j] = m.Exp[j].Add(e.Mul(law.Exp[j]))
			}
		}
		sol.Relaxed = append(sol.Relaxed, m)
	}
}

func (sol *Solution) buildMatrix() {
	sol.exp = mat.NewDense(len(sol.Laws), len(sol.Params), nil)
	for i, l := range sol.Laws {
		for j, e := range l.Exp {
			sol.exp.Set(i, j, e.Float64())
		}
	}
}

// Law returns the scale law of a quantity.
func (sol *Solution) Law(quantity string) (ScaleLaw, bool) {
	i, ok := quantityIndex[quantity]
	if !ok {
		return ScaleLaw{}, false
	}
	return sol.Laws[i], true
}

// ParamIndex returns the position of a quantity among the parameters, or -1.
func (sol *Solution) ParamIndex(quantity string) int {
	for j, p := range sol.Params {
		if p.Quantity == quantity {
			return j
		}
	}
	return -1
}

// Exponents returns the quantities × parameters matrix of float exponents:
// log k = Exponents · log p. The caller must not modify it.
func (sol *Solution) Exponents() mat.Matrix { return sol.exp }

// Eval computes log k of every quantity (natural logarithms) from log p of
// every parameter: a matrix–vector product. Unset quantities get 0; check
// their status before use. dst must have one entry per quantity.
func (sol *Solution) Eval(logp, dst []float64) {
	out := mat.NewVecDense(len(dst), dst)
	out.MulVec(sol.exp, mat.NewVecDense(len(logp), logp))
}
