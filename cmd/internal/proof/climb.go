package proof

import (
	"fmt"

	"kneeprint/cmd/internal/spec"
	"kneeprint/cmd/internal/units"
	"kneeprint/perf"
)

// climbSection states the profile's climb section in words: the climb speed as typed,
// where the rates come from (the manual's table, printed as typed further on, or the
// physics' excess power with the figures the takeoff calibration fitted), how the
// cards use it, and the reference climb of validate to hold against the manual.
func (s *sheet) climbSection(doc *spec.Document) {
	s.heading("Climb after takeoff (for obstacles past a runway end)")
	if doc.Aircraft.Climb == nil {
		s.para("No climb section: a runway end with obstacles has no figure on the cards (the clearance cannot be worked out without a climb).")
		return
	}
	s.items(climbItems(doc))
	s.para(referenceClimb(doc.Aircraft))
}

// climbItems are the climb section's values in words (see climbSection).
func climbItems(doc *spec.Document) [][2]string {
	a := doc.Aircraft
	c := a.Climb
	rows := [][2]string{{"climb speed (IAS)", typedOr(doc, "climb.speed", fmt.Sprintf("%.0f kt", units.Knots(c.SpeedIASMS)))}}
	if t := c.Table; t != nil {
		unit := typedOr(doc, "climb.rate_unit", "")
		what := fmt.Sprintf("the manual's rate-of-climb table, in %s: %d pressure altitudes x %d temperatures x %d weight(s) (%.0f to %.0f kg), printed as typed further on",
			unit, len(t.PressureAltM), len(t.TempK), len(t.WeightKg), t.WeightKg[0], t.WeightKg[len(t.WeightKg)-1])
		if _, single := doc.Scalars["climb.rate_of_climb[0][0]"]; single {
			what = fmt.Sprintf("the manual's rate-of-climb table, in %s: %d pressure altitudes x %d temperatures, one table without weights: taken as the MTOW's (%.0f kg) "+
				"and used at every lighter weight (a lighter aircraft climbs better: the safe side); printed as typed further on",
				unit, len(t.PressureAltM), len(t.TempK), a.MTOWKg)
		} else if hi := t.WeightKg[len(t.WeightKg)-1]; hi < a.MTOWKg-1e-9 {
			what += fmt.Sprintf("; heavier than %.0f kg there is no climb data", hi)
		}
		rows = append(rows, [2]string{"rates from", what},
			[2]string{"checks", "the loader refuses a rate that rises with pressure altitude, temperature or weight; a rate off the smooth pattern of its neighbours is listed above"})
	} else {
		what := fmt.Sprintf("no table: the physics description's excess power at %.0f kt, rate of climb = V (T - D) / W in steady flight", units.Knots(c.SpeedIASMS))
		switch {
		case a.Physics == nil:
		case a.Physics.Calibration != nil:
			what += fmt.Sprintf(", with the propeller the takeoff calibration fitted (static thrust fraction %.3f, propeller efficiency %.3f), the calibrated excess power",
				a.Physics.StaticThrustFac, a.Physics.PropEfficiency)
		default:
			what += fmt.Sprintf("; the takeoff physics is NOT CALIBRATED: its propeller figures (static thrust fraction %.2f, propeller efficiency %.2f) are the file's or the defaults, never held against the manual",
				a.Physics.StaticThrustFac, a.Physics.PropEfficiency)
		}
		rows = append(rows, [2]string{"rates from", what})
	}
	rows = append(rows, [2]string{"used for", "the climb gradient over the ground from the 50 ft point: rate of climb / ground speed, the wind credited as for the takeoff; " +
		"the height over each obstacle past a runway end follows from it"})
	return rows
}

// referenceClimb is validate's reference climb: the rate of climb and the still-air
// gradient at sea level in the ISA at the MTOW, to hold against the manual.
func referenceClimb(a *perf.Aircraft) string {
	cm, err := perf.ClimbFor(a)
	if err == nil {
		var r perf.ClimbResult
		if r, err = cm.Climb(perf.Conditions{PressureAltM: 0, TempK: perf.ISASeaLevelTempK, MassKg: a.MTOWKg}); err == nil {
			var g float64
			if g, err = r.GroundGradient(0); err == nil {
				return fmt.Sprintf("Reference climb, to hold against the manual (as validate prints it): sea level in the ISA, MTOW %.0f kg, %.0f kt: "+
					"%.0f ft/min, a gradient of %.1f %% in still air.", a.MTOWKg, units.Knots(a.Climb.SpeedIASMS), units.Feet(r.RateMS)*60, g*100)
			}
		}
	}
	return "Reference climb (sea level ISA, MTOW): no figure: " + err.Error()
}

// typedOr is a field as typed with its line, or dflt when the file does not give it.
func typedOr(doc *spec.Document, field, dflt string) string {
	if v, ok := doc.Scalars[field]; ok {
		return fmt.Sprintf("%s (line %d)", v.Text, v.Line)
	}
	return dflt
}
