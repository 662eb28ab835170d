package main

import (
	"errors"
	"fmt"
	"io"
	"time"

	"github.com/spf13/cobra"
)

// version is set at build time with -ldflags "-X main.version=..."; cards print it.
var version = "0.4.0-dev"

// caution is printed by --help, the README and every card (see the domain notes).
const caution = `CAUTION: kneeprint gives planning figures. It is not a substitute for the approved
flight manual: verify against it. The pilot in command decides. Figures assume the
aircraft, engine and technique of the profile; a poorly maintained aircraft, soft or
contaminated ground or a rushed takeoff needs more. Local regulations and licensed
practice take precedence.`

// env is what a command run may touch: its output streams and the clock.
type env struct {
	stdout, stderr io.Writer
	now            func() time.Time
}

func run(args []string, e env) int {
	root := newRootCmd(e)
	root.SetArgs(args)
	err := root.Execute()
	if err == nil {
		return exitOK
	}
	var de dataError
	var ce changedError
	switch {
	case errors.As(err, &ce):
		return exitFailure
	case errors.As(err, &de):
		fmt.Fprintln(e.stderr, "kneeprint:", err)
		return exitFailure
	default:
		fmt.Fprintln(e.stderr, "kneeprint:", err)
		fmt.Fprintln(e.stderr, "run 'kneeprint --help' for usage")
		return exitUsage
	}
}

// changedError reports "something changed" from diff without printing anything more.
type changedError struct{}

func (changedError) Error() string { return "changes found" }

func newRootCmd(e env) *cobra.Command {
	root := &cobra.Command{
		Use:   "kneeprint",
		Short: "Takeoff-distance kneeboard cards for light piston aircraft",
		Long: `kneeprint reads an aircraft performance profile and an airfield's runway data,
computes takeoff distances over temperature x wind x weight for every runway end,
applies the published corrections and safety factors, and prints kneeboard cards.

` + caution,
		Example: `  kneeprint validate --demo
  kneeprint init --demo ./my-files
  kneeprint validate my-aircraft.yaml my-field.yaml`,
		SilenceUsage:  true,
		SilenceErrors: true,
	}
	root.SetOut(e.stdout)
	root.SetErr(e.stderr)
	root.AddCommand(
		newValidateCmd(e),
		newInitCmd(e),
		newCheckCmd(e),
		newGridCmd(e),
		newCardsCmd(e),
		newStaleCmd(e),
		newDiffCmd(e),
		newProofCmd(e),
		newSchemaCmd(e),
		newImportCmd(e),
		newVersionCmd(e),
	)
	return root
}
