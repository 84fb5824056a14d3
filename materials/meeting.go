package materials

import (
	"math"
	"sort"
)

// Match is an entry whose property meets a required value.
type Match struct {
	Name     string
	Kind     Kind
	Property Property // at the conditions, with its tunable range
	// Deviation is (nearest − required)/required, where nearest is the
	// property's value, or for a tunable property the nearest value in its
	// range (0 when the range holds the required value).
	Deviation float64
	Tuned     bool // the required value lies inside the tunable range
}

// Meeting lists the entries whose property lies within a relative
// tolerance tol of a required value (SI): |nearest − value| ≤ tol·|value|,
// counting a tunable property as meeting any value within its range. Each
// entry is taken at the conditions it takes (others are ignored, missing
// ones default); entries whose valid range excludes the conditions are left
// out. The matches are sorted by |Deviation|, then kind and name. An empty
// result means no entry meets the requirement; so does an unknown quantity,
// a negative tolerance or a value that is not finite.
func (l *Library) Meeting(quantity string, value, tol float64, c Conditions) []Match {
	if tol < 0 || math.IsNaN(value) || math.IsInf(value, 0) || math.IsNaN(tol) {
		return nil
	}
	var out []Match
	for _, e := range l.Entries() {
		rc, err := e.resolve(c)
		if err != nil {
			continue
		}
		for _, p := range e.eval(rc) {
			if p.Quantity != quantity {
				continue
			}
			m := Match{Name: e.Name, Kind: e.Kind, Property: p}
			nearest := p.Value
			if p.Tunable() {
				nearest = clamp(value, p.Min, p.Max)
				m.Tuned = nearest == value
			}
			if value != 0 {
				m.Deviation = (nearest - value) / math.Abs(value)
			} else if nearest != 0 {
				m.Deviation = math.Inf(1)
			}
			if math.Abs(nearest-value) <= tol*math.Abs(value) {
				out = append(out, m)
			}
		}
	}
	sort.SliceStable(out, func(i, j int) bool {
		a, b := math.Abs(out[i].Deviation), math.Abs(out[j].Deviation)
		if a != b {
			return a < b
		}
		if x, y := out[i].Kind.rank(), out[j].Kind.rank(); x != y {
			return x < y
		}
		return normalize(out[i].Name) < normalize(out[j].Name)
	})
	return out
}
