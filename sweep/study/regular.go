package study

import (
	"fmt"
	"io"
	"io/fs"
	"os"
	"syscall"
)

// notRegular explains why a file that is not a regular file is not read
// (a device such as /dev/zero would be read for ever, a named pipe would
// wait for a writer), or returns "" for a regular file.
func notRegular(m fs.FileMode) string {
	switch {
	case m.IsRegular():
		return ""
	case m&fs.ModeNamedPipe != 0:
		return "a named pipe"
	case m&fs.ModeSocket != 0:
		return "a socket"
	case m&fs.ModeDevice != 0:
		return "a device"
	case m.IsDir():
		return "a folder"
	}
	return "not a regular file"
}

// readRegular reads a whole regular file of at most limit bytes. It opens
// the file without waiting (a named pipe put in its place after a check
// does not block the open) and checks what it opened before reading.
func readRegular(p string, limit int64) ([]byte, error) {
	f, err := os.OpenFile(p, os.O_RDONLY|syscall.O_NONBLOCK, 0)
	if err != nil {
		return nil, err
	}
	defer f.Close()
	fi, err := f.Stat()
	if err != nil {
		return nil, err
	}
	if what := notRegular(fi.Mode()); what != "" {
		return nil, fmt.Errorf("it is %s, not a file: give the workbook itself", what)
	}
	if fi.Size() > limit {
		return nil, errTooLarge
	}
	b, err := io.ReadAll(io.LimitReader(f, limit+1))
	if err != nil {
		return nil, err
	}
	if int64(len(b)) > limit {
		return nil, errTooLarge
	}
	return b, nil
}

var errTooLarge = fmt.Errorf("too large")
