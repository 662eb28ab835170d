package layout

import (
	"bytes"
	"cmp"
	"errors"
	"fmt"
	"io"
	"slices"
	"sort"
	"strconv"
	"sync"
	"time"
	"unicode/utf16"

	"codeberg.org/go-pdf/fpdf"
)

// RenderOptions controls the PDF.
type RenderOptions struct {
	// Sheet, when set, imposes two cards side by side on each landscape sheet with
	// cut marks; otherwise each card is one page of its own size.
	Sheet *Sheet
	// Compress deflates page streams: smaller files, more CPU per page.
	Compress bool
	// Date is written as creation and modification date, so that the same inputs
	// give a byte-identical file.
	Date   time.Time
	Title  string
	Author string
	// Fonts supplies the embedded fonts; nil makes one.
	Fonts *Fonts
	// Duplex says the cards come in front/back pairs (takeoff side, landing side):
	// on 2-up sheets the backs are then imposed mirrored (Impose).
	Duplex bool
	// DropDrawn lets RenderPDF set each element of its cards to nil once the card
	// is drawn, so that a long document's card models go as its pages are made.
	DropDrawn bool
}

const fontFamily = "go"

var fpdfStyle = [2]string{Regular: "", Bold: "B"}

// RenderPDF writes cards to w as one PDF. fpdf keeps a sticky error: it is checked
// once, at Output.
//
// The fonts are simple TrueType fonts subset to the document's characters (see
// encoding.go and embed.go); a document using more characters in one style than a
// single-byte encoding holds gets CID fonts instead (fpdf's UTF-8 fonts). Page
// streams are deflated after fpdf is done (see deflateStreams).
func RenderPDF(w io.Writer, cards []*Card, opt RenderOptions) error {
	if len(cards) == 0 {
		return errors.New("no cards to render")
	}
	p := cards[0].Page
	for _, c := range cards[1:] {
		if c.Page != p {
			return errors.New("all cards of one PDF must have the same page size")
		}
	}
	size := fpdf.SizeType{Wd: p.WidthMM, Ht: p.HeightMM}
	orient := "P"
	if opt.Sheet != nil {
		if !opt.Sheet.Fits(p) {
			return fmt.Errorf("two %s cards do not fit side by side on a %s sheet", p.Name, opt.Sheet.Name)
		}
		// fpdf swaps width and height for "L": give the portrait size.
		size, orient = fpdf.SizeType{Wd: opt.Sheet.HeightMM, Ht: opt.Sheet.WidthMM}, "L"
	}
	fonts := opt.Fonts
	if fonts == nil {
		var err error
		if fonts, err = NewFonts(); err != nil {
			return err
		}
	}
	pdf := fpdf.NewCustom(&fpdf.InitType{OrientationStr: orient, UnitStr: "mm", Size: size})
	pdf.SetCompression(false) // deflateStreams compresses, with pooled writers
	pdf.SetCatalogSort(true)
	pdf.SetCreationDate(opt.Date)
	pdf.SetModificationDate(opt.Date)
	pdf.SetProducer("kneeprint", true)
	pdf.SetCreator("kneeprint", true)
	pdf.SetTitle(opt.Title, true)
	pdf.SetAuthor(opt.Author, true)
	pdf.SetAutoPageBreak(false, 0)
	pdf.SetMargins(0, 0, 0)

	if opt.Duplex && len(cards)%2 != 0 {
		return errors.New("two-sided cards come in front and back pairs: an odd number of pages")
	}
	d := &doc{pdf: pdf}
	if err := d.addFonts(fonts, cards); err != nil {
		return err
	}
	if opt.Sheet == nil {
		for i, c := range cards {
			pdf.AddPageFormat("P", size)
			d.bookmark(c.Title)
			d.drawCard(c, 0, 0)
			if opt.DropDrawn {
				cards[i] = nil
			}
		}
	} else {
		s := *opt.Sheet
		offX, offY := (s.WidthMM-2*p.WidthMM)/2, (s.HeightMM-p.HeightMM)/2
		for _, sheet := range Impose(len(cards), opt.Duplex) {
			pdf.AddPageFormat("L", size)
			for j, ci := range sheet {
				if ci < 0 {
					continue
				}
				d.bookmark(cards[ci].Title)
				d.drawCard(cards[ci], offX+float64(j)*p.WidthMM, offY)
				if opt.DropDrawn {
					cards[ci] = nil
				}
			}
			cutMarks(pdf, s, p, offX, offY)
		}
	}
	if !opt.Compress {
		return pdf.Output(w)
	}
	plain, out := getBuffer(), getBuffer()
	defer putBuffer(plain)
	defer putBuffer(out)
	if err := pdf.Output(plain); err != nil {
		return err
	}
	if err := deflateStreams(out, plain.Bytes(), pageDeflateLevel); err != nil {
		return err
	}
	_, err := w.Write(out.Bytes())
	return err
}

// buffers recycles the byte buffers a document passes through, so a batch does
// not grow (and clear) new ones for every file.
var buffers = sync.Pool{New: func() any { return new(bytes.Buffer) }}

func getBuffer() *bytes.Buffer { return buffers.Get().(*bytes.Buffer) }

// maxPooledBuffer bounds the buffers kept for reuse: a card file is tens of
// kilobytes, a bundle (cards --bundle) megabytes; a bundle's buffers kept for the
// next bundle save growing them again, page by page.
const maxPooledBuffer = 64 << 20

func putBuffer(b *bytes.Buffer) {
	if b.Cap() <= maxPooledBuffer {
		b.Reset()
		buffers.Put(b)
	}
}

// doc is one PDF being drawn.
type doc struct {
	pdf   *fpdf.Fpdf
	enc   [2]*encoding // per style; nil with CID fonts
	cid   bool         // CID fonts (fpdf's UTF-8 fonts): text goes through fpdf.Text
	text  []byte       // text operators not yet written, see pen.show
	texts []*Text      // a card's texts in drawing order, see drawCard
	// styles and rank: the distinct styles of a card's texts and each text's
	// (groupTexts).
	styles []textStyle
	rank   []int
}

// addFonts adds both styles as simple fonts for the characters the cards use, or
// as CID fonts when they do not fit one byte.
func (d *doc) addFonts(fonts *Fonts, cards []*Card) error {
	var more [2][]rune
	seen := [2]map[rune]bool{{}, {}}
	for _, c := range cards {
		for _, b := range c.Blocks {
			for _, t := range b.Texts {
				for _, r := range t.S {
					if (r < 0x20 || r > 0x7E) && !seen[t.Style][r] {
						seen[t.Style][r] = true
						more[t.Style] = append(more[t.Style], r)
					}
				}
			}
		}
	}
	for st := range more {
		for _, r := range more[st] {
			if fonts.faces[st].glyph(r) == 0 {
				return fmt.Errorf("character %q cannot be printed: the embedded font has no glyph for it", r)
			}
		}
	}
	var sfs [2]*simpleFont
	for st := range more {
		sort.Slice(more[st], func(i, j int) bool { return more[st][i] < more[st][j] })
		sf, ok, err := fonts.simpleFont(FontStyle(st), more[st])
		if err != nil {
			return err
		}
		if !ok {
			d.cid = true
		}
		sfs[st] = sf
	}
	if !d.cid {
		for st, sf := range sfs {
			d.pdf.AddFontFromBytes(fontFamily, fpdfStyle[st], sf.def, sf.file)
			d.enc[st] = sf.enc
		}
		return nil
	}
	for st := range more {
		runes := append([]rune(nil), more[st]...)
		for r := rune(0x20); r <= 0x7E; r++ {
			runes = append(runes, r)
		}
		sub, err := subsetTTF(fonts.faces[st].ttf, runes)
		if err != nil {
			return fmt.Errorf("embedded font: %w", err)
		}
		d.pdf.AddUTF8FontFromBytes(fontFamily, fpdfStyle[st], sub)
	}
	// With a UTF-8 font current, fpdf writes bookmarks as UTF-16 itself.
	d.pdf.SetFont(fontFamily, "", 10)
	return nil
}

// bookmark adds an outline entry for the current page. Titles are text strings:
// PDFDocEncoding for ASCII, else UTF-16BE with a byte order mark (ISO 32000-1,
// 7.9.2.2).
func (d *doc) bookmark(title string) {
	if !d.cid {
		title = textString(title)
	}
	d.pdf.Bookmark(title, 0, 0)
}

func textString(s string) string {
	for _, r := range s {
		if r > 0x7E || r < 0x20 {
			b := []byte{0xFE, 0xFF}
			for _, u := range utf16.Encode([]rune(s)) {
				b = append(b, byte(u>>8), byte(u))
			}
			return string(b)
		}
	}
	return s
}

// Impose places n cards on 2-up sheets: one [left, right] pair of card indexes per
// sheet page, -1 for an empty half. Single-sided, cards go two by two. Duplex, the
// cards come front, back, front, back (a takeoff side and its landing side): each
// sheet's front page holds two fronts side by side, its back page their backs
// mirrored, the back of the left card on the right. A sheet printed double-sided and
// flipped on its short edge (turned like a book page) then has every back behind its
// own front, and cutting it gives two whole cards.
func Impose(n int, duplex bool) [][2]int {
	var out [][2]int
	at := func(i int) int {
		if i < n {
			return i
		}
		return -1
	}
	if !duplex {
		for i := 0; i < n; i += 2 {
			out = append(out, [2]int{i, at(i + 1)})
		}
		return out
	}
	for i := 0; i < n; i += 4 {
		// Cards i, i+1 are the left card's front and back; i+2, i+3 the right one's.
		out = append(out, [2]int{i, at(i + 2)}, [2]int{at(i + 3), i + 1})
	}
	return out
}

// pen draws on one fpdf document and sets font, colours and line width only when they
// change: a card has hundreds of texts and shapes in a handful of styles. known says
// which of them the PDF's graphics state holds for certain. Text is filled with the
// fill colour, so texts need no saved and restored graphics state of their own.
type pen struct {
	*doc
	style          string
	size           float64
	fill, draw, tx Color
	line           float64
	known          struct{ font, fill, draw, tx, line bool }
	// k and pageH are fpdf's points per millimetre and page height, for the
	// operators the pen writes itself (show, rect, line).
	k, pageH float64
}

func (p *pen) forget() { p.known = struct{ font, fill, draw, tx, line bool }{} }

func (p *pen) font(style string, size float64) {
	if !p.known.font || style != p.style || size != p.size {
		p.flush()
		p.pdf.SetFont(fontFamily, style, size)
		p.style, p.size, p.known.font = style, size, true
	}
}

func (p *pen) fillColor(c Color) {
	if !p.known.fill || c != p.fill {
		p.flush()
		p.pdf.SetFillColor(int(c.R), int(c.G), int(c.B))
		p.fill, p.known.fill = c, true
	}
}

func (p *pen) drawColor(c Color) {
	if !p.known.draw || c != p.draw {
		p.flush()
		p.pdf.SetDrawColor(int(c.R), int(c.G), int(c.B))
		p.draw, p.known.draw = c, true
	}
}

func (p *pen) textColor(c Color) {
	if !p.known.tx || c != p.tx {
		p.flush()
		p.pdf.SetTextColor(int(c.R), int(c.G), int(c.B))
		p.tx, p.known.tx = c, true
	}
}

func (p *pen) lineWidth(w float64) {
	if !p.known.line || w != p.line {
		p.flush()
		p.pdf.SetLineWidth(w)
		p.line, p.known.line = w, true
	}
}

// show adds a text object showing s at (x, y) points from the bottom left, written
// as fpdf.Text would but without its graphics-state save and restore (the text is
// filled with the fill colour) and without re-encoding s for every call. Texts are
// collected and written to fpdf together, until the font or a colour changes.
func (p *pen) show(style FontStyle, x, y float64, s string) {
	p.text = append(p.text, "BT "...)
	p.text = strconv.AppendFloat(p.text, x, 'f', 2, 64)
	p.text = append(p.text, ' ')
	p.text = strconv.AppendFloat(p.text, y, 'f', 2, 64)
	p.text = append(p.text, " Td ("...)
	var err error
	if p.text, err = p.enc[style].appendText(p.text, s); err != nil {
		p.pdf.SetError(err)
	}
	p.text = append(p.text, ") Tj ET\n"...)
}

// rect adds a rectangle, filled (op "f") or stroked ("S"), written as fpdf.Rect
// writes it (the same numbers to the last digit: TestPenWritesAsLibrary) but
// without a string per number; collected with the texts until flushed.
func (p *pen) rect(x, y, w, h float64, op string) {
	p.text = strconv.AppendFloat(p.text, x*p.k, 'f', 2, 64)
	p.text = append(p.text, ' ')
	p.text = strconv.AppendFloat(p.text, (p.pageH-y)*p.k, 'f', 2, 64)
	p.text = append(p.text, ' ')
	p.text = strconv.AppendFloat(p.text, w*p.k, 'f', 2, 64)
	p.text = append(p.text, ' ')
	p.text = strconv.AppendFloat(p.text, -h*p.k, 'f', 2, 64)
	p.text = append(p.text, " re "...)
	p.text = append(p.text, op...)
	p.text = append(p.text, '\n')
}

// lineTo adds a stroked line, written as fpdf.Line writes it (see rect).
func (p *pen) lineTo(x1, y1, x2, y2 float64) {
	p.text = strconv.AppendFloat(p.text, x1*p.k, 'f', 2, 64)
	p.text = append(p.text, ' ')
	p.text = strconv.AppendFloat(p.text, (p.pageH-y1)*p.k, 'f', 2, 64)
	p.text = append(p.text, " m "...)
	p.text = strconv.AppendFloat(p.text, x2*p.k, 'f', 2, 64)
	p.text = append(p.text, ' ')
	p.text = strconv.AppendFloat(p.text, (p.pageH-y2)*p.k, 'f', 2, 64)
	p.text = append(p.text, " l S\n"...)
}

// flush writes the collected texts and shapes.
func (p *pen) flush() {
	if len(p.text) > 0 {
		// RawWriteStr ends the line itself.
		p.pdf.RawWriteStr(string(p.text[:len(p.text)-1]))
		p.text = p.text[:0]
	}
}

// drawCard draws the shapes, in order, then the texts grouped by font, size and
// colour (in order within a group), so the font and colour are set once per group,
// not once per text: texts never overlap one another, only shapes, which are all
// drawn before them.
func (d *doc) drawCard(c *Card, dx, dy float64) {
	p := &pen{doc: d, k: d.pdf.GetConversionRatio()}
	_, p.pageH = d.pdf.GetPageSize()
	for _, b := range c.Blocks {
		for _, s := range b.Shapes {
			p.shape(s, dx, dy)
		}
	}
	d.groupTexts(c)
	k, pageH := p.k, p.pageH
	for _, t := range d.texts {
		p.font(fpdfStyle[t.Style], t.SizePt)
		x := t.Box.X
		switch t.Align {
		case Center:
			x += (t.Box.W - t.WidthMM) / 2
		case Right:
			x += t.Box.W - t.WidthMM
		}
		// Baseline: digits and capitals (about 0.7 em tall) centred in the box.
		base := t.Box.Y + t.Box.H/2 + 0.35*t.SizePt*ptMM
		if d.cid {
			p.textColor(t.Color)
			p.flush()
			d.pdf.Text(x+dx, base+dy, t.S)
			continue
		}
		p.fillColor(t.Color)
		// As fpdf.Text computes it, so positions are the same to the last digit.
		p.show(t.Style, (x+dx)*k, (pageH-(base+dy))*k, t.S)
	}
	p.flush()
}

func colorKey(c Color) int { return int(c.R)<<16 | int(c.G)<<8 | int(c.B) }

// textStyle is what texts are grouped by: font, size and colour.
type textStyle struct {
	style FontStyle
	size  float64
	color int
}

func (a textStyle) cmp(b textStyle) int {
	if a.style != b.style {
		return cmp.Compare(a.style, b.style)
	}
	if a.size != b.size {
		return cmp.Compare(a.size, b.size)
	}
	return cmp.Compare(a.color, b.color)
}

// groupTexts puts card c's texts into d.texts grouped by font, then size, then
// colour, in drawing order within a group: the order a stable sort by the three
// gives (TestGroupTextsAsStableSort), made by counting: a card has hundreds of
// texts in a dozen styles.
func (d *doc) groupTexts(c *Card) {
	d.styles = d.styles[:0]
	d.rank = d.rank[:0]
	for bi := range c.Blocks {
		for ti := range c.Blocks[bi].Texts {
			t := &c.Blocks[bi].Texts[ti]
			st := textStyle{t.Style, t.SizePt, colorKey(t.Color)}
			i := slices.Index(d.styles, st)
			if i < 0 {
				i = len(d.styles)
				d.styles = append(d.styles, st)
			}
			d.rank = append(d.rank, i)
		}
	}
	// Order the styles, then count each one's texts to find where its group starts.
	order := make([]int, len(d.styles))
	for i := range order {
		order[i] = i
	}
	slices.SortStableFunc(order, func(a, b int) int { return d.styles[a].cmp(d.styles[b]) })
	start := make([]int, len(d.styles)+1)
	pos := make([]int, len(d.styles)) // position of each style in the order
	for at, si := range order {
		pos[si] = at
	}
	for _, r := range d.rank {
		start[pos[r]+1]++
	}
	for i := 1; i < len(start); i++ {
		start[i] += start[i-1]
	}
	d.texts = append(d.texts[:0], make([]*Text, len(d.rank))...)
	n := 0
	for bi := range c.Blocks {
		for ti := range c.Blocks[bi].Texts {
			g := pos[d.rank[n]]
			d.texts[start[g]] = &c.Blocks[bi].Texts[ti]
			start[g]++
			n++
		}
	}
}

func (p *pen) shape(s Shape, dx, dy float64) {
	r := s.Box
	r.X += dx
	r.Y += dy
	switch s.Kind {
	case FillRect:
		p.fillColor(s.Color)
		p.rect(r.X, r.Y, r.W, r.H, "f") // fpdf's "F"
	case StrokeRect:
		p.drawColor(s.Color)
		p.lineWidth(s.LineMM)
		p.rect(r.X, r.Y, r.W, r.H, "S") // fpdf's "D"
	case Line:
		p.drawColor(s.Color)
		p.lineWidth(s.LineMM)
		p.lineTo(r.X, r.Y, r.X+r.W, r.Y+r.H)
	case Hatch:
		p.drawColor(s.Color)
		p.lineWidth(s.LineMM)
		p.flush()
		p.pdf.ClipRect(r.X, r.Y, r.W, r.H, false)
		for off := -r.H; off < r.W; off += s.SpaceMM {
			p.lineTo(r.X+off, r.Y+r.H, r.X+off+r.H, r.Y)
		}
		p.flush()
		p.pdf.ClipEnd()
		p.forget() // ClipEnd restores the graphics state saved before the clip
	}
}

// cutMarks draws short marks on the sheet's edges along every cut line.
func cutMarks(pdf *fpdf.Fpdf, s Sheet, p Page, offX, offY float64) {
	pdf.SetDrawColor(int(Grey.R), int(Grey.G), int(Grey.B))
	pdf.SetLineWidth(0.2)
	const l = 4.0
	for i := 0; i <= 2; i++ {
		x := offX + float64(i)*p.WidthMM
		pdf.Line(x, 0, x, l)
		pdf.Line(x, s.HeightMM-l, x, s.HeightMM)
	}
	if offY > 0.5 {
		for _, y := range []float64{offY, offY + p.HeightMM} {
			pdf.Line(0, y, l, y)
			pdf.Line(s.WidthMM-l, y, s.WidthMM, y)
		}
	}
}
