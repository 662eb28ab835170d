package units

import (
	"math"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
)

func TestParseExactDefinitions(t *testing.T) {
	cases := []struct {
		name string
		in   string
		dim  Dimension
		want float64
		src  string
	}{
		{"foot", "1 ft", Length, 0.3048, "international yard and pound agreement, 1959"},
		{"metre", "2690 m", Length, 2690, "SI"},
		{"runway in feet", "2690 ft", Length, 819.912, "1959 agreement: 2690 x 0.3048"},
		{"pound", "1 lb", Mass, 0.45359237, "international yard and pound agreement, 1959"},
		{"pounds alias", "2400 lbs", Mass, 1088.621688, "1959 agreement: 2400 x 0.45359237"},
		{"knot", "1 kt", Speed, 1852.0 / 3600.0, "ICAO Annex 5: 1 NM = 1852 m"},
		{"kmh", "36 km/h", Speed, 10, "SI"},
		{"mph", "1 mph", Speed, 0.44704, "1959 agreement: 1 mile = 1609.344 m"},
		{"inHg", "1 inHg", Pressure, 3386.389, "NIST SP 811: 1 inHg = 33.8639 hPa"},
		{"inHg no space", "29.92inHg", Pressure, 101320.75888, "NIST SP 811: 29.92 x 3386.389 Pa"},
		{"hPa", "1013.25 hPa", Pressure, 101325, "ICAO Doc 7488: standard sea-level pressure"},
		{"celsius", "15 C", Temperature, 288.15, "ISO 80000-5: 0 degC = 273.15 K"},
		{"celsius degree sign", "-5 °C", Temperature, 268.15, "ISO 80000-5"},
		{"fahrenheit freezing", "32 F", Temperature, 273.15, "ISO 80000-5: degF = degC x 9/5 + 32"},
		{"fahrenheit 59", "59F", Temperature, 288.15, "ISO 80000-5: 59 degF = 15 degC"},
		{"slope", "-1.5 %", Slope, -1.5, "percent kept as percent"},
		{"angle", "240 deg", Angle, 240, "degrees kept as degrees"},
		{"horsepower", "1 hp", Power, 745.69987158227022, "NIST SP 811: 550 ft lbf/s"},
		{"kilowatt", "134.2 kW", Power, 134200, "SI"},
		{"square feet", "1 ft2", Area, 0.09290304, "1959 agreement: 0.3048^2"},
		{"exponent", "1.5e3 m", Length, 1500, "SI"},
	}
	for _, tc := range cases {
		t.Run(tc.name, func(t *testing.T) {
			got, err := Parse(tc.in, tc.dim)
			require.NoError(t, err)
			assert.InDelta(t, tc.want, got, 1e-9*math.Max(1, math.Abs(tc.want)), "got %v, want %v (%s)", got, tc.want, tc.src)
		})
	}
}

func TestParseRejects(t *testing.T) {
	cases := []struct {
		name, in string
		dim      Dimension
		wantMsg  string
	}{
		{"bare number", "2690", Length, "has no unit: write it with one of m, ft"},
		{"wrong unit", "2690 kg", Length, `unknown length unit "kg", accepted: m, ft`},
		{"nan", "NaN m", Length, "is not a length"},
		{"inf", "Inf ft", Length, "is not a length"},
		{"huge", "1e999 m", Length, "is not a finite number"},
		{"empty", "  ", Mass, "empty mass"},
		{"words", "heavy", Mass, "is not a mass"},
	}
	for _, tc := range cases {
		t.Run(tc.name, func(t *testing.T) {
			_, err := Parse(tc.in, tc.dim)
			require.Error(t, err)
			assert.Contains(t, err.Error(), tc.wantMsg)
		})
	}
}

func TestRoundTrip(t *testing.T) {
	// Converting out and back must be the identity (property).
	for _, v := range []float64{0, 1, 123.456, 5000} {
		assert.InDelta(t, v, Feet(v*MetresPerFoot), 1e-9)
		assert.InDelta(t, v, Pounds(v*KilogramsPerPound), 1e-9)
		assert.InDelta(t, v, Knots(v*MetresPerSecPerKnot), 1e-9)
		assert.InDelta(t, v, InHg(v*PascalsPerInHg), 1e-9)
	}
	// 29.92 inHg is the standard altimeter setting, 1013.2 hPa (ICAO Doc 7488 rounds
	// 1013.25 hPa to 29.92 inHg).
	assert.InDelta(t, 1013.25, HPa(29.92*PascalsPerInHg), 0.05)
}

func FuzzParse(f *testing.F) {
	for _, s := range []string{"2690 ft", "1 kt", "29.92inHg", "NaN", "-1e308 m", "", "1.2.3 m", "°C"} {
		f.Add(s)
	}
	f.Fuzz(func(t *testing.T, s string) {
		for d := Length; d <= Percent; d++ {
			v, err := Parse(s, d)
			if err == nil && (math.IsNaN(v) || math.IsInf(v, 0)) {
				t.Fatalf("Parse(%q) = %v without error", s, v)
			}
		}
	})
}

// Values and ranges in messages are shown in the unit the user wrote, rounded to
// what can be told apart, never as a raw conversion ("3.048 to 152.4 m" for a value
// in feet, "1 to 19685.03937007874"). Ranges are rounded inwards, so a value shown
// as accepted is accepted. Check values: 1 ft = 0.3048 m and 1 lb = 0.45359237 kg
// (international yard and pound agreement, 1959), degF = degC x 9/5 + 32 (ISO
// 80000-5), 1 kt = 1852/3600 m/s (ICAO Annex 5).
func TestFormatInTheUnitWritten(t *testing.T) {
	for _, tc := range []struct {
		name string
		got  string
		want string
	}{
		{"10 to 500 ft stored in m", FormatRange(10*MetresPerFoot, 500*MetresPerFoot, Length, "ft"), "10 to 500 ft"},
		{"1 to 6000 m shown in ft: inwards", FormatRange(1, 6000, Length, "ft"), "3.29 to 19685 ft"},
		{"the same in m", FormatRange(1, 6000, Length, "m"), "1 to 6000 m"},
		{"-60 to 60 C in F", FormatRange(-60+KelvinAtZeroCelsius, 60+KelvinAtZeroCelsius, Temperature, "F"), "-76 to 140 F"},
		{"100 to 5670 kg in lb: inwards", FormatRange(100, 5670, Mass, "lb"), "221 to 12500 lb"},
		{"unknown unit: SI", FormatRange(1, 2, Length, "furlong"), "1 to 2 m"},
		{"inHg to the hundredth (NIST SP 811: 1 inHg = 3386.389 Pa)", FormatRange(80000, 110000, Pressure, "inHg"), "23.63 to 32.48 inHg"},
		{"a length in ft", Format(610, Length, "ft"), "2001 ft"},
		{"a mass in kg", Format(700, Mass, "kg"), "700 kg"},
		{"a speed in km/h", Format(10, Speed, "km/h"), "36 km/h"},
		{"plain numbers", FormatNumberRange(1, 6000/MetresPerFoot), "1 to 19685"},
		{"small plain numbers", FormatNumberRange(0.01, 0.15), "0.01 to 0.15"},
		{"negative plain numbers", FormatNumberRange(-2000*MetresPerFoot/60, 5000*MetresPerFoot/60), "-10.16 to 25.4"},
	} {
		assert.Equal(t, tc.want, tc.got, tc.name)
	}
	for _, u := range []struct {
		s    string
		d    Dimension
		want string
	}{{"5 ft", Length, "ft"}, {"5ft", Length, "ft"}, {"86 °F", Temperature, "F"}, {"2300 lbs", Mass, "lb"}, {"junk", Length, "m"}} {
		assert.Equal(t, u.want, UnitOf(u.s, u.d), u.s)
	}
	// FromSI inverts Parse for every unit of every dimension.
	for d, us := range table {
		for _, u := range us {
			si, err := Parse("12.5 "+u.spellings[0], d)
			require.NoError(t, err)
			back, ok := FromSI(si, d, u.def.name)
			require.True(t, ok)
			assert.InDelta(t, 12.5, back, 1e-9, "%s %s", d, u.def.name)
		}
	}
}
