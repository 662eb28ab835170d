package cards

import (
	"encoding/json"
	"math"
	"strings"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"

	"kneeprint/layout"
	"kneeprint/perf"
)

// Issue 12 on the card, end to end through the demo (invented data): the obstacle
// line, the climb row (per temperature column, heaviest block, still air: the
// gradient the cells use, perf.ObstacleClimb, rounded down to 0.1 %), the OBSTACLE
// mark on cells that fit the declared distance as printed but do not clear, and the
// legend entry only where the runway end lists obstacles.
func TestCardObstacles(t *testing.T) {
	j := demoJob(t, "a5", "Sedgefin", "KP-SPM")
	e := endOf(t, j, "04")
	d, card := build(t, j, e, perf.Dry)
	require.Len(t, d.Obstacles, 1)
	// 5125 ft above sea level over the end of 04's TORA, the 22 threshold at 4975 ft.
	assert.Equal(t, 150.0, d.Obstacles[0].HeightFt)
	assert.Equal(t, 600.0, d.Obstacles[0].PastEnd)
	assert.Equal(t, 50.0, d.ObstacleMarginFt, "the a5 preset's obstacle_margin")
	assert.Equal(t, 65.0, d.ClimbKIAS)
	assert.Equal(t, 1000.0, d.ClimbWeight, "the heaviest block")
	pa := perf.PressureAltitudeFromQNH(j.Template.QNHPa, perf.TakeoffElevationM(*j.Airfield, e))
	cm, err := perf.ClimbFor(j.Aircraft)
	require.NoError(t, err)
	require.Len(t, d.ClimbPct, len(d.Temps))
	for ti, tk := range j.Template.TempsK {
		_, grad, err := perf.ObstacleClimb(cm, e, pa, tk, 1000, 0, j.Template.ObstacleMarginM)
		require.NoError(t, err)
		assert.True(t, d.HasClimbPct[ti])
		assert.InDelta(t, math.Floor(grad*1000+1e-9)/10, d.ClimbPct[ti], 1e-9)
		if ti > 0 {
			assert.LessOrEqual(t, d.ClimbPct[ti], d.ClimbPct[ti-1], "hotter never climbs better")
		}
	}
	tora := 0.0
	for _, dd := range d.Declared {
		if dd.Name == "TORA" {
			tora = dd.Value
		}
	}
	marked := 0
	for _, b := range d.Blocks {
		for _, row := range b.Cells {
			for _, c := range row {
				if c.Obstacle {
					marked++
					assert.Equal(t, perf.NoGo, c.State)
					require.True(t, c.HasDistance)
					assert.LessOrEqual(t, c.Distance, tora, "the mark is for a figure that fits")
				}
			}
		}
	}
	assert.Positive(t, marked, "the rising ground stops some cells that fit the TORA")
	text := flatText(card)
	assert.Contains(t, text, "OBSTACLES past the end: rising ground 150 ft at 600 m. Clear by 50 ft at 65 KIAS, from 50 ft at the takeoff distance before the safety factor; climb %: still air, 1000 kg.")
	assert.Contains(t, text, "climb %")
	assert.Contains(t, text, "OBSTACLE fits, not cleared")

	// The other end lists none: no line, no row, no legend entry.
	d22, card22 := build(t, j, endOf(t, j, "22"), perf.Dry)
	assert.Empty(t, d22.Obstacles)
	assert.Empty(t, d22.ClimbPct)
	assert.NotContains(t, allText(card22), "OBSTACLE")
	assert.NotContains(t, allText(card22), "climb %")
}

// The card in feet: obstacle distances in the card's unit, heights in feet.
// 600 m = 1968.5 ft, printed 1968 ft (rounded down: the nearer).
func TestCardObstaclesInFeet(t *testing.T) {
	j := withTemplate(t, demoJob(t, "a5", "Sedgefin", "KP-SPM"), usTemplate)
	d, card := build(t, j, endOf(t, j, "04"), perf.Dry)
	assert.Equal(t, 1968.0, d.Obstacles[0].PastEnd)
	assert.Contains(t, flatText(card), "rising ground 150 ft at 1968 ft")
	assert.Equal(t, 2204.0, d.ClimbWeight, "1000 kg in lb, rounded down")
}

// cards --data carries the obstacles, the margin, the climb row and each cell's
// obstacle mark.
func TestCardDataObstacles(t *testing.T) {
	j := demoJob(t, "a5", "Sedgefin", "KP-SPM")
	j.Data = true
	fonts, err := layout.NewFonts()
	require.NoError(t, err)
	rd, err := j.Render(fonts)
	require.NoError(t, err)
	var f CardFile
	require.NoError(t, json.Unmarshal(rd.Data, &f))
	pages := map[string]DataPage{}
	for _, p := range f.Pages {
		pages[p.Page] = p
	}
	p := pages["04 dry"]
	require.Len(t, p.Obstacles, 1)
	assert.Equal(t, DataObstacle{Note: "rising ground", HeightFt: 150, PastEnd: 600}, p.Obstacles[0])
	require.NotNil(t, p.ObstacleMarginFt)
	assert.Equal(t, 50.0, *p.ObstacleMarginFt)
	require.NotNil(t, p.Climb)
	assert.Equal(t, 65.0, p.Climb.SpeedKIAS)
	assert.Len(t, p.Climb.GradientsPct, len(p.Temperatures))
	marked := 0
	for _, b := range p.Blocks {
		for _, c := range b.Cells {
			if c.Obstacle {
				marked++
				assert.Equal(t, "no-go", c.State)
				require.NotNil(t, c.Figure)
			}
		}
	}
	assert.Positive(t, marked)
	q := pages["22 dry"]
	assert.Empty(t, q.Obstacles)
	assert.Nil(t, q.Climb)
	assert.Nil(t, q.ObstacleMarginFt)
	assert.True(t, strings.Contains(string(rd.Data), `"obstacles": []`), "an end without obstacles has an empty list, not null")
}

// A profile without climb data at a runway end with obstacles: no figure where the
// distance alone would fit (n/d, and null in the card data, as printed), no-go where
// it does not; the card says why when it has no figure at all.
func TestCardObstaclesWithoutClimb(t *testing.T) {
	j := demoJob(t, "a5", "Sedgefin", "KP-SPM")
	a := *j.Aircraft
	a.Climb = nil
	j.Aircraft = &a
	d, card := build(t, j, endOf(t, j, "04"), perf.Dry)
	assert.Contains(t, flatText(card), "To be cleared by 50 ft, but the profile gives no climb: no figure where the distance fits.")
	nodata, nogo := 0, 0
	for _, b := range d.Blocks {
		for _, row := range b.Cells {
			for _, c := range row {
				switch c.State {
				case perf.NoData:
					nodata++
					assert.False(t, c.HasDistance, "no figure on a no-data cell")
				case perf.NoGo:
					nogo++
				}
				assert.NotEqual(t, perf.Go, c.State)
				assert.NotEqual(t, perf.Tight, c.State)
			}
		}
	}
	assert.Positive(t, nodata)
	assert.Positive(t, nogo)
	for _, ok := range d.HasClimbPct {
		assert.False(t, ok, "no climb row figure")
	}
}
