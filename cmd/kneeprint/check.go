package main

import (
	"errors"

	"github.com/spf13/cobra"

	"kneeprint/cmd/internal/report"
	"kneeprint/cmd/internal/units"
	"kneeprint/perf"
)

type checkOptions struct {
	aircraft, airfield string
	temp, qnh, weight  string
	wind               string
	windTrue           bool
	surface            string
	policy             string
	margin             string
	json               bool
}

func newCheckCmd(e env) *cobra.Command {
	opts := &checkOptions{}
	cmd := &cobra.Command{
		Use:   "check --aircraft FILE --airfield FILE --temp T [flags]",
		Short: "Answer for one set of conditions on every runway end, ranked",
		Long: `check computes the takeoff for one set of conditions on every runway end of the
airfield and ranks the ends, best first. Quantities take units exactly as files do.
The wind is direction/speed in knots as a tower gives it (magnetic); --wind-true for
a forecast's true direction. The headwind printed is the reported component; the
credited wind (50 % of a headwind, 150 % of a tailwind, unless the profile's data
already include that) is what the model used. Exit 0 when computed, whatever the verdict.

` + caution,
		Example: `  kneeprint check --aircraft demo:sedgefin-sf2 --airfield demo:wrenmoor --temp 30C --qnh 1003hPa --wind 240/15G25
  kneeprint check --aircraft my-plane.yaml --airfield home.yaml --temp 86F --qnh 29.62inHg --weight 2300lb --surface wet --json`,
		Args: cobra.NoArgs,
		RunE: func(cmd *cobra.Command, _ []string) error { return checkRun(e, opts) },
	}
	f := cmd.Flags()
	f.StringVar(&opts.aircraft, "aircraft", "", "aircraft profile file, or demo:NAME")
	f.StringVar(&opts.airfield, "airfield", "", "airfield file, or demo:NAME")
	f.StringVar(&opts.temp, "temp", "", "outside air temperature, e.g. 30C or 86F (required)")
	f.StringVar(&opts.qnh, "qnh", "1013.25hPa", "QNH, e.g. 1003hPa or 29.62inHg")
	f.StringVar(&opts.weight, "weight", "", "takeoff weight, e.g. 1050kg or 2300lb (default: the profile's MTOW)")
	f.StringVar(&opts.wind, "wind", "calm", "wind direction/speed in knots: 240/15, 240/15G25, VRB/05, calm")
	f.BoolVar(&opts.windTrue, "wind-true", false, "the wind direction is true (forecast), not magnetic (tower)")
	f.StringVar(&opts.surface, "surface", "", "runway condition dry|wet (default: as the airfield file declares)")
	f.StringVar(&opts.policy, "policy", defaultPolicy, "safety policy: "+policyList())
	f.StringVar(&opts.margin, "margin", "10%", "spare margin below which a fitting runway is marked tight")
	f.BoolVar(&opts.json, "json", false, "write JSON (fields documented in the README)")
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
	if opts.temp == "" {
		return errors.New("--temp is required, e.g. --temp 30C")
	}
	j, err := loadJob(opts.aircraft, opts.airfield, opts.policy)
	if err != nil {
		return err
	}
	q := perf.Question{MassKg: j.aircraft.MTOWKg}
	if q.TempK, err = quantity("temp", opts.temp, units.Temperature); err != nil {
		return err
	}
	if q.QNHPa, err = quantity("qnh", opts.qnh, units.Pressure); err != nil {
		return err
	}
	if q.QNHPa < 80000 || q.QNHPa > 110000 {
		return errors.New("--qnh: outside 800 to 1100 hPa")
	}
	if opts.weight != "" {
		if q.MassKg, err = quantity("weight", opts.weight, units.Mass); err != nil {
			return err
		}
	}
	w, err := units.ParseWind(opts.wind)
	if err != nil {
		return err
	}
	q.Wind = perf.Wind{FromDeg: w.FromDeg, SpeedMS: w.SpeedMS, GustMS: w.GustMS, True: opts.windTrue}
	q.Variable = w.Variable
	if q.Condition, err = conditionFlag(opts.surface); err != nil {
		return err
	}
	if q.TightMargin, err = marginFlag(opts.margin); err != nil {
		return err
	}
	ans := perf.Ask(j.aircraft, j.model, j.policy, *j.airfield, q)
	run := report.BuildCheck(report.CheckInput{Aircraft: j.aircraft, Airfield: j.airfield, Policy: j.policy, Question: q, WindText: opts.wind}, ans)
	if opts.json {
		return report.WriteCheckJSON(e.stdout, run)
	}
	return report.WriteCheckText(e.stdout, run)
}
