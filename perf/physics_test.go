package perf

import (
	"math"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
)

// closedFormGroundRun is the ground run to speed vf from rest for constant thrust and
// no wind (Anderson, Aircraft Performance and Design, eq. 6.90; Raymer ch. 17):
//
//	S = 1/(2 g K_A) ln[(K_T + K_A V_f^2) / K_T]
func closedFormGroundRun(kt, ka, vf float64) float64 {
	return 1 / (2 * StandardGravity * ka) * math.Log((kt+ka*vf*vf)/kt)
}

// constantThrustForces builds forces whose acceleration is g (K_T + K_A V^2) exactly:
// thrust K_T W, no friction, no lift, a drag coefficient giving K_A.
func constantThrustForces(kt, ka float64) *forces {
	const m, rho, s = 1000.0, 1.225, 16.0
	w := m * StandardGravity
	return &forces{
		massKg: m, rho: rho, s: s, cl: 0, cosSlope: 1,
		cd0: -2 * m * StandardGravity * ka / (rho * s), kGE: 0, mu: 0,
		thrust: func(float64) float64 { return kt * w },
	}
}

// Anderson, Aircraft Performance and Design (1999), Example 6.6: K_T = 0.301,
// K_A = -4.525e-7 ft^-2 s^2 (per (ft/s)^2), V_LO = 205.1 ft/s, N = 3 s:
// s_g = 2242 ft to lift-off plus 615 ft of rotation = 2857 ft [pub].
func TestGroundRunAndersonExample66(t *testing.T) {
	kt := 0.301
	ka := -4.525e-7 / (ft * ft) // per (m/s)^2: a = g (K_T + K_A V^2) in any units
	vlo := 205.1 * ft
	f := constantThrustForces(kt, ka)
	s, _, _, err := groundRun(f, 0, vlo, 0.7*vlo, DefaultStepMS, nil)
	require.NoError(t, err)
	// Anderson uses g = 32.2 ft/s^2, we use 9.80665 m/s^2 (32.174): 0.08 % apart.
	assert.InEpsilon(t, 2242, s/ft, 0.002, "got %.1f ft, want 2242 ft (Anderson Ex. 6.6)", s/ft)
	total := s/ft + 3*205.1
	assert.InEpsilon(t, 2857, total, 0.002, "got %.1f ft, want 2857 ft (Anderson Ex. 6.6)", total)
}

func TestGroundRunClosedForm(t *testing.T) {
	for _, tc := range []struct{ kt, ka, vf float64 }{
		{0.301, -4.525e-7 / (ft * ft), 205.1 * ft},
		{0.25, -1.5e-4, 30},
		{0.18, -6e-5, 28},
	} {
		want := closedFormGroundRun(tc.kt, tc.ka, tc.vf)
		got, _, _, err := groundRun(constantThrustForces(tc.kt, tc.ka), 0, tc.vf, 0.7*tc.vf, DefaultStepMS, nil)
		require.NoError(t, err)
		assert.InEpsilon(t, want, got, 0.001, "got %.3f m, closed form %.3f m", got, want)
		assert.InEpsilon(t, want, got, 5e-5, "the default step is far inside 0.1 %%: got %.6f m, want %.6f m", got, want)
	}
}

// Convergence: Simpson's rule error falls by about 2^4 = 16 when the step halves.
func TestGroundRunConvergence(t *testing.T) {
	kt, ka, vf := 0.25, -1.5e-4, 30.0
	want := closedFormGroundRun(kt, ka, vf)
	var prev float64
	for i, step := range []float64{8, 4, 2, 1} {
		got, _, _, err := groundRun(constantThrustForces(kt, ka), 0, vf, 0.7*vf, step, nil)
		require.NoError(t, err)
		e := math.Abs(got - want)
		if i > 0 && prev > 1e-9 {
			assert.Greater(t, prev/e, 10.0, "step %.1f: error %.3g, previous %.3g: want fourth-order decrease", step, e, prev)
		}
		prev = e
	}
}

// With a headwind the airspeed is the ground speed plus the headwind at every step;
// with a tailwind the ground speed equals the tailwind when the airspeed is zero
// (common practice).
func TestGroundRunWind(t *testing.T) {
	f := constantThrustForces(0.25, -1.5e-4)
	const vf = 30.0
	for _, w := range []float64{5, -5} {
		var pts []RunPoint
		_, _, _, err := groundRun(f, w, vf, 0.7*vf, DefaultStepMS, func(p RunPoint) { pts = append(pts, p) })
		require.NoError(t, err)
		require.NotEmpty(t, pts)
		for _, p := range pts {
			assert.InDelta(t, p.GroundSpeedMS+w, p.AirspeedMS, 1e-12)
		}
		last := pts[len(pts)-1]
		assert.InDelta(t, vf, last.AirspeedMS, 1e-9, "run ends at lift-off airspeed")
		if w < 0 {
			for _, p := range pts {
				if math.Abs(p.AirspeedMS) < 1e-9 {
					assert.InDelta(t, -w, p.GroundSpeedMS, 1e-9)
				}
				if p.GroundSpeedMS < -w {
					assert.Less(t, p.AirspeedMS, 0.0, "still moving slower than the tailwind")
				}
			}
		}
	}
	still, _, _, _ := groundRun(f, 0, vf, 0.7*vf, DefaultStepMS, nil)
	head, _, _, _ := groundRun(f, 5, vf, 0.7*vf, DefaultStepMS, nil)
	tail, _, _, _ := groundRun(f, -5, vf, 0.7*vf, DefaultStepMS, nil)
	assert.Less(t, head, still)
	assert.Greater(t, tail, still)
}

// Under constant acceleration airspeed 0.7 V_LO is reached at 0.49 of the run (domain
// notes sec. 4 [calc]): with K_A = 0 the acceleration is constant.
func TestAccelerateCheckConstantAcceleration(t *testing.T) {
	f := constantThrustForces(0.3, 0)
	s, _, mark, err := groundRun(f, 0, 30, 21, DefaultStepMS, nil)
	require.NoError(t, err)
	assert.InDelta(t, 0.49, mark/s, 1e-9, "0.7^2 (domain notes sec. 4 [calc])")
}

// Anderson, Aircraft Performance and Design, sec. 6.7 example: V_stall = 186.4 ft/s,
// obstacle 35 ft, R = 6.96 V_stall^2 / g = 7510 ft, airborne distance 724 ft [pub].
func TestAirborneAnderson(t *testing.T) {
	r := 6.96 * 186.4 * 186.4 / 32.2
	assert.InDelta(t, 7510, r, 1, "R = 7510 ft (Anderson, sec. 6.7 example [pub])")
	got := airborneDistance(r*ft, 0.2, 35*ft) / ft // a climb angle steep enough for the arc to reach 35 ft
	assert.InDelta(t, 724, got, 1, "got %.1f ft, want 724 ft (Anderson)", got)
	// A shallow climb: the arc ends below the screen, the straight climb completes it.
	shallow := airborneDistance(r*ft, 0.05, 35*ft) / ft
	hTR := r * (1 - math.Cos(0.05))
	want := r*math.Sin(0.05) + (35-hTR)/math.Tan(0.05)
	assert.InDelta(t, want, shallow, 1e-6)
}

// Momentum-theory static thrust: 134.2 kW, 1.930 m disc, sea level -> 5055 N ideal
// (domain notes [calc]): T = (2 rho A P^2)^(1/3).
func TestStaticThrustMomentumTheory(t *testing.T) {
	a := math.Pi * 1.930 * 1.930 / 4
	got := math.Cbrt(2 * 1.225 * a * 134.2e3 * 134.2e3)
	assert.InDelta(t, 5055, got, 5, "5055 N (domain notes sec. 4 [calc])")
}

// demoPhysics is the demo tourer's description (invented demo data) with the
// starting values of a constant-speed propeller.
func demoPhysics() *PhysicsModel {
	return &PhysicsModel{P: Physics{
		WingAreaM2: 16.2, SpanM: 10.9, WingHeightM: 1.0, CD0: 0.034, Oswald: 0.75,
		CLGround: 0.3, CLMax: 1.7, PowerW: 134e3, PropDiameterM: 1.93,
		Propeller: ConstantSpeed, PropEfficiency: 0.58, StaticThrustFac: 0.66,
		RotationS: 1,
	}, RotateIASMS: 60 * knot, At50ftIASMS: 68 * knot}
}

// Lift-off at the profile's rotation speed, indicated, as true airspeed for the day:
// V_TAS = V_IAS / sqrt(sigma), with sigma 0.8617 at 5000 ft ISA (ICAO Doc 7488; domain
// notes sec. 2 [calc]). Never below the stall speed at the weight:
// V_S = sqrt(2 W / (rho S CLmax)) (Anderson, Aircraft Performance and Design, eq. 5.67).
func TestPhysicsLiftoffSpeed(t *testing.T) {
	m := demoPhysics()
	r, err := m.Takeoff(Conditions{TempK: 288.15, MassKg: 1250, Surface: Paved, Condition: Dry})
	require.NoError(t, err)
	assert.InDelta(t, 60*knot, r.LiftoffTASMS, 1e-9, "sea level ISA: TAS = IAS")
	assert.Greater(t, r.To50ftM, r.GroundRollM)
	assert.Less(t, r.AccelCheckM, r.GroundRollM)
	assert.True(t, r.Covers.Surface && r.Covers.Slope)

	r, err = m.Takeoff(Conditions{PressureAltM: 5000 * ft, TempK: 278.24, MassKg: 1250, Surface: Paved, Condition: Dry})
	require.NoError(t, err)
	assert.InEpsilon(t, 60*knot/math.Sqrt(0.8617), r.LiftoffTASMS, 2e-4, "5000 ft ISA: sigma 0.8617 (ICAO Doc 7488)")

	// At 1700 kg the stall speed sqrt(2 x 1700 g / (1.225 x 16.2 x 1.7)) = 31.4 m/s
	// (61.1 kt [calc]) is above the 60 kt rotation speed: lift-off at the stall speed.
	r, err = m.Takeoff(Conditions{TempK: 288.15, MassKg: 1700, Surface: Paved, Condition: Dry})
	require.NoError(t, err)
	vs := math.Sqrt(2 * 1700 * StandardGravity / (1.225 * 16.2 * 1.7))
	assert.Greater(t, vs, 60*knot)
	assert.InDelta(t, vs, r.LiftoffTASMS, 1e-3)
}

// The accelerate check is where 70 % of the rotation speed (TAS) is reached.
func TestPhysicsAccelCheckAtRotationSpeed(t *testing.T) {
	m := demoPhysics()
	c := Conditions{TempK: 288.15, MassKg: 1250, Surface: Paved, Condition: Dry}
	r, err := m.Takeoff(c)
	require.NoError(t, err)
	var pts []RunPoint
	f := demoForces(m, c)
	_, _, _, err = groundRun(f, 0, 60*knot, 0.7*60*knot, 0.01, func(p RunPoint) { pts = append(pts, p) })
	require.NoError(t, err)
	var at float64
	for _, p := range pts {
		if p.AirspeedMS >= 0.7*60*knot {
			at = p.DistanceM
			break
		}
	}
	assert.InDelta(t, at, r.AccelCheckM, 0.5, "a 0.01 m/s trace crosses 0.7 V_R where the model says")
}

// demoForces rebuilds the ground-run forces of m at c (sea level ISA only).
func demoForces(m *PhysicsModel, c Conditions) *forces {
	p := m.P
	rho := DensityKgM3(c.PressureAltM, c.TempK)
	power := p.PowerW * (1.132*rho/isaDensity0() - 0.132)
	vLO := m.RotateIASMS / math.Sqrt(rho/isaDensity0())
	disc := math.Pi * p.PropDiameterM * p.PropDiameterM / 4
	ts := p.StaticThrustFac * math.Cbrt(2*rho*disc*power*power)
	ar := p.SpanM * p.SpanM / p.WingAreaM2
	hb := 16 * p.WingHeightM / p.SpanM
	return &forces{massKg: c.MassKg, rho: rho, s: p.WingAreaM2, cl: p.CLGround, cd0: p.CD0,
		kGE: hb * hb / (1 + hb*hb) / (math.Pi * p.Oswald * ar), mu: rollingFriction(c.Surface, c.Condition), cosSlope: 1,
		prop: propThrust{static: ts, atLO: p.PropEfficiency * power / vLO, vLO: vLO, etaP: p.PropEfficiency * power}}
}

// The energy method (Anderson, Aircraft Performance and Design, ch. 5, energy height;
// from memory of the section): with the 50 ft speed equal to lift-off speed and no
// wind, the energy gained is the 50 ft alone and S = 15.24 m / r; the transition arc
// and straight climb (Raymer ch. 17) is then longer, since
// R sin(gamma) + (h - h_TR)/tan(gamma) > h / sin(gamma) for a shallow climb, and is kept.
// With a faster 50 ft speed the energy form wins and agrees with a fine quadrature
// of the same integral (Simpson's error on this smooth integrand is below 1e-4).
func TestAirSegmentEnergy(t *testing.T) {
	m := demoPhysics()
	rho := 1.225
	power := m.P.PowerW
	v := 60 * knot
	prop := propThrust{static: 4000, atLO: m.P.PropEfficiency * power / v, vLO: v, etaP: m.P.PropEfficiency * power}
	ar := m.P.SpanM * m.P.SpanM / m.P.WingAreaM2
	c := climbOut{w: 1250 * StandardGravity, rho: rho, s: m.P.WingAreaM2, cd0: m.P.CD0, k: 1 / (math.Pi * m.P.Oswald * ar), prop: &prop}

	r := c.excess(v)
	require.Greater(t, r, 0.02)
	got, err := airSegment(c, v, v, 0)
	require.NoError(t, err)
	energy := screenHeightM / r
	radius := v * v / (0.2 * StandardGravity)
	arc := airborneDistance(radius, math.Asin(r), screenHeightM)
	assert.Greater(t, arc, energy, "equal speeds: the arc form is the longer")
	assert.InDelta(t, arc, got, 1e-9)

	v50 := 68 * knot
	got, err = airSegment(c, v, v50, 0)
	require.NoError(t, err)
	dE := screenHeightM + (v50*v50-v*v)/(2*StandardGravity)
	const n = 20000
	fine := 0.0
	for i := 0; i < n; i++ {
		vv := v + (v50-v)*(float64(i)+0.5)/n
		fine += dE / n / c.excess(vv)
	}
	assert.InEpsilon(t, fine, got, 1e-4, "energy method: got %.3f m, fine quadrature %.3f m", got, fine)
	assert.Greater(t, got, dE/((c.excess(v)+c.excess(v50))/2)*0.999, "never shorter than dE over the arithmetic mean of the ends")

	// A headwind shortens the distance over the ground by (V - w)/V at every point.
	head, err := airSegment(c, v, v50, 5)
	require.NoError(t, err)
	assert.Less(t, head, got)
	assert.Greater(t, head, got*(v-5)/v)
}

// Issue 14 item 4: a credited headwind past the lift-off speed made the air distance
// negative. Over every wind from a tailwind of the lift-off speed to a headwind of
// twice it, the model gives either no data or distances with 0 < ground roll <
// distance to 50 ft (a property: a distance is positive).
func TestPhysicsNoNonPositiveDistance(t *testing.T) {
	m := demoPhysics()
	vLO := 60 * knot
	for w := -vLO; w <= 2*vLO; w += 0.25 {
		r, err := m.Takeoff(Conditions{TempK: 288.15, MassKg: 1250, HeadwindMS: w, Surface: Paved, Condition: Dry})
		if math.Abs(w) > MaxWindFraction*vLO+1e-9 {
			assert.ErrorIs(t, err, ErrNoData, "wind %.1f kt", w/knot)
			continue
		}
		if err != nil {
			assert.ErrorIs(t, err, ErrCannotTakeOff, "wind %.1f kt", w/knot)
			continue
		}
		assert.Greater(t, r.GroundRollM, 0.0, "wind %.1f kt", w/knot)
		assert.Greater(t, r.To50ftM, r.GroundRollM, "wind %.1f kt", w/knot)
		assert.GreaterOrEqual(t, r.AccelCheckM, 0.0)
	}
}

// An envelope (the range of a table the physics was fitted to): above it no data,
// below it the lowest value's figures with a note (as the table model does).
func TestPhysicsEnvelope(t *testing.T) {
	m := demoPhysics()
	m.Envelope = &Envelope{MinPressureAltM: 0, MaxPressureAltM: 2000 * ft, MinTempK: 273.15, MaxTempK: 303.15, MinMassKg: 1000, MaxMassKg: 1250}
	base := Conditions{TempK: 288.15, MassKg: 1250, Surface: Paved, Condition: Dry}
	for _, c := range []Conditions{
		{PressureAltM: 2500 * ft, TempK: 288.15, MassKg: 1250},
		{TempK: 310, MassKg: 1250},
		{TempK: 288.15, MassKg: 1300},
	} {
		_, err := m.Takeoff(c)
		assert.ErrorIs(t, err, ErrNoData, "%+v", c)
	}
	cold := base
	cold.TempK = 263.15
	rc, err := m.Takeoff(cold)
	require.NoError(t, err)
	at := base
	at.TempK = 273.15
	ra, err := m.Takeoff(at)
	require.NoError(t, err)
	assert.Equal(t, ra.To50ftM, rc.To50ftM)
	assert.NotEmpty(t, rc.Notes)
}

func TestPhysicsCannotTakeOff(t *testing.T) {
	m := demoPhysics()
	_, err := m.Takeoff(Conditions{PressureAltM: 10000, TempK: 300, MassKg: 1250, Surface: Paved, Condition: Dry})
	assert.ErrorIs(t, err, ErrCannotTakeOff)
	_, err = m.Takeoff(Conditions{PressureAltM: 12000, TempK: 230, MassKg: 1250})
	assert.ErrorIs(t, err, ErrNoData)
}

func TestPhysicsStepIndependence(t *testing.T) {
	for _, c := range []Conditions{
		{PressureAltM: 500, TempK: 300, MassKg: 1150, HeadwindMS: -3, SlopePct: 1, Surface: Grass, Condition: Wet},
		{PressureAltM: 1600, TempK: 308, MassKg: 1250, HeadwindMS: -7.7, SlopePct: 1.1, Surface: Gravel, Condition: Dry},
		{PressureAltM: 0, TempK: 273, MassKg: 950, HeadwindMS: 10, SlopePct: -1, Surface: Paved, Condition: Dry},
	} {
		fine := demoPhysics()
		fine.StepMS = 0.05
		a, err := fine.Takeoff(c)
		require.NoError(t, err)
		b, err := demoPhysics().Takeoff(c)
		require.NoError(t, err)
		assert.InEpsilon(t, a.GroundRollM, b.GroundRollM, 1e-5, "%+v", c)
		assert.InEpsilon(t, a.AccelCheckM, b.AccelCheckM, 1e-5, "%+v", c)
	}
}
