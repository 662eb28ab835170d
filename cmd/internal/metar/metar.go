// Package metar reads what a takeoff check needs from an aerodrome routine weather
// report (METAR, or SPECI): the wind group with its direction range, the temperature
// group and the QNH group. The code form is that of WMO No. 306, Manual on Codes,
// FM 15 METAR, and ICAO Annex 3, Appendix 3.
//
// Only the observation is read: the report stops at a trend (NOSIG, BECMG, TEMPO) or
// at remarks (RMK), whose groups are forecasts or local additions. Groups a check does
// not need (visibility, weather, cloud, CAVOK, NSC, runway groups) are skipped. A group
// reported missing ("/////KT", "/////", "Q////") leaves its value unknown: nothing is
// assumed.
package metar

import (
	"fmt"
	"regexp"
	"strconv"
	"strings"

	"kneeprint/cmd/internal/units"
)

// Report is what was read from a report.
type Report struct {
	Text string // the report as given, trimmed

	Wind      *units.WindReport // nil when the report has no usable wind group
	WindGroup string            // the group(s) as written, e.g. "24015G25KT 210V270"

	HasTemp   bool
	TempK     float64
	TempGroup string
	// HasDew and DewK are the dew point of the temperature group (TT/TdTd), when
	// reported.
	HasDew bool
	DewK   float64

	HasQNH   bool
	QNHPa    float64
	QNHGroup string
}

// Missing lists what the report does not give, among wind, temperature and QNH.
func (r Report) Missing() []string {
	var out []string
	if r.Wind == nil {
		out = append(out, "wind")
	}
	if !r.HasTemp {
		out = append(out, "temperature")
	}
	if !r.HasQNH {
		out = append(out, "QNH")
	}
	return out
}

var (
	windGroup  = regexp.MustCompile(`^(\d{3}|VRB|///)(P?\d{2,3}|//)(G(P?\d{2,3}|//))?(KT|MPS)$`)
	rangeGroup = regexp.MustCompile(`^\d{3}V\d{3}$`)
	tempGroup  = regexp.MustCompile(`^(M?\d{2}|//)/(M?\d{2}|//)?$`)
	qnhGroup   = regexp.MustCompile(`^([QA])(\d{4}|////)$`)
	timeGroup  = regexp.MustCompile(`^\d{6}Z$`)
)

// Plausible QNH: the same bounds as the command line (800 to 1100 hPa).
const minQNHPa, maxQNHPa = 80000.0, 110000.0

// Parse reads a routine weather report. It fails on text that is not a report, a
// NIL report, a malformed or repeated wind, temperature or QNH group, and values no
// aerodrome reports; a group reported missing is not an error (see Report.Missing).
func Parse(s string) (Report, error) {
	r := Report{Text: strings.TrimSpace(s)}
	text := strings.TrimSpace(strings.TrimSuffix(r.Text, "="))
	groups := strings.Fields(text)
	if len(groups) == 0 {
		return r, fmt.Errorf("the report is empty")
	}
	recognised := false
	windIdx := -1
	for i, g := range groups {
		switch {
		case g == "RMK" || g == "NOSIG" || g == "BECMG" || g == "TEMPO":
			return r.finish(recognised)
		case g == "NIL":
			return r, fmt.Errorf("the report is NIL: it holds no observation")
		case g == "METAR" || g == "SPECI" || g == "COR" || g == "AUTO" || timeGroup.MatchString(g):
			recognised = true
		case windGroup.MatchString(g):
			if r.WindGroup != "" {
				return r, fmt.Errorf("group %q: a second wind group (the first is %s)", g, r.WindGroup)
			}
			recognised, windIdx, r.WindGroup = true, i, g
			if strings.HasPrefix(g, "///") || strings.Contains(g, "//KT") || strings.Contains(g, "//MPS") {
				continue // reported missing
			}
			w, err := units.ParseWind(g)
			if err != nil {
				return r, fmt.Errorf("wind group %q: %w", g, err)
			}
			r.Wind = &w
		case rangeGroup.MatchString(g):
			if i != windIdx+1 || windIdx < 0 {
				return r, fmt.Errorf("group %q: a direction range follows the wind group directly", g)
			}
			if r.Wind != nil {
				if err := r.Wind.AddRange(g); err != nil {
					return r, fmt.Errorf("group %q: %w", g, err)
				}
			}
			r.WindGroup += " " + g
		case tempGroup.MatchString(g):
			if r.TempGroup != "" {
				return r, fmt.Errorf("group %q: a second temperature group (the first is %s)", g, r.TempGroup)
			}
			recognised, r.TempGroup = true, g
			m := tempGroup.FindStringSubmatch(g)
			if dew, ok := celsius(m[2]); ok {
				r.HasDew, r.DewK = true, dew+units.KelvinAtZeroCelsius
			}
			c, ok := celsius(m[1])
			if !ok {
				continue // reported missing
			}
			r.HasTemp, r.TempK = true, c+units.KelvinAtZeroCelsius
		case qnhGroup.MatchString(g):
			if r.QNHGroup != "" {
				return r, fmt.Errorf("group %q: a second QNH group (the first is %s)", g, r.QNHGroup)
			}
			recognised, r.QNHGroup = true, g
			m := qnhGroup.FindStringSubmatch(g)
			if m[2] == "////" {
				continue // reported missing
			}
			n, _ := strconv.Atoi(m[2])
			if m[1] == "Q" {
				r.QNHPa = float64(n) * units.PascalsPerHPa
			} else {
				r.QNHPa = float64(n) / 100 * units.PascalsPerInHg // A2962 = 29.62 inHg
			}
			if r.QNHPa < minQNHPa || r.QNHPa > maxQNHPa {
				return r, fmt.Errorf("QNH group %q: %.0f hPa is outside 800 to 1100 hPa", g, units.HPa(r.QNHPa))
			}
			r.HasQNH = true
		}
	}
	return r.finish(recognised)
}

// celsius reads a temperature of the temperature group: two digits, M for minus; ""
// and "//" (missing) are not a temperature.
func celsius(t string) (float64, bool) {
	if t == "" || t == "//" {
		return 0, false
	}
	c, err := strconv.Atoi(strings.TrimPrefix(t, "M"))
	if err != nil {
		return 0, false
	}
	if strings.HasPrefix(t, "M") {
		c = -c
	}
	return float64(c), true
}

// Warnings are what looks wrong in a report that was still read: a dew point above
// the temperature (the dew point is at most the air's temperature: common practice),
// a slip in the report or in its copy that may touch the temperature itself.
func (r Report) Warnings() []string {
	var out []string
	if r.HasTemp && r.HasDew && r.DewK > r.TempK+1e-9 {
		out = append(out, fmt.Sprintf("the dew point %.0f C (%s) is above the temperature %.0f C, which air does not hold: check the report and its temperature before using this answer",
			r.DewK-units.KelvinAtZeroCelsius, r.TempGroup, r.TempK-units.KelvinAtZeroCelsius))
	}
	return out
}

func (r Report) finish(recognised bool) (Report, error) {
	if !recognised {
		return r, fmt.Errorf("%q is not a routine weather report: no wind, temperature or QNH group found (e.g. METAR ZZZZ 121250Z 24015G25KT 9999 FEW030 18/10 Q1013)", r.Text)
	}
	return r, nil
}
