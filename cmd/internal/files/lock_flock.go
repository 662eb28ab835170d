//go:build linux || darwin || dragonfly || freebsd || netbsd || openbsd

package files

import (
	"errors"
	"os"
	"syscall"
)

// TryLock takes an exclusive advisory lock (flock) on the file at path, creating it,
// and returns ErrLocked at once if another process holds it. A symbolic link or
// anything but a regular file at path is refused. Unlock removes the file.
func TryLock(path string) (*Lock, error) {
	for {
		f, err := os.OpenFile(path, os.O_RDWR|os.O_CREATE|syscall.O_NOFOLLOW|syscall.O_NONBLOCK, 0o644)
		if err != nil {
			if errors.Is(err, syscall.ELOOP) {
				return nil, &NotRegularError{Path: path, Mode: os.ModeSymlink}
			}
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
		if err := syscall.Flock(int(f.Fd()), syscall.LOCK_EX|syscall.LOCK_NB); err != nil {
			f.Close()
			if errors.Is(err, syscall.EWOULDBLOCK) {
				return nil, ErrLocked
			}
			return nil, err
		}
		// The holder before us removes the file before it lets go: if path no longer
		// names the file we locked, our lock guards nothing and we start again.
		now, err := os.Lstat(path)
		if err != nil || !os.SameFile(st, now) {
			f.Close()
			continue
		}
		l := &Lock{f: f, path: path}
		l.writePID()
		return l, nil
	}
}

// Unlock removes the lock file and releases the lock.
func (l *Lock) Unlock() error {
	rmErr := os.Remove(l.path)
	if err := l.f.Close(); err != nil {
		return err
	}
	return rmErr
}
