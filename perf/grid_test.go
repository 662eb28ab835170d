package perf

import (
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
)

func testAircraft(m Model) *Aircraft {
	a := &Aircraft{
		Name: "test", MTOWKg: 1100, WeightsKg: []float64{1100, 1000, 900, 800},
		MaxTailwindMS: 10 * knot, MaxCrosswindMS: 15 * knot,
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

	k.Wind = Components{GustCrosswindMS: 18 * knot}
	c = Evaluate(k)
	assert.Equal(t, BeyondLimits, c.State)
	assert.Contains(t, c.Reasons()[0], "crosswind 18 kt above the demonstrated 15 kt")

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
	// 50 % of a reported headwind: 14 CFR 23.1587 [pub].
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
