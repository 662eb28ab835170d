package main

import (
	"encoding/json"
	"math"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"

	"kneeprint/templates"
)

func landingByDesignator(t *testing.T, run map[string]any, des string) map[string]any {
	t.Helper()
	ends, ok := run["landing_runway_ends"].([]any)
	require.True(t, ok, "no landing_runway_ends in %v", run)
	for _, e := range ends {
		if m := e.(map[string]any); m["designator"] == des {
			return m
		}
	}
	t.Fatalf("no landing answer for runway end %s", des)
	return nil
}

// Issue 11 item 4, end to end: check gives the landing answer beside the takeoff one
// when the profile has landing data. The trainer's (invented) landing table gives
// 1245 ft from 50 ft at sea level, 10 C, 1000 kg: 379.476 m (0.3048 m per ft exactly,
// ICAO Annex 5). Paved, dry, level, calm:
//   - uk-advisory: x1.43 (SSL 7c, from memory): 542.65 m, printed 543;
//   - eu-class-b: within 70 % of the LDA (CAT.POL.A.330(a)) [pub]: 379.476 / 0.7 =
//     542.11 m, printed 543.
func TestCheckLandingEndToEnd(t *testing.T) {
	f := fieldFile(t, "      - {designator: \"09\", tora: 800 m, lda: 560 m}\n      - {designator: \"27\", tora: 800 m}\n", "0 %")
	args := []string{"--aircraft", "demo:sedgefin-sf2", "--airfield", f, "--temp", "10C", "--qnh", "1013.25hPa", "--margin", "0%"}
	for _, tc := range []struct {
		policy, rule string
		want         float64
	}{
		{"uk-advisory", "SSL 7c landing factor", 1245 * 0.3048 * 1.43},
		{"eu-class-b", "CAT.POL.A.330(a)", 1245 * 0.3048 / 0.7},
	} {
		run := checkJSON(t, append(args, "--policy", tc.policy)...)
		assert.NotEmpty(t, run["runway_ends"], "the takeoff answer is there too")
		assert.Equal(t, "table", run["landing_model"])
		assert.Equal(t, 1000.0, run["landing_weight_kg"], "the maximum landing mass (the MTOW for this profile)")
		e := landingByDesignator(t, run, "09")
		for _, k := range []string{"ground_roll_m", "landing_distance_m", "required_m", "available_m", "lda_m", "rule", "factors", "status", "reasons", "headwind_kt", "credited_headwind_kt"} {
			assert.Contains(t, e, k)
		}
		assert.Equal(t, math.Ceil(1245*0.3048), e["landing_distance_m"], "the table's own figure, rounded up")
		assert.Equal(t, math.Ceil(tc.want), e["required_m"], tc.policy)
		assert.Equal(t, 560.0, e["lda_m"])
		assert.Equal(t, "go", e["status"], "%s: %v", tc.policy, e["reasons"])
		assert.Equal(t, tc.rule, e["rule"])
		// An end without an LDA: no figure, and why.
		n := landingByDesignator(t, run, "27")
		assert.Equal(t, "no-data", n["status"])
		assert.Nil(t, n["required_m"])
		assert.Nil(t, n["lda_m"])
		assert.Contains(t, strings.Join(toStrings(n["reasons"]), ";"), "no LDA declared for runway end 27")
	}
	// A shorter LDA turns the same landing no-go; a lighter --landing-weight helps.
	short := fieldFile(t, "      - {designator: \"09\", tora: 800 m, lda: 530 m}\n", "0 %")
	run := checkJSON(t, "--aircraft", "demo:sedgefin-sf2", "--airfield", short, "--temp", "10C", "--qnh", "1013.25hPa")
	assert.Equal(t, "no-go", landingByDesignator(t, run, "09")["status"])
	run = checkJSON(t, "--aircraft", "demo:sedgefin-sf2", "--airfield", short, "--temp", "10C", "--qnh", "1013.25hPa", "--landing-weight", "800kg")
	assert.Equal(t, 800.0, run["landing_weight_kg"])
	assert.NotEqual(t, "no-go", landingByDesignator(t, run, "09")["status"])

	// --landing: the landing answer only; --takeoff: the takeoff answer only.
	run = checkJSON(t, append(args, "--landing")...)
	assert.Empty(t, run["runway_ends"])
	assert.NotEmpty(t, run["landing_runway_ends"])
	run = checkJSON(t, append(args, "--takeoff")...)
	assert.NotEmpty(t, run["runway_ends"])
	assert.NotContains(t, run, "landing_runway_ends")

	code, out, errOut := runCLI(t, append([]string{"check"}, args...)...)
	require.Equal(t, exitOK, code, errOut)
	assert.Contains(t, out, "TAKEOFF (table model), weight 1000 kg")
	assert.Contains(t, out, "LANDING (table model), weight 1000 kg")
	assert.Contains(t, out, "Not a substitute for the approved flight manual")

	code, _, errOut = runCLI(t, append([]string{"check"}, append(args, "--landing", "--takeoff")...)...)
	assert.Equal(t, exitUsage, code)
	assert.Contains(t, errOut, "choose one")
}

// A profile without landing data: check answers the takeoff as before; --landing is
// refused with the reason (exit 1, a data problem).
func TestCheckLandingWithoutLandingData(t *testing.T) {
	data, err := templates.FS.ReadFile("aircraft/sedgefin-sf2.yaml")
	require.NoError(t, err)
	src := string(data)
	src = src[:strings.Index(src, "# The manual's landing table")]
	ac := writeFile(t, "no-landing.yaml", src)
	run := checkJSON(t, "--aircraft", ac, "--airfield", "demo:wrenmoor", "--temp", "15C", "--qnh", "1013hPa")
	assert.NotContains(t, run, "landing_runway_ends")
	code, _, errOut := runCLI(t, "check", "--aircraft", ac, "--airfield", "demo:wrenmoor", "--temp", "15C", "--qnh", "1013hPa", "--landing")
	assert.Equal(t, exitFailure, code)
	assert.Contains(t, errOut, "the profile has no landing data")
	code, _, errOut = runCLI(t, "grid", "--aircraft", ac, "--airfield", "demo:wrenmoor", "--landing")
	assert.Equal(t, exitFailure, code)
	assert.Contains(t, errOut, "the profile has no landing data")
}

// Issue 11 item 4: grid --landing, in JSON: side "landing", each end's LDA, every
// cell held against it; the weights from the maximum landing mass down.
func TestGridLandingEndToEnd(t *testing.T) {
	code, out, errOut := runCLI(t, "grid", "--aircraft", "demo:quillwing-qt6", "--airfield", "demo:wrenmoor", "--landing", "--runway", "07", "--json")
	require.Equal(t, exitOK, code, errOut)
	var run struct {
		Side  string `json:"side"`
		Model string `json:"model"`
		Ends  []struct {
			Designator string  `json:"designator"`
			LDAM       float64 `json:"lda_m"`
			Cells      []struct {
				WeightKg   float64  `json:"weight_kg"`
				RequiredM  *float64 `json:"required_m"`
				AvailableM *float64 `json:"available_m"`
				Limiting   string   `json:"limiting"`
				Status     string   `json:"status"`
			} `json:"cells"`
		} `json:"runway_ends"`
	}
	require.NoError(t, json.Unmarshal([]byte(out), &run))
	assert.Equal(t, "landing", run.Side)
	assert.Equal(t, "physics", run.Model)
	require.Len(t, run.Ends, 1)
	assert.Equal(t, 780.0, run.Ends[0].LDAM)
	weights := map[float64]bool{}
	for _, c := range run.Ends[0].Cells {
		weights[c.WeightKg] = true
		if c.RequiredM == nil {
			continue
		}
		assert.Equal(t, "LDA", c.Limiting)
		assert.Equal(t, 780.0, *c.AvailableM)
		if c.Status == "go" || c.Status == "tight" {
			assert.LessOrEqual(t, *c.RequiredM, 780.0)
		}
	}
	assert.Equal(t, map[float64]bool{1200: true, 1150: true, 1050: true, 950: true}, weights, "the maximum landing mass 1200 kg, then the card weights below it")

	code, out, _ = runCLI(t, "grid", "--aircraft", "demo:sedgefin-sf2", "--airfield", "demo:wrenmoor", "--landing", "--runway", "33")
	require.Equal(t, exitOK, code)
	assert.Contains(t, out, "LANDING: required landing distance")
	assert.Contains(t, out, "LDA 510 m")

	// The obstacles past the end of the TORA are the takeoff's: the landing grid of 07
	// does not list the powerline (common practice: a landing is flown from the other side).
	code, out, _ = runCLI(t, "grid", "--aircraft", "demo:sedgefin-sf2", "--airfield", "demo:wrenmoor", "--landing", "--runway", "07")
	require.Equal(t, exitOK, code)
	assert.NotContains(t, out, "powerline")
	code, out, _ = runCLI(t, "grid", "--aircraft", "demo:sedgefin-sf2", "--airfield", "demo:wrenmoor", "--runway", "07")
	require.Equal(t, exitOK, code)
	assert.Contains(t, out, "obstacle: powerline 35 ft, 400 m past the end")
}

// Issue 11 item 5, end to end: diff names the LDA change and the landing cells it
// turns, and no takeoff cell.
func TestDiffLDAEndToEnd(t *testing.T) {
	dir, _ := demoFolder(t)
	old := filepath.Join(dir, "wrenmoor.yaml")
	data, err := os.ReadFile(old)
	require.NoError(t, err)
	edited := filepath.Join(dir, "wrenmoor-2027.yaml")
	require.NoError(t, os.WriteFile(edited, []byte(strings.Replace(string(data), "lda: 780 m", "lda: 600 m", 1)), 0o644))
	code, out, errOut := runCLI(t, "diff", "--aircraft", "demo:sedgefin-sf2", old, edited, "--json")
	require.Equal(t, exitFailure, code, errOut) // a change found
	var rep struct {
		Ends  []map[string]any `json:"runway_end_changes"`
		Cells []struct {
			Designator string `json:"designator"`
			Side       string `json:"side"`
		} `json:"cell_changes"`
	}
	require.NoError(t, json.Unmarshal([]byte(out), &rep))
	require.Len(t, rep.Ends, 1)
	assert.Equal(t, "LDA", rep.Ends[0]["field"])
	require.NotEmpty(t, rep.Cells)
	for _, c := range rep.Cells {
		assert.Equal(t, "07", c.Designator)
		assert.Equal(t, "landing", c.Side)
	}
}
