package spec

import (
	"fmt"
	"io"
	"strconv"
	"strings"

	"gopkg.in/yaml.v3"

	"kneeprint/cmd/internal/units"
	"kneeprint/perf"
)

// Summarize writes a plain-text account of what a document holds, the defaults that
// were applied and the warnings raised, for validate. It returns the number of
// warnings written.
func Summarize(w io.Writer, doc *Document) int {
	warnings := doc.Warnings
	switch {
	case doc.Airfield != nil:
		summarizeAirfield(w, doc.Airfield)
	case doc.Aircraft != nil:
		summarizeAircraft(w, doc.Aircraft)
		// Issue 9.11: a figure to hold against the manual, and a warning when it
		// looks implausible for the class.
		if ref, err := ReferenceFigures(doc.Aircraft); err != nil {
			fmt.Fprintf(w, "  reference (sea level ISA, MTOW): no figure: %v\n", err)
		} else {
			fmt.Fprintf(w, "  %s\n", referenceLine(doc.Aircraft, ref))
			if ref.Warning != "" {
				warnings = append(append([]string(nil), warnings...), doc.Path+": "+ref.Warning)
			}
		}
		summarizeFit(w, doc)
		summarizeClimb(w, doc.Aircraft) // climb.go
		summarizeLanding(w, doc)
	case doc.Template != nil:
		summarizeTemplate(w, doc.Template)
	case doc.Plan != nil:
		summarizePlan(w, doc.Plan)
	}
	if len(doc.Defaults) > 0 {
		fmt.Fprintln(w, "  defaults applied:")
		for _, s := range doc.Defaults {
			fmt.Fprintf(w, "    - %s\n", s)
		}
	}
	if len(warnings) > 0 {
		fmt.Fprintln(w, "  warnings:")
		for _, s := range warnings {
			fmt.Fprintf(w, "    ! %s\n", s)
		}
	}
	return len(warnings)
}

func summarizeAirfield(w io.Writer, a *perf.Airfield) {
	ew := "E"
	if a.VariationDeg < 0 {
		ew = "W"
	}
	fmt.Fprintf(w, "  airfield %q (%s), elevation %.0f ft / %.0f m, variation %g° %s\n",
		a.Name, a.Ident, units.Feet(a.ElevationM), a.ElevationM, abs(a.VariationDeg), ew)
	for _, r := range a.Runways {
		var ds []string
		for _, e := range r.Ends {
			ds = append(ds, e.Designator)
		}
		fmt.Fprintf(w, "  runway %s: %s, %s\n", strings.Join(ds, "/"), r.Surface, r.Condition)
		for _, e := range r.Ends {
			lda := "-"
			if e.LDAM > 0 {
				lda = fmt.Sprintf("%.0f m", e.LDAM)
			}
			fmt.Fprintf(w, "    %-4s heading %03.0f° M  TORA %.0f m  TODA %.0f m  ASDA %.0f m  LDA %s  slope %+.2f %%  threshold %.0f ft\n",
				e.Designator, e.HeadingDeg, e.TORAM, e.TODAM, e.ASDAM, lda, e.SlopePct, units.Feet(e.ElevationM))
			if e.Notes != "" {
				fmt.Fprintf(w, "         note: %s\n", e.Notes)
			}
			for _, o := range e.Obstacles {
				fmt.Fprintf(w, "         obstacle: %s\n", ObstacleLine(o)) // obstacle.go
			}
		}
	}
}

func summarizeAircraft(w io.Writer, a *perf.Aircraft) {
	fmt.Fprintf(w, "  aircraft %q: %s\n", a.Name, a.Type)
	var ws []string
	for _, x := range a.WeightsKg {
		ws = append(ws, fmt.Sprintf("%.0f", x))
	}
	fmt.Fprintf(w, "  MTOW %.0f kg; lowest flyable mass %.0f kg; card weights %s kg; takeoff flap %s\n", a.MTOWKg, a.MinMassKg, strings.Join(ws, ", "), a.TakeoffFlap)
	fmt.Fprintf(w, "  limits: %s\n", limitsLine(a))
	if a.RotateIASMS > 0 || a.At50ftIASMS > 0 {
		fmt.Fprintf(w, "  speeds: rotation %.0f kt, at 50 ft %.0f kt (IAS)\n", units.Knots(a.RotateIASMS), units.Knots(a.At50ftIASMS))
	}
	fmt.Fprintf(w, "  cards use the %s model\n", a.Model)
	if t := a.Table; t != nil {
		fmt.Fprintf(w, "  table: %d pressure altitudes (%.0f to %.0f ft) x %d temperatures (%.0f to %.0f C) x %d weights (%.0f to %.0f kg); wind factoring in the data: %v\n",
			len(t.PressureAltM), units.Feet(first(t.PressureAltM)), units.Feet(last(t.PressureAltM)),
			len(t.TempK), units.Celsius(first(t.TempK)), units.Celsius(last(t.TempK)),
			len(t.WeightKg), first(t.WeightKg), last(t.WeightKg), t.WindInData)
		c := t.Corrections
		if c.HeadwindPerMS > 0 {
			fmt.Fprintf(w, "    headwind: -%g %% per %.0f kt%s\n", c.HeadwindPct, units.Knots(c.HeadwindPerMS), headwindBound(c, a.RotateIASMS))
		}
		if c.TailwindPerMS > 0 {
			fmt.Fprintf(w, "    tailwind: +%g %% per %.0f kt up to %.0f kt\n", c.TailwindPct, units.Knots(c.TailwindPerMS), units.Knots(c.TailwindMaxMS))
		}
		if c.GrassPctOfGroundRoll > 0 {
			fmt.Fprintf(w, "    dry grass: add %g %% of the ground roll\n", c.GrassPctOfGroundRoll)
		}
		if c.WetGrassPctOfGroundRoll > 0 {
			fmt.Fprintf(w, "    wet grass: add %g %% of the ground roll\n", c.WetGrassPctOfGroundRoll)
		}
	}
	if p := a.Physics; p != nil {
		fmt.Fprintf(w, "  physics: S %.1f m², b %.1f m, h %.1f m, CD0 %.3f, e %.2f, CL ground %.2f, CLmax %.2f, P %.0f kW, %s propeller %.2f m, rotation %.0f s\n",
			p.WingAreaM2, p.SpanM, p.WingHeightM, p.CD0, p.Oswald, p.CLGround, p.CLMax, p.PowerW/1000, p.Propeller, p.PropDiameterM, p.RotationS)
	}
}

// summarizeFit prints the physics calibration: the fitted parameters, where the fit
// started, and every figure's residual with the file:line it was read from (for a
// table, the residual map cell by cell).
func summarizeFit(w io.Writer, doc *Document) {
	p := doc.Aircraft.Physics
	if p == nil {
		return
	}
	c := p.Calibration
	if c == nil {
		fmt.Fprintf(w, "  physics NOT CALIBRATED (static thrust fraction %.2f, propeller efficiency %.2f as written or by default): cards, check and grid refuse it\n", p.StaticThrustFac, p.PropEfficiency)
		return
	}
	fmt.Fprintf(w, "  physics calibrated to %d point(s), %d figure(s) (Nelder-Mead, %d model evaluations):\n", len(c.Points), c.Figures(), c.Evaluations)
	fmt.Fprintf(w, "    static thrust fraction %.3f (fit started from %.2f; bounds %.2f to %.2f)\n", c.Static, c.StartStatic, perf.MinStaticThrustFrac, perf.MaxStaticThrustFrac)
	fmt.Fprintf(w, "    propeller efficiency   %.3f (fit started from %.2f; bounds %.2f to %.2f)\n", c.Eta, c.StartEta, perf.MinPropEfficiency, perf.MaxPropEfficiency)
	fmt.Fprintf(w, "    largest residual %.1f %% (at most %.0f %% accepted); residuals, model against manual:\n", c.LargestPct, perf.CalibrationTolerancePct)
	defer summarizeFloor(w, c.Floor, "takeoff", "    ")
	for i, cp := range doc.calib {
		if i >= len(c.Fits) {
			break
		}
		f := c.Fits[i]
		what := cp.label
		if !cp.p.FromTable {
			what = pointWords(cp)
		}
		row := func(at *yaml.Node, name string, manual, model, pct float64) {
			if at == nil {
				return
			}
			if f.Err != "" {
				fmt.Fprintf(w, "    %s:%d:%d  %s, %s %.0f m: no figure (%s)\n", doc.Path, at.Line, at.Column, what, name, manual, f.Err)
				return
			}
			fmt.Fprintf(w, "    %s:%d:%d  %s, %s %.0f m, fit %.0f m, %+.1f %%\n", doc.Path, at.Line, at.Column, what, name, manual, model, pct)
		}
		row(cp.grAt, "ground roll", cp.p.GroundRollM, f.GroundRollM, f.GroundRollPct)
		row(cp.toAt, "to 50 ft", cp.p.To50ftM, f.To50ftM, f.To50ftPct)
	}
}

// pointWords names a calibration point's conditions: "calibration[0] 0 ft, 15 C,
// 1250 kg, paved dry, calm".
func pointWords(cp calibPoint) string {
	cond := cp.p.Conditions
	wind := "calm"
	if cond.HeadwindMS != 0 {
		wind = fmt.Sprintf("headwind %+.0f kt", units.Knots(cond.HeadwindMS))
	}
	return fmt.Sprintf("%s %.0f ft, %.0f C, %.0f kg, %s %s, %s", cp.label, units.Feet(cond.PressureAltM), units.Celsius(cond.TempK), cond.MassKg, cond.Surface, cond.Condition, wind)
}

func first(xs []float64) float64 {
	if len(xs) == 0 {
		return 0
	}
	return xs[0]
}

func last(xs []float64) float64 {
	if len(xs) == 0 {
		return 0
	}
	return xs[len(xs)-1]
}

func abs(x float64) float64 {
	if x < 0 {
		return -x
	}
	return x
}

func summarizeTemplate(w io.Writer, t *CardTemplate) {
	fmt.Fprintf(w, "  card template %q: page %s, unit %s, policy %s, QNH %.0f hPa, tight margin %.0f %%\n",
		t.Name, t.Page, t.Unit, t.Policy, units.HPa(t.QNHPa), t.TightMargin*100)
	blocks := fmt.Sprintf("up to %d weight blocks", t.MaxBlocks)
	if t.MaxBlocks == 1 {
		blocks = "one weight block"
	}
	fmt.Fprintf(w, "  %d temperatures x %d winds, %s; valid %d days; obstacles cleared by %.0f ft\n", len(t.TempsK), len(t.WindsMS), blocks, t.ValidDays, units.Feet(t.ObstacleMarginM))
	fmt.Fprintf(w, "  landing figures (for a profile with landing data): %s\n", t.Landing)
}

func summarizePlan(w io.Writer, p *Plan) {
	fmt.Fprintf(w, "  plan %q: %d aircraft x %d airfields x %d template(s) -> %s\n", p.Name, len(p.Aircraft), len(p.Airfields), len(p.Templates), p.Output)
	fmt.Fprintf(w, "  date %s", p.Date.Format("2006-01-02"))
	if !p.ValidUntil.IsZero() {
		fmt.Fprintf(w, ", valid until %s", p.ValidUntil.Format("2006-01-02"))
	}
	fmt.Fprintln(w)
}

// limitsLine says which limits the profile declares: the demonstrated crosswind is
// advisory; a crosswind limit and operating temperatures only when declared.
func limitsLine(a *perf.Aircraft) string {
	parts := []string{fmt.Sprintf("crosswind %.0f kt demonstrated (advisory)", units.Knots(a.DemonstratedCrosswindMS))}
	if a.HasMaxCrosswind {
		parts = append(parts, fmt.Sprintf("crosswind limit %.0f kt", units.Knots(a.MaxCrosswindMS)))
	} else {
		parts = append(parts, "no crosswind limit declared")
	}
	parts = append(parts, fmt.Sprintf("tailwind %.0f kt", units.Knots(a.MaxTailwindMS)))
	switch {
	case a.MinTempK > 0 && a.MaxTempK > 0:
		parts = append(parts, fmt.Sprintf("operating temperatures %.0f to %.0f C", units.Celsius(a.MinTempK), units.Celsius(a.MaxTempK)))
	case a.MaxTempK > 0:
		parts = append(parts, fmt.Sprintf("operating temperature up to %.0f C", units.Celsius(a.MaxTempK)))
	case a.MinTempK > 0:
		parts = append(parts, fmt.Sprintf("operating temperature from %.0f C", units.Celsius(a.MinTempK)))
	default:
		parts = append(parts, "no operating temperature limits declared")
	}
	return strings.Join(parts, ", ")
}

// headwindBound says how far a takeoff table's headwind note is used
// (perf.TableModel.Takeoff): up to its up_to; else, with the manual's rotation speed,
// to half the lift-off speed; else only the floor of half the distance bounds it.
func headwindBound(c perf.Corrections, rotateIASMS float64) string {
	switch {
	case c.HeadwindMaxMS > 0:
		return fmt.Sprintf(" up to %.0f kt", units.Knots(c.HeadwindMaxMS))
	case rotateIASMS > 0:
		return fmt.Sprintf(" (no up_to: no data beyond half the lift-off speed, %.0f kt IAS)", units.Knots(rotateIASMS))
	}
	return " (no up_to and no rotation speed: the credit is only floored at half the distance; give up_to)"
}

// summarizeFloor says which floor factor a calibration applies (perf: the calibrated
// model is never shorter than the manual at its own points).
func summarizeFloor(w io.Writer, floor float64, what, indent string) {
	if floor > 1 {
		fmt.Fprintf(w, "%sfloor factor ×%s on every %s distance of the fitted model (ground roll and total): the largest manual/fit ratio above, rounded up, so that the calibrated model is never shorter than the manual at its own points\n", indent, strconv.FormatFloat(floor, 'f', -1, 64), what)
		return
	}
	fmt.Fprintf(w, "%sno floor factor: the fit is nowhere shorter than the manual at its own points\n", indent)
}
