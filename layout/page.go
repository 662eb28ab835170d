package layout

import (
	"fmt"
	"sort"
	"strings"
)

// Page is a card size in millimetres, portrait.
type Page struct {
	Name     string
	WidthMM  float64
	HeightMM float64
}

// Card sizes: A5 (ISO 216), US half-letter (5.5 x 8.5 in) and 5 x 8 in index card.
var pages = map[string]Page{
	"a5":          {"a5", 148, 210},
	"half-letter": {"half-letter", 139.7, 215.9},
	"5x8":         {"5x8", 127, 203.2},
}

// Sheet is a printer sheet for 2-up imposition, landscape.
type Sheet struct {
	Name     string
	WidthMM  float64
	HeightMM float64
}

// Sheets: A4 (ISO 216) and US letter, both landscape.
var sheets = map[string]Sheet{
	"a4":     {"a4", 297, 210},
	"letter": {"letter", 279.4, 215.9},
}

// PageByName returns a card size.
func PageByName(name string) (Page, error) {
	p, ok := pages[name]
	if !ok {
		return Page{}, fmt.Errorf("page %q: known sizes are %s", name, strings.Join(keys(pages), ", "))
	}
	return p, nil
}

// SheetByName returns a sheet for 2-up printing.
func SheetByName(name string) (Sheet, error) {
	s, ok := sheets[name]
	if !ok {
		return Sheet{}, fmt.Errorf("sheet %q: known sheets are %s", name, strings.Join(keys(sheets), ", "))
	}
	return s, nil
}

// Fits reports whether two cards of page p fit side by side on sheet s.
func (s Sheet) Fits(p Page) bool {
	return 2*p.WidthMM <= s.WidthMM+1e-9 && p.HeightMM <= s.HeightMM+1e-9
}

func keys[V any](m map[string]V) []string {
	var out []string
	for k := range m {
		out = append(out, k)
	}
	sort.Strings(out)
	return out
}
