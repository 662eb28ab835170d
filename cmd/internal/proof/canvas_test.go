package proof

import (
	"bytes"
	"image"
	"image/color"
	"math"
	"testing"

	"codeberg.org/go-pdf/fpdf"
	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
	"gonum.org/v1/plot/vg"
)

// The canvas maps the plot's points (1/72 in, y up, origin bottom left) onto its page
// rectangle (mm, y down): 1 pt = 25.4/72 mm exactly (PostScript point, by definition).
func TestCanvasMapping(t *testing.T) {
	pdf := fpdf.New("P", "mm", "A4", "")
	pdf.AddPage()
	c := newCanvas(pdf, 10, 20, 100, 50)
	w, h := c.Size()
	assert.InDelta(t, 100, float64(w)*25.4/72, 1e-9)
	assert.InDelta(t, 50, float64(h)*25.4/72, 1e-9)
	x, y := c.page(vg.Point{})
	assert.InDelta(t, 10, x, 1e-9)
	assert.InDelta(t, 70, y, 1e-9, "the origin is the rectangle's bottom left")
	x, y = c.page(vg.Point{X: w, Y: h})
	assert.InDelta(t, 110, x, 1e-9)
	assert.InDelta(t, 20, y, 1e-9)

	// Transforms compose as vg's do: translate, then rotate a quarter turn.
	c.Push()
	c.Translate(vg.Point{X: 72, Y: 0})
	c.Rotate(math.Pi / 2)
	x, y = c.page(vg.Point{X: 72, Y: 0}) // one inch along the turned x axis: up
	assert.InDelta(t, 10+25.4, x, 1e-9)
	assert.InDelta(t, 70-25.4, y, 1e-9)
	c.Scale(2, 2)
	assert.InDelta(t, 2, c.scale(), 1e-12)
	c.Pop()
	assert.InDelta(t, 1, c.scale(), 1e-12, "Pop restores the transform")

	// An arc ends where it should, whatever the number of Bézier pieces.
	pdf.MoveTo(c.page(vg.Point{X: 10, Y: 0}))
	end := c.arc(vg.PathComp{Type: vg.ArcComp, Pos: vg.Point{}, Radius: 10, Start: 0, Angle: 3 * math.Pi / 2})
	assert.InDelta(t, 0, float64(end.X), 1e-9)
	assert.InDelta(t, -10, float64(end.Y), 1e-9)

	img := image.NewGray(image.Rect(0, 0, 2, 2))
	img.Set(1, 1, color.White)
	c.DrawImage(vg.Rectangle{Min: vg.Point{}, Max: vg.Point{X: 20, Y: 20}}, img)
	c.Pop() // one Pop too many: a contract error, reported at Output
	require.Error(t, pdf.Output(&bytes.Buffer{}))
}
