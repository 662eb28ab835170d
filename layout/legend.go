package layout

import "kneeprint/perf"

// The legend is kneeprint's own, designed for a kneeboard read in turbulence, in
// sunlight, under a red night light (red, orange and magenta ink vanish: FAA AIM
// 8-1-6) and as a grey photocopy. Each mark is carried by fill, frame, weight and
// words, never by colour alone; the one tint (tight) only adds to a heavy frame.
// Each mark means one thing:
//
//	go            white cell, regular figure: nothing to notice
//	tight         heavy black frame, bold figure, pale amber tint
//	no-go         solid black cell, white bold figure: inverse, seen at a glance
//	obstacle      solid black cell, white bold figure inside a white frame: fits the
//	              declared distances but the climb does not clear an obstacle past
//	              the runway end by the margin (a no-go; on cards with obstacles only)
//	no takeoff    solid black cell, white bold X, no figure: the model finds no
//	              lift-off or no climb at all (a no-go without a figure)
//	limit         diagonal hatching, no figure, the word LIMIT: past a declared limit
//	              of the profile (MTOW, tailwind, operating temperature)
//	no data       white cell, no figure, n/d: outside the data (a table's hottest
//	              column passed), which is not a limit
type look int

const (
	lookGo look = iota
	lookTight
	lookNoGo
	lookNoTakeoff
	lookLimit
	lookNoData
	lookObstacle
)

// looks lists every mark, in legend order.
func looks() []look {
	return []look{lookGo, lookTight, lookNoGo, lookObstacle, lookNoTakeoff, lookLimit, lookNoData}
}

// looksFor lists the marks card d's legend explains: the obstacle mark only on a
// card whose runway end lists obstacles.
func looksFor(d CardData) []look {
	var out []look
	for _, l := range looks() {
		if l != lookObstacle || len(d.Obstacles) > 0 {
			out = append(out, l)
		}
	}
	return out
}

// lookOf is the mark of a cell.
func lookOf(c CellData) look {
	switch c.State {
	case perf.Tight:
		return lookTight
	case perf.NoGo:
		if c.CannotTakeOff || !c.HasDistance {
			return lookNoTakeoff
		}
		if c.Obstacle {
			return lookObstacle
		}
		return lookNoGo
	case perf.BeyondLimits:
		return lookLimit
	case perf.NoData:
		return lookNoData
	}
	return lookGo
}

type lookStyle struct {
	Word       string // the mark's name in the legend
	Meaning    string // %s: the tight margin
	Fill       *Color
	Frame      float64 // frame line width in mm, 0 for none
	FrameColor Color
	Hatch      bool
	Text       Color
	Bold       bool
	Figure     bool     // whether the cell shows its distance
	Marks      []string // text shown instead of a figure, longest first: the first that fits
}

var amber = Color{255, 226, 150}

// tightFrameMM is the tight frame's line width; the frame's outer edge lies
// tightInsetMM inside the cell, so a figure has cellPadMM of white on each side.
const (
	tightFrameMM = 0.4
	tightInsetMM = 0.05
	cellPadMM    = tightInsetMM + tightFrameMM + lineClearMM + 0.05
)

func styleOf(l look) lookStyle {
	switch l {
	case lookTight:
		return lookStyle{Word: "TIGHT", Meaning: "under %s spare", Fill: &amber, Frame: tightFrameMM, FrameColor: Black, Text: Black, Bold: true, Figure: true}
	case lookNoGo:
		return lookStyle{Word: "NO-GO", Meaning: "does not fit", Fill: &Black, Text: White, Bold: true, Figure: true}
	case lookObstacle:
		// The frame is the tight frame's, so a figure fits it as it fits that one.
		return lookStyle{Word: "OBSTACLE", Meaning: "fits, not cleared", Fill: &Black, Frame: tightFrameMM, FrameColor: White, Text: White, Bold: true, Figure: true}
	case lookNoTakeoff:
		return lookStyle{Word: "NO TAKEOFF", Meaning: "no lift-off or climb", Fill: &Black, Text: White, Bold: true, Marks: []string{"X"}}
	case lookLimit:
		return lookStyle{Word: "LIMIT", Meaning: "past a profile limit", Fill: &Light, Hatch: true, Text: Black, Bold: true, Marks: []string{"LIMIT", "LIM"}}
	case lookNoData:
		return lookStyle{Word: "NO DATA", Meaning: "outside the data", Text: Black, Marks: []string{"n/d"}}
	}
	return lookStyle{Word: "GO", Meaning: "≥ %s spare", Text: Black, Figure: true}
}
