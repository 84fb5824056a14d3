package feasibility

// Small helpers on the text of units, values and expressions.

// shorten cuts s to its first n characters and an ellipsis, for quoting
// user input in an error.
func shorten(s string, n int) string {
	r := []rune(s)
	if len(r) <= n {
		return s
	}
	return string(r[:n]) + "…"
}

// isDigit reports whether r is an ASCII decimal digit (not any Unicode
// digit: numbers in units, values and expressions are ASCII).
func isDigit(r rune) bool { return r >= '0' && r <= '9' }
