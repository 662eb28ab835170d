package main

import (
	"errors"
	"fmt"
	"math"
	"strings"

	"github.com/spf13/cobra"

	"kneeprint/cmd/internal/report"
	kspec "kneeprint/cmd/internal/spec"
	"kneeprint/cmd/internal/units"
	"kneeprint/perf"
)

// maxWindKt is the largest wind component grid takes, as check's --wind takes whole
// knots up to 99 (a routine report's two-digit speed, ICAO Annex 3).
const maxWindKt = 99

type gridOptions struct {
	aircraft, airfield string
	runway             string
	qnh                string
	temps, winds       string
	weights            string
	surface            string
	policy             string
	margin             string
	obstacleMargin     string
	csv, json          bool
	landing            bool
}

func newGridCmd(e env) *cobra.Command {
	opts := &gridOptions{}
	cmd := &cobra.Command{
		Use:   "grid --aircraft FILE --airfield FILE [flags]",
		Short: "Print the takeoff grid of every runway end: temperature x wind x weight",
		Long: `grid computes, for every runway end (or one with --runway), the required takeoff
distance over temperature x wind component x weight at an assumed QNH (default a
conservative 1000 hPa), marks each cell go, tight, no-go, no data or beyond limits,
and prints it as a terminal table, --csv or --json. Winds are reported along-runway
components in knots, negative for a tailwind. On a runway end that lists obstacles, a
cell whose climb does not pass each by --obstacle-margin (default 50 ft) is no-go
(marked ^ in the table when it fits the declared distances).

With --landing it gives the landing grid instead: the landing distance from 50 ft,
factored by the policy, against each end's LDA (an end without an LDA has no
figure), over the weights from the maximum landing mass down.

` + caution,
		Example: `  kneeprint grid --aircraft demo:quillwing-qt6 --airfield demo:saltpan
  kneeprint grid --aircraft demo:sedgefin-sf2 --airfield demo:wrenmoor --runway 25 --temps 10C,20C,30C --winds=-5kt,0kt,10kt --csv
  kneeprint grid --aircraft demo:quillwing-qt6 --airfield demo:wrenmoor --landing --json`,
		Args: cobra.NoArgs,
		RunE: func(cmd *cobra.Command, _ []string) error { return gridRun(e, opts) },
	}
	f := cmd.Flags()
	f.StringVar(&opts.aircraft, "aircraft", "", "aircraft profile file, or demo:NAME")
	f.StringVar(&opts.airfield, "airfield", "", "airfield file, or demo:NAME")
	f.StringVar(&opts.runway, "runway", "", "only this runway end, e.g. 24 (default: all)")
	f.StringVar(&opts.qnh, "qnh", "1000hPa", "QNH assumed for the whole grid")
	f.StringVar(&opts.temps, "temps", "0C,5C,10C,15C,20C,25C,30C,35C", "temperature columns")
	f.StringVar(&opts.winds, "winds", "-10kt,-5kt,0kt,5kt,10kt,15kt,20kt", "wind-component rows, negative = tailwind")
	f.StringVar(&opts.weights, "weights", "", "weight blocks (default: the profile's weights)")
	f.StringVar(&opts.surface, "surface", "", "runway condition dry|wet (default: as the airfield file declares)")
	f.StringVar(&opts.policy, "policy", defaultPolicy, "safety policy: "+policyList())
	f.StringVar(&opts.margin, "margin", "10%", "spare margin below which a fitting cell is marked tight")
	f.StringVar(&opts.obstacleMargin, "obstacle-margin", defaultObstacleMargin, "clearance an obstacle past a runway end must be passed by, e.g. 50ft or 15m")
	f.BoolVar(&opts.csv, "csv", false, "write CSV, one row per cell")
	f.BoolVar(&opts.json, "json", false, "write JSON (fields documented in the README)")
	f.BoolVar(&opts.landing, "landing", false, "the landing grid against the LDA (the profile needs landing data)")
	return cmd
}

func gridRun(e env, opts *gridOptions) error {
	if opts.csv && opts.json {
		return errors.New("--csv and --json: choose one")
	}
	j, err := loadJob(opts.aircraft, opts.airfield, opts.policy)
	if err != nil {
		return err
	}
	spec := perf.DefaultGridSpec(j.aircraft)
	if spec.QNHPa, err = quantity("qnh", opts.qnh, units.Pressure); err != nil {
		return err
	}
	if spec.TempsK, err = quantityList("temps", opts.temps, units.Temperature); err != nil {
		return err
	}
	for _, t := range spec.TempsK {
		if err := perf.CheckTemp(t); err != nil {
			return fmt.Errorf("--temps: %w", err)
		}
	}
	if spec.HeadwindsMS, err = quantityList("winds", opts.winds, units.Speed); err != nil {
		return err
	}
	for _, w := range spec.HeadwindsMS {
		// The same bound as check's --wind; within it, a wind the model cannot
		// answer (a physics model past half its lift-off speed) is a no-data cell.
		if math.Abs(w) > maxWindKt*units.MetresPerSecPerKnot+1e-9 {
			return fmt.Errorf("--winds: %.0f kt is beyond %d kt either way, the largest wind kneeprint takes", units.Knots(w), maxWindKt)
		}
	}
	if opts.weights != "" {
		if spec.WeightsKg, err = quantityList("weights", opts.weights, units.Mass); err != nil {
			return err
		}
		for _, w := range spec.WeightsKg {
			if err := perf.CheckMass(j.aircraft, w); err != nil {
				return fmt.Errorf("--weights: %w", err)
			}
		}
	}
	runway := ""
	if opts.runway != "" {
		// Read as the files are: "7" is runway 07.
		if runway, err = kspec.NormalizeDesignator(opts.runway); err != nil {
			return fmt.Errorf("--runway: %w", err)
		}
	}
	if spec.TightMargin, err = marginFlag(opts.margin); err != nil {
		return err
	}
	if spec.ObstacleMarginM, err = obstacleMarginFlag(opts.obstacleMargin); err != nil {
		return err
	}
	cond, err := conditionFlag(opts.surface)
	if err != nil {
		return err
	}
	in := report.GridInput{Aircraft: j.aircraft, Airfield: j.airfield, Policy: j.policy, Landing: opts.landing}
	var lm perf.LandingModel
	if opts.landing {
		if lm, err = perf.LandingModelFor(j.aircraft); err != nil {
			return dataError{err}
		}
		if opts.weights == "" {
			spec.WeightsKg = perf.LandingMasses(j.aircraft, spec.WeightsKg, perf.MaxGridWeights)
		}
	}
	for _, end := range j.airfield.Ends() {
		if runway != "" && end.Designator != runway {
			continue
		}
		if cond != "" {
			end.Condition = cond
		}
		var g *perf.Grid
		if opts.landing {
			g, err = perf.ComputeLandingGrid(j.aircraft, lm, j.policy, *j.airfield, end, spec)
		} else {
			g, err = perf.ComputeGrid(j.aircraft, j.model, j.policy, *j.airfield, end, spec)
		}
		if err != nil {
			return err
		}
		in.Grids = append(in.Grids, g)
	}
	if len(in.Grids) == 0 {
		var have []string
		for _, e := range j.airfield.Ends() {
			have = append(have, e.Designator)
		}
		return fmt.Errorf("--runway %s: no runway end %s at %s (it has %s)", opts.runway, runway, j.airfield.Ident, strings.Join(have, ", "))
	}
	switch {
	case opts.json:
		return report.WriteGridJSON(e.stdout, report.BuildGrid(in))
	case opts.csv:
		return report.WriteGridCSV(e.stdout, report.BuildGrid(in))
	}
	return report.WriteGridText(e.stdout, in)
}
