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

// checkJSON runs check with --json and returns the decoded run.
func checkJSON(t *testing.T, args ...string) map[string]any {
	t.Helper()
	code, out, errOut := runCLI(t, append(append([]string{"check"}, args...), "--json")...)
	require.Equal(t, exitOK, code, errOut)
	var run map[string]any
	require.NoError(t, json.Unmarshal([]byte(out), &run))
	return run
}

func endByDesignator(t *testing.T, run map[string]any, des string) map[string]any {
	t.Helper()
	for _, e := range run["runway_ends"].([]any) {
		if m := e.(map[string]any); m["designator"] == des {
			return m
		}
	}
	t.Fatalf("no runway end %s", des)
	return nil
}

// writeFile writes a test input file and returns its path.
func writeFile(t *testing.T, name, body string) string {
	t.Helper()
	p := filepath.Join(t.TempDir(), name)
	require.NoError(t, os.WriteFile(p, []byte(body), 0o644))
	return p
}

var trainerAtWrenmoor = []string{"--aircraft", "demo:sedgefin-sf2", "--airfield", "demo:wrenmoor"}

// Issue 9.1: 068/06G16 on runway 25 (248 deg) is a tailwind of 6 kt gusting 16 kt
// (cos 180 deg = -1): past the trainer's 10 kt tailwind limit. Before the fix the
// steady 6 kt was used and it passed.
func TestCheckGustTailwindEndToEnd(t *testing.T) {
	run := checkJSON(t, append(trainerAtWrenmoor, "--temp", "15C", "--qnh", "1013hPa", "--wind", "068/06G16")...)
	e25 := endByDesignator(t, run, "25")
	assert.Equal(t, "beyond-limits", e25["status"])
	assert.InDelta(t, -6, e25["headwind_kt"], 0.05)
	assert.InDelta(t, -16, e25["gust_headwind_kt"], 0.05)
	assert.InDelta(t, -16, e25["headwind_for_distance_kt"], 0.05)
	assert.Contains(t, strings.Join(toStrings(e25["reasons"]), "\n"), "tailwind 16 kt above the 10 kt limit")
	// Runway 07 into it: a headwind, credited at the steady 6 kt.
	e07 := endByDesignator(t, run, "07")
	assert.InDelta(t, 6, e07["headwind_for_distance_kt"], 0.05)
	assert.InDelta(t, 16, e07["gust_headwind_kt"], 0.05)

	// The text shows the steady and gust components.
	code, out, _ := runCLI(t, append(append([]string{"check"}, trainerAtWrenmoor...), "--temp", "15C", "--qnh", "1013hPa", "--wind", "068/06G16")...)
	require.Equal(t, exitOK, code)
	assert.Contains(t, out, "gust")
	assert.Contains(t, out, "-16.0kt")
	assert.Contains(t, out, "the gust counts for a tailwind")

	// A variable wind gusting is a tailwind of the gust on every end.
	run = checkJSON(t, append(trainerAtWrenmoor, "--temp", "15C", "--qnh", "1013hPa", "--wind", "VRB/04G12")...)
	for _, e := range run["runway_ends"].([]any) {
		m := e.(map[string]any)
		assert.InDelta(t, -12, m["headwind_for_distance_kt"], 0.05, m["designator"])
		assert.Equal(t, "beyond-limits", m["status"], "12 kt tailwind > 10 kt")
	}
}

func toStrings(v any) []string {
	var out []string
	for _, x := range v.([]any) {
		out = append(out, x.(string))
	}
	return out
}

// Issue 9.2: the direction takes three digits; a report group is true, the tower form
// magnetic unless --wind-true; the reference used is printed. Saltpan has 9 deg E
// variation: 220 true is 211 magnetic, 9 deg off runway 22, crosswind
// 15 sin 9 deg = 2.3 kt from the left (trigonometry).
func TestCheckWindReference(t *testing.T) {
	base := []string{"--aircraft", "demo:sedgefin-sf2", "--airfield", "demo:saltpan", "--temp", "10C", "--qnh", "1013hPa"}
	run := checkJSON(t, append(base, "--wind", "220/15")...)
	assert.Equal(t, "magnetic", run["wind_reference"])
	assert.InDelta(t, 0, endByDesignator(t, run, "22")["crosswind_kt"], 0.05)
	for _, w := range [][]string{{"--wind", "22015KT"}, {"--wind", "220/15", "--wind-true"}} {
		run = checkJSON(t, append(base, w...)...)
		assert.Equal(t, "true", run["wind_reference"], w)
		assert.Equal(t, true, run["wind_true"], w)
		assert.InDelta(t, -2.3, endByDesignator(t, run, "22")["crosswind_kt"], 0.05, w)
	}
	code, out, _ := runCLI(t, append(append([]string{"check"}, base...), "--wind", "22015KT")...)
	require.Equal(t, exitOK, code)
	assert.Contains(t, out, "wind 22015KT, true (report group)")
	for _, bad := range []string{"24/15", "240/15G", "240/1g5", "+90/5", "090/+5", "-0/0"} {
		code, _, errOut := runCLI(t, append(append([]string{"check"}, base...), "--wind", bad)...)
		assert.Equal(t, exitUsage, code, bad)
		assert.Contains(t, errOut, "--wind", bad)
	}
}

// Issue 9.3: a whole report gives wind, temperature and QNH; flags given alongside win
// and are named; a report without temperature or pressure is refused clearly.
func TestCheckMETAR(t *testing.T) {
	const rep = "METAR ZZZZ 121250Z AUTO 25012G22KT 220V280 9999 NSC M05/M08 Q1003 RMK Q0990 30/20"
	run := checkJSON(t, append(trainerAtWrenmoor, "--metar", rep)...)
	assert.InDelta(t, -5, run["temperature_c"], 1e-9, "M05 is minus 5 (WMO FM 15)")
	assert.InDelta(t, 1003, run["qnh_hpa"], 1e-9, "Q1003, not the Q0990 after RMK")
	assert.Equal(t, "true", run["wind_reference"], "a report's wind is true")
	assert.Equal(t, rep, run["metar"])
	assert.Len(t, run["from_report"], 3)
	assert.Nil(t, run["flags_over_report"])

	run = checkJSON(t, append(trainerAtWrenmoor, "--metar", rep, "--temp", "2C", "--wind", "250/05")...)
	assert.InDelta(t, 2, run["temperature_c"], 1e-9, "the flag wins")
	assert.Equal(t, "magnetic", run["wind_reference"], "the tower-form flag wins, magnetic")
	over := strings.Join(toStrings(run["flags_over_report"]), "\n")
	assert.Contains(t, over, "--temp 2C")
	assert.Contains(t, over, "--wind 250/05")

	// Inches of mercury, CAVOK.
	run = checkJSON(t, append(trainerAtWrenmoor, "--metar", "ZZZZ 121250Z 24008KT CAVOK 21/09 A2962")...)
	assert.InDelta(t, 1003.0, run["qnh_hpa"], 0.05, "29.62 inHg = 1003.0 hPa (NIST SP 811)")

	for _, tc := range []struct{ rep, want string }{
		{"METAR ZZZZ 121250Z 24008KT 9999 FEW030 Q1013", "no usable temperature group"},
		{"METAR ZZZZ 121250Z 24008KT 9999 FEW030 18/10", "no usable QNH group"},
		{"METAR ZZZZ 121250Z 24008KT 9999 FEW030 18/10 Q////", "no usable QNH group"},
		{"METAR ZZZZ 121250Z /////KT 9999 FEW030 18/10 Q1013", "no usable wind group"},
		{"good morning", "not a routine weather report"},
	} {
		code, _, errOut := runCLI(t, append(append([]string{"check"}, trainerAtWrenmoor...), "--metar", tc.rep)...)
		assert.Equal(t, exitUsage, code, tc.rep)
		assert.Contains(t, errOut, tc.want, tc.rep)
	}
	// A missing group is fine when its flag is given.
	run = checkJSON(t, append(trainerAtWrenmoor, "--metar", "METAR ZZZZ 121250Z 24008KT 9999 FEW030 Q1013", "--temp", "18C")...)
	assert.InDelta(t, 18, run["temperature_c"], 1e-9)
}

// Issue 9.4: the QNH is never assumed.
func TestCheckRequiresQNH(t *testing.T) {
	code, _, errOut := runCLI(t, append(append([]string{"check"}, trainerAtWrenmoor...), "--temp", "15C")...)
	assert.Equal(t, exitUsage, code)
	assert.Contains(t, errOut, "--qnh is required")
	code, out, _ := runCLI(t, "check", "--help")
	require.Equal(t, exitOK, code)
	for _, want := range []string{"--metar", "MAGNETIC", "TRUE", "--wind-true", "never assumed"} {
		assert.Contains(t, out, want)
	}
}

// ac/af files for the end-to-end policy tests: an invented field with a runway of
// the given declared distances and slope.
func fieldFile(t *testing.T, ends, slope string) string {
	return writeFile(t, "field.yaml", "kind: airfield\nname: Test field\nident: TST\nelevation: 0 ft\nrunways:\n  - surface: paved\n    slope: "+slope+"\n    ends:\n"+ends)
}

// Issue 9.5: CAT.POL.A.305(b)(1) OR (b)(2). The trainer at sea level, 15 C, MTOW:
// its (invented) table gives 1440 ft at 10 C and 1550 ft at 20 C to 50 ft, so
// 1495 ft = 455.7 m at 15 C (linear interpolation). With TORA 580 m, (b)(1) asks
// 1.25 x 455.7 = 569.6 m and fits; a 700 m clearway without stopway (ASDA = TORA)
// makes (b)(2) ask 1.3 x 455.7 = 592.4 m of the ASDA, which does not fit. Either rule
// meets CAT.POL.A.305(b) [pub]: the runway must stay GO with the clearway.
func TestCheckEUEitherRuleEndToEnd(t *testing.T) {
	plain := fieldFile(t, "      - {designator: \"09\", tora: 580 m}\n", "0 %")
	clear := fieldFile(t, "      - {designator: \"09\", tora: 580 m, toda: 700 m}\n", "0 %")
	args := []string{"--aircraft", "demo:sedgefin-sf2", "--temp", "15C", "--qnh", "1013.25hPa", "--policy", "eu-class-b", "--margin", "0%"}
	a := endByDesignator(t, checkJSON(t, append(args, "--airfield", plain)...), "09")
	b := endByDesignator(t, checkJSON(t, append(args, "--airfield", clear)...), "09")
	require.Equal(t, "go", a["status"], a["reasons"])
	assert.Equal(t, "go", b["status"], "a clearway never makes a runway worse: %v", b["reasons"])
	assert.Equal(t, "CAT.POL.A.305(b)(1)", b["rule"])
	assert.Equal(t, a["required_m"], b["required_m"])
}

// Issue 14.3: TORA 800 m with ASDA 300 m is not a GO: the short ASDA limits the run.
func TestCheckShortASDAEndToEnd(t *testing.T) {
	f := fieldFile(t, "      - {designator: \"09\", tora: 800 m, asda: 300 m}\n", "0 %")
	for _, pol := range []string{"uk-advisory", "eu-class-b"} {
		e := endByDesignator(t, checkJSON(t, "--aircraft", "demo:sedgefin-sf2", "--airfield", f, "--temp", "15C", "--qnh", "1013hPa", "--policy", pol), "09")
		assert.Equal(t, "no-go", e["status"], pol)
		assert.Equal(t, "ASDA", e["limiting"], pol)
		assert.Contains(t, strings.Join(toStrings(e["policy_notes"]), ""), "ASDA shorter than TORA", pol)
	}
}

// Issue 9.6: a 3 % slope is beyond AMC2 CAT.POL.A.305: no data under eu-class-b,
// a caution under uk-advisory.
func TestCheckSteepSlopeEndToEnd(t *testing.T) {
	f := fieldFile(t, "      - {designator: \"09\", tora: 1500 m}\n      - {designator: \"27\", tora: 1500 m}\n", "3 %")
	base := []string{"check", "--aircraft", "demo:sedgefin-sf2", "--airfield", f, "--temp", "15C", "--qnh", "1013hPa"}
	e := endByDesignator(t, checkJSON(t, append(base[1:], "--policy", "eu-class-b")...), "09")
	assert.Equal(t, "no-data", e["status"])
	assert.Contains(t, strings.Join(toStrings(e["reasons"]), ""), "AMC2 CAT.POL.A.305")
	code, out, _ := runCLI(t, append(base, "--policy", "uk-advisory")...)
	require.Equal(t, exitOK, code)
	assert.Contains(t, out, "caution: upslope 3.0 % is beyond the 2 %")
	assert.Contains(t, out, "caution: downslope 3.0 % is beyond the 2 %")
}

// Issue 9.7: a runway whose far threshold (4975 ft) is above the aerodrome elevation
// (4950 ft): both its ends take their pressure altitude at 4975 ft; validate warns.
func TestCheckHighestThreshold(t *testing.T) {
	f := writeFile(t, "high.yaml", "kind: airfield\nname: High strip\nident: HIGH\nelevation: 4950 ft\nrunways:\n  - surface: gravel\n    length: 1100 m\n    ends:\n"+
		"      - {designator: \"04\", tora: 1100 m, threshold_elevation: 4935 ft}\n      - {designator: \"22\", tora: 1100 m, threshold_elevation: 4975 ft}\n")
	run := checkJSON(t, "--aircraft", "demo:sedgefin-sf2", "--airfield", f, "--temp", "20C", "--qnh", "1013.25hPa")
	assert.InDelta(t, 4950, run["elevation_ft"], 0.5)
	for _, d := range []string{"04", "22"} {
		e := endByDesignator(t, run, d)
		assert.InDelta(t, 4975, e["elevation_used_ft"], 0.5, d)
		// QNH 1013.25 hPa: pressure altitude = elevation (ISA, ICAO Doc 7488).
		assert.InDelta(t, 4975, e["pressure_altitude_ft"], 0.5, d)
	}
	code, out, _ := runCLI(t, "check", "--aircraft", "demo:sedgefin-sf2", "--airfield", f, "--temp", "20C", "--qnh", "1013.25hPa")
	require.Equal(t, exitOK, code)
	assert.Contains(t, out, "pressure altitude 4975 ft, taken at 4975 ft: this runway's highest threshold")
	code, out, _ = runCLI(t, "validate", f)
	assert.Equal(t, exitOK, code, "a warning, not an error")
	assert.Contains(t, out, "threshold_elevation: 4975 ft is above the aerodrome elevation 4950 ft")
	// The grid takes the same elevation.
	code, out, _ = runCLI(t, "grid", "--aircraft", "demo:sedgefin-sf2", "--airfield", f, "--qnh", "1013.25hPa", "--runway", "04", "--json")
	require.Equal(t, exitOK, code)
	var g map[string]any
	require.NoError(t, json.Unmarshal([]byte(out), &g))
	assert.InDelta(t, 4975, g["runway_ends"].([]any)[0].(map[string]any)["elevation_used_ft"], 0.5)
}

// Issue 14.2: impossible weights are refused with a clear message, not answered.
func TestCheckImpossibleWeights(t *testing.T) {
	for _, w := range []string{"100kg", "0kg", "-1000kg", "1kg"} {
		code, out, errOut := runCLI(t, append(append([]string{"check"}, trainerAtWrenmoor...), "--temp", "15C", "--qnh", "1013hPa", "--weight", w)...)
		assert.Equal(t, exitUsage, code, w)
		assert.Empty(t, out, w)
		assert.Contains(t, errOut, "--weight", w)
	}
	_, _, errOut := runCLI(t, append(append([]string{"check"}, trainerAtWrenmoor...), "--temp", "15C", "--qnh", "1013hPa", "--weight", "100kg")...)
	assert.Contains(t, errOut, "below the lowest flyable mass 800 kg")
	// The physics tourer: 1 kg is refused, not answered with a short distance.
	code, _, errOut := runCLI(t, "check", "--aircraft", "demo:quillwing-qt6", "--airfield", "demo:wrenmoor", "--temp", "15C", "--qnh", "1013hPa", "--weight", "1kg")
	assert.Equal(t, exitUsage, code)
	assert.Contains(t, errOut, "lowest flyable mass")
}

// Issue 14.5: temperatures outside physics are refused with exit 2; no NaN or Inf
// ever reaches the output.
func TestCheckImplausibleTemperatures(t *testing.T) {
	for _, temp := range []string{"-300C", "1e308C", "-274C", "61C", "500F"} {
		for _, js := range []bool{false, true} {
			args := append(append([]string{"check"}, trainerAtWrenmoor...), "--temp", temp, "--qnh", "1013hPa")
			if js {
				args = append(args, "--json")
			}
			code, out, errOut := runCLI(t, args...)
			assert.Equal(t, exitUsage, code, temp)
			assert.Contains(t, errOut, "--temp", temp)
			assert.NotContains(t, out+errOut, "NaN", temp)
			assert.NotContains(t, out+errOut, "Inf", temp)
		}
	}
	// The ends of the range are answered, with valid JSON (encoding/json refuses NaN
	// and infinities), on both demo models and in the strongest winds accepted.
	for _, ac := range []string{"demo:sedgefin-sf2", "demo:quillwing-qt6"} {
		for _, temp := range []string{"-90C", "60C", "140F"} {
			for _, wind := range []string{"VRB/90G99", "220/99", "040/99"} {
				checkJSON(t, "--aircraft", ac, "--airfield", "demo:saltpan", "--temp", temp, "--qnh", "800hPa", "--wind", wind)
			}
		}
	}
}

// Issue 9.11: validate prints, per aircraft, the ground roll and distance to 50 ft at
// sea level ISA and MTOW in m and ft (the demo trainer's invented table: 825 ft and
// 1495 ft by linear interpolation between its 10 C and 20 C columns), and warns when a
// table's figures are implausible for the class (a feet table marked m).
func TestValidateReferenceFigures(t *testing.T) {
	code, out, _ := runCLI(t, "validate", "--demo")
	require.Equal(t, exitOK, code)
	assert.Contains(t, out, "MTOW 1000 kg, paved, dry, level, calm: ground roll 252 m (825 ft), to 50 ft 456 m (1495 ft)")
	assert.Equal(t, 2, strings.Count(out, "reference, to hold against the manual"), "one per aircraft")

	data, err := os.ReadFile("../../templates/aircraft/sedgefin-sf2.yaml")
	require.NoError(t, err)
	slip := writeFile(t, "slip.yaml", strings.Replace(string(data), "distance_unit: ft", "distance_unit: m", 1))
	code, out, _ = runCLI(t, "validate", slip)
	assert.Equal(t, exitOK, code, "a warning, not an error")
	assert.Contains(t, out, "warnings:")
	assert.Contains(t, out, "check the table's distance_unit")
}
