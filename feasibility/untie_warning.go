package feasibility

import (
	"fmt"
	"slices"
)

// untieWarnings says, for each untied quantity that no retained law uses
// (directly or through a definition such as E·I), that scaling it apart
// changes nothing the laws keep similar. An untied thickness with gravity
// retained is the classic slip of a distorted open-channel model: the
// velocity then follows the horizontal scale, so the warning names the law
// that uses the vertical scale.
func untieWarnings(s Strategy) []string {
	uses := func(q string) bool {
		for _, name := range s.Retain {
			for _, t := range laws[lawIndex[name]].Force {
				if t.Quantity == q {
					return true
				}
				for _, d := range definitions {
					if d.Quantity != t.Quantity {
						continue
					}
					for _, dt := range d.Of {
						if dt.Quantity == q {
							return true
						}
					}
				}
			}
		}
		return false
	}
	var out []string
	for _, q := range s.Untie {
		if uses(q) {
			continue
		}
		w := fmt.Sprintf("%s is untied but no retained law uses it, so the retained laws do not depend on it (only quantities defined from it, such as discharge, follow it)", q)
		if q == "thickness" && slices.Contains(s.Retain, "gravity") {
			w += "; for a distorted open-channel model retain hydrostatic (the pressure head over the vertical scale) instead of gravity, so that the velocity follows the vertical scale"
		}
		out = append(out, w)
	}
	return out
}
