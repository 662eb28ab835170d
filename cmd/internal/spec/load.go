package spec

import (
	"fmt"
	"io"
	"io/fs"

	"gopkg.in/yaml.v3"

	"kneeprint/cmd/internal/files"
	"kneeprint/cmd/internal/typedtable"
	"kneeprint/perf"
)

// Kind is what a kneeprint file declares itself to be with its top-level kind: key.
type Kind string

// The kinds of kneeprint file.
const (
	KindAircraft Kind = "aircraft"
	KindAirfield Kind = "airfield"
)

// Document is one file read: what it is, what it holds, the defaults applied and the
// warnings raised. Exactly one of Aircraft and Airfield is set when Err is nil.
type Document struct {
	Path     string
	Kind     Kind
	Aircraft *perf.Aircraft
	Airfield *perf.Airfield
	Template *CardTemplate
	Plan     *Plan
	Defaults []string // defaults applied, one sentence each
	Warnings []string // things that are legal but look wrong

	// Tables are an aircraft's tables as typed, one per quantity (ground roll,
	// distance to 50 ft), blocks in file order, each cell with its line: for the
	// proof sheet and the outlier check. Set when the table's shape could be read.
	Tables []*typedtable.Table
	// Scalars are the file's values as typed, by field path (runways[0].ends[1].tora),
	// for the proof sheet's "as typed" columns.
	Scalars map[string]Scalar

	calib []calibPoint // an aircraft's calibration points as read, for the residual table
	// landingCalib is the same for its landing fit.
	landingCalib []calibPoint
}

// Parse reads one kneeprint file's bytes. name is used in messages. The error, when
// not nil, is an ErrorList with every problem found.
func Parse(name string, data []byte) (*Document, error) {
	d := &decoder{file: name}
	doc := &Document{Path: name}
	root := d.parseRoot(data)
	if root != nil {
		doc.Scalars = map[string]Scalar{}
		scalars(root, "", doc.Scalars)
		m := d.mapping(root, "")
		kindNode := m.get("kind", false)
		switch {
		case root.Kind != yaml.MappingNode:
			// reported by mapping
		case kindNode == nil:
			d.errorf(root, "kind", "missing required field \"kind\": say what this file is (kind: aircraft, airfield, card-template or plan)")
		case kindNode.Value == string(KindAircraft):
			doc.Kind = KindAircraft
			doc.Aircraft = d.aircraft(m)
			d.checkPrinted(root, KindAircraft)
			d.outlierWarnings()
		case kindNode.Value == string(KindAirfield):
			doc.Kind = KindAirfield
			doc.Airfield = d.airfield(m)
			d.checkPrinted(root, KindAirfield)
		case kindNode.Value == string(KindPlan):
			doc.Kind = KindPlan
			m.get("kind", true)
			doc.Plan = d.plan(m)
		case kindNode.Value == string(KindCardTemplate):
			doc.Kind = KindCardTemplate
			m.get("kind", true)
			doc.Template = d.cardTemplate(m)
		default:
			d.errorf(kindNode, "kind", "%q is not a kind of kneeprint file: aircraft, airfield, card-template or plan", kindNode.Value)
		}
	}
	doc.Defaults, doc.Warnings = d.notes, d.warns
	doc.calib = d.calib
	doc.Tables = d.typed
	doc.landingCalib = d.landingCalib
	if err := d.result().Err(); err != nil {
		return doc, err
	}
	return doc, nil
}

// Load reads and parses one file from fsys (os.DirFS or an embed.FS), refusing files
// larger than MaxFileBytes before reading them whole.
func Load(fsys fs.FS, path string) (*Document, error) {
	f, err := fsys.Open(path)
	if err != nil {
		return nil, fmt.Errorf("%s: %w", path, err)
	}
	defer f.Close()
	data, err := io.ReadAll(io.LimitReader(f, MaxFileBytes+1))
	if err != nil {
		return nil, fmt.Errorf("%s: %w", path, err)
	}
	return Parse(path, data)
}

// LoadFile reads a file by its operating-system path. Anything but a regular file (a
// named pipe, a device, a folder) is refused without being opened for reading.
func LoadFile(path string) (*Document, error) {
	f, err := files.OpenRegular(path)
	if err != nil {
		return nil, err
	}
	defer f.Close()
	data, err := io.ReadAll(io.LimitReader(f, MaxFileBytes+1))
	if err != nil {
		return nil, fmt.Errorf("%s: %w", path, err)
	}
	return Parse(path, data)
}

// LoadAircraft reads a file that must be an aircraft profile.
func LoadAircraft(fsys fs.FS, path string) (*Document, error) {
	return loadKind(fsys, path, KindAircraft)
}

// LoadAirfield reads a file that must be an airfield.
func LoadAirfield(fsys fs.FS, path string) (*Document, error) {
	return loadKind(fsys, path, KindAirfield)
}

func loadKind(fsys fs.FS, path string, want Kind) (*Document, error) {
	var doc *Document
	var err error
	if fsys == nil {
		doc, err = LoadFile(path)
	} else {
		doc, err = Load(fsys, path)
	}
	if err != nil {
		return doc, err
	}
	if doc.Kind != want {
		return doc, ErrorList{{File: path, Field: "kind", Msg: fmt.Sprintf("this is an %s file, an %s file is needed here", doc.Kind, want)}}
	}
	return doc, nil
}
