package layout

import (
	"fmt"
	"sort"

	"golang.org/x/image/font"
	"golang.org/x/image/font/gofont/gobold"
	"golang.org/x/image/font/gofont/goregular"
	"golang.org/x/image/font/sfnt"
	"golang.org/x/image/math/fixed"
)

// Fonts holds the embedded Go fonts (a sans-serif with tabular digits, so columns of
// numbers line up) parsed once for measuring, and their bytes for embedding in PDFs.
// A Fonts is safe for use by one goroutine at a time; make one per worker.
type Fonts struct {
	faces  [2]*sfnt.Font
	buf    sfnt.Buffer
	base   [2][]byte         // subsets for baseRunes
	extra  map[string][]byte // subsets for cards that use more, by style and runes
	inBase map[rune]bool
}

// baseRunes are the characters a card is expected to need: ASCII, Latin-1, Latin
// Extended-A (European names) and the punctuation and symbols kneeprint prints.
func baseRunes() []rune {
	var rs []rune
	for r := rune(0x20); r <= 0x7E; r++ {
		rs = append(rs, r)
	}
	for r := rune(0xA0); r <= 0x17F; r++ {
		rs = append(rs, r)
	}
	return append(rs, []rune("–—‘’‚“”„•…‰′″←↑→↓↔≈≠≤≥−÷▲►▼◄■□●◂▸")...)
}

// NewFonts parses the embedded fonts.
func NewFonts() (*Fonts, error) {
	f := &Fonts{extra: map[string][]byte{}, inBase: map[rune]bool{}}
	base := baseRunes()
	for _, r := range base {
		f.inBase[r] = true
	}
	for i, ttf := range [][]byte{goregular.TTF, gobold.TTF} {
		face, err := sfnt.Parse(ttf)
		if err != nil {
			return nil, fmt.Errorf("embedded font: %w", err)
		}
		f.faces[i] = face
		if f.base[i], err = subsetTTF(ttf, base); err != nil {
			return nil, fmt.Errorf("embedded font: %w", err)
		}
	}
	return f, nil
}

func fontBytes(s FontStyle) []byte {
	if s == Bold {
		return gobold.TTF
	}
	return goregular.TTF
}

// pdfFont returns the font file to embed for style st in a document using runes:
// the base subset when it covers them, else a subset made for them (and cached).
func (f *Fonts) pdfFont(st FontStyle, used map[rune]bool) []byte {
	var more []rune
	for r := range used {
		if !f.inBase[r] {
			more = append(more, r)
		}
	}
	if len(more) == 0 {
		return f.base[st]
	}
	sort.Slice(more, func(i, j int) bool { return more[i] < more[j] })
	key := fmt.Sprint(st, string(more))
	if b, ok := f.extra[key]; ok {
		return b
	}
	b, err := subsetTTF(fontBytes(st), append(baseRunes(), more...))
	if err != nil {
		b = fontBytes(st) // the whole font always works, only slower
	}
	f.extra[key] = b
	return b
}

// Missing lists the characters of s that the embedded font cannot print.
func (f *Fonts) Missing(s string, st FontStyle) []rune {
	var out []rune
	for _, r := range s {
		if f.inBase[r] {
			continue
		}
		if idx, err := f.faces[st].GlyphIndex(&f.buf, r); err != nil || idx == 0 {
			out = append(out, r)
		}
	}
	return out
}

// WidthMM measures s at size pt in style st, from the font's advance widths.
func (f *Fonts) WidthMM(s string, pt float64, st FontStyle) float64 {
	face := f.faces[st]
	const unitsPerEm = 1000
	total := 0
	for _, r := range s {
		idx, err := face.GlyphIndex(&f.buf, r)
		if err != nil {
			continue
		}
		adv, err := face.GlyphAdvance(&f.buf, idx, fixed.I(unitsPerEm), font.HintingNone)
		if err != nil {
			continue
		}
		total += int(adv)
	}
	return float64(total) / 64 / unitsPerEm * pt * ptMM
}
