package units

import (
	"fmt"
	"regexp"
	"strconv"
	"strings"
)

// WindReport is a wind as a tower or a report gives it.
type WindReport struct {
	FromDeg  float64
	SpeedMS  float64
	GustMS   float64 // 0 when none
	Variable bool    // VRB: direction variable
	// True is set for the report group of a routine weather report (dddffKT), whose
	// direction is true; the tower form (ddd/ff) is magnetic.
	True bool
	// Varies is set when a direction-range group (dddVddd) follows: the direction
	// varies clockwise from VaryFromDeg to VaryToDeg.
	Varies                 bool
	VaryFromDeg, VaryToDeg float64
}

// Wind forms. The tower form is kneeprint's command-line way of writing what a tower
// or broadcast says ("two four zero degrees, one five knots, gusting two five"); the
// report group is that of the aerodrome routine weather report (WMO No. 306, Manual on
// Codes, FM 15 METAR; ICAO Annex 3, Appendix 3): dddff or dddfff, then Gfmfm for a gust,
// then the unit KT or MPS, in capitals.
var (
	towerForm  = regexp.MustCompile(`^(\d{3}|VRB)/(\d{1,3})(?:[Gg](\d{2,3}))?(?:KT|kt)?$`)
	reportForm = regexp.MustCompile(`^(\d{3}|VRB)(\d{2,3})(?:G(\d{2,3}))?(KT|MPS)$`)
	rangeForm  = regexp.MustCompile(`^(\d{3})V(\d{3})$`)
)

// MaxWindKt is the fastest wind accepted, 99 kt (the largest two-digit report): no light
// aircraft takes off in more.
const MaxWindKt = 99

const windForms = "240/15 or 240/15G25 (magnetic, knots), VRB/05, calm, or a report group 24015G25KT, VRB05KT, 00000KT, 27008MPS (true)"

// ParseWind reads a wind in one of two forms, optionally followed by a direction-range
// group "dddVddd":
//
//   - the tower form, magnetic, in knots: "240/15", "240/15G25", "VRB/05", "calm",
//     "000/00"; the direction always three digits (a "24/15" could be 024 or 240);
//   - the report group of a routine weather report, true: "24015KT", "24015G25KT",
//     "VRB05KT", "00000KT", "27008MPS".
//
// Direction 001 to 360 (000 only when calm), speeds 0 to 99 kt, a gust two or three
// digits and above the steady speed. Signs, missing or one-digit gusts and anything
// else are refused with the forms accepted.
func ParseWind(s string) (WindReport, error) {
	s = strings.TrimSpace(s)
	fields := strings.Fields(s)
	if len(fields) == 0 {
		return WindReport{}, fmt.Errorf("wind is empty: write %s", windForms)
	}
	if len(fields) > 2 {
		return WindReport{}, fmt.Errorf("wind %q: one wind group and at most one direction range (e.g. 210V270)", s)
	}
	w, err := parseWindGroup(fields[0])
	if err != nil {
		return w, fmt.Errorf("wind %q: %w", s, err)
	}
	if len(fields) == 2 {
		if err := w.AddRange(fields[1]); err != nil {
			return WindReport{}, fmt.Errorf("wind %q: %w", s, err)
		}
	}
	return w, nil
}

func parseWindGroup(g string) (WindReport, error) {
	if strings.EqualFold(g, "calm") {
		return WindReport{}, nil
	}
	var w WindReport
	var m []string
	perUnit := MetresPerSecPerKnot
	if m = towerForm.FindStringSubmatch(g); m == nil {
		if m = reportForm.FindStringSubmatch(g); m == nil {
			return w, fmt.Errorf("not a wind: write %s", windForms)
		}
		w.True = true
		if m[4] == "MPS" {
			perUnit = 1
		}
	}
	speed, _ := strconv.Atoi(m[2])
	w.SpeedMS = float64(speed) * perUnit
	if m[3] != "" {
		gust, _ := strconv.Atoi(m[3])
		if gust <= speed {
			return w, fmt.Errorf("the gust %d is not above the steady speed %d", gust, speed)
		}
		w.GustMS = float64(gust) * perUnit
	}
	if w.SpeedMS > MaxWindKt*MetresPerSecPerKnot+1e-9 || w.GustMS > MaxWindKt*MetresPerSecPerKnot+1e-9 {
		return w, fmt.Errorf("speeds above %d kt are not accepted", MaxWindKt)
	}
	if m[1] == "VRB" {
		w.Variable = true
		return w, nil
	}
	dir, _ := strconv.Atoi(m[1])
	switch {
	case dir == 0 && speed == 0 && w.GustMS == 0:
		return WindReport{True: w.True}, nil // calm
	case dir < 1 || dir > 360:
		return w, fmt.Errorf("direction %03d is outside 001 to 360 degrees", dir)
	}
	w.FromDeg = float64(dir)
	return w, nil
}

// AddRange adds a direction-range group "dddVddd" (WMO FM 15: the extreme directions,
// clockwise) to a wind with a direction.
func (w *WindReport) AddRange(g string) error {
	if w.Varies {
		return fmt.Errorf("%q: a second direction range", g)
	}
	m := rangeForm.FindStringSubmatch(g)
	if m == nil {
		return fmt.Errorf("%q is not a direction range such as 210V270", g)
	}
	if w.Variable || (w.FromDeg == 0 && w.SpeedMS == 0) {
		return fmt.Errorf("a direction range needs a wind with a direction")
	}
	from, _ := strconv.Atoi(m[1])
	to, _ := strconv.Atoi(m[2])
	if from < 1 || from > 360 || to < 1 || to > 360 || from == to {
		return fmt.Errorf("direction range %s: two different directions from 001 to 360", g)
	}
	w.Varies, w.VaryFromDeg, w.VaryToDeg = true, float64(from), float64(to)
	return nil
}
