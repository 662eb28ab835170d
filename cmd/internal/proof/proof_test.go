package proof

import (
	"bytes"
	"fmt"
	"io/fs"
	"math"
	"os"
	"strconv"
	"strings"
	"testing"
	"time"

	"github.com/pdfcpu/pdfcpu/pkg/api"
	"github.com/pdfcpu/pdfcpu/pkg/pdfcpu/model"
	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
	"gonum.org/v1/plot/vg"
	"gonum.org/v1/plot/vg/draw"
	"gonum.org/v1/plot/vg/recorder"

	"kneeprint/airfields"
	"kneeprint/cmd/internal/spec"
	"kneeprint/cmd/internal/typedtable"
	"kneeprint/templates"
)

var sampleDate = time.Date(2026, 12, 1, 0, 0, 0, 0, time.UTC)

type input struct {
	fsys fs.FS
	name string
}

var demoInputs = []input{
	{templates.FS, "aircraft/sedgefin-sf2.yaml"},
	{templates.FS, "aircraft/quillwing-qt6.yaml"},
	{airfields.FS, "wrenmoor.yaml"},
	{airfields.FS, "saltpan.yaml"},
	{os.DirFS("testdata"), "planted.yaml"},
	{os.DirFS("testdata"), "planted-climb.yaml"},
}

func render(t *testing.T, in input, opt Options) ([]byte, *spec.Document) {
	t.Helper()
	data, err := fs.ReadFile(in.fsys, in.name)
	require.NoError(t, err)
	doc, err := spec.Parse(in.name, data)
	require.NoError(t, err)
	var buf bytes.Buffer
	require.NoError(t, Write(&buf, Source{Name: in.name, Data: data}, doc, opt))
	return buf.Bytes(), doc
}

// Every proof sheet of the demo files and of the planted table is a valid PDF
// (pdfcpu, strict), its fonts are embedded, and the same file and date give the
// same bytes while another date gives others.
func TestProofPDFs(t *testing.T) {
	for _, in := range demoInputs {
		t.Run(in.name, func(t *testing.T) {
			opt := Options{Date: sampleDate, Version: "test"}
			pdf, _ := render(t, in, opt)
			conf := model.NewDefaultConfiguration()
			conf.ValidationMode = model.ValidationStrict
			require.NoError(t, api.Validate(bytes.NewReader(pdf), conf))
			n, err := api.PageCount(bytes.NewReader(pdf), conf)
			require.NoError(t, err)
			assert.GreaterOrEqual(t, n, 1)
			// Two fonts, both embedded (TrueType font files), none left to the system.
			assert.Equal(t, 2, bytes.Count(pdf, []byte("/FontFile2")), "both Go fonts embedded")
			assert.Equal(t, bytes.Count(pdf, []byte("/Type /FontDescriptor")), bytes.Count(pdf, []byte("/FontFile2")), "every font has its file")
			assert.Equal(t, 2, bytes.Count(pdf, []byte("/Subtype /Type0")), "no other font")

			again, _ := render(t, in, opt)
			assert.True(t, bytes.Equal(pdf, again), "same file and date: same bytes")
			other, _ := render(t, in, Options{Date: sampleDate.AddDate(0, 0, 1), Version: "test"})
			assert.False(t, bytes.Equal(pdf, other), "another date: other bytes")
			letter, _ := render(t, in, Options{Date: sampleDate, Version: "test", Paper: "letter"})
			require.NoError(t, api.Validate(bytes.NewReader(letter), conf))
		})
	}
}

// The page counts follow the content: the table profile has a summary, its table
// page and its plots; the physics profile a summary and its calibration.
func TestProofPages(t *testing.T) {
	conf := model.NewDefaultConfiguration()
	for _, tc := range []struct {
		in   input
		want int
	}{
		{demoInputs[0], 8}, // summary (2), takeoff table (3 blocks) and plots (3 x 2 panels), climb table and plots, landing table and plots
		{demoInputs[1], 3}, // summary, physics, physics landing
		{demoInputs[2], 2}, // data with obstacles, runway 07/25; runway 15/33
		{demoInputs[3], 2}, // data with its obstacle; runway 04/22
		{demoInputs[5], 6}, // summary (2), takeoff table and plots, climb table and plots
	} {
		pdf, _ := render(t, tc.in, Options{Date: sampleDate})
		n, err := api.PageCount(bytes.NewReader(pdf), conf)
		require.NoError(t, err)
		assert.Equal(t, tc.want, n, tc.in.name)
	}
}

// The planted transposition is listed with its line and column and circled on its
// row's plot with its file line; the clean demo table lists nothing.
func TestProofShowsThePlantedSlip(t *testing.T) {
	data, err := os.ReadFile("testdata/planted.yaml")
	require.NoError(t, err)
	line := 0
	for i, l := range strings.Split(string(data), "\n") {
		if strings.Contains(l, "1580") && strings.HasPrefix(strings.TrimSpace(l), "- [") {
			line = i + 1
		}
	}
	require.NotZero(t, line)
	_, doc := render(t, demoInputs[4], Options{Date: sampleDate})
	flagged, order := flaggedCells(doc.Tables)
	rows := outlierRows(flagged, order)
	require.Len(t, rows, 1)
	assert.Equal(t, "table.weights[2].to_50ft[2][2]", rows[0][1])
	assert.Equal(t, "1580", rows[0][3])
	assert.Contains(t, rows[0][0], strconv.Itoa(line)+":")

	// The plot of that row: a ring around the cell and the label with its line.
	s, err := newSheet(Source{Name: "planted.yaml", Data: data}, "t", Options{Date: sampleDate})
	require.NoError(t, err)
	var to50 = doc.Tables[1]
	xs, unit := temperatureAxis(to50.Temperatures)
	p, err := s.rowPlot(to50, 2, xs, unit, flagged)
	require.NoError(t, err)
	rec := &recorder.Canvas{}
	p.Draw(draw.NewCanvas(rec, 90*vg.Millimeter, 70*vg.Millimeter))
	assert.Contains(t, texts(rec), "line "+strconv.Itoa(line))
	assert.Contains(t, texts(rec), "off its neighbours (file line)")

	_, clean := render(t, demoInputs[0], Options{Date: sampleDate})
	f, o := flaggedCells(clean.Tables)
	assert.Empty(t, outlierRows(f, o))
}

func texts(rec *recorder.Canvas) []string {
	var out []string
	for _, a := range rec.Actions {
		if fs, ok := a.(*recorder.FillString); ok {
			out = append(out, fs.String)
		}
	}
	return out
}

// The planted slip in a climb table given as one table for the MTOW (360 typed 306)
// is listed at its line with the loader's field path and circled on its row's plot;
// the table prints as one block, named by its section.
func TestProofShowsAClimbSlip(t *testing.T) {
	data, err := os.ReadFile("testdata/planted-climb.yaml")
	require.NoError(t, err)
	line := 0
	for i, l := range strings.Split(string(data), "\n") {
		if strings.HasPrefix(strings.TrimSpace(l), "- [306,") {
			line = i + 1
		}
	}
	require.NotZero(t, line)
	_, doc := render(t, demoInputs[5], Options{Date: sampleDate})
	flagged, order := flaggedCells(doc.Tables)
	rows := outlierRows(flagged, order)
	require.Len(t, rows, 1, "%v", rows)
	assert.Equal(t, fmt.Sprintf("%d:8", line), rows[0][0])
	assert.Equal(t, "climb.rate_of_climb[3][0]", rows[0][1])
	assert.Equal(t, "rate of climb, MTOW 1000 kg, 6000 ft, -20 C", rows[0][2])
	assert.Equal(t, "306", rows[0][3])

	var climb *typedtable.Table
	for _, tab := range doc.Tables {
		if tab.Section == "climb" {
			climb = tab
		}
	}
	require.NotNil(t, climb)
	assert.True(t, climb.Linear)
	s, err := newSheet(Source{Name: "planted-climb.yaml", Data: data}, "t", Options{Date: sampleDate})
	require.NoError(t, err)
	xs, unit := temperatureAxis(climb.Temperatures)
	p, err := s.rowPlot(climb, 0, xs, unit, flagged)
	require.NoError(t, err)
	assert.LessOrEqual(t, p.Y.Min, -80.0, "the rate axis reaches the table's negative rate")
	rec := &recorder.Canvas{}
	p.Draw(draw.NewCanvas(rec, 90*vg.Millimeter, 70*vg.Millimeter))
	assert.Contains(t, texts(rec), "line "+strconv.Itoa(line))
	assert.Contains(t, outlierRule(doc.Tables), "rate-of-climb table 2 ft/min", "306 among multiples of 40: the greatest common divisor of the figures as typed")
	assert.Contains(t, outlierRule(doc.Tables), "10 % of the table's largest rate")
}

// The climb section in words: the speed as typed with its line, where the rates come
// from (the manual's table, or for a physics profile the calibrated excess power with
// the propeller the takeoff calibration fitted) and the reference climb of validate.
func TestClimbInWords(t *testing.T) {
	_, table := render(t, demoInputs[0], Options{Date: sampleDate})
	items := itemMap(climbItems(table))
	assert.Regexp(t, `^65 kt \(line \d+\)$`, items["climb speed (IAS)"])
	assert.Contains(t, items["rates from"], "the manual's rate-of-climb table, in ft/min (line")
	assert.Contains(t, items["rates from"], "5 pressure altitudes x 6 temperatures x 2 weight(s) (800 to 1000 kg)")
	assert.Contains(t, items["checks"], "refuses a rate that rises")
	// The demo's 1000 kg rate at sea level is 700 ft/min at 10 C and 670 at 20 C: at
	// 15 C (ISA) the table interpolates 685 (invented demo data); over the 65 kt true
	// airspeed of sea level ISA (6583 ft/min), 10.4 % in still air.
	assert.Equal(t, "Reference climb, to hold against the manual (as validate prints it): sea level in the ISA, MTOW 1000 kg, 65 kt: 685 ft/min, a gradient of 10.4 % in still air.",
		referenceClimb(table.Aircraft))

	_, phys := render(t, demoInputs[1], Options{Date: sampleDate})
	items = itemMap(climbItems(phys))
	assert.Contains(t, items["rates from"], "the physics description's excess power at 76 kt")
	assert.Contains(t, items["rates from"], fmt.Sprintf("static thrust fraction %.3f, propeller efficiency %.3f), the calibrated excess power",
		phys.Aircraft.Physics.Calibration.Static, phys.Aircraft.Physics.Calibration.Eta))
	assert.Contains(t, referenceClimb(phys.Aircraft), "Reference climb, to hold against the manual")

	_, single := render(t, demoInputs[5], Options{Date: sampleDate})
	assert.Contains(t, itemMap(climbItems(single))["rates from"], "one table without weights: taken as the MTOW's (1000 kg)")
	_, none := render(t, demoInputs[4], Options{Date: sampleDate})
	assert.Nil(t, none.Aircraft.Climb, "planted.yaml has no climb: the sheet says so")
}

// The landing section in words: flap, approach speed and maximum landing mass as
// typed (or the default the loader applied), the model, a reference landing; for a
// physics landing model every landing figure it was fitted to, with its line.
func TestLandingInWords(t *testing.T) {
	_, table := render(t, demoInputs[0], Options{Date: sampleDate})
	items := itemMap(landingItems(table))
	assert.Regexp(t, `^30° \(line \d+\)$`, items["landing flap"])
	assert.Regexp(t, `^58 kt \(line \d+\)$`, items["approach speed (IAS)"])
	assert.Equal(t, "not given: the MTOW, 1000 kg", items["maximum landing mass"])
	assert.Equal(t, "table", items["model the cards use"])
	assert.Regexp(t, `^true \(line \d+\)$`, items["wind factoring in the data"])
	// The demo landing table's 1000 kg, sea level row: 540 ft at 10 C and 560 ft at
	// 20 C ground roll, 1245 and 1290 ft from 50 ft (invented demo data); at 15 C
	// 550 ft = 167.6 m and 1267.5 ft = 386.3 m, rounded up.
	assert.Equal(t, "Reference landing, to hold against the manual: sea level in the ISA (15 C, 1013.25 hPa), maximum landing mass 1000 kg, paved, dry, level runway, "+
		"calm wind, table model: ground roll 168 m (550 ft), distance from 50 ft 387 m (1268 ft).", referenceLanding(table.Aircraft))

	data, err := fs.ReadFile(templates.FS, "aircraft/quillwing-qt6.yaml")
	require.NoError(t, err)
	_, phys := render(t, demoInputs[1], Options{Date: sampleDate})
	items = itemMap(landingItems(phys))
	assert.Regexp(t, `^1200 kg \(line \d+\)$`, items["maximum landing mass"])
	assert.Equal(t, "physics", items["model the cards use"])
	res := phys.LandingResiduals()
	require.Len(t, res, 8, "4 calibration points, ground roll and distance from 50 ft each")
	lines := strings.Split(string(data), "\n")
	for _, r := range res {
		assert.Contains(t, []string{"ground roll", "from 50 ft"}, r.Figure)
		typed := lines[r.Line-1][r.Column-1:]
		assert.True(t, strings.HasPrefix(typed, fmt.Sprintf("%.0f m", r.ManualM)), "line %d: %q holds the manual's %.0f m", r.Line, typed, r.ManualM)
		assert.LessOrEqual(t, math.Abs(r.Pct), phys.Aircraft.Landing.Physics.Calibration.LargestPct+1e-9)
	}
	assert.Nil(t, table.LandingResiduals(), "a table landing has no fit")
}

// The airfield's obstacles come from the file as the loader resolved them, each with
// the line it is typed on: Wrenmoor's powerline past 07 as typed (height, past_end),
// Saltpan's rising ground past 04 given as an elevation, 150 ft above the end of the
// TORA (5125 ft less the 4975 ft threshold of 22, invented demo data).
func TestAirfieldObstaclesFromTheFile(t *testing.T) {
	lineOf := func(fsys fs.FS, name, text string) int {
		data, err := fs.ReadFile(fsys, name)
		require.NoError(t, err)
		for i, l := range strings.Split(string(data), "\n") {
			if strings.Contains(l, text) {
				return i + 1
			}
		}
		t.Fatalf("%s: no %q", name, text)
		return 0
	}
	_, wren := render(t, demoInputs[2], Options{Date: sampleDate})
	v := endViews(wren, 0, wren.Airfield.Runways[0])
	require.Len(t, v[0].Obstacles, 1)
	o := v[0].Obstacles[0]
	assert.InDelta(t, 400, o.DistanceM, 1e-9)
	assert.InDelta(t, 35*0.3048, o.HeightM, 1e-9) // 1 ft = 0.3048 m exactly (international foot)
	assert.Equal(t, "powerline", o.Note)
	assert.Equal(t, lineOf(airfields.FS, "wrenmoor.yaml", "note: powerline"), o.Line)
	assert.Empty(t, v[1].Obstacles)

	_, salt := render(t, demoInputs[3], Options{Date: sampleDate})
	rows := obstacleRows(salt)
	require.Len(t, rows, 1)
	assert.Equal(t, []string{"04", strconv.Itoa(lineOf(airfields.FS, "saltpan.yaml", "note: rising ground")), "rising ground",
		"elevation: 5125 ft", "150 ft (45.7 m)", "past_end: 600 m", "600 m", "not given"}, rows[0])
	assert.Len(t, obstacleRows(wren), 2, "the powerline past 07 and the trees past 15")
}

func itemMap(rows [][2]string) map[string]string {
	m := map[string]string{}
	for _, r := range rows {
		m[r[0]] = r[1]
	}
	return m
}
