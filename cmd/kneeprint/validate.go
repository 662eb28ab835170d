package main

import (
	"errors"
	"fmt"

	"github.com/spf13/cobra"

	"kneeprint/cmd/internal/batch"
	"kneeprint/cmd/internal/inputs"
	"kneeprint/cmd/internal/spec"
)

type validateOptions struct {
	demo   bool
	strict bool
	files  []string
}

func newValidateCmd(e env) *cobra.Command {
	opts := &validateOptions{}
	cmd := &cobra.Command{
		Use:   "validate [--demo] [FILE...]",
		Short: "Read kneeprint files strictly and report what they hold, defaults and errors",
		Long: `validate reads aircraft profiles and airfield files (any mix: each file says what it
is with its kind: line), prints a summary of what was read and the defaults applied,
and every error with file:line:column and field. A plan is checked with every file it
names: each must exist and be of the kind its list needs. Text a card prints (names,
flap, runway notes) must be characters the card's font can print. It exits 1 if any
file has an error. Warnings (legal but suspicious data, such as a table cell that breaks
the smooth pattern of its neighbours) are listed with their file:line; with --strict
they count as errors (exit 1).

` + caution,
		Example: `  kneeprint validate --demo
  kneeprint validate my-aircraft.yaml home-field.yaml
  kneeprint validate season-2027.yaml`,
		RunE: func(cmd *cobra.Command, args []string) error {
			opts.files = args
			if !opts.demo && len(args) == 0 {
				return errors.New("validate needs files, or --demo for the embedded demo files")
			}
			return validateRun(e, opts)
		},
	}
	cmd.Flags().BoolVar(&opts.demo, "demo", false, "validate the embedded demo files (invented aircraft and airfields)")
	cmd.Flags().BoolVar(&opts.strict, "strict", false, "exit 1 when any file has a warning, as for an error")
	return cmd
}

func validateRun(e env, opts *validateOptions) error {
	var srcs []inputs.Source
	if opts.demo {
		ac, af := inputs.Demo()
		srcs = append(append(srcs, ac...), af...)
	}
	for _, f := range opts.files {
		src, err := inputs.Resolve(f)
		if err != nil {
			return err
		}
		srcs = append(srcs, src)
	}
	failed, warned := 0, 0
	for _, s := range srcs {
		doc, err := s.Load()
		if err != nil {
			failed++
			fmt.Fprintf(e.stdout, "%s: ERRORS\n", s.Name)
			var list spec.ErrorList
			if errors.As(err, &list) {
				for _, fe := range list {
					fmt.Fprintf(e.stdout, "  %s\n", fe.Error())
				}
			} else {
				fmt.Fprintf(e.stdout, "  %s\n", err)
			}
			continue
		}
		if doc.Plan != nil && s.FS == nil {
			// A plan is checked with the files it names, at the plan's lines.
			if list := batch.CheckPlan(doc.Plan, s.Path); len(list) > 0 {
				failed++
				fmt.Fprintf(e.stdout, "%s: ERRORS in the files it names\n", s.Name)
				for _, fe := range list {
					fmt.Fprintf(e.stdout, "  %s\n", fe.Error())
				}
				continue
			}
		}
		fmt.Fprintf(e.stdout, "%s: ok, %s\n", s.Name, doc.Kind)
		if spec.Summarize(e.stdout, doc) > 0 {
			warned++
		}
	}
	fmt.Fprintf(e.stdout, "\n%d file(s) read, %d with errors, %d with warnings\n", len(srcs), failed, warned)
	switch {
	case failed > 0:
		return dataError{fmt.Errorf("%d of %d file(s) have errors", failed, len(srcs))}
	case opts.strict && warned > 0:
		return dataError{fmt.Errorf("--strict: %d of %d file(s) have warnings", warned, len(srcs))}
	}
	return nil
}
