//go:build !(linux || darwin || dragonfly || freebsd || netbsd || openbsd)

package files

import (
	"errors"
	"io/fs"
	"os"
)

// TryLock creates the lock file at path exclusively and returns ErrLocked when it
// exists. Where advisory file locks are not available a lock file left by a crash
// must be removed by hand; the message naming its holder says which process made it.
func TryLock(path string) (*Lock, error) {
	f, err := os.OpenFile(path, os.O_RDWR|os.O_CREATE|os.O_EXCL, 0o644)
	if err != nil {
		if errors.Is(err, fs.ErrExist) {
			return nil, ErrLocked
		}
		return nil, err
	}
	l := &Lock{f: f, path: path}
	l.writePID()
	return l, nil
}

// Unlock removes the lock file.
func (l *Lock) Unlock() error {
	cerr := l.f.Close()
	if err := os.Remove(l.path); err != nil {
		return err
	}
	return cerr
}
