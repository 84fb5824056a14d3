package feasibility

import (
	"errors"
	"fmt"
	"sort"
	"strings"
)

// The repeating variables of a pi analysis: chosen automatically, or the
// user's choice checked.

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
