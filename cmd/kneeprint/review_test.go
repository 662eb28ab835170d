package main

import (
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
