package report

import (
	"io"
	"strings"

	"scaleplan/sweep/study"
)

// partialMark is in the name of every temporary file an output is written
// to before it is renamed into place, and of the staging folders of
// WriteStudy; nothing else carries it.
const partialMark = study.PartialMark

// IsPartial reports whether a file name is one of the temporary files
// WriteFileAtomic writes through (a leftover of a run that was killed).
func IsPartial(name string) bool {
	return strings.HasPrefix(name, ".") && strings.Contains(name, partialMark)
}

// WriteFileAtomic writes a file through a temporary file in the same
// folder and renames it into place when complete (study.WriteFileAtomic,
// the one atomic writer): an interrupted run never leaves a half-written
// output. On any error, and on a panic in write, the temporary file is
// removed and the target is left as it was.
func WriteFileAtomic(path string, write func(io.Writer) error) error {
	return study.WriteFileAtomic(path, write)
}
