package main

import (
	"encoding/json"
	"math"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"

	"kneeprint/cmd/internal/report"
)

// Issue 12 item 4, end to end: check reports the obstacle clearance per runway end,
// in text and JSON. The demo trainer (invented data) at the hot-and-high strip, 900 kg,
// 30 C, QNH 1000 hPa, calm: runway 04 fits its TORA (1081 m required with less than
// 10 % spare) but its climb does not clear the rising ground by 50 ft.
//
// The clearance by hand: pressure altitude 5326 ft (the 04/22 threshold at 4975 ft,
// QNH 1000 hPa, ISA: ICAO Doc 7488); the climb is taken at 5326 + 150 + 50 = 5526 ft
// (the highest obstacle's top plus the margin). The demo climb table at 30 C: 1000 kg
// 400 ft/min at 4000 ft, 280 at 6000 ft, so 400 - 120 x 1526/2000 = 308.4; 800 kg
// 580 and 450, so 480.8; at 900 kg 394.6 ft/min. 65 KIAS at 5526 ft and 30 C: sigma
// = (82660 Pa / (287.053 x 303.15 K)) / 1.225 = 0.7754, true airspeed 65 / 0.8806 =
// 73.8 kt = 7476 ft/min over the ground in calm air (1 kt = 6076.12 ft/h), so a
// gradient of 5.28 % (printed 5.2). The 50 ft point is the takeoff distance before
// the safety factor, 1081 / 1.33 = 813 m. Beyond it to the obstacle 1100 + 600 - 813
// = 887 m; the runway still rises 1.108 % x 287 m = 3.18 m to its end (40 ft over
// 1100 m); height = 15.24 - 3.18 + 0.0528 x 887 = 58.9 m = 193 ft over the end of
// the TORA, 43 ft over the 150 ft rising ground: short of 50 ft.
func TestCheckObstacleClearance(t *testing.T) {
	args := []string{"check", "--aircraft", "demo:sedgefin-sf2", "--airfield", "demo:saltpan", "--temp", "30C", "--qnh", "1000hPa", "--weight", "900kg"}
	code, out, errOut := runCLI(t, append(args, "--json")...)
	require.Equal(t, exitOK, code, errOut)
	var run report.CheckRun
	require.NoError(t, json.Unmarshal([]byte(out), &run))
	var e04, e22 report.CheckEnd
	for _, e := range run.Ends {
		switch e.Designator {
		case "04":
			e04 = e
		case "22":
			e22 = e
		}
	}
	assert.Equal(t, "no-go", e04.Status)
	require.NotNil(t, e04.ClimbGradientPct)
	assert.Equal(t, 65.0, *e04.ClimbSpeedKIAS)
	assert.Equal(t, 5526.0, *e04.ClimbPressureAltFt)
	assert.InDelta(t, 394.6, *e04.ClimbRateFPM, 1)
	assert.Equal(t, 5.2, *e04.ClimbGradientPct)
	assert.InDelta(t, math.Ceil(*e04.RequiredM/1.33), *e04.ClimbFromM, 1)
	assert.Equal(t, 50.0, *e04.ObstacleMarginFt)
	require.Len(t, e04.Obstacles, 1)
	o := e04.Obstacles[0]
	assert.Equal(t, "rising ground", o.Note)
	assert.Equal(t, 150.0, o.HeightFt)
	assert.Equal(t, 600.0, o.PastEndM)
	assert.InDelta(t, 193, *o.PassingHeightFt, 1)
	assert.InDelta(t, 43, *o.ClearanceFt, 1)
	assert.False(t, *o.Cleared)
	assert.Equal(t, 1, e04.ObstaclesNotCleared)
	assert.Contains(t, e04.Reasons, "150 ft rising ground at 600 m past the runway end: 43 ft clearance, 50 ft required")
	// Runway 22 lists none: empty list, nulls.
	assert.Empty(t, e22.Obstacles)
	assert.Nil(t, e22.ClimbGradientPct)
	assert.Nil(t, e22.ObstacleMarginFt)

	// A 40 ft margin is met: the distance decides again (tight).
	code, out, errOut = runCLI(t, append(args, "--json", "--obstacle-margin", "40ft")...)
	require.Equal(t, exitOK, code, errOut)
	require.NoError(t, json.Unmarshal([]byte(out), &run))
	for _, e := range run.Ends {
		if e.Designator == "04" {
			assert.Equal(t, "tight", e.Status, e.Reasons)
			assert.True(t, *e.Obstacles[0].Cleared)
		}
	}

	// The same in text.
	code, out, errOut = runCLI(t, args...)
	require.Equal(t, exitOK, code, errOut)
	assert.Contains(t, out, "climb at 65 KIAS: 394 ft/min (taken at 5526 ft pressure altitude), 5.2 % over the ground with the credited wind, from 50 ft at 813 m")
	assert.Contains(t, out, "rising ground 150 ft 600 m past the end: passed at 193 ft, NOT CLEARED: 43 ft clearance, 50 ft required")

	// A margin outside 10 to 500 ft is refused as a wrong command line.
	code, _, errOut = runCLI(t, append(args, "--obstacle-margin", "0ft")...)
	assert.Equal(t, exitUsage, code)
	assert.Contains(t, errOut, "--obstacle-margin: 0ft outside 10 to 500 ft")
}

// grid marks a cell stopped only by an obstacle, and gives each cell's climb and
// least clearance in JSON.
func TestGridObstacle(t *testing.T) {
	code, out, errOut := runCLI(t, "grid", "--aircraft", "demo:sedgefin-sf2", "--airfield", "demo:saltpan", "--runway", "04", "--temps", "30C", "--winds", "0kt", "--weights", "900kg")
	require.Equal(t, exitOK, code, errOut)
	assert.Contains(t, out, "obstacle: rising ground 150 ft, 600 m past the end: to be cleared by 50 ft")
	assert.Contains(t, out, "1081^")
	code, out, errOut = runCLI(t, "grid", "--aircraft", "demo:sedgefin-sf2", "--airfield", "demo:saltpan", "--runway", "04", "--temps", "30C", "--winds", "0kt", "--weights", "900kg", "--json")
	require.Equal(t, exitOK, code, errOut)
	var run report.GridRun
	require.NoError(t, json.Unmarshal([]byte(out), &run))
	require.Len(t, run.Ends, 1)
	require.Len(t, run.Ends[0].Cells, 1)
	c := run.Ends[0].Cells[0]
	assert.True(t, c.Obstacle)
	assert.Equal(t, 5.2, *c.ClimbGradientPct)
	assert.InDelta(t, 43, *c.LeastClearanceFt, 1)
	assert.Equal(t, []report.GridObstacle{{Note: "rising ground", HeightFt: 150, PastEndM: 600}}, run.Ends[0].Obstacles)
}
