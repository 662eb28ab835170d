package main

import (
	"bytes"
	"os"
	"path/filepath"
	"strings"
	"testing"
	"time"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
)

// runCLI runs kneeprint with args and returns exit code, stdout and stderr.
func runCLI(t *testing.T, args ...string) (int, string, string) {
	t.Helper()
	var out, errb bytes.Buffer
	fixed := func() time.Time { return time.Date(2026, 12, 1, 12, 0, 0, 0, time.UTC) }
	code := run(args, env{stdout: &out, stderr: &errb, now: fixed})
	return code, out.String(), errb.String()
}

func TestValidateDemo(t *testing.T) {
	code, out, errOut := runCLI(t, "validate", "--demo")
	require.Equal(t, exitOK, code, "stderr: %s\nstdout: %s", errOut, out)
	for _, want := range []string{
		"Wrenmoor Field (demo)", "Saltpan Mesa Strip (demo)",
		"Sedgefin SF-2 demo trainer", "Quillwing QT-6 demo tourer",
		"toda not given: TODA = TORA", "4 file(s) read, 0 with errors",
	} {
		assert.Contains(t, out, want)
	}
}

// Issue 9.9: unedited starters are refused by validate and cards, each placeholder
// named by file:line:column and key; the plan starter (no placeholders) validates.
func TestInitStartersValidate(t *testing.T) {
	dir := t.TempDir()
	for _, kind := range []string{"aircraft", "airfield", "plan"} {
		p := filepath.Join(dir, kind+".yaml")
		code, _, errOut := runCLI(t, "init", kind, p)
		require.Equal(t, exitOK, code, errOut)
		code, out, _ := runCLI(t, "validate", p)
		if kind == "plan" {
			// The starter plan names files still to be written: validate says so.
			assert.Equal(t, exitFailure, code, out)
			assert.Contains(t, out, "plan.yaml:7:5: aircraft[0]: ")
			assert.Contains(t, out, "my-trainer.yaml: no such file")
		} else {
			assert.Equal(t, exitFailure, code, out)
			assert.Contains(t, out, p+":")
			assert.Contains(t, out, "is a starter placeholder")
		}
		// A second init must not overwrite the pilot's work.
		code, _, errOut = runCLI(t, "init", kind, p)
		assert.Equal(t, exitFailure, code)
		assert.Contains(t, errOut, "already exists")
	}
	ac := filepath.Join(dir, "aircraft.yaml")
	code, out, _ := runCLI(t, "validate", ac)
	require.Equal(t, exitFailure, code)
	assert.Contains(t, out, ac+":11:7: mtow: \"EXAMPLE 1000 kg\" is a starter placeholder")
	assert.Contains(t, out, "table.wind_factoring_included: required, no default")

	// cards refuses it too, and writes nothing.
	outDir := filepath.Join(dir, "cards")
	code, cout, errOut := runCLI(t, "cards", "--aircraft", ac, "--airfield", "demo:wrenmoor", "-o", outDir)
	assert.Equal(t, exitFailure, code)
	assert.Contains(t, cout+errOut, "mtow: \"EXAMPLE 1000 kg\" is a starter placeholder")
	pdfs, _ := filepath.Glob(filepath.Join(outDir, "*.pdf"))
	assert.Empty(t, pdfs)
	code, cout, errOut = runCLI(t, "cards", "--aircraft", "demo:sedgefin-sf2", "--airfield", filepath.Join(dir, "airfield.yaml"), "-o", outDir)
	assert.Equal(t, exitFailure, code)
	assert.Contains(t, cout+errOut, "runways[0].ends[0].tora: \"EXAMPLE 800 m\" is a starter placeholder")
}

func TestInitDemoRoundTrip(t *testing.T) {
	dir := t.TempDir()
	code, _, errOut := runCLI(t, "init", "--demo", dir)
	require.Equal(t, exitOK, code, errOut)
	entries, err := os.ReadDir(dir)
	require.NoError(t, err)
	require.Len(t, entries, 5)
	args := []string{"validate"}
	for _, e := range entries {
		args = append(args, filepath.Join(dir, e.Name()))
	}
	code, out, _ := runCLI(t, args...)
	assert.Equal(t, exitOK, code, out)
}

func TestValidateReportsAllErrors(t *testing.T) {
	code, out, errOut := runCLI(t, "validate", "../internal/spec/testdata/bad/af-negative-tora.yaml", "../internal/spec/testdata/bad/ok-airfield.yaml")
	assert.Equal(t, exitFailure, code)
	assert.Equal(t, 2, strings.Count(out, "tora: -800 m is outside"), out)
	assert.Contains(t, out, "2 file(s) read, 1 with errors")
	assert.Contains(t, errOut, "1 of 2 file(s) have errors")
}

func TestUsageErrors(t *testing.T) {
	code, _, errOut := runCLI(t, "validate")
	assert.Equal(t, exitUsage, code)
	assert.Contains(t, errOut, "validate needs files")
	code, _, _ = runCLI(t, "nonsense")
	assert.Equal(t, exitUsage, code)
}

func TestHelpCarriesCaution(t *testing.T) {
	for _, cmd := range [][]string{{"--help"}, {"validate", "--help"}, {"init", "--help"}, {"check", "--help"}, {"grid", "--help"},
		{"cards", "--help"}, {"stale", "--help"}, {"diff", "--help"}} {
		code, out, _ := runCLI(t, cmd...)
		require.Equal(t, exitOK, code)
		assert.Contains(t, out, "not a substitute for the approved", cmd)
		assert.Contains(t, out, "The pilot in command decides", cmd)
		assert.Contains(t, out, "Examples:", cmd)
	}
}
