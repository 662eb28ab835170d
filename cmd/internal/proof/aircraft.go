package proof

import (
	"fmt"
	"io"
	"math"
	"strings"

	"kneeprint/cmd/internal/spec"
	"kneeprint/cmd/internal/typedtable"
	"kneeprint/cmd/internal/units"
	"kneeprint/perf"
)

// writeAircraft writes an aircraft profile's proof sheet.
func writeAircraft(w io.Writer, src Source, doc *spec.Document, opt Options) error {
	a := doc.Aircraft
	s, err := newSheet(src, "kneeprint proof: "+a.Name, opt)
	if err != nil {
		return err
	}
	s.title("Proof sheet: "+a.Name, fmt.Sprintf("Aircraft profile %s, as typed, to check by eye against the flight manual. Made %s.", src.Name, opt.Date.Format("2006-01-02")))
	flagged, order := flaggedCells(doc.Tables)
	if len(doc.Tables) > 0 {
		s.para("How to use this sheet: hold each table below beside the manual's page and tick every figure that agrees; " +
			"each figure is printed exactly as it is typed in the file, with the file lines of its row. The plots draw every row as a " +
			"curve: a figure typed wrong usually stands off its curve. Cells that break the smooth pattern of their neighbours are " +
			"circled on the plots, framed in the tables and listed below with their file line.")
	}
	s.heading("Profile")
	s.items(profileItems(doc))

	if len(doc.Tables) > 0 {
		s.heading("Cells that break the smooth pattern of their neighbours")
		s.para(outlierRule(doc.Tables))
		if len(order) == 0 {
			s.para(fmt.Sprintf("None. The largest deviation of any figure from its neighbours' prediction is %.1f %%.", largestDeviation(doc.Tables)))
		} else {
			s.table([]column{{"line:col", 16, "L"}, {"field", 46, "L"}, {"figure and conditions", 44, "L"}, {"typed", 13, "R"}, {"its neighbours predict", 0, "L"}},
				outlierRows(flagged, order), nil)
		}
	}

	if t := a.Table; t != nil {
		s.heading("The manual's takeoff correction notes, in words")
		for _, n := range correctionNotes(t) {
			s.para(n)
		}
	}

	s.heading("Reference figures (as validate prints them)")
	if ref, err := spec.ReferenceFigures(a); err != nil {
		s.para("No figure at sea level ISA and the MTOW: " + err.Error())
	} else {
		s.para(fmt.Sprintf("Sea level in the ISA (15 C, 1013.25 hPa), MTOW %.0f kg, paved, dry, level runway, calm wind, %s model: "+
			"ground roll %.0f m (%.0f ft), distance to 50 ft %.0f m (%.0f ft). Hold these against the manual's page.",
			a.MTOWKg, a.Model, up(ref.GroundRollM), up(units.Feet(ref.GroundRollM)), up(ref.To50ftM), up(units.Feet(ref.To50ftM))))
		if ref.Warning != "" {
			s.font(bodyPt, true)
			s.pdf.MultiCell(s.width(), lineMM, "WARNING: "+ref.Warning, "1", "L", false)
			s.pdf.Ln(1)
		}
	}
	s.climbSection(doc)
	s.landingSection(doc)
	if len(doc.Warnings) > 0 {
		s.heading("Warnings of the loader (validate)")
		for _, w := range doc.Warnings {
			s.para("! " + w)
		}
	}

	for _, g := range groupByAxes(doc.Tables) {
		name := sectionName(g[0].Section)
		s.pdf.AddPage()
		per := "one block per weight"
		if len(g[0].Blocks) == 1 && g[0].Blocks[0].Index == typedtable.Single {
			per = "one table for the MTOW"
		}
		s.heading(fmt.Sprintf("The %s as typed (%s), %s", name, g[0].Section, per))
		s.manualTables(g, flagged)
		s.pdf.AddPage()
		s.heading(fmt.Sprintf("Every row of the %s (%s) plotted", name, g[0].Section))
		if err := s.rowPlots(g, flagged); err != nil {
			return err
		}
	}
	if a.Physics != nil {
		s.pdf.AddPage()
		s.physics(doc)
	}
	if a.Landing != nil && a.Landing.Physics != nil {
		s.pdf.AddPage()
		s.landingPhysics(doc)
	}
	return s.finish(w)
}

// sectionName names a typed table's section in words.
func sectionName(section string) string {
	switch section {
	case "table":
		return "takeoff table"
	case "landing.table":
		return "landing table"
	case "climb":
		return "rate-of-climb table"
	}
	return "table"
}

// outlierRule states the outlier rule as it applies to the profile's tables, with
// each table's rounding step.
func outlierRule(tables []*typedtable.Table) string {
	var steps []string
	linear := false
	for _, g := range groupByAxes(tables) {
		same := true
		for _, t := range g {
			same = same && typedtable.Step(t) == typedtable.Step(g[0])
			linear = linear || t.Linear
		}
		for _, t := range g {
			if same {
				steps = append(steps, fmt.Sprintf("%s %g %s", sectionName(t.Section), typedtable.Step(t), t.Unit))
				break
			}
			steps = append(steps, fmt.Sprintf("%s %s %g %s", sectionName(t.Section), t.Quantity, typedtable.Step(t), t.Unit))
		}
	}
	rule := fmt.Sprintf("Rule: each figure is predicted from its neighbours along each axis with 3 or more values (temperature, "+
		"pressure altitude, weight), on a straight line through the logarithms of its two neighbours (the two nearest at the "+
		"end of an axis). A figure is listed when it is more than %g %% off every such prediction, beyond what rounding to the "+
		"table's step (%s) explains.", typedtable.OutlierThresholdPct, strings.Join(steps, "; "))
	if linear {
		rule += fmt.Sprintf(" A rate of climb falls about linearly with altitude and temperature and may be zero or negative near the "+
			"ceiling: it is predicted on the straight line through its neighbours themselves, not their logarithms, and its deviation "+
			"is measured in per cent of the larger of the prediction and %g %% of the table's largest rate.", typedtable.LinearFloorFraction*100)
	}
	return rule + " A listed figure may be right: check it against the manual."
}

func up(x float64) float64 { return math.Ceil(x - 1e-6) }

// profileItems are the profile's main values: as typed where the file gives them,
// with the defaults the loader applied.
func profileItems(doc *spec.Document) [][2]string {
	a := doc.Aircraft
	typed := func(field string) string {
		if v, ok := doc.Scalars[field]; ok {
			return fmt.Sprintf("%s (line %d)", v.Text, v.Line)
		}
		return ""
	}
	var ws []string
	for _, w := range a.WeightsKg {
		ws = append(ws, fmt.Sprintf("%.0f kg", w))
	}
	rows := [][2]string{
		{"name", a.Name},
		{"type", a.Type},
		{"MTOW", typed("mtow")},
		{"lowest flyable mass", lowest(typed("min_mass"), a.MinMassKg)},
		{"card weights", strings.Join(ws, ", ")},
		{"takeoff flap", a.TakeoffFlap},
		{"speeds (IAS)", joinNonEmpty(", ", prefixed("rotation ", typed("speeds.rotation")), prefixed("at 50 ft ", typed("speeds.at_50ft")))},
		{"crosswind", joinNonEmpty(", ", prefixed("demonstrated ", typed("limits.demonstrated_crosswind")), prefixed("limit ", typed("limits.max_crosswind")))},
		{"tailwind limit", fmt.Sprintf("%.0f kt", units.Knots(a.MaxTailwindMS))},
		{"operating temperatures", joinNonEmpty(", ", prefixed("from ", typed("limits.min_temperature")), prefixed("up to ", typed("limits.max_temperature")))},
		{"model the cards use", string(a.Model)},
	}
	if t := a.Table; t != nil {
		rows = append(rows, [2]string{"wind factoring in the data", typed("table.wind_factoring_included")})
	}
	if a.Notes != "" {
		rows = append(rows, [2]string{"notes", a.Notes})
	}
	var out [][2]string
	for _, r := range rows {
		if r[1] == "" {
			r[1] = "not given"
		}
		out = append(out, r)
	}
	return out
}

func lowest(typed string, kg float64) string {
	if typed != "" {
		return typed
	}
	return fmt.Sprintf("not given: %.0f kg, the table's lightest block", kg)
}

func prefixed(p, s string) string {
	if s == "" {
		return ""
	}
	return p + s
}

// correctionNotes states the table's correction notes as the manual would word
// them, and what kneeprint does about the wind factoring.
func correctionNotes(t *perf.Table) []string {
	c := t.Corrections
	var out []string
	if c.HeadwindPerMS > 0 && c.HeadwindMaxMS > 0 {
		out = append(out, fmt.Sprintf("Headwind: decrease the distances by %g %% for each %g kt of headwind, up to %g kt; beyond that the manual has no data.",
			c.HeadwindPct, round1(units.Knots(c.HeadwindPerMS)), round1(units.Knots(c.HeadwindMaxMS))))
	} else if c.HeadwindPerMS > 0 {
		out = append(out, fmt.Sprintf("Headwind: decrease the distances by %g %% for each %g kt of headwind.", c.HeadwindPct, round1(units.Knots(c.HeadwindPerMS))))
	} else {
		out = append(out, "Headwind: no note; no credit is taken for a headwind.")
	}
	if c.TailwindPerMS > 0 {
		out = append(out, fmt.Sprintf("Tailwind: increase the distances by %g %% for each %g kt of tailwind, up to %g kt; beyond that the manual has no data.",
			c.TailwindPct, round1(units.Knots(c.TailwindPerMS)), round1(units.Knots(c.TailwindMaxMS))))
	} else {
		out = append(out, "Tailwind: no note; a tailwind has no data.")
	}
	if c.GrassPctOfGroundRoll > 0 {
		out = append(out, fmt.Sprintf("Dry grass: add %g %% of the ground roll to both distances.", c.GrassPctOfGroundRoll))
	} else {
		out = append(out, "Dry grass: no note; the policy's grass factor applies.")
	}
	if c.WetGrassPctOfGroundRoll > 0 {
		out = append(out, fmt.Sprintf("Wet grass: add %g %% of the ground roll to both distances.", c.WetGrassPctOfGroundRoll))
	} else {
		out = append(out, "Wet grass: no note; the policy's wet grass factor applies.")
	}
	if t.WindInData {
		out = append(out, "Wind factoring: the file says the manual's wind notes already credit only part of a headwind and more than all of a tailwind "+
			"(wind_factoring_included: true): kneeprint uses the reported wind as it is.")
	} else {
		out = append(out, "Wind factoring: the file says the manual's wind notes are for the full reported wind (wind_factoring_included: false): "+
			"kneeprint credits 50 % of a headwind and charges 150 % of a tailwind before applying them.")
	}
	return out
}

func round1(x float64) float64 { return math.Round(x*10) / 10 }

// physics writes the physics description, its calibration and every residual.
func (s *sheet) physics(doc *spec.Document) {
	a := doc.Aircraft
	p := a.Physics
	s.heading("Physics description")
	s.items([][2]string{
		{"wing", fmt.Sprintf("area %.2f m², span %.2f m, height above the ground %.2f m", p.WingAreaM2, p.SpanM, p.WingHeightM)},
		{"drag and lift", fmt.Sprintf("CD0 %.3f, Oswald factor %.2f, CL in the ground run %.2f, CLmax of the takeoff flap %.2f", p.CD0, p.Oswald, p.CLGround, p.CLMax)},
		{"engine and propeller", fmt.Sprintf("%.0f kW, %s propeller of %.2f m", p.PowerW/1000, strings.ReplaceAll(string(p.Propeller), "_", " "), p.PropDiameterM)},
		{"rotation", fmt.Sprintf("%.1f s at %.0f kt IAS, %.0f kt IAS at 50 ft", p.RotationS, units.Knots(a.RotateIASMS), units.Knots(a.At50ftIASMS))},
	})
	c := p.Calibration
	s.heading("Calibration to the manual's figures")
	if c == nil {
		s.para("NOT CALIBRATED: cards, check and grid refuse this profile until it lists the flight manual's figures under physics.calibration.")
		return
	}
	s.items([][2]string{
		{"fit", fmt.Sprintf("%d points, %d figures, Nelder-Mead, %d model evaluations", len(c.Points), c.Figures(), c.Evaluations)},
		{"static thrust fraction", fmt.Sprintf("%.3f (the fit started from %.2f; physical bounds %.2f to %.2f)", c.Static, c.StartStatic, perf.MinStaticThrustFrac, perf.MaxStaticThrustFrac)},
		{"propeller efficiency", fmt.Sprintf("%.3f (the fit started from %.2f; physical bounds %.2f to %.2f)", c.Eta, c.StartEta, perf.MinPropEfficiency, perf.MaxPropEfficiency)},
		{"largest residual", fmt.Sprintf("%.1f %% (at most %.0f %% accepted)", c.LargestPct, perf.CalibrationTolerancePct)},
	})
	s.residualTable(doc.Residuals())
}

// residualTable lists the figures a physics model was fitted to, each with its
// line, the manual's figure, the fitted model's and the residual.
func (s *sheet) residualTable(res []spec.Residual) {
	var rows [][]string
	for _, r := range res {
		fit, pct := fmt.Sprintf("%.0f", r.ModelM), fmt.Sprintf("%+.1f", r.Pct)
		if r.Err != "" {
			fit, pct = "none", r.Err
		}
		rows = append(rows, []string{fmt.Sprintf("%d:%d", r.Line, r.Column), r.Point, r.Figure, fmt.Sprintf("%.0f", r.ManualM), fit, pct})
	}
	s.table([]column{{"line:col", 16, "L"}, {"point", 0, "L"}, {"figure", 20, "L"}, {"manual, m", 18, "R"}, {"model, m", 18, "R"}, {"residual %", 20, "R"}}, rows, nil)
}

// largestDeviation is the largest deviation of any figure from any prediction.
func largestDeviation(tables []*typedtable.Table) float64 {
	m := 0.0
	for _, t := range tables {
		for _, rows := range typedtable.Deviations(t) {
			for _, row := range rows {
				for _, devs := range row {
					for _, d := range devs {
						m = math.Max(m, math.Abs(d.Pct))
					}
				}
			}
		}
	}
	return m
}
