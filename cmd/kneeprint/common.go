package main

import (
	"errors"
	"fmt"
	"strings"

	"kneeprint/cmd/internal/inputs"
	"kneeprint/cmd/internal/spec"
	"kneeprint/cmd/internal/units"
	"kneeprint/perf"
)

// defaultPolicy is the policy used when none is named: the advisory factors with
// their 1.33 overall factor are the stricter of the two for a runway without
// stopway or clearway.
const defaultPolicy = perf.PolicyUKAdvisory

// job is an aircraft, an airfield and a policy, loaded and checked.
type job struct {
	aircraft *perf.Aircraft
	airfield *perf.Airfield
	model    perf.Model
	policy   perf.Policy
}

func loadJob(aircraftArg, airfieldArg, policyID string) (*job, error) {
	if aircraftArg == "" || airfieldArg == "" {
		return nil, errors.New("--aircraft and --airfield are both needed (a file, or demo:NAME for an embedded demo file)")
	}
	p, err := perf.PolicyByID(policyID)
	if err != nil {
		return nil, err
	}
	a, _, err := inputs.Aircraft(aircraftArg)
	if err != nil {
		return nil, fileError(err)
	}
	f, _, err := inputs.Airfield(airfieldArg)
	if err != nil {
		return nil, fileError(err)
	}
	m, err := perf.ModelFor(a)
	if err != nil {
		return nil, dataError{err}
	}
	return &job{aircraft: a, airfield: f, model: m, policy: p}, nil
}

// fileError marks errors in the user's files as data errors (exit 1).
func fileError(err error) error {
	var list spec.ErrorList
	if errors.As(err, &list) {
		return dataError{fmt.Errorf("errors in input:\n%w", err)}
	}
	return dataError{err}
}

// quantity parses a flag value with its unit.
func quantity(flag, value string, d units.Dimension) (float64, error) {
	v, err := units.Parse(value, d)
	if err != nil {
		return 0, fmt.Errorf("--%s: %w", flag, err)
	}
	return v, nil
}

// quantityList parses a comma-separated list of values with units.
func quantityList(flag, value string, d units.Dimension) ([]float64, error) {
	var out []float64
	for _, part := range strings.Split(value, ",") {
		v, err := quantity(flag, part, d)
		if err != nil {
			return nil, err
		}
		out = append(out, v)
	}
	return out, nil
}

func conditionFlag(s string) (perf.Condition, error) {
	switch s {
	case "":
		return "", nil
	case "dry":
		return perf.Dry, nil
	case "wet":
		return perf.Wet, nil
	}
	return "", fmt.Errorf("--surface: %q is not dry or wet", s)
}

func marginFlag(s string) (float64, error) {
	v, err := quantity("margin", s, units.Percent)
	if err != nil {
		return 0, err
	}
	if v < 0 || v > 100 {
		return 0, fmt.Errorf("--margin: %s outside 0 to 100 %%", s)
	}
	return v / 100, nil
}
