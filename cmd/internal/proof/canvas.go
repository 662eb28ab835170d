package proof

import (
	"bytes"
	"crypto/sha256"
	"fmt"
	"image"
	"image/color"
	"image/png"
	"math"

	"codeberg.org/go-pdf/fpdf"
	stdfont "golang.org/x/image/font"
	"gonum.org/v1/plot/font"
	"gonum.org/v1/plot/vg"
)

// canvas draws gonum plot's vector graphics (vg.Canvas: points, origin at the bottom
// left, y up) into a rectangle of an fpdf page (millimetres, origin at the top left,
// y down), so that a plot sits on a page of the same document as the text around it
// and uses its embedded fonts. Transforms are kept here as an affine matrix applied to
// every point; text is placed with fpdf's rotation around its anchor.
type canvas struct {
	pdf    *fpdf.Fpdf
	x0, y0 float64 // the rectangle's bottom-left corner on the page, mm
	w, h   vg.Length
	stack  []state
}

// state is what Push saves: the transform and the line and colour settings.
type state struct {
	m      [6]float64 // x' = m0 x + m2 y + m4, y' = m1 x + m3 y + m5 (points)
	width  vg.Length
	dash   []vg.Length
	offset vg.Length
	col    color.Color
}

const mmPerPoint = 25.4 / 72

// newCanvas returns a canvas for the page rectangle at (x, y) (top left, mm) of
// w x h mm.
func newCanvas(pdf *fpdf.Fpdf, x, y, w, h float64) *canvas {
	c := &canvas{pdf: pdf, x0: x, y0: y + h, w: vg.Length(w / mmPerPoint), h: vg.Length(h / mmPerPoint)}
	c.stack = []state{{m: [6]float64{1, 0, 0, 1, 0, 0}, width: 1, col: color.Black}}
	c.apply()
	return c
}

func (c *canvas) top() *state { return &c.stack[len(c.stack)-1] }

// apply sends the current line width, dash pattern and colour to fpdf.
func (c *canvas) apply() {
	s := c.top()
	c.pdf.SetLineWidth(float64(s.width) * mmPerPoint * c.scale())
	ds := make([]float64, len(s.dash))
	for i, d := range s.dash {
		ds[i] = float64(d) * mmPerPoint * c.scale()
	}
	c.pdf.SetDashPattern(ds, float64(s.offset)*mmPerPoint*c.scale())
	r, g, b, a := rgba(s.col)
	c.pdf.SetDrawColor(r, g, b)
	c.pdf.SetFillColor(r, g, b)
	c.pdf.SetTextColor(r, g, b)
	c.pdf.SetAlpha(a, "Normal")
}

func rgba(col color.Color) (r, g, b int, a float64) {
	if col == nil {
		col = color.Black
	}
	cr, cg, cb, ca := col.RGBA()
	if ca == 0 {
		return 0, 0, 0, 0
	}
	// Un-premultiply.
	return int(cr * 255 / ca), int(cg * 255 / ca), int(cb * 255 / ca), float64(ca) / 0xffff
}

// Size is the rectangle's size in points.
func (c *canvas) Size() (vg.Length, vg.Length) { return c.w, c.h }

func (c *canvas) SetLineWidth(w vg.Length) {
	c.top().width = w
	c.apply()
}

func (c *canvas) SetLineDash(pattern []vg.Length, offset vg.Length) {
	c.top().dash = append([]vg.Length(nil), pattern...)
	c.top().offset = offset
	c.apply()
}

func (c *canvas) SetColor(col color.Color) {
	if col == nil {
		col = color.Black
	}
	c.top().col = col
	c.apply()
}

// concat multiplies the current transform by n (n applied first).
func (c *canvas) concat(n [6]float64) {
	m := c.top().m
	c.top().m = [6]float64{
		m[0]*n[0] + m[2]*n[1], m[1]*n[0] + m[3]*n[1],
		m[0]*n[2] + m[2]*n[3], m[1]*n[2] + m[3]*n[3],
		m[0]*n[4] + m[2]*n[5] + m[4], m[1]*n[4] + m[3]*n[5] + m[5],
	}
}

func (c *canvas) Rotate(rad float64) {
	s, co := math.Sin(rad), math.Cos(rad)
	c.concat([6]float64{co, s, -s, co, 0, 0})
}

func (c *canvas) Translate(pt vg.Point) {
	c.concat([6]float64{1, 0, 0, 1, float64(pt.X), float64(pt.Y)})
}

func (c *canvas) Scale(x, y float64) {
	c.concat([6]float64{x, 0, 0, y, 0, 0})
	c.apply() // line widths scale with the transform
}

func (c *canvas) Push() {
	s := *c.top()
	s.dash = append([]vg.Length(nil), s.dash...)
	c.stack = append(c.stack, s)
}

func (c *canvas) Pop() {
	if len(c.stack) == 1 {
		c.pdf.SetError(fmt.Errorf("plot canvas: Pop without Push"))
		return
	}
	c.stack = c.stack[:len(c.stack)-1]
	c.apply()
}

// scale is the transform's mean scale factor (for line widths and font sizes).
func (c *canvas) scale() float64 {
	m := c.top().m
	return math.Sqrt(math.Abs(m[0]*m[3] - m[1]*m[2]))
}

// page maps a point of the plot to the page, in mm.
func (c *canvas) page(p vg.Point) (float64, float64) {
	m := c.top().m
	x := m[0]*float64(p.X) + m[2]*float64(p.Y) + m[4]
	y := m[1]*float64(p.X) + m[3]*float64(p.Y) + m[5]
	return c.x0 + x*mmPerPoint, c.y0 - y*mmPerPoint
}

func (c *canvas) Stroke(p vg.Path) {
	if c.top().width <= 0 {
		return
	}
	c.path(p)
	c.pdf.DrawPath("D")
}

func (c *canvas) Fill(p vg.Path) {
	c.path(p)
	c.pdf.DrawPath("F")
}

// path sends p to fpdf; arcs become cubic Bézier curves of at most 90 degrees each
// (control points at 4/3 tan(theta/4) of the radius, the usual construction), and
// quadratic curves cubic ones, so that the transform applies to them like to any
// point.
func (c *canvas) path(p vg.Path) {
	var start, cur vg.Point
	for _, comp := range p {
		switch comp.Type {
		case vg.MoveComp:
			start, cur = comp.Pos, comp.Pos
			c.pdf.MoveTo(c.page(comp.Pos))
		case vg.LineComp:
			cur = comp.Pos
			c.pdf.LineTo(c.page(comp.Pos))
		case vg.ArcComp:
			cur = c.arc(comp)
		case vg.CurveComp:
			switch len(comp.Control) {
			case 1:
				q := comp.Control[0]
				c1 := vg.Point{X: cur.X + 2*(q.X-cur.X)/3, Y: cur.Y + 2*(q.Y-cur.Y)/3}
				c2 := vg.Point{X: comp.Pos.X + 2*(q.X-comp.Pos.X)/3, Y: comp.Pos.Y + 2*(q.Y-comp.Pos.Y)/3}
				c.cubic(c1, c2, comp.Pos)
			case 2:
				c.cubic(comp.Control[0], comp.Control[1], comp.Pos)
			default:
				c.pdf.SetError(fmt.Errorf("plot canvas: a curve with %d control points", len(comp.Control)))
			}
			cur = comp.Pos
		case vg.CloseComp:
			c.pdf.LineTo(c.page(start))
			c.pdf.ClosePath()
			cur = start
		}
	}
}

func (c *canvas) cubic(c1, c2, to vg.Point) {
	x1, y1 := c.page(c1)
	x2, y2 := c.page(c2)
	x, y := c.page(to)
	c.pdf.CurveBezierCubicTo(x1, y1, x2, y2, x, y)
}

// arc draws an arc component and returns the point it ends at.
func (c *canvas) arc(comp vg.PathComp) vg.Point {
	r := float64(comp.Radius)
	at := func(a float64) vg.Point {
		return vg.Point{X: comp.Pos.X + vg.Length(r*math.Cos(a)), Y: comp.Pos.Y + vg.Length(r*math.Sin(a))}
	}
	// A path may begin with an arc: move to its start; otherwise draw a line to it.
	c.pdf.LineTo(c.page(at(comp.Start)))
	n := int(math.Ceil(math.Abs(comp.Angle) / (math.Pi / 2)))
	if n == 0 {
		return at(comp.Start)
	}
	step := comp.Angle / float64(n)
	k := 4.0 / 3 * math.Tan(step/4)
	for i := 0; i < n; i++ {
		a0 := comp.Start + float64(i)*step
		a1 := a0 + step
		p0, p1 := at(a0), at(a1)
		c1 := vg.Point{X: p0.X - vg.Length(k*r*math.Sin(a0)), Y: p0.Y + vg.Length(k*r*math.Cos(a0))}
		c2 := vg.Point{X: p1.X + vg.Length(k*r*math.Sin(a1)), Y: p1.Y - vg.Length(k*r*math.Cos(a1))}
		c.cubic(c1, c2, p1)
	}
	return at(comp.Start + comp.Angle)
}

// FillString writes text with its baseline starting at pt, in the document's Go
// font (bold for a bold face), turned with the transform.
func (c *canvas) FillString(f font.Face, pt vg.Point, text string) {
	if f.Font.Size == 0 || text == "" {
		return
	}
	style := ""
	if f.Font.Weight >= stdfont.WeightBold {
		style = "B"
	}
	c.pdf.SetFont(fontFamily, style, float64(f.Font.Size)*c.scale())
	x, y := c.page(pt)
	m := c.top().m
	angle := math.Atan2(m[1], m[0]) * 180 / math.Pi
	if angle != 0 {
		c.pdf.TransformBegin()
		c.pdf.TransformRotate(angle, x, y)
	}
	c.pdf.Text(x, y, text)
	if angle != 0 {
		c.pdf.TransformEnd()
	}
}

// DrawImage places img, as a PNG, in the rectangle rect (the transform's rotation
// is not applied to images: plots kneeprint draws have none).
func (c *canvas) DrawImage(rect vg.Rectangle, img image.Image) {
	var buf bytes.Buffer
	if err := png.Encode(&buf, img); err != nil {
		c.pdf.SetError(err)
		return
	}
	name := fmt.Sprintf("plot-image-%x", sha256.Sum256(buf.Bytes())) // deterministic
	opt := fpdf.ImageOptions{ImageType: "png"}
	c.pdf.RegisterImageOptionsReader(name, opt, &buf)
	x0, y0 := c.page(rect.Min)
	x1, y1 := c.page(rect.Max)
	c.pdf.ImageOptions(name, math.Min(x0, x1), math.Min(y0, y1), math.Abs(x1-x0), math.Abs(y1-y0), false, opt, 0, "")
}

var _ vg.CanvasSizer = (*canvas)(nil)
