package proof

import (
	"strings"
	"testing"
	"time"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
	"gonum.org/v1/plot/vg"
	"gonum.org/v1/plot/vg/draw"
	"gonum.org/v1/plot/vg/recorder"

	"kneeprint/perf"
)

// Declared distances are drawn where they are measured (ICAO Annex 14, Vol. I,
// Attachment A, sec. 3, as commonly read, from memory): TORA and LDA end at the
// departure end of the runway, TODA and ASDA start with the run and go beyond it by
// the clearway and the stopway. Lengths are to scale: every bar is as long as its
// distance.
func TestDeclaredBarsToScale(t *testing.T) {
	// Wrenmoor 07 (demo): TORA 840, TODA 900, ASDA 840, LDA 780 on an 840 m runway.
	e07 := endView{RunwayEnd: perf.RunwayEnd{Designator: "07", TORAM: 840, TODAM: 900, ASDAM: 840, LDAM: 780}}
	got := declared(e07, 840, true)
	require.Len(t, got, 4)
	want := map[string][2]float64{"TORA": {0, 840}, "TODA": {0, 900}, "ASDA": {0, 840}, "LDA": {60, 840}}
	for _, b := range got {
		assert.Equal(t, want[b.name], [2]float64{b.from, b.to}, b.name)
		assert.InDelta(t, b.metres, abs(b.to-b.from), 1e-9, "%s to scale", b.name)
	}
	// Wrenmoor 33 (demo), the second end: TORA 560 of a 610 m runway (the run starts
	// 50 m in), TODA 610 (a 50 m clearway beyond the far end, x < 0).
	e33 := endView{RunwayEnd: perf.RunwayEnd{Designator: "33", TORAM: 560, TODAM: 610, ASDAM: 560}}
	got = declared(e33, 610, false)
	want = map[string][2]float64{"TORA": {560, 0}, "TODA": {560, -50}, "ASDA": {560, 0}}
	require.Len(t, got, 3)
	for _, b := range got {
		assert.Equal(t, want[b.name], [2]float64{b.from, b.to}, b.name)
		assert.InDelta(t, b.metres, abs(b.to-b.from), 1e-9, "%s to scale", b.name)
	}
}

func abs(x float64) float64 {
	if x < 0 {
		return -x
	}
	return x
}

// The schematic names every bar with its distance, marks the clearway, the
// displaced threshold and the slope, and draws an end's obstacles when it has them.
func TestSchematicLabels(t *testing.T) {
	s, err := newSheet(Source{Name: "x.yaml"}, "t", Options{Date: time.Date(2026, 12, 1, 0, 0, 0, 0, time.UTC)})
	require.NoError(t, err)
	views := []endView{
		{RunwayEnd: perf.RunwayEnd{Designator: "07", HeadingDeg: 68, TORAM: 840, TODAM: 900, ASDAM: 840, LDAM: 780, SlopePct: 0.3}},
		{RunwayEnd: perf.RunwayEnd{Designator: "25", HeadingDeg: 248, TORAM: 840, TODAM: 840, ASDAM: 840, LDAM: 840, SlopePct: -0.3},
			Obstacles: []obstacle{{DistanceM: 400, HeightM: 35 * 0.3048, LateralM: -30, Note: "powerline", Line: 24}, {DistanceM: 0, HeightM: 50 * 0.3048, Note: "trees"}}},
	}
	p, err := s.schematic(views, 840)
	require.NoError(t, err)
	rec := &recorder.Canvas{}
	p.Draw(draw.NewCanvas(rec, 180*vg.Millimeter, 100*vg.Millimeter))
	all := strings.Join(texts(rec), "|")
	for _, want := range []string{
		"07 TORA 840 m", "07 TODA 900 m", "07 ASDA 840 m", "07 LDA 780 m", "25 TORA 840 m",
		"clearway 60 m", "threshold 60 m in", "uphill → 0.30 %", "07 (068° M) →", "← 25 (248° M)",
		"25 obstacle: powerline", "35 ft, 400 m past the end of the TORA, 30 m left (line 24)", "runway 07/25",
		"25 obstacle: trees", "50 ft, 0 m past the end of the TORA",
	} {
		assert.Contains(t, all, want)
	}
	assert.NotContains(t, all, "stopway", "no stopway is declared")
	// To scale: the drawing reaches the powerline 400 m past the end of 25's TORA
	// (x = 0, 25 takes off to the left), with room to spare.
	assert.LessOrEqual(t, p.X.Min, -400.0)
	assert.Equal(t, 4+2+1, lanes(views[1], 840), "four bars, two obstacles, one lane each, and one")
}

// Obstacles are drawn where they stand, to scale along the runway: past the end of
// the TORA (the far end of the runway in the direction of takeoff) by their distance
// (perf.Obstacle.PastEndM), as the declared distances are drawn (TestDeclaredBarsToScale).
func TestObstaclesToScale(t *testing.T) {
	// Wrenmoor 07 (demo): a powerline 400 m past the end of an 840 m runway, taking
	// off to the right: at 1240 m; the same for the second end, to the left: -400 m.
	o := obstacle{DistanceM: 400}
	assert.InDelta(t, 1240, o.at(840, true), 1e-9)
	assert.InDelta(t, -400, o.at(840, false), 1e-9)
	// The distance along the drawing from the end of the TORA is the obstacle's.
	e07 := endView{RunwayEnd: perf.RunwayEnd{Designator: "07", TORAM: 840}}
	for _, b := range declared(e07, 840, true) {
		if b.name == "TORA" {
			assert.InDelta(t, 400, o.at(840, true)-b.to, 1e-9)
		}
	}
	e33 := endView{RunwayEnd: perf.RunwayEnd{Designator: "33", TORAM: 560}}
	for _, b := range declared(e33, 610, false) {
		if b.name == "TORA" {
			assert.InDelta(t, 400, b.to-o.at(610, false), 1e-9)
		}
	}
}
