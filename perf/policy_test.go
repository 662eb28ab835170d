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
	// With them: TOD <= TORA, TOD x 1.15 <= TODA, TOD x 1.3 <= ASDA (CAT.POL.A.305(b)(2)),
	// or TOD x 1.25 <= TORA (b)(1): 500 x 1.25 = 625 > 600, so (b)(2) is the one that
	// passes (Regulation (EU) No 965/2012 Annex IV CAT.POL.A.305(b) [pub]).
	p, _ := PolicyByID(PolicyEUClassB)
	e := RunwayEnd{TORAM: 600, TODAM: 650, ASDAM: 700, Surface: Paved, Condition: Dry}
	req := p.Require(Result{To50ftM: 500}, Result{}, e)
	require.Len(t, req.Checks, 3)
	want := map[string]float64{"TORA": 500, "TODA": 575, "ASDA": 650}
	for _, c := range req.Checks {
		assert.InDelta(t, want[c.Declared], c.RequiredM, 1e-9, c.Declared)
	}
	assert.Equal(t, "ASDA", req.Limiting.Declared, "650/700 is the largest ratio")
	assert.Equal(t, "CAT.POL.A.305(b)(2)", req.Rule)
	require.Len(t, req.Rules, 2, "both rules are kept for printing")
}

// Issue 9.5: CAT.POL.A.305(b) is met by (1) OR (2): a clearway never makes a runway
// worse. TOD 500 m, TORA 640 m: (b)(1) needs 625 m <= 640 m and passes; a clearway
// (TODA 700 m) with no stopway makes (b)(2) ask 650 m of an ASDA of 640 m, which fails.
func TestEUClassBEitherRule(t *testing.T) {
	p, _ := PolicyByID(PolicyEUClassB)
	plain := RunwayEnd{TORAM: 640, TODAM: 640, ASDAM: 640, Surface: Paved, Condition: Dry}
	withClearway := plain
	withClearway.TODAM = 700
	r1 := p.Require(Result{To50ftM: 500}, Result{}, plain)
	r2 := p.Require(Result{To50ftM: 500}, Result{}, withClearway)
	assert.Equal(t, "CAT.POL.A.305(b)(1)", r1.Rule)
	assert.Equal(t, "CAT.POL.A.305(b)(1)", r2.Rule, "(b)(1) still passes with a clearway")
	assert.InDelta(t, 625, r2.Limiting.RequiredM, 1e-9)
	assert.LessOrEqual(t, r2.Limiting.Ratio(), 1.0)
	// Property: adding clearway or stopway never raises the limiting ratio.
	for _, todm := range []float64{640, 660, 700, 900} {
		for _, asdm := range []float64{640, 660, 700, 900} {
			e := plain
			e.TODAM, e.ASDAM = todm, asdm
			for _, tod := range []float64{300, 480, 500, 520, 600} {
				got := p.Require(Result{To50ftM: tod}, Result{}, e).Limiting.Ratio()
				base := p.Require(Result{To50ftM: tod}, Result{}, plain).Limiting.Ratio()
				assert.LessOrEqual(t, got, base+1e-12, "TODA %v ASDA %v TOD %v", todm, asdm, tod)
			}
		}
	}
}

// Issue 14.3: an ASDA shorter than the TORA limits the takeoff run (a run from which
// the aircraft could not stop is not available: common practice). TORA 800 m,
// ASDA 300 m, TOD 400 m: 400 x 1.33 = 532 m > 300 m under the advisory factors.
func TestShortASDALimitsTheRun(t *testing.T) {
	for _, id := range []string{PolicyUKAdvisory, PolicyEUClassB} {
		p, _ := PolicyByID(id)
		e := RunwayEnd{TORAM: 800, TODAM: 800, ASDAM: 300, Surface: Paved, Condition: Dry}
		req := p.Require(Result{To50ftM: 400}, Result{}, e)
		assert.Equal(t, "ASDA", req.Limiting.Declared, id)
		assert.InDelta(t, 300, req.Limiting.AvailableM, 1e-9, id)
		assert.Greater(t, req.Limiting.Ratio(), 1.0, "%s: must not fit", id)
		assert.NotEmpty(t, req.Limiting.Note, id)
	}
}

// Issue 9.6: AMC2 CAT.POL.A.305 gives +5 % per 1 % upslope and covers slopes up to
// 2 %: beyond, eu-class-b has no data; uk-advisory keeps the rate with a caution.
func TestSlopeBeyondPublishedCorrection(t *testing.T) {
	eu, _ := PolicyByID(PolicyEUClassB)
	uk, _ := PolicyByID(PolicyUKAdvisory)
	for _, pct := range []float64{-2, 0, 1, 2} {
		assert.NoError(t, eu.CheckSlope(pct), pct)
		assert.Empty(t, uk.SlopeCaution(pct), pct)
	}
	for _, pct := range []float64{2.1, 3, -2.5} {
		err := eu.CheckSlope(pct)
		require.Error(t, err, pct)
		assert.ErrorIs(t, err, ErrNoData)
		assert.Contains(t, err.Error(), "AMC2 CAT.POL.A.305")
		assert.NoError(t, uk.CheckSlope(pct), pct)
		assert.NotEmpty(t, uk.SlopeCaution(pct), pct)
	}
	// The UK caution reaches the requirement so that check can print it.
	req := uk.Require(Result{To50ftM: 400}, Result{}, RunwayEnd{TORAM: 900, TODAM: 900, ASDAM: 900, Surface: Paved, Condition: Dry, SlopePct: 3})
	assert.Contains(t, req.Caution, "2 %")
	assert.InDelta(t, 400*1.15*1.33, req.Limiting.RequiredM, 1e-9, "5 %% per 1 %% kept: 3 %% -> x1.15")
}

// Sources are cited as they stand: AMC1/AMC2 CAT.POL.A.305 have no paragraph letters
// (sources pinned from Regulation (EU) No 965/2012 Annex IV, AMC to CAT.POL.A.305).
func TestSourcesCitedAsTheyAre(t *testing.T) {
	for _, id := range PolicyIDs() {
		p, _ := PolicyByID(id)
		for _, f := range []Factor{p.SurfaceFactor(Grass, Dry), p.SurfaceFactor(Grass, Wet), p.SurfaceFactor(Paved, Wet), p.SlopeFactor(1)} {
			assert.NotContains(t, f.Source, "305(e)", id)
		}
	}
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

// Gravel has no published factor of its own: it takes the grass factor (AMC1
// CAT.POL.A.305, Table 1: dry grass x1.2, wet x1.3 [pub]) and is named as unpaved with
// the grass factor, never "dry grass" (common practice: say what was assumed).
func TestGravelNamedAsUnpaved(t *testing.T) {
	for _, id := range PolicyIDs() {
		p, _ := PolicyByID(id)
		for c, want := range map[Condition]float64{Dry: 1.2, Wet: 1.3} {
			f := p.SurfaceFactor(Gravel, c)
			assert.Equal(t, want, f.Value, id)
			assert.Equal(t, "unpaved, "+string(c)+" (grass factor)", f.Label(), id)
			req := p.Require(Result{To50ftM: 500}, Result{To50ftM: 500}, RunwayEnd{TORAM: 2000, TODAM: 2000, ASDAM: 2000, Surface: Gravel, Condition: c})
			assert.Equal(t, f.Name, req.Factors[0].Name, id)
		}
		assert.Equal(t, "dry grass", p.SurfaceFactor(Grass, Dry).Label(), id)
	}
}

// A policy's rules for a factored distance are its rules for a distance of 1 with
// every check's required distance scaled: each check requires its multiplier times
// the factored distance (CAT.POL.A.305(b) and SSL 7c state each factor as a multiple
// of the takeoff distance). Requirements of a grid's cells are made that way
// (endRules); this is the property that makes it the policy's own answer.
func TestEndRulesScale(t *testing.T) {
	ends := []RunwayEnd{
		{TORAM: 700, TODAM: 700, ASDAM: 700, Surface: Paved, Condition: Dry},
		{TORAM: 600, TODAM: 800, ASDAM: 750, Surface: Grass, Condition: Wet, SlopePct: 1},
		{TORAM: 600, TODAM: 600, ASDAM: 500, Surface: Gravel, Condition: Dry, SlopePct: -3},
	}
	for _, id := range PolicyIDs() {
		p, _ := PolicyByID(id)
		for _, e := range ends {
			er := p.forEnd(e)
			for _, tod := range []float64{1, 312.5, 777.7, 1234.56789} {
				var scaled []Rule
				for _, r := range er.rules {
					var cs []Check
					for _, c := range r.Checks {
						c.RequiredM = c.Multiplier * tod
						cs = append(cs, c)
					}
					scaled = append(scaled, Rule{Name: r.Name, Checks: cs})
				}
				assert.Equal(t, p.rules(tod, e), scaled, "%s %+v tod %g", id, e, tod)
			}
		}
	}
}
