package main

import (
	"encoding/json"
	"strings"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
)

func TestCheckJSONFields(t *testing.T) {
	code, out, errOut := runCLI(t, "check", "--aircraft", "demo:sedgefin-sf2", "--airfield", "demo:wrenmoor",
		"--temp", "30C", "--qnh", "29.62inHg", "--wind", "240/15G25", "--json")
	require.Equal(t, exitOK, code, errOut)
	var run map[string]any
	require.NoError(t, json.Unmarshal([]byte(out), &run))
	for _, k := range []string{"pressure_altitude_ft", "density_altitude_ft", "elevation_ft", "qnh_hpa", "temperature_c", "weight_kg", "runway_ends", "caution"} {
		assert.Contains(t, run, k)
	}
	// 29.62 inHg = 1003.0 hPa (NIST SP 811 conversion).
	assert.InDelta(t, 1003.0, run["qnh_hpa"], 0.05)
	assert.Equal(t, 1000.0, run["weight_kg"], "defaults to the MTOW")
	ends := run["runway_ends"].([]any)
	require.Len(t, ends, 4)
	for _, e := range ends {
		m := e.(map[string]any)
		for _, k := range []string{"designator", "heading_deg", "headwind_kt", "crosswind_kt", "credited_headwind_kt", "ground_roll_m", "distance_50ft_m", "required_m", "available_m", "limiting", "status"} {
			assert.Contains(t, m, k)
		}
	}
	first := ends[0].(map[string]any)
	assert.Equal(t, "25", first["designator"], "runway 25 into a 240 wind ranks first")
	assert.Equal(t, "go", first["status"])
	// 240/15 on runway 248: headwind 15 cos 8 deg = 14.85 kt (trigonometry).
	assert.InDelta(t, 14.9, first["headwind_kt"], 0.05)
}

func TestCheckVerdictDoesNotChangeExitCode(t *testing.T) {
	code, out, errOut := runCLI(t, "check", "--aircraft", "demo:sedgefin-sf2", "--airfield", "demo:saltpan", "--temp", "35C", "--qnh", "995hPa")
	require.Equal(t, exitOK, code, errOut)
	assert.Contains(t, out, "NO-GO")
	assert.Contains(t, out, "Not a substitute for the approved flight manual")
}

func TestCheckBadFlags(t *testing.T) {
	for _, args := range [][]string{
		{"--temp", "30"},
		{"--temp", "30C", "--qnh", "1003"},
		{"--temp", "30C", "--wind", "240-15"},
		{"--temp", "30C", "--policy", "lenient"},
		{"--temp", "30C", "--surface", "icy"},
	} {
		code, _, errOut := runCLI(t, append([]string{"check", "--aircraft", "demo:sedgefin-sf2", "--airfield", "demo:wrenmoor"}, args...)...)
		assert.Equal(t, exitUsage, code, strings.Join(args, " "))
		assert.NotEmpty(t, errOut)
	}
	code, _, errOut := runCLI(t, "check", "--aircraft", "demo:wrenmoor", "--airfield", "demo:wrenmoor", "--temp", "30C", "--qnh", "1013hPa")
	assert.Equal(t, exitFailure, code)
	assert.Contains(t, errOut, "an aircraft file is needed here")
}

func TestGridOutputs(t *testing.T) {
	base := []string{"grid", "--aircraft", "demo:quillwing-qt6", "--airfield", "demo:saltpan"}
	code, out, errOut := runCLI(t, base...)
	require.Equal(t, exitOK, code, errOut)
	assert.Contains(t, out, "runway 04")
	assert.Contains(t, out, "runway 22")
	assert.Contains(t, out, "X", "the hot-and-high demo has no-go cells")

	code, out, _ = runCLI(t, append(base, "--csv", "--runway", "22", "--temps", "10C,30C", "--winds=-5kt,0kt", "--weights", "1250kg")...)
	require.Equal(t, exitOK, code)
	lines := strings.Split(strings.TrimSpace(out), "\n")
	assert.Len(t, lines, 1+2*2, "header and one row per cell")
	assert.True(t, strings.HasPrefix(lines[0], "ident,designator,weight_kg,headwind_kt,temperature_c"))

	code, out, _ = runCLI(t, append(base, "--json")...)
	require.Equal(t, exitOK, code)
	var run GridJSONProbe
	require.NoError(t, json.Unmarshal([]byte(out), &run))
	require.Len(t, run.Ends, 2)
	assert.Len(t, run.Ends[0].Cells, 8*7*4) // the demo tourer's 4 weights

	code, _, _ = runCLI(t, append(base, "--runway", "09")...)
	assert.Equal(t, exitUsage, code)
}

type GridJSONProbe struct {
	Ends []struct {
		Cells []map[string]any `json:"cells"`
	} `json:"runway_ends"`
}
