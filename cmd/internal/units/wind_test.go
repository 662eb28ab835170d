package units

import (
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
)

func TestParseWind(t *testing.T) {
	kt := MetresPerSecPerKnot
	cases := []struct {
		in   string
		want WindReport
	}{
		// The tower form: three-digit direction, magnetic (domain notes sec. 5d).
		{"240/15", WindReport{FromDeg: 240, SpeedMS: 15 * kt}},
		{"240/15G25", WindReport{FromDeg: 240, SpeedMS: 15 * kt, GustMS: 25 * kt}},
		{"240/15g25", WindReport{FromDeg: 240, SpeedMS: 15 * kt, GustMS: 25 * kt}},
		{"090/05kt", WindReport{FromDeg: 90, SpeedMS: 5 * kt}},
		{"090/5", WindReport{FromDeg: 90, SpeedMS: 5 * kt}},
		{"360/10", WindReport{FromDeg: 360, SpeedMS: 10 * kt}},
		{"VRB/03", WindReport{Variable: true, SpeedMS: 3 * kt}},
		{"calm", WindReport{}},
		{"000/00", WindReport{}},
		// The report group of WMO FM 15 / ICAO Annex 3: dddff(Gfm)KT or MPS, true.
		{"24015KT", WindReport{FromDeg: 240, SpeedMS: 15 * kt, True: true}},
		{"24015G25KT", WindReport{FromDeg: 240, SpeedMS: 15 * kt, GustMS: 25 * kt, True: true}},
		{"VRB05KT", WindReport{Variable: true, SpeedMS: 5 * kt, True: true}},
		{"00000KT", WindReport{True: true}},
		{"27008MPS", WindReport{FromDeg: 270, SpeedMS: 8, True: true}},
		{"27008G15MPS", WindReport{FromDeg: 270, SpeedMS: 8, GustMS: 15, True: true}},
		// With a direction-range group: 210V270.
		{"24015KT 210V270", WindReport{FromDeg: 240, SpeedMS: 15 * kt, True: true, Varies: true, VaryFromDeg: 210, VaryToDeg: 270}},
		{"240/15 210V270", WindReport{FromDeg: 240, SpeedMS: 15 * kt, Varies: true, VaryFromDeg: 210, VaryToDeg: 270}},
	}
	for _, tc := range cases {
		t.Run(tc.in, func(t *testing.T) {
			got, err := ParseWind(tc.in)
			require.NoError(t, err)
			assert.InDelta(t, tc.want.FromDeg, got.FromDeg, 1e-12)
			assert.InDelta(t, tc.want.SpeedMS, got.SpeedMS, 1e-12)
			assert.InDelta(t, tc.want.GustMS, got.GustMS, 1e-12)
			assert.Equal(t, tc.want.Variable, got.Variable)
			assert.Equal(t, tc.want.True, got.True, "reference")
			assert.Equal(t, tc.want.Varies, got.Varies)
			assert.InDelta(t, tc.want.VaryFromDeg, got.VaryFromDeg, 1e-12)
			assert.InDelta(t, tc.want.VaryToDeg, got.VaryToDeg, 1e-12)
		})
	}
}

// Issue 9.2 and issue 14 ("Smaller"): winds a pilot could mistype are refused, never
// read as something else.
func TestParseWindRefuses(t *testing.T) {
	for _, bad := range []string{
		"24/15",     // two-digit direction: 024 or 240?
		"4/15",      // one-digit direction
		"240/15G",   // gust missing
		"240/1g5",   // one-digit gust
		"+90/5",     // signed direction
		"090/+5",    // signed speed
		"-0/0",      // signed calm
		"0/0",       // calm written short
		"240",       // no speed
		"400/10",    // past 360
		"240/-5",    // negative speed
		"240/15G10", // gust below the steady speed
		"240/15G15", // gust not above it
		"abc/10",
		"240/150", // past 99 kt
		"000/10",  // direction 000 with wind
		"/", "240/", "", " ",
		"2401KT",   // one-digit speed in the report group
		"24015",    // report group without a unit
		"24015KMH", // not a unit of the report group
		"24015kt",  // report groups are upper case
		"24015G25", // no unit
		"P49MPS",   // above the report's two digits
		"24015KT 27V210x",
		"24015KT 210V270 300V330", // one range only
		"24015KT 210V210",         // an empty range
		"VRB05KT 210V270",         // a variable wind has no range
		"24060MPS",                // 60 m/s, past 99 kt
	} {
		_, err := ParseWind(bad)
		assert.Error(t, err, "%q must be refused", bad)
	}
}

func FuzzParseWind(f *testing.F) {
	for _, s := range []string{"240/15", "240/15G25", "VRB/05", "calm", "000/00", "9999/9", "240/G", "24015G25KT", "27008MPS", "24015KT 210V270"} {
		f.Add(s)
	}
	f.Fuzz(func(t *testing.T, s string) {
		w, err := ParseWind(s)
		if err != nil {
			return
		}
		if w.FromDeg < 0 || w.FromDeg > 360 || w.SpeedMS < 0 || w.GustMS < 0 || w.SpeedMS > 99*MetresPerSecPerKnot+1e-9 || (w.GustMS > 0 && w.GustMS <= w.SpeedMS) {
			t.Fatalf("ParseWind(%q) = %+v", s, w)
		}
		if w.Varies && (w.VaryFromDeg < 1 || w.VaryFromDeg > 360 || w.VaryToDeg < 1 || w.VaryToDeg > 360) {
			t.Fatalf("ParseWind(%q) range = %+v", s, w)
		}
	})
}
