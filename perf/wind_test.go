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
	// 14 CFR 23.1587(c)(3) (as it stood before the 2017 rewrite of Part 23, 2014 edition
	// [pub]): not more than 50 % of headwind, not less than 150 % of tailwind; the same
	// for operations in CAT.POL.A.305(c) [pub].
	assert.Equal(t, 5.0, CreditedWindMS(10, false))
	assert.Equal(t, -15.0, CreditedWindMS(-10, false))
	// Already in the manual's data: not applied twice.
	assert.Equal(t, 10.0, CreditedWindMS(10, true))
	assert.Equal(t, -10.0, CreditedWindMS(-10, true))
}

// Issue 9.1: the gust counts for any tailwind (distance and limit), the steady wind
// for a headwind (common practice; domain notes sec. 5d).
func TestGustOnTailwind(t *testing.T) {
	// 068/06G16 on a runway of 248 deg: a direct tailwind of 6 kt gusting 16 kt
	// (trigonometry: cos 180 deg = -1).
	c := WindComponents(Wind{FromDeg: 68, SpeedMS: 6 * knot, GustMS: 16 * knot}, 248, 0)
	assert.InDelta(t, -6*knot, c.HeadwindMS, 1e-9, "steady component")
	assert.InDelta(t, -16*knot, c.GustHeadwindMS, 1e-9, "gust component")
	assert.InDelta(t, -16*knot, c.ForDistanceMS(), 1e-9, "a tailwind is taken at the gust")
	// The reciprocal runway: a headwind, taken at the steady speed.
	c = WindComponents(Wind{FromDeg: 68, SpeedMS: 6 * knot, GustMS: 16 * knot}, 68, 0)
	assert.InDelta(t, 16*knot, c.GustHeadwindMS, 1e-9)
	assert.InDelta(t, 6*knot, c.ForDistanceMS(), 1e-9, "a headwind is taken steady")
	// Property: the wind used for distance is never more favourable than the steady
	// or the gust component, on every heading.
	for h := 1.0; h <= 360; h += 7 {
		c := WindComponents(Wind{FromDeg: 200, SpeedMS: 8 * knot, GustMS: 20 * knot}, h, 0)
		assert.LessOrEqual(t, c.ForDistanceMS(), c.HeadwindMS+1e-12, "heading %v", h)
		if c.HeadwindMS < 0 {
			assert.LessOrEqual(t, c.ForDistanceMS(), c.GustHeadwindMS+1e-12, "heading %v", h)
		}
	}
	// No gust reported: the steady wind for both.
	c = Components{HeadwindMS: -5 * knot}
	assert.InDelta(t, -5*knot, c.ForDistanceMS(), 1e-12)
}

// A variable wind counts as a full tailwind of the gust and a full crosswind on every
// end (issue 9.1; conservative, common practice).
func TestVariableWindWithGust(t *testing.T) {
	for _, h := range []float64{40, 220, 360} {
		c := WindComponents(Wind{Variable: true, SpeedMS: 5 * knot, GustMS: 15 * knot}, h, 0)
		assert.InDelta(t, -5*knot, c.HeadwindMS, 1e-12)
		assert.InDelta(t, -15*knot, c.GustHeadwindMS, 1e-12)
		assert.InDelta(t, -15*knot, c.ForDistanceMS(), 1e-12)
		assert.InDelta(t, 5*knot, c.CrosswindMS, 1e-12)
		assert.InDelta(t, 15*knot, c.GustCrosswindMS, 1e-12)
	}
}

// A direction varying between two bearings (a report's dddVddd group, WMO FM 15 /
// ICAO Annex 3) is taken at its worst for each runway: the least headwind (or most
// tailwind) and the most crosswind anywhere in the arc (common practice).
func TestWindDirectionRange(t *testing.T) {
	w := Wind{FromDeg: 240, SpeedMS: 20, Varies: true, VaryFromDeg: 210, VaryToDeg: 270}
	// Runway 240: the arc is +-30 deg off the nose: headwind 20 cos 30, crosswind
	// 20 sin 30 = 10 (trigonometry), on either side; steady and gust alike.
	c := WindComponents(w, 240, 0)
	assert.InDelta(t, 20*math.Sqrt(3)/2, c.HeadwindMS, 1e-9)
	assert.InDelta(t, 10, math.Abs(c.CrosswindMS), 1e-9)
	// Runway 330: the arc 210-270 is 60 to 120 deg off, so it passes through a full
	// crosswind (90 deg) and its worst headwind is 20 cos 120 = -10 (a tailwind).
	c = WindComponents(w, 330, 0)
	assert.InDelta(t, -10, c.HeadwindMS, 1e-9)
	assert.InDelta(t, 20, math.Abs(c.GustCrosswindMS), 1e-9)
	// Runway 060: the arc lies behind; its middle, 240, is a direct tailwind.
	c = WindComponents(w, 60, 0)
	assert.InDelta(t, -20, c.HeadwindMS, 1e-9)
	// An arc across north (350V030) for runway 180: worst is 180 deg off, tailwind.
	c = WindComponents(Wind{FromDeg: 10, SpeedMS: 10, Varies: true, VaryFromDeg: 350, VaryToDeg: 30}, 180, 0)
	assert.InDelta(t, -10, c.HeadwindMS, 1e-9)
	// Property: the range never gives more headwind or less crosswind than its mean
	// direction alone, on any runway.
	for h := 1.0; h <= 360; h += 5 {
		plain := WindComponents(Wind{FromDeg: 240, SpeedMS: 20}, h, 0)
		ranged := WindComponents(w, h, 0)
		assert.LessOrEqual(t, ranged.HeadwindMS, plain.HeadwindMS+1e-9, "heading %v", h)
		assert.GreaterOrEqual(t, math.Abs(ranged.CrosswindMS), math.Abs(plain.CrosswindMS)-1e-9, "heading %v", h)
	}
}
