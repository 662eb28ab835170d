package report

import (
	"encoding/csv"
	"fmt"
	"io"
	"math"
	"strconv"
	"strings"

	"kneeprint/cmd/internal/units"
	"kneeprint/perf"
)

// GridInput names what the grids are for.
type GridInput struct {
	Aircraft *perf.Aircraft
	Airfield *perf.Airfield
	Policy   perf.Policy
	Grids    []*perf.Grid
	// Landing says the grids are landing grids (grid --landing).
	Landing bool
}

// GridRun is the JSON form of the grids of one aircraft at one airfield.
type GridRun struct {
	Aircraft           string  `json:"aircraft"`
	Airfield           string  `json:"airfield"`
	Ident              string  `json:"ident"`
	Policy             string  `json:"policy"`
	Model              string  `json:"model"`
	ModelLine          string  `json:"model_line"`
	ElevationFt        float64 `json:"elevation_ft"`
	QNHhPa             float64 `json:"qnh_hpa"`
	PressureAltitudeFt float64 `json:"pressure_altitude_ft"`
	TightMarginPct     float64 `json:"tight_margin_pct"`
	// Side is "takeoff", or "landing" for grid --landing: then each cell's
	// distance_50ft_m is the landing distance from 50 ft and available_m the LDA.
	Side    string    `json:"side"`
	Ends    []GridEnd `json:"runway_ends"`
	Caution string    `json:"caution"`
}

// GridEnd is one runway end's grid.
type GridEnd struct {
	Designator string  `json:"designator"`
	HeadingDeg float64 `json:"heading_deg"`
	Surface    string  `json:"surface"`
	Condition  string  `json:"condition"`
	SlopePct   float64 `json:"slope_pct"`
	TORAM      float64 `json:"tora_m"`
	TODAM      float64 `json:"toda_m"`
	ASDAM      float64 `json:"asda_m"`
	LDAM       float64 `json:"lda_m"` // 0 when the runway end declares none
	// The elevation this end's pressure altitude is taken at (the highest of the
	// aerodrome elevation and the runway's thresholds) and that pressure altitude.
	ElevationUsedFt    float64        `json:"elevation_used_ft"`
	PressureAltitudeFt float64        `json:"pressure_altitude_ft"`
	Obstacles          []GridObstacle `json:"obstacles"`          // past the end of the TORA (obstacle.go)
	ObstacleMarginFt   float64        `json:"obstacle_margin_ft"` // the clearance each must be passed by
	Cells              []GridCell     `json:"cells"`
}

// GridCell is one cell.
type GridCell struct {
	WeightKg       float64 `json:"weight_kg"`
	HeadwindKt     float64 `json:"headwind_kt"`
	TemperatureC   float64 `json:"temperature_c"`
	CreditedWindKt float64 `json:"credited_headwind_kt"`
	Distances
	Status  string   `json:"status"`
	Reasons []string `json:"reasons"`
	// On a runway end with obstacles: the climb gradient over the ground (percent,
	// credited wind), the least clearance (ft) and whether the cell is a no-go that
	// fits the declared distances but does not clear an obstacle; null, null, false
	// otherwise.
	ClimbGradientPct *float64 `json:"climb_gradient_pct"`
	LeastClearanceFt *float64 `json:"least_clearance_ft"`
	Obstacle         bool     `json:"obstacle"`
}

// BuildGrid turns grids into their JSON form.
func BuildGrid(in GridInput) GridRun {
	r := GridRun{
		Aircraft: in.Aircraft.Name, Airfield: in.Airfield.Name, Ident: in.Airfield.Ident,
		Policy: in.Policy.ID, Model: string(in.Aircraft.Model), ModelLine: perf.ModelLine(in.Aircraft),
		ElevationFt: math.Round(units.Feet(in.Airfield.ElevationM)), Caution: Caution, Side: "takeoff",
	}
	if in.Landing {
		r.Side = "landing"
		if in.Aircraft.Landing != nil {
			r.Model, r.ModelLine = string(in.Aircraft.Landing.Model), perf.LandingModelLine(in.Aircraft)
		}
	}
	for _, g := range in.Grids {
		r.QNHhPa = round1(units.HPa(g.Spec.QNHPa))
		// At the aerodrome elevation; each end's own is in its runway_ends entry.
		r.PressureAltitudeFt = math.Round(units.Feet(perf.PressureAltitudeFromQNH(g.Spec.QNHPa, in.Airfield.ElevationM)))
		r.TightMarginPct = round1(g.Spec.TightMargin * 100)
		ge := GridEnd{
			Designator: g.End.Designator, HeadingDeg: g.End.HeadingDeg, Surface: string(g.End.Surface),
			Condition: string(g.End.Condition), SlopePct: math.Round(g.End.SlopePct*100) / 100,
			TORAM: g.End.TORAM, TODAM: g.End.TODAM, ASDAM: g.End.ASDAM, LDAM: g.End.LDAM,
			ElevationUsedFt:    math.Round(units.Feet(g.ElevationM)),
			PressureAltitudeFt: math.Round(units.Feet(g.PressureAltM)),
			Obstacles:          gridObstacles(g.End),
			ObstacleMarginFt:   ceilFt(perf.ObstacleMargin(g.Spec.ObstacleMarginM)),
		}
		if in.Landing { // obstacles past the end of the TORA are the takeoff's
			ge.Obstacles, ge.ObstacleMarginFt = []GridObstacle{}, 0
		}
		for _, blk := range g.Cells {
			for _, row := range blk {
				for _, c := range row {
					gc := GridCell{
						WeightKg: c.MassKg, HeadwindKt: round1(units.Knots(c.HeadwindMS)),
						TemperatureC: round1(units.Celsius(c.TempK)), CreditedWindKt: round1(units.Knots(c.CreditedWindMS)),
						Status: c.State.String(), Reasons: c.Reasons(),
					}
					if gc.Reasons == nil {
						gc.Reasons = []string{}
					}
					gc.Distances = distances(c)
					gc.ClimbGradientPct, gc.LeastClearanceFt = cellClimb(c)
					gc.Obstacle = c.ObstacleNoGo
					ge.Cells = append(ge.Cells, gc)
				}
			}
		}
		r.Ends = append(r.Ends, ge)
	}
	return r
}

// WriteGridJSON writes the grids as indented JSON.
func WriteGridJSON(w io.Writer, run GridRun) error { return WriteJSON(w, run) }

// WriteGridCSV writes one row per cell, with a header row.
func WriteGridCSV(w io.Writer, run GridRun) error {
	cw := csv.NewWriter(w)
	_ = cw.Write([]string{"ident", "designator", "weight_kg", "headwind_kt", "temperature_c", "credited_headwind_kt",
		"ground_roll_m", "distance_50ft_m", "required_m", "available_m", "limiting", "status", "reasons",
		"climb_gradient_pct", "least_clearance_ft", "obstacle"})
	num := func(p *float64) string {
		if p == nil {
			return ""
		}
		return strconv.FormatFloat(*p, 'f', -1, 64)
	}
	for _, e := range run.Ends {
		for _, c := range e.Cells {
			_ = cw.Write([]string{run.Ident, e.Designator, strconv.FormatFloat(c.WeightKg, 'f', -1, 64),
				strconv.FormatFloat(c.HeadwindKt, 'f', -1, 64), strconv.FormatFloat(c.TemperatureC, 'f', -1, 64),
				strconv.FormatFloat(c.CreditedWindKt, 'f', -1, 64), num(c.GroundRollM), num(c.Distance50ftM),
				num(c.RequiredM), num(c.AvailableM), c.Limiting, c.Status, strings.Join(c.Reasons, "; "),
				num(c.ClimbGradientPct), num(c.LeastClearanceFt), strconv.FormatBool(c.Obstacle)})
		}
	}
	cw.Flush()
	return cw.Error()
}

// Terminal marks after a number: our own, plain ASCII so any terminal shows them.
var textMarks = map[perf.State]string{
	perf.Go:           " ",
	perf.Tight:        "~",
	perf.NoGo:         "X",
	perf.NoData:       "?",
	perf.BeyondLimits: "L",
}

// WriteGridText writes each runway end's grid as a table: one block per weight, rows
// of wind, columns of temperature, each cell the required distance in metres rounded
// up, marked by its state.
func WriteGridText(w io.Writer, in GridInput) error {
	b := &strings.Builder{}
	model := perf.ModelLine(in.Aircraft)
	if in.Landing {
		model = perf.LandingModelLine(in.Aircraft)
	}
	fmt.Fprintf(b, "%s at %s (%s), policy %s (%s)\n", in.Aircraft.Name, in.Airfield.Name, in.Airfield.Ident, in.Policy.ID, model)
	if in.Landing {
		fmt.Fprintf(b, "LANDING: required landing distance in m (from 50 ft, factored, rounded up) against the LDA.  ~ tight (less than the margin spare)  X no-go  ? no data  L beyond limits\n")
	} else {
		fmt.Fprintf(b, "required distance in m (rounded up).  ~ tight (less than the margin spare)  X no-go  ^ no-go: fits, an obstacle not cleared  ? no data  L beyond limits\n")
	}
	for _, g := range in.Grids {
		e := g.End
		if in.Landing {
			lda := "no LDA declared"
			if e.LDAM > 0 {
				lda = fmt.Sprintf("LDA %.0f m", math.Floor(e.LDAM))
			}
			fmt.Fprintf(b, "\nrunway %s, %03.0f° M, %s %s, slope %+.1f %%; %s; QNH %.0f hPa assumed at %.0f ft -> PA %.0f ft\n",
				e.Designator, e.HeadingDeg, e.Surface, e.Condition, e.SlopePct, lda, units.HPa(g.Spec.QNHPa), units.Feet(g.ElevationM), units.Feet(g.PressureAltM))
			for _, c := range g.Policy.Landing().Cautions(e) {
				fmt.Fprintf(b, "  %s\n", c)
			}
		} else {
			fmt.Fprintf(b, "\nrunway %s, %03.0f° M, %s %s, slope %+.1f %%; TORA %.0f TODA %.0f ASDA %.0f m; QNH %.0f hPa assumed at %.0f ft -> PA %.0f ft\n",
				e.Designator, e.HeadingDeg, e.Surface, e.Condition, e.SlopePct, e.TORAM, e.TODAM, e.ASDAM, units.HPa(g.Spec.QNHPa), units.Feet(g.ElevationM), units.Feet(g.PressureAltM))
			if c := g.Policy.SlopeCaution(e.SlopePct); c != "" {
				fmt.Fprintf(b, "  %s\n", c)
			}
		}
		for _, o := range e.Obstacles {
			if in.Landing {
				break // obstacles past the end of the TORA are the takeoff's
			}
			fmt.Fprintf(b, "  obstacle: %s %.0f ft, %.0f m past the end: to be cleared by %.0f ft\n", o.Note, ceilFt(o.HeightM), math.Floor(o.PastEndM+1e-9), ceilFt(perf.ObstacleMargin(g.Spec.ObstacleMarginM)))
		}
		for wi, blk := range g.Cells {
			fmt.Fprintf(b, "  %.0f kg      ", g.Spec.WeightsKg[wi])
			for _, t := range g.Spec.TempsK {
				fmt.Fprintf(b, "%6.0fC", units.Celsius(t))
			}
			b.WriteString("\n")
			for hi, row := range blk {
				kt := units.Knots(g.Spec.HeadwindsMS[hi])
				label := fmt.Sprintf("head %2.0f kt", kt)
				if kt < 0 {
					label = fmt.Sprintf("tail %2.0f kt", -kt)
				}
				fmt.Fprintf(b, "  %-12s", label)
				for _, c := range row {
					mark := textMarks[c.State]
					if c.ObstacleNoGo {
						mark = "^"
					}
					if c.HasDistance && c.State != perf.BeyondLimits && c.State != perf.NoData { // no data with a distance: an end with obstacles and no climb (issue 12)
						fmt.Fprintf(b, "%6.0f%s", ceilM(c.RequiredM), mark)
					} else {
						fmt.Fprintf(b, "%6s%s", "--", textMarks[c.State])
					}
				}
				b.WriteString("\n")
			}
		}
	}
	fmt.Fprintf(b, "\n%s\n", Caution)
	_, err := io.WriteString(w, b.String())
	return err
}
