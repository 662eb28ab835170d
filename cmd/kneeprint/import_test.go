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

	code, _, errOut = runCLI(t, "import", "cruise", in)
	assert.Equal(t, exitUsage, code)
	assert.Contains(t, errOut, `import: "cruise": import table (the takeoff table), landing or climb`)
	code, _, errOut = runCLI(t, "import", "landing", in)
	assert.Equal(t, exitFailure, code, "a takeoff CSV is not a landing table")
	assert.Contains(t, errOut, in+":7:1: to_50ft: the rows of a takeoff table (kneeprint import table): a landing table has ground_roll and from_50ft rows")
	code, _, _ = runCLI(t, "import", "table", filepath.Join(dir, "missing.csv"))
	assert.Equal(t, exitFailure, code)
}

const landingCSV = `distance_unit,ft
weight,800 kg
ground_roll,-10 C,0 C,10 C
0 ft,410,425,440
2000 ft,440,455,470
from_50ft,-10 C,0 C,10 C
0 ft,980,1020,1055
2000 ft,1055,1095,1130
`

const climbCSV = `speed,65 kt
rate_unit,ft/min
rate_of_climb,-10 C,0 C,10 C
0 ft,760,730,700
2000 ft,640,610,580
4000 ft,520,490,460
`

// import landing and import climb end to end: the sections printed, the questions
// the CSV leaves open named on stderr, and a profile made with both sections
// (answered) validates.
func TestImportLandingAndClimbCommand(t *testing.T) {
	dir := t.TempDir()
	landing := filepath.Join(dir, "landing.csv")
	climb := filepath.Join(dir, "climb.csv")
	require.NoError(t, os.WriteFile(landing, []byte(landingCSV), 0o644))
	require.NoError(t, os.WriteFile(climb, []byte(climbCSV), 0o644))

	code, landingYAML, errOut := runCLI(t, "import", "landing", landing)
	require.Equal(t, exitOK, code, errOut)
	assert.Contains(t, landingYAML, "landing:\n")
	assert.Contains(t, landingYAML, "  table:\n")
	assert.Contains(t, landingYAML, "          - [980, 1020, 1055]  # 0 ft\n")
	assert.Contains(t, errOut, "note: answer landing.flap in the YAML: the CSV does not say")
	assert.Contains(t, errOut, "note: answer landing.table.wind_factoring_included in the YAML: the CSV does not say")

	yamlOut := filepath.Join(dir, "climb.yaml")
	code, _, errOut = runCLI(t, "import", "climb", climb, "-o", yamlOut)
	require.Equal(t, exitOK, code, errOut)
	climbYAML, err := os.ReadFile(yamlOut)
	require.NoError(t, err)
	assert.Contains(t, string(climbYAML), "climb:\n  speed: 65 kt\n  rate_unit: ft/min\n")
	assert.Contains(t, string(climbYAML), "  rate_of_climb:\n    - [760, 730, 700]  # 0 ft\n")

	answered := strings.Replace(strings.Replace(landingYAML, "  flap:\n", "  flap: full\n", 1), "    wind_factoring_included:\n", "    wind_factoring_included: false\n", 1)
	profile := "kind: aircraft\nname: Imported\ntype: a test table, no aircraft\nmtow: 800 kg\nlimits: {demonstrated_crosswind: 15 kt}\ntakeoff_flap: \"0\"\n" +
		strings.SplitN(tableCSVYAML(t), "\n", 3)[2] + answered + string(climbYAML)
	p := filepath.Join(dir, "imported.yaml")
	require.NoError(t, os.WriteFile(p, []byte(profile), 0o644))
	code, out, _ := runCLI(t, "validate", p)
	assert.Equal(t, exitOK, code, out)
	assert.Contains(t, out, "landing: table model, flap full")
	assert.Contains(t, out, "climb at 65 kt (IAS): rate-of-climb table, 3 pressure altitudes")

	bad := filepath.Join(dir, "bad.csv")
	require.NoError(t, os.WriteFile(bad, []byte(strings.Replace(climbCSV, "2000 ft,640,610,580", "2000 ft,640,650,580", 1)), 0o644))
	code, out, errOut = runCLI(t, "import", "climb", bad)
	assert.Equal(t, exitFailure, code)
	assert.Empty(t, out, "no section written")
	assert.Contains(t, errOut, bad+":5:13: climb.rate_of_climb[1][1]: rate of climb rises as temperature rises")
}

// tableCSVYAML is the takeoff section import table makes of tableCSV (its first two
// lines, the comments, are dropped by the caller).
func tableCSVYAML(t *testing.T) string {
	t.Helper()
	dir := t.TempDir()
	in := filepath.Join(dir, "takeoff.csv")
	require.NoError(t, os.WriteFile(in, []byte(tableCSV), 0o644))
	code, out, errOut := runCLI(t, "import", "table", in)
	require.Equal(t, exitOK, code, errOut)
	return out
}
