// Package inputs finds kneeprint's input files: on disk, or embedded in the binary
// (the invented demo), and loads them with spec.
package inputs

import (
	"fmt"
	"io/fs"
	"os"
	"path"
	"path/filepath"
	"sort"
	"strings"

	"kneeprint/airfields"
	"kneeprint/cmd/internal/spec"
	"kneeprint/perf"
	"kneeprint/templates"
)

// DemoPrefix names an embedded demo file on the command line: demo:wrenmoor.
const DemoPrefix = "demo:"

// Source is one input file: on disk (FS nil) or embedded.
type Source struct {
	Name string // what messages call it
	FS   fs.FS
	Path string
}

// Load reads and parses the source.
func (s Source) Load() (*spec.Document, error) {
	if s.FS == nil {
		return spec.LoadFile(s.Path)
	}
	return spec.Load(s.FS, s.Path)
}

// File is a source on disk.
func File(p string) Source { return Source{Name: p, Path: p} }

// Demo lists the embedded demo files: aircraft, then airfields, each sorted by path.
func Demo() (aircraft, fields []Source) {
	return list(templates.FS, templates.DemoAircraftDir, "templates"), list(airfields.FS, ".", "airfields")
}

func list(fsys fs.FS, dir, prefix string) []Source {
	entries, err := fs.ReadDir(fsys, dir)
	if err != nil {
		panic("kneeprint: embedded demo folder missing: " + err.Error()) // a build defect
	}
	var out []Source
	for _, e := range entries {
		if !strings.HasSuffix(e.Name(), ".yaml") {
			continue
		}
		p := path.Join(dir, e.Name())
		out = append(out, Source{Name: path.Join(prefix, p), FS: fsys, Path: p})
	}
	sort.Slice(out, func(i, j int) bool { return out[i].Path < out[j].Path })
	return out
}

// Resolve turns a command-line argument into a source: "demo:NAME" is the embedded
// demo file NAME(.yaml), anything else a path on disk.
func Resolve(arg string) (Source, error) {
	name, ok := strings.CutPrefix(arg, DemoPrefix)
	if !ok {
		return File(arg), nil
	}
	ac, af := Demo()
	var names []string
	for _, s := range append(ac, af...) {
		base := strings.TrimSuffix(path.Base(s.Path), ".yaml")
		if base == strings.TrimSuffix(name, ".yaml") {
			return s, nil
		}
		names = append(names, DemoPrefix+base)
	}
	return Source{}, fmt.Errorf("%q is not an embedded demo file; there are: %s", arg, strings.Join(names, ", "))
}

// Aircraft loads an aircraft profile from a command-line argument.
func Aircraft(arg string) (*perf.Aircraft, *spec.Document, error) {
	doc, err := load(arg, spec.KindAircraft)
	if err != nil {
		return nil, doc, err
	}
	return doc.Aircraft, doc, nil
}

// Airfield loads an airfield from a command-line argument.
func Airfield(arg string) (*perf.Airfield, *spec.Document, error) {
	doc, err := load(arg, spec.KindAirfield)
	if err != nil {
		return nil, doc, err
	}
	return doc.Airfield, doc, nil
}

func load(arg string, kind spec.Kind) (*spec.Document, error) {
	src, err := Resolve(arg)
	if err != nil {
		return nil, err
	}
	doc, err := src.Load()
	if err != nil {
		return doc, err
	}
	if doc.Kind != kind {
		return doc, spec.ErrorList{{File: src.Name, Field: "kind", Msg: fmt.Sprintf("this is an %s file, an %s file is needed here", doc.Kind, kind)}}
	}
	return doc, nil
}

// In resolves a file argument written in a file at dir (a plan): relative paths are
// taken from dir; demo:NAME and absolute paths are kept.
func In(dir, arg string) string {
	if strings.HasPrefix(arg, DemoPrefix) || filepath.IsAbs(arg) || dir == "" {
		return arg
	}
	return filepath.Join(dir, arg)
}

// Template loads a card template: a preset name (a5, half-letter, 5x8, a5-one-page) or a file.
func Template(arg string) (*spec.CardTemplate, error) {
	var doc *spec.Document
	var err error
	preset := templates.CardsDir + "/" + arg + ".yaml"
	if _, statErr := fs.Stat(templates.FS, preset); statErr == nil && !strings.ContainsAny(arg, `/\.`) {
		doc, err = spec.Load(templates.FS, preset)
	} else {
		if _, statErr := os.Stat(arg); statErr != nil {
			return nil, fmt.Errorf("template %q: not a preset (%s) nor a readable file", arg, strings.Join(Presets(), ", "))
		}
		doc, err = spec.LoadFile(arg)
	}
	if err != nil {
		return nil, err
	}
	if doc.Kind != spec.KindCardTemplate {
		return nil, spec.ErrorList{{File: arg, Field: "kind", Msg: fmt.Sprintf("this is an %s file, a card-template file is needed here", doc.Kind)}}
	}
	return doc.Template, nil
}

// Presets lists the embedded card presets.
func Presets() []string {
	var out []string
	for _, s := range list(templates.FS, templates.CardsDir, "templates") {
		out = append(out, strings.TrimSuffix(path.Base(s.Path), ".yaml"))
	}
	return out
}
