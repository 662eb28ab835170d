// Package changes compares two versions of an airfield: what changed in its declared
// data, and which grid cells change state for a pilot because of it.
package changes

import (
	"fmt"
	"io"
	"math"
	"sort"
	"strings"

	"kneeprint/cmd/internal/report"
	"kneeprint/cmd/internal/spec"
	"kneeprint/cmd/internal/units"
	"kneeprint/perf"
)

// FieldChange is one changed value, printed as the pilot reads it.
type FieldChange struct {
	Designator string `json:"designator,omitempty"` // empty for the airfield itself
	Field      string `json:"field"`
	Old        string `json:"old"`
	New        string `json:"new"`
}

func (c FieldChange) String() string {
	where := "airfield"
	if c.Designator != "" {
		where = "runway " + c.Designator
	}
	return fmt.Sprintf("%s: %s %s -> %s", where, c.Field, c.Old, c.New)
}

func metres(m float64) string { return fmt.Sprintf("%.0f m", m) }

// EndFields lists what differs between two versions of a runway end: declared
// distances, heading, slope, surface, condition, threshold elevation, notes,
// obstacles.
func EndFields(old, new perf.RunwayEnd) []FieldChange {
	var out []FieldChange
	add := func(field, o, n string) {
		if o != n {
			out = append(out, FieldChange{Designator: new.Designator, Field: field, Old: o, New: n})
		}
	}
	add("TORA", metres(old.TORAM), metres(new.TORAM))
	add("TODA", metres(old.TODAM), metres(new.TODAM))
	add("ASDA", metres(old.ASDAM), metres(new.ASDAM))
	lda := func(m float64) string {
		if m == 0 {
			return "not declared"
		}
		return metres(m)
	}
	add("LDA", lda(old.LDAM), lda(new.LDAM))
	add("heading", fmt.Sprintf("%03.0f°", old.HeadingDeg), fmt.Sprintf("%03.0f°", new.HeadingDeg))
	add("slope", fmt.Sprintf("%+.2f %%", old.SlopePct), fmt.Sprintf("%+.2f %%", new.SlopePct))
	add("surface", string(old.Surface), string(new.Surface))
	add("condition", string(old.Condition), string(new.Condition))
	add("threshold elevation", fmt.Sprintf("%.0f ft", units.Feet(old.ElevationM)), fmt.Sprintf("%.0f ft", units.Feet(new.ElevationM)))
	add("notes", quote(old.Notes), quote(new.Notes))
	obstacleFields(old, new, add) // obstacle.go
	return out
}

func quote(s string) string {
	if s == "" {
		return "none"
	}
	return fmt.Sprintf("%q", s)
}

// CellChange is one grid cell whose state changed.
type CellChange struct {
	Aircraft     string   `json:"aircraft"`
	Designator   string   `json:"designator"`
	Side         string   `json:"side"` // "takeoff", or "landing": a cell of the landing grid (against the LDA)
	WeightKg     float64  `json:"weight_kg"`
	HeadwindKt   float64  `json:"headwind_kt"`
	TemperatureC float64  `json:"temperature_c"`
	Old          string   `json:"old_status"`
	New          string   `json:"new_status"`
	OldRequiredM *float64 `json:"old_required_m"`
	NewRequiredM *float64 `json:"new_required_m"`
	NewAvailable *float64 `json:"new_available_m"`
	// Obstacle is set when the new state is a no-go because the climb does not clear
	// an obstacle of the end, though the declared distance fits (perf.Cell.ObstacleNoGo);
	// ObstacleReason then says which and by how much ("35 ft powerline at 400 m past
	// the runway end: 12 ft clearance, 50 ft required").
	Obstacle       bool   `json:"obstacle"`
	ObstacleReason string `json:"obstacle_reason,omitempty"`
}

func (c CellChange) String() string {
	wind := "calm"
	if c.HeadwindKt < 0 {
		wind = fmt.Sprintf("%.0f kt tail", -c.HeadwindKt)
	} else if c.HeadwindKt > 0 {
		wind = fmt.Sprintf("%.0f kt head", c.HeadwindKt)
	}
	where := c.Designator
	if c.Side == "landing" {
		where += " landing"
	}
	s := fmt.Sprintf("runway %s, %s: %.0f °C, %s, %.0f kg: %s -> %s", where, c.Aircraft, c.TemperatureC, wind, c.WeightKg, c.Old, c.New)
	switch {
	case c.NewRequiredM != nil && c.NewAvailable != nil && c.ObstacleReason != "":
		s += fmt.Sprintf(" (%.0f m required, %.0f m available; %s)", *c.NewRequiredM, *c.NewAvailable, c.ObstacleReason)
	case c.NewRequiredM != nil && c.NewAvailable != nil:
		s += fmt.Sprintf(" (%.0f m required, %.0f m available)", *c.NewRequiredM, *c.NewAvailable)
	case c.ObstacleReason != "":
		s += " (" + c.ObstacleReason + ")"
	}
	return s
}

// Report is everything that changed between two versions of an airfield.
type Report struct {
	OldFile       string        `json:"old_file"`
	NewFile       string        `json:"new_file"`
	Airfield      []FieldChange `json:"airfield_changes"`
	Removed       []string      `json:"removed_runway_ends"`
	Added         []string      `json:"added_runway_ends"`
	Ends          []FieldChange `json:"runway_end_changes"`
	Cells         []CellChange  `json:"cell_changes"`
	CellsCompared int           `json:"cells_compared"`
	Changed       bool          `json:"changed"`
}

// Diff compares old and new for every aircraft over the grid of template t.
func Diff(aircraft []*perf.Aircraft, old, new *perf.Airfield, t spec.CardTemplate) (*Report, error) {
	r := &Report{}
	add := func(field, o, n string) {
		if o != n {
			r.Airfield = append(r.Airfield, FieldChange{Field: field, Old: o, New: n})
		}
	}
	add("name", old.Name, new.Name)
	add("ident", old.Ident, new.Ident)
	add("elevation", fmt.Sprintf("%.0f ft", units.Feet(old.ElevationM)), fmt.Sprintf("%.0f ft", units.Feet(new.ElevationM)))
	add("variation", fmt.Sprintf("%+.1f°", old.VariationDeg), fmt.Sprintf("%+.1f°", new.VariationDeg))

	oldEnds, newEnds := map[string]perf.RunwayEnd{}, map[string]perf.RunwayEnd{}
	for _, e := range old.Ends() {
		oldEnds[e.Designator] = e
	}
	for _, e := range new.Ends() {
		newEnds[e.Designator] = e
		if _, ok := oldEnds[e.Designator]; !ok {
			r.Added = append(r.Added, e.Designator)
		}
	}
	for _, e := range old.Ends() {
		ne, ok := newEnds[e.Designator]
		if !ok {
			r.Removed = append(r.Removed, e.Designator)
			continue
		}
		r.Ends = append(r.Ends, EndFields(e, ne)...)
	}
	pol, err := perf.PolicyByID(t.Policy)
	if err != nil {
		return nil, err
	}
	for _, a := range aircraft {
		m, err := perf.ModelFor(a)
		if err != nil {
			return nil, err
		}
		weights := append([]float64(nil), a.WeightsKg...)
		sort.Sort(sort.Reverse(sort.Float64Slice(weights)))
		gs := perf.GridSpec{TempsK: t.TempsK, HeadwindsMS: t.WindsMS, WeightsKg: weights, QNHPa: t.QNHPa, TightMargin: t.TightMargin, Rounding: t.Rounding(), ObstacleMarginM: t.ObstacleMarginM}
		for _, e := range old.Ends() {
			ne, ok := newEnds[e.Designator]
			if !ok {
				continue
			}
			og, err := perf.ComputeGrid(a, m, pol, *old, e, gs)
			if err != nil {
				return nil, err
			}
			ng, err := perf.ComputeGrid(a, m, pol, *new, ne, gs)
			if err != nil {
				return nil, err
			}
			r.compare(a, e.Designator, "takeoff", weights, gs, og, ng)
		}
		if a.Landing == nil || t.Landing == spec.LandingNone {
			continue
		}
		// The landing grids: an LDA change shows here, and only here.
		lm, err := perf.LandingModelFor(a)
		if err != nil {
			return nil, err
		}
		lgs := gs
		lgs.WeightsKg = perf.LandingMasses(a, weights, 0)
		for _, e := range old.Ends() {
			ne, ok := newEnds[e.Designator]
			if !ok {
				continue
			}
			og, err := perf.ComputeLandingGrid(a, lm, pol, *old, e, lgs)
			if err != nil {
				return nil, err
			}
			ng, err := perf.ComputeLandingGrid(a, lm, pol, *new, ne, lgs)
			if err != nil {
				return nil, err
			}
			r.compare(a, e.Designator, "landing", lgs.WeightsKg, lgs, og, ng)
		}
	}
	// Names alone do not matter to a pilot; everything else does.
	pilotFields := 0
	for _, c := range r.Airfield {
		if c.Field != "name" {
			pilotFields++
		}
	}
	r.Changed = pilotFields > 0 || len(r.Removed) > 0 || len(r.Added) > 0 || len(r.Ends) > 0 || len(r.Cells) > 0
	return r, nil
}

// compare adds every cell of grid og whose state differs in ng.
func (r *Report) compare(a *perf.Aircraft, designator, side string, weights []float64, gs perf.GridSpec, og, ng *perf.Grid) {
	for wi := range og.Cells {
		for hi := range og.Cells[wi] {
			for ti := range og.Cells[wi][hi] {
				oc, nc := og.Cells[wi][hi][ti], ng.Cells[wi][hi][ti]
				r.CellsCompared++
				if oc.State == nc.State {
					continue
				}
				r.Cells = append(r.Cells, CellChange{
					Aircraft: a.Name, Designator: designator, Side: side, WeightKg: weights[wi],
					HeadwindKt: math.Round(units.Knots(gs.HeadwindsMS[hi])), TemperatureC: math.Round(units.Celsius(gs.TempsK[ti])),
					Old: oc.State.String(), New: nc.State.String(),
					OldRequiredM: required(oc), NewRequiredM: required(nc), NewAvailable: available(nc),
					Obstacle: nc.ObstacleNoGo, ObstacleReason: obstacleReason(nc),
				})
			}
		}
	}
}

func required(c perf.Cell) *float64 {
	if !c.HasDistance {
		return nil
	}
	v := math.Ceil(c.RequiredM - 1e-9)
	return &v
}

func available(c perf.Cell) *float64 {
	if !c.HasDistance {
		return nil
	}
	v := math.Floor(c.AvailableM)
	return &v
}

// WriteText prints the report as a pilot reads it.
func (r *Report) WriteText(w io.Writer) error {
	b := &strings.Builder{}
	fmt.Fprintf(b, "%s -> %s\n", r.OldFile, r.NewFile)
	if !r.Changed {
		fmt.Fprintf(b, "nothing a pilot must know changed (%d cells compared)\n", r.CellsCompared)
	}
	for _, c := range r.Airfield {
		fmt.Fprintf(b, "  %s\n", c)
	}
	for _, d := range r.Removed {
		fmt.Fprintf(b, "  runway %s: REMOVED: its cards must be withdrawn\n", d)
	}
	for _, d := range r.Added {
		fmt.Fprintf(b, "  runway %s: NEW: it has no card yet\n", d)
	}
	for _, c := range r.Ends {
		fmt.Fprintf(b, "  %s\n", c)
	}
	if len(r.Cells) > 0 {
		fmt.Fprintf(b, "\n%d of %d cells change state:\n", len(r.Cells), r.CellsCompared)
		for _, c := range r.Cells {
			fmt.Fprintf(b, "  %s\n", c)
		}
	} else if r.Changed {
		fmt.Fprintf(b, "\nno cell changes state (%d cells compared)\n", r.CellsCompared)
	}
	_, err := io.WriteString(w, b.String())
	return err
}

// WriteJSON writes the report as indented JSON.
func (r *Report) WriteJSON(w io.Writer) error {
	if r.Airfield == nil {
		r.Airfield = []FieldChange{}
	}
	for _, p := range []*[]string{&r.Removed, &r.Added} {
		if *p == nil {
			*p = []string{}
		}
	}
	if r.Ends == nil {
		r.Ends = []FieldChange{}
	}
	if r.Cells == nil {
		r.Cells = []CellChange{}
	}
	return report.WriteJSON(w, r)
}

// obstacleReason is why an obstacle stops cell c, the obstacles' reasons joined, when
// an obstacle is what makes it a no-go (the declared distance fits); "" otherwise.
func obstacleReason(c perf.Cell) string {
	if !c.ObstacleNoGo {
		return ""
	}
	return strings.Join(c.ObstacleReasons(), "; ")
}
