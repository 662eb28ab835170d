package perf

import (
	"errors"
	"fmt"
	"math"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
)

// Geometry written out by hand (issue 12 item 3): height at the obstacle =
// 50 ft at the 50 ft point + gradient x the distance beyond it, heights above the end
// of the TORA, the runway's rise to its end subtracted on an upslope
// (CAT.POL.A.310(a)(1): the path begins 50 ft above the surface at the end of the
// takeoff distance). 50 ft = 15.24 m, 35 ft = 10.668 m (0.3048 m per foot, ICAO Annex 5).
func TestObstacleClearanceHandCalculation(t *testing.T) {
	cases := []struct {
		name         string
		tora, slope  float64
		height, past float64
		tod, grad    float64
		wantH        float64
		wantClear    float64
		before       bool
	}{
		{
			// beyond = 840 + 400 - 600 = 640 m; h = 15.24 + 0.05 x 640 = 47.24 m;
			// clearance = 47.24 - 10.668 = 36.572 m.
			name: "level, 35 ft at 400 m, 5 %", tora: 840, height: 10.668, past: 400, tod: 600, grad: 0.05,
			wantH: 47.24, wantClear: 36.572,
		},
		{
			// rise of the runway from the 50 ft point to its end: 3.28 % x (610 - 450)
			// = 5.248 m; h = 15.24 - 5.248 + 0.06 x 160 = 19.592 m; clearance 4.352 m.
			name: "upslope 3.28 %, 50 ft trees at the end, 6 %", tora: 610, slope: 3.28, height: 15.24, past: 0, tod: 450, grad: 0.06,
			wantH: 19.592, wantClear: 4.352,
		},
		{
			// The runway (5 %) rises faster than the aircraft climbs (2 %): taken as if
			// the 50 ft were reached at the start of the run, h = 15.24 - 0.05 x 610 +
			// 0.02 x (610 + 100) = -1.06 m: below the end of the TORA, clearance
			// -1.06 - 3 = -4.06 m (the formula alone, 15.24 - 0.05 x 160 + 0.02 x 260 =
			// 12.44 m, would credit the late takeoff).
			name: "upslope steeper than the climb", tora: 610, slope: 5, height: 3, past: 100, tod: 450, grad: 0.02,
			wantH: -1.06, wantClear: -4.06,
		},
		{
			// No credit for a downslope: as level, h = 15.24 + 0.06 x 160 = 24.84 m.
			name: "downslope 2 %, no credit", tora: 610, slope: -2, height: 15.24, past: 0, tod: 450, grad: 0.06,
			wantH: 24.84, wantClear: 9.6,
		},
		{
			// The 50 ft point in the clearway, 40 m past the end of the TORA: no rise,
			// beyond = 560 + 100 - 600 = 60 m, h = 15.24 + 0.05 x 60 = 18.24 m.
			name: "50 ft point past the TORA", tora: 560, slope: 3, height: 3, past: 100, tod: 600, grad: 0.05,
			wantH: 18.24, wantClear: 15.24,
		},
		{
			// 560 + 100 < 700: the obstacle stands before the 50 ft point: height
			// there not known, taken as zero.
			name: "obstacle before the 50 ft point", tora: 560, height: 3, past: 100, tod: 700, grad: 0.05,
			wantH: 0, wantClear: -3, before: true,
		},
		{
			// No climb: level at 50 ft, never a descent.
			name: "negative gradient taken as level", tora: 840, height: 10.668, past: 400, tod: 600, grad: -0.01,
			wantH: 15.24, wantClear: 4.572,
		},
	}
	for _, tc := range cases {
		t.Run(tc.name, func(t *testing.T) {
			e := RunwayEnd{TORAM: tc.tora, SlopePct: tc.slope}
			c := ObstacleClearance(e, Obstacle{HeightM: tc.height, PastEndM: tc.past}, tc.tod, tc.grad)
			assert.InDelta(t, tc.wantH, c.HeightM, 1e-9, "height")
			assert.InDelta(t, tc.wantClear, c.ClearanceM, 1e-9, "clearance")
			assert.Equal(t, tc.before, c.BeforeScreen)
		})
	}
}

// Properties of the geometry: a higher obstacle, a nearer one, a longer takeoff or a
// flatter climb never leaves more clearance (issue 12, tests).
func TestObstacleClearanceMonotonic(t *testing.T) {
	for _, slope := range []float64{-2, 0, 1.5, 4} {
		e := RunwayEnd{TORAM: 700, SlopePct: slope}
		for _, tod := range []float64{300, 550, 700, 760} {
			for _, g := range []float64{0, 0.02, 0.08} {
				for _, past := range []float64{0, 150, 600} {
					for _, h := range []float64{2, 10, 30} {
						base := ObstacleClearance(e, Obstacle{HeightM: h, PastEndM: past}, tod, g).ClearanceM
						at := fmt.Sprintf("slope %g, tod %g, g %g, past %g, h %g", slope, tod, g, past, h)
						assert.LessOrEqual(t, ObstacleClearance(e, Obstacle{HeightM: h + 5, PastEndM: past}, tod, g).ClearanceM, base, "higher: "+at)
						if past > 0 {
							assert.LessOrEqual(t, ObstacleClearance(e, Obstacle{HeightM: h, PastEndM: past - 50}, tod, g).ClearanceM, base+1e-9, "nearer: "+at)
						}
						assert.LessOrEqual(t, ObstacleClearance(e, Obstacle{HeightM: h, PastEndM: past}, tod+40, g).ClearanceM, base+1e-9, "longer takeoff: "+at)
						assert.LessOrEqual(t, ObstacleClearance(e, Obstacle{HeightM: h, PastEndM: past}, tod, g-0.01).ClearanceM, base+1e-9, "flatter climb: "+at)
					}
				}
			}
		}
	}
}

// fixedClimb answers one rate of climb at one true airspeed, whatever the conditions.
type fixedClimb struct {
	rate, tas float64
	err       error
	asked     *Conditions
}

func (f fixedClimb) Climb(c Conditions) (ClimbResult, error) {
	if f.asked != nil {
		*f.asked = c
	}
	return ClimbResult{RateMS: f.rate, TASMS: f.tas}, f.err
}

// obstacleCase is a paved, dry, level 840 m runway with a 35 ft powerline 400 m past
// its end, and a model whose distance to 50 ft is tod (no factor on a paved, dry,
// level runway: AMC1 and AMC2 CAT.POL.A.305; eu-class-b's TOD x1.25 <= TORA).
func obstacleCase(tod float64, cm ClimbModel) Case {
	m := fixedModel{r: Result{GroundRollM: tod / 2, To50ftM: tod}}
	a := &Aircraft{Name: "test", MTOWKg: 1000, MaxTailwindMS: 10 * knot, Model: ModelTable}
	eu, _ := PolicyByID(PolicyEUClassB)
	e := RunwayEnd{Designator: "07", TORAM: 840, TODAM: 840, ASDAM: 840, Surface: Paved, Condition: Dry,
		Obstacles: []Obstacle{{HeightM: 35 * footM, PastEndM: 400, Note: "powerline"}}}
	return Case{Aircraft: a, Model: m, Policy: eu, End: e, TempK: 288.15, MassKg: 1000, TightMargin: 0.1, Climb: cm}
}

// The cell's verdict on an obstacle, end to end through Evaluate: TOD 600 m fits
// (x1.25 = 750 <= 840, CAT.POL.A.305(b)(1)); the climb 0.2 m/s at 40 m/s is a
// gradient of 0.5 %; beyond the 50 ft point 840 + 400 - 600 = 640 m, so the height at
// the powerline is 15.24 + 3.2 = 18.44 m = 60.50 ft and the clearance 25.50 ft,
// printed 25 ft: short of the 50 ft margin (common practice; CAT.POL.A.310(a) for
// multi-engine class B). The reason reads as the issue asks.
func TestEvaluateObstacleNoGo(t *testing.T) {
	k := obstacleCase(600, fixedClimb{rate: 0.2, tas: 40})
	c := Evaluate(k)
	require.True(t, c.HasClimb, c.Reasons())
	assert.Equal(t, NoGo, c.State)
	assert.True(t, c.ObstacleNoGo, "fits the TORA, does not clear")
	assert.InDelta(t, 0.005, c.ClimbGradient, 1e-12)
	assert.InDelta(t, 18.44, c.Clearance.HeightM, 1e-9)
	assert.Contains(t, c.Reasons(), "35 ft powerline at 400 m past the runway end: 25 ft clearance, 50 ft required")

	// A margin of 20 ft is met: the distance decides again (go).
	k.ObstacleMarginM = 20 * footM
	c = Evaluate(k)
	assert.Equal(t, Go, c.State, c.Reasons())
	assert.False(t, c.ObstacleNoGo)

	// 5 %: 15.24 + 32 = 47.24 m, clearance 36.572 m = 119.98 ft: cleared by 50 ft.
	k = obstacleCase(600, fixedClimb{rate: 2, tas: 40})
	c = Evaluate(k)
	assert.Equal(t, Go, c.State, c.Reasons())
	assert.InDelta(t, 36.572, c.Clearance.ClearanceM, 1e-9)

	// Too long for the TORA and short of the margin: a plain no-go, not the
	// obstacle's mark.
	k = obstacleCase(700, fixedClimb{rate: 0.2, tas: 40})
	c = Evaluate(k)
	assert.Equal(t, NoGo, c.State)
	assert.False(t, c.ObstacleNoGo)
}

// The verdict follows the printed feet: a clearance of 49.99 ft prints 49 and fails a
// 50 ft margin; 50.0 prints 50 and passes.
func TestObstacleStateFromPrintedFeet(t *testing.T) {
	for _, tc := range []struct {
		clearFt float64
		want    State
	}{{49.99, NoGo}, {50.0, Go}} {
		// gradient g over the 640 m beyond the 50 ft point: h = 15.24 + 640 g must
		// be 35 ft + clearFt.
		g := ((35+tc.clearFt)*footM - 15.24) / 640
		k := obstacleCase(600, fixedClimb{rate: g * 40, tas: 40})
		c := Evaluate(k)
		assert.Equal(t, tc.want, c.State, "clearance %.2f ft: %v", tc.clearFt, c.Reasons())
	}
}

// The climb is asked at the pressure altitude of the highest obstacle's top plus the
// margin (the conservative side: the rate falls as the aircraft climbs), at the
// surface temperature and the takeoff mass; the wind is credited as for the takeoff,
// 50 % of a headwind and 150 % of a tailwind (CAT.POL.A.305(c)), whatever the takeoff
// data include.
func TestObstacleClimbConditionsAndWind(t *testing.T) {
	var asked Conditions
	k := obstacleCase(600, fixedClimb{rate: 2, tas: 40, asked: &asked})
	k.PressureAltM = 500
	k.End.Obstacles = append(k.End.Obstacles, Obstacle{HeightM: 30, PastEndM: 2000, Note: "ridge"})
	k.Wind = Components{HeadwindMS: 10}
	c := Evaluate(k)
	assert.InDelta(t, 500+30+15.24, asked.PressureAltM, 1e-9)
	assert.Equal(t, 288.15, asked.TempK)
	assert.Equal(t, 1000.0, asked.MassKg)
	assert.InDelta(t, 2.0/(40-5), c.ClimbGradient, 1e-12, "50 % of a 10 m/s headwind")

	k.Wind = Components{HeadwindMS: -2}
	c = Evaluate(k)
	assert.InDelta(t, 2.0/(40+3), c.ClimbGradient, 1e-12, "150 % of a 2 m/s tailwind")
}

// Without climb data a cell with obstacles has no figure, unless its distance is
// already no-go; a model error that is a "cannot climb" makes it no-go.
func TestObstacleWithoutClimb(t *testing.T) {
	k := obstacleCase(600, nil) // the aircraft has no climb section
	c := Evaluate(k)
	assert.Equal(t, NoData, c.State)
	assert.True(t, errors.Is(func() error { _, err := ClimbFor(k.Aircraft); return err }(), ErrNoClimbData))
	assert.Contains(t, fmt.Sprint(c.Reasons()), "no climb section")

	k = obstacleCase(700, nil)
	c = Evaluate(k)
	assert.Equal(t, NoGo, c.State, "a runway too short needs no climb to be refused")

	k = obstacleCase(600, fixedClimb{err: fmt.Errorf("%w: no engine power left", ErrCannotTakeOff)})
	c = Evaluate(k)
	assert.Equal(t, NoGo, c.State)
	assert.True(t, c.ObstacleNoGo)

	k = obstacleCase(600, fixedClimb{err: fmt.Errorf("%w: above the climb table", ErrNoData)})
	c = Evaluate(k)
	assert.Equal(t, NoData, c.State)
}

// An end without obstacles is not touched by the climb: no climb asked, no field set.
func TestNoObstacleNoClimb(t *testing.T) {
	k := obstacleCase(600, fixedClimb{err: errors.New("must not be asked")})
	k.End.Obstacles = nil
	c := Evaluate(k)
	assert.Equal(t, Go, c.State)
	assert.False(t, c.HasClimb)
}

// smallClimb is a rate-of-climb table beside smallTable (invented test values, in
// ft/min: 0 and 1000 m, 0 and 30 C, 900 and 1100 kg), rates falling with each axis.
func smallClimb() *ClimbTable {
	fpm := footM / 60
	return &ClimbTable{
		PressureAltM: []float64{0, 1000},
		TempK:        []float64{273.15, 303.15},
		WeightKg:     []float64{900, 1100},
		RateMS: [][][]float64{
			{{900 * fpm, 780 * fpm}, {760 * fpm, 640 * fpm}},
			{{700 * fpm, 600 * fpm}, {580 * fpm, 480 * fpm}},
		},
	}
}

// Hotter, heavier, more tailwind, a higher or nearer obstacle never improve the
// clearance, through the real table models end to end (issue 12, tests).
func TestObstacleClearanceNeverImproves(t *testing.T) {
	m := smallTable()
	a := testAircraft(m)
	a.Climb = &Climb{SpeedIASMS: 65 * knot, Table: smallClimb()}
	uk, _ := PolicyByID(PolicyUKAdvisory)
	clearance := func(tempK, mass, wind, height, past float64) float64 {
		e := RunwayEnd{Designator: "07", TORAM: 900, TODAM: 900, ASDAM: 900, Surface: Paved, Condition: Dry,
			Obstacles: []Obstacle{{HeightM: height, PastEndM: past}}}
		c := Evaluate(Case{Aircraft: a, Model: m, Policy: uk, End: e, PressureAltM: 300, TempK: tempK, MassKg: mass,
			Wind: Components{HeadwindMS: wind}, TightMargin: 0.1})
		require.True(t, c.HasClimb, c.Reasons())
		return c.Clearance.ClearanceM
	}
	for _, tk := range []float64{273.15, 283.15, 293.15} {
		for _, kg := range []float64{900, 1000} {
			for _, w := range []float64{-3, 0, 5} {
				for _, h := range []float64{5, 15} {
					for _, d := range []float64{100, 500} {
						base := clearance(tk, kg, w, h, d)
						at := fmt.Sprintf("%.0f K, %.0f kg, wind %g, %g m at %g m", tk, kg, w, h, d)
						assert.LessOrEqual(t, clearance(tk+10, kg, w, h, d), base, "hotter: "+at)
						assert.LessOrEqual(t, clearance(tk, kg+100, w, h, d), base, "heavier: "+at)
						assert.LessOrEqual(t, clearance(tk, kg, w-1.5, h, d), base, "more tailwind: "+at)
						assert.LessOrEqual(t, clearance(tk, kg, w, h+3, d), base, "higher: "+at)
						assert.LessOrEqual(t, clearance(tk, kg, w, h, d-100), base, "nearer: "+at)
					}
				}
			}
		}
	}
}

// The grid and the check carry the margin and the climb to every cell; the check
// lists each obstacle's clearance.
func TestGridAndCheckObstacles(t *testing.T) {
	m := smallTable()
	a := testAircraft(m)
	a.Climb = &Climb{SpeedIASMS: 65 * knot, Table: smallClimb()}
	uk, _ := PolicyByID(PolicyUKAdvisory)
	e := RunwayEnd{Designator: "07", HeadingDeg: 70, TORAM: 900, TODAM: 900, ASDAM: 900, Surface: Paved, Condition: Dry,
		Obstacles: []Obstacle{{HeightM: 12, PastEndM: 300, Note: "wires"}, {HeightM: 30, PastEndM: 1500, Note: "ridge"}}}
	f := Airfield{Name: "t", Ident: "T", Runways: []Runway{{Surface: Paved, Condition: Dry, Ends: []RunwayEnd{e}}}}
	spec := GridSpec{TempsK: []float64{273.15, 293.15}, HeadwindsMS: []float64{0}, WeightsKg: []float64{1000}, QNHPa: 101325}
	g, err := ComputeGrid(a, m, uk, f, e, spec)
	require.NoError(t, err)
	for _, c := range g.Cells[0][0] {
		assert.True(t, c.HasClimb)
	}
	ans, err := Ask(a, m, uk, f, Question{QNHPa: 101325, TempK: 293.15, MassKg: 1000, TightMargin: 0.1})
	require.NoError(t, err)
	ea := ans.Ends[0]
	require.Len(t, ea.Clearances, 2)
	c := ea.Cell
	for i, cl := range ea.Clearances {
		want := ObstacleClearance(e, e.Obstacles[i], c.Requirement.FactoredTODM, c.ClimbGradient)
		assert.InDelta(t, want.ClearanceM, cl.ClearanceM, 1e-9)
		assert.Equal(t, i, cl.Obstacle)
	}
	assert.InDelta(t, ea.PressureAltM+30+DefaultObstacleMarginM, ea.ClimbAltM, 1e-9)
	assert.InDelta(t, math.Min(ea.Clearances[0].ClearanceM, ea.Clearances[1].ClearanceM), c.Clearance.ClearanceM, 1e-9)
}

// benchmarkGridObstacles is benchmarkGrid on a runway end with two obstacles: the
// climb and the clearances in every cell. Target: the same 5 ms per 224-cell grid as
// without obstacles (the climb costs one rate of climb and two clearances per cell).
func benchmarkGridObstacles(b *testing.B, m Model, climb *Climb) {
	a := testAircraft(m)
	a.Climb = climb
	uk, _ := PolicyByID(PolicyUKAdvisory)
	f := Airfield{ElevationM: 300}
	end := RunwayEnd{TORAM: 700, TODAM: 700, ASDAM: 700, Surface: Grass, Condition: Dry, SlopePct: 1,
		Obstacles: []Obstacle{{HeightM: 10, PastEndM: 300, Note: "wires"}, {HeightM: 40, PastEndM: 1500, Note: "ridge"}}}
	spec := DefaultGridSpec(a)
	b.ReportAllocs()
	for i := 0; i < b.N; i++ {
		if _, err := ComputeGrid(a, m, uk, f, end, spec); err != nil {
			b.Fatal(err)
		}
	}
}

func BenchmarkGridObstaclesPhysics(b *testing.B) {
	benchmarkGridObstacles(b, demoPhysics(), &Climb{SpeedIASMS: 76 * knot})
}

func BenchmarkGridObstaclesTable(b *testing.B) {
	benchmarkGridObstacles(b, smallTable(), &Climb{SpeedIASMS: 65 * knot, Table: smallClimb()})
}
