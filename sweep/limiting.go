package sweep

// What gives the margin at a grid point (ComboResult.Limiting): an index
// into the combination's Limits, or one of these.
const (
	// LimitingSimilarity: a similarity condition of the strategy (a
	// retained law that holds at one scale only, or not at all) gives the
	// margin.
	LimitingSimilarity = -1
	// LimitingNone: no limit applies at the point (its margin is +Inf).
	LimitingNone = -2
)
