package perf

import (
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
)

func TestEUClassBWorkedExample(t *testing.T) {
	// TOD 500 m, dry grass, 2 % upslope, no stopway or clearway:
	// 500 x 1.2 x 1.10 x 1.25 = 825 m (CAT.POL.A.305(b), AMC1 and AMC2 [sec]; domain notes [calc]).
	p, err := PolicyByID(PolicyEUClassB)
	require.NoError(t, err)
	e := RunwayEnd{TORAM: 900, TODAM: 900, ASDAM: 900, Surface: Grass, Condition: Dry, SlopePct: 2}
	req := p.Require(Result{To50ftM: 500}, Result{}, e)
	assert.InDelta(t, 660, req.FactoredTODM, 1e-9)
	require.Len(t, req.Checks, 1)
	assert.Equal(t, "TORA", req.Limiting.Declared)
	assert.InDelta(t, 825, req.Limiting.RequiredM, 1e-9)
}

func TestEUClassBWithStopwayAndClearway(t *testing.T) {
	// With them: TOD <= TORA, TOD x 1.15 <= TODA, TOD x 1.3 <= ASDA (CAT.POL.A.305(b)).
	p, _ := PolicyByID(PolicyEUClassB)
	e := RunwayEnd{TORAM: 600, TODAM: 650, ASDAM: 700, Surface: Paved, Condition: Dry}
	req := p.Require(Result{To50ftM: 500}, Result{}, e)
	require.Len(t, req.Checks, 3)
	want := map[string]float64{"TORA": 500, "TODA": 575, "ASDA": 650}
	for _, c := range req.Checks {
		assert.InDelta(t, want[c.Declared], c.RequiredM, 1e-9, c.Declared)
	}
	assert.Equal(t, "ASDA", req.Limiting.Declared, "650/700 is the largest ratio")
}

func TestPublishedFactors(t *testing.T) {
	eu, _ := PolicyByID(PolicyEUClassB)
	uk, _ := PolicyByID(PolicyUKAdvisory)
	cases := []struct {
		name string
		got  float64
		want float64
		src  string
	}{
		{"EU dry grass", eu.SurfaceFactor(Grass, Dry).Value, 1.2, "AMC1 CAT.POL.A.305"},
		{"EU wet grass", eu.SurfaceFactor(Grass, Wet).Value, 1.3, "AMC1 CAT.POL.A.305"},
		{"EU wet paved", eu.SurfaceFactor(Paved, Wet).Value, 1.0, "AMC1 CAT.POL.A.305"},
		{"EU 2 % up", eu.SlopeFactor(2).Value, 1.10, "AMC2 CAT.POL.A.305: 5 % per 1 %"},
		{"EU downslope: no credit", eu.SlopeFactor(-2).Value, 1.0, "AMC2 CAT.POL.A.305"},
		{"UK dry grass", uk.SurfaceFactor(Grass, Dry).Value, 1.2, "SSL 7c"},
		{"UK wet grass", uk.SurfaceFactor(Grass, Wet).Value, 1.3, "SSL 7c"},
		{"UK 2 % up", uk.SlopeFactor(2).Value, 1.1, "SSL 7c"},
		{"UK overall", uk.OverallMultipliers(RunwayEnd{TORAM: 1})[0].Multiplier, 1.33, "SSL 7c recommended overall factor"},
		{"EU no stopway", eu.OverallMultipliers(RunwayEnd{TORAM: 1, TODAM: 1, ASDAM: 1})[0].Multiplier, 1.25, "CAT.POL.A.305(b)"},
	}
	for _, tc := range cases {
		assert.InDelta(t, tc.want, tc.got, 1e-12, "%s: got %v, want %v (%s)", tc.name, tc.got, tc.want, tc.src)
	}
}

// A model that already includes the surface is not factored for it again; the
// published factor on the paved reference sets a floor.
func TestFactorsAppliedOnce(t *testing.T) {
	uk, _ := PolicyByID(PolicyUKAdvisory)
	e := RunwayEnd{TORAM: 2000, TODAM: 2000, ASDAM: 2000, Surface: Grass, Condition: Dry}
	ref := Result{To50ftM: 400}
	// The model's grass figure is larger than the published factor gives: used as is.
	heavy := Result{To50ftM: 520, Covers: Effects{Surface: true, Slope: true}}
	req := uk.Require(heavy, ref, e)
	assert.InDelta(t, 520*1.33, req.Limiting.RequiredM, 1e-9, "not 520 x 1.2 x 1.33")
	// The model's grass figure is smaller: the published factor governs.
	light := Result{To50ftM: 430, Covers: Effects{Surface: true, Slope: true}}
	req = uk.Require(light, ref, e)
	assert.InDelta(t, 400*1.2*1.33, req.Limiting.RequiredM, 1e-9)
	// A model that covers nothing gets the factor once.
	req = uk.Require(Result{To50ftM: 400}, Result{}, e)
	assert.InDelta(t, 400*1.2*1.33, req.Limiting.RequiredM, 1e-9)
}

func TestUnknownPolicy(t *testing.T) {
	_, err := PolicyByID("lenient")
	assert.ErrorContains(t, err, "known policies are eu-class-b, uk-advisory")
}
