package proof

import (
	"fmt"
	"math"

	"kneeprint/cmd/internal/spec"
	"kneeprint/cmd/internal/units"
	"kneeprint/perf"
)

// landingSection states the profile's landing section in words: the landing flap,
// the approach speed and the maximum landing mass as typed (or the defaults the
// loader applied), the model the cards use, the landing table's correction notes,
// and a reference landing to hold against the manual. The landing table itself is
// printed as typed further on, and a physics landing model has a page of its own.
func (s *sheet) landingSection(doc *spec.Document) {
	a := doc.Aircraft
	l := a.Landing
	s.heading("Landing")
	if l == nil {
		s.para("No landing section: the cards have no landing side (add the manual's landing table or a calibrated physics landing model for one).")
		return
	}
	s.items(landingItems(doc))
	s.para(referenceLanding(a))
	if t := l.Table; t != nil {
		s.heading("The manual's landing correction notes, in words")
		for _, n := range correctionNotes(t) {
			s.para(n)
		}
	}
}

// landingItems are the landing section's values in words (see landingSection).
func landingItems(doc *spec.Document) [][2]string {
	l := doc.Aircraft.Landing
	approach := "not given: the physics landing model flies 1.3 V_S0 in the landing flap"
	if l.Physics == nil || l.Model == perf.ModelTable {
		approach = "not given (the landing table's figures assume the manual's own approach speed)"
	}
	rows := [][2]string{
		{"landing flap", typedOr(doc, "landing.flap", l.Flap)},
		{"approach speed (IAS)", typedOr(doc, "landing.approach_speed", approach)},
		{"maximum landing mass", typedOr(doc, "landing.max_landing_mass", fmt.Sprintf("not given: the MTOW, %.0f kg", l.MaxMassKg))},
		{"model the cards use", string(l.Model)},
	}
	if l.Table != nil {
		rows = append(rows, [2]string{"wind factoring in the data", typedOr(doc, "landing.table.wind_factoring_included", "not given")})
	}
	if l.Physics != nil {
		rows = append(rows, [2]string{"physics landing model", "described, with its fit to the manual's landing figures, on its own page"})
	}
	return rows
}

// referenceLanding is the landing at sea level in the ISA at the maximum landing
// mass, paved, dry, level, calm, rounded up, to hold against the manual's page.
func referenceLanding(a *perf.Aircraft) string {
	l := a.Landing
	lm, err := perf.LandingModelFor(a)
	if err == nil {
		var r perf.LandingResult
		if r, err = lm.Land(perf.Conditions{PressureAltM: 0, TempK: perf.ISASeaLevelTempK, MassKg: l.MaxMassKg, Surface: perf.Paved, Condition: perf.Dry}); err == nil {
			return fmt.Sprintf("Reference landing, to hold against the manual: sea level in the ISA (15 C, 1013.25 hPa), maximum landing mass %.0f kg, paved, dry, level runway, "+
				"calm wind, %s model: ground roll %.0f m (%.0f ft), distance from 50 ft %.0f m (%.0f ft).",
				l.MaxMassKg, l.Model, up(r.GroundRollM), up(units.Feet(r.GroundRollM)), up(r.From50ftM), up(units.Feet(r.From50ftM)))
		}
	}
	return "Reference landing (sea level ISA, maximum landing mass): no figure: " + err.Error()
}

// landingPhysics writes the physics landing model's page: its description, the
// values its fit found against the manual's landing figures, and every residual
// with its line, like the takeoff physics page.
func (s *sheet) landingPhysics(doc *spec.Document) {
	a := doc.Aircraft
	l := a.Landing
	p := l.Physics
	s.heading("Physics landing model")
	approach := "1.3 V_S0 in the landing flap (no approach_speed given)"
	if l.ApproachIASMS > 0 {
		approach = fmt.Sprintf("%.0f kt IAS at the maximum landing mass %.0f kg, scaled with the square root of the mass below it, never below 1.3 V_S0", units.Knots(l.ApproachIASMS), l.MaxMassKg)
	}
	rows := [][2]string{
		{"airframe", "the physics section's wing, span, wing height and Oswald factor (see the takeoff physics)"},
		{"landing flap", fmt.Sprintf("%s, CLmax %.2f", l.Flap, p.CLMax)},
	}
	if a.Physics != nil && a.Physics.WingAreaM2 > 0 && p.CLMax > 0 {
		vs0 := math.Sqrt(2 * l.MaxMassKg * perf.StandardGravity / (perf.DensityKgM3(0, perf.ISASeaLevelTempK) * a.Physics.WingAreaM2 * p.CLMax))
		rows[1][1] += fmt.Sprintf(": V_S0 %.0f kt at the maximum landing mass", units.Knots(vs0))
	}
	rows = append(rows,
		[2]string{"drag and lift", fmt.Sprintf("CD0 %.3f in the landing configuration, CL in the landing roll %.2f", p.CD0, p.CLGround)},
		[2]string{"approach", approach},
		[2]string{"free roll", fmt.Sprintf("%.1f s from touchdown to braking", p.FreeRollS)},
	)
	s.items(rows)
	c := p.Calibration
	s.heading("Calibration to the manual's landing figures")
	if c == nil {
		s.para("NOT CALIBRATED: cards and check refuse this profile's landing (and grid --landing) until it lists the flight manual's landing figures under landing.physics.calibration.")
		return
	}
	s.items([][2]string{
		{"fit", fmt.Sprintf("%d points, Nelder-Mead, %d model evaluations", len(c.Points), c.Evaluations)},
		{"approach angle", fmt.Sprintf("%.2f deg (the fit started from %.1f; bounds %.0f to %.0f)", c.ApproachAngleDeg, c.StartAngleDeg, perf.MinApproachAngleDeg, perf.MaxApproachAngleDeg)},
		{"braking fraction", fmt.Sprintf("%.3f of the surface's braking coefficient (the fit started from %.2f; bounds %.2f to %.2f)", c.BrakingFrac, c.StartBraking, perf.MinBrakingFraction, perf.MaxBrakingFraction)},
		{"largest residual", fmt.Sprintf("%.1f %% (at most %.0f %% accepted)", c.LargestPct, perf.CalibrationTolerancePct)},
	})
	s.residualTable(doc.LandingResiduals())
}
