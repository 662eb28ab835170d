//go:build unix

package files

import (
	"os"
	"syscall"
)

// openNonBlocking opens path read-only with O_NONBLOCK, which makes opening a named
// pipe return at once; reads of a regular file are not affected by the flag.
func openNonBlocking(path string) (*os.File, error) {
	return os.OpenFile(path, os.O_RDONLY|syscall.O_NONBLOCK, 0)
}
