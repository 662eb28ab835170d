package perf

import (
	"errors"
	"fmt"
	"math"
)

// Climb is a profile's all-engines climb after takeoff, at one stated climb speed:
// a flight-manual rate-of-climb table, or, with Table nil, the physics model's excess
// power at that speed (ClimbFor).
type Climb struct {
	SpeedIASMS float64     // the climb speed the rates are for (indicated, as the manual gives it)
	Table      *ClimbTable // nil: the physics description's excess power at SpeedIASMS
}

// ClimbTable is a flight manual's rate-of-climb table over pressure altitude x
// temperature x weight. A manual that prints one weight gives one block: its rates
// are used at every lighter weight (a lighter aircraft climbs better, so that is
// conservative) and heavier weights have no data.
type ClimbTable struct {
	PressureAltM []float64 // strictly increasing
	TempK        []float64 // strictly increasing
	WeightKg     []float64 // strictly increasing
	// RateMS is the rate of climb, indexed [weight][pressure altitude][temperature];
	// the loader guarantees it never rises with any of the three.
	RateMS [][][]float64
}

// ClimbResult is a climb model's answer at one set of conditions.
type ClimbResult struct {
	RateMS float64 // rate of climb in still air; zero or negative: no climb
	TASMS  float64 // true airspeed of the climb speed in these conditions
	Notes  []string
}

// ClimbModel answers the rate of climb at the profile's climb speed for a pressure
// altitude, temperature and mass (the other fields of Conditions are not used).
type ClimbModel interface {
	Climb(Conditions) (ClimbResult, error)
}

// ErrNoClimbData marks a runway end with obstacles for a profile that gives no climb:
// without a climb no clearance can be worked out, so the cell has no figure.
var ErrNoClimbData = errors.New("no climb data")

// ClimbFor returns the climb model the aircraft's profile gives: its rate-of-climb
// table, or its physics description's excess power at the climb speed (with the
// propeller figures the takeoff calibration fitted). Nil, with ErrNoClimbData, when
// the profile gives no climb.
func ClimbFor(a *Aircraft) (ClimbModel, error) {
	switch {
	case a.Climb == nil:
		return nil, fmt.Errorf("%w: the profile %q has no climb section", ErrNoClimbData, a.Name)
	case a.Climb.SpeedIASMS <= 0:
		return nil, fmt.Errorf("%w: the profile %q states no climb speed", ErrNoClimbData, a.Name)
	case a.Climb.Table != nil:
		return &TableClimb{Table: a.Climb.Table, SpeedIASMS: a.Climb.SpeedIASMS}, nil
	case a.Physics != nil:
		m := &PhysicsClimb{P: *a.Physics, SpeedIASMS: a.Climb.SpeedIASMS}
		if a.Table != nil {
			m.Envelope = TableEnvelope(a.Table) // as for takeoff: never beyond the table it was fitted to
		}
		return m, nil
	}
	return nil, fmt.Errorf("%w: the profile %q gives a climb speed but neither a rate-of-climb table nor a physics section", ErrNoClimbData, a.Name)
}

// trueAirspeed converts an indicated airspeed to true airspeed for the day,
// V_TAS = V_IAS / sqrt(sigma), taking indicated as equivalent airspeed (common
// practice at light-aircraft speeds, as the takeoff models do).
func trueAirspeed(iasMS, paM, tempK float64) float64 {
	sigma := DensityKgM3(paM, tempK) / isaDensity0()
	return iasMS / math.Sqrt(sigma)
}

// TableClimb answers from a flight-manual rate-of-climb table.
type TableClimb struct {
	Table      *ClimbTable
	SpeedIASMS float64
}

// Climb interpolates the table multilinearly over pressure altitude x temperature x
// weight, exactly as the takeoff table is read (TableModel.Takeoff): above the
// highest value of an axis the answer is ErrNoData, never an extrapolation; below the
// lowest, the lowest is used with a note (conservative: the loader guarantees rates
// never rise with any axis).
func (m *TableClimb) Climb(c Conditions) (ClimbResult, error) {
	t := m.Table
	var r ClimbResult
	wi, wf, note, err := axisPos(t.WeightKg, c.MassKg, "climb table weight", axisKg)
	if err != nil {
		return r, err
	}
	if note != "" {
		r.Notes = append(r.Notes, fmt.Sprintf("weight %.0f kg is below the climb table's lightest block: the %.0f kg rates are used", c.MassKg, t.WeightKg[0]))
	}
	pi, pf, note, err := axisPos(t.PressureAltM, c.PressureAltM, "climb table pressure altitude", axisFt)
	if err != nil {
		return r, err
	}
	if note != "" {
		r.Notes = append(r.Notes, note)
	}
	ti, tf, note, err := axisPos(t.TempK, c.TempK, "climb table temperature", axisC)
	if err != nil {
		return r, err
	}
	if note != "" {
		r.Notes = append(r.Notes, note)
	}
	r.RateMS = trilinear(t.RateMS, wi, wf, pi, pf, ti, tf)
	r.TASMS = trueAirspeed(m.SpeedIASMS, c.PressureAltM, c.TempK)
	return r, nil
}

// PhysicsClimb answers from a physics description: the excess power at the climb
// speed in steady flight.
type PhysicsClimb struct {
	P          Physics
	SpeedIASMS float64
	// Envelope, when set, is the range of the flight-manual table the physics was
	// fitted to: nothing beyond it is answered (as PhysicsModel.Envelope).
	Envelope *Envelope
}

// Climb is the rate of climb from the excess power at the climb speed V (true
// airspeed for the day) in steady flight, lift equal to weight:
//
//	RC = V (T - D) / W,   T = eta P / V (never above the static thrust),
//	D = q S (CD0 + K CL^2),   CL = W / (q S),   K = 1 / (pi e AR)
//
// (Anderson, Aircraft Performance and Design, ch. 5, rate of climb from the power
// available and the power required; Raymer, Aircraft Design, ch. 17, climb; from
// memory of the sections). The engine power lapses with density as in the takeoff
// (Gagg-Ferrar), and eta and the static thrust fraction are the ones the takeoff
// calibration fitted, so the climb carries the same propeller the calibrated
// takeoff's air segment flies (which uses this very excess-thrust ratio, climbOut).
// The drag polar is the takeoff flap's with the gear down and out of ground effect,
// which is the conservative side for a clean climb.
//
// Outside the ISA troposphere or the Envelope, or at a climb speed below the stall
// speed in the takeoff flap, the answer is ErrNoData; without engine power,
// ErrCannotTakeOff. A zero or negative rate is an answer (no climb), not an error.
func (m *PhysicsClimb) Climb(c Conditions) (ClimbResult, error) {
	p := m.P
	var r ClimbResult
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
	if c.TempK <= 150 || c.MassKg <= 0 || m.SpeedIASMS <= 0 {
		return r, fmt.Errorf("%w: temperature, mass or climb speed out of physical range", ErrNoData)
	}
	rho := DensityKgM3(c.PressureAltM, c.TempK)
	sigma := rho / isaDensity0()
	power := p.PowerW * (1.132*sigma - 0.132)
	if power <= 0 {
		return r, fmt.Errorf("%w: no engine power left at this density", ErrCannotTakeOff)
	}
	w := c.MassKg * StandardGravity
	v := m.SpeedIASMS / math.Sqrt(sigma)
	if p.CLMax > 0 {
		if vs := math.Sqrt(2 * w / (rho * p.WingAreaM2 * p.CLMax)); v < vs {
			return r, fmt.Errorf("%w: climb speed %.0f kt is below the stall speed %.0f kt at this weight", ErrNoData, m.SpeedIASMS/knot, vs*math.Sqrt(sigma)/knot)
		}
	}
	disc := math.Pi * p.PropDiameterM * p.PropDiameterM / 4
	etaP := p.PropEfficiency * power
	prop := propThrust{static: p.StaticThrustFac * math.Cbrt(2*rho*disc*power*power), atLO: etaP / v, vLO: v, etaP: etaP}
	k := 1 / (math.Pi * p.Oswald * p.SpanM * p.SpanM / p.WingAreaM2)
	ratio := climbOut{w: w, rho: rho, s: p.WingAreaM2, cd0: p.CD0, k: k, prop: &prop}.excess(v)
	r.RateMS, r.TASMS = v*ratio, v
	if math.IsNaN(r.RateMS) || math.IsInf(r.RateMS, 0) {
		return r, fmt.Errorf("%w: the model gave no usable rate of climb", ErrNoData)
	}
	return r, nil
}

// minGroundSpeedMS is the smallest ground speed a climb gradient is worked out for:
// a headwind that leaves less than 5 m/s (about 10 kt) over the ground would make the
// gradient a matter of the wind alone (common practice; a credited headwind of half a
// 99 kt wind is far below a climb speed).
const minGroundSpeedMS = 5.0

// GroundGradient is the climb gradient over the ground with the along-track wind
// creditedHeadwindMS (negative: tailwind), already factored as for the takeoff:
//
//	gradient = RC / (V_TAS - headwind)
//
// (the rate of climb over the ground speed; V_TAS, not V cos(gamma), is the
// conservative side: common practice). Zero or negative when the model finds no climb.
func (r ClimbResult) GroundGradient(creditedHeadwindMS float64) (float64, error) {
	gs := r.TASMS - creditedHeadwindMS
	if !(gs >= minGroundSpeedMS) {
		return 0, fmt.Errorf("%w: a credited headwind of %.0f kt leaves the climb speed almost no ground speed", ErrNoData, creditedHeadwindMS/knot)
	}
	return r.RateMS / gs, nil
}

// ClimbCreditedWindMS is the along-track wind a climb gradient is worked out with:
// the reported component factored as for the takeoff, not more than 50 % of a
// headwind and not less than 150 % of a tailwind (Regulation (EU) No 965/2012,
// CAT.POL.A.305(c); 14 CFR 23.1587(c)(3) before the 2017 rewrite). A rate-of-climb
// table has no wind in it, so the factoring is always applied here, whatever the
// takeoff data include.
func ClimbCreditedWindMS(reportedHeadwindMS float64) float64 {
	return CreditedWindMS(reportedHeadwindMS, false)
}

// axisFrac is axisPos without words: the index i and fraction f of x on the strictly
// increasing axis xs, (0, 0) below the first value (the lowest is used, as axisPos
// does), and above set when x lies past the last value. It allocates nothing: it runs
// for every cell of every card (stillAirClimb).
func axisFrac(xs []float64, x float64) (i int, f float64, above bool) {
	n := len(xs)
	const eps = 1e-9
	if x > xs[n-1]+eps {
		return 0, 0, true
	}
	if n == 1 || x <= xs[0] {
		return 0, 0, false
	}
	for i := 0; i < n-1; i++ {
		if x <= xs[i+1] {
			return i, (x - xs[i]) / (xs[i+1] - xs[i]), false
		}
	}
	return n - 1, 0, false
}

// stillAirClimb is the climb a profile's rate-of-climb table gives at the runway, for
// the no-climb check of every cell (Evaluate): the rate at pressure altitude paM,
// temperature tempK and mass massKg, interpolated as TableClimb.Climb does (the lowest
// value of an axis below it), and the still-air gradient rate / V_TAS at the climb
// speed. inside is false, with no figure, when a value lies above the table's highest
// (no extrapolation: the check then does not apply), or when c has no table.
func (c *Climb) stillAirClimb(paM, tempK, massKg float64) (rateMS, gradient float64, inside bool) {
	if c == nil || c.Table == nil || !(c.SpeedIASMS > 0) {
		return 0, 0, false
	}
	t := c.Table
	wi, wf, above := axisFrac(t.WeightKg, massKg)
	if above {
		return 0, 0, false
	}
	pi, pf, above := axisFrac(t.PressureAltM, paM)
	if above {
		return 0, 0, false
	}
	ti, tf, above := axisFrac(t.TempK, tempK)
	if above {
		return 0, 0, false
	}
	rateMS = trilinear(t.RateMS, wi, wf, pi, pf, ti, tf)
	return rateMS, rateMS / trueAirspeed(c.SpeedIASMS, paM, tempK), true
}
