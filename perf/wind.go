package perf

import "math"

// Wind is a wind report: the direction it blows from, its steady speed and gust.
type Wind struct {
	FromDeg float64 // direction the wind blows from
	SpeedMS float64 // steady (mean) speed
	GustMS  float64 // gust speed, 0 when none reported
	True    bool    // direction relative to true north (a written forecast or report); false: magnetic (tower, broadcast)
}

// Components are the wind components along and across one runway direction.
type Components struct {
	HeadwindMS      float64 // along the runway from the steady wind; negative = tailwind
	CrosswindMS     float64 // across, from the steady wind; positive from the right
	GustCrosswindMS float64 // across, from the gust (for crosswind limits)
}

// WindComponents resolves wind w on a runway of magnetic heading headingMagDeg at an
// airfield with magnetic variation variationDeg (east positive):
//
//	theta = wind direction (magnetic) - runway heading
//	headwind = V cos(theta), crosswind = V sin(theta)
//
// A true direction is made magnetic first: magnetic = true - variation(E). The steady
// wind gives the headwind (for distance), the gust the crosswind for limits (common
// practice; domain notes sec. 3).
func WindComponents(w Wind, headingMagDeg, variationDeg float64) Components {
	from := w.FromDeg
	if w.True {
		from -= variationDeg
	}
	theta := (from - headingMagDeg) * math.Pi / 180
	s, c := math.Sincos(theta)
	gust := math.Max(w.GustMS, w.SpeedMS)
	return Components{
		HeadwindMS:      cleanZero(w.SpeedMS * c),
		CrosswindMS:     cleanZero(w.SpeedMS * s),
		GustCrosswindMS: cleanZero(gust * s),
	}
}

// cleanZero removes floating-point dust such as cos(90 deg) = 6e-17.
func cleanZero(x float64) float64 {
	if math.Abs(x) < 1e-9 {
		return 0
	}
	return x
}

// Wind factoring for distance: credit not more than 50 % of a reported headwind and
// not less than 150 % of a reported tailwind. Source: 14 CFR 23.1587 (flight-manual
// takeoff data); EU Air OPS CAT.POL.A.305(c)/NCC.POL (operations).
const (
	HeadwindCredit  = 0.5
	TailwindPenalty = 1.5
)

// CreditedWindMS is the along-runway wind a takeoff model should use for a reported
// headwind component headwindMS (negative = tailwind). When the model's data already
// include the factoring (most flight-manual charts do), the reported value is
// returned unchanged so the factor is never applied twice.
func CreditedWindMS(headwindMS float64, factoringInData bool) float64 {
	if factoringInData {
		return headwindMS
	}
	if headwindMS >= 0 {
		return HeadwindCredit * headwindMS
	}
	return TailwindPenalty * headwindMS
}
