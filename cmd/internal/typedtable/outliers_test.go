package typedtable_test

import (
	"fmt"
	"io/fs"
	"math"
	"strings"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"

	"kneeprint/cmd/internal/spec"
	"kneeprint/cmd/internal/typedtable"
	"kneeprint/cmd/internal/units"
	"kneeprint/perf"
	"kneeprint/templates"
)

// smoothProfile writes an aircraft profile whose table follows a closed form (no
// aircraft's figures: a smooth surface to plant slips in), distances in ft rounded
// to 5 as manuals print them:
//
//	to_50ft = D exp(0.085 PA/1000 ft) exp(0.009 T/C) (W/1000 kg)^2, ground roll 0.55 of it
//
// with D chosen so that the cell 1000 kg, 4000 ft, 20 C is 1850. plant replaces the
// to_50ft cell of that block, row and column by its text. It returns the file and
// the line of each to_50ft row of the 1000 kg block.
func smoothProfile(plant func(w, p, k int) (string, bool)) (string, map[int]int) {
	pas := []float64{0, 2000, 4000, 6000, 8000}
	temps := []float64{-20, 0, 20, 40}
	weights := []float64{800, 900, 1000}
	d := 1850 / math.Exp(0.085*4+0.009*20)
	round5 := func(x float64) float64 { return math.Round(x/5) * 5 }
	var b strings.Builder
	b.WriteString(`kind: aircraft
name: Smooth test table
type: a closed form, no aircraft
mtow: 1000 kg
limits: {demonstrated_crosswind: 15 kt}
takeoff_flap: "0"
table:
  wind_factoring_included: false
  distance_unit: ft
  pressure_altitudes: [0 ft, 2000 ft, 4000 ft, 6000 ft, 8000 ft]
  temperatures: [-20 C, 0 C, 20 C, 40 C]
  weights:
`)
	lines := map[int]int{}
	line := 13
	for wi, w := range weights {
		fmt.Fprintf(&b, "    - weight: %.0f kg\n", w)
		line++
		for _, key := range []string{"ground_roll", "to_50ft"} {
			fmt.Fprintf(&b, "      %s:\n", key)
			line++
			for pi, pa := range pas {
				var cells []string
				for ti, tc := range temps {
					v := d * math.Exp(0.085*pa/1000+0.009*tc) * (w / 1000) * (w / 1000)
					s := fmt.Sprintf("%.0f", round5(v))
					if key == "ground_roll" {
						s = fmt.Sprintf("%.0f", round5(0.55*v))
					} else if txt, ok := plant(wi, pi, ti); ok {
						s = txt
					}
					cells = append(cells, s)
				}
				fmt.Fprintf(&b, "        - [%s]\n", strings.Join(cells, ", "))
				if key == "to_50ft" && w == 1000 {
					lines[pi] = line
				}
				line++
			}
		}
	}
	return b.String(), lines
}

func noPlant(int, int, int) (string, bool) { return "", false }

// The transposition the issue names: a manual's 1850 typed as 1580. The loader
// accepts the table (it still rises with temperature, altitude and weight), so only
// the outlier check can see it; it names that cell, its line and column, and no
// other.
func TestPlantedTranspositionFlagged(t *testing.T) {
	clean, _ := smoothProfile(noPlant)
	require.Contains(t, clean, "1850", "the closed form gives the 1850 the slip is planted over")
	doc, err := spec.Parse("smooth.yaml", []byte(clean))
	require.NoError(t, err)
	for _, w := range doc.Warnings {
		assert.NotContains(t, w, "smooth pattern", "a clean table raises nothing")
	}

	text, lines := smoothProfile(func(w, p, k int) (string, bool) { return "1580", w == 2 && p == 2 && k == 2 })
	doc, err = spec.Parse("typo.yaml", []byte(text))
	require.NoError(t, err, "the slip keeps the table rising: the loader accepts it")
	var flagged []string
	for _, w := range doc.Warnings {
		if strings.Contains(w, "smooth pattern") {
			flagged = append(flagged, w)
		}
	}
	require.Len(t, flagged, 1, "got %v", flagged)
	// "        - [" is 10 characters: the third cell starts at column 11 + two cells.
	row := strings.Split(text, "\n")[lines[2]-1]
	col := strings.Index(row, "1580") + 1
	want := fmt.Sprintf("typo.yaml:%d:%d: table.weights[2].to_50ft[2][2]: distance to 50 ft 1580 (1000 kg, 4000 ft, 20 C) breaks the smooth pattern", lines[2], col)
	assert.True(t, strings.HasPrefix(flagged[0], want), "got %s\nwant it to start %s", flagged[0], want)
	assert.Contains(t, flagged[0], "about 18", "the neighbours predict about 1850")
}

// Property: a 15 % slip up or down planted in any cell of the demo tables (takeoff,
// climb and landing) is flagged at that cell and at no other, corners and edges
// included. In the rate-of-climb table the slip is at least 25 ft/min (five of its
// 5 ft/min steps): at its 135 ft/min corner, rounding three figures to 5 ft/min can
// move a prediction extrapolated to the end of an axis by 10 ft/min, 7.7 % of the
// 130 ft/min predicted there, so a 20 ft/min slip (15 %) lies within what rounding
// and the threshold explain (the rule, as Outliers states it).
func TestAnySlipFlaggedAtItsCell(t *testing.T) {
	doc, err := spec.Load(templates.FS, "aircraft/sedgefin-sf2.yaml")
	require.NoError(t, err)
	require.Len(t, doc.Tables, 5, "ground roll and distance, takeoff and landing, and the rate of climb")
	for _, tab := range doc.Tables {
		for b := range tab.Blocks {
			for p := range tab.PressureAltitudes {
				for k := range tab.Temperatures {
					for _, f := range []float64{0.85, 1.15} {
						planted := clone(tab)
						v := tab.Blocks[b].Rows[p][k].Value
						slip := v * (f - 1)
						if tab.Linear && math.Abs(slip) < 25 {
							slip = math.Copysign(25, slip)
						}
						planted.Blocks[b].Rows[p][k].Value = v + slip
						got := typedtable.Outliers(planted)
						require.Len(t, got, 1, "%s %s x%.2f: got %v", tab.Quantity, tab.Where(b, p, k), f, got)
						assert.Equal(t, [3]int{b, p, k}, [3]int{got[0].Block, got[0].Row, got[0].Col}, "%s x%.2f", tab.Where(b, p, k), f)
					}
				}
			}
		}
	}
}

func clone(t *typedtable.Table) *typedtable.Table {
	c := *t
	c.Blocks = make([]typedtable.Block, len(t.Blocks))
	for i, b := range t.Blocks {
		c.Blocks[i] = b
		c.Blocks[i].Rows = make([][]typedtable.Cell, len(b.Rows))
		for j, r := range b.Rows {
			c.Blocks[i].Rows[j] = append([]typedtable.Cell(nil), r...)
		}
	}
	return &c
}

// The clean demo tables raise nothing, and no cell is near the threshold: the
// largest deviation of a distance along any axis stays under 1.5 % (the figure quoted
// in OutlierThresholdPct's comment); the rate of climb's under 4 % (its top row bends
// 5 ft/min off the straight line through the rows below, a rate of climb of 130
// ft/min or so: a real table's curvature near its ceiling, judged in per cent of a
// small figure).
func TestDemoTablesClean(t *testing.T) {
	doc, err := spec.Load(templates.FS, "aircraft/sedgefin-sf2.yaml")
	require.NoError(t, err)
	for _, w := range doc.Warnings {
		assert.NotContains(t, w, "smooth pattern")
	}
	for _, tab := range doc.Tables {
		assert.Empty(t, typedtable.Outliers(tab))
		limit := 1.5
		if tab.Linear {
			limit = 4
		}
		assert.Less(t, largest(tab), limit, tab.Quantity)
	}
}

func largest(tab *typedtable.Table) float64 {
	m := 0.0
	for _, rows := range typedtable.Deviations(tab) {
		for _, row := range rows {
			for _, devs := range row {
				for _, d := range devs {
					m = math.Max(m, math.Abs(d.Pct))
				}
			}
		}
	}
	return m
}

// A table computed by the demo tourer's calibrated physics model (thrust lapse,
// drag, ground effect: a curvature no closed form above has), on uneven axes and
// rounded to 5 m as a manual prints, raises nothing: the rule does not mistake a real
// aircraft's smooth curvature for a slip.
func TestPhysicsTableClean(t *testing.T) {
	doc, err := spec.Load(templates.FS, "aircraft/quillwing-qt6.yaml")
	require.NoError(t, err)
	m, err := perf.ModelFor(doc.Aircraft)
	require.NoError(t, err)
	pas := []float64{0, 1000, 2000, 4000, 6000, 8000}
	temps := []float64{-20, -10, 0, 10, 20, 30, 40}
	weights := []float64{950, 1050, 1150, 1250}
	for _, fig := range []string{"ground roll", "distance to 50 ft"} {
		tab := &typedtable.Table{File: "physics", Quantity: fig, Section: "table", Key: "x", Unit: "m"}
		for _, pa := range pas {
			tab.PressureAltitudes = append(tab.PressureAltitudes, typedtable.Label{Text: fmt.Sprintf("%.0f ft", pa), SI: pa * units.MetresPerFoot})
		}
		for _, tc := range temps {
			tab.Temperatures = append(tab.Temperatures, typedtable.Label{Text: fmt.Sprintf("%.0f C", tc), SI: tc + units.KelvinAtZeroCelsius})
		}
		for i, w := range weights {
			bl := typedtable.Block{Index: i, Weight: typedtable.Label{Text: fmt.Sprintf("%.0f kg", w), SI: w}}
			for _, pa := range tab.PressureAltitudes {
				var row []typedtable.Cell
				for _, tc := range tab.Temperatures {
					r, err := m.Takeoff(perf.Conditions{PressureAltM: pa.SI, TempK: tc.SI, MassKg: w, Surface: perf.Paved, Condition: perf.Dry})
					require.NoError(t, err)
					v := r.GroundRollM
					if fig != "ground roll" {
						v = r.To50ftM
					}
					row = append(row, typedtable.Cell{Value: math.Round(v/5) * 5})
				}
				bl.Rows = append(bl.Rows, row)
			}
			tab.Blocks = append(tab.Blocks, bl)
		}
		assert.Empty(t, typedtable.Outliers(tab), fig)
	}
}

// With one pressure altitude and one weight, the temperature axis alone judges: the
// slip is flagged (its neighbour at the end of the row may be listed with it, as the
// rule says).
func TestSingleAxis(t *testing.T) {
	tab := &typedtable.Table{File: "one.yaml", Quantity: "ground roll", Section: "table", Key: "ground_roll", Unit: "m",
		PressureAltitudes: []typedtable.Label{{Text: "0 ft"}}}
	vals := []float64{400, 430, 460, 495, 530} // about 7 % a step (common practice: ~1 % per degree C)
	for i := range vals {
		tab.Temperatures = append(tab.Temperatures, typedtable.Label{SI: float64(i * 10)})
	}
	row := make([]typedtable.Cell, len(vals))
	for i, v := range vals {
		row[i] = typedtable.Cell{Value: v}
	}
	tab.Blocks = []typedtable.Block{{Weight: typedtable.Label{SI: 1000}, Rows: [][]typedtable.Cell{row}}}
	assert.Empty(t, typedtable.Outliers(tab))
	tab.Blocks[0].Rows[0][2].Value = 640 // 460 typed 640
	got := typedtable.Outliers(tab)
	require.NotEmpty(t, got)
	found := false
	for _, o := range got {
		found = found || o.Col == 2
		require.Len(t, o.Deviations, 1)
		assert.Equal(t, typedtable.AxisTemperature, o.Deviations[0].Axis)
	}
	assert.True(t, found, "the slip itself is listed: %v", got)
}

// Two points on an axis predict nothing: a 2 x 2 table is never judged.
func TestTooSmallToJudge(t *testing.T) {
	tab := &typedtable.Table{PressureAltitudes: []typedtable.Label{{SI: 0}, {SI: 1000}}, Temperatures: []typedtable.Label{{SI: 273}, {SI: 303}},
		Blocks: []typedtable.Block{{Rows: [][]typedtable.Cell{{{Value: 100}, {Value: 900}}, {{Value: 120}, {Value: 130}}}}}}
	assert.Empty(t, typedtable.Outliers(tab))
}

// Step reads the rounding step from the figures as typed.
func TestStep(t *testing.T) {
	mk := func(texts ...string) *typedtable.Table {
		var row []typedtable.Cell
		for _, s := range texts {
			row = append(row, typedtable.Cell{Text: s})
		}
		return &typedtable.Table{Blocks: []typedtable.Block{{Rows: [][]typedtable.Cell{row}}}}
	}
	for _, tc := range []struct {
		texts []string
		want  float64
	}{
		{[]string{"415", "450", "1_000"}, 5},
		{[]string{"410", "450", "1000"}, 10},
		{[]string{"413", "450"}, 1},
		{[]string{"12.5", "13", "14.25"}, 0.01},
	} {
		assert.InDelta(t, tc.want, typedtable.Step(mk(tc.texts...)), 1e-12, "%v", tc.texts)
	}
}

// linearTable is a rate-of-climb table over pressure altitude x temperature that
// falls on a plane (invented, no aircraft's: rate = 880 - 0.1 PA/ft - 4 T/C, in
// ft/min, rounded to 5 as a manual prints), down to zero and below at the top: a
// table a manual may print up to its ceiling.
func linearTable() *typedtable.Table {
	tab := &typedtable.Table{File: "climb.yaml", Quantity: "rate of climb", Short: "rate", Section: "climb", Key: "rate_of_climb", Unit: "ft/min", Linear: true}
	pas := []float64{0, 2000, 4000, 6000, 8000, 10000}
	temps := []float64{-20, 0, 20, 40}
	for _, pa := range pas {
		tab.PressureAltitudes = append(tab.PressureAltitudes, typedtable.Label{Text: fmt.Sprintf("%.0f ft", pa), SI: pa * units.MetresPerFoot})
	}
	for _, tc := range temps {
		tab.Temperatures = append(tab.Temperatures, typedtable.Label{Text: fmt.Sprintf("%.0f C", tc), SI: tc + units.KelvinAtZeroCelsius})
	}
	bl := typedtable.Block{Index: typedtable.Single, Weight: typedtable.Label{Text: "MTOW 1000 kg", SI: 1000}}
	for _, pa := range pas {
		var row []typedtable.Cell
		for _, tc := range temps {
			v := math.Round((880-0.1*pa-4*tc)/5) * 5
			row = append(row, typedtable.Cell{Text: fmt.Sprintf("%.0f", v), Value: v})
		}
		bl.Rows = append(bl.Rows, row)
	}
	tab.Blocks = []typedtable.Block{bl}
	return tab
}

// A rate of climb falls about linearly with altitude and temperature, and a manual
// may print a zero or negative rate at the top of its table: a Linear table is judged
// in its figures themselves, zero and negative ones included. The clean table raises
// nothing; a slip near its ceiling (-80 typed 80: a lost minus sign) and one of the
// hundreds digit in the middle are flagged at their cells; judged in logarithms, as
// distances are, the zero and negative rates would never be judged and the lost
// minus sign would go unseen: why a climb table is Linear.
func TestLinearTableToItsCeiling(t *testing.T) {
	tab := linearTable()
	require.Equal(t, "0", tab.Blocks[0].Rows[4][2].Text, "zero at 8000 ft, 20 C: 880 - 800 - 80")
	require.Equal(t, "-280", tab.Blocks[0].Rows[5][3].Text, "below zero at 10000 ft, 40 C: 880 - 1000 - 160")
	assert.Empty(t, typedtable.Outliers(tab), "a clean table raises nothing")
	assert.Less(t, largest(tab), 1e-9, "a plane is predicted exactly")
	assert.Equal(t, "climb.rate_of_climb[5][3]", tab.Field(0, 5, 3), "one table, no weights list")
	assert.Equal(t, "MTOW 1000 kg, 10000 ft, 40 C", tab.Where(0, 5, 3))

	for _, tc := range []struct {
		name   string
		p, k   int
		typed  float64
		wantAt [2]int
	}{
		{"lost minus sign near the ceiling", 4, 3, 80, [2]int{4, 3}}, // -80 typed 80
		{"hundreds digit in the middle", 2, 1, 400, [2]int{2, 1}},
	} {
		t.Run(tc.name, func(t *testing.T) {
			planted := clone(tab)
			planted.Blocks[0].Rows[tc.p][tc.k].Value = tc.typed
			got := typedtable.Outliers(planted)
			require.Len(t, got, 1, "%v", got)
			assert.Equal(t, tc.wantAt, [2]int{got[0].Row, got[0].Col})
		})
	}

	// Judged in logarithms, as distances are, the zero and negative rates are not
	// judged at all, and the lost minus sign goes unseen.
	asLogs := clone(tab)
	asLogs.Linear = false
	assert.Empty(t, typedtable.Deviations(asLogs)[0][5][3], "a negative rate has no logarithm")
	assert.NotEmpty(t, typedtable.Deviations(tab)[0][5][3], "the Linear form judges it")
	asLogs.Blocks[0].Rows[4][3].Value = 80
	assert.Empty(t, typedtable.Outliers(asLogs), "in logarithms the slip is missed")
}

// The climb table of a profile, given as one table for the MTOW or as one block per
// weight, is kept as typed with the loader's field paths, and a slip planted in it
// (the demo's 285 typed 258, a transposition the loader accepts: the rates still fall
// with altitude, temperature and weight) is a validate warning at its line and column.
func TestClimbSlipFlaggedAtItsLine(t *testing.T) {
	demo, err := fs.ReadFile(templates.FS, "aircraft/sedgefin-sf2.yaml")
	require.NoError(t, err)
	const row = "[285, 255, 225, 195, 165, 135]"
	require.Contains(t, string(demo), row)
	text := strings.Replace(string(demo), row, "[258, 255, 225, 195, 165, 135]", 1)
	doc, err := spec.Parse("slip.yaml", []byte(text))
	require.NoError(t, err, "the loader accepts the slip")
	var flagged []string
	for _, w := range doc.Warnings {
		if strings.Contains(w, "smooth pattern") {
			flagged = append(flagged, w)
		}
	}
	require.Len(t, flagged, 1, "%v", flagged)
	line, col := 0, 0
	for i, l := range strings.Split(text, "\n") {
		if j := strings.Index(l, "[258,"); j >= 0 {
			line, col = i+1, j+2
		}
	}
	want := fmt.Sprintf("slip.yaml:%d:%d: climb.weights[1].rate_of_climb[4][0]: rate of climb 258 (1000 kg, 8000 ft, -10 C) breaks the smooth pattern", line, col)
	assert.True(t, strings.HasPrefix(flagged[0], want), "got %s\nwant it to start %s", flagged[0], want)

	// One table for the MTOW (no weights list): the loader's path climb.rate_of_climb.
	i := strings.Index(text, "  weights:\n    - weight: 800 kg\n      rate_of_climb:")
	require.Positive(t, i)
	j := strings.Index(text[i:], "    - weight: 1000 kg\n")
	require.Positive(t, j)
	single := text[:i] + strings.ReplaceAll(strings.Replace(text[i+j:], "    - weight: 1000 kg\n", "", 1), "\n        - [", "\n    - [")
	single = strings.Replace(single, "      rate_of_climb:\n", "  rate_of_climb:\n", 1)
	doc, err = spec.Parse("single.yaml", []byte(single))
	require.NoError(t, err, "%s", single)
	var climb *typedtable.Table
	for _, tab := range doc.Tables {
		if tab.Section == "climb" {
			climb = tab
		}
	}
	require.NotNil(t, climb)
	require.Len(t, climb.Blocks, 1)
	assert.Equal(t, typedtable.Single, climb.Blocks[0].Index)
	assert.Equal(t, "MTOW 1000 kg", climb.Blocks[0].Weight.Text)
	assert.Equal(t, "climb", climb.BlockField(0))
	flagged = nil
	for _, w := range doc.Warnings {
		if strings.Contains(w, "smooth pattern") {
			flagged = append(flagged, w)
		}
	}
	require.Len(t, flagged, 1, "%v", flagged)
	for i, l := range strings.Split(single, "\n") {
		if j := strings.Index(l, "[258,"); j >= 0 {
			line, col = i+1, j+2
		}
	}
	want = fmt.Sprintf("single.yaml:%d:%d: climb.rate_of_climb[4][0]: rate of climb 258 (MTOW 1000 kg, 8000 ft, -10 C) breaks the smooth pattern", line, col)
	assert.True(t, strings.HasPrefix(flagged[0], want), "got %s\nwant it to start %s", flagged[0], want)
}

// A rate-of-climb table computed by the demo tourer's physics (excess power at its
// climb speed, with the propeller figures its takeoff calibration fitted: thrust
// lapse and induced drag give a curvature no plane has), rounded to 5 ft/min, raises
// nothing in the Linear form.
func TestPhysicsClimbTableClean(t *testing.T) {
	doc, err := spec.Load(templates.FS, "aircraft/quillwing-qt6.yaml")
	require.NoError(t, err)
	cm, err := perf.ClimbFor(doc.Aircraft)
	require.NoError(t, err)
	tab := &typedtable.Table{File: "physics", Quantity: "rate of climb", Section: "climb", Key: "rate_of_climb", Unit: "ft/min", Linear: true}
	for _, pa := range []float64{0, 2000, 4000, 6000, 8000} {
		tab.PressureAltitudes = append(tab.PressureAltitudes, typedtable.Label{Text: fmt.Sprintf("%.0f ft", pa), SI: pa * units.MetresPerFoot})
	}
	for _, tc := range []float64{-20, 0, 20, 40} {
		tab.Temperatures = append(tab.Temperatures, typedtable.Label{Text: fmt.Sprintf("%.0f C", tc), SI: tc + units.KelvinAtZeroCelsius})
	}
	for i, w := range []float64{950, 1100, 1250} {
		bl := typedtable.Block{Index: i, Weight: typedtable.Label{Text: fmt.Sprintf("%.0f kg", w), SI: w}}
		for _, pa := range tab.PressureAltitudes {
			var row []typedtable.Cell
			for _, tc := range tab.Temperatures {
				r, err := cm.Climb(perf.Conditions{PressureAltM: pa.SI, TempK: tc.SI, MassKg: w})
				require.NoError(t, err)
				v := math.Round(units.Feet(r.RateMS)*60/5) * 5
				row = append(row, typedtable.Cell{Text: fmt.Sprintf("%.0f", v), Value: v})
			}
			bl.Rows = append(bl.Rows, row)
		}
		tab.Blocks = append(tab.Blocks, bl)
	}
	assert.Empty(t, typedtable.Outliers(tab))
}
