package spec

import (
	"io/fs"
	"strings"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"

	"kneeprint/perf"
	"kneeprint/templates"
)

// Obstacles as the loader reads them (issue 12 item 1): every form resolved to a
// height above the end of the TORA and a distance past it, in SI. 1 ft = 0.3048 m
// exactly (ICAO Annex 5).
func TestObstaclesRead(t *testing.T) {
	doc, err := Parse("field.yaml", []byte(`kind: airfield
name: Test field
ident: TST-1
elevation: 300 ft
runways:
  - surface: grass
    ends:
      - designator: "09"
        tora: 800 m
        threshold_elevation: 280 ft
        obstacles:
          - {note: wires, height: 35 ft, past_end: 400 m, lateral: 30 m left}
          - {note: mast, elevation: 420 ft, from_start: 3000 ft, lateral: 100 ft right}
      - designator: "27"
        tora: 750 m
        threshold_elevation: 300 ft
        obstacles:
          - {note: hedge, height: 4 m, past_end: 0 m, lateral: 0 m}
`))
	require.NoError(t, err)
	ends := doc.Airfield.Ends()
	require.Len(t, ends[0].Obstacles, 2)
	w, m := ends[0].Obstacles[0], ends[0].Obstacles[1]
	assert.Equal(t, "wires", w.Note)
	assert.InDelta(t, 35*0.3048, w.HeightM, 1e-9)
	assert.InDelta(t, 400, w.PastEndM, 1e-9)
	assert.InDelta(t, -30, w.LateralM, 1e-9, "left is negative")
	// The mast's top, 420 ft above sea level, over the end of 09's TORA: the threshold
	// of 27 at 300 ft, so 120 ft; 3000 ft from the start of the run is 914.4 m, 114.4 m
	// past the 800 m TORA.
	assert.InDelta(t, 120*0.3048, m.HeightM, 1e-9)
	assert.InDelta(t, 3000*0.3048-800, m.PastEndM, 1e-9)
	assert.InDelta(t, 30.48, m.LateralM, 1e-9)
	require.Len(t, ends[1].Obstacles, 1)
	assert.InDelta(t, 4, ends[1].Obstacles[0].HeightM, 1e-9)
	assert.Zero(t, ends[1].Obstacles[0].LateralM)

	var out strings.Builder
	Summarize(&out, doc)
	assert.Contains(t, out.String(), "obstacle: wires: top 35 ft above the end of the TORA, 400 m past it, 30 m left")
}

// Climb data (issue 12 item 2): a table in ft/min or m/s to SI; one table without
// weights is the MTOW's; a physics profile may give the speed alone.
func TestClimbRead(t *testing.T) {
	base := `kind: aircraft
name: Test
type: Test type
mtow: 1000 kg
speeds: {rotation: 55 kt}
limits:
  demonstrated_crosswind: 15 kt
takeoff_flap: "0"
table:
  wind_factoring_included: true
  distance_unit: m
  pressure_altitudes: [0 ft, 4000 ft]
  temperatures: [0 C, 30 C]
  weights:
    - weight: 1000 kg
      ground_roll:
        - [250, 300]
        - [320, 380]
      to_50ft:
        - [450, 540]
        - [580, 690]
`
	doc, err := Parse("a.yaml", []byte(base+`climb:
  speed: 65 kt
  rate_unit: ft/min
  pressure_altitudes: [0 ft, 4000 ft]
  temperatures: [0 C, 30 C]
  rate_of_climb:
    - [700, 600]
    - [520, 430]
`))
	require.NoError(t, err)
	c := doc.Aircraft.Climb
	require.NotNil(t, c)
	assert.InDelta(t, 65*1852.0/3600, c.SpeedIASMS, 1e-9)
	require.NotNil(t, c.Table)
	assert.Equal(t, []float64{1000}, c.Table.WeightKg, "one table: the MTOW's")
	assert.InDelta(t, 700*0.3048/60, c.Table.RateMS[0][0][0], 1e-12)
	assert.InDelta(t, 430*0.3048/60, c.Table.RateMS[0][1][1], 1e-12)
	var out strings.Builder
	Summarize(&out, doc)
	// At sea level ISA, 15 C, halfway between the 700 and 600 ft/min columns: 650
	// ft/min; 65 kt true airspeed at sea level is 6582.5 ft/min over the ground in
	// still air (1 kt = 6076.12 ft/h), 9.87 %.
	assert.Contains(t, out.String(), "reference climb, to hold against the manual: sea level ISA, MTOW 1000 kg, 65 kt: 650 ft/min, 9.9 % in still air")

	doc, err = Parse("a.yaml", []byte(base+`climb:
  speed: 65 kt
  rate_unit: m/s
  pressure_altitudes: [0 ft, 4000 ft]
  temperatures: [0 C, 30 C]
  weights:
    - {weight: 800 kg, rate_of_climb: [[4.5, 4.0], [3.5, 3.0]]}
    - {weight: 1000 kg, rate_of_climb: [[3.5, 3.0], [2.6, 2.2]]}
`))
	require.NoError(t, err)
	assert.Equal(t, []float64{800, 1000}, doc.Aircraft.Climb.Table.WeightKg)
	assert.InDelta(t, 2.2, doc.Aircraft.Climb.Table.RateMS[1][1][1], 1e-12)
	cm, err := perf.ClimbFor(doc.Aircraft)
	require.NoError(t, err)
	r, err := cm.Climb(perf.Conditions{PressureAltM: 0, TempK: 273.15, MassKg: 900})
	require.NoError(t, err)
	assert.InDelta(t, 4.0, r.RateMS, 1e-12, "halfway between the blocks")

	// Below the rotation speed: legal, but said.
	doc, err = Parse("a.yaml", []byte(base+"climb:\n  speed: 50 kt\n  rate_unit: ft/min\n  pressure_altitudes: [0 ft]\n  temperatures: [0 C]\n  rate_of_climb: [[700]]\n"))
	require.NoError(t, err)
	assert.Contains(t, strings.Join(doc.Warnings, "\n"), "climb.speed: 50 kt is below the rotation speed 55 kt")
}

// The card template's obstacle margin: 50 ft unless it says (common practice); 10 to
// 500 ft accepted.
func TestTemplateObstacleMargin(t *testing.T) {
	tpl := func(extra string) string {
		return `kind: card-template
name: t
page: a5
unit: m
policy: uk-advisory
qnh: 1000 hPa
tight_margin: 10 %
temperatures: [0 C, 10 C]
winds: [0 kt, 10 kt]
max_blocks: 1
crosswind_speeds: [10 kt]
crosswind_angles: [30 deg]
valid_days: 100
` + extra
	}
	doc, err := Parse("t.yaml", []byte(tpl("")))
	require.NoError(t, err)
	assert.InDelta(t, 15.24, doc.Template.ObstacleMarginM, 1e-9)
	doc, err = Parse("t.yaml", []byte(tpl("obstacle_margin: 30 m\n")))
	require.NoError(t, err)
	assert.InDelta(t, 30, doc.Template.ObstacleMarginM, 1e-9)
	_, err = Parse("t.yaml", []byte(tpl("obstacle_margin: 0 ft\n")))
	require.Error(t, err)
	assert.Contains(t, err.Error(), "t.yaml:14:18: obstacle_margin: 0 ft is outside the accepted range")
}

// A climb table's rates of zero or less mean no climb: the loader accepts them (a
// manual may print them), validate warns at each with its line, since every cell at
// those conditions is "no takeoff" on every runway end (perf: the no-climb check).
func TestClimbNoClimbWarned(t *testing.T) {
	const ac = `kind: aircraft
name: Test
type: Test type
mtow: 1000 kg
speeds: {rotation: 55 kt}
limits:
  demonstrated_crosswind: 15 kt
takeoff_flap: "0"
table:
  wind_factoring_included: true
  distance_unit: m
  pressure_altitudes: [0 ft, 4000 ft]
  temperatures: [0 C, 30 C]
  weights:
    - weight: 1000 kg
      ground_roll:
        - [250, 300]
        - [320, 380]
      to_50ft:
        - [450, 540]
        - [580, 690]
climb:
  speed: 65 kt
  rate_unit: ft/min
  pressure_altitudes: [0 ft, 4000 ft]
  temperatures: [0 C, 30 C]
  rate_of_climb:
    - [300, 0]
    - [120, -40]
`
	doc, err := Parse("a.yaml", []byte(ac))
	require.NoError(t, err)
	w := strings.Join(doc.Warnings, "\n")
	assert.Contains(t, w, "a.yaml:28: climb (1000 kg).rate_of_climb[0][1]: 0 ft/min at 0 ft, 30 C: no climb")
	assert.Contains(t, w, "a.yaml:29: climb (1000 kg).rate_of_climb[1][1]: -40 ft/min at 4000 ft, 30 C: no climb")
	assert.NotContains(t, w, "rate_of_climb[0][0]")
	assert.NotContains(t, w, "rate_of_climb[1][0]")
	assert.Len(t, doc.Warnings, 2)
}

// The headwind note takes an optional up_to, as the tailwind note does: beyond it,
// no data. validate prints it, or says what is assumed without it.
func TestHeadwindNoteUpTo(t *testing.T) {
	data, err := fs.ReadFile(templates.FS, "aircraft/sedgefin-sf2.yaml")
	require.NoError(t, err)
	s := strings.Replace(string(data), "headwind: {decrease: 6 %, per: 5 kt}", "headwind: {decrease: 6 %, per: 5 kt, up_to: 20 kt}", 1)
	doc, err := Parse("a.yaml", []byte(s))
	require.NoError(t, err)
	assert.InDelta(t, 20*1852.0/3600, doc.Aircraft.Table.Corrections.HeadwindMaxMS, 1e-12)
	var out strings.Builder
	Summarize(&out, doc)
	assert.Contains(t, out.String(), "headwind: -6 % per 5 kt up to 20 kt")

	doc, err = Load(templates.FS, "aircraft/sedgefin-sf2.yaml")
	require.NoError(t, err)
	out.Reset()
	Summarize(&out, doc)
	assert.Contains(t, out.String(), "headwind: -6 % per 5 kt (no up_to: no data beyond half the lift-off speed, 55 kt IAS)")

	_, err = Parse("a.yaml", []byte(strings.Replace(string(data), "per: 5 kt}", "per: 5 kt, up_to: 0 kt}", 1)))
	require.Error(t, err)
	assert.Contains(t, err.Error(), "table.corrections.headwind.up_to: 0 kt is outside the accepted range 1 to 60 kt")
}
