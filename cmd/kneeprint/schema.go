package main

import (
	"fmt"

	"github.com/spf13/cobra"

	"kneeprint/cmd/internal/schema"
)

func newSchemaCmd(e env) *cobra.Command {
	cmd := &cobra.Command{
		Use:   "schema aircraft|airfield|card-template|plan",
		Short: "Print the JSON Schema of a kind of file, for editors",
		Long: `schema prints a JSON Schema (draft 2020-12) of a kind of kneeprint file: every key
with its description, quantities as text whose pattern requires a number and one of
the units kneeprint accepts. A YAML language server (in many editors) reads it
through the modeline at the top of a starter file,

  ` + schema.Modeline("aircraft") + `

and then checks and completes keys as you type. kneeprint init writes the schema file
next to the starter; to write it yourself, or refresh it after an update:

  kneeprint schema aircraft > ` + schema.FileName("aircraft") + `

The schema helps while typing; kneeprint validate stays the judge (ranges, a table
rising with temperature and altitude, one value against another).

` + caution,
		Example: `  kneeprint schema aircraft > ` + schema.FileName("aircraft") + `
  kneeprint schema airfield > ` + schema.FileName("airfield"),
		Args: cobra.ExactArgs(1),
		RunE: func(cmd *cobra.Command, args []string) error {
			b, err := schema.JSON(args[0])
			if err != nil {
				return fmt.Errorf("schema: %w", err)
			}
			_, err = e.stdout.Write(b)
			return err
		},
		ValidArgs: schema.Kinds(),
	}
	return cmd
}
