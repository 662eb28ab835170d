package main

import (
	"errors"
	"fmt"
	"io/fs"
	"os"
	"path/filepath"

	"github.com/spf13/cobra"

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
so you can copy and adapt them. Existing files are never
overwritten unless --force is given.

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
	for _, s := range all {
		data, err := fs.ReadFile(s.FS, s.Path)
		if err != nil {
			return err
		}
		dst := filepath.Join(opts.demoDir, filepath.Base(s.Path))
		if err := writeNew(dst, data, opts.force); err != nil {
			return dataError{err}
		}
		fmt.Fprintf(e.stdout, "wrote %s\n", dst)
	}
	return nil
}

// writeNew writes data to path, refusing to replace an existing file unless force.
func writeNew(path string, data []byte, force bool) error {
	flags := os.O_WRONLY | os.O_CREATE | os.O_EXCL
	if force {
		flags = os.O_WRONLY | os.O_CREATE | os.O_TRUNC
	}
	f, err := os.OpenFile(path, flags, 0o644)
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
