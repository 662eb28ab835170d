package report

import (
	"fmt"
	"math"
	"strings"

	"kneeprint/perf"
)

// CheckLandingEnd is the JSON form of one runway end's landing answer (check).
type CheckLandingEnd struct {
	EndHead
	// GroundRollM and LandingDistanceM are the model's unfactored figures: touchdown
	// to a stop, and 50 ft over the threshold to a stop; RequiredM the factored
	// landing distance times the rule's factor; AvailableM the LDA as printed.
	GroundRollM      *float64 `json:"ground_roll_m"`
	LandingDistanceM *float64 `json:"landing_distance_m"`
	RequiredM        *float64 `json:"required_m"`
	AvailableM       *float64 `json:"available_m"`
	LDAM             *float64 `json:"lda_m"` // null when the runway end declares none
	Rule             string   `json:"rule"`
	Factors          []string `json:"factors"`
	PolicyCaution    string   `json:"policy_caution"`
	Status           string   `json:"status"`
	Reasons          []string `json:"reasons"`
}

// BuildLanding is the JSON form of a landing answer, ends best first.
func BuildLanding(ans perf.Answer) []CheckLandingEnd {
	out := []CheckLandingEnd{}
	for i, ea := range ans.Ends {
		c := ea.Cell
		e := CheckLandingEnd{
			EndHead: endHead(i, ea),
			Status:  c.State.String(), Reasons: c.Reasons(), Factors: []string{},
		}
		if e.Reasons == nil {
			e.Reasons = []string{}
		}
		if ea.End.LDAM > 0 {
			e.LDAM = ptr(math.Floor(ea.End.LDAM))
		}
		if c.HasDistance {
			e.GroundRollM, e.LandingDistanceM = ptr(ceilM(c.GroundRollM)), ptr(ceilM(c.To50ftM))
			e.RequiredM, e.AvailableM = ptr(ceilM(c.RequiredM)), ptr(math.Floor(c.AvailableM))
			e.Rule, e.PolicyCaution = c.Requirement.Rule, c.Requirement.Caution
			for _, f := range c.Requirement.Factors {
				e.Factors = append(e.Factors, fmt.Sprintf("%s %s (%s)", factorLabel(f), multiplier(f.Value), f.Source))
			}
			if c.Covers.Surface || c.Covers.Slope {
				e.Factors = append(e.Factors, "floor: "+perf.FloorRule)
			}
			for _, ch := range c.Requirement.Checks {
				e.Factors = append(e.Factors, ch.Declared+" "+multiplier(ch.Multiplier))
			}
		}
		out = append(out, e)
	}
	return out
}

// factorLabel names a factor with the slope it is for ("upslope 0.3 %", "downslope
// 1.25 %"), the slope as exactly as the factor uses it (slopeText).
func factorLabel(f perf.Factor) string {
	if f.Name == "upslope" || f.Name == "downslope" {
		return f.Name + " " + slopeText(f.Pct) + " %"
	}
	return f.Name
}

// writeLandingText writes the landing answer for a terminal, after the takeoff's.
func writeLandingText(b *strings.Builder, run CheckRun) {
	fmt.Fprintf(b, "\nLANDING (%s model), weight %.0f kg: landing distance from 50 ft, factored, against the LDA\n", run.LandingModel, run.LandingWeightKg)
	fmt.Fprintf(b, "%-4s %-4s %-13s %7s %7s %7s %7s %8s %8s %9s %9s  %s\n", "rank", "rwy", "surface", "head", "gust", "cross", "gust", "roll m", "land m", "required", "LDA", "status")
	dist := func(p *float64) string {
		if p == nil {
			return "-"
		}
		return fmt.Sprintf("%.0f", *p)
	}
	for _, e := range run.Landing {
		fmt.Fprintf(b, "%-4d %-4s %-13s %5.1fkt %5.1fkt %5.1fkt %5.1fkt %8s %8s %9s %9s  %s\n",
			e.Rank, e.Designator, e.Surface+" "+e.Condition, e.HeadwindKt, e.GustHeadwindKt, e.CrosswindKt, e.GustCrosswindKt,
			dist(e.GroundRollM), dist(e.LandingDistanceM), dist(e.RequiredM), dist(e.LDAM), strings.ToUpper(e.Status))
		if e.Rule != "" && strings.HasPrefix(e.Rule, "CAT.POL") {
			fmt.Fprintf(b, "         - rule used: %s\n", e.Rule)
		}
		if e.PolicyCaution != "" {
			fmt.Fprintf(b, "         - %s\n", e.PolicyCaution)
		}
		for _, r := range e.Reasons {
			fmt.Fprintf(b, "         - %s\n", r)
		}
	}
}
