package spec

import (
	"fmt"
	"io"
	"math"

	"gopkg.in/yaml.v3"

	"kneeprint/cmd/internal/units"
	"kneeprint/perf"
)

// Plausibility and defaults of the landing section.
const (
	// The approach speed over the threshold of a light aircraft: a slip beyond these
	// (a speed in km/h written as kt) is refused (common practice).
	minApproachKt = 30
	maxApproachKt = 120
)

// landing reads the profile's landing section: the landing flap, the approach speed,
// the maximum landing mass, and the manual's landing table and/or a physics landing
// model. flaps are the profile's flap settings with their CLmax; physNode is the
// profile's physics section (the airframe the physics landing model uses), nil when
// it has none. The section is optional: without it the cards have no landing side.
func (d *decoder) landing(n *yaml.Node, a *perf.Aircraft, flaps map[string]float64, mtow float64, mtowOK bool) *perf.Landing {
	m := d.mapping(n, "landing")
	l := &perf.Landing{}
	l.Flap = m.str("flap", true)
	if v, ok := m.quantity("approach_speed", units.Speed, false, minApproachKt*units.MetresPerSecPerKnot, maxApproachKt*units.MetresPerSecPerKnot); ok {
		l.ApproachIASMS = v
	}
	if v, ok := m.quantity("max_landing_mass", units.Mass, false, minMassKg, maxMassKg); ok {
		l.MaxMassKg = v
		if mtowOK && v > mtow+1e-9 {
			d.errorf(m.vals["max_landing_mass"], "landing.max_landing_mass", "%s is above the MTOW %.0f kg: an aircraft never lands heavier than it took off", m.vals["max_landing_mass"].Value, mtow)
		}
		// The landing side shows the maximum landing mass first; below the lowest
		// flyable mass no question is answered, so the profile could give no landing
		// figure at all (a slip: 650 kg for 1650 kg).
		if a.MinMassKg > 0 && v < a.MinMassKg-1e-9 {
			d.errorf(m.vals["max_landing_mass"], "landing.max_landing_mass", "%s is below the lowest flyable mass %s (%s): no landing could be answered at it; check the figure",
				m.vals["max_landing_mass"].Value, units.Format(a.MinMassKg, units.Mass, units.UnitOf(m.vals["max_landing_mass"].Value, units.Mass)), d.minMassWhy)
		}
	} else if !m.has("max_landing_mass") && mtowOK {
		l.MaxMassKg = mtow
		d.notef("landing.max_landing_mass not given: the MTOW, %.0f kg, is taken as the maximum landing mass", mtow)
	}
	tableNode, physNode := m.get("table", false), m.get("physics", false)
	if tableNode != nil {
		var nodes [2][][][]*yaml.Node
		l.Table, nodes = d.tableOf(tableNode, l.MaxMassKg, landingTable)
		d.landingTableNodes = nodes
	}
	if physNode != nil {
		l.Physics = d.landingPhysics(physNode, a)
	}
	model := m.oneOf("model", tableNode != nil && physNode != nil, string(perf.ModelTable), string(perf.ModelPhysics))
	switch {
	case tableNode == nil && physNode == nil:
		d.errorf(n, "landing.table", "a landing section needs a landing model: the manual's landing table, a physics section under landing, or both")
	case model != "":
		l.Model = perf.ModelKind(model)
		if (l.Model == perf.ModelTable && tableNode == nil) || (l.Model == perf.ModelPhysics && physNode == nil) {
			d.errorf(m.vals["model"], "landing.model", "model %s chosen but the landing section has no %s", model, model)
		}
	case tableNode != nil:
		l.Model = perf.ModelTable
	default:
		l.Model = perf.ModelPhysics
	}
	if l.Physics != nil && l.Flap != "" {
		cl, ok := flaps[l.Flap]
		if !ok {
			d.errorf(m.vals["flap"], "landing.flap", "%q is not in the flaps list, which the physics landing model needs for CLmax (V_S0)", l.Flap)
		}
		l.Physics.CLMax = cl
		if ok && l.ApproachIASMS > 0 && l.MaxMassKg > 0 && a.Physics != nil && a.Physics.WingAreaM2 > 0 {
			vs0 := math.Sqrt(2 * l.MaxMassKg * perf.StandardGravity / (perf.DensityKgM3(0, perf.ISASeaLevelTempK) * a.Physics.WingAreaM2 * cl))
			if l.ApproachIASMS < 1.1*vs0 {
				d.errorf(m.vals["approach_speed"], "landing.approach_speed", "%.0f kt is below 1.1 x the stall speed %.0f kt that wing_area, the landing flap's clmax and the maximum landing mass give: check them", units.Knots(l.ApproachIASMS), units.Knots(vs0))
			}
		}
	}
	m.finish()
	return l
}

// landingPhysics reads landing.physics: the landing configuration the physics landing
// model needs beyond the airframe of the profile's physics section, the starting
// values of its fit and the manual's landing figures it is fitted to.
func (d *decoder) landingPhysics(n *yaml.Node, a *perf.Aircraft) *perf.LandingPhysics {
	m := d.mapping(n, "landing.physics")
	p := &perf.LandingPhysics{}
	if a.Physics == nil {
		d.errorf(n, "landing.physics", "the physics landing model flies the airframe of the profile's physics section (wing_area, span, wing_height, oswald): add that section, or use a landing table")
	}
	if v, ok := m.number("cd0", false, 0.01, 0.2); ok {
		p.CD0 = v
	} else if !m.has("cd0") && a.Physics != nil {
		// Less drag than with landing flap and gear: a longer roll, the safe side.
		p.CD0 = a.Physics.CD0
		d.notef("landing.physics.cd0 not given: the takeoff cd0 %.3f is used (less drag than in the landing configuration: longer, the safe side)", p.CD0)
	}
	if v, ok := m.number("cl_ground_roll", false, 0, 2); ok {
		p.CLGround = v
	} else if !m.has("cl_ground_roll") && a.Physics != nil {
		p.CLGround = a.Physics.CLGround
		d.notef("landing.physics.cl_ground_roll not given: the takeoff cl_ground_run %.2f is used", p.CLGround)
	}
	if v, ok := m.quantity("free_roll_time", units.Duration, false, 0, 5); ok {
		p.FreeRollS = v
	} else if !m.has("free_roll_time") {
		p.FreeRollS = perf.DefaultFreeRollS
		d.notef("landing.physics.free_roll_time not given: %.0f s between touchdown and braking (the short end of 1 to 3 s: the safe side)", perf.DefaultFreeRollS)
	}
	if v, ok := m.quantity("approach_angle", units.Angle, false, perf.MinApproachAngleDeg, perf.MaxApproachAngleDeg); ok {
		p.ApproachAngleDeg = v
	} else if !m.has("approach_angle") {
		p.ApproachAngleDeg = perf.DefaultApproachAngleDeg
		d.notef("landing.physics.approach_angle not given: the fit starts from %.0f deg (from memory)", perf.DefaultApproachAngleDeg)
	}
	if v, ok := m.number("braking_fraction", false, perf.MinBrakingFraction, perf.MaxBrakingFraction); ok {
		p.BrakingFraction = v
	} else if !m.has("braking_fraction") {
		p.BrakingFraction = perf.DefaultBrakingFraction
		d.notef("landing.physics.braking_fraction not given: the fit starts from %.2f of the surface's braking coefficient (from memory)", perf.DefaultBrakingFraction)
	}
	d.landingCalib = append(d.landingCalib, d.calibrationPoints(m, "landing.physics", landingTable)...)
	m.finish()
	return p
}

// fitLanding fits the physics landing model to its calibration points and, with a
// landing table, to every cell of it (perf.CalibrateLanding), as fitPhysics does for
// the takeoff. A profile with nothing to fit to is warned about: cards, check and
// grid --landing then refuse its landing.
func (d *decoder) fitLanding(a *perf.Aircraft, landingNode *yaml.Node) {
	l := a.Landing
	if l == nil || l.Physics == nil || a.Physics == nil {
		return
	}
	physNode := d.mapping(landingNode, "landing").vals["physics"]
	if l.Table != nil && d.landingTableNodes[0] != nil {
		d.landingCalib = append(d.landingCalib, tablePoints(l.Table, d.landingTableNodes, landingTable)...)
	}
	if len(d.landingCalib) == 0 {
		d.warnf(physNode, "landing.physics.calibration", "not calibrated: cards and check refuse this profile's landing (and grid --landing) until it lists the flight manual's landing figures (at least sea level, maximum landing mass, paved dry)")
		return
	}
	if len(d.landingCalib) > perf.MaxCalibrationPoints {
		d.errorf(physNode, "landing.physics", "%d points to fit (calibration points and table cells), at most %d", len(d.landingCalib), perf.MaxCalibrationPoints)
		return
	}
	pts, anchored := d.pointsUpTo(d.landingCalib, l.MaxMassKg, "the maximum landing mass")
	if len(d.errs) > 0 {
		return
	}
	if !anchored && l.Model == perf.ModelPhysics {
		d.warnf(physNode, "landing.physics.calibration", "no point is at the maximum landing mass on a paved, dry runway: cards and check refuse this profile's landing (and grid --landing) until the manual's figure there is added")
	}
	cal, err := perf.CalibrateLanding(perf.LandingPhysicsModel{P: *a.Physics, L: *l.Physics, ApproachIASMS: l.ApproachIASMS, RefMassKg: l.MaxMassKg}, pts)
	if d.fitErrors(err, d.landingCalib, physNode, "landing.physics", "landing.physics", landingTable) {
		return
	}
	l.Physics.ApproachAngleDeg, l.Physics.BrakingFraction, l.Physics.Calibration = cal.ApproachAngleDeg, cal.BrakingFrac, cal
}

// summarizeLanding prints the landing section for validate: the model, the flap, the
// speeds and mass, the table's axes and notes, and the landing fit with every
// residual at the file:line it was read from.
func summarizeLanding(w io.Writer, doc *Document) {
	a := doc.Aircraft
	l := a.Landing
	if l == nil {
		fmt.Fprintf(w, "  landing: none (cards have no landing side; add a landing section for one)\n")
		return
	}
	approach := "1.3 V_S0 (no approach_speed given)"
	if l.ApproachIASMS > 0 {
		approach = fmt.Sprintf("%.0f kt (IAS) at the maximum landing mass", units.Knots(l.ApproachIASMS))
	}
	fmt.Fprintf(w, "  landing: %s model, flap %s, maximum landing mass %.0f kg, approach %s\n", l.Model, l.Flap, l.MaxMassKg, approach)
	if t := l.Table; t != nil {
		fmt.Fprintf(w, "    landing table: %d pressure altitudes x %d temperatures (%.0f to %.0f C) x %d weights (%.0f to %.0f kg); wind factoring in the data: %v\n",
			len(t.PressureAltM), len(t.TempK), units.Celsius(first(t.TempK)), units.Celsius(last(t.TempK)),
			len(t.WeightKg), first(t.WeightKg), last(t.WeightKg), t.WindInData)
	}
	p := l.Physics
	if p == nil {
		return
	}
	fmt.Fprintf(w, "    landing physics: CLmax %.2f (flap %s), CD0 %.3f, CL ground roll %.2f, free roll %.1f s\n", p.CLMax, l.Flap, p.CD0, p.CLGround, p.FreeRollS)
	c := p.Calibration
	if c == nil {
		fmt.Fprintf(w, "    landing physics NOT CALIBRATED: cards and check refuse this profile's landing (and grid --landing)\n")
		return
	}
	fmt.Fprintf(w, "    landing physics calibrated to %d point(s) (Nelder-Mead, %d model evaluations):\n", len(c.Points), c.Evaluations)
	fmt.Fprintf(w, "      approach angle   %.2f deg (fit started from %.1f; bounds %.0f to %.0f)\n", c.ApproachAngleDeg, c.StartAngleDeg, perf.MinApproachAngleDeg, perf.MaxApproachAngleDeg)
	fmt.Fprintf(w, "      braking fraction %.3f (fit started from %.2f; bounds %.2f to %.2f)\n", c.BrakingFrac, c.StartBraking, perf.MinBrakingFraction, perf.MaxBrakingFraction)
	fmt.Fprintf(w, "      largest residual %.1f %% (at most %.0f %% accepted); residuals, model against manual:\n", c.LargestPct, perf.CalibrationTolerancePct)
	defer summarizeFloor(w, c.Floor, "landing", "      ")
	for i, cp := range doc.landingCalib {
		if i >= len(c.Fits) {
			break
		}
		f := c.Fits[i]
		cond := cp.p.Conditions
		what := cp.label
		if !cp.p.FromTable {
			wind := "calm"
			if cond.HeadwindMS != 0 {
				wind = fmt.Sprintf("headwind %+.0f kt", units.Knots(cond.HeadwindMS))
			}
			what = fmt.Sprintf("%s %.0f ft, %.0f C, %.0f kg, %s %s, %s", cp.label, units.Feet(cond.PressureAltM), units.Celsius(cond.TempK), cond.MassKg, cond.Surface, cond.Condition, wind)
		}
		row := func(at *yaml.Node, name string, manual, model, pct float64) {
			if at == nil {
				return
			}
			if f.Err != "" {
				fmt.Fprintf(w, "      %s:%d:%d  %s, %s %.0f m: no figure (%s)\n", doc.Path, at.Line, at.Column, what, name, manual, f.Err)
				return
			}
			fmt.Fprintf(w, "      %s:%d:%d  %s, %s %.0f m, fit %.0f m, %+.1f %%\n", doc.Path, at.Line, at.Column, what, name, manual, model, pct)
		}
		row(cp.grAt, "ground roll", cp.p.GroundRollM, f.GroundRollM, f.GroundRollPct)
		row(cp.toAt, "from 50 ft", cp.p.To50ftM, f.To50ftM, f.To50ftPct)
	}
}
