package metar

import (
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"

	"kneeprint/cmd/internal/units"
)

const kt = units.MetresPerSecPerKnot

// The reports below are written for these tests (station ZZZZ, the placeholder
// ICAO Doc 7910 gives for "no indicator"); their groups follow WMO No. 306, Manual on
// Codes, FM 15 METAR and ICAO Annex 3, Appendix 3.
func TestParseReports(t *testing.T) {
	cases := []struct {
		name     string
		in       string
		windFrom float64
		speed    float64
		gust     float64
		variable bool
		varies   [2]float64
		tempC    float64
		qnhHPa   float64
	}{
		{"plain", "METAR ZZZZ 121250Z 24015KT 9999 FEW030 18/10 Q1013", 240, 15 * kt, 0, false, [2]float64{}, 18, 1013},
		{"gust, range, minus temperatures", "METAR ZZZZ 030650Z 24015G25KT 210V270 4000 -SN BKN008 M05/M08 Q1003", 240, 15 * kt, 25 * kt, false, [2]float64{210, 270}, -5, 1003},
		{"CAVOK and NOSIG", "ZZZZ 121250Z 31008KT CAVOK 24/12 Q1021 NOSIG=", 310, 8 * kt, 0, false, [2]float64{}, 24, 1021},
		{"NSC and AUTO", "METAR ZZZZ 121250Z AUTO 09006KT 9999 NSC 12/07 Q0998", 90, 6 * kt, 0, false, [2]float64{}, 12, 998},
		{"inches of mercury", "SPECI ZZZZ 121250Z 18012KT 10SM CLR 30/18 A2962", 180, 12 * kt, 0, false, [2]float64{}, 30, 29.62 * units.PascalsPerInHg / 100},
		{"variable and m/s", "METAR ZZZZ 121250Z VRB02MPS 9999 SCT040 M01/M03 Q1030", 0, 2, 0, true, [2]float64{}, -1, 1030},
		{"calm", "METAR COR ZZZZ 121250Z 00000KT 0800 FG VV002 03/03 Q1016", 0, 0, 0, false, [2]float64{}, 3, 1016},
		// Groups after RMK and in the trend are not the observation.
		{"remarks and trend ignored", "METAR ZZZZ 121250Z 20010KT 9999 15/09 Q1011 BECMG 25025G40KT RMK Q0980 M10/M12", 200, 10 * kt, 0, false, [2]float64{}, 15, 1011},
		{"temperature with missing dew point", "METAR ZZZZ 121250Z 20010KT 9999 15/// Q1011", 200, 10 * kt, 0, false, [2]float64{}, 15, 1011},
	}
	for _, tc := range cases {
		t.Run(tc.name, func(t *testing.T) {
			r, err := Parse(tc.in)
			require.NoError(t, err)
			require.NotNil(t, r.Wind)
			assert.True(t, r.Wind.True, "a report's wind is true")
			assert.InDelta(t, tc.windFrom, r.Wind.FromDeg, 1e-12)
			assert.InDelta(t, tc.speed, r.Wind.SpeedMS, 1e-12)
			assert.InDelta(t, tc.gust, r.Wind.GustMS, 1e-12)
			assert.Equal(t, tc.variable, r.Wind.Variable)
			assert.Equal(t, tc.varies[0] != 0, r.Wind.Varies)
			assert.InDelta(t, tc.varies[0], r.Wind.VaryFromDeg, 1e-12)
			assert.InDelta(t, tc.varies[1], r.Wind.VaryToDeg, 1e-12)
			require.True(t, r.HasTemp)
			assert.InDelta(t, tc.tempC+units.KelvinAtZeroCelsius, r.TempK, 1e-9)
			require.True(t, r.HasQNH)
			assert.InDelta(t, tc.qnhHPa*100, r.QNHPa, 1e-6)
		})
	}
}

// A report missing groups is read for what it has; what it lacks is said, never
// assumed (issue 9.3).
func TestParseMissingGroups(t *testing.T) {
	r, err := Parse("METAR ZZZZ 121250Z AUTO /////KT 9999 NCD /////  Q////")
	require.NoError(t, err)
	assert.Nil(t, r.Wind)
	assert.False(t, r.HasTemp)
	assert.False(t, r.HasQNH)
	assert.ElementsMatch(t, []string{"wind", "temperature", "QNH"}, r.Missing())

	r, err = Parse("METAR ZZZZ 121250Z 24010KT 9999 FEW030 Q1013")
	require.NoError(t, err)
	assert.False(t, r.HasTemp)
	assert.Equal(t, []string{"temperature"}, r.Missing())
}

func TestParseRefuses(t *testing.T) {
	for _, bad := range []string{
		"",
		"hello world",
		"METAR ZZZZ 121250Z NIL", // no observation
		"METAR ZZZZ 121250Z 240P99KT 9999 15/09 Q1011",                // above 99 kt
		"METAR ZZZZ 121250Z 24015G10KT 9999 15/09 Q1011",              // gust below speed
		"METAR ZZZZ 121250Z 24015KT 9999 15/09 Q1011 24015KT",         // two wind groups
		"METAR ZZZZ 121250Z 24015KT 9999 15/09 Q1011 Q1012",           // two QNH groups
		"METAR ZZZZ 121250Z 24015KT 9999 15/09 14/08 Q1011",           // two temperature groups
		"METAR ZZZZ 121250Z 24015KT 9999 15/09 Q0500",                 // a QNH no aerodrome has
		"METAR ZZZZ 121250Z 24015KT 210V270 200V280 9999 15/09 Q1011", // two ranges
	} {
		_, err := Parse(bad)
		assert.Error(t, err, "%q", bad)
	}
}

func FuzzParse(f *testing.F) {
	for _, s := range []string{
		"METAR ZZZZ 121250Z 24015G25KT 210V270 9999 FEW030 M05/M08 Q1003 RMK AO2",
		"ZZZZ 121250Z 00000KT CAVOK 24/12 A2992 NOSIG=",
		"METAR ZZZZ 121250Z AUTO /////KT 9999 NCD ///// Q////",
	} {
		f.Add(s)
	}
	f.Fuzz(func(t *testing.T, s string) {
		r, err := Parse(s)
		if err != nil {
			return
		}
		if r.HasTemp && !(r.TempK > 150 && r.TempK < 400) {
			t.Fatalf("Parse(%q) temperature %v", s, r.TempK)
		}
		if r.HasQNH && !(r.QNHPa >= 80000 && r.QNHPa <= 110000) {
			t.Fatalf("Parse(%q) QNH %v", s, r.QNHPa)
		}
	})
}

// The dew point is read too (WMO FM 15: TT/TdTd, M for minus), so that a report
// whose dew point is above its temperature, which air does not hold (the dew point is
// at most the temperature: common practice), can be questioned.
func TestParseDewPoint(t *testing.T) {
	r, err := Parse("METAR ZZZZ 121250Z 20010KT 9999 M05/M08 Q1011")
	require.NoError(t, err)
	require.True(t, r.HasDew)
	assert.InDelta(t, -8+units.KelvinAtZeroCelsius, r.DewK, 1e-9)
	assert.Empty(t, r.Warnings())
	r, err = Parse("METAR ZZZZ 121250Z 20010KT 9999 15/18 Q1011")
	require.NoError(t, err)
	require.Len(t, r.Warnings(), 1)
	assert.Contains(t, r.Warnings()[0], "the dew point 18 C (15/18) is above the temperature 15 C")
	r, err = Parse("METAR ZZZZ 121250Z 20010KT 9999 15/// Q1011")
	require.NoError(t, err)
	assert.False(t, r.HasDew)
	assert.Empty(t, r.Warnings())
}
