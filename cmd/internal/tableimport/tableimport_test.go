package tableimport

import (
	"bytes"
	"fmt"
	"io/fs"
	"os"
	"regexp"
	"strconv"
	"strings"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"

	"kneeprint/cmd/internal/spec"
	"kneeprint/cmd/internal/typedtable"
	"kneeprint/templates"
)

// csvOf writes a profile's typed table in the documented CSV layout.
func csvOf(tables []*typedtable.Table, unit, wind string, sep string) string {
	var b strings.Builder
	fmt.Fprintf(&b, "distance_unit%s%s\n", sep, unit)
	if wind != "" {
		fmt.Fprintf(&b, "wind_factoring_included%s%s\n", sep, wind)
	}
	gr, to := tables[0], tables[1]
	for i, bl := range gr.Blocks {
		fmt.Fprintf(&b, "weight%s%s\n", sep, bl.Weight.Text)
		for _, t := range []*typedtable.Table{gr, to} {
			b.WriteString(t.Key)
			for _, c := range t.Temperatures {
				b.WriteString(sep + c.Text)
			}
			b.WriteString("\n")
			for p, pa := range t.PressureAltitudes {
				b.WriteString(pa.Text)
				for _, c := range t.Blocks[i].Rows[p] {
					b.WriteString(sep + c.Text)
				}
				b.WriteString("\n")
			}
		}
	}
	return b.String()
}

// profileWith replaces the demo profile's table section by the imported one.
func profileWith(t *testing.T, table []byte) []byte {
	t.Helper()
	demo, err := fs.ReadFile(templates.FS, "aircraft/sedgefin-sf2.yaml")
	require.NoError(t, err)
	s := string(demo)
	i := strings.Index(s, "\ntable:\n")
	require.Positive(t, i)
	return []byte(s[:i+1] + string(table))
}

// Issue 13.4: the demo table typed as CSV comes back as the same table section: the
// output, run through the loader in the demo profile, gives the demo's table figure
// for figure and unit for unit; with semicolons, a spreadsheet's byte-order mark and
// padded rows too.
func TestRoundTripThroughTheLoader(t *testing.T) {
	demo, err := spec.Load(templates.FS, "aircraft/sedgefin-sf2.yaml")
	require.NoError(t, err)
	for _, variant := range []struct {
		name string
		csv  string
	}{
		{"commas", csvOf(demo.Tables, "ft", "true", ",")},
		{"semicolons with BOM and padding", "\xef\xbb\xbf" + strings.ReplaceAll(csvOf(demo.Tables, "ft", "true", ";"), "\n", ";;\n")},
		{"tabs and comments", "# typed from the manual, page 5-12\n" + csvOf(demo.Tables, "ft", "true", "\t")},
	} {
		t.Run(variant.name, func(t *testing.T) {
			res, err := Import(Takeoff, "demo.csv", []byte(variant.csv))
			require.NoError(t, err)
			assert.Empty(t, res.Warnings)
			doc, err := spec.Parse("imported.yaml", profileWith(t, res.YAML))
			require.NoError(t, err, "%s", res.YAML)
			assert.Equal(t, demo.Aircraft.Table.GroundRollM, doc.Aircraft.Table.GroundRollM)
			assert.Equal(t, demo.Aircraft.Table.To50ftM, doc.Aircraft.Table.To50ftM)
			assert.Equal(t, demo.Aircraft.Table.PressureAltM, doc.Aircraft.Table.PressureAltM)
			assert.Equal(t, demo.Aircraft.Table.TempK, doc.Aircraft.Table.TempK)
			assert.Equal(t, demo.Aircraft.Table.WeightKg, doc.Aircraft.Table.WeightKg)
			assert.True(t, doc.Aircraft.Table.WindInData)
		})
	}
}

// Without the wind factoring answer, the YAML leaves it empty: the loader refuses it
// until the pilot answers, then loads it.
func TestWindFactoringLeftToThePilot(t *testing.T) {
	demo, err := spec.Load(templates.FS, "aircraft/sedgefin-sf2.yaml")
	require.NoError(t, err)
	res, err := Import(Takeoff, "demo.csv", []byte(csvOf(demo.Tables, "ft", "", ",")))
	require.NoError(t, err)
	assert.Equal(t, []string{"table.wind_factoring_included"}, res.Unanswered)
	assert.Contains(t, string(res.YAML), "  wind_factoring_included:\n")
	_, err = spec.Parse("imported.yaml", profileWith(t, res.YAML))
	require.Error(t, err)
	assert.Contains(t, err.Error(), "table.wind_factoring_included: required, no default")
	answered := bytes.Replace(res.YAML, []byte("  wind_factoring_included:\n"), []byte("  wind_factoring_included: false\n"), 1)
	_, err = spec.Parse("imported.yaml", profileWith(t, answered))
	require.NoError(t, err)
}

// The loader's checks, at the CSV's lines and columns; and the layout's own.
func TestErrorsAtCSVPlaces(t *testing.T) {
	good := `distance_unit,ft
wind_factoring_included,true
weight,800 kg
ground_roll,-10 C,0 C,10 C
0 ft,415,450,485
2000 ft,485,525,565
to_50ft,-10 C,0 C,10 C
0 ft,755,820,885
2000 ft,900,975,1050
`
	_, err := Import(Takeoff, "t.csv", []byte(good))
	require.NoError(t, err)
	for _, tc := range []struct {
		name, from, to string
		want           []string
	}{
		{"not a number", "0 ft,415,450,485", "0 ft,415,abc,485", []string{`t.csv:5:10: table.weights[0].ground_roll[0][1]: expected a plain number, found "abc"`}},
		{"falls with temperature", "2000 ft,900,975,1050", "2000 ft,900,795,1050", []string{
			"t.csv:9:13: table.weights (800 kg).to_50ft[1][1]: distance falls as temperature rises"}},
		{"bare number axis", ",-10 C,0 C,10 C", ",-10,0 C,10 C", []string{ // in both headers
			`t.csv:4:13: table.temperatures[0]: "-10" has no unit`}},
		{"unit", "distance_unit,ft", "distance_unit,yd", []string{`t.csv:1:15: table.distance_unit: "yd" is not one of: m, ft`}},
		{"wind answer", "wind_factoring_included,true", "wind_factoring_included,yes", []string{
			`t.csv:2:25: table.wind_factoring_included: expected true or false, found "yes"`}},
		{"other temperatures", "to_50ft,-10 C,0 C,10 C", "to_50ft,-10 C,0 C,20 C", []string{
			"t.csv:7:1: to_50ft: temperatures -10 C, 0 C, 20 C differ from the first block's -10 C, 0 C, 10 C"}},
		{"other altitudes", "2000 ft,900,975,1050", "3000 ft,900,975,1050", []string{
			`t.csv:9:1: to_50ft: pressure altitude "3000 ft": the first block's rows give "2000 ft" here`}},
		{"missing rows", "2000 ft,900,975,1050\n", "", []string{
			"t.csv:7:1: to_50ft: 1 row(s) under this line, the first block has 2 pressure altitudes (0 ft, 2000 ft)"}},
		{"settings late", "2000 ft,900,975,1050", "2000 ft,900,975,1050\ndistance_unit,m", []string{
			"t.csv:10:1: distance_unit: settings come before the first weight block"}},
		{"unknown line", "distance_unit,ft", "rows,415\ndistance_unit,ft", []string{`t.csv:1:1: "rows": expected distance_unit, wind_factoring_included, weight, ground_roll or to_50ft here`}},
		{"bad CSV", "0 ft,415,450,485", `0 ft,415,4"50,485`, []string{`t.csv:5:11: not valid CSV: bare " in non-quoted-field`}},
	} {
		t.Run(tc.name, func(t *testing.T) {
			require.Contains(t, good, tc.from)
			_, err := Import(Takeoff, "t.csv", []byte(strings.ReplaceAll(good, tc.from, tc.to)))
			require.Error(t, err)
			for _, w := range tc.want {
				found := false
				for _, l := range strings.Split(err.Error(), "\n") {
					found = found || strings.HasPrefix(l, w)
				}
				assert.True(t, found, "got\n%v\nwant a line starting %q", err, w)
			}
		})
	}
	_, err = Import(Takeoff, "empty.csv", []byte("\n# nothing\n"))
	require.Error(t, err)
	assert.Contains(t, err.Error(), "no weight block found")
	_, err = Import(Takeoff, "big.csv", bytes.Repeat([]byte("x"), MaxBytes+1))
	require.Error(t, err)
}

// A planted transposition is a warning at its CSV line and column.
func TestOutlierAtCSVPlace(t *testing.T) {
	demo, err := spec.Load(templates.FS, "aircraft/sedgefin-sf2.yaml")
	require.NoError(t, err)
	text := csvOf(demo.Tables, "ft", "true", ",")
	// A slip that breaks the rise with temperature is the loader's error.
	text = strings.Replace(text, "4000 ft,1750,1890,2040", "4000 ft,1750,1620,2040", 1)
	require.Contains(t, text, "1620")
	_, err = Import(Takeoff, "slip.csv", []byte(text))
	require.Error(t, err)

	// One the rise does not catch: the 800 kg ground roll at 8000 ft, 40 C (1120)
	// typed 1210, a transposition, still above its neighbours.
	const row = "8000 ft,775,840,905,975,1045,1120"
	text = csvOf(demo.Tables, "ft", "true", ",")
	require.Contains(t, text, row)
	text = strings.Replace(text, row, "8000 ft,775,840,905,975,1045,1210", 1)
	res, err := Import(Takeoff, "slip.csv", []byte(text))
	require.NoError(t, err)
	require.Len(t, res.Warnings, 1, "%v", res.Warnings)
	line := 0
	for i, l := range strings.Split(text, "\n") {
		if strings.HasSuffix(l, ",1045,1210") {
			line = i + 1
		}
	}
	assert.Regexp(t, regexp.MustCompile(fmt.Sprintf(`^slip\.csv:%d:\d+: table\.weights\[0\]\.ground_roll\[4\]\[5\]: ground roll 1210 \(800 kg, 8000 ft, 40 C\) breaks the smooth pattern`, line)), res.Warnings[0])
}

// csvFor writes typed tables (one per quantity, same axes) in the documented CSV
// layout after the settings lines; without weight lines when single.
func csvFor(settings []string, tables []*typedtable.Table, single bool) string {
	var b strings.Builder
	for _, s := range settings {
		b.WriteString(s + "\n")
	}
	for i, bl := range tables[0].Blocks {
		if !single {
			fmt.Fprintf(&b, "weight,%s\n", bl.Weight.Text)
		}
		for _, t := range tables {
			b.WriteString(t.Key)
			for _, c := range t.Temperatures {
				b.WriteString("," + c.Text)
			}
			b.WriteString("\n")
			for p, pa := range t.PressureAltitudes {
				b.WriteString(pa.Text)
				for _, c := range t.Blocks[i].Rows[p] {
					b.WriteString("," + c.Text)
				}
				b.WriteString("\n")
			}
		}
	}
	return b.String()
}

// tablesOf returns the demo profile's typed tables of one section.
func tablesOf(t *testing.T, doc *spec.Document, section string) []*typedtable.Table {
	t.Helper()
	var out []*typedtable.Table
	for _, tab := range doc.Tables {
		if tab.Section == section {
			out = append(out, tab)
		}
	}
	require.NotEmpty(t, out, section)
	return out
}

// replaceSection replaces the top-level section key of a profile (from its line to
// the next top-level key or the end) by text.
func replaceSection(t *testing.T, profile, key, text string) string {
	t.Helper()
	lines := strings.SplitAfter(profile, "\n")
	start, end := -1, len(lines)
	for i, l := range lines {
		top := l != "" && l[0] != ' ' && l[0] != '#' && l[0] != '\n'
		switch {
		case start < 0 && strings.HasPrefix(l, key+":"):
			start = i
		case start >= 0 && top:
			end = i
		}
		if start >= 0 && end < len(lines) {
			break
		}
	}
	require.GreaterOrEqual(t, start, 0, key)
	return strings.Join(lines[:start], "") + text + strings.Join(lines[end:], "")
}

func demoProfile(t *testing.T) (string, *spec.Document) {
	t.Helper()
	data, err := fs.ReadFile(templates.FS, "aircraft/sedgefin-sf2.yaml")
	require.NoError(t, err)
	doc, err := spec.Parse("sedgefin-sf2.yaml", data)
	require.NoError(t, err)
	return string(data), doc
}

// The demo's landing table typed as CSV comes back as the landing section: pasted in
// place of the demo's, the loader reads the same table figure for figure, the flap
// and the wind factoring as given.
func TestLandingRoundTripThroughTheLoader(t *testing.T) {
	text, demo := demoProfile(t)
	csv := csvFor([]string{"flap,30°", "distance_unit,ft", "wind_factoring_included,true"}, tablesOf(t, demo, "landing.table"), false)
	res, err := Import(Landing, "landing.csv", []byte(csv))
	require.NoError(t, err)
	assert.Empty(t, res.Warnings)
	assert.Empty(t, res.Unanswered)
	require.Len(t, res.Tables, 2)
	assert.Equal(t, "landing.table.weights[2].from_50ft[4][5]", res.Tables[1].Field(2, 4, 5))
	assert.Contains(t, string(res.YAML), "landing:\n  flap: 30°\n")
	doc, err := spec.Parse("imported.yaml", []byte(replaceSection(t, text, "landing", string(res.YAML))))
	require.NoError(t, err, "%s", res.YAML)
	got, want := doc.Aircraft.Landing, demo.Aircraft.Landing
	assert.Equal(t, want.Table.GroundRollM, got.Table.GroundRollM)
	assert.Equal(t, want.Table.To50ftM, got.Table.To50ftM)
	assert.Equal(t, want.Table.PressureAltM, got.Table.PressureAltM)
	assert.Equal(t, want.Table.TempK, got.Table.TempK)
	assert.Equal(t, want.Table.WeightKg, got.Table.WeightKg)
	assert.True(t, got.Table.WindInData)
	assert.Equal(t, "30°", got.Flap)

	// Without flap and wind factoring the YAML leaves both to answer; the loader
	// refuses it until they are.
	csv = csvFor([]string{"distance_unit,ft"}, tablesOf(t, demo, "landing.table"), false)
	res, err = Import(Landing, "landing.csv", []byte(csv))
	require.NoError(t, err)
	assert.Equal(t, []string{"landing.flap", "landing.table.wind_factoring_included"}, res.Unanswered)
	_, err = spec.Parse("imported.yaml", []byte(replaceSection(t, text, "landing", string(res.YAML))))
	require.Error(t, err)
	assert.Contains(t, err.Error(), "landing.flap")
	assert.Contains(t, err.Error(), "landing.table.wind_factoring_included")
	answered := strings.Replace(strings.Replace(string(res.YAML), "  flap:\n", "  flap: \"30°\"\n", 1), "    wind_factoring_included:\n", "    wind_factoring_included: true\n", 1)
	_, err = spec.Parse("imported.yaml", []byte(replaceSection(t, text, "landing", answered)))
	require.NoError(t, err, "%s", answered)
}

// The demo's rate-of-climb table typed as CSV comes back as the climb section, in
// both forms: one block per weight, and one table without weight lines (the MTOW's).
func TestClimbRoundTripThroughTheLoader(t *testing.T) {
	text, demo := demoProfile(t)
	climb := tablesOf(t, demo, "climb")
	res, err := Import(Climb, "climb.csv", []byte(csvFor([]string{"speed,65 kt", "rate_unit,ft/min"}, climb, false)))
	require.NoError(t, err)
	assert.Empty(t, res.Warnings)
	assert.Empty(t, res.Unanswered)
	require.Len(t, res.Tables, 1)
	assert.True(t, res.Tables[0].Linear)
	doc, err := spec.Parse("imported.yaml", []byte(replaceSection(t, text, "climb", string(res.YAML))))
	require.NoError(t, err, "%s", res.YAML)
	assert.Equal(t, demo.Aircraft.Climb, doc.Aircraft.Climb, "speed and table, figure for figure")

	// One table, the 1000 kg block's figures, without weight lines, semicolons.
	one := &typedtable.Table{Key: climb[0].Key, PressureAltitudes: climb[0].PressureAltitudes, Temperatures: climb[0].Temperatures, Blocks: climb[0].Blocks[1:]}
	csv := strings.ReplaceAll(csvFor([]string{"speed,65 kt", "rate_unit,ft/min"}, []*typedtable.Table{one}, true), ",", ";")
	res, err = Import(Climb, "climb.csv", []byte(csv))
	require.NoError(t, err)
	assert.Contains(t, string(res.YAML), "\n  rate_of_climb:\n    - [760, 730, 700, 670, 640, 610]  # 0 ft\n")
	assert.NotContains(t, string(res.YAML), "\n  weights:")
	assert.Equal(t, "climb.rate_of_climb[4][5]", res.Tables[0].Field(0, 4, 5))
	doc, err = spec.Parse("imported.yaml", []byte(replaceSection(t, text, "climb", string(res.YAML))))
	require.NoError(t, err, "%s", res.YAML)
	got := doc.Aircraft.Climb.Table
	assert.Equal(t, []float64{1000}, got.WeightKg, "taken as the MTOW's")
	assert.Equal(t, demo.Aircraft.Climb.Table.RateMS[1], got.RateMS[0])

	// Without the speed the YAML leaves it to answer.
	res, err = Import(Climb, "climb.csv", []byte(csvFor([]string{"rate_unit,ft/min"}, climb, false)))
	require.NoError(t, err)
	assert.Equal(t, []string{"climb.speed"}, res.Unanswered)
	_, err = spec.Parse("imported.yaml", []byte(replaceSection(t, text, "climb", string(res.YAML))))
	require.Error(t, err)
	assert.Contains(t, err.Error(), "climb.speed")
}

// The loader's checks of a landing or climb section, at the CSV's lines and columns;
// and the layout's own.
func TestLandingAndClimbErrorsAtCSVPlaces(t *testing.T) {
	landing := `flap,30°
distance_unit,ft
wind_factoring_included,true
weight,800 kg
ground_roll,-10 C,0 C,10 C
0 ft,410,425,440
2000 ft,440,455,470
from_50ft,-10 C,0 C,10 C
0 ft,980,1020,1055
2000 ft,1055,1095,1130
`
	climb := `speed,65 kt
rate_unit,ft/min
weight,800 kg
rate_of_climb,-10 C,0 C,10 C
0 ft,960,930,900
2000 ft,830,800,770
weight,1000 kg
rate_of_climb,-10 C,0 C,10 C
0 ft,760,730,700
2000 ft,640,610,580
`
	for _, good := range []struct {
		k    Kind
		text string
	}{{Landing, landing}, {Climb, climb}} {
		_, err := Import(good.k, "t.csv", []byte(good.text))
		require.NoError(t, err, good.k)
	}
	for _, tc := range []struct {
		name     string
		k        Kind
		csv      string
		from, to string
		want     string
	}{
		{"landing distance falls", Landing, landing, "2000 ft,1055,1095,1130", "2000 ft,1055,995,1130",
			"t.csv:10:14: landing.table.weights (800 kg).from_50ft[1][1]: distance falls as temperature rises"},
		{"landing takeoff key", Landing, landing, "from_50ft,", "to_50ft,",
			`t.csv:8:1: to_50ft: the rows of a takeoff table (kneeprint import table): a landing table has ground_roll and from_50ft rows`},
		{"climb setting in a landing table", Landing, landing, "flap,30°", "speed,65 kt",
			`t.csv:1:1: speed: a setting of a rate-of-climb table (kneeprint import climb): a landing table's settings are flap, distance_unit and wind_factoring_included`},
		{"unknown line", Landing, landing, "flap,30°", "flaps,30°",
			`t.csv:1:1: "flaps": expected flap, distance_unit, wind_factoring_included, weight, ground_roll or from_50ft here`},
		{"flap a card cannot print", Landing, landing, "flap,30°", "flap,30° 字",
			"t.csv:1:6: landing.flap: a card cannot print"},
		{"rate rises with temperature", Climb, climb, "0 ft,760,730,700", "0 ft,760,780,700",
			"t.csv:9:10: climb (1000 kg).rate_of_climb[0][1]: rate of climb rises as temperature rises"},
		{"rate not a number", Climb, climb, "0 ft,960,930,900", "0 ft,960,9 30,900",
			`t.csv:5:10: climb.weights[0].rate_of_climb[0][1]: expected a plain number, found "9 30"`},
		{"rate unit", Climb, climb, "rate_unit,ft/min", "rate_unit,fpm",
			`t.csv:2:11: climb.rate_unit: "fpm" is not one of: ft/min, m/s`},
		{"speed out of range", Climb, climb, "speed,65 kt", "speed,650 kt",
			"t.csv:1:7: climb.speed:"},
		{"weight above the heaviest MTOW", Climb, climb, "weight,1000 kg", "weight,9000 kg",
			"t.csv:7:8: climb.weights[1].weight:"},
		{"a weight after a table without weights", Climb, strings.Replace(climb, "weight,800 kg\n", "", 1), "", "",
			"t.csv:6:1: weight: the rows above have no weight line"},
	} {
		t.Run(tc.name, func(t *testing.T) {
			text := tc.csv
			if tc.from != "" {
				require.Contains(t, text, tc.from)
				text = strings.Replace(text, tc.from, tc.to, 1)
			}
			_, err := Import(tc.k, "t.csv", []byte(text))
			require.Error(t, err)
			found := false
			for _, l := range strings.Split(err.Error(), "\n") {
				found = found || strings.HasPrefix(l, tc.want)
			}
			assert.True(t, found, "got\n%v\nwant a line starting %q", err, tc.want)
		})
	}
}

// A planted transposition in a climb CSV (the demo's 285 typed 258, which the loader
// accepts: the rates still fall) is a warning at its CSV line and column.
func TestClimbOutlierAtCSVPlace(t *testing.T) {
	_, demo := demoProfile(t)
	text := csvFor([]string{"speed,65 kt", "rate_unit,ft/min"}, tablesOf(t, demo, "climb"), false)
	const row = "8000 ft,285,255,225,195,165,135"
	require.Contains(t, text, row)
	text = strings.Replace(text, row, "8000 ft,258,255,225,195,165,135", 1)
	res, err := Import(Climb, "slip.csv", []byte(text))
	require.NoError(t, err)
	require.Len(t, res.Warnings, 1, "%v", res.Warnings)
	line := 1 + strings.Count(text[:strings.Index(text, "8000 ft,258")], "\n")
	assert.True(t, strings.HasPrefix(res.Warnings[0], fmt.Sprintf("slip.csv:%d:9: climb.weights[1].rate_of_climb[4][0]: rate of climb 258 (1000 kg, 8000 ft, -10 C) breaks the smooth pattern", line)), res.Warnings[0])
}

// The fuzz seeds of the landing and climb layouts import as they stand (so that the
// fuzzer starts from files that reach the loader).
func TestFuzzSeedsImport(t *testing.T) {
	for _, tc := range []struct {
		k    Kind
		seed string
	}{{Landing, "seed-landing"}, {Climb, "seed-climb-weights"}, {Climb, "seed-climb-single"}, {Takeoff, "seed-commas"}} {
		data, err := os.ReadFile("testdata/fuzz/FuzzImport/" + tc.seed)
		require.NoError(t, err)
		lines := strings.SplitN(string(data), "\n", 3)
		require.Len(t, lines, 3)
		body, err := strconv.Unquote(strings.TrimSuffix(strings.TrimPrefix(strings.TrimSpace(lines[1]), "[]byte("), ")"))
		require.NoError(t, err, tc.seed)
		_, err = Import(tc.k, tc.seed, []byte(body))
		assert.NoError(t, err, tc.seed)
	}
}
