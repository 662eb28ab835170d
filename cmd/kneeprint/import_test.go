package main

import (
	"os"
	"path/filepath"
	"strings"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
)

const tableCSV = `distance_unit,ft
wind_factoring_included,true
weight,800 kg
ground_roll,-10 C,0 C,10 C
0 ft,415,450,485
2000 ft,485,525,565
to_50ft,-10 C,0 C,10 C
0 ft,755,820,885
2000 ft,900,975,1050
`

// Issue 13.4 end to end: import prints the table section, -o writes it (never over a
// file without --force), and a profile made with it validates; errors carry the
// CSV's line and column and exit 1.
func TestImportCommand(t *testing.T) {
	dir := t.TempDir()
	in := filepath.Join(dir, "takeoff.csv")
	require.NoError(t, os.WriteFile(in, []byte(tableCSV), 0o644))
	code, out, errOut := runCLI(t, "import", "table", in)
	require.Equal(t, exitOK, code, errOut)
	assert.Contains(t, out, "table:\n  wind_factoring_included: true\n  distance_unit: ft\n")
	assert.Contains(t, out, "        - [415, 450, 485]  # 0 ft\n")

	yamlOut := filepath.Join(dir, "table.yaml")
	code, _, errOut = runCLI(t, "import", "table", in, "-o", yamlOut)
	require.Equal(t, exitOK, code, errOut)
	code, _, errOut = runCLI(t, "import", "table", in, "-o", yamlOut)
	assert.Equal(t, exitFailure, code)
	assert.Contains(t, errOut, "already exists")
	code, _, _ = runCLI(t, "import", "table", in, "-o", yamlOut, "--force")
	assert.Equal(t, exitOK, code)

	table, err := os.ReadFile(yamlOut)
	require.NoError(t, err)
	profile := "kind: aircraft\nname: Imported\ntype: a test table, no aircraft\nmtow: 800 kg\nlimits: {demonstrated_crosswind: 15 kt}\ntakeoff_flap: \"0\"\n" + string(table)
	p := filepath.Join(dir, "imported.yaml")
	require.NoError(t, os.WriteFile(p, []byte(profile), 0o644))
	code, out, _ = runCLI(t, "validate", "--strict", p)
	assert.Equal(t, exitOK, code, out)

	bad := filepath.Join(dir, "bad.csv")
	require.NoError(t, os.WriteFile(bad, []byte(strings.Replace(tableCSV, "2000 ft,900,975,1050", "2000 ft,900,795,1050", 1)), 0o644))
	code, out, errOut = runCLI(t, "import", "table", bad)
	assert.Equal(t, exitFailure, code)
	assert.Empty(t, out, "no table written")
	assert.Contains(t, errOut, bad+":9:13: table.weights (800 kg).to_50ft[1][1]: distance falls as temperature rises")

	code, _, errOut = runCLI(t, "import", "landing", in)
	assert.Equal(t, exitUsage, code)
	assert.Contains(t, errOut, "only a takeoff table")
	code, _, _ = runCLI(t, "import", "table", filepath.Join(dir, "missing.csv"))
	assert.Equal(t, exitFailure, code)
}
