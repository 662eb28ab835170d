package perf

import (
	"errors"
	"fmt"
	"math"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
)

// demoLandingPhysics is a four-seat single's landing description (invented, like the
// demo profiles): the airframe of demoPhysics, full flap.
func demoLandingPhysics() *LandingPhysicsModel {
	return &LandingPhysicsModel{P: demoPhysics().P, L: LandingPhysics{
		CLMax: 1.95, CD0: 0.06, CLGround: 0.45, FreeRollS: DefaultFreeRollS,
		ApproachAngleDeg: 5, BrakingFraction: 0.55,
	}, RefMassKg: 1200}
}

// Anderson, Aircraft Performance and Design (1999), Example 6.7 [pub]: V_stall
// 164.5 ft/s, flare at 1.23 V_stall = 202.3 ft/s, approach angle 3 deg: R = V_f^2 /
// 0.2 g = 6354.9 ft, h_f = R (1 - cos 3 deg) = 8.71 ft, approach distance
// (50 - h_f) / tan 3 deg = 788 ft, flare distance R sin 3 deg = 333 ft.
func TestAirLandingAndersonExample67(t *testing.T) {
	vs := 164.5 * ft
	vf := 1.23 * vs
	theta := 3 * math.Pi / 180
	radius := vf * vf / (0.2 * StandardGravity)
	// Anderson takes g = 32.2 ft/s^2; we take 9.80665 m/s^2 (32.174): 0.08 % apart.
	// Anderson also rounds V_f to 202.3 ft/s (1.23 x 164.5 = 202.34): 0.04 % more.
	assert.InEpsilon(t, 6354.9, radius/ft, 0.002, "flare radius: got %.1f ft, want 6354.9 ft", radius/ft)
	assert.InEpsilon(t, 8.71, radius*(1-math.Cos(theta))/ft, 0.002, "flare height")
	got := airLanding(1.3*vs, vf, 0, theta, screenHeightM) / ft
	assert.InEpsilon(t, 788+333, got, 0.002, "air distance: got %.1f ft, want 788 + 333 ft (Anderson Ex. 6.7)", got)
	// A headwind shortens it over the ground, a tailwind lengthens it: monotone.
	head := airLanding(1.3*vs, vf, 10, theta, screenHeightM) / ft
	tail := airLanding(1.3*vs, vf, -10, theta, screenHeightM) / ft
	assert.Less(t, head, got)
	assert.Greater(t, tail, got)
	// A flare arc higher than the screen: the arc from the screen height, closed form.
	radius = 400.0
	theta = 20 * math.Pi / 180 // h_f = 24.1 m > 15.24 m
	assert.InDelta(t, math.Sqrt(screenHeightM*(2*radius-screenHeightM)), airLanding(40, math.Sqrt(radius*0.2*StandardGravity), 0, theta, screenHeightM), 1e-9)
}

// brakingForces builds forces whose deceleration is g (J_T + J_A V^2) exactly: no
// thrust, no lift, friction J_T, a drag coefficient giving J_A.
func brakingForces(jt, ja float64) *forces {
	const m, rho, s = 1000.0, 1.225, 16.0
	return &forces{
		massKg: m, rho: rho, s: s, cl: 0, cosSlope: 1, mu: jt,
		cd0: 2 * m * StandardGravity * ja / (rho * s), braking: true,
	}
}

// The braking roll from touchdown speed V_TD with constant J_T = T_rev/W + mu and J_A
// (Anderson, Aircraft Performance and Design, eq. 6.119 without the free roll) [pub]:
//
//	s = 1 / (2 g J_A) ln(1 + (J_A / J_T) V_TD^2)
//
// The quadrature, run as the takeoff's on the deceleration, meets it.
func TestBrakingRollClosedForm(t *testing.T) {
	for _, tc := range []struct{ jt, ja, vtd float64 }{
		{0.4, 1e-4, 60},
		{0.3, 2e-4, 28},
		{0.12, 3e-5, 25},
	} {
		want := 1 / (2 * StandardGravity * tc.ja) * math.Log(1+tc.ja/tc.jt*tc.vtd*tc.vtd)
		got, _, _, err := groundRun(brakingForces(tc.jt, tc.ja), 0, tc.vtd, tc.vtd, DefaultStepMS, nil)
		require.NoError(t, err)
		assert.InEpsilon(t, want, got, 1e-4, "got %.3f m, closed form %.3f m", got, want)
	}
	// No drag at all: the constant-deceleration roll V^2 / (2 mu g) (common practice).
	got, _, _, err := groundRun(brakingForces(0.3, 0), 0, 30, 30, DefaultStepMS, nil)
	require.NoError(t, err)
	assert.InEpsilon(t, 30*30/(2*0.3*StandardGravity), got, 1e-9)
}

func landingRef(m LandingModel, c Conditions) LandingResult {
	r, err := m.Land(c)
	if err != nil {
		panic(err)
	}
	return r
}

// Properties of the physics landing model: heavier, hotter, higher, a tailwind, a
// downslope and a wet or unpaved surface never shorten the landing distance or the
// ground roll (Anderson sec. 6.8: distance grows with V^2 / rho and falls with the
// braking coefficient).
func TestLandingPhysicsMonotone(t *testing.T) {
	m := demoLandingPhysics()
	base := Conditions{PressureAltM: 2000 * ft, TempK: 288.15, MassKg: 1100, Surface: Paved, Condition: Dry}
	b := landingRef(m, base)
	for _, tc := range []struct {
		name string
		mod  func(*Conditions)
	}{
		{"heavier", func(c *Conditions) { c.MassKg = 1200 }},
		{"hotter", func(c *Conditions) { c.TempK += 20 }},
		{"higher", func(c *Conditions) { c.PressureAltM += 3000 * ft }},
		{"tailwind", func(c *Conditions) { c.HeadwindMS = -5 * knot }},
		{"downslope", func(c *Conditions) { c.SlopePct = -2 }},
		{"wet", func(c *Conditions) { c.Condition = Wet }},
		{"grass", func(c *Conditions) { c.Surface = Grass }},
		{"wet grass", func(c *Conditions) { c.Surface, c.Condition = Grass, Wet }},
	} {
		t.Run(tc.name, func(t *testing.T) {
			c := base
			tc.mod(&c)
			r := landingRef(m, c)
			assert.GreaterOrEqual(t, r.From50ftM, b.From50ftM, "landing distance")
			assert.GreaterOrEqual(t, r.GroundRollM, b.GroundRollM*(1-1e-12), "ground roll")
		})
	}
	// A headwind and an upslope help.
	c := base
	c.HeadwindMS = 10 * knot
	assert.Less(t, landingRef(m, c).From50ftM, b.From50ftM)
	c = base
	c.SlopePct = 2
	assert.Less(t, landingRef(m, c).GroundRollM, b.GroundRollM)
}

// The approach speed: 1.3 V_S0 at the mass, at sea-level density (equivalent
// airspeed), V_S0 = sqrt(2 W / (rho0 S CLmax)) (Anderson eq. 5.67); a profile's
// speed at the maximum landing mass scales with sqrt(mass), never below 1.3 V_S0.
func TestLandingApproachSpeed(t *testing.T) {
	m := demoLandingPhysics()
	vs0 := math.Sqrt(2 * 1200 * StandardGravity / (1.225 * 16.2 * 1.95)) // 24.6 m/s, 47.8 kt [calc]
	assert.InEpsilon(t, 1.3*vs0, m.ApproachEASMS(1200), 1e-4)
	m.ApproachIASMS = 70 * knot
	assert.InEpsilon(t, 70*knot, m.ApproachEASMS(1200), 1e-12)
	assert.InEpsilon(t, 70*knot*math.Sqrt(1000.0/1200), m.ApproachEASMS(1000), 1e-12)
	m.ApproachIASMS = 50 * knot // below 1.3 V_S0 (62 kt): the model flies 1.3 V_S0
	assert.InEpsilon(t, 1.3*vs0, m.ApproachEASMS(1200), 1e-4)
	r := landingRef(m, Conditions{PressureAltM: 5000 * ft, TempK: 278.24, MassKg: 1200, Surface: Paved, Condition: Dry})
	assert.InEpsilon(t, 1.3*vs0, r.ApproachIASMS, 1e-4, "the result names the indicated approach speed")
}

// A steep downslope on wet grass with weak braking: braking does not stop the
// aircraft, a no-go without a figure (never a number, never "no data").
func TestLandingCannotStop(t *testing.T) {
	m := demoLandingPhysics()
	m.L.BrakingFraction = 0.15
	_, err := m.Land(Conditions{TempK: 288.15, MassKg: 1200, SlopePct: -10, Surface: Grass, Condition: Wet})
	require.Error(t, err)
	assert.True(t, errors.Is(err, ErrCannotStop), "got %v", err)
}

// A synthetic truth: landing points made by the model with known approach angle and
// braking fraction are fitted back from other starting values, and every point is
// predicted within 0.5 %.
func TestCalibrateLandingSyntheticTruth(t *testing.T) {
	truth := demoLandingPhysics()
	truth.L.ApproachAngleDeg, truth.L.BrakingFraction = 6.5, 0.42
	var pts []CalibrationPoint
	for _, c := range []Conditions{
		{TempK: 288.15, MassKg: 1200, Surface: Paved, Condition: Dry},
		{PressureAltM: 4000 * ft, TempK: 280.2, MassKg: 1200, Surface: Paved, Condition: Dry},
		{TempK: 303.15, MassKg: 1000, Surface: Paved, Condition: Dry},
	} {
		r := landingRef(truth, c)
		pts = append(pts, CalibrationPoint{Conditions: c, GroundRollM: r.GroundRollM, To50ftM: r.From50ftM})
	}
	start := *truth
	start.L.ApproachAngleDeg, start.L.BrakingFraction = DefaultApproachAngleDeg, DefaultBrakingFraction
	cal, err := CalibrateLanding(start, pts)
	require.NoError(t, err)
	assert.InEpsilon(t, 6.5, cal.ApproachAngleDeg, 1e-3)
	assert.InEpsilon(t, 0.42, cal.BrakingFrac, 1e-3)
	assert.Less(t, cal.LargestPct, 0.01)
	assert.Contains(t, cal.ModelLine(), "calibrated to 3 manual landing points")
	require.NoError(t, cal.usable(1200), "a point at the maximum landing mass, paved, dry")
	assert.Error(t, cal.usable(1250), "no point at 1250 kg")

	// The same points, bit for bit the same fit.
	again, err := CalibrateLanding(start, pts)
	require.NoError(t, err)
	assert.Equal(t, math.Float64bits(cal.ApproachAngleDeg), math.Float64bits(again.ApproachAngleDeg))

	// A typing slip in one figure is refused, naming it.
	pts[1].To50ftM *= 1.3
	_, err = CalibrateLanding(start, pts)
	var fe *FitError
	require.True(t, errors.As(err, &fe), "got %v", err)
	named := false
	for _, p := range fe.Problems {
		named = named || (p.Point == 1 && p.Figure == "from_50ft")
	}
	assert.True(t, named, "problems %+v", fe.Problems)
}

// landingTable is a manual's landing table (invented): ground roll and distance from
// 50 ft, in metres, paved, dry, level, with wind and grass notes.
func landingTable() *Table {
	return &Table{
		PressureAltM: []float64{0, 4000 * ft},
		TempK:        []float64{273.15, 293.15, 313.15},
		WeightKg:     []float64{900, 1000},
		GroundRollM:  [][][]float64{{{150, 160, 170}, {170, 181, 193}}, {{170, 182, 194}, {193, 206, 219}}},
		To50ftM:      [][][]float64{{{360, 378, 396}, {400, 421, 442}}, {{400, 420, 440}, {445, 468, 491}}},
		Corrections:  Corrections{HeadwindPct: 8, HeadwindPerMS: 7 * knot, TailwindPct: 6, TailwindPerMS: 1 * knot, TailwindMaxMS: 10 * knot, GrassPctOfGroundRoll: 25, WetGrassPctOfGroundRoll: 40},
	}
}

// The landing table reads as the takeoff table does: a cell at a grid point, linear
// between (20 C halfway between 0 and 40 C at 0 ft, 1000 kg: 420 m), the notes (a
// 7 kt headwind -8 %, grass +25 % of the ground roll), no data above the axes.
func TestLandingTableModel(t *testing.T) {
	m := &LandingTableModel{Table: landingTable()}
	r, err := m.Land(Conditions{TempK: 293.15, MassKg: 1000, Surface: Paved, Condition: Dry})
	require.NoError(t, err)
	assert.InDelta(t, 420, r.From50ftM, 1e-9)
	assert.InDelta(t, 182, r.GroundRollM, 1e-9)
	assert.True(t, r.Covers.Surface)
	r, err = m.Land(Conditions{TempK: 293.15, MassKg: 950, Surface: Paved, Condition: Dry, HeadwindMS: 7 * knot})
	require.NoError(t, err)
	assert.InDelta(t, 0.92*(378+420)/2, r.From50ftM, 1e-9)
	r, err = m.Land(Conditions{TempK: 293.15, MassKg: 1000, Surface: Grass, Condition: Dry})
	require.NoError(t, err)
	assert.InDelta(t, 420+0.25*182, r.From50ftM, 1e-9)
	_, err = m.Land(Conditions{TempK: 320, MassKg: 1000, Surface: Paved, Condition: Dry})
	assert.True(t, errors.Is(err, ErrNoData), "hotter than the table: no data, got %v", err)
}

// The published landing factors, each with its source, on a model figure of 500 m:
//   - eu-class-b dry paved: 500 / 0.7 = 714.3 m (CAT.POL.A.330(a): within 70 % of the LDA);
//   - wet paved: x1.15 more, 1.15 x 1.43 = 1.64 (GM1 CAT.POL.A.430, Table 2) [pub];
//   - dry grass x1.15 (AMC1 CAT.POL.A.330, secondary quotation of CAP 698) [sec];
//   - 2 % downslope x1.10, upslope no credit (AMC2 CAT.POL.A.330 as CAP 698 quotes it;
//     AMC2 CAT.POL.A.430) [sec];
//   - uk-advisory: x1.43, dry grass x1.15 [sec], wet grass x1.35, wet paved x1.15
//     (SSL 7c, from memory).
func TestLandingPolicyFactors(t *testing.T) {
	eu, _ := PolicyByID(PolicyEUClassB)
	uk, _ := PolicyByID(PolicyUKAdvisory)
	res := LandingResult{GroundRollM: 200, From50ftM: 500} // covers nothing
	end := RunwayEnd{Designator: "09", LDAM: 2000, Surface: Paved, Condition: Dry}
	for _, tc := range []struct {
		name   string
		p      Policy
		s      Surface
		c      Condition
		slope  float64
		want   float64
		factor string
	}{
		{"eu dry paved", eu, Paved, Dry, 0, 500 / 0.7, "dry paved"},
		{"eu wet paved", eu, Paved, Wet, 0, 500 * 1.15 / 0.7, "wet paved"},
		{"eu dry grass", eu, Grass, Dry, 0, 500 * 1.15 / 0.7, "dry grass"},
		{"eu wet grass", eu, Grass, Wet, 0, 500 * 1.15 * 1.15 / 0.7, "wet grass"},
		{"eu 2 % downslope", eu, Paved, Dry, -2, 500 * 1.1 / 0.7, "dry paved"},
		{"eu 2 % upslope, no credit", eu, Paved, Dry, 2, 500 / 0.7, "dry paved"},
		{"uk dry paved", uk, Paved, Dry, 0, 500 * 1.43, "dry paved"},
		{"uk wet paved", uk, Paved, Wet, 0, 500 * 1.15 * 1.43, "wet paved"},
		{"uk dry grass", uk, Grass, Dry, 0, 500 * 1.15 * 1.43, "dry grass"},
		{"uk wet grass", uk, Grass, Wet, 0, 500 * 1.35 * 1.43, "wet grass"},
		{"uk gravel takes grass", uk, Gravel, Dry, 0, 500 * 1.15 * 1.43, "dry grass"},
		{"uk 1 % downslope", uk, Paved, Dry, -1, 500 * 1.05 * 1.43, "dry paved"},
	} {
		t.Run(tc.name, func(t *testing.T) {
			e := end
			e.Surface, e.Condition, e.SlopePct = tc.s, tc.c, tc.slope
			req := tc.p.Landing().Require(res, res, e)
			assert.InEpsilon(t, tc.want, req.Limiting.RequiredM, 1e-12, "got %.2f m, want %.2f m", req.Limiting.RequiredM, tc.want)
			assert.Equal(t, "LDA", req.Limiting.Declared)
			assert.Equal(t, 2000.0, req.Limiting.AvailableM)
			assert.Equal(t, tc.factor, req.Factors[0].Name)
		})
	}
	// GM1 CAT.POL.A.430 Table 2 [pub]: LDA at least 1.15 x 1.43 x ALD = 1.64 x ALD.
	req := eu.Landing().Require(res, res, RunwayEnd{LDAM: 2000, Surface: Paved, Condition: Wet})
	assert.InDelta(t, 1.64, req.Limiting.RequiredM/500, 0.005)
	assert.Equal(t, "CAT.POL.A.330(a)", req.Rule)
	// A wet grass end carries the GM1 CAT.POL.A.335 caution (up to 60 %).
	req = eu.Landing().Require(res, res, RunwayEnd{LDAM: 2000, Surface: Grass, Condition: Wet})
	assert.Contains(t, req.Caution, "60 %")
}

// The floor: a model that covers the surface cannot beat the published factor on its
// own paved, dry, level figure (kneeprint's own rule, FloorRule).
func TestLandingPolicyFloor(t *testing.T) {
	uk, _ := PolicyByID(PolicyUKAdvisory)
	actual := LandingResult{GroundRollM: 200, From50ftM: 480, Covers: Effects{Surface: true, Slope: true}}
	ref := LandingResult{GroundRollM: 200, From50ftM: 480, Covers: Effects{Surface: true, Slope: true}}
	req := uk.Landing().Require(actual, ref, RunwayEnd{LDAM: 1000, Surface: Grass, Condition: Dry})
	assert.True(t, req.Floor)
	assert.InEpsilon(t, 480*1.15, req.FactoredTODM, 1e-12)
}

// EvaluateLanding: a go cell fits its LDA as printed; an end without an LDA gives no
// figure and says so; above the maximum landing mass is beyond limits; the tailwind
// limit holds for landing too.
func TestEvaluateLanding(t *testing.T) {
	uk, _ := PolicyByID(PolicyUKAdvisory)
	a := &Aircraft{Name: "t", MTOWKg: 1000, MaxTailwindMS: 10 * knot, Landing: &Landing{MaxMassKg: 1000, Model: ModelTable, Table: landingTable()}}
	m, err := LandingModelFor(a)
	require.NoError(t, err)
	rnd := Rounding{Step: CardStep}
	k := LandingCase{Aircraft: a, Model: m, Policy: uk, End: RunwayEnd{Designator: "27", LDAM: 700, Surface: Paved, Condition: Dry},
		TempK: 293.15, MassKg: 1000, TightMargin: 0.1, Rounding: rnd}
	c := EvaluateLanding(k)
	// 420 m x 1.43 = 600.6 m, printed 610 m against 700 m: fits, with 14.8 % spare: go.
	require.True(t, c.HasDistance)
	assert.Equal(t, Go, c.State, "%v", c.Reasons())
	assert.Equal(t, 610.0, c.ShownRequired)
	assert.LessOrEqual(t, c.ShownRequired, c.ShownAvailable)

	k.End.LDAM = 650 // 610 fits, 6.6 % spare: tight
	assert.Equal(t, Tight, EvaluateLanding(k).State)
	k.End.LDAM = 605 // 610 printed > 605: no-go, though 600.6 would fit
	assert.Equal(t, NoGo, EvaluateLanding(k).State)

	k.End.LDAM = 0
	c = EvaluateLanding(k)
	assert.Equal(t, NoData, c.State)
	assert.False(t, c.HasDistance)
	assert.Contains(t, c.Reasons()[0], "no LDA declared for runway end 27")

	k.End.LDAM = 700
	a.Landing.MaxMassKg = 950
	c = EvaluateLanding(k)
	assert.Equal(t, BeyondLimits, c.State)
	assert.Contains(t, c.Reasons()[0], "maximum landing mass 950 kg")
	a.Landing.MaxMassKg = 1000

	k.Wind = Components{HeadwindMS: -12 * knot, GustHeadwindMS: -12 * knot}
	assert.Equal(t, BeyondLimits, EvaluateLanding(k).State)

	// Without landing data there is no landing model.
	_, err = LandingModelFor(&Aircraft{Name: "none"})
	assert.True(t, errors.Is(err, ErrNoLandingData))
}

// calibratedLandingAircraft is a physics profile whose landing model is calibrated to
// points it made itself (the fit's correctness is TestCalibrateLandingSyntheticTruth's).
func calibratedLandingAircraft(t testing.TB) *Aircraft {
	lm := demoLandingPhysics()
	lm.RefMassKg = 1000
	r := landingRef(lm, Conditions{TempK: 288.15, MassKg: 1000, Surface: Paved, Condition: Dry})
	cal, err := CalibrateLanding(*lm, []CalibrationPoint{{Conditions: Conditions{TempK: 288.15, MassKg: 1000, Surface: Paved, Condition: Dry}, GroundRollM: r.GroundRollM, To50ftM: r.From50ftM}})
	require.NoError(t, err)
	lp := lm.L
	lp.ApproachAngleDeg, lp.BrakingFraction, lp.Calibration = cal.ApproachAngleDeg, cal.BrakingFrac, cal
	p := demoPhysics().P
	return &Aircraft{Name: "p", MTOWKg: 1000, MaxTailwindMS: 10 * knot, Physics: &p,
		Landing: &Landing{MaxMassKg: 1000, Model: ModelPhysics, Physics: &lp}}
}

// Every go or tight landing cell of a grid fits its LDA as printed, and along every
// axis the requirement never falls: heavier (block), tailwind (row, towards the
// tail), hotter (column).
func TestLandingGridProperties(t *testing.T) {
	for _, pid := range PolicyIDs() {
		p, _ := PolicyByID(pid)
		for _, mk := range []struct {
			name string
			a    *Aircraft
		}{
			{"table", &Aircraft{Name: "t", MTOWKg: 1000, MaxTailwindMS: 10 * knot, Landing: &Landing{MaxMassKg: 1000, Model: ModelTable, Table: landingTable()}}},
			{"physics", calibratedLandingAircraft(t)},
		} {
			m, err := LandingModelFor(mk.a)
			require.NoError(t, err)
			for _, e := range []RunwayEnd{
				{Designator: "09", LDAM: 600, Surface: Paved, Condition: Dry, SlopePct: -1},
				{Designator: "27", LDAM: 650, Surface: Grass, Condition: Wet, SlopePct: 1},
			} {
				spec := GridSpec{TempsK: []float64{273.15, 283.15, 293.15, 303.15}, HeadwindsMS: []float64{-10 * knot, -5 * knot, 0, 10 * knot},
					WeightsKg: []float64{1000, 900}, QNHPa: 100000, TightMargin: 0.1, Rounding: Rounding{Step: CardStep}}
				g, err := ComputeLandingGrid(mk.a, m, p, Airfield{ElevationM: 300}, e, spec)
				require.NoError(t, err)
				assert.True(t, g.Landing)
				for wi := range g.Cells {
					for hi := range g.Cells[wi] {
						for ti, c := range g.Cells[wi][hi] {
							if c.State == Go || c.State == Tight {
								assert.LessOrEqual(t, c.ShownRequired, c.ShownAvailable)
							}
							if !c.HasDistance {
								continue
							}
							if ti > 0 && g.Cells[wi][hi][ti-1].HasDistance {
								assert.GreaterOrEqual(t, c.RequiredM, g.Cells[wi][hi][ti-1].RequiredM, "hotter")
							}
							if hi > 0 && g.Cells[wi][hi-1][ti].HasDistance {
								assert.LessOrEqual(t, c.RequiredM, g.Cells[wi][hi-1][ti].RequiredM, "more tailwind")
							}
							if wi > 0 && g.Cells[wi-1][hi][ti].HasDistance {
								assert.LessOrEqual(t, c.RequiredM, g.Cells[wi-1][hi][ti].RequiredM, "heavier")
							}
						}
					}
				}
			}
		}
	}
}

// The memo answers exactly as the model does, reference figures included.
func TestMemoLandingSameAnswers(t *testing.T) {
	m := demoLandingPhysics()
	mm := MemoLanding(m)
	assert.Same(t, mm, MemoLanding(mm))
	for _, c := range []Conditions{
		{TempK: 288.15, MassKg: 1200, Surface: Paved, Condition: Dry},
		{TempK: 288.15, MassKg: 1200, Surface: Paved, Condition: Dry},
		{TempK: 300, MassKg: 1100, Surface: Grass, Condition: Wet, SlopePct: -1},
	} {
		want, err := m.Land(c)
		require.NoError(t, err)
		got, err := mm.Land(c)
		require.NoError(t, err)
		assert.Equal(t, want, got)
	}
}

// One 8 temperatures x 7 winds x 2 weights landing grid, as a card side computes it.
func benchmarkLandingGrid(b *testing.B, a *Aircraft) {
	m, err := LandingModelFor(a)
	if err != nil {
		b.Fatal(err)
	}
	p, _ := PolicyByID(PolicyUKAdvisory)
	spec := DefaultGridSpec(a)
	spec.WeightsKg = LandingMasses(a, a.WeightsKg, 2)
	spec.Rounding = Rounding{Step: CardStep}
	e := RunwayEnd{Designator: "15", LDAM: 610, Surface: Grass, Condition: Wet, SlopePct: -1}
	b.ReportAllocs()
	for i := 0; i < b.N; i++ {
		if _, err := ComputeLandingGrid(a, MemoLanding(m), p, Airfield{ElevationM: 300}, e, spec); err != nil {
			b.Fatal(err)
		}
	}
}

func BenchmarkLandingGridPhysics(b *testing.B) {
	b.StopTimer()
	a := calibratedLandingAircraft(b)
	a.WeightsKg = []float64{1000, 900}
	b.StartTimer()
	benchmarkLandingGrid(b, a)
}

func BenchmarkLandingGridTable(b *testing.B) {
	benchmarkLandingGrid(b, &Aircraft{Name: "t", MTOWKg: 1000, MaxTailwindMS: 10 * knot, WeightsKg: []float64{1000, 900},
		Landing: &Landing{MaxMassKg: 1000, Model: ModelTable, Table: landingTable()}})
}

// A wet unpaved runway other than grass (gravel) takes the grass factors, and so the
// wet grass caution of GM1 CAT.POL.A.335 (up to +60 % on very short wet grass [pub]);
// a dry one and a wet paved one carry none.
func TestWetGravelLandingCaution(t *testing.T) {
	for _, id := range PolicyIDs() {
		p, _ := PolicyByID(id)
		lp := p.Landing()
		wet := lp.Cautions(RunwayEnd{Surface: Gravel, Condition: Wet, LDAM: 800})
		require.Len(t, wet, 1, id)
		assert.Contains(t, wet[0], "+60 %", id)
		assert.Contains(t, wet[0], "grass factors", id)
		assert.Empty(t, lp.Cautions(RunwayEnd{Surface: Gravel, Condition: Dry, LDAM: 800}), id)
		assert.Empty(t, lp.Cautions(RunwayEnd{Surface: Paved, Condition: Wet, LDAM: 800}), id)
	}
}

// eu-class-b read steep slopes differently for takeoff (no data past 2 %, AMC2
// CAT.POL.A.305: "correction factors for runways with slopes in excess of 2 % should
// only be applied when the operator has demonstrated ... the necessary data", as
// the UK Air Operations Regulations print it) and landing (a figure and a caution).
// AMC2 CAT.POL.A.330 itself could not be read here (AMC2 CAT.POL.A.430, for class C,
// reads "+5 % for each 1 % of downslope" with no bound), so the takeoff's
// conservative reading is applied to the landing: past 2 % either way, no data, with
// the reason. uk-advisory keeps its figure and caution.
func TestLandingSlopeBeyondTwoPercent(t *testing.T) {
	eu, _ := PolicyByID(PolicyEUClassB)
	uk, _ := PolicyByID(PolicyUKAdvisory)
	a := &Aircraft{Name: "t", MTOWKg: 1000, MaxTailwindMS: 10 * knot, Landing: &Landing{MaxMassKg: 1000, Model: ModelTable, Table: landingTable()}}
	m, err := LandingModelFor(a)
	require.NoError(t, err)
	for _, tc := range []struct {
		pol      Policy
		slope    float64
		noData   bool
		contains string
	}{
		{eu, -3, true, "slope 3.0 % is beyond the 2 %"},
		{eu, 3, true, "AMC2 CAT.POL.A.305"},
		{eu, -2, false, ""},
		{uk, -3, false, "caution: downslope 3.0 % is beyond the 2 %"},
	} {
		k := LandingCase{Aircraft: a, Model: m, Policy: tc.pol, End: RunwayEnd{Designator: "27", LDAM: 2000, Surface: Paved, Condition: Dry, SlopePct: tc.slope},
			TempK: 293.15, MassKg: 1000, TightMargin: 0.1}
		c := EvaluateLanding(k)
		name := fmt.Sprintf("%s %+g %%", tc.pol.ID, tc.slope)
		if tc.noData {
			assert.Equal(t, NoData, c.State, name)
			assert.False(t, c.HasDistance, name)
			assert.Contains(t, fmt.Sprint(c.Reasons()), tc.contains, name)
			continue
		}
		assert.True(t, c.HasDistance, name)
		assert.Equal(t, Go, c.State, "%s: %v", name, c.Reasons())
		if tc.contains != "" {
			assert.Contains(t, c.Requirement.Caution, tc.contains, name)
		}
	}
}
