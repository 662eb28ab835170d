package perf

import (
	"fmt"
	"math"
)

// LandingPolicy is the landing half of a published policy: surface and slope
// factors on the landing distance from 50 ft, and the overall factor it must fit the
// LDA with.
type LandingPolicy struct {
	Title  string
	Source string
	// surface and slope give the published factors for a paved, dry, level basis;
	// surface includes the wet-runway factor.
	surface func(Surface, Condition) Factor
	slope   func(pct float64) Factor
	// rule is the rule's name and its factor on the landing distance, compared with
	// the LDA.
	rule       string
	multiplier float64
	// wetGrassCaution is printed on a wet grass runway end, if not empty.
	wetGrassCaution string
	// slopeNoData: past publishedSlopePct (either way) the policy gives no landing
	// figure (see CheckSlope); otherwise a downslope past it carries a caution.
	slopeNoData bool
}

// The landing factor of EU Air OPS class B: a full-stop landing from 50 ft within
// 70 % of the LDA (Regulation (EU) No 965/2012 Annex IV CAT.POL.A.330(a), read in the
// UK CAA regulatory library), i.e. LDA at least LD / 0.7 = 1.43 LD (GM1 CAT.POL.A.430,
// Table 1, for the same 70 %).
const euLandingMultiplier = 1 / 0.7

// EU wet-runway factor: the LDA at least 115 % of the CAT.POL.A.330 distance
// (CAT.POL.A.335(a) as the integrator's pinned sources quote it; the same 15 % is in
// GM1 CAT.POL.A.430, Table 2: 1.15 x 1.43 = 1.64, and GM1 CAT.POL.A.335(b) names "the
// wet factor (1.15)").
const euWetLanding = 1.15

// EU grass landing factor x1.15: AMC1 CAT.POL.A.330 (the table was not read; the
// factor as CAP 698 quotes it in secondary texts).
const euGrassLanding = 1.15

// landingPolicies holds the landing half of each policy, by policy identifier.
var landingPolicies = map[string]LandingPolicy{
	PolicyEUClassB: {
		Title: "EU Air OPS performance class B",
		Source: "Regulation (EU) No 965/2012 Annex IV CAT.POL.A.330 (dry) and CAT.POL.A.335 (wet), " +
			"AMC1 and AMC2 CAT.POL.A.330, GM1 CAT.POL.A.335",
		surface: func(s Surface, c Condition) Factor {
			switch {
			case s != Paved && c == Wet:
				return Factor{Name: "wet grass", Value: euGrassLanding * euWetLanding,
					Source: "AMC1 CAT.POL.A.330: grass x1.15 (secondary quotation), and CAT.POL.A.335(a): wet x1.15"}
			case s != Paved:
				return Factor{Name: "dry grass", Value: euGrassLanding, Source: "AMC1 CAT.POL.A.330: grass x1.15 (secondary quotation)"}
			case c == Wet:
				return Factor{Name: "wet paved", Value: euWetLanding, Source: "CAT.POL.A.335(a): wet x1.15"}
			}
			return Factor{Name: "dry paved", Value: 1.0, Source: "flight-manual basis"}
		},
		slope:           downslopeFivePerPercent("AMC2 CAT.POL.A.330"),
		rule:            "CAT.POL.A.330(a)",
		multiplier:      euLandingMultiplier,
		wetGrassCaution: "caution: very short wet grass, up to +60 % (GM1 CAT.POL.A.335)",
		slopeNoData:     true,
	},
	PolicyUKAdvisory: {
		Title: "UK CAA advisory factors",
		Source: "UK CAA Safety Sense Leaflet 7c, Aeroplane Performance (2013), landing factors " +
			"(dry grass x1.15 as a secondary text quotes the leaflet's table; the rest from memory: verify against the leaflet; " +
			"AIC 67/2002 para 7.6 gives x1.20 for dry grass)",
		surface: func(s Surface, c Condition) Factor {
			switch {
			case s != Paved && c == Wet:
				return Factor{Name: "wet grass", Value: 1.35, Source: "SSL 7c: wet grass x1.35 (from memory)"}
			case s != Paved:
				return Factor{Name: "dry grass", Value: 1.15, Source: "SSL 7c: dry grass x1.15 (secondary quotation)"}
			case c == Wet:
				return Factor{Name: "wet paved", Value: 1.15, Source: "SSL 7c: wet paved x1.15 (from memory)"}
			}
			return Factor{Name: "dry paved", Value: 1.0, Source: "flight-manual basis"}
		},
		slope:           downslopeFivePerPercent("SSL 7c: 2 % downslope x1.1 (from memory)"),
		rule:            "SSL 7c landing factor",
		multiplier:      1.43, // SSL 7c: x1.43 (from memory), the same as 1/0.7 to within 0.1 %
		wetGrassCaution: "caution: very short wet grass, up to +60 % (GM1 CAT.POL.A.335)",
	},
}

// Landing is the landing half of policy p.
func (p Policy) Landing() LandingPolicy {
	lp, ok := landingPolicies[p.ID]
	if !ok {
		panic("kneeprint: policy " + p.ID + " has no landing half") // a programming defect: every policy has one
	}
	return lp
}

// downslopeFivePerPercent is +5 % of the landing distance per 1 % of downslope in the
// direction of landing, linear, and no credit for an upslope (AMC2 CAT.POL.A.330 as
// CAP 698 quotes it: "increased by 5 % for each 1 % downslope. No allowance is
// permitted for an upslope"; AMC2 CAT.POL.A.430, read in the UK CAA regulatory
// library, says the same for class C). pct is uphill positive in the direction of
// landing, which on a runway end is the direction of its takeoff.
func downslopeFivePerPercent(src string) func(float64) Factor {
	// The sources are built once: every grid cell asks for the factor.
	level, down := src+": no credit for upslope", src+": +5 % per 1 % downslope"
	return func(pct float64) Factor {
		if pct >= 0 {
			return Factor{Name: "level or upslope", Pct: pct, Value: 1.0, Source: level}
		}
		return Factor{Name: "downslope", Pct: -pct, Value: 1 + 0.05*-pct, Source: down}
	}
}

// SurfaceFactor is the landing policy's factor for a surface and condition.
func (lp LandingPolicy) SurfaceFactor(s Surface, c Condition) Factor { return lp.surface(s, c) }

// SlopeFactor is the landing policy's factor for a slope (uphill positive in the
// direction of landing).
func (lp LandingPolicy) SlopeFactor(pct float64) Factor { return lp.slope(pct) }

// Rule is the landing rule with its factor on the landing distance, for printing.
func (lp LandingPolicy) Rule() Rule {
	return Rule{Name: lp.rule, Checks: []Check{{Declared: "LDA", Multiplier: lp.multiplier}}}
}

// CheckSlope returns an ErrNoData error when the landing policy gives no figure for a
// runway end of slope pct (percent, uphill positive in the direction of landing):
// eu-class-b beyond 2 % either way. Nil otherwise.
//
// Which reading, and why: AMC2 CAT.POL.A.330 (class B landing slope) was not read for
// kneeprint; AMC2 CAT.POL.A.430 (class C) asks +5 % per 1 % of downslope with no bound,
// while AMC2 CAT.POL.A.305 (class B takeoff) allows its slope correction beyond 2 %
// only with data the authority has accepted. Rather than give a landing figure where
// the takeoff is refused, kneeprint applies the takeoff's reading to the landing under
// eu-class-b (the conservative reading): beyond 2 %, no data. uk-advisory carries
// the rate on with a caution (Cautions), as for the takeoff.
func (lp LandingPolicy) CheckSlope(pct float64) error {
	if !lp.slopeNoData || math.Abs(pct) <= publishedSlopePct+1e-9 {
		return nil
	}
	return fmt.Errorf("%w: slope %.1f %% is beyond the 2 %% kneeprint takes as covered for landing under eu-class-b: the limit AMC2 CAT.POL.A.305 sets on the takeoff's slope correction is applied to the landing too (the conservative reading; steeper slopes need data the authority has accepted)", ErrNoData, math.Abs(pct))
}

// Cautions are what the landing policy prints for runway end e in its condition: a
// downslope past the 2 % the published slope guidance is known to cover (the
// figure is still given, with +5 % per 1 % carried on), and the wet grass warning.
func (lp LandingPolicy) Cautions(e RunwayEnd) []string {
	var out []string
	if e.SlopePct < -publishedSlopePct-1e-9 {
		out = append(out, fmt.Sprintf("caution: downslope %.1f %% is beyond the %g %% the published slope guidance is known to cover; +5 %% per 1 %% is carried on, a steep slope may cost more", -e.SlopePct, publishedSlopePct))
	}
	switch {
	case e.Surface == Grass && e.Condition == Wet && lp.wetGrassCaution != "":
		out = append(out, lp.wetGrassCaution)
	case e.Surface != Paved && e.Condition == Wet && lp.wetGrassCaution != "":
		// Gravel takes the grass factors, and so their caution (common practice: no
		// published factor of its own).
		out = append(out, lp.wetGrassCaution+"; this unpaved surface takes the grass factors")
	}
	return out
}

// Require applies the landing policy to a landing result on runway end e. actual is
// the model's answer for the real surface, condition and slope; ref its answer for a
// paved, dry, level runway in the same conditions (ignored when the model covers
// neither). As for the takeoff (Policy.Require), each effect is applied once, and an
// effect the model includes keeps the published factor as a floor (FloorRule):
//
//	LD = max(actual x factors for effects not covered, ref x all published factors)
//	required = LD x the rule's factor <= LDA
//
// The Requirement's FactoredTODM holds the factored landing distance LD.
func (lp LandingPolicy) Require(actual, ref LandingResult, e RunwayEnd) Requirement {
	var req Requirement
	lp.forEnd(e).require(actual, ref, e, nil, &req)
	return req
}

// landingEndRules is what LandingPolicy.Require needs for one runway end, worked out
// once for all the cells of a grid: the factors and the cautions joined.
type landingEndRules struct {
	lp      LandingPolicy
	fs, fsl Factor
	caution string
}

func (lp LandingPolicy) forEnd(e RunwayEnd) *landingEndRules {
	er := &landingEndRules{lp: lp, fs: lp.surface(e.Surface, e.Condition), fsl: lp.slope(e.SlopePct)}
	for i, c := range lp.Cautions(e) {
		if i > 0 {
			er.caution += "; "
		}
		er.caution += c
	}
	return er
}

// require is Require with the end's factors worked out (er), writing into req; the
// requirement's rule and check are cut from a (nil: allocated).
func (er *landingEndRules) require(actual, ref LandingResult, e RunwayEnd, a *arena, req *Requirement) {
	fs, fsl := er.fs, er.fsl
	ld, floor := factored(actual.From50ftM, ref.From50ftM, actual.Covers, fs, fsl)
	*req = Requirement{FactoredTODM: ld, Factors: [2]Factor{fs, fsl}, Caution: er.caution}
	req.Floor = floor
	chk := Check{Declared: "LDA", Multiplier: er.lp.multiplier, RequiredM: er.lp.multiplier * ld, AvailableM: e.LDAM}
	checks, rules := a.checks(1), a.rules(1)
	checks[0] = chk
	rules[0] = Rule{Name: er.lp.rule, Checks: checks}
	req.Rule, req.Rules, req.Checks, req.Limiting = er.lp.rule, rules, checks, chk
}

// landingUsable reports whether a landing result's distances are positive and
// finite, the ground roll not longer than the distance from 50 ft.
func landingUsable(r LandingResult) bool {
	return r.GroundRollM > 0 && r.From50ftM >= r.GroundRollM && !math.IsInf(r.From50ftM, 0) && !math.IsNaN(r.From50ftM)
}
