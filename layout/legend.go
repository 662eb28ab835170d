package layout

import "kneeprint/perf"

// The legend is kneeprint's own, designed for a kneeboard read in turbulence, in
// sunlight, under a red night light (red, orange and magenta ink vanish: FAA AIM
// 8-1-6) and as a grey photocopy. Each state is carried by fill, frame, weight and
// words, never by colour alone; the one tint (tight) only adds to a heavy frame.
//
//	go            white cell, regular figures: nothing to notice
//	tight         heavy black frame, bold figures, pale amber tint
//	no-go         solid black cell, white bold figures: inverse, seen at a glance
//	beyond limits diagonal hatching, no figure, the word LIMIT
//	no data       white cell, no figure, the words "no data" shortened to n/d
type stateStyle struct {
	Word    string // the state's name in the legend
	Meaning string
	Fill    *Color
	Frame   float64 // frame line width in mm, 0 for none
	Hatch   bool
	Text    Color
	Bold    bool
	Figure  bool   // whether the cell shows its distance
	Mark    string // text shown instead of a figure
}

var amber = Color{255, 226, 150}

func styleFor(s perf.State) stateStyle {
	switch s {
	case perf.Tight:
		return stateStyle{Word: "TIGHT", Meaning: "fits, less than %s spare", Fill: &amber, Frame: 0.55, Text: Black, Bold: true, Figure: true}
	case perf.NoGo:
		return stateStyle{Word: "NO-GO", Meaning: "does not fit", Fill: &Black, Text: White, Bold: true, Figure: true}
	case perf.BeyondLimits:
		return stateStyle{Word: "LIMIT", Meaning: "past an aircraft limit", Fill: &Light, Hatch: true, Text: Black, Bold: true, Mark: "LIMIT"}
	case perf.NoData:
		return stateStyle{Word: "NO DATA", Meaning: "outside the data: no figure", Text: Black, Mark: "n/d"}
	}
	return stateStyle{Word: "GO", Meaning: "fits with %s spare", Text: Black, Figure: true}
}
