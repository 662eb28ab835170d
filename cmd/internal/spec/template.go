package spec

import (
	"math"

	"kneeprint/cmd/internal/units"
)

// KindCardTemplate is a card preset file.
const KindCardTemplate Kind = "card-template"

// CardTemplate is a card preset in SI units.
type CardTemplate struct {
	Name               string
	Page               string
	Unit               string // "m" or "ft"
	Policy             string
	QNHPa              float64
	TightMargin        float64 // fraction
	TempsK             []float64
	WindsMS            []float64
	MaxBlocks          int
	AccelTempK         float64
	CrosswindSpeedsMS  []float64
	CrosswindAnglesDeg []float64
	ValidDays          int
}

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
	t.Policy = m.oneOf("policy", true, "uk-advisory", "eu-class-b")
	t.QNHPa, _ = m.quantity("qnh", units.Pressure, true, 90000, 105000)
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
	t.AccelTempK, _ = m.quantity("accelerate_check_temperature", units.Temperature, true, minDataTempK, maxDataTempK)
	t.CrosswindSpeedsMS, _, _ = m.quantities("crosswind_speeds", units.Speed, true, 1*units.MetresPerSecPerKnot, 60*units.MetresPerSecPerKnot)
	t.CrosswindAnglesDeg, _, _ = m.quantities("crosswind_angles", units.Angle, true, 0, 90)
	if len(t.CrosswindSpeedsMS) > 6 || len(t.CrosswindAnglesDeg) > 7 {
		d.errorf(m.n, "crosswind_speeds", "at most 6 speeds and 7 angles fit the crosswind helper")
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
