package layout

import (
	"errors"
	"fmt"
	"io"
	"time"

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
	// Fonts supplies the embedded fonts, subset to what cards use; nil makes one.
	Fonts *Fonts
	// Duplex says the cards come in front/back pairs (takeoff side, landing side):
	// on 2-up sheets the backs are then imposed mirrored (Impose).
	Duplex bool
}

const fontFamily = "go"

// RenderPDF writes cards to w as one PDF. fpdf keeps a sticky error: it is checked
// once, at Output.
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
	pdf := fpdf.NewCustom(&fpdf.InitType{OrientationStr: orient, UnitStr: "mm", Size: size})
	pdf.SetCompression(opt.Compress)
	pdf.SetCatalogSort(true)
	pdf.SetCreationDate(opt.Date)
	pdf.SetModificationDate(opt.Date)
	pdf.SetProducer("kneeprint", true)
	pdf.SetCreator("kneeprint", true)
	pdf.SetTitle(opt.Title, true)
	pdf.SetAuthor(opt.Author, true)
	pdf.SetAutoPageBreak(false, 0)
	pdf.SetMargins(0, 0, 0)
	fonts := opt.Fonts
	if fonts == nil {
		var err error
		if fonts, err = NewFonts(); err != nil {
			return err
		}
	}
	used := [2]map[rune]bool{{}, {}}
	for _, c := range cards {
		for _, b := range c.Blocks {
			for _, t := range b.Texts {
				for _, r := range t.S {
					used[t.Style][r] = true
				}
			}
		}
	}
	pdf.AddUTF8FontFromBytes(fontFamily, "", fonts.pdfFont(Regular, used[Regular]))
	pdf.AddUTF8FontFromBytes(fontFamily, "B", fonts.pdfFont(Bold, used[Bold]))

	if opt.Duplex && len(cards)%2 != 0 {
		return errors.New("two-sided cards come in front and back pairs: an odd number of pages")
	}
	if opt.Sheet == nil {
		for _, c := range cards {
			pdf.AddPageFormat("P", size)
			pdf.Bookmark(c.Title, 0, 0)
			drawCard(pdf, c, 0, 0)
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
				pdf.Bookmark(cards[ci].Title, 0, 0)
				drawCard(pdf, cards[ci], offX+float64(j)*p.WidthMM, offY)
			}
			cutMarks(pdf, s, p, offX, offY)
		}
	}
	return pdf.Output(w)
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
// which of them the PDF's graphics state holds for certain.
type pen struct {
	pdf            *fpdf.Fpdf
	style          string
	size           float64
	fill, draw, tx Color
	line           float64
	known          struct{ font, fill, draw, tx, line bool }
}

func (p *pen) forget() { p.known = struct{ font, fill, draw, tx, line bool }{} }

func (p *pen) font(style string, size float64) {
	if !p.known.font || style != p.style || size != p.size {
		p.pdf.SetFont(fontFamily, style, size)
		p.style, p.size, p.known.font = style, size, true
	}
}

func (p *pen) fillColor(c Color) {
	if !p.known.fill || c != p.fill {
		p.pdf.SetFillColor(int(c.R), int(c.G), int(c.B))
		p.fill, p.known.fill = c, true
	}
}

func (p *pen) drawColor(c Color) {
	if !p.known.draw || c != p.draw {
		p.pdf.SetDrawColor(int(c.R), int(c.G), int(c.B))
		p.draw, p.known.draw = c, true
	}
}

func (p *pen) textColor(c Color) {
	if !p.known.tx || c != p.tx {
		p.pdf.SetTextColor(int(c.R), int(c.G), int(c.B))
		p.tx, p.known.tx = c, true
	}
}

func (p *pen) lineWidth(w float64) {
	if !p.known.line || w != p.line {
		p.pdf.SetLineWidth(w)
		p.line, p.known.line = w, true
	}
}

func drawCard(pdf *fpdf.Fpdf, c *Card, dx, dy float64) {
	p := &pen{pdf: pdf}
	for _, b := range c.Blocks {
		for _, s := range b.Shapes {
			p.shape(s, dx, dy)
		}
	}
	for _, b := range c.Blocks {
		for _, t := range b.Texts {
			style := ""
			if t.Style == Bold {
				style = "B"
			}
			p.font(style, t.SizePt)
			p.textColor(t.Color)
			x := t.Box.X
			switch t.Align {
			case Center:
				x += (t.Box.W - t.WidthMM) / 2
			case Right:
				x += t.Box.W - t.WidthMM
			}
			// Baseline: digits and capitals (about 0.7 em tall) centred in the box.
			base := t.Box.Y + t.Box.H/2 + 0.35*t.SizePt*ptMM
			pdf.Text(x+dx, base+dy, t.S)
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
		p.pdf.Rect(r.X, r.Y, r.W, r.H, "F")
	case StrokeRect:
		p.drawColor(s.Color)
		p.lineWidth(s.LineMM)
		p.pdf.Rect(r.X, r.Y, r.W, r.H, "D")
	case Line:
		p.drawColor(s.Color)
		p.lineWidth(s.LineMM)
		p.pdf.Line(r.X, r.Y, r.X+r.W, r.Y+r.H)
	case Hatch:
		p.drawColor(s.Color)
		p.lineWidth(s.LineMM)
		p.pdf.ClipRect(r.X, r.Y, r.W, r.H, false)
		for off := -r.H; off < r.W; off += s.SpaceMM {
			p.pdf.Line(r.X+off, r.Y+r.H, r.X+off+r.H, r.Y)
		}
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
