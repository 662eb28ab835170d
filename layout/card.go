package layout

import (
	"fmt"
	"math"
	"strings"

	"kneeprint/perf"
)

// CardData is everything one card shows, already computed and converted: layout
// only places it.
type CardData struct {
	AirfieldName string
	Ident        string
	ElevationFt  float64
	Designator   string
	HeadingDeg   float64
	Surface      string
	Condition    string
	SlopePct     float64
	TORAM        float64
	TODAM        float64
	ASDAM        float64
	LDAM         float64 // 0 when not declared
	Limiting     string  // the declared distance that limits most cells
	RunwayNotes  string

	AircraftName   string
	Flap           string
	ModelName      string
	RotateKIAS     float64 // 0 when not given
	MaxCrosswindKt float64
	MaxTailwindKt  float64

	PolicyTitle string
	PolicyLine  string // the factors applied, in words

	QNHhPa        float64
	PressureAltFt float64
	FtPerHPa      float64 // pressure altitude added per hPa of lower QNH

	Unit           string // "m" or "ft": the unit of every cell
	TempsC         []float64
	WindsKt        []float64 // negative = tailwind
	TightMarginPct float64
	Blocks         []WeightBlock
	OmittedKg      []float64 // profile weights not on this card

	Accel     AccelCheck
	Crosswind CrosswindHelper

	Generated   string // YYYY-MM-DD
	ValidUntil  string
	Fingerprint string
	Version     string
	Caution     string
}

// WeightBlock is one weight's grid: Cells[wind][temperature].
type WeightBlock struct {
	WeightKg float64
	MTOW     bool
	Cells    [][]CellData
}

// CellData is one cell: its state and, when it has one, the required distance in the
// card's unit, already rounded up.
type CellData struct {
	State       perf.State
	Distance    float64
	HasDistance bool
}

// AccelCheck is the accelerate check printed on the card.
type AccelCheck struct {
	Available    bool
	WeightKg     float64
	TempC        float64
	Distance     float64 // in the card's unit, rounded up
	FractionTORA float64
	SpeedKIAS    float64 // 70 % of lift-off speed, 0 when unknown
	Reason       string  // why not available
}

// CrosswindHelper is the little crosswind table: Kt[speed][angle].
type CrosswindHelper struct {
	SpeedsKt  []float64
	AnglesDeg []float64
	Kt        [][]float64
}

const (
	marginMM = 5.0
	gapMM    = 1.2
)

type builder struct {
	f    *Fonts
	card *Card
}

func (b *builder) text(blk *Block, box Rect, s string, pt float64, st FontStyle, al Align, col Color, role Role) {
	blk.Texts = append(blk.Texts, Text{Box: box, S: s, SizePt: pt, Style: st, Align: al, Color: col, Role: role,
		WidthMM: b.f.WidthMM(s, pt, st), Missing: string(b.f.Missing(s, st))})
}

// fitPt returns the largest size from pt down to minPt at which s fits maxW, or minPt.
func (b *builder) fitPt(s string, maxW, pt, minPt float64, st FontStyle) float64 {
	for ; pt > minPt; pt -= 0.25 {
		if b.f.WidthMM(s, pt, st) <= maxW {
			return pt
		}
	}
	return minPt
}

// wrap breaks s into lines no wider than maxW at size pt.
func (b *builder) wrap(s string, maxW, pt float64, st FontStyle) []string {
	var lines []string
	cur := ""
	for _, w := range strings.Fields(s) {
		try := w
		if cur != "" {
			try = cur + " " + w
		}
		if b.f.WidthMM(try, pt, st) <= maxW || cur == "" {
			cur = try
			continue
		}
		lines = append(lines, cur)
		cur = w
	}
	if cur != "" {
		lines = append(lines, cur)
	}
	return lines
}

// paragraph places s at the top of box, wrapped, and returns the height used.
func (b *builder) paragraph(blk *Block, x, y, w float64, s string, pt float64, st FontStyle) float64 {
	lh := pt * ptMM * 1.25
	lines := b.wrap(s, w, pt, st)
	for i, l := range lines {
		b.text(blk, Rect{x, y + float64(i)*lh, w, lh}, l, pt, st, Left, Black, Label)
	}
	return float64(len(lines)) * lh
}

// Build lays out one card on page p. It fails when the grid cannot be printed with
// numbers of at least MinNumberPt on this page: choose fewer weight blocks or a
// larger page.
func Build(d CardData, p Page, f *Fonts) (*Card, error) {
	if len(d.Blocks) == 0 || len(d.TempsC) == 0 || len(d.WindsKt) == 0 {
		return nil, fmt.Errorf("card %s %s: empty grid", d.Ident, d.Designator)
	}
	b := &builder{f: f, card: &Card{Page: p, Title: fmt.Sprintf("%s runway %s, %s", d.Ident, d.Designator, d.AircraftName)}}
	x0, w := marginMM, p.WidthMM-2*marginMM

	header := b.header(d, x0, marginMM, w)
	footer := b.footer(d, x0, w, p.HeightMM-marginMM)
	legend := b.legend(d, x0, footer.Box.Y-gapMM, w)
	tools := b.tools(d, x0, legend.Box.Y-gapMM, w)
	gridTop := header.Box.Y + header.Box.H + gapMM
	grid, err := b.grid(d, x0, gridTop, w, tools.Box.Y-gapMM-gridTop)
	if err != nil {
		return nil, err
	}
	b.card.Blocks = append(b.card.Blocks, header, grid, tools, legend, footer)
	return b.card, nil
}

func (b *builder) header(d CardData, x, y, w float64) Block {
	blk := Block{Name: "header"}
	// Line 1: the runway, large, and the airfield.
	rwy := "RWY " + d.Designator
	b.text(&blk, Rect{x, y, 42, 9}, rwy, b.fitPt(rwy, 42, 25, 14, Bold), Bold, Left, Black, Label)
	hdg := fmt.Sprintf("%03.0f° M", d.HeadingDeg)
	rwyW := b.f.WidthMM(rwy, b.fitPt(rwy, 42, 25, 14, Bold), Bold)
	b.text(&blk, Rect{x + rwyW + 2, y + 3.2, 18, 5}, hdg, 11, Regular, Left, Black, Label)
	rx := x + rwyW + 22
	rw := w - (rx - x)
	name := d.AirfieldName
	b.text(&blk, Rect{rx, y + 0.5, rw, 4.2}, name, b.fitPt(name, rw, 10.5, MinTextPt, Bold), Bold, Right, Black, Label)
	sub := fmt.Sprintf("%s · elevation %.0f ft", d.Ident, d.ElevationFt)
	b.text(&blk, Rect{rx, y + 5, rw, 3.6}, sub, b.fitPt(sub, rw, 8.5, MinTextPt, Regular), Regular, Right, Black, Label)
	y += 10

	// Line 2: declared distances; the limiting one is bold and framed.
	type dd struct {
		name string
		m    float64
	}
	ds := []dd{{"TORA", d.TORAM}, {"TODA", d.TODAM}, {"ASDA", d.ASDAM}}
	if d.LDAM > 0 {
		ds = append(ds, dd{"LDA", d.LDAM})
	}
	cx := x
	const ddPt = 9
	for _, v := range ds {
		s := fmt.Sprintf("%s %.0f m", v.name, math.Floor(v.m))
		st := Regular
		if v.name == d.Limiting {
			st = Bold
		}
		wd := b.f.WidthMM(s, ddPt, st)
		b.text(&blk, Rect{cx, y, wd + 0.01, 4}, s, ddPt, st, Left, Black, Label)
		if v.name == d.Limiting {
			blk.Shapes = append(blk.Shapes, Shape{Kind: StrokeRect, Box: Rect{cx - 0.8, y - 0.3, wd + 1.6, 4.4}, Color: Black, LineMM: 0.35})
		}
		cx += wd + 5
	}
	if d.Limiting != "" {
		s := "← limits"
		b.text(&blk, Rect{cx - 4, y + 0.5, b.f.WidthMM(s, 7, Regular) + 0.01, 3.4}, s, 7, Regular, Left, Black, Label)
	}
	y += 4.6

	slope := "level"
	switch {
	case d.SlopePct > 0.05:
		slope = fmt.Sprintf("upslope %.1f %%", d.SlopePct)
	case d.SlopePct < -0.05:
		slope = fmt.Sprintf("downslope %.1f %%", -d.SlopePct)
	}
	lines := []string{
		fmt.Sprintf("%s, %s · %s · %s, flap %s · %s", d.Surface, d.Condition, slope, d.AircraftName, d.Flap, d.ModelName),
		fmt.Sprintf("%s: %s", d.PolicyTitle, d.PolicyLine),
		fmt.Sprintf("Figures for QNH %.0f hPa and above (pressure altitude %.0f ft). Each hPa lower adds %.0f ft: recompute.", d.QNHhPa, d.PressureAltFt, d.FtPerHPa),
	}
	if d.RunwayNotes != "" {
		lines = append(lines, "Note: "+d.RunwayNotes)
	}
	for i, l := range lines {
		st := Regular
		if i == 2 {
			st = Bold
		}
		y += b.paragraph(&blk, x, y, w, l, 7.5, st)
	}
	blk.Box = Rect{x - 0.9, marginMM - 0.4, w + 1.8, y - marginMM + 0.6}
	return blk
}

func windLabel(kt float64) string {
	switch {
	case kt < -0.05:
		return fmt.Sprintf("tail %.0f", -kt)
	case kt > 0.05:
		return fmt.Sprintf("head %.0f", kt)
	}
	return "calm"
}

func (b *builder) grid(d CardData, x, y, w, h float64) (Block, error) {
	blk := Block{Name: "grid", Box: Rect{x, y, w, h}}
	capPt := 7.5
	caption := fmt.Sprintf("Required distance in %s, rounded up. Columns: outside air temperature °C. Rows: wind along the runway, kt.", d.Unit)
	capH := b.paragraph(&blk, x, y, w, caption, capPt, Regular)
	y += capH + 0.4
	h -= capH + 0.4
	n := len(d.Blocks)
	rows := n * (1 + len(d.WindsKt))
	rowH := math.Min(6, (h-float64(n-1)*gapMM)/float64(rows))
	// Figures fill about 0.7 of the row: digits are about 0.7 em tall.
	numPt := math.Min(12, rowH*2.6)
	if numPt < MinNumberPt || rowH < MinNumberPt*ptMM {
		return blk, fmt.Errorf("card %s %s: %d weight blocks of %d rows do not fit on a %s card with figures of at least %.0f pt: use fewer weights (blocks) or a larger page", d.Ident, d.Designator, n, len(d.WindsKt), b.card.Page.Name, MinNumberPt)
	}
	labelW := 21.0
	colW := (w - labelW) / float64(len(d.TempsC))
	for bi, wb := range d.Blocks {
		by := y + float64(bi)*(rowH*float64(1+len(d.WindsKt))+gapMM)
		// Title row: weight and the temperature columns.
		blk.Shapes = append(blk.Shapes, Shape{Kind: FillRect, Box: Rect{x, by, w, rowH}, Color: Light})
		title := fmt.Sprintf("%.0f kg", wb.WeightKg)
		if wb.MTOW {
			title += " MTOW"
		}
		tpt := b.fitPt(title, labelW-0.8, math.Min(9.5, numPt), MinTextPt, Bold)
		b.text(&blk, Rect{x + 0.6, by + (rowH-tpt*ptMM)/2, labelW - 0.8, tpt * ptMM}, title, tpt, Bold, Left, Black, Label)
		for ti, t := range d.TempsC {
			s := fmt.Sprintf("%.0f°", t)
			hp := math.Max(MinNumberPt, numPt*0.9)
			b.text(&blk, Rect{x + labelW + float64(ti)*colW, by + (rowH-hp*ptMM)/2, colW, hp * ptMM}, s, hp, Bold, Center, Black, Number)
		}
		for wi, wind := range d.WindsKt {
			ry := by + float64(1+wi)*rowH
			lpt := b.fitPt(windLabel(wind), labelW-1.2, math.Min(9, numPt*0.85), MinTextPt, Regular)
			if wind == 0 {
				blk.Shapes = append(blk.Shapes, Shape{Kind: Line, Box: Rect{x, ry, labelW, 0}, Color: Black, LineMM: 0.2})
			}
			b.text(&blk, Rect{x + 0.6, ry + (rowH-lpt*ptMM)/2, labelW - 1.2, lpt * ptMM}, windLabel(wind), lpt, Regular, Left, Black, Label)
			for ti := range d.TempsC {
				c := wb.Cells[wi][ti]
				b.cell(&blk, Rect{x + labelW + float64(ti)*colW, ry, colW, rowH}, c, numPt)
			}
		}
		// Grid lines.
		bh := rowH * float64(1+len(d.WindsKt))
		for ti := 0; ti <= len(d.TempsC); ti++ {
			cx := x + labelW + float64(ti)*colW
			blk.Shapes = append(blk.Shapes, Shape{Kind: Line, Box: Rect{cx, by, 0, bh}, Color: Grey, LineMM: 0.15})
		}
		for ri := 1; ri <= len(d.WindsKt); ri++ {
			blk.Shapes = append(blk.Shapes, Shape{Kind: Line, Box: Rect{x + labelW, by + float64(ri)*rowH, w - labelW, 0}, Color: Grey, LineMM: 0.15})
		}
		blk.Shapes = append(blk.Shapes, Shape{Kind: StrokeRect, Box: Rect{x, by, w, bh}, Color: Black, LineMM: 0.3})
	}
	return blk, nil
}

// cell draws one grid cell in its state's style.
func (b *builder) cell(blk *Block, r Rect, c CellData, numPt float64) {
	st := styleFor(c.State)
	if st.Fill != nil {
		blk.Shapes = append(blk.Shapes, Shape{Kind: FillRect, Box: r, Color: *st.Fill})
	}
	if st.Hatch {
		blk.Shapes = append(blk.Shapes, Shape{Kind: Hatch, Box: r, Color: Grey, LineMM: 0.2, SpaceMM: 1.3})
	}
	if st.Frame > 0 {
		in := st.Frame/2 + 0.15
		blk.Shapes = append(blk.Shapes, Shape{Kind: StrokeRect, Box: Rect{r.X + in, r.Y + in, r.W - 2*in, r.H - 2*in}, Color: Black, LineMM: st.Frame})
	}
	font := Regular
	if st.Bold {
		font = Bold
	}
	switch {
	case st.Figure && c.HasDistance:
		s := fmt.Sprintf("%.0f", c.Distance)
		b.text(blk, Rect{r.X, r.Y + (r.H-numPt*ptMM)/2, r.W, numPt * ptMM}, s, numPt, font, Center, st.Text, Number)
	default:
		mark := st.Mark
		if mark == "" {
			mark = "n/d"
		}
		pt := b.fitPt(mark, r.W-1.6, 7.5, MinTextPt, font)
		tw := b.f.WidthMM(mark, pt, font)
		if st.Hatch {
			// A white plate behind the word keeps it readable over the hatching.
			blk.Shapes = append(blk.Shapes, Shape{Kind: FillRect, Box: Rect{r.X + (r.W-tw)/2 - 0.5, r.Y + (r.H-pt*ptMM)/2 - 0.2, tw + 1, pt*ptMM + 0.4}, Color: White})
		}
		b.text(blk, Rect{r.X, r.Y + (r.H-pt*ptMM)/2, r.W, pt * ptMM}, mark, pt, font, Center, st.Text, Label)
	}
}

// tools is the accelerate check and the crosswind helper, side by side.
func (b *builder) tools(d CardData, x, bottom, w float64) Block {
	const h = 21.0
	y := bottom - h
	blk := Block{Name: "tools", Box: Rect{x, y, w, h}}
	leftW := w*0.5 - 1.5
	b.text(&blk, Rect{x, y, leftW, 3.4}, "ACCELERATE CHECK", 8, Bold, Left, Black, Label)
	a := d.Accel
	if a.Available {
		big := fmt.Sprintf("%.0f %s", a.Distance, d.Unit)
		b.text(&blk, Rect{x, y + 3.8, leftW, 5.2}, big, 14, Bold, Left, Black, Number)
		bw := b.f.WidthMM(big, 14, Bold)
		frac := fmt.Sprintf("= %.0f %% of TORA", a.FractionTORA*100)
		b.text(&blk, Rect{x + bw + 2, y + 5, leftW - bw - 2, 3.6}, frac, 9, Bold, Left, Black, Number)
		speed := "70 % of lift-off speed"
		if a.SpeedKIAS > 0 {
			speed = fmt.Sprintf("%.0f KIAS (70 %% of lift-off speed)", a.SpeedKIAS)
		}
		s := fmt.Sprintf("from brake release, reach %s by then, or stop. Computed for %.0f kg, %.0f °C, calm.", speed, a.WeightKg, a.TempC)
		b.paragraph(&blk, x, y+9.6, leftW, s, 7, Regular)
	} else {
		b.paragraph(&blk, x, y+4, leftW, "No figure: "+a.Reason, 7.5, Regular)
	}
	// Crosswind helper.
	cx := x + w*0.5 + 1.5
	cw := w - (cx - x)
	title := fmt.Sprintf("CROSSWIND kt · demonstrated max %.0f kt", d.MaxCrosswindKt)
	b.text(&blk, Rect{cx, y, cw, 3.4}, title, b.fitPt(title, cw, 8, MinTextPt, Bold), Bold, Left, Black, Label)
	ch := d.Crosswind
	rows := len(ch.SpeedsKt) + 1
	rowH := (h - 3.6) / float64(rows)
	labW := 11.0
	colW := (cw - labW) / float64(len(ch.AnglesDeg))
	pt := math.Min(9, rowH/ptMM*0.95)
	if pt < MinNumberPt {
		pt = MinNumberPt
	}
	ty := y + 3.6
	b.text(&blk, Rect{cx, ty + (rowH-7*ptMM)/2, labW, 7 * ptMM}, "off rwy", 7, Regular, Left, Black, Label)
	for ai, ang := range ch.AnglesDeg {
		s := fmt.Sprintf("%.0f°", ang)
		b.text(&blk, Rect{cx + labW + float64(ai)*colW, ty + (rowH-pt*ptMM)/2, colW, pt * ptMM}, s, pt, Bold, Center, Black, Number)
	}
	for si, sp := range ch.SpeedsKt {
		ry := ty + float64(si+1)*rowH
		s := fmt.Sprintf("%.0f kt", sp)
		b.text(&blk, Rect{cx, ry + (rowH-pt*ptMM)/2, labW, pt * ptMM}, s, pt, Regular, Left, Black, Number)
		for ai := range ch.AnglesDeg {
			v := ch.Kt[si][ai]
			r := Rect{cx + labW + float64(ai)*colW, ry, colW, rowH}
			over := v > d.MaxCrosswindKt+1e-9
			font, col := Regular, Black
			if over {
				blk.Shapes = append(blk.Shapes, Shape{Kind: FillRect, Box: r, Color: Black})
				font, col = Bold, White
			}
			b.text(&blk, Rect{r.X, r.Y + (rowH-pt*ptMM)/2, r.W, pt * ptMM}, fmt.Sprintf("%.0f", v), pt, font, Center, col, Number)
		}
	}
	for ai := 0; ai <= len(ch.AnglesDeg); ai++ {
		lx := cx + labW + float64(ai)*colW
		blk.Shapes = append(blk.Shapes, Shape{Kind: Line, Box: Rect{lx, ty, 0, rowH * float64(rows)}, Color: Grey, LineMM: 0.15})
	}
	blk.Shapes = append(blk.Shapes, Shape{Kind: StrokeRect, Box: Rect{cx, ty, cw, rowH * float64(rows)}, Color: Black, LineMM: 0.25})
	return blk
}

func (b *builder) legend(d CardData, x, bottom, w float64) Block {
	const h = 10.5
	y := bottom - h
	blk := Block{Name: "legend", Box: Rect{x, y, w, h}}
	states := perf.States()
	ew := w / float64(len(states))
	margin := fmt.Sprintf("%.0f %%", d.TightMarginPct)
	for i, s := range states {
		st := styleFor(s)
		ex := x + float64(i)*ew
		// The swatch gives way to the word on narrow cards, down to 9 mm (a 9 pt figure).
		swW := math.Max(9, math.Min(13, ew-2-b.f.WidthMM(st.Word, MinTextPt, Bold)))
		sw := Rect{ex + 0.5, y, swW, 4.6}
		sample := CellData{State: s, HasDistance: true, Distance: 640}
		b.cell(&blk, sw, sample, MinNumberPt)
		blk.Shapes = append(blk.Shapes, Shape{Kind: StrokeRect, Box: sw, Color: Grey, LineMM: 0.15})
		wordX := sw.X + sw.W + 1
		b.text(&blk, Rect{wordX, y + 0.6, ex + ew - wordX, 3.4}, st.Word, b.fitPt(st.Word, ex+ew-wordX, 7.5, MinTextPt, Bold), Bold, Left, Black, Label)
		meaning := st.Meaning
		if strings.Contains(meaning, "%s") {
			meaning = fmt.Sprintf(meaning, margin)
		}
		lines := b.wrap(meaning, ew-1, MinTextPt, Regular)
		for li, l := range lines {
			if li > 1 {
				break
			}
			b.text(&blk, Rect{ex + 0.5, y + 5 + float64(li)*2.7, ew - 1, 2.7}, l, MinTextPt, Regular, Left, Black, Label)
		}
	}
	return blk
}

func (b *builder) footer(d CardData, x, w, bottom float64) Block {
	blk := Block{Name: "footer"}
	meta := fmt.Sprintf("Generated %s · valid until %s · fingerprint %s · kneeprint %s", d.Generated, d.ValidUntil, d.Fingerprint, d.Version)
	if len(d.OmittedKg) > 0 {
		var ws []string
		for _, kg := range d.OmittedKg {
			ws = append(ws, fmt.Sprintf("%.0f", kg))
		}
		meta += " · not on this card: " + strings.Join(ws, ", ") + " kg"
	}
	pt := MinTextPt
	lh := pt * ptMM * 1.25
	caution := b.wrap(d.Caution, w, pt, Bold)
	metaLines := b.wrap(meta, w, pt, Regular)
	h := float64(len(caution)+len(metaLines))*lh + 0.6
	y := bottom - h
	blk.Shapes = append(blk.Shapes, Shape{Kind: Line, Box: Rect{x, y, w, 0}, Color: Black, LineMM: 0.3})
	y += 0.6
	for _, l := range caution {
		b.text(&blk, Rect{x, y, w, lh}, l, pt, Bold, Left, Black, Label)
		y += lh
	}
	for _, l := range metaLines {
		b.text(&blk, Rect{x, y, w, lh}, l, pt, Regular, Left, Black, Label)
		y += lh
	}
	blk.Box = Rect{x, bottom - h, w, h}
	return blk
}
