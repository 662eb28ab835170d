package layout

import (
	"encoding/binary"
	"fmt"
	"math"
	"sync"

	"golang.org/x/image/font"
	"golang.org/x/image/font/gofont/gobold"
	"golang.org/x/image/font/gofont/goregular"
	"golang.org/x/image/font/sfnt"
	"golang.org/x/image/math/fixed"
)

// Fonts holds the embedded Go fonts (a sans-serif with tabular digits, so columns of
// numbers line up): their glyph tables for measuring and the font programs a PDF
// embeds, subset and deflated once per character set (see embed.go). A Fonts is safe
// for concurrent use; one per process is enough.
type Fonts struct {
	faces *[2]*face

	mu     sync.Mutex
	simple map[string]*simpleFont // by style and the characters beyond ASCII
}

// NewFonts returns the embedded fonts. Their tables are read once per process.
func NewFonts() (*Fonts, error) {
	faces, err := loadFaces()
	if err != nil {
		return nil, err
	}
	return &Fonts{faces: faces, simple: map[string]*simpleFont{}}, nil
}

// Missing lists the characters of s that the embedded font cannot print: those it has
// no glyph for. Every character it has a glyph for can be printed (see encoding.go).
func (f *Fonts) Missing(s string, st FontStyle) []rune {
	var out []rune
	fc := f.faces[st]
	for _, r := range s {
		if fc.glyph(r) == 0 {
			out = append(out, r)
		}
	}
	return out
}

// WidthMM measures s at size pt in style st, from the font's advance widths. A
// character the font has no glyph for counts with the advance of its .notdef glyph.
func (f *Fonts) WidthMM(s string, pt float64, st FontStyle) float64 {
	fc := f.faces[st]
	total := 0
	for _, r := range s {
		total += int(fc.adv[fc.glyph(r)])
	}
	return float64(total) / 64 / advPPEM * pt * ptMM
}

// advPPEM is the size at which advances are read: 1000 pixels per em, in 26.6 fixed
// point, so a width in em is the sum / 64 / 1000.
const advPPEM = 1000

// face is one style of the embedded fonts, with what measuring and embedding need,
// read from the font program once.
type face struct {
	ttf    []byte
	sf     *sfnt.Font
	psName string          // PostScript name (name ID 6)
	gids   []uint16        // glyph by rune, for the Basic Multilingual Plane; 0 = none
	adv    []fixed.Int26_6 // advance by glyph at advPPEM, unhinted
	width  []int           // advance by glyph in 1/1000 em, rounded: the PDF glyph width
	desc   fontDesc
	up, ut int // underline position and thickness, 1/1000 em
}

func (fc *face) glyph(r rune) uint16 {
	if r < 0 || int(r) >= len(fc.gids) {
		return 0
	}
	return fc.gids[r]
}

// fontDesc is a PDF font descriptor's metrics in 1/1000 em (ISO 32000-1, 9.8.1,
// table 122), in the field names fpdf's font definitions use.
type fontDesc struct {
	Ascent, Descent, CapHeight, Flags int
	FontBBox                          struct{ Xmin, Ymin, Xmax, Ymax int }
	ItalicAngle, StemV, MissingWidth  int
}

// loadFaces parses both embedded fonts once per process. The result is never
// modified, so goroutines share it.
var loadFaces = sync.OnceValues(func() (*[2]*face, error) {
	var out [2]*face
	for st, ttf := range [][]byte{goregular.TTF, gobold.TTF} {
		fc, err := newFace(ttf)
		if err != nil {
			return nil, fmt.Errorf("embedded font: %w", err)
		}
		out[st] = fc
	}
	return &out, nil
})

func newFace(ttf []byte) (*face, error) {
	sf, err := sfnt.Parse(ttf)
	if err != nil {
		return nil, err
	}
	var buf sfnt.Buffer
	fc := &face{ttf: ttf, sf: sf, gids: make([]uint16, 0x10000)}
	if fc.psName, err = sf.Name(&buf, sfnt.NameIDPostScript); err != nil {
		return nil, err
	}
	for r := range fc.gids {
		g, err := sf.GlyphIndex(&buf, rune(r))
		if err == nil {
			fc.gids[r] = uint16(g)
		}
	}
	n := sf.NumGlyphs()
	upem := float64(sf.UnitsPerEm())
	fc.adv = make([]fixed.Int26_6, n)
	fc.width = make([]int, n)
	for g := 0; g < n; g++ {
		a, err := sf.GlyphAdvance(&buf, sfnt.GlyphIndex(g), fixed.I(advPPEM), font.HintingNone)
		if err != nil {
			return nil, err
		}
		fc.adv[g] = a
		units, err := sf.GlyphAdvance(&buf, sfnt.GlyphIndex(g), fixed.Int26_6(upem), font.HintingNone)
		if err != nil {
			return nil, err
		}
		// At ppem = unitsPerEm / 64 the 26.6 advance is the advance in font units.
		fc.width[g] = int(math.Round(float64(units) * 1000 / upem))
	}
	if fc.desc, fc.up, fc.ut, err = descriptor(ttf, fc.width[0]); err != nil {
		return nil, err
	}
	return fc, nil
}

// descriptor reads a font descriptor's metrics from the head, hhea, OS/2 and post
// tables (OpenType specification), scaled to 1/1000 em as fpdf's TrueType reader does.
func descriptor(ttf []byte, missingWidth int) (d fontDesc, up, ut int, err error) {
	t, err := ttfTables(ttf)
	if err != nil {
		return d, 0, 0, err
	}
	head, hhea, os2, post := t["head"], t["hhea"], t["OS/2"], t["post"]
	if len(head) < 54 || len(hhea) < 36 || len(os2) < 90 || len(post) < 16 {
		return d, 0, 0, fmt.Errorf("font metrics tables missing or truncated")
	}
	be := binary.BigEndian
	i16 := func(b []byte, off int) int { return int(int16(be.Uint16(b[off:]))) }
	scale := 1000 / float64(be.Uint16(head[18:]))
	sc := func(v int) int { return int(float64(v) * scale) }
	d.FontBBox.Xmin, d.FontBBox.Ymin = sc(i16(head, 36)), sc(i16(head, 38))
	d.FontBBox.Xmax, d.FontBBox.Ymax = sc(i16(head, 40)), sc(i16(head, 42))
	d.Ascent, d.Descent = sc(i16(hhea, 4)), sc(i16(hhea, 6))
	d.CapHeight = d.Ascent
	if be.Uint16(os2) > 1 {
		d.CapHeight = sc(i16(os2, 88))
	}
	weight := float64(be.Uint16(os2[4:]))
	d.StemV = 50 + int(math.Pow(weight/65, 2))
	d.ItalicAngle = i16(post, 4)
	// Nonsymbolic: the glyphs are found through the encoding's standard names and
	// the font's Unicode cmap (ISO 32000-1, 9.6.6.4 and 9.8.2).
	d.Flags = 32
	if d.ItalicAngle != 0 {
		d.Flags |= 64 // Italic
	}
	if weight >= 600 {
		d.Flags |= 1 << 18 // ForceBold
	}
	d.MissingWidth = missingWidth
	up = int(math.Round(float64(i16(post, 8)) * scale))
	ut = int(math.Round(float64(i16(post, 10)) * scale))
	return d, up, ut, nil
}
