package study

import (
	"fmt"
	"io"
	"os"
	"path/filepath"
)

// PartialMark is in the name of every temporary file WriteFileAtomic
// writes through before it renames it into place; nothing else carries it
// (report.IsPartial recognises such names).
const PartialMark = ".partial-"

// WriteFileAtomic writes a file through a temporary file in the same
// folder and renames it into place when complete, so an interrupted write
// never leaves a half-written file. On any error, and on a panic in write,
// the temporary file is removed and the target is left as it was. It is
// the one atomic writer of scaleplan: the study templates written here
// and every output of report go through it.
func WriteFileAtomic(path string, write func(io.Writer) error) (err error) {
	dir := filepath.Dir(path)
	tmp, err := os.CreateTemp(dir, "."+filepath.Base(path)+PartialMark+"*")
	if err != nil {
		return fmt.Errorf("writing %s: %v", path, err)
	}
	done := false
	defer func() {
		if !done { // an error, or a panic on its way up
			tmp.Close()
			os.Remove(tmp.Name())
		}
	}()
	if err = write(tmp); err != nil {
		return fmt.Errorf("writing %s: %w", path, err)
	}
	if err = tmp.Sync(); err != nil {
		return fmt.Errorf("writing %s: %v", path, err)
	}
	if err = tmp.Close(); err != nil {
		return fmt.Errorf("writing %s: %v", path, err)
	}
	// os.CreateTemp makes the file private (0600); an output is an
	// ordinary file.
	if err = os.Chmod(tmp.Name(), 0o644); err != nil {
		return fmt.Errorf("writing %s: %v", path, err)
	}
	if err = os.Rename(tmp.Name(), path); err != nil {
		return fmt.Errorf("writing %s: %v", path, err)
	}
	done = true
	return nil
}
