package files

import (
	"errors"
	"os"
	"strconv"
	"strings"
)

// ErrLocked is returned by TryLock while another process holds the lock.
var ErrLocked = errors.New("locked by another process")

// Lock is an exclusive lock held on a lock file. The operating system releases it
// when the process ends, however it ends, so a crash or a kill leaves no stale lock
// on the systems with advisory file locks (Linux, macOS, the BSDs).
type Lock struct {
	f    *os.File
	path string
}

// Holder returns the process number a lock holder wrote into the lock file at path,
// or "" when it cannot be read.
func Holder(path string) string {
	data, err := ReadRegular(path, 64)
	if err != nil {
		return ""
	}
	s := strings.TrimSpace(string(data))
	if _, err := strconv.Atoi(s); err != nil {
		return ""
	}
	return s
}

func (l *Lock) writePID() {
	if err := l.f.Truncate(0); err != nil {
		return
	}
	l.f.WriteAt([]byte(strconv.Itoa(os.Getpid())+"\n"), 0)
}
