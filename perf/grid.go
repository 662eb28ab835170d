package perf

import (
	"errors"
	"fmt"
	"math"
	"strconv"
	"strings"
)

// State is the verdict of one grid cell.
type State int

// Cell states, from best to worst. A cell takes the worst state any of its checks gives.
const (
	Go           State = iota // fits, with the card's margin to spare
	Tight                     // fits, but within the card's margin
	NoGo                      // required distance exceeds the distance available, or no takeoff at all (Cell.CannotTakeOff)
	NoData                    // outside the model's data: no figure is given
	BeyondLimits              // past a declared limit of the profile: MTOW, tailwind, crosswind limit, operating temperature
)

var stateNames = [...]string{"go", "tight", "no-go", "no-data", "beyond-limits"}

func (s State) String() string {
	if int(s) < len(stateNames) {
		return stateNames[s]
	}
	return fmt.Sprintf("State(%d)", int(s))
}

// States lists every state, best first.
func States() []State { return []State{Go, Tight, NoGo, NoData, BeyondLimits} }

// DefaultTightMargin is the spare margin a card asks for before a cell is "go": the
// required distance plus 10 % must fit (common practice for a quick-reference card;
// the card template may change it).
const DefaultTightMargin = 0.10

// Case is one question: this aircraft, this runway end, these conditions.
type Case struct {
	Aircraft     *Aircraft
	Model        Model
	Policy       Policy
	End          RunwayEnd
	PressureAltM float64
	TempK        float64
	MassKg       float64
	Wind         Components // reported components, before any factoring
	TightMargin  float64
	// Rounding is how the figures are printed; the state is decided from the printed
	// figures (the zero value: whole metres).
	Rounding Rounding
	// ObstacleMarginM is the clearance the end's obstacles must be passed by; zero
	// or less means DefaultObstacleMarginM (a margin of nothing is never meant).
	ObstacleMarginM float64
	// Climb is the profile's climb model for the obstacle check; nil means
	// ClimbFor(Aircraft), asked only when the end lists obstacles.
	Climb ClimbModel
}

// obstacleMargin is the margin the case asks for (ObstacleMargin).
func (k Case) obstacleMargin() float64 { return ObstacleMargin(k.ObstacleMarginM) }

// Cell is the answer to a Case.
type Cell struct {
	TempK          float64
	HeadwindMS     float64 // reported component; negative = tailwind
	CrosswindMS    float64 // reported gust crosswind used for the limit
	MassKg         float64
	CreditedWindMS float64 // after factoring, what the model used
	State          State

	// Unfactored model output (0 when none).
	GroundRollM  float64
	To50ftM      float64
	AccelCheckM  float64
	LiftoffTASMS float64

	Requirement Requirement
	RequiredM   float64 // of the limiting declared distance
	AvailableM  float64
	Limiting    string  // TORA, TODA or ASDA
	HasDistance bool    // a required distance was computed
	Covers      Effects // what the model's figure already includes

	// The figures as printed, in Rounding's unit: the required distance rounded up,
	// the available distance rounded down. The state is decided from these.
	ShownRequired  float64
	ShownAvailable float64
	ShownUnit      string

	// CannotTakeOff is set when the model finds no takeoff at all (no acceleration to
	// lift-off speed, or no climb): a no-go without a figure.
	CannotTakeOff bool

	// The obstacle check, when the runway end lists obstacles and the takeoff has a
	// figure (HasClimb): the climb used (ObstacleClimb), and the obstacle passed with
	// the least clearance. ObstacleNoGo is set when the cell fits the declared
	// distances but does not clear an obstacle by the margin.
	HasClimb      bool
	ClimbRateMS   float64
	ClimbGradient float64 // over the ground, with the credited wind (a fraction)
	Clearance     Clearance
	ObstacleNoGo  bool

	reasons []reason
}

// reason is why a cell has its state, kept as numbers and formatted only when asked:
// a season's cards hold millions of cells and print none of these sentences.
type reason struct {
	kind       reasonKind
	a, b, c, d float64
	s          string
	unit       string
}

type reasonKind int

const (
	reasonText reasonKind = iota
	reasonMTOW
	reasonTailwind
	reasonCrosswind
	reasonDemonstrated
	reasonTemperature
	reasonNoGo
	reasonTight
	reasonObstacle       // a: clearance ft, b: margin ft, c: height m, d: distance past the end, s: note
	reasonObstacleBefore // a: TOD, b: margin ft, c: height m, d: distance past the end, s: note
	reasonNoClimb        // a: rate m/s, b: still-air gradient, c: pressure altitude m, d: temperature K, unit: climb speed kt
	reasonClimbOutside   // a: pressure altitude m, b: temperature K, c: mass kg
)

func (r reason) String() string {
	switch r.kind {
	case reasonMTOW:
		return fmt.Sprintf("weight %s kg above MTOW %s kg", passedText(r.a, r.b), limitText(r.b))
	case reasonTailwind:
		return fmt.Sprintf("tailwind %s kt above the %s kt limit", passedText(r.a/knot, r.b/knot), limitText(r.b/knot))
	case reasonCrosswind:
		return fmt.Sprintf("crosswind %s kt above the %s kt limit", passedText(r.a/knot, r.b/knot), limitText(r.b/knot))
	case reasonDemonstrated:
		return fmt.Sprintf("crosswind %s kt above the demonstrated %s kt (advisory, not a limit of the profile)", passedText(r.a/knot, r.b/knot), limitText(r.b/knot))
	case reasonTemperature:
		t, lo, hi := r.a-273.15, r.b-273.15, r.c-273.15
		switch {
		case r.b == 0:
			return fmt.Sprintf("temperature %s C above the declared limit %s C", passedText(t, hi), limitText(hi))
		case r.c == 0:
			return fmt.Sprintf("temperature %s C below the declared limit %s C", passedText(t, lo), limitText(lo))
		}
		lim := lo
		if t > hi {
			lim = hi
		}
		return fmt.Sprintf("temperature %s C outside the declared limits %s to %s C", passedText(t, lim), limitText(lo), limitText(hi))
	case reasonNoGo:
		return fmt.Sprintf("%s: %.0f %s required, %.0f %s available", r.s, r.a, r.unit, r.b, r.unit)
	case reasonTight:
		return fmt.Sprintf("%s: %.0f %s required, %.0f %s available, less than %.0f %% spare", r.s, r.a, r.unit, r.b, r.unit, r.c*100)
	case reasonObstacle:
		if r.a < 0 {
			return fmt.Sprintf("%s %s: %.0f ft below its top, %.0f ft clearance required", obstacleName(r.c, r.s), obstacleWhere(r.d, r.unit), -r.a, r.b)
		}
		return fmt.Sprintf("%s %s: %.0f ft clearance, %.0f ft required", obstacleName(r.c, r.s), obstacleWhere(r.d, r.unit), r.a, r.b)
	case reasonNoClimb:
		return fmt.Sprintf("no takeoff: the manual's rate of climb at %s kt is %.0f ft/min at %.0f ft, %.0f C, a still-air gradient of %.1f %%, under the %.1f %% counted as a climb",
			r.unit, r.a/footM*60, r.c/footM, r.d-273.15, r.b*100, minClimbGradient*100)
	case reasonClimbOutside:
		return fmt.Sprintf("the climb table has no rate at %.0f ft, %.0f C, %.0f kg: the no-climb check does not apply here (kneeprint never extrapolates a table)", r.a/footM, r.b-273.15, r.c)
	case reasonObstacleBefore:
		return fmt.Sprintf("%s %s stands before the 50 ft point (takeoff distance %.0f %s from the start of the run): %.0f ft clearance required", obstacleName(r.c, r.s), obstacleWhere(r.d, r.unit), r.a, r.unit, r.b)
	}
	return r.s
}

// passedText prints a value v that lies beyond a limit lim (both in the printing
// unit) in whole units, unless whole units would not show it beyond the limit (15.3 kt
// printed "15" above a 15 kt limit): then with one decimal, rounded away from the
// limit ("15.3", and "15.1" for 15.04). A reason never reads "15 kt above 15 kt".
func passedText(v, lim float64) string { return string(appendPassed(nil, v, lim)) }

// appendPassed appends passedText(v, lim) to b.
func appendPassed(b []byte, v, lim float64) []byte {
	if w := math.Round(v); (v > lim && w > lim) || (v < lim && w < lim) {
		return strconv.AppendFloat(b, w, 'f', 0, 64)
	}
	if v > lim {
		return strconv.AppendFloat(b, math.Ceil(v*10-1e-9)/10, 'f', 1, 64)
	}
	return strconv.AppendFloat(b, math.Floor(v*10+1e-9)/10, 'f', 1, 64)
}

// limitText prints a limit as written in a profile: whole units, or one decimal when
// it has one (17.5 kt).
func limitText(v float64) string {
	s := strconv.FormatFloat(v, 'f', 1, 64)
	return strings.TrimSuffix(s, ".0")
}

// Reasons says, in words, why the cell has its state: limits passed, the limiting
// declared distance, notes from the model.
func (c *Cell) Reasons() []string {
	out := make([]string, len(c.reasons))
	for i, r := range c.reasons {
		out[i] = r.String()
	}
	return out
}

// decide sets the cell's required and available distances from the requirement's
// limiting check and its verdict from the figures as printed (rnd: required rounded
// up, available down): no-go when the printed figure is longer than the printed
// declared distance, tight when it fits with less than the margin to spare. The
// takeoff and the landing decide alike.
func (c *Cell) decide(req *Requirement, rnd Rounding, margin float64) {
	c.RequiredM, c.AvailableM, c.Limiting = req.Limiting.RequiredM, req.Limiting.AvailableM, req.Limiting.Declared
	c.HasDistance = true
	c.ShownRequired, c.ShownAvailable, c.ShownUnit = rnd.Up(c.RequiredM), rnd.Down(c.AvailableM), rnd.UnitName()
	r := reason{s: c.Limiting, a: c.ShownRequired, b: c.ShownAvailable, c: margin, unit: c.ShownUnit}
	switch {
	case c.ShownRequired > c.ShownAvailable:
		r.kind = reasonNoGo
		c.worsen(NoGo, r)
	case c.ShownRequired*(1+margin) > c.ShownAvailable+1e-9:
		r.kind = reasonTight
		c.worsen(Tight, r)
	}
}

// limits marks the profile's limits the cell passes, takeoff and landing alike: a
// tailwind (along the runway, negative: the gust for a tailwind) past max_tailwind,
// a crosswind past a declared max_crosswind (beyond limits) or past the demonstrated
// one (advisory: a reason, no state), a temperature past a declared operating limit.
func (c *Cell) limits(a *Aircraft, along, tempK float64) {
	if tail := -along; tail > a.MaxTailwindMS+1e-9 {
		c.worsen(BeyondLimits, reason{kind: reasonTailwind, a: tail, b: a.MaxTailwindMS})
	}
	switch {
	case a.HasMaxCrosswind && c.CrosswindMS > a.MaxCrosswindMS+1e-9:
		c.worsen(BeyondLimits, reason{kind: reasonCrosswind, a: c.CrosswindMS, b: a.MaxCrosswindMS})
	case a.DemonstratedCrosswindMS > 0 && c.CrosswindMS > a.DemonstratedCrosswindMS+1e-9:
		c.reasons = append(c.reasons, reason{kind: reasonDemonstrated, a: c.CrosswindMS, b: a.DemonstratedCrosswindMS})
	}
	if (a.MaxTempK > 0 && tempK > a.MaxTempK+1e-9) || (a.MinTempK > 0 && tempK < a.MinTempK-1e-9) {
		c.worsen(BeyondLimits, reason{kind: reasonTemperature, a: tempK, b: a.MinTempK, c: a.MaxTempK})
	}
}

func (c *Cell) worsen(s State, r reason) {
	if s > c.State {
		c.State = s
	}
	c.reasons = append(c.reasons, r)
}

// Evaluate answers one Case: limits, wind factoring, the model (twice when the policy
// needs a paved, dry, level reference), the policy, and the cell's state.
//
// Marks mean one thing:
//   - beyond limits: a real limit of the profile is passed (weight above MTOW, tailwind
//     past its limit, crosswind past a declared max_crosswind, temperature past a
//     declared operating limit);
//   - no data: the model holds no answer (a table's hottest column passed, ...);
//   - no-go without a figure (CannotTakeOff): the model finds no takeoff at all;
//   - no-go, tight, go: decided from the figures as printed (k.Rounding).
//
// The demonstrated crosswind is advisory: passing it adds a reason, not a state.
// On a wet unpaved runway the requirement is never below the dry one (common
// practice: water never shortens a takeoff on grass or gravel, whatever the notes).
func Evaluate(k Case) Cell {
	var c Cell
	x := cellCtx{er: k.Policy.forEnd(k.End)}
	x.evaluate(&k, &c)
	return c
}

// cellCtx is what the cells of one grid share: the policy worked out for the runway
// end (er) and for its dry twin, which a wet unpaved cell is compared with (dry,
// worked out when first needed), and the arena the cells' slices are cut from (nil:
// each allocated on its own).
type cellCtx struct {
	er, dry *endRules
	a       *arena
}

// evaluate is Evaluate writing into c, which it overwrites whole.
func (x *cellCtx) evaluate(k *Case, c *Cell) {
	x.evaluateCell(k, c)
	if len(c.reasons) == 0 {
		c.reasons = nil // as a cell without reasons always was
	}
}

func (x *cellCtx) evaluateCell(k *Case, c *Cell) {
	a := k.Aircraft
	*c = Cell{TempK: k.TempK, HeadwindMS: k.Wind.HeadwindMS, CrosswindMS: math.Abs(k.Wind.GustCrosswindMS), MassKg: k.MassKg,
		reasons: x.a.reasons(3)}
	if k.MassKg > a.MTOWKg+1e-9 {
		c.worsen(BeyondLimits, reason{kind: reasonMTOW, a: k.MassKg, b: a.MTOWKg})
	}
	// The along-runway wind for the tailwind limit and the distance: the gust for a
	// tailwind, the steady wind for a headwind (Components.ForDistanceMS).
	along := k.Wind.ForDistanceMS()
	c.limits(a, along, k.TempK)

	if err := k.Policy.CheckSlope(k.End.SlopePct); err != nil { // no published correction
		c.worsen(NoData, reason{s: err.Error()})
		return
	}
	// The manual's climb counts on every cell, obstacles or not: where its rate gives
	// no climb (a still-air gradient under minClimbGradient, the physics model's own
	// threshold) there is no takeoff. Outside the climb table's data the check does
	// not apply, and a cell with a figure says so below.
	rate, grad, climbInside := a.Climb.stillAirClimb(k.PressureAltM, k.TempK, k.MassKg)
	if climbInside && grad < minClimbGradient {
		c.CannotTakeOff = true
		c.worsen(NoGo, reason{kind: reasonNoClimb, a: rate, b: grad, c: k.PressureAltM, d: k.TempK, unit: strconv.FormatFloat(math.Round(a.Climb.SpeedIASMS/knot), 'f', -1, 64)})
		return
	}
	c.CreditedWindMS = CreditedWindMS(along, WindFactoringIncluded(k.Model))
	cond := Conditions{
		PressureAltM: k.PressureAltM, TempK: k.TempK, MassKg: k.MassKg,
		HeadwindMS: c.CreditedWindMS, SlopePct: k.End.SlopePct,
		Surface: k.End.Surface, Condition: k.End.Condition,
	}
	req := &c.Requirement
	actual, err := x.takeoff(k, x.er, k.End, cond, req)
	if err == nil && cond.Surface != Paved && cond.Condition == Wet {
		dryCond := cond
		dryCond.Condition = Dry
		dryEnd := k.End
		dryEnd.Condition = Dry
		if x.dry == nil {
			x.dry = k.Policy.forEnd(dryEnd)
		}
		var dry Requirement
		if _, derr := x.takeoff(k, x.dry, dryEnd, dryCond, &dry); derr == nil && dry.FactoredTODM > req.FactoredTODM {
			*req = dry
			c.reasons = append(c.reasons, reason{s: "wet figure raised to the dry one: wet is never shorter than dry"})
		}
	}
	if err != nil {
		switch {
		case errors.Is(err, ErrCannotTakeOff):
			c.CannotTakeOff = true
			c.worsen(NoGo, reason{s: err.Error()})
		default: // ErrNoData, and anything unexpected: never a figure
			c.worsen(NoData, reason{s: err.Error()})
		}
		*req = Requirement{}
		return
	}
	c.GroundRollM, c.To50ftM, c.AccelCheckM, c.LiftoffTASMS = actual.GroundRollM, actual.To50ftM, actual.AccelCheckM, actual.LiftoffTASMS
	c.Covers = actual.Covers
	for _, n := range actual.Notes {
		c.reasons = append(c.reasons, reason{s: n})
	}
	c.decide(req, k.Rounding, k.TightMargin)
	if !climbInside && a.Climb != nil && a.Climb.Table != nil {
		c.reasons = append(c.reasons, reason{kind: reasonClimbOutside, a: k.PressureAltM, b: k.TempK, c: k.MassKg})
	}
	if len(k.End.Obstacles) > 0 {
		c.obstacles(*k, req.FactoredTODM, along)
	}
}

// obstacles is the obstacle check of a cell with a takeoff figure (issue 12): the
// climb from the 50 ft point at the takeoff distance todM, with the wind along (the
// reported component, credited as for the takeoff), past every obstacle of the end.
//
// The takeoff distance is the model's distance to 50 ft with the surface and slope
// effects (the policy's factors for what the model does not include, as in
// Requirement.FactoredTODM) but without the overall safety factor: where the
// aircraft really is at 50 ft. The required margin stands in for the safety factor.
//
// A cell that does not clear an obstacle by the margin (decided from the printed
// feet: clearance rounded down, margin rounded up) is no-go, with one reason per
// obstacle. Without climb data the cell has no data, unless it is already no-go by
// its distance (a runway too short needs no climb to be refused).
func (c *Cell) obstacles(k Case, todM, along float64) {
	fits := c.State <= Tight
	cm := k.Climb
	var err error
	if cm == nil {
		cm, err = ClimbFor(k.Aircraft)
	}
	var cr ClimbResult
	var g float64
	margin := k.obstacleMargin()
	if err == nil {
		cr, g, err = ObstacleClimb(cm, k.End, k.PressureAltM, k.TempK, k.MassKg, along, margin)
	}
	if err != nil {
		r := reason{s: obstacleReasonPrefix + err.Error()}
		switch {
		case errors.Is(err, ErrCannotTakeOff):
			c.worsen(NoGo, r)
			c.ObstacleNoGo = fits
		case fits:
			c.worsen(NoData, r)
		default:
			c.reasons = append(c.reasons, r)
		}
		return
	}
	for _, n := range cr.Notes {
		c.reasons = append(c.reasons, reason{s: "climb: " + n})
	}
	c.HasClimb, c.ClimbRateMS, c.ClimbGradient = true, cr.RateMS, g
	marginFt := shownMarginFt(margin)
	for i, o := range k.End.Obstacles {
		cl := ObstacleClearance(k.End, o, todM, g)
		cl.Obstacle = i
		if i == 0 || cl.ClearanceM < c.Clearance.ClearanceM {
			c.Clearance = cl
		}
		r := reason{b: marginFt, c: o.HeightM, d: k.Rounding.Down(o.PastEndM), s: o.Note, unit: k.Rounding.UnitName()}
		switch {
		case cl.BeforeScreen:
			r.kind, r.a = reasonObstacleBefore, k.Rounding.Up(todM)
		case shownClearanceFt(cl.ClearanceM) < marginFt:
			r.kind, r.a = reasonObstacle, shownClearanceFt(cl.ClearanceM)
		default:
			continue
		}
		c.worsen(NoGo, r)
		c.ObstacleNoGo = fits
	}
}

// ObstacleReasons are the reasons, in words, of the obstacles the cell does not clear
// by the margin (and why the obstacle check had no figure, when it had none): empty
// when no obstacle stops the cell.
func (c *Cell) ObstacleReasons() []string {
	var out []string
	for _, r := range c.reasons {
		if r.kind == reasonObstacle || r.kind == reasonObstacleBefore || (r.kind == reasonText && strings.HasPrefix(r.s, obstacleReasonPrefix)) {
			out = append(out, r.String())
		}
	}
	return out
}

// obstacleReasonPrefix starts the reason of an obstacle check that had no figure.
const obstacleReasonPrefix = "obstacle clearance: "

// takeoff asks the model for conditions cond (and, when the model covers surface or
// slope, for the paved, dry, level reference) and applies the policy worked out for
// runway end e (er), writing the requirement into req. A model's contract is a
// positive, finite distance: any other answer is no data, never a printed figure.
func (x *cellCtx) takeoff(k *Case, er *endRules, e RunwayEnd, cond Conditions, req *Requirement) (Result, error) {
	actual, err := k.Model.Takeoff(cond)
	if err != nil {
		return actual, err
	}
	ref := actual
	if (actual.Covers.Surface || actual.Covers.Slope) && !isReference(cond) {
		refCond := cond
		refCond.Surface, refCond.Condition, refCond.SlopePct = Paved, Dry, 0
		if ref, err = k.Model.Takeoff(refCond); err != nil {
			return actual, err
		}
	}
	if !(usable(actual) && usable(ref)) {
		return actual, fmt.Errorf("%w: the model gave no usable distance (%.1f m, %.1f m)", ErrNoData, actual.GroundRollM, actual.To50ftM)
	}
	er.require(actual, ref, e, x.a, req)
	return actual, nil
}

// usable reports whether r's distances are positive and finite, the ground roll
// not longer than the distance to 50 ft.
func usable(r Result) bool {
	return r.GroundRollM > 0 && r.To50ftM >= r.GroundRollM && !math.IsInf(r.To50ftM, 0) && !math.IsNaN(r.AccelCheckM)
}

func isReference(c Conditions) bool {
	return c.Surface == Paved && c.Condition == Dry && c.SlopePct == 0
}

// GridSpec is the axes and assumptions of a grid.
type GridSpec struct {
	TempsK      []float64 // columns
	HeadwindsMS []float64 // rows: reported along-runway wind, tailwind negative
	WeightsKg   []float64 // one block per weight
	QNHPa       float64   // the QNH assumed (a conservative low value)
	TightMargin float64
	Rounding    Rounding // how figures are printed; states follow the printed figures
	// ObstacleMarginM is the clearance obstacles must be passed by; zero means
	// DefaultObstacleMarginM.
	ObstacleMarginM float64
}

// Limits on a grid's size: a card holds far fewer cells; larger requests are mistakes.
const (
	MaxGridTemps   = 24
	MaxGridWinds   = 16
	MaxGridWeights = 8
)

// Grid is the computed grid for one runway end.
type Grid struct {
	Spec         GridSpec
	End          RunwayEnd
	ElevationM   float64 // the elevation used: TakeoffElevationM
	PressureAltM float64 // at Spec.QNHPa and ElevationM
	Policy       Policy
	Cells        [][][]Cell // [weight][wind][temperature]
	// Landing is true for a grid of landing distances against the LDA
	// (ComputeLandingGrid); its cells' To50ftM is then the distance from 50 ft.
	Landing bool
}

// DefaultGridSpec is 0 to 35 C by 5, tailwind 10 kt to headwind 20 kt by 5, the
// profile's weights, QNH 1000 hPa, and the default tight margin.
func DefaultGridSpec(a *Aircraft) GridSpec {
	var temps, winds []float64
	for c := 0.0; c <= 35; c += 5 {
		temps = append(temps, c+273.15)
	}
	for kt := -10.0; kt <= 20; kt += 5 {
		winds = append(winds, kt*knot)
	}
	return GridSpec{TempsK: temps, HeadwindsMS: winds, WeightsKg: a.WeightsKg, QNHPa: 100000, TightMargin: DefaultTightMargin, ObstacleMarginM: DefaultObstacleMarginM}
}

// ComputeGrid evaluates every cell of spec for runway end e of airfield f. The
// pressure altitude comes from the assumed QNH at the highest of the aerodrome
// elevation and the runway's threshold elevations (TakeoffElevationM).
func ComputeGrid(a *Aircraft, m Model, p Policy, f Airfield, e RunwayEnd, spec GridSpec) (*Grid, error) {
	if len(spec.TempsK) == 0 || len(spec.HeadwindsMS) == 0 || len(spec.WeightsKg) == 0 {
		return nil, errors.New("grid: every axis needs at least one value")
	}
	if len(spec.TempsK) > MaxGridTemps || len(spec.HeadwindsMS) > MaxGridWinds || len(spec.WeightsKg) > MaxGridWeights {
		return nil, fmt.Errorf("grid: at most %d temperatures, %d winds and %d weights", MaxGridTemps, MaxGridWinds, MaxGridWeights)
	}
	if !(spec.QNHPa >= MinQNHPa && spec.QNHPa <= MaxQNHPa) { // the range check accepts too
		return nil, fmt.Errorf("grid: QNH %.1f hPa outside 800 to 1100 hPa", spec.QNHPa/100)
	}
	if err := spec.Rounding.Validate(); err != nil {
		return nil, fmt.Errorf("grid: %w", err)
	}
	for _, w := range spec.WeightsKg {
		if err := CheckMass(a, w); err != nil {
			return nil, fmt.Errorf("grid: %w", err)
		}
	}
	for _, t := range spec.TempsK {
		if err := CheckTemp(t); err != nil {
			return nil, fmt.Errorf("grid: %w", err)
		}
	}
	g := &Grid{Spec: spec, End: e, ElevationM: TakeoffElevationM(f, e), Policy: p}
	var climb ClimbModel
	if len(e.Obstacles) > 0 {
		climb, _ = ClimbFor(a) // nil: each cell says why (Cell.obstacles)
	}
	g.PressureAltM = PressureAltitudeFromQNH(spec.QNHPa, g.ElevationM)
	g.Cells = gridCells(len(spec.WeightsKg), len(spec.HeadwindsMS), len(spec.TempsK))
	// Every cell as Evaluate answers it (TestGridCellsAsEvaluate), with what the
	// cells share worked out once.
	x := cellCtx{er: p.forEnd(e), a: newArena(len(spec.WeightsKg) * len(spec.HeadwindsMS) * len(spec.TempsK))}
	k := Case{Aircraft: a, Model: m, Policy: p, End: e, PressureAltM: g.PressureAltM, TightMargin: spec.TightMargin,
		Rounding: spec.Rounding, ObstacleMarginM: spec.ObstacleMarginM, Climb: climb}
	for wi, w := range spec.WeightsKg {
		for hi, h := range spec.HeadwindsMS {
			for ti, t := range spec.TempsK {
				k.TempK, k.MassKg, k.Wind = t, w, Components{HeadwindMS: h}
				x.evaluate(&k, &g.Cells[wi][hi][ti])
			}
		}
	}
	return g, nil
}

// gridCells makes a grid's [weight][wind][temperature] cells in one piece.
func gridCells(nw, nh, nt int) [][][]Cell {
	all := make([]Cell, nw*nh*nt)
	rows := make([][]Cell, nw*nh)
	out := make([][][]Cell, nw)
	for wi := range out {
		out[wi] = rows[wi*nh : (wi+1)*nh : (wi+1)*nh]
		for hi := range out[wi] {
			i := (wi*nh + hi) * nt
			out[wi][hi] = all[i : i+nt : i+nt]
		}
	}
	return out
}
