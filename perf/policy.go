package perf

import (
	"fmt"
	"math"
	"sort"
	"strings"
)

// Factor is one multiplier a policy applies, with its published source.
type Factor struct {
	Name   string  // "dry grass", "upslope", ...
	Pct    float64 // the slope it is for, for slope factors
	Value  float64
	Source string
}

// Label names the factor with its slope, e.g. "upslope 1.0 %".
func (f Factor) Label() string {
	if f.Name == "upslope" {
		return fmt.Sprintf("upslope %.1f %%", f.Pct)
	}
	return f.Name
}

// Check compares one declared distance with what the policy requires of it.
type Check struct {
	Declared   string  // "TORA", "TODA" or "ASDA"
	Multiplier float64 // the policy's factor on the takeoff distance for this check
	RequiredM  float64
	AvailableM float64
}

// Ratio is required over available: above 1 does not fit.
func (c Check) Ratio() float64 { return c.RequiredM / c.AvailableM }

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
	// checks turns the factored distance into required lengths per declared distance.
	checks func(todM float64, e RunwayEnd) []Check
}

// Policy identifiers.
const (
	PolicyEUClassB   = "eu-class-b"
	PolicyUKAdvisory = "uk-advisory"
)

var policies = map[string]Policy{
	PolicyEUClassB: {
		ID:    PolicyEUClassB,
		Title: "EU Air OPS performance class B",
		Source: "Regulation (EU) No 965/2012 Annex IV CAT.POL.A.305, AMC1 and AMC2 CAT.POL.A.305 " +
			"(the same factors stand in NCC.POL for non-commercial complex operations)",
		surface: func(s Surface, c Condition) Factor {
			switch {
			case s != Paved && c == Wet:
				return Factor{Name: "wet grass", Value: 1.3, Source: "AMC1 CAT.POL.A.305(e): wet grass on firm soil x1.3"}
			case s != Paved:
				return Factor{Name: "dry grass", Value: 1.2, Source: "AMC1 CAT.POL.A.305(e): dry grass on firm soil x1.2"}
			case c == Wet:
				return Factor{Name: "wet paved", Value: 1.0, Source: "AMC1 CAT.POL.A.305(e): wet paved x1.0"}
			}
			return Factor{Name: "dry paved", Value: 1.0, Source: "flight-manual basis"}
		},
		slope: slopeFivePerPercent("AMC2 CAT.POL.A.305(e)"),
		checks: func(tod float64, e RunwayEnd) []Check {
			if !e.HasStopwayOrClearway() {
				return []Check{{"TORA", 1.25, 1.25 * tod, e.TORAM}}
			}
			return []Check{
				{"TORA", 1.0, tod, e.TORAM},
				{"TODA", 1.15, 1.15 * tod, e.TODAM},
				{"ASDA", 1.3, 1.3 * tod, e.ASDAM},
			}
		},
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
		checks: func(tod float64, e RunwayEnd) []Check {
			// The advisory factored distance is compared with the takeoff run: no
			// clearway credit (common practice for private operations).
			return []Check{{"TORA", 1.33, 1.33 * tod, e.TORAM}}
		},
	},
}

// slopeFivePerPercent is +5 % of distance per 1 % of upslope, linear, and no credit
// for a downslope (AMC2 CAT.POL.A.305; SSL 7c gives 2 % uphill x1.1, the same rate).
func slopeFivePerPercent(src string) func(float64) Factor {
	return func(pct float64) Factor {
		if pct <= 0 {
			return Factor{Name: "level or downslope", Pct: pct, Value: 1.0, Source: src + ": no credit for downslope"}
		}
		return Factor{Name: "upslope", Pct: pct, Value: 1 + 0.05*pct, Source: src + ": +5 % per 1 % upslope"}
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
func (p Policy) SurfaceFactor(s Surface, c Condition) Factor { return p.surface(s, c) }

// SlopeFactor is the policy's factor for a slope in percent (uphill positive).
func (p Policy) SlopeFactor(pct float64) Factor { return p.slope(pct) }

// OverallMultipliers returns the per-declared-distance factors the policy uses for
// runway end e, for printing (e.g. "TORA x1.25").
func (p Policy) OverallMultipliers(e RunwayEnd) []Check { return p.checks(1, e) }

// Requirement is what a policy made of one model result for one runway end.
type Requirement struct {
	// FactoredTODM is the takeoff distance to 50 ft after surface and slope factors
	// (or the model's own figure for those effects, whichever is longer).
	FactoredTODM float64
	Factors      [2]Factor // surface, slope
	Checks       []Check
	Limiting     Check // the check with the largest required/available ratio
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
func (p Policy) Require(actual, ref Result, e RunwayEnd) Requirement {
	fs, fsl := p.surface(e.Surface, e.Condition), p.slope(e.SlopePct)
	uncovered := 1.0
	if !actual.Covers.Surface {
		uncovered *= fs.Value
	}
	if !actual.Covers.Slope {
		uncovered *= fsl.Value
	}
	tod := actual.To50ftM * uncovered
	if actual.Covers.Surface || actual.Covers.Slope {
		tod = math.Max(tod, ref.To50ftM*fs.Value*fsl.Value)
	}
	req := Requirement{FactoredTODM: tod, Factors: [2]Factor{fs, fsl}}
	req.Checks = p.checks(tod, e)
	req.Limiting = req.Checks[0]
	for _, c := range req.Checks[1:] {
		if c.Ratio() > req.Limiting.Ratio() {
			req.Limiting = c
		}
	}
	return req
}
