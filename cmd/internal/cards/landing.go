package cards

import (
	"fmt"
	"math"
	"sort"
	"strings"
	"time"

	"kneeprint/cmd/internal/spec"
	"kneeprint/cmd/internal/units"
	"kneeprint/layout"
	"kneeprint/perf"
)

// HasLandingSide reports whether the job's cards have a landing side: the profile has
// landing data and the template does not leave it out.
func (j *Job) HasLandingSide() bool {
	return j.Aircraft.Landing != nil && (j.Template.Landing == "" || j.Template.Landing == spec.LandingBack)
}

// NoLDA is what the landing side of a runway end without an LDA says instead of
// figures.
func NoLDA(designator string) string {
	return fmt.Sprintf("NO LDA DECLARED FOR RUNWAY %s: no landing figure on this side. Add lda, the landing distance available from the threshold, to the airfield file.", designator)
}

// LandingCard computes runway end e's landing grid for condition cond and the card
// data of its landing side: the same units, rounding, states and legend as the
// takeoff side (Card), the weights from the maximum landing mass down
// (perf.LandingMasses), the landing distance from 50 ft against the LDA. A runway end
// without an LDA gets a side that says so, with no grid (the grid returned is nil).
func (j *Job) LandingCard(e perf.RunwayEnd, cond perf.Condition) (layout.CardData, *perf.Grid, error) {
	a, f, t := j.Aircraft, j.Airfield, j.Template
	var d layout.CardData
	if j.landingModel == nil {
		m, err := perf.LandingModelFor(a)
		if err != nil {
			return d, nil, err
		}
		// One memo per job: the runway ends share their reference figures.
		j.landingModel = perf.MemoLanding(m)
	}
	pol, err := perf.PolicyByID(t.Policy)
	if err != nil {
		return d, nil, err
	}
	lp := pol.Landing()
	u := newUnits(t)
	all := append([]float64(nil), a.WeightsKg...)
	sort.Sort(sort.Reverse(sort.Float64Slice(all)))
	weights := perf.LandingMasses(a, all, t.MaxBlocks)
	for _, kg := range perf.LandingMasses(a, all, 0)[len(weights):] {
		d.Omitted = append(d.Omitted, u.mass(kg))
	}
	end := e
	end.Condition = cond
	rnd := t.Rounding()

	d.Side, d.TwoSided = layout.LandingSide, true
	d.AirfieldName, d.Ident, d.ElevationFt = f.Name, f.Ident, units.Feet(f.ElevationM)
	d.Designator, d.HeadingDeg = e.Designator, e.HeadingDeg
	d.Surface, d.Condition, d.SlopePct = string(e.Surface), string(cond), e.SlopePct
	d.ConditionPages = len(j.Conditions(e))
	if e.LDAM > 0 {
		d.Declared = []layout.DeclaredDistance{{Name: "LDA", Value: rnd.Down(e.LDAM)}}
	}
	d.Limiting = "LDA"
	d.RunwayNotes = e.Notes
	d.AircraftName, d.Flap = a.Name, a.Landing.Flap
	d.ModelName = perf.LandingModelLine(a) // LandingModelFor refused an uncalibrated physics model

	d.QNHhPa = math.Ceil(units.HPa(t.QNHPa)*100-1e-3) / 100
	d.QNHinHg = math.Ceil((units.InHg(t.QNHPa)-units.InHg(5))*100) / 100
	paM := perf.PressureAltitudeFromQNH(t.QNHPa, perf.TakeoffElevationM(*f, e))
	d.PressureAltFt = units.Feet(paM)
	d.HotterPer10hPa = hotterPer10hPa(t)
	d.Unit, d.MassUnit, d.TempUnit = rnd.UnitName(), t.MassUnit, t.TempUnit
	d.TightMarginPct = t.TightMargin * 100
	for _, k := range t.TempsK {
		d.Temps = append(d.Temps, u.temp(k))
		da := units.Feet(perf.DensityAltitudeM(paM, k))
		d.DensityAltFt = append(d.DensityAltFt, math.Ceil(da/100-1e-9)*100)
	}
	for _, w := range t.WindsMS {
		d.WindsKt = append(d.WindsKt, math.Round(units.Knots(w)*10)/10)
	}
	d.Approach = j.approachSpeeds(weights, u)
	d.Crosswind = crosswindHelper(a, t)
	d.Generated = j.Date.Format("2006-01-02")
	d.ValidUntil = j.ValidUntil.Format("2006-01-02")
	d.Fingerprint = j.Fingerprint(e)
	d.Version = j.Version
	d.Caution = Caution
	d.PolicyTitle = lp.Title

	if !(e.LDAM > 0) {
		d.NoGrid = NoLDA(e.Designator)
		d.PolicyItems = landingPolicyItems(lp, end, perf.Effects{})
		return d, nil, nil
	}
	gs := perf.GridSpec{TempsK: t.TempsK, HeadwindsMS: t.WindsMS, WeightsKg: weights, QNHPa: t.QNHPa, TightMargin: t.TightMargin, Rounding: rnd}
	t0 := time.Now()
	g, err := perf.ComputeLandingGrid(a, j.landingModel, pol, *f, end, gs)
	j.computeTime += time.Since(t0)
	if err != nil {
		return d, nil, err
	}
	var covers perf.Effects
	figures := 0
	for wi, blk := range g.Cells {
		wb := layout.WeightBlock{Weight: u.mass(weights[wi])}
		if math.Abs(weights[wi]-a.Landing.MaxMassKg) < 0.5 {
			wb.Tag = "MLM"
		}
		for _, row := range blk {
			var cells []layout.CellData
			for _, c := range row {
				cd := layout.CellData{State: c.State, CannotTakeOff: c.CannotTakeOff}
				if c.HasDistance {
					covers = c.Covers
				}
				if c.HasDistance && c.State != perf.BeyondLimits {
					cd.Distance, cd.HasDistance = c.ShownRequired, true
					figures++
				}
				cells = append(cells, cd)
			}
			wb.Cells = append(wb.Cells, cells)
		}
		d.Blocks = append(d.Blocks, wb)
	}
	if figures == 0 {
		d.Empty = emptyReason(g)
	}
	d.PolicyItems = landingPolicyItems(lp, end, covers)
	return d, g, nil
}

// approachSpeeds are the speeds over the threshold the landing figures assume, per
// weight block, in KIAS rounded to the knot: the physics model's own (the profile's
// speed scaled from the maximum landing mass, never below 1.3 V_S0), or the
// manual's approach speed for a table.
func (j *Job) approachSpeeds(weights []float64, u cardUnits) []layout.ApproachSpeed {
	var out []layout.ApproachSpeed
	for _, kg := range weights {
		var v float64
		lm := j.landingModel
		if u, ok := lm.(interface{ Unwrap() perf.LandingModel }); ok {
			lm = u.Unwrap()
		}
		switch m := lm.(type) {
		case *perf.LandingPhysicsModel:
			v = m.ApproachEASMS(kg)
		default:
			v = j.Aircraft.Landing.ApproachIASMS
		}
		if v <= 0 {
			return nil
		}
		out = append(out, layout.ApproachSpeed{Weight: u.mass(kg), KIAS: math.Round(units.Knots(v))})
	}
	return out
}

// landingPolicyItems are the landing policy's factors and its rule for runway end e,
// each exactly as applied and each kept whole on one line, as policyItems prints the
// takeoff's.
func landingPolicyItems(lp perf.LandingPolicy, e perf.RunwayEnd, covers perf.Effects) []string {
	var items []string
	sf, slf := lp.SurfaceFactor(e.Surface, e.Condition), lp.SlopeFactor(e.SlopePct)
	if sf.Value != 1 {
		name := sf.Label()
		if e.Surface == perf.Gravel {
			name = fmt.Sprintf("unpaved, %s: grass factor", e.Condition)
		}
		assume := ""
		switch e.Surface {
		case perf.Grass:
			assume = " (firm soil)"
		case perf.Gravel:
			assume = " (firm surface)"
		}
		items = append(items, name+" "+layout.Keep(pctFactor(sf.Value))+assume)
	}
	if slf.Value != 1 {
		items = append(items, layout.Keep(layout.SlopeWords(e.SlopePct))+" "+layout.Keep(pctFactor(slf.Value)))
	}
	r := lp.Rule()
	mult := r.Checks[0].Multiplier
	if strings.HasPrefix(r.Name, "CAT.POL") {
		// The regulation's own form: within 70 % of the LDA (x1/0.7).
		items = append(items, "LD ≤ "+trimNum(100/mult, 1)+" % of LDA ("+r.Name+")")
	} else {
		items = append(items, "LD ×"+trimNum(mult, 4)+" ≤ LDA")
	}
	if (covers.Surface && sf.Value != 1) || (covers.Slope && slf.Value != 1) {
		items = append(items, "the model's own figure where longer (the factor as a floor: kneeprint's own rule)")
	}
	items = append(items, lp.Cautions(e)...)
	return items
}

// landingPage builds the landing side of runway end e in condition cond (page id)
// and records its cells' states in sum.
func (j *Job) landingPage(e perf.RunwayEnd, cond perf.Condition, id string, fonts *layout.Fonts, sum *EndSummary) (layout.CardData, *layout.Card, error) {
	d, g, err := j.LandingCard(e, cond)
	if err != nil {
		return d, nil, fmt.Errorf("airfield %s runway %s, landing: %w", j.Airfield.Ident, id, err)
	}
	c, err := layout.Build(d, j.Page, fonts)
	if err != nil {
		return d, nil, fmt.Errorf("landing side: %w", err)
	}
	if probs := c.Check(); len(probs) > 0 {
		more := ""
		if len(probs) > 3 {
			probs, more = probs[:3], fmt.Sprintf(" and %d more", len(probs)-3)
		}
		return d, nil, fmt.Errorf("card %s %s, landing side: layout check failed: %v%s", j.Airfield.Ident, id, probs, more)
	}
	sum.recordLanding(d, g)
	return d, c, nil
}

// landingSamePage reports whether the job prints each runway end's landing figures
// on the takeoff page (a template with landing: same-page).
func (j *Job) landingSamePage() bool {
	return j.Aircraft.Landing != nil && j.Template.Landing == spec.LandingSamePage
}

// recordLanding counts the landing cells of grid g (nil for an end without an LDA)
// and the landing emptiness of its card data d.
func (sum *EndSummary) recordLanding(d layout.CardData, g *perf.Grid) {
	sum.Landing, sum.LandingCounts = true, map[perf.State]int{}
	sum.LandingEmpty, sum.LandingEmptyWhy, sum.NoLDA = d.Empty != "", d.Empty, d.NoGrid != ""
	if g == nil {
		return
	}
	for _, blk := range g.Cells {
		for _, row := range blk {
			for _, c := range row {
				sum.LandingCounts[c.State]++
			}
		}
	}
}
