package cards

import (
	"math"

	"kneeprint/cmd/internal/units"
	"kneeprint/layout"
	"kneeprint/perf"
)

// obstacleData fills card d's obstacle line and climb row for runway end e (nothing
// when it lists no obstacles): each obstacle as printed (its height in feet rounded
// up, its distance past the end of the TORA in the card's unit rounded down, both the
// conservative way), the template's margin in feet rounded up, the profile's climb
// speed, and per temperature column the still-air climb gradient the cells use
// (perf.ObstacleClimb, at the heaviest block's weight heaviestKg), rounded down to
// 0.1 %.
func obstacleData(d *layout.CardData, a *perf.Aircraft, e perf.RunwayEnd, g *perf.Grid, heaviestKg float64, u cardUnits) {
	if len(e.Obstacles) == 0 {
		return
	}
	rnd := u.t.Rounding()
	for _, o := range e.Obstacles {
		od := layout.ObstacleData{Note: o.Note, HeightFt: math.Ceil(units.Feet(o.HeightM) - 1e-9), PastEnd: rnd.Down(o.PastEndM)}
		if o.LateralM != 0 {
			od.Lateral = math.Copysign(rnd.Down(math.Abs(o.LateralM)), o.LateralM)
		}
		d.Obstacles = append(d.Obstacles, od)
	}
	margin := perf.ObstacleMargin(u.t.ObstacleMarginM)
	d.ObstacleMarginFt = math.Ceil(units.Feet(margin) - 1e-9)
	d.ClimbWeight = u.mass(heaviestKg)
	if a.Climb != nil {
		d.ClimbKIAS = math.Round(units.Knots(a.Climb.SpeedIASMS))
	}
	cm, err := perf.ClimbFor(a)
	for _, tk := range u.t.TempsK {
		pct, ok := 0.0, false
		if err == nil {
			if _, grad, cerr := perf.ObstacleClimb(cm, e, g.PressureAltM, tk, heaviestKg, 0, margin); cerr == nil {
				pct, ok = math.Floor(grad*1000+1e-9)/10, true
			}
		}
		d.ClimbPct = append(d.ClimbPct, pct)
		d.HasClimbPct = append(d.HasClimbPct, ok)
	}
}
