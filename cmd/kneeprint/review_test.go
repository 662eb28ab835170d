package main

import (
	"os"
	"strings"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
)

// End-to-end tests of the safety findings of an independent review: each was a GO (or
// an answer without file:line) before its fix.

// An extra zero in a TORA (610 m typed 5600 m) or an LDA gave GO. Now check refuses
// the airfield file, naming file, line and field, and validate does the same.
func TestTORABeyondRunwayLengthRefused(t *testing.T) {
	f := writeFile(t, "field.yaml", "kind: airfield\nname: Test field\nident: TST\nelevation: 272 ft\nrunways:\n  - surface: grass\n    length: 610 m\n    ends:\n"+
		"      - {designator: \"15\", tora: 610 m, lda: 610 m}\n      - {designator: \"33\", tora: 5600 m, toda: 5600 m, lda: 5100 m}\n")
	for _, args := range [][]string{
		{"check", "--aircraft", "demo:sedgefin-sf2", "--airfield", f, "--temp", "15C", "--qnh", "1013hPa"},
		{"check", "--aircraft", "demo:sedgefin-sf2", "--airfield", f, "--temp", "15C", "--qnh", "1013hPa", "--landing"},
		{"validate", f},
	} {
		code, out, errOut := runCLI(t, args...)
		assert.Equal(t, exitFailure, code, "%v: %s%s", args, out, errOut)
		assert.Contains(t, out+errOut, f+":10:34: runways[0].ends[1].tora: TORA 5600 m is longer than the runway's length 610 m", args)
		assert.Contains(t, out+errOut, f+":10:61: runways[0].ends[1].lda: LDA 5100 m is longer than the runway's length 610 m", args)
		assert.NotContains(t, out, "GO", args)
	}
	// Without a length, validate warns (exit 0, the warning with its line).
	g := writeFile(t, "field.yaml", "kind: airfield\nname: Test field\nident: TST\nelevation: 272 ft\nrunways:\n  - surface: grass\n    ends:\n"+
		"      - {designator: \"15\", tora: 610 m}\n      - {designator: \"33\", tora: 5600 m}\n")
	code, out, _ := runCLI(t, "validate", g)
	require.Equal(t, exitOK, code, out)
	assert.True(t, strings.Contains(out, g+":9: runways[0].ends[1].tora: TORA 5600 m of 33 is 9.2 times the 610 m of 15"), out)
}

// A maximum landing mass below the lowest flyable mass loaded cleanly; check then
// exited 2 with a message naming no line, and cards failed. Now the loader refuses it.
func TestLandingMassBelowLowestMassRefused(t *testing.T) {
	const bad = "../internal/spec/testdata/bad/ac-landing-mlm-below-min.yaml"
	want := "ac-landing-mlm-below-min.yaml:25:21: landing.max_landing_mass: 650 kg is below the lowest flyable mass 700 kg (min_mass)"
	dir := t.TempDir()
	for _, args := range [][]string{
		{"check", "--aircraft", bad, "--airfield", "demo:wrenmoor", "--temp", "15C", "--qnh", "1013hPa"},
		{"cards", "--aircraft", bad, "--airfield", "demo:wrenmoor", "-o", dir},
		{"validate", bad},
	} {
		code, out, errOut := runCLI(t, args...)
		assert.Equal(t, exitFailure, code, "%v: %s%s", args, out, errOut)
		assert.Contains(t, out+errOut, want, args)
	}
}

// trainerWithClimb is the demo trainer with its climb section replaced by climb.
func trainerWithClimb(t *testing.T, climb string) string {
	t.Helper()
	data, err := os.ReadFile("../../templates/aircraft/sedgefin-sf2.yaml")
	require.NoError(t, err)
	s := string(data)
	i := strings.Index(s, "\nclimb:\n")
	j := strings.Index(s, "\n# The manual's landing table")
	require.True(t, i > 0 && j > i, "the demo trainer's climb section")
	return writeFile(t, "trainer.yaml", s[:i+1]+climb+s[j:])
}

// A climb table whose rates run out was ignored on runway ends without obstacles:
// at 35 C the (test) table gives 25 ft/min at sea level, a still-air gradient of
// about 0.4 % at 65 kt, under the 0.5 % the physics model counts as a climb (common
// practice). Runway 25 (840 m, no obstacles) was GO; it is now no takeoff, without a
// figure, and validate warns at the rate of zero or less with its line.
func TestNoClimbOnEndWithoutObstacles(t *testing.T) {
	ac := trainerWithClimb(t, "climb:\n  speed: 65 kt\n  rate_unit: ft/min\n  pressure_altitudes: [0 ft, 8000 ft]\n  temperatures: [-10 C, 40 C]\n  rate_of_climb:\n    - [700, -50]\n    - [300, -400]\n")
	run := checkJSON(t, "--aircraft", ac, "--airfield", "demo:wrenmoor", "--temp", "35C", "--qnh", "1013hPa", "--takeoff")
	e := endByDesignator(t, run, "25")
	assert.Equal(t, "no-go", e["status"], e["reasons"])
	assert.Nil(t, e["required_m"], "no figure")
	assert.Contains(t, strings.Join(toStrings(e["reasons"]), "\n"), "no takeoff: the manual's rate of climb at 65 kt is ")
	// At 15 C the same table climbs: 25 is as the demo trainer gives it.
	cool := endByDesignator(t, checkJSON(t, "--aircraft", ac, "--airfield", "demo:wrenmoor", "--temp", "15C", "--qnh", "1013hPa", "--takeoff"), "25")
	assert.Equal(t, "go", cool["status"], cool["reasons"])

	code, out, _ := runCLI(t, "validate", ac)
	require.Equal(t, exitOK, code, out)
	assert.Contains(t, out, "climb (1000 kg).rate_of_climb[0][1]: -50 ft/min at 0 ft, 40 C: no climb")
}
