package spec

import (
	"fmt"
	"strings"
	"unicode"

	"gopkg.in/yaml.v3"

	"kneeprint/layout"
)

// PrintedFields are the text fields of each kind of file that a card prints as
// written. Their characters are checked against what the card's fonts can print
// (layout.Printable), so that a name a card cannot show is refused by validate with
// its line, not by cards later. "[]" walks every item of a list.
var PrintedFields = map[Kind][]string{
	KindAircraft: {"name", "takeoff_flap", "landing.flap"},
	KindAirfield: {"name", "ident", "runways[].ends[].designator", "runways[].ends[].notes", "runways[].ends[].obstacles[].note"},
}

// checkPrinted reports, at its line, every printed field of a kind of file that holds
// characters a card cannot print. Control and invisible characters are left to str,
// which reports them for every text field.
func (d *decoder) checkPrinted(root *yaml.Node, kind Kind) {
	for _, path := range PrintedFields[kind] {
		d.walkPrinted(root, strings.Split(path, "."), "")
	}
}

func (d *decoder) walkPrinted(n *yaml.Node, path []string, field string) {
	if n == nil || len(path) == 0 {
		return
	}
	key, each := strings.CutSuffix(path[0], "[]")
	if n.Kind != yaml.MappingNode {
		return
	}
	var v *yaml.Node
	for i := 0; i+1 < len(n.Content); i += 2 {
		if n.Content[i].Kind == yaml.ScalarNode && n.Content[i].Value == key {
			v = n.Content[i+1]
			break
		}
	}
	if v == nil {
		return
	}
	if field != "" {
		key = field + "." + key
	}
	switch {
	case each && v.Kind == yaml.SequenceNode:
		for i, it := range v.Content {
			d.walkPrinted(it, path[1:], fmt.Sprintf("%s[%d]", key, i))
		}
	case !each && len(path) == 1 && v.Kind == yaml.ScalarNode:
		d.printable(v, key)
	case !each && len(path) > 1 && v.Kind == yaml.MappingNode: // landing.flap
		d.walkPrinted(v, path[1:], key)
	}
}

func (d *decoder) printable(v *yaml.Node, field string) {
	var bad []string
	seen := map[rune]bool{}
	for _, r := range v.Value {
		if seen[r] || r < 0x20 && r != '\n' && r != '\t' || r >= 0x7f && r < 0xa0 || invisible(r) || layout.Printable(r) {
			continue
		}
		seen[r] = true
		switch {
		case r == '\n':
			bad = append(bad, "U+000A (a line break)")
		case r == '\t':
			bad = append(bad, "U+0009 (a tab)")
		case unicode.IsGraphic(r):
			bad = append(bad, fmt.Sprintf("%q (%U)", string(r), r))
		default:
			bad = append(bad, fmt.Sprintf("%U", r))
		}
	}
	if len(bad) == 0 {
		return
	}
	if len(bad) > 8 {
		bad = append(bad[:8], fmt.Sprintf("and %d more", len(bad)-8))
	}
	d.errorf(v, field, "a card cannot print %s: write this printed text in Latin letters, digits and common punctuation, on one line", strings.Join(bad, ", "))
}
