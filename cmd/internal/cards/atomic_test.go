package cards

import (
	"context"
	"os"
	"path/filepath"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
)

// The temporaries WriteAtomicCtx makes are exactly what IsTemp recognises, and
// nothing a user would name a file by chance.
func TestTemporariesRecognised(t *testing.T) {
	dir := t.TempDir()
	for i := 0; i < 20; i++ {
		f, err := os.CreateTemp(dir, ".kp-wrm_x_a5.pdf"+tempPattern)
		require.NoError(t, err)
		f.Close()
		assert.True(t, IsTemp(filepath.Base(f.Name())), f.Name())
	}
	for _, name := range []string{"card.pdf", ".notes.tmp", ".card.pdf.123456.tmp", "card.pdf.kneeprint-1.tmp", ".a.kneeprint-12x.tmp", ".kneeprint-1.tmp"} {
		assert.False(t, IsTemp(name), name)
	}
	// A cancelled write leaves nothing, and a finished one only the file.
	ctx, cancel := context.WithCancel(context.Background())
	cancel()
	require.Error(t, WriteAtomicCtx(ctx, filepath.Join(dir, "a.pdf"), []byte("x")))
	require.NoError(t, WriteAtomic(filepath.Join(dir, "b.pdf"), []byte("x")))
	entries, _ := os.ReadDir(dir)
	n := 0
	for _, e := range entries {
		if !IsTemp(e.Name()) {
			n++
			assert.Equal(t, "b.pdf", e.Name())
		}
	}
	assert.Equal(t, 1, n)
}
