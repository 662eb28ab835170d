package main

import (
	"encoding/json"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
)

// Issue 14.1 and 8.4, end to end: a declared crosswind limit is a limit, the
// demonstrated crosswind is advisory, and a limit of 0 kt is refused with its line
// (never read as "no limit"). 160/35G45 across runway 07 (068 deg M): the gust
// component is 45 sin(92 deg) = 45 kt (domain notes sec. 3: crosswind = V sin theta,
// the gust for limits).
func TestCrosswindLimitEndToEnd(t *testing.T) {
	type end struct {
		Designator string   `json:"designator"`
		Status     string   `json:"status"`
		Reasons    []string `json:"reasons"`
	}
	ask := func(aircraft string) map[string]end {
		code, out, errOut := runCLI(t, "check", "--aircraft", aircraft, "--airfield", "demo:wrenmoor",
			"--temp", "15C", "--qnh", "1013hPa", "--wind", "160/35G45", "--json")
		require.Equal(t, exitOK, code, errOut)
		var run struct {
			Ends []end `json:"runway_ends"`
		}
		require.NoError(t, json.Unmarshal([]byte(out), &run))
		m := map[string]end{}
		for _, e := range run.Ends {
			m[e.Designator] = e
		}
		return m
	}
	// The demo tourer declares a 20 kt limit.
	q := ask("demo:quillwing-qt6")
	assert.Equal(t, "beyond-limits", q["07"].Status)
	assert.Contains(t, strings.Join(q["07"].Reasons, "; "), "crosswind 45 kt above the 20 kt limit")
	// The demo trainer only states a demonstrated 15 kt: advisory, no limit.
	s := ask("demo:sedgefin-sf2")
	assert.NotEqual(t, "beyond-limits", s["07"].Status)
	assert.Contains(t, strings.Join(s["07"].Reasons, "; "), "above the demonstrated 15 kt (advisory")

	// A profile with max_crosswind: 0 kt is refused, naming file, line and field.
	src, err := os.ReadFile("../../templates/aircraft/sedgefin-sf2.yaml")
	require.NoError(t, err)
	p := filepath.Join(t.TempDir(), "zero.yaml")
	require.NoError(t, os.WriteFile(p, []byte(strings.Replace(string(src), "  demonstrated_crosswind: 15 kt\n", "  demonstrated_crosswind: 15 kt\n  max_crosswind: 0 kt\n", 1)), 0o644))
	code, out, errOut := runCLI(t, "validate", p)
	assert.Equal(t, exitFailure, code)
	assert.Contains(t, out+errOut, "zero.yaml:15:18: limits.max_crosswind: 0 kt would forbid any crosswind")
	code, _, errOut = runCLI(t, "check", "--aircraft", p, "--airfield", "demo:wrenmoor", "--temp", "15C", "--qnh", "1013hPa", "--wind", "160/35G45")
	assert.Equal(t, exitFailure, code)
	assert.Contains(t, errOut, "limits.max_crosswind")
}
