package schema_test

import (
	"bytes"
	"encoding/json"
	"fmt"
	"io/fs"
	"math"
	"os"
	"path/filepath"
	"regexp"
	"sort"
	"strconv"
	"strings"
	"testing"

	"github.com/santhosh-tekuri/jsonschema/v6"
	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
	"gopkg.in/yaml.v3"

	"kneeprint/airfields"
	"kneeprint/cmd/internal/schema"
	"kneeprint/cmd/internal/spec"
	"kneeprint/templates"
)

// compiled compiles every kind's schema with a JSON Schema library kept apart from
// kneeprint (santhosh-tekuri/jsonschema, draft 2020-12 with its meta-schema check).
func compiled(t *testing.T) map[string]*jsonschema.Schema {
	t.Helper()
	out := map[string]*jsonschema.Schema{}
	for _, k := range schema.Kinds() {
		b, err := schema.JSON(k)
		require.NoError(t, err)
		doc, err := jsonschema.UnmarshalJSON(bytes.NewReader(b))
		require.NoError(t, err)
		c := jsonschema.NewCompiler()
		url := "file:///" + schema.FileName(k)
		require.NoError(t, c.AddResource(url, doc))
		s, err := c.Compile(url)
		require.NoError(t, err, k)
		out[k] = s
	}
	return out
}

// instance turns a YAML file into the JSON value a YAML language server validates:
// mappings, lists, strings, numbers, booleans and null by their YAML tags.
func instance(data []byte) (any, string, error) {
	var doc yaml.Node
	if err := yaml.Unmarshal(data, &doc); err != nil {
		return nil, "", err
	}
	if len(doc.Content) == 0 {
		return nil, "", fmt.Errorf("empty")
	}
	root := doc.Content[0]
	kind := ""
	if root.Kind == yaml.MappingNode {
		for i := 0; i+1 < len(root.Content); i += 2 {
			if root.Content[i].Value == "kind" {
				kind = root.Content[i+1].Value
			}
		}
	}
	v, err := toJSON(root)
	return v, kind, err
}

func toJSON(n *yaml.Node) (any, error) {
	switch n.Kind {
	case yaml.MappingNode:
		m := map[string]any{}
		for i := 0; i+1 < len(n.Content); i += 2 {
			v, err := toJSON(n.Content[i+1])
			if err != nil {
				return nil, err
			}
			m[n.Content[i].Value] = v
		}
		return m, nil
	case yaml.SequenceNode:
		l := []any{}
		for _, c := range n.Content {
			v, err := toJSON(c)
			if err != nil {
				return nil, err
			}
			l = append(l, v)
		}
		return l, nil
	case yaml.AliasNode:
		return toJSON(n.Alias)
	case yaml.ScalarNode:
		switch n.Tag {
		case "!!null":
			return nil, nil
		case "!!bool":
			var b bool
			err := n.Decode(&b)
			return b, err
		case "!!int", "!!float":
			var f float64
			if err := n.Decode(&f); err != nil {
				return n.Value, nil
			}
			if math.IsNaN(f) || math.IsInf(f, 0) {
				return n.Value, nil // no JSON number: the text
			}
			return json.Number(strconv.FormatFloat(f, 'g', -1, 64)), nil
		}
		return n.Value, nil
	}
	return nil, fmt.Errorf("unknown node kind")
}

type file struct {
	name string
	data []byte
}

func readAll(t *testing.T, fsys fs.FS, dir string) []file {
	t.Helper()
	var out []file
	entries, err := fs.ReadDir(fsys, dir)
	require.NoError(t, err)
	for _, e := range entries {
		if strings.HasSuffix(e.Name(), ".yaml") {
			b, err := fs.ReadFile(fsys, filepath.ToSlash(filepath.Join(dir, e.Name())))
			require.NoError(t, err)
			out = append(out, file{filepath.Join(dir, e.Name()), b})
		}
	}
	return out
}

// filled is a starter with its placeholders replaced the way a pilot would: the word
// EXAMPLE removed and the wind factoring question answered.
func filled(data []byte) []byte {
	s := strings.ReplaceAll(string(data), spec.PlaceholderMark+" ", "")
	s = strings.Replace(s, "wind_factoring_included:   # true or false", "wind_factoring_included: false", 1)
	return []byte(s)
}

// goodFiles are the demo, preset and filled starter files: all load.
func goodFiles(t *testing.T) []file {
	t.Helper()
	var out []file
	out = append(out, readAll(t, templates.FS, "aircraft")...)
	out = append(out, readAll(t, templates.FS, "cards")...)
	out = append(out, readAll(t, templates.FS, "plans")...)
	out = append(out, readAll(t, airfields.FS, ".")...)
	for _, st := range readAll(t, templates.FS, "starter") {
		out = append(out, file{st.name + " (filled)", filled(st.data)})
	}
	for _, name := range []string{"ok-aircraft.yaml", "ok-airfield.yaml"} {
		b, err := os.ReadFile(filepath.Join("..", "spec", "testdata", "bad", name))
		require.NoError(t, err)
		out = append(out, file{name, b})
	}
	return out
}

func validate(schemas map[string]*jsonschema.Schema, data []byte) error {
	v, kind, err := instance(data)
	if err != nil {
		return err
	}
	s, ok := schemas[kind]
	if !ok {
		return fmt.Errorf("kind %q has no schema", kind)
	}
	return s.Validate(v)
}

// Issue 13.3: every demo, preset and (filled) starter file validates against its
// kind's schema, and loads.
func TestDemoAndStarterFilesValidate(t *testing.T) {
	schemas := compiled(t)
	for _, f := range goodFiles(t) {
		_, err := spec.Parse(f.name, f.data)
		require.NoError(t, err, "%s must load", f.name)
		assert.NoError(t, validate(schemas, f.data), f.name)
	}
}

// The unedited starters carry the modeline, and the schema marks exactly the values
// the pilot must replace (each EXAMPLE, and the unanswered wind factoring), as the
// loader refuses them.
func TestStartersAsWritten(t *testing.T) {
	schemas := compiled(t)
	for _, st := range readAll(t, templates.FS, "starter") {
		_, kind, err := instance(st.data)
		require.NoError(t, err)
		assert.True(t, strings.HasPrefix(string(st.data), schema.Modeline(kind)+"\n"), "%s starts with its modeline", st.name)
		if !bytes.Contains(st.data, []byte(spec.PlaceholderMark)) {
			continue
		}
		err = validate(schemas, st.data)
		require.Error(t, err, st.name)
		var ve *jsonschema.ValidationError
		require.ErrorAs(t, err, &ve)
		var flagged []string
		for _, leaf := range leaves(ve) {
			flagged = append(flagged, "/"+strings.Join(leaf.InstanceLocation, "/"))
		}
		// Every place the schema flags holds a placeholder (or the empty answer).
		v, _, _ := instance(st.data)
		for _, loc := range flagged {
			val := at(v, loc)
			s, _ := val.(string)
			assert.True(t, val == nil || strings.HasPrefix(s, spec.PlaceholderMark), "%s: %s = %v is flagged but is no placeholder", st.name, loc, val)
		}
		_, lerr := spec.Parse(st.name, st.data)
		assert.Error(t, lerr, "the loader refuses the unedited starter too")
	}
}

func leaves(e *jsonschema.ValidationError) []*jsonschema.ValidationError {
	if len(e.Causes) == 0 {
		return []*jsonschema.ValidationError{e}
	}
	var out []*jsonschema.ValidationError
	for _, c := range e.Causes {
		out = append(out, leaves(c)...)
	}
	return out
}

func at(v any, loc string) any {
	for _, p := range strings.Split(strings.Trim(loc, "/"), "/") {
		if p == "" {
			continue
		}
		switch x := v.(type) {
		case map[string]any:
			v = x[p]
		case []any:
			i, _ := strconv.Atoi(p)
			if i < len(x) {
				v = x[i]
			}
		}
	}
	return v
}

// loaderOnly are the bad files whose fault no schema can see: the loader alone
// refuses them, each for the reason given.
var loaderOnly = map[string]string{
	"af-negative-tora.yaml":          "a range in SI, whatever the unit",
	"af-heading-range.yaml":          "a range",
	"ac-zero-crosswind-limit.yaml":   "a range",
	"af-toda-short.yaml":             "one value against another (TODA below TORA)",
	"af-tora-beyond-length.yaml":     "one value against another (TORA and LDA longer than the runway)",
	"ac-weight-above-mtow.yaml":      "one value against another",
	"ac-weight-below-min.yaml":       "one value against another",
	"af-duplicate-end.yaml":          "one runway end against another",
	"af-slope-and-elev.yaml":         "a runway's slope against its ends' threshold elevations",
	"ac-axis-order.yaml":             "the order of an axis, whatever its units",
	"ac-ragged.yaml":                 "a row's length against the axes",
	"ac-nonmonotone.yaml":            "the table rising with temperature, altitude and weight",
	"ac-rotation-below-stall.yaml":   "the stall speed from wing area, CLmax and MTOW",
	"ac-calib-bound.yaml":            "the physics fit",
	"ac-table-typo.yaml":             "the physics fit to the table",
	"ac-climb-rising.yaml":           "the climb table falling with temperature, altitude and weight",
	"ac-landing-from50-short.yaml":   "the landing table rising with temperature, its distance from 50 ft against its ground roll",
	"ac-landing-mlm-above-mtow.yaml": "one value against another (maximum landing mass above the MTOW)",
	"ac-landing-mlm-below-min.yaml":  "one value against another (maximum landing mass below min_mass)",
	"af-obstacle-elevation.yaml":     "an obstacle's elevation against the runway's threshold elevations",
	"af-obstacle-unprintable.yaml":   "the characters the card's font can print",
	"af-duplicate-key.yaml":          "a duplicate key: a YAML parser keeps one, the loader refuses both",
	"ac-duplicate-mtow.yaml":         "a duplicate key: a YAML parser keeps one, the loader refuses both",
}

// loaderOnlyMutations are the mutations whose fault is one value against another,
// which the loader alone sees.
var loaderOnlyMutations = []struct{ pattern, reason string }{
	{`without runways\.\[\d\]\.ends\.\[\d\]\.threshold_elevation$`, "one end's threshold elevation without the other's"},
	{`without the unit of (takeoff_flap|landing\.flap|flaps\.\[\d\]\.name)$`, "takeoff_flap and landing.flap name a flap of the list"},
	{`starter/aircraft\.yaml \(filled\) without min_mass$`, "the card weights against the default lowest mass"},
}

// TestSchemaAndLoaderAgree: on the good files, the bad-file corpus and mutations of
// every good file (each key removed, an unknown key added to each mapping, each value
// replaced by a list, each quantity's unit removed), a file the schema refuses is
// refused by the loader; and a file the loader refuses is refused by the schema,
// except the bad files listed in loaderOnly (with their reasons) and mutations whose
// fault is one value against another.
func TestSchemaAndLoaderAgree(t *testing.T) {
	schemas := compiled(t)
	bad := readAll(t, os.DirFS(filepath.Join("..", "spec", "testdata")), "bad")
	var disagreements []string
	check := func(name string, data []byte) {
		_, lerr := spec.Parse(name, data)
		serr := validate(schemas, data)
		switch {
		case serr != nil && lerr == nil:
			disagreements = append(disagreements, fmt.Sprintf("SCHEMA ONLY %s: %v", name, firstLine(serr)))
		case serr == nil && lerr != nil:
			disagreements = append(disagreements, fmt.Sprintf("LOADER ONLY %s: %v", name, firstLine(lerr)))
		}
	}
	for _, f := range bad {
		if strings.HasPrefix(filepath.Base(f.name), "ok-") {
			continue
		}
		check(filepath.Base(f.name), f.data)
	}
	n := 0
	for _, f := range goodFiles(t) {
		for _, m := range mutations(t, f) {
			check(m.name, m.data)
			n++
		}
	}
	assert.Greater(t, n, 1000, "mutations checked")
	t.Logf("%d bad files and %d mutations checked", len(bad), n)
	sort.Strings(disagreements)
	seen := map[string]bool{}
	for _, d := range disagreements {
		switch {
		case strings.HasPrefix(d, "SCHEMA ONLY"):
			t.Errorf("the schema refuses what the loader accepts: an editor would flag a good file: %s", d)
		case strings.HasPrefix(d, "LOADER ONLY"):
			name := strings.TrimPrefix(d, "LOADER ONLY ")
			name = name[:strings.Index(name, ": ")]
			if _, ok := loaderOnly[name]; ok {
				seen[name] = true
				continue
			}
			allowed := false
			for _, m := range loaderOnlyMutations {
				allowed = allowed || regexp.MustCompile(m.pattern).MatchString(name)
			}
			assert.True(t, allowed, "the loader refuses what the schema accepts, and no reason is listed: %s", d)
		}
	}
	for name, reason := range loaderOnly {
		assert.True(t, seen[name], "%s is listed as seen by the loader alone (%s) but the schema refuses it too: remove it from the list", name, reason)
	}
	assert.Greater(t, len(bad), 40, "the bad-file corpus")
}

func firstLine(err error) string {
	s := err.Error()
	if i := strings.Index(s, "\n"); i > 0 {
		s = s[:i]
	}
	return s
}

// mutations of a good file: each key removed, an unknown key added to each mapping,
// each scalar replaced by a list, each quantity's unit removed.
func mutations(t *testing.T, f file) []file {
	t.Helper()
	var out []file
	var doc yaml.Node
	require.NoError(t, yaml.Unmarshal(f.data, &doc))
	var paths [][]int
	var walk func(n *yaml.Node, path []int)
	walk = func(n *yaml.Node, path []int) {
		paths = append(paths, append([]int(nil), path...))
		for i, c := range n.Content {
			walk(c, append(path, i))
		}
	}
	walk(doc.Content[0], nil)
	emit := func(what string, edit func(root *yaml.Node) bool) {
		var copyDoc yaml.Node
		require.NoError(t, yaml.Unmarshal(f.data, &copyDoc))
		if !edit(copyDoc.Content[0]) {
			return
		}
		b, err := yaml.Marshal(&copyDoc)
		require.NoError(t, err)
		out = append(out, file{f.name + " " + what, b})
	}
	get := func(root *yaml.Node, path []int) (*yaml.Node, *yaml.Node, int) {
		var parent *yaml.Node
		n, idx := root, -1
		for _, i := range path {
			parent, n, idx = n, n.Content[i], i
		}
		return n, parent, idx
	}
	unit := regexp.MustCompile(`^\s*[+-]?[0-9.]+\s*[^0-9\s].*$`)
	for _, p := range paths {
		p := p
		n, parent, idx := get(doc.Content[0], p)
		label := pathLabel(doc.Content[0], p)
		if parent != nil && parent.Kind == yaml.MappingNode && idx%2 == 1 {
			key := parent.Content[idx-1].Value
			emit("without "+label, func(root *yaml.Node) bool {
				_, par, i := get(root, p)
				par.Content = append(par.Content[:i-1], par.Content[i+1:]...)
				return true
			})
			_ = key
		}
		if n.Kind == yaml.MappingNode {
			emit("with an unknown key in "+label, func(root *yaml.Node) bool {
				m, _, _ := get(root, p)
				m.Content = append(m.Content, &yaml.Node{Kind: yaml.ScalarNode, Value: "zz_unknown"}, &yaml.Node{Kind: yaml.ScalarNode, Value: "1"})
				return true
			})
		}
		if n.Kind == yaml.ScalarNode && (parent == nil || parent.Kind != yaml.MappingNode || idx%2 == 1) {
			emit("with a list for "+label, func(root *yaml.Node) bool {
				s, _, _ := get(root, p)
				c := *s
				*s = yaml.Node{Kind: yaml.SequenceNode, Content: []*yaml.Node{&c}}
				return true
			})
			if unit.MatchString(n.Value) {
				emit("without the unit of "+label, func(root *yaml.Node) bool {
					s, _, _ := get(root, p)
					num := regexp.MustCompile(`^\s*[+-]?[0-9.]+`).FindString(s.Value)
					s.Value, s.Tag, s.Style = strings.TrimSpace(num), "", 0
					return true
				})
			}
		}
	}
	return out
}

func pathLabel(root *yaml.Node, path []int) string {
	var parts []string
	n := root
	for _, i := range path {
		switch n.Kind {
		case yaml.MappingNode:
			if i%2 == 1 {
				parts = append(parts, n.Content[i-1].Value)
			}
		case yaml.SequenceNode:
			parts = append(parts, fmt.Sprintf("[%d]", i))
		}
		n = n.Content[i]
	}
	return strings.Join(parts, ".")
}
