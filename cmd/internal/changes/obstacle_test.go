package changes

import (
	"strings"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
)

// Issue 12: what an obstacle changes reaches diff: the obstacle added, changed or
// removed, and the cells whose state changes; a taller obstacle never improves one.
func TestDiffObstacle(t *testing.T) {
	src, acs, tm := fixtures(t)
	old := load(t, src)
	// The powerline past 07 rebuilt 200 ft tall.
	taller := strings.Replace(src, "height: 35 ft", "height: 200 ft", 1)
	require.NotEqual(t, src, taller)
	rep, err := Diff(acs, old, load(t, taller), tm)
	require.NoError(t, err)
	require.Len(t, rep.Ends, 1)
	assert.Equal(t, FieldChange{Designator: "07", Field: "obstacle powerline", Old: "powerline 35 ft, 400 m past the end", New: "powerline 200 ft, 400 m past the end"}, rep.Ends[0])
	require.NotEmpty(t, rep.Cells, "a 200 ft obstacle 400 m out stops some cells")
	order := map[string]int{"go": 0, "tight": 1, "no-go": 2, "no-data": 3, "beyond-limits": 4}
	for _, c := range rep.Cells {
		assert.Equal(t, "07", c.Designator)
		assert.Greater(t, order[c.New], order[c.Old], "a taller obstacle never improves a cell: %s", c)
	}
	assert.True(t, rep.Changed)

	// Removed from 15, added to 25: said as such, the cells follow.
	moved := strings.Replace(src, `        obstacles:
          - note: trees
            height: 50 ft
            past_end: 0 m        # at the far end
`, "", 1)
	moved = strings.Replace(moved, "        lda: 840 m\n", "        lda: 840 m\n        obstacles:\n          - {note: mast, height: 200 ft, past_end: 300 m, lateral: 40 m right}\n", 1)
	require.NotEqual(t, src, moved)
	rep, err = Diff(acs, old, load(t, moved), tm)
	require.NoError(t, err)
	assert.ElementsMatch(t, []FieldChange{
		{Designator: "25", Field: "obstacle", Old: "none", New: "mast 200 ft, 300 m past the end, 40 m right"},
		{Designator: "15", Field: "obstacle", Old: "trees 50 ft, 0 m past the end", New: "removed"},
	}, rep.Ends)
	ends := map[string]bool{}
	for _, c := range rep.Cells {
		ends[c.Designator] = true
		if c.Designator == "25" {
			assert.Greater(t, order[c.New], order[c.Old], "an obstacle added never improves a cell: %s", c)
		}
	}
	assert.True(t, ends["25"], "the mast stops cells of 25")
}

// A cell an obstacle stops says so in the diff (review: "tight -> no-go (804 m
// required, 840 m available)" did not say that the runway fits and the climb does
// not): the cell change carries obstacle (true) and the obstacle's reason, in text
// and JSON; a cell stopped by its distance carries neither.
func TestDiffSaysObstacle(t *testing.T) {
	src, acs, tm := fixtures(t)
	old := load(t, src)
	rep, err := Diff(acs, old, load(t, strings.Replace(src, "height: 35 ft", "height: 200 ft", 1)), tm)
	require.NoError(t, err)
	n := 0
	for _, c := range rep.Cells {
		if c.New != "no-go" || (c.Old != "go" && c.Old != "tight") {
			continue
		}
		n++
		assert.True(t, c.Obstacle, "%s", c)
		assert.Contains(t, c.ObstacleReason, "200 ft powerline at 400 m past the runway end", c.String())
		assert.Contains(t, c.String(), "; 200 ft powerline at 400 m past the runway end: ")
	}
	assert.Greater(t, n, 0, "the 200 ft powerline stops cells that fit the runway")
	var b strings.Builder
	require.NoError(t, rep.WriteJSON(&b))
	assert.Contains(t, b.String(), `"obstacle": true`)
	assert.Contains(t, b.String(), `"obstacle_reason": "200 ft powerline at 400 m past the runway end:`)

	// A shorter TORA on 25 (no obstacles there): distance only.
	short := strings.Replace(src, "        tora: 840 m\n        lda: 840 m\n", "        tora: 500 m\n        lda: 840 m\n", 1)
	require.NotEqual(t, src, short)
	rep, err = Diff(acs, old, load(t, short), tm)
	require.NoError(t, err)
	require.NotEmpty(t, rep.Cells)
	for _, c := range rep.Cells {
		assert.False(t, c.Obstacle, "%s", c)
		assert.Empty(t, c.ObstacleReason)
	}
}
