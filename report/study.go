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

// studyOutputs writes the outputs of a study into a folder, under names
// starting with base (a FileName), and returns the paths it wrote, in the
// order they are listed: the feasibility maps (PNG, and the format asked
// for when it is another), the workbook with the PNG maps embedded, and
// the memo.
func studyOutputs(ctx context.Context, dir, base string, res *sweep.Result, format string) ([]string, error) {
	maps, err := WritePlotsContext(ctx, dir, base, res, PlotPNG)
	if err != nil {
		return nil, err
	}
	if err := ctx.Err(); err != nil {
		return nil, err
	}
	files := append([]string(nil), maps...)
	if format != PlotPNG {
		more, err := WritePlotsContext(ctx, dir, base, res, format)
		if err != nil {
			return nil, err
		}
		files = append(files, more...)
	}
	if err := ctx.Err(); err != nil {
		return nil, err
	}
	wb := filepath.Join(dir, base+".xlsx")
	if err := WriteWorkbookContext(ctx, wb, res, maps...); err != nil {
		return nil, err
	}
	if err := ctx.Err(); err != nil {
		return nil, err
	}
	memos, err := WriteMemos(filepath.Join(dir, base+".memo.md"), res, maps)
	if err != nil {
		return nil, err
	}
	return append(append([]string{wb}, memos...), files...), nil
}

// WriteStudy writes every output of a study into dir and returns the paths
// written.
//
// The outputs are first written into a hidden staging folder inside dir
// (named like a temporary file, see IsPartial) and moved into place only
// when all of them are complete and ctx is not done. On an error, or when
// ctx is cancelled (an interrupt), nothing is moved, the staging folder is
// removed, and dir is left as it was: it holds every new output of the
// study or none, and never a half-written file. A rename that fails while
// the outputs are moved into place puts the earlier outputs back (see
// moveIntoPlace).
//
// The folder holds one run's set of the study's files: the files written
// are listed in a manifest (ManifestName), and the earlier run's files
// that are not written again are removed, as is a staging folder a killed
// run left; nothing scaleplan did not write is touched.
//
// The maps are PNG; a format of svg or pdf writes those too (the first of
// formats counts; none means PNG only).
func WriteStudy(ctx context.Context, dir string, res *sweep.Result, formats ...string) ([]string, error) {
	if err := ctx.Err(); err != nil {
		return nil, err
	}
	format := PlotPNG
	if len(formats) > 0 {
		f, err := ParsePlotFormat(formats[0])
		if err != nil {
			return nil, err
		}
		format = f
	}
	base := FileName(res.Name)
	removeStale(dir, base)
	stage, err := os.MkdirTemp(dir, "."+base+partialMark+"*")
	if err != nil {
		return nil, fmt.Errorf("output folder %s: %v", dir, err)
	}
	defer os.RemoveAll(stage)
	staged, err := studyOutputs(ctx, stage, base, res, format)
	if err != nil && ctx.Err() != nil {
		return nil, ctx.Err()
	}
	if err != nil {
		// Name the output as it would have been, not the stage.
		return nil, fmt.Errorf("%s", strings.ReplaceAll(err.Error(), stage, dir))
	}
	if err := ctx.Err(); err != nil {
		return nil, err
	}
	old := readManifest(dir, base)
	aside, err := os.MkdirTemp(stage, ".aside-")
	if err != nil {
		return nil, fmt.Errorf("output folder %s: %v", dir, err)
	}
	written, err := moveIntoPlace(dir, aside, staged)
	if err != nil {
		return nil, err
	}
	if err := writeManifest(dir, base, res.Name, written); err != nil {
		return written, err
	}
	removeOld(dir, old, written)
	return written, nil
}
