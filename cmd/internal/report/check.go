// Package report writes kneeprint's answers for a terminal, as CSV and as JSON. The
// JSON field names are stable and documented in the README.
package report

import (
	"fmt"
	"io"
	"math"
	"strings"

	"kneeprint/cmd/internal/units"
	"kneeprint/perf"
)

// Caution is the one-line caution every output carries.
const Caution = "Not a substitute for the approved flight manual. The pilot in command decides. Local rules and licensed practice prevail."

// CheckInput is what the check was asked, for printing.
type CheckInput struct {
	Aircraft *perf.Aircraft
	Airfield *perf.Airfield
	Policy   perf.Policy
	Question perf.Question
	WindText string // as the user wrote it, or the report's wind group
	// WindSource says where the wind's reference came from, e.g. "tower form" or
	// "report group"; the reference itself is Question.Wind.True.
	WindSource string
	// METAR is the routine weather report given with --metar, if any; FromReport
	// lists what was taken from it and FlagsOverReport the flags that replaced one of
	// its values, each as a short sentence.
	METAR           string
	FromReport      []string
	FlagsOverReport []string
	// Warnings are what looks wrong in the question though it was answered (a
	// report's dew point above its temperature).
	Warnings []string
}

// CheckRun is the JSON form of one check.
type CheckRun struct {
	Aircraft           string     `json:"aircraft"`
	Airfield           string     `json:"airfield"`
	Ident              string     `json:"ident"`
	Policy             string     `json:"policy"`
	Model              string     `json:"model"`
	ModelLine          string     `json:"model_line"`
	ElevationFt        float64    `json:"elevation_ft"`
	QNHhPa             float64    `json:"qnh_hpa"`
	PressureAltitudeFt float64    `json:"pressure_altitude_ft"`
	DensityAltitudeFt  float64    `json:"density_altitude_ft"`
	TemperatureC       float64    `json:"temperature_c"`
	ISADeviationC      float64    `json:"isa_deviation_c"`
	WeightKg           float64    `json:"weight_kg"`
	Wind               string     `json:"wind"`
	WindTrue           bool       `json:"wind_true"`
	WindReference      string     `json:"wind_reference"` // "magnetic" or "true"
	WindSource         string     `json:"wind_source"`
	METAR              string     `json:"metar,omitempty"`
	FromReport         []string   `json:"from_report,omitempty"`
	FlagsOverReport    []string   `json:"flags_over_report,omitempty"`
	Warnings           []string   `json:"warnings,omitempty"`
	Ends               []CheckEnd `json:"runway_ends"`
	// The landing answer (check --landing, or by default when the profile has landing
	// data): the landing model, the landing weight and every runway end, best first.
	LandingModel    string            `json:"landing_model,omitempty"`
	LandingWeightKg float64           `json:"landing_weight_kg,omitempty"`
	Landing         []CheckLandingEnd `json:"landing_runway_ends,omitempty"`
	Caution         string            `json:"caution"`
}

// EndHead is what the takeoff and the landing answers of a runway end both give
// first: its rank and identity, and the atmosphere and wind at this end. The
// elevation used is the highest of the aerodrome elevation and the runway's
// thresholds.
type EndHead struct {
	Rank               int     `json:"rank"`
	Designator         string  `json:"designator"`
	HeadingDeg         float64 `json:"heading_deg"`
	Surface            string  `json:"surface"`
	Condition          string  `json:"condition"`
	SlopePct           float64 `json:"slope_pct"`
	ElevationUsedFt    float64 `json:"elevation_used_ft"`
	PressureAltitudeFt float64 `json:"pressure_altitude_ft"`
	DensityAltitudeFt  float64 `json:"density_altitude_ft"`
	HeadwindKt         float64 `json:"headwind_kt"`
	GustHeadwindKt     float64 `json:"gust_headwind_kt"`
	DistanceWindKt     float64 `json:"headwind_for_distance_kt"`
	CrosswindKt        float64 `json:"crosswind_kt"`
	GustCrosswindKt    float64 `json:"gust_crosswind_kt"`
	CreditedWindKt     float64 `json:"credited_headwind_kt"`
}

func endHead(i int, ea perf.EndAnswer) EndHead {
	return EndHead{
		Rank: i + 1, Designator: ea.End.Designator, HeadingDeg: ea.End.HeadingDeg,
		Surface: string(ea.End.Surface), Condition: string(ea.End.Condition), SlopePct: math.Round(ea.End.SlopePct*100) / 100,
		ElevationUsedFt:    math.Round(units.Feet(ea.ElevationM)),
		PressureAltitudeFt: math.Round(units.Feet(ea.PressureAltM)),
		DensityAltitudeFt:  math.Round(units.Feet(ea.DensityAltM)),
		HeadwindKt:         round1(units.Knots(ea.Wind.HeadwindMS)), GustHeadwindKt: round1(units.Knots(ea.Wind.GustHeadwindMS)),
		DistanceWindKt: round1(units.Knots(ea.Wind.ForDistanceMS())),
		CrosswindKt:    round1(units.Knots(ea.Wind.CrosswindMS)), GustCrosswindKt: round1(units.Knots(ea.Wind.GustCrosswindMS)),
		CreditedWindKt: round1(units.Knots(ea.Cell.CreditedWindMS)),
	}
}

// CheckEnd is the JSON form of one runway end's answer.
type CheckEnd struct {
	EndHead
	Distances
	AccelerateCheckM *float64 `json:"accelerate_check_m"`
	TORAM            float64  `json:"tora_m"`
	TODAM            float64  `json:"toda_m"`
	ASDAM            float64  `json:"asda_m"`
	Rule             string   `json:"rule"`
	Factors          []string `json:"factors"`
	PolicyNotes      []string `json:"policy_notes"`
	PolicyCaution    string   `json:"policy_caution"`
	Status           string   `json:"status"`
	Reasons          []string `json:"reasons"`
	CheckObstacles
}

func round1(x float64) float64 { return math.Round(x*10) / 10 }

// ceilM rounds a distance up to the whole metre: a printed distance is never shorter
// than the one computed.
func ceilM(x float64) float64 { return math.Ceil(x - 1e-9) }

func ptr(x float64) *float64 { return &x }

// Distances are a cell's figures in JSON: null where the cell has none.
type Distances struct {
	GroundRollM   *float64 `json:"ground_roll_m"`   // unfactored, rounded up
	Distance50ftM *float64 `json:"distance_50ft_m"` // unfactored, rounded up
	RequiredM     *float64 `json:"required_m"`      // of the limiting declared distance, rounded up
	AvailableM    *float64 `json:"available_m"`     // rounded down
	Limiting      string   `json:"limiting"`
}

func distances(c perf.Cell) Distances {
	if !c.HasDistance {
		return Distances{}
	}
	return Distances{ptr(ceilM(c.GroundRollM)), ptr(ceilM(c.To50ftM)), ptr(ceilM(c.RequiredM)), ptr(math.Floor(c.AvailableM)), c.Limiting}
}

// BuildCheck turns an answer into its JSON form.
func BuildCheck(in CheckInput, ans perf.Answer) CheckRun {
	r := CheckRun{
		Aircraft: in.Aircraft.Name, Airfield: in.Airfield.Name, Ident: in.Airfield.Ident,
		Policy: in.Policy.ID, Model: string(in.Aircraft.Model), ModelLine: perf.ModelLine(in.Aircraft),
		ElevationFt:        math.Round(units.Feet(ans.ElevationM)),
		QNHhPa:             round1(units.HPa(in.Question.QNHPa)),
		PressureAltitudeFt: math.Round(units.Feet(ans.PressureAltM)),
		DensityAltitudeFt:  math.Round(units.Feet(ans.DensityAltM)),
		TemperatureC:       round1(units.Celsius(in.Question.TempK)),
		ISADeviationC:      round1(ans.ISADevK),
		WeightKg:           math.Round(in.Question.MassKg),
		Wind:               in.WindText, WindTrue: in.Question.Wind.True,
		WindReference: map[bool]string{true: "true", false: "magnetic"}[in.Question.Wind.True],
		WindSource:    in.WindSource,
		METAR:         in.METAR, FromReport: in.FromReport, FlagsOverReport: in.FlagsOverReport, Warnings: in.Warnings,
		Caution: Caution,
	}
	for i, ea := range ans.Ends {
		c := ea.Cell
		e := CheckEnd{
			EndHead: endHead(i, ea),
			TORAM:   ea.End.TORAM, TODAM: ea.End.TODAM, ASDAM: ea.End.ASDAM,
			Status: c.State.String(), Reasons: c.Reasons(), Factors: []string{}, PolicyNotes: []string{},
		}
		if e.Reasons == nil {
			e.Reasons = []string{}
		}
		e.Distances = distances(c)
		e.CheckObstacles = buildObstacles(in, ea) // obstacle.go
		if c.HasDistance {
			e.AccelerateCheckM = ptr(ceilM(c.AccelCheckM))
			e.Rule = c.Requirement.Rule
			e.PolicyCaution = c.Requirement.Caution
			for _, f := range c.Requirement.Factors {
				e.Factors = append(e.Factors, fmt.Sprintf("%s %s (%s)", factorLabel(f), multiplier(f.Value), f.Source))
			}
			if c.Covers.Surface || c.Covers.Slope {
				e.Factors = append(e.Factors, "floor: "+perf.FloorRule)
			}
			for _, ch := range c.Requirement.Checks {
				f := ch.Declared + " " + multiplier(ch.Multiplier)
				if ch.Note != "" {
					f += " (" + ch.Note + ")"
					e.PolicyNotes = append(e.PolicyNotes, ch.Note)
				}
				e.Factors = append(e.Factors, f)
			}
		}
		r.Ends = append(r.Ends, e)
	}
	return r
}

// WriteCheckJSON writes the check as indented JSON.
func WriteCheckJSON(w io.Writer, run CheckRun) error { return WriteJSON(w, run) }

// WriteCheckText writes the check for a terminal.
func WriteCheckText(w io.Writer, run CheckRun) error {
	b := &strings.Builder{}
	fmt.Fprintf(b, "%s at %s (%s), policy %s (%s)\n", run.Aircraft, run.Airfield, run.Ident, run.Policy, run.ModelLine)
	fmt.Fprintf(b, "elevation %.0f ft, QNH %.1f hPa -> pressure altitude %.0f ft; %.0f C (ISA%+.0f) -> density altitude %.0f ft; weight %.0f kg\n",
		run.ElevationFt, run.QNHhPa, run.PressureAltitudeFt, run.TemperatureC, run.ISADeviationC, run.DensityAltitudeFt, run.WeightKg)
	fmt.Fprintf(b, "wind %s, %s (%s)\n", run.Wind, run.WindReference, run.WindSource)
	if run.METAR != "" {
		fmt.Fprintf(b, "report: %s\n", run.METAR)
		if len(run.FromReport) > 0 {
			fmt.Fprintf(b, "  taken from it: %s\n", strings.Join(run.FromReport, "; "))
		}
		for _, f := range run.FlagsOverReport {
			fmt.Fprintf(b, "  given by flag instead: %s\n", f)
		}
	}
	for _, w := range run.Warnings {
		fmt.Fprintf(b, "WARNING: %s\n", w)
	}
	b.WriteString("\n")
	if len(run.Ends) > 0 {
		if run.Landing != nil {
			fmt.Fprintf(b, "TAKEOFF (%s model), weight %.0f kg\n", run.Model, run.WeightKg)
		}
		writeTakeoffText(b, run)
	}
	if run.Landing != nil {
		writeLandingText(b, run)
	}
	fmt.Fprintf(b, "\nhead, cross: the reported steady components, gust: the same from the gust (negative head: tailwind);\n")
	fmt.Fprintf(b, "a tailwind counts at its gust, a headwind at its steady speed; distances rounded up.\n%s\n", Caution)
	_, err := io.WriteString(w, b.String())
	return err
}

// writeTakeoffText writes the takeoff answer's table.
func writeTakeoffText(b *strings.Builder, run CheckRun) {
	fmt.Fprintf(b, "%-4s %-4s %-13s %7s %7s %7s %7s %8s %8s %9s %9s %-5s  %s\n", "rank", "rwy", "surface", "head", "gust", "cross", "gust", "roll m", "50ft m", "required", "available", "limit", "status")
	for _, e := range run.Ends {
		dist := func(p *float64) string {
			if p == nil {
				return "-"
			}
			return fmt.Sprintf("%.0f", *p)
		}
		fmt.Fprintf(b, "%-4d %-4s %-13s %5.1fkt %5.1fkt %5.1fkt %5.1fkt %8s %8s %9s %9s %-5s  %s\n",
			e.Rank, e.Designator, e.Surface+" "+e.Condition, e.HeadwindKt, e.GustHeadwindKt, e.CrosswindKt, e.GustCrosswindKt,
			dist(e.GroundRollM), dist(e.Distance50ftM), dist(e.RequiredM), dist(e.AvailableM), e.Limiting, strings.ToUpper(e.Status))
		if e.ElevationUsedFt != run.ElevationFt {
			fmt.Fprintf(b, "         - pressure altitude %.0f ft, taken at %.0f ft: this runway's highest threshold, above the aerodrome elevation\n", e.PressureAltitudeFt, e.ElevationUsedFt)
		}
		if e.DistanceWindKt < 0 {
			fmt.Fprintf(b, "         - distance and tailwind limit taken with a %.1f kt tailwind (the gust counts for a tailwind)\n", -e.DistanceWindKt)
		}
		if e.Rule != "" && strings.HasPrefix(e.Rule, "CAT.POL") {
			fmt.Fprintf(b, "         - rule used: %s\n", e.Rule)
		}
		for _, n := range e.PolicyNotes {
			fmt.Fprintf(b, "         - %s\n", n)
		}
		if e.PolicyCaution != "" {
			fmt.Fprintf(b, "         - %s\n", e.PolicyCaution)
		}
		for _, r := range e.Reasons {
			fmt.Fprintf(b, "         - %s\n", r)
		}
		writeObstacles(b, e) // obstacle.go
	}
}
