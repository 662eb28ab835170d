package main

import (
	"errors"
	"fmt"
	"math"

	"github.com/spf13/cobra"

	"kneeprint/cmd/internal/metar"
	"kneeprint/cmd/internal/report"
	"kneeprint/cmd/internal/units"
	"kneeprint/perf"
)

type checkOptions struct {
	aircraft, airfield string
	temp, qnh, weight  string
	wind               string
	windTrue           bool
	metar              string
	surface            string
	policy             string
	margin             string
	obstacleMargin     string
	json               bool
	// landing: the landing answer only; takeoff: the takeoff answer only. Neither:
	// both, when the profile has landing data.
	landing, takeoff bool
	landingWeight    string
}

func newCheckCmd(e env) *cobra.Command {
	opts := &checkOptions{}
	cmd := &cobra.Command{
		Use:   "check --aircraft FILE --airfield FILE (--temp T --qnh P | --metar REPORT) [flags]",
		Short: "Answer for one set of conditions on every runway end, ranked",
		Long: `check computes the takeoff for one set of conditions on every runway end of the
airfield and ranks the ends, best first. Quantities take units exactly as files do.

Today's conditions: --temp and --qnh, or --metar with a whole routine weather report
(METAR/SPECI), from which the wind group (with a dddVddd direction range), the
temperature group (M05 is minus 5) and the QNH group (Q1003 or A2962) are taken. A
flag given alongside a report replaces the report's value and is named in the output.
The QNH is never assumed: give --qnh or a report with a QNH group.

Winds: the tower form 240/15, 240/15G25, VRB/05 or calm, with a three-digit direction
in knots, is MAGNETIC (as a tower or broadcast gives it); --wind-true says it is true.
A report group (24015G25KT, VRB05KT, 00000KT, 27008MPS), alone or from --metar, is
TRUE, as reports are; true directions are made magnetic with the airfield's variation.
The output says which reference was used. A tailwind counts at its gust, a headwind
at its steady speed; a variable wind is a full tailwind and crosswind on every end.
The headwind printed is the reported component; the credited wind (50 % of a
headwind, 150 % of a tailwind, unless the profile's data already include that) is
what the model used.

Obstacles: for a runway end that lists obstacles past its end, the climb at the
profile's climb speed from 50 ft at the takeoff distance (before the safety factor)
must pass each by --obstacle-margin (default 50 ft), or the end is no-go; the output
gives the climb gradient and every obstacle's clearance. A profile's rate-of-climb
table counts on every runway end: where it gives no climb (a still-air gradient under
0.5 %), there is no takeoff. Exit 0 when computed, whatever the verdict.

Landing: when the profile has landing data the answer also gives, for every runway
end, the landing distance from 50 ft, what the policy requires of the LDA (e.g.
CAT.POL.A.330: within 70 % of it) and the verdict; --landing gives the landing answer
only, --takeoff the takeoff answer only. The landing weight is --landing-weight, else
--weight, else the maximum landing mass.

` + caution,
		Example: `  kneeprint check --aircraft demo:sedgefin-sf2 --airfield demo:wrenmoor --temp 30C --qnh 1003hPa --wind 240/15G25
  kneeprint check --aircraft demo:sedgefin-sf2 --airfield demo:wrenmoor --metar "METAR ZZZZ 121250Z 25012G22KT 9999 FEW040 24/11 Q1009"
  kneeprint check --aircraft my-plane.yaml --airfield home.yaml --temp 86F --qnh 29.62inHg --weight 2300lb --surface wet --json
  kneeprint check --aircraft demo:quillwing-qt6 --airfield demo:wrenmoor --temp 25C --qnh 1008hPa --wind 320/08 --landing --landing-weight 1150kg`,
		Args: cobra.NoArgs,
		RunE: func(cmd *cobra.Command, _ []string) error { return checkRun(e, opts) },
	}
	f := cmd.Flags()
	f.StringVar(&opts.aircraft, "aircraft", "", "aircraft profile file, or demo:NAME")
	f.StringVar(&opts.airfield, "airfield", "", "airfield file, or demo:NAME")
	f.StringVar(&opts.temp, "temp", "", "outside air temperature, e.g. 30C or 86F (required unless --metar has one)")
	f.StringVar(&opts.qnh, "qnh", "", "QNH, e.g. 1003hPa or 29.62inHg (required unless --metar has one: never assumed)")
	f.StringVar(&opts.metar, "metar", "", "a routine weather report: wind, temperature and QNH are taken from it")
	f.StringVar(&opts.weight, "weight", "", "takeoff weight, e.g. 1050kg or 2300lb (default: the profile's MTOW)")
	f.StringVar(&opts.wind, "wind", "", "wind: 240/15, 240/15G25, VRB/05, calm (magnetic) or 24015G25KT (true); default: the report's, else calm")
	f.BoolVar(&opts.windTrue, "wind-true", false, "a tower-form --wind direction is true, not magnetic")
	f.StringVar(&opts.surface, "surface", "", "runway condition dry|wet (default: as the airfield file declares)")
	f.StringVar(&opts.policy, "policy", defaultPolicy, "safety policy: "+policyList())
	f.StringVar(&opts.margin, "margin", "10%", "spare margin below which a fitting runway is marked tight")
	f.StringVar(&opts.obstacleMargin, "obstacle-margin", defaultObstacleMargin, "clearance an obstacle past a runway end must be passed by, e.g. 50ft or 15m")
	f.BoolVar(&opts.json, "json", false, "write JSON (fields documented in the README)")
	f.BoolVar(&opts.landing, "landing", false, "the landing answer only (the profile needs landing data)")
	f.BoolVar(&opts.takeoff, "takeoff", false, "the takeoff answer only")
	f.StringVar(&opts.landingWeight, "landing-weight", "", "landing weight (default: --weight, else the maximum landing mass)")
	return cmd
}

func policyList() string {
	s := ""
	for i, id := range perf.PolicyIDs() {
		if i > 0 {
			s += ", "
		}
		s += id
	}
	return s
}

func checkRun(e env, opts *checkOptions) error {
	var rep *metar.Report
	if opts.metar != "" {
		r, err := metar.Parse(opts.metar)
		if err != nil {
			return fmt.Errorf("--metar: %w", err)
		}
		rep = &r
	}
	if opts.temp == "" && (rep == nil || !rep.HasTemp) {
		if rep != nil {
			return fmt.Errorf("--metar: the report has no usable temperature group (e.g. 18/10, M05/M08): give --temp")
		}
		return errors.New("--temp is required, e.g. --temp 30C (or --metar with a whole report)")
	}
	if opts.qnh == "" && (rep == nil || !rep.HasQNH) {
		if rep != nil {
			return fmt.Errorf("--metar: the report has no usable QNH group (e.g. Q1003 or A2962): give --qnh")
		}
		return errors.New("--qnh is required, e.g. --qnh 1003hPa or --qnh 29.62inHg (or --metar with a whole report): kneeprint never assumes a pressure")
	}
	if opts.landing && opts.takeoff {
		return errors.New("--landing and --takeoff: choose one, or neither for both")
	}
	j, err := loadJob(opts.aircraft, opts.airfield, opts.policy)
	if err != nil {
		return err
	}
	var lm perf.LandingModel
	if opts.landing || (!opts.takeoff && j.aircraft.Landing != nil) {
		if lm, err = perf.LandingModelFor(j.aircraft); err != nil {
			return dataError{err}
		}
	}
	in := report.CheckInput{Aircraft: j.aircraft, Airfield: j.airfield, Policy: j.policy}
	q := perf.Question{MassKg: j.aircraft.MTOWKg}

	// Temperature and QNH: the flag wins over the report and is named.
	if rep != nil {
		in.METAR = rep.Text
		in.Warnings = rep.Warnings()
	}
	if opts.temp != "" {
		if q.TempK, err = quantity("temp", opts.temp, units.Temperature); err != nil {
			return err
		}
		if rep != nil && rep.HasTemp {
			in.FlagsOverReport = append(in.FlagsOverReport, fmt.Sprintf("--temp %s (the report's temperature %s not used)", opts.temp, rep.TempGroup))
		}
	} else {
		q.TempK = rep.TempK
		in.FromReport = append(in.FromReport, fmt.Sprintf("temperature %.0f C (%s)", units.Celsius(rep.TempK), rep.TempGroup))
	}
	if err := perf.CheckTemp(q.TempK); err != nil {
		return fmt.Errorf("--temp: %w%s", err, inUnitWritten(opts.temp, units.Temperature, perf.MinPlausibleTempK, perf.MaxPlausibleTempK))
	}
	if opts.qnh != "" {
		if q.QNHPa, err = quantity("qnh", opts.qnh, units.Pressure); err != nil {
			return err
		}
		if rep != nil && rep.HasQNH {
			in.FlagsOverReport = append(in.FlagsOverReport, fmt.Sprintf("--qnh %s (the report's %s not used)", opts.qnh, rep.QNHGroup))
		}
	} else {
		q.QNHPa = rep.QNHPa
		in.FromReport = append(in.FromReport, fmt.Sprintf("QNH %.1f hPa (%s)", units.HPa(rep.QNHPa), rep.QNHGroup))
	}
	if q.QNHPa < perf.MinQNHPa || q.QNHPa > perf.MaxQNHPa {
		return fmt.Errorf("--qnh: outside 800 to 1100 hPa%s", inUnitWritten(opts.qnh, units.Pressure, perf.MinQNHPa, perf.MaxQNHPa))
	}
	if opts.weight != "" {
		if q.MassKg, err = quantity("weight", opts.weight, units.Mass); err != nil {
			return err
		}
		if err := perf.CheckMass(j.aircraft, q.MassKg); err != nil {
			return fmt.Errorf("--weight: %w%s", err, inUnitWritten(opts.weight, units.Mass, j.aircraft.MinMassKg, perf.MaxMassOverMTOW*j.aircraft.MTOWKg))
		}
	}

	// Wind: the flag, else the report's, else calm; its reference is said.
	var w units.WindReport
	switch {
	case opts.wind != "":
		if w, err = units.ParseWind(opts.wind); err != nil {
			return fmt.Errorf("--wind: %w", err)
		}
		in.WindText = opts.wind
		switch {
		case w.True:
			in.WindSource = "report group"
		case opts.windTrue:
			w.True, in.WindSource = true, "tower form with --wind-true"
		default:
			in.WindSource = "tower form; --wind-true if it is true"
		}
		if rep != nil && rep.Wind != nil {
			in.FlagsOverReport = append(in.FlagsOverReport, fmt.Sprintf("--wind %s (the report's %s not used)", opts.wind, rep.WindGroup))
		}
	case rep != nil:
		if rep.Wind == nil {
			return fmt.Errorf("--metar: the report has no usable wind group (%s): give --wind", orMissing(rep.WindGroup))
		}
		w, in.WindText, in.WindSource = *rep.Wind, rep.WindGroup, "from the report"
		in.FromReport = append([]string{fmt.Sprintf("wind %s (true)", rep.WindGroup)}, in.FromReport...)
	default:
		in.WindText, in.WindSource = "calm", "no --wind given: calm"
	}
	q.Wind = perf.Wind{FromDeg: w.FromDeg, SpeedMS: w.SpeedMS, GustMS: w.GustMS, True: w.True, Variable: w.Variable,
		Varies: w.Varies, VaryFromDeg: w.VaryFromDeg, VaryToDeg: w.VaryToDeg}
	if q.Condition, err = conditionFlag(opts.surface); err != nil {
		return err
	}
	if q.TightMargin, err = marginFlag(opts.margin); err != nil {
		return err
	}
	if q.ObstacleMarginM, err = obstacleMarginFlag(opts.obstacleMargin); err != nil {
		return err
	}
	landingQ := q
	if lm != nil {
		landingQ.MassKg = j.aircraft.Landing.MaxMassKg
		if opts.weight != "" {
			landingQ.MassKg = q.MassKg
		}
		if opts.landingWeight != "" {
			if landingQ.MassKg, err = quantity("landing-weight", opts.landingWeight, units.Mass); err != nil {
				return err
			}
			if err := perf.CheckMass(j.aircraft, landingQ.MassKg); err != nil {
				return fmt.Errorf("--landing-weight: %w%s", err, inUnitWritten(opts.landingWeight, units.Mass, j.aircraft.MinMassKg, perf.MaxMassOverMTOW*j.aircraft.MTOWKg))
			}
		}
	}
	var ans perf.Answer
	if !opts.landing {
		if ans, err = perf.Ask(j.aircraft, j.model, j.policy, *j.airfield, q); err != nil {
			return err
		}
	}
	in.Question = q
	run := report.BuildCheck(in, ans)
	if opts.landing {
		run.Ends = []report.CheckEnd{}
	}
	if lm != nil {
		lans, err := perf.AskLanding(j.aircraft, lm, j.policy, *j.airfield, landingQ)
		if err != nil {
			return err
		}
		run.Landing = report.BuildLanding(lans)
		run.LandingModel, run.LandingWeightKg = string(j.aircraft.Landing.Model), math.Round(landingQ.MassKg)
		if opts.landing {
			// The atmosphere of the answer, which the takeoff would otherwise give.
			run.ElevationFt = math.Round(units.Feet(lans.ElevationM))
			run.PressureAltitudeFt = math.Round(units.Feet(lans.PressureAltM))
			run.DensityAltitudeFt = math.Round(units.Feet(lans.DensityAltM))
			run.ISADeviationC = math.Round(lans.ISADevK*10) / 10
		}
	}
	if opts.json {
		return report.WriteCheckJSON(e.stdout, run)
	}
	return report.WriteCheckText(e.stdout, run)
}

// inUnitWritten repeats an accepted SI range lo to hi in the unit flag value v was
// written in, when that is not the unit the message uses (" (in F: -130 to 140 F)");
// "" otherwise.
func inUnitWritten(v string, dim units.Dimension, lo, hi float64) string {
	u := units.UnitOf(v, dim)
	if u == units.Accepted(dim)[0] {
		return ""
	}
	return fmt.Sprintf(" (in %s: %s)", u, units.FormatRange(lo, hi, dim, u))
}

func orMissing(g string) string {
	if g == "" {
		return "none found"
	}
	return g + " reported missing"
}
