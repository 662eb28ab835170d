package layout

import (
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
	"golang.org/x/image/font"
	"golang.org/x/image/font/gofont/goregular"
	"golang.org/x/image/font/sfnt"
	"golang.org/x/image/math/fixed"
)

// The subset keeps exactly the runes asked for, with the same glyph outlines and
// advances as the full font (checked against the x/image/font/sfnt reader).
func TestSubsetTTF(t *testing.T) {
	runes := []rune("0123456789 RWY°←≤kgÅé")
	sub, err := subsetTTF(goregular.TTF, runes)
	require.NoError(t, err)
	assert.Less(t, len(sub), len(goregular.TTF)/2)
	full, err := sfnt.Parse(goregular.TTF)
	require.NoError(t, err)
	part, err := sfnt.Parse(sub)
	require.NoError(t, err)
	var b1, b2 sfnt.Buffer
	for _, r := range runes {
		g1, err := full.GlyphIndex(&b1, r)
		require.NoError(t, err)
		g2, err := part.GlyphIndex(&b2, r)
		require.NoError(t, err)
		assert.Equal(t, g1, g2, "rune %q keeps its glyph", r)
		a1, _ := full.GlyphAdvance(&b1, g1, fixed.I(1000), font.HintingNone)
		a2, _ := part.GlyphAdvance(&b2, g2, fixed.I(1000), font.HintingNone)
		assert.Equal(t, a1, a2)
		s1, err := full.LoadGlyph(&b1, g1, fixed.I(1000), nil)
		require.NoError(t, err)
		s2, err := part.LoadGlyph(&b2, g2, fixed.I(1000), nil)
		require.NoError(t, err)
		assert.Equal(t, len(s1), len(s2), "rune %q keeps its outline", r)
	}
	g, err := part.GlyphIndex(&b2, 'Z')
	require.NoError(t, err)
	assert.Zero(t, g, "a rune not asked for is not mapped")
	// The whole-font checksum is 0xB1B0AFBA once head.checkSumAdjustment is set
	// (OpenType specification, head table).
	assert.Equal(t, uint32(0xB1B0AFBA), checksum(sub))
}

func TestMissingGlyphsReported(t *testing.T) {
	f, err := NewFonts()
	require.NoError(t, err)
	assert.Empty(t, f.Missing("Wrenmoor Ærø 840 m ←", Regular))
	assert.Equal(t, []rune("北京"), f.Missing("北京 Field", Regular))
}
