package study

import (
	"strings"
	"testing"
	"unicode"
)

// FuzzTypedText checks the readers of typed forms on any text: number
// format codes and cell values never panic; white space comes out plain
// (no tab, no no-break space, no run of spaces, trimmed) and tidying twice
// changes nothing; a scale read as 1:K is positive and finite.
func FuzzTypedText(f *testing.F) {
	for _, s := range []string{"h:mm", "[h]:mm:ss", "yyyy-mm-dd", "0.0%", "\"d\"0", "Estuary\u00a0 tank\t", "1:25", "1:1e400", "0:01:00", "2026-11-30", "12,5 %", "a\n b \n"} {
		f.Add(s, "0.059027777777777776")
	}
	f.Fuzz(func(t *testing.T, s, raw string) {
		for _, k := range []cellKind{numFmtKind(s), kindDate, kindTime, kindDuration, kindPercent} {
			_ = cellText(raw, k, false)
			_ = cellText(raw, k, true)
		}
		n := normSpace(s)
		if normSpace(n) != n {
			t.Errorf("normSpace not idempotent: %q → %q → %q", s, n, normSpace(n))
		}
		if strings.Contains(n, "  ") || n != strings.TrimSpace(n) || strings.ContainsFunc(n, func(r rune) bool { return r != ' ' && r != '\n' && unicode.IsSpace(r) }) {
			t.Errorf("normSpace(%q) = %q is not plain", s, n)
		}
		if k, ok := ratioScale(s); ok && !(k > 0 && k <= 1e300) {
			t.Errorf("ratioScale(%q) = %v", s, k)
		}
		_ = fromDecimalComma(s)
		_, _ = clockSeconds(s)
		_ = TypedAsClock(s)
	})
}
