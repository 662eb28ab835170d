package main

import (
	"encoding/json"
	"os"
	"path/filepath"
	"regexp"
	"strings"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"

	"kneeprint/templates"
)

// uncalibratedTourer is the demo tourer with its calibration points removed.
func uncalibratedTourer(t *testing.T) string {
	t.Helper()
	data, err := templates.FS.ReadFile("aircraft/quillwing-qt6.yaml")
	require.NoError(t, err)
	s := string(data)
	i := strings.Index(s, "  calibration:")
	require.Positive(t, i)
	p := filepath.Join(t.TempDir(), "tourer.yaml")
	require.NoError(t, os.WriteFile(p, []byte(s[:i]), 0o644))
	return p
}

// Issue 10 item 1: cards and check refuse a physics profile without a calibration
// point, saying why and how to add one; validate reads it and says it is not
// calibrated.
func TestUncalibratedPhysicsRefused(t *testing.T) {
	ac := uncalibratedTourer(t)
	out := filepath.Join(t.TempDir(), "cards")
	for _, args := range [][]string{
		{"cards", "--aircraft", ac, "--airfield", "demo:wrenmoor", "-o", out, "--date", "2026-12-01"},
		{"check", "--aircraft", ac, "--airfield", "demo:wrenmoor", "--temp", "20C", "--qnh", "1013hPa"},
		{"grid", "--aircraft", ac, "--airfield", "demo:wrenmoor"},
	} {
		code, stdout, errOut := runCLI(t, args...)
		assert.Equal(t, exitFailure, code, "%s: %s %s", args[0], stdout, errOut)
		all := stdout + errOut
		assert.Contains(t, all, "not calibrated to the flight manual", args[0])
		assert.Contains(t, all, "calibration:", args[0])
		assert.Contains(t, all, "sea level, MTOW, paved dry", args[0])
	}
	pdfs, _ := filepath.Glob(filepath.Join(out, "*.pdf"))
	assert.Empty(t, pdfs, "no card from an uncalibrated model")

	code, stdout, _ := runCLI(t, "validate", ac)
	assert.Equal(t, exitOK, code, stdout)
	assert.Contains(t, stdout, "physics NOT CALIBRATED")
	assert.Contains(t, stdout, "physics.calibration: not calibrated: cards, check and grid refuse this profile")
	assert.Contains(t, stdout, "the fit starts from the default 0.58 for a constant_speed propeller")
}

// Issue 10 item 2: validate prints the fitted parameters and every figure's residual
// with its file:line.
func TestValidatePrintsFit(t *testing.T) {
	code, out, errOut := runCLI(t, "validate", "demo:quillwing-qt6")
	require.Equal(t, exitOK, code, errOut)
	for _, want := range []string{
		"physics calibrated to 4 point(s), 8 figure(s)",
		"static thrust fraction 0.", "propeller efficiency   0.",
		"(fit started from 0.66", "largest residual",
	} {
		assert.Contains(t, out, want)
	}
	rows := regexp.MustCompile(`quillwing-qt6\.yaml:\d+:\d+  calibration\[\d\] .*, (ground roll|to 50 ft) \d+ m, fit \d+ m, [+-]\d+\.\d %`).FindAllString(out, -1)
	assert.Len(t, rows, 8, out)
	// Issue 11 item 1: the landing fit is printed the same way, figure by figure.
	for _, want := range []string{"landing physics calibrated to 4 point(s)", "approach angle", "braking fraction"} {
		assert.Contains(t, out, want)
	}
	rows = regexp.MustCompile(`quillwing-qt6\.yaml:\d+:\d+  landing calibration\[\d\] .*, (ground roll|from 50 ft) \d+ m, fit \d+ m, [+-]\d+\.\d %`).FindAllString(out, -1)
	assert.Len(t, rows, 8, out)
}

// tablePhysics is a profile with a table and a physics description; the table was
// typed from the demo tourer's fitted model (invented), rounded to 5 m.
const tablePhysics = `kind: aircraft
name: Both
type: invented tourer
mtow: 1250 kg
speeds: {rotation: 60 kt, at_50ft: 68 kt}
limits:
  demonstrated_crosswind: 15 kt
model: MODEL
takeoff_flap: "10"
flaps:
  - {name: "10", clmax: 1.7}
physics:
  wing_area: 16.2 m2
  span: 10.9 m
  wing_height: 1.0 m
  cd0: 0.034
  oswald: 0.75
  cl_ground_run: 0.3
  power: 134 kW
  propeller: {type: constant_speed, diameter: 1.93 m}
table:
  wind_factoring_included: true
  distance_unit: m
  pressure_altitudes: [0 ft, 4000 ft]
  temperatures: [0 C, 30 C]
  weights:
    - weight: 1050 kg
      ground_roll:
        - [220, 275]
        - [305, 400]
      to_50ft:
        - [360, 465]
        - [520, 710]
    - weight: 1250 kg
      ground_roll:
        - [265, 330]
        - [370, 495]
      to_50ft:
        - [455, 595]
        - [675, 970]
`

// Issue 10 item 5: with a table and physics, validate shows the residual map cell by
// cell with its file:line; cards use the table, and with model: physics the fitted
// physics never answers beyond the table's range.
func TestTableAndPhysicsResidualMap(t *testing.T) {
	dir := t.TempDir()
	p := filepath.Join(dir, "both.yaml")
	require.NoError(t, os.WriteFile(p, []byte(strings.Replace(tablePhysics, "MODEL", "table", 1)), 0o644))
	code, out, errOut := runCLI(t, "validate", p)
	require.Equal(t, exitOK, code, out+errOut)
	assert.Contains(t, out, "physics calibrated to 8 point(s), 16 figure(s)")
	rows := regexp.MustCompile(`both\.yaml:\d+:\d+  table \d+ kg, \d+ ft, \d+ C, (ground roll|to 50 ft) \d+ m, fit \d+ m, [+-]\d+\.\d %`).FindAllString(out, -1)
	assert.Len(t, rows, 16, out)
	assert.Contains(t, out, "both.yaml:40:17  table 1250 kg, 4000 ft, 30 C, to 50 ft 970 m, fit")

	pp := filepath.Join(dir, "both-physics.yaml")
	require.NoError(t, os.WriteFile(pp, []byte(strings.Replace(tablePhysics, "MODEL", "physics", 1)), 0o644))
	code, out, errOut = runCLI(t, "check", "--aircraft", pp, "--airfield", "demo:saltpan", "--temp", "20C", "--qnh", "1013hPa", "--json")
	require.Equal(t, exitOK, code, errOut)
	var run struct {
		Ends []struct {
			Status  string   `json:"status"`
			Reasons []string `json:"reasons"`
		} `json:"runway_ends"`
	}
	require.NoError(t, json.Unmarshal([]byte(out), &run))
	require.NotEmpty(t, run.Ends)
	for _, e := range run.Ends {
		// The hot-and-high demo strip is near 5000 ft, above the table's 4000 ft.
		assert.Equal(t, "no-data", e.Status, "%v", e.Reasons)
		assert.Contains(t, strings.Join(e.Reasons, " "), "above the table's highest")
	}
}

// shortTakeoff is an invented short-takeoff profile: lift-off at 42 kt.
const shortTakeoff = `kind: aircraft
name: Short-field test
type: invented short-takeoff two-seater
mtow: 700 kg
min_mass: 450 kg
speeds: {rotation: 42 kt, at_50ft: 48 kt}
limits:
  demonstrated_crosswind: 12 kt
takeoff_flap: "30"
flaps:
  - {name: "30", clmax: 2.0}
physics:
  wing_area: 15 m2
  span: 10 m
  wing_height: 1.8 m
  cd0: 0.045
  oswald: 0.7
  cl_ground_run: 0.5
  power: 75 kW
  propeller: {type: fixed_pitch, diameter: 1.75 m}
  calibration:
    - {pressure_altitude: 0 ft, temperature: 15 C, weight: 700 kg, ground_roll: 120 m, to_50ft: 260 m}
`

// Issue 14 item 4: a credited headwind past what the model can answer printed
// negative distances as go. Now: no data, never a distance <= 0; grid refuses winds
// past the 99 kt check takes.
func TestHugeHeadwindNoData(t *testing.T) {
	p := filepath.Join(t.TempDir(), "stol.yaml")
	require.NoError(t, os.WriteFile(p, []byte(shortTakeoff), 0o644))

	code, out, errOut := runCLI(t, "check", "--aircraft", p, "--airfield", "demo:wrenmoor", "--temp", "15C", "--qnh", "1013hPa", "--wind", "250/85", "--json")
	require.Equal(t, exitOK, code, errOut)
	var run struct {
		Ends []struct {
			Designator string   `json:"designator"`
			Status     string   `json:"status"`
			Roll       *float64 `json:"ground_roll_m"`
			To50       *float64 `json:"distance_50ft_m"`
			Required   *float64 `json:"required_m"`
			Reasons    []string `json:"reasons"`
		} `json:"runway_ends"`
	}
	require.NoError(t, json.Unmarshal([]byte(out), &run))
	for _, e := range run.Ends {
		for _, d := range []*float64{e.Roll, e.To50, e.Required} {
			if d != nil {
				assert.Greater(t, *d, 0.0, "runway %s", e.Designator)
			}
		}
		if e.Designator == "25" {
			assert.Equal(t, "no-data", e.Status, "%v", e.Reasons)
			assert.Nil(t, e.To50)
		}
	}

	code, out, errOut = runCLI(t, "grid", "--aircraft", p, "--airfield", "demo:wrenmoor", "--winds=0kt,60kt,99kt", "--csv")
	require.Equal(t, exitOK, code, errOut)
	assert.NotContains(t, out, ",-", "no negative figure in any column but the wind: "+out)
	assert.Contains(t, out, "no-data")

	code, _, errOut = runCLI(t, "grid", "--aircraft", p, "--airfield", "demo:wrenmoor", "--winds=150kt")
	assert.Equal(t, exitUsage, code)
	assert.Contains(t, errOut, "--winds: 150 kt is beyond 99 kt")
}
