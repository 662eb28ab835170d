package spec

import (
	"bytes"
	"fmt"
	"io"
	"math"
	"sort"
	"strconv"
	"strings"
	"unicode/utf8"

	"gopkg.in/yaml.v3"

	"kneeprint/cmd/internal/typedtable"
	"kneeprint/cmd/internal/units"
)

// Limits on what a file may be. They keep hostile input from costing memory or time.
const (
	MaxFileBytes = 1 << 20 // a real profile or airfield is a few kilobytes
	maxDepth     = 24      // deeper nesting than any kneeprint file needs
)

// decoder walks a yaml.Node tree, keeping line numbers, and collects every error.
type decoder struct {
	file  string
	errs  ErrorList
	notes []string // defaults applied, for validate's summary
	warns []string

	suppressed int // errors past maxErrors

	// An aircraft's calibration points, and the nodes of its table's cells.
	calib      []calibPoint
	tableNodes [2][][][]*yaml.Node

	// typed holds an aircraft's tables as typed (typedtable), for the proof sheet
	// and the outlier check.
	typed []*typedtable.Table
	// The same for the landing section (landing.go).
	landingCalib      []calibPoint
	landingTableNodes [2][][][]*yaml.Node
	// minMassWhy says where an aircraft's lowest flyable mass came from, for messages.
	minMassWhy string
}

// result returns the errors, with a last line counting those not listed.
func (d *decoder) result() ErrorList {
	if d.suppressed > 0 {
		return append(d.errs, &FieldError{File: d.file, Msg: fmt.Sprintf("%d more errors not listed: fix the ones above first", d.suppressed)})
	}
	return d.errs
}

// maxErrors is how many errors of one file are listed; the rest are counted.
const maxErrors = 50

func (d *decoder) errorf(n *yaml.Node, field, format string, args ...any) {
	if len(d.errs) >= maxErrors {
		d.suppressed++
		return
	}
	e := &FieldError{File: d.file, Field: field, Msg: fmt.Sprintf(format, args...)}
	if n != nil {
		e.Line, e.Column = n.Line, n.Column
	}
	d.errs = append(d.errs, e)
}

func (d *decoder) notef(format string, args ...any) {
	d.notes = append(d.notes, fmt.Sprintf(format, args...))
}

func (d *decoder) warnf(n *yaml.Node, field, format string, args ...any) {
	line := 0
	if n != nil {
		line = n.Line
	}
	d.warns = append(d.warns, fmt.Sprintf("%s:%d: %s: %s", d.file, line, field, fmt.Sprintf(format, args...)))
}

// parseRoot parses data and returns the top-level mapping node, rejecting anchors,
// aliases, merge keys and excessive nesting before anything else looks at the tree.
func (d *decoder) parseRoot(data []byte) *yaml.Node {
	if len(data) > MaxFileBytes {
		d.errorf(nil, "", "file is %d bytes, more than the %d bytes a kneeprint file may have", len(data), MaxFileBytes)
		return nil
	}
	if len(strings.TrimSpace(string(data))) == 0 {
		d.errorf(nil, "", "file is empty: a kneeprint file starts with a kind: line")
		return nil
	}
	if bytes.HasPrefix(data, []byte{0xFF, 0xFE}) || bytes.HasPrefix(data, []byte{0xFE, 0xFF}) {
		d.errs = append(d.errs, &FieldError{File: d.file, Line: 1, Column: 1, Msg: "the file is UTF-16: save it as UTF-8"})
		return nil
	}
	if line, col, ok := invalidUTF8(data); ok {
		d.errs = append(d.errs, &FieldError{File: d.file, Line: line, Column: col, Msg: "not UTF-8 text: save the file as UTF-8 (a kneeprint file is UTF-8)"})
		return nil
	}
	var doc yaml.Node
	dec := yaml.NewDecoder(bytes.NewReader(data))
	if err := dec.Decode(&doc); err != nil {
		d.errs = append(d.errs, yamlError(d.file, err))
		return nil
	}
	var second yaml.Node
	if err := dec.Decode(&second); err != io.EOF {
		d.errs = append(d.errs, afterDocument(d.file, data, err, &second))
		return nil
	}
	if doc.Kind != yaml.DocumentNode || len(doc.Content) == 0 {
		d.errorf(nil, "", "file holds no YAML document")
		return nil
	}
	if !d.checkTree(doc.Content[0], "", 0) {
		return nil
	}
	return doc.Content[0]
}

// invalidUTF8 finds the first byte of data that is not part of valid UTF-8 and
// returns its line and column (in characters, as YAML counts them), both from 1.
func invalidUTF8(data []byte) (line, col int, found bool) {
	line, col = 1, 1
	for i := 0; i < len(data); {
		r, size := utf8.DecodeRune(data[i:])
		if r == utf8.RuneError && size <= 1 {
			return line, col, true
		}
		if r == '\n' {
			line, col = line+1, 1
		} else {
			col++
		}
		i += size
	}
	return 0, 0, false
}

// afterDocument locates what follows a file's first YAML document: a second document
// (after ---), or text after the document end marker (...), which the YAML parser
// reports without a usable line. err and second are the parser's second answer.
func afterDocument(file string, data []byte, err error, second *yaml.Node) *FieldError {
	const one = "a kneeprint file holds one YAML document: remove the second"
	lines := strings.Split(string(data), "\n")
	started := false // the first document's content has begun
	for i, l := range lines {
		t := strings.TrimRight(l, " \t\r")
		switch {
		case !started && (t == "" || strings.HasPrefix(strings.TrimSpace(t), "#") || strings.HasPrefix(t, "%")):
			continue
		case !started:
			started = true
			continue // content, or the first document's own --- start marker
		case t == "---" || strings.HasPrefix(t, "--- ") || strings.HasPrefix(t, "---\t"):
			return &FieldError{File: file, Line: i + 1, Column: 1, Msg: one + " (from this --- on)"}
		case t != "..." && !strings.HasPrefix(t, "... ") && !strings.HasPrefix(t, "...\t"):
			continue
		}
		// The end marker: what follows on its line, then on the lines after it.
		rest := t[3:]
		if trimmed := strings.TrimLeft(rest, " \t"); trimmed != "" && !strings.HasPrefix(trimmed, "#") {
			return &FieldError{File: file, Line: i + 1, Column: 3 + len(rest) - len(trimmed) + 1, Msg: "text after the end of the document (...): remove it"}
		}
		for j := i + 1; j < len(lines); j++ {
			t := strings.TrimRight(lines[j], " \t\r")
			trimmed := strings.TrimLeft(t, " \t")
			switch {
			case trimmed == "" || strings.HasPrefix(trimmed, "#"):
				continue
			case t == "---" || strings.HasPrefix(t, "--- ") || strings.HasPrefix(t, "---\t"):
				return &FieldError{File: file, Line: j + 1, Column: 1, Msg: one + " (from this --- on)"}
			}
			return &FieldError{File: file, Line: j + 1, Column: utf8.RuneCountInString(t[:len(t)-len(trimmed)]) + 1, Msg: "text after the end of the document (...): remove it"}
		}
		break
	}
	// Not found by the scan (a marker inside something unusual): the parser's word.
	if err == nil {
		return &FieldError{File: file, Line: second.Line, Column: 1, Msg: one}
	}
	fe := yamlError(file, err)
	fe.Msg = one + ": " + fe.Msg
	return fe
}

// yamlError turns a YAML syntax error ("yaml: line 7: ...") into a FieldError.
func yamlError(file string, err error) *FieldError {
	msg := strings.TrimPrefix(err.Error(), "yaml: ")
	e := &FieldError{File: file, Msg: "not valid YAML: " + msg}
	if strings.HasPrefix(msg, "line ") {
		rest := msg[len("line "):]
		if i := strings.Index(rest, ":"); i > 0 {
			if n, convErr := strconv.Atoi(rest[:i]); convErr == nil {
				e.Line, e.Column = n, 1
				e.Msg = "not valid YAML: " + strings.TrimSpace(rest[i+1:])
			}
		}
	}
	return e
}

func (d *decoder) checkTree(n *yaml.Node, path string, depth int) bool {
	if depth > maxDepth {
		d.errorf(n, path, "nested more than %d levels deep", maxDepth)
		return false
	}
	if n.Kind == yaml.AliasNode || n.Anchor != "" {
		d.errorf(n, path, "anchors and aliases (& and *) are not accepted in kneeprint files: write each value out")
		return false
	}
	ok := true
	for _, c := range n.Content {
		if c.Kind == yaml.ScalarNode && c.Value == "<<" && c.Tag == "!!merge" {
			d.errorf(c, path, "merge keys (<<) are not accepted in kneeprint files")
			return false
		}
		if !d.checkTree(c, path, depth+1) {
			ok = false
			break
		}
	}
	return ok
}

// mapping is a YAML mapping being read: every key read is marked, and finish
// reports the keys nobody asked for.
type mapping struct {
	d     *decoder
	n     *yaml.Node
	path  string
	keys  map[string]*yaml.Node
	vals  map[string]*yaml.Node
	order []string
	asked map[string]bool
}

func (d *decoder) mapping(n *yaml.Node, path string) *mapping {
	m := &mapping{d: d, n: n, path: path, keys: map[string]*yaml.Node{}, vals: map[string]*yaml.Node{}, asked: map[string]bool{}}
	if n == nil {
		return m
	}
	if n.Kind != yaml.MappingNode {
		d.errorf(n, path, "expected a mapping of key: value lines, found %s", describe(n))
		return m
	}
	for i := 0; i+1 < len(n.Content); i += 2 {
		k, v := n.Content[i], n.Content[i+1]
		if k.Kind != yaml.ScalarNode {
			d.errorf(k, path, "keys must be plain words")
			continue
		}
		if prev, dup := m.keys[k.Value]; dup {
			d.errorf(k, m.field(k.Value), "duplicate key (first at line %d)", prev.Line)
			continue
		}
		m.keys[k.Value], m.vals[k.Value] = k, v
		m.order = append(m.order, k.Value)
	}
	return m
}

func (m *mapping) field(k string) string {
	if m.path == "" {
		return k
	}
	return m.path + "." + k
}

// get returns the value node of key k, or nil; a missing required key is an error.
func (m *mapping) get(k string, required bool) *yaml.Node {
	m.asked[k] = true
	v := m.vals[k]
	if v == nil && required && m.n != nil && m.n.Kind == yaml.MappingNode {
		m.d.errorf(m.n, m.field(k), "missing required field %q", k)
	}
	if v != nil && v.Kind == yaml.ScalarNode && v.Tag == "!!null" {
		if required {
			m.d.errorf(v, m.field(k), "has no value")
		}
		return nil
	}
	return v
}

func (m *mapping) has(k string) bool {
	v := m.vals[k]
	return v != nil && !(v.Kind == yaml.ScalarNode && v.Tag == "!!null")
}

// finish reports every key that was not asked for.
func (m *mapping) finish() {
	if m.n == nil || m.n.Kind != yaml.MappingNode {
		return
	}
	var known []string
	for k := range m.asked {
		known = append(known, k)
	}
	sort.Strings(known)
	for _, k := range m.order {
		if !m.asked[k] {
			m.d.errorf(m.keys[k], m.field(k), "unknown field %q; known fields here: %s", k, strings.Join(known, ", "))
		}
	}
}

func describe(n *yaml.Node) string {
	switch n.Kind {
	case yaml.MappingNode:
		return "a mapping"
	case yaml.SequenceNode:
		return "a list"
	case yaml.ScalarNode:
		return fmt.Sprintf("%q", n.Value)
	}
	return "something else"
}

// PlaceholderMark starts every value of a starter file (kneeprint init) that the
// pilot must replace: a file still holding one is refused, naming the key, so an
// unedited starter never prints a normal-looking card.
const PlaceholderMark = "EXAMPLE"

// placeholder reports, as an error naming the field, a value that still carries the
// starter's mark.
func (d *decoder) placeholder(v *yaml.Node, field string) bool {
	if v.Kind != yaml.ScalarNode {
		return false
	}
	if s := strings.TrimSpace(v.Value); s == PlaceholderMark || strings.HasPrefix(s, PlaceholderMark+" ") {
		d.errorf(v, field, "%q is a starter placeholder: replace it with the figure from your own flight manual or aerodrome data (and remove %s)", v.Value, PlaceholderMark)
		return true
	}
	return false
}

// placeholdersIn reports every placeholder in a part of the tree that is not read
// value by value (for instance table rows whose axes are in error).
func (d *decoder) placeholdersIn(n *yaml.Node, field string) {
	if n == nil {
		return
	}
	switch n.Kind {
	case yaml.ScalarNode:
		d.placeholder(n, field)
	case yaml.SequenceNode:
		for i, c := range n.Content {
			d.placeholdersIn(c, fmt.Sprintf("%s[%d]", field, i))
		}
	}
}

// str reads a text value. Numbers written unquoted are taken as their text.
func (m *mapping) str(k string, required bool) string {
	v := m.get(k, required)
	if v == nil {
		return ""
	}
	if m.d.placeholder(v, m.field(k)) {
		return ""
	}
	if v.Kind != yaml.ScalarNode {
		m.d.errorf(v, m.field(k), "expected text, found %s", describe(v))
		return ""
	}
	s := strings.TrimSpace(v.Value)
	if s == "" && required {
		m.d.errorf(v, m.field(k), "must not be empty")
	}
	const maxText = 500
	if len(s) > maxText {
		m.d.errorf(v, m.field(k), "text is %d characters long, at most %d accepted", len(s), maxText)
		return s[:maxText]
	}
	for _, r := range s {
		if r < 0x20 && r != '\n' && r != '\t' || r >= 0x7f && r < 0xa0 {
			m.d.errorf(v, m.field(k), "contains a control character")
			return ""
		}
		if invisible(r) {
			m.d.errorf(v, m.field(k), "contains an invisible formatting character (%U): retype the text without it", r)
			return ""
		}
	}
	return s
}

// invisible reports the formatting characters that change how a text is shown
// without being seen (Unicode bidirectional controls, UAX #9 sec. 2; zero-width
// characters and the byte-order mark): refused in every text, where they could make
// a value read as another.
func invisible(r rune) bool {
	switch {
	case r == 0x061C, r == 0x180E, r == 0xFEFF:
		return true
	case r >= 0x200B && r <= 0x200F, r >= 0x202A && r <= 0x202E, r >= 0x2060 && r <= 0x2069:
		return true
	}
	return false
}

// oneOf reads a text value that must be one of choices.
func (m *mapping) oneOf(k string, required bool, choices ...string) string {
	s := m.str(k, required)
	if s == "" {
		return ""
	}
	for _, c := range choices {
		if s == c {
			return s
		}
	}
	m.d.errorf(m.vals[k], m.field(k), "%q is not one of: %s", s, strings.Join(choices, ", "))
	return ""
}

// quantity reads a value with a unit of dimension dim, in SI, and checks it lies in
// [lo, hi] (SI). The bool is false when the value is absent or wrong.
func (m *mapping) quantity(k string, dim units.Dimension, required bool, lo, hi float64) (float64, bool) {
	v := m.get(k, required)
	if v == nil {
		return 0, false
	}
	return m.d.quantity(v, m.field(k), dim, lo, hi)
}

func (d *decoder) quantity(v *yaml.Node, field string, dim units.Dimension, lo, hi float64) (float64, bool) {
	if d.placeholder(v, field) {
		return 0, false
	}
	if v.Kind != yaml.ScalarNode {
		d.errorf(v, field, "expected a %s with a unit (%s), found %s", dim, strings.Join(units.Accepted(dim), ", "), describe(v))
		return 0, false
	}
	x, err := units.Parse(v.Value, dim)
	if err != nil {
		d.errorf(v, field, "%v", err)
		return 0, false
	}
	if x < lo || x > hi {
		d.errorf(v, field, "%s is outside the accepted range %s", v.Value, units.FormatRange(lo, hi, dim, units.UnitOf(v.Value, dim)))
		return 0, false
	}
	return x, true
}

func round3(x float64) float64 { return math.Round(x*1000) / 1000 }

// number reads a plain number (no unit) in [lo, hi].
func (m *mapping) number(k string, required bool, lo, hi float64) (float64, bool) {
	v := m.get(k, required)
	if v == nil {
		return 0, false
	}
	return m.d.number(v, m.field(k), lo, hi)
}

func (d *decoder) number(v *yaml.Node, field string, lo, hi float64) (float64, bool) {
	if d.placeholder(v, field) {
		return 0, false
	}
	if v.Kind != yaml.ScalarNode || (v.Tag != "!!int" && v.Tag != "!!float") {
		d.errorf(v, field, "expected a plain number, found %s", describe(v))
		return 0, false
	}
	x, err := strconv.ParseFloat(strings.ReplaceAll(v.Value, "_", ""), 64)
	if err != nil || math.IsNaN(x) || math.IsInf(x, 0) {
		d.errorf(v, field, "%q is not a finite number", v.Value)
		return 0, false
	}
	if x < lo || x > hi {
		d.errorf(v, field, "%s is outside the accepted range %s", v.Value, units.FormatNumberRange(lo, hi))
		return 0, false
	}
	return x, true
}

// boolean reads true or false.
func (m *mapping) boolean(k string, required bool) (bool, bool) {
	v := m.get(k, required)
	if v == nil || m.d.placeholder(v, m.field(k)) {
		return false, false
	}
	if v.Kind != yaml.ScalarNode || v.Tag != "!!bool" {
		m.d.errorf(v, m.field(k), "expected true or false, found %s", describe(v))
		return false, false
	}
	return v.Value == "true", true
}

// list reads a sequence; a missing required list or a non-list is an error.
func (m *mapping) list(k string, required bool) []*yaml.Node {
	v := m.get(k, required)
	if v == nil {
		return nil
	}
	if v.Kind != yaml.SequenceNode {
		m.d.errorf(v, m.field(k), "expected a list, found %s", describe(v))
		return nil
	}
	if len(v.Content) == 0 && required {
		m.d.errorf(v, m.field(k), "list is empty")
	}
	return v.Content
}

// quantities reads a list of values with units.
func (m *mapping) quantities(k string, dim units.Dimension, required bool, lo, hi float64) ([]float64, []*yaml.Node, bool) {
	items := m.list(k, required)
	if items == nil {
		return nil, nil, false
	}
	out := make([]float64, 0, len(items))
	ok := true
	for i, it := range items {
		x, good := m.d.quantity(it, fmt.Sprintf("%s[%d]", m.field(k), i), dim, lo, hi)
		ok = ok && good
		out = append(out, x)
	}
	return out, items, ok
}

// increasing reports, as an error at the offending element, axes that are not
// strictly increasing.
func (d *decoder) increasing(field string, xs []float64, nodes []*yaml.Node) bool {
	for i := 1; i < len(xs); i++ {
		if !(xs[i] > xs[i-1]) {
			d.errorf(nodes[i], fmt.Sprintf("%s[%d]", field, i), "axis values must be strictly increasing: %s does not follow %s", nodes[i].Value, nodes[i-1].Value)
			return false
		}
	}
	return true
}
