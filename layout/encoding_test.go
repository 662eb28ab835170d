package layout

import (
	"sort"
	"testing"
	"unicode"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
	"golang.org/x/text/encoding/charmap"
)

// The code page 1252 table agrees with golang.org/x/text's Windows-1252 charmap for
// every code from 0x20, and the codes kneeprint treats as unused are those the
// charmap leaves unassigned (U+FFFD) or to DEL (ISO 32000-1, annex D.2: unused in
// WinAnsiEncoding).
func TestCP1252AgainstReference(t *testing.T) {
	unused := map[byte]bool{}
	for _, c := range unusedWinAnsi {
		unused[c] = true
	}
	for c := 0x20; c <= 0xFF; c++ {
		ref := charmap.Windows1252.DecodeByte(byte(c))
		if unicode.IsControl(ref) || ref == unicode.ReplacementChar {
			assert.True(t, unused[byte(c)], "code %#x is unassigned in code page 1252", c)
			_, ok := cp1252Code(ref)
			assert.False(t, ok, "%U has no code", ref)
			continue
		}
		assert.False(t, unused[byte(c)], "code %#x is assigned", c)
		got, ok := cp1252Code(ref)
		require.True(t, ok, "%U is in code page 1252", ref)
		assert.Equal(t, byte(c), got, "%U", ref)
		if c >= 0x80 {
			assert.Equal(t, ref, cp1252High[c-0x80])
		}
	}
	assert.Len(t, unused, 6)
}

// The card's extra symbols fit the unused codes, have glyphs in both styles, and
// keep the same code in every document, whatever else it uses.
func TestExtraGlyphsFixed(t *testing.T) {
	require.LessOrEqual(t, len(extraGlyphs), len(unusedWinAnsi))
	f, err := NewFonts()
	require.NoError(t, err)
	var all []rune
	for _, x := range extraGlyphs {
		all = append(all, x.r)
		_, inCP := cp1252Code(x.r)
		assert.False(t, inCP, "%q is beyond code page 1252", x.r)
		for st := Regular; st <= Bold; st++ {
			assert.Empty(t, f.Missing(string(x.r), st))
		}
	}
	full, ok := newEncoding(sortedRunes("°·×é" + string(all) + "Πεδίο"))
	require.True(t, ok)
	for i, x := range extraGlyphs {
		one, ok := newEncoding([]rune{x.r})
		require.True(t, ok)
		assert.Equal(t, unusedWinAnsi[i], one.code[x.r])
		assert.Equal(t, unusedWinAnsi[i], full.code[x.r])
		assert.Contains(t, full.diff, x.name)
	}
}

// Characters beyond code page 1252 and the extras take codes of code page 1252
// characters the document does not use, named uniXXXX (Adobe Glyph List
// specification, "uni" names); every character gets its own code.
func TestEncodingOtherScripts(t *testing.T) {
	more := sortedRunes("°·Πεδίο Δοκιμής←≤Ærø")
	e, ok := newEncoding(more)
	require.True(t, ok)
	codes := map[byte]rune{}
	for _, r := range more {
		c, ok := e.code[r]
		require.True(t, ok, "%q has a code", r)
		assert.GreaterOrEqual(t, c, byte(0x7F), "%q: ASCII codes stay ASCII", r)
		if prev, dup := codes[c]; dup {
			t.Errorf("code %#x for both %q and %q", c, prev, r)
		}
		codes[c] = r
		assert.Equal(t, r, e.byCode[c])
	}
	assert.Equal(t, byte(0xB0), e.code['°'], "code page 1252 characters keep their codes")
	assert.Equal(t, byte(0xC6), e.code['Æ'])
	assert.Contains(t, e.diff, "/uni03A0", "Π is named uni03A0")
	assert.NotContains(t, e.diff, "/uni00B0", "° needs no difference")

	// More characters than free codes do not fit.
	var many []rune
	for r := rune(0x0400); r < 0x0400+140; r++ {
		many = append(many, r)
	}
	_, ok = newEncoding(many)
	assert.False(t, ok)
}

// Strings are written as PDF literal strings (ISO 32000-1, 7.3.4.2).
func TestAppendText(t *testing.T) {
	e, ok := newEncoding(sortedRunes("←°"))
	require.True(t, ok)
	b, err := e.appendText(nil, `(a\b) ← 5°`)
	require.NoError(t, err)
	assert.Equal(t, "\\(a\\\\b\\) \\177 5\xB0", string(b))
	_, err = e.appendText(nil, "北")
	assert.ErrorContains(t, err, "cannot be printed")
}

// sortedRunes returns the characters of s beyond ASCII, sorted, once each, as
// RenderPDF hands them to newEncoding.
func sortedRunes(s string) []rune {
	seen := map[rune]bool{}
	var out []rune
	for _, r := range s {
		if (r < 0x20 || r > 0x7E) && !seen[r] {
			seen[r] = true
			out = append(out, r)
		}
	}
	sort.Slice(out, func(i, j int) bool { return out[i] < out[j] })
	return out
}
