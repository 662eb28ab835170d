package spec

import (
	"strconv"
	"strings"

	"gopkg.in/yaml.v3"

	"kneeprint/cmd/internal/typedtable"
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
