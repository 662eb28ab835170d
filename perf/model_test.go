package perf

import (
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
)

// countingModel counts the questions a takeoff model is asked.
type countingModel struct {
	m Model
	n map[Conditions]int
}

func (c *countingModel) Takeoff(k Conditions) (Result, error) {
	c.n[k]++
	return c.m.Takeoff(k)
}

// WindFactoringIncluded passes the counted model's answer through, as Memo does.
func (c *countingModel) WindFactoringIncluded() bool { return WindFactoringIncluded(c.m) }

func (c *countingModel) total() int {
	t := 0
	for _, n := range c.n {
		t += n
	}
	return t
}

// A card file's pages through one memo (as cards.Job does): the grids are the grids
// without it, cell for cell, and the model is asked each reference question once and
// each dry question of the grass end once, though the wet page asks them again for
// every cell (wet is never shorter than dry). Questions asked once pass straight
// through. A property of the memo (common practice for a cache: the answers are the
// model's).
func TestMemoAnswersOnce(t *testing.T) {
	for _, tc := range []struct {
		name string
		m    Model
	}{{"physics", demoPhysics()}, {"table", smallTable()}} {
		t.Run(tc.name, func(t *testing.T) {
			a := testAircraft(tc.m)
			uk, _ := PolicyByID(PolicyUKAdvisory)
			f := Airfield{ElevationM: 300}
			spec := DefaultGridSpec(a)
			ends := []RunwayEnd{
				{Designator: "09", TORAM: 700, TODAM: 700, ASDAM: 700, Surface: Paved, Condition: Dry, SlopePct: 0.5},
				{Designator: "27", TORAM: 700, TODAM: 700, ASDAM: 700, Surface: Paved, Condition: Dry, SlopePct: -0.5},
				{Designator: "15", TORAM: 650, Surface: Grass, Condition: Dry, SlopePct: 1},
				{Designator: "15", TORAM: 650, Surface: Grass, Condition: Wet, SlopePct: 1},
			}
			cm := &countingModel{m: tc.m, n: map[Conditions]int{}}
			memo := Memo(cm)
			assert.Same(t, memo, Memo(memo))
			plain := &countingModel{m: tc.m, n: map[Conditions]int{}}
			for _, e := range ends {
				want, err := ComputeGrid(a, plain, uk, f, e, spec)
				require.NoError(t, err)
				got, err := ComputeGrid(a, memo, uk, f, e, spec)
				require.NoError(t, err)
				assert.Equal(t, want.Cells, got.Cells, "runway end %s %s", e.Designator, e.Condition)
			}
			for k, n := range cm.n {
				assert.Equal(t, 1, n, "asked %d times: %+v", n, k)
			}
			// The same questions, each once: without the memo the references are
			// asked by every end (the same pressure altitude) and the grass end's dry
			// questions twice.
			assert.Equal(t, len(plain.n), len(cm.n))
			again, asked := 0, 0
			for k, n := range plain.n {
				asked += n
				if n > 1 {
					again++
					assert.True(t, askedAgain(k), "%+v", k)
				}
			}
			assert.Positive(t, again)
			assert.Less(t, cm.total(), asked)
		})
	}
}

// The memo keys: the same conditions in the same bits share a key; any field
// changed does not; a surface or condition kneeprint does not know has none (such
// a question is not memoized).
func TestMemoKey(t *testing.T) {
	c := Conditions{PressureAltM: 100, TempK: 288.15, MassKg: 1000, HeadwindMS: -2, SlopePct: 1, Surface: Grass, Condition: Wet}
	k, ok := keyOf(c)
	require.True(t, ok)
	for _, change := range []func(*Conditions){
		func(c *Conditions) { c.PressureAltM++ },
		func(c *Conditions) { c.TempK++ },
		func(c *Conditions) { c.MassKg++ },
		func(c *Conditions) { c.HeadwindMS++ },
		func(c *Conditions) { c.SlopePct++ },
		func(c *Conditions) { c.Surface = Gravel },
		func(c *Conditions) { c.Condition = Dry },
	} {
		d := c
		change(&d)
		kd, ok := keyOf(d)
		require.True(t, ok)
		assert.NotEqual(t, k, kd)
	}
	same := c
	k2, _ := keyOf(same)
	assert.Equal(t, k, k2)
	c.Surface = "ice"
	_, ok = keyOf(c)
	assert.False(t, ok)
}
