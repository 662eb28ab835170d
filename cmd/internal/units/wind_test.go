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
		{"240/15", WindReport{FromDeg: 240, SpeedMS: 15 * kt}},
		{"240/15G25", WindReport{FromDeg: 240, SpeedMS: 15 * kt, GustMS: 25 * kt}},
		{"090/05kt", WindReport{FromDeg: 90, SpeedMS: 5 * kt}},
		{"360/10", WindReport{FromDeg: 360, SpeedMS: 10 * kt}},
		{"VRB/03", WindReport{Variable: true, SpeedMS: 3 * kt}},
		{"calm", WindReport{}},
		{"0/0", WindReport{}},
	}
	for _, tc := range cases {
		t.Run(tc.in, func(t *testing.T) {
			got, err := ParseWind(tc.in)
			require.NoError(t, err)
			assert.InDelta(t, tc.want.FromDeg, got.FromDeg, 1e-12)
			assert.InDelta(t, tc.want.SpeedMS, got.SpeedMS, 1e-12)
			assert.InDelta(t, tc.want.GustMS, got.GustMS, 1e-12)
			assert.Equal(t, tc.want.Variable, got.Variable)
		})
	}
	for _, bad := range []string{"240", "400/10", "240/-5", "240/15G10", "abc/10", "240/150", "000/10", "/", "240/"} {
		_, err := ParseWind(bad)
		assert.Error(t, err, bad)
	}
}

func FuzzParseWind(f *testing.F) {
	for _, s := range []string{"240/15", "240/15G25", "VRB/05", "calm", "0/0", "9999/9", "240/G"} {
		f.Add(s)
	}
	f.Fuzz(func(t *testing.T, s string) {
		w, err := ParseWind(s)
		if err != nil {
			return
		}
		if w.FromDeg < 0 || w.FromDeg > 360 || w.SpeedMS < 0 || w.GustMS < 0 {
			t.Fatalf("ParseWind(%q) = %+v", s, w)
		}
	})
}
