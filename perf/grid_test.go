package perf

import (
	"fmt"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
)

func testAircraft(m Model) *Aircraft {
	a := &Aircraft{
		Name: "test", MTOWKg: 1100, WeightsKg: []float64{1100, 1000, 900, 800},
		MaxTailwindMS: 10 * knot, DemonstratedCrosswindMS: 15 * knot,
		MinTempK: 243.15, MaxTempK: 318.15,
	}
	switch mm := m.(type) {
	case *TableModel:
		a.Model, a.Table = ModelTable, mm.Table
	case *PhysicsModel:
		a.Model, a.Physics = ModelPhysics, &mm.P
	}
	return a
}

func TestEvaluateStates(t *testing.T) {
	m := smallTable()
	a := testAircraft(m)
	a.MaxTempK = 303.15
	eu, _ := PolicyByID(PolicyEUClassB)
	end := RunwayEnd{Designator: "09", TORAM: 700, TODAM: 700, ASDAM: 700, Surface: Paved, Condition: Dry}
	k := Case{Aircraft: a, Model: m, Policy: eu, End: end, TempK: 273.15, MassKg: 900, TightMargin: 0.1}

	// 400 x 1.25 = 500 <= 700 with 10 % spare (TOD x 1.25 <= TORA: EU Air OPS
	// CAT.POL.A.305(b) [sec]; the 10 % tight margin is the card's, common practice).
	c := Evaluate(k)
	assert.Equal(t, Go, c.State, c.Reasons())
	assert.InDelta(t, 500, c.RequiredM, 1e-9)
	assert.Equal(t, "TORA", c.Limiting)

	k.End.TORAM, k.End.TODAM, k.End.ASDAM = 520, 520, 520 // 500 fits, 550 does not
	c = Evaluate(k)
	assert.Equal(t, Tight, c.State)

	k.End.TORAM, k.End.TODAM, k.End.ASDAM = 480, 480, 480
	c = Evaluate(k)
	assert.Equal(t, NoGo, c.State)
	assert.Contains(t, c.Reasons()[len(c.Reasons())-1], "TORA: 500 m required, 480 m available")

	k.MassKg = 1150
	c = Evaluate(k)
	assert.Equal(t, BeyondLimits, c.State)
	assert.Contains(t, c.Reasons()[0], "above MTOW")

	k.MassKg = 900
	k.Wind = Components{HeadwindMS: -12 * knot}
	c = Evaluate(k)
	assert.Equal(t, BeyondLimits, c.State)

	// Past the demonstrated crosswind: advisory, the state stands.
	k.End.TORAM, k.End.TODAM, k.End.ASDAM = 700, 700, 700
	k.Wind = Components{GustCrosswindMS: 18 * knot}
	c = Evaluate(k)
	assert.Equal(t, Go, c.State)
	assert.Contains(t, c.Reasons()[0], "crosswind 18 kt above the demonstrated 15 kt (advisory")
	// Past a declared crosswind limit: beyond limits.
	a.MaxCrosswindMS, a.HasMaxCrosswind = 17*knot, true
	c = Evaluate(k)
	assert.Equal(t, BeyondLimits, c.State)
	assert.Contains(t, c.Reasons()[0], "crosswind 18 kt above the 17 kt limit")
	a.HasMaxCrosswind = false

	k.Wind = Components{}
	k.PressureAltM = 1500
	c = Evaluate(k)
	assert.Equal(t, NoData, c.State)
	assert.False(t, c.HasDistance, "no number is given outside the data")
}

// The table's own wind notes already factor the wind: the grid must not factor it again.
func TestEvaluateWindNotAppliedTwice(t *testing.T) {
	m := smallTable()
	a := testAircraft(m)
	eu, _ := PolicyByID(PolicyEUClassB)
	end := RunwayEnd{TORAM: 2000, TODAM: 2000, ASDAM: 2000, Surface: Paved, Condition: Dry}
	c := Evaluate(Case{Aircraft: a, Model: m, Policy: eu, End: end, TempK: 273.15, MassKg: 900, Wind: Components{HeadwindMS: 5 * knot}})
	assert.InDelta(t, 5*knot, c.CreditedWindMS, 1e-12)
	// The test table's own invented note, 6 % per 5 kt: 400 x 0.94 = 376 m (arithmetic).
	assert.InDelta(t, 376, c.To50ftM, 1e-9, "x0.94 once")
	m.Table.WindInData = false
	c = Evaluate(Case{Aircraft: a, Model: m, Policy: eu, End: end, TempK: 273.15, MassKg: 900, Wind: Components{HeadwindMS: 5 * knot}})
	// 50 % of a reported headwind: 14 CFR 23.1587(c)(3), pre-2017 text [pub].
	assert.InDelta(t, 2.5*knot, c.CreditedWindMS, 1e-12)
	assert.InDelta(t, 388, c.To50ftM, 1e-9, "50 % of 5 kt -> x0.97")
}

func TestComputeGrid(t *testing.T) {
	m := demoPhysics()
	a := testAircraft(m)
	uk, _ := PolicyByID(PolicyUKAdvisory)
	f := Airfield{ElevationM: 300}
	end := RunwayEnd{Designator: "27", TORAM: 700, TODAM: 700, ASDAM: 700, Surface: Grass, Condition: Dry, SlopePct: 1}
	spec := DefaultGridSpec(a)
	g, err := ComputeGrid(a, m, uk, f, end, spec)
	require.NoError(t, err)
	assert.Len(t, g.Cells, 4)
	assert.Len(t, g.Cells[0], 7)
	assert.Len(t, g.Cells[0][0], 8)
	// QNH 1000 hPa at 300 m: pressure altitude about 300 m + 13.25 hPa x 8.4 m/hPa
	// (ISA pressure gradient near sea level, ICAO Doc 7488 [calc]).
	assert.InDelta(t, 410, g.PressureAltM, 5)
	for _, blk := range g.Cells {
		for _, row := range blk {
			for _, c := range row {
				if c.HasDistance {
					assert.GreaterOrEqual(t, c.RequiredM, c.To50ftM, "never shorter than the model computed")
				}
			}
		}
	}
	spec.TempsK = make([]float64, MaxGridTemps+1)
	_, err = ComputeGrid(a, m, uk, f, end, spec)
	assert.Error(t, err)
}

func benchmarkGrid(b *testing.B, m Model) {
	a := testAircraft(m)
	uk, _ := PolicyByID(PolicyUKAdvisory)
	f := Airfield{ElevationM: 300}
	end := RunwayEnd{TORAM: 700, TODAM: 700, ASDAM: 700, Surface: Grass, Condition: Dry, SlopePct: 1}
	spec := DefaultGridSpec(a) // 8 temperatures x 7 winds x 4 weights
	b.ReportAllocs()
	for i := 0; i < b.N; i++ {
		if _, err := ComputeGrid(a, m, uk, f, end, spec); err != nil {
			b.Fatal(err)
		}
	}
}

// Target: under 5 ms per 224-cell grid for the physics model on a 2-core machine.
func BenchmarkGridPhysics(b *testing.B) { benchmarkGrid(b, demoPhysics()) }

func BenchmarkGridTable(b *testing.B) { benchmarkGrid(b, smallTable()) }

// fixedModel answers every question with the same result or error: a test double
// that sets the model's figure exactly.
type fixedModel struct {
	r   Result
	err error
}

func (m fixedModel) Takeoff(Conditions) (Result, error) { return m.r, m.err }

// Issue 8.3: the state follows the figures as printed. EU Air OPS CAT.POL.A.305(b)(1):
// TOD x1.25 <= TORA [pub]. TOD 537.6 m -> 672 m required against TORA 675 m. The card
// prints 680 (rounded up to 10 m): 680 > 675 is no-go on the card, whatever the
// unrounded figures say; whole metres (check and grid) print 672 <= 675: tight. In
// feet (0.3048 m exactly, ICAO Annex 5): 672 m = 2204.7 ft -> 2210 ft, TORA 675 m =
// 2214.6 ft -> 2214 ft: fits.
func TestStateFollowsPrintedFigures(t *testing.T) {
	m := fixedModel{r: Result{GroundRollM: 300, To50ftM: 537.6, Covers: Effects{Surface: true}}}
	a := testAircraft(m)
	eu, _ := PolicyByID(PolicyEUClassB)
	end := RunwayEnd{Designator: "09", TORAM: 675, TODAM: 675, ASDAM: 675, Surface: Paved, Condition: Dry}
	k := Case{Aircraft: a, Model: m, Policy: eu, End: end, TempK: 288.15, MassKg: 900, TightMargin: 0.1}
	for _, tc := range []struct {
		name             string
		r                Rounding
		state            State
		shown, available float64
		unit             string
	}{
		{"whole metres", Rounding{}, Tight, 672, 675, "m"},
		{"card, 10 m", Rounding{Unit: UnitMetre, Step: CardStep}, NoGo, 680, 675, "m"},
		{"card, 10 ft", Rounding{Unit: UnitFoot, Step: CardStep}, Tight, 2210, 2214, "ft"},
	} {
		t.Run(tc.name, func(t *testing.T) {
			k.Rounding = tc.r
			c := Evaluate(k)
			assert.InDelta(t, 672, c.RequiredM, 1e-9)
			assert.Equal(t, tc.state, c.State, c.Reasons())
			assert.Equal(t, tc.shown, c.ShownRequired)
			assert.Equal(t, tc.available, c.ShownAvailable)
			assert.Equal(t, tc.unit, c.ShownUnit)
		})
	}
	k.Rounding = Rounding{Unit: UnitMetre, Step: CardStep}
	c := Evaluate(k)
	assert.Contains(t, c.Reasons(), "TORA: 680 m required, 675 m available")
}

// Property: over a sweep of required and available distances, a printed figure is
// never shorter than the computed one, a printed declared distance never longer, and
// the state is no-go exactly when the printed figure exceeds the printed declared
// distance (common practice: the pilot compares what is printed).
func TestStateAgreesWithPrintedFiguresSweep(t *testing.T) {
	uk, _ := PolicyByID(PolicyUKAdvisory)
	for _, r := range []Rounding{{}, {Unit: UnitMetre, Step: 10}, {Unit: UnitFoot, Step: 10}, {Unit: UnitFoot, Step: 1}} {
		for to := 300.0; to < 700; to += 3.7 {
			m := fixedModel{r: Result{GroundRollM: to / 2, To50ftM: to, Covers: Effects{Surface: true}}}
			a := testAircraft(m)
			end := RunwayEnd{TORAM: 640.4, TODAM: 640.4, ASDAM: 640.4, Surface: Paved, Condition: Dry}
			c := Evaluate(Case{Aircraft: a, Model: m, Policy: uk, End: end, TempK: 288.15, MassKg: 900, TightMargin: 0.1, Rounding: r})
			require.True(t, c.HasDistance)
			assert.GreaterOrEqual(t, c.ShownRequired, r.In(c.RequiredM)-1e-6, "printed figure never shorter")
			assert.LessOrEqual(t, c.ShownAvailable, r.In(c.AvailableM), "printed TORA never longer")
			assert.Equal(t, c.ShownRequired > c.ShownAvailable, c.State == NoGo, "%v %v: %.1f vs %.1f", r, c.State, c.ShownRequired, c.ShownAvailable)
			assert.Equal(t, c.ShownRequired <= c.ShownAvailable && c.ShownRequired*1.1 > c.ShownAvailable+1e-9, c.State == Tight)
		}
	}
}

// Issue 8.4: each mark means one thing.
func TestMarksMeanOneThing(t *testing.T) {
	uk, _ := PolicyByID(PolicyUKAdvisory)
	end := RunwayEnd{Designator: "09", TORAM: 2000, TODAM: 2000, ASDAM: 2000, Surface: Paved, Condition: Dry}

	t.Run("hotter than the table is no data, not a limit", func(t *testing.T) {
		m := smallTable() // hottest column 30 C
		a := testAircraft(m)
		a.MinTempK, a.MaxTempK = 0, 0 // no declared operating limits
		c := Evaluate(Case{Aircraft: a, Model: m, Policy: uk, End: end, TempK: 308.15, MassKg: 900})
		assert.Equal(t, NoData, c.State, c.Reasons())
		assert.False(t, c.HasDistance)
		assert.Contains(t, c.Reasons()[0], "above the table's highest")
		// A declared operating limit below it makes the cell beyond limits.
		a.MaxTempK = 298.15
		c = Evaluate(Case{Aircraft: a, Model: m, Policy: uk, End: end, TempK: 303.15, MassKg: 900})
		assert.Equal(t, BeyondLimits, c.State)
		assert.Contains(t, c.Reasons()[0], "temperature 30 C above the declared limit 25 C")
	})

	t.Run("cannot take off: no-go without a figure", func(t *testing.T) {
		m := fixedModel{err: fmt.Errorf("%w: acceleration stops at 40 kt", ErrCannotTakeOff)}
		a := testAircraft(m)
		c := Evaluate(Case{Aircraft: a, Model: m, Policy: uk, End: end, TempK: 288.15, MassKg: 900})
		assert.Equal(t, NoGo, c.State)
		assert.True(t, c.CannotTakeOff)
		assert.False(t, c.HasDistance)
		// No data is not "cannot take off".
		m.err = fmt.Errorf("%w: above the table", ErrNoData)
		c = Evaluate(Case{Aircraft: a, Model: m, Policy: uk, End: end, TempK: 288.15, MassKg: 900})
		assert.Equal(t, NoData, c.State)
		assert.False(t, c.CannotTakeOff)
	})

	// Issue 14.1: a crosswind limit of 0 means 0, never "no limit". 35 kt gusting 45
	// straight across (the case).
	t.Run("zero crosswind limit", func(t *testing.T) {
		m := smallTable()
		a := testAircraft(m)
		a.DemonstratedCrosswindMS = 15 * knot
		a.MaxCrosswindMS, a.HasMaxCrosswind = 0, true
		w := WindComponents(Wind{FromDeg: 180, SpeedMS: 35 * knot, GustMS: 45 * knot}, 90, 0)
		c := Evaluate(Case{Aircraft: a, Model: m, Policy: uk, End: end, TempK: 288.15, MassKg: 900, Wind: w})
		assert.Equal(t, BeyondLimits, c.State)
		assert.Contains(t, c.Reasons()[0], "crosswind 45 kt above the 0 kt limit")
		// Without a limit, the demonstrated value is advisory only: a reason, no state.
		a.HasMaxCrosswind = false
		c = Evaluate(Case{Aircraft: a, Model: m, Policy: uk, End: end, TempK: 288.15, MassKg: 900, Wind: w})
		assert.Equal(t, Go, c.State)
		assert.Contains(t, c.Reasons()[0], "above the demonstrated 15 kt (advisory")
	})
}

// Issue 8.7: on grass and gravel, wet is never shorter than dry. A manual whose dry
// grass note is large (here 80 % of the ground roll, an invented test value) and
// which has no wet note: dry = 400 + 0.8 x 200 = 560 m (above the published dry grass
// floor 400 x 1.2 = 480, AMC1 CAT.POL.A.305 [pub]); wet takes the published wet grass
// factor on the paved figure, 400 x 1.3 = 520 m (AMC1 CAT.POL.A.305 [pub]), which is
// shorter: it is raised to the dry 560 m.
func TestWetNeverShorterThanDry(t *testing.T) {
	m := smallTable()
	m.Table.Corrections.GrassPctOfGroundRoll = 80
	a := testAircraft(m)
	uk, _ := PolicyByID(PolicyUKAdvisory)
	for _, s := range []Surface{Grass, Gravel} {
		end := RunwayEnd{Designator: "09", TORAM: 2000, TODAM: 2000, ASDAM: 2000, Surface: s, Condition: Dry}
		k := Case{Aircraft: a, Model: m, Policy: uk, End: end, TempK: 273.15, MassKg: 900}
		dry := Evaluate(k)
		k.End.Condition = Wet
		wet := Evaluate(k)
		require.True(t, dry.HasDistance && wet.HasDistance)
		assert.GreaterOrEqual(t, wet.RequiredM, dry.RequiredM-1e-9, "%s", s)
		if s == Grass {
			assert.InDelta(t, 560*1.33, dry.RequiredM, 1e-9)
			assert.InDelta(t, 560*1.33, wet.RequiredM, 1e-9)
			assert.Contains(t, wet.Reasons(), "wet figure raised to the dry one: wet is never shorter than dry")
		}
	}
}

// Issue 9.1: 068/06G16 on a 248 deg runway is a 16 kt tailwind for the limit and the
// distance, not 6 kt (gust for any tailwind: common practice, domain notes sec. 5d).
func TestEvaluateGustTailwind(t *testing.T) {
	m := smallTable()
	a := testAircraft(m) // tailwind limit 10 kt
	uk, _ := PolicyByID(PolicyUKAdvisory)
	end := RunwayEnd{Designator: "25", HeadingDeg: 248, TORAM: 2000, TODAM: 2000, ASDAM: 2000, Surface: Paved, Condition: Dry}
	comp := WindComponents(Wind{FromDeg: 68, SpeedMS: 6 * knot, GustMS: 16 * knot}, 248, 0)
	c := Evaluate(Case{Aircraft: a, Model: m, Policy: uk, End: end, TempK: 273.15, MassKg: 900, Wind: comp})
	assert.Equal(t, BeyondLimits, c.State)
	assert.Contains(t, c.Reasons()[0], "tailwind 16 kt above the 10 kt limit")
	// Within the limit the distance uses the gust: 4 kt gusting 8 kt behind is +4 % per
	// kt x 8 kt = x1.32 on the test table's 400 m (its invented note; arithmetic).
	comp = WindComponents(Wind{FromDeg: 68, SpeedMS: 4 * knot, GustMS: 8 * knot}, 248, 0)
	c = Evaluate(Case{Aircraft: a, Model: m, Policy: uk, End: end, TempK: 273.15, MassKg: 900, Wind: comp})
	assert.Equal(t, Go, c.State, c.Reasons())
	assert.InDelta(t, -8*knot, c.CreditedWindMS, 1e-9)
	assert.InDelta(t, 400*1.32, c.To50ftM, 1e-9)
	// A headwind with gusts is credited at its steady speed: 6 % per 5 kt x 4 kt.
	comp = WindComponents(Wind{FromDeg: 248, SpeedMS: 4 * knot, GustMS: 14 * knot}, 248, 0)
	c = Evaluate(Case{Aircraft: a, Model: m, Policy: uk, End: end, TempK: 273.15, MassKg: 900, Wind: comp})
	assert.InDelta(t, 4*knot, c.CreditedWindMS, 1e-9)
	assert.InDelta(t, 400*(1-0.06*4/5), c.To50ftM, 1e-9)
}

// Issue 9.6: beyond the 2 % that AMC2 CAT.POL.A.305 covers, eu-class-b gives no
// figure (with the reason); uk-advisory gives one, with a caution.
func TestEvaluateSlopeBeyondTwoPercent(t *testing.T) {
	m := smallTable()
	a := testAircraft(m)
	eu, _ := PolicyByID(PolicyEUClassB)
	uk, _ := PolicyByID(PolicyUKAdvisory)
	end := RunwayEnd{Designator: "09", TORAM: 2000, TODAM: 2000, ASDAM: 2000, Surface: Paved, Condition: Dry, SlopePct: 2.6}
	k := Case{Aircraft: a, Model: m, Policy: eu, End: end, TempK: 273.15, MassKg: 900}
	c := Evaluate(k)
	assert.Equal(t, NoData, c.State)
	assert.False(t, c.HasDistance)
	assert.Contains(t, c.Reasons()[0], "AMC2 CAT.POL.A.305")
	k.Policy = uk
	c = Evaluate(k)
	assert.Equal(t, Go, c.State, c.Reasons())
	assert.NotEmpty(t, c.Requirement.Caution)
	// 2 % exactly is inside the published correction: a figure under either policy.
	k.End.SlopePct, k.Policy = 2, eu
	assert.True(t, Evaluate(k).HasDistance)
}

// Issue 9.7: the grid's pressure altitude is taken at the highest threshold when it is
// above the aerodrome elevation; the elevation used is exposed.
func TestComputeGridHighestElevation(t *testing.T) {
	m := smallTable()
	a := testAircraft(m)
	uk, _ := PolicyByID(PolicyUKAdvisory)
	lo := RunwayEnd{Designator: "04", TORAM: 1100, TODAM: 1100, ASDAM: 1100, Surface: Paved, Condition: Dry, ElevationM: 290}
	hi := lo
	hi.Designator, hi.ElevationM = "22", 310
	f := Airfield{ElevationM: 300, Runways: []Runway{{Ends: []RunwayEnd{lo, hi}}}}
	spec := DefaultGridSpec(a)
	spec.QNHPa = ISASeaLevelPressurePa
	g, err := ComputeGrid(a, m, uk, f, lo, spec)
	require.NoError(t, err)
	assert.InDelta(t, 310, g.ElevationM, 1e-9)
	// At QNH 1013.25 hPa the pressure altitude equals the elevation (ISA, ICAO Doc 7488).
	assert.InDelta(t, 310, g.PressureAltM, 1e-6)
}

// negativeModel is a broken model: it answers a negative distance.
type negativeModel struct{}

func (negativeModel) Takeoff(Conditions) (Result, error) {
	return Result{GroundRollM: -15, To50ftM: -15, Covers: Effects{Surface: true, Slope: true}}, nil
}

// Issue 14 item 4: with a huge credited headwind cells printed -15 m as go. The grid
// now gives no data where the model cannot answer (a physics model past half its
// lift-off speed), and never a distance <= 0 from any model.
func TestGridNoNonPositiveDistance(t *testing.T) {
	uk, _ := PolicyByID(PolicyUKAdvisory)
	f := Airfield{ElevationM: 0}
	end := RunwayEnd{Designator: "09", TORAM: 700, TODAM: 700, ASDAM: 700, Surface: Paved, Condition: Dry}
	for _, m := range []Model{demoPhysics(), negativeModel{}} {
		a := testAircraft(m)
		spec := DefaultGridSpec(a)
		spec.HeadwindsMS = []float64{0, 20 * knot, 60 * knot, 85 * knot, 150 * knot}
		g, err := ComputeGrid(a, m, uk, f, end, spec)
		require.NoError(t, err)
		for _, blk := range g.Cells {
			for hi, row := range blk {
				for _, c := range row {
					if c.HasDistance {
						assert.Greater(t, c.To50ftM, 0.0)
						assert.Greater(t, c.RequiredM, 0.0)
					}
					if spec.HeadwindsMS[hi] >= 85*knot {
						// credited 42.5 kt or more, past half the 60 kt lift-off speed
						assert.Equal(t, NoData, c.State, "%.0f kt: %v", spec.HeadwindsMS[hi]/knot, c.Reasons())
					}
				}
			}
		}
	}
}

// A reason never shows a value equal to the limit it says is passed (review:
// "crosswind 15 kt above the demonstrated 15 kt" for 15.3 kt): a whole value is
// printed whole, any other with one decimal, rounded away from the limit (up above
// a maximum, down below a minimum).
func TestReasonsShowThePassedValue(t *testing.T) {
	m := smallTable()
	a := testAircraft(m)
	a.MaxTempK = 303.15
	uk, _ := PolicyByID(PolicyUKAdvisory)
	end := RunwayEnd{Designator: "09", TORAM: 2000, TODAM: 2000, ASDAM: 2000, Surface: Paved, Condition: Dry}
	k := Case{Aircraft: a, Model: m, Policy: uk, End: end, TempK: 273.15, MassKg: 900, TightMargin: 0.1}
	for _, tc := range []struct {
		name string
		set  func(*Case)
		want string
	}{
		{"demonstrated crosswind", func(k *Case) { k.Wind = Components{GustCrosswindMS: 15.3 * knot} }, "crosswind 15.3 kt above the demonstrated 15 kt"},
		{"just above", func(k *Case) { k.Wind = Components{GustCrosswindMS: 15.04 * knot} }, "crosswind 15.1 kt above the demonstrated 15 kt"},
		{"whole", func(k *Case) { k.Wind = Components{GustCrosswindMS: 18 * knot} }, "crosswind 18 kt above the demonstrated 15 kt"},
		{"tailwind", func(k *Case) { k.Wind = Components{HeadwindMS: -10.3 * knot} }, "tailwind 10.3 kt above the 10 kt limit"},
		{"temperature", func(k *Case) { k.TempK = 303.45 }, "temperature 30.3 C outside the declared limits -30 to 30 C"},
	} {
		kk := k
		tc.set(&kk)
		c := Evaluate(kk)
		assert.Contains(t, fmt.Sprint(c.Reasons()), tc.want, tc.name)
	}
}

// A grid's cells are the cells Evaluate and EvaluateLanding answer one at a time,
// field for field: the grid only works out once what its cells share (the policy's
// factors and rules for the runway end, the memory of the cells' lists). Paved,
// sloped, with a stopway, grass and gravel, dry and wet, obstacles, both models and
// both policies.
func TestGridCellsAsEvaluate(t *testing.T) {
	ends := []RunwayEnd{
		{Designator: "09", TORAM: 700, TODAM: 700, ASDAM: 700, LDAM: 650, Surface: Paved, Condition: Dry, SlopePct: 0.5},
		{Designator: "27", TORAM: 600, TODAM: 800, ASDAM: 750, LDAM: 600, Surface: Paved, Condition: Wet, SlopePct: -1.5},
		{Designator: "15", TORAM: 650, LDAM: 600, Surface: Grass, Condition: Wet, SlopePct: 1,
			Obstacles: []Obstacle{{HeightM: 15, PastEndM: 100, Note: "trees"}}},
		{Designator: "33", TORAM: 550, TODAM: 600, ASDAM: 520, LDAM: 500, Surface: Gravel, Condition: Wet, SlopePct: -1},
		{Designator: "04", TORAM: 900, Surface: Gravel, Condition: Dry, SlopePct: 2.5},
	}
	landing := calibratedLandingAircraft(t)
	lm, err := LandingModelFor(landing)
	require.NoError(t, err)
	tableLanding := &Aircraft{Name: "t", MTOWKg: 1000, MaxTailwindMS: 10 * knot, WeightsKg: []float64{1000, 900},
		Landing: &Landing{MaxMassKg: 1000, Model: ModelTable, Table: landingTable()}}
	tlm, err := LandingModelFor(tableLanding)
	require.NoError(t, err)
	for _, pid := range PolicyIDs() {
		p, _ := PolicyByID(pid)
		for _, e := range ends {
			for _, m := range []Model{demoPhysics(), smallTable()} {
				a := testAircraft(m)
				spec := DefaultGridSpec(a)
				spec.Rounding = Rounding{Step: CardStep}
				g, err := ComputeGrid(a, m, p, Airfield{ElevationM: 300}, e, spec)
				require.NoError(t, err)
				for wi, w := range spec.WeightsKg {
					for hi, h := range spec.HeadwindsMS {
						for ti, tk := range spec.TempsK {
							want := Evaluate(Case{Aircraft: a, Model: m, Policy: p, End: e, PressureAltM: g.PressureAltM,
								TempK: tk, MassKg: w, Wind: Components{HeadwindMS: h}, TightMargin: spec.TightMargin,
								Rounding: spec.Rounding, ObstacleMarginM: spec.ObstacleMarginM})
							require.Equal(t, want, g.Cells[wi][hi][ti], "%s %s %T cell %d %d %d", pid, e.Designator, m, wi, hi, ti)
						}
					}
				}
			}
			for _, l := range []struct {
				a *Aircraft
				m LandingModel
			}{{landing, lm}, {tableLanding, tlm}} {
				spec := DefaultGridSpec(l.a)
				spec.WeightsKg = LandingMasses(l.a, []float64{1000, 900}, 2)
				g, err := ComputeLandingGrid(l.a, l.m, p, Airfield{ElevationM: 300}, e, spec)
				require.NoError(t, err)
				for wi, w := range spec.WeightsKg {
					for hi, h := range spec.HeadwindsMS {
						for ti, tk := range spec.TempsK {
							want := EvaluateLanding(LandingCase{Aircraft: l.a, Model: l.m, Policy: p, End: e, PressureAltM: g.PressureAltM,
								TempK: tk, MassKg: w, Wind: Components{HeadwindMS: h}, TightMargin: spec.TightMargin, Rounding: spec.Rounding})
							require.Equal(t, want, g.Cells[wi][hi][ti], "landing %s %s %T cell %d %d %d", pid, e.Designator, l.m, wi, hi, ti)
						}
					}
				}
			}
		}
	}
}
