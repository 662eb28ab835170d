package spec

import (
	"fmt"
	"math"
	"regexp"
	"strconv"
	"strings"

	"gopkg.in/yaml.v3"

	"kneeprint/cmd/internal/units"
	"kneeprint/perf"
)

var (
	identPattern      = regexp.MustCompile(`^[A-Za-z0-9][A-Za-z0-9-]{1,9}$`)
	designatorPattern = regexp.MustCompile(`^(0?[1-9]|[12][0-9]|3[0-6])([LCR]?)$`)
)

// Plausibility ranges for airfield data, in SI. They catch typing slips (a TORA in
// feet written as metres), not real airfields.
const (
	minElevationM = -500.0 // below the lowest land airfields (common practice)
	maxElevationM = 5000.0 // above the highest piston-aircraft strips (common practice)
	maxDistanceM  = 6000.0 // longer than any light-aircraft runway (common practice)
	maxSlopePct   = 10.0   // steeper than any runway kneeprint should serve (common practice)
	maxVariation  = 60.0   // larger than inhabited-area magnetic variation (common practice)
	maxRunways    = 12     // more than any airfield a light aircraft uses (common practice)
)

func (d *decoder) airfield(m *mapping) *perf.Airfield {
	m.oneOf("kind", true, string(KindAirfield))
	a := &perf.Airfield{}
	a.Name = m.str("name", true)
	a.Ident = m.str("ident", true)
	if a.Ident != "" && !identPattern.MatchString(a.Ident) {
		d.errorf(m.vals["ident"], "ident", "%q: use 2 to 10 letters, digits or '-', starting with a letter or digit (a local name of your own, not an official location indicator)", a.Ident)
	}
	elev, _ := m.quantity("elevation", units.Length, true, minElevationM, maxElevationM)
	a.ElevationM = elev
	if v := m.get("variation", false); v != nil {
		a.VariationDeg = d.variation(v, "variation")
	} else {
		d.notef("variation not given: 0 deg assumed (needed only for winds given as true)")
	}
	seen := map[string]*yaml.Node{}
	runways := m.list("runways", true)
	if len(runways) > maxRunways {
		d.errorf(m.vals["runways"], "runways", "%d runways, at most %d accepted", len(runways), maxRunways)
		runways = nil
	}
	for i, rn := range runways {
		r := d.runway(rn, fmt.Sprintf("runways[%d]", i), a.ElevationM, seen)
		if r != nil {
			a.Runways = append(a.Runways, *r)
		}
	}
	m.finish()
	return a
}

// variation reads "3 deg E", "2 deg W", or a signed "-2 deg" (east positive).
func (d *decoder) variation(v *yaml.Node, field string) float64 {
	if v.Kind != yaml.ScalarNode {
		d.errorf(v, field, "expected an angle such as \"3 deg E\" or \"2 deg W\"")
		return 0
	}
	if d.placeholder(v, field) {
		return 0
	}
	s := strings.TrimSpace(v.Value)
	sign, hemisphere := 1.0, false
	switch {
	case strings.HasSuffix(s, "E"):
		s, hemisphere = strings.TrimSpace(strings.TrimSuffix(s, "E")), true
	case strings.HasSuffix(s, "W"):
		s, sign, hemisphere = strings.TrimSpace(strings.TrimSuffix(s, "W")), -1, true
	}
	if hemisphere && (strings.HasPrefix(s, "-") || strings.HasPrefix(s, "+")) {
		// "-3 deg W" could mean 3 deg W or 3 deg E: refuse rather than guess.
		d.errorf(v, field, "%q gives both a sign and E or W: write \"3 deg W\" (or \"-3 deg\", east positive), not both", v.Value)
		return 0
	}
	x, err := units.Parse(s, units.Angle)
	if err != nil {
		d.errorf(v, field, "%v (write e.g. \"3 deg E\" or \"2 deg W\")", err)
		return 0
	}
	if math.Abs(x) > maxVariation {
		d.errorf(v, field, "%s is outside -%g to %g deg", v.Value, maxVariation, maxVariation)
		return 0
	}
	return sign * x
}

func (d *decoder) runway(n *yaml.Node, path string, fieldElev float64, seen map[string]*yaml.Node) *perf.Runway {
	m := d.mapping(n, path)
	r := &perf.Runway{}
	r.Surface = perf.Surface(m.oneOf("surface", true, string(perf.Paved), string(perf.Grass), string(perf.Gravel)))
	r.Condition = perf.Condition(m.oneOf("condition", false, string(perf.Dry), string(perf.Wet)))
	if !m.has("condition") {
		r.Condition = perf.Dry
		d.notef("%s: condition not given: dry assumed", path)
	}
	lengthM, haveLength := m.quantity("length", units.Length, false, 1, maxDistanceM)
	slope, haveSlope := m.quantity("slope", units.Slope, false, -maxSlopePct, maxSlopePct)
	endNodes := m.list("ends", true)
	if len(endNodes) > 2 {
		d.errorf(m.vals["ends"], m.field("ends"), "a runway has one or two ends, found %d", len(endNodes))
		endNodes = endNodes[:2]
	}
	elevs := make([]float64, len(endNodes))
	haveElev := make([]bool, len(endNodes))
	raws := make([][]rawObstacle, len(endNodes)) // resolved once the elevations are known
	endMaps := make([]*mapping, 0, len(endNodes))
	for i, en := range endNodes {
		e, elev, elevNode, em := d.runwayEnd(en, fmt.Sprintf("%s.ends[%d]", path, i), seen, &raws[i])
		ok := elevNode != nil
		if e == nil {
			continue
		}
		e.Surface, e.Condition = r.Surface, r.Condition
		e.ElevationM = fieldElev
		if ok {
			e.ElevationM, elevs[i], haveElev[i] = elev, elev, true
			if elev > fieldElev+0.5 { // half a metre: elevations are whole feet or metres
				d.warnf(elevNode, fmt.Sprintf("%s.ends[%d].threshold_elevation", path, i),
					"%s is above the aerodrome elevation %.0f ft, which is the highest point of the landing area: check both; kneeprint takes the pressure altitude at the higher figure",
					elevNode.Value, units.Feet(fieldElev))
			}
		}
		r.Ends = append(r.Ends, *e)
		endMaps = append(endMaps, em)
	}
	m.finish()
	if len(r.Ends) == 0 || len(r.Ends) != len(endNodes) {
		return r // errors already reported
	}
	name := runwayName(r)
	d.runLengths(r, endMaps, lengthM, haveLength)
	if len(r.Ends) == 2 {
		d1, d2 := designatorNumber(r.Ends[0].Designator), designatorNumber(r.Ends[1].Designator)
		if diff := (d1 - d2 + 36) % 36; diff != 18 {
			d.warnf(endNodes[1], path+".ends[1].designator", "%s is not the reciprocal of %s", r.Ends[1].Designator, r.Ends[0].Designator)
		}
	}
	switch {
	case haveSlope && (haveElev[0] || len(haveElev) > 1 && haveElev[1]):
		d.errorf(m.vals["slope"], m.field("slope"), "give either slope or threshold elevations, not both")
	case haveSlope:
		r.Ends[0].SlopePct = slope
		if len(r.Ends) == 2 {
			r.Ends[1].SlopePct = -slope
		}
		if len(r.Ends) == 2 {
			d.notef("runway %s: slope %+.2f %% for %s, %+.2f %% for %s (slope is uphill in the direction of the first end)", name, slope, r.Ends[0].Designator, -slope, r.Ends[1].Designator)
		}
	case len(r.Ends) == 2 && haveElev[0] && haveElev[1]:
		if !haveLength {
			lengthM = math.Max(r.Ends[0].TORAM, r.Ends[1].TORAM)
			d.notef("runway %s: length not given: the longer TORA, %.0f m, used to derive the slope", name, lengthM)
		}
		s := (elevs[1] - elevs[0]) / lengthM * 100
		if math.Abs(s) > maxSlopePct {
			d.errorf(endNodes[1], path+".ends[1].threshold_elevation", "the threshold elevations give a slope of %.1f %%, more than %g %%: check them and the length", s, maxSlopePct)
		}
		r.Ends[0].SlopePct, r.Ends[1].SlopePct = s, -s
		d.notef("runway %s: slope from threshold elevations: %+.2f %% for %s, %+.2f %% for %s", name, s, r.Ends[0].Designator, -s, r.Ends[1].Designator)
	case haveElev[0] || len(haveElev) > 1 && haveElev[1]:
		d.errorf(n, path, "threshold_elevation given for one end only: give both ends, or a slope")
	default:
		d.notef("runway %s: no slope or threshold elevations: level assumed", name)
	}
	for i := range r.Ends {
		d.resolveObstacles(r, i, raws[i], elevs, haveElev)
	}
	return r
}

func runwayName(r *perf.Runway) string {
	var ds []string
	for _, e := range r.Ends {
		ds = append(ds, e.Designator)
	}
	return strings.Join(ds, "/")
}

// NormalizeDesignator reads a runway designator as the files do ("7" is "07", "9l"
// is "09L") and returns it in the form the loaded files use, or an error.
func NormalizeDesignator(s string) (string, error) {
	m := designatorPattern.FindStringSubmatch(strings.ToUpper(strings.TrimSpace(s)))
	if m == nil {
		return "", fmt.Errorf("%q is not a runway designator: 01 to 36, optionally followed by L, C or R", s)
	}
	num, _ := strconv.Atoi(m[1])
	return fmt.Sprintf("%02d%s", num, m[2]), nil
}

func designatorNumber(s string) int {
	m := designatorPattern.FindStringSubmatch(s)
	if m == nil {
		return 0
	}
	n, _ := strconv.Atoi(m[1])
	return n
}

// runwayEnd reads one runway end; the threshold elevation is returned with its node,
// which is nil when none was given, and the end's mapping (for checks against the
// other end and the runway). Its obstacles go to *obstacles as read (see
// resolveObstacles).
func (d *decoder) runwayEnd(n *yaml.Node, path string, seen map[string]*yaml.Node, obstacles *[]rawObstacle) (*perf.RunwayEnd, float64, *yaml.Node, *mapping) {
	m := d.mapping(n, path)
	e := &perf.RunwayEnd{}
	des := m.str("designator", true)
	if des != "" {
		mm := designatorPattern.FindStringSubmatch(des)
		if mm == nil {
			d.errorf(m.vals["designator"], m.field("designator"), "%q is not a runway designator: 01 to 36, optionally followed by L, C or R", des)
		} else {
			num, _ := strconv.Atoi(mm[1])
			des = fmt.Sprintf("%02d%s", num, mm[2])
			if prev, dup := seen[des]; dup {
				d.errorf(m.vals["designator"], m.field("designator"), "runway end %s is already described at line %d", des, prev.Line)
			}
			seen[des] = m.vals["designator"]
		}
	}
	e.Designator = des
	if h, ok := m.quantity("heading", units.Angle, false, 1, 360); ok {
		e.HeadingDeg = h
		if num := designatorNumber(des); num > 0 {
			if diff := math.Abs(angleDiff(h, float64(num*10))); diff > 10 {
				d.warnf(m.vals["heading"], m.field("heading"), "heading %g deg is %.0f deg away from designator %s", h, diff, des)
			}
		}
	} else if m.has("heading") {
		// error already reported
	} else if num := designatorNumber(des); num > 0 {
		e.HeadingDeg = float64(num * 10)
		d.notef("%s (%s): heading not given: %03.0f deg magnetic from the designator", path, des, e.HeadingDeg)
	}
	tora, toraOK := m.quantity("tora", units.Length, true, 1, maxDistanceM)
	e.TORAM = tora
	if toda, ok := m.quantity("toda", units.Length, false, 1, maxDistanceM); ok {
		e.TODAM = toda
		if toraOK && toda < tora {
			d.errorf(m.vals["toda"], m.field("toda"), "TODA %s is shorter than TORA %s: TODA includes the takeoff run", m.vals["toda"].Value, m.vals["tora"].Value)
		}
	} else if !m.has("toda") {
		e.TODAM = tora
		d.notef("%s (%s): toda not given: TODA = TORA", path, des)
	}
	if asda, ok := m.quantity("asda", units.Length, false, 1, maxDistanceM); ok {
		e.ASDAM = asda
		if toraOK && asda < tora-0.5 {
			d.warnf(m.vals["asda"], m.field("asda"), "ASDA %s is shorter than TORA %s: kneeprint takes the ASDA as the takeoff run available (a run the aircraft could not stop within is not available)", m.vals["asda"].Value, m.vals["tora"].Value)
		}
	} else if !m.has("asda") {
		e.ASDAM = tora
		d.notef("%s (%s): asda not given: ASDA = TORA", path, des)
	}
	if lda, ok := m.quantity("lda", units.Length, false, 1, maxDistanceM); ok {
		e.LDAM = lda
	}
	elev, haveElev := m.quantity("threshold_elevation", units.Length, false, minElevationM, maxElevationM)
	e.Notes = m.str("notes", false)
	*obstacles = d.obstacles(m)
	m.finish()
	if !haveElev {
		return e, elev, nil, m
	}
	return e, elev, m.vals["threshold_elevation"], m
}

// lengthSlackM is how much longer than the runway's declared length a TORA or an LDA
// may be written: the rounding of one figure in whole metres and the other in whole
// feet (half a metre at most) with room to spare.
const lengthSlackM = 1.0

// plausibleEndRatio bounds how much longer one end's TORA (or LDA) may be than the
// other end's of the same runway before validate asks for a check when the runway
// gives no length: half as much again. A displaced threshold, a starter extension or
// a stopway counted into the run make the two ends differ by some tens or a few
// hundred metres (common practice); an extra digit makes one ten times the other, a
// length in feet typed as metres 3.28 times.
const plausibleEndRatio = 1.5

// runLengths checks the TORA and LDA of runway r's ends (read through endMaps) against
// the runway's declared length: each is a length of runway (ICAO Annex 14, Vol I,
// ch. 1, definitions: "the length of runway declared available and suitable for the
// ground run of an aeroplane taking off" and "... landing", as TERMIUM Plus quotes the
// ICAO definition of TORA; the LDA's from memory), so neither may be longer than the
// runway. TODA and ASDA may: a clearway and a stopway lie beyond the runway's end.
// Without a length, the two ends' TORAs and LDAs are held against each other
// (plausibleEndRatio) and a large difference is a warning.
func (d *decoder) runLengths(r *perf.Runway, endMaps []*mapping, lengthM float64, haveLength bool) {
	type figure struct {
		key, name string
		get       func(perf.RunwayEnd) float64
	}
	for _, f := range []figure{
		{"tora", "TORA", func(e perf.RunwayEnd) float64 { return e.TORAM }},
		{"lda", "LDA", func(e perf.RunwayEnd) float64 { return e.LDAM }},
	} {
		if haveLength {
			for i, e := range r.Ends {
				if v := f.get(e); v > lengthM+lengthSlackM {
					n := endMaps[i].vals[f.key]
					d.errorf(n, endMaps[i].field(f.key), "%s %s is longer than the runway's length %s: TORA and LDA are lengths of runway (only TODA and ASDA reach beyond it, over a clearway or a stopway); check for an extra digit or a unit slip",
						f.name, strings.TrimSpace(n.Value), units.Format(lengthM, units.Length, units.UnitOf(n.Value, units.Length)))
				}
			}
			continue
		}
		if len(r.Ends) != 2 {
			continue
		}
		a, b := f.get(r.Ends[0]), f.get(r.Ends[1])
		if !(a > 0 && b > 0) {
			continue
		}
		long, short := 0, 1
		if b > a {
			long, short = 1, 0
		}
		if lv, sv := f.get(r.Ends[long]), f.get(r.Ends[short]); lv > plausibleEndRatio*sv {
			n := endMaps[long].vals[f.key]
			d.warnf(n, endMaps[long].field(f.key), "%s %s of %s is %.1f times the %s of %s: the two ends of one runway differ by a displaced threshold or a starter extension, rarely by half as much again; check for an extra digit or a unit slip, and give the runway's length so that kneeprint can hold both against it",
				f.name, strings.TrimSpace(n.Value), r.Ends[long].Designator, lv/sv, strings.TrimSpace(endMaps[short].vals[f.key].Value), r.Ends[short].Designator)
		}
	}
}

// angleDiff returns a-b in (-180, 180].
func angleDiff(a, b float64) float64 {
	d := math.Mod(a-b, 360)
	if d <= -180 {
		d += 360
	} else if d > 180 {
		d -= 360
	}
	return d
}
