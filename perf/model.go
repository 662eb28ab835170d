package perf

import (
	"errors"
	"fmt"
	"math"
)

// ErrNoData marks a question outside the data a model holds (a table's axes, the ISA
// troposphere, a correction the manual does not give). The answer is "no data", never
// an extrapolated number.
var ErrNoData = errors.New("no data")

// ErrCannotTakeOff marks conditions in which the model says the aircraft does not
// reach lift-off speed or cannot climb: a no-go, not a gap in the data.
var ErrCannotTakeOff = errors.New("cannot take off")

// Conditions are the conditions of one takeoff, in SI.
type Conditions struct {
	PressureAltM float64
	TempK        float64 // outside air temperature
	MassKg       float64
	// HeadwindMS is the along-runway wind the model uses, after any wind factoring
	// (see CreditedWindMS); negative is a tailwind.
	HeadwindMS float64
	SlopePct   float64 // uphill positive
	Surface    Surface
	Condition  Condition
}

// Effects says which conditions a model's figures include. Effects a model does not
// include are left to the safety policy's published factors; effects it does include
// are never factored a second time.
type Effects struct {
	Surface bool // the surface and its condition
	Slope   bool
}

// Result is a model's answer, unfactored.
type Result struct {
	GroundRollM float64 // start of roll to lift-off
	To50ftM     float64 // start of roll to 50 ft (15 m) above the runway
	// AccelCheckM is the distance from the start of the roll by which 70 % of the
	// lift-off airspeed should be reached (FAA AIM runway half-way guidance).
	AccelCheckM  float64
	LiftoffTASMS float64 // lift-off true airspeed, 0 when the model does not know it
	Covers       Effects
	Notes        []string // what the model assumed (a clamped axis, a correction applied)
}

// Model is a takeoff model: the handbook table and the physics integration both
// satisfy it; the grid and the check see only this.
type Model interface {
	Takeoff(Conditions) (Result, error)
}

// windFactored is implemented by models whose data may already include the 50 %/150 %
// wind factoring.
type windFactored interface {
	WindFactoringIncluded() bool
}

// WindFactoringIncluded reports whether model m's data already factor the wind.
func WindFactoringIncluded(m Model) bool {
	wf, ok := m.(windFactored)
	return ok && wf.WindFactoringIncluded()
}

// ModelLine names the model a profile's figures come from, as a card and a report
// print it: "flight-manual table", or "physics, calibrated to 4 manual points (largest
// residual 1.3 %)".
func ModelLine(a *Aircraft) string {
	if a.Model == ModelPhysics && a.Physics != nil {
		return a.Physics.Calibration.ModelLine()
	}
	return "flight-manual table"
}

// LandingModelLine names the model a profile's landing figures come from: "flight-manual
// table", or the physics landing model with its calibration; "" without landing data.
func LandingModelLine(a *Aircraft) string {
	switch {
	case a.Landing == nil:
		return ""
	case a.Landing.Model == ModelPhysics && a.Landing.Physics != nil:
		return a.Landing.Physics.Calibration.ModelLine()
	}
	return "flight-manual table"
}

// ModelFor returns the takeoff model the aircraft's profile selects.
func ModelFor(a *Aircraft) (Model, error) {
	switch a.Model {
	case ModelTable:
		if a.Table == nil {
			return nil, fmt.Errorf("aircraft %q: table model selected but no table", a.Name)
		}
		return &TableModel{Table: a.Table, LiftoffIASMS: a.RotateIASMS}, nil
	case ModelPhysics:
		if a.Physics == nil {
			return nil, fmt.Errorf("aircraft %q: physics model selected but no physics section", a.Name)
		}
		if err := a.Physics.Calibration.usable(a.MTOWKg); err != nil {
			return nil, fmt.Errorf("aircraft %q: %w. A model nobody held against the aircraft's own figures can be optimistic by as much as the whole safety factor, so it gives no card and no answer. "+
				"Add under physics a calibration list with at least the flight manual's takeoff figures at sea level, MTOW, paved dry, e.g.\n"+
				"  calibration:\n    - {pressure_altitude: 0 ft, temperature: 15 C, weight: %.0f kg, ground_roll: ... m, to_50ft: ... m}\n"+
				"and check the fit with kneeprint validate", a.Name, err, a.MTOWKg)
		}
		m := &PhysicsModel{P: *a.Physics, RotateIASMS: a.RotateIASMS, At50ftIASMS: a.At50ftIASMS}
		if a.Table != nil {
			// The physics was fitted to the table too: never used beyond its range.
			m.Envelope = TableEnvelope(a.Table)
		}
		return m, nil
	}
	return nil, fmt.Errorf("aircraft %q: unknown model %q", a.Name, a.Model)
}

// Memo wraps a model so that the questions a card file asks more than once are
// answered once: the paved, dry, level reference figures, the same for every runway
// end of an airfield (a grid asks them for every cell when the model covers surface
// or slope), and the dry figures of an unpaved runway, which its wet page asks again
// for every cell (wet is never shorter than dry). Other questions pass straight
// through: storing every answer costs more than the few it would save. The answers
// are the wrapped model's, shared (a Result's Notes are read, never changed). Not
// safe for concurrent use: make one per goroutine.
func Memo(m Model) Model {
	if _, ok := m.(*memo); ok {
		return m
	}
	return &memo{m: m, seen: make(map[memoKey]memoEntry, 256)}
}

// askedAgain reports whether a card file asks the question c more than once (see
// Memo): the paved, dry, level reference, or dry on an unpaved surface.
func askedAgain(c Conditions) bool {
	return isReference(c) || (c.Surface != Paved && c.Condition == Dry)
}

// memoKey is a question's conditions as bits: hashed as plain memory, much faster
// than the float and string fields of Conditions (a map key per grid cell). Two
// questions share a key exactly when their conditions are the same bits.
type memoKey struct {
	pa, temp, mass, wind, slope uint64
	surface, cond               uint8
}

// keyOf is c's key; ok is false for a surface or condition kneeprint does not know,
// which is then not memoized (it has no code of its own).
func keyOf(c Conditions) (k memoKey, ok bool) {
	k = memoKey{pa: math.Float64bits(c.PressureAltM), temp: math.Float64bits(c.TempK), mass: math.Float64bits(c.MassKg),
		wind: math.Float64bits(c.HeadwindMS), slope: math.Float64bits(c.SlopePct)}
	switch c.Surface {
	case Paved:
		k.surface = 1
	case Grass:
		k.surface = 2
	case Gravel:
		k.surface = 3
	default:
		return k, false
	}
	switch c.Condition {
	case Dry:
		k.cond = 1
	case Wet:
		k.cond = 2
	default:
		return k, false
	}
	return k, true
}

type memoEntry struct {
	r   Result
	err error
}

type memo struct {
	m    Model
	seen map[memoKey]memoEntry
}

func (mm *memo) Takeoff(c Conditions) (Result, error) {
	if !askedAgain(c) {
		return mm.m.Takeoff(c)
	}
	k, known := keyOf(c)
	if !known {
		return mm.m.Takeoff(c)
	}
	if e, ok := mm.seen[k]; ok {
		return e.r, e.err
	}
	r, err := mm.m.Takeoff(c)
	mm.seen[k] = memoEntry{r, err}
	return r, err
}

// WindFactoringIncluded passes the wrapped model's answer through.
func (mm *memo) WindFactoringIncluded() bool { return WindFactoringIncluded(mm.m) }
