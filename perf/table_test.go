package perf

import (
	"fmt"
	"math"
	"strings"
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

// The table model never stretches a headwind note past what it covers (review: a
// 99 kt report gave GO at half the calm distance):
//   - a headwind note's up_to bounds it, as the tailwind note's does: beyond, no data;
//   - with the manual's rotation speed, a credited wind beyond MaxWindFraction (half)
//     of the lift-off true airspeed has no data, as in the physics model (common
//     practice: flight-manual wind notes stop far below it);
//   - with neither, the credit stays floored at half the distance and the note says
//     what was assumed.
//
// The small table credits 6 % per 5 kt (1.2 % per kt); its data include the wind
// factoring, so the credited wind is the reported one. Lift-off 55 kt IAS at sea
// level ISA is 55 kt true (sigma 1, ICAO Doc 7488): half of it is 27.5 kt.
func TestTableHeadwindBounds(t *testing.T) {
	at := func(m *TableModel, windKt float64) (Result, error) {
		return m.Takeoff(Conditions{PressureAltM: 0, TempK: ISASeaLevelTempK, MassKg: 900, HeadwindMS: windKt * knot, Surface: Paved, Condition: Dry})
	}
	calm, err := at(smallTable(), 0)
	require.NoError(t, err)

	upTo := smallTable()
	upTo.Table.Corrections.HeadwindMaxMS = 20 * knot
	r, err := at(upTo, 20)
	require.NoError(t, err)
	assert.InDelta(t, calm.To50ftM*(1-0.24), r.To50ftM, 1e-9, "20 kt: 4 x 6 % = 24 % off")
	_, err = at(upTo, 20.5)
	require.ErrorIs(t, err, ErrNoData)
	assert.Contains(t, err.Error(), "headwind 20.5 kt beyond the manual's correction (up to 20 kt)")

	rot := smallTable()
	rot.LiftoffIASMS = 55 * knot
	_, err = at(rot, 27.4)
	require.NoError(t, err)
	for _, w := range []float64{27.6, 40, 99, -27.6} {
		_, err = at(rot, w)
		require.ErrorIs(t, err, ErrNoData, "%g kt", w)
		assert.Contains(t, err.Error(), "beyond half the lift-off speed (27 kt true)", "%g kt", w)
	}
	// Hot and high the lift-off true airspeed is higher, and so is the bound: 5000 ft
	// ISA, sigma 0.8617 (ICAO Doc 7488): 55 / sqrt(0.8617) = 59.2 kt, half 29.6 kt.
	rt := smallTable()
	rt.LiftoffIASMS = 55 * knot
	rt.Table.PressureAltM = []float64{0, 2000} // the same figures, up to 2000 m
	bound := 55 / math.Sqrt(0.8617) / 2
	hot := Conditions{PressureAltM: 5000 * footM, TempK: ISATempK(5000 * footM), MassKg: 900, Surface: Paved, Condition: Dry}
	hot.HeadwindMS = (bound - 0.05) * knot
	_, err = rt.Takeoff(hot)
	assert.NoError(t, err)
	hot.HeadwindMS = (bound + 0.05) * knot
	_, err = rt.Takeoff(hot)
	assert.ErrorIs(t, err, ErrNoData)

	// Neither bound: the floor, said in words.
	r, err = at(smallTable(), 99)
	require.NoError(t, err)
	assert.InDelta(t, calm.To50ftM*0.5, r.To50ftM, 1e-9)
	assert.Contains(t, strings.Join(r.Notes, "\n"), "headwind credit limited to half the distance: the manual's headwind note gives no upper wind (up_to) and the profile no rotation speed")
}

// The landing table is bounded the same way: by its headwind note's up_to, and, with
// the manual's approach speed, by half the touchdown speed (1.15/1.3 of the approach
// speed, Anderson, Aircraft Performance and Design, sec. 6.8), as the physics landing
// model. Approach 58 kt at sea level ISA: touchdown 51.3 kt, half 25.7 kt.
func TestLandingTableHeadwindBounds(t *testing.T) {
	m := &LandingTableModel{Table: landingTable(), ApproachIASMS: 58 * knot}
	at := func(windKt float64) error {
		_, err := m.Land(Conditions{PressureAltM: 0, TempK: ISASeaLevelTempK, MassKg: 1000, HeadwindMS: windKt * knot, Surface: Paved, Condition: Dry})
		return err
	}
	assert.NoError(t, at(25.6))
	err := at(25.8)
	require.ErrorIs(t, err, ErrNoData)
	assert.Contains(t, err.Error(), "beyond half the touchdown speed")
	m.Table.Corrections.HeadwindMaxMS = 15 * knot
	assert.NoError(t, at(15))
	assert.ErrorIs(t, at(15.5), ErrNoData)
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
