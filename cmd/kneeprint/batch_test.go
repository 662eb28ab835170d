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

// The done-when of the season issue, end to end through the command line: a plan of
// the demo renders in one command; editing one runway's TORA in a copy of an airfield
// makes stale name exactly the affected cards and diff list the affected cells.
func TestSeasonEndToEnd(t *testing.T) {
	dir := t.TempDir()
	code, _, errOut := runCLI(t, "init", "--demo", dir)
	require.Equal(t, exitOK, code, errOut)
	plan := filepath.Join(dir, "demo-season.yaml")
	code, out, errOut := runCLI(t, "cards", "--plan", plan)
	require.Equal(t, exitOK, code, errOut+out)
	assert.Contains(t, out, "4 card file(s), 48 card page(s) written to "+filepath.Join(dir, "cards"))
	assert.Contains(t, errOut, "[4/4] wrote", "plain progress lines when not on a terminal")

	code, out, _ = runCLI(t, "stale", filepath.Join(dir, "cards"))
	assert.Equal(t, exitOK, code, out)
	assert.Contains(t, out, "all 24 card(s) match their inputs")

	// A copy of the airfield with runway 25 shortened; the plan now names the copy.
	src, err := os.ReadFile(filepath.Join(dir, "wrenmoor.yaml"))
	require.NoError(t, err)
	edited := strings.Replace(string(src), "designator: \"25\"\n        heading: 248 deg\n        tora: 840 m", "designator: \"25\"\n        heading: 248 deg\n        tora: 760 m", 1)
	require.NotEqual(t, string(src), edited)
	require.NoError(t, os.WriteFile(filepath.Join(dir, "wrenmoor-2027.yaml"), []byte(edited), 0o644))
	p, _ := os.ReadFile(plan)
	require.NoError(t, os.WriteFile(plan, []byte(strings.Replace(string(p), "  - wrenmoor.yaml", "  - wrenmoor-2027.yaml", 1)), 0o644))

	code, out, _ = runCLI(t, "stale", filepath.Join(dir, "cards"), "--plan", plan, "--json")
	assert.Equal(t, exitFailure, code)
	var rep struct {
		Stale []struct {
			File, Designator string
			Reasons          []string
		} `json:"stale"`
	}
	require.NoError(t, json.Unmarshal([]byte(out), &rep), out)
	require.Len(t, rep.Stale, 4, "runway 25 of each aircraft, dry and wet, nothing else")
	for _, s := range rep.Stale {
		assert.Equal(t, "25", s.Designator)
		assert.Contains(t, strings.Join(s.Reasons, ";"), "TORA 840 m -> 760 m")
	}

	code, out, _ = runCLI(t, "diff", "--aircraft", filepath.Join(dir, "sedgefin-sf2.yaml"), "--aircraft", filepath.Join(dir, "quillwing-qt6.yaml"),
		filepath.Join(dir, "wrenmoor.yaml"), filepath.Join(dir, "wrenmoor-2027.yaml"))
	assert.Equal(t, exitFailure, code, "something a pilot must know changed")
	assert.Contains(t, out, "runway 25: TORA 840 m -> 760 m")
	for _, line := range strings.Split(out, "\n") {
		if strings.HasPrefix(line, "  runway ") && strings.Contains(line, " -> ") && strings.Contains(line, "kg:") {
			assert.True(t, strings.HasPrefix(line, "  runway 25,"), "only runway 25 cells change: %s", line)
		}
	}
	code, out, _ = runCLI(t, "diff", "--aircraft", "demo:sedgefin-sf2", filepath.Join(dir, "wrenmoor.yaml"), filepath.Join(dir, "wrenmoor.yaml"))
	assert.Equal(t, exitOK, code)
	assert.Contains(t, out, "nothing a pilot must know changed")

	// Regenerating with the new plan makes every card current again.
	code, _, errOut = runCLI(t, "cards", "--plan", plan)
	require.Equal(t, exitOK, code, errOut)
	code, out, _ = runCLI(t, "stale", filepath.Join(dir, "cards"), "--plan", plan)
	assert.Equal(t, exitOK, code, out)
}

func TestStaleAndDiffUsage(t *testing.T) {
	code, _, errOut := runCLI(t, "stale", t.TempDir())
	assert.Equal(t, exitFailure, code)
	assert.Contains(t, errOut, "has no kneeprint-index.json")
	code, _, _ = runCLI(t, "diff", "a.yaml")
	assert.Equal(t, exitUsage, code)
	code, _, errOut = runCLI(t, "diff", "a.yaml", "b.yaml")
	assert.Equal(t, exitUsage, code)
	assert.Contains(t, errOut, "--aircraft is needed")
}
