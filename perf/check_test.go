package perf

import (
	"math"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
)

func checkField() Airfield {
	return Airfield{Ident: "T", ElevationM: 300, Runways: []Runway{{Surface: Paved, Condition: Dry, Ends: []RunwayEnd{
		{Designator: "09", HeadingDeg: 90, TORAM: 900, TODAM: 900, ASDAM: 900, ElevationM: 295, Surface: Paved, Condition: Dry},
		{Designator: "27", HeadingDeg: 270, TORAM: 900, TODAM: 900, ASDAM: 900, ElevationM: 320, Surface: Paved, Condition: Dry},
	}}}}
}

// Issue 14.2 and 14.5: a question with an impossible weight or temperature is refused,
// never answered; no NaN or infinity is ever computed.
func TestAskRefusesImpossibleQuestions(t *testing.T) {
	m := smallTable()
	a := testAircraft(m)
	a.MinMassKg = 700
	uk, _ := PolicyByID(PolicyUKAdvisory)
	good := Question{QNHPa: 101325, TempK: 288.15, MassKg: 900, TightMargin: 0.1}
	_, err := Ask(a, m, uk, checkField(), good)
	require.NoError(t, err)
	for name, q := range map[string]Question{
		"100 kg, a dropped zero":   {QNHPa: 101325, TempK: 288.15, MassKg: 100},
		"zero mass":                {QNHPa: 101325, TempK: 288.15, MassKg: 0},
		"negative mass":            {QNHPa: 101325, TempK: 288.15, MassKg: -1000},
		"-300 C":                   {QNHPa: 101325, TempK: -300 + 273.15, MassKg: 900},
		"1e308 C":                  {QNHPa: 101325, TempK: 1e308, MassKg: 900},
		"NaN temperature":          {QNHPa: 101325, TempK: math.NaN(), MassKg: 900},
		"QNH 10 hPa":               {QNHPa: 1000, TempK: 288.15, MassKg: 900},
		"infinite wind":            {QNHPa: 101325, TempK: 288.15, MassKg: 900, Wind: Wind{FromDeg: 90, SpeedMS: math.Inf(1)}},
		"NaN weight":               {QNHPa: 101325, TempK: 288.15, MassKg: math.NaN()},
		"gust below steady speed":  {QNHPa: 101325, TempK: 288.15, MassKg: 900, Wind: Wind{FromDeg: 90, SpeedMS: 10, GustMS: -5}},
		"1e308 kg":                 {QNHPa: 101325, TempK: 288.15, MassKg: 1e308},
		"11000 kg, an extra digit": {QNHPa: 101325, TempK: 288.15, MassKg: 11000},
	} {
		_, err := Ask(a, m, uk, checkField(), q)
		assert.Error(t, err, name)
	}
	_, err = Ask(a, m, uk, checkField(), Question{QNHPa: 101325, TempK: 288.15, MassKg: 100})
	assert.ErrorContains(t, err, "below the lowest flyable mass 700 kg")
	// The MTOW is 1100 kg: up to 1650 kg is answered (beyond limits), past it refused
	// with the range; a huge figure is printed short.
	_, err = Ask(a, m, uk, checkField(), Question{QNHPa: 101325, TempK: 288.15, MassKg: 1650})
	assert.NoError(t, err)
	_, err = Ask(a, m, uk, checkField(), Question{QNHPa: 101325, TempK: 288.15, MassKg: 1e308})
	assert.ErrorContains(t, err, "weight 1e+308 kg is no loading of \"test\"")
	assert.ErrorContains(t, err, "accepted: 700 to 1650 kg")
}

// Issue 9.7: each runway end answers at its own elevation, the highest of the
// aerodrome elevation and its runway's thresholds.
func TestAskElevationPerEnd(t *testing.T) {
	m := smallTable()
	a := testAircraft(m)
	uk, _ := PolicyByID(PolicyUKAdvisory)
	ans, err := Ask(a, m, uk, checkField(), Question{QNHPa: ISASeaLevelPressurePa, TempK: 288.15, MassKg: 900, TightMargin: 0.1})
	require.NoError(t, err)
	require.Len(t, ans.Ends, 2)
	for _, e := range ans.Ends {
		assert.InDelta(t, 320, e.ElevationM, 1e-9, e.End.Designator)
		// QNH 1013.25 hPa: pressure altitude = elevation (ISA, ICAO Doc 7488).
		assert.InDelta(t, 320, e.PressureAltM, 1e-6)
		assert.Greater(t, e.DensityAltM, e.PressureAltM, "15 C is warmer than ISA at 320 m")
	}
	assert.InDelta(t, 300, ans.ElevationM, 1e-9, "the aerodrome's own elevation is still reported")
}

// A grid refuses weights below the lowest flyable mass and temperatures outside the
// plausible range (issue 14.2, 14.5).
func TestComputeGridRefusesImpossibleAxes(t *testing.T) {
	m := smallTable()
	a := testAircraft(m)
	a.MinMassKg = 700
	uk, _ := PolicyByID(PolicyUKAdvisory)
	f := checkField()
	spec := DefaultGridSpec(a)
	spec.WeightsKg = []float64{900, 100}
	_, err := ComputeGrid(a, m, uk, f, f.Runways[0].Ends[0], spec)
	assert.ErrorContains(t, err, "lowest flyable mass")
	spec = DefaultGridSpec(a)
	spec.TempsK = []float64{1e308}
	_, err = ComputeGrid(a, m, uk, f, f.Runways[0].Ends[0], spec)
	assert.ErrorContains(t, err, "temperature")
}
