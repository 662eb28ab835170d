//go:build unix

package files

import (
	"path/filepath"
	"syscall"
	"testing"
	"time"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
)

// A named pipe planted as an input or an index is refused at once: opening it for
// reading would wait for a writer for ever.
func TestOpenRegularRefusesNamedPipe(t *testing.T) {
	dir := t.TempDir()
	var nr *NotRegularError
	fifo := filepath.Join(dir, "pipe.yaml")
	if err := syscall.Mkfifo(fifo, 0o644); err != nil {
		t.Skipf("no named pipes here: %v", err)
	}
	done := make(chan error, 1)
	go func() { _, err := ReadRegular(fifo, 100); done <- err }()
	select {
	case err := <-done:
		require.ErrorAs(t, err, &nr)
		assert.Contains(t, err.Error(), "is a named pipe, not a regular file")
	case <-time.After(10 * time.Second):
		t.Fatal("opening a named pipe blocked")
	}
}
