package proof

import (
	"fmt"
	"image/color"
	"io"
	"math"
	"strings"

	"gonum.org/v1/plot"
	"gonum.org/v1/plot/plotter"
	"gonum.org/v1/plot/vg"
	"gonum.org/v1/plot/vg/draw"

	"kneeprint/cmd/internal/spec"
	"kneeprint/cmd/internal/units"
	"kneeprint/perf"
)

// obstacle is something to clear beyond the end of a runway, as the schematic draws
// it: DistanceM past the end of the TORA (the far end of the runway in the direction
// of takeoff), HeightM above the ground there (perf.Obstacle, as the loader resolved
// it), and the file line it is typed on.
type obstacle struct {
	DistanceM float64
	HeightM   float64
	LateralM  float64 // right of the extended centre line as seen taking off, positive
	Note      string
	Line      int // 0 when unknown
}

// at is where the schematic draws o, in metres along the drawing: the first end
// takes off to the right, the end of its TORA at x = length; the second to the left,
// the end of its TORA at x = 0 (as declared draws the bars).
func (o obstacle) at(length float64, first bool) float64 {
	if first {
		return length + o.DistanceM
	}
	return -o.DistanceM
}

// endView is a runway end as the schematic draws it, with its obstacles.
type endView struct {
	perf.RunwayEnd
	Obstacles []obstacle
}

// endViews is the ends of runway ri of the airfield doc as the schematic draws them.
func endViews(doc *spec.Document, ri int, r perf.Runway) []endView {
	out := make([]endView, len(r.Ends))
	for i, e := range r.Ends {
		out[i] = endView{RunwayEnd: e}
		for k, o := range e.Obstacles {
			out[i].Obstacles = append(out[i].Obstacles, obstacle{DistanceM: o.PastEndM, HeightM: o.HeightM, LateralM: o.LateralM, Note: o.Note,
				Line: firstLine(doc, fmt.Sprintf("runways[%d].ends[%d].obstacles[%d].", ri, i, k))})
		}
	}
	return out
}

// firstLine is the first line of the file holding a value under the field path
// prefix (runways[0].ends[1].obstacles[0].), 0 when none does.
func firstLine(doc *spec.Document, prefix string) int {
	line := 0
	for f, v := range doc.Scalars {
		if strings.HasPrefix(f, prefix) && (line == 0 || v.Line < line) {
			line = v.Line
		}
	}
	return line
}

// obstacleRows lists every obstacle of the airfield as typed (height or elevation,
// distance past the end of the TORA or from the start of the run, lateral offset)
// beside what the loader made of it, with its file line.
func obstacleRows(doc *spec.Document) [][]string {
	var rows [][]string
	for ri, r := range doc.Airfield.Runways {
		for ei, e := range r.Ends {
			for k, o := range e.Obstacles {
				path := fmt.Sprintf("runways[%d].ends[%d].obstacles[%d].", ri, ei, k)
				typed := func(keys ...string) string {
					for _, key := range keys {
						if v, ok := doc.Scalars[path+key]; ok {
							return fmt.Sprintf("%s: %s", key, v.Text)
						}
					}
					return "-"
				}
				lateral := "not given"
				if v, ok := doc.Scalars[path+"lateral"]; ok {
					lateral = v.Text
				}
				line := ""
				if l := firstLine(doc, path); l > 0 {
					line = fmt.Sprint(l)
				}
				rows = append(rows, []string{
					e.Designator, line, o.Note,
					typed("height", "elevation"), fmt.Sprintf("%.0f ft (%.1f m)", units.Feet(o.HeightM), o.HeightM),
					typed("past_end", "from_start"), fmt.Sprintf("%.0f m", o.PastEndM),
					lateral,
				})
			}
		}
	}
	return rows
}

// writeAirfield writes an airfield's proof sheet: the data as typed, then a to-scale
// schematic of each runway.
func writeAirfield(w io.Writer, src Source, doc *spec.Document, opt Options) error {
	a := doc.Airfield
	s, err := newSheet(src, "kneeprint proof: "+a.Name, opt)
	if err != nil {
		return err
	}
	s.title("Proof sheet: "+a.Name, fmt.Sprintf("Airfield file %s, as typed, to check by eye against the published aerodrome chart. Made %s.", src.Name, opt.Date.Format("2006-01-02")))
	s.para("How to use this sheet: compare every figure with the aerodrome chart and the published declared distances, and tick it. " +
		"The drawings are to scale: each declared distance is a bar ending where it ends, at the far end of the runway in the direction " +
		"of takeoff (TODA and ASDA beyond it by the clearway and the stopway), so a displaced start of the takeoff run or a displaced " +
		"landing threshold shows as a shorter bar.")
	typed := func(field string) string {
		if v, ok := doc.Scalars[field]; ok {
			return fmt.Sprintf("%s (line %d)", v.Text, v.Line)
		}
		return ""
	}
	variation := typed("variation")
	if variation == "" {
		variation = "not given: 0 deg assumed"
	}
	s.heading("Aerodrome")
	s.items([][2]string{
		{"name", a.Name},
		{"identifier", a.Ident},
		{"elevation", typed("elevation")},
		{"magnetic variation", variation},
		{"runways", fmt.Sprint(len(a.Runways))},
	})
	s.heading("Runway ends as typed")
	var rows [][]string
	for ri, r := range a.Runways {
		for ei, e := range r.Ends {
			path := fmt.Sprintf("runways[%d].ends[%d].", ri, ei)
			or := func(key, dflt string) string {
				if v, ok := doc.Scalars[path+key]; ok {
					return v.Text
				}
				return dflt
			}
			heading := or("heading", fmt.Sprintf("%03.0f deg (from %s)", e.HeadingDeg, e.Designator))
			thr := or("threshold_elevation", "-")
			line := ""
			if v, ok := doc.Scalars[path+"designator"]; ok {
				line = fmt.Sprint(v.Line)
			}
			rows = append(rows, []string{
				e.Designator, line, heading,
				or("tora", "-"), or("toda", "= TORA"), or("asda", "= TORA"), or("lda", "-"),
				thr, fmt.Sprintf("%+.2f %%", e.SlopePct),
				fmt.Sprintf("%s, %s", r.Surface, r.Condition), e.Notes,
			})
		}
	}
	s.table([]column{{"end", 9, "L"}, {"line", 9, "R"}, {"heading", 17, "L"}, {"TORA", 14, "R"}, {"TODA", 14, "R"}, {"ASDA", 14, "R"},
		{"LDA", 14, "R"}, {"threshold elevation", 17, "R"}, {"slope", 13, "R"}, {"surface", 17, "L"}, {"notes", 0, "L"}}, rows, nil)
	if rows := obstacleRows(doc); len(rows) > 0 {
		s.heading("Obstacles past the runway ends, as typed")
		s.para("Each obstacle as the file gives it, and as kneeprint takes it: its top above the ground at the end of the TORA (an elevation less the " +
			"other end's threshold elevation) and its distance past the end of the TORA (a distance from the start of the run less the TORA). " +
			"Compare them with the obstacle data of the aerodrome chart. The cards count every obstacle listed, whatever its lateral offset.")
		s.table([]column{{"end", 9, "L"}, {"line", 9, "R"}, {"obstacle", 0, "L"}, {"top, as typed", 27, "L"}, {"above the end of the TORA", 24, "R"},
			{"distance, as typed", 29, "L"}, {"past the end of the TORA", 20, "R"}, {"lateral", 20, "L"}}, rows, nil)
	}
	if len(doc.Warnings) > 0 {
		s.heading("Warnings of the loader (validate)")
		for _, w := range doc.Warnings {
			s.para("! " + w)
		}
	}
	for i, r := range a.Runways {
		length := runwayLength(doc, i, r)
		views := endViews(doc, i, r)
		p, err := s.schematic(views, length)
		if err != nil {
			return err
		}
		h := 22 + 9*float64(lanes(pick(views, 0), length)+lanes(pick(views, 1), length)-1)
		s.ensure(h + 10) // the heading stays with its drawing
		s.heading(runwayHeading(doc, i, r, length))
		s.ensure(h)
		y := s.pdf.GetY()
		p.Draw(draw.New(newCanvas(s.pdf, s.margin, y, s.width(), h)))
		s.pdf.SetXY(s.margin, y+h+2)
	}
	return s.finish(w)
}

// runwayLength is the length the schematic draws: the file's length when given,
// else the longest declared run of either end.
func runwayLength(doc *spec.Document, i int, r perf.Runway) float64 {
	if v, ok := doc.Scalars[fmt.Sprintf("runways[%d].length", i)]; ok {
		if l, err := units.Parse(v.Text, units.Length); err == nil {
			return l
		}
	}
	l := 0.0
	for _, e := range r.Ends {
		l = math.Max(l, math.Max(e.TORAM, e.LDAM))
	}
	return l
}

func runwayHeading(doc *spec.Document, i int, r perf.Runway, length float64) string {
	var ds []string
	for _, e := range r.Ends {
		ds = append(ds, e.Designator)
	}
	slope := "level"
	if len(r.Ends) > 0 && r.Ends[0].SlopePct != 0 {
		up := r.Ends[0]
		if len(r.Ends) > 1 && r.Ends[1].SlopePct > 0 {
			up = r.Ends[1]
		}
		slope = fmt.Sprintf("slope %.2f %%, uphill for %s", math.Abs(up.SlopePct), up.Designator)
	}
	line := ""
	if v, ok := doc.Scalars[fmt.Sprintf("runways[%d].surface", i)]; ok {
		line = fmt.Sprintf(", line %d", v.Line)
	}
	return fmt.Sprintf("Runway %s (runways[%d]%s): %s, %s, %.0f m long, %s", strings.Join(ds, "/"), i, line, r.Surface, r.Condition, length, slope)
}

// bar is one declared distance of one end, as drawn: from the start to the end of
// the distance, in metres along the drawing.
type bar struct {
	name     string
	metres   float64
	from, to float64
}

// declared lists an end's declared distances as bars. The first end (first true)
// takes off to the right, its departure end at x = length; the second to the left,
// its departure end at x = 0. Each distance ends where it ends: TORA and LDA at the
// departure end, TODA and ASDA beyond it by the clearway and the stopway; TODA and
// ASDA start where the run starts.
func declared(v endView, length float64, first bool) []bar {
	dir, far := 1.0, length
	if !first {
		dir, far = -1, 0
	}
	var out []bar
	add := func(name string, m float64) {
		if m <= 0 {
			return
		}
		b := bar{name: name, metres: m, from: far - dir*m, to: far}
		if name == "TODA" || name == "ASDA" {
			b.from, b.to = far-dir*v.TORAM, far+dir*(m-v.TORAM)
		}
		out = append(out, b)
	}
	add("TORA", v.TORAM)
	add("TODA", v.TODAM)
	add("ASDA", v.ASDAM)
	add("LDA", v.LDAM)
	return out
}

// schematic draws a runway to scale: the strip with its ends' designators and
// headings, each end's declared distances as bars, clearway and stopway beyond the
// ends, displaced starts and thresholds, the slope, and the obstacles of each end.
// The first end takes off to the right (its departure end at x = length), the
// second to the left; the first end's bars are above the strip, the second's below.
func (s *sheet) schematic(views []endView, length float64) (*plot.Plot, error) {
	p := s.fonts.newPlot("", "metres along the runway, to scale", "")
	p.X.Tick.Marker = plainTicks{}
	p.Y.LineStyle.Width = 0
	p.Y.Tick.Length = 0
	var ticks []plot.Tick
	var labels []labelAt
	var err error
	poly := func(pts plotter.XYs, fill color.Color, line vg.Length, dashed bool) {
		if err != nil {
			return
		}
		var pg *plotter.Polygon
		if pg, err = plotter.NewPolygon(pts); err != nil {
			return
		}
		pg.Color = fill
		pg.LineStyle = draw.LineStyle{Color: color.Black, Width: line}
		if dashed {
			pg.LineStyle.Dashes = []vg.Length{vg.Points(3), vg.Points(2)}
		}
		p.Add(pg)
	}
	rect := func(x0, x1, y0, y1 float64, fill color.Color, dashed bool) {
		poly(plotter.XYs{{X: math.Min(x0, x1), Y: y0}, {X: math.Max(x0, x1), Y: y0}, {X: math.Max(x0, x1), Y: y1}, {X: math.Min(x0, x1), Y: y1}}, fill, vg.Points(0.7), dashed)
	}
	// The strip, dark, at y = 0.
	rect(0, length, -0.35, 0.35, color.Gray{Y: 100}, false)
	var names []string
	for _, v := range views {
		names = append(names, v.Designator)
	}
	ticks = append(ticks, plot.Tick{Value: 0, Label: "runway " + strings.Join(names, "/")})
	inset := length * 0.01
	lo, hi := 0.0, length
	for i, v := range views {
		dir, sign, far := 1.0, 1.0, length
		align, back := draw.XLeft, draw.XRight
		if i == 1 {
			dir, sign, far = -1, -1, 0
			align, back = draw.XRight, draw.XLeft
		}
		head := fmt.Sprintf("%s (%03.0f° M) →", v.Designator, v.HeadingDeg)
		if i == 1 {
			head = fmt.Sprintf("← %s (%03.0f° M)", v.Designator, v.HeadingDeg)
		}
		// The designator where the takeoff run starts.
		labels = append(labels, labelAt{far - dir*math.Min(v.TORAM, length) + dir*inset, 0, head, align, true, color.White})
		lane := 1.0
		for _, b := range declared(v, length, i == 0) {
			y := lane * sign
			x0, x1 := b.from, b.to
			lo, hi = math.Min(lo, math.Min(x0, x1)), math.Max(hi, math.Max(x0, x1))
			fill := color.Gray{Y: 215}
			if b.name == "TORA" {
				fill = color.Gray{Y: 170}
			}
			rect(x0, x1, y-0.3, y+0.3, fill, false)
			// An arrow head at the end, in the direction of takeoff or landing.
			poly(plotter.XYs{{X: x1, Y: y - 0.3}, {X: x1 + dir*length*0.02, Y: y}, {X: x1, Y: y + 0.3}}, color.Black, 0, false)
			ticks = append(ticks, plot.Tick{Value: y, Label: fmt.Sprintf("%s %s %.0f m", v.Designator, b.name, b.metres)})
			// Beyond the runway: clearway and stopway, dashed, on the strip's lane.
			if (b.name == "TODA" || b.name == "ASDA") && b.metres > v.TORAM+0.5 {
				h, what := 0.25, "stopway"
				if b.name == "TODA" {
					h, what = 0.42, "clearway"
				}
				rect(far, x1, -h, h, nil, true)
				labels = append(labels, labelAt{x1 - dir*inset, y, fmt.Sprintf("%s %.0f m", what, b.metres-v.TORAM), back, false, color.Black})
			}
			// A displaced start of the run, or a displaced landing threshold: a white
			// line across the strip, and the distance in the bar.
			if (b.name == "TORA" || b.name == "LDA") && b.metres < length-0.5 {
				var mark *plotter.Line
				if mark, err = plotter.NewLine(plotter.XYs{{X: x0, Y: -0.35}, {X: x0, Y: 0.35}}); err != nil {
					return nil, err
				}
				mark.LineStyle = draw.LineStyle{Color: color.White, Width: vg.Points(1.5)}
				p.Add(mark)
				what := "run starts"
				if b.name == "LDA" {
					what = "threshold"
				}
				labels = append(labels, labelAt{x0 + dir*inset, y, fmt.Sprintf("%s %.0f m in", what, length-b.metres), align, false, color.Black})
			}
			lane++
		}
		// Each obstacle on a lane of its own: a dotted ground line from the end of
		// the TORA (the far end of the runway) to where it stands, to scale, and a
		// mark there, its words above the line.
		for _, o := range v.Obstacles {
			y := lane * sign
			x := o.at(length, i == 0)
			lo, hi = math.Min(lo, x), math.Max(hi, x)
			var reach *plotter.Line
			if reach, err = plotter.NewLine(plotter.XYs{{X: far, Y: y - 0.3}, {X: x, Y: y - 0.3}}); err != nil {
				return nil, err
			}
			reach.LineStyle = draw.LineStyle{Color: color.Black, Width: vg.Points(0.7), Dashes: []vg.Length{vg.Points(1), vg.Points(1.5)}}
			p.Add(reach)
			poly(plotter.XYs{{X: x - length*0.012, Y: y - 0.3}, {X: x + length*0.012, Y: y - 0.3}, {X: x, Y: y + 0.3}}, color.Black, 0, false)
			ticks = append(ticks, plot.Tick{Value: y, Label: fmt.Sprintf("%s obstacle: %s", v.Designator, o.Note)})
			what := fmt.Sprintf("%.0f ft, %.0f m past the end of the TORA", units.Feet(o.HeightM), o.DistanceM)
			switch {
			case o.LateralM < 0:
				what += fmt.Sprintf(", %.0f m left", -o.LateralM)
			case o.LateralM > 0:
				what += fmt.Sprintf(", %.0f m right", o.LateralM)
			}
			if o.Line > 0 {
				what += fmt.Sprintf(" (line %d)", o.Line)
			}
			labels = append(labels, labelAt{x - dir*length*0.02, y + 0.05, what, back, false, color.Black})
			lane++
		}
	}
	// The slope: an arrow pointing uphill, in the middle of the strip.
	if len(views) > 0 && views[0].SlopePct != 0 {
		up := "uphill →"
		if views[0].SlopePct < 0 {
			up = "← uphill"
		}
		labels = append(labels, labelAt{length / 2, 0, fmt.Sprintf("%s %.2f %%", up, math.Abs(views[0].SlopePct)), draw.XCenter, true, color.White})
	}
	if err != nil {
		return nil, err
	}
	if err := s.addLabels(p, labels); err != nil {
		return nil, err
	}
	p.Y.Tick.Marker = plot.ConstantTicks(ticks)
	pad := (hi - lo) * 0.05
	p.X.Min, p.X.Max = lo-pad, hi+pad
	p.Y.Min, p.Y.Max = -float64(lanes(pick(views, 1), length)-1)-0.7, float64(lanes(pick(views, 0), length)-1)+0.7
	return p, nil
}

// lanes is the number of lanes an end's bars and obstacles take, plus one.
func lanes(v endView, length float64) int {
	return len(declared(v, length, true)) + len(v.Obstacles) + 1
}

func pick(vs []endView, i int) endView {
	if i < len(vs) {
		return vs[i]
	}
	return endView{}
}

// labelAt is a text placed at a point of a plot.
type labelAt struct {
	x, y   float64
	text   string
	xalign draw.XAlignment
	bold   bool
	col    color.Color
}

func (s *sheet) addLabels(p *plot.Plot, ls []labelAt) error {
	if len(ls) == 0 {
		return nil
	}
	var xy plotter.XYLabels
	for _, l := range ls {
		xy.XYs = append(xy.XYs, plotter.XY{X: l.x, Y: l.y})
		xy.Labels = append(xy.Labels, l.text)
	}
	lab, err := plotter.NewLabels(xy)
	if err != nil {
		return err
	}
	for i, l := range ls {
		st := p.Legend.TextStyle
		st.XAlign, st.YAlign = l.xalign, draw.YCenter
		if l.bold {
			st.Font.Weight = 700
		}
		st.Color = l.col
		lab.TextStyle[i] = st
	}
	p.Add(lab)
	return nil
}

// plainTicks are the library's default ticks, labelled without trailing zeros.
type plainTicks struct{}

func (plainTicks) Ticks(lo, hi float64) []plot.Tick {
	ts := plot.DefaultTicks{}.Ticks(lo, hi)
	for i := range ts {
		if ts[i].Label != "" {
			ts[i].Label = fmt.Sprintf("%g", math.Round(ts[i].Value*1e6)/1e6)
		}
	}
	return ts
}
