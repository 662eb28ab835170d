package perf

import (
	"errors"
	"fmt"
	"math"
)

// LandingCase is one landing question: this aircraft, this runway end, these
// conditions.
type LandingCase struct {
	Aircraft     *Aircraft
	Model        LandingModel
	Policy       Policy // its landing half is applied (Policy.Landing)
	End          RunwayEnd
	PressureAltM float64
	TempK        float64
	MassKg       float64
	Wind         Components // reported components, before any factoring
	TightMargin  float64
	Rounding     Rounding
}

// EvaluateLanding answers one landing case with the states, marks and rounding of
// the takeoff cells (Evaluate): a Cell whose To50ftM is the landing distance from
// 50 ft, GroundRollM the ground roll from touchdown, RequiredM the factored landing
// distance times the rule's factor and AvailableM the LDA (Limiting "LDA").
//
//   - beyond limits: mass above the maximum landing mass, tailwind past its limit,
//     crosswind past a declared max_crosswind, temperature past a declared limit;
//   - no data: the runway end declares no LDA, or the model holds no answer;
//   - no-go without a figure (CannotTakeOff): braking does not stop the aircraft;
//   - no-go, tight, go: from the figures as printed.
//
// The wind is credited as for takeoff (CAT.POL.A.330(c)(2): not more than 50 % of a
// headwind, not less than 150 % of a tailwind, unless the data already do); on a wet
// unpaved runway the requirement is never below the dry one.
func EvaluateLanding(k LandingCase) Cell {
	var c Cell
	x := landingCtx{}
	x.evaluate(&k, &c)
	return c
}

// landingCtx is what the landing cells of one grid share, as cellCtx for takeoff:
// the landing policy worked out for the runway end and its dry twin (when first
// needed), and the arena.
type landingCtx struct {
	er, dry *landingEndRules
	a       *arena
}

// evaluate is EvaluateLanding writing into c, which it overwrites whole.
func (x *landingCtx) evaluate(k *LandingCase, c *Cell) {
	x.evaluateCell(k, c)
	if len(c.reasons) == 0 {
		c.reasons = nil // as a cell without reasons always was
	}
}

func (x *landingCtx) evaluateCell(k *LandingCase, c *Cell) {
	a := k.Aircraft
	*c = Cell{TempK: k.TempK, HeadwindMS: k.Wind.HeadwindMS, CrosswindMS: math.Abs(k.Wind.GustCrosswindMS), MassKg: k.MassKg,
		reasons: x.a.reasons(3)}
	mlm := a.MTOWKg
	if a.Landing != nil && a.Landing.MaxMassKg > 0 {
		mlm = a.Landing.MaxMassKg
	}
	if k.MassKg > mlm+1e-9 {
		c.worsen(BeyondLimits, reason{s: fmt.Sprintf("weight %s kg above the maximum landing mass %s kg", passedText(k.MassKg, mlm), limitText(mlm))})
	}
	along := k.Wind.ForDistanceMS()
	c.limits(a, along, k.TempK)
	if !(k.End.LDAM > 0) {
		c.worsen(NoData, reason{s: fmt.Sprintf("no LDA declared for runway end %s: no landing figure", k.End.Designator)})
		return
	}
	if x.er == nil {
		x.er = k.Policy.Landing().forEnd(k.End)
	}
	lp := k.Policy.Landing()
	if err := lp.CheckSlope(k.End.SlopePct); err != nil { // eu-class-b past 2 %
		c.worsen(NoData, reason{s: err.Error()})
		return
	}
	c.CreditedWindMS = CreditedWindMS(along, LandingWindFactoringIncluded(k.Model))
	cond := Conditions{
		PressureAltM: k.PressureAltM, TempK: k.TempK, MassKg: k.MassKg,
		HeadwindMS: c.CreditedWindMS, SlopePct: k.End.SlopePct,
		Surface: k.End.Surface, Condition: k.End.Condition,
	}
	req := &c.Requirement
	actual, err := x.land(k.Model, x.er, k.End, cond, req)
	if err == nil && cond.Surface != Paved && cond.Condition == Wet {
		dryCond, dryEnd := cond, k.End
		dryCond.Condition, dryEnd.Condition = Dry, Dry
		if x.dry == nil {
			x.dry = x.er.lp.forEnd(dryEnd)
		}
		var dry Requirement
		if _, derr := x.land(k.Model, x.dry, dryEnd, dryCond, &dry); derr == nil && dry.FactoredTODM > req.FactoredTODM {
			dry.Caution = req.Caution // the wet runway's cautions stand
			*req = dry
			c.reasons = append(c.reasons, reason{s: "wet figure raised to the dry one: wet is never shorter than dry"})
		}
	}
	if err != nil {
		switch {
		case errors.Is(err, ErrCannotStop):
			c.CannotTakeOff = true
			c.worsen(NoGo, reason{s: err.Error()})
		default:
			c.worsen(NoData, reason{s: err.Error()})
		}
		*req = Requirement{}
		return
	}
	c.GroundRollM, c.To50ftM = actual.GroundRollM, actual.From50ftM
	c.Covers = actual.Covers
	for _, n := range actual.Notes {
		c.reasons = append(c.reasons, reason{s: n})
	}
	c.decide(req, k.Rounding, k.TightMargin)
}

// land asks the landing model for cond (and, when the model covers surface or slope,
// for the paved, dry, level reference) and applies the landing policy worked out for
// runway end e (er), writing the requirement into req. A model's contract is a
// positive, finite distance: any other answer is no data.
func (x *landingCtx) land(m LandingModel, er *landingEndRules, e RunwayEnd, cond Conditions, req *Requirement) (LandingResult, error) {
	actual, err := m.Land(cond)
	if err != nil {
		return actual, err
	}
	ref := actual
	if (actual.Covers.Surface || actual.Covers.Slope) && !isReference(cond) {
		refCond := cond
		refCond.Surface, refCond.Condition, refCond.SlopePct = Paved, Dry, 0
		if ref, err = m.Land(refCond); err != nil {
			return actual, err
		}
	}
	if !(landingUsable(actual) && landingUsable(ref)) {
		return actual, fmt.Errorf("%w: the landing model gave no usable distance (%.1f m, %.1f m)", ErrNoData, actual.GroundRollM, actual.From50ftM)
	}
	er.require(actual, ref, e, x.a, req)
	return actual, nil
}

// ComputeLandingGrid evaluates every landing cell of spec for runway end e of
// airfield f (EvaluateLanding), at the pressure altitude of the assumed QNH at the
// highest of the aerodrome elevation and the runway's thresholds, as the takeoff grid
// does. The grid's Landing is set.
func ComputeLandingGrid(a *Aircraft, m LandingModel, p Policy, f Airfield, e RunwayEnd, spec GridSpec) (*Grid, error) {
	if len(spec.TempsK) == 0 || len(spec.HeadwindsMS) == 0 || len(spec.WeightsKg) == 0 {
		return nil, errors.New("grid: every axis needs at least one value")
	}
	if len(spec.TempsK) > MaxGridTemps || len(spec.HeadwindsMS) > MaxGridWinds || len(spec.WeightsKg) > MaxGridWeights {
		return nil, fmt.Errorf("grid: at most %d temperatures, %d winds and %d weights", MaxGridTemps, MaxGridWinds, MaxGridWeights)
	}
	if !(spec.QNHPa >= MinQNHPa && spec.QNHPa <= MaxQNHPa) {
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
	g := &Grid{Spec: spec, End: e, ElevationM: TakeoffElevationM(f, e), Policy: p, Landing: true}
	g.PressureAltM = PressureAltitudeFromQNH(spec.QNHPa, g.ElevationM)
	g.Cells = gridCells(len(spec.WeightsKg), len(spec.HeadwindsMS), len(spec.TempsK))
	// Every cell as EvaluateLanding answers it (TestGridCellsAsEvaluate), with what
	// the cells share worked out once.
	x := landingCtx{a: newArena(len(spec.WeightsKg) * len(spec.HeadwindsMS) * len(spec.TempsK))}
	k := LandingCase{Aircraft: a, Model: m, Policy: p, End: e, PressureAltM: g.PressureAltM, TightMargin: spec.TightMargin, Rounding: spec.Rounding}
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

// AskLanding evaluates the landing question q on every runway end of airfield f and
// ranks the ends as Ask does (state, then required over available, then
// designator). Each end takes its pressure altitude as the takeoff does.
func AskLanding(a *Aircraft, m LandingModel, p Policy, f Airfield, q Question) (Answer, error) {
	if err := q.Check(a); err != nil {
		return Answer{}, err
	}
	ans := Answer{ElevationM: f.ElevationM}
	ans.PressureAltM = PressureAltitudeFromQNH(q.QNHPa, f.ElevationM)
	ans.DensityAltM = DensityAltitudeM(ans.PressureAltM, q.TempK)
	ans.ISADevK = q.TempK - ISATempK(ans.PressureAltM)
	for _, e := range f.Ends() {
		ea := EndAnswer{ElevationM: TakeoffElevationM(f, e)}
		if q.Condition != "" {
			e.Condition = q.Condition
		}
		ea.End = e
		ea.PressureAltM = PressureAltitudeFromQNH(q.QNHPa, ea.ElevationM)
		ea.DensityAltM = DensityAltitudeM(ea.PressureAltM, q.TempK)
		ea.ISADevK = q.TempK - ISATempK(ea.PressureAltM)
		ea.Wind = WindComponents(q.Wind, e.HeadingDeg, f.VariationDeg)
		ea.Cell = EvaluateLanding(LandingCase{
			Aircraft: a, Model: m, Policy: p, End: e,
			PressureAltM: ea.PressureAltM, TempK: q.TempK, MassKg: q.MassKg,
			Wind: ea.Wind, TightMargin: q.TightMargin,
		})
		ans.Ends = append(ans.Ends, ea)
	}
	ans.rank()
	return ans, nil
}
