package report

import (
	"fmt"
	"io"
	"os"
	"path/filepath"
)

// WriteFileAtomic writes a file through a temporary file in the same
// folder and renames it into place when complete, so an interrupted run
// never leaves a half-written output.
func WriteFileAtomic(path string, write func(io.Writer) error) (err error) {
	dir := filepath.Dir(path)
	tmp, err := os.CreateTemp(dir, "."+filepath.Base(path)+".partial-*")
	if err != nil {
		return fmt.Errorf("writing %s: %v", path, err)
	}
	defer func() {
		if err != nil {
			tmp.Close()
			os.Remove(tmp.Name())
		}
	}()
	if err = write(tmp); err != nil {
		return fmt.Errorf("writing %s: %v", path, err)
	}
	if err = tmp.Close(); err != nil {
		return fmt.Errorf("writing %s: %v", path, err)
	}
	if err = os.Rename(tmp.Name(), path); err != nil {
		return fmt.Errorf("writing %s: %v", path, err)
	}
	return nil
}
