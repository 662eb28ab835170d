package typedtable_test

import (
	"fmt"
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

// Property: a 15 % slip up or down planted in any cell of the demo tables (takeoff and
// landing) is flagged at that cell and at no other, corners and edges included.
func TestAnySlipFlaggedAtItsCell(t *testing.T) {
	doc, err := spec.Load(templates.FS, "aircraft/sedgefin-sf2.yaml")
	require.NoError(t, err)
	require.Len(t, doc.Tables, 4, "ground roll and distance, takeoff and landing")
	for _, tab := range doc.Tables {
		for b := range tab.Blocks {
			for p := range tab.PressureAltitudes {
				for k := range tab.Temperatures {
					for _, f := range []float64{0.85, 1.15} {
						planted := clone(tab)
						planted.Blocks[b].Rows[p][k].Value *= f
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

// The clean demo table raises nothing, and no cell is within half the threshold of
// it: the largest deviation along any axis stays under 1.5 % (the figure quoted in
// OutlierThresholdPct's comment).
func TestDemoTablesClean(t *testing.T) {
	doc, err := spec.Load(templates.FS, "aircraft/sedgefin-sf2.yaml")
	require.NoError(t, err)
	for _, w := range doc.Warnings {
		assert.NotContains(t, w, "smooth pattern")
	}
	for _, tab := range doc.Tables {
		assert.Empty(t, typedtable.Outliers(tab))
		assert.Less(t, largest(tab), 1.5, tab.Quantity)
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
