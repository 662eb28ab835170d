package main

import (
	"errors"

	"github.com/spf13/cobra"

	"kneeprint/cmd/internal/changes"
	"kneeprint/cmd/internal/inputs"
	"kneeprint/perf"
	"kneeprint/templates"
)

type diffOptions struct {
	aircraft []string
	old, new string
	template string
	policy   string
	json     bool
}

func newDiffCmd(e env) *cobra.Command {
	opts := &diffOptions{}
	cmd := &cobra.Command{
		Use:   "diff --aircraft FILE [--aircraft FILE...] OLD_AIRFIELD NEW_AIRFIELD [--json]",
		Short: "What changed for a pilot between two versions of an airfield file",
		Long: `diff lists the changed declared distances, slopes, surfaces, headings and notes of
every runway end, and, for each aircraft, every grid cell whose state changes
(e.g. go -> no-go at 30 C, 5 kt tailwind, 1100 kg) over the card template's grid;
a cell an obstacle stops (the runway fits, the climb does not clear it) names the
obstacle and its clearance.
Exit 0 when nothing a pilot must know changed, 1 when something did.

` + caution,
		Example: `  kneeprint diff --aircraft demo:sedgefin-sf2 home-2026.yaml home-2027.yaml
  kneeprint diff --aircraft a.yaml --aircraft b.yaml old.yaml new.yaml --template 5x8 --json`,
		Args: cobra.ExactArgs(2),
		RunE: func(cmd *cobra.Command, args []string) error {
			opts.old, opts.new = args[0], args[1]
			return diffRun(e, opts)
		},
	}
	cmd.Flags().StringArrayVar(&opts.aircraft, "aircraft", nil, "aircraft profile file or demo:NAME (repeat for several)")
	cmd.Flags().StringVar(&opts.template, "template", templates.DefaultCard, "card template whose grid is compared")
	cmd.Flags().StringVar(&opts.policy, "policy", "", "safety policy (default: the template's): "+policyList())
	cmd.Flags().BoolVar(&opts.json, "json", false, "write JSON")
	return cmd
}

func diffRun(e env, opts *diffOptions) error {
	if len(opts.aircraft) == 0 {
		return errors.New("--aircraft is needed: the cells compared are an aircraft's")
	}
	tmpl, err := loadTemplate(opts.template)
	if err != nil {
		return err
	}
	if opts.policy != "" {
		if _, err := perf.PolicyByID(opts.policy); err != nil {
			return err
		}
		tmpl.Policy = opts.policy
	}
	var acs []*perf.Aircraft
	for _, a := range opts.aircraft {
		ac, _, err := inputs.Aircraft(a)
		if err != nil {
			return fileError(err)
		}
		acs = append(acs, ac)
	}
	oldF, _, err := inputs.Airfield(opts.old)
	if err != nil {
		return fileError(err)
	}
	newF, _, err := inputs.Airfield(opts.new)
	if err != nil {
		return fileError(err)
	}
	rep, err := changes.Diff(acs, oldF, newF, *tmpl)
	if err != nil {
		return dataError{err}
	}
	rep.OldFile, rep.NewFile = opts.old, opts.new
	if opts.json {
		err = rep.WriteJSON(e.stdout)
	} else {
		err = rep.WriteText(e.stdout)
	}
	if err != nil {
		return err
	}
	if rep.Changed {
		return changedError{}
	}
	return nil
}
