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
	"soft or contaminated ground or a rushed takeoff needs more. Local regulations and licensed practice take precedence."

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

	aircraftHash, templateHash string        // cached by Fingerprint
	model                      perf.Model    // memoized, made by Card
	computeTime                time.Duration // spent in perf by Card, read by Render
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

// EndSummary counts the states of one runway end's cells.
type EndSummary struct {
	Designator  string
	Fingerprint string
	Counts      map[perf.State]int
}

// Result is what a job wrote.
type Result struct {
	Path  string
	Pages int
	Ends  []EndSummary
}

// Card computes one runway end's grid and card data.
func (j *Job) Card(e perf.RunwayEnd) (layout.CardData, *perf.Grid, error) {
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
	weights := append([]float64(nil), a.WeightsKg...)
	sort.Sort(sort.Reverse(sort.Float64Slice(weights)))
	if len(weights) > t.MaxBlocks {
		d.OmittedKg = weights[t.MaxBlocks:]
		weights = weights[:t.MaxBlocks]
	}
	gs := perf.GridSpec{TempsK: t.TempsK, HeadwindsMS: t.WindsMS, WeightsKg: weights, QNHPa: t.QNHPa, TightMargin: t.TightMargin}
	t0 := time.Now()
	g, err := perf.ComputeGrid(a, model, pol, *f, e, gs)
	j.computeTime += time.Since(t0)
	if err != nil {
		return d, nil, err
	}

	d.AirfieldName, d.Ident, d.ElevationFt = f.Name, f.Ident, units.Feet(f.ElevationM)
	d.Designator, d.HeadingDeg = e.Designator, e.HeadingDeg
	d.Surface, d.Condition, d.SlopePct = string(e.Surface), string(e.Condition), e.SlopePct
	d.TORAM, d.TODAM, d.ASDAM, d.LDAM = e.TORAM, e.TODAM, e.ASDAM, e.LDAM
	d.RunwayNotes = e.Notes
	d.AircraftName, d.Flap = a.Name, a.TakeoffFlap
	d.ModelName = "flight-manual table"
	if a.Model == perf.ModelPhysics {
		d.ModelName = a.Physics.Calibration.ModelLine() // ModelFor refused an uncalibrated one above
	}
	d.RotateKIAS = units.Knots(a.RotateIASMS)
	d.MaxCrosswindKt, d.MaxTailwindKt = units.Knots(a.MaxCrosswindMS), units.Knots(a.MaxTailwindMS)
	var covers perf.Effects
	for _, blk := range g.Cells {
		for _, row := range blk {
			for _, c := range row {
				if c.HasDistance {
					covers = c.Covers
				}
			}
		}
	}
	d.PolicyTitle, d.PolicyLine = pol.Title, policyLine(pol, e, covers)
	d.QNHhPa = units.HPa(t.QNHPa)
	d.PressureAltFt = units.Feet(g.PressureAltM)
	d.FtPerHPa = units.Feet(perf.PressureAltitudeFromQNH(t.QNHPa-100, f.ElevationM) - g.PressureAltM)
	d.Unit = t.Unit
	d.TightMarginPct = t.TightMargin * 100
	for _, k := range t.TempsK {
		d.TempsC = append(d.TempsC, units.Celsius(k))
	}
	for _, w := range t.WindsMS {
		d.WindsKt = append(d.WindsKt, math.Round(units.Knots(w)*10)/10)
	}
	limiting := map[string]int{}
	for wi, blk := range g.Cells {
		wb := layout.WeightBlock{WeightKg: weights[wi], MTOW: math.Abs(weights[wi]-a.MTOWKg) < 0.5}
		for _, row := range blk {
			var cells []layout.CellData
			for _, c := range row {
				cd := layout.CellData{State: c.State, HasDistance: c.HasDistance}
				if c.HasDistance {
					cd.Distance = roundUp10(c.RequiredM, t.Unit)
					limiting[c.Limiting]++
				}
				cells = append(cells, cd)
			}
			wb.Cells = append(wb.Cells, cells)
		}
		d.Blocks = append(d.Blocks, wb)
	}
	best := 0
	for _, name := range []string{"TORA", "TODA", "ASDA"} {
		if limiting[name] > best {
			d.Limiting, best = name, limiting[name]
		}
	}
	t0 = time.Now()
	d.Accel = accelCheck(a, model, pol, e, g, weights[0], t)
	j.computeTime += time.Since(t0)
	d.Crosswind = crosswindHelper(t)
	d.Generated = j.Date.Format("2006-01-02")
	d.ValidUntil = j.ValidUntil.Format("2006-01-02")
	d.Fingerprint = j.Fingerprint(e)
	d.Version = j.Version
	d.Caution = Caution
	return d, g, nil
}

// roundUp10 converts metres to the card's unit and rounds up to the next 10: a
// printed distance is never shorter than the one computed.
func roundUp10(m float64, unit string) float64 {
	v := m
	if unit == "ft" {
		v = units.Feet(m)
	}
	return math.Ceil(v/10-1e-9) * 10
}

func accelCheck(a *perf.Aircraft, m perf.Model, p perf.Policy, e perf.RunwayEnd, g *perf.Grid, kg float64, t spec.CardTemplate) layout.AccelCheck {
	c := perf.Evaluate(perf.Case{Aircraft: a, Model: m, Policy: p, End: e, PressureAltM: g.PressureAltM, TempK: t.AccelTempK, MassKg: kg, TightMargin: t.TightMargin})
	ac := layout.AccelCheck{WeightKg: kg, TempC: units.Celsius(t.AccelTempK)}
	if !c.HasDistance || c.AccelCheckM <= 0 {
		ac.Reason = fmt.Sprintf("no figure at %.0f kg, %.0f °C: %s", kg, ac.TempC, strings.Join(c.Reasons(), "; "))
		return ac
	}
	ac.Available = true
	ac.Distance = roundUp10(c.AccelCheckM, t.Unit)
	ac.FractionTORA = c.AccelCheckM / e.TORAM
	if c.LiftoffTASMS > 0 {
		sigma := perf.DensityKgM3(g.PressureAltM, t.AccelTempK) / perf.ISASeaLevelDensity
		ac.SpeedKIAS = math.Round(0.7 * units.Knots(c.LiftoffTASMS*math.Sqrt(sigma)))
	}
	return ac
}

func crosswindHelper(t spec.CardTemplate) layout.CrosswindHelper {
	h := layout.CrosswindHelper{}
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

func policyLine(p perf.Policy, e perf.RunwayEnd, covers perf.Effects) string {
	var parts []string
	sf, slf := p.SurfaceFactor(e.Surface, e.Condition), p.SlopeFactor(e.SlopePct)
	for _, f := range []struct {
		f       perf.Factor
		covered bool
	}{{sf, covers.Surface}, {slf, covers.Slope}} {
		if f.f.Value == 1 {
			continue
		}
		s := fmt.Sprintf("%s ×%.2f", f.f.Label(), f.f.Value)
		if f.covered {
			s += " (or the model's own figure if longer)"
		}
		parts = append(parts, s)
	}
	checks := p.OverallMultipliers(e)
	var cs []string
	for _, c := range checks {
		if c.Multiplier == 1 {
			cs = append(cs, "TOD ≤ "+c.Declared)
		} else {
			cs = append(cs, fmt.Sprintf("TOD ×%.2f ≤ %s", c.Multiplier, c.Declared))
		}
	}
	parts = append(parts, strings.Join(cs, ", "))
	return strings.Join(parts, " · ")
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
// the airfield's name, identifier and elevation, and the end itself.
func EndHash(f *perf.Airfield, e perf.RunwayEnd) string {
	return canonicalHash(struct {
		Name, Ident string
		ElevationM  float64
		End         perf.RunwayEnd
	}{f.Name, f.Ident, f.ElevationM, e})
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

// Rendered is a job's PDF and what went into it.
type Rendered struct {
	PDF   []byte
	Ends  []EndSummary
	Pages int
	// Time spent computing (perf: models, policies, grids, the accelerate check),
	// laying out (card data: units, rounding, fingerprint; card models) and writing
	// the PDF, for the batch benchmark.
	Compute, Layout, PDFTime time.Duration
}

// Render computes every runway end and writes one PDF of all their cards.
func (j *Job) Render(fonts *layout.Fonts) (*Rendered, error) {
	out := &Rendered{}
	j.computeTime = 0
	var cs []*layout.Card
	for _, e := range j.Airfield.Ends() {
		t0 := time.Now()
		d, g, err := j.Card(e)
		if err != nil {
			return nil, fmt.Errorf("airfield %s runway %s: %w", j.Airfield.Ident, e.Designator, err)
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
			return nil, fmt.Errorf("card %s %s: layout check failed: %v%s", j.Airfield.Ident, e.Designator, probs, more)
		}
		out.Layout += time.Since(t0)
		cs = append(cs, c)
		sum := EndSummary{Designator: e.Designator, Fingerprint: d.Fingerprint, Counts: map[perf.State]int{}}
		for _, blk := range g.Cells {
			for _, row := range blk {
				for _, c := range row {
					sum.Counts[c.State]++
				}
			}
		}
		out.Ends = append(out.Ends, sum)
	}
	out.Compute = j.computeTime
	out.Layout -= j.computeTime
	t0 := time.Now()
	var buf bytes.Buffer
	opt := layout.RenderOptions{Sheet: j.Sheet, Compress: j.Compress, Date: j.Date,
		Title: fmt.Sprintf("kneeprint cards: %s at %s", j.Aircraft.Name, j.Airfield.Name), Author: "kneeprint " + j.Version,
		Fonts: fonts}
	if err := layout.RenderPDF(&buf, cs, opt); err != nil {
		return nil, err
	}
	out.PDFTime = time.Since(t0)
	out.PDF = buf.Bytes()
	out.Pages = len(cs)
	if j.Sheet != nil {
		out.Pages = (len(cs) + 1) / 2
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
	if err := WriteAtomic(path, r.PDF); err != nil {
		return Result{}, err
	}
	return Result{Path: path, Pages: r.Pages, Ends: r.Ends}, nil
}

// WriteAtomic writes data to path through a temporary file in the same folder,
// synced, then renamed into place: no reader ever sees half a file.
func WriteAtomic(path string, data []byte) error {
	return WriteAtomicCtx(context.Background(), path, data)
}

// SampleVersion is the version printed on the committed sample cards, so that they
// do not change with every release.
const SampleVersion = "sample"

// WriteAtomicCtx is WriteAtomic that gives up, leaving nothing behind, when ctx is
// cancelled before the file is renamed into place.
func WriteAtomicCtx(ctx context.Context, path string, data []byte) (err error) {
	tmp, err := os.CreateTemp(filepath.Dir(path), "."+filepath.Base(path)+".*.tmp")
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
