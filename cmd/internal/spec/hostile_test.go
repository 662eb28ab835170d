package spec

import (
	"bytes"
	"errors"
	"fmt"
	"math/rand"
	"os"
	"strings"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
)

const okAirfield = "kind: airfield\nname: Test field\nident: TST-1\nelevation: 300 ft\nrunways:\n  - surface: paved\n    ends:\n      - designator: \"09\"\n        tora: 800 m\n"

func nested(open, close string, n int) string {
	return "kind: airfield\nname: " + strings.Repeat(open, n) + strings.Repeat(close, n) + "\n"
}

// hostileInputs is a corpus of malformed and hostile files. Each must be answered by a
// clear error naming the file, and never by a panic, a hang or a huge allocation.
func hostileInputs() map[string]string {
	okAircraft := string(mustReadFile("testdata/bad/ok-aircraft.yaml"))
	rnd := rand.New(rand.NewSource(7))
	binary := make([]byte, 4096)
	rnd.Read(binary)
	table := func(n int) string {
		var b strings.Builder
		b.WriteString("kind: aircraft\nname: T\ntype: T\nmtow: 1000 kg\nlimits: {demonstrated_crosswind: 15 kt}\ntakeoff_flap: \"0\"\ntable:\n  wind_factoring_included: true\n  distance_unit: m\n  pressure_altitudes: [")
		for i := 0; i < n; i++ {
			fmt.Fprintf(&b, "%d ft,", i*10)
		}
		b.WriteString("]\n  temperatures: [")
		for i := 0; i < n; i++ {
			fmt.Fprintf(&b, "%d C,", i-40)
		}
		b.WriteString("]\n  weights: []\n")
		return b.String()
	}
	physics := "kind: aircraft\nname: T\ntype: T\nmtow: 1250 kg\nspeeds: {rotation: 60 kt, at_50ft: 68 kt}\nlimits: {max_crosswind: 15 kt}\ntakeoff_flap: \"10\"\nflaps: [{name: \"10\", clmax: 1.7}]\n" +
		"physics:\n  wing_area: 16.2 m2\n  span: 10.9 m\n  wing_height: 1 m\n  cd0: 0.034\n  oswald: 0.75\n  cl_ground_run: 0.3\n  power: 134 kW\n  propeller: {type: constant_speed, diameter: 1.93 m}\n  calibration:\n"
	point := "    - {pressure_altitude: 0 ft, temperature: 15 C, weight: 1250 kg, ground_roll: 295 m, to_50ft: 520 m}\n"
	manyRunways := "kind: airfield\nname: X\nident: XX\nelevation: 1 m\nrunways:\n" + strings.Repeat("  - {surface: paved, ends: [{designator: \"09\", tora: 1 m}]}\n", 5000)
	return map[string]string{
		"empty":               "",
		"whitespace only":     "   \n\t\n  ",
		"comment only":        "# nothing here\n",
		"binary":              string(binary),
		"nul bytes":           "kind: airfield\x00\x00\nname: x\n",
		"utf-16 bom":          "\xff\xfek\x00i\x00n\x00d\x00",
		"utf-8 bom then junk": "\xef\xbb\xbf: : :",
		"huge number":         strings.Replace(okAirfield, "300 ft", "1e308 ft", 1),
		"overflowing number":  strings.Replace(okAirfield, "300 ft", "1e999 ft", 1),
		"nan":                 strings.Replace(okAirfield, "300 ft", ".nan ft", 1),
		"NaN word":            strings.Replace(okAirfield, "300 ft", "NaN ft", 1),
		"infinity":            strings.Replace(okAirfield, "800 m", ".inf m", 1),
		"negative infinity":   strings.Replace(okAirfield, "800 m", "-Inf m", 1),
		"hex number":          strings.Replace(okAirfield, "800 m", "0x320 m", 1),
		"comma decimal":       strings.Replace(okAirfield, "800 m", "800,5 m", 1),
		"fullwidth digits":    strings.Replace(okAirfield, "800 m", "８００ m", 1),
		"unit in capitals":    strings.Replace(okAirfield, "800 m", "800 M", 1),
		"negative length":     strings.Replace(okAirfield, "800 m", "-800 m", 1),
		"zero length":         strings.Replace(okAirfield, "800 m", "0 m", 1),
		"deep flow lists":     nested("[", "]", 10000),
		"deep flow maps":      nested("{a: ", "}", 5000),
		"deep block nesting": "kind: airfield\nname:\n" + func() string {
			var b strings.Builder
			for i := 0; i < 200; i++ {
				b.WriteString(strings.Repeat(" ", i+1) + "a:\n")
			}
			return b.String()
		}(),
		"alias bomb":            "a: &a [x,x,x,x,x,x,x,x,x]\nb: &b [*a,*a,*a,*a,*a,*a,*a,*a,*a]\nc: &c [*b,*b,*b,*b,*b,*b,*b,*b,*b]\nd: &d [*c,*c,*c,*c,*c,*c,*c,*c,*c]\nkind: airfield\n",
		"self alias":            "kind: &k airfield\nname: *k\n",
		"merge key":             "base: &b {surface: paved}\nkind: airfield\nname: x\nident: XX\nelevation: 1 m\nrunways:\n  - <<: *b\n",
		"custom tag":            "kind: !evil airfield\nname: x\n",
		"binary tag":            "kind: airfield\nname: !!binary aGVsbG8=\n",
		"two documents":         okAirfield + "---\n" + okAirfield,
		"document end marker":   "...\n",
		"tab indentation":       "kind: airfield\nrunways:\n\t- surface: paved\n",
		"very long line":        "kind: airfield\nname: " + strings.Repeat("x", 200000) + "\n",
		"control characters":    strings.Replace(okAirfield, "Test field", "\"Test\\u0007\\u001b[2Jfield\"", 1),
		"kind is a list":        "kind: [airfield]\n",
		"kind is a map":         "kind: {a: b}\n",
		"unknown kind":          "kind: spaceship\n",
		"root is a list":        "- kind: airfield\n",
		"root is a number":      "42\n",
		"null root":             "~\n",
		"runways is a string":   strings.Replace(okAirfield, "runways:\n  - surface: paved\n    ends:\n      - designator: \"09\"\n        tora: 800 m\n", "runways: lots\n", 1),
		"ends is a mapping":     strings.Replace(okAirfield, "    ends:\n      - designator: \"09\"\n        tora: 800 m\n", "    ends: {designator: \"09\"}\n", 1),
		"5000 runways":          manyRunways,
		"table too large":       table(80),
		"51 calibration points": physics + strings.Repeat(point, 51),
		"calibration nan":       physics + strings.Replace(point, "520 m", ".nan m", 1),
		"calibration 1e308":     physics + strings.Replace(point, "295 m", "1e308 m", 1),
		"calibration is a map":  physics + "    {a: b}\n",
		"duplicate deep key":    strings.Replace(okAirfield, "        tora: 800 m\n", "        tora: 800 m\n        tora: 900 m\n", 1),
		"unterminated string":   "kind: airfield\nname: \"unterminated\n",
		"unterminated flow":     "kind: airfield\nname: [a, b\n",
		"key without value":     "kind:\n",
		"plan with 10k entries": "kind: plan\nname: p\ndate: 2027-01-01\noutput: o\nairfields: [a.yaml]\naircraft: [" + strings.Repeat("x.yaml,", 10000) + "]\n",
		"plan bad date":         "kind: plan\nname: p\ndate: 01/03/2027\noutput: o\nairfields: [a.yaml]\naircraft: [x.yaml]\n",
		// Issue 14 ("Smaller") and issues 9.9, 9.10, 14.2: plausible mistakes that
		// once loaded.
		"variation sign and hemisphere": strings.Replace(okAirfield, "elevation: 300 ft\n", "elevation: 300 ft\nvariation: -3 deg W\n", 1),
		"variation plus and E":          strings.Replace(okAirfield, "elevation: 300 ft\n", "elevation: 300 ft\nvariation: +3 deg E\n", 1),
		"starter placeholder":           strings.Replace(okAirfield, "800 m", "EXAMPLE 800 m", 1),
		"placeholder designator":        strings.Replace(okAirfield, `"09"`, `"EXAMPLE 09"`, 1),
		"valid_days fraction":           strings.Replace(string(mustReadFile("../../../templates/cards/a5.yaml")), "valid_days: 120", "valid_days: 1.9", 1),
		"wind factoring not answered":   strings.Replace(okAircraft, "  wind_factoring_included: true\n", "  wind_factoring_included:\n", 1),
		"wind factoring left out":       strings.Replace(okAircraft, "  wind_factoring_included: true\n", "", 1),
		"min_mass above mtow":           strings.Replace(okAircraft, "mtow: 1000 kg\n", "mtow: 1000 kg\nmin_mass: 1200 kg\n", 1),
		"min_mass zero":                 strings.Replace(okAircraft, "mtow: 1000 kg\n", "mtow: 1000 kg\nmin_mass: 0 kg\n", 1),
		"min_mass negative":             strings.Replace(okAircraft, "mtow: 1000 kg\n", "mtow: 1000 kg\nmin_mass: -1000 kg\n", 1),
		"card weight below min_mass":    strings.Replace(okAircraft, "mtow: 1000 kg\n", "mtow: 1000 kg\nmin_mass: 800 kg\nweights: [1000 kg, 100 kg]\n", 1),
		"template 100 temps": "kind: card-template\nname: t\npage: a5\nunit: m\npolicy: uk-advisory\nqnh: 1000 hPa\ntight_margin: 10 %\ntemperatures: [" + func() string {
			var b strings.Builder
			for i := 0; i < 100; i++ {
				fmt.Fprintf(&b, "%d C,", i-40)
			}
			return b.String()
		}() + "]\nwinds: [0 kt]\nmax_blocks: 2\naccelerate_check_temperature: 20 C\ncrosswind_speeds: [10 kt]\ncrosswind_angles: [30 deg]\nvalid_days: 10\n",
	}
}

func mustReadFile(p string) []byte {
	b, err := os.ReadFile(p)
	if err != nil {
		panic(err)
	}
	return b
}

func TestHostileInputs(t *testing.T) {
	inputs := hostileInputs()
	for _, c := range lineCases() { // hardening_test.go: each also checked for its line
		inputs[c.name] = c.data
	}
	require.GreaterOrEqual(t, len(inputs), 60)
	for name, data := range inputs {
		t.Run(name, func(t *testing.T) {
			doc, err := Parse("hostile.yaml", []byte(data))
			require.Error(t, err, "must be rejected")
			var list ErrorList
			require.True(t, errors.As(err, &list), "got %T", err)
			require.NotEmpty(t, list)
			assert.Less(t, len(list), 200, "errors are reported, not repeated without end")
			for _, e := range list {
				assert.Equal(t, "hostile.yaml", e.File)
				assert.NotEmpty(t, e.Msg)
			}
			_ = doc
		})
	}
}

// A 10 MB file is refused before it is parsed.
func TestTenMegabyteFile(t *testing.T) {
	big := bytes.Repeat([]byte("# padding line of a file far larger than any airfield\n"), 10<<20/54)
	_, err := Parse("big.yaml", big)
	require.Error(t, err)
	assert.Contains(t, err.Error(), "more than the 1048576 bytes a kneeprint file may have")
}
