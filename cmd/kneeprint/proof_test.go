package main

import (
	"bytes"
	"os"
	"path/filepath"
	"strconv"
	"strings"
	"testing"

	"github.com/pdfcpu/pdfcpu/pkg/api"
	"github.com/pdfcpu/pdfcpu/pkg/pdfcpu/model"
	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
)

const plantedFile = "../internal/proof/testdata/planted.yaml"

// plantedClimbFile has a slip in its climb table (one table for the MTOW): 360 typed
// 306 on the row "- [306, 280, 200, 120]".
const plantedClimbFile = "../internal/proof/testdata/planted-climb.yaml"

// plantedLine is the line of the planted transposition (1580 typed for 1850).
func plantedLine(t *testing.T) (line, col int) {
	data, err := os.ReadFile(plantedFile)
	require.NoError(t, err)
	for i, l := range strings.Split(string(data), "\n") {
		if j := strings.Index(l, "1580"); j >= 0 && strings.HasPrefix(strings.TrimSpace(l), "- [") {
			return i + 1, j + 1
		}
	}
	t.Fatal("no planted figure")
	return 0, 0
}

// proof end to end: a sheet per file, valid PDFs, byte-identical for the same
// --date, the planted slips (in a takeoff table and in a climb table) counted and
// named with their lines.
func TestProofCommand(t *testing.T) {
	dir := t.TempDir()
	code, out, errOut := runCLI(t, "proof", "demo:sedgefin-sf2", "demo:quillwing-qt6", "demo:wrenmoor", "demo:saltpan", plantedFile, plantedClimbFile, "-o", dir, "--date", "2027-03-01")
	require.Equal(t, exitOK, code, "stdout %s\nstderr %s", out, errOut)
	assert.Contains(t, out, "sedgefin-sf2-proof.pdf (0 figure(s) off the smooth pattern of their neighbours)")
	assert.Contains(t, out, "planted-proof.pdf (1 figure(s) off the smooth pattern of their neighbours)")
	line, col := plantedLine(t)
	assert.Contains(t, out, "  ! "+plantedFile+":"+strconv.Itoa(line)+":"+strconv.Itoa(col)+": table.weights[2].to_50ft[2][2]: distance to 50 ft 1580")
	assert.Contains(t, out, "planted-climb-proof.pdf (1 figure(s) off the smooth pattern of their neighbours)")
	climb, err := os.ReadFile(plantedClimbFile)
	require.NoError(t, err)
	climbLine := 1 + strings.Count(string(climb[:bytes.Index(climb, []byte("- [306,"))]), "\n")
	assert.Contains(t, out, "  ! "+plantedClimbFile+":"+strconv.Itoa(climbLine)+":8: climb.rate_of_climb[3][0]: rate of climb 306 (MTOW 1000 kg, 6000 ft, -20 C) breaks the smooth pattern")
	conf := model.NewDefaultConfiguration()
	for _, name := range []string{"sedgefin-sf2", "quillwing-qt6", "wrenmoor", "saltpan", "planted", "planted-climb"} {
		data, err := os.ReadFile(filepath.Join(dir, name+"-proof.pdf"))
		require.NoError(t, err, name)
		require.NoError(t, api.Validate(bytes.NewReader(data), conf), name)
	}
	first, err := os.ReadFile(filepath.Join(dir, "wrenmoor-proof.pdf"))
	require.NoError(t, err)
	code, _, _ = runCLI(t, "proof", "demo:wrenmoor", "-o", dir, "--date", "2027-03-01")
	require.Equal(t, exitOK, code)
	second, err := os.ReadFile(filepath.Join(dir, "wrenmoor-proof.pdf"))
	require.NoError(t, err)
	assert.True(t, bytes.Equal(first, second), "same file and --date: same bytes")
	entries, err := os.ReadDir(dir)
	require.NoError(t, err)
	assert.Len(t, entries, 6, "nothing but the sheets (no temporaries left)")
}

// A file with errors gets no sheet, its errors are listed with their lines, the other
// files are proofed, and the command exits 1; a folder named as a file, a card
// template and a bad paper are refused.
func TestProofRefusals(t *testing.T) {
	dir := t.TempDir()
	code, out, _ := runCLI(t, "proof", "../internal/spec/testdata/bad/ac-nonmonotone.yaml", "demo:saltpan", "-o", dir, "--date", "2027-03-01")
	assert.Equal(t, exitFailure, code)
	assert.Contains(t, out, "ac-nonmonotone.yaml: ERRORS, no proof sheet")
	assert.Contains(t, out, "ac-nonmonotone.yaml:20:17: table.weights (1000 kg).to_50ft[1][1]: distance falls as temperature rises")
	assert.FileExists(t, filepath.Join(dir, "saltpan-proof.pdf"))
	assert.NoFileExists(t, filepath.Join(dir, "ac-nonmonotone-proof.pdf"))

	code, out, _ = runCLI(t, "proof", "../../templates/cards/a5.yaml", "-o", dir)
	assert.Equal(t, exitFailure, code)
	assert.Contains(t, out, "a proof sheet is made for aircraft profiles and airfields")

	file := filepath.Join(dir, "saltpan-proof.pdf")
	code, _, errOut := runCLI(t, "proof", "demo:saltpan", "-o", file)
	assert.Equal(t, exitUsage, code)
	assert.Contains(t, errOut, "is a file: give a folder")
	code, _, errOut = runCLI(t, "proof", "demo:saltpan", "-o", dir, "--paper", "a3")
	assert.Equal(t, exitUsage, code)
	assert.Contains(t, errOut, "--paper")
	code, _, _ = runCLI(t, "proof", "demo:saltpan")
	assert.Equal(t, exitUsage, code)
}

// Two inputs with the same file name get sheets of their own.
func TestProofNamesUnique(t *testing.T) {
	dir := t.TempDir()
	a, b := filepath.Join(dir, "a"), filepath.Join(dir, "b")
	require.NoError(t, os.MkdirAll(a, 0o755))
	require.NoError(t, os.MkdirAll(b, 0o755))
	data, err := os.ReadFile("../../airfields/saltpan.yaml")
	require.NoError(t, err)
	require.NoError(t, os.WriteFile(filepath.Join(a, "field.yaml"), data, 0o644))
	require.NoError(t, os.WriteFile(filepath.Join(b, "Field.yaml"), data, 0o644))
	out := filepath.Join(dir, "out")
	code, stdout, _ := runCLI(t, "proof", filepath.Join(a, "field.yaml"), filepath.Join(b, "Field.yaml"), "-o", out)
	require.Equal(t, exitOK, code, stdout)
	entries, err := os.ReadDir(out)
	require.NoError(t, err)
	assert.Len(t, entries, 2)
}

// Issue 13.2: validate lists the planted slip as a warning with its line; exit 0,
// or 1 with --strict. The clean demo passes --strict.
func TestValidateOutlierWarning(t *testing.T) {
	line, col := plantedLine(t)
	code, out, _ := runCLI(t, "validate", plantedFile)
	assert.Equal(t, exitOK, code, out)
	assert.Contains(t, out, "! "+plantedFile+":"+strconv.Itoa(line)+":"+strconv.Itoa(col)+": table.weights[2].to_50ft[2][2]: distance to 50 ft 1580 (1000 kg, 4000 ft, 20 C) breaks the smooth pattern of its neighbours")
	assert.Contains(t, out, "1 file(s) read, 0 with errors, 1 with warnings")
	code, _, errOut := runCLI(t, "validate", "--strict", plantedFile)
	assert.Equal(t, exitFailure, code)
	assert.Contains(t, errOut, "--strict: 1 of 1 file(s) have warnings")
	code, out, _ = runCLI(t, "validate", "--strict", "--demo")
	assert.Equal(t, exitOK, code, out)
}
