package proof

import (
	"fmt"
	"image/color"

	"codeberg.org/go-pdf/fpdf"
	stdfont "golang.org/x/image/font"
	"golang.org/x/image/font/gofont/gobold"
	"golang.org/x/image/font/gofont/goregular"
	"golang.org/x/image/font/opentype"
	"gonum.org/v1/plot"
	"gonum.org/v1/plot/font"
	"gonum.org/v1/plot/text"
	"gonum.org/v1/plot/vg"
)

// fontFamily is the name the proof's fonts are registered under in fpdf: the Go
// fonts of the cards (golang.org/x/image/font/gofont), embedded whole (fpdf subsets
// them to the characters used), so nothing depends on the system's fonts.
const fontFamily = "go"

// typeface is the plots' name for the same fonts.
const typeface font.Typeface = "Go"

// fonts holds the Go fonts parsed for the plots' text measuring.
type fonts struct {
	handler text.Handler
}

func newFonts() (*fonts, error) {
	reg, err := opentype.Parse(goregular.TTF)
	if err != nil {
		return nil, fmt.Errorf("embedded font: %w", err)
	}
	bold, err := opentype.Parse(gobold.TTF)
	if err != nil {
		return nil, fmt.Errorf("embedded font: %w", err)
	}
	cache := font.NewCache(font.Collection{
		{Font: font.Font{Typeface: typeface}, Face: reg},
		{Font: font.Font{Typeface: typeface, Weight: stdfont.WeightBold}, Face: bold},
	})
	return &fonts{handler: text.Plain{Fonts: cache}}, nil
}

// register adds the fonts to a document.
func registerFonts(pdf *fpdf.Fpdf) {
	pdf.AddUTF8FontFromBytes(fontFamily, "", goregular.TTF)
	pdf.AddUTF8FontFromBytes(fontFamily, "B", gobold.TTF)
}

// newPlot returns a plot whose every text is in the Go fonts, at sizes for a panel
// of about 90 mm: 9 pt title, 8 pt labels and legend, 7.5 pt tick labels.
func (f *fonts) newPlot(title, xLabel, yLabel string) *plot.Plot {
	p := plot.New()
	p.TextHandler = f.handler
	set := func(s *text.Style, size vg.Length, bold bool) {
		s.Handler = f.handler
		s.Font = font.Font{Typeface: typeface, Size: size}
		if bold {
			s.Font.Weight = stdfont.WeightBold
		}
		s.Color = color.Black
	}
	set(&p.Title.TextStyle, 9, true)
	set(&p.X.Label.TextStyle, 8, false)
	set(&p.Y.Label.TextStyle, 8, false)
	set(&p.X.Tick.Label, 7.5, false)
	set(&p.Y.Tick.Label, 7.5, false)
	set(&p.Legend.TextStyle, 7.5, false)
	p.Title.Text, p.X.Label.Text, p.Y.Label.Text = title, xLabel, yLabel
	p.Title.Padding = vg.Points(4)
	p.X.Tick.Length, p.Y.Tick.Length = vg.Points(4), vg.Points(4)
	return p
}
