package main

import (
	"path/filepath"
	"time"

	"github.com/spf13/cobra"

	"kneeprint/cmd/internal/batch"
	"kneeprint/cmd/internal/report"
	"kneeprint/cmd/internal/spec"
)

type staleOptions struct {
	dir  string
	plan string
	json bool
}

func newStaleCmd(e env) *cobra.Command {
	opts := &staleOptions{}
	cmd := &cobra.Command{
		Use:   "stale DIR [--plan PLAN] [--json]",
		Short: "List printed cards that no longer match their input files, and why",
		Long: `stale reads the index a batch wrote into DIR and compares every card with the
current input files: the ones the index recorded, or, with --plan, the ones the plan
names now (for example after pointing the plan at an edited copy of an airfield). A
card is stale when its aircraft profile, its runway end (declared distances, heading,
slope, surface...), its card template or the kneeprint version changed, when the PDF
itself is missing or was altered, or when it is past its valid-until date (listed with
the date). Formatting, comments, the unit a value is written in and fields no card
prints and no figure uses (an aircraft's type and notes, the airfield's variation, a
template's name and valid_days) do not count, nor does a page chosen with cards
--page. Exit 0 when every card matches, 1 when any is stale or expired.

` + caution,
		Example: `  kneeprint stale cards-2027
  kneeprint stale cards-2027 --plan season-2027.yaml --json`,
		Args: cobra.ExactArgs(1),
		RunE: func(cmd *cobra.Command, args []string) error {
			opts.dir = args[0]
			return staleRun(e, opts)
		},
	}
	cmd.Flags().StringVar(&opts.plan, "plan", "", "compare with the files this plan names now")
	cmd.Flags().BoolVar(&opts.json, "json", false, "write JSON")
	return cmd
}

func staleRun(e env, opts *staleOptions) error {
	var plan *spec.Plan
	planDir := ""
	if opts.plan != "" {
		p, err := batch.LoadPlan(opts.plan)
		if err != nil {
			return fileError(err)
		}
		plan, planDir = p, filepath.Dir(opts.plan)
	}
	now := e.now()
	today := time.Date(now.Year(), now.Month(), now.Day(), 0, 0, 0, 0, time.UTC)
	rep, err := batch.Stale(opts.dir, plan, planDir, version, today)
	if err != nil {
		return dataError{err}
	}
	if opts.json {
		if rep.Stale == nil {
			rep.Stale = []batch.StaleCard{}
		}
		if rep.Errors == nil {
			rep.Errors = []string{}
		}
		if err := report.WriteJSON(e.stdout, rep); err != nil {
			return err
		}
	} else if err := rep.WriteText(e.stdout); err != nil {
		return err
	}
	if len(rep.Stale) > 0 || len(rep.Errors) > 0 {
		return changedError{}
	}
	return nil
}
