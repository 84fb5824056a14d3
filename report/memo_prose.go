package report

import (
	"regexp"
	"sort"
	"strconv"
	"strings"

	"scaleplan/sweep"
)

// The memo's verdict sections say what sweep says, in the memo's words:
// built from the structured fields where there are some (laws, groups,
// ratios, capabilities, values), and, where sweep gives only a sentence
// (a warning, a failing reason, a limit's name), through proseText, which
// names the identifiers of the label table and writes numbers for people
// without touching the names the user typed.

var (
	// eNumberRE is a number in E-notation as strconv writes it ("1.68e-08").
	eNumberRE = regexp.MustCompile(`\b[0-9]+(?:\.[0-9]+)?e[+-]?[0-9]+\b`)
	// powerRE is a power written with a caret ("m^2/s", "s^-1"), printed
	// for people as a superscript (m²/s).
	powerRE = regexp.MustCompile(`\^(-?[0-9]+)`)
	// symbolWordRE is a scale-factor symbol standing as a word ("k_density").
	symbolWordRE = regexp.MustCompile(`\bk_[a-z_]+\b`)
	// rawWordRE matches, as whole words, every identifier of the label
	// tables that a reader must not see (see RawIdentifiers), the longest
	// first.
	rawWordRE = func() *regexp.Regexp {
		ids := RawIdentifiers()
		sort.SliceStable(ids, func(i, j int) bool { return len(ids[i]) > len(ids[j]) })
		for i, id := range ids {
			ids[i] = regexp.QuoteMeta(id)
		}
		return regexp.MustCompile(`\b(?:` + strings.Join(ids, "|") + `)\b`)
	}()
)

// userNames are the names a user typed in a study (strategies, cases,
// facilities, media and materials), longest first: proseText leaves them
// as they are.
func userNames(res *sweep.Result) []string {
	seen := map[string]bool{}
	var out []string
	add := func(n string) {
		if n = strings.TrimSpace(n); n != "" && !seen[n] {
			seen[n] = true
			out = append(out, n)
		}
	}
	for _, sr := range res.Strategies {
		add(sr.Name)
		for _, cs := range sr.Cases {
			add(cs.Case)
		}
	}
	if p := res.Plan; p != nil {
		for _, f := range p.Facilities {
			add(f.Name)
		}
		for _, c := range append(append([]*sweep.Candidate2(nil), p.Media...), p.Materials...) {
			add(c.Name)
		}
	}
	sort.SliceStable(out, func(i, j int) bool { return len(out[i]) > len(out[j]) })
	return out
}

// proseText rewrites a sentence of sweep for the memo: identifiers of the
// label table that stand as whole words get their readable names, scale
// symbols (k_density) become k(density), numbers in E-notation are written
// as HumanNumber writes them. The names in keep (userNames) are left as
// typed, even where they look like an identifier.
func proseText(s string, keep []string) string {
	// Mask the user's names: \x00N\x01 cannot occur in a study's text and
	// holds no letter an identifier could match.
	var masked []string
	for _, n := range keep {
		token := "\x00" + strings.Repeat("\x02", len(masked)) + "\x01"
		if t, ok := replaceWord(s, n, token); ok {
			s = t
			masked = append(masked, n)
		}
	}
	s = symbolWordRE.ReplaceAllStringFunc(s, symbolLabel)
	s = rawWordRE.ReplaceAllStringFunc(s, func(id string) string {
		if l, ok := lawLabels[id]; ok {
			if _, quantity := labels[id]; !quantity {
				return l
			}
		}
		return Label(id)
	})
	s = eNumberRE.ReplaceAllStringFunc(s, func(e string) string {
		x, err := strconv.ParseFloat(e, 64)
		if err != nil {
			return e
		}
		return HumanNumber(x)
	})
	s = humanPowers(s)
	for i := len(masked) - 1; i >= 0; i-- {
		s = strings.ReplaceAll(s, "\x00"+strings.Repeat("\x02", i)+"\x01", masked[i])
	}
	return s
}

// humanPowers writes the caret powers of a text as superscripts: "m^2/s"
// becomes "m²/s".
func humanPowers(s string) string {
	return powerRE.ReplaceAllStringFunc(s, func(p string) string { return superscripts.Replace(p[1:]) })
}

// replaceWord replaces the occurrences of w in s that do not stand inside
// a longer word (no letter, digit or underscore on either side).
func replaceWord(s, w, by string) (string, bool) {
	var b strings.Builder
	found := false
	for {
		i := strings.Index(s, w)
		if i < 0 {
			b.WriteString(s)
			return b.String(), found
		}
		end := i + len(w)
		if (i > 0 && isWordByte(s[i-1])) || (end < len(s) && isWordByte(s[end])) {
			b.WriteString(s[:i+1])
			s = s[i+1:]
			continue
		}
		b.WriteString(s[:i])
		b.WriteString(by)
		s = s[end:]
		found = true
	}
}

func isWordByte(c byte) bool {
	return c == '_' || c >= '0' && c <= '9' || c >= 'a' && c <= 'z' || c >= 'A' && c <= 'Z'
}
