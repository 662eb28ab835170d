package cards

// Tests of issue 8, "the card tells the truth": each numbered item against values
// with a named source, read from the card data and the card model (never by scraping
// the PDF).

import (
	"encoding/json"
	"errors"
	"fmt"
	"math"
	"regexp"
	"strings"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"

	"kneeprint/cmd/internal/spec"
	"kneeprint/cmd/internal/units"
	"kneeprint/layout"
	"kneeprint/perf"
)

// demoJob is one demo aircraft at one demo airfield with template name.
func demoJob(t testing.TB, tmpl, aircraft, ident string) *Job {
	t.Helper()
	for _, j := range demoJobs(t, tmpl) {
		if strings.HasPrefix(j.Aircraft.Name, aircraft) && j.Airfield.Ident == ident {
			return j
		}
	}
	t.Fatalf("no demo job %s at %s", aircraft, ident)
	return nil
}

func endOf(t testing.TB, j *Job, designator string) perf.RunwayEnd {
	t.Helper()
	for _, e := range j.Airfield.Ends() {
		if e.Designator == designator {
			return e
		}
	}
	t.Fatalf("no runway end %s", designator)
	return perf.RunwayEnd{}
}

// build computes and lays out one page and fails the test on any layout problem.
func build(t testing.TB, j *Job, e perf.RunwayEnd, c perf.Condition) (layout.CardData, *layout.Card) {
	t.Helper()
	d, _, err := j.Card(e, c)
	require.NoError(t, err)
	fonts, err := layout.NewFonts()
	require.NoError(t, err)
	card, err := layout.Build(d, j.Page, fonts)
	require.NoError(t, err)
	require.Empty(t, card.Check())
	return d, card
}

func texts(c *layout.Card, block string) []layout.Text {
	var out []layout.Text
	for _, b := range c.Blocks {
		if block == "" || b.Name == block {
			out = append(out, b.Texts...)
		}
	}
	return out
}

// allText is every text of the card, one per line, no-break spaces as spaces.
func allText(c *layout.Card) string {
	var s []string
	for _, t := range texts(c, "") {
		s = append(s, strings.ReplaceAll(t.S, layout.NBSP, " "))
	}
	return strings.Join(s, "\n")
}

// flatText is the card's text with lines joined: sentences read across wrapping.
func flatText(c *layout.Card) string { return strings.ReplaceAll(allText(c), "\n", " ") }

func parseTemplate(t testing.TB, src string) spec.CardTemplate {
	t.Helper()
	doc, err := spec.Parse("test-template.yaml", []byte(src))
	require.NoError(t, err)
	return *doc.Template
}

// usTemplate: every length in feet, weights in pounds, twelve temperature columns on
// the narrowest card (issue 8 "done when").
const usTemplate = `kind: card-template
name: us12
page: 5x8
unit: ft
mass_unit: lb
temperature_unit: C
policy: uk-advisory
qnh: 29.53 inHg
tight_margin: 10 %
temperatures: [-10 C, -5 C, 0 C, 5 C, 10 C, 15 C, 20 C, 25 C, 30 C, 35 C, 40 C, 45 C]
winds: [-10 kt, -5 kt, 0 kt, 5 kt, 10 kt, 15 kt, 20 kt]
max_blocks: 1
crosswind_speeds: [10 kt, 15 kt, 20 kt, 25 kt]
crosswind_angles: [15 deg, 30 deg, 45 deg, 60 deg, 90 deg]
valid_days: 120
`

func withTemplate(t testing.TB, j *Job, src string) *Job {
	t.Helper()
	jj := *j
	jj.Template = parseTemplate(t, src)
	page, err := layout.PageByName(jj.Template.Page)
	require.NoError(t, err)
	jj.Page = page
	jj.model = nil
	return &jj
}

// Item 1: the limiting declared distance is framed where it stands, and only there;
// no arrow tag that could point at the wrong one; the legend says what the frame means.
func TestItem1LimitingFramedWhereItStands(t *testing.T) {
	for _, j := range demoJobs(t, "a5") {
		for _, e := range j.Airfield.Ends() {
			d, card := build(t, j, e, j.Conditions(e)[0])
			require.NotEmpty(t, d.Limiting)
			var header layout.Block
			for _, b := range card.Blocks {
				if b.Name == "header" {
					header = b
				}
			}
			framed := 0
			for _, s := range header.Shapes {
				if s.Kind != layout.StrokeRect {
					continue
				}
				for _, tx := range header.Texts {
					if !tx.Ink().Inside(s.Box) || tx.S == "DRY" || tx.S == "WET" {
						continue // not in this frame, or the condition tag's own frame
					}
					framed++
					assert.True(t, strings.HasPrefix(tx.S, d.Limiting+" "), "the frame holds %q, the limiting one is %s", tx.S, d.Limiting)
				}
			}
			assert.Equal(t, 1, framed, "%s %s: one declared distance framed", j.Airfield.Ident, e.Designator)
			text := allText(card)
			assert.NotContains(t, text, "limits")
			assert.NotContains(t, text, "←")
			// The legend's frame entry (issue 12 made it a slot beside the marks).
			assert.Contains(t, text, "FRAMED\nlimiting distance")
		}
	}
}

// Item 2: one unit per card. 1100 m is 3608.9 ft (0.3048 m exactly: ICAO Annex 5,
// 1959 agreement), printed 3608 ft (rounded down); 1000 kg is 2204.6 lb (0.45359237 kg
// exactly, same agreement), printed 2204 lb.
func TestItem2OneUnitPerCard(t *testing.T) {
	j := withTemplate(t, demoJob(t, "a5", "Sedgefin", "KP-SPM"), usTemplate)
	e := endOf(t, j, "04")
	d, card := build(t, j, e, perf.Dry)
	assert.Equal(t, "ft", d.Unit)
	assert.Equal(t, []layout.DeclaredDistance{{Name: "TORA", Value: 3608}, {Name: "TODA", Value: 3608}, {Name: "ASDA", Value: 3608}}, d.Declared)
	assert.Equal(t, 2204.0, d.Blocks[0].Weight)
	assert.Equal(t, []float64{1984, 1763}, d.Omitted, "900 kg = 1984.2 lb, 800 kg = 1763.7 lb, rounded down")
	text := allText(card)
	assert.Contains(t, text, "TORA 3608 ft")
	assert.Contains(t, text, "2204 lb")
	// No length in metres and no weight in kilograms anywhere on the card.
	assert.NotRegexp(t, regexp.MustCompile(`\d m\b`), text)
	assert.NotRegexp(t, regexp.MustCompile(`\d kg\b`), text)
	// Temperature heads carry their unit; crosswind heads are angles.
	assert.Contains(t, text, "°C")
	assert.Contains(t, text, "angle")
	assert.Regexp(t, regexp.MustCompile(`(?m)^90°$`), text)
	// The accelerate check is in feet too: half of 3608.9 ft, rounded down.
	assert.Equal(t, 1804.0, d.Accel.MidpointDist)

	// Fahrenheit: 30 C is 86 F (F = 1.8 C + 32, exact).
	f := withTemplate(t, j, strings.Replace(strings.Replace(usTemplate, "temperature_unit: C", "temperature_unit: F", 1), "page: 5x8", "page: half-letter", 1))
	d, card = build(t, f, e, perf.Dry)
	assert.InDelta(t, 86, d.Temps[8], 1e-9)
	assert.Contains(t, allText(card), "°F")
	assert.NotContains(t, allText(card), "°C")
}

// Item 3: every printed figure and its mark agree. Read from the card as a pilot:
// a figure above the framed declared distance is no-go, a figure that fits with less
// than the margin to spare is tight, the others go (common practice: the pilot
// compares what is printed).
func TestItem3PrintedFigureAndStateAgree(t *testing.T) {
	jobs := append(demoJobs(t, "a5"), withTemplate(t, demoJob(t, "a5", "Sedgefin", "KP-WRM"), usTemplate))
	checked := 0
	for _, j := range jobs {
		for _, e := range j.Airfield.Ends() {
			for _, c := range j.Conditions(e) {
				d, _, err := j.Card(e, c)
				require.NoError(t, err)
				avail := 0.0
				for _, dd := range d.Declared {
					if dd.Name == d.Limiting {
						avail = dd.Value
					}
				}
				require.Positive(t, avail)
				for _, b := range d.Blocks {
					for _, row := range b.Cells {
						for _, cell := range row {
							if !cell.HasDistance {
								continue
							}
							checked++
							want := perf.Go
							switch {
							case cell.Obstacle:
								// Issue 12: fits the declared distance as printed, but the climb
								// does not clear an obstacle: no-go with its own mark.
								assert.LessOrEqual(t, cell.Distance, avail, "the obstacle mark is for a figure that fits")
								want = perf.NoGo
							case cell.Distance > avail:
								want = perf.NoGo
							case cell.Distance*(1+d.TightMarginPct/100) > avail+1e-9:
								want = perf.Tight
							}
							assert.Equal(t, want, cell.State, "%s %s: %v %s against %v", j.Airfield.Ident, j.PageID(e, c), cell.Distance, d.Unit, avail)
							assert.Zero(t, math.Mod(cell.Distance, perf.CardStep), "figures in steps of 10")
						}
					}
				}
			}
		}
	}
	assert.Greater(t, checked, 1000)
}

// stubModel wraps a model and says "cannot take off" above a temperature.
type stubModel struct {
	perf.Model
	aboveK float64
}

func (s stubModel) Takeoff(c perf.Conditions) (perf.Result, error) {
	if c.TempK > s.aboveK {
		return perf.Result{}, fmt.Errorf("%w: acceleration stops below lift-off speed", perf.ErrCannotTakeOff)
	}
	return s.Model.Takeoff(c)
}

// Item 4: each mark means one thing. A temperature past the table's hottest column
// (the demo trainer's table stops at 40 C) is no data, never a limit; "cannot take
// off" is a no-go without a figure with its own mark, never n/d; the demonstrated
// crosswind is advisory (framed), a declared limit is black.
func TestItem4MarksMeanOneThing(t *testing.T) {
	j := withTemplate(t, demoJob(t, "a5", "Sedgefin", "KP-SPM"), usTemplate)
	e := endOf(t, j, "04")
	d, card := build(t, j, e, perf.Dry)
	last := len(d.Temps) - 1
	require.Equal(t, 45.0, d.Temps[last])
	for _, row := range d.Blocks[0].Cells {
		assert.Equal(t, perf.NoData, row[last].State, "45 C is above the table: no data")
		assert.NotEqual(t, perf.BeyondLimits, row[last].State)
	}
	assert.Contains(t, allText(card), "n/d")
	for _, tx := range texts(card, "grid") {
		assert.NotContains(t, tx.S, "LIM", "no limit passed on this card")
	}

	// A model that cannot take off above 25 C: black cells with the no-takeoff mark.
	j2 := demoJob(t, "a5", "Quillwing", "KP-WRM")
	m, err := perf.ModelFor(j2.Aircraft)
	require.NoError(t, err)
	j2.model = stubModel{Model: m, aboveK: 298.15}
	d, card = build(t, j2, endOf(t, j2, "07"), perf.Dry)
	for _, row := range d.Blocks[0].Cells {
		for ti, c := range row {
			if d.Temps[ti] > 25 {
				assert.Equal(t, perf.NoGo, c.State)
				assert.True(t, c.CannotTakeOff)
				assert.False(t, c.HasDistance)
			}
		}
	}
	grid := texts(card, "grid")
	marks := map[string]int{}
	for _, tx := range grid {
		marks[tx.S]++
	}
	assert.Zero(t, marks["n/d"], "cannot take off is never shown as no data")
	assert.Equal(t, 2*7*2, marks["X"], "2 blocks x 7 winds x the 30 and 35 C columns")

	// Crosswind helper: the tourer demonstrated 17 kt and declares a 20 kt limit (demo
	// values). 25 kt at 45 deg is 17.7 kt (25 sin 45, rounded up to 18): framed, not
	// black; 25 kt at 90 deg is 25 kt: black.
	xw := d.Crosswind
	assert.Equal(t, 17.0, xw.DemonstratedKt)
	assert.True(t, xw.HasLimit)
	assert.Equal(t, 20.0, xw.LimitKt)
	tools := texts(card, "tools")
	var toolsBlock layout.Block
	for _, b := range card.Blocks {
		if b.Name == "tools" {
			toolsBlock = b
		}
	}
	look := func(s string) (framed, black bool) {
		for _, tx := range tools {
			if tx.S != s || tx.Role != layout.Number {
				continue
			}
			for _, sh := range toolsBlock.Shapes {
				if tx.Ink().Inside(sh.Box) && sh.Kind == layout.StrokeRect && sh.Box.W < 20 {
					framed = true
				}
				if tx.Ink().Inside(sh.Box) && sh.Kind == layout.FillRect && sh.Color == layout.Black {
					black = true
				}
			}
		}
		return
	}
	f, b := look("18")
	assert.True(t, f, "past the demonstrated crosswind: framed")
	assert.False(t, b, "the demonstrated crosswind is not a limit")
	_, b = look("25")
	assert.True(t, b, "past the declared limit: black")
}

// Item 5: how to read the card, density altitude per column, and a cockpit rule for a
// lower QNH. An airfield at 5000 ft with the card's QNH 1013.25 hPa sits at pressure
// altitude 5000 ft (ICAO Doc 7488: QNH reduces through the ISA); at 25 C its density
// altitude is 7262 ft (domain notes sec. 2, from the ISA [calc]), printed rounded up to
// 7300 ft. Cross-check: the rule of thumb DA = PA + 120 ft per degree above ISA (5.1 C
// at 5000 ft) gives 7389 ft (common practice, within 150 ft).
func TestItem5HowToReadAndDensityAltitude(t *testing.T) {
	j := demoJob(t, "a5", "Sedgefin", "KP-WRM")
	f := *j.Airfield
	f.ElevationM = 5000 * units.MetresPerFoot
	j.Airfield = &f
	j.Template.QNHPa = 101325
	j.Template.TempsK = []float64{273.15, 278.15, 283.15, 288.15, 293.15, 298.15, 303.15, 308.15}
	d, card := build(t, j, endOf(t, j, "07"), perf.Dry)
	assert.InDelta(t, 5000, d.PressureAltFt, 0.5)
	assert.Equal(t, 7300.0, d.DensityAltFt[5])
	assert.InDelta(t, 5000+120*(25-5.09), d.DensityAltFt[5], 150)
	for i := 1; i < len(d.DensityAltFt); i++ {
		assert.Greater(t, d.DensityAltFt[i], d.DensityAltFt[i-1], "density altitude rises with temperature")
	}
	text := allText(card)
	assert.Contains(t, text, "DA ft")
	assert.Contains(t, text, "hotter column")
	assert.Contains(t, text, "No figure past the last column")
	assert.Contains(t, text, "factored in")
	assert.Contains(t, text, "tailwind at its gust", "the card says what check does: a tailwind counts at its gust")
	assert.NotContains(t, text, "recompute")

	// The QNH rule: 10 hPa less lowers the station pressure by 10/QNH (it is the QNH
	// times a factor of the elevation alone: ICAO Doc 7488); the same density is then
	// reached at T x 10/(QNH - 10) hotter: at 35 C and 1000 hPa, 308.15 x 10/990 =
	// 3.11 K, printed rounded up: 4 C (7 F: 3.11 x 1.8 = 5.6, rounded up to 6 F).
	tm := parseTemplate(t, strings.Replace(usTemplate, "qnh: 29.53 inHg", "qnh: 1000 hPa", 1))
	tm.TempsK = []float64{288.15, 308.15}
	assert.Equal(t, 4.0, hotterPer10hPa(tm))
	tm.TempUnit = "F"
	assert.Equal(t, 6.0, hotterPer10hPa(tm))
	// And the rule holds: the density at QNH 990 hPa and 35 C equals the density at
	// QNH 1000 hPa and 35 + 3.11 C (ICAO Doc 7488, ideal gas).
	pa990 := perf.PressureAltitudeFromQNH(99000, 1500)
	pa1000 := perf.PressureAltitudeFromQNH(100000, 1500)
	assert.InDelta(t, perf.DensityKgM3(pa990, 308.15), perf.DensityKgM3(pa1000, 308.15+308.15*10/990), 1e-9)
	// 1000 hPa is 29.53 inHg (1 inHg = 33.8639 hPa: NIST SP 811), rounded up.
	d, _ = build(t, demoJob(t, "a5", "Sedgefin", "KP-WRM"), endOf(t, j, "07"), perf.Dry)
	assert.Equal(t, 1000.0, d.QNHhPa)
	assert.Equal(t, 29.53, d.QNHinHg)
	// The standard 1013.25 hPa is 29.92 inHg (ICAO Doc 7488), within the 0.05 hPa
	// tolerance of the rounding up.
	j.Template.QNHPa = 101325
	d, _ = build(t, j, endOf(t, j, "07"), perf.Dry)
	assert.Equal(t, 1013.25, d.QNHhPa)
	assert.Equal(t, 29.92, d.QNHinHg)
}

// Item 6: the accelerate check as pilots are taught it (FAA AIM 7-6-8, runway half-way
// signs; 7-5-7 in older editions): the midpoint of this runway end and 70 % of the
// rotation speed. Saltpan 04: TORA 1100 m, midpoint 550 m; the demo trainer rotates at
// 55 KIAS (demo value): 0.7 x 55 = 38.5, printed rounded up to 39 KIAS.
func TestItem6AccelerateCheck(t *testing.T) {
	j := demoJob(t, "a5", "Sedgefin", "KP-SPM")
	e := endOf(t, j, "04")
	d, card := build(t, j, e, perf.Dry)
	a := d.Accel
	assert.Equal(t, 550.0, a.MidpointDist)
	assert.Equal(t, 55.0, a.RotateKIAS)
	assert.Equal(t, 39.0, a.SpeedKIAS)
	assert.Contains(t, allText(card), "550 m: 39 KIAS")
	assert.Contains(t, flatText(card), "By the runway midpoint reach 0.7 × VR 55 KIAS, or abandon (FAA AIM 7-6-8)")

	// An ASDA shorter than the TORA is the run available (perf takes it as the takeoff
	// run, common practice): the midpoint is the ASDA's, and the card says so. TORA
	// 1100 m, ASDA 700 m (a reviewer's case): midpoint 350 m, not 550 m, which would
	// leave 150 m to stop.
	short := e
	short.ASDAM = 700
	ds, cs := build(t, j, short, perf.Dry)
	assert.Equal(t, 350.0, ds.Accel.MidpointDist)
	assert.True(t, ds.Accel.OfASDA)
	assert.Contains(t, flatText(cs), "By the midpoint of the ASDA (shorter than the TORA) reach 0.7 × VR 55 KIAS")

	// The expected 70 % point is factored for the surface and slope the table does not
	// cover (gravel takes the grass factor 1.2, AMC1 CAT.POL.A.305; upslope +5 % per
	// 1 %, AMC2 CAT.POL.A.305), from the table's ground roll at the hottest column whose
	// calm cell fits; constant acceleration in still air reaches 0.7 V by 0.7^2 = 0.49 of
	// the roll (domain notes sec. 4 [calc]). Rounded down to the card's 10 m.
	m, err := perf.ModelFor(j.Aircraft)
	require.NoError(t, err)
	pol, _ := perf.PolicyByID(j.Template.Policy)
	pa := perf.PressureAltitudeFromQNH(j.Template.QNHPa, j.Airfield.ElevationM)
	for bi, pt := range a.Expected {
		kg := j.Aircraft.WeightsKg[bi]
		if !pt.Has {
			continue
		}
		r, err := m.Takeoff(perf.Conditions{PressureAltM: pa, TempK: pt.Temp + 273.15, MassKg: kg, Surface: perf.Gravel, Condition: perf.Dry, SlopePct: e.SlopePct})
		require.NoError(t, err)
		exact := 0.49 * r.GroundRollM * 1.2 * pol.SlopeFactor(e.SlopePct).Value
		assert.LessOrEqual(t, pt.Dist, exact, "rounded down")
		assert.Greater(t, pt.Dist, exact-10)
	}
	// Never on a block whose calm row is all no-go: the wet page at 1000 kg.
	d, card = build(t, j, e, perf.Wet)
	require.False(t, d.Accel.Expected[0].Has)
	for _, c := range d.Blocks[0].Cells[2] { // the calm row
		assert.Equal(t, perf.NoGo, c.State)
	}
	assert.Contains(t, flatText(card), "1000 kg none fits")
}

// Item 7: an unpaved end has a dry and a wet page, whatever the file declares; the
// assumption the grass factors carry is printed (AMC1 CAT.POL.A.305: grass up to 20 cm
// on firm soil); gravel is "unpaved (grass factor)", not "dry grass"; wet is never
// shorter than dry, cell by cell.
func TestItem7UnpavedWetAndDry(t *testing.T) {
	for _, j := range demoJobs(t, "a5") {
		for _, e := range j.Airfield.Ends() {
			require.Equal(t, []perf.Condition{perf.Dry, perf.Wet}, j.Conditions(e), "the demo aircraft have landing data: every end dry and wet")
			if e.Surface == perf.Paved {
				assert.Equal(t, []perf.Condition{e.Condition}, Conditions(e, false), "a paved end of a takeoff-only card: the declared condition")
				continue
			}
			require.Equal(t, []perf.Condition{perf.Dry, perf.Wet}, Conditions(e, false), "an unpaved end: dry and wet, takeoff only or not")
			dry, dc := build(t, j, e, perf.Dry)
			wet, wc := build(t, j, e, perf.Wet)
			assert.Equal(t, e.Designator+" wet", j.PageID(e, perf.Wet))
			assert.Contains(t, allText(wc), "WET")
			assert.Contains(t, allText(dc), "DRY")
			for bi := range dry.Blocks {
				for wi := range dry.Blocks[bi].Cells {
					for ti, dcell := range dry.Blocks[bi].Cells[wi] {
						wcell := wet.Blocks[bi].Cells[wi][ti]
						if dcell.HasDistance && wcell.HasDistance {
							assert.GreaterOrEqual(t, wcell.Distance, dcell.Distance, "wet never shorter than dry")
						}
						assert.GreaterOrEqual(t, wcell.State, dcell.State)
					}
				}
			}
			text := allText(dc)
			switch e.Surface {
			case perf.Gravel:
				assert.Contains(t, flatText(dc), "unpaved, dry: grass factor +20 %")
				assert.NotContains(t, text, "dry grass")
				assert.Contains(t, flatText(wc), "unpaved, wet: grass factor +30 %")
				assert.Contains(t, text, "AMC1 CAT.POL.A.305")
			case perf.Grass:
				assert.Contains(t, flatText(dc), "dry grass +20 % (grass to 20 cm on firm soil: AMC1 CAT.POL.A.305)")
				assert.Contains(t, allText(wc), "wet grass +30 %")
			}
		}
	}
}

// Item 8: factors exactly as applied. Wrenmoor 07 slopes up 0.3 %: +5 % per 1 % of
// upslope (AMC2 CAT.POL.A.305) is x1.015, printed +1.5 %, not x1.01. The overall
// factor of the advisory policy, x1.33 (UK CAA SSL 7c, as recorded in the policy).
func TestItem8FactorsExact(t *testing.T) {
	j := demoJob(t, "a5", "Sedgefin", "KP-WRM")
	d, card := build(t, j, endOf(t, j, "07"), perf.Dry)
	assert.Contains(t, d.PolicyItems, "upslope"+layout.NBSP+"0.3"+layout.NBSP+"%"+" "+"+1.5"+layout.NBSP+"%")
	assert.Contains(t, d.PolicyItems, "TOD ×1.33 ≤ TORA")
	assert.Contains(t, flatText(card), "upslope 0.3 % +1.5 %")
	for _, tc := range []struct {
		v    float64
		want string
	}{{1.015, "+1.5 %"}, {1.2, "+20 %"}, {1.3, "+30 %"}, {1.05, "+5 %"}, {1.0499667, "+5 %"}, {1.0175, "+1.75 %"}} {
		assert.Equal(t, tc.want, pctFactor(tc.v), "%v", tc.v)
	}
	// No factor item is split between lines.
	for _, tx := range texts(card, "header") {
		s := strings.ReplaceAll(tx.S, layout.NBSP, " ")
		assert.False(t, strings.HasSuffix(s, "upslope") || strings.HasPrefix(s, "0.3 %") || strings.HasPrefix(s, "+1.5 %"), "orphaned: %q", s)
	}
}

// Item 9: legible where it matters. Nothing below 8 pt, figures the largest text after
// the runway title, and the layout checks (no text touching a line or overrunning a
// frame) pass on 12 temperature columns with 4-digit feet figures.
func TestItem9Legible(t *testing.T) {
	assert.Equal(t, 8.0, layout.MinTextPt)
	cases := []*Job{withTemplate(t, demoJob(t, "a5", "Sedgefin", "KP-SPM"), usTemplate)}
	cases = append(cases, demoJobs(t, "a5")...)
	for _, j := range cases {
		for _, e := range j.Airfield.Ends() {
			d, card := build(t, j, e, j.Conditions(e)[0])
			fig := 0.0
			for _, tx := range texts(card, "grid") {
				if tx.Role == layout.Number && tx.Style == layout.Bold && len(tx.S) >= 3 && tx.S[0] >= '0' && tx.S[0] <= '9' {
					fig = math.Max(fig, tx.SizePt)
				}
			}
			require.Positive(t, fig)
			for _, tx := range texts(card, "") {
				assert.GreaterOrEqual(t, tx.SizePt, layout.MinTextPt, "%q", tx.S)
				if strings.HasPrefix(tx.S, "RWY ") || tx.S == d.AirfieldName || strings.HasSuffix(tx.S, "° M") || tx.S == "DRY" || tx.S == "WET" {
					continue // the title line
				}
				assert.LessOrEqual(t, tx.SizePt, fig+1e-9, "figures stay the largest: %q", tx.S)
			}
		}
	}
	// With 2 weight blocks there is no empty band: the tools follow the grid at once.
	j := demoJob(t, "a5", "Quillwing", "KP-WRM")
	_, card := build(t, j, endOf(t, j, "07"), perf.Dry)
	var grid, tools layout.Block
	for _, b := range card.Blocks {
		switch b.Name {
		case "grid":
			grid = b
		case "tools":
			tools = b
		}
	}
	assert.InDelta(t, 1.2, tools.Box.Y-(grid.Box.Y+grid.Box.H), 1e-6)
}

// Item 10: a card on which no cell has a figure says so, and the summary can list it.
// The demo trainer's table stops at 8000 ft: an airfield at 9000 ft has no data.
func TestItem10EmptyCard(t *testing.T) {
	j := demoJob(t, "a5", "Sedgefin", "KP-WRM")
	f := *j.Airfield
	f.ElevationM = 9000 * units.MetresPerFoot
	j.Airfield = &f
	fonts, _ := layout.NewFonts()
	rd, err := j.Render(fonts)
	require.NoError(t, err)
	for _, s := range rd.Ends {
		assert.True(t, s.Empty, s.Page)
		assert.Contains(t, s.EmptyWhy, "pressure altitude")
	}
	d, card := build(t, j, endOf(t, j, "07"), perf.Dry)
	assert.Contains(t, d.Empty, "above the table's highest")
	assert.Contains(t, allText(card), "NO FIGURE ON THIS CARD")
}

// Item 11: the card data beside the PDF says what the card prints.
func TestItem11CardData(t *testing.T) {
	j := demoJob(t, "a5", "Sedgefin", "KP-SPM")
	j.Data = true
	fonts, _ := layout.NewFonts()
	rd, err := j.Render(fonts)
	require.NoError(t, err)
	var f CardFile
	dec := json.NewDecoder(strings.NewReader(string(rd.Data)))
	dec.DisallowUnknownFields()
	require.NoError(t, dec.Decode(&f))
	assert.Equal(t, DataFormat, f.Format)
	require.Len(t, f.Pages, 4, "04 dry, 04 wet, 22 dry, 22 wet")
	p := f.Pages[1]
	assert.Equal(t, "04 wet", p.Page)
	assert.Equal(t, "m", p.Unit)
	assert.Equal(t, 1100.0, *p.Declared.TORA)
	assert.Nil(t, p.Declared.LDA)
	assert.Equal(t, 550.0, p.AccelerateCheck.Midpoint)
	assert.Equal(t, 39.0, *p.AccelerateCheck.SpeedKIAS)
	d, _, err := j.Card(endOf(t, j, "04"), perf.Wet)
	require.NoError(t, err)
	require.Len(t, p.Blocks, len(d.Blocks))
	for bi, b := range d.Blocks {
		assert.Equal(t, b.Weight, p.Blocks[bi].Weight)
		require.Len(t, p.Blocks[bi].Cells, len(d.WindsKt)*len(d.Temps))
		for wi, row := range b.Cells {
			for ti, c := range row {
				dc := p.Blocks[bi].Cells[wi*len(d.Temps)+ti]
				assert.Equal(t, d.WindsKt[wi], dc.WindKt)
				assert.Equal(t, d.Temps[ti], dc.Temperature)
				assert.Equal(t, c.State.String(), dc.State)
				if c.HasDistance {
					require.NotNil(t, dc.Figure)
					assert.Equal(t, c.Distance, *dc.Figure)
				} else {
					assert.Nil(t, dc.Figure)
				}
			}
		}
	}
	// Without Data, no JSON is made.
	j.Data = false
	rd, err = j.Render(fonts)
	require.NoError(t, err)
	assert.Nil(t, rd.Data)
	assert.False(t, errors.Is(err, perf.ErrNoData))
}

// Item 6: without a rotation speed in the profile there is no speed to check: the card
// says so instead of inventing one.
func TestItem6NoRotationSpeed(t *testing.T) {
	j := demoJob(t, "a5", "Sedgefin", "KP-WRM")
	a := *j.Aircraft
	a.RotateIASMS = 0
	j.Aircraft = &a
	d, card := build(t, j, endOf(t, j, "07"), perf.Dry)
	assert.Zero(t, d.Accel.SpeedKIAS)
	assert.Contains(t, flatText(card), "No rotation speed in the profile (speeds.rotation)")
}
