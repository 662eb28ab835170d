package layout

import (
	"fmt"

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
	faces [2]*sfnt.Font
	buf   sfnt.Buffer
}

// NewFonts parses the embedded fonts.
func NewFonts() (*Fonts, error) {
	f := &Fonts{}
	for i, ttf := range [][]byte{goregular.TTF, gobold.TTF} {
		face, err := sfnt.Parse(ttf)
		if err != nil {
			return nil, fmt.Errorf("embedded font: %w", err)
		}
		f.faces[i] = face
	}
	return f, nil
}

func fontBytes(s FontStyle) []byte {
	if s == Bold {
		return gobold.TTF
	}
	return goregular.TTF
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
