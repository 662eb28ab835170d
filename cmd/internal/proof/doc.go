// Package proof writes proof sheets: a PDF per kneeprint file to hold beside the
// flight manual or the aerodrome chart and check by eye. An aircraft profile's sheet
// re-prints its tables exactly as typed, laid out like a manual's page, plots every
// row with the cells that break the smooth pattern of their neighbours circled and
// listed with their file:line, and states the correction notes, the physics fit and
// the reference figures; an airfield's draws each runway to scale and lists its data.
package proof

import (
	"bytes"
	"crypto/sha256"
	"errors"
	"fmt"
	"io"
	"strings"
	"time"

	"codeberg.org/go-pdf/fpdf"

	"kneeprint/cmd/internal/spec"
)

// Options controls a proof sheet.
type Options struct {
	// Date is printed on the sheet and written as its creation and modification
	// date, so the same file and date give a byte-identical PDF.
	Date    time.Time
	Version string // kneeprint's version, printed in the footer
	Paper   string // "a4" (default) or "letter"
}

// Caution is printed on every proof sheet (domain notes, sec. 7).
const Caution = "kneeprint gives planning figures. It is not a substitute for the approved flight manual: verify against it. " +
	"The pilot in command decides. Figures assume the aircraft, engine and technique of the profile; a poorly maintained aircraft, " +
	"soft or contaminated ground or a rushed takeoff needs more. Local regulations and licensed practice take precedence."

// Source is a file to proof: the name messages use and its bytes as read.
type Source struct {
	Name string
	Data []byte
}

// ErrKind is returned for a kind of file that has no proof sheet.
var ErrKind = errors.New("a proof sheet is made for aircraft profiles and airfields")

// Write writes the proof sheet of src, already loaded without error as doc, to w.
func Write(w io.Writer, src Source, doc *spec.Document, opt Options) error {
	switch {
	case doc.Aircraft != nil:
		return writeAircraft(w, src, doc, opt)
	case doc.Airfield != nil:
		return writeAirfield(w, src, doc, opt)
	}
	return fmt.Errorf("%s: %w (this is a %s file)", src.Name, ErrKind, doc.Kind)
}

// sheet is a proof document being written: an fpdf document with the page flow,
// the fonts and the text helpers the sheets share.
type sheet struct {
	pdf    *fpdf.Fpdf
	fonts  *fonts
	pageW  float64
	pageH  float64
	margin float64
}

const (
	bodyPt    = 9.0
	smallPt   = 8.0 // nothing on a sheet is smaller
	lineMM    = 4.2 // a 9 pt line
	footerMM  = 12.0
	keepWithH = 30.0 // a heading is kept with this much of what follows
)

func newSheet(src Source, title string, opt Options) (*sheet, error) {
	f, err := newFonts()
	if err != nil {
		return nil, err
	}
	size := fpdf.SizeType{Wd: 210, Ht: 297} // ISO 216 A4
	if opt.Paper == "letter" {
		size = fpdf.SizeType{Wd: 215.9, Ht: 279.4} // US letter, 8.5 x 11 in
	}
	pdf := fpdf.NewCustom(&fpdf.InitType{OrientationStr: "P", UnitStr: "mm", Size: size})
	pdf.SetCompression(true)
	pdf.SetCatalogSort(true)
	pdf.SetCreationDate(opt.Date)
	pdf.SetModificationDate(opt.Date)
	pdf.SetProducer("kneeprint", true)
	pdf.SetCreator("kneeprint", true)
	pdf.SetTitle(title, true)
	registerFonts(pdf)
	s := &sheet{pdf: pdf, fonts: f, pageW: size.Wd, pageH: size.Ht, margin: 15}
	pdf.SetMargins(s.margin, s.margin, s.margin)
	pdf.SetAutoPageBreak(true, s.margin+footerMM)
	pdf.AliasNbPages("{nb}")
	sum := sha256.Sum256(src.Data)
	lines := bytes.Count(src.Data, []byte("\n"))
	if len(src.Data) > 0 && src.Data[len(src.Data)-1] != '\n' {
		lines++
	}
	footer := fmt.Sprintf("kneeprint %s proof of %s (%d lines, sha256 %x), %s. Not a substitute for the approved flight manual; the pilot in command decides.",
		opt.Version, src.Name, lines, sum[:6], opt.Date.Format("2006-01-02"))
	pdf.SetFooterFunc(func() {
		pdf.SetY(-(s.margin + footerMM - 3))
		pdf.SetFont(fontFamily, "", smallPt)
		pdf.SetTextColor(0, 0, 0)
		pdf.MultiCell(s.pageW-2*s.margin-25, 3.6, footer, "T", "L", false)
		pdf.SetXY(s.pageW-s.margin-25, -(s.margin + footerMM - 3))
		pdf.CellFormat(25, 3.6, fmt.Sprintf("page %d of {nb}", pdf.PageNo()), "T", 0, "R", false, 0, "")
	})
	pdf.AddPage()
	return s, nil
}

func (s *sheet) width() float64 { return s.pageW - 2*s.margin }

// bottom is the lowest y the body may use.
func (s *sheet) bottom() float64 { return s.pageH - s.margin - footerMM }

// ensure starts a new page unless h mm are left.
func (s *sheet) ensure(h float64) {
	if s.pdf.GetY()+h > s.bottom() {
		s.pdf.AddPage()
	}
}

func (s *sheet) font(size float64, bold bool) {
	st := ""
	if bold {
		st = "B"
	}
	s.pdf.SetFont(fontFamily, st, size)
	s.pdf.SetTextColor(0, 0, 0)
}

// title writes the sheet's title and what it is a proof of.
func (s *sheet) title(title, what string) {
	s.font(16, true)
	s.pdf.MultiCell(s.width(), 7, title, "", "L", false)
	s.font(bodyPt, false)
	s.pdf.MultiCell(s.width(), lineMM, what, "", "L", false)
	s.pdf.Ln(1)
	s.caution()
}

// caution writes the caution in a framed box.
func (s *sheet) caution() {
	s.font(bodyPt, true)
	s.pdf.SetLineWidth(0.4)
	s.pdf.MultiCell(s.width(), lineMM, "CAUTION: "+Caution, "1", "L", false)
	s.pdf.Ln(2)
}

// heading writes a section heading, kept with the start of what follows.
func (s *sheet) heading(text string) {
	s.ensure(keepWithH)
	s.pdf.Ln(2)
	s.font(11, true)
	s.pdf.MultiCell(s.width(), 5.5, text, "B", "L", false)
	s.pdf.Ln(1)
	s.font(bodyPt, false)
}

// para writes a paragraph of body text.
func (s *sheet) para(text string) {
	s.font(bodyPt, false)
	s.pdf.MultiCell(s.width(), lineMM, text, "", "L", false)
	s.pdf.Ln(1)
}

// items writes "key: value" lines, the keys in bold in a column of their own.
func (s *sheet) items(rows [][2]string) {
	keyW := 0.0
	s.font(bodyPt, true)
	for _, r := range rows {
		keyW = max(keyW, s.pdf.GetStringWidth(r[0])+3)
	}
	keyW = min(keyW, s.width()/3)
	for _, r := range rows {
		s.font(bodyPt, false)
		lines := s.pdf.SplitText(r[1], s.width()-keyW)
		s.ensure(float64(len(lines)) * lineMM)
		x, y := s.pdf.GetXY()
		s.font(bodyPt, true)
		s.pdf.CellFormat(keyW, lineMM, r[0], "", 0, "L", false, 0, "")
		s.font(bodyPt, false)
		s.pdf.SetXY(x+keyW, y)
		s.pdf.MultiCell(s.width()-keyW, lineMM, r[1], "", "L", false)
	}
	s.pdf.Ln(1)
}

// column of a plain table.
type column struct {
	head  string
	width float64 // mm; the last column takes what is left when 0
	align string  // "L", "C" or "R"
}

// table writes a plain table with a header row, repeated on each new page; cells
// wrap within their column. bold marks rows to print in bold.
func (s *sheet) table(cols []column, rows [][]string, bold func(i int) bool) {
	used := 0.0
	for _, c := range cols {
		used += c.width
	}
	ws := make([]float64, len(cols))
	for i, c := range cols {
		ws[i] = c.width
		if c.width == 0 {
			ws[i] = s.width() - used
		}
	}
	header := func() {
		s.font(smallPt, true)
		s.pdf.SetFillColor(225, 225, 225)
		s.pdf.SetLineWidth(0.2)
		h := 0.0
		for i, c := range cols {
			h = max(h, float64(len(s.pdf.SplitText(c.head, ws[i]-1)))*3.6)
		}
		x, y := s.pdf.GetXY()
		for i, c := range cols {
			s.pdf.SetXY(x, y)
			s.pdf.Rect(x, y, ws[i], h+1, "FD")
			s.pdf.MultiCell(ws[i], 3.6, c.head, "", c.align, false)
			x += ws[i]
		}
		s.pdf.SetXY(s.margin, y+h+1)
	}
	s.ensure(12)
	header()
	for r, row := range rows {
		b := bold != nil && bold(r)
		s.font(smallPt, b)
		h := 0.0
		for i := range cols {
			if i < len(row) {
				h = max(h, float64(len(s.pdf.SplitText(row[i], ws[i]-1)))*3.6)
			}
		}
		h += 0.8
		if s.pdf.GetY()+h > s.bottom() {
			s.pdf.AddPage()
			header()
			s.font(smallPt, b)
		}
		x, y := s.pdf.GetXY()
		for i, c := range cols {
			s.pdf.SetXY(x, y+0.4)
			s.pdf.Rect(x, y, ws[i], h, "D")
			if i < len(row) {
				s.pdf.MultiCell(ws[i], 3.6, row[i], "", c.align, false)
			}
			x += ws[i]
		}
		s.pdf.SetXY(s.margin, y+h)
	}
	s.pdf.Ln(2)
}

// finish writes the document to w; fpdf's sticky error is checked here.
func (s *sheet) finish(w io.Writer) error {
	var buf bytes.Buffer
	if err := s.pdf.Output(&buf); err != nil {
		return fmt.Errorf("proof PDF: %w", err)
	}
	_, err := w.Write(buf.Bytes())
	return err
}

// joinNonEmpty joins the non-empty parts with sep.
func joinNonEmpty(sep string, parts ...string) string {
	var out []string
	for _, p := range parts {
		if strings.TrimSpace(p) != "" {
			out = append(out, p)
		}
	}
	return strings.Join(out, sep)
}
