package batch

import (
	"os"
	"path/filepath"
	"strings"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
)

// Issue 12: a runway end's hash covers its obstacles, so a changed obstacle makes
// exactly that end's cards stale, saying what changed; the aircraft's climb data
// count as the rest of its profile.
func TestStaleObstacle(t *testing.T) {
	dir := demoDir(t)
	run(t, dir, demoPlan(dir))
	out := filepath.Join(dir, "cards")
	path := filepath.Join(dir, "wrenmoor.yaml")
	data, _ := os.ReadFile(path)
	edited := strings.Replace(string(data), "past_end: 400 m", "past_end: 250 m", 1) // the powerline past 07
	require.NotEqual(t, string(data), edited)
	require.NoError(t, os.WriteFile(path, []byte(edited), 0o644))
	rep, err := Stale(out, nil, "", "test", planDate)
	require.NoError(t, err)
	require.Len(t, rep.Stale, 4, "2 aircraft x runway 07, dry and wet")
	for _, s := range rep.Stale {
		assert.Equal(t, "07", s.Designator)
		require.Len(t, s.Reasons, 1)
		assert.Contains(t, s.Reasons[0], "obstacle powerline powerline 35 ft, 400 m past the end -> powerline 35 ft, 250 m past the end")
	}
	require.NoError(t, os.WriteFile(path, data, 0o644))

	ap := filepath.Join(dir, "sedgefin-sf2.yaml")
	adata, _ := os.ReadFile(ap)
	require.NoError(t, os.WriteFile(ap, []byte(strings.Replace(string(adata), "speed: 65 kt", "speed: 68 kt", 1)), 0o644))
	rep, err = Stale(out, nil, "", "test", planDate)
	require.NoError(t, err)
	assert.NotEmpty(t, rep.Stale)
	for _, s := range rep.Stale {
		assert.Contains(t, s.File, "sedgefin")
		assert.Contains(t, strings.Join(s.Reasons, ";"), "aircraft profile")
	}
}
