package spec

import (
	"math"

	"kneeprint/cmd/internal/units"
	"kneeprint/perf"
)

// KindCardTemplate is a card preset file.
const KindCardTemplate Kind = "card-template"

// CardTemplate is a card preset in SI units.
type CardTemplate struct {
	Name               string
	Page               string
	Unit               string // "m" or "ft": every length on the card
	MassUnit           string // "kg" or "lb": the weights on the card
	TempUnit           string // "C" or "F": the temperatures on the card
	Policy             string
	QNHPa              float64
	TightMargin        float64 // fraction
	TempsK             []float64
	WindsMS            []float64
	MaxBlocks          int
	CrosswindSpeedsMS  []float64
	CrosswindAnglesDeg []float64
	ValidDays          int
	// ObstacleMarginM is the clearance a runway end's obstacles must be passed by
	// (perf.DefaultObstacleMarginM, 50 ft, when the template does not say).
	ObstacleMarginM float64
	// Landing says where a profile's landing figures go: LandingBack (a landing side
	// behind each takeoff side, the default), LandingSamePage (both on one page) or
	// LandingNone.
	Landing string `json:",omitempty"`
}

// Obstacle margins a template (and check's --obstacle-margin) accepts: below 10 ft a margin is smaller than the
// precision of a surveyed obstacle height, above 500 ft it is no longer a margin
// (common practice).
const (
	MinObstacleMarginM = 10 * units.MetresPerFoot
	MaxObstacleMarginM = 500 * units.MetresPerFoot
)

// Where a card template puts the landing figures.
const (
	LandingBack     = "back"
	LandingSamePage = "same-page"
	LandingNone     = "none"
)

// Grid-size limits: a card cannot hold more, and larger requests are mistakes.
const (
	maxTemplateTemps  = 12
	maxTemplateWinds  = 11
	maxTemplateBlocks = 6
)

func (d *decoder) cardTemplate(m *mapping) *CardTemplate {
	t := &CardTemplate{}
	t.Name = m.str("name", true)
	t.Page = m.oneOf("page", true, "a5", "half-letter", "5x8")
	t.Unit = m.oneOf("unit", true, "m", "ft")
	t.MassUnit = m.oneOf("mass_unit", false, "kg", "lb")
	if t.MassUnit == "" && !m.has("mass_unit") {
		t.MassUnit = "kg"
		d.notef("mass_unit not given: weights in kg")
	}
	t.TempUnit = m.oneOf("temperature_unit", false, "C", "F")
	if t.TempUnit == "" && !m.has("temperature_unit") {
		t.TempUnit = "C"
		d.notef("temperature_unit not given: temperatures in C")
	}
	t.Policy = m.oneOf("policy", true, "uk-advisory", "eu-class-b")
	if q, ok := m.quantity("qnh", units.Pressure, true, 90000, 105000); ok {
		t.QNHPa = q
		// A card holds for its QNH and above: one assumed above the standard
		// atmosphere's leaves out most days (a 1030 typed for 1003 puts the pressure
		// altitude about 730 ft low: 27 ft per hPa, ICAO Doc 7488 near sea level).
		if q > perf.ISASeaLevelPressurePa+1e-6 {
			d.warnf(m.vals["qnh"], "qnh", "%s is above the standard 1013.25 hPa: the card's figures hold only at this QNH or above, so on a day with a lower QNH they are too short; a low QNH such as 1000 hPa covers most days", m.vals["qnh"].Value)
		}
	}
	if v, ok := m.quantity("tight_margin", units.Percent, true, 0, 50); ok {
		t.TightMargin = v / 100
	}
	temps, tn, ok := m.quantities("temperatures", units.Temperature, true, minDataTempK, maxDataTempK)
	if ok && d.increasing("temperatures", temps, tn) {
		t.TempsK = temps
	}
	winds, wn, ok := m.quantities("winds", units.Speed, true, -30*units.MetresPerSecPerKnot, 50*units.MetresPerSecPerKnot)
	if ok && d.increasing("winds", winds, wn) {
		t.WindsMS = winds
	}
	if len(temps) > maxTemplateTemps {
		d.errorf(m.vals["temperatures"], "temperatures", "at most %d temperatures fit a card", maxTemplateTemps)
	}
	if len(winds) > maxTemplateWinds {
		d.errorf(m.vals["winds"], "winds", "at most %d winds fit a card", maxTemplateWinds)
	}
	if v, ok := m.number("max_blocks", true, 1, maxTemplateBlocks); ok {
		if v != float64(int(v)) {
			d.errorf(m.vals["max_blocks"], "max_blocks", "must be a whole number")
		}
		t.MaxBlocks = int(v)
	}
	if v := m.get("accelerate_check_temperature", false); v != nil {
		// Older presets named the temperature of the accelerate check; the card now
		// prints the runway midpoint and 70 % of the rotation speed, and the expected
		// 70 % point at each block's hottest go column.
		d.warnf(v, "accelerate_check_temperature", "no longer used (the accelerate check follows the grid): delete this line")
	}
	t.Landing = m.oneOf("landing", false, LandingBack, LandingSamePage, LandingNone)
	if t.Landing == "" && !m.has("landing") {
		t.Landing = LandingBack
		d.notef("landing not given: a profile's landing figures go on a landing side behind each takeoff side")
	}
	t.CrosswindSpeedsMS, _, _ = m.quantities("crosswind_speeds", units.Speed, true, 1*units.MetresPerSecPerKnot, 60*units.MetresPerSecPerKnot)
	t.CrosswindAnglesDeg, _, _ = m.quantities("crosswind_angles", units.Angle, true, 0, 90)
	if len(t.CrosswindSpeedsMS) > 6 || len(t.CrosswindAnglesDeg) > 7 {
		d.errorf(m.n, "crosswind_speeds", "at most 6 speeds and 7 angles fit the crosswind helper")
	}
	if v, ok := m.quantity("obstacle_margin", units.Length, false, MinObstacleMarginM, MaxObstacleMarginM); ok {
		t.ObstacleMarginM = v
	} else if !m.has("obstacle_margin") {
		t.ObstacleMarginM = perf.DefaultObstacleMarginM
		d.notef("obstacle_margin not given: obstacles past a runway end must be cleared by 50 ft")
	}
	if v, ok := m.number("valid_days", true, 1, 400); ok {
		if v != math.Trunc(v) {
			d.errorf(m.vals["valid_days"], "valid_days", "%s is not a whole number of days", m.vals["valid_days"].Value)
		}
		t.ValidDays = int(v)
	}
	m.finish()
	return t
}

// Rounding is how the card prints its distances (and so decides its cells' states):
// required distances rounded up to perf.CardStep in the card's unit, declared
// distances rounded down to a whole unit.
func (t CardTemplate) Rounding() perf.Rounding {
	return perf.Rounding{Unit: t.Unit, Step: perf.CardStep}
}
