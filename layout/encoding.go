package layout

import (
	"fmt"
	"sort"
	"strings"
)

// A card's fonts are PDF simple fonts: one byte per character, so a document names
// each font once with 224 widths instead of a CID font's tables (ISO 32000-1, 9.6
// and 9.7). The encoding is WinAnsiEncoding (Windows code page 1252; ISO 32000-1,
// annex D.2) with differences for the few characters beyond it:
//
//   - the symbols a card prints beyond code page 1252 (extraGlyphs) take the codes
//     WinAnsiEncoding leaves unused, the same in every document;
//   - any other character the font has (a Greek or Cyrillic airfield name) takes, in
//     this document only, the code of a code page 1252 character the document does
//     not use;
//   - a document with more such characters than free codes in one style falls back
//     to a CID font (see RenderPDF).
//
// Codes are named by their Adobe Glyph List names (or uniXXXX), so text extraction
// finds the characters through the names, and the viewer finds the glyphs through
// the names' Unicode values in the font's Unicode cmap (ISO 32000-1, 9.6.6.4).

// extraGlyphs are the characters beyond code page 1252 that cards print, with their
// Adobe Glyph List names (AGL 2.0, glyphlist.txt). At most len(unusedWinAnsi).
var extraGlyphs = []struct {
	r    rune
	name string
}{
	{'←', "arrowleft"},    // U+2190
	{'↑', "arrowup"},      // U+2191
	{'≤', "lessequal"},    // U+2264
	{'≥', "greaterequal"}, // U+2265
}

// unusedWinAnsi are the codes from 32 up that WinAnsiEncoding leaves unassigned
// (ISO 32000-1, annex D.2, table D.2 and its note 3).
var unusedWinAnsi = []byte{0x7F, 0x81, 0x8D, 0x8F, 0x90, 0x9D}

// cp1252High is Windows code page 1252 above ASCII: the character of each code from
// 0x80 (0 where unassigned). 0xA0-0xFF are Latin-1 (ISO 8859-1).
var cp1252High = func() (t [128]rune) {
	copy(t[:32], []rune{
		'€', 0, '‚', 'ƒ', '„', '…', '†', '‡', 'ˆ', '‰', 'Š', '‹', 'Œ', 0, 'Ž', 0,
		0, '‘', '’', '“', '”', '•', '–', '—', '˜', '™', 'š', '›', 'œ', 0, 'ž', 'Ÿ',
	})
	for c := 0xA0; c <= 0xFF; c++ {
		t[c-0x80] = rune(c)
	}
	return t
}()

// cp1252Code returns the code page 1252 code of r, if it has one.
func cp1252Code(r rune) (byte, bool) {
	if r >= 0x20 && r <= 0x7E {
		return byte(r), true
	}
	if r >= 0xA0 && r <= 0xFF {
		return byte(r), true
	}
	for i, c := range cp1252High[:32] {
		if c == r && c != 0 {
			return byte(0x80 + i), true
		}
	}
	return 0, false
}

// encoding is one document's single-byte encoding for one font style. ASCII
// characters are their own codes; code holds the rest.
type encoding struct {
	code   map[rune]byte
	byCode [256]rune // the character each code shows, 0 for none
	diff   string    // the /Differences array's content, "" for none
}

// newEncoding returns the encoding for a document whose texts in one style use
// beyond ASCII exactly the characters more (sorted, without duplicates), or false
// when they do not fit in one byte.
func newEncoding(more []rune) (*encoding, bool) {
	e := &encoding{code: make(map[rune]byte, len(more))}
	for c := 0x20; c <= 0x7E; c++ {
		e.byCode[c] = rune(c)
	}
	for i, r := range cp1252High {
		e.byCode[0x80+i] = r
	}
	type diff struct {
		code byte
		name string
	}
	var diffs []diff
	taken := map[byte]bool{}
	var others []rune
	for _, r := range more {
		if c, ok := cp1252Code(r); ok {
			e.code[r] = c
			taken[c] = true
			continue
		}
		fixed := false
		for i, x := range extraGlyphs {
			if x.r == r && i < len(unusedWinAnsi) {
				c := unusedWinAnsi[i]
				e.code[r], e.byCode[c], taken[c] = c, r, true
				diffs = append(diffs, diff{c, x.name})
				fixed = true
			}
		}
		if !fixed {
			others = append(others, r)
		}
	}
	if len(others) > 0 {
		// Free codes: the unused ones no fixed extra holds, then those of the code
		// page 1252 characters beyond ASCII this document does not use.
		var free []byte
		for i, c := range unusedWinAnsi {
			if i >= len(extraGlyphs) || !taken[c] {
				free = append(free, c)
			}
		}
		for c := 0x80; c <= 0xFF; c++ {
			if cp1252High[c-0x80] != 0 && !taken[byte(c)] {
				free = append(free, byte(c))
			}
		}
		if len(others) > len(free) {
			return nil, false
		}
		for i, r := range others {
			c := free[i]
			e.code[r], e.byCode[c] = c, r
			diffs = append(diffs, diff{c, fmt.Sprintf("uni%04X", r)})
		}
	}
	sort.Slice(diffs, func(i, j int) bool { return diffs[i].code < diffs[j].code })
	var b strings.Builder
	for i, d := range diffs {
		if i > 0 {
			b.WriteByte(' ')
		}
		fmt.Fprintf(&b, "%d /%s", d.code, d.name)
	}
	e.diff = b.String()
	return e, true
}

// appendText appends s in this encoding as the content of a PDF literal string
// (ISO 32000-1, 7.3.4.2): parentheses and backslashes escaped, control codes and
// DEL in octal, the rest as bytes. It fails on a character without a code.
func (e *encoding) appendText(b []byte, s string) ([]byte, error) {
	for _, r := range s {
		var c byte
		switch {
		case r >= 0x20 && r <= 0x7E:
			c = byte(r)
		default:
			var ok bool
			if c, ok = e.code[r]; !ok {
				return b, fmt.Errorf("character %q cannot be printed in the embedded font", r)
			}
		}
		switch {
		case c == '(' || c == ')' || c == '\\':
			b = append(b, '\\', c)
		case c < 0x20 || c == 0x7F:
			b = append(b, '\\', '0'+c>>6, '0'+(c>>3)&7, '0'+c&7)
		default:
			b = append(b, c)
		}
	}
	return b, nil
}
