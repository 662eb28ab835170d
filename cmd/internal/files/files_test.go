package files

import (
	"errors"
	"os"
	"os/exec"
	"path/filepath"
	"runtime"
	"strconv"
	"testing"
	"time"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
)

// A named pipe, a folder or a device in place of an input is refused at once; a
// regular file, or a link to one, is read.
func TestOpenRegular(t *testing.T) {
	dir := t.TempDir()
	reg := filepath.Join(dir, "a.yaml")
	require.NoError(t, os.WriteFile(reg, []byte("kind: airfield\n"), 0o644))
	link := filepath.Join(dir, "link.yaml")
	require.NoError(t, os.Symlink(reg, link))
	for _, p := range []string{reg, link} {
		data, err := ReadRegular(p, 100)
		require.NoError(t, err)
		assert.Equal(t, "kind: airfield\n", string(data))
	}
	_, err := ReadRegular(reg, 5)
	assert.ErrorContains(t, err, "longer than the 5 bytes accepted")

	var nr *NotRegularError
	_, err = OpenRegular(dir)
	require.ErrorAs(t, err, &nr)
	assert.EqualError(t, err, dir+" is a folder, not a regular file: refused")
	if runtime.GOOS != "windows" {
		_, err = OpenRegular("/dev/null")
		require.ErrorAs(t, err, &nr)
		assert.Contains(t, err.Error(), "is a device")
	}

}

func TestLockExclusive(t *testing.T) {
	path := filepath.Join(t.TempDir(), ".kneeprint-lock")
	l, err := TryLock(path)
	require.NoError(t, err)
	assert.Equal(t, itoa(os.Getpid()), Holder(path))
	_, err = TryLock(path)
	assert.ErrorIs(t, err, ErrLocked, "a second holder is refused while the first holds it")
	require.NoError(t, l.Unlock())
	_, err = os.Stat(path)
	assert.True(t, errors.Is(err, os.ErrNotExist), "the lock file is removed on unlock")
	l2, err := TryLock(path)
	require.NoError(t, err)
	require.NoError(t, l2.Unlock())
}

// A symbolic link planted as the lock file is not followed.
func TestLockRefusesSymlink(t *testing.T) {
	dir := t.TempDir()
	target := filepath.Join(dir, "elsewhere")
	require.NoError(t, os.WriteFile(target, []byte("keep me"), 0o644))
	path := filepath.Join(dir, ".kneeprint-lock")
	require.NoError(t, os.Symlink(target, path))
	_, err := TryLock(path)
	var nr *NotRegularError
	require.ErrorAs(t, err, &nr)
	data, _ := os.ReadFile(target)
	assert.Equal(t, "keep me", string(data))
}

// A process killed while holding the lock leaves no stale lock: the system releases
// it, and the next run takes it at once.
func TestLockReleasedWhenHolderIsKilled(t *testing.T) {
	if runtime.GOOS == "windows" {
		t.Skip("advisory locks only")
	}
	path := filepath.Join(t.TempDir(), ".kneeprint-lock")
	cmd := exec.Command(os.Args[0], "-test.run=^TestHelperHoldLock$")
	cmd.Env = append(os.Environ(), "KNEEPRINT_HOLD_LOCK="+path)
	out, err := cmd.StdoutPipe()
	require.NoError(t, err)
	require.NoError(t, cmd.Start())
	buf := make([]byte, 4)
	_, err = out.Read(buf) // the helper says "held" once it holds the lock
	require.NoError(t, err)
	_, err = TryLock(path)
	require.ErrorIs(t, err, ErrLocked)
	assert.Equal(t, itoa(cmd.Process.Pid), Holder(path))
	require.NoError(t, cmd.Process.Kill()) // SIGKILL: no clean-up runs
	_ = cmd.Wait()
	l, err := TryLock(path)
	require.NoError(t, err, "the lock of a killed process is free")
	require.NoError(t, l.Unlock())
}

// TestHelperHoldLock is the process TestLockReleasedWhenHolderIsKilled kills.
func TestHelperHoldLock(t *testing.T) {
	path := os.Getenv("KNEEPRINT_HOLD_LOCK")
	if path == "" {
		t.Skip("helper process only")
	}
	if _, err := TryLock(path); err != nil {
		t.Fatal(err)
	}
	os.Stdout.WriteString("held")
	time.Sleep(time.Minute)
}

func itoa(n int) string { return strconv.Itoa(n) }
