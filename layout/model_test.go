package layout

import (
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"

	"kneeprint/perf"
)

func TestCheckFindsProblems(t *testing.T) {
	f, err := NewFonts()
	require.NoError(t, err)
	p, _ := PageByName("a5")
	c := &Card{Page: p, Blocks: []Block{
		{Name: "a", Box: Rect{5, 5, 100, 20}, Texts: []Text{{Box: Rect{5, 5, 10, 4}, S: "12345678", SizePt: 9, Role: Number, WidthMM: f.WidthMM("12345678", 9, Regular)}}},
		{Name: "b", Box: Rect{50, 20, 50, 20}, Texts: []Text{{Box: Rect{50, 20, 40, 4}, S: "x", SizePt: 6, WidthMM: 1}, {Box: Rect{50, 30, 40, 4}, S: "9", SizePt: 8, Role: Number, WidthMM: 1}}},
		{Name: "c", Box: Rect{140, 200, 20, 20}},
	}}
	probs := c.Check()
	var msgs []string
	for _, p := range probs {
		msgs = append(msgs, p.String())
	}
	assert.Contains(t, msgs, "a: overlaps block b")
	assert.Contains(t, msgs, `a: text "12345678" is 14.1 mm wide in a 10.0 mm box`) // 8 x 0.556 em (Go Regular digit advance) x 9 pt
	assert.Contains(t, msgs, `b: text "x" at 6.0 pt, below 8.0 pt`)
	assert.Contains(t, msgs, `b: number "9" at 8.0 pt, below 9.0 pt`)
	assert.Contains(t, msgs, "c: block {X:140 Y:200 W:20 H:20} leaves the page {X:0 Y:0 W:148 H:210}")
}

// Every mark has its own word, and no two marks look alike once colour is removed:
// they differ in fill, frame, hatching, weight, the presence of a figure or the mark.
func TestLegendDistinguishableWithoutColour(t *testing.T) {
	type look struct {
		dark, frame, hatch, bold, figure bool
		mark                             string
	}
	seen := map[look]string{}
	words := map[string]bool{}
	for _, l := range looks() {
		st := styleOf(l)
		require.NotEmpty(t, st.Word)
		assert.False(t, words[st.Word], "word %q used twice", st.Word)
		words[st.Word] = true
		dark := st.Fill != nil && int(st.Fill.R)+int(st.Fill.G)+int(st.Fill.B) < 100
		mark := ""
		if len(st.Marks) > 0 {
			mark = st.Marks[0]
		}
		k := look{dark, st.Frame > 0, st.Hatch, st.Bold, st.Figure, mark}
		if prev, dup := seen[k]; dup {
			t.Errorf("%s and %s look the same without colour", st.Word, prev)
		}
		seen[k] = st.Word
	}
	// Red light makes red, orange and magenta vanish: no state may rely on them. The
	// only tint (tight) must come with a frame.
	assert.Greater(t, styleOf(lookTight).Frame, 0.0)
	// Each perf state has a mark; a no-go without a figure has its own (never n/d).
	assert.Equal(t, lookNoTakeoff, lookOf(CellData{State: perf.NoGo, CannotTakeOff: true}))
	assert.Equal(t, lookNoGo, lookOf(CellData{State: perf.NoGo, HasDistance: true, Distance: 700}))
	assert.Equal(t, lookNoData, lookOf(CellData{State: perf.NoData}))
	assert.Equal(t, lookLimit, lookOf(CellData{State: perf.BeyondLimits}))
	assert.NotEqual(t, styleOf(lookNoTakeoff).Marks, styleOf(lookNoData).Marks)
}

func TestPagesAndSheets(t *testing.T) {
	for _, tc := range []struct {
		page, sheet string
		fits        bool
	}{{"a5", "a4", true}, {"half-letter", "letter", true}, {"5x8", "letter", true}, {"5x8", "a4", true}, {"half-letter", "a4", false}, {"a5", "letter", false}} {
		p, err := PageByName(tc.page)
		require.NoError(t, err)
		s, err := SheetByName(tc.sheet)
		require.NoError(t, err)
		assert.Equal(t, tc.fits, s.Fits(p), "%s on %s", tc.page, tc.sheet)
	}
	// ISO 216 A5 is 148 x 210 mm; half-letter 5.5 x 8.5 in; 5 x 8 in.
	p, _ := PageByName("half-letter")
	assert.InDelta(t, 5.5*25.4, p.WidthMM, 1e-9)
	assert.InDelta(t, 8.5*25.4, p.HeightMM, 1e-9)
	_, err := PageByName("b5")
	assert.ErrorContains(t, err, "known sizes are 5x8, a5, half-letter")
}
