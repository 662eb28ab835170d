// Package cards makes kneeboard cards: it computes each runway end's grid with perf,
// turns it into layout.CardData (units, rounding up, the accelerate check, the
// crosswind helper, the fingerprint) and writes the PDF atomically.
package cards

import (
	"bytes"
	"context"
	"crypto/sha256"
	"encoding/hex"
	"encoding/json"
	"fmt"
	"math"
	"os"
	"path/filepath"
	"regexp"
	"sort"
	"strconv"
	"strings"
	"sync"
	"time"
	"unicode"

	"kneeprint/cmd/internal/spec"
	"kneeprint/cmd/internal/units"
	"kneeprint/layout"
	"kneeprint/perf"
)

// Caution is printed on every card.
const Caution = "CAUTION: planning figures, not a substitute for the approved flight manual: verify against it. " +
	"The pilot in command decides. Figures assume the profile's aircraft, engine and technique; a worn aircraft, " +
	"soft or contaminated ground or a rushed takeoff needs more. Local regulations and licensed practice prevail."

// Job is one aircraft at one airfield with one card template.
type Job struct {
	Aircraft   *perf.Aircraft
	Airfield   *perf.Airfield
	Template   spec.CardTemplate
	Page       layout.Page
	Sheet      *layout.Sheet // 2-up imposition when set
	Date       time.Time
	ValidUntil time.Time
	Version    string
	Compress   bool

	// Hashes, when set, shares component hashes with the other jobs of a batch.
	Hashes *HashCache
	// Data asks Render for the card data as JSON too (Rendered.Data).
	Data bool

	aircraftHash, templateHash string            // cached by Fingerprint
	model                      perf.Model        // memoized, made by Card
	landingModel               perf.LandingModel // made by LandingCard
	computeTime                time.Duration     // spent in perf by Card, read by Render
}

// HashCache shares the canonical hashes of aircraft and runway ends between the jobs
// of a batch (twenty aircraft at one airfield hash its runway ends once). Safe for
// concurrent use.
type HashCache struct {
	mu sync.Mutex
	m  map[any]string
}

func (h *HashCache) get(key any, f func() string) string {
	if h == nil {
		return f()
	}
	h.mu.Lock()
	v, ok := h.m[key]
	h.mu.Unlock()
	if ok {
		return v
	}
	v = f()
	h.mu.Lock()
	if h.m == nil {
		h.m = map[any]string{}
	}
	h.m[key] = v
	h.mu.Unlock()
	return v
}

type endKey struct {
	f *perf.Airfield
	d string
}

// EndSummary counts the states of one card page's cells. A runway end on grass or
// gravel has two pages, dry and wet: Page tells them apart.
type EndSummary struct {
	Designator  string
	Page        string // the page's identity: the designator, with the condition when the end has a page per condition ("15 wet")
	Condition   string // the condition the page is printed for
	End         perf.RunwayEnd
	Fingerprint string
	Counts      map[perf.State]int
	// Empty is set when no cell of the page has a figure; EmptyWhy says why.
	Empty    bool
	EmptyWhy string
	// The landing side of the card, when it has one (Job.HasLandingSide): its cells'
	// states, and the same emptiness (a runway end without an LDA is not empty: its
	// side says there is no LDA; NoLDA is set).
	Landing         bool
	LandingCounts   map[perf.State]int
	LandingEmpty    bool
	LandingEmptyWhy string
	NoLDA           bool
	// PDFPages are the pages of a bundle (cards --bundle) the card is printed on:
	// its takeoff side, then its landing side when it has one; nil outside a bundle.
	PDFPages []int
}

// Result is what a job wrote.
type Result struct {
	Path     string
	DataPath string // the card data (JSON) beside the PDF, when asked for
	Pages    int
	Ends     []EndSummary
}

// Conditions lists the conditions runway end e gets a card page for, on a card with a
// landing side (landing true) or without one. Grass and gravel: dry and wet, whatever
// the file declares, so that a pilot on a wet morning has a figure (an unpaved strip
// changes with the weather, a declared condition does not). Paved: the declared
// condition alone when the card is takeoff only (no published takeoff factor for a
// wet paved runway: AMC1 CAT.POL.A.305, Table 1, wet paved x1.0), dry and wet when it
// has a landing side (a wet paved landing takes x1.15: CAT.POL.A.335(a), UK CAA SSL 7c).
func Conditions(e perf.RunwayEnd, landing bool) []perf.Condition {
	if e.Surface == perf.Paved && !landing {
		return []perf.Condition{e.Condition}
	}
	return []perf.Condition{perf.Dry, perf.Wet}
}

// PageID is the identity of the page of runway end e in condition c ("15 wet" when the
// end has a page per condition), on a card with or without a landing side.
func PageID(e perf.RunwayEnd, c perf.Condition, landing bool) string {
	if len(Conditions(e, landing)) > 1 {
		return e.Designator + " " + string(c)
	}
	return e.Designator
}

// HasLanding reports whether the job's cards carry landing figures (a landing side,
// or the landing on the same page).
func (j *Job) HasLanding() bool {
	return j.Aircraft.Landing != nil && j.Template.Landing != spec.LandingNone
}

// Conditions lists the conditions runway end e gets a card page for in this job.
func (j *Job) Conditions(e perf.RunwayEnd) []perf.Condition { return Conditions(e, j.HasLanding()) }

// PageID is the identity of the page of runway end e in condition c in this job.
func (j *Job) PageID(e perf.RunwayEnd, c perf.Condition) string { return PageID(e, c, j.HasLanding()) }

// Card computes runway end e's grid for condition cond and its card data: every
// figure in the template's units, rounded as printed, the state of every cell decided
// from the printed figures (perf.Rounding).
func (j *Job) Card(e perf.RunwayEnd, cond perf.Condition) (layout.CardData, *perf.Grid, error) {
	a, f, t := j.Aircraft, j.Airfield, j.Template
	var d layout.CardData
	if j.model == nil {
		m, err := perf.ModelFor(a)
		if err != nil {
			return d, nil, err
		}
		// One memo per job: the runway ends of an airfield share their reference
		// (paved, dry, level) figures.
		j.model = perf.Memo(m)
	}
	model := j.model
	pol, err := perf.PolicyByID(t.Policy)
	if err != nil {
		return d, nil, err
	}
	u := newUnits(t)
	weights := append([]float64(nil), a.WeightsKg...)
	sort.Sort(sort.Reverse(sort.Float64Slice(weights)))
	if len(weights) > t.MaxBlocks {
		for _, kg := range weights[t.MaxBlocks:] {
			d.Omitted = append(d.Omitted, u.mass(kg))
		}
		weights = weights[:t.MaxBlocks]
	}
	end := e
	end.Condition = cond
	rnd := t.Rounding()
	gs := perf.GridSpec{TempsK: t.TempsK, HeadwindsMS: t.WindsMS, WeightsKg: weights, QNHPa: t.QNHPa, TightMargin: t.TightMargin, Rounding: rnd, ObstacleMarginM: t.ObstacleMarginM}
	t0 := time.Now()
	g, err := perf.ComputeGrid(a, model, pol, *f, end, gs)
	j.computeTime += time.Since(t0)
	if err != nil {
		return d, nil, err
	}

	d.AirfieldName, d.Ident, d.ElevationFt = f.Name, f.Ident, units.Feet(f.ElevationM)
	d.Designator, d.HeadingDeg = e.Designator, e.HeadingDeg
	d.Surface, d.Condition, d.SlopePct = string(e.Surface), string(cond), e.SlopePct
	d.ConditionPages = len(j.Conditions(e))
	for _, dd := range []layout.DeclaredDistance{{Name: "TORA", Value: e.TORAM}, {Name: "TODA", Value: e.TODAM}, {Name: "ASDA", Value: e.ASDAM}, {Name: "LDA", Value: e.LDAM}} {
		if dd.Name == "LDA" && j.HasLandingSide() {
			continue // the landing side, behind, holds the LDA
		}
		if dd.Value > 0 {
			dd.Value = rnd.Down(dd.Value)
			d.Declared = append(d.Declared, dd)
		}
	}
	d.RunwayNotes = e.Notes
	d.TwoSided = j.HasLandingSide() // the front of a card with a landing side behind it
	d.AircraftName, d.Flap = a.Name, a.TakeoffFlap
	d.ModelName = perf.ModelLine(a) // ModelFor refused an uncalibrated physics model above
	var covers perf.Effects
	limiting := map[string]int{}
	for _, blk := range g.Cells {
		for _, row := range blk {
			for _, c := range row {
				if c.HasDistance {
					covers = c.Covers
					limiting[c.Limiting]++
				}
			}
		}
	}
	best := 0
	for _, name := range []string{"TORA", "TODA", "ASDA"} {
		if limiting[name] > best {
			d.Limiting, best = name, limiting[name]
		}
	}
	d.PolicyTitle, d.PolicyItems = pol.Title, policyItems(pol, end, covers)
	// The QNH the figures hold for and above, as a pilot compares it: rounded up to
	// the hundredth of an hPa and of an inHg, so that "or more" holds; the inHg within
	// 0.05 hPa (about 1.4 ft of pressure altitude), so that 1013.25 hPa prints 29.92
	// inHg (29.9212), not 29.93.
	d.QNHhPa = math.Ceil(units.HPa(t.QNHPa)*100-1e-3) / 100
	d.QNHinHg = math.Ceil((units.InHg(t.QNHPa)-units.InHg(5))*100) / 100
	d.PressureAltFt = units.Feet(g.PressureAltM)
	d.HotterPer10hPa = hotterPer10hPa(t)
	d.Unit, d.MassUnit, d.TempUnit = rnd.UnitName(), t.MassUnit, t.TempUnit
	d.TightMarginPct = t.TightMargin * 100
	for _, k := range t.TempsK {
		d.Temps = append(d.Temps, u.temp(k))
		// Density altitude at the card's QNH, rounded up to 100 ft (the worse side).
		da := units.Feet(perf.DensityAltitudeM(g.PressureAltM, k))
		d.DensityAltFt = append(d.DensityAltFt, math.Ceil(da/100-1e-9)*100)
	}
	for _, w := range t.WindsMS {
		d.WindsKt = append(d.WindsKt, math.Round(units.Knots(w)*10)/10)
	}
	figures := 0
	for wi, blk := range g.Cells {
		wb := layout.WeightBlock{Weight: u.mass(weights[wi]), MTOW: math.Abs(weights[wi]-a.MTOWKg) < 0.5}
		for _, row := range blk {
			var cells []layout.CellData
			for _, c := range row {
				cd := layout.CellData{State: c.State, CannotTakeOff: c.CannotTakeOff, Obstacle: c.ObstacleNoGo}
				if c.HasDistance && c.State != perf.BeyondLimits && c.State != perf.NoData { // no data with a distance: an end with obstacles and no climb (issue 12)
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
	t0 = time.Now()
	d.Accel = j.accelCheck(model, pol, end, g, weights, u)
	j.computeTime += time.Since(t0)
	d.Crosswind = crosswindHelper(a, t)
	t0 = time.Now()
	obstacleData(&d, a, end, g, weights[0], u) // obstacle.go
	j.computeTime += time.Since(t0)
	d.Generated = j.Date.Format("2006-01-02")
	d.ValidUntil = j.ValidUntil.Format("2006-01-02")
	d.Fingerprint = j.Fingerprint(e)
	d.Version = j.Version
	d.Caution = Caution
	return d, g, nil
}

// cardUnits converts SI values to a template's printing units.
type cardUnits struct{ t spec.CardTemplate }

func newUnits(t spec.CardTemplate) cardUnits { return cardUnits{t} }

// mass is a weight in the card's mass unit, rounded down to a whole unit: a block
// computed at 1000 kg is labelled 2204 lb, so that a pilot at 2204.6 lb reads the
// heavier block (the conservative side).
func (u cardUnits) mass(kg float64) float64 {
	v := kg
	if u.t.MassUnit == "lb" {
		v = units.Pounds(kg)
	}
	return math.Floor(v + 1e-6)
}

// temp is a temperature in the card's unit; template temperatures are whole degrees
// as written, so a conversion back is rounded to a hundredth.
func (u cardUnits) temp(k float64) float64 {
	c := units.Celsius(k)
	if u.t.TempUnit == "F" {
		c = c*1.8 + 32
	}
	return math.Round(c*100) / 100
}

// hotterPer10hPa is the cockpit rule for a QNH below the card's: how many degrees
// hotter to read per 10 hPa lower. From the ISA: the station pressure is the QNH
// times a factor of the elevation alone (p = QNH (1 - L h/T0)^n, ICAO Doc 7488), so
// 10 hPa less QNH lowers the pressure by the fraction 10/QNH; the same density
// (rho = p / R T) is reached at a temperature higher by
//
//	dT = T (10 / (QNH - 10))
//
// taken at the card's hottest column and rounded up to a whole degree (about 3.1 K at
// 35 C and 1000 hPa: the card says 4 C). A density-equivalent rule: close for power
// and airspeed, which follow the density.
func hotterPer10hPa(t spec.CardTemplate) float64 {
	hot := t.TempsK[len(t.TempsK)-1]
	hpa := units.HPa(t.QNHPa)
	dt := hot * 10 / (hpa - 10)
	if t.TempUnit == "F" {
		dt *= 1.8
	}
	return math.Ceil(dt - 1e-9)
}

// emptyReason says why no cell of grid g has a figure: the first cell's first reason.
func emptyReason(g *perf.Grid) string {
	for _, blk := range g.Cells {
		for _, row := range blk {
			for _, c := range row {
				if r := c.Reasons(); len(r) > 0 {
					return r[0]
				}
			}
		}
	}
	return "no cell could be computed"
}

// surfaceAssumption is what the surface factors assume, printed beside them: the
// published grass factors are for grass up to 20 cm on firm soil (AMC1
// CAT.POL.A.305); gravel has no published factor and takes the grass one.
func surfaceAssumption(s perf.Surface) string {
	switch s {
	case perf.Grass:
		return " (grass to 20 cm on firm soil: AMC1 CAT.POL.A.305)"
	case perf.Gravel:
		return " (firm surface assumed: AMC1 CAT.POL.A.305)"
	}
	return ""
}

// accelCheck is the accelerate check: the runway midpoint and 0.7 x the profile's
// rotation speed (FAA Aeronautical Information Manual 7-6-8, runway half-way signs;
// 7-5-7 in older editions), and, as information, where
// 70 % of the rotation speed is expected for each weight block: from the ground roll
// factored for surface and slope (the effects the model does not cover, as the policy
// factors them), in calm wind, at the hottest column whose calm cell fits, rounded
// down to the card's step (the stricter side for a point to reach a speed by).
func (j *Job) accelCheck(m perf.Model, p perf.Policy, e perf.RunwayEnd, g *perf.Grid, weights []float64, u cardUnits) layout.AccelCheck {
	a, t := j.Aircraft, j.Template
	rnd := t.Rounding()
	// The run available: the TORA, or an ASDA shorter than it (the run the aircraft
	// can stop within; perf's policies take it as the takeoff run, common practice).
	run := e.TORAM
	ac := layout.AccelCheck{}
	if e.ASDAM > 0 && e.ASDAM < e.TORAM-0.5 {
		run, ac.OfASDA = e.ASDAM, true
	}
	ac.MidpointDist = math.Floor(rnd.In(run)/2 + 1e-9)
	if a.RotateIASMS <= 0 {
		return ac
	}
	ac.RotateKIAS = math.Round(units.Knots(a.RotateIASMS)*10) / 10
	ac.SpeedKIAS = math.Ceil(0.7*ac.RotateKIAS - 1e-9)
	calm := -1
	for wi, w := range t.WindsMS {
		if w == 0 {
			calm = wi
		}
	}
	for bi, kg := range weights {
		pt := layout.ExpectedPoint{Weight: u.mass(kg)}
		for ti := len(t.TempsK) - 1; ti >= 0; ti-- {
			var c perf.Cell
			if calm >= 0 {
				c = g.Cells[bi][calm][ti]
			} else {
				c = perf.Evaluate(perf.Case{Aircraft: a, Model: m, Policy: p, End: e, PressureAltM: g.PressureAltM,
					TempK: t.TempsK[ti], MassKg: kg, TightMargin: t.TightMargin, Rounding: rnd, ObstacleMarginM: t.ObstacleMarginM})
			}
			if (c.State != perf.Go && c.State != perf.Tight) || c.AccelCheckM <= 0 {
				continue
			}
			f := 1.0
			if !c.Covers.Surface {
				f *= c.Requirement.Factors[0].Value
			}
			if !c.Covers.Slope {
				f *= c.Requirement.Factors[1].Value
			}
			pt.Has, pt.Temp = true, u.temp(t.TempsK[ti])
			pt.Dist = math.Floor(rnd.In(c.AccelCheckM*f)/perf.CardStep+1e-9) * perf.CardStep
			break
		}
		ac.Expected = append(ac.Expected, pt)
	}
	return ac
}

func crosswindHelper(a *perf.Aircraft, t spec.CardTemplate) layout.CrosswindHelper {
	h := layout.CrosswindHelper{
		DemonstratedKt: math.Round(units.Knots(a.DemonstratedCrosswindMS)*10) / 10,
		HasLimit:       a.HasMaxCrosswind,
		LimitKt:        math.Round(units.Knots(a.MaxCrosswindMS)*10) / 10,
	}
	h.AnglesDeg = append(h.AnglesDeg, t.CrosswindAnglesDeg...)
	for _, s := range t.CrosswindSpeedsMS {
		h.SpeedsKt = append(h.SpeedsKt, math.Round(units.Knots(s)))
		var row []float64
		for _, a := range t.CrosswindAnglesDeg {
			c := perf.WindComponents(perf.Wind{FromDeg: 180 + a, SpeedMS: s}, 180, 0)
			// Rounded up: the helper never shows less crosswind than there is.
			row = append(row, math.Ceil(units.Knots(math.Abs(c.CrosswindMS))-1e-6))
		}
		h.Kt = append(h.Kt, row)
	}
	return h
}

// policyItems are the policy's factors and checks for runway end e, each exactly as
// applied (1.015 prints +1.5 %), each printed whole on one line. A policy met by any
// one of several rules (CAT.POL.A.305(b)(1) or (b)(2)) prints them joined by "or".
func policyItems(p perf.Policy, e perf.RunwayEnd, covers perf.Effects) []string {
	var items []string
	sf, slf := p.SurfaceFactor(e.Surface, e.Condition), p.SlopeFactor(e.SlopePct)
	if sf.Value != 1 {
		name := sf.Label()
		if e.Surface == perf.Gravel {
			// Gravel has no published factor of its own: it takes the grass one.
			name = fmt.Sprintf("unpaved, %s: grass factor", e.Condition)
		}
		items = append(items, name+" "+layout.Keep(pctFactor(sf.Value))+surfaceAssumption(e.Surface))
	}
	if slf.Value != 1 {
		items = append(items, layout.Keep(layout.SlopeWords(e.SlopePct))+" "+layout.Keep(pctFactor(slf.Value)))
	}
	floor := (covers.Surface && sf.Value != 1) || (covers.Slope && slf.Value != 1)
	rules := p.Rules(e)
	for ri, r := range rules {
		for ci, c := range r.Checks {
			s := "TOD ≤ " + c.Declared
			if c.Multiplier != 1 {
				s = "TOD ×" + trimNum(c.Multiplier, 4) + " ≤ " + c.Declared
			}
			if ri > 0 && ci == 0 {
				s = "or " + s
			}
			items = append(items, s)
		}
	}
	if floor {
		// The model includes surface or slope itself: its own figure counts where it
		// is longer than the published factor gives (Policy.Require). The published
		// factor as a floor is kneeprint's own conservative rule (perf.FloorRule).
		items = append(items, "the model's own figure where longer (the factor as a floor: kneeprint's own rule)")
	}
	if c := p.SlopeCaution(e.SlopePct); c != "" {
		items = append(items, c)
	}
	return items
}

// pctFactor prints a factor as the percentage it adds, exactly to a hundredth of a
// percent and rounded up beyond that: 1.015 is "+1.5 %", 1.2 is "+20 %".
func pctFactor(v float64) string {
	return "+" + trimNum(math.Ceil((v-1)*1e4-1e-6)/100, 2) + " %"
}

// trimNum prints x with at most prec decimals and no trailing zeros.
func trimNum(x float64, prec int) string {
	s := strconv.FormatFloat(x, 'f', prec, 64)
	if strings.Contains(s, ".") {
		s = strings.TrimRight(strings.TrimRight(s, "0"), ".")
	}
	return s
}

// Fingerprint is a short hash of the canonical form of every input that affects the
// card of runway end e: the profile, the airfield's identity and elevation, this
// runway end, the template (with its policy and page) and the kneeprint version. It is
// built from the three component hashes, so that a stale card can say which input
// changed.
func (j *Job) Fingerprint(e perf.RunwayEnd) string {
	if j.aircraftHash == "" {
		j.aircraftHash = j.Hashes.get(j.Aircraft, func() string { return AircraftHash(j.Aircraft) })
		j.templateHash = TemplateHash(j.Template, j.Page)
	}
	end := j.Hashes.get(endKey{j.Airfield, e.Designator}, func() string { return EndHash(j.Airfield, e) })
	return CombineFingerprint(j.aircraftHash, end, j.templateHash, j.Version)
}

// CombineFingerprint joins component hashes into a card fingerprint.
func CombineFingerprint(aircraft, end, template, version string) string {
	return shortHash(aircraft + "|" + end + "|" + template + "|" + version)
}

// AircraftHash is a short hash of the canonical form (JSON of the SI values) of a
// profile: comments, key order and units written do not change it.
func AircraftHash(a *perf.Aircraft) string { return canonicalHash(a) }

// EndHash is a short hash of what a runway end's card depends on in the airfield file:
// the airfield's name, identifier and elevation, the elevation its pressure altitude
// is taken at, and the end itself.
func EndHash(f *perf.Airfield, e perf.RunwayEnd) string {
	return canonicalHash(struct {
		Name, Ident string
		ElevationM  float64
		// The elevation the end's figures use: the highest of the aerodrome and the
		// runway's thresholds, so the other end's threshold counts too.
		TakeoffElevationM float64
		End               perf.RunwayEnd
	}{f.Name, f.Ident, f.ElevationM, perf.TakeoffElevationM(*f, e), e})
}

// TemplateHash is a short hash of a card template and the page it is printed on.
func TemplateHash(t spec.CardTemplate, p layout.Page) string {
	return canonicalHash(struct {
		T    spec.CardTemplate
		Page string
	}{t, p.Name})
}

// canonicalHash hashes the JSON form of v with every number rounded to 9 significant
// digits, so that the same value written in other units (2755.9055 ft for 840 m)
// hashes alike.
func canonicalHash(v any) string {
	data, err := json.Marshal(v)
	if err != nil {
		panic("kneeprint: canonical form of plain data failed: " + err.Error()) // a programming defect
	}
	dec := json.NewDecoder(bytes.NewReader(data))
	dec.UseNumber()
	var tree any
	if err := dec.Decode(&tree); err != nil {
		panic("kneeprint: canonical form of plain data failed: " + err.Error())
	}
	data, err = json.Marshal(roundNumbers(tree))
	if err != nil {
		panic("kneeprint: canonical form of plain data failed: " + err.Error())
	}
	return shortHash(string(data))
}

func roundNumbers(v any) any {
	switch x := v.(type) {
	case map[string]any:
		for k, e := range x {
			x[k] = roundNumbers(e)
		}
	case []any:
		for i, e := range x {
			x[i] = roundNumbers(e)
		}
	case json.Number:
		f, err := x.Float64()
		if err == nil {
			return json.Number(strconv.FormatFloat(f, 'g', 9, 64))
		}
	}
	return v
}

func shortHash(s string) string {
	sum := sha256.Sum256([]byte(s))
	return hex.EncodeToString(sum[:])[:12]
}

// Release drops what Card memoized for the job (its model and the model's reference
// figures, tens of kilobytes): a batch calls it once the job's PDF is made, so that
// memory does not grow with every card file. A later Card makes them again.
func (j *Job) Release() { j.model, j.landingModel = nil, nil }

// Rendered is a job's PDF and what went into it.
type Rendered struct {
	PDF   []byte
	Data  []byte // the card data as JSON, when Job.Data is set
	Ends  []EndSummary
	Pages int
	// Time spent computing (perf: models, policies, grids, the accelerate check),
	// laying out (card data: units, rounding, fingerprint; card models) and writing
	// the PDF, for the batch benchmark.
	Compute, Layout, PDFTime time.Duration
}

// Laid is a job's cards laid out: the card models its PDF is drawn from, in print
// order (each takeoff side followed by its landing side when the card has one), and
// what went into them.
type Laid struct {
	Job *Job
	// Part names the job in a bundle: the name its card file has on its own.
	Part  string
	Cards []*layout.Card
	Ends  []EndSummary
	// first[i] is the index in Cards of end i's takeoff side.
	first []int
	// The card data of each takeoff page and its landing side, when Job.Data is set.
	data    []layout.CardData
	landing map[int]layout.CardData
	// Time spent computing and laying out (see Rendered).
	Compute, Layout time.Duration
}

// Lay computes every runway end and lays out its cards: everything but the PDF.
func (j *Job) Lay(fonts *layout.Fonts) (*Laid, error) {
	out := &Laid{Job: j}
	j.computeTime = 0
	landing := map[int]layout.CardData{} // page index in data -> its landing side
	for _, e := range j.Airfield.Ends() {
		for _, cond := range j.Conditions(e) {
			t0 := time.Now()
			id := j.PageID(e, cond)
			d, g, err := j.Card(e, cond)
			if err != nil {
				return nil, fmt.Errorf("airfield %s runway %s: %w", j.Airfield.Ident, id, err)
			}
			sum := EndSummary{Designator: e.Designator, Page: id, Condition: string(cond), End: e, Fingerprint: d.Fingerprint,
				Counts: map[perf.State]int{}, Empty: d.Empty != "", EmptyWhy: d.Empty}
			if j.landingSamePage() {
				ld, lg, err := j.LandingCard(e, cond)
				if err != nil {
					return nil, fmt.Errorf("airfield %s runway %s, landing: %w", j.Airfield.Ident, id, err)
				}
				d.SamePage = &ld
				sum.recordLanding(ld, lg)
				if j.Data {
					landing[len(out.data)] = ld
				}
			}
			c, err := layout.Build(d, j.Page, fonts)
			if err != nil {
				return nil, err
			}
			if probs := c.Check(); len(probs) > 0 {
				more := ""
				if len(probs) > 3 {
					probs, more = probs[:3], fmt.Sprintf(" and %d more", len(probs)-3)
				}
				return nil, fmt.Errorf("card %s %s: layout check failed: %v%s", j.Airfield.Ident, id, probs, more)
			}
			out.Layout += time.Since(t0)
			out.first = append(out.first, len(out.Cards))
			out.Cards = append(out.Cards, c)
			for _, blk := range g.Cells {
				for _, row := range blk {
					for _, c := range row {
						sum.Counts[c.State]++
					}
				}
			}
			if j.Data {
				out.data = append(out.data, d)
			}
			if j.HasLandingSide() {
				t0 := time.Now()
				ld, lc, err := j.landingPage(e, cond, id, fonts, &sum)
				if err != nil {
					return nil, err
				}
				out.Layout += time.Since(t0)
				out.Cards = append(out.Cards, lc)
				if j.Data {
					landing[len(out.data)-1] = ld
				}
			}
			out.Ends = append(out.Ends, sum)
		}
	}
	if j.Data {
		out.landing = landing
	}
	out.Compute = j.computeTime
	out.Layout -= j.computeTime
	return out, nil
}

// Render computes every runway end and writes one PDF of all their cards.
func (j *Job) Render(fonts *layout.Fonts) (*Rendered, error) {
	l, err := j.Lay(fonts)
	if err != nil {
		return nil, err
	}
	out := &Rendered{Ends: l.Ends, Compute: l.Compute, Layout: l.Layout}
	if j.Data {
		t0 := time.Now()
		f, err := l.cardFile()
		if err != nil {
			return nil, err
		}
		if out.Data, err = encodeData(f); err != nil {
			return nil, err
		}
		out.Layout += time.Since(t0)
	}
	t0 := time.Now()
	var buf bytes.Buffer
	opt := layout.RenderOptions{Sheet: j.Sheet, Compress: j.Compress, Date: j.Date, Duplex: j.HasLandingSide(),
		Title: fmt.Sprintf("kneeprint cards: %s at %s", j.Aircraft.Name, j.Airfield.Name), Author: "kneeprint " + j.Version,
		Fonts: fonts}
	if err := layout.RenderPDF(&buf, l.Cards, opt); err != nil {
		return nil, err
	}
	out.PDFTime = time.Since(t0)
	out.PDF = buf.Bytes()
	out.Pages = len(l.Cards)
	if j.Sheet != nil {
		out.Pages = (len(l.Cards) + 1) / 2
	}
	return out, nil
}

// FileName is the job's PDF name: airfield identifier, aircraft name and page,
// each reduced to lower-case letters, digits and hyphens.
func (j *Job) FileName() string {
	name := Slug(j.Airfield.Ident) + "_" + Slug(j.Aircraft.Name) + "_" + Slug(j.Page.Name)
	if j.Sheet != nil {
		name += "_" + Slug(j.Sheet.Name) + "-2up"
	}
	return name + ".pdf"
}

// Slug keeps letters and digits (lower-cased, ASCII only) and turns every other run
// of characters into one hyphen, at most 40 characters: nothing in a name can leave
// the output folder or differ only by case.
func Slug(s string) string {
	var b strings.Builder
	dash := false
	for _, r := range strings.ToLower(s) {
		if r < 128 && (unicode.IsLetter(r) || unicode.IsDigit(r)) {
			b.WriteRune(r)
			dash = false
		} else if !dash && b.Len() > 0 {
			b.WriteByte('-')
			dash = true
		}
		if b.Len() >= 40 {
			break
		}
	}
	out := strings.Trim(b.String(), "-")
	if out == "" {
		out = "unnamed"
	}
	return out
}

// Write renders the job and writes it into dir atomically: to a temporary file in
// dir, synced, then renamed into place, so no reader ever sees half a PDF.
func (j *Job) Write(dir string, fonts *layout.Fonts) (Result, error) {
	r, err := j.Render(fonts)
	if err != nil {
		return Result{}, err
	}
	path := filepath.Join(dir, j.FileName())
	res := Result{Path: path, Pages: r.Pages, Ends: r.Ends}
	if r.Data != nil {
		res.DataPath = DataPath(path)
		if err := WriteAtomic(res.DataPath, r.Data); err != nil {
			return Result{}, err
		}
	}
	if err := WriteAtomic(path, r.PDF); err != nil {
		return Result{}, err
	}
	return res, nil
}

// DataPath is where the card data of the PDF at pdfPath goes: beside it, .json for .pdf.
func DataPath(pdfPath string) string {
	return strings.TrimSuffix(pdfPath, filepath.Ext(pdfPath)) + ".json"
}

// WriteAtomic writes data to path through a temporary file in the same folder,
// synced, then renamed into place: no reader ever sees half a file.
func WriteAtomic(path string, data []byte) error {
	return WriteAtomicCtx(context.Background(), path, data)
}

// SampleVersion is the version printed on the committed sample cards, so that they
// do not change with every release.
const SampleVersion = "sample"

// tempPattern is how kneeprint names its temporary files: ".NAME.kneeprint-DIGITS.tmp"
// (os.CreateTemp puts the digits in place of the star). IsTemp recognises exactly
// these, so that clearing a killed run's leftovers never touches a user's own file.
const tempPattern = ".kneeprint-*.tmp"

var tempName = regexp.MustCompile(`^\..+\.kneeprint-[0-9]+\.tmp$`)

// IsTemp reports whether a file name is one of kneeprint's temporaries (see
// WriteAtomicCtx).
func IsTemp(name string) bool { return tempName.MatchString(name) }

// WriteAtomicCtx is WriteAtomic that gives up, leaving nothing behind, when ctx is
// cancelled before the file is renamed into place.
func WriteAtomicCtx(ctx context.Context, path string, data []byte) (err error) {
	tmp, err := os.CreateTemp(filepath.Dir(path), "."+filepath.Base(path)+tempPattern)
	if err != nil {
		return err
	}
	defer func() {
		if err != nil {
			tmp.Close()
			os.Remove(tmp.Name())
		}
	}()
	if _, err = tmp.Write(data); err != nil {
		return err
	}
	if err = tmp.Sync(); err != nil {
		return err
	}
	if err = tmp.Close(); err != nil {
		return err
	}
	if err = os.Chmod(tmp.Name(), 0o644); err != nil {
		return err
	}
	if err = ctx.Err(); err != nil {
		return err
	}
	return os.Rename(tmp.Name(), path)
}
