package tableimport

import (
	"bytes"
	"fmt"
	"io/fs"
	"regexp"
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
			res, err := Import("demo.csv", []byte(variant.csv))
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
	res, err := Import("demo.csv", []byte(csvOf(demo.Tables, "ft", "", ",")))
	require.NoError(t, err)
	assert.False(t, res.WindFactoringGiven)
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
	_, err := Import("t.csv", []byte(good))
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
			_, err := Import("t.csv", []byte(strings.ReplaceAll(good, tc.from, tc.to)))
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
	_, err = Import("empty.csv", []byte("\n# nothing\n"))
	require.Error(t, err)
	assert.Contains(t, err.Error(), "no weight block found")
	_, err = Import("big.csv", bytes.Repeat([]byte("x"), MaxBytes+1))
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
	_, err = Import("slip.csv", []byte(text))
	require.Error(t, err)

	// One the rise does not catch: the 800 kg ground roll at 8000 ft, 40 C (1120)
	// typed 1210, a transposition, still above its neighbours.
	const row = "8000 ft,775,840,905,975,1045,1120"
	text = csvOf(demo.Tables, "ft", "true", ",")
	require.Contains(t, text, row)
	text = strings.Replace(text, row, "8000 ft,775,840,905,975,1045,1210", 1)
	res, err := Import("slip.csv", []byte(text))
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
