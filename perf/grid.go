package perf

import (
	"errors"
	"fmt"
	"math"
)

// State is the verdict of one grid cell.
type State int

// Cell states, from best to worst. A cell takes the worst state any of its checks gives.
const (
	Go           State = iota // fits, with the card's margin to spare
	Tight                     // fits, but within the card's margin
	NoGo                      // required distance exceeds the distance available
	NoData                    // outside the model's data: no figure is given
	BeyondLimits              // past an aircraft limit: weight, tailwind, crosswind, temperature
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
}

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
	reasons     []reason
}

// reason is why a cell has its state, kept as numbers and formatted only when asked:
// a season's cards hold millions of cells and print none of these sentences.
type reason struct {
	kind    reasonKind
	a, b, c float64
	s       string
}

type reasonKind int

const (
	reasonText reasonKind = iota
	reasonMTOW
	reasonTailwind
	reasonCrosswind
	reasonTemperature
	reasonNoGo
	reasonTight
)

func (r reason) String() string {
	switch r.kind {
	case reasonMTOW:
		return fmt.Sprintf("weight %.0f kg above MTOW %.0f kg", r.a, r.b)
	case reasonTailwind:
		return fmt.Sprintf("tailwind %.0f kt above the %.0f kt limit", r.a/knot, r.b/knot)
	case reasonCrosswind:
		return fmt.Sprintf("crosswind %.0f kt above the demonstrated %.0f kt", r.a/knot, r.b/knot)
	case reasonTemperature:
		return fmt.Sprintf("temperature %.0f C outside the data's %.0f to %.0f C", r.a-273.15, r.b-273.15, r.c-273.15)
	case reasonNoGo:
		return fmt.Sprintf("%s: %.0f m required, %.0f m available", r.s, math.Ceil(r.a), math.Floor(r.b))
	case reasonTight:
		return fmt.Sprintf("%s: %.0f m required, %.0f m available, less than %.0f %% spare", r.s, math.Ceil(r.a), math.Floor(r.b), r.c*100)
	}
	return r.s
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

func (c *Cell) worsen(s State, r reason) {
	if s > c.State {
		c.State = s
	}
	c.reasons = append(c.reasons, r)
}

// Evaluate answers one Case: limits, wind factoring, the model (twice when the policy
// needs a paved, dry, level reference), the policy, and the cell's state.
func Evaluate(k Case) Cell {
	a := k.Aircraft
	c := Cell{TempK: k.TempK, HeadwindMS: k.Wind.HeadwindMS, CrosswindMS: math.Abs(k.Wind.GustCrosswindMS), MassKg: k.MassKg}
	if k.MassKg > a.MTOWKg+1e-9 {
		c.worsen(BeyondLimits, reason{kind: reasonMTOW, a: k.MassKg, b: a.MTOWKg})
	}
	if tail := -k.Wind.HeadwindMS; tail > a.MaxTailwindMS+1e-9 {
		c.worsen(BeyondLimits, reason{kind: reasonTailwind, a: tail, b: a.MaxTailwindMS})
	}
	if a.MaxCrosswindMS > 0 && c.CrosswindMS > a.MaxCrosswindMS+1e-9 {
		c.worsen(BeyondLimits, reason{kind: reasonCrosswind, a: c.CrosswindMS, b: a.MaxCrosswindMS})
	}
	if k.TempK > a.MaxTempK+1e-9 || k.TempK < a.MinTempK-1e-9 {
		c.worsen(BeyondLimits, reason{kind: reasonTemperature, a: k.TempK, b: a.MinTempK, c: a.MaxTempK})
	}

	c.CreditedWindMS = CreditedWindMS(k.Wind.HeadwindMS, WindFactoringIncluded(k.Model))
	cond := Conditions{
		PressureAltM: k.PressureAltM, TempK: k.TempK, MassKg: k.MassKg,
		HeadwindMS: c.CreditedWindMS, SlopePct: k.End.SlopePct,
		Surface: k.End.Surface, Condition: k.End.Condition,
	}
	actual, err := k.Model.Takeoff(cond)
	ref := actual
	if err == nil && (actual.Covers.Surface || actual.Covers.Slope) && !isReference(cond) {
		refCond := cond
		refCond.Surface, refCond.Condition, refCond.SlopePct = Paved, Dry, 0
		ref, err = k.Model.Takeoff(refCond)
	}
	if err == nil && !(usable(actual) && usable(ref)) {
		// A model's contract is a positive, finite distance; never print another.
		err = fmt.Errorf("%w: the model gave no usable distance (%.1f m, %.1f m)", ErrNoData, actual.GroundRollM, actual.To50ftM)
	}
	if err != nil {
		switch {
		case errors.Is(err, ErrCannotTakeOff):
			c.worsen(NoGo, reason{s: err.Error()})
		default: // ErrNoData, and anything unexpected: never a figure
			c.worsen(NoData, reason{s: err.Error()})
		}
		return c
	}
	c.GroundRollM, c.To50ftM, c.AccelCheckM, c.LiftoffTASMS = actual.GroundRollM, actual.To50ftM, actual.AccelCheckM, actual.LiftoffTASMS
	c.Covers = actual.Covers
	for _, n := range actual.Notes {
		c.reasons = append(c.reasons, reason{s: n})
	}
	req := k.Policy.Require(actual, ref, k.End)
	c.Requirement = req
	c.RequiredM, c.AvailableM, c.Limiting = req.Limiting.RequiredM, req.Limiting.AvailableM, req.Limiting.Declared
	c.HasDistance = true
	switch {
	case c.RequiredM > c.AvailableM:
		c.worsen(NoGo, reason{kind: reasonNoGo, s: c.Limiting, a: c.RequiredM, b: c.AvailableM})
	case c.RequiredM*(1+k.TightMargin) > c.AvailableM:
		c.worsen(Tight, reason{kind: reasonTight, s: c.Limiting, a: c.RequiredM, b: c.AvailableM, c: k.TightMargin})
	}
	return c
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
	ElevationM   float64
	PressureAltM float64 // at Spec.QNHPa and the aerodrome elevation
	Policy       Policy
	Cells        [][][]Cell // [weight][wind][temperature]
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
	return GridSpec{TempsK: temps, HeadwindsMS: winds, WeightsKg: a.WeightsKg, QNHPa: 100000, TightMargin: DefaultTightMargin}
}

// ComputeGrid evaluates every cell of spec for runway end e of airfield f. The
// pressure altitude comes from the assumed QNH at the aerodrome elevation (the
// highest point of the landing area, so conservative for every runway end).
func ComputeGrid(a *Aircraft, m Model, p Policy, f Airfield, e RunwayEnd, spec GridSpec) (*Grid, error) {
	if len(spec.TempsK) == 0 || len(spec.HeadwindsMS) == 0 || len(spec.WeightsKg) == 0 {
		return nil, errors.New("grid: every axis needs at least one value")
	}
	if len(spec.TempsK) > MaxGridTemps || len(spec.HeadwindsMS) > MaxGridWinds || len(spec.WeightsKg) > MaxGridWeights {
		return nil, fmt.Errorf("grid: at most %d temperatures, %d winds and %d weights", MaxGridTemps, MaxGridWinds, MaxGridWeights)
	}
	if !(spec.QNHPa > 80000 && spec.QNHPa < 110000) {
		return nil, fmt.Errorf("grid: QNH %.1f hPa outside 800 to 1100 hPa", spec.QNHPa/100)
	}
	g := &Grid{Spec: spec, End: e, ElevationM: f.ElevationM, Policy: p}
	g.PressureAltM = PressureAltitudeFromQNH(spec.QNHPa, f.ElevationM)
	g.Cells = make([][][]Cell, len(spec.WeightsKg))
	for wi, w := range spec.WeightsKg {
		g.Cells[wi] = make([][]Cell, len(spec.HeadwindsMS))
		for hi, h := range spec.HeadwindsMS {
			row := make([]Cell, len(spec.TempsK))
			for ti, t := range spec.TempsK {
				row[ti] = Evaluate(Case{
					Aircraft: a, Model: m, Policy: p, End: e,
					PressureAltM: g.PressureAltM, TempK: t, MassKg: w,
					Wind:        Components{HeadwindMS: h},
					TightMargin: spec.TightMargin,
				})
			}
			g.Cells[wi][hi] = row
		}
	}
	return g, nil
}
