package main

import (
	"io/fs"
	"path"
	"sort"

	"kneeprint/airfields"
	"kneeprint/cmd/internal/spec"
	"kneeprint/templates"
)

// source is one input file: on disk (fsys nil) or embedded.
type source struct {
	name string // what messages call it
	fsys fs.FS
	path string
}

func (s source) load() (*spec.Document, error) {
	if s.fsys == nil {
		return spec.LoadFile(s.path)
	}
	doc, err := spec.Load(s.fsys, s.path)
	return doc, err
}

func fileSource(p string) source { return source{name: p, path: p} }

// demoSources lists the embedded demo files: aircraft first, then airfields.
func demoSources() (aircraft, fields []source) {
	list := func(fsys fs.FS, dir, prefix string) []source {
		entries, err := fs.ReadDir(fsys, dir)
		if err != nil {
			panic("kneeprint: embedded demo folder missing: " + err.Error()) // a build defect
		}
		var out []source
		for _, e := range entries {
			p := path.Join(dir, e.Name())
			out = append(out, source{name: path.Join(prefix, p), fsys: fsys, path: p})
		}
		sort.Slice(out, func(i, j int) bool { return out[i].path < out[j].path })
		return out
	}
	return list(templates.FS, templates.DemoAircraftDir, "templates"), list(airfields.FS, ".", "airfields")
}
