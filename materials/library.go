package materials

import (
	"fmt"
	"sort"
	"strings"
)

// Library is a set of entries by name: the embedded data (Default) plus
// the custom entries of a study (Add). A Library is safe for concurrent
// reads; Add must not run concurrently with other methods.
type Library struct {
	byKey map[string]Entry
}

// New returns an empty library.
func New() *Library { return &Library{byKey: map[string]Entry{}} }

// Default builds a fresh library from the embedded data files. Each call
// returns a new library, so adding to one never changes another.
func Default() (*Library, error) {
	entries, err := loadEntries()
	if err != nil {
		return nil, fmt.Errorf("materials library: %v", err)
	}
	l := New()
	for _, e := range entries {
		l.byKey[normalize(e.Name)] = e
	}
	return l, nil
}

// normalize makes the key of a name: lower case, runs of spaces, hyphens
// and underscores as one underscore ("Structural steel" → structural_steel).
func normalize(name string) string {
	f := strings.FieldsFunc(strings.ToLower(strings.TrimSpace(name)), func(r rune) bool {
		return r == ' ' || r == '-' || r == '_' || r == '\t'
	})
	return strings.Join(f, "_")
}

// Lookup finds an entry by name (case, spaces and hyphens do not matter;
// aliases of the same substance such as fresh water, perspex, glycerine
// and "silicone oil 100 cSt" are known, see names.go). A word naming a
// class (steel, sand, oil) is refused with its entries; an unknown name is
// an error with a suggestion close in spelling and meaning.
func (l *Library) Lookup(name string) (Entry, error) {
	k, err := l.lookupName(name, normalize(name))
	if err != nil {
		return Entry{}, err
	}
	return l.byKey[k].clone(), nil
}

func (e Entry) clone() Entry {
	e.Ranges = append([]ConditionRange(nil), e.Ranges...)
	e.fixed = append([]Property(nil), e.fixed...)
	return e
}

// Entries returns every entry, by kind (solid, fluid, soil, ice) then name.
func (l *Library) Entries() []Entry {
	out := make([]Entry, 0, len(l.byKey))
	for _, e := range l.byKey {
		out = append(out, e.clone())
	}
	sort.Slice(out, func(i, j int) bool {
		if a, b := out[i].Kind.rank(), out[j].Kind.rank(); a != b {
			return a < b
		}
		return normalize(out[i].Name) < normalize(out[j].Name)
	})
	return out
}

// Names returns the keys of every entry, sorted.
func (l *Library) Names() []string {
	out := make([]string, 0, len(l.byKey))
	for k := range l.byKey {
		out = append(out, k)
	}
	sort.Strings(out)
	return out
}

// Has reports whether an entry of that name exists (Add would override it).
func (l *Library) Has(name string) bool {
	_, ok := l.byKey[normalize(name)]
	return ok
}

// Add validates a custom entry and adds it. Its name is matched like
// Lookup's: an entry with the name of an existing one overrides it (a
// study may redefine "concrete" with its own mix); Has tells beforehand.
// Errors name the entry and the property, e.g.
// `material "my foam": poisson 0.7 is outside 0–0.5`.
func (l *Library) Add(c CustomEntry) error {
	e, err := c.build()
	if err != nil {
		return err
	}
	l.byKey[normalize(e.Name)] = e
	return nil
}
