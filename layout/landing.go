package layout

import (
	"fmt"
	"math"
	"strings"
)

// Side is which side of a two-sided card a page is: the takeoff side (the front) or
// the landing side (the back). A card file's pages come front, back, front, back, so
// that a duplex printer puts each runway end's landing side behind its takeoff side.
type Side int

// The sides of a card.
const (
	TakeoffSide Side = iota
	LandingSide
)

func (s Side) String() string {
	if s == LandingSide {
		return "landing"
	}
	return "takeoff"
}

// sideTag is the word printed, white on black, at the head of each side of a
// two-sided card, so that a pilot turning the card knows at a glance which side he
// holds.
func sideTag(s Side) string {
	if s == LandingSide {
		return "LANDING"
	}
	return "TAKEOFF"
}

// ApproachSpeed is, for one weight block of the landing side, the speed over the
// threshold at 50 ft the figures assume.
type ApproachSpeed struct {
	Weight float64 // in the card's mass unit
	KIAS   float64 // rounded to the knot
}

// readLine is the how-to-read sentence of a side.
func readLine(d CardData) string {
	if d.Side == LandingSide {
		return fmt.Sprintf("Figures: %s required to land from 50 ft, all factors in, rounded up. Between figures: hotter column, "+
			"less headwind, heavier block. Rows: reported wind, factored in; tailwind at its gust. No figure past the last column.", d.Unit)
	}
	return fmt.Sprintf("Figures: %s required, all factors in, rounded up. Between figures: hotter column, less headwind, "+
		"heavier block. Rows: reported wind, factored in; tailwind at its gust. No figure past the last column.", d.Unit)
}

// blockTag is what a weight block's title says after its weight: the profile's mass
// limit it is at (MTOW on the takeoff side, MLM on the landing side), or nothing.
func blockTag(wb WeightBlock) string {
	switch {
	case wb.Tag != "":
		return wb.Tag
	case wb.MTOW:
		return "MTOW"
	}
	return ""
}

// landingTools is the landing side's tools: the approach speeds the figures assume
// and the crosswind helper, side by side (Build moves the block under the grid).
func (b *builder) landingTools(d CardData, x, w, figPt float64) Block {
	blk := Block{Name: "tools"}
	leftW := w*0.5 - 1.5
	ly := b.approach(&blk, d, x, 0, leftW, figPt)
	cx := x + w*0.5 + 1.5
	ry := b.crosswind(&blk, d, cx, 0, w-(cx-x))
	blk.Box = Rect{x, 0, w, math.Max(ly, ry)}
	return blk
}

// approach prints the speed over the threshold per weight block and what the figures
// assume of the landing.
func (b *builder) approach(blk *Block, d CardData, x, y, w, figPt float64) float64 {
	top := y
	b.text(blk, Rect{x, y, w, 3.6}, "APPROACH", 8.5, Bold, Left, Black, Label)
	y += 3.9
	if len(d.Approach) > 0 {
		same := true
		var parts []string
		for _, a := range d.Approach {
			parts = append(parts, fmt.Sprintf("%.0f KIAS", a.KIAS))
			same = same && a.KIAS == d.Approach[0].KIAS
		}
		if same {
			parts = parts[:1]
		}
		big := strings.Join(parts, " / ")
		pt := math.Max(MinNumberPt, math.Min(figPt, maxAccelPt))
		pt = b.fitPt(big, w, pt, MinNumberPt, Bold)
		b.text(blk, Rect{x, y, w, pt * ptMM}, big, pt, Bold, Left, Black, Number)
		y += pt*ptMM + 0.6
		var items []string
		if same {
			items = []string{"At 50 ft over the threshold, every weight."}
		} else {
			for _, a := range d.Approach {
				items = append(items, Keep(fmt.Sprintf("%.0f KIAS at %.0f %s", a.KIAS, a.Weight, d.MassUnit)))
			}
			items[0] = "At 50 ft over the threshold: " + items[0]
			items[len(items)-1] += "."
		}
		items = append(items, approachRule)
		y += b.lines(blk, x, y, w, b.wrapItems(items, " ", w, bodyPt, Regular), bodyPt, Regular)
	} else {
		y += b.paragraph(blk, x, y, w, "At 50 ft over the threshold at the manual's approach speed (the profile gives none). "+approachRule, bodyPt, Regular)
	}
	return y - top
}

// approachRule is what the landing figures assume of the pilot.
const approachRule = "Figures assume it, a prompt touchdown and firm braking: faster, higher or long, go around."

// noGrid is the landing side of a runway end that declares no LDA: no figure, and
// why, in place of the grid.
func (b *builder) noGrid(d CardData, x, y, w float64) Block {
	blk := Block{Name: "grid"}
	h := b.paragraph(&blk, x+1.5, y+1.5, w-3, d.NoGrid, 11, Bold)
	blk.Shapes = append(blk.Shapes, Shape{Kind: StrokeRect, Box: Rect{x, y, w, h + 3}, Color: Black, LineMM: 0.4})
	blk.Box = Rect{x - 0.2, y - 0.2, w + 0.4, h + 3.4}
	return blk
}

// sideWords are a mark's word and meaning in the legend of card page d: the same
// marks on both sides, in the words of the side (a figure-less no-go is no takeoff on
// the takeoff side, no stop on the landing side, either on a page with both).
func sideWords(l look, d CardData, st lookStyle) (word, meaning string) {
	switch {
	case l != lookNoTakeoff:
	case d.SamePage != nil:
		return "NO TAKEOFF/STOP", "no lift-off, climb, stop"
	case d.Side == LandingSide:
		return "NO STOP", "braking does not stop"
	}
	return st.Word, st.Meaning
}

// grids lays out the grid of d in at most h mm (or, for a runway end without an LDA,
// the note that replaces it) and, when d carries its landing half on the same page,
// the landing strip and the landing grid below it. The room is shared in proportion
// to the rows of each grid. It returns the blocks in page order and the size of the
// takeoff grid's figures.
func (b *builder) grids(d CardData, x, y, w, h float64) ([]Block, float64, error) {
	if d.NoGrid != "" {
		return []Block{b.noGrid(d, x, y, w)}, MinNumberPt + 2, nil
	}
	if d.SamePage == nil {
		g, pt, err := b.grid(d, x, y, w, h)
		return []Block{g}, pt, err
	}
	l := *d.SamePage
	l.DensityAltFt = nil // the takeoff grid above gives them, column for column
	strip := b.landingStrip(l, x, w)
	rows := func(c CardData) float64 {
		r := float64(len(c.Blocks)) * (1 + float64(len(c.WindsKt)))
		if len(c.DensityAltFt) > 0 {
			r++
		}
		return r
	}
	room := h - strip.Box.H - gapMM
	rt, rl := rows(d), 0.0
	if l.NoGrid == "" {
		rl = rows(l)
	}
	takeoffRoom := room * rt / (rt + rl)
	if l.NoGrid != "" {
		// The landing note is measured, not shared.
		takeoffRoom = room - b.noGrid(l, x, 0, w).Box.H - gapMM
	}
	g, pt, err := b.grid(d, x, y, w, takeoffRoom)
	if err != nil {
		return nil, 0, err
	}
	sy := g.Box.Y + g.Box.H + gapMM
	strip.shift(sy)
	ly := strip.Box.Y + strip.Box.H + gapMM
	var lg Block
	if l.NoGrid != "" {
		lg = b.noGrid(l, x, ly, w)
	} else if lg, _, err = b.grid(l, x, ly, w, y+h-ly); err != nil {
		return nil, 0, fmt.Errorf("landing: %w", err)
	}
	lg.Name = "landing grid"
	return []Block{g, strip, lg}, pt, nil
}

// landingStrip is the head of the landing half of a page that carries both: the
// LANDING tag and the LDA (framed, as every landing figure is held against it), then
// the flap, the model, the approach speeds and the policy's factors, built at the top
// of the page (grids moves it).
func (b *builder) landingStrip(l CardData, x, w float64) Block {
	blk := Block{Name: "landing strip"}
	const tagPt = 9
	y := 0.4
	tag := sideTag(LandingSide)
	tw := b.f.WidthMM(tag, tagPt, Bold)
	blk.Shapes = append(blk.Shapes, Shape{Kind: FillRect, Box: Rect{x, y - 0.3, tw + 2.4, 4.6}, Color: Black})
	b.text(&blk, Rect{x + 1.2, y, tw + 0.01, 4}, tag, tagPt, Bold, Left, White, Label)
	cx := x + tw + 2.4 + 3
	for _, v := range l.Declared {
		s := fmt.Sprintf("%s %.0f %s", v.Name, v.Value, l.Unit)
		wd := b.f.WidthMM(s, tagPt, Bold)
		b.text(&blk, Rect{cx, y, wd + 0.01, 4}, s, tagPt, Bold, Left, Black, Label)
		blk.Shapes = append(blk.Shapes, Shape{Kind: StrokeRect, Box: Rect{cx - 0.8, y - 0.3, wd + 1.6, 4.6}, Color: Black, LineMM: 0.35})
		cx += wd + 4
	}
	y += 4.8
	items := []string{"flap " + l.Flap, l.ModelName}
	if len(l.Approach) > 0 {
		var sp []string
		for _, a := range l.Approach {
			sp = append(sp, fmt.Sprintf("%.0f", a.KIAS))
		}
		items = append(items, Keep("approach "+strings.Join(sp, "/")+" KIAS at 50 ft"))
	}
	pol := append([]string(nil), l.PolicyItems...)
	if len(pol) > 0 {
		pol[0] = l.PolicyTitle + ": " + pol[0]
	}
	items = append(items, pol...)
	y += b.lines(&blk, x, y, w, b.wrapItems(items, " · ", w, bodyPt, Regular), bodyPt, Regular)
	blk.Box = Rect{x - 0.9, 0, w + 1.8, y + 0.2}
	return blk
}
