// Package tableimport turns a flight manual's takeoff table typed in a spreadsheet
// and saved as CSV into the table section of an aircraft profile, with the loader's
// own checks (spec.CheckTable) reported at the CSV's lines and columns.
//
// The CSV layout: optional settings first, then one block per weight:
//
//	distance_unit,ft
//	wind_factoring_included,false
//	weight,1000 kg
//	ground_roll,-10 C,0 C,10 C
//	0 ft,680,735,795
//	2000 ft,790,855,925
//	to_50ft,-10 C,0 C,10 C
//	0 ft,1235,1335,1440
//	2000 ft,1470,1590,1710
//	weight,900 kg
//	...
//
// A `ground_roll` or `to_50ft` line heads its rows with the temperatures; each row
// starts with its pressure altitude. Every block has the same temperatures and
// pressure altitudes in the same order. Blank lines and lines starting with # are
// skipped; commas, semicolons or tabs separate the cells (the first line decides);
// empty cells at the end of a line (a spreadsheet pads rows) are ignored.
package tableimport

import (
	"bytes"
	"encoding/csv"
	"errors"
	"fmt"
	"io"
	"strconv"
	"strings"

	"gopkg.in/yaml.v3"

	"kneeprint/cmd/internal/spec"
	"kneeprint/cmd/internal/typedtable"
)

// Result is an imported table.
type Result struct {
	YAML     []byte              // the table section, to paste into a profile
	Tables   []*typedtable.Table // the table as read, ground roll and distance to 50 ft
	Warnings []string            // cells that break the smooth pattern of their neighbours
	// WindFactoringGiven is false when the CSV does not answer
	// wind_factoring_included: the YAML then leaves it for the pilot to answer.
	WindFactoringGiven bool
}

// MaxBytes bounds a CSV file, as spec.MaxFileBytes bounds a profile.
const MaxBytes = spec.MaxFileBytes

// cell is one CSV field with its place.
type cell struct {
	text      string
	line, col int
}

// Import reads a CSV table. name is used in messages. The error, when not nil, is a
// spec.ErrorList with every problem found.
func Import(name string, data []byte) (*Result, error) {
	if len(data) > MaxBytes {
		return nil, spec.ErrorList{{File: name, Msg: fmt.Sprintf("file is %d bytes, more than the %d bytes accepted", len(data), MaxBytes)}}
	}
	data = bytes.TrimPrefix(data, []byte("\xef\xbb\xbf")) // a spreadsheet's byte-order mark
	lines, err := readCSV(name, data)
	if err != nil {
		return nil, err
	}
	b := &builder{file: name}
	b.parse(lines)
	if len(b.errs) > 0 {
		return nil, b.errs
	}
	node, windGiven := b.node()
	tables, warns, err := spec.CheckTable(name, node)
	if err != nil {
		return nil, err
	}
	return &Result{YAML: b.yaml(name, windGiven), Tables: tables, Warnings: warns, WindFactoringGiven: windGiven}, nil
}

// readCSV splits the file into lines of trimmed cells with their places, skipping
// blank and comment lines and empty trailing cells.
func readCSV(name string, data []byte) ([][]cell, error) {
	r := csv.NewReader(bytes.NewReader(data))
	r.FieldsPerRecord = -1
	r.Comment = '#'
	r.TrimLeadingSpace = true
	first := "" // the first line that is neither blank nor a comment
	for _, l := range strings.Split(string(data), "\n") {
		if t := strings.TrimSpace(l); t != "" && !strings.HasPrefix(t, "#") {
			first = l
			break
		}
	}
	switch {
	case strings.Contains(first, ";") && !strings.Contains(first, ","):
		r.Comma = ';'
	case strings.Contains(first, "\t") && !strings.Contains(first, ","):
		r.Comma = '\t'
	}
	var out [][]cell
	for {
		rec, err := r.Read()
		if err == io.EOF {
			break
		}
		if err != nil {
			var pe *csv.ParseError
			if errors.As(err, &pe) {
				return nil, spec.ErrorList{{File: name, Line: pe.Line, Column: pe.Column, Msg: "not valid CSV: " + pe.Err.Error()}}
			}
			return nil, spec.ErrorList{{File: name, Msg: err.Error()}}
		}
		var cs []cell
		for i, f := range rec {
			line, col := r.FieldPos(i)
			cs = append(cs, cell{strings.TrimSpace(f), line, col})
		}
		for len(cs) > 0 && cs[len(cs)-1].text == "" {
			cs = cs[:len(cs)-1]
		}
		if len(cs) > 0 {
			out = append(out, cs)
		}
	}
	return out, nil
}

// builder collects the CSV's settings and blocks.
type builder struct {
	file          string
	errs          spec.ErrorList
	distanceUnit  *cell
	windFactoring *cell
	alts          []cell // from the first block's first rows
	firstKey      string // the quantity whose rows came first
	temps         []cell // from the first block's first header
	blocks        []block
}

type block struct {
	weight cell
	rows   map[string][][]cell // "ground_roll", "to_50ft": rows of figures
}

func (b *builder) errorf(c cell, field, format string, args ...any) {
	b.errs = append(b.errs, &spec.FieldError{File: b.file, Line: c.line, Column: c.col, Field: field, Msg: fmt.Sprintf(format, args...)})
}

func (b *builder) parse(lines [][]cell) {
	var cur *block
	key := ""      // the quantity whose rows follow
	var keyAt cell // its header
	row := 0       // rows read under the current header
	for _, l := range lines {
		head := strings.ToLower(l[0].text)
		switch head {
		case "distance_unit", "wind_factoring_included":
			if cur != nil {
				b.errorf(l[0], head, "settings come before the first weight block")
				continue
			}
			if len(l) != 2 {
				b.errorf(l[0], head, "write %s and its value in the next cell, nothing more", head)
				continue
			}
			if head == "distance_unit" {
				b.distanceUnit = &l[1]
			} else {
				b.windFactoring = &l[1]
			}
		case "weight":
			if len(l) != 2 {
				b.errorf(l[0], "weight", "write weight and its value with its unit in the next cell, e.g. weight,1000 kg")
				continue
			}
			b.endBlock(cur, key, keyAt, row)
			b.blocks = append(b.blocks, block{weight: l[1], rows: map[string][][]cell{}})
			cur, key, row = &b.blocks[len(b.blocks)-1], "", 0
		case "ground_roll", "to_50ft":
			if cur == nil {
				b.errorf(l[0], head, "a weight line (weight,1000 kg) comes before the figures of its block")
				continue
			}
			if _, dup := cur.rows[head]; dup {
				b.errorf(l[0], head, "this block already has its %s rows", head)
				continue
			}
			b.endRows(cur, key, keyAt, row)
			temps := l[1:]
			if len(temps) == 0 {
				b.errorf(l[0], head, "write the temperatures after %s, one per cell, e.g. %s,-10 C,0 C,10 C", head, head)
			}
			if b.temps == nil {
				b.temps = temps
			} else if !sameTexts(b.temps, temps) {
				b.errorf(l[0], head, "temperatures %s differ from the first block's %s: every block has the same columns", texts(temps), texts(b.temps))
			}
			cur.rows[head] = [][]cell{}
			key, keyAt, row = head, l[0], 0
			if b.firstKey == "" {
				b.firstKey = head
			}
		default:
			if cur == nil || key == "" {
				b.errorf(l[0], "", "%q: expected distance_unit, wind_factoring_included, weight, ground_roll or to_50ft here", l[0].text)
				continue
			}
			if len(b.blocks) == 1 && key == b.firstKey {
				b.alts = append(b.alts, l[0])
			} else if row >= len(b.alts) || b.alts[row].text != l[0].text {
				want := "no more rows"
				if row < len(b.alts) {
					want = fmt.Sprintf("%q", b.alts[row].text)
				}
				b.errorf(l[0], key, "pressure altitude %q: the first block's rows give %s here: every block has the same rows", l[0].text, want)
			}
			cur.rows[key] = append(cur.rows[key], l[1:])
			row++
		}
	}
	b.endBlock(cur, key, keyAt, row)
	if len(b.blocks) == 0 && len(b.errs) == 0 {
		b.errs = append(b.errs, &spec.FieldError{File: b.file, Msg: "no weight block found: a block starts with a line weight,1000 kg"})
	}
}

// endRows checks that the rows under a header (at) are all there.
func (b *builder) endRows(cur *block, key string, at cell, row int) {
	if cur == nil || key == "" {
		return
	}
	if (len(b.blocks) > 1 || key != b.firstKey) && row < len(b.alts) {
		b.errorf(at, key, "%d row(s) under this line, the first block has %d pressure altitudes (%s): every block has the same rows", row, len(b.alts), texts(b.alts))
	}
}

func (b *builder) endBlock(cur *block, key string, keyAt cell, row int) {
	if cur == nil {
		return
	}
	b.endRows(cur, key, keyAt, row)
	for _, k := range []string{"ground_roll", "to_50ft"} {
		if _, ok := cur.rows[k]; !ok {
			b.errorf(cur.weight, k, "the block of %s has no %s rows", cur.weight.text, k)
		}
	}
}

func sameTexts(a, b []cell) bool {
	if len(a) != len(b) {
		return false
	}
	for i := range a {
		if a[i].text != b[i].text {
			return false
		}
	}
	return true
}

func texts(cs []cell) string {
	var s []string
	for _, c := range cs {
		s = append(s, c.text)
	}
	return strings.Join(s, ", ")
}

// node builds the table section as a YAML tree carrying the CSV's lines and columns,
// for the loader's checks. An unanswered wind factoring question is checked as false
// (the conservative answer) and left for the pilot in the YAML.
func (b *builder) node() (*yaml.Node, bool) {
	scalar := func(c cell, tag string) *yaml.Node {
		return &yaml.Node{Kind: yaml.ScalarNode, Tag: tag, Value: c.text, Line: c.line, Column: c.col}
	}
	str := func(c cell) *yaml.Node { return scalar(c, "!!str") }
	num := func(c cell) *yaml.Node {
		if _, err := strconv.ParseFloat(c.text, 64); err != nil || c.text == "" {
			return str(c) // the loader says it is not a plain number, at its place
		}
		if _, err := strconv.ParseInt(c.text, 10, 64); err == nil {
			return scalar(c, "!!int")
		}
		return scalar(c, "!!float")
	}
	seq := func(items []*yaml.Node, at cell) *yaml.Node {
		return &yaml.Node{Kind: yaml.SequenceNode, Content: items, Line: at.line, Column: at.col}
	}
	mapping := func(at cell, kv ...any) *yaml.Node {
		n := &yaml.Node{Kind: yaml.MappingNode, Line: at.line, Column: at.col}
		for i := 0; i+1 < len(kv); i += 2 {
			n.Content = append(n.Content, &yaml.Node{Kind: yaml.ScalarNode, Tag: "!!str", Value: kv[i].(string), Line: at.line, Column: at.col}, kv[i+1].(*yaml.Node))
		}
		return n
	}
	origin := cell{line: 1, col: 1}
	var kv []any
	windGiven := b.windFactoring != nil
	if windGiven {
		c := *b.windFactoring
		tag := "!!str"
		if c.text == "true" || c.text == "false" {
			tag = "!!bool"
		}
		kv = append(kv, "wind_factoring_included", scalar(c, tag))
	} else {
		kv = append(kv, "wind_factoring_included", scalar(cell{text: "false", line: 1, col: 1}, "!!bool"))
	}
	if b.distanceUnit != nil {
		kv = append(kv, "distance_unit", str(*b.distanceUnit))
	}
	var alts, temps []*yaml.Node
	for _, c := range b.alts {
		alts = append(alts, str(c))
	}
	for _, c := range b.temps {
		temps = append(temps, str(c))
	}
	at := origin
	if len(b.alts) > 0 {
		at = b.alts[0]
	}
	kv = append(kv, "pressure_altitudes", seq(alts, at))
	at = origin
	if len(b.temps) > 0 {
		at = b.temps[0]
	}
	kv = append(kv, "temperatures", seq(temps, at))
	var blocks []*yaml.Node
	for _, bl := range b.blocks {
		var parts []any
		parts = append(parts, "weight", str(bl.weight))
		for _, k := range []string{"ground_roll", "to_50ft"} {
			var rows []*yaml.Node
			for _, r := range bl.rows[k] {
				var cs []*yaml.Node
				for _, c := range r {
					cs = append(cs, num(c))
				}
				rowAt := bl.weight
				if len(r) > 0 {
					rowAt = r[0]
				}
				rows = append(rows, seq(cs, rowAt))
			}
			parts = append(parts, k, seq(rows, bl.weight))
		}
		blocks = append(blocks, mapping(bl.weight, parts...))
	}
	kv = append(kv, "weights", seq(blocks, origin))
	return mapping(origin, kv...), windGiven
}

// yaml writes the table section as a profile holds it, one row per line with its
// pressure altitude as a comment, ready to paste.
func (b *builder) yaml(name string, windGiven bool) []byte {
	var w bytes.Buffer
	q := func(s string) string {
		out, err := yaml.Marshal(s)
		if err != nil {
			return strconv.Quote(s)
		}
		return strings.TrimSuffix(string(out), "\n")
	}
	list := func(cs []cell) string {
		var s []string
		for _, c := range cs {
			s = append(s, q(c.text))
		}
		return "[" + strings.Join(s, ", ") + "]"
	}
	fmt.Fprintf(&w, "# The takeoff table imported from %s by kneeprint import table:\n", name)
	fmt.Fprintf(&w, "# paste it at the top level of the aircraft profile, then run kneeprint validate.\n")
	fmt.Fprintf(&w, "table:\n")
	if windGiven {
		fmt.Fprintf(&w, "  wind_factoring_included: %s\n", b.windFactoring.text)
	} else {
		fmt.Fprintf(&w, "  # Does the manual's wind correction already include the certification wind factors\n")
		fmt.Fprintf(&w, "  # (only part of a headwind credited, more than all of a tailwind charged)? The chart\n")
		fmt.Fprintf(&w, "  # or its notes say so. No default: answer true or false (false when in doubt).\n")
		fmt.Fprintf(&w, "  wind_factoring_included:\n")
	}
	fmt.Fprintf(&w, "  distance_unit: %s\n", q(b.distanceUnit.text))
	fmt.Fprintf(&w, "  pressure_altitudes: %s\n", list(b.alts))
	fmt.Fprintf(&w, "  temperatures: %s\n", list(b.temps))
	fmt.Fprintf(&w, "  weights:\n")
	for _, bl := range b.blocks {
		fmt.Fprintf(&w, "    - weight: %s\n", q(bl.weight.text))
		for _, k := range []string{"ground_roll", "to_50ft"} {
			fmt.Fprintf(&w, "      %s:\n", k)
			for i, r := range bl.rows[k] {
				var s []string
				for _, c := range r {
					s = append(s, c.text)
				}
				fmt.Fprintf(&w, "        - [%s]  # %s\n", strings.Join(s, ", "), b.alts[i].text)
			}
		}
	}
	fmt.Fprintf(&w, "  # corrections: the manual's notes (headwind, tailwind, grass), as kneeprint init aircraft shows\n")
	return w.Bytes()
}
