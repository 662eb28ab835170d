package perf

import (
	"fmt"
	"math"
)

// Obstacle is an obstacle on the departure path past a runway end.
type Obstacle struct {
	// HeightM is the height of its top above the ground at the end of the TORA (the
	// end of the runway the takeoff runs toward). An obstacle given as an elevation
	// is converted by the loader.
	HeightM float64
	// PastEndM is its distance along the departure path from the end of the TORA
	// (zero: standing at the end). One given from the start of the takeoff run is
	// converted by the loader.
	PastEndM float64
	// LateralM is its offset from the extended centre line, right positive (as seen
	// taking off); printed only: every obstacle listed is counted (see Clearance).
	LateralM float64
	Note     string // what it is, as printed: "powerline", "trees"
}

// DefaultObstacleMarginM is the clearance an obstacle must be passed by when the card
// template or the check does not say: 50 ft. Common practice for single-engine
// private operations, where the margin is the pilot's own judgement; it is the
// vertical margin Regulation (EU) No 965/2012, CAT.POL.A.310(a), sets for the
// take-off flight path of aeroplanes with two or more engines (performance class B),
// a rule that does not apply to single-engine aircraft. Taken from CAT.POL.A.310 as
// well: the path begins 50 ft above the surface at the end of the takeoff distance
// (CAT.POL.A.310(a)(1)). Not taken: its alternative horizontal clearance (90 m plus
// 0.125 D to the side), since a single-engine departure flies no scheduled track and
// kneeprint counts every obstacle listed, whatever its lateral offset.
const DefaultObstacleMarginM = 50 * footM

// ObstacleMargin is the margin asked for, marginM, or DefaultObstacleMarginM when it
// is zero or less (unset: a margin of nothing is never meant).
func ObstacleMargin(marginM float64) float64 {
	if marginM > 0 {
		return marginM
	}
	return DefaultObstacleMarginM
}

// MaxObstacleHeightM bounds an obstacle's height: the take-off flight path of
// CAT.POL.A.310(a)(1) ends 1500 ft above the surface; terrain higher than that is a
// matter of route planning, not of the takeoff card.
const MaxObstacleHeightM = 1500 * footM

// Clearance is how one obstacle is passed in one set of conditions.
type Clearance struct {
	Obstacle int // index in the runway end's Obstacles
	// HeightM is the aircraft's height above the ground at the end of the TORA when
	// it passes the obstacle; ClearanceM is HeightM less the obstacle's height
	// (negative: below its top).
	HeightM    float64
	ClearanceM float64
	// BeforeScreen is set when the obstacle stands before the point where the
	// aircraft reaches 50 ft: its height there is not known, and it is taken as zero.
	BeforeScreen bool
}

// ObstacleClearance works out how obstacle o of runway end e is passed, for a takeoff
// distance to 50 ft of todM (from the start of the run) and a climb gradient over the
// ground of gradient (a fraction, 0.05 for 5 %):
//
//	h = 50 ft - u + gradient x (TORA + d - TOD)
//
// with d the obstacle's distance past the end of the TORA, and u the rise of the
// runway from the 50 ft point to the end of the TORA on an upslope, u = slope x
// (TORA - TOD) when the 50 ft point is on the runway (heights are measured above
// the end of the TORA, and the 50 ft are above the surface where they are reached:
// CAT.POL.A.310(a)(1)); no credit is taken for a downslope (common practice, as for
// the takeoff distance). A gradient of zero or less is taken as level flight at
// 50 ft, never a descent.
//
// On an upslope steeper than the climb gradient the runway rises faster than the
// aircraft climbs, and the formula would credit a longer takeoff (the aircraft rolls
// up the slope instead of flying over it) with more height at the end. No takeoff is
// credited with more than an earlier 50 ft point would give: the height is then
// taken as if the 50 ft were reached at the start of the run and the climb flown
// over the whole rising runway, h = 50 ft - slope x TORA + gradient x (TORA + d),
// whichever is lower. So a longer takeoff or a flatter climb never leaves more
// clearance.
//
// When the obstacle stands before the 50 ft point (TOD past TORA + d) the
// aircraft's height there is taken as zero (BeforeScreen), or lower by the rule
// above.
func ObstacleClearance(e RunwayEnd, o Obstacle, todM, gradient float64) Clearance {
	g := math.Max(gradient, 0)
	up := math.Max(e.SlopePct, 0) / 100
	var c Clearance
	if beyond := e.TORAM + o.PastEndM - todM; beyond < 0 {
		c.BeforeScreen = true
	} else {
		c.HeightM = screenHeightM - up*math.Max(e.TORAM-todM, 0) + g*beyond
	}
	if up > g {
		c.HeightM = math.Min(c.HeightM, screenHeightM-up*e.TORAM+g*(e.TORAM+o.PastEndM))
	}
	c.ClearanceM = c.HeightM - o.HeightM
	return c
}

// ObstacleClearances is ObstacleClearance for every obstacle of e, in file order.
func ObstacleClearances(e RunwayEnd, todM, gradient float64) []Clearance {
	out := make([]Clearance, len(e.Obstacles))
	for i, o := range e.Obstacles {
		out[i] = ObstacleClearance(e, o, todM, gradient)
		out[i].Obstacle = i
	}
	return out
}

// ObstacleClimbAltM is the pressure altitude the climb to runway end e's obstacles is
// worked out at: the runway's (paM) plus the highest obstacle's top plus the margin.
// The rate of climb falls as the aircraft climbs, so the rate where it must pass the
// highest obstacle is the least along the way: taking it for the whole climb is the
// conservative side. The surface temperature is kept (no cooling with height is
// credited, also the conservative side).
func ObstacleClimbAltM(e RunwayEnd, paM, marginM float64) float64 {
	top := 0.0
	for _, o := range e.Obstacles {
		top = math.Max(top, o.HeightM)
	}
	return paM + top + marginM
}

// ObstacleClimb is the climb an end's obstacle check uses: the rate of climb at
// ObstacleClimbAltM, at the surface temperature tempK and mass massKg, and the
// gradient over the ground with the reported along-runway wind reportedHeadwindMS
// (credited as for the takeoff: ClimbCreditedWindMS).
func ObstacleClimb(cm ClimbModel, e RunwayEnd, paM, tempK, massKg, reportedHeadwindMS, marginM float64) (ClimbResult, float64, error) {
	r, err := cm.Climb(Conditions{PressureAltM: ObstacleClimbAltM(e, paM, marginM), TempK: tempK, MassKg: massKg})
	if err != nil {
		return r, 0, err
	}
	g, err := r.GroundGradient(ClimbCreditedWindMS(reportedHeadwindMS))
	return r, g, err
}

// Printed heights: a clearance is printed rounded down to a whole foot and a
// required margin rounded up (the conservative directions, as for distances); a
// cell's verdict on an obstacle is decided from these figures.
func shownClearanceFt(m float64) float64 { return math.Floor(m/footM + 1e-9) }
func shownMarginFt(m float64) float64    { return math.Ceil(m/footM - 1e-9) }

// obstacleName is how an obstacle is named in a reason: "35 ft powerline".
func obstacleName(heightM float64, note string) string {
	if note == "" {
		note = "obstacle"
	}
	return fmt.Sprintf("%.0f ft %s", math.Ceil(heightM/footM-1e-9), note)
}

// obstacleWhere says where an obstacle stands, d past the runway end in unit.
func obstacleWhere(d float64, unit string) string {
	if d == 0 {
		return "at the runway end"
	}
	return fmt.Sprintf("at %.0f %s past the runway end", d, unit)
}
