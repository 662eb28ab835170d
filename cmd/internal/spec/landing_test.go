package spec

import (
	"errors"
	"strings"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"

	"kneeprint/perf"
	"kneeprint/templates"
)

// Issue 11 item 1: the demo profiles' landing sections load: the trainer's landing
// table in feet (1245 ft = 379.476 m: 0.3048 m per ft exactly, ICAO Annex 5) with its
// notes, its MTOW as the maximum landing mass; the tourer's physics landing model,
// fitted to its four (invented) landing points within 5 %, on the landing flap's CLmax.
func TestLandingSectionLoads(t *testing.T) {
	d, err := Load(templates.FS, "aircraft/sedgefin-sf2.yaml")
	require.NoError(t, err)
	l := d.Aircraft.Landing
	require.NotNil(t, l)
	assert.Equal(t, perf.ModelTable, l.Model)
	assert.Equal(t, "30°", l.Flap)
	assert.Equal(t, 1000.0, l.MaxMassKg)
	assert.Contains(t, strings.Join(d.Defaults, "\n"), "landing.max_landing_mass not given: the MTOW, 1000 kg")
	require.NotNil(t, l.Table)
	assert.InDelta(t, 1245*0.3048, l.Table.To50ftM[2][0][2], 1e-9, "1000 kg, 0 ft, 10 C")
	assert.InDelta(t, 7.0, l.Table.Corrections.HeadwindPct, 1e-12)
	assert.True(t, l.Table.WindInData)

	d, err = Load(templates.FS, "aircraft/quillwing-qt6.yaml")
	require.NoError(t, err)
	l = d.Aircraft.Landing
	require.NotNil(t, l)
	require.NotNil(t, l.Physics)
	assert.Equal(t, perf.ModelPhysics, l.Model)
	assert.Equal(t, 1200.0, l.MaxMassKg)
	assert.InDelta(t, 1.95, l.Physics.CLMax, 1e-12, "the 25° flap's clmax")
	c := l.Physics.Calibration
	require.NotNil(t, c)
	assert.Len(t, c.Points, 4)
	assert.Less(t, c.LargestPct, perf.CalibrationTolerancePct)
	assert.False(t, c.BoundHit)
	assert.Equal(t, c.ApproachAngleDeg, l.Physics.ApproachAngleDeg, "the fitted values are the model's")
	_, err = perf.LandingModelFor(d.Aircraft)
	assert.NoError(t, err)
}

const landingPhysicsProfile = `kind: aircraft
name: Test
type: Test type
mtow: 1000 kg
min_mass: 700 kg
speeds: {rotation: 55 kt, at_50ft: 62 kt}
limits:
  demonstrated_crosswind: 15 kt
takeoff_flap: "10"
flaps:
  - {name: "10", clmax: 1.6}
  - {name: "30", clmax: 1.9}
PHYSICS
landing:
  flap: "30"
  physics:
    cd0: 0.06
CALIBRATION
`

const physicsSection = `physics:
  wing_area: 15 m2
  span: 10 m
  wing_height: 1 m
  cd0: 0.032
  oswald: 0.75
  cl_ground_run: 0.3
  power: 100 kW
  propeller: {type: fixed_pitch, diameter: 1.8 m}
  calibration:
    - {pressure_altitude: 0 ft, temperature: 15 C, weight: 1000 kg, ground_roll: 260 m, to_50ft: 470 m}
`

// A physics landing model needs the profile's airframe (its physics section); without
// calibration points it loads with a warning and is refused where a figure is asked.
func TestLandingPhysicsNeedsAirframeAndCalibration(t *testing.T) {
	src := strings.NewReplacer("PHYSICS\n", "", "CALIBRATION\n", "").Replace(landingPhysicsProfile)
	_, err := Parse("no-airframe.yaml", []byte(src))
	require.Error(t, err)
	assert.Contains(t, err.Error(), "landing.physics: the physics landing model flies the airframe of the profile's physics section")

	src = strings.NewReplacer("PHYSICS\n", physicsSection, "CALIBRATION\n", "").Replace(landingPhysicsProfile)
	doc, err := Parse("uncalibrated.yaml", []byte(src))
	require.NoError(t, err)
	assert.Contains(t, strings.Join(doc.Warnings, "\n"), "landing.physics.calibration: not calibrated")
	_, err = perf.LandingModelFor(doc.Aircraft)
	assert.True(t, errors.Is(err, perf.ErrNotCalibrated), "got %v", err)
	assert.Contains(t, err.Error(), "from_50ft")

	cal := "    calibration:\n      - {pressure_altitude: 0 ft, temperature: 15 C, weight: 1000 kg, ground_roll: 230 m, from_50ft: 420 m}\n"
	src = strings.NewReplacer("PHYSICS\n", physicsSection, "CALIBRATION\n", cal).Replace(landingPhysicsProfile)
	doc, err = Parse("calibrated.yaml", []byte(src))
	require.NoError(t, err)
	_, err = perf.LandingModelFor(doc.Aircraft)
	assert.NoError(t, err)
	assert.Less(t, doc.Aircraft.Landing.Physics.Calibration.LargestPct, 0.5, "one point, two figures, two parameters")

	// A landing figure far off any fit is refused at its line.
	bad := "    calibration:\n      - {pressure_altitude: 0 ft, temperature: 15 C, weight: 1000 kg, ground_roll: 230 m, from_50ft: 2400 m}\n"
	src = strings.NewReplacer("PHYSICS\n", physicsSection, "CALIBRATION\n", bad).Replace(landingPhysicsProfile)
	_, err = Parse("bad-fit.yaml", []byte(src))
	require.Error(t, err)
	assert.Contains(t, err.Error(), "landing.physics")
}
