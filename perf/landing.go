package perf

import (
	"errors"
	"fmt"
	"math"
)

// ErrNoLandingData marks a profile without landing data: no landing figure can be
// given for it.
var ErrNoLandingData = errors.New("the profile has no landing data")

// ErrCannotStop marks conditions in which the landing model finds that braking does
// not stop the aircraft (a steep downslope on a slippery surface): a no-go without a
// figure, as ErrCannotTakeOff is for a takeoff.
var ErrCannotStop = errors.New("cannot stop")

// Landing is what a profile says about landing: the flight manual's landing table
// and/or a physics landing model, the landing flap, the approach speed and the
// maximum landing mass.
type Landing struct {
	Flap string // the landing flap setting, as printed in the manual
	// ApproachIASMS is the manual's approach speed over the 50 ft screen (indicated)
	// at MaxMassKg; 0 when the profile gives none (the physics then flies 1.3 V_S0).
	ApproachIASMS float64
	MaxMassKg     float64 // maximum landing mass (the MTOW when the manual gives none)

	Model ModelKind // which landing model the cards use
	// Table is the manual's landing table: GroundRollM from touchdown to a stop,
	// To50ftM from 50 ft over the threshold to a stop, over pressure altitude x
	// temperature x weight, paved, dry, level; with the manual's own notes.
	Table   *Table
	Physics *LandingPhysics // may be nil
}

// LandingPhysics is what the physics landing model needs beyond the airframe of the
// profile's physics section (wing, span, wing height, span efficiency).
// ApproachAngleDeg and BrakingFraction are the two figures a description cannot know
// well: once calibrated (CalibrateLanding) they hold the fitted values.
type LandingPhysics struct {
	CLMax     float64 // maximum lift coefficient in the landing flap (V_S0)
	CD0       float64 // zero-lift drag coefficient, landing flap, gear down
	CLGround  float64 // lift coefficient in the landing-roll attitude
	FreeRollS float64 // time between touchdown and braking

	ApproachAngleDeg float64 // the approach path from 50 ft, degrees below the horizontal
	BrakingFraction  float64 // the share of the surface's braking coefficient the manual's technique reaches

	// Calibration is the fit to the manual's landing figures; nil when the profile
	// has none (LandingModelFor then refuses it).
	Calibration *LandingCalibration
}

// LandingResult is a landing model's answer, unfactored.
type LandingResult struct {
	GroundRollM float64 // touchdown to a stop
	From50ftM   float64 // 50 ft over the threshold to a stop: the landing distance
	// ApproachIASMS is the speed over the threshold the figures assume (indicated),
	// 0 when the model does not know it.
	ApproachIASMS float64
	Covers        Effects
	Notes         []string
}

// LandingModel is a landing model: the manual's landing table and the physics
// landing model both satisfy it.
type LandingModel interface {
	Land(Conditions) (LandingResult, error)
}

// LandingWindFactoringIncluded reports whether landing model m's data already factor
// the wind (CAT.POL.A.330(c)(2): not more than 50 % of the headwind, not less than
// 150 % of the tailwind).
func LandingWindFactoringIncluded(m LandingModel) bool {
	wf, ok := m.(windFactored)
	return ok && wf.WindFactoringIncluded()
}

// LandingModelFor returns the landing model the profile selects, or an error
// wrapping ErrNoLandingData when it has no landing data.
func LandingModelFor(a *Aircraft) (LandingModel, error) {
	l := a.Landing
	if l == nil {
		return nil, fmt.Errorf("aircraft %q: %w (add a landing section: the manual's landing table, or a calibrated physics landing model)", a.Name, ErrNoLandingData)
	}
	switch l.Model {
	case ModelTable:
		if l.Table == nil {
			return nil, fmt.Errorf("aircraft %q: landing table model selected but no landing table", a.Name)
		}
		return &LandingTableModel{Table: l.Table, ApproachIASMS: l.ApproachIASMS}, nil
	case ModelPhysics:
		if l.Physics == nil || a.Physics == nil {
			return nil, fmt.Errorf("aircraft %q: landing physics model selected but no physics and landing physics sections", a.Name)
		}
		if err := l.Physics.Calibration.usable(l.MaxMassKg); err != nil {
			return nil, fmt.Errorf("aircraft %q: landing: %w. A landing model nobody held against the aircraft's own figures can be optimistic by as much as the whole safety factor, so it gives no landing figure. "+
				"Add under landing.physics a calibration list with at least the flight manual's landing figures at sea level, at the maximum landing mass, paved dry, e.g.\n"+
				"  calibration:\n    - {pressure_altitude: 0 ft, temperature: 15 C, weight: %.0f kg, ground_roll: ... m, from_50ft: ... m}\n"+
				"and check the fit with kneeprint validate", a.Name, err, l.MaxMassKg)
		}
		m := &LandingPhysicsModel{P: *a.Physics, L: *l.Physics, ApproachIASMS: l.ApproachIASMS, RefMassKg: l.MaxMassKg}
		if l.Table != nil {
			m.Envelope = TableEnvelope(l.Table)
		}
		return m, nil
	}
	return nil, fmt.Errorf("aircraft %q: unknown landing model %q", a.Name, l.Model)
}

// LandingTableModel answers landing questions from the manual's landing table.
type LandingTableModel struct {
	Table         *Table
	ApproachIASMS float64 // the manual's approach speed, for printing; 0 when not given
}

// WindFactoringIncluded reports whether the table's wind notes already factor the wind.
func (m *LandingTableModel) WindFactoringIncluded() bool { return m.Table.WindInData }

// Land interpolates the landing table multilinearly over pressure altitude x
// temperature x weight and applies the manual's notes in the manual's order (wind,
// then grass), exactly as the takeoff table does (Table.lookup, Table.applyNotes):
// above the highest value of an axis ErrNoData, never an extrapolation; below the
// lowest, the lowest value's figures with a note.
//
// As the takeoff table, the wind notes are never stretched: past a note's up_to, or,
// with the manual's approach speed, past MaxWindFraction of the touchdown true
// airspeed (touchdownStallRatio/approachStallRatio of the approach speed, as the
// physics landing model flies it), the answer is ErrNoData.
func (m *LandingTableModel) Land(c Conditions) (LandingResult, error) {
	t := m.Table
	r := LandingResult{ApproachIASMS: m.ApproachIASMS}
	gr, total, notes, err := t.lookup(c)
	r.Notes = notes
	if err != nil {
		return r, err
	}
	if m.ApproachIASMS > 0 {
		sigma := DensityKgM3(c.PressureAltM, c.TempK) / isaDensity0()
		vTD := m.ApproachIASMS / math.Sqrt(sigma) * touchdownStallRatio / approachStallRatio
		if math.Abs(c.HeadwindMS) > MaxWindFraction*vTD+1e-9 {
			return r, fmt.Errorf("%w: credited wind %.1f kt is beyond half the touchdown speed (%.0f kt true): kneeprint never stretches the manual's wind notes that far",
				ErrNoData, math.Abs(c.HeadwindMS)/knot, math.Floor(MaxWindFraction*vTD/knot+1e-9))
		}
	}
	if gr, total, err = t.applyNotes(c, gr, total, &r.Covers, &r.Notes, m.ApproachIASMS > 0); err != nil {
		return r, err
	}
	r.GroundRollM, r.From50ftM = gr, total
	return r, nil
}

// Speed ratios of the landing (Anderson, Aircraft Performance and Design, sec. 6.8 and
// Example 6.7; Raymer, Aircraft Design, sec. 17.9): approach at 1.3 V_stall in the
// landing configuration, the flare at an average 1.23 V_stall, touchdown at
// 1.15 V_stall. The load factor in the flare is 1.2, so its radius is
// R = V_f^2 / (0.2 g) (Anderson eq. 6.107).
const (
	approachStallRatio  = 1.3
	flareStallRatio     = 1.23
	touchdownStallRatio = 1.15
	flareLoadFactor     = 1.2
)

// Braking coefficients mu_B by surface and condition, brakes on. Source: Raymer,
// Aircraft Design: A Conceptual Approach, ch. 17, table of rolling and braking
// coefficients (from memory, not verified): dry concrete/asphalt 0.3-0.5 (0.4
// taken), wet concrete/asphalt 0.15-0.3 (0.225 taken), hard turf 0.4, firm dirt 0.3,
// wet grass 0.2. Gravel is taken as firm dirt; wet gravel has no entry and takes wet
// grass's 0.2 (common practice: the nearest, and not larger). Wet is never above dry.
func brakingCoefficient(s Surface, c Condition) float64 {
	wet := c == Wet
	switch s {
	case Grass:
		if wet {
			return 0.2
		}
		return 0.4
	case Gravel:
		if wet {
			return 0.2
		}
		return 0.3
	default:
		if wet {
			return 0.225
		}
		return 0.4
	}
}

// LandingPhysicsModel computes the landing from a physics description.
type LandingPhysicsModel struct {
	P Physics        // the airframe (wing area, span, wing height, span efficiency)
	L LandingPhysics // the landing configuration and the fitted figures
	// ApproachIASMS is the manual's approach speed at RefMassKg; 0: 1.3 V_S0.
	ApproachIASMS float64
	RefMassKg     float64
	// Envelope, when set, is the range of the manual's landing table the physics was
	// fitted to: nothing is answered beyond it.
	Envelope *Envelope
	StepMS   float64 // quadrature step; 0 means DefaultStepMS
}

// ApproachEASMS is the approach speed the model flies at mass kg, as equivalent
// (indicated) airspeed: the profile's approach speed scaled with the square root of
// the mass from the maximum landing mass (the same margin over the stall at every
// mass, as the stall speed goes with sqrt(W): common practice), and never below
// 1.3 V_S0 at that mass; 1.3 V_S0 when the profile gives none.
//
//	V_S0 = sqrt(2 W / (rho0 S CLmax))   (Anderson eq. 5.67, at sea-level density: EAS)
func (m *LandingPhysicsModel) ApproachEASMS(kg float64) float64 {
	vs0 := math.Sqrt(2 * kg * StandardGravity / (isaDensity0() * m.P.WingAreaM2 * m.L.CLMax))
	v := approachStallRatio * vs0
	if m.ApproachIASMS > 0 && m.RefMassKg > 0 {
		v = math.Max(v, m.ApproachIASMS*math.Sqrt(kg/m.RefMassKg))
	}
	return v
}

// Land computes the landing with the physics model (Anderson, Aircraft Performance
// and Design, sec. 6.8; Raymer, Aircraft Design, sec. 17.9):
//
//   - Speeds: the approach at ApproachEASMS, as true airspeed for the day
//     (V_TAS = V_EAS / sqrt(sigma)); the flare at 1.23/1.3 and touchdown at 1.15/1.3
//     of it (the ratios of 1.23 and 1.15 V_stall to the 1.3 V_stall approach).
//   - Air distance (airLanding): a straight approach at the profile's (fitted)
//     approach angle from 50 ft to the flare height, then a flare arc of radius
//     R = V_f^2 / (0.2 g); over the ground each part shortens by (V - w)/V.
//   - Free roll: FreeRollS seconds at the touchdown ground speed.
//   - Braking roll: m dV/dt = -(D + mu_B BrakingFraction (W cos(slope) - L)
//   - W sin(slope)), idle thrust taken as nil, with the drag polar in ground
//     effect; integrated by groundRun (the same quadrature as the takeoff) from rest
//     to the touchdown ground speed, which is the roll run backwards in time.
//
// Every effect is in the figure: surface and condition (mu_B), slope, wind, density,
// mass. Outside the ISA troposphere, with a credited wind beyond MaxWindFraction of
// the touchdown speed, or outside the Envelope: ErrNoData. When braking does not
// stop the aircraft: ErrCannotStop. Every distance returned is positive and finite.
func (m *LandingPhysicsModel) Land(c Conditions) (LandingResult, error) {
	var r LandingResult
	r.Covers = Effects{Surface: true, Slope: true}
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
	p, l := m.P, m.L
	rho := DensityKgM3(c.PressureAltM, c.TempK)
	sigma := rho / isaDensity0()
	eas := m.ApproachEASMS(c.MassKg)
	r.ApproachIASMS = eas
	vApp := eas / math.Sqrt(sigma)
	vFlare := vApp * flareStallRatio / approachStallRatio
	vTD := vApp * touchdownStallRatio / approachStallRatio
	w := c.HeadwindMS
	if math.Abs(w) > MaxWindFraction*vTD {
		return r, fmt.Errorf("%w: credited wind %.0f kt is beyond what the model answers (half the touchdown speed, %.0f kt)", ErrNoData, math.Abs(w)/knot, MaxWindFraction*vTD/knot)
	}
	air := airLanding(vApp, vFlare, w, l.ApproachAngleDeg*math.Pi/180, screenHeightM)

	ar := p.SpanM * p.SpanM / p.WingAreaM2
	k := 1 / (math.Pi * p.Oswald * ar)
	hb := 16 * p.WingHeightM / p.SpanM
	g := hb * hb / (1 + hb*hb)
	f := &forces{
		massKg: c.MassKg, rho: rho, s: p.WingAreaM2, cl: l.CLGround,
		cd0: l.CD0, kGE: g * k, mu: brakingCoefficient(c.Surface, c.Condition) * l.BrakingFraction,
		slopeRad: math.Atan(c.SlopePct / 100), braking: true,
	}
	f.sinSlope, f.cosSlope = math.Sincos(f.slopeRad)
	step := m.StepMS
	if step <= 0 {
		step = DefaultStepMS
	}
	brake, _, _, err := groundRun(f, w, vTD, vTD, step, nil)
	if err != nil {
		if errors.Is(err, ErrCannotTakeOff) {
			return r, fmt.Errorf("%w: braking does not stop the aircraft here (surface, slope and wind)", ErrCannotStop)
		}
		return r, err
	}
	gr := l.FreeRollS*(vTD-w) + brake
	total := air + gr
	if cal := l.Calibration; cal != nil {
		gr, total = applyFloor(cal.Floor, gr, total) // never shorter than the manual at its points
	}
	if !(gr > 0) || !(air > 0) || math.IsInf(total, 0) || math.IsNaN(total) {
		return r, fmt.Errorf("%w: the model gave no usable distance here (ground roll %.1f m, air %.1f m)", ErrNoData, gr, air)
	}
	r.GroundRollM, r.From50ftM = gr, total
	return r, nil
}

// airLanding is the horizontal distance over the ground from screenM above the
// runway to touchdown (Anderson, Aircraft Performance and Design, eqs. 6.106-6.109;
// Raymer, Aircraft Design, sec. 17.9): a straight approach at angle theta at vApp to
// the flare height, then a flare arc of radius R = V_f^2 / ((n - 1) g), n = 1.2:
//
//	h_f = R (1 - cos theta)
//	S_a = (screen - h_f) / tan theta,   S_f = R sin theta
//
// When the arc alone is higher than the screen, the flare starts on the arc at the
// screen height: S_f = sqrt(h (2R - h)). With headwind w each part is flown at its
// own airspeed, so over the ground it is (V - w)/V of the distance through the air.
func airLanding(vApp, vFlare, w, theta, screenM float64) float64 {
	radius := vFlare * vFlare / ((flareLoadFactor - 1) * StandardGravity)
	hf := radius * (1 - math.Cos(theta))
	if hf >= screenM {
		return math.Sqrt(screenM*(2*radius-screenM)) * (vFlare - w) / vFlare
	}
	sa := (screenM - hf) / math.Tan(theta)
	sf := radius * math.Sin(theta)
	return sa*(vApp-w)/vApp + sf*(vFlare-w)/vFlare
}

// Physical bounds of the two fitted landing figures; a fit ending on one is refused.
//
//   - Approach angle: 2 to 12 degrees. Below 2 degrees no approach is flown (the
//     visual approach slope is 3 degrees: common practice); steeper than 12 degrees is
//     past a light aircraft's power-off glide with full flap (from memory: a glide
//     ratio of about 6, 9.5 degrees).
//   - Braking fraction: 0.15 to 1 of the surface's brakes-on coefficient. At most
//     the coefficient itself; below 0.15 the brakes are barely used (from memory).
const (
	MinApproachAngleDeg = 2.0
	MaxApproachAngleDeg = 12.0
	MinBrakingFraction  = 0.15
	MaxBrakingFraction  = 1.0
)

// Defaults of the physics landing model. The free roll lasts 1 to 3 s depending on
// the pilot (Raymer, quoted in Anderson, Aircraft Performance and Design, sec. 6.8):
// 1 s is taken, the end that leaves the most of the ground roll to braking, so that
// a slippery surface or a thinner air, which lengthen braking, are never
// underestimated from a fit on a dry paved runway. The starting values of the fit
// are from memory and never used on a card by themselves.
const (
	DefaultFreeRollS        = 1.0
	DefaultApproachAngleDeg = 5.0
	DefaultBrakingFraction  = 0.5
)

// LandingCalibration is the fit of a physics landing model to the manual's landing
// figures. A point's GroundRollM is touchdown to a stop, its To50ftM the distance
// from 50 ft to a stop.
type LandingCalibration struct {
	Points                        []CalibrationPoint
	StartAngleDeg, StartBraking   float64    // where the fit started
	ApproachAngleDeg, BrakingFrac float64    // where it ended
	Fits                          []PointFit `json:"-"`
	LargestPct                    float64    `json:"-"`
	BoundHit                      bool       `json:"-"`
	Evaluations                   int        `json:"-"`
	// Floor multiplies the fitted model's distances so that it is never shorter than
	// the manual at these points (floorFactor; LandingPhysicsModel.Land).
	Floor float64
}

// ModelLine is how a card names the landing model.
func (c *LandingCalibration) ModelLine() string {
	if c == nil {
		return "physics, not calibrated"
	}
	noun := "points"
	if len(c.Points) == 1 {
		noun = "point"
	}
	return fmt.Sprintf("physics, calibrated to %d manual landing %s (largest residual %.1f %%%s)", len(c.Points), noun, c.LargestPct, floorText(c.Floor))
}

// usable says why cards may not use the landing calibration c, or nil: it needs a
// point at the maximum landing mass on a paved, dry runway, and an accepted fit.
func (c *LandingCalibration) usable(mlmKg float64) error {
	if c == nil || len(c.Points) == 0 {
		return fmt.Errorf("%w: it has no calibration point", ErrNotCalibrated)
	}
	if c.BoundHit || c.LargestPct > CalibrationTolerancePct {
		return fmt.Errorf("%w: the fit was refused", ErrNotCalibrated)
	}
	for _, p := range c.Points {
		if IsAnchor(p, mlmKg) {
			return nil
		}
	}
	return fmt.Errorf("%w: no landing calibration point is at the maximum landing mass on a paved, dry runway", ErrNotCalibrated)
}

// CalibrateLanding fits the approach angle and the braking fraction of model m to
// the manual's landing points with the machinery of the takeoff fit (fitBounded: the
// sum of squared relative residuals, Nelder-Mead within the physical bounds
// MinApproachAngleDeg...MaxBrakingFraction, deterministic). The approach angle sets
// the air distance, the braking fraction the ground roll: the two figures the manual
// gives per point. The result is never nil when points are given; the error is a
// *FitError when a residual exceeds CalibrationTolerancePct or a figure ends on a
// bound.
func CalibrateLanding(m LandingPhysicsModel, points []CalibrationPoint) (*LandingCalibration, error) {
	if len(points) == 0 {
		return nil, fmt.Errorf("%w: it has no calibration point", ErrNotCalibrated)
	}
	if len(points) > MaxCalibrationPoints {
		return nil, fmt.Errorf("%d calibration points, at most %d", len(points), MaxCalibrationPoints)
	}
	m.Envelope = nil
	m.L.Calibration = nil // the fit is of the bare model: no floor factors
	cal := &LandingCalibration{Points: append([]CalibrationPoint(nil), points...), StartAngleDeg: m.L.ApproachAngleDeg, StartBraking: m.L.BrakingFraction}
	params := []fitParam{
		{"approach angle", m.L.ApproachAngleDeg, MinApproachAngleDeg, MaxApproachAngleDeg},
		{"braking fraction", m.L.BrakingFraction, MinBrakingFraction, MaxBrakingFraction},
	}
	set := func(v []float64) { m.L.ApproachAngleDeg, m.L.BrakingFraction = v[0], v[1] }
	cost := func() float64 {
		cal.Evaluations++
		sum := 0.0
		for _, p := range points {
			r, err := m.Land(p.Conditions)
			sum = addSquares(sum, [2]float64{r.GroundRollM, r.From50ftM}, [2]float64{p.GroundRollM, p.To50ftM}, err)
		}
		return sum
	}
	vals, err := fitBounded(params, set, cost)
	if err != nil {
		return cal, err
	}
	cal.ApproachAngleDeg, cal.BrakingFrac = vals[0], vals[1]
	var fe FitError
	cal.Fits, cal.LargestPct, fe.Problems = residuals(len(points),
		func(i int) ([2]float64, error) {
			r, err := m.Land(points[i].Conditions)
			return [2]float64{r.GroundRollM, r.From50ftM}, err
		},
		func(i int) [2]float64 { return [2]float64{points[i].GroundRollM, points[i].To50ftM} },
		[2]string{"ground_roll", "from_50ft"})
	cal.Floor = floorFactor(cal.Fits, func(i int) [2]float64 { return [2]float64{points[i].GroundRollM, points[i].To50ftM} })
	var bp []FitProblem
	cal.BoundHit, bp = boundProblems(params, vals, "the description (landing flap CLmax, drag, approach speed) does not match the manual's landing figures")
	fe.Problems = append(fe.Problems, bp...)
	if len(fe.Problems) > 0 {
		return cal, &fe
	}
	return cal, nil
}

// LandingMasses are the weights a landing side shows: the maximum landing mass, then
// every card weight below it, heaviest first, at most n. A card weight above the
// maximum landing mass is not a landing weight (it would be all beyond limits).
func LandingMasses(a *Aircraft, weightsKg []float64, n int) []float64 {
	if a.Landing == nil {
		return nil
	}
	mlm := a.Landing.MaxMassKg
	out := []float64{mlm}
	for _, w := range weightsKg {
		if w < mlm-0.5 {
			out = append(out, w)
		}
	}
	// weightsKg is heaviest first; keep that order after the MLM.
	for i := 1; i < len(out); i++ {
		for j := i; j > 1 && out[j] > out[j-1]; j-- {
			out[j], out[j-1] = out[j-1], out[j]
		}
	}
	if n > 0 && len(out) > n {
		out = out[:n]
	}
	return out
}

// MemoLanding wraps a landing model so that the questions a card file asks more than
// once are answered once, as Memo does for takeoff: the paved, dry, level reference
// figures (the floor under a model that covers surface or slope), the same for every
// runway end of an airfield, and the dry figures of an unpaved runway, which its wet
// side asks again. Not safe for concurrent use.
func MemoLanding(m LandingModel) LandingModel {
	if _, ok := m.(*landingMemo); ok {
		return m
	}
	return &landingMemo{m: m, seen: make(map[memoKey]landingMemoEntry, 256)}
}

type landingMemoEntry struct {
	r   LandingResult
	err error
}

type landingMemo struct {
	m    LandingModel
	seen map[memoKey]landingMemoEntry
}

func (mm *landingMemo) Land(c Conditions) (LandingResult, error) {
	if !askedAgain(c) {
		return mm.m.Land(c)
	}
	k, known := keyOf(c)
	if !known {
		return mm.m.Land(c)
	}
	if e, ok := mm.seen[k]; ok {
		return e.r, e.err
	}
	r, err := mm.m.Land(c)
	mm.seen[k] = landingMemoEntry{r, err}
	return r, err
}

// WindFactoringIncluded passes the wrapped model's answer through.
func (mm *landingMemo) WindFactoringIncluded() bool { return LandingWindFactoringIncluded(mm.m) }

// Unwrap is the memoized model.
func (mm *landingMemo) Unwrap() LandingModel { return mm.m }
