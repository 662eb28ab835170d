package layout

import (
	"bytes"
	"compress/zlib"
	"crypto/sha256"
	"encoding/json"
	"fmt"
)

// simpleFont is one style of the embedded fonts as a PDF simple TrueType font
// (ISO 32000-1, 9.6.3) for documents that use a given set of characters: the font
// program subset to them and deflated, its encoding, and the font definition fpdf
// reads (fpdf.AddFontFromBytes). It is made once per character set and shared.
type simpleFont struct {
	enc  *encoding
	def  []byte // fpdf's font definition, JSON
	file []byte // the subset font program, deflated (FontFile2 with FlateDecode)
}

// maxSimpleFonts bounds the cache of simple fonts (a few tens of KB each).
const maxSimpleFonts = 256

// fontDeflateLevel is the zlib level for font programs, deflated once per character
// set. Measured on the Go Regular subset a card uses (BenchmarkSubsetFont): level 6
// is within 0.1 % of level 9's size at a third of its time, and 6 % smaller than
// level 1.
const fontDeflateLevel = zlib.DefaultCompression

// simpleFont returns style st as a simple font for documents that use, beyond
// ASCII, exactly the characters more (sorted, no duplicates), and false when they do
// not fit a single-byte encoding.
func (f *Fonts) simpleFont(st FontStyle, more []rune) (*simpleFont, bool, error) {
	key := string(rune('0'+st)) + string(more)
	f.mu.Lock()
	sf, ok := f.simple[key]
	f.mu.Unlock()
	if ok {
		return sf, sf != nil, nil
	}
	sf, err := f.makeSimpleFont(st, more)
	if err != nil {
		return nil, false, err
	}
	f.mu.Lock()
	if len(f.simple) >= maxSimpleFonts {
		clear(f.simple)
	}
	f.simple[key] = sf
	f.mu.Unlock()
	return sf, sf != nil, nil
}

// fontDef is fpdf's font definition (the JSON AddFontFromBytes reads).
type fontDef struct {
	Tp           string
	Name         string
	Desc         fontDesc
	Up, Ut       int
	Cw           []int // width by code, 1/1000 em
	Enc          string
	Diff         string // the /Differences array's content
	File         string // ends in ".z": the program is deflated
	OriginalSize int    // the program's length before deflating (Length1)
}

// makeSimpleFont builds a simple font, or returns nil when the characters do not fit.
func (f *Fonts) makeSimpleFont(st FontStyle, more []rune) (*simpleFont, error) {
	enc, ok := newEncoding(more)
	if !ok {
		return nil, nil
	}
	fc := f.faces[st]
	runes := make([]rune, 0, 95+len(more))
	for r := rune(0x20); r <= 0x7E; r++ {
		runes = append(runes, r)
	}
	sub, err := subsetTTF(fc.ttf, append(runes, more...))
	if err != nil {
		return nil, fmt.Errorf("embedded font: %w", err)
	}
	z, err := deflate(sub, fontDeflateLevel)
	if err != nil {
		return nil, err
	}
	name := subsetTag(sub) + "+" + fc.psName
	def := fontDef{Tp: "TrueType", Name: name, Desc: fc.desc, Up: fc.up, Ut: fc.ut,
		Cw: make([]int, 256), Enc: "cp1252", Diff: enc.diff, File: name + ".z", OriginalSize: len(sub)}
	for c, r := range enc.byCode {
		if g := fc.glyph(r); g != 0 {
			def.Cw[c] = fc.width[g]
		}
	}
	js, err := json.Marshal(def)
	if err != nil {
		return nil, err
	}
	return &simpleFont{enc: enc, def: js, file: z}, nil
}

// subsetTag names a subset: six capital letters from its bytes, so a different
// subset has a different name (ISO 32000-1, 9.6.4).
func subsetTag(sub []byte) string {
	h := sha256.Sum256(sub)
	tag := make([]byte, 6)
	for i := range tag {
		tag[i] = 'A' + h[i]%26
	}
	return string(tag)
}

// deflate compresses b with zlib at level.
func deflate(b []byte, level int) ([]byte, error) {
	var z bytes.Buffer
	zw, err := zlib.NewWriterLevel(&z, level)
	if err != nil {
		return nil, err
	}
	if _, err := zw.Write(b); err != nil {
		return nil, err
	}
	if err := zw.Close(); err != nil {
		return nil, err
	}
	return z.Bytes(), nil
}
