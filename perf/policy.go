package perf

import (
	"fmt"
	"math"
	"sort"
	"strconv"
	"strings"
)

// Factor is one multiplier a policy applies, with its published source.
type Factor struct {
	Name   string  // "dry grass", "upslope", ...
	Pct    float64 // the slope it is for, for slope factors
	Value  float64
	Source string
}

// Label names the factor with its slope as the factor uses it (up to two decimals),
// e.g. "upslope 1 %", "upslope 0.25 %".
func (f Factor) Label() string {
	if f.Name == "upslope" {
		s := strconv.FormatFloat(f.Pct, 'f', 2, 64)
		return "upslope " + strings.TrimRight(strings.TrimRight(s, "0"), ".") + " %"
	}
	return f.Name
}

// Check compares one declared distance with what the policy requires of it.
type Check struct {
	Declared   string  // "TORA", "TODA" or "ASDA"
	Multiplier float64 // the policy's factor on the takeoff distance for this check
	RequiredM  float64
	AvailableM float64
	// Note says why a declared distance stands in for another (an ASDA shorter
	// than the TORA limits the takeoff run); empty otherwise.
	Note string
}

// Ratio is required over available: above 1 does not fit.
func (c Check) Ratio() float64 { return c.RequiredM / c.AvailableM }

// Rule is one way of meeting a policy: every check of the rule must hold. A policy
// with several rules is met when any one of them is (CAT.POL.A.305(b): (1) or (2)).
type Rule struct {
	Name   string // e.g. "CAT.POL.A.305(b)(1)"
	Checks []Check
}

// worst is the check of the rule with the largest required/available ratio.
func (r Rule) worst() Check {
	w := r.Checks[0]
	for _, c := range r.Checks[1:] {
		if c.Ratio() > w.Ratio() {
			w = c
		}
	}
	return w
}

// Policy is a named, published way of turning a model's takeoff distance into the
// distance a runway must offer: surface and slope factors, an overall factor, and the
// declared distances to compare with.
type Policy struct {
	ID     string
	Title  string
	Source string
	// surface and slope give the published factors for a paved, dry, level basis.
	surface func(Surface, Condition) Factor
	slope   func(pct float64) Factor
	// rules turns the factored distance into the rules that can meet the policy.
	rules func(todM float64, e RunwayEnd) []Rule
	// slopeCoveredPct is the largest slope (either sign) the published slope
	// correction covers; beyond it the policy gives no figure when slopeNoData, or a
	// caution otherwise. Zero: no bound.
	slopeCoveredPct float64
	slopeNoData     bool
}

// Policy identifiers.
const (
	PolicyEUClassB   = "eu-class-b"
	PolicyUKAdvisory = "uk-advisory"
)

// FloorRule is printed wherever the floor under a model's own figure is applied: it
// is kneeprint's own conservative choice, not a published rule.
const FloorRule = "the published factor on the model's paved, dry, level figure is kept as a floor under the model's own figure (kneeprint's own conservative choice, not a published rule)"

// publishedSlopePct is the largest slope the published slope correction covers:
// AMC2 CAT.POL.A.305 ("correction factors for runways with slopes in excess of 2 %
// should only be applied when the operator has demonstrated to the competent
// authority that the necessary data ... contain the appropriate procedures").
const publishedSlopePct = 2.0

// takeoffRun is the run a policy compares its factored distance with: the TORA, or
// the ASDA where it is shorter. A takeoff run from which the aircraft could not stop
// on the runway is not a run available (common practice; declared distances
// normally have ASDA >= TORA, so a shorter ASDA is a restriction the pilot must
// honour).
func takeoffRun(e RunwayEnd, mult, tod float64) Check {
	if e.ASDAM > 0 && e.ASDAM < e.TORAM-0.5 {
		return Check{"ASDA", mult, mult * tod, e.ASDAM, "ASDA shorter than TORA: taken as the takeoff run available"}
	}
	return Check{"TORA", mult, mult * tod, e.TORAM, ""}
}

var policies = map[string]Policy{
	PolicyEUClassB: {
		ID:    PolicyEUClassB,
		Title: "EU Air OPS performance class B",
		Source: "Regulation (EU) No 965/2012 Annex IV CAT.POL.A.305, AMC1 and AMC2 CAT.POL.A.305 " +
			"(the same factors stand in NCC.POL for non-commercial complex operations)",
		surface: func(s Surface, c Condition) Factor {
			switch {
			case s != Paved && c == Wet:
				return Factor{Name: "wet grass", Value: 1.3, Source: "AMC1 CAT.POL.A.305, Table 1: wet grass on firm soil x1.3"}
			case s != Paved:
				return Factor{Name: "dry grass", Value: 1.2, Source: "AMC1 CAT.POL.A.305, Table 1: dry grass on firm soil x1.2"}
			case c == Wet:
				return Factor{Name: "wet paved", Value: 1.0, Source: "AMC1 CAT.POL.A.305, Table 1: wet paved x1.0"}
			}
			return Factor{Name: "dry paved", Value: 1.0, Source: "flight-manual basis"}
		},
		slope: slopeFivePerPercent("AMC2 CAT.POL.A.305"),
		rules: func(tod float64, e RunwayEnd) []Rule {
			b1 := Rule{"CAT.POL.A.305(b)(1)", []Check{takeoffRun(e, 1.25, tod)}}
			if !e.HasStopwayOrClearway() {
				return []Rule{b1}
			}
			b2 := Rule{"CAT.POL.A.305(b)(2)", []Check{
				takeoffRun(e, 1.0, tod),
				{"TODA", 1.15, 1.15 * tod, e.TODAM, ""},
				{"ASDA", 1.3, 1.3 * tod, e.ASDAM, ""},
			}}
			return []Rule{b1, b2}
		},
		slopeCoveredPct: publishedSlopePct,
		slopeNoData:     true,
	},
	PolicyUKAdvisory: {
		ID:     PolicyUKAdvisory,
		Title:  "UK CAA advisory factors",
		Source: "UK CAA Safety Sense Leaflet 7c, Aeroplane Performance (2013), takeoff factors (from memory; verify against the leaflet)",
		surface: func(s Surface, c Condition) Factor {
			switch {
			case s != Paved && c == Wet:
				return Factor{Name: "wet grass", Value: 1.3, Source: "SSL 7c: wet grass x1.3"}
			case s != Paved:
				return Factor{Name: "dry grass", Value: 1.2, Source: "SSL 7c: dry grass x1.2"}
			case c == Wet:
				return Factor{Name: "wet paved", Value: 1.0, Source: "SSL 7c: no takeoff factor for wet paved (from memory)"}
			}
			return Factor{Name: "dry paved", Value: 1.0, Source: "flight-manual basis"}
		},
		slope: slopeFivePerPercent("SSL 7c: 2 % uphill x1.1"),
		rules: func(tod float64, e RunwayEnd) []Rule {
			// The advisory factored distance is compared with the takeoff run: no
			// clearway credit (common practice for private operations).
			return []Rule{{"SSL 7c overall factor", []Check{takeoffRun(e, 1.33, tod)}}}
		},
		slopeCoveredPct: publishedSlopePct,
	},
}

// CheckSlope returns an ErrNoData error when the policy gives no figure for a runway
// of slope pct (percent, uphill positive): eu-class-b beyond the 2 % that AMC2
// CAT.POL.A.305 covers. Nil otherwise.
func (p Policy) CheckSlope(pct float64) error {
	if !p.slopeNoData || p.slopeCoveredPct <= 0 || math.Abs(pct) <= p.slopeCoveredPct+1e-9 {
		return nil
	}
	return fmt.Errorf("%w: slope %.1f %% is beyond the %g %% AMC2 CAT.POL.A.305 covers (steeper slopes need data the authority has accepted)", ErrNoData, math.Abs(pct), p.slopeCoveredPct)
}

// SlopeCaution is the caution the policy prints for a runway end of slope pct when it
// still gives a figure beyond the slopes its published correction covers (uk-advisory
// past 2 %); empty otherwise. The wording is kneeprint's own.
func (p Policy) SlopeCaution(pct float64) string {
	if p.slopeNoData || p.slopeCoveredPct <= 0 || math.Abs(pct) <= p.slopeCoveredPct+1e-9 {
		return ""
	}
	if pct > 0 {
		return fmt.Sprintf("caution: upslope %.1f %% is beyond the %g %% the published slope guidance covers; +5 %% per 1 %% is carried on, a steep slope may cost more", pct, p.slopeCoveredPct)
	}
	return fmt.Sprintf("caution: downslope %.1f %% is beyond the %g %% the published slope guidance covers; no credit is taken for it", -pct, p.slopeCoveredPct)
}

// slopeFivePerPercent is +5 % of distance per 1 % of upslope, linear, and no credit
// for a downslope (AMC2 CAT.POL.A.305; SSL 7c gives 2 % uphill x1.1, the same rate).
func slopeFivePerPercent(src string) func(float64) Factor {
	// The sources are built once: every grid cell asks for the factor.
	level, up := src+": no credit for downslope", src+": +5 % per 1 % upslope"
	return func(pct float64) Factor {
		if pct <= 0 {
			return Factor{Name: "level or downslope", Pct: pct, Value: 1.0, Source: level}
		}
		return Factor{Name: "upslope", Pct: pct, Value: 1 + 0.05*pct, Source: up}
	}
}

// PolicyByID returns a policy by its identifier.
func PolicyByID(id string) (Policy, error) {
	p, ok := policies[id]
	if !ok {
		return Policy{}, fmt.Errorf("unknown policy %q: known policies are %s", id, strings.Join(PolicyIDs(), ", "))
	}
	return p, nil
}

// PolicyIDs lists the policy identifiers, sorted.
func PolicyIDs() []string {
	var ids []string
	for id := range policies {
		ids = append(ids, id)
	}
	sort.Strings(ids)
	return ids
}

// SurfaceFactor is the policy's factor for a surface and condition.
// An unpaved surface other than grass (gravel) takes the grass factor, named as such:
// "unpaved, dry (grass factor)", never "dry grass".
func (p Policy) SurfaceFactor(s Surface, c Condition) Factor {
	f := p.surface(s, c)
	if s != Paved && s != Grass {
		f.Name = unpavedName(c)
	}
	return f
}

// unpavedName names the grass factor on an unpaved surface other than grass:
// "unpaved, dry (grass factor)". The two conditions are constants, as every grid
// cell asks.
func unpavedName(c Condition) string {
	switch c {
	case Dry:
		return "unpaved, dry (grass factor)"
	case Wet:
		return "unpaved, wet (grass factor)"
	}
	return fmt.Sprintf("unpaved, %s (grass factor)", c)
}

// SlopeFactor is the policy's factor for a slope in percent (uphill positive).
func (p Policy) SlopeFactor(pct float64) Factor { return p.slope(pct) }

// OverallMultipliers returns the per-declared-distance factors of every rule the
// policy may use for runway end e, rule after rule, for printing (e.g. "TORA x1.25").
// Rules says how they combine.
func (p Policy) OverallMultipliers(e RunwayEnd) []Check {
	var out []Check
	for _, r := range p.rules(1, e) {
		out = append(out, r.Checks...)
	}
	return out
}

// Rules returns the rules the policy may use for runway end e with multipliers only
// (a takeoff distance of 1): the policy is met when every check of any one rule is.
func (p Policy) Rules(e RunwayEnd) []Rule { return p.rules(1, e) }

// Requirement is what a policy made of one model result for one runway end.
type Requirement struct {
	// FactoredTODM is the takeoff distance to 50 ft after surface and slope factors
	// (or the model's own figure for those effects, whichever is longer).
	FactoredTODM float64
	Factors      [2]Factor // surface, slope
	// Floor is true when the published factors on the paved, dry, level figure
	// governed over the model's own figure (see FloorRule).
	Floor    bool
	Rule     string  // the rule used: the one that fits best
	Rules    []Rule  // every rule the policy offered, for printing
	Checks   []Check // the checks of the rule used
	Limiting Check   // the check of that rule with the largest required/available ratio
	Caution  string  // a caution the policy prints for this runway end, if any
}

// Require applies the policy to a model result on runway end e. actual is the model's
// answer for the real surface and slope; ref is its answer for a paved, dry, level
// runway in the same conditions (ignored when the model covers neither effect).
//
// Each effect is applied once. An effect the model did not include is applied as the
// published factor. An effect the model did include is not factored again, but the
// published factor still sets a floor: the basis is
//
//	max(actual x factors for effects not covered, ref x all published factors)
//
// so a model's optimism about grass or a downslope never beats the published factor.
// That floor is kneeprint's own conservative choice (FloorRule), not a published rule.
//
// A policy with several rules is met by any of them: the rule whose worst check has
// the smallest required/available ratio is used (it passes whenever any rule passes).
func (p Policy) Require(actual, ref Result, e RunwayEnd) Requirement {
	var req Requirement
	p.forEnd(e).require(actual, ref, e, nil, &req)
	return req
}

// endRules is what Require needs of a policy for one runway end, worked out once
// for all the cells of a grid: the factors, the caution, and the rules with their
// multipliers (a takeoff distance of 1). Each check's required distance is its
// multiplier times the factored distance (TestEndRulesScale), so a cell's rules are
// the end's scaled.
type endRules struct {
	fs, fsl Factor
	caution string
	rules   []Rule
	checks  int // checks over all rules
}

func (p Policy) forEnd(e RunwayEnd) *endRules {
	er := &endRules{fs: p.SurfaceFactor(e.Surface, e.Condition), fsl: p.slope(e.SlopePct), caution: p.SlopeCaution(e.SlopePct),
		rules: p.rules(1, e)}
	for _, r := range er.rules {
		er.checks += len(r.Checks)
	}
	return er
}

// factored applies a surface factor fs and a slope factor fsl to a model's distance d
// once: an effect the model covers is not factored again, but the published factors
// on the model's paved, dry, level figure ref stay a floor under its own (kneeprint's
// own conservative rule, FloorRule):
//
//	max(d x factors of the effects not covered, ref x fs x fsl)
//
// floor reports whether the floor governed. The takeoff and the landing alike.
func factored(d, ref float64, covers Effects, fs, fsl Factor) (out float64, floor bool) {
	uncovered := 1.0
	if !covers.Surface {
		uncovered *= fs.Value
	}
	if !covers.Slope {
		uncovered *= fsl.Value
	}
	out = d * uncovered
	if covers.Surface || covers.Slope {
		if f := ref * fs.Value * fsl.Value; f > out {
			out = f
		}
	}
	return out, out > d*uncovered
}

// require is Require with the end's rules worked out (er), writing into req; the
// requirement's rules and checks are cut from a (nil: allocated).
func (er *endRules) require(actual, ref Result, e RunwayEnd, a *arena, req *Requirement) {
	fs, fsl := er.fs, er.fsl
	tod, floor := factored(actual.To50ftM, ref.To50ftM, actual.Covers, fs, fsl)
	*req = Requirement{FactoredTODM: tod, Factors: [2]Factor{fs, fsl}, Caution: er.caution}
	req.Floor = floor
	req.Rules = a.rules(len(er.rules))
	checks := a.checks(er.checks)
	for i, r := range er.rules {
		cs := checks[:len(r.Checks):len(r.Checks)]
		checks = checks[len(r.Checks):]
		for j, c := range r.Checks {
			c.RequiredM = c.Multiplier * tod
			cs[j] = c
		}
		req.Rules[i] = Rule{Name: r.Name, Checks: cs}
	}
	best := 0
	for i, r := range req.Rules {
		if r.worst().Ratio() < req.Rules[best].worst().Ratio() {
			best = i
		}
	}
	req.Rule, req.Checks, req.Limiting = req.Rules[best].Name, req.Rules[best].Checks, req.Rules[best].worst()
}

// arena hands out the small slices the cells of one grid keep (rules, checks,
// reasons) from a few large ones, instead of a few small allocations per cell.
// Each slice is cut with its capacity at its length, so that appending to it never
// writes into another cell's. A nil arena allocates each slice on its own.
type arena struct {
	rs []Rule
	cs []Check
	ws []reason
}

// newArena makes an arena for about n cells.
func newArena(n int) *arena {
	return &arena{rs: make([]Rule, 0, 2*n), cs: make([]Check, 0, 4*n), ws: make([]reason, 0, 3*n)}
}

func (a *arena) rules(n int) []Rule {
	if a == nil || len(a.rs)+n > cap(a.rs) {
		return make([]Rule, n)
	}
	a.rs = a.rs[:len(a.rs)+n]
	return a.rs[len(a.rs)-n : len(a.rs) : len(a.rs)]
}

func (a *arena) checks(n int) []Check {
	if a == nil || len(a.cs)+n > cap(a.cs) {
		return make([]Check, n)
	}
	a.cs = a.cs[:len(a.cs)+n]
	return a.cs[len(a.cs)-n : len(a.cs) : len(a.cs)]
}

// reasons is an empty slice with room for n reasons, or nil.
func (a *arena) reasons(n int) []reason {
	if a == nil || len(a.ws)+n > cap(a.ws) {
		return nil
	}
	a.ws = a.ws[:len(a.ws)+n]
	return a.ws[len(a.ws)-n : len(a.ws)-n : len(a.ws)]
}
