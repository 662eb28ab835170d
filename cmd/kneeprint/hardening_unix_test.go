//go:build unix

package main

import (
	"bytes"
	"os"
	"path/filepath"
	"strconv"
	"syscall"
	"testing"
	"time"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
)

// holdLock holds the advisory lock at path as another batch would, and returns
// the function that lets it go.
func holdLock(t *testing.T, path string) func() {
	t.Helper()
	f, err := os.OpenFile(path, os.O_RDWR|os.O_CREATE, 0o644)
	require.NoError(t, err)
	require.NoError(t, syscall.Flock(int(f.Fd()), syscall.LOCK_EX|syscall.LOCK_NB))
	_, err = f.WriteString(strconv.Itoa(os.Getpid()))
	require.NoError(t, err)
	return func() {
		os.Remove(path)
		f.Close()
	}
}

// within runs f and fails the test if it has not returned after d (it is then left
// running: the point is that it blocked).
func within(t *testing.T, d time.Duration, what string, f func()) {
	t.Helper()
	done := make(chan struct{})
	go func() { f(); close(done) }()
	select {
	case <-done:
	case <-time.After(d):
		t.Fatalf("%s: still blocked after %s", what, d)
	}
}

// Issue 14 item 9: a named pipe planted as the index, an input or a card file is
// refused at once, with its name; the other cards are still made.
func TestNamedPipesRefused(t *testing.T) {
	dir, plan := demoFolder(t)
	out := filepath.Join(dir, "cards")
	require.NoError(t, os.MkdirAll(out, 0o755))
	require.NoError(t, syscall.Mkfifo(filepath.Join(out, "kneeprint-index.jsonl"), 0o644))
	require.NoError(t, syscall.Mkfifo(filepath.Join(out, "kneeprint-index.json"), 0o644))
	var code int
	var stdout, stderr string
	within(t, 30*time.Second, "cards with a named pipe as its index", func() { code, stdout, stderr = runCLI(t, "cards", "--plan", plan) })
	assert.Equal(t, exitFailure, code)
	assert.Contains(t, stdout, "kneeprint-index.jsonl is a named pipe, not a regular file", stderr)
	within(t, 30*time.Second, "stale with a named pipe as its index", func() { code, stdout, stderr = runCLI(t, "stale", out) })
	assert.Equal(t, exitFailure, code)
	assert.Contains(t, stderr, "is a named pipe, not a regular file")

	// A pipe as an input: that file is refused, the others made.
	dir2, _ := demoFolder(t)
	require.NoError(t, syscall.Mkfifo(filepath.Join(dir2, "pipe.yaml"), 0o644))
	plan2 := writePlan(t, dir2, "p.yaml", []string{"sedgefin-sf2.yaml", "pipe.yaml"}, []string{"wrenmoor.yaml"}, []string{"a5"}, "out")
	within(t, 30*time.Second, "cards with a named pipe as an input", func() { code, stdout, stderr = runCLI(t, "cards", "--plan", plan2) })
	assert.Equal(t, exitFailure, code)
	assert.Contains(t, stdout, "pipe.yaml is a named pipe, not a regular file")
	assert.Equal(t, 1, claimedFiles(t, stdout))
	within(t, 30*time.Second, "validate a named pipe", func() { code, stdout, stderr = runCLI(t, "validate", filepath.Join(dir2, "pipe.yaml")) })
	assert.Equal(t, exitFailure, code)

	// A pipe in place of a card file: stale says so rather than hang.
	cardsDir := filepath.Join(dir2, "out")
	pdfs := pdfsIn(t, cardsDir)
	require.Len(t, pdfs, 1)
	require.NoError(t, os.Remove(filepath.Join(cardsDir, pdfs[0])))
	require.NoError(t, syscall.Mkfifo(filepath.Join(cardsDir, pdfs[0]), 0o644))
	within(t, 30*time.Second, "stale with a named pipe as a card", func() { code, stdout, stderr = runCLI(t, "stale", cardsDir) })
	assert.Equal(t, exitFailure, code)
	assert.Contains(t, stdout, "is a named pipe, not a regular file")
}

// Issue 14 item 9: SIGTERM stops a batch even while it is blocked. Here the batch is
// blocked writing its progress to a stream nobody reads; the command gives it
// stopGrace to stop, then returns, leaving it behind.
func TestSignalStopsABlockedBatch(t *testing.T) {
	dir, plan := demoFolder(t)
	stuck := &blockingWriter{reached: make(chan struct{}), release: make(chan struct{})}
	t.Cleanup(func() {
		// Unblock the abandoned run and let it finish (its lock file goes last)
		// before the folder is removed.
		close(stuck.release)
		lock := filepath.Join(dir, "cards", ".kneeprint-lock")
		for i := 0; i < 300; i++ {
			if _, err := os.Lstat(lock); os.IsNotExist(err) {
				return
			}
			time.Sleep(100 * time.Millisecond)
		}
	})
	var out bytes.Buffer
	e := env{stdout: &out, stderr: stuck, now: time.Now}
	errc := make(chan error, 1)
	go func() { errc <- cardsRun(e, &cardsOptions{plan: plan, template: "a5"}) }()
	select {
	case <-stuck.reached:
	case <-time.After(30 * time.Second):
		t.Fatal("the batch never wrote its progress")
	}
	require.NoError(t, syscall.Kill(os.Getpid(), syscall.SIGTERM)) // caught by the command while it runs
	select {
	case err := <-errc:
		require.Error(t, err)
		assert.Contains(t, err.Error(), "interrupted")
	case <-time.After(stopGrace + 10*time.Second):
		t.Fatal("SIGTERM did not stop a blocked batch")
	}
}

// blockingWriter blocks every write until released, like a terminal nobody reads.
type blockingWriter struct {
	reached, release chan struct{}
	once             bool
}

func (w *blockingWriter) Write(p []byte) (int, error) {
	if !w.once {
		w.once = true
		close(w.reached)
	}
	<-w.release
	return len(p), nil
}
