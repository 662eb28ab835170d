package spec

import (
	"strconv"
	"strings"

	"gopkg.in/yaml.v3"

	"kneeprint/cmd/internal/typedtable"
	"kneeprint/perf"
)

// typedLabels pairs the nodes of an axis list with their values in SI.
func typedLabels(list *yaml.Node, si []float64) []typedtable.Label {
	if list == nil || len(list.Content) != len(si) {
		return nil
	}
	out := make([]typedtable.Label, len(si))
	for i, n := range list.Content {
		out[i] = typedLabel(n, si[i])
	}
	return out
}

func typedLabel(n *yaml.Node, si float64) typedtable.Label {
	if n == nil {
		return typedtable.Label{SI: si}
	}
	return typedtable.Label{Text: n.Value, SI: si, Line: n.Line, Column: n.Column}
}

// typedCells reads rows of number nodes (already checked by grid) as typed.
func typedCells(rows [][]*yaml.Node) [][]typedtable.Cell {
	out := make([][]typedtable.Cell, len(rows))
	for i, r := range rows {
		out[i] = make([]typedtable.Cell, len(r))
		for j, n := range r {
			v, _ := strconv.ParseFloat(strings.ReplaceAll(n.Value, "_", ""), 64)
			out[i][j] = typedtable.Cell{Text: n.Value, Value: v, Line: n.Line, Column: n.Column}
		}
	}
	return out
}

// outlierWarnings adds a warning for every cell of the typed tables that breaks the
// smooth pattern of its neighbours (typedtable.Outliers): legal, but worth a look
// against the manual.
func (d *decoder) outlierWarnings() {
	for _, t := range d.typed {
		for _, o := range typedtable.Outliers(t) {
			d.warns = append(d.warns, t.Message(o))
		}
	}
}

// Scalar is one value of a file as typed, with its place.
type Scalar struct {
	Text         string
	Line, Column int
}

// scalars records every scalar value of the tree under its field path, named as the
// loader's messages name fields: runways[0].ends[1].tora.
func scalars(n *yaml.Node, path string, out map[string]Scalar) {
	switch n.Kind {
	case yaml.ScalarNode:
		if n.Tag != "!!null" {
			out[path] = Scalar{Text: n.Value, Line: n.Line, Column: n.Column}
		}
	case yaml.MappingNode:
		for i := 0; i+1 < len(n.Content); i += 2 {
			k := n.Content[i].Value
			if path != "" {
				k = path + "." + k
			}
			scalars(n.Content[i+1], k, out)
		}
	case yaml.SequenceNode:
		for i, c := range n.Content {
			scalars(c, path+"["+strconv.Itoa(i)+"]", out)
		}
	}
}

// Residual is one manual figure of a physics calibration against the fitted model.
type Residual struct {
	Line, Column int
	Field        string  // where the figure was read: physics.calibration[0].ground_roll
	Point        string  // the point's conditions in words
	Figure       string  // "ground roll", "to 50 ft" or (landing) "from 50 ft"
	ManualM      float64 // the manual's figure
	ModelM       float64 // the fitted model's (0 when it gives none)
	Pct          float64 // (model - manual) / manual x 100
	Err          string  // why the model gave no figure, if it did not
}

// Residuals lists every figure the physics was fitted to, with the fitted model's
// answer, as validate prints them; nil when the profile has no calibration.
func (doc *Document) Residuals() []Residual {
	if doc.Aircraft == nil || doc.Aircraft.Physics == nil || doc.Aircraft.Physics.Calibration == nil {
		return nil
	}
	return residuals(doc.calib, doc.Aircraft.Physics.Calibration.Fits, "to 50 ft")
}

// LandingResiduals lists every landing figure the physics landing model was fitted
// to, with the fitted model's answer, as validate prints them (Figure "ground roll"
// or "from 50 ft"); nil when the profile has no calibrated physics landing model.
func (doc *Document) LandingResiduals() []Residual {
	a := doc.Aircraft
	if a == nil || a.Landing == nil || a.Landing.Physics == nil || a.Landing.Physics.Calibration == nil {
		return nil
	}
	return residuals(doc.landingCalib, a.Landing.Physics.Calibration.Fits, "from 50 ft")
}

// residuals pairs calibration points with their fits; total names the second figure.
func residuals(calib []calibPoint, fits []perf.PointFit, total string) []Residual {
	var out []Residual
	for i, cp := range calib {
		if i >= len(fits) {
			break
		}
		f := fits[i]
		what := cp.label
		if !cp.p.FromTable {
			what = pointWords(cp)
		}
		add := func(at *yaml.Node, fld, name string, manual, model, pct float64) {
			if at == nil {
				return
			}
			out = append(out, Residual{Line: at.Line, Column: at.Column, Field: fld, Point: what, Figure: name, ManualM: manual, ModelM: model, Pct: pct, Err: f.Err})
		}
		add(cp.grAt, cp.grFld, "ground roll", cp.p.GroundRollM, f.GroundRollM, f.GroundRollPct)
		add(cp.toAt, cp.toFld, total, cp.p.To50ftM, f.To50ftM, f.To50ftPct)
	}
	return out
}

// CheckTable reads a profile's table section given as a YAML mapping node (built by
// a reader of another format, with that format's lines and columns) with exactly
// the loader's checks. It returns the table as typed and the outlier warnings; the
// error, when not nil, is an ErrorList naming file, line, column and field.
func CheckTable(file string, n *yaml.Node) ([]*typedtable.Table, []string, error) {
	d := &decoder{file: file}
	d.table(n, 0)
	d.outlierWarnings()
	return d.typed, d.warns, d.result().Err()
}

// CheckLanding reads a profile's landing section given as a YAML mapping node (built
// by a reader of another format, with that format's lines and columns) with exactly
// the loader's checks, for a profile not known: the MTOW is taken as the largest
// mass the loader accepts, so a mass is checked against the profile's own MTOW only
// once the section is in a profile. It returns the landing tables as typed and the
// outlier warnings; the error, when not nil, is an ErrorList.
func CheckLanding(file string, n *yaml.Node) ([]*typedtable.Table, []string, error) {
	d := &decoder{file: file}
	d.landing(n, &perf.Aircraft{}, map[string]float64{}, maxMassKg, true)
	d.checkPrinted(&yaml.Node{Kind: yaml.MappingNode, Content: []*yaml.Node{{Kind: yaml.ScalarNode, Value: "landing"}, n}}, KindAircraft)
	d.outlierWarnings()
	return d.typed, d.warns, d.result().Err()
}

// CheckClimb reads a profile's climb section given as a YAML mapping node, as
// CheckLanding does (a table given without weights is taken as the MTOW's). It
// returns the rate-of-climb table as typed and the outlier warnings.
func CheckClimb(file string, n *yaml.Node) ([]*typedtable.Table, []string, error) {
	d := &decoder{file: file}
	d.climb(n, &perf.Aircraft{MTOWKg: maxMassKg}, false, true, nil)
	d.outlierWarnings()
	return d.typed, d.warns, d.result().Err()
}
