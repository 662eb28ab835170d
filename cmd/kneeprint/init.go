package main

import (
	"errors"
	"fmt"
	"io/fs"
	"os"
	"path/filepath"
	"strings"

	"github.com/spf13/cobra"

	"kneeprint/cmd/internal/cards"
	"kneeprint/cmd/internal/inputs"
	"kneeprint/templates"
)

type initOptions struct {
	demoDir string
	kind    string
	file    string
	force   bool
}

func newInitCmd(e env) *cobra.Command {
	opts := &initOptions{}
	cmd := &cobra.Command{
		Use:   "init (aircraft|airfield|plan FILE | --demo DIR)",
		Short: "Write a commented starter file, or copy the demo files to a folder",
		Long: `init aircraft FILE writes a commented aircraft profile to fill in from your own flight
manual; init airfield FILE writes an airfield file to fill in from your aerodrome's
published data; init plan FILE writes a season plan. init --demo DIR copies every
embedded demo file (invented aircraft and airfields, and a plan naming them) into DIR
so you can copy and adapt them. Existing files are never overwritten unless --force
is given: without it, every target is checked before any is written; with it, a
symbolic link in DIR is replaced by the file, never followed.

` + caution,
		Example: `  kneeprint init aircraft my-trainer.yaml
  kneeprint init airfield home.yaml
  kneeprint init plan season-2027.yaml
  kneeprint init --demo ./demo-files && kneeprint cards --plan ./demo-files/demo-season.yaml`,
		RunE: func(cmd *cobra.Command, args []string) error {
			switch {
			case opts.demoDir != "" && len(args) == 0:
				return initDemoRun(e, opts)
			case opts.demoDir == "" && len(args) == 2:
				opts.kind, opts.file = args[0], args[1]
				return initStarterRun(e, opts)
			default:
				return errors.New("init takes either aircraft|airfield|plan FILE, or --demo DIR")
			}
		},
	}
	cmd.Flags().StringVar(&opts.demoDir, "demo", "", "copy the embedded demo files into this folder")
	cmd.Flags().BoolVar(&opts.force, "force", false, "overwrite existing files")
	return cmd
}

func initStarterRun(e env, opts *initOptions) error {
	var name string
	switch opts.kind {
	case "aircraft":
		name = templates.StarterAircraft
	case "airfield":
		name = templates.StarterAirfield
	case "plan":
		name = templates.StarterPlan
	default:
		return fmt.Errorf("init: %q is not a kind of starter: aircraft, airfield or plan", opts.kind)
	}
	data, err := fs.ReadFile(templates.FS, name)
	if err != nil {
		return err
	}
	if err := writeNew(opts.file, data, opts.force); err != nil {
		return dataError{err}
	}
	fmt.Fprintf(e.stdout, "wrote %s: fill it in, then run 'kneeprint validate %s'\n", opts.file, opts.file)
	return nil
}

func initDemoRun(e env, opts *initOptions) error {
	ac, af := inputs.Demo()
	if err := os.MkdirAll(opts.demoDir, 0o755); err != nil {
		return dataError{err}
	}
	all := append(ac, af...)
	all = append(all, inputs.Source{FS: templates.FS, Path: templates.DemoPlan})
	type target struct {
		dst  string
		data []byte
	}
	var targets []target
	var problems []string
	for _, s := range all {
		data, err := fs.ReadFile(s.FS, s.Path)
		if err != nil {
			return err
		}
		dst := filepath.Join(opts.demoDir, filepath.Base(s.Path))
		if err := checkTarget(dst, opts.force); err != nil {
			problems = append(problems, err.Error())
			continue
		}
		targets = append(targets, target{dst, data})
	}
	// Every target is checked before any is written: a refusal leaves DIR as it was.
	if len(problems) > 0 {
		return dataError{fmt.Errorf("%s\nnothing written", strings.Join(problems, "\n"))}
	}
	for _, t := range targets {
		if err := writeNew(t.dst, t.data, opts.force); err != nil {
			return dataError{err}
		}
		fmt.Fprintf(e.stdout, "wrote %s\n", t.dst)
	}
	return nil
}

// checkTarget says whether init may write path: a new name always; an existing one
// only with force, and then only a regular file or a symbolic link (which is
// replaced, never followed), not a folder or a special file.
func checkTarget(path string, force bool) error {
	st, err := os.Lstat(path)
	switch {
	case errors.Is(err, fs.ErrNotExist):
		return nil
	case err != nil:
		return err
	case !force:
		return fmt.Errorf("%s already exists: not overwritten (use --force to replace it)", path)
	case st.Mode().IsRegular() || st.Mode()&fs.ModeSymlink != 0:
		return nil
	}
	return fmt.Errorf("%s exists and is not a file: not replaced", path)
}

// writeNew writes data to path, refusing to replace an existing file unless force.
// Without force the file is created exclusively (an existing name, even a dangling
// symbolic link, is refused); with force it is written beside and renamed into
// place, so that a symbolic link at path is replaced, never followed out of the
// folder.
func writeNew(path string, data []byte, force bool) error {
	if err := checkTarget(path, force); err != nil {
		return err
	}
	if force {
		return cards.WriteAtomic(path, data)
	}
	f, err := os.OpenFile(path, os.O_WRONLY|os.O_CREATE|os.O_EXCL, 0o644)
	if err != nil {
		if errors.Is(err, fs.ErrExist) {
			return fmt.Errorf("%s already exists: not overwritten (use --force to replace it)", path)
		}
		return err
	}
	if _, err := f.Write(data); err != nil {
		f.Close()
		return err
	}
	return f.Close()
}
