package spec

import (
	"bytes"
	"errors"
	"io/fs"
	"os"
	"regexp"
	"strings"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"

	"kneeprint/airfields"
	"kneeprint/templates"
)

// Issue 9.9: an unedited starter is refused, each placeholder named by its key; with
// every placeholder replaced (here: the mark removed) it loads.
func TestStarterPlaceholdersRefused(t *testing.T) {
	for _, tc := range []struct {
		file string
		keys []string // a few of the keys that must be named
	}{
		{templates.StarterAircraft, []string{"name", "mtow", "min_mass", "weights[0]", "table.pressure_altitudes[0]", "table.weights[0].ground_roll[0][0]", "table.wind_factoring_included"}},
		{templates.StarterAirfield, []string{"name", "ident", "elevation", "runways[0].ends[0].tora", "runways[0].slope"}},
	} {
		t.Run(tc.file, func(t *testing.T) {
			data, err := fs.ReadFile(templates.FS, tc.file)
			require.NoError(t, err)
			_, err = Parse("starter.yaml", data)
			require.Error(t, err)
			var list ErrorList
			require.True(t, errors.As(err, &list))
			fields := map[string]bool{}
			for _, e := range list {
				if e.Line == 0 && strings.Contains(e.Msg, "more errors not listed") {
					continue // the list is capped; the rest follow once these are fixed
				}
				assert.Greater(t, e.Line, 0, "every placeholder has a line: %v", e)
				fields[e.Field] = true
				if e.Field != "table.wind_factoring_included" {
					assert.Contains(t, e.Msg, "starter placeholder", e.Error())
				}
			}
			for _, k := range tc.keys {
				assert.True(t, fields[k], "%s not named in\n%v", k, err)
			}
			// The placeholders are the only problem: with the marks removed and the
			// wind question answered, the starter loads without a warning.
			fixed := bytes.ReplaceAll(data, []byte(PlaceholderMark+" "), nil)
			fixed = regexp.MustCompile(`(?m)^(\s*wind_factoring_included:)\s*(#.*)?$`).ReplaceAll(fixed, []byte("$1 false"))
			doc, err := Parse("starter.yaml", fixed)
			require.NoError(t, err)
			assert.Empty(t, doc.Warnings)
		})
	}
}

// Every figure of the starter is a placeholder, not only the first of each row, and so
// are the figures of its commented-out sections: a pilot who deletes the marks he sees
// on the first cells, or uncomments the landing example, still gets a refusal at each
// figure left as typed by kneeprint (an independent review found a starter that
// validated with invented landing figures).
func TestStarterEveryFigureIsAPlaceholder(t *testing.T) {
	data, err := fs.ReadFile(templates.FS, templates.StarterAircraft)
	require.NoError(t, err)
	text := string(data)
	// Delete only the first mark of each table row, as a hurried pilot might.
	text = regexp.MustCompile(`(?m)^(\s*- \[)EXAMPLE `).ReplaceAllString(text, "$1")
	_, err = Parse("starter.yaml", []byte(text))
	require.Error(t, err)
	assert.Contains(t, err.Error(), "table.weights[0].ground_roll[0][1]: \"EXAMPLE 750\" is a starter placeholder")
	// Uncomment the landing example and answer everything else: its figures are
	// placeholders too.
	text = strings.ReplaceAll(string(data), PlaceholderMark+" ", "")
	text = regexp.MustCompile(`(?m)^(\s*wind_factoring_included:)\s*(#.*)?$`).ReplaceAllString(text, "$1 false")
	i := strings.Index(string(data), "# landing:")
	require.Positive(t, i)
	landing := regexp.MustCompile(`(?m)^# ?`).ReplaceAllString(string(data[i:]), "")
	text = text[:strings.Index(text, "# landing:")] + landing
	_, err = Parse("starter.yaml", []byte(text))
	require.Error(t, err)
	assert.Contains(t, err.Error(), "landing.approach_speed: \"EXAMPLE 60 kt\" is a starter placeholder")
	assert.Contains(t, err.Error(), "landing.table.weights[0].from_50ft[0][0]")
}

// Issue 9.10: wind_factoring_included has no default; its absence is explained.
func TestWindFactoringRequired(t *testing.T) {
	data, err := fs.ReadFile(templates.FS, "aircraft/sedgefin-sf2.yaml")
	require.NoError(t, err)
	for _, variant := range []string{
		strings.Replace(string(data), "  wind_factoring_included: true\n", "", 1),
		strings.Replace(string(data), "  wind_factoring_included: true\n", "  wind_factoring_included:\n", 1),
	} {
		_, err = Parse("ac.yaml", []byte(variant))
		require.Error(t, err)
		assert.Contains(t, err.Error(), "table.wind_factoring_included: required, no default")
		assert.Contains(t, err.Error(), "flight manual")
	}
}

const physicsProfile = `kind: aircraft
name: P
type: P
mtow: 1200 kg
limits: {demonstrated_crosswind: 15 kt}
speeds: {rotation: 60 kt, at_50ft: 66 kt}
takeoff_flap: "0"
flaps: [{name: "0", clmax: 1.5}]
physics:
  wing_area: 16 m2
  span: 10.5 m
  wing_height: 1.0 m
  cd0: 0.032
  oswald: 0.75
  cl_ground_run: 0.3
  power: 120 kW
  propeller: {type: fixed_pitch, diameter: 1.85 m, efficiency: 0.65, static_thrust_fraction: 0.7}
  rotation_time: 1 s
`

// Issue 14.2: a profile states its lowest flyable mass; the table's lightest block by
// default, required for a physics profile; no card weight below it.
func TestMinMass(t *testing.T) {
	doc, err := Load(templates.FS, "aircraft/sedgefin-sf2.yaml")
	require.NoError(t, err)
	assert.InDelta(t, 800, doc.Aircraft.MinMassKg, 1e-9, "the table's lightest block")
	assert.Contains(t, strings.Join(doc.Defaults, "\n"), "min_mass not given")

	_, err = Parse("p.yaml", []byte(physicsProfile))
	require.Error(t, err)
	assert.Contains(t, err.Error(), `p.yaml:1:1: min_mass: missing required field "min_mass"`)

	doc, err = Parse("p.yaml", []byte(physicsProfile+"min_mass: 800 kg\n"))
	require.NoError(t, err)
	assert.InDelta(t, 800, doc.Aircraft.MinMassKg, 1e-9)

	for _, tc := range []struct{ extra, want string }{
		{"min_mass: 1300 kg\n", "min_mass: 1300 kg is not below the MTOW 1200 kg"},
		{"min_mass: 800 kg\nweights: [1200 kg, 700 kg]\n", "weights[1]: 700 kg is below the lowest flyable mass (min_mass) 800 kg"},
		{"min_mass: 50 kg\n", "min_mass: 50 kg is outside the accepted range"},
	} {
		_, err = Parse("p.yaml", []byte(physicsProfile+tc.extra))
		require.Error(t, err, tc.extra)
		assert.Contains(t, err.Error(), tc.want)
	}
}

// Issue 14 ("Smaller"): "-3 deg W" gives the sign and the hemisphere both: refused,
// not read as 3 deg E.
func TestVariationSignAndHemisphere(t *testing.T) {
	for in, want := range map[string]float64{"3 deg E": 3, "3 deg W": -3, "-3 deg": -3, "3 deg": 3} {
		doc, err := Parse("af.yaml", []byte(strings.Replace(okAirfield, "elevation: 300 ft\n", "elevation: 300 ft\nvariation: "+in+"\n", 1)))
		require.NoError(t, err, in)
		assert.InDelta(t, want, doc.Airfield.VariationDeg, 1e-12, in)
	}
	for _, in := range []string{"-3 deg W", "+3 deg E", "-3 deg E", "3 deg EW"} {
		_, err := Parse("af.yaml", []byte(strings.Replace(okAirfield, "elevation: 300 ft\n", "elevation: 300 ft\nvariation: "+in+"\n", 1)))
		require.Error(t, err, in)
		assert.Contains(t, err.Error(), "af.yaml:5:12: variation:", in)
	}
}

// Issue 9.7: validate warns when a threshold is above the aerodrome elevation.
func TestThresholdAboveAerodromeWarns(t *testing.T) {
	body := strings.Replace(string(mustRead(t, airfields.FS, "saltpan.yaml")), "elevation: 4975 ft", "elevation: 4950 ft", 1)
	doc, err := Parse("saltpan.yaml", []byte(body))
	require.NoError(t, err)
	require.Len(t, doc.Warnings, 1)
	assert.Contains(t, doc.Warnings[0], "runways[0].ends[1].threshold_elevation: 4975 ft is above the aerodrome elevation 4950 ft")
}

// Issue 14.3: the warning about a short ASDA says what is done with it, and is true.
func TestShortASDAWarning(t *testing.T) {
	doc, err := Parse("af.yaml", []byte(strings.Replace(okAirfield, "tora: 800 m\n", "tora: 800 m\n        asda: 300 m\n", 1)))
	require.NoError(t, err)
	require.Len(t, doc.Warnings, 1)
	assert.Contains(t, doc.Warnings[0], "ASDA 300 m is shorter than TORA 800 m: kneeprint takes the ASDA as the takeoff run available")
}

// Issue 14 ("Smaller"): whole days only.
func TestValidDaysWhole(t *testing.T) {
	a5 := string(mustRead(t, templates.FS, "cards/a5.yaml"))
	_, err := Parse("t.yaml", []byte(strings.Replace(a5, "valid_days: 120", "valid_days: 1.9", 1)))
	require.Error(t, err)
	assert.Contains(t, err.Error(), "valid_days: 1.9 is not a whole number of days")
}

// Issue 14 ("Smaller"): the command line's runway is read as the file's designator.
func TestNormalizeDesignator(t *testing.T) {
	for in, want := range map[string]string{"7": "07", "07": "07", "25": "25", "9L": "09L", "09r": "09R", "36": "36"} {
		got, err := NormalizeDesignator(in)
		require.NoError(t, err, in)
		assert.Equal(t, want, got, in)
	}
	for _, in := range []string{"0", "37", "7X", "", "-7", "007"} {
		_, err := NormalizeDesignator(in)
		assert.Error(t, err, in)
	}
}

func mustRead(t *testing.T, fsys fs.FS, p string) []byte {
	t.Helper()
	b, err := fs.ReadFile(fsys, p)
	require.NoError(t, err)
	return b
}

// Issue 9.11: validate's figure to hold against the manual. The demo trainer's
// (invented) table at 0 ft, MTOW 1000 kg gives 795 and 855 ft of ground roll at 10 and
// 20 C, 1440 and 1550 ft to 50 ft: at ISA 15 C, 825 ft and 1495 ft (linear
// interpolation), 252 m and 456 m rounded up (1 ft = 0.3048 m).
func TestReferenceFigures(t *testing.T) {
	doc, err := Load(templates.FS, "aircraft/sedgefin-sf2.yaml")
	require.NoError(t, err)
	ref, err := ReferenceFigures(doc.Aircraft)
	require.NoError(t, err)
	assert.InDelta(t, 825*0.3048, ref.GroundRollM, 1e-9)
	assert.InDelta(t, 1495*0.3048, ref.To50ftM, 1e-9)
	assert.Empty(t, ref.Warning, "a plausible table: %.3f g", ref.MeanAccelG)
	var b bytes.Buffer
	Summarize(&b, doc)
	assert.Contains(t, b.String(), "ground roll 252 m (825 ft), to 50 ft 456 m (1495 ft)")

	// A feet table marked m: 3.28 times too long, a mean acceleration too small.
	data := mustRead(t, templates.FS, "aircraft/sedgefin-sf2.yaml")
	slip, err := Parse("slip.yaml", bytes.Replace(data, []byte("distance_unit: ft"), []byte("distance_unit: m"), 1))
	require.NoError(t, err)
	ref, err = ReferenceFigures(slip.Aircraft)
	require.NoError(t, err)
	assert.Less(t, ref.MeanAccelG, minPlausibleAccelG)
	b.Reset()
	Summarize(&b, slip)
	assert.Contains(t, b.String(), "warnings:")
	assert.Contains(t, b.String(), "check the table's distance_unit")

	// A metre table marked ft: 3.28 times too short.
	ok := mustRead(t, os.DirFS("testdata/bad"), "ok-aircraft.yaml")
	ok = bytes.Replace(ok, []byte("mtow: 1000 kg\n"), []byte("mtow: 1000 kg\nspeeds: {rotation: 55 kt}\n"), 1)
	good, err := Parse("ok.yaml", ok)
	require.NoError(t, err)
	ref, err = ReferenceFigures(good.Aircraft)
	require.NoError(t, err)
	assert.Empty(t, ref.Warning, "%.3f g", ref.MeanAccelG)
	slip, err = Parse("slip.yaml", bytes.Replace(ok, []byte("distance_unit: m"), []byte("distance_unit: ft"), 1))
	require.NoError(t, err)
	ref, err = ReferenceFigures(slip.Aircraft)
	require.NoError(t, err)
	assert.Greater(t, ref.MeanAccelG, maxPlausibleAccelG)
	assert.NotEmpty(t, ref.Warning)

	// The physics demo answers through whatever model the profile selects.
	doc, err = Load(templates.FS, "aircraft/quillwing-qt6.yaml")
	require.NoError(t, err)
	ref, err = ReferenceFigures(doc.Aircraft)
	require.NoError(t, err)
	assert.Greater(t, ref.To50ftM, ref.GroundRollM)
	assert.Empty(t, ref.Warning, "%.3f g", ref.MeanAccelG)
}

// A card template assuming a QNH above the standard 1013.25 hPa (ICAO Doc 7488) is
// warned about: its figures are too short on any day with a lower QNH.
func TestTemplateHighQNHWarns(t *testing.T) {
	data, err := fs.ReadFile(templates.FS, "cards/a5.yaml")
	require.NoError(t, err)
	doc, err := Parse("t.yaml", data)
	require.NoError(t, err)
	assert.Empty(t, doc.Warnings, "the a5 preset assumes 1000 hPa")
	doc, err = Parse("t.yaml", []byte(strings.Replace(string(data), "qnh: 1000 hPa", "qnh: 1030 hPa", 1)))
	require.NoError(t, err)
	require.Len(t, doc.Warnings, 1)
	assert.Contains(t, doc.Warnings[0], "t.yaml:")
	assert.Contains(t, doc.Warnings[0], "qnh: 1030 hPa is above the standard 1013.25 hPa")
}
