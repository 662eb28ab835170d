// Package tableimport turns a flight manual's table typed in a spreadsheet and saved
// as CSV into a section of an aircraft profile, with the loader's own checks
// (spec.CheckTable, spec.CheckLanding, spec.CheckClimb) reported at the CSV's lines
// and columns. Three kinds of table are read (Kind): the takeoff table, the landing
// table and the rate-of-climb table.
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
// A quantity line (`ground_roll`, `to_50ft`; for a landing table `ground_roll`,
// `from_50ft`; for a climb table `rate_of_climb`) heads its rows with the
// temperatures; each row starts with its pressure altitude. Every block has the same
// temperatures and pressure altitudes in the same order. A climb table may leave out
// the weight lines: it is then one table, for the MTOW. Blank lines and lines
// starting with # are skipped; commas, semicolons or tabs separate the cells (the
// first line decides); empty cells at the end of a line (a spreadsheet pads rows) are
// ignored.
package tableimport

import (
	"bytes"
	"encoding/csv"
	"errors"
	"fmt"
	"io"
	"strconv"
	"strings"
	"unicode"

	"gopkg.in/yaml.v3"

	"kneeprint/cmd/internal/spec"
	"kneeprint/cmd/internal/typedtable"
)

// Kind is the kind of table a CSV holds, named as the import command names it.
type Kind string

// The kinds of table.
const (
	Takeoff Kind = "table"   // the takeoff table: the profile's table section
	Landing Kind = "landing" // the landing table: the profile's landing section
	Climb   Kind = "climb"   // the rate-of-climb table: the profile's climb section
)

// Kinds lists the kinds of table, in the order the command's help names them.
var Kinds = []Kind{Takeoff, Landing, Climb}

// setting is a line the CSV may give before its first block.
type setting struct {
	key string
	// pending, when not empty, makes the setting one the pilot answers when the CSV
	// does not: the YAML leaves it empty with this comment above it, and the check
	// reads checkAs in its place (a value the loader accepts, which no check of the
	// figures depends on).
	pending []string
	checkAs string
	tag     string // the YAML tag checkAs is read with
}

// kindSpec is what a kind of table looks like in a CSV and in a profile.
type kindSpec struct {
	what       string   // in words: "takeoff table"
	quantities []string // the keys of a block's rows, in the order written
	settings   []setting
	// noWeights allows a table without weight lines: one table for the MTOW.
	noWeights bool
	// section is the path of the table in a profile, as the loader's messages name
	// it.
	section string
}

var windPending = []string{
	"Does the manual's wind correction already include the certification wind factors",
	"(only part of a headwind credited, more than all of a tailwind charged)? The chart",
	"or its notes say so. No default: answer true or false (false when in doubt).",
}

var kinds = map[Kind]kindSpec{
	Takeoff: {what: "takeoff table", quantities: []string{"ground_roll", "to_50ft"}, section: "table",
		settings: []setting{{key: "distance_unit"}, {key: "wind_factoring_included", pending: windPending, checkAs: "false", tag: "!!bool"}}},
	Landing: {what: "landing table", quantities: []string{"ground_roll", "from_50ft"}, section: "landing.table",
		settings: []setting{{key: "flap", pending: []string{"The landing flap, as the manual names it (\"30°\", \"full\"): no default, answer it."}, checkAs: "to answer", tag: "!!str"},
			{key: "distance_unit"}, {key: "wind_factoring_included", pending: windPending, checkAs: "false", tag: "!!bool"}}},
	Climb: {what: "rate-of-climb table", quantities: []string{"rate_of_climb"}, section: "climb", noWeights: true,
		settings: []setting{{key: "speed", pending: []string{"The climb speed the manual's rates are for (IAS, e.g. 70 kt): no default, answer it."}, checkAs: "70 kt", tag: "!!str"},
			{key: "rate_unit"}}},
}

// Result is an imported table.
type Result struct {
	YAML     []byte              // the profile's section, to paste into a profile
	Tables   []*typedtable.Table // the table as read, one per quantity
	Warnings []string            // cells that break the smooth pattern of their neighbours
	// Unanswered lists the settings the CSV does not give that the pilot must answer
	// in the YAML, as the loader names them (table.wind_factoring_included,
	// landing.flap, climb.speed); the YAML leaves them empty.
	Unanswered []string
}

// MaxBytes bounds a CSV file, as spec.MaxFileBytes bounds a profile.
const MaxBytes = spec.MaxFileBytes

// cell is one CSV field with its place.
type cell struct {
	text      string
	line, col int
}

// Import reads a CSV table of kind k. name is used in messages. The error, when not
// nil, is a spec.ErrorList with every problem found.
func Import(k Kind, name string, data []byte) (*Result, error) {
	ks, ok := kinds[k]
	if !ok {
		return nil, fmt.Errorf("tableimport: unknown kind of table %q", k)
	}
	if len(data) > MaxBytes {
		return nil, spec.ErrorList{{File: name, Msg: fmt.Sprintf("file is %d bytes, more than the %d bytes accepted", len(data), MaxBytes)}}
	}
	data = bytes.TrimPrefix(data, []byte("\xef\xbb\xbf")) // a spreadsheet's byte-order mark
	lines, err := readCSV(name, data)
	if err != nil {
		return nil, err
	}
	b := &builder{file: name, kind: ks, settings: map[string]*cell{}}
	b.parse(lines)
	if len(b.errs) > 0 {
		return nil, b.errs
	}
	var tables []*typedtable.Table
	var warns []string
	switch k {
	case Takeoff:
		tables, warns, err = spec.CheckTable(name, b.tableNode())
	case Landing:
		tables, warns, err = spec.CheckLanding(name, b.landingNode())
	case Climb:
		tables, warns, err = spec.CheckClimb(name, b.climbNode())
	}
	if err != nil {
		return nil, err
	}
	return &Result{YAML: b.yaml(k, name), Tables: tables, Warnings: warns, Unanswered: b.unanswered()}, nil
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
	file     string
	kind     kindSpec
	errs     spec.ErrorList
	settings map[string]*cell // by key, as given
	alts     []cell           // from the first block's first rows
	firstKey string           // the quantity whose rows came first
	temps    []cell           // from the first block's first header
	blocks   []block
	single   bool // a climb table without weight lines: one block, for the MTOW
}

type block struct {
	weight cell                // its weight line's value; empty in a single table
	rows   map[string][][]cell // by quantity key: rows of figures
}

func (b *builder) errorf(c cell, field, format string, args ...any) {
	b.errs = append(b.errs, &spec.FieldError{File: b.file, Line: c.line, Column: c.col, Field: field, Msg: fmt.Sprintf(format, args...)})
}

func (b *builder) isSetting(key string) bool {
	for _, s := range b.kind.settings {
		if s.key == key {
			return true
		}
	}
	return false
}

func (b *builder) isQuantity(key string) bool {
	for _, q := range b.kind.quantities {
		if q == key {
			return true
		}
	}
	return false
}

// otherKind reports, as an error at c, a line that heads the rows or gives a setting
// of another kind of table (to_50ft in a landing table): the wrong command, or a
// slip. It returns false for any other line.
func (b *builder) otherKind(c cell, head string) bool {
	for _, k := range Kinds {
		o := kinds[k]
		if o.section == b.kind.section {
			continue
		}
		for _, q := range o.quantities {
			if q == head {
				b.errorf(c, head, "the rows of a %s (kneeprint import %s): a %s has %s rows", o.what, k, b.kind.what, andList(b.kind.quantities))
				return true
			}
		}
		for _, s := range o.settings {
			if s.key == head {
				var own []string
				for _, s := range b.kind.settings {
					own = append(own, s.key)
				}
				b.errorf(c, head, "a setting of a %s (kneeprint import %s): a %s's settings are %s", o.what, k, b.kind.what, andList(own))
				return true
			}
		}
	}
	return false
}

// andList joins words as a sentence lists them: "a, b and c".
func andList(ws []string) string {
	if len(ws) < 2 {
		return strings.Join(ws, "")
	}
	return strings.Join(ws[:len(ws)-1], ", ") + " and " + ws[len(ws)-1]
}

// expected lists the first cells a line may have, for messages.
func (b *builder) expected() string {
	var ks []string
	for _, s := range b.kind.settings {
		ks = append(ks, s.key)
	}
	ks = append(ks, "weight")
	ks = append(ks, b.kind.quantities...)
	return strings.Join(ks[:len(ks)-1], ", ") + " or " + ks[len(ks)-1]
}

func (b *builder) parse(lines [][]cell) {
	var cur *block
	key := ""      // the quantity whose rows follow
	var keyAt cell // its header
	row := 0       // rows read under the current header
	for _, l := range lines {
		head := strings.ToLower(l[0].text)
		switch {
		case b.isSetting(head):
			if cur != nil {
				b.errorf(l[0], head, "settings come before the first weight block")
				continue
			}
			if len(l) != 2 {
				b.errorf(l[0], head, "write %s and its value in the next cell, nothing more", head)
				continue
			}
			if _, dup := b.settings[head]; dup {
				b.errorf(l[0], head, "given twice")
				continue
			}
			b.settings[head] = &l[1]
		case head == "weight":
			if len(l) != 2 {
				b.errorf(l[0], "weight", "write weight and its value with its unit in the next cell, e.g. weight,1000 kg")
				continue
			}
			if b.single {
				b.errorf(l[0], "weight", "the rows above have no weight line: a table without weight lines is one table, for the MTOW; give every block its weight line, or none")
				continue
			}
			b.endBlock(cur, key, keyAt, row)
			b.blocks = append(b.blocks, block{weight: l[1], rows: map[string][][]cell{}})
			cur, key, row = &b.blocks[len(b.blocks)-1], "", 0
		case b.isQuantity(head):
			if cur == nil && b.kind.noWeights && len(b.blocks) == 0 {
				b.blocks = append(b.blocks, block{weight: cell{line: l[0].line, col: l[0].col}, rows: map[string][][]cell{}})
				cur, b.single = &b.blocks[0], true
			}
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
		case b.otherKind(l[0], head):
		default:
			if cur == nil || key == "" {
				b.errorf(l[0], "", "%q: expected %s here", l[0].text, b.expected())
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
		msg := "no weight block found: a block starts with a line weight,1000 kg"
		if b.kind.noWeights {
			msg += fmt.Sprintf(" (or, for one table for the MTOW, with its %s line)", b.kind.quantities[0])
		}
		b.errs = append(b.errs, &spec.FieldError{File: b.file, Msg: msg})
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
	for _, k := range b.kind.quantities {
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

// unanswered lists the pending settings the CSV does not give, as field paths.
func (b *builder) unanswered() []string {
	var out []string
	for _, s := range b.kind.settings {
		if _, given := b.settings[s.key]; !given && len(s.pending) > 0 {
			out = append(out, b.settingPath(s.key))
		}
	}
	return out
}

// settingPath names a setting as the loader does: table.wind_factoring_included,
// landing.flap, landing.table.wind_factoring_included, climb.speed.
func (b *builder) settingPath(key string) string {
	if b.kind.section == "landing.table" && key == "flap" {
		return "landing.flap"
	}
	return b.kind.section + "." + key
}

// comment is text as a YAML comment may hold it: as it is when every character is
// printable, else quoted with Go's escapes (a YAML parser refuses a control character
// even in a comment; the pressure-altitude parser takes a form feed for a space).
func comment(s string) string {
	for _, r := range s {
		if !unicode.IsPrint(r) {
			return strconv.QuoteToGraphic(s)
		}
	}
	return s
}

// YAML trees carrying the CSV's lines and columns, for the loader's checks.

var origin = cell{line: 1, col: 1}

func scalar(c cell, tag string) *yaml.Node {
	return &yaml.Node{Kind: yaml.ScalarNode, Tag: tag, Value: c.text, Line: c.line, Column: c.col}
}

func str(c cell) *yaml.Node { return scalar(c, "!!str") }

// num is a figure: a plain number, or text the loader says is not one, at its place.
func num(c cell) *yaml.Node {
	if _, err := strconv.ParseFloat(c.text, 64); err != nil || c.text == "" {
		return str(c)
	}
	if _, err := strconv.ParseInt(c.text, 10, 64); err == nil {
		return scalar(c, "!!int")
	}
	return scalar(c, "!!float")
}

func seq(items []*yaml.Node, at cell) *yaml.Node {
	return &yaml.Node{Kind: yaml.SequenceNode, Content: items, Line: at.line, Column: at.col}
}

func mapping(at cell, kv ...any) *yaml.Node {
	n := &yaml.Node{Kind: yaml.MappingNode, Line: at.line, Column: at.col}
	for i := 0; i+1 < len(kv); i += 2 {
		n.Content = append(n.Content, &yaml.Node{Kind: yaml.ScalarNode, Tag: "!!str", Value: kv[i].(string), Line: at.line, Column: at.col}, kv[i+1].(*yaml.Node))
	}
	return n
}

// settingNodes are the given settings among keys, and the pending ones the CSV does
// not give read as their checkAs value (left for the pilot in the YAML).
func (b *builder) settingNodes(keys ...string) []any {
	var kv []any
	for _, s := range b.kind.settings {
		want := false
		for _, k := range keys {
			want = want || k == s.key
		}
		if !want {
			continue
		}
		c, given := b.settings[s.key]
		switch {
		case given && s.tag == "!!bool" && (c.text == "true" || c.text == "false"):
			kv = append(kv, s.key, scalar(*c, "!!bool"))
		case given:
			kv = append(kv, s.key, str(*c))
		case len(s.pending) > 0:
			kv = append(kv, s.key, scalar(cell{text: s.checkAs, line: origin.line, col: origin.col}, s.tag))
		}
	}
	return kv
}

// axesNodes are the pressure altitudes and the temperatures.
func (b *builder) axesNodes() []any {
	var alts, temps []*yaml.Node
	for _, c := range b.alts {
		alts = append(alts, str(c))
	}
	for _, c := range b.temps {
		temps = append(temps, str(c))
	}
	altAt, tempAt := origin, origin
	if len(b.alts) > 0 {
		altAt = b.alts[0]
	}
	if len(b.temps) > 0 {
		tempAt = b.temps[0]
	}
	return []any{"pressure_altitudes", seq(alts, altAt), "temperatures", seq(temps, tempAt)}
}

// rowsNode is one quantity's rows of a block.
func rowsNode(bl block, key string) *yaml.Node {
	var rows []*yaml.Node
	for _, r := range bl.rows[key] {
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
	return seq(rows, bl.weight)
}

// weightsNode is the list of blocks: weight and each quantity's rows.
func (b *builder) weightsNode() *yaml.Node {
	var blocks []*yaml.Node
	for _, bl := range b.blocks {
		parts := []any{"weight", str(bl.weight)}
		for _, k := range b.kind.quantities {
			parts = append(parts, k, rowsNode(bl, k))
		}
		blocks = append(blocks, mapping(bl.weight, parts...))
	}
	return seq(blocks, origin)
}

// tableNode is a takeoff or landing table section.
func (b *builder) tableNode() *yaml.Node {
	kv := b.settingNodes("wind_factoring_included", "distance_unit")
	kv = append(kv, b.axesNodes()...)
	kv = append(kv, "weights", b.weightsNode())
	return mapping(origin, kv...)
}

// landingNode is a landing section: its flap and its table.
func (b *builder) landingNode() *yaml.Node {
	kv := b.settingNodes("flap")
	kv = append(kv, "table", b.tableNode())
	return mapping(origin, kv...)
}

// climbNode is a climb section: its speed and its rate-of-climb table, one block per
// weight or one table for the MTOW.
func (b *builder) climbNode() *yaml.Node {
	kv := b.settingNodes("speed", "rate_unit")
	kv = append(kv, b.axesNodes()...)
	if b.single {
		kv = append(kv, "rate_of_climb", rowsNode(b.blocks[0], "rate_of_climb"))
	} else {
		kv = append(kv, "weights", b.weightsNode())
	}
	return mapping(origin, kv...)
}

// yaml writes the profile's section, one row per line with its pressure altitude as
// a comment, ready to paste.
func (b *builder) yaml(k Kind, name string) []byte {
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
	// put writes a setting as given, or empty under its question for the pilot.
	put := func(indent, key string) {
		for _, s := range b.kind.settings {
			if s.key != key {
				continue
			}
			c, given := b.settings[key]
			switch {
			case given && s.tag == "!!bool" && (c.text == "true" || c.text == "false"):
				fmt.Fprintf(&w, "%s%s: %s\n", indent, key, c.text)
			case given:
				fmt.Fprintf(&w, "%s%s: %s\n", indent, key, q(c.text))
			case len(s.pending) > 0:
				for _, l := range s.pending {
					fmt.Fprintf(&w, "%s# %s\n", indent, l)
				}
				fmt.Fprintf(&w, "%s%s:\n", indent, key)
			}
		}
	}
	rows := func(indent string, bl block, key string) {
		for i, r := range bl.rows[key] {
			var s []string
			for _, c := range r {
				s = append(s, c.text)
			}
			fmt.Fprintf(&w, "%s- [%s]  # %s\n", indent, strings.Join(s, ", "), comment(b.alts[i].text))
		}
	}
	table := func(indent string) {
		put(indent, "wind_factoring_included")
		put(indent, "distance_unit")
		fmt.Fprintf(&w, "%spressure_altitudes: %s\n", indent, list(b.alts))
		fmt.Fprintf(&w, "%stemperatures: %s\n", indent, list(b.temps))
		fmt.Fprintf(&w, "%sweights:\n", indent)
		for _, bl := range b.blocks {
			fmt.Fprintf(&w, "%s  - weight: %s\n", indent, q(bl.weight.text))
			for _, key := range b.kind.quantities {
				fmt.Fprintf(&w, "%s    %s:\n", indent, key)
				rows(indent+"      ", bl, key)
			}
		}
		fmt.Fprintf(&w, "%s# corrections: the manual's notes (headwind, tailwind, grass), as kneeprint init aircraft shows\n", indent)
	}
	switch k {
	case Takeoff:
		fmt.Fprintf(&w, "# The takeoff table imported from %s by kneeprint import table:\n", name)
		fmt.Fprintf(&w, "# paste it at the top level of the aircraft profile, then run kneeprint validate.\n")
		fmt.Fprintf(&w, "table:\n")
		table("  ")
	case Landing:
		fmt.Fprintf(&w, "# The landing table imported from %s by kneeprint import landing:\n", name)
		fmt.Fprintf(&w, "# paste it at the top level of the aircraft profile (a profile with a landing section\n")
		fmt.Fprintf(&w, "# already: put its table: part there instead), then run kneeprint validate.\n")
		fmt.Fprintf(&w, "landing:\n")
		put("  ", "flap")
		fmt.Fprintf(&w, "  # approach_speed and max_landing_mass (default the MTOW): as kneeprint init aircraft shows\n")
		fmt.Fprintf(&w, "  table:\n")
		table("    ")
	case Climb:
		fmt.Fprintf(&w, "# The rate-of-climb table imported from %s by kneeprint import climb:\n", name)
		fmt.Fprintf(&w, "# paste it at the top level of the aircraft profile, then run kneeprint validate\n")
		fmt.Fprintf(&w, "# (it checks every weight against the profile's MTOW).\n")
		fmt.Fprintf(&w, "climb:\n")
		put("  ", "speed")
		put("  ", "rate_unit")
		fmt.Fprintf(&w, "  pressure_altitudes: %s\n", list(b.alts))
		fmt.Fprintf(&w, "  temperatures: %s\n", list(b.temps))
		if b.single {
			fmt.Fprintf(&w, "  # One table without weights: taken as the MTOW's and used at every lighter weight.\n")
			fmt.Fprintf(&w, "  rate_of_climb:\n")
			rows("    ", b.blocks[0], "rate_of_climb")
			break
		}
		fmt.Fprintf(&w, "  weights:\n")
		for _, bl := range b.blocks {
			fmt.Fprintf(&w, "    - weight: %s\n", q(bl.weight.text))
			fmt.Fprintf(&w, "      rate_of_climb:\n")
			rows("        ", bl, "rate_of_climb")
		}
	}
	return w.Bytes()
}
