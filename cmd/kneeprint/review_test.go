package main

import (
	"encoding/json"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
)

// End-to-end tests of the safety findings of an independent review: each was a GO (or
// an answer without file:line) before its fix.

// An extra zero in a TORA (610 m typed 5600 m) or an LDA gave GO. Now check refuses
// the airfield file, naming file, line and field, and validate does the same.
func TestTORABeyondRunwayLengthRefused(t *testing.T) {
	f := writeFile(t, "field.yaml", "kind: airfield\nname: Test field\nident: TST\nelevation: 272 ft\nrunways:\n  - surface: grass\n    length: 610 m\n    ends:\n"+
		"      - {designator: \"15\", tora: 610 m, lda: 610 m}\n      - {designator: \"33\", tora: 5600 m, toda: 5600 m, lda: 5100 m}\n")
	for _, args := range [][]string{
		{"check", "--aircraft", "demo:sedgefin-sf2", "--airfield", f, "--temp", "15C", "--qnh", "1013hPa"},
		{"check", "--aircraft", "demo:sedgefin-sf2", "--airfield", f, "--temp", "15C", "--qnh", "1013hPa", "--landing"},
		{"validate", f},
	} {
		code, out, errOut := runCLI(t, args...)
		assert.Equal(t, exitFailure, code, "%v: %s%s", args, out, errOut)
		assert.Contains(t, out+errOut, f+":10:34: runways[0].ends[1].tora: TORA 5600 m is longer than the runway's length 610 m", args)
		assert.Contains(t, out+errOut, f+":10:61: runways[0].ends[1].lda: LDA 5100 m is longer than the runway's length 610 m", args)
		assert.NotContains(t, out, "GO", args)
	}
	// Without a length, validate warns (exit 0, the warning with its line).
	g := writeFile(t, "field.yaml", "kind: airfield\nname: Test field\nident: TST\nelevation: 272 ft\nrunways:\n  - surface: grass\n    ends:\n"+
		"      - {designator: \"15\", tora: 610 m}\n      - {designator: \"33\", tora: 5600 m}\n")
	code, out, _ := runCLI(t, "validate", g)
	require.Equal(t, exitOK, code, out)
	assert.True(t, strings.Contains(out, g+":9: runways[0].ends[1].tora: TORA 5600 m of 33 is 9.2 times the 610 m of 15"), out)
}

// A maximum landing mass below the lowest flyable mass loaded cleanly; check then
// exited 2 with a message naming no line, and cards failed. Now the loader refuses it.
func TestLandingMassBelowLowestMassRefused(t *testing.T) {
	const bad = "../internal/spec/testdata/bad/ac-landing-mlm-below-min.yaml"
	want := "ac-landing-mlm-below-min.yaml:25:21: landing.max_landing_mass: 650 kg is below the lowest flyable mass 700 kg (min_mass)"
	dir := t.TempDir()
	for _, args := range [][]string{
		{"check", "--aircraft", bad, "--airfield", "demo:wrenmoor", "--temp", "15C", "--qnh", "1013hPa"},
		{"cards", "--aircraft", bad, "--airfield", "demo:wrenmoor", "-o", dir},
		{"validate", bad},
	} {
		code, out, errOut := runCLI(t, args...)
		assert.Equal(t, exitFailure, code, "%v: %s%s", args, out, errOut)
		assert.Contains(t, out+errOut, want, args)
	}
}

// trainerWithClimb is the demo trainer with its climb section replaced by climb.
func trainerWithClimb(t *testing.T, climb string) string {
	t.Helper()
	data, err := os.ReadFile("../../templates/aircraft/sedgefin-sf2.yaml")
	require.NoError(t, err)
	s := string(data)
	i := strings.Index(s, "\nclimb:\n")
	j := strings.Index(s, "\n# The manual's landing table")
	require.True(t, i > 0 && j > i, "the demo trainer's climb section")
	return writeFile(t, "trainer.yaml", s[:i+1]+climb+s[j:])
}

// A climb table whose rates run out was ignored on runway ends without obstacles:
// at 35 C the (test) table gives 25 ft/min at sea level, a still-air gradient of
// about 0.4 % at 65 kt, under the 0.5 % the physics model counts as a climb (common
// practice). Runway 25 (840 m, no obstacles) was GO; it is now no takeoff, without a
// figure, and validate warns at the rate of zero or less with its line.
func TestNoClimbOnEndWithoutObstacles(t *testing.T) {
	ac := trainerWithClimb(t, "climb:\n  speed: 65 kt\n  rate_unit: ft/min\n  pressure_altitudes: [0 ft, 8000 ft]\n  temperatures: [-10 C, 40 C]\n  rate_of_climb:\n    - [700, -50]\n    - [300, -400]\n")
	run := checkJSON(t, "--aircraft", ac, "--airfield", "demo:wrenmoor", "--temp", "35C", "--qnh", "1013hPa", "--takeoff")
	e := endByDesignator(t, run, "25")
	assert.Equal(t, "no-go", e["status"], e["reasons"])
	assert.Nil(t, e["required_m"], "no figure")
	assert.Contains(t, strings.Join(toStrings(e["reasons"]), "\n"), "no takeoff: the manual's rate of climb at 65 kt is ")
	// At 15 C the same table climbs: 25 is as the demo trainer gives it.
	cool := endByDesignator(t, checkJSON(t, "--aircraft", ac, "--airfield", "demo:wrenmoor", "--temp", "15C", "--qnh", "1013hPa", "--takeoff"), "25")
	assert.Equal(t, "go", cool["status"], cool["reasons"])

	code, out, _ := runCLI(t, "validate", ac)
	require.Equal(t, exitOK, code, out)
	assert.Contains(t, out, "climb (1000 kg).rate_of_climb[0][1]: -50 ft/min at 0 ft, 40 C: no climb")
}

// The table model stretched the headwind note without limit: a 40 kt or a 99 kt
// headwind gave GO at half the calm distance. The demo trainer's data include the
// wind factoring (the reported wind is credited), its rotation speed is 55 kt: past
// half the lift-off true airspeed (about 27 to 29 kt at Wrenmoor, by temperature;
// V_TAS = V_IAS / sqrt(sigma), ICAO Doc 7488) there is no data, as in the physics
// model. Runway 25 is 248 deg magnetic: 248/40 is a 40 kt headwind on it.
func TestHeadwindBoundEndToEnd(t *testing.T) {
	for _, wind := range []string{"248/40", "248/99"} {
		e := endByDesignator(t, checkJSON(t, "--aircraft", "demo:sedgefin-sf2", "--airfield", "demo:wrenmoor", "--temp", "15C", "--qnh", "1013hPa", "--wind", wind, "--takeoff"), "25")
		assert.Equal(t, "no-data", e["status"], "%s: %v", wind, e["reasons"])
		assert.Nil(t, e["required_m"], wind)
		assert.Contains(t, strings.Join(toStrings(e["reasons"]), "\n"), "beyond half the lift-off speed", wind)
	}
	// grid: the 30 and 40 kt rows have no data, the 20 kt row has figures.
	code, out, errOut := runCLI(t, "grid", "--aircraft", "demo:sedgefin-sf2", "--airfield", "demo:wrenmoor", "--runway", "25", "--winds=0kt,20kt,30kt,40kt", "--weights", "1000kg", "--csv")
	require.Equal(t, exitOK, code, errOut)
	lines := strings.Split(strings.TrimSpace(out), "\n")
	cols := strings.Split(lines[0], ",")
	col := func(name string) int {
		for i, c := range cols {
			if c == name {
				return i
			}
		}
		t.Fatalf("no column %s in %s", name, lines[0])
		return -1
	}
	wi, si := col("headwind_kt"), col("status")
	seen := map[string]int{}
	for _, l := range lines[1:] {
		f := strings.Split(l, ",")
		switch f[wi] {
		case "30", "40":
			assert.Equal(t, "no-data", f[si], l)
		case "20":
			assert.NotEqual(t, "no-data", f[si], l)
		}
		seen[f[wi]]++
	}
	assert.Equal(t, 8, seen["40"], "every temperature of the 40 kt row")

	// A card whose template reaches 40 kt prints those rows without a figure (n/d).
	tpl, err := os.ReadFile("../../templates/cards/a5.yaml")
	require.NoError(t, err)
	tplFile := writeFile(t, "strong.yaml", strings.NewReplacer("winds: [-10 kt, -5 kt, 0 kt, 5 kt, 10 kt, 15 kt, 20 kt]", "winds: [-10 kt, 0 kt, 10 kt, 20 kt, 30 kt, 40 kt]", "name: a5", "name: strong").Replace(string(tpl)))
	dir := t.TempDir()
	code, out, errOut = runCLI(t, "cards", "--aircraft", "demo:sedgefin-sf2", "--airfield", "demo:wrenmoor", "--template", tplFile, "--data", "-o", dir, "--date", "2026-12-01")
	require.Equal(t, exitOK, code, out+errOut)
	js, _ := filepath.Glob(filepath.Join(dir, "*.json"))
	require.Len(t, js, 1, out)
	data, err := os.ReadFile(js[0])
	require.NoError(t, err)
	var f struct {
		Pages []struct {
			Page   string `json:"page"`
			Blocks []struct {
				Cells []struct {
					WindKt float64  `json:"wind_kt"`
					Figure *float64 `json:"figure"`
					State  string   `json:"state"`
				} `json:"cells"`
			} `json:"blocks"`
		} `json:"pages"`
	}
	require.NoError(t, json.Unmarshal(data, &f))
	strong := 0
	for _, p := range f.Pages {
		for _, b := range p.Blocks {
			for _, c := range b.Cells {
				if c.WindKt >= 30 {
					strong++
					assert.Equal(t, "no-data", c.State, "%s %g kt", p.Page, c.WindKt)
					assert.Nil(t, c.Figure, "%s %g kt", p.Page, c.WindKt)
				}
			}
		}
	}
	assert.Greater(t, strong, 0)
}

// eu-class-b gave no takeoff figure past a 2 % slope but a landing GO with a caution.
// The takeoff's conservative reading now holds for the landing: no data, with the
// reason naming the reading; uk-advisory keeps the figure and the caution.
func TestLandingSteepSlopeEndToEnd(t *testing.T) {
	f := fieldFile(t, "      - {designator: \"09\", tora: 1500 m, lda: 1500 m}\n      - {designator: \"27\", tora: 1500 m, lda: 1500 m}\n", "3 %")
	base := []string{"--aircraft", "demo:sedgefin-sf2", "--airfield", f, "--temp", "15C", "--qnh", "1013hPa", "--landing"}
	run := checkJSON(t, append(base, "--policy", "eu-class-b")...)
	for _, des := range []string{"09", "27"} {
		e := landingByDesignator(t, run, des)
		assert.Equal(t, "no-data", e["status"], des)
		assert.Nil(t, e["required_m"], des)
		assert.Contains(t, strings.Join(toStrings(e["reasons"]), ""), "the limit AMC2 CAT.POL.A.305 sets on the takeoff's slope correction is applied to the landing too", des)
	}
	e := landingByDesignator(t, checkJSON(t, append(base, "--policy", "uk-advisory")...), "27")
	assert.Equal(t, "go", e["status"], e["reasons"])
	assert.Contains(t, e["policy_caution"], "caution: downslope 3.0 % is beyond the 2 %")
}

// A calibrated physics model may fit up to 5 % short of the manual's own figure (a
// least-squares fit balances its residuals), and nothing floored it at the manual's
// figures. Now the fitted distances carry a floor factor: at each of the demo
// tourer's (invented) calibration points the answer is never shorter than the
// manual's figure, for takeoff and landing, and validate and the model line say so.
func TestCalibratedNeverShorterEndToEnd(t *testing.T) {
	f := fieldFile(t, "      - {designator: \"09\", tora: 2000 m, lda: 2000 m}\n", "0 %")
	for _, p := range []struct {
		temp, weight, landingWeight string
		roll, to50                  float64 // the manual's takeoff figures (the demo file)
		landRoll, from50            float64 // the manual's landing figures
	}{
		{"15C", "1250kg", "1200kg", 295, 520, 265, 455},
		{"30C", "1250kg", "1200kg", 330, 590, 275, 470},
	} {
		// Elevation 0 ft and QNH 1013.25 hPa: pressure altitude 0 ft (ICAO Doc 7488).
		run := checkJSON(t, "--aircraft", "demo:quillwing-qt6", "--airfield", f, "--temp", p.temp, "--qnh", "1013.25hPa",
			"--weight", p.weight, "--landing-weight", p.landingWeight)
		e := endByDesignator(t, run, "09")
		assert.GreaterOrEqual(t, e["ground_roll_m"], p.roll, p.temp)
		assert.GreaterOrEqual(t, e["distance_50ft_m"], p.to50, p.temp)
		l := landingByDesignator(t, run, "09")
		assert.GreaterOrEqual(t, l["ground_roll_m"], p.landRoll, p.temp)
		assert.GreaterOrEqual(t, l["landing_distance_m"], p.from50, p.temp)
		assert.Regexp(t, `^physics, calibrated to 4 manual points \(largest residual [0-9.]+ %, floor ×1\.0[0-9]+\)$`, run["model_line"])
	}
	code, out, _ := runCLI(t, "validate", "demo:quillwing-qt6")
	require.Equal(t, exitOK, code, out)
	assert.Contains(t, out, "on every takeoff distance of the fitted model")
	assert.Contains(t, out, "on every landing distance of the fitted model")
}

// diff said "tight -> no-go (804 m required, 840 m available)" for a cell an obstacle
// stops: now the cell change names the obstacle (text) and carries "obstacle": true
// and "obstacle_reason" (JSON).
func TestDiffObstacleReasonEndToEnd(t *testing.T) {
	src, err := os.ReadFile("../../airfields/wrenmoor.yaml")
	require.NoError(t, err)
	oldF := writeFile(t, "old.yaml", string(src))
	newF := writeFile(t, "new.yaml", strings.Replace(string(src), "height: 35 ft", "height: 200 ft", 1))
	code, out, errOut := runCLI(t, "diff", "--aircraft", "demo:sedgefin-sf2", oldF, newF)
	require.Equal(t, exitFailure, code, errOut)
	assert.Regexp(t, `runway 07, .*: (go|tight) -> no-go \(\d+ m required, 840 m available; 200 ft powerline at 400 m past the runway end: -?\d+ ft (clearance|below its top)`, out)

	code, out, errOut = runCLI(t, "diff", "--aircraft", "demo:sedgefin-sf2", oldF, newF, "--json")
	require.Equal(t, exitFailure, code, errOut)
	var rep struct {
		Cells []struct {
			Old, New       string
			Obstacle       bool   `json:"obstacle"`
			ObstacleReason string `json:"obstacle_reason"`
		} `json:"cell_changes"`
	}
	require.NoError(t, json.Unmarshal([]byte(out), &rep))
	n := 0
	for _, c := range rep.Cells {
		if c.Obstacle {
			n++
			assert.Contains(t, c.ObstacleReason, "200 ft powerline at 400 m past the runway end")
		}
	}
	assert.Greater(t, n, 0)
}

// Messages a pilot reads (review, cosmetic): "1 weight blocks ... do not fit on a 5x8
// card" read wrong. One block is one block, and the page is named without an article
// that does not fit its name ("a a5").
func TestCardTooFullMessage(t *testing.T) {
	tpl, err := os.ReadFile("../../templates/cards/5x8.yaml")
	require.NoError(t, err)
	f := writeFile(t, "tight.yaml", strings.NewReplacer(
		"winds: [-10 kt, -5 kt, 0 kt, 5 kt, 10 kt, 15 kt, 20 kt]", "winds: [-10 kt, -8 kt, -6 kt, -4 kt, -2 kt, 0 kt, 4 kt, 8 kt, 12 kt, 16 kt, 20 kt]",
		"landing: back", "landing: same-page").Replace(string(tpl)))
	code, out, errOut := runCLI(t, "cards", "--aircraft", "demo:quillwing-qt6", "--airfield", "demo:wrenmoor", "--template", f, "-o", t.TempDir())
	require.Equal(t, exitFailure, code)
	assert.Contains(t, out+errOut, "1 weight block of 11 rows does not fit on the 5x8 card")
	assert.NotContains(t, out+errOut, "1 weight blocks")
}

// check --json printed factors rounded ("upslope 0.3 % x1.01" while 1.015 was used,
// "LDA x1.429"): now each factor as applied, as the card prints it (+1.5 %, ×1.33).
// 0.3 % upslope: +5 % per 1 % (AMC2 CAT.POL.A.305; SSL 7c: 2 % uphill x1.1), x1.015;
// the landing on 25 runs down the same 0.3 %: +5 % per 1 % of downslope (AMC2
// CAT.POL.A.330 as CAP 698 quotes it), x1.015; 70 % of the LDA is x1/0.7 =
// 1.4285714... (CAT.POL.A.330(a)); SSL 7c's x1.43 and x1.33 (from memory).
func TestCheckFactorsAsApplied(t *testing.T) {
	base := []string{"--aircraft", "demo:sedgefin-sf2", "--airfield", "demo:wrenmoor", "--temp", "15C", "--qnh", "1013hPa"}
	run := checkJSON(t, base...)
	e07 := strings.Join(toStrings(endByDesignator(t, run, "07")["factors"]), "\n")
	assert.Contains(t, e07, "upslope 0.3 % x1.015 (")
	assert.Contains(t, e07, "TORA x1.33")
	assert.NotContains(t, e07, "x1.01 (")
	l25 := strings.Join(toStrings(landingByDesignator(t, run, "25")["factors"]), "\n")
	assert.Contains(t, l25, "downslope 0.3 % x1.015 (")
	assert.Contains(t, l25, "LDA x1.43")
	eu := checkJSON(t, append(base, "--policy", "eu-class-b")...)
	assert.Contains(t, strings.Join(toStrings(landingByDesignator(t, eu, "25")["factors"]), "\n"), "LDA x1.428571 (1/0.7)")
	assert.Contains(t, strings.Join(toStrings(endByDesignator(t, eu, "07")["factors"]), "\n"), "TORA x1.25")
}

// A weight of 1e308 kg printed a 309-digit figure in a reason: a weight past 1.5 times
// the MTOW is a slip (an extra digit, pounds written as kilograms), refused with the
// range; one just over the MTOW is still answered (beyond limits).
func TestCheckAbsurdWeightRefused(t *testing.T) {
	for _, w := range []string{"1e308kg", "10000kg", "2205kg"} {
		code, out, errOut := runCLI(t, append(append([]string{"check"}, trainerAtWrenmoor...), "--temp", "15C", "--qnh", "1013hPa", "--weight", w)...)
		assert.Equal(t, exitUsage, code, w)
		assert.Empty(t, out, w)
		assert.Contains(t, errOut, "accepted: 800 to 1500 kg (the lowest flyable mass to 1.5 times the MTOW)", w)
		assert.Less(t, len(errOut), 400, w)
	}
	e := endByDesignator(t, checkJSON(t, append(trainerAtWrenmoor, "--temp", "15C", "--qnh", "1013hPa", "--weight", "1100kg")...), "07")
	assert.Equal(t, "beyond-limits", e["status"])
}

// A report whose dew point is above its temperature was accepted silently: the check
// still answers (the temperature is the report's), and warns, in text and JSON.
func TestCheckWarnsDewAboveTemperature(t *testing.T) {
	const rep = "METAR ZZZZ 121250Z 24008KT 9999 FEW030 15/18 Q1013"
	run := checkJSON(t, append(trainerAtWrenmoor, "--metar", rep)...)
	assert.Contains(t, strings.Join(toStrings(run["warnings"]), "\n"), "the dew point 18 C (15/18) is above the temperature 15 C")
	code, out, _ := runCLI(t, append(append([]string{"check"}, trainerAtWrenmoor...), "--metar", rep)...)
	require.Equal(t, exitOK, code)
	assert.Contains(t, out, "WARNING: the dew point 18 C (15/18) is above the temperature 15 C")
	run = checkJSON(t, append(trainerAtWrenmoor, "--metar", "METAR ZZZZ 121250Z 24008KT 9999 FEW030 18/15 Q1013")...)
	assert.Nil(t, run["warnings"])
}

// A flag out of range is answered in the unit it was written in too: 500 F against
// -90 to 60 C is -130 to 140 F (ISO 80000-5); 35 inHg against 800 to 1100 hPa is
// 23.63 to 32.48 inHg (1 inHg = 33.86389 hPa, NIST SP 811); 5000 lb against the demo
// trainer's 800 to 1500 kg is 1764 to 3306 lb (1 lb = 0.45359237 kg), rounded inwards.
func TestCheckFlagRangesInTheUnitWritten(t *testing.T) {
	for _, tc := range []struct{ flag, value, want string }{
		{"--temp", "500F", "-130 to 140 F"},
		{"--qnh", "35inHg", "23.63 to 32.48 inHg"},
		{"--weight", "5000lb", "1764 to 3306 lb"},
	} {
		args := append(append([]string{"check"}, trainerAtWrenmoor...), "--temp", "15C", "--qnh", "1013hPa")
		args = append(args, tc.flag, tc.value)
		code, _, errOut := runCLI(t, args...)
		assert.Equal(t, exitUsage, code, tc.flag)
		assert.Contains(t, errOut, tc.want, tc.flag)
	}
}
