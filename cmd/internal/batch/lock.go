package batch

import (
	"context"
	"errors"
	"fmt"
	"path/filepath"
	"time"

	"kneeprint/cmd/internal/files"
)

// LockName is the lock file a batch holds in its output folder for the whole run.
const LockName = ".kneeprint-lock"

// lockPoll is how often a waiting batch tries the lock again.
const lockPoll = 200 * time.Millisecond

// lockFolder takes the output folder's lock, waiting while another batch holds it:
// waiting, when not nil, hears once that this batch waits and for whom. Cancelling
// ctx gives up the wait.
func lockFolder(ctx context.Context, dir string, waiting func(string)) (*files.Lock, error) {
	path := filepath.Join(dir, LockName)
	told := false
	for {
		l, err := files.TryLock(path)
		if err == nil {
			return l, nil
		}
		if !errors.Is(err, files.ErrLocked) {
			return nil, fmt.Errorf("cannot lock the output folder: %w", err)
		}
		if !told && waiting != nil {
			who := "another kneeprint batch"
			if pid := files.Holder(path); pid != "" {
				who += " (process " + pid + ")"
			}
			waiting(fmt.Sprintf("waiting: %s is writing into %s; this batch starts when it ends (Ctrl-C to give up)", who, dir))
			told = true
		}
		select {
		case <-ctx.Done():
			return nil, fmt.Errorf("interrupted while waiting for the batch writing into %s: nothing written", dir)
		case <-time.After(lockPoll):
		}
	}
}
