package sweep

// inputKind says what sort of input an uncertain factor multiplies.
type inputKind int

const (
	inputItem       inputKind = iota + 1 // a prototype item
	inputProto                           // a property of the prototype
	inputCandidate                       // a property of a medium or model material
	inputCapability                      // a capability of a facility
)

// inputKey names one input of a combination that a draw of the uncertain
// inputs may multiply: its kind, the candidate or facility it belongs to
// (empty for items and prototype properties) and its name. Names are kept
// apart, never joined into one string, so any character may appear in
// them (a facility "Polar:basin").
type inputKey struct {
	kind  inputKind
	owner string
	name  string
}
