package layout

import (
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
	"golang.org/x/image/font"
	"golang.org/x/image/font/gofont/gobold"
	"golang.org/x/image/font/gofont/goregular"
	"golang.org/x/image/font/sfnt"
	"golang.org/x/image/math/fixed"
)

// The subset maps exactly the runes asked for, to glyphs with the same outlines and
// advances as the full font (checked against the x/image/font/sfnt reader), and holds
// no other glyphs than those and the parts of composite glyphs (Å and é are composites
// in the Go fonts).
func TestSubsetTTF(t *testing.T) {
	runes := []rune("0123456789 RWY°←≤kgÅé")
	for name, ttf := range map[string][]byte{"regular": goregular.TTF, "bold": gobold.TTF} {
		t.Run(name, func(t *testing.T) {
			sub, err := subsetTTF(ttf, runes)
			require.NoError(t, err)
			assert.Less(t, len(sub), len(ttf)/4)
			full, err := sfnt.Parse(ttf)
			require.NoError(t, err)
			part, err := sfnt.Parse(sub)
			require.NoError(t, err)
			var b1, b2 sfnt.Buffer
			for _, r := range runes {
				g1, err := full.GlyphIndex(&b1, r)
				require.NoError(t, err)
				g2, err := part.GlyphIndex(&b2, r)
				require.NoError(t, err)
				require.NotZero(t, g2, "rune %q is mapped", r)
				a1, _ := full.GlyphAdvance(&b1, g1, fixed.I(1000), font.HintingNone)
				a2, _ := part.GlyphAdvance(&b2, g2, fixed.I(1000), font.HintingNone)
				assert.Equal(t, a1, a2, "rune %q keeps its advance", r)
				s1, err := full.LoadGlyph(&b1, g1, fixed.I(1000), nil)
				require.NoError(t, err)
				s2, err := part.LoadGlyph(&b2, g2, fixed.I(1000), nil)
				require.NoError(t, err)
				assert.Equal(t, s1, s2, "rune %q keeps its outline (composites resolved through renumbered parts)", r)
			}
			g, err := part.GlyphIndex(&b2, 'Z')
			require.NoError(t, err)
			assert.Zero(t, g, "a rune not asked for is not mapped")
			// .notdef, the 21 runes' glyphs, and the base glyphs and accents the two
			// composites use beyond them: no more than 21 + 1 + 4.
			assert.LessOrEqual(t, part.NumGlyphs(), len(runes)+1+4)
			assert.Greater(t, part.NumGlyphs(), len(runes))
			// The whole-font checksum is 0xB1B0AFBA once head.checkSumAdjustment is set
			// (OpenType specification, head table).
			assert.Equal(t, uint32(0xB1B0AFBA), checksum(sub))
			// The name table keeps the copyright and the licence.
			for _, id := range []sfnt.NameID{sfnt.NameIDCopyright, sfnt.NameIDLicense, sfnt.NameIDPostScript} {
				want, err := full.Name(&b1, id)
				require.NoError(t, err)
				got, err := part.Name(&b2, id)
				require.NoError(t, err)
				assert.Equal(t, want, got)
			}
		})
	}
}

func TestMissingGlyphsReported(t *testing.T) {
	f, err := NewFonts()
	require.NoError(t, err)
	assert.Empty(t, f.Missing("Wrenmoor Ærø 840 m ← ≤ ≥ ↑ Πεδίο Поле", Regular))
	assert.Equal(t, []rune("北京\t"), f.Missing("北京 Field\t", Regular))
	assert.Equal(t, []rune("😀"), f.Missing("😀", Bold), "outside the Basic Multilingual Plane")
}
