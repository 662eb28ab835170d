package report

import (
	"fmt"
	"math"
	"strings"

	"kneeprint/cmd/internal/units"
	"kneeprint/perf"
)

// CheckObstacles is a runway end's obstacle check in check's JSON (issue 12); every
// field is null or empty on an end that lists no obstacles.
type CheckObstacles struct {
	// The climb: the profile's climb speed, the rate of climb at the pressure
	// altitude it is taken at (the runway's plus the highest obstacle and the
	// margin), the gradient over the ground with the credited wind, and where the
	// climb starts: 50 ft at the takeoff distance with surface and slope, before
	// the safety factor, from the start of the run.
	ClimbSpeedKIAS      *float64        `json:"climb_speed_kias"`
	ClimbRateFPM        *float64        `json:"climb_rate_fpm"`
	ClimbPressureAltFt  *float64        `json:"climb_pressure_altitude_ft"`
	ClimbGradientPct    *float64        `json:"climb_gradient_pct"`
	ClimbFromM          *float64        `json:"climb_from_m"`
	ObstacleMarginFt    *float64        `json:"obstacle_margin_ft"`
	Obstacles           []CheckObstacle `json:"obstacles"`
	ObstaclesNotCleared int             `json:"obstacles_not_cleared"`
}

// CheckObstacle is one obstacle and how it is passed. Heights in feet (the trade's
// unit for obstacle heights), distances in metres, as the rest of check's JSON.
type CheckObstacle struct {
	Note     string  `json:"note"`
	HeightFt float64 `json:"height_ft"`  // top above the end of the TORA, rounded up
	PastEndM float64 `json:"past_end_m"` // from the end of the TORA, rounded down
	LateralM float64 `json:"lateral_m"`  // right positive, 0 on the extended centre line
	// The aircraft's height above the end of the TORA when it passes, and the
	// clearance (rounded down; negative: below the top); null without a climb.
	PassingHeightFt *float64 `json:"passing_height_ft"`
	ClearanceFt     *float64 `json:"clearance_ft"`
	Before50ft      bool     `json:"before_50ft"` // stands before the 50 ft point: its height there is taken as zero
	Cleared         *bool    `json:"cleared"`     // by the margin; null without a climb
}

// floorFt is a height in feet as printed: rounded down (a clearance is never shown
// larger than computed).
func floorFt(m float64) float64 { return math.Floor(units.Feet(m) + 1e-9) }

func ceilFt(m float64) float64 { return math.Ceil(units.Feet(m) - 1e-9) }

// buildObstacles is end answer ea's obstacle check; zero when it lists none.
func buildObstacles(in CheckInput, ea perf.EndAnswer) CheckObstacles {
	var o CheckObstacles
	o.Obstacles = []CheckObstacle{}
	if len(ea.End.Obstacles) == 0 {
		return o
	}
	margin := perf.ObstacleMargin(in.Question.ObstacleMarginM)
	o.ObstacleMarginFt = ptr(ceilFt(margin))
	if c := in.Aircraft.Climb; c != nil {
		o.ClimbSpeedKIAS = ptr(math.Round(units.Knots(c.SpeedIASMS)))
	}
	c := ea.Cell
	if c.HasClimb {
		o.ClimbRateFPM = ptr(math.Floor(units.Feet(c.ClimbRateMS)*60 + 1e-9))
		o.ClimbPressureAltFt = ptr(math.Round(units.Feet(ea.ClimbAltM)))
		o.ClimbGradientPct = ptr(math.Floor(c.ClimbGradient*1000+1e-9) / 10)
		o.ClimbFromM = ptr(ceilM(c.Requirement.FactoredTODM))
	}
	for i, ob := range ea.End.Obstacles {
		co := CheckObstacle{Note: ob.Note, HeightFt: ceilFt(ob.HeightM), PastEndM: math.Floor(ob.PastEndM + 1e-9), LateralM: math.Round(ob.LateralM)}
		if c.HasClimb && i < len(ea.Clearances) {
			cl := ea.Clearances[i]
			ok := floorFt(cl.ClearanceM) >= *o.ObstacleMarginFt
			co.PassingHeightFt, co.ClearanceFt, co.Before50ft = ptr(floorFt(cl.HeightM)), ptr(floorFt(cl.ClearanceM)), cl.BeforeScreen
			ok = ok && !cl.BeforeScreen
			co.Cleared = &ok
			if !ok {
				o.ObstaclesNotCleared++
			}
		}
		o.Obstacles = append(o.Obstacles, co)
	}
	return o
}

// writeObstacles prints an end's obstacle check for a terminal.
func writeObstacles(b *strings.Builder, e CheckEnd) {
	if len(e.Obstacles) == 0 {
		return
	}
	if e.ClimbGradientPct == nil {
		fmt.Fprintf(b, "         - obstacles past the end: no climb worked out (see the reasons); each must be cleared by %.0f ft\n", *e.ObstacleMarginFt)
	} else {
		speed := "the climb speed"
		if e.ClimbSpeedKIAS != nil {
			speed = fmt.Sprintf("%.0f KIAS", *e.ClimbSpeedKIAS)
		}
		fmt.Fprintf(b, "         - climb at %s: %.0f ft/min (taken at %.0f ft pressure altitude), %.1f %% over the ground with the credited wind, from 50 ft at %.0f m\n",
			speed, *e.ClimbRateFPM, *e.ClimbPressureAltFt, *e.ClimbGradientPct, *e.ClimbFromM)
	}
	for _, o := range e.Obstacles {
		where := fmt.Sprintf("%.0f m past the end", o.PastEndM)
		if o.PastEndM == 0 {
			where = "at the end"
		}
		switch {
		case o.LateralM < 0:
			where += fmt.Sprintf(", %.0f m left", -o.LateralM)
		case o.LateralM > 0:
			where += fmt.Sprintf(", %.0f m right", o.LateralM)
		}
		line := fmt.Sprintf("         - %s %.0f ft %s", o.Note, o.HeightFt, where)
		switch {
		case o.Cleared == nil:
			line += ": no figure"
		case o.Before50ft:
			line += fmt.Sprintf(": NOT CLEARED, it stands before the 50 ft point (%.0f ft required)", *e.ObstacleMarginFt)
		case *o.Cleared:
			line += fmt.Sprintf(": passed at %.0f ft, cleared by %.0f ft (%.0f ft required)", *o.PassingHeightFt, *o.ClearanceFt, *e.ObstacleMarginFt)
		default:
			line += fmt.Sprintf(": passed at %.0f ft, NOT CLEARED: %.0f ft clearance, %.0f ft required", *o.PassingHeightFt, *o.ClearanceFt, *e.ObstacleMarginFt)
		}
		b.WriteString(line + "\n")
	}
}

// GridObstacle is one obstacle of a runway end in grid's JSON.
type GridObstacle struct {
	Note     string  `json:"note"`
	HeightFt float64 `json:"height_ft"`
	PastEndM float64 `json:"past_end_m"`
	LateralM float64 `json:"lateral_m"`
}

func gridObstacles(e perf.RunwayEnd) []GridObstacle {
	out := []GridObstacle{}
	for _, o := range e.Obstacles {
		out = append(out, GridObstacle{Note: o.Note, HeightFt: ceilFt(o.HeightM), PastEndM: math.Floor(o.PastEndM + 1e-9), LateralM: math.Round(o.LateralM)})
	}
	return out
}

// cellClimb is a grid cell's climb gradient (percent, rounded down to 0.1) and least
// obstacle clearance (feet, rounded down); null without a climb.
func cellClimb(c perf.Cell) (*float64, *float64) {
	if !c.HasClimb {
		return nil, nil
	}
	return ptr(math.Floor(c.ClimbGradient*1000+1e-9) / 10), ptr(floorFt(c.Clearance.ClearanceM))
}
