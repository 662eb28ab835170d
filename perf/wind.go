package perf

import "math"

// Wind is a wind report: the direction it blows from, its steady speed and gust.
type Wind struct {
	FromDeg float64 // direction the wind blows from
	SpeedMS float64 // steady (mean) speed
	GustMS  float64 // gust speed, 0 when none reported
	True    bool    // direction relative to true north (a routine report or written forecast); false: magnetic (tower, broadcast)

	// Variable is a wind of variable direction (VRB): it is taken as a full tailwind
	// and a full crosswind on every runway end (conservative, common practice).
	Variable bool
	// Varies says the direction varies between VaryFromDeg and VaryToDeg, clockwise
	// (a routine report's dddVddd group, WMO FM 15 / ICAO Annex 3): each runway end
	// takes the worst direction of that arc.
	Varies                 bool
	VaryFromDeg, VaryToDeg float64
}

// Components are the wind components along and across one runway direction.
type Components struct {
	HeadwindMS      float64 // along the runway from the steady wind; negative = tailwind
	GustHeadwindMS  float64 // along the runway from the gust; negative = tailwind
	CrosswindMS     float64 // across, from the steady wind; positive from the right
	GustCrosswindMS float64 // across, from the gust (for crosswind limits)
}

// ForDistanceMS is the reported along-runway wind used for the takeoff distance and
// the tailwind limit: the steady component for a headwind, the gust component for
// a tailwind (issue 9.1; domain notes sec. 5d: "use the gust for any tailwind
// component" - common practice). With no gust reported it is the steady component.
func (c Components) ForDistanceMS() float64 {
	if g := math.Min(c.HeadwindMS, c.GustHeadwindMS); g < 0 {
		return g
	}
	return c.HeadwindMS
}

// WindComponents resolves wind w on a runway of magnetic heading headingMagDeg at an
// airfield with magnetic variation variationDeg (east positive):
//
//	theta = wind direction (magnetic) - runway heading
//	headwind = V cos(theta), crosswind = V sin(theta)
//
// A true direction is made magnetic first: magnetic = true - variation(E). Steady
// and gust speeds give one component each; see ForDistanceMS for the one used for
// distance, the gust crosswind is the one for limits (domain notes sec. 3).
//
// A variable wind (VRB) is a full tailwind and a full crosswind of its speed and its
// gust on every end. A direction range (w.Varies) gives, for this runway, the smallest
// headwind and the largest crosswind found anywhere in the arc or at the mean
// direction: both are extremes of cos and sin, reached at the ends of the arc or where
// it crosses 180 deg (tailwind) or 90/270 deg (full crosswind) off the runway.
func WindComponents(w Wind, headingMagDeg, variationDeg float64) Components {
	gust := math.Max(w.GustMS, w.SpeedMS)
	if w.Variable {
		return Components{HeadwindMS: -w.SpeedMS, GustHeadwindMS: -gust, CrosswindMS: w.SpeedMS, GustCrosswindMS: gust}
	}
	offset := -headingMagDeg
	if w.True {
		offset -= variationDeg
	}
	cosMin, sinWorst := worstAngles(w, offset)
	return Components{
		HeadwindMS:      cleanZero(w.SpeedMS * cosMin),
		GustHeadwindMS:  cleanZero(gust * cosMin),
		CrosswindMS:     cleanZero(w.SpeedMS * sinWorst),
		GustCrosswindMS: cleanZero(gust * sinWorst),
	}
}

// worstAngles returns, over the wind's direction (and its arc when it varies) made
// relative to the runway by adding offsetDeg, the smallest cosine and the sine of
// largest magnitude (with its sign).
func worstAngles(w Wind, offsetDeg float64) (cosMin, sinWorst float64) {
	rad := func(deg float64) float64 { return deg * math.Pi / 180 }
	s, c := math.Sincos(rad(w.FromDeg + offsetDeg))
	cosMin, sinWorst = c, s
	if !w.Varies {
		return cosMin, sinWorst
	}
	from := norm360(w.VaryFromDeg + offsetDeg)
	width := norm360(w.VaryToDeg - w.VaryFromDeg) // clockwise extent of the arc
	cands := []float64{from, from + width}
	for _, crit := range []float64{90, 180, 270} {
		if norm360(crit-from) <= width {
			cands = append(cands, crit)
		}
	}
	for _, a := range cands {
		s, c := math.Sincos(rad(a))
		if c < cosMin {
			cosMin = c
		}
		if math.Abs(s) > math.Abs(sinWorst) {
			sinWorst = s
		}
	}
	return cosMin, sinWorst
}

// norm360 maps an angle in degrees into [0, 360).
func norm360(deg float64) float64 {
	d := math.Mod(deg, 360)
	if d < 0 {
		d += 360
	}
	return d
}

// cleanZero removes floating-point dust such as cos(90 deg) = 6e-17.
func cleanZero(x float64) float64 {
	if math.Abs(x) < 1e-9 {
		return 0
	}
	return x
}

// Wind factoring for distance: credit not more than 50 % of a reported headwind and
// not less than 150 % of a reported tailwind. Sources: 14 CFR 23.1587(c)(3), as it
// stood before the 2017 rewrite of Part 23 (flight-manual takeoff data: "the effect
// on takeoff distance of runway slope and 50 percent of the headwind component and
// 150 percent of the tailwind component"); Regulation (EU) No 965/2012 Annex IV
// CAT.POL.A.305(c) (the operator's side: "not more than 50 % of the reported headwind
// component or not less than 150 % of the reported tailwind component").
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
