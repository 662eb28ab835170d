package perf

import (
	"errors"
	"fmt"
	"math"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
)

// The climb table is read exactly as the takeoff table (issue 12, tests): nodes
// exactly, multilinear between them, below the lowest value of an axis the lowest
// with a note, above the highest no data, never an extrapolation.
func TestClimbTableInterpolation(t *testing.T) {
	fpm := footM / 60
	m := &TableClimb{Table: smallClimb(), SpeedIASMS: 65 * knot}
	cases := []struct {
		name      string
		pa, tk, w float64
		wantFPM   float64
		note      bool
	}{
		{"node", 0, 273.15, 900, 900, false},
		{"far corner", 1000, 303.15, 1100, 480, false},
		{"mid temperature: (900 + 780) / 2", 0, 288.15, 900, 840, false},
		{"mid altitude: (900 + 760) / 2", 500, 273.15, 900, 830, false},
		{"centre: the mean of the eight corners", 500, 288.15, 1000, (900 + 780 + 760 + 640 + 700 + 600 + 580 + 480) / 8.0, false},
		{"quarter weight: 900 - (900 - 700) / 4", 0, 273.15, 950, 850, false},
		{"colder than the table: the coldest column", 0, 253.15, 900, 900, true},
		{"below the lowest altitude: the lowest row", -300, 273.15, 900, 900, true},
		{"lighter than the table: the lightest block", 0, 273.15, 800, 900, true},
	}
	for _, tc := range cases {
		t.Run(tc.name, func(t *testing.T) {
			r, err := m.Climb(Conditions{PressureAltM: tc.pa, TempK: tc.tk, MassKg: tc.w})
			require.NoError(t, err)
			assert.InDelta(t, tc.wantFPM*fpm, r.RateMS, 1e-9)
			assert.Equal(t, tc.note, len(r.Notes) > 0, r.Notes)
		})
	}
	for _, c := range []Conditions{
		{PressureAltM: 1000.1, TempK: 273.15, MassKg: 900},
		{PressureAltM: 0, TempK: 303.2, MassKg: 900},
		{PressureAltM: 0, TempK: 273.15, MassKg: 1100.1},
	} {
		_, err := m.Climb(c)
		assert.True(t, errors.Is(err, ErrNoData), "above an axis: no data, got %v", err)
	}
}

// A table of one weight holds for every lighter weight (a lighter aircraft climbs
// better: conservative) and has no data above it.
func TestClimbTableOneWeight(t *testing.T) {
	ct := smallClimb()
	ct.WeightKg, ct.RateMS = ct.WeightKg[1:], ct.RateMS[1:]
	m := &TableClimb{Table: ct, SpeedIASMS: 65 * knot}
	r, err := m.Climb(Conditions{PressureAltM: 0, TempK: 273.15, MassKg: 800})
	require.NoError(t, err)
	assert.InDelta(t, 700*footM/60, r.RateMS, 1e-9)
	_, err = m.Climb(Conditions{PressureAltM: 0, TempK: 273.15, MassKg: 1101})
	assert.True(t, errors.Is(err, ErrNoData))
}

// The climb speed is indicated: true airspeed V_IAS / sqrt(sigma), sigma 0.8617 at
// 5000 ft ISA (ICAO Doc 7488; domain notes sec. 2 [calc]).
func TestClimbTrueAirspeed(t *testing.T) {
	m := &TableClimb{Table: &ClimbTable{PressureAltM: []float64{0, 3000}, TempK: []float64{250, 320}, WeightKg: []float64{1000},
		RateMS: [][][]float64{{{3, 2}, {2, 1}}}}, SpeedIASMS: 70 * knot}
	r, err := m.Climb(Conditions{PressureAltM: 5000 * footM, TempK: ISATempK(5000 * footM), MassKg: 1000})
	require.NoError(t, err)
	assert.InDelta(t, 70/math.Sqrt(0.8617), r.TASMS/knot, 0.01)
}

// Gradient over the ground = rate of climb / ground speed. Published check: the
// FAA's rate-of-descent table for instrument approach charts (Terminal Procedures
// Publication; as reproduced in secondary texts [sec]) gives 635 ft/min for a 3.0
// degree path at 120 kt ground speed and 955 ft/min for 6.0 degrees at 90 kt; the
// same geometry read the other way gives tan 3.0 deg = 5.24 % and tan 6.0 deg =
// 10.51 %, within the table's 5 ft/min printing step. 1 kt = 1852/3600 m/s.
func TestGroundGradientPublishedTable(t *testing.T) {
	for _, tc := range []struct {
		fpm, kt, deg float64
	}{{635, 120, 3.0}, {955, 90, 6.0}} {
		r := ClimbResult{RateMS: tc.fpm * footM / 60, TASMS: tc.kt * knot}
		g, err := r.GroundGradient(0)
		require.NoError(t, err)
		want := math.Tan(tc.deg * math.Pi / 180)
		assert.InDelta(t, want, g, 5*footM/60/(tc.kt*knot), "%g ft/min at %g kt", tc.fpm, tc.kt)
	}
	// A headwind shortens the ground speed: 635 ft/min at 130 kt true airspeed into
	// a credited 10 kt headwind is the 120 kt case above.
	r := ClimbResult{RateMS: 635 * footM / 60, TASMS: 130 * knot}
	g1, _ := r.GroundGradient(10 * knot)
	g2, _ := ClimbResult{RateMS: 635 * footM / 60, TASMS: 120 * knot}.GroundGradient(0)
	assert.InDelta(t, g2, g1, 1e-12)
	// No ground speed left: no figure.
	_, err := ClimbResult{RateMS: 3, TASMS: 30}.GroundGradient(28)
	assert.True(t, errors.Is(err, ErrNoData))
}

// The wind is credited as for the takeoff: 50 % of a headwind, 150 % of a tailwind
// (CAT.POL.A.305(c); 14 CFR 23.1587(c)(3) before 2017 [pub]), always, since a climb
// table holds no wind.
func TestClimbCreditedWind(t *testing.T) {
	assert.InDelta(t, 5.0, ClimbCreditedWindMS(10), 1e-12)
	assert.InDelta(t, -15.0, ClimbCreditedWindMS(-10), 1e-12)
}

// The physics climb, written out by hand at sea level ISA for the demo tourer's
// description (invented demo data; 76 kt, 1250 kg, eta 0.58 and static fraction 0.66
// as the fit's starting values): rho 1.225 kg/m3, sigma 1, so P = 134 kW
// (Gagg-Ferrar: 1.132 - 0.132 = 1); V = 76 kt = 39.098 m/s; W = 1250 x 9.80665 =
// 12258.3 N; q = rho V^2 / 2 = 936.29 Pa; CL = W / (q S) = 0.80817; AR = 10.9^2 /
// 16.2 = 7.3340, K = 1 / (pi 0.75 AR) = 0.057870; CD = 0.034 + K CL^2 = 0.071797;
// D = q S CD = 1089.0 N; T = eta P / V = 1987.8 N (below the static 3332 N);
// RC = V (T - D) / W = 2.8667 m/s = 564.3 ft/min (the rate of climb from the excess
// power: Anderson, Aircraft Performance and Design, ch. 5; from memory).
func TestPhysicsClimbByHand(t *testing.T) {
	m := &PhysicsClimb{P: demoPhysics().P, SpeedIASMS: 76 * knot}
	r, err := m.Climb(Conditions{PressureAltM: 0, TempK: 288.15, MassKg: 1250})
	require.NoError(t, err)
	assert.InDelta(t, 564.3, r.RateMS/footM*60, 0.5)
	assert.InDelta(t, 76*knot, r.TASMS, 1e-9)

	// The same excess-thrust ratio the takeoff's air segment flies (one propeller,
	// one polar: the calibration of the takeoff carries into the climb).
	p := m.P
	v := 76 * knot
	etaP := p.PropEfficiency * p.PowerW
	co := climbOut{w: 1250 * StandardGravity, rho: ISASeaLevelDensity, s: p.WingAreaM2, cd0: p.CD0,
		k:    1 / (math.Pi * p.Oswald * p.SpanM * p.SpanM / p.WingAreaM2),
		prop: &propThrust{static: 1e9, atLO: etaP / v, vLO: v, etaP: etaP}}
	assert.InDelta(t, v*co.excess(v), r.RateMS, 1e-3)
}

// Properties: the physics rate of climb falls with altitude, temperature and weight;
// a climb speed below the stall speed is no data; the fitted envelope holds.
func TestPhysicsClimbProperties(t *testing.T) {
	m := &PhysicsClimb{P: demoPhysics().P, SpeedIASMS: 76 * knot}
	rate := func(pa, tk, kg float64) float64 {
		r, err := m.Climb(Conditions{PressureAltM: pa, TempK: tk, MassKg: kg})
		require.NoError(t, err)
		return r.RateMS
	}
	for _, pa := range []float64{0, 600, 1200} {
		for _, tk := range []float64{273.15, 288.15, 303.15} {
			for _, kg := range []float64{1050, 1250} {
				base := rate(pa, tk, kg)
				assert.Less(t, rate(pa+300, tk, kg), base, "higher")
				assert.Less(t, rate(pa, tk+10, kg), base, "hotter")
				assert.Less(t, rate(pa, tk, kg+100), base, "heavier")
			}
		}
	}
	slow := &PhysicsClimb{P: demoPhysics().P, SpeedIASMS: 40 * knot}
	_, err := slow.Climb(Conditions{TempK: 288.15, MassKg: 1250})
	assert.True(t, errors.Is(err, ErrNoData), "below the stall speed: %v", err)

	m.Envelope = &Envelope{MaxPressureAltM: 1000, MinTempK: 250, MaxTempK: 310, MinMassKg: 900, MaxMassKg: 1250}
	_, err = m.Climb(Conditions{PressureAltM: 1200, TempK: 288.15, MassKg: 1250})
	assert.True(t, errors.Is(err, ErrNoData), "beyond the table the physics was fitted to")
}

// ClimbFor: the table when there is one, else the physics; without a climb section
// no model (ErrNoClimbData).
func TestClimbFor(t *testing.T) {
	a := testAircraft(smallTable())
	_, err := ClimbFor(a)
	assert.True(t, errors.Is(err, ErrNoClimbData))
	a.Climb = &Climb{SpeedIASMS: 65 * knot}
	_, err = ClimbFor(a)
	assert.True(t, errors.Is(err, ErrNoClimbData), "a speed but no table and no physics")
	a.Climb.Table = smallClimb()
	cm, err := ClimbFor(a)
	require.NoError(t, err)
	assert.IsType(t, &TableClimb{}, cm)
	p := testAircraft(demoPhysics())
	p.Table = smallTable().Table
	p.Climb = &Climb{SpeedIASMS: 76 * knot}
	cm, err = ClimbFor(p)
	require.NoError(t, err)
	require.IsType(t, &PhysicsClimb{}, cm)
	assert.NotNil(t, cm.(*PhysicsClimb).Envelope, "fitted to a table: never beyond it")
}

// noClimbAircraft is the small table aircraft with a climb table that runs out of
// climb: -10 to 20 C (narrower than the takeoff table's 0 to 30 C), rates in ft/min
// falling to zero and below at altitude and heat (invented test data).
func noClimbAircraft() (*Aircraft, *TableModel) {
	m := smallTable()
	a := testAircraft(m)
	fpm := footM / 60
	a.Climb = &Climb{SpeedIASMS: 65 * knot, Table: &ClimbTable{
		PressureAltM: []float64{0, 1000},
		TempK:        []float64{263.15, 293.15},
		WeightKg:     []float64{900, 1100},
		RateMS: [][][]float64{
			{{300 * fpm, 120 * fpm}, {150 * fpm, -30 * fpm}},
			{{200 * fpm, 20 * fpm}, {60 * fpm, -100 * fpm}},
		},
	}}
	return a, m
}

// A climb table that says "no climb" counts on every cell, not only on runway ends
// with obstacles: where the manual's rate at the cell's pressure altitude,
// temperature and weight gives a still-air gradient under 0.5 % (the physics model's
// own threshold, common practice), the cell is the figure-less no-go "no takeoff".
// Outside the climb table's data the rule does not apply, and the reason says so.
//
// Hand values: at sea level, 20 C, 1100 kg the table gives 20 ft/min = 0.1016 m/s;
// the climb speed 65 kt IAS is 33.73 m/s true (sigma = 288.15/293.15 at ISA pressure,
// ICAO Doc 7488: V_TAS = V_IAS / sqrt(sigma)), a gradient of 0.30 %: no climb.
// At sea level, 0 C, 900 kg: 300 - 180/3 = 240 ft/min, 3.7 %: a climb.
func TestNoClimbIsNoTakeoff(t *testing.T) {
	a, m := noClimbAircraft()
	uk, _ := PolicyByID(PolicyUKAdvisory)
	end := RunwayEnd{Designator: "09", TORAM: 2000, TODAM: 2000, ASDAM: 2000, Surface: Paved, Condition: Dry}
	cases := []struct {
		name          string
		pa, tk, mass  float64
		wantNoTakeoff bool
		wantReason    string
	}{
		{"negative rate", 1000, 293.15, 1100, true, "no takeoff: the manual's rate of climb at 65 kt is -100 ft/min at 3281 ft, 20 C"},
		{"a rate under 0.5 %", 0, 293.15, 1100, true, "a still-air gradient of 0.3 %, under the 0.5 % counted as a climb"},
		{"a climb", 0, 273.15, 900, false, ""},
		{"hotter than the climb table", 0, 298.15, 900, false, "the climb table has no rate at 0 ft, 25 C, 900 kg: the no-climb check does not apply"},
	}
	for _, tc := range cases {
		t.Run(tc.name, func(t *testing.T) {
			c := Evaluate(Case{Aircraft: a, Model: m, Policy: uk, End: end, PressureAltM: tc.pa, TempK: tc.tk, MassKg: tc.mass, TightMargin: 0.1})
			reasons := fmt.Sprint(c.Reasons())
			if tc.wantNoTakeoff {
				assert.Equal(t, NoGo, c.State, reasons)
				assert.True(t, c.CannotTakeOff, "no takeoff is a no-go without a figure")
				assert.False(t, c.HasDistance, "no figure")
			} else {
				assert.Equal(t, Go, c.State, reasons)
				assert.True(t, c.HasDistance)
			}
			if tc.wantReason != "" {
				assert.Contains(t, reasons, tc.wantReason)
			}
		})
	}
}

// Property over a grid: no cell whose climb-table rate gives no climb is go or tight,
// every such cell is "no takeoff", and a cell with a climb keeps the state the takeoff
// alone gives (the check never improves a cell and never worsens one that climbs).
func TestNoClimbGridProperty(t *testing.T) {
	a, m := noClimbAircraft()
	uk, _ := PolicyByID(PolicyUKAdvisory)
	end := RunwayEnd{Designator: "09", TORAM: 2000, TODAM: 2000, ASDAM: 2000, Surface: Paved, Condition: Dry}
	withoutClimb := *a
	withoutClimb.Climb = nil
	spec := GridSpec{TempsK: []float64{263.15, 268.15, 273.15, 278.15, 283.15, 288.15, 293.15}, HeadwindsMS: []float64{-5 * knot, 0, 10 * knot},
		WeightsKg: []float64{1100, 1000, 900}, QNHPa: 100000, TightMargin: 0.1}
	noClimbCells := 0
	for _, elev := range []float64{0, 300, 600, 850} {
		f := Airfield{ElevationM: elev}
		g, err := ComputeGrid(a, m, uk, f, end, spec)
		require.NoError(t, err)
		ref, err := ComputeGrid(&withoutClimb, m, uk, f, end, spec)
		require.NoError(t, err)
		for wi := range g.Cells {
			for hi := range g.Cells[wi] {
				for ti, c := range g.Cells[wi][hi] {
					rate, grad, inside := a.Climb.stillAirClimb(g.PressureAltM, spec.TempsK[ti], spec.WeightsKg[wi])
					require.True(t, inside)
					if grad < minClimbGradient {
						noClimbCells++
						assert.True(t, c.CannotTakeOff && c.State >= NoGo, "rate %.2f m/s: %v", rate, c.Reasons())
						continue
					}
					assert.Equal(t, ref.Cells[wi][hi][ti].State, c.State)
				}
			}
		}
	}
	assert.Greater(t, noClimbCells, 10, "the sweep reaches the no-climb corner")
}

// BenchmarkGridTableClimb is BenchmarkGridTable for a profile with a rate-of-climb
// table: every cell also reads the climb table for the no-climb check (one
// interpolation, no allocation), on a runway end without obstacles.
func BenchmarkGridTableClimb(b *testing.B) {
	m := smallTable()
	a := testAircraft(m)
	a.Climb = &Climb{SpeedIASMS: 65 * knot, Table: smallClimb()}
	uk, _ := PolicyByID(PolicyUKAdvisory)
	f := Airfield{ElevationM: 300}
	end := RunwayEnd{TORAM: 700, TODAM: 700, ASDAM: 700, Surface: Grass, Condition: Dry, SlopePct: 1}
	spec := DefaultGridSpec(a)
	b.ReportAllocs()
	for i := 0; i < b.N; i++ {
		if _, err := ComputeGrid(a, m, uk, f, end, spec); err != nil {
			b.Fatal(err)
		}
	}
}
