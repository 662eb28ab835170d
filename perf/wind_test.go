package perf

import (
	"math"
	"testing"

	"github.com/stretchr/testify/assert"
)

func TestWindComponents(t *testing.T) {
	const v = 20.0
	cases := []struct {
		name            string
		from, heading   float64
		wantHead, wantX float64
	}{
		// Exact trigonometry: headwind = V cos(theta), crosswind = V sin(theta).
		{"on the nose", 240, 240, 20, 0},
		{"30 deg right", 270, 240, v * math.Sqrt(3) / 2, v / 2},
		{"45 deg left", 195, 240, v * math.Sqrt2 / 2, -v * math.Sqrt2 / 2},
		{"60 deg right", 300, 240, v / 2, v * math.Sqrt(3) / 2},
		{"90 deg right", 330, 240, 0, v},
		{"tail", 60, 240, -v, 0},
		{"across north", 10, 350, v * math.Cos(20*math.Pi/180), v * math.Sin(20*math.Pi/180)},
	}
	for _, tc := range cases {
		t.Run(tc.name, func(t *testing.T) {
			c := WindComponents(Wind{FromDeg: tc.from, SpeedMS: v}, tc.heading, 0)
			assert.InDelta(t, tc.wantHead, c.HeadwindMS, 1e-9, "headwind got %v want %v", c.HeadwindMS, tc.wantHead)
			assert.InDelta(t, tc.wantX, c.CrosswindMS, 1e-9, "crosswind got %v want %v", c.CrosswindMS, tc.wantX)
		})
	}
}

// The clock rule of thumb (common practice): 30 deg off -> half the wind across,
// 45 -> three quarters, 60 and more -> all of it. A looser check.
func TestCrosswindClockRule(t *testing.T) {
	for _, tc := range []struct{ angle, fraction, tol float64 }{{15, 0.25, 0.02}, {30, 0.5, 0.01}, {45, 0.75, 0.05}, {60, 1.0, 0.14}, {90, 1.0, 0.01}} {
		c := WindComponents(Wind{FromDeg: 100 + tc.angle, SpeedMS: 10}, 100, 0)
		assert.InDelta(t, tc.fraction, c.CrosswindMS/10, tc.tol, "%.0f deg off: got %.3f of the wind", tc.angle, c.CrosswindMS/10)
	}
}

func TestWindTrueAndGust(t *testing.T) {
	// A forecast's 250 deg true with variation 10 deg E is 240 magnetic: on the nose of 24.
	c := WindComponents(Wind{FromDeg: 250, SpeedMS: 10, GustMS: 20, True: true}, 240, 10)
	assert.InDelta(t, 10, c.HeadwindMS, 1e-9)
	assert.InDelta(t, 0, c.CrosswindMS, 1e-9)
	// Gust for the crosswind limit, steady wind for distance (domain notes sec. 3).
	c = WindComponents(Wind{FromDeg: 330, SpeedMS: 10, GustMS: 20}, 240, 0)
	assert.InDelta(t, 0, c.HeadwindMS, 1e-9)
	assert.InDelta(t, 10, c.CrosswindMS, 1e-9)
	assert.InDelta(t, 20, c.GustCrosswindMS, 1e-9)
}

func TestCreditedWind(t *testing.T) {
	// 14 CFR 23.1587: not more than 50 % of headwind, not less than 150 % of tailwind.
	assert.Equal(t, 5.0, CreditedWindMS(10, false))
	assert.Equal(t, -15.0, CreditedWindMS(-10, false))
	// Already in the manual's data: not applied twice.
	assert.Equal(t, 10.0, CreditedWindMS(10, true))
	assert.Equal(t, -10.0, CreditedWindMS(-10, true))
}
