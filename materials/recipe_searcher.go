package materials

import (
	"fmt"
	"math"
	"sort"
	"strings"
	"sync"
)

// A Searcher runs a library's searches (FindRecipes, Extreme) remembering
// each entry's extremes of a property over its valid ranges, so that a
// sweep asking the library the same question at many requirements solves
// each entry's range once. A requirement that lies clearly outside an
// entry's range cannot be met by it (its properties are continuous over a
// connected box of conditions, so its values fill the interval between
// its extremes): that entry's nearest recipe is its extreme on the side of
// the requirement, without a solve. A Searcher is safe for concurrent use;
// it must not outlive changes to its library (Add).
type Searcher struct {
	lib *Library
	mu  sync.Mutex
	ext map[extremeKey]extremeResult
}

type extremeKey struct {
	entry, quantity, limits string
	sign                    float64
}

type extremeResult struct {
	r   Recipe
	err error
}

// screenMargin widens an entry's range before a requirement is judged
// outside it: the extremes come from a numerical search, so a requirement
// within 2 % beyond them (besides the tolerance) is still solved.
const screenMargin = 0.02

// Searcher returns a searcher over the library.
func (l *Library) Searcher() *Searcher {
	return &Searcher{lib: l, ext: map[extremeKey]extremeResult{}}
}

// FindRecipes is the library's FindRecipes with each entry's extremes
// remembered: see Library.FindRecipes.
func (s *Searcher) FindRecipes(spec RecipeSpec, filter func(Entry) bool) Search {
	return s.lib.findRecipes(spec, filter, s.extremeOf)
}

// Extreme is the library's Extreme with each entry's extremes remembered:
// see Library.Extreme.
func (s *Searcher) Extreme(quantity string, lowest bool, limits map[Condition]Range, filter func(Entry) bool) (Recipe, error) {
	return s.lib.extreme(quantity, lowest, limits, filter, s.extremeOf)
}

func (s *Searcher) extremeOf(e Entry, quantity string, sign float64, limits map[Condition]Range) (Recipe, error) {
	k := extremeKey{entry: e.Name, quantity: quantity, limits: limitsKey(limits), sign: sign}
	s.mu.Lock()
	v, ok := s.ext[k]
	s.mu.Unlock()
	if ok {
		return v.r, v.err
	}
	r, err := extremeOf(e, quantity, sign, limits)
	s.mu.Lock()
	s.ext[k] = extremeResult{r, err}
	s.mu.Unlock()
	return r, err
}

// limitsKey is a canonical text of a set of condition limits.
func limitsKey(limits map[Condition]Range) string {
	keys := make([]string, 0, len(limits))
	for c := range limits {
		keys = append(keys, string(c))
	}
	sort.Strings(keys)
	var b strings.Builder
	for _, c := range keys {
		r := limits[Condition(c)]
		fmt.Fprintf(&b, "%s=%g..%g;", c, r.Min, r.Max)
	}
	return b.String()
}

// screened is an entry's nearest recipe when its range shows that it
// cannot meet the spec, and false when it must be solved: the spec has a
// constant target, no other requirement and nothing held, and the required
// value lies beyond the entry's extremes by more than the tolerance and
// screenMargin.
func screened(e Entry, spec RecipeSpec, extreme extremeFunc) (Recipe, bool) {
	t := spec.Target
	if extreme == nil || e.model == nil || t.Of != nil || len(spec.Also) > 0 || len(spec.Hold) > 0 || !(t.Value > 0) || math.IsInf(t.Value, 0) {
		return Recipe{}, false
	}
	tol := t.Tolerance
	if tol == 0 {
		tol = spec.Tolerance
	}
	if tol == 0 {
		tol = DefaultRecipeTolerance
	}
	lo, err := extreme(e, t.Quantity, 1, spec.Limits)
	if err != nil {
		return Recipe{}, false
	}
	hi, err := extreme(e, t.Quantity, -1, spec.Limits)
	if err != nil {
		return Recipe{}, false
	}
	var r Recipe
	switch {
	case t.Value*(1+tol)*(1+screenMargin) < lo.Target.Value:
		r = lo
	case t.Value*(1-math.Min(tol, 0.5))*(1-screenMargin) > hi.Target.Value:
		r = hi
	default:
		return Recipe{}, false
	}
	r.Method = "nearest: the entry's extreme over its ranges, the requirement lying beyond it"
	r.Target = Check{Quantity: t.Quantity, Value: r.Target.Value, Required: t.Value, Tolerance: tol,
		Deviation: (r.Target.Value - t.Value) / t.Value}
	r.Met = false
	return r, true
}
