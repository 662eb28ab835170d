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
		Use:   "import table|landing|climb FILE.csv [-o FILE] [--force]",
		Short: "Turn a takeoff, landing or rate-of-climb table typed in a spreadsheet (CSV) into a profile's section",
		Long: `import reads a flight manual's table typed in a spreadsheet and saved as CSV, checks it
exactly as validate checks that section of a profile (each problem named with the
CSV's line and column), lists the figures that break the smooth pattern of their
neighbours, and prints the profile's section as YAML to paste into the profile (or
writes it to FILE with -o; an existing FILE is replaced only with --force):

  import table FILE.csv     the takeoff table: the profile's table section
  import landing FILE.csv   the landing table: the profile's landing section
  import climb FILE.csv     the rate-of-climb table: the profile's climb section

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

The quantity lines carry the temperatures; each row begins with its pressure
altitude; every block has the same temperatures and pressure altitudes. A landing
table has ground_roll and from_50ft (and may give flap,30° among its settings); a
climb table has rate_unit (ft/min or m/s) and speed (the climb speed, e.g. 70 kt)
as settings and rate_of_climb rows, and may leave out the weight lines (one table,
for the MTOW). Figures are plain numbers (no thousands separator). Commas,
semicolons or tabs separate cells. Without wind_factoring_included, flap or speed,
the YAML leaves them for you to answer.

` + caution,
		Example: `  kneeprint import table trainer-takeoff.csv > table.yaml
  kneeprint import landing trainer-landing.csv -o landing.yaml
  kneeprint import climb trainer-climb.csv`,
		Args: cobra.ExactArgs(2),
		RunE: func(cmd *cobra.Command, args []string) error {
			opts.what, opts.file = args[0], args[1]
			known := false
			for _, k := range tableimport.Kinds {
				known = known || string(k) == opts.what
			}
			if !known {
				return fmt.Errorf("import: %q: import table (the takeoff table), landing or climb, then the CSV file", opts.what)
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
	res, err := tableimport.Import(tableimport.Kind(opts.what), opts.file, data)
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
	for _, field := range res.Unanswered {
		fmt.Fprintf(e.stderr, "note: answer %s in the YAML: the CSV does not say\n", field)
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
