package inputs

import (
	"fmt"
	"testing"

	"github.com/stretchr/testify/require"

	"kneeprint/perf"
)

const kt = 1852.0 / 3600.0 // ICAO Annex 5

type demoCase struct {
	name   string
	a      *perf.Aircraft
	m      perf.Model
	f      *perf.Airfield
	policy perf.Policy
}

func demoCases(t *testing.T) []demoCase {
	t.Helper()
	ac, af := Demo()
	var out []demoCase
	for _, as := range ac {
		ad, err := as.Load()
		require.NoError(t, err)
		m, err := perf.ModelFor(ad.Aircraft)
		require.NoError(t, err)
		for _, fs := range af {
			fd, err := fs.Load()
			require.NoError(t, err)
			for _, id := range perf.PolicyIDs() {
				p, _ := perf.PolicyByID(id)
				out = append(out, demoCase{fmt.Sprintf("%s@%s/%s", ad.Aircraft.Name, fd.Airfield.Ident, id), ad.Aircraft, m, fd.Airfield, p})
			}
		}
	}
	require.NotEmpty(t, out)
	return out
}

// required evaluates one cell and returns its required distance and unfactored
// distance to 50 ft, or ok=false when the cell has no distance.
func required(dc demoCase, e perf.RunwayEnd, paM, tempK, massKg, headwindMS float64) (req, to50 float64, ok bool) {
	c := perf.Evaluate(perf.Case{
		Aircraft: dc.a, Model: dc.m, Policy: dc.policy, End: e,
		PressureAltM: paM, TempK: tempK, MassKg: massKg,
		Wind: perf.Components{HeadwindMS: headwindMS}, TightMargin: perf.DefaultTightMargin,
	})
	return c.RequiredM, c.To50ftM, c.HasDistance
}

// monotone checks that f never decreases (sign +1) or never increases (sign -1)
// along xs, over every pair of neighbouring points that both have a distance.
func monotone(t *testing.T, what string, sign float64, xs []float64, f func(x float64) (float64, float64, bool)) {
	t.Helper()
	var prevReq, prevTo float64
	have := false
	for _, x := range xs {
		req, to, ok := f(x)
		if !ok {
			have = false
			continue
		}
		if have {
			if sign*(req-prevReq) < -1e-9 || sign*(to-prevTo) < -1e-9 {
				t.Errorf("%s: at %g required %.3f after %.3f, to 50 ft %.3f after %.3f", what, x, req, prevReq, to, prevTo)
			}
		}
		prevReq, prevTo, have = req, to, true
	}
}

func span(lo, hi, step float64) []float64 {
	var out []float64
	for x := lo; x <= hi+1e-9; x += step {
		out = append(out, x)
	}
	return out
}

// Over the whole demo: distance never decreases with weight, temperature, pressure
// altitude, tailwind, upslope, grass or a wet surface, and never increases with
// headwind (properties of the physics, common practice).
func TestDemoMonotonicity(t *testing.T) {
	for _, dc := range demoCases(t) {
		t.Run(dc.name, func(t *testing.T) {
			for _, e := range dc.f.Ends() {
				pa := perf.PressureAltitudeFromQNH(100000, dc.f.ElevationM)
				temps := span(-10+273.15, 40+273.15, 2.5)
				weights := span(dc.a.WeightsKg[len(dc.a.WeightsKg)-1], dc.a.MTOWKg, 25)
				for _, w := range []float64{dc.a.MTOWKg, dc.a.WeightsKg[len(dc.a.WeightsKg)-1]} {
					monotone(t, e.Designator+" temperature", +1, temps, func(x float64) (float64, float64, bool) { return required(dc, e, pa, x, w, 0) })
					monotone(t, e.Designator+" pressure altitude", +1, span(0, 2500, 100), func(x float64) (float64, float64, bool) { return required(dc, e, x, 293.15, w, 0) })
					monotone(t, e.Designator+" headwind (more headwind, shorter)", -1, span(0, 25*kt, 1*kt), func(x float64) (float64, float64, bool) { return required(dc, e, pa, 293.15, w, x) })
					monotone(t, e.Designator+" tailwind (more tailwind, longer)", +1, span(0, 10*kt, 0.5*kt), func(x float64) (float64, float64, bool) { return required(dc, e, pa, 293.15, w, -x) })
				}
				monotone(t, e.Designator+" weight", +1, weights, func(x float64) (float64, float64, bool) { return required(dc, e, pa, 293.15, x, 0) })
				monotone(t, e.Designator+" upslope", +1, span(0, 3, 0.25), func(x float64) (float64, float64, bool) {
					e2 := e
					e2.SlopePct = x
					return required(dc, e2, pa, 293.15, dc.a.MTOWKg, 0)
				})
				// Surface order: paved dry <= grass dry <= grass wet; dry <= wet on each.
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
					monotone(t, e.Designator+" surface", +1, xs, func(x float64) (float64, float64, bool) {
						e2 := e
						e2.Surface, e2.Condition = chain[int(x)].s, chain[int(x)].c
						req, to, ok := required(dc, e2, pa, 293.15, dc.a.MTOWKg, 0)
						return req, to * 0, ok // the unfactored figure may legitimately not move; the requirement must
					})
				}
			}
		})
	}
}

// Every distance printed must be at least what the model computed, and every cell with
// a distance must say which declared distance limits it.
func TestDemoRequiredNeverBelowModel(t *testing.T) {
	for _, dc := range demoCases(t) {
		for _, e := range dc.f.Ends() {
			g, err := perf.ComputeGrid(dc.a, dc.m, dc.policy, *dc.f, e, perf.DefaultGridSpec(dc.a))
			require.NoError(t, err)
			for _, blk := range g.Cells {
				for _, row := range blk {
					for _, c := range row {
						if !c.HasDistance {
							continue
						}
						if c.RequiredM < c.To50ftM {
							t.Errorf("%s %s: required %.1f below the model's %.1f", dc.name, e.Designator, c.RequiredM, c.To50ftM)
						}
						if c.Limiting == "" {
							t.Errorf("%s %s: no limiting distance", dc.name, e.Designator)
						}
					}
				}
			}
		}
	}
}
