package layout

import (
	"bytes"
	"compress/zlib"
	"fmt"
	"io"
	"math"
	"math/rand/v2"
	"os/exec"
	"slices"
	"strings"
	"sync"
	"testing"
	"time"

	"codeberg.org/go-pdf/fpdf"
	"github.com/pdfcpu/pdfcpu/pkg/api"
	"github.com/pdfcpu/pdfcpu/pkg/pdfcpu/model"
	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
)

func init() { api.DisableConfigDir() }

// strict is pdfcpu's strict validation (ISO 32000-1 as pdfcpu reads it).
func strict() *model.Configuration {
	conf := model.NewDefaultConfiguration()
	conf.ValidationMode = model.ValidationStrict
	return conf
}

var testDate = time.Date(2026, 12, 1, 0, 0, 0, 0, time.UTC)

const testCaution = "CAUTION: not a substitute for the approved flight manual."

// testCard is a small card model with the texts and shapes a real card has: the
// runway, a declared distance, figures in both styles and colours, the symbols beyond
// code page 1252, a name in another script, characters PDF strings escape, and the
// caution. The numbers are invented.
func testCard(t testing.TB, f *Fonts, name, extra string) *Card {
	t.Helper()
	p, err := PageByName("a5")
	require.NoError(t, err)
	blk := Block{Name: "all", Box: Rect{0, 0, p.WidthMM, p.HeightMM}}
	add := func(x, y float64, s string, pt float64, st FontStyle, col Color) {
		blk.Texts = append(blk.Texts, Text{Box: Rect{x, y, 138 - x, pt * ptMM}, S: s, SizePt: pt, Style: st,
			Color: col, WidthMM: f.WidthMM(s, pt, st), Missing: string(f.Missing(s, st))})
	}
	blk.Shapes = append(blk.Shapes,
		Shape{Kind: FillRect, Box: Rect{10, 60, 30, 8}, Color: Black},
		Shape{Kind: Hatch, Box: Rect{50, 60, 30, 8}, Color: Grey, LineMM: 0.2, SpaceMM: 1.3},
		Shape{Kind: StrokeRect, Box: Rect{90, 60, 30, 8}, Color: Black, LineMM: 0.55},
		Shape{Kind: Line, Box: Rect{10, 75, 128, 0}, Color: Grey, LineMM: 0.15})
	add(10, 10, "RWY 07", 25, Bold, Black)
	add(10, 22, name, 10.5, Bold, Black)
	add(10, 30, "TORA 900 m ← limits", 9, Regular, Black)
	add(10, 36, "TOD ×1.33 ≤ TORA · 15 °C ≥ 10 kt ↑", 8, Regular, Black)
	add(10, 61, "640", 9, Bold, White)
	add(50, 61, "LIMIT", 8, Bold, Black)
	add(10, 80, `fraction (of TORA) \ 70 %`, 9, Regular, Black)
	for i, l := range strings.Fields(extra) {
		add(10+float64(i/30)*32, 90+float64(i%30)*3.2, l, 8, Regular, Black)
	}
	add(10, 195, testCaution, MinTextPt, Bold, Black)
	c := &Card{Title: "KP-TST runway 07, " + name, Page: p, Blocks: []Block{blk}}
	require.Empty(t, c.Check())
	return c
}

func render(t testing.TB, cards []*Card, opt RenderOptions) []byte {
	t.Helper()
	if opt.Date.IsZero() {
		opt.Date = testDate
	}
	var buf bytes.Buffer
	require.NoError(t, RenderPDF(&buf, cards, opt))
	return buf.Bytes()
}

// pdftotext runs poppler's pdftotext when it is installed (poppler-utils): an
// extractor independent of kneeprint and of the PDF library.
func pdftotext(t *testing.T, pdf []byte) (string, bool) {
	t.Helper()
	if _, err := exec.LookPath("pdftotext"); err != nil {
		return "", false
	}
	cmd := exec.Command("pdftotext", "-", "-")
	cmd.Stdin = bytes.NewReader(pdf)
	out, err := cmd.Output()
	require.NoError(t, err)
	return string(out), true
}

// Every card's fonts are embedded, the file validates, and its text comes back out:
// the runway, TORA, the caution, the symbols and a name in another script.
func TestRenderEmbedsFontsAndTextExtracts(t *testing.T) {
	f, err := NewFonts()
	require.NoError(t, err)
	a4, _ := SheetByName("a4")
	for _, tc := range []struct {
		name     string
		compress bool
		sheet    *Sheet
		simple   bool
		extra    string
	}{
		{"plain", false, nil, true, ""},
		{"compressed", true, nil, true, ""},
		{"sheet", true, &a4, true, ""},
		{"greek and cyrillic", true, nil, true, "Πεδίο Δοκιμής · Лётное поле"},
		// More characters beyond code page 1252 than one byte holds: CID fonts.
		{"cid fallback", true, nil, false, manyLetters()},
	} {
		t.Run(tc.name, func(t *testing.T) {
			cards := []*Card{testCard(t, f, "Wrenmoor Ærø (demo)", tc.extra), testCard(t, f, "Saltpan Mesa", "")}
			pdf := render(t, cards, RenderOptions{Compress: tc.compress, Sheet: tc.sheet, Fonts: f, Title: "test"})
			require.NoError(t, api.Validate(bytes.NewReader(pdf), strict()), "pdfcpu validates strictly")
			info, err := api.PDFInfo(bytes.NewReader(pdf), "test.pdf", nil, true, nil)
			require.NoError(t, err)
			require.Len(t, info.Fonts, 2, "one font per style")
			for _, fi := range info.Fonts {
				assert.True(t, fi.Embedded, "font %s embedded", fi.Name)
				if tc.simple {
					assert.Equal(t, "TrueType", fi.Type, fi.Name)
					assert.Regexp(t, `^[A-Z]{6}\+Go`, fi.Prefix+"+"+fi.Name, "subset tag")
				}
			}
			text, ok := pdftotext(t, pdf)
			if !ok {
				t.Skip("pdftotext not installed")
			}
			text = strings.Join(strings.Fields(text), " ")
			for _, want := range []string{"RWY 07", "TORA 900 m ← limits", "TOD ×1.33 ≤ TORA · 15 °C ≥ 10 kt ↑",
				"Wrenmoor Ærø (demo)", "Saltpan Mesa", "fraction (of TORA) \\ 70 %", "640", "LIMIT", testCaution} {
				assert.Contains(t, text, want)
			}
			for _, w := range strings.Fields(tc.extra) {
				assert.Contains(t, text, w)
			}
		})
	}
}

// manyLetters is 150 Greek and Cyrillic letters: more than the codes a single-byte
// encoding has free beyond code page 1252.
func manyLetters() string {
	var b strings.Builder
	for r := rune(0x391); r <= 0x3A9; r++ {
		if r != 0x3A2 {
			b.WriteRune(r)
		}
	}
	b.WriteByte(' ')
	for r := rune(0x3B1); r <= 0x3C9; r++ {
		b.WriteRune(r)
	}
	b.WriteByte(' ')
	for r := rune(0x410); r <= 0x44F; r++ {
		b.WriteRune(r)
		if r%16 == 15 {
			b.WriteByte(' ')
		}
	}
	return b.String()
}

// The same cards give the same bytes, with a fresh or a shared Fonts; the date is
// in the file.
func TestRenderDeterministic(t *testing.T) {
	f1, err := NewFonts()
	require.NoError(t, err)
	f2, err := NewFonts()
	require.NoError(t, err)
	for _, extra := range []string{"", "Πεδίο", manyLetters()} {
		cards := []*Card{testCard(t, f1, "Wrenmoor", extra)}
		a := render(t, cards, RenderOptions{Compress: true, Fonts: f1})
		b := render(t, cards, RenderOptions{Compress: true, Fonts: f2})
		c := render(t, cards, RenderOptions{Compress: true, Fonts: f1})
		assert.Equal(t, a, b)
		assert.Equal(t, a, c)
		d := render(t, cards, RenderOptions{Compress: true, Fonts: f1, Date: testDate.AddDate(0, 0, 1)})
		assert.NotEqual(t, a, d)
	}
}

// A Fonts serves concurrent documents (run with -race): a batch shares one.
func TestFontsConcurrent(t *testing.T) {
	f, err := NewFonts()
	require.NoError(t, err)
	names := []string{"Wrenmoor", "Ærøskøbing", "Πεδίο", "Saltpan"}
	want := make([][]byte, len(names))
	for i, n := range names {
		want[i] = render(t, []*Card{testCard(t, f, n, "")}, RenderOptions{Compress: true})
	}
	var wg sync.WaitGroup
	got := make([][]byte, 4*len(names))
	for i := range got {
		wg.Add(1)
		go func() {
			defer wg.Done()
			var buf bytes.Buffer
			c := testCard(t, f, names[i%len(names)], "")
			if err := RenderPDF(&buf, []*Card{c}, RenderOptions{Compress: true, Fonts: f, Date: testDate}); err == nil {
				got[i] = buf.Bytes()
			}
		}()
	}
	wg.Wait()
	for i := range got {
		assert.Equal(t, want[i%len(names)], got[i], names[i%len(names)])
	}
}

// Outline titles are PDF text strings: a name beyond ASCII comes back whole from
// pdfcpu, on every page.
func TestBookmarkTitles(t *testing.T) {
	f, err := NewFonts()
	require.NoError(t, err)
	for _, extra := range []string{"", manyLetters()} {
		cards := []*Card{testCard(t, f, "Ærø Field", extra), testCard(t, f, "Πεδίο", extra), testCard(t, f, "Plain", extra)}
		pdf := render(t, cards, RenderOptions{Compress: true, Fonts: f})
		bms, err := api.Bookmarks(bytes.NewReader(pdf), nil)
		require.NoError(t, err)
		require.Len(t, bms, 3)
		for i, bm := range bms {
			assert.Equal(t, cards[i].Title, bm.Title)
		}
	}
}

// A character without a glyph is refused when drawn, not printed as a blank (the
// layout check refuses it before that, see Card.Check).
func TestRenderRefusesUnprintable(t *testing.T) {
	f, err := NewFonts()
	require.NoError(t, err)
	c := testCard(t, f, "Field", "")
	c.Blocks[0].Texts[0].S = "北京"
	var buf bytes.Buffer
	err = RenderPDF(&buf, []*Card{c}, RenderOptions{Fonts: f, Date: testDate})
	assert.ErrorContains(t, err, "cannot be printed")
}

// deflateStreams gives, byte for byte, what fpdf writes with its own compression
// on, for a document with several pages, an image-free font and an outline: the
// library itself is the reference.
func TestDeflateStreamsMatchesLibrary(t *testing.T) {
	doc := func(compress bool) []byte {
		pdf := fpdf.New("P", "mm", "A5", "")
		pdf.SetCompression(compress)
		pdf.SetCatalogSort(true)
		pdf.SetCreationDate(testDate)
		pdf.SetModificationDate(testDate)
		pdf.SetFont("Helvetica", "", 12)
		for i := 0; i < 3; i++ {
			pdf.AddPage()
			pdf.Bookmark(fmt.Sprintf("page %d", i+1), 0, 0)
			for j := 0; j < 60; j++ {
				pdf.Text(10, 10+float64(j)*3, fmt.Sprintf("line %d of page %d: (TORA) 1234 m", j, i))
				pdf.Rect(100, 10+float64(j)*3, 20, 2, "D")
			}
		}
		var buf bytes.Buffer
		require.NoError(t, pdf.Output(&buf))
		return buf.Bytes()
	}
	plain, want := doc(false), doc(true)
	var got bytes.Buffer
	require.NoError(t, deflateStreams(&got, plain, zlib.BestSpeed))
	assert.Equal(t, string(want), got.String())

	// Other levels give a valid file with the same page contents.
	got.Reset()
	require.NoError(t, deflateStreams(&got, plain, zlib.BestCompression))
	require.NoError(t, api.Validate(bytes.NewReader(got.Bytes()), strict()))
	assert.Less(t, got.Len(), len(plain))
}

// Anything deflateStreams does not understand is an error, never a damaged file.
func TestDeflateStreamsRefusesBrokenInput(t *testing.T) {
	for name, in := range map[string]string{
		"empty":      "",
		"no xref":    "%PDF-1.3\n1 0 obj\n<<>>\nendobj\nstartxref\n9\n%%EOF\n",
		"bad offset": "%PDF-1.3\n1 0 obj\n<<>>\nendobj\nxref\n0 2\n0000000000 65535 f \n0000009999 00000 n \ntrailer\n<<>>\nstartxref\n34\n%%EOF\n",
	} {
		err := deflateStreams(io.Discard, []byte(in), zlib.BestSpeed)
		assert.Error(t, err, name)
	}
}

// The pen writes rectangles and lines byte for byte as fpdf's Rect and Line do, for
// any numbers (rounding halves, negatives, large and tiny), on pages of any size: a
// card drawn either way is the same file.
func TestPenWritesAsLibrary(t *testing.T) {
	rnd := rand.New(rand.NewPCG(3, 4))
	for _, size := range []fpdf.SizeType{{Wd: 148, Ht: 210}, {Wd: 297, Ht: 210}, {Wd: 127, Ht: 203.2}} {
		var shapes [][4]float64
		for i := 0; i < 400; i++ {
			shapes = append(shapes, [4]float64{rnd.Float64()*300 - 20, rnd.Float64()*300 - 20, rnd.Float64()*50 - 5, rnd.Float64()*50 - 5})
		}
		shapes = append(shapes, [4]float64{0.005, 0.015, 1e-9, 1e6}, [4]float64{math.Copysign(0, -1), 210, 0.125, 0.375})
		mk := func(draw func(pdf *fpdf.Fpdf)) []byte {
			pdf := fpdf.NewCustom(&fpdf.InitType{UnitStr: "mm", Size: size})
			pdf.SetCompression(false)
			pdf.SetCreationDate(time.Date(2027, 3, 1, 0, 0, 0, 0, time.UTC))
			pdf.SetModificationDate(time.Date(2027, 3, 1, 0, 0, 0, 0, time.UTC))
			pdf.AddPageFormat("P", size)
			draw(pdf)
			var buf bytes.Buffer
			require.NoError(t, pdf.Output(&buf))
			return buf.Bytes()
		}
		want := mk(func(pdf *fpdf.Fpdf) {
			for _, r := range shapes {
				pdf.Rect(r[0], r[1], r[2], r[3], "F")
				pdf.Rect(r[0], r[1], r[2], r[3], "D")
				pdf.Line(r[0], r[1], r[2], r[3])
			}
		})
		got := mk(func(pdf *fpdf.Fpdf) {
			p := &pen{doc: &doc{pdf: pdf}, k: pdf.GetConversionRatio()}
			_, p.pageH = pdf.GetPageSize()
			for _, r := range shapes {
				p.rect(r[0], r[1], r[2], r[3], "f")
				p.rect(r[0], r[1], r[2], r[3], "S")
				p.lineTo(r[0], r[1], r[2], r[3])
			}
			p.flush()
		})
		require.Equal(t, string(want), string(got), "page %+v", size)
	}
}

// Texts are grouped as a stable sort by font, size and colour orders them: random
// texts in a few styles, sizes and colours (NaN sizes too) over several blocks.
func TestGroupTextsAsStableSort(t *testing.T) {
	rnd := rand.New(rand.NewPCG(5, 6))
	sizes := []float64{8, 9, 12.5, 8.0000001, math.NaN()}
	colors := []Color{Black, White, Grey, {1, 2, 3}}
	for round := 0; round < 50; round++ {
		c := &Card{}
		for b := 0; b < 1+rnd.IntN(5); b++ {
			var blk Block
			for i := 0; i < rnd.IntN(60); i++ {
				blk.Texts = append(blk.Texts, Text{S: fmt.Sprint(round, b, i), Style: FontStyle(rnd.IntN(2)),
					SizePt: sizes[rnd.IntN(len(sizes))], Color: colors[rnd.IntN(len(colors))]})
			}
			c.Blocks = append(c.Blocks, blk)
		}
		var want []*Text
		for bi := range c.Blocks {
			for ti := range c.Blocks[bi].Texts {
				want = append(want, &c.Blocks[bi].Texts[ti])
			}
		}
		slices.SortStableFunc(want, func(a, b *Text) int {
			return textStyle{a.Style, a.SizePt, colorKey(a.Color)}.cmp(textStyle{b.Style, b.SizePt, colorKey(b.Color)})
		})
		d := &doc{}
		d.groupTexts(c)
		require.Equal(t, want, d.texts)
	}
}
