package perf

import (
	"fmt"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
)

// smallTable is a two-by-two-by-two table, values chosen so interpolation is easy to
// check by hand (test data, not an aircraft). The expected values in these tests are
// arithmetic on this table and its notes: multilinear interpolation and the note
// forms "x % per y kt" and "add x % of the ground roll" (from memory, the usual
// flight-manual wording; domain notes sec. 4).
func smallTable() *TableModel {
	return &TableModel{Table: &Table{
		PressureAltM: []float64{0, 1000},
		TempK:        []float64{273.15, 303.15},
		WeightKg:     []float64{900, 1100},
		GroundRollM:  [][][]float64{{{200, 260}, {240, 300}}, {{300, 360}, {340, 400}}},
		To50ftM:      [][][]float64{{{400, 520}, {480, 600}}, {{600, 720}, {680, 800}}},
		WindInData:   true,
		Corrections: Corrections{
			HeadwindPct: 6, HeadwindPerMS: 5 * knot,
			TailwindPct: 4, TailwindPerMS: 1 * knot, TailwindMaxMS: 10 * knot,
			GrassPctOfGroundRoll: 18,
		},
	}}
}

func TestTableInterpolation(t *testing.T) {
	m := smallTable()
	cases := []struct {
		name      string
		pa, tk, w float64
		wantGR    float64
	}{
		{"node", 0, 273.15, 900, 200},
		{"node far corner", 1000, 303.15, 1100, 400},
		{"mid temperature", 0, 288.15, 900, 230},
		{"mid altitude", 500, 273.15, 900, 220},
		{"centre: mean of the eight corners", 500, 288.15, 1000, 300},
		{"quarter weight", 0, 273.15, 950, 225},
	}
	for _, tc := range cases {
		t.Run(tc.name, func(t *testing.T) {
			r, err := m.Takeoff(Conditions{PressureAltM: tc.pa, TempK: tc.tk, MassKg: tc.w, Surface: Paved, Condition: Dry})
			require.NoError(t, err)
			assert.InDelta(t, tc.wantGR, r.GroundRollM, 1e-9, "got %v, want %v", r.GroundRollM, tc.wantGR)
			assert.InDelta(t, 2*tc.wantGR, r.To50ftM, 1e-9)
		})
	}
}

func TestTableNeverExtrapolates(t *testing.T) {
	m := smallTable()
	for _, c := range []Conditions{
		{PressureAltM: 1001, TempK: 280, MassKg: 1000},
		{PressureAltM: 500, TempK: 304, MassKg: 1000},
		{PressureAltM: 500, TempK: 280, MassKg: 1101},
		{PressureAltM: 500, TempK: 280, MassKg: 1000, HeadwindMS: -11 * knot},
	} {
		_, err := m.Takeoff(c)
		assert.ErrorIs(t, err, ErrNoData, "%+v", c)
	}
	// Below the lowest value of an axis the lowest column is used: conservative,
	// never shorter than the table's own figure for that column.
	r, err := m.Takeoff(Conditions{PressureAltM: -200, TempK: 263.15, MassKg: 800, Surface: Paved, Condition: Dry})
	require.NoError(t, err)
	assert.Equal(t, 200.0, r.GroundRollM)
	assert.Len(t, r.Notes, 3)
	// Issue 14.2: below the lightest block the note says what was done and does not
	// call it conservative for the pilot's real weight.
	assert.Equal(t, "weight 800 kg is below the table's lightest block: the 900 kg figures are used", r.Notes[0])
}

func TestTableCorrections(t *testing.T) {
	m := smallTable()
	base := Conditions{TempK: 273.15, MassKg: 900, Surface: Paved, Condition: Dry}
	// The test table's invented note "decrease 6 % per 5 kt headwind": 5 kt -> x0.94.
	c := base
	c.HeadwindMS = 5 * knot
	r, _ := m.Takeoff(c)
	assert.InDelta(t, 188, r.GroundRollM, 1e-9)
	assert.InDelta(t, 376, r.To50ftM, 1e-9)
	// "Increase 4 % per 1 kt tailwind": 10 kt -> x1.4.
	c.HeadwindMS = -10 * knot
	r, _ = m.Takeoff(c)
	assert.InDelta(t, 280, r.GroundRollM, 1e-9)
	// Grass: add 18 % of the ground roll to both distances.
	c = base
	c.Surface = Grass
	r, _ = m.Takeoff(c)
	assert.InDelta(t, 236, r.GroundRollM, 1e-9)
	assert.InDelta(t, 436, r.To50ftM, 1e-9)
	assert.True(t, r.Covers.Surface)
	// Wet grass with no wet note: not covered, the policy must factor it.
	c.Condition = Wet
	r, _ = m.Takeoff(c)
	assert.False(t, r.Covers.Surface)
	assert.Equal(t, 200.0, r.GroundRollM)
}

func TestTableAccelerateCheck(t *testing.T) {
	m := smallTable()
	r, _ := m.Takeoff(Conditions{TempK: 273.15, MassKg: 900, Surface: Paved, Condition: Dry})
	assert.InDelta(t, 0.49*200, r.AccelCheckM, 1e-9, "still air, constant acceleration: 0.49 of the ground roll")
	m.LiftoffIASMS = 55 * knot
	r, _ = m.Takeoff(Conditions{TempK: 273.15, MassKg: 900, HeadwindMS: 10 * knot, Surface: Paved, Condition: Dry})
	assert.Less(t, r.AccelCheckM, 0.49*r.GroundRollM, "a headwind gives part of the airspeed at rest")
	r2, _ := m.Takeoff(Conditions{TempK: 273.15, MassKg: 900, HeadwindMS: -10 * knot, Surface: Paved, Condition: Dry})
	assert.Greater(t, r2.AccelCheckM, 0.49*r2.GroundRollM)
}

// The grass note reads as fmt writes it, for whole, fractional, tiny and huge
// percentages (the %g verb is strconv's shortest 'g' form: Go fmt documentation).
func TestGrassNote(t *testing.T) {
	for _, c := range []Condition{Dry, Wet} {
		for _, pct := range []float64{18, 12.5, 0.1, 1e-7, 33.333333333333336, 1e21, 100} {
			assert.Equal(t, fmt.Sprintf("manual's %s grass note: +%g %% of ground roll", c, pct), grassNote(c, pct))
		}
	}
}
