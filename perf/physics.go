package perf

import (
	"fmt"
	"math"
)

// PropellerType distinguishes fixed-pitch and constant-speed propellers.
type PropellerType string

// Propeller types.
const (
	FixedPitch    PropellerType = "fixed_pitch"
	ConstantSpeed PropellerType = "constant_speed"
)

// Physics is the aerodynamic and engine description the physics model integrates.
// StaticThrustFac and PropEfficiency are the two figures a description cannot know
// well: once the profile is calibrated (see Calibrate) they hold the fitted values,
// and Calibration says how they were found.
type Physics struct {
	WingAreaM2  float64 // reference wing area S
	SpanM       float64 // wing span b
	WingHeightM float64 // height of the wing above the ground h, for ground effect
	CD0         float64 // zero-lift drag coefficient, gear down, takeoff flap
	Oswald      float64 // span efficiency e
	CLGround    float64 // lift coefficient in the ground-run attitude
	CLMax       float64 // maximum lift coefficient in the takeoff flap setting

	PowerW          float64       // rated sea-level power of the engine
	PropDiameterM   float64       // propeller diameter
	Propeller       PropellerType // fixed pitch or constant speed
	PropEfficiency  float64       // eta at lift-off speed and in the climb-out
	StaticThrustFac float64       // static thrust as a fraction of the momentum-theory ideal

	RotationS float64 // rotation time at lift-off speed

	// Calibration is the fit of StaticThrustFac and PropEfficiency to the flight
	// manual's figures; nil when the profile has none (ModelFor then refuses it).
	Calibration *Calibration
}

// Rolling friction coefficients mu by surface and condition. Source: Raymer, Aircraft
// Design: A Conceptual Approach, ch. 17, table "typical rolling resistance
// coefficients" (quoted, from memory): dry concrete/asphalt 0.03-0.05 (0.04 taken),
// wet 0.05, hard turf 0.05, firm dirt 0.04, soft turf 0.07, wet grass 0.08. Wet gravel
// has no entry: soft turf's 0.07 is used (common practice: the nearest, and larger).
func rollingFriction(s Surface, c Condition) float64 {
	wet := c == Wet
	switch s {
	case Grass:
		if wet {
			return 0.08
		}
		return 0.05
	case Gravel:
		if wet {
			return 0.07
		}
		return 0.04
	default:
		if wet {
			return 0.05
		}
		return 0.04
	}
}

// PhysicsModel integrates the takeoff from a physics description.
type PhysicsModel struct {
	P Physics
	// RotateIASMS and At50ftIASMS are the flight manual's rotation speed and speed
	// at the 50 ft screen (indicated); the model flies them, converted to true
	// airspeed for the day. Both are needed.
	RotateIASMS, At50ftIASMS float64
	// Envelope, when set, is the range of a flight-manual table the physics was
	// fitted to: the model then answers nothing beyond it (see Envelope).
	Envelope *Envelope
	// StepMS is the ground-speed step of the ground-run quadrature; zero means
	// DefaultStepMS.
	StepMS float64
}

// Envelope is the range of conditions a model may answer: the axes of the
// flight-manual table a physics description was fitted to. Above the highest
// pressure altitude, temperature or weight the answer is no data, never the
// physics; below the lowest the lowest is used (as the table does: distances rise
// with each of them, so that is conservative).
type Envelope struct {
	MinPressureAltM, MaxPressureAltM float64
	MinTempK, MaxTempK               float64
	MinMassKg, MaxMassKg             float64
}

// TableEnvelope is the range of table t's axes.
func TableEnvelope(t *Table) *Envelope {
	if t == nil || len(t.PressureAltM) == 0 || len(t.TempK) == 0 || len(t.WeightKg) == 0 {
		return nil
	}
	return &Envelope{
		MinPressureAltM: t.PressureAltM[0], MaxPressureAltM: t.PressureAltM[len(t.PressureAltM)-1],
		MinTempK: t.TempK[0], MaxTempK: t.TempK[len(t.TempK)-1],
		MinMassKg: t.WeightKg[0], MaxMassKg: t.WeightKg[len(t.WeightKg)-1],
	}
}

// clamp applies the envelope to c: ErrNoData above it, the lowest value (with a
// note) below it.
func (e *Envelope) clamp(c *Conditions) ([]string, error) {
	const eps = 1e-9
	var notes []string
	axis := func(x *float64, lo, hi float64, name string, show func(float64) string) error {
		if *x > hi+eps {
			return fmt.Errorf("%w: %s %s above the table's highest, %s: the physics fitted to it is not used beyond it", ErrNoData, name, show(*x), show(hi))
		}
		if *x < lo-eps {
			notes = append(notes, fmt.Sprintf("%s %s below the table: figures for %s used (conservative)", name, show(*x), show(lo)))
			*x = lo
		}
		return nil
	}
	if err := axis(&c.MassKg, e.MinMassKg, e.MaxMassKg, "weight", func(x float64) string { return fmt.Sprintf("%.0f kg", x) }); err != nil {
		return nil, err
	}
	if err := axis(&c.PressureAltM, e.MinPressureAltM, e.MaxPressureAltM, "pressure altitude", func(x float64) string { return fmt.Sprintf("%.0f ft", x/0.3048) }); err != nil {
		return nil, err
	}
	if err := axis(&c.TempK, e.MinTempK, e.MaxTempK, "temperature", func(x float64) string { return fmt.Sprintf("%.0f C", x-273.15) }); err != nil {
		return nil, err
	}
	return notes, nil
}

// DefaultStepMS is the largest ground-speed step of the ground-run quadrature: 3 m/s
// (about 6 kt, some 11 steps to lift-off). The integrand is smooth on each piece, so
// Simpson's rule (what RK4 reduces to here) has an error of order step^4:
// TestPhysicsStepIndependence holds the demo tourer's ground roll at this step within
// 1e-5 of a 0.05 m/s reference (a few millimetres), tailwind included, and
// TestGroundRunClosedForm holds it within 5e-5 of the closed form even where the
// acceleration halves during the run; the 0.1 % asked of the integrator is 20 times
// looser. A finer step costs time in every cell of every card and buys nothing a card
// can print (figures are rounded up to 10 m).
const DefaultStepMS = 3.0

// screenHeightM is the 50 ft screen height, 15.24 m.
const screenHeightM = 50 * 0.3048

// minAccelMS2 is the smallest acceleration taken as "still accelerating": below it
// the run would take minutes, which is a no-go (common practice).
const minAccelMS2 = 0.05

// forces describes the ground run of one takeoff: a(Va) along the runway.
type forces struct {
	massKg   float64
	cosSlope float64 // cached cos and sin of slopeRad
	sinSlope float64
	rho      float64
	s        float64 // wing area
	cl       float64 // ground-run lift coefficient
	cd0, kGE float64 // drag polar in ground effect
	mu       float64
	slopeRad float64
	thrust   func(va float64) float64 // when nil, prop is used
	prop     propThrust
	// braking makes accel return the deceleration of a landing roll: the same
	// quadrature then integrates the landing roll run backwards in time, from rest
	// to the touchdown speed (see LandingPhysicsModel.Land).
	braking bool
}

// propThrust is the propeller thrust law of the physics model (see Takeoff).
type propThrust struct {
	static, atLO, vLO, etaP float64
}

// at is the thrust at airspeed va. The built-in min is math.Min to the bit (the
// same rules for NaN and signed zeros, Go specification "Min and max"), compiled in
// line: the ground run asks for the thrust some twenty times per takeoff.
func (p *propThrust) at(va float64) float64 {
	if va <= 0 {
		return p.static
	}
	if va >= p.vLO {
		return min(p.static, p.etaP/va)
	}
	return min(p.static, p.static+(p.atLO-p.static)*va/p.vLO)
}

// accel is Newton's second law along the runway (Anderson, Aircraft Performance and
// Design, sec. 6.7, eq. 6.84, with the slope term added):
//
//	m dVg/dt = T - D - mu (W cos(slope) - L) - W sin(slope)
//
// with L and D at airspeed Va = Vg + headwind. With Va < 0 (a tailwind faster than
// the aircraft) the relative wind comes from behind: drag then pushes forward.
func (f *forces) accel(va float64) float64 {
	w := f.massKg * StandardGravity
	q := 0.5 * f.rho * va * va
	lift := q * f.s * f.cl
	drag := q * f.s * (f.cd0 + f.kGE*f.cl*f.cl)
	if va < 0 {
		drag = -drag
	}
	normal := w*f.cosSlope - lift
	if normal < 0 {
		normal = 0
	}
	var thrust float64
	if f.thrust != nil {
		thrust = f.thrust(va)
	} else {
		thrust = f.prop.at(va)
	}
	a := (thrust - drag - f.mu*normal - w*f.sinSlope) / f.massKg
	if f.braking {
		return -a
	}
	return a
}

// RunPoint is one sample of the ground run.
type RunPoint struct {
	TimeS, DistanceM, GroundSpeedMS, AirspeedMS float64
}

// groundRun integrates the ground run from rest to airspeed vEnd with headwind w,
// over the ground speed Vg:
//
//	ds/dVg = Vg / a(Vg + w),   dt/dVg = 1 / a(Vg + w)
//
// The right-hand sides depend on Vg only, so the classical RK4 step is Simpson's rule
// on each interval. Integrating over speed rather than time makes the end point
// (lift-off airspeed) exact, with no event to locate. With a tailwind the integrand has
// a kink where the airspeed passes zero (drag changes side): the range is split there
// so that each piece is smooth and keeps Simpson's fourth order. It also returns the
// distance at which airspeed first reaches vMark (0 when vMark <= w, i.e. reached at
// rest). trace, when not nil, receives every step.
func groundRun(f *forces, w, vEnd, vMark, step float64, trace func(RunPoint)) (dist, timeS, markDist float64, err error) {
	vgEnd := vEnd - w
	if vgEnd <= 0 {
		return 0, 0, 0, nil // the wind alone gives lift-off airspeed
	}
	vgMark := vMark - w
	markDist = -1
	if vgMark <= 0 {
		markDist = 0
	}
	a0 := f.accel(w)
	if a0 < minAccelMS2 {
		return 0, 0, 0, fmt.Errorf("%w: thrust does not overcome drag, friction and slope at the start of the run", ErrCannotTakeOff)
	}
	if trace != nil {
		trace(RunPoint{0, 0, 0, w})
	}
	pieces, np := [2][2]float64{{0, vgEnd}}, 1
	if vgZero := -w; vgZero > 0 && vgZero < vgEnd {
		pieces, np = [2][2]float64{{0, vgZero}, {vgZero, vgEnd}}, 2
	}
	var s, t float64
	for _, pc := range pieces[:np] {
		n := int(math.Ceil((pc[1] - pc[0]) / step))
		if n < 2 {
			n = 2
		}
		h := (pc[1] - pc[0]) / float64(n)
		for i := 0; i < n; i++ {
			vg := pc[0] + float64(i)*h
			am := f.accel(vg + h/2 + w)
			a1 := f.accel(vg + h + w)
			if am < minAccelMS2 || a1 < minAccelMS2 {
				return 0, 0, 0, fmt.Errorf("%w: acceleration stops at %.0f kt airspeed, below lift-off speed %.0f kt", ErrCannotTakeOff, (vg+h+w)/knot, vEnd/knot)
			}
			if markDist < 0 && vg+h >= vgMark {
				// Simpson on the partial interval [vg, vgMark].
				hp := vgMark - vg
				ap := f.accel(vg + hp/2 + w)
				am2 := f.accel(vgMark + w)
				markDist = s + hp/6*(vg/a0+4*(vg+hp/2)/ap+vgMark/am2)
			}
			s += h / 6 * (vg/a0 + 4*(vg+h/2)/am + (vg+h)/a1)
			t += h / 6 * (1/a0 + 4/am + 1/a1)
			a0 = a1
			if trace != nil {
				trace(RunPoint{t, s, vg + h, vg + h + w})
			}
		}
	}
	if markDist < 0 {
		markDist = s
	}
	return s, t, markDist, nil
}

// MaxWindFraction bounds the credited wind the physics model answers for: a
// headwind or tailwind of at most half the lift-off true airspeed. Beyond it the
// steady-wind assumption carries the whole answer (a headwind of the lift-off speed
// would "lift off" at rest and fly the air segment backwards); flight-manual wind
// corrections stop far below it (common practice). Past it: no data.
const MaxWindFraction = 0.5

// minClimbGradient is the smallest excess-thrust ratio (T - D)/W taken as a climb:
// 0.5 %, about 17 ft/min at 60 kt, which no pilot would call one (common practice).
const minClimbGradient = 0.005

// Takeoff computes the takeoff with the physics model:
//
//   - Atmosphere: density from pressure altitude and temperature (ISA pressure, ideal gas).
//   - Power lapse (Gagg-Ferrar; Gudmundsson, General Aviation Aircraft Design, sec. 7):
//     P = P_SL (1.132 sigma - 0.132).
//   - Static thrust by momentum theory, T_ideal = (2 rho A P^2)^(1/3), times the
//     profile's (fitted) static fraction; thrust at speed eta P / V (Gudmundsson
//     ch. 14; Anderson sec. 3.3); blended linearly in airspeed from the static value
//     at rest to eta P / V_LO at lift-off, and never above the static value.
//   - Speeds from the profile: lift-off at the manual's rotation speed, the screen
//     at its 50 ft speed, both indicated, taken as equivalent airspeed (common
//     practice at these speeds) and converted to true airspeed for the day,
//     V_TAS = V_IAS / sqrt(sigma). Never below the stall speed
//     V_S = sqrt(2 W / (rho S CLmax)) in the takeoff flap: lift-off at max(V_R, V_S),
//     the screen at max(V_50, V_LO).
//   - Ground run: groundRun, with ground effect G = (16h/b)^2 / (1 + (16h/b)^2) on the
//     induced drag (Anderson eq. 6.82), K = 1 / (pi e AR), and mu from rollingFriction.
//   - Rotation: RotationS seconds at lift-off ground speed (Anderson sec. 6.7: N = 1 s
//     for small aircraft).
//   - Airborne to 50 ft: airSegment, the energy method (energy height
//     h_e = h + V^2/2g gained at (T - D)/W per metre flown), or the transition arc
//     and climb where that is the longer.
//
// The accelerate check distance is where airspeed reaches 0.7 V_LO. A calibrated
// model's distances are then floored at the manual's (Calibration.Floor).
// Outside the ISA troposphere, or with a credited wind beyond MaxWindFraction of the
// lift-off speed, or outside the Envelope, the answer is ErrNoData; when the
// aircraft does not accelerate to V_LO or cannot climb, ErrCannotTakeOff. Every
// distance returned is positive and finite.
func (m *PhysicsModel) Takeoff(c Conditions) (Result, error) {
	p := m.P
	var r Result
	r.Covers = Effects{Surface: true, Slope: true}
	if m.RotateIASMS <= 0 || m.At50ftIASMS <= 0 {
		return r, fmt.Errorf("%w: the physics model needs the manual's rotation and 50 ft speeds", ErrNoData)
	}
	if m.Envelope != nil {
		notes, err := m.Envelope.clamp(&c)
		if err != nil {
			return r, err
		}
		r.Notes = notes
	}
	if c.PressureAltM < isaLowestM || c.PressureAltM > TropopauseM {
		return r, fmt.Errorf("%w: pressure altitude outside the ISA troposphere", ErrNoData)
	}
	if c.TempK <= 150 || c.MassKg <= 0 {
		return r, fmt.Errorf("%w: temperature or mass out of physical range", ErrNoData)
	}
	rho := DensityKgM3(c.PressureAltM, c.TempK)
	sigma := rho / isaDensity0()
	power := p.PowerW * (1.132*sigma - 0.132)
	if power <= 0 {
		return r, fmt.Errorf("%w: no engine power left at this density", ErrCannotTakeOff)
	}
	w := c.MassKg * StandardGravity
	vStall := math.Sqrt(2 * w / (rho * p.WingAreaM2 * p.CLMax))
	tas := 1 / math.Sqrt(sigma)
	vLO := max(m.RotateIASMS*tas, vStall) // built-in max: math.Max to the bit
	v50 := max(m.At50ftIASMS*tas, vLO)
	if math.Abs(c.HeadwindMS) > MaxWindFraction*vLO {
		return r, fmt.Errorf("%w: credited wind %.0f kt is beyond what the model answers (half the lift-off speed, %.0f kt)", ErrNoData, math.Abs(c.HeadwindMS)/knot, MaxWindFraction*vLO/knot)
	}
	disc := math.Pi * p.PropDiameterM * p.PropDiameterM / 4
	tStatic := p.StaticThrustFac * math.Cbrt(2*rho*disc*power*power)
	tLO := p.PropEfficiency * power / vLO
	prop := propThrust{static: tStatic, atLO: tLO, vLO: vLO, etaP: p.PropEfficiency * power}
	ar := p.SpanM * p.SpanM / p.WingAreaM2
	k := 1 / (math.Pi * p.Oswald * ar)
	hb := 16 * p.WingHeightM / p.SpanM
	g := hb * hb / (1 + hb*hb)
	f := &forces{
		massKg: c.MassKg, rho: rho, s: p.WingAreaM2, cl: p.CLGround,
		cd0: p.CD0, kGE: g * k, mu: rollingFriction(c.Surface, c.Condition),
		slopeRad: math.Atan(c.SlopePct / 100), prop: prop,
	}
	f.sinSlope, f.cosSlope = math.Sincos(f.slopeRad)
	step := m.StepMS
	if step <= 0 {
		step = DefaultStepMS
	}
	run, _, mark, err := groundRun(f, c.HeadwindMS, vLO, 0.7*vLO, step, nil)
	if err != nil {
		return r, err
	}
	gr := run + p.RotationS*(vLO-c.HeadwindMS)

	air, err := airSegment(climbOut{w: w, rho: rho, s: p.WingAreaM2, cd0: p.CD0, k: k, prop: &prop}, vLO, v50, c.HeadwindMS)
	if err != nil {
		return r, err
	}
	to := gr + air
	if cal := p.Calibration; cal != nil && cal.Floor > 1 {
		// Never shorter than the manual at its own points (floorFactor); the
		// accelerate check follows the ground roll.
		mark *= cal.Floor
		gr, to = applyFloor(cal.Floor, gr, to)
	}
	// The model's contract: a distance is positive and finite, whatever the inputs.
	if !(gr > 0) || !(air > 0) || math.IsInf(to, 0) || math.IsNaN(mark) || mark < 0 {
		return r, fmt.Errorf("%w: the model gave no usable distance here (ground roll %.1f m, air %.1f m)", ErrNoData, gr, air)
	}
	r.GroundRollM = gr
	r.To50ftM = to
	r.AccelCheckM = mark
	r.LiftoffTASMS = vLO
	return r, nil
}

// climbOut is what the air segment needs: weight, density, wing area, drag polar
// (out of ground effect, the conservative side) and the propeller.
type climbOut struct {
	w, rho, s, cd0, k float64
	prop              *propThrust
}

// excess is the excess-thrust ratio (T - D)/W at true airspeed v in steady flight,
// lift equal to weight: C_L = W / (q S), D = q S (CD0 + K C_L^2).
func (c climbOut) excess(v float64) float64 {
	q := 0.5 * c.rho * v * v
	cl := c.w / (q * c.s)
	return (c.prop.at(v) - q*c.s*(c.cd0+c.k*cl*cl)) / c.w
}

// airSegment is the horizontal distance over the ground from lift-off at true
// airspeed vLO to the 50 ft screen at v50, with headwind w. The energy method: the
// energy height h_e = h + V^2 / 2g rises by (T - D)/W for every metre flown through
// the air, since its rate of change, the specific excess power, is V (T - D)/W
// (Anderson, Aircraft Performance and Design, ch. 5, energy height and specific
// excess power; Raymer, Aircraft Design, ch. 17, energy methods; from memory of the
// sections). Over the ground a metre flown is (V - w)/V metres. So
//
//	S_A = integral over h_e from 0 to dE of (V - w) / (V r(V)) dh_e,
//	dE  = 50 ft + (V_50^2 - V_LO^2) / 2g,   r = (T - D)/W at L = W,
//
// with V rising linearly in h_e from V_LO to V_50, by Simpson's rule: the harmonic
// mean of r along the segment, never shorter than dE over the arithmetic mean.
// The transition arc and straight climb of Raymer (load factor 1.2 at
// V_TR = (V_LO + V_50)/2, see airborneDistance) is kept where it is the longer: it
// holds when the 50 ft speed is barely above lift-off, where the energy method
// would leave out the arc. A ratio below minClimbGradient anywhere: ErrCannotTakeOff.
func airSegment(c climbOut, vLO, v50, w float64) (float64, error) {
	vMid := (vLO + v50) / 2
	vs := [3]float64{vLO, vMid, v50}
	var f [3]float64
	for i, v := range vs {
		r := c.excess(v)
		if r < minClimbGradient {
			return 0, fmt.Errorf("%w: climb gradient %.1f %% at %.0f kt is too small to reach 50 ft", ErrCannotTakeOff, r*100, v/knot)
		}
		f[i] = (v - w) / (v * r)
	}
	dE := screenHeightM + (v50*v50-vLO*vLO)/(2*StandardGravity)
	energy := dE / 6 * (f[0] + 4*f[1] + f[2])

	radius := vMid * vMid / (0.2 * StandardGravity)
	gamma := math.Asin(min(c.excess(vMid), 0.5)) // built-in min and max: math.Min and math.Max to the bit
	arc := airborneDistance(radius, gamma, screenHeightM) * (vMid - w) / vMid
	return max(energy, arc), nil
}

// airborneDistance is the horizontal distance from lift-off to height screenM along
// a transition arc of radius R that ends in a straight climb at angle gamma (Raymer,
// Aircraft Design, ch. 17; Anderson, Aircraft Performance and Design, eqs. 6.97-6.99):
//
//	h_TR = R (1 - cos gamma)
//	h_TR >= screen: S = sqrt(R^2 - (R - screen)^2)          (the arc reaches it)
//	otherwise:      S = R sin gamma + (screen - h_TR) / tan gamma
func airborneDistance(radius, gamma, screenM float64) float64 {
	hTR := radius * (1 - math.Cos(gamma))
	if hTR >= screenM {
		return math.Sqrt(radius*radius - (radius-screenM)*(radius-screenM))
	}
	return radius*math.Sin(gamma) + (screenM-hTR)/math.Tan(gamma)
}
