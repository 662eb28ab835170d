package inputs

import (
	"fmt"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"

	"kneeprint/perf"
)

// Issue 12 over the whole demo, both policies: an obstacle never improves a cell (a
// grid of each end with its obstacles against the same end without them), the
// required distance and the unfactored figures do not move, and a cell the obstacle
// alone stops carries the obstacle mark; a higher margin never improves a cell.
func TestDemoObstaclesNeverImprove(t *testing.T) {
	stopped := 0
	for _, dc := range demoCases(t) {
		for _, e := range dc.f.Ends() {
			if len(e.Obstacles) == 0 {
				continue
			}
			bare := e
			bare.Obstacles = nil
			spec := perf.DefaultGridSpec(dc.a)
			with, err := perf.ComputeGrid(dc.a, dc.m, dc.policy, *dc.f, e, spec)
			require.NoError(t, err)
			without, err := perf.ComputeGrid(dc.a, dc.m, dc.policy, *dc.f, bare, spec)
			require.NoError(t, err)
			spec.ObstacleMarginM = 100 * 0.3048
			wider, err := perf.ComputeGrid(dc.a, dc.m, dc.policy, *dc.f, e, spec)
			require.NoError(t, err)
			for wi := range with.Cells {
				for hi := range with.Cells[wi] {
					for ti, c := range with.Cells[wi][hi] {
						b, w := without.Cells[wi][hi][ti], wider.Cells[wi][hi][ti]
						at := fmt.Sprintf("%s %s cell %d/%d/%d", dc.name, e.Designator, wi, hi, ti)
						assert.GreaterOrEqual(t, c.State, b.State, "obstacles never improve a cell: "+at)
						assert.GreaterOrEqual(t, w.State, c.State, "a wider margin never improves a cell: "+at)
						assert.Equal(t, b.RequiredM, c.RequiredM, at)
						assert.Equal(t, b.To50ftM, c.To50ftM, at)
						if c.ObstacleNoGo {
							stopped++
							assert.Equal(t, perf.NoGo, c.State, at)
							assert.Contains(t, []perf.State{perf.Go, perf.Tight}, b.State, "the mark is for a cell the distance alone lets go: "+at)
						}
					}
				}
			}
		}
	}
	assert.Positive(t, stopped, "the demo shows the effect somewhere")
}
