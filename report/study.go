package report

import (
	"context"
	"path/filepath"
	"strings"
	"unicode"

	"scaleplan/sweep"
)

// FileName turns a study name into a safe file name: letters, digits,
// '-' and '_' only, so no name can climb out of the output folder.
func FileName(name string) string {
	var b strings.Builder
	for _, r := range name {
		switch {
		case unicode.IsLetter(r) || unicode.IsDigit(r) || r == '-' || r == '_':
			b.WriteRune(r)
		default:
			b.WriteRune('_')
		}
	}
	s := strings.Trim(b.String(), "_")
	if s == "" {
		s = "study"
	}
	if len(s) > 80 {
		s = s[:80]
	}
	return s
}

// WriteStudy writes every output of a study into dir and returns the
// paths written.
func WriteStudy(ctx context.Context, dir string, res *sweep.Result) ([]string, error) {
	base := filepath.Join(dir, FileName(res.Name))
	var files []string
	wb := base + ".xlsx"
	if err := WriteWorkbook(wb, res); err != nil {
		return files, err
	}
	files = append(files, wb)
	memo := base + ".memo.md"
	if err := WriteMemo(memo, res); err != nil {
		return files, err
	}
	files = append(files, memo)
	return files, ctx.Err()
}
