package sweep

import (
	"errors"
	"strings"
)

// failedNames are the names of rows that failed a check (a prototype item
// with a bad unit, a facility capability with a bad value). They stay
// known names: a limit or cost naming one is not reported again as
// naming something unknown, since the row's own problem says what is
// wrong. Keys are an item name, or a facility name and a capability.
type failedNames map[string]bool

func (f *failedNames) add(parts ...string) {
	if *f == nil {
		*f = failedNames{}
	}
	(*f)[strings.Join(parts, "\x00")] = true
}

func (f failedNames) has(parts ...string) bool {
	return f[strings.Join(parts, "\x00")]
}

// errFailedName is what a name of a failed row resolves to.
var errFailedName = errors.New("a name whose row failed a check")
