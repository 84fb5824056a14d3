package report

import (
	"context"
	"fmt"
	"os"
	"path/filepath"
	"strings"
	"unicode"

	"scaleplan/sweep"
)

// FileName turns a study name into a safe file name: letters, digits,
// '-' and '_' only, so no name can climb out of the output folder ("../x"
// gives "x", "a/b" gives "a_b", "", "." and ".." give "study"); at most 80
// bytes, cut between characters; a name Windows reserves for a device
// (CON, NUL, COM1, …) gets a trailing '_'.
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
		cut := 0
		for i := range s { // i is the start of each character
			if i > 80 {
				break
			}
			cut = i
		}
		s = s[:cut]
	}
	if reservedName(s) {
		s += "_"
	}
	return s
}

// reservedName reports whether Windows reserves a name for a device, in
// any case and whatever extension follows.
func reservedName(s string) bool {
	switch strings.ToUpper(s) {
	case "CON", "PRN", "AUX", "NUL":
		return true
	}
	u := strings.ToUpper(s)
	return len(u) == 4 && (strings.HasPrefix(u, "COM") || strings.HasPrefix(u, "LPT")) && u[3] >= '0' && u[3] <= '9'
}

// studyOutput writes one output of a study into a folder, under a name
// starting with base (a FileName), and returns the paths it wrote.
type studyOutput func(dir, base string, res *sweep.Result) ([]string, error)

// studyOutputs are the outputs of a study, in the order they are written
// and listed.
var studyOutputs = []studyOutput{
	func(dir, base string, res *sweep.Result) ([]string, error) {
		p := filepath.Join(dir, base+".xlsx")
		return []string{p}, WriteWorkbook(p, res)
	},
	func(dir, base string, res *sweep.Result) ([]string, error) {
		p := filepath.Join(dir, base+".memo.md")
		return []string{p}, WriteMemo(p, res)
	},
}

// WriteStudy writes every output of a study into dir and returns the paths
// written.
//
// The outputs are first written into a hidden staging folder inside dir
// (named like a temporary file, see IsPartial) and moved into place only
// when all of them are complete and ctx is not done. On an error, or when
// ctx is cancelled (an interrupt), nothing is moved, the staging folder is
// removed, and dir is left as it was: it holds every new output of the
// study or none, and never a half-written file.
func WriteStudy(ctx context.Context, dir string, res *sweep.Result) ([]string, error) {
	if err := ctx.Err(); err != nil {
		return nil, err
	}
	base := FileName(res.Name)
	stage, err := os.MkdirTemp(dir, "."+base+partialMark+"*")
	if err != nil {
		return nil, fmt.Errorf("output folder %s: %v", dir, err)
	}
	defer os.RemoveAll(stage)
	var staged []string
	for _, out := range studyOutputs {
		if err := ctx.Err(); err != nil {
			return nil, err
		}
		files, err := out(stage, base, res)
		if err != nil {
			// Name the output as it would have been, not the stage.
			return nil, fmt.Errorf("%s", strings.ReplaceAll(err.Error(), stage, dir))
		}
		staged = append(staged, files...)
	}
	if err := ctx.Err(); err != nil {
		return nil, err
	}
	var written []string
	for _, s := range staged {
		p := filepath.Join(dir, filepath.Base(s))
		if err := os.Rename(s, p); err != nil {
			return written, fmt.Errorf("writing %s: %v", p, err)
		}
		written = append(written, p)
	}
	return written, nil
}
