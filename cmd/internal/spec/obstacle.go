package spec

import (
	"fmt"
	"strings"

	"gopkg.in/yaml.v3"

	"kneeprint/cmd/internal/units"
	"kneeprint/perf"
)

// Plausibility of obstacle data.
const (
	// maxObstacles bounds a runway end's list: a card prints every one of them.
	maxObstacles = 6
	// maxObstacleNote is the longest name a card prints for an obstacle.
	maxObstacleNote = 40
	// maxObstaclePastEndM: 10 km past the runway end a light aircraft is well above
	// the 1500 ft where the take-off flight path ends (CAT.POL.A.310(a)(1)) at any
	// gradient worth flying (common practice).
	maxObstaclePastEndM = 10000.0
	// maxLateralM: 600 m to either side is the widest obstacle accountability
	// semi-width of the EU take-off rules (AMC3 CAT.POL.A.210, AMC2 CAT.POL.A.405:
	// 300 m or 600 m with adequate course guidance); an obstacle further to the side
	// is not on the departure path.
	maxLateralM = 600.0
)

// rawObstacle is an obstacle as read, before the runway's elevations and TORA are
// known: its height may be an elevation, its distance one from the start of the run.
type rawObstacle struct {
	o                 perf.Obstacle
	elevM             float64 // top above mean sea level, when byElev
	byElev            bool
	fromStartM        float64 // from the start of the takeoff run, when byStart
	byStart           bool
	path              string
	elevNode, disNode *yaml.Node
	ok                bool
}

// obstacles reads a runway end's obstacle list:
//
//	obstacles:
//	  - note: powerline
//	    height: 35 ft        # top above the ground at the end of the TORA
//	    past_end: 400 m      # along the departure path from the end of the TORA
//	    lateral: 30 m left   # optional, printed only
//	  - note: mast
//	    elevation: 612 ft    # or: top above mean sea level
//	    from_start: 1240 m   # or: from the start of the takeoff run
func (d *decoder) obstacles(m *mapping) []rawObstacle {
	items := m.list("obstacles", false)
	if len(items) > maxObstacles {
		d.errorf(m.vals["obstacles"], m.field("obstacles"), "%d obstacles, at most %d: list those that limit the climb (the highest and the nearest)", len(items), maxObstacles)
		return nil
	}
	var out []rawObstacle
	for i, it := range items {
		path := fmt.Sprintf("%s[%d]", m.field("obstacles"), i)
		om := d.mapping(it, path)
		r := rawObstacle{path: path, ok: true}
		r.o.Note = om.str("note", true)
		if len(r.o.Note) > maxObstacleNote {
			d.errorf(om.vals["note"], om.field("note"), "%q is longer than %d characters: a short name the card prints, e.g. powerline, trees, mast", r.o.Note, maxObstacleNote)
			r.ok = false
		}
		switch {
		case om.has("height") && om.has("elevation"):
			om.get("height", false)
			om.get("elevation", false)
			d.errorf(om.vals["elevation"], om.field("elevation"), "give height (above the end of the TORA) or elevation (above mean sea level), not both")
			r.ok = false
		case om.has("elevation"):
			r.elevM, r.byElev = om.quantity("elevation", units.Length, true, minElevationM, maxElevationM+perf.MaxObstacleHeightM)
			r.elevNode = om.vals["elevation"]
			r.ok = r.ok && r.byElev
		default:
			h, ok := om.quantity("height", units.Length, true, -maxElevationM, maxElevationM)
			switch {
			case ok && h <= 0:
				d.errorf(om.vals["height"], om.field("height"), "an obstacle has a height above the ground: leave out what does not stand above the end of the TORA")
				ok = false
			case ok && h > perf.MaxObstacleHeightM+1e-9:
				d.errorf(om.vals["height"], om.field("height"), "%s is more than 1500 ft above the end of the TORA, where the take-off flight path ends (CAT.POL.A.310(a)(1)): a matter of route planning", om.vals["height"].Value)
				ok = false
			}
			r.o.HeightM, r.ok = h, r.ok && ok
		}
		switch {
		case om.has("past_end") && om.has("from_start"):
			om.get("past_end", false)
			om.get("from_start", false)
			d.errorf(om.vals["from_start"], om.field("from_start"), "give past_end (from the end of the TORA) or from_start (from the start of the takeoff run), not both")
			r.ok = false
		case om.has("from_start"):
			r.fromStartM, r.byStart = om.quantity("from_start", units.Length, true, 1, maxDistanceM+maxObstaclePastEndM)
			r.disNode = om.vals["from_start"]
			r.ok = r.ok && r.byStart
		default:
			past, ok := om.quantity("past_end", units.Length, true, 0, maxObstaclePastEndM)
			r.o.PastEndM, r.ok = past, r.ok && ok
		}
		if v := om.get("lateral", false); v != nil {
			lat, ok := d.lateral(v, om.field("lateral"))
			r.o.LateralM, r.ok = lat, r.ok && ok
		}
		om.finish()
		out = append(out, r)
	}
	return out
}

// lateral reads "30 m left", "30 m right" or "0 m" (on the extended centre line),
// right positive as seen taking off.
func (d *decoder) lateral(v *yaml.Node, field string) (float64, bool) {
	if v.Kind != yaml.ScalarNode {
		d.errorf(v, field, "expected an offset such as \"30 m left\" or \"20 m right\"")
		return 0, false
	}
	if d.placeholder(v, field) {
		return 0, false
	}
	s := strings.TrimSpace(v.Value)
	sign, side := 1.0, false
	switch low := strings.ToLower(s); {
	case strings.HasSuffix(low, "left"):
		s, sign, side = strings.TrimSpace(s[:len(s)-len("left")]), -1, true
	case strings.HasSuffix(low, "right"):
		s, side = strings.TrimSpace(s[:len(s)-len("right")]), true
	}
	x, err := units.Parse(s, units.Length)
	if err != nil {
		d.errorf(v, field, "%v (write e.g. \"30 m left\" or \"20 m right\")", err)
		return 0, false
	}
	switch {
	case x < 0:
		d.errorf(v, field, "%s: give the offset as a distance and a side, e.g. \"30 m left\"", v.Value)
		return 0, false
	case x > maxLateralM:
		d.errorf(v, field, "%s is more than %g m to the side, the widest obstacle accountability semi-width of the EU take-off rules: not an obstacle of the departure path", v.Value, maxLateralM)
		return 0, false
	case x > 0 && !side:
		d.errorf(v, field, "%s: say which side, e.g. \"%s left\" or \"%s right\" (as seen taking off)", v.Value, s, s)
		return 0, false
	}
	return sign * x, true
}

// resolveObstacles turns the obstacles read for runway end i of runway r into the
// end's Obstacles: a distance from the start of the run is made one past the end of
// the TORA, an elevation a height above the end of the TORA, which is the other
// end's threshold: known only when both threshold elevations are given.
func (d *decoder) resolveObstacles(r *perf.Runway, i int, raws []rawObstacle, elevs []float64, haveElev []bool) {
	e := &r.Ends[i]
	for _, ro := range raws {
		if !ro.ok {
			continue
		}
		o := ro.o
		if ro.byStart {
			o.PastEndM = ro.fromStartM - e.TORAM
			switch {
			case e.TORAM <= 0:
				continue // the TORA's error is reported
			case o.PastEndM < -0.5: // half a metre: distances are whole metres or feet
				d.errorf(ro.disNode, ro.path+".from_start", "%s is within the takeoff run (TORA %.0f m): an obstacle of the departure path stands past the end of the TORA", ro.disNode.Value, e.TORAM)
				continue
			case o.PastEndM > maxObstaclePastEndM:
				d.errorf(ro.disNode, ro.path+".from_start", "%s is more than %g km past the end of the TORA: no longer part of the takeoff", ro.disNode.Value, maxObstaclePastEndM/1000)
				continue
			}
			o.PastEndM = max(o.PastEndM, 0)
		}
		if ro.byElev {
			if len(r.Ends) != 2 || !haveElev[0] || !haveElev[1] {
				d.errorf(ro.elevNode, ro.path+".elevation", "an elevation needs the ground's elevation at the end of the TORA: give threshold_elevation on both ends of this runway, or give the obstacle's height above the end of the TORA instead")
				continue
			}
			depart := elevs[1-i]
			o.HeightM = ro.elevM - depart
			switch {
			case o.HeightM <= 0:
				d.errorf(ro.elevNode, ro.path+".elevation", "%s is not above the end of the TORA (%.0f ft, the threshold elevation of %s): it is no obstacle to the climb; check the figure", ro.elevNode.Value, units.Feet(depart), r.Ends[1-i].Designator)
				continue
			case o.HeightM > perf.MaxObstacleHeightM:
				d.errorf(ro.elevNode, ro.path+".elevation", "%s is %.0f ft above the end of the TORA, more than the 1500 ft where the take-off flight path ends (CAT.POL.A.310(a)(1)): a matter of route planning", ro.elevNode.Value, units.Feet(o.HeightM))
				continue
			}
		}
		e.Obstacles = append(e.Obstacles, o)
	}
}

// ObstacleLine describes an obstacle for validate: "powerline: top 35 ft above the
// end of the TORA, 400 m past it, 30 m left".
func ObstacleLine(o perf.Obstacle) string {
	s := fmt.Sprintf("%s: top %.0f ft above the end of the TORA, %.0f m past it", o.Note, units.Feet(o.HeightM), o.PastEndM)
	switch {
	case o.LateralM < 0:
		s += fmt.Sprintf(", %.0f m left", -o.LateralM)
	case o.LateralM > 0:
		s += fmt.Sprintf(", %.0f m right", o.LateralM)
	}
	return s
}
