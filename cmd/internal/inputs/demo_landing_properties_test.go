package inputs

import (
	"testing"

	"github.com/stretchr/testify/require"

	"kneeprint/perf"
)

// landingRequired evaluates one landing cell and returns its required distance and
// the model's unfactored landing distance from 50 ft, or ok=false without a figure.
func landingRequired(dc demoCase, m perf.LandingModel, e perf.RunwayEnd, paM, tempK, massKg, headwindMS float64) (req, ld float64, ok bool) {
	c := perf.EvaluateLanding(perf.LandingCase{
		Aircraft: dc.a, Model: m, Policy: dc.policy, End: e,
		PressureAltM: paM, TempK: tempK, MassKg: massKg,
		Wind: perf.Components{HeadwindMS: headwindMS}, TightMargin: perf.DefaultTightMargin,
	})
	return c.RequiredM, c.To50ftM, c.HasDistance
}

// Issue 11, tests: over the whole demo (both demo aircraft, a landing table and a
// calibrated physics landing model, both policies, every runway end) heavier,
// hotter, higher, a tailwind, a downslope and a wet or unpaved surface never shorten
// the required landing distance; a headwind and an upslope never lengthen it; the
// requirement is never below the model's own distance; a go cell fits its LDA as
// printed.
func TestDemoLandingProperties(t *testing.T) {
	for _, dc := range demoCases(t) {
		m, err := perf.LandingModelFor(dc.a)
		require.NoError(t, err, dc.name)
		mlm := dc.a.Landing.MaxMassKg
		light := dc.a.WeightsKg[len(dc.a.WeightsKg)-1]
		t.Run(dc.name, func(t *testing.T) {
			for _, e := range dc.f.Ends() {
				pa := perf.PressureAltitudeFromQNH(100000, dc.f.ElevationM)
				f := func(e perf.RunwayEnd, pa, temp, mass, wind float64) (float64, float64, bool) {
					return landingRequired(dc, m, e, pa, temp, mass, wind)
				}
				for _, w := range []float64{mlm, light} {
					monotone(t, e.Designator+" landing temperature", +1, span(-10+273.15, 40+273.15, 2.5), func(x float64) (float64, float64, bool) { return f(e, pa, x, w, 0) })
					monotone(t, e.Designator+" landing pressure altitude", +1, span(0, 2500, 100), func(x float64) (float64, float64, bool) { return f(e, x, 293.15, w, 0) })
					monotone(t, e.Designator+" landing headwind (more headwind, shorter)", -1, span(0, 20*kt, 1*kt), func(x float64) (float64, float64, bool) { return f(e, pa, 293.15, w, x) })
					monotone(t, e.Designator+" landing tailwind (more tailwind, longer)", +1, span(0, 10*kt, 0.5*kt), func(x float64) (float64, float64, bool) { return f(e, pa, 293.15, w, -x) })
				}
				monotone(t, e.Designator+" landing weight", +1, span(light, mlm, 25), func(x float64) (float64, float64, bool) { return f(e, pa, 293.15, x, 0) })
				monotone(t, e.Designator+" landing downslope (more downslope, longer)", +1, span(0, 3, 0.25), func(x float64) (float64, float64, bool) {
					e2 := e
					e2.SlopePct = -x
					req, _, ok := f(e2, pa, 293.15, mlm, 0)
					return req, 0, ok // the requirement must rise; a table's own figure has no slope
				})
				monotone(t, e.Designator+" landing upslope (never longer)", -1, span(0, 3, 0.25), func(x float64) (float64, float64, bool) {
					e2 := e
					e2.SlopePct = x
					req, _, ok := f(e2, pa, 293.15, mlm, 0)
					return req, 0, ok
				})
				type sc struct {
					s perf.Surface
					c perf.Condition
				}
				for _, chain := range [][]sc{
					{{perf.Paved, perf.Dry}, {perf.Grass, perf.Dry}, {perf.Grass, perf.Wet}},
					{{perf.Paved, perf.Dry}, {perf.Paved, perf.Wet}},
					{{perf.Paved, perf.Dry}, {perf.Gravel, perf.Dry}, {perf.Gravel, perf.Wet}},
				} {
					xs := make([]float64, len(chain))
					for i := range xs {
						xs[i] = float64(i)
					}
					monotone(t, e.Designator+" landing surface", +1, xs, func(x float64) (float64, float64, bool) {
						e2 := e
						e2.Surface, e2.Condition = chain[int(x)].s, chain[int(x)].c
						req, _, ok := f(e2, pa, 293.15, mlm, 0)
						return req, 0, ok
					})
				}
				g, err := perf.ComputeLandingGrid(dc.a, m, dc.policy, *dc.f, e, perf.GridSpec{
					TempsK: span(273.15, 308.15, 5), HeadwindsMS: []float64{-10 * kt, -5 * kt, 0, 5 * kt, 10 * kt, 20 * kt},
					WeightsKg: perf.LandingMasses(dc.a, dc.a.WeightsKg, 0), QNHPa: 100000, TightMargin: perf.DefaultTightMargin,
					Rounding: perf.Rounding{Step: perf.CardStep},
				})
				require.NoError(t, err)
				for _, blk := range g.Cells {
					for _, row := range blk {
						for _, c := range row {
							if !c.HasDistance {
								continue
							}
							if c.RequiredM < c.To50ftM {
								t.Errorf("%s: required %.1f below the model's %.1f", e.Designator, c.RequiredM, c.To50ftM)
							}
							if (c.State == perf.Go || c.State == perf.Tight) && c.ShownRequired > c.ShownAvailable {
								t.Errorf("%s: a %s cell prints %.0f against an LDA of %.0f", e.Designator, c.State, c.ShownRequired, c.ShownAvailable)
							}
							if c.Limiting != "LDA" {
								t.Errorf("%s: a landing cell is held against %q", e.Designator, c.Limiting)
							}
						}
					}
				}
			}
		})
	}
}
