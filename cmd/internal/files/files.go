// Package files opens and locks kneeprint's files safely: an input or an index is read
// only when it is a regular file (a named pipe or a device planted in its place would
// block the reader, or never end), and a batch holds an exclusive lock on its output
// folder for the whole run.
package files

import (
	"fmt"
	"io"
	"io/fs"
	"os"
)

// NotRegularError says that a path names something other than a regular file.
type NotRegularError struct {
	Path string
	Mode fs.FileMode
}

func (e *NotRegularError) Error() string {
	return fmt.Sprintf("%s is %s, not a regular file: refused", e.Path, describeMode(e.Mode))
}

func describeMode(m fs.FileMode) string {
	switch {
	case m.IsDir():
		return "a folder"
	case m&fs.ModeNamedPipe != 0:
		return "a named pipe"
	case m&fs.ModeSocket != 0:
		return "a socket"
	case m&fs.ModeDevice != 0:
		return "a device"
	case m&fs.ModeSymlink != 0:
		return "a symbolic link"
	}
	return "a special file"
}

// OpenRegular opens path for reading if it is a regular file (a symbolic link to one
// is followed) and refuses anything else with a *NotRegularError, without blocking:
// opening a named pipe for reading would otherwise wait for a writer for ever.
func OpenRegular(path string) (*os.File, error) {
	f, err := openNonBlocking(path)
	if err != nil {
		return nil, err
	}
	st, err := f.Stat()
	if err != nil {
		f.Close()
		return nil, err
	}
	if !st.Mode().IsRegular() {
		f.Close()
		return nil, &NotRegularError{Path: path, Mode: st.Mode()}
	}
	return f, nil
}

// ReadRegular reads a regular file whole, refusing anything else (see OpenRegular)
// and files longer than max bytes.
func ReadRegular(path string, max int64) ([]byte, error) {
	f, err := OpenRegular(path)
	if err != nil {
		return nil, err
	}
	defer f.Close()
	data, err := io.ReadAll(io.LimitReader(f, max+1))
	if err != nil {
		return nil, fmt.Errorf("%s: %w", path, err)
	}
	if int64(len(data)) > max {
		return nil, fmt.Errorf("%s is longer than the %d bytes accepted", path, max)
	}
	return data, nil
}
