package layout

import (
	"fmt"
	"math"
	"math/rand/v2"
	"strings"
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

// Issue 8.9: a figure that touches a grid line or overruns its frame is a layout
// problem. A 9 pt "1100" (4 x 0.556 em advance, read from the Go font: 7.06 mm) in a
// 7.5 mm wide frame leaves 0.22 mm each side, above the 0.1 mm clearance; in a 7.2 mm
// frame it touches.
func TestCheckTextTouchingLines(t *testing.T) {
	f, err := NewFonts()
	require.NoError(t, err)
	p, _ := PageByName("a5")
	mk := func(frameW float64) []Problem {
		blk := Block{Name: "grid", Box: Rect{10, 10, 40, 20}}
		b := &builder{f: f, card: &Card{Page: p}}
		b.text(&blk, Rect{10, 10, 20, 5}, "1100", 9, Bold, Center, Black, Number)
		blk.Shapes = append(blk.Shapes, Shape{Kind: StrokeRect, Box: Rect{20 - frameW/2, 10.2, frameW, 4.6}, Color: Black, LineMM: 0.001})
		c := &Card{Page: p, Blocks: []Block{blk}}
		return c.Check()
	}
	assert.Empty(t, mk(7.5))
	probs := mk(7.2)
	require.Len(t, probs, 1)
	assert.Contains(t, probs[0].String(), `text "1100" touches a line`)
	// A rule through the middle of a text is caught too.
	blk := Block{Name: "b", Box: Rect{0, 0, 50, 10}, Shapes: []Shape{{Kind: Line, Box: Rect{0, 2.5, 50, 0}, LineMM: 0.15}}}
	bb := &builder{f: f, card: &Card{Page: p}}
	bb.text(&blk, Rect{1, 1, 30, 3.5}, "tail 10", 8, Regular, Left, Black, Label)
	c := &Card{Page: p, Blocks: []Block{blk}}
	assert.Len(t, c.Check(), 1)
}

// Issue 8.8: a list of factors wraps between items, never inside one, and a figure
// joined to its unit with a no-break space stays with it.
func TestWrapKeepsItemsWhole(t *testing.T) {
	f, err := NewFonts()
	require.NoError(t, err)
	b := &builder{f: f}
	items := []string{"UK CAA advisory factors: dry grass +20 %", Keep("upslope 0.3 %") + " " + Keep("+1.5 %"), "TOD ×1.33 ≤ TORA"}
	whole := f.WidthMM(strings.Join(items, " · "), 8, Regular)
	for _, w := range []float64{whole + 1, whole * 0.8, whole * 0.6, 40} {
		lines := b.wrapItems(items, " · ", w, 8, Regular)
		joined := strings.Join(lines, "\n")
		for _, it := range items[1:] {
			assert.Contains(t, joined, it, "width %.0f: item %q kept whole", w, it)
		}
		for _, l := range lines {
			assert.LessOrEqual(t, f.WidthMM(l, 8, Regular), w+1e-9)
		}
	}
	lines := b.wrap("add "+Keep("4 °C")+" to the OAT", f.WidthMM("add 4 °", 8, Regular), 8, Regular)
	require.Greater(t, len(lines), 2)
	assert.Contains(t, strings.Join(lines, "\n"), Keep("4 °C"), "the figure stays with its unit")
}

// Numbers print as fmt's "%.*f" prints them (the Go fmt documentation: %f is
// strconv's 'f' format): halves, negatives, negative zero, large, tiny, not finite.
func TestFixedAsFmt(t *testing.T) {
	for _, x := range []float64{0, math.Copysign(0, -1), -0.4, 0.5, 1.5, 2.5, 12.345, -7.65, 1234.5, 99999.99, 1e21, 3e-9,
		math.Inf(1), math.Inf(-1), math.NaN()} {
		for _, prec := range []int{0, 1, 2} {
			assert.Equal(t, fmt.Sprintf("%.*f", prec, x), fixedNum(x, prec), "%v %d", x, prec)
		}
	}
}

// The stroke index finds the stroke a scan of all of them finds first, for any ink:
// a grid's rules and cell frames (and a block with too few strokes to index, one
// with a stroke not finite), against inks all over and around the block, tiny, huge,
// on the rules and not finite. A property of the index (common practice: an index
// must answer as the scan it replaces).
func TestStrokeIndexAsScan(t *testing.T) {
	var grid []Rect
	for i := 0; i <= 8; i++ {
		grid = Shape{Kind: Line, Box: Rect{20 + float64(i)*12, 10, 0, 70}, LineMM: 0.15}.appendStrokes(grid)
	}
	for j := 0; j <= 7; j++ {
		grid = Shape{Kind: Line, Box: Rect{20, 10 + float64(j)*10, 96, 0}, LineMM: 0.15}.appendStrokes(grid)
	}
	for k := 0; k < 20; k++ {
		x, y := 20+float64(k%8)*12, 10+float64(k%7)*10
		grid = Shape{Kind: StrokeRect, Box: Rect{x + 0.6, y + 0.6, 10.8, 8.8}, LineMM: 0.55}.appendStrokes(grid)
	}
	nan := append(append([]Rect(nil), grid...), Rect{math.NaN(), 5, 1, 1})
	rnd := rand.New(rand.NewPCG(1, 2))
	for _, strokes := range [][]Rect{grid, grid[:5], nan} {
		var idx strokeIndex
		idx.reset(strokes)
		inks := []Rect{{math.NaN(), 0, 1, 1}, {0, math.Inf(-1), 1, math.Inf(1)}, {-1e9, -1e9, 2e9, 2e9}, {0, 0, 0, 0}}
		for _, s := range strokes {
			inks = append(inks, Rect{s.X - 0.3, s.Y - 0.3, 0.6, 0.6}, Rect{s.X + s.W, s.Y + s.H, 0.1, 0.1})
		}
		for i := 0; i < 5000; i++ {
			inks = append(inks, Rect{rnd.Float64()*140 - 10, rnd.Float64()*100 - 10, rnd.Float64() * 15, rnd.Float64() * 6})
		}
		for _, ink := range inks {
			require.Equal(t, firstTouching(ink, strokes), idx.first(ink), "ink %+v", ink)
		}
	}
}
