package proof

import (
	"fmt"
	"image/color"

	"gonum.org/v1/plot"
	"gonum.org/v1/plot/plotter"
	"gonum.org/v1/plot/vg"
	"gonum.org/v1/plot/vg/draw"

	"kneeprint/cmd/internal/typedtable"
	"kneeprint/cmd/internal/units"
)

// Panel geometry on the page, mm.
const (
	panelH   = 78.0
	panelGap = 5.0
)

// Curves are told apart by glyph and dash, never by colour alone (the sheet is
// printed in grey, and read under red light).
var (
	glyphs = []draw.GlyphDrawer{draw.CircleGlyph{}, draw.BoxGlyph{}, draw.TriangleGlyph{}, draw.CrossGlyph{}, draw.PlusGlyph{}, draw.PyramidGlyph{}, draw.SquareGlyph{}, draw.RingGlyph{}}
	dashes = [][]vg.Length{nil, {vg.Points(4), vg.Points(2)}, {vg.Points(1), vg.Points(1.5)}, {vg.Points(6), vg.Points(2), vg.Points(1), vg.Points(2)}}
	greys  = []color.Color{color.Black, color.Gray{Y: 90}}
)

// rowPlots draws, for every weight block, one panel per quantity of the group: the
// figure against temperature, one curve per pressure altitude, with each flagged
// cell circled and labelled with its file line.
func (s *sheet) rowPlots(group []*typedtable.Table, flagged map[cellKey]typedtable.Outlier) error {
	t0 := group[0]
	cols := min(len(group), 2)
	w := (s.width() - float64(cols-1)*panelGap) / float64(cols)
	xs, tUnit := temperatureAxis(t0.Temperatures)
	for b := range t0.Blocks {
		for q0 := 0; q0 < len(group); q0 += cols {
			s.ensure(panelH)
			y := s.pdf.GetY()
			for q := q0; q < min(q0+cols, len(group)); q++ {
				p, err := s.rowPlot(group[q], b, xs, tUnit, flagged)
				if err != nil {
					return err
				}
				x := s.margin + float64(q-q0)*(w+panelGap)
				p.Draw(draw.New(newCanvas(s.pdf, x, y, w, panelH-3)))
			}
			s.pdf.SetXY(s.margin, y+panelH)
		}
	}
	return nil
}

// temperatureAxis returns the temperatures in the unit the first was typed in.
func temperatureAxis(ls []typedtable.Label) ([]float64, string) {
	unit := "C"
	if len(ls) > 0 {
		if _, u, err := units.ParseUnit(ls[0].Text, units.Temperature); err == nil {
			unit = u
		}
	}
	xs := make([]float64, len(ls))
	for i, l := range ls {
		xs[i] = units.Celsius(l.SI)
		if unit == "F" {
			xs[i] = xs[i]*9/5 + 32
		}
	}
	return xs, unit
}

func (s *sheet) rowPlot(t *typedtable.Table, b int, xs []float64, tUnit string, flagged map[cellKey]typedtable.Outlier) (*plot.Plot, error) {
	bl := t.Blocks[b]
	p := s.fonts.newPlot(fmt.Sprintf("%s, %s", t.Quantity, bl.Weight.Text), fmt.Sprintf("temperature (%s)", tUnit), fmt.Sprintf("%s (%s)", t.Quantity, t.Unit))
	// The legend in a corner the curves leave empty: distances rise with
	// temperature (top left); rates of climb fall, and may fall to zero and below,
	// so their temperature axis runs on past the last column to leave room at the
	// right (see below).
	p.Legend.Top, p.Legend.Left = true, !t.Linear
	p.Legend.Padding = vg.Points(2)
	p.Legend.ThumbnailWidth = vg.Points(16)
	// The columns of the table are the ticks of the temperature axis.
	var ticks []plot.Tick
	for _, x := range xs {
		ticks = append(ticks, plot.Tick{Value: x, Label: fmt.Sprintf("%g", x)})
	}
	p.X.Tick.Marker = plot.ConstantTicks(ticks)
	p.Y.Tick.Marker = plainTicks{}
	var rings plotter.XYs
	var labels plotter.XYLabels
	for r, pa := range t.PressureAltitudes {
		pts := make(plotter.XYs, len(xs))
		for k, x := range xs {
			pts[k] = plotter.XY{X: x, Y: bl.Rows[r][k].Value}
			if _, ok := flagged[cellKey{t, b, r, k}]; ok {
				rings = append(rings, pts[k])
				labels.XYs = append(labels.XYs, pts[k])
				labels.Labels = append(labels.Labels, fmt.Sprintf("line %d", bl.Rows[r][k].Line))
			}
		}
		line, scatter, err := plotter.NewLinePoints(pts)
		if err != nil {
			return nil, fmt.Errorf("plot of %s: %w", t.Quantity, err)
		}
		line.Color = greys[r%len(greys)]
		line.Width = vg.Points(0.8)
		line.Dashes = dashes[r%len(dashes)]
		scatter.GlyphStyle = draw.GlyphStyle{Color: line.Color, Radius: vg.Points(2), Shape: glyphs[r%len(glyphs)]}
		p.Add(line, scatter)
		p.Legend.Add(pa.Text, line, scatter)
	}
	if t.Linear && len(xs) > 1 {
		// The rate axis from zero (the ceiling a rate falls toward) or the lowest
		// rate below it; the temperature axis 40 % past the last column, for the legend.
		lo := 0.0
		for _, row := range bl.Rows {
			for _, c := range row {
				lo = min(lo, c.Value)
			}
		}
		p.Y.Min = lo
		p.X.Min, p.X.Max = xs[0], xs[len(xs)-1]+0.4*(xs[len(xs)-1]-xs[0])
	}
	if len(rings) > 0 {
		ring, err := plotter.NewScatter(rings)
		if err != nil {
			return nil, err
		}
		ring.GlyphStyle = draw.GlyphStyle{Color: color.Black, Radius: vg.Points(6), Shape: draw.RingGlyph{}}
		p.Add(ring)
		lab, err := plotter.NewLabels(labels)
		if err != nil {
			return nil, err
		}
		for i := range lab.TextStyle {
			lab.TextStyle[i] = p.Legend.TextStyle
			lab.TextStyle[i].Font.Weight = 700
		}
		lab.Offset = vg.Point{X: vg.Points(7), Y: vg.Points(-3)}
		p.Add(lab)
		p.Legend.Add("off its neighbours (file line)", ring)
	}
	return p, nil
}
