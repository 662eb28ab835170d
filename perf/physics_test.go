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

func TestPhysicsLiftoffSpeed(t *testing.T) {
	m := demoPhysics()
	r, err := m.Takeoff(Conditions{TempK: 288.15, MassKg: 1250, Surface: Paved, Condition: Dry})
	require.NoError(t, err)
	// V_LO = 1.1 sqrt(2 W / (rho S CLmax)) (Raymer ch. 17).
	want := 1.1 * math.Sqrt(2*1250*StandardGravity/(1.225*16.2*1.7))
	assert.InDelta(t, want, r.LiftoffTASMS, 1e-3)
	assert.Greater(t, r.To50ftM, r.GroundRollM)
	assert.Less(t, r.AccelCheckM, r.GroundRollM)
	assert.True(t, r.Covers.Surface && r.Covers.Slope)
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
