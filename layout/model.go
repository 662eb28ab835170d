// Package layout turns a computed takeoff grid into a kneeboard card: first a
// device-independent card model (blocks, boxes and text runs in millimetres), then a
// PDF. layout computes no physics: every number it prints arrives in CardData.
package layout

import (
	"fmt"
	"math"
)

// Rect is a box in millimetres from the top-left corner of the card.
type Rect struct{ X, Y, W, H float64 }

// Inside reports whether r lies within o (with a hair of tolerance for rounding).
func (r Rect) Inside(o Rect) bool {
	const eps = 1e-6
	return r.X >= o.X-eps && r.Y >= o.Y-eps && r.X+r.W <= o.X+o.W+eps && r.Y+r.H <= o.Y+o.H+eps
}

// Overlaps reports whether r and o share any area.
func (r Rect) Overlaps(o Rect) bool {
	const eps = 1e-6
	return r.X < o.X+o.W-eps && o.X < r.X+r.W-eps && r.Y < o.Y+o.H-eps && o.Y < r.Y+r.H-eps
}

// Color is an RGB colour.
type Color struct{ R, G, B uint8 }

// Colours the card uses. State is never carried by colour alone (see legend.go).
var (
	Black = Color{0, 0, 0}
	White = Color{255, 255, 255}
	Grey  = Color{110, 110, 110}
	Light = Color{225, 225, 225}
)

// FontStyle selects a face of the embedded Go fonts.
type FontStyle int

// Font faces.
const (
	Regular FontStyle = iota
	Bold
)

// Align is horizontal text alignment within a text's box.
type Align int

// Alignments.
const (
	Left Align = iota
	Center
	Right
)

// Role says what a text is, for the legibility checks.
type Role int

// Text roles: a Number a pilot must read (9 pt at least), other Text (8 pt at least).
const (
	Label Role = iota
	Number
)

// Minimum sizes: numbers a pilot must read at least 9 pt, nothing on the card below
// 8 pt (UK CAA CAP 676 and FAA HF-STD-001 as summarised in the domain notes, sec. 6:
// checklists never below 10 pt, critical figures never below 9 pt; 8 pt is the floor
// kneeprint keeps for the caution, dates and legend on a card this size).
const (
	MinNumberPt = 9.0
	MinTextPt   = 8.0
)

// Text is one line of text in a box; Y is the top of the box.
type Text struct {
	Box     Rect
	S       string
	SizePt  float64
	Style   FontStyle
	Align   Align
	Color   Color
	Role    Role
	WidthMM float64 // the measured width of S at SizePt
	Missing string  // characters of S the embedded font cannot print
}

// ShapeKind is a drawing primitive.
type ShapeKind int

// Shapes.
const (
	FillRect   ShapeKind = iota // a filled rectangle
	StrokeRect                  // a rectangle outline
	Line                        // a line from (X, Y) to (X+W, Y+H)
	Hatch                       // 45-degree lines clipped to the rectangle
)

// Shape is one drawing primitive.
type Shape struct {
	Kind    ShapeKind
	Box     Rect
	Color   Color
	LineMM  float64
	SpaceMM float64 // hatch spacing
}

// Block is a named part of the card; blocks never overlap.
type Block struct {
	Name   string
	Box    Rect
	Shapes []Shape
	Texts  []Text
}

// Card is the device-independent model of one kneeboard card.
type Card struct {
	Title  string // what the card is, for the PDF outline
	Page   Page
	Blocks []Block
}

// Problem is one failed layout check.
type Problem struct {
	Block string
	Msg   string
}

func (p Problem) String() string { return p.Block + ": " + p.Msg }

// Ink metrics of the embedded Go fonts, in em (read from the font: digits and capitals
// reach 0.741 em above the baseline, the degree sign 0.783 em; descenders 0.205 em
// below it, a slash 0.068 em).
const (
	inkAboveEm   = 0.79
	inkBelowEm   = 0.07
	inkDescendEm = 0.21
	// lineClearMM is the least white between a text's ink and a line (common practice
	// for printed tables: figures never touch their rules).
	lineClearMM = 0.1
)

// Baseline is where the PDF writer puts the text's baseline: digits and capitals
// (about 0.7 em tall) centred in the box. layout/pdf.go draws at this height.
func (t Text) Baseline() float64 { return t.Box.Y + t.Box.H/2 + 0.35*t.SizePt*ptMM }

// Ink is the rectangle the text's glyphs cover: its advance width placed by its
// alignment, from the top of the tallest glyph to the bottom of the lowest.
func (t Text) Ink() Rect {
	x := t.Box.X
	switch t.Align {
	case Center:
		x += (t.Box.W - t.WidthMM) / 2
	case Right:
		x += t.Box.W - t.WidthMM
	}
	em := t.SizePt * ptMM
	below := inkBelowEm
	if descends(t.S) {
		below = inkDescendEm
	}
	base := t.Baseline()
	return Rect{x, base - inkAboveEm*em, t.WidthMM, (inkAboveEm + below) * em}
}

// appendStrokes appends the lines a shape draws, each as the rectangle its ink covers.
func (s Shape) appendStrokes(out []Rect) []Rect {
	half := s.LineMM / 2
	r := s.Box
	switch s.Kind {
	case Line:
		x0, x1 := math.Min(r.X, r.X+r.W), math.Max(r.X, r.X+r.W)
		y0, y1 := math.Min(r.Y, r.Y+r.H), math.Max(r.Y, r.Y+r.H)
		return append(out, Rect{x0 - half, y0 - half, x1 - x0 + 2*half, y1 - y0 + 2*half})
	case StrokeRect:
		return append(out,
			Rect{r.X - half, r.Y - half, r.W + 2*half, 2 * half},
			Rect{r.X - half, r.Y + r.H - half, r.W + 2*half, 2 * half},
			Rect{r.X - half, r.Y - half, 2 * half, r.H + 2*half},
			Rect{r.X + r.W - half, r.Y - half, 2 * half, r.H + 2*half})
	}
	return out
}

// descends reports whether s has a character reaching below the baseline (as
// strings.ContainsAny(s, "gjpqy(),;[]{}|"), byte by byte: all are ASCII).
func descends(s string) bool {
	for i := 0; i < len(s); i++ {
		switch s[i] {
		case 'g', 'j', 'p', 'q', 'y', '(', ')', ',', ';', '[', ']', '{', '}', '|':
			return true
		}
	}
	return false
}

func grow(r Rect, d float64) Rect { return Rect{r.X - d, r.Y - d, r.W + 2*d, r.H + 2*d} }

// Check runs the layout checks: every block inside the page, no two blocks
// overlapping, every shape and text inside its block, every text narrower than its
// box, no text touching a line or frame of its block, and the minimum font sizes.
func (c *Card) Check() []Problem {
	var out []Problem
	page := Rect{0, 0, c.Page.WidthMM, c.Page.HeightMM}
	var strokes []Rect
	var idx strokeIndex
	for i, b := range c.Blocks {
		strokes = strokes[:0]
		for _, s := range b.Shapes {
			strokes = s.appendStrokes(strokes)
		}
		idx.reset(strokes)
		if !b.Box.Inside(page) {
			out = append(out, Problem{b.Name, fmt.Sprintf("block %+v leaves the page %+v", b.Box, page)})
		}
		for _, o := range c.Blocks[i+1:] {
			if b.Box.Overlaps(o.Box) {
				out = append(out, Problem{b.Name, "overlaps block " + o.Name})
			}
		}
		for _, s := range b.Shapes {
			box := s.Box
			if s.Kind == Line {
				box = Rect{math.Min(s.Box.X, s.Box.X+s.Box.W), math.Min(s.Box.Y, s.Box.Y+s.Box.H), math.Abs(s.Box.W), math.Abs(s.Box.H)}
			}
			if !box.Inside(b.Box) {
				out = append(out, Problem{b.Name, fmt.Sprintf("shape %+v leaves the block", s.Box)})
			}
		}
		for _, t := range b.Texts {
			if !t.Box.Inside(b.Box) {
				out = append(out, Problem{b.Name, fmt.Sprintf("text %q box leaves the block", t.S)})
			}
			if t.WidthMM > t.Box.W+1e-6 {
				out = append(out, Problem{b.Name, fmt.Sprintf("text %q is %.1f mm wide in a %.1f mm box", t.S, t.WidthMM, t.Box.W)})
			}
			if t.Missing != "" {
				out = append(out, Problem{b.Name, fmt.Sprintf("text %q has characters the embedded font cannot print: %q", t.S, t.Missing)})
			}
			if t.SizePt < MinTextPt-1e-9 {
				out = append(out, Problem{b.Name, fmt.Sprintf("text %q at %.1f pt, below %.1f pt", t.S, t.SizePt, MinTextPt)})
			}
			if t.Role == Number && t.SizePt < MinNumberPt-1e-9 {
				out = append(out, Problem{b.Name, fmt.Sprintf("number %q at %.1f pt, below %.1f pt", t.S, t.SizePt, MinNumberPt)})
			}
			if t.SizePt*ptMM > t.Box.H+1e-6 {
				out = append(out, Problem{b.Name, fmt.Sprintf("text %q at %.1f pt is taller than its %.1f mm box", t.S, t.SizePt, t.Box.H)})
			}
			if si := idx.first(grow(t.Ink(), lineClearMM)); si >= 0 {
				out = append(out, Problem{b.Name, fmt.Sprintf("text %q touches a line at %+v", t.S, strokes[si])})
			}
		}
	}
	return out
}

// strokeIndex finds the first of a block's strokes a text's ink touches without
// trying every stroke: a grid block has a few hundred texts and as many strokes. The
// strokes are filed in the cells of a coarse grid over the block by the area they
// span; a text is tried against the strokes of the cells it spans, and the first in
// the block's order that it overlaps is the one a scan of all of them finds
// (firstTouching, TestStrokeIndexAsScan).
type strokeIndex struct {
	strokes []Rect
	x0, y0  float64 // the grid's corner
	cw, ch  float64 // a cell's width and height
	side    int     // cells per row and per column; 0: no index, scan
	// The strokes of cell c are items[start[c]:start[c+1]], in the block's order.
	start, items []int32
	next         []int32 // where the next stroke of each cell goes, while filing
}

func (x *strokeIndex) reset(strokes []Rect) {
	x.strokes, x.side = strokes, 0
	if len(strokes) < 16 {
		return // a scan is as quick
	}
	x0, y0, x1, y1 := math.Inf(1), math.Inf(1), math.Inf(-1), math.Inf(-1)
	for _, r := range strokes {
		x0, y0 = math.Min(x0, r.X), math.Min(y0, r.Y)
		x1, y1 = math.Max(x1, r.X+r.W), math.Max(y1, r.Y+r.H)
	}
	// About as many cells as strokes: a grid's rules are long and thin, each
	// crosses a row or a column of cells.
	side := int(math.Ceil(math.Sqrt(float64(len(strokes)))))
	cw, ch := (x1-x0)/float64(side), (y1-y0)/float64(side)
	if !(cw > 0 && ch > 0) || math.IsInf(cw, 0) || math.IsInf(ch, 0) {
		return // not finite, or all on one line: scan
	}
	x.x0, x.y0, x.cw, x.ch, x.side = x0, y0, cw, ch, side
	n := side * side
	// Count the strokes of each cell, then file them: cell c's from start[c].
	x.start = append(x.start[:0], make([]int32, n+1)...)
	x.each(func(c, _ int) { x.start[c+1]++ })
	for c := 0; c < n; c++ {
		x.start[c+1] += x.start[c]
	}
	x.next = append(x.next[:0], x.start[:n]...)
	x.items = append(x.items[:0], make([]int32, x.start[n])...)
	x.each(func(c, i int) {
		x.items[x.next[c]] = int32(i)
		x.next[c]++
	})
}

// each calls f for every cell c that stroke i reaches into, strokes in order.
func (x *strokeIndex) each(f func(c, i int)) {
	for i, r := range x.strokes {
		ix0, ix1 := x.col(r.X), x.col(r.X+r.W)
		for iy, iy1 := x.row(r.Y), x.row(r.Y+r.H); iy <= iy1; iy++ {
			for ix := ix0; ix <= ix1; ix++ {
				f(ix+iy*x.side, i)
			}
		}
	}
}

// col and row are the cell column and row holding v, clamped to the grid.
func (x *strokeIndex) col(v float64) int { return cellOf(v, x.x0, x.cw, x.side) }
func (x *strokeIndex) row(v float64) int { return cellOf(v, x.y0, x.ch, x.side) }

// cellOf is the index of the cell of size d from v0 holding v, clamped to the n cells.
func cellOf(v, v0, d float64, n int) int {
	f := (v - v0) / d
	switch {
	case !(f > 0):
		return 0
	case f >= float64(n-1):
		return n - 1
	}
	return int(f)
}

// first is the index of the first stroke ink overlaps, or -1.
func (x *strokeIndex) first(ink Rect) int {
	if x.side == 0 {
		return firstTouching(ink, x.strokes)
	}
	const slack = 1e-3 // wider than Overlaps' tolerance: a cell at the edge is tried too
	best := -1
	ix0, ix1 := x.col(ink.X-slack), x.col(ink.X+ink.W+slack)
	for iy, iy1 := x.row(ink.Y-slack), x.row(ink.Y+ink.H+slack); iy <= iy1; iy++ {
		for ix := ix0; ix <= ix1; ix++ {
			c := ix + iy*x.side
			for _, i := range x.items[x.start[c]:x.start[c+1]] {
				if (best < 0 || int(i) < best) && ink.Overlaps(x.strokes[i]) {
					best = int(i)
				}
			}
		}
	}
	return best
}

// firstTouching is the index of the first of strokes that ink overlaps, or -1.
func firstTouching(ink Rect, strokes []Rect) int {
	for i, st := range strokes {
		if ink.Overlaps(st) {
			return i
		}
	}
	return -1
}

// ptMM is one typographic point in millimetres (1/72 inch).
const ptMM = 25.4 / 72
