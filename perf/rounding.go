package perf

import (
	"fmt"
	"math"
)

// Units a distance may be printed in.
const (
	UnitMetre = "m"
	UnitFoot  = "ft"
)

// footM is the international foot, 0.3048 m exactly (1959 agreement; ICAO Annex 5).
const footM = 0.3048

// Rounding is how distances are printed, and therefore how a cell's state is decided:
// a pilot compares the printed figures, so the verdict must follow from them. The
// required distance is rounded UP to a multiple of Step in Unit; the declared
// distance available is rounded DOWN to a whole Unit. Both directions are the
// conservative ones (common practice: a printed distance is never shorter than the
// one computed, and never longer than the one declared).
//
// The zero value prints whole metres (Step 1), as check and grid do; a card uses its
// own unit and a step of CardStep.
type Rounding struct {
	Unit string  // UnitMetre or UnitFoot; "" means metres
	Step float64 // the required distance is rounded up to a multiple of Step; 0 means 1
}

// CardStep is the step a card rounds its required distances up to: 10 m or 10 ft
// (common practice for quick-reference cards; a figure a pilot reads at a glance).
const CardStep = 10

// Validate reports a rounding that cannot be used.
func (r Rounding) Validate() error {
	if r.Unit != "" && r.Unit != UnitMetre && r.Unit != UnitFoot {
		return fmt.Errorf("rounding: unit %q, want m or ft", r.Unit)
	}
	if r.Step < 0 || math.IsNaN(r.Step) || math.IsInf(r.Step, 0) || r.Step > 100 {
		return fmt.Errorf("rounding: step %g outside 0 to 100", r.Step)
	}
	return nil
}

// UnitName is the unit's symbol, "m" for the zero value.
func (r Rounding) UnitName() string {
	if r.Unit == UnitFoot {
		return UnitFoot
	}
	return UnitMetre
}

// In converts metres to the rounding's unit, without rounding.
func (r Rounding) In(m float64) float64 {
	if r.Unit == UnitFoot {
		return m / footM
	}
	return m
}

func (r Rounding) step() float64 {
	if r.Step <= 0 {
		return 1
	}
	return r.Step
}

// Up is a required distance as printed: metres converted to the unit and rounded up
// to the next multiple of Step. A hair of tolerance keeps 500.0000000001 at 500.
func (r Rounding) Up(m float64) float64 {
	s := r.step()
	return math.Ceil(r.In(m)/s-1e-9) * s
}

// Down is a declared distance as printed: metres converted to the unit and rounded
// down to a whole unit (2755.9 ft prints 2755).
func (r Rounding) Down(m float64) float64 {
	return math.Floor(r.In(m) + 1e-9)
}
