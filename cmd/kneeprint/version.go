package main

import (
	"fmt"
	"runtime"

	"github.com/spf13/cobra"
)

func newVersionCmd(e env) *cobra.Command {
	return &cobra.Command{
		Use:     "version",
		Short:   "Print kneeprint's version",
		Example: "  kneeprint version",
		Args:    cobra.NoArgs,
		RunE: func(cmd *cobra.Command, _ []string) error {
			_, err := fmt.Fprintf(e.stdout, "kneeprint %s (%s)\n", version, runtime.Version())
			return err
		},
	}
}
