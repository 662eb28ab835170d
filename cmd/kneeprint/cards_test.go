package main

import (
	"os"
	"path/filepath"
	"strings"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
)

func TestCardsDemo(t *testing.T) {
	dir := t.TempDir()
	code, out, errOut := runCLI(t, "cards", "--demo", "-o", dir, "--date", "2026-12-01")
	require.Equal(t, exitOK, code, errOut)
	entries, err := os.ReadDir(dir)
	require.NoError(t, err)
	assert.Len(t, entries, 5, "2 aircraft x 2 airfields, and the index")
	for _, e := range entries {
		assert.True(t, strings.HasSuffix(e.Name(), ".pdf") || e.Name() == "kneeprint-index.jsonl", "no temporary file left: %s", e.Name())
	}
	assert.Contains(t, out, "kp-spm_sedgefin-sf-2-demo-trainer_a5.pdf (2 page(s))")
	assert.Contains(t, out, "no-go")
}

func TestCardsUserFilesAndOptions(t *testing.T) {
	dir := t.TempDir()
	code, out, errOut := runCLI(t, "cards", "--aircraft", "demo:quillwing-qt6", "--airfield", "demo:saltpan", "--template", "5x8",
		"--sheet", "letter", "--date", "2027-03-01", "--valid-until", "2027-10-31", "--policy", "eu-class-b", "-o", dir)
	require.Equal(t, exitOK, code, errOut)
	assert.Contains(t, out, "kp-spm_quillwing-qt-6-demo-tourer_5x8_letter-2up.pdf (1 page(s))")
	_, err := os.Stat(filepath.Join(dir, "kp-spm_quillwing-qt-6-demo-tourer_5x8_letter-2up.pdf"))
	assert.NoError(t, err)
}

func TestCardsBadInput(t *testing.T) {
	dir := t.TempDir()
	for _, args := range [][]string{
		{"cards", "--demo"},
		{"cards", "--demo", "-o", dir, "--template", "a6"},
		{"cards", "--demo", "-o", dir, "--date", "1 Dec 2026"},
		{"cards", "--demo", "-o", dir, "--date", "2026-12-01", "--valid-until", "2026-11-01"},
		{"cards", "--demo", "-o", dir, "--sheet", "a3"},
		{"cards", "--demo", "--aircraft", "x.yaml", "-o", dir},
	} {
		code, _, errOut := runCLI(t, args...)
		assert.Equal(t, exitUsage, code, strings.Join(args, " ")+": "+errOut)
	}
	// A bad airfield file is reported with file and line, and nothing is written for it.
	code, out, _ := runCLI(t, "cards", "--aircraft", "demo:sedgefin-sf2", "--airfield", "../internal/spec/testdata/bad/af-toda-short.yaml", "-o", dir)
	assert.Equal(t, exitFailure, code)
	assert.Contains(t, out, "af-toda-short.yaml:10:15: runways[0].ends[0].toda")
	entries, _ := os.ReadDir(dir)
	assert.Empty(t, entries)
}
