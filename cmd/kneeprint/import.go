package main

import (
	"errors"
	"fmt"
	"io"

	"github.com/spf13/cobra"

	"kneeprint/cmd/internal/files"
	"kneeprint/cmd/internal/spec"
	"kneeprint/cmd/internal/tableimport"
)

type importOptions struct {
	what, file string
	out        string
	force      bool
}

func newImportCmd(e env) *cobra.Command {
	opts := &importOptions{}
	cmd := &cobra.Command{
		Use:   "import table FILE.csv [-o FILE] [--force]",
		Short: "Turn a takeoff table typed in a spreadsheet (CSV) into a profile's table section",
		Long: `import table reads a flight manual's takeoff table typed in a spreadsheet and saved as
CSV, checks it exactly as validate checks a profile's table (each problem named with
the CSV's line and column), lists the figures that break the smooth pattern of their
neighbours, and prints the profile's table section as YAML to paste into the profile
(or writes it to FILE with -o; an existing FILE is replaced only with --force).

The CSV: settings first, then one block per weight, in the manual's unit:

  distance_unit,ft
  wind_factoring_included,false
  weight,1000 kg
  ground_roll,-10 C,0 C,10 C
  0 ft,680,735,795
  2000 ft,790,855,925
  to_50ft,-10 C,0 C,10 C
  0 ft,1235,1335,1440
  2000 ft,1470,1590,1710
  weight,900 kg
  ...

The ground_roll and to_50ft lines carry the temperatures; each row begins with its
pressure altitude; every block has the same temperatures and pressure altitudes.
Figures are plain numbers (no thousands separator). Commas, semicolons or tabs
separate cells. Without wind_factoring_included the YAML leaves it for you to answer.

` + caution,
		Example: `  kneeprint import table trainer-takeoff.csv > table.yaml
  kneeprint import table trainer-takeoff.csv -o table.yaml`,
		Args: cobra.ExactArgs(2),
		RunE: func(cmd *cobra.Command, args []string) error {
			opts.what, opts.file = args[0], args[1]
			if opts.what != "table" {
				return fmt.Errorf("import: %q: only a takeoff table can be imported (import table FILE.csv)", opts.what)
			}
			return importRun(e, opts)
		},
	}
	cmd.Flags().StringVarP(&opts.out, "out", "o", "", "write the YAML to this file instead of the standard output")
	cmd.Flags().BoolVar(&opts.force, "force", false, "replace FILE if it exists")
	return cmd
}

func importRun(e env, opts *importOptions) error {
	f, err := files.OpenRegular(opts.file)
	if err != nil {
		return dataError{err}
	}
	data, err := io.ReadAll(io.LimitReader(f, tableimport.MaxBytes+1))
	f.Close()
	if err != nil {
		return dataError{err}
	}
	res, err := tableimport.Import(opts.file, data)
	if err != nil {
		var list spec.ErrorList
		if errors.As(err, &list) {
			for _, fe := range list {
				fmt.Fprintln(e.stderr, fe.Error())
			}
			return dataError{fmt.Errorf("%s: %d error(s): no table written", opts.file, len(list))}
		}
		return dataError{err}
	}
	for _, w := range res.Warnings {
		fmt.Fprintf(e.stderr, "warning: %s\n", w)
	}
	if !res.WindFactoringGiven {
		fmt.Fprintln(e.stderr, "note: answer table.wind_factoring_included (true or false) in the YAML: the CSV does not say")
	}
	if opts.out == "" {
		_, err := e.stdout.Write(res.YAML)
		return err
	}
	if err := writeNew(opts.out, res.YAML, opts.force); err != nil {
		return dataError{err}
	}
	fmt.Fprintf(e.stderr, "wrote %s\n", opts.out)
	return nil
}
