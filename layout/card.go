package layout

import (
	"fmt"
	"math"
	"strconv"
	"strings"

	"kneeprint/perf"
)

// CardData is everything one card page shows, already computed, converted to the
// card's units and rounded: layout only places it. Every length is in Unit, every
// weight in MassUnit, every temperature in TempUnit.
type CardData struct {
	AirfieldName string
	Ident        string
	ElevationFt  float64
	Designator   string
	HeadingDeg   float64
	Surface      string // "paved", "grass" or "gravel"
	Condition    string // "dry" or "wet": the condition this page is for
	// ConditionPages is 2 when the runway end has a page per condition (grass and
	// gravel: dry and wet); the page then carries its condition in large letters.
	ConditionPages int
	SlopePct       float64
	Declared       []DeclaredDistance // as printed: in Unit, rounded down
	Limiting       string             // the declared distance every figure is compared with
	RunwayNotes    string

	AircraftName string
	Flap         string
	ModelName    string

	PolicyTitle string
	PolicyItems []string // the factors (with the assumption they carry) and checks; each kept whole on one line

	QNHhPa         float64
	QNHinHg        float64 // the same QNH in inHg, rounded up
	PressureAltFt  float64
	HotterPer10hPa float64 // degrees (TempUnit) to add per 10 hPa below QNHhPa

	Unit           string // "m" or "ft": every length on the card
	MassUnit       string // "kg" or "lb"
	TempUnit       string // "C" or "F"
	Temps          []float64
	DensityAltFt   []float64 // per temperature column at QNHhPa, rounded up to 100 ft
	WindsKt        []float64 // negative = tailwind
	TightMarginPct float64
	Blocks         []WeightBlock
	Omitted        []float64 // profile weights not on this card, in MassUnit
	// Empty, when set, says why no cell of this card has a figure.
	Empty string

	Accel     AccelCheck
	Crosswind CrosswindHelper

	// Obstacles past the end of the TORA (none: no obstacle line, no climb row, no
	// obstacle mark in the legend), the clearance they must be passed by, and the
	// climb: its speed, and per temperature column the still-air gradient over the
	// ground at ClimbWeight (the heaviest block), rounded down to 0.1 %
	// (HasClimbPct false: no figure).
	Obstacles        []ObstacleData
	ObstacleMarginFt float64
	ClimbKIAS        float64
	ClimbWeight      float64
	ClimbPct         []float64
	HasClimbPct      []bool
	// Side is the side of the card this page is (landing.go); TwoSided says the card
	// has both, and each side then says which it is.
	Side     Side
	TwoSided bool
	// Approach is, on the landing side, the speed over the threshold per weight
	// block; NoGrid, when set, replaces the grid (a runway end without an LDA).
	Approach []ApproachSpeed
	NoGrid   string
	// SamePage, when set, is the landing half printed on this page below the takeoff
	// grid (a template with landing: same-page).
	SamePage *CardData

	Generated   string // YYYY-MM-DD
	ValidUntil  string
	Fingerprint string
	Version     string
	Caution     string
}

// DeclaredDistance is one declared distance as printed.
type DeclaredDistance struct {
	Name  string  // TORA, TODA, ASDA or LDA
	Value float64 // in the card's unit, rounded down
}

// WeightBlock is one weight's grid: Cells[wind][temperature].
type WeightBlock struct {
	Weight float64 // in the card's mass unit
	MTOW   bool
	// Tag, when set, names the mass limit the block is at instead of "MTOW" (the
	// landing side's "MLM").
	Tag   string
	Cells [][]CellData
}

// CellData is one cell: its state and, when it has one, the required distance in the
// card's unit, already rounded up.
type CellData struct {
	State         perf.State
	Distance      float64
	HasDistance   bool
	CannotTakeOff bool // a no-go without a figure: the model finds no takeoff
	// Obstacle marks a no-go that fits the declared distances but whose climb does
	// not clear an obstacle past the runway end by the margin.
	Obstacle bool
}

// ObstacleData is one obstacle past the end of the TORA, as printed.
type ObstacleData struct {
	Note     string
	HeightFt float64 // top above the end of the TORA, in feet (the trade's unit for obstacle heights), rounded up
	PastEnd  float64 // from the end of the TORA, in the card's unit, rounded down
	Lateral  float64 // offset from the extended centre line in the card's unit, right positive; 0 on it
}

// AccelCheck is the accelerate check as pilots are taught it (FAA AIM 7-6-8): reach
// 70 % of the rotation speed by the runway's midpoint, or abandon.
type AccelCheck struct {
	MidpointDist float64 // half the run available (the TORA, or a shorter ASDA), in the card's unit, rounded down
	// OfASDA is set when an ASDA shorter than the TORA is the run available: the
	// midpoint is then the ASDA's, and the card says so.
	OfASDA     bool
	RotateKIAS float64 // the profile's rotation speed; 0 when the profile gives none
	SpeedKIAS  float64 // 0.7 x RotateKIAS, rounded up
	Expected   []ExpectedPoint
}

// ExpectedPoint is, for one weight block, where 70 % of the rotation speed is
// expected: information beside the rule, from the ground roll factored for surface
// and slope, in calm wind, at the hottest column where the calm row fits.
type ExpectedPoint struct {
	Weight float64 // in the card's mass unit
	Has    bool    // false when no calm cell of the block fits: nothing is printed
	Temp   float64 // in the card's temperature unit
	Dist   float64 // in the card's unit, rounded down
}

// CrosswindHelper is the little crosswind table, Kt[speed][angle], with the
// profile's demonstrated crosswind (advisory) and its limit, if it declares one.
type CrosswindHelper struct {
	SpeedsKt       []float64
	AnglesDeg      []float64
	Kt             [][]float64
	DemonstratedKt float64
	LimitKt        float64
	HasLimit       bool
}

const (
	marginMM = 5.0
	gapMM    = 1.2
	// bodyPt is the size of every sentence on the card.
	bodyPt = MinTextPt
	// maxRowMM caps a grid row: figures of about 13 pt; more room goes to the notes.
	maxRowMM = 6.5
	// lineSpacing is the distance between lines of text, in sizes.
	lineSpacing = 1.18
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

// NBSP is the no-break space: text joined with it ("550\u00a0m") is never split
// between lines. It is in Windows-1252 (0xA0) and prints as a space.
const NBSP = "\u00a0"

// Keep joins the words of s with no-break spaces, so that a figure stays with its
// unit ("4 °C") when a sentence wraps.
func Keep(s string) string { return strings.ReplaceAll(s, " ", NBSP) }

// wrap breaks s into lines no wider than maxW at size pt, at ordinary spaces only.
func (b *builder) wrap(s string, maxW, pt float64, st FontStyle) []string {
	// Widths add up (advance widths, no kerning): each word is measured once.
	var lines []string
	cur, curW := "", 0.0
	space := b.f.WidthMM(" ", pt, st)
	for _, w := range strings.FieldsFunc(s, func(r rune) bool { return r == ' ' || r == '\n' || r == '\t' }) {
		ww := b.f.WidthMM(w, pt, st)
		if cur == "" {
			cur, curW = w, ww
			continue
		}
		if curW+space+ww <= maxW {
			cur, curW = cur+" "+w, curW+space+ww
			continue
		}
		lines = append(lines, cur)
		cur, curW = w, ww
	}
	if cur != "" {
		lines = append(lines, cur)
	}
	return lines
}

// wrapItems joins items with sep into lines no wider than maxW, breaking only between
// items, so that no item ("upslope 1 % +5 %") is split and no word is orphaned. An
// item wider than a line on its own is wrapped by words.
func (b *builder) wrapItems(items []string, sep string, maxW, pt float64, st FontStyle) []string {
	var lines []string
	cur := ""
	end := strings.TrimRight(sep, " ") // a line that breaks after an item ends with it
	fits := func(s string) bool { return b.f.WidthMM(s+end, pt, st) <= maxW }
	for _, it := range items {
		try := it
		if cur != "" {
			try = cur + sep + it
		}
		if fits(try) {
			cur = try
			continue
		}
		if cur != "" {
			lines = append(lines, cur+end)
			cur = ""
		}
		if fits(it) {
			cur = it
			continue
		}
		parts := b.wrap(it, maxW-b.f.WidthMM(end, pt, st), pt, st)
		lines = append(lines, parts[:len(parts)-1]...)
		cur = parts[len(parts)-1]
	}
	if cur != "" {
		lines = append(lines, cur)
	}
	return lines
}

// lines places each line at the top of the box from y down, and returns the height used.
func (b *builder) lines(blk *Block, x, y, w float64, lines []string, pt float64, st FontStyle) float64 {
	lh := pt * ptMM * lineSpacing
	for i, l := range lines {
		b.text(blk, Rect{x, y + float64(i)*lh, w, lh}, l, pt, st, Left, Black, Label)
	}
	return float64(len(lines)) * lh
}

// paragraph places s at the top of box, wrapped, and returns the height used.
func (b *builder) paragraph(blk *Block, x, y, w float64, s string, pt float64, st FontStyle) float64 {
	return b.lines(blk, x, y, w, b.wrap(s, w, pt, st), pt, st)
}

// shift moves a block and everything in it down by dy.
func (blk *Block) shift(dy float64) {
	blk.Box.Y += dy
	for i := range blk.Shapes {
		blk.Shapes[i].Box.Y += dy
	}
	for i := range blk.Texts {
		blk.Texts[i].Box.Y += dy
	}
}

// Build lays out one card on page p. It fails when the grid cannot be printed with
// figures of at least MinNumberPt on this page: choose fewer weight blocks or
// temperature columns, or a larger page.
func Build(d CardData, p Page, f *Fonts) (*Card, error) {
	if (len(d.Blocks) == 0 && d.NoGrid == "") || len(d.Temps) == 0 || len(d.WindsKt) == 0 {
		return nil, fmt.Errorf("card %s %s: empty grid", d.Ident, d.Designator)
	}
	if len(d.DensityAltFt) != len(d.Temps) {
		return nil, fmt.Errorf("card %s %s: %d density altitudes for %d temperature columns", d.Ident, d.Designator, len(d.DensityAltFt), len(d.Temps))
	}
	title := fmt.Sprintf("%s runway %s, %s", d.Ident, d.Designator, d.AircraftName)
	if d.ConditionPages > 1 {
		title = fmt.Sprintf("%s runway %s %s, %s", d.Ident, d.Designator, d.Condition, d.AircraftName)
	}
	if d.TwoSided {
		title += ", " + d.Side.String()
	}
	b := &builder{f: f, card: &Card{Page: p, Title: title}}
	x0, w := marginMM, p.WidthMM-2*marginMM

	header := b.header(d, x0, marginMM, w)
	footer := b.footer(d, x0, w, p.HeightMM-marginMM)
	legend := b.legend(d, x0, w)
	// Room for the grid: the tools are measured with their largest figure; once the
	// grid's figure size is known they are laid out with it (figures stay the largest).
	gridTop := header.Box.Y + header.Box.H + gapMM
	tools := b.tools
	if d.Side == LandingSide {
		tools = b.landingTools
	}
	room := footer.Box.Y - gapMM - legend.Box.H - gapMM - tools(d, x0, w, maxAccelPt).Box.H - gapMM - gridTop
	grids, numPt, err := b.grids(d, x0, gridTop, w, room)
	if err != nil {
		return nil, err
	}
	toolsBlk := tools(d, x0, w, numPt)
	// Tools and legend follow the grid; what room is left becomes a notes area above
	// the footer, never a band inside the grid.
	last := grids[len(grids)-1]
	y := last.Box.Y + last.Box.H + gapMM
	toolsBlk.shift(y)
	y += toolsBlk.Box.H + gapMM
	legend.shift(y)
	y += legend.Box.H + gapMM
	b.card.Blocks = append(b.card.Blocks, header)
	b.card.Blocks = append(b.card.Blocks, grids...)
	b.card.Blocks = append(b.card.Blocks, toolsBlk, legend)
	if free := footer.Box.Y - gapMM - y; free >= 9 {
		b.card.Blocks = append(b.card.Blocks, b.notes(x0, y, w, free))
	}
	b.card.Blocks = append(b.card.Blocks, footer)
	return b.card, nil
}

func surfaceWords(surface string) string {
	if surface == string(perf.Gravel) {
		return "gravel (unpaved)"
	}
	return surface
}

// fixedNum prints x with prec decimals as fmt's "%.*f" does (strconv's 'f' format,
// which fmt uses for it: Go fmt documentation), without fmt's machinery: a card
// prints a few hundred numbers (TestFixedAsFmt).
func fixedNum(x float64, prec int) string { return strconv.FormatFloat(x, 'f', prec, 64) }

// trimNum prints x with at most prec decimals and no trailing zeros.
func trimNum(x float64, prec int) string {
	s := fixedNum(x, prec)
	if strings.Contains(s, ".") {
		s = strings.TrimRight(strings.TrimRight(s, "0"), ".")
	}
	if s == "-0" {
		s = "0"
	}
	return s
}

// SlopeWords is a slope as printed: "level", "upslope 1.1 %", "downslope 0.25 %".
func SlopeWords(pct float64) string {
	switch {
	case pct > 0.005:
		return "upslope " + trimNum(pct, 2) + " %"
	case pct < -0.005:
		return "downslope " + trimNum(-pct, 2) + " %"
	}
	return "level"
}

func (b *builder) header(d CardData, x, y, w float64) Block {
	blk := Block{Name: "header"}
	top := y
	// Line 1: the runway, large, its heading, the condition of this page when the end
	// has a page per condition, and the airfield.
	rwy := "RWY " + d.Designator
	rpt := b.fitPt(rwy, 42, 25, 14, Bold)
	rwyW := b.f.WidthMM(rwy, rpt, Bold)
	b.text(&blk, Rect{x, y, rwyW + 0.01, 9}, rwy, rpt, Bold, Left, Black, Label)
	cx := x + rwyW + 2
	hdg := fmt.Sprintf("%03.0f° M", d.HeadingDeg)
	hw := b.f.WidthMM(hdg, 11, Regular)
	b.text(&blk, Rect{cx, y + 3.2, hw + 0.01, 5}, hdg, 11, Regular, Left, Black, Label)
	cx += hw + 2.5
	if d.ConditionPages > 1 {
		tag := strings.ToUpper(d.Condition)
		tw := b.f.WidthMM(tag, 13, Bold)
		b.text(&blk, Rect{cx + 1.3, y + 2, tw + 0.01, 5.6}, tag, 13, Bold, Left, Black, Label)
		blk.Shapes = append(blk.Shapes, Shape{Kind: StrokeRect, Box: Rect{cx, y + 1.2, tw + 2.6, 7.2}, Color: Black, LineMM: 0.6})
		cx += tw + 4.5
	}
	rw := x + w - cx
	name := d.AirfieldName
	b.text(&blk, Rect{cx, y + 0.5, rw, 4.2}, name, b.fitPt(name, rw, 10.5, MinTextPt, Bold), Bold, Right, Black, Label)
	sub := fmt.Sprintf("%s · elevation %.0f ft", d.Ident, d.ElevationFt)
	b.text(&blk, Rect{cx, y + 5, rw, 3.6}, sub, b.fitPt(sub, rw, 8.5, MinTextPt, Regular), Regular, Right, Black, Label)
	y += 10

	// Line 2: declared distances in the card's unit; the one every figure is compared
	// with is framed where it stands (the legend says what the frame means).
	const ddPt = 9
	cx = x
	if d.TwoSided || d.SamePage != nil {
		// Which side this is, white on black: seen at a glance when the card is turned.
		tag := sideTag(d.Side)
		tw := b.f.WidthMM(tag, ddPt, Bold)
		blk.Shapes = append(blk.Shapes, Shape{Kind: FillRect, Box: Rect{cx, y - 0.3, tw + 2.4, 4.6}, Color: Black})
		b.text(&blk, Rect{cx + 1.2, y, tw + 0.01, 4}, tag, ddPt, Bold, Left, White, Label)
		cx += tw + 2.4 + 3
	}
	for _, v := range d.Declared {
		s := fmt.Sprintf("%s %.0f %s", v.Name, v.Value, d.Unit)
		st := Regular
		if v.Name == d.Limiting {
			st = Bold
		}
		wd := b.f.WidthMM(s, ddPt, st)
		if cx > x && cx+wd > x+w {
			cx, y = x, y+4.6
		}
		b.text(&blk, Rect{cx, y, wd + 0.01, 4}, s, ddPt, st, Left, Black, Label)
		if v.Name == d.Limiting {
			blk.Shapes = append(blk.Shapes, Shape{Kind: StrokeRect, Box: Rect{cx - 0.8, y - 0.3, wd + 1.6, 4.6}, Color: Black, LineMM: 0.35})
		}
		cx += wd + 4
	}
	y += 4.8

	surface := fmt.Sprintf("%s, %s · %s · %s, flap %s · %s", surfaceWords(d.Surface), d.Condition, SlopeWords(d.SlopePct), d.AircraftName, d.Flap, d.ModelName)
	y += b.paragraph(&blk, x, y, w, surface, bodyPt, Regular)
	items := append([]string(nil), d.PolicyItems...)
	if len(items) > 0 {
		items[0] = d.PolicyTitle + ": " + items[0]
	}
	y += b.lines(&blk, x, y, w, b.wrapItems(items, " · ", w, bodyPt, Regular), bodyPt, Regular)
	qnh := fmt.Sprintf("QNH %s (%s) or more: pressure altitude %s. Per %s (%s) less: add %s to the OAT.",
		Keep(trimNum(d.QNHhPa, 2)+" hPa"), Keep(fmt.Sprintf("%.2f inHg", d.QNHinHg)), Keep(fmt.Sprintf("%.0f ft", d.PressureAltFt)),
		Keep("10 hPa"), Keep("0.30 inHg"), Keep(fmt.Sprintf("%.0f °%s", d.HotterPer10hPa, d.TempUnit)))
	y += b.paragraph(&blk, x, y, w, qnh, bodyPt, Bold)
	y += b.paragraph(&blk, x, y, w, readLine(d), bodyPt, Regular)
	if d.RunwayNotes != "" {
		y += b.paragraph(&blk, x, y, w, "Note: "+d.RunwayNotes, bodyPt, Regular)
	}
	if len(d.Obstacles) > 0 {
		y += b.paragraph(&blk, x, y, w, obstacleText(d), bodyPt, Regular)
	}
	blk.Box = Rect{x - 0.9, top - 0.4, w + 1.8, y - top + 0.6}
	return blk
}

// obstacleText is the card's obstacle line: each obstacle past the end of the TORA
// (heights in feet, the trade's unit for obstacle heights; distances in the card's
// unit), the margin, and what the clearance assumes.
func obstacleText(d CardData) string {
	var obs []string
	for _, o := range d.Obstacles {
		s := Keep(fmt.Sprintf("%s %.0f ft", o.Note, o.HeightFt)) + " at " + Keep(fmt.Sprintf("%.0f %s", o.PastEnd, d.Unit))
		if o.PastEnd == 0 {
			s = Keep(fmt.Sprintf("%s %.0f ft", o.Note, o.HeightFt)) + " at the end"
		}
		switch {
		case o.Lateral < 0:
			s += " (" + Keep(fmt.Sprintf("%.0f %s left", -o.Lateral, d.Unit)) + ")"
		case o.Lateral > 0:
			s += " (" + Keep(fmt.Sprintf("%.0f %s right", o.Lateral, d.Unit)) + ")"
		}
		obs = append(obs, s)
	}
	if d.ClimbKIAS <= 0 {
		return fmt.Sprintf("OBSTACLES past the end: %s. To be cleared by %s, but the profile gives no climb: no figure where the distance fits.",
			strings.Join(obs, ", "), Keep(fmt.Sprintf("%.0f ft", d.ObstacleMarginFt)))
	}
	return fmt.Sprintf("OBSTACLES past the end: %s. Clear by %s at %s, from 50 ft at the takeoff distance before the safety factor; climb %%: still air, %s.",
		strings.Join(obs, ", "), Keep(fmt.Sprintf("%.0f ft", d.ObstacleMarginFt)), Keep(trimNum(d.ClimbKIAS, 0)+" KIAS"), Keep(fmt.Sprintf("%.0f %s", d.ClimbWeight, d.MassUnit)))
}

// climbLabel is the label of the grid's climb row.
const climbLabel = "climb %"

func windLabel(kt float64) string {
	switch {
	case kt < -0.05:
		return "tail " + fixedNum(-kt, 0)
	case kt > 0.05:
		return "head " + fixedNum(kt, 0)
	}
	return "calm"
}

func figureText(c CellData) string { return fixedNum(c.Distance, 0) }

// climbText is column ti's climb gradient as printed, or n/d.
func climbText(d CardData, ti int) string {
	if ti >= len(d.HasClimbPct) || !d.HasClimbPct[ti] {
		return "n/d"
	}
	return fixedNum(d.ClimbPct[ti], 1)
}

// widestFigure is the widest figure the grid prints (at least four digits, so that
// cards of one template keep one size), bold, at MinNumberPt.
func (b *builder) widestFigure(d CardData) float64 {
	w := b.f.WidthMM("8888", MinNumberPt, Bold)
	for _, blk := range d.Blocks {
		for _, row := range blk.Cells {
			for _, c := range row {
				if c.HasDistance {
					w = math.Max(w, b.f.WidthMM(figureText(c), MinNumberPt, Bold))
				}
			}
		}
	}
	return w
}

// gridColumns sizes the label column and the temperature columns: a temperature
// column must hold the widest figure, bold, inside a tight cell's frame with white on
// both sides; the label column takes what the wind labels and weights need, and
// weights go on two lines ("1000 kg" over "MTOW") when one line does not fit.
type gridCols struct {
	labelW, colW float64
	twoLine      bool // the block title row holds two lines: weight over MTOW, temperature over unit
}

func (b *builder) columns(d CardData, w, widest float64) (gridCols, error) {
	n := float64(len(d.Temps))
	minCol := widest + 2*cellPadMM
	need := b.f.WidthMM("DA ft", MinTextPt, Regular)
	if len(d.ClimbPct) > 0 {
		need = math.Max(need, b.f.WidthMM(climbLabel, MinTextPt, Regular))
	}
	for _, kt := range d.WindsKt {
		need = math.Max(need, b.f.WidthMM(windLabel(kt), MinTextPt, Regular))
	}
	one := need
	for _, blk := range d.Blocks {
		need = math.Max(need, b.f.WidthMM(weightLabel(blk, d.MassUnit), MinTextPt, Bold))
		one = math.Max(one, b.f.WidthMM(weightTitle(blk, d.MassUnit), MinTextPt, Bold))
	}
	const pad = 1.4
	maxLabel := w - n*minCol
	if need+pad > maxLabel {
		return gridCols{}, fmt.Errorf("card %s %s: %d temperature columns of %.1f mm do not fit the %s card beside the row labels: use fewer temperatures or a larger page",
			d.Ident, d.Designator, len(d.Temps), minCol, b.card.Page.Name)
	}
	g := gridCols{labelW: math.Min(math.Max(one, need)+pad, math.Min(maxLabel, 26))}
	g.twoLine = one+pad > g.labelW
	if g.twoLine {
		g.labelW = math.Min(need+pad, maxLabel)
	}
	g.colW = (w - g.labelW) / n
	// One line for the temperature heads needs the unit beside every number.
	for _, t := range d.Temps {
		if b.f.WidthMM(tempHead(t, d.TempUnit), MinNumberPt, Bold)+2*cellPadMM > g.colW {
			g.twoLine = true
		}
	}
	return g, nil
}

func weightLabel(blk WeightBlock, unit string) string {
	return fixedNum(blk.Weight, 0) + " " + unit
}

func weightTitle(blk WeightBlock, unit string) string {
	if tag := blockTag(blk); tag != "" {
		return weightLabel(blk, unit) + " " + tag
	}
	return weightLabel(blk, unit)
}

func tempNum(t float64) string { return trimNum(t, 0) }

func tempHead(t float64, unit string) string { return tempNum(t) + " °" + unit }

// maxAccelPt is the largest size of the accelerate check's figure line.
const maxAccelPt = 12

// grid lays out the density-altitude row and the weight blocks in at most h mm, and
// returns the block and the size of its figures.
func (b *builder) grid(d CardData, x, y, w, h float64) (Block, float64, error) {
	top := y
	blk := Block{Name: "grid"}
	// The texts and shapes of a grid: per block its title row, wind labels and
	// cells (a figure, or a mark with its fill, hatch, plate or frame) and rules.
	nCells := 0
	for _, wb := range d.Blocks {
		nCells += len(wb.Cells) * len(d.Temps)
	}
	blk.Texts = make([]Text, 0, nCells+len(d.Blocks)*(2*len(d.Temps)+len(d.WindsKt)+2)+2*len(d.Temps)+4)
	blk.Shapes = make([]Shape, 0, 2*nCells+len(d.Blocks)*(len(d.Temps)+len(d.WindsKt)+5)+4)
	widest := b.widestFigure(d)
	g, err := b.columns(d, w, widest)
	if err != nil {
		return blk, 0, err
	}
	if d.Empty != "" {
		y += b.paragraph(&blk, x, y, w, "NO FIGURE ON THIS CARD: "+d.Empty, bodyPt, Bold) + 0.4
		h -= y - top
	}
	nB, nW := float64(len(d.Blocks)), float64(len(d.WindsKt))
	gaps := (nB - 1) * gapMM
	// Rows: the density-altitude row (and the climb row on a card with obstacles),
	// then per block a title row and the wind rows. A grid without density altitudes
	// (the landing half of a page that carries both: the takeoff grid above gives
	// them) has no such row.
	da := 1.0
	if len(d.DensityAltFt) == 0 {
		da = 0
	}
	top1 := da
	if len(d.ClimbPct) > 0 {
		top1++
	}
	rowH := (h - gaps) / (top1 + nB*(1+nW))
	titleH := func(rowH float64) float64 {
		if !g.twoLine {
			return rowH
		}
		return math.Max(1.75*rowH, (MinNumberPt+MinTextPt)*ptMM+0.9)
	}
	if g.twoLine {
		rowH = (h - gaps - nB*titleH(rowH)) / (top1 + nB*nW)
		if th := titleH(rowH); th > 1.75*rowH+1e-9 {
			rowH = (h - gaps - nB*th) / (top1 + nB*nW)
		}
	}
	rowH = math.Min(rowH, maxRowMM)
	// Figures as large as the row allows inside a tight cell's frame, with white
	// between ink and frame, and as the column allows; at most 13 pt.
	numPt := math.Min((rowH-2*cellPadMM)/((inkAboveEm+inkBelowEm)*ptMM), MinNumberPt*(g.colW-2*cellPadMM)/widest)
	numPt = math.Min(numPt, 13)
	if numPt < MinNumberPt-1e-9 || rowH < MinNumberPt*ptMM {
		minRow := (inkAboveEm+inkBelowEm)*MinNumberPt*ptMM + 2*cellPadMM
		need := gaps + minRow*(top1+nB*nW) + nB*titleH(minRow)
		blocks := fmt.Sprintf("%d weight blocks of %d rows do not", len(d.Blocks), len(d.WindsKt))
		if len(d.Blocks) == 1 {
			blocks = fmt.Sprintf("1 weight block of %d rows does not", len(d.WindsKt))
		}
		return blk, 0, fmt.Errorf("card %s %s: %s fit on the %s card with figures of at least %.0f pt (%.0f mm left for the grid, %.0f mm needed): use fewer weights (max_blocks) or wind rows, or a larger page",
			d.Ident, d.Designator, blocks, b.card.Page.Name, MinNumberPt, h, need)
	}
	th := titleH(rowH)
	labPt := math.Min(MinTextPt+1, numPt)
	colX := func(ti int) float64 { return x + g.labelW + float64(ti)*g.colW }
	// One size for every wind label: the largest at which all fit.
	lpt := labPt
	for _, wind := range d.WindsKt {
		lpt = math.Min(lpt, b.fitPt(windLabel(wind), g.labelW-1.4, labPt, MinTextPt, Regular))
	}

	// Density altitude per column at the card's QNH.
	daPt := math.Max(MinTextPt, math.Min(labPt, numPt*0.85))
	for _, da := range d.DensityAltFt {
		daPt = b.fitPt(fixedNum(da, 0), g.colW-2*cellPadMM, daPt, MinTextPt, Regular)
	}
	if da > 0 {
		b.text(&blk, Rect{x + 0.7, y + (rowH-MinTextPt*ptMM)/2, g.labelW - 1.2, MinTextPt * ptMM}, "DA ft", MinTextPt, Regular, Left, Black, Label)
		for ti, da := range d.DensityAltFt {
			b.text(&blk, Rect{colX(ti), y + (rowH-daPt*ptMM)/2, g.colW, daPt * ptMM}, fixedNum(da, 0), daPt, Regular, Center, Black, Label)
		}
		blk.Shapes = append(blk.Shapes, Shape{Kind: StrokeRect, Box: Rect{x, y, w, rowH}, Color: Grey, LineMM: 0.15})
		y += rowH
	}
	if len(d.ClimbPct) > 0 {
		// The still-air climb gradient per column at the heaviest block's weight.
		cpt := daPt
		for ti := range d.ClimbPct {
			cpt = b.fitPt(climbText(d, ti), g.colW-2*cellPadMM, cpt, MinTextPt, Regular)
		}
		b.text(&blk, Rect{x + 0.7, y + (rowH-MinTextPt*ptMM)/2, g.labelW - 1.2, MinTextPt * ptMM}, climbLabel, MinTextPt, Regular, Left, Black, Label)
		for ti := range d.ClimbPct {
			b.text(&blk, Rect{colX(ti), y + (rowH-cpt*ptMM)/2, g.colW, cpt * ptMM}, climbText(d, ti), cpt, Regular, Center, Black, Label)
		}
		blk.Shapes = append(blk.Shapes, Shape{Kind: StrokeRect, Box: Rect{x, y, w, rowH}, Color: Grey, LineMM: 0.15})
		y += rowH
	}

	for bi, wb := range d.Blocks {
		if bi > 0 {
			y += gapMM
		}
		by := y
		// Title row: weight and the temperature columns with their unit.
		blk.Shapes = append(blk.Shapes, Shape{Kind: FillRect, Box: Rect{x, by, w, th}, Color: Light})
		hp := math.Max(MinNumberPt, math.Min(numPt, 11))
		if g.twoLine {
			l1 := by + (th-(hp+MinTextPt)*ptMM-0.3)/2
			l2 := l1 + hp*ptMM + 0.3
			b.text(&blk, Rect{x + 0.7, l1, g.labelW - 1.2, hp * ptMM}, weightLabel(wb, d.MassUnit), b.fitPt(weightLabel(wb, d.MassUnit), g.labelW-1.2, hp, MinTextPt, Bold), Bold, Left, Black, Label)
			if tag := blockTag(wb); tag != "" {
				b.text(&blk, Rect{x + 0.7, l2, g.labelW - 1.2, MinTextPt * ptMM}, tag, MinTextPt, Bold, Left, Black, Label)
			}
			for ti, t := range d.Temps {
				b.text(&blk, Rect{colX(ti), l1, g.colW, hp * ptMM}, tempNum(t), hp, Bold, Center, Black, Number)
				b.text(&blk, Rect{colX(ti), l2, g.colW, MinTextPt * ptMM}, "°"+d.TempUnit, MinTextPt, Regular, Center, Black, Label)
			}
		} else {
			title := weightTitle(wb, d.MassUnit)
			tpt := b.fitPt(title, g.labelW-1.2, math.Min(9.5, numPt), MinTextPt, Bold)
			b.text(&blk, Rect{x + 0.7, by + (th-tpt*ptMM)/2, g.labelW - 1.2, tpt * ptMM}, title, tpt, Bold, Left, Black, Label)
			for ti, t := range d.Temps {
				s := tempHead(t, d.TempUnit)
				pt := b.fitPt(s, g.colW-2*cellPadMM, hp, MinNumberPt, Bold)
				b.text(&blk, Rect{colX(ti), by + (th-pt*ptMM)/2, g.colW, pt * ptMM}, s, pt, Bold, Center, Black, Number)
			}
		}
		y += th
		for wi, wind := range d.WindsKt {
			ry := y + float64(wi)*rowH
			lbl := windLabel(wind)
			if wind == 0 && wi > 0 {
				// A heavier rule between tailwind and calm/headwind rows.
				blk.Shapes = append(blk.Shapes, Shape{Kind: Line, Box: Rect{x, ry, g.labelW, 0}, Color: Black, LineMM: 0.25})
			}
			b.text(&blk, Rect{x + 0.7, ry + (rowH-lpt*ptMM)/2, g.labelW - 1.4, lpt * ptMM}, lbl, lpt, Regular, Left, Black, Label)
			for ti := range d.Temps {
				b.cell(&blk, Rect{colX(ti), ry, g.colW, rowH}, wb.Cells[wi][ti], numPt)
			}
		}
		bh := th + nW*rowH
		for ti := 0; ti <= len(d.Temps); ti++ {
			blk.Shapes = append(blk.Shapes, Shape{Kind: Line, Box: Rect{colX(ti), by, 0, bh}, Color: Grey, LineMM: 0.15})
		}
		for ri := 0; ri <= len(d.WindsKt); ri++ {
			blk.Shapes = append(blk.Shapes, Shape{Kind: Line, Box: Rect{x + g.labelW, y + float64(ri)*rowH, w - g.labelW, 0}, Color: Grey, LineMM: 0.15})
		}
		blk.Shapes = append(blk.Shapes, Shape{Kind: StrokeRect, Box: Rect{x, by, w, bh}, Color: Black, LineMM: 0.3})
		y += nW * rowH
	}
	blk.Box = Rect{x - 0.2, top, w + 0.4, y - top + 0.2}
	return blk, numPt, nil
}

// cell draws one grid cell in its mark's style.
func (b *builder) cell(blk *Block, r Rect, c CellData, numPt float64) {
	st := styleOf(lookOf(c))
	if st.Fill != nil {
		blk.Shapes = append(blk.Shapes, Shape{Kind: FillRect, Box: r, Color: *st.Fill})
	}
	if st.Hatch {
		blk.Shapes = append(blk.Shapes, Shape{Kind: Hatch, Box: r, Color: Grey, LineMM: 0.2, SpaceMM: 1.3})
	}
	if st.Frame > 0 {
		in := tightInsetMM + st.Frame/2
		blk.Shapes = append(blk.Shapes, Shape{Kind: StrokeRect, Box: Rect{r.X + in, r.Y + in, r.W - 2*in, r.H - 2*in}, Color: st.FrameColor, LineMM: st.Frame})
	}
	font := Regular
	if st.Bold {
		font = Bold
	}
	if st.Figure && c.HasDistance {
		b.text(blk, Rect{r.X, r.Y + (r.H-numPt*ptMM)/2, r.W, numPt * ptMM}, figureText(c), numPt, font, Center, st.Text, Number)
		return
	}
	if len(st.Marks) == 0 {
		return
	}
	mark := st.Marks[len(st.Marks)-1]
	for _, m := range st.Marks {
		if b.f.WidthMM(m, MinTextPt, font) <= r.W-2*cellPadMM {
			mark = m
			break
		}
	}
	pt := b.fitPt(mark, r.W-2*cellPadMM, math.Min(numPt, 10), MinTextPt, font)
	if mark == "X" {
		pt = numPt // the no-takeoff cross is as large as a figure
	}
	tw := b.f.WidthMM(mark, pt, font)
	if st.Hatch {
		// A white plate behind the word keeps it readable over the hatching.
		blk.Shapes = append(blk.Shapes, Shape{Kind: FillRect, Box: Rect{r.X + (r.W-tw)/2 - 0.5, r.Y + (r.H-pt*ptMM)/2 - 0.2, tw + 1, pt*ptMM + 0.4}, Color: White})
	}
	b.text(blk, Rect{r.X, r.Y + (r.H-pt*ptMM)/2, r.W, pt * ptMM}, mark, pt, font, Center, st.Text, Label)
}

// tools is the accelerate check and the crosswind helper, side by side, built at the
// top of the page (Build moves it under the grid).
func (b *builder) tools(d CardData, x, w, figPt float64) Block {
	blk := Block{Name: "tools"}
	leftW := w*0.5 - 1.5
	ly := b.accelCheck(&blk, d, x, 0, leftW, figPt)
	cx := x + w*0.5 + 1.5
	ry := b.crosswind(&blk, d, cx, 0, w-(cx-x))
	blk.Box = Rect{x, 0, w, math.Max(ly, ry)}
	return blk
}

func (b *builder) accelCheck(blk *Block, d CardData, x, y, w, figPt float64) float64 {
	top := y
	b.text(blk, Rect{x, y, w, 3.6}, "ACCELERATE CHECK", 8.5, Bold, Left, Black, Label)
	y += 3.9
	a := d.Accel
	if a.RotateKIAS <= 0 {
		y += b.paragraph(blk, x, y, w, "No rotation speed in the profile (speeds.rotation): no accelerate check can be printed.", bodyPt, Regular)
		return y - top
	}
	pt := math.Max(MinNumberPt, math.Min(figPt, maxAccelPt))
	big := fmt.Sprintf("%.0f %s: %.0f KIAS", a.MidpointDist, d.Unit, a.SpeedKIAS)
	pt = b.fitPt(big, w, pt, MinNumberPt, Bold)
	b.text(blk, Rect{x, y, w, pt * ptMM}, big, pt, Bold, Left, Black, Number)
	y += pt*ptMM + 0.6
	where := "By the runway midpoint"
	if a.OfASDA {
		where = "By the midpoint of the ASDA (shorter than the TORA)"
	}
	rule := fmt.Sprintf("%s reach 0.7 × VR %s, or abandon (FAA AIM 7-6-8).", where,
		Keep(trimNum(a.RotateKIAS, 1)+" KIAS"))
	y += b.paragraph(blk, x, y, w, rule, bodyPt, Regular)
	var items []string
	for _, e := range a.Expected {
		if !e.Has {
			items = append(items, Keep(fmt.Sprintf("%.0f %s", e.Weight, d.MassUnit))+" none fits")
			continue
		}
		s := Keep(fmt.Sprintf("%.0f %s %.0f %s (%s °%s)", e.Weight, d.MassUnit, e.Dist, d.Unit, tempNum(e.Temp), d.TempUnit))
		if e.Dist > a.MidpointDist {
			s += " past the midpoint"
		}
		items = append(items, s)
	}
	if len(items) > 0 {
		items[0] = "Expected 70 % point, calm: " + items[0]
		y += b.lines(blk, x, y, w, b.wrapItems(items, " · ", w, bodyPt, Regular), bodyPt, Regular)
	}
	return y - top
}

func (b *builder) crosswind(blk *Block, d CardData, x, y, w float64) float64 {
	top := y
	ch := d.Crosswind
	title := "CROSSWIND COMPONENT kt"
	b.text(blk, Rect{x, y, w, 3.6}, title, b.fitPt(title, w, 8.5, MinTextPt, Bold), Bold, Left, Black, Label)
	y += 3.9
	rows := len(ch.SpeedsKt) + 1
	// Rows hold a 9 pt figure inside the advisory frame, with white around it.
	rowH := (inkAboveEm+inkBelowEm)*MinNumberPt*ptMM + 2*cellPadMM + 0.05
	labW := math.Max(b.f.WidthMM("angle", MinTextPt, Regular), b.f.WidthMM("25 kt", MinNumberPt, Regular)) + 1.4
	colW := (w - labW) / float64(len(ch.AnglesDeg))
	pt := MinNumberPt
	b.text(blk, Rect{x + 0.6, y + (rowH-MinTextPt*ptMM)/2, labW - 1, MinTextPt * ptMM}, "angle", MinTextPt, Regular, Left, Black, Label)
	for ai, ang := range ch.AnglesDeg {
		s := fixedNum(ang, 0) + "°"
		b.text(blk, Rect{x + labW + float64(ai)*colW, y + (rowH-pt*ptMM)/2, colW, pt * ptMM}, s, pt, Bold, Center, Black, Number)
	}
	demonstrated, limited := false, false
	for si, sp := range ch.SpeedsKt {
		ry := y + float64(si+1)*rowH
		s := fixedNum(sp, 0) + " kt"
		b.text(blk, Rect{x + 0.6, ry + (rowH-pt*ptMM)/2, labW - 1, pt * ptMM}, s, pt, Regular, Left, Black, Number)
		for ai := range ch.AnglesDeg {
			v := ch.Kt[si][ai]
			r := Rect{x + labW + float64(ai)*colW, ry, colW, rowH}
			font, col := Regular, Black
			switch {
			case ch.HasLimit && v > ch.LimitKt+1e-9:
				// Past a real limit: black, as a no-go.
				blk.Shapes = append(blk.Shapes, Shape{Kind: FillRect, Box: r, Color: Black})
				font, col = Bold, White
				limited = true
			case v > ch.DemonstratedKt+1e-9:
				// Past the demonstrated value: advisory, outlined.
				in := tightInsetMM + tightFrameMM/2
				blk.Shapes = append(blk.Shapes, Shape{Kind: StrokeRect, Box: Rect{r.X + in, r.Y + in, r.W - 2*in, r.H - 2*in}, Color: Black, LineMM: tightFrameMM})
				font = Bold
				demonstrated = true
			}
			b.text(blk, Rect{r.X, r.Y + (rowH-pt*ptMM)/2, r.W, pt * ptMM}, fixedNum(v, 0), pt, font, Center, col, Number)
		}
	}
	for ai := 0; ai <= len(ch.AnglesDeg); ai++ {
		lx := x + labW + float64(ai)*colW
		blk.Shapes = append(blk.Shapes, Shape{Kind: Line, Box: Rect{lx, y, 0, rowH * float64(rows)}, Color: Grey, LineMM: 0.15})
	}
	blk.Shapes = append(blk.Shapes, Shape{Kind: Line, Box: Rect{x, y + rowH, w, 0}, Color: Grey, LineMM: 0.15})
	blk.Shapes = append(blk.Shapes, Shape{Kind: StrokeRect, Box: Rect{x, y, w, rowH * float64(rows)}, Color: Black, LineMM: 0.25})
	y += rowH*float64(rows) + 0.5
	key := []string{"framed: past the demonstrated " + Keep(trimNum(ch.DemonstratedKt, 1)+" kt") + " (advisory)"}
	if ch.HasLimit {
		key = append(key, "black: past the "+Keep(trimNum(ch.LimitKt, 1)+" kt")+" limit")
	}
	_, _ = demonstrated, limited
	y += b.lines(blk, x, y, w, b.wrapItems(key, " · ", w, bodyPt, Regular), bodyPt, Regular)
	return y - top
}

// legend explains every mark, and the frame on the declared distance; built at the
// top of the page (Build moves it).
func (b *builder) legend(d CardData, x, w float64) Block {
	blk := Block{Name: "legend"}
	ls := looksFor(d)
	margin := trimNum(d.TightMarginPct, 1) + " %"
	const swH = 6.4
	// The swatch holds a sample of each mark at its full length ("LIMIT").
	swW := math.Max(9.5, b.f.WidthMM(styleOf(lookLimit).Marks[0], MinTextPt, Bold)+2*cellPadMM+0.2)
	entryW := 0.0
	meanings := make([]string, len(ls))
	words := make([]string, len(ls))
	for i, l := range ls {
		st := styleOf(l)
		words[i], meanings[i] = sideWords(l, d, st)
		if strings.Contains(meanings[i], "%s") {
			meanings[i] = fmt.Sprintf(meanings[i], margin)
		}
		entryW = math.Max(entryW, swW+1.2+math.Max(b.f.WidthMM(words[i], MinTextPt, Bold), b.f.WidthMM(meanings[i], MinTextPt, Regular))+0.8)
	}
	// The frame on a declared distance is explained in the slot after the marks when
	// that costs no row of its own; otherwise on a line below them.
	name := d.Limiting
	if name == "" {
		name = "TORA"
	}
	const frameWord, frameMeaning = "FRAMED", "limiting distance"
	entryW = math.Max(entryW, swW+1.2+math.Max(b.f.WidthMM(frameWord, MinTextPt, Bold), b.f.WidthMM(frameMeaning, MinTextPt, Regular))+0.8)
	rows := func(n, cols int) int { return (n + cols - 1) / cols }
	cols := int(math.Max(1, math.Min(float64(len(ls)+1), math.Floor(w/entryW))))
	for cols > 1 && rows(len(ls)+1, cols) == rows(len(ls)+1, cols-1) {
		cols-- // as few columns as give the same number of rows: wider entries
	}
	frameInSlot := rows(len(ls)+1, cols) == rows(len(ls), cols)
	if !frameInSlot {
		cols = int(math.Max(1, math.Min(float64(len(ls)), math.Floor(w/entryW))))
		for cols > 1 && rows(len(ls), cols) == rows(len(ls), cols-1) {
			cols--
		}
	}
	ew := w / float64(cols)
	lh := MinTextPt * ptMM * 1.15
	th := MinTextPt*ptMM + 0.05
	y := 0.0
	for i, l := range ls {
		st := styleOf(l)
		ex := x + float64(i%cols)*ew
		ey := y + float64(i/cols)*(swH+0.6)
		sw := Rect{ex + 0.3, ey, swW, swH}
		sample := CellData{State: perf.Go, HasDistance: true, Distance: 640}
		switch l {
		case lookTight:
			sample.State = perf.Tight
		case lookNoGo:
			sample.State = perf.NoGo
		case lookNoTakeoff:
			sample = CellData{State: perf.NoGo, CannotTakeOff: true}
		case lookLimit:
			sample = CellData{State: perf.BeyondLimits}
		case lookNoData:
			sample = CellData{State: perf.NoData}
		case lookObstacle:
			sample.State, sample.Obstacle = perf.NoGo, true
		}
		b.cell(&blk, sw, sample, MinNumberPt)
		if st.Fill == nil || *st.Fill == White {
			blk.Shapes = append(blk.Shapes, Shape{Kind: StrokeRect, Box: sw, Color: Grey, LineMM: 0.15})
		}
		tx := sw.X + sw.W + 1.2
		tw := ex + ew - tx - 0.5
		mid := ey + swH/2
		b.text(&blk, Rect{tx, mid - th - 0.15, tw, th}, words[i], MinTextPt, Bold, Left, Black, Label)
		b.text(&blk, Rect{tx, mid + 0.15, tw, th}, meanings[i], MinTextPt, Regular, Left, Black, Label)
	}
	fw := b.f.WidthMM(name, MinTextPt, Bold)
	if frameInSlot {
		i := len(ls)
		ex := x + float64(i%cols)*ew
		ey := y + float64(i/cols)*(swH+0.6)
		// The declared distance framed as the header frames it, centred in a swatch.
		fx, fy := ex+0.3+(swW-fw-1.6)/2, ey+(swH-lh-0.8)/2
		b.text(&blk, Rect{fx + 0.8, fy + 0.4, fw + 0.01, lh}, name, MinTextPt, Bold, Left, Black, Label)
		blk.Shapes = append(blk.Shapes, Shape{Kind: StrokeRect, Box: Rect{fx, fy, fw + 1.6, lh + 0.8}, Color: Black, LineMM: 0.35})
		tx := ex + 0.3 + swW + 1.2
		tw := ex + ew - tx - 0.5
		mid := ey + swH/2
		b.text(&blk, Rect{tx, mid - th - 0.15, tw, th}, frameWord, MinTextPt, Bold, Left, Black, Label)
		b.text(&blk, Rect{tx, mid + 0.15, tw, th}, frameMeaning, MinTextPt, Regular, Left, Black, Label)
		y += float64(rows(len(ls)+1, cols)) * (swH + 0.6)
	} else {
		y += float64(rows(len(ls), cols))*(swH+0.6) + 0.2
		b.text(&blk, Rect{x + 1.2, y + 0.5, fw + 0.01, lh}, name, MinTextPt, Bold, Left, Black, Label)
		blk.Shapes = append(blk.Shapes, Shape{Kind: StrokeRect, Box: Rect{x + 0.4, y + 0.1, fw + 1.6, lh + 0.8}, Color: Black, LineMM: 0.35})
		rest := "framed: the limiting distance, the declared distance the figures are held against"
		rx := x + fw + 3.4
		y += 0.5 + b.paragraph(&blk, rx, y+0.5, w-(rx-x), rest, MinTextPt, Regular)
	}
	blk.Box = Rect{x, 0, w, y + 0.4}
	return blk
}

// notes is the free room left on the card: a place to write today's figures.
func (b *builder) notes(x, y, w, h float64) Block {
	blk := Block{Name: "notes", Box: Rect{x, y, w, h}}
	b.text(&blk, Rect{x, y, w, MinTextPt * ptMM * 1.25}, "Notes", MinTextPt, Regular, Left, Grey, Label)
	for ly := y + 7; ly < y+h-0.5; ly += 7 {
		blk.Shapes = append(blk.Shapes, Shape{Kind: Line, Box: Rect{x, ly, w, 0}, Color: Light, LineMM: 0.2})
	}
	return blk
}

func (b *builder) footer(d CardData, x, w, bottom float64) Block {
	blk := Block{Name: "footer"}
	pt := MinTextPt
	lh := pt * ptMM * lineSpacing
	caution := b.wrap(d.Caution, w, pt, Bold)
	valid := "VALID UNTIL " + d.ValidUntil
	meta := []string{valid, "generated " + d.Generated, "fingerprint " + d.Fingerprint, "kneeprint " + d.Version}
	if len(d.Omitted) > 0 {
		var ws []string
		for _, m := range d.Omitted {
			ws = append(ws, fmt.Sprintf("%.0f", m))
		}
		meta = append(meta, "not on this card: "+strings.Join(ws, ", ")+" "+d.MassUnit)
	}
	// Measured in bold: the first item is bold, and bold is never narrower.
	metaLines := b.wrapItems(meta, " · ", w, pt, Bold)
	h := float64(len(caution)+len(metaLines))*lh + 0.8
	y := bottom - h
	blk.Shapes = append(blk.Shapes, Shape{Kind: Line, Box: Rect{x, y, w, 0}, Color: Black, LineMM: 0.3})
	y += 0.8
	for _, l := range caution {
		b.text(&blk, Rect{x, y, w, lh}, l, pt, Bold, Left, Black, Label)
		y += lh
	}
	for i, l := range metaLines {
		if i == 0 && strings.HasPrefix(l, valid) {
			// The valid-until date in bold, the rest of the line regular.
			vw := b.f.WidthMM(valid, pt, Bold)
			b.text(&blk, Rect{x, y, vw + 0.01, lh}, valid, pt, Bold, Left, Black, Label)
			rest := strings.TrimPrefix(l, valid)
			if rest != "" {
				b.text(&blk, Rect{x + vw, y, w - vw, lh}, rest, pt, Regular, Left, Black, Label)
			}
		} else {
			b.text(&blk, Rect{x, y, w, lh}, l, pt, Regular, Left, Black, Label)
		}
		y += lh
	}
	blk.Box = Rect{x, bottom - h, w, h}
	return blk
}
