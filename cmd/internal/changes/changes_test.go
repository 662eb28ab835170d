package changes

import (
	"bytes"
	"encoding/json"
	"strings"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"

	"kneeprint/airfields"
	"kneeprint/cmd/internal/spec"
	"kneeprint/perf"
	"kneeprint/templates"
)

func load(t *testing.T, data string) *perf.Airfield {
	t.Helper()
	doc, err := spec.Parse("test.yaml", []byte(data))
	require.NoError(t, err)
	return doc.Airfield
}

func fixtures(t *testing.T) (string, []*perf.Aircraft, spec.CardTemplate) {
	t.Helper()
	data, err := airfields.FS.ReadFile("wrenmoor.yaml")
	require.NoError(t, err)
	var acs []*perf.Aircraft
	for _, p := range []string{"aircraft/sedgefin-sf2.yaml", "aircraft/quillwing-qt6.yaml"} {
		d, err := spec.Load(templates.FS, p)
		require.NoError(t, err)
		acs = append(acs, d.Aircraft)
	}
	td, err := spec.Load(templates.FS, "cards/a5.yaml")
	require.NoError(t, err)
	return string(data), acs, *td.Template
}

func TestShorterRunwayChangesOnlyThatEnd(t *testing.T) {
	src, acs, tm := fixtures(t)
	old := load(t, src)
	edited := strings.Replace(src, "tora: 840 m\n        toda: 900 m", "tora: 700 m\n        toda: 900 m", 1)
	require.NotEqual(t, src, edited)
	rep, err := Diff(acs, old, load(t, edited), tm)
	require.NoError(t, err)
	assert.True(t, rep.Changed)
	require.Len(t, rep.Ends, 1)
	assert.Equal(t, FieldChange{Designator: "07", Field: "TORA", Old: "840 m", New: "700 m"}, rep.Ends[0])
	require.NotEmpty(t, rep.Cells)
	order := map[string]int{"go": 0, "tight": 1, "no-go": 2, "no-data": 3, "beyond-limits": 4}
	for _, c := range rep.Cells {
		assert.Equal(t, "07", c.Designator)
		assert.Equal(t, "takeoff", c.Side, "a TORA change changes no landing cell: %s", c)
		assert.Greater(t, order[c.New], order[c.Old], "a shorter runway never improves a cell: %s", c)
	}
	// 4 runway ends x 7 winds x 8 temperatures x (3 + 4) takeoff weights (the
	// trainer's 3, the tourer's 4) and as many landing weights (the trainer from its
	// MTOW, which is its maximum landing mass, 1000, 900, 800 kg; the tourer from its
	// maximum landing mass 1200 kg, then 1150, 1050, 950 kg).
	assert.Equal(t, 4*7*8*(7+7), rep.CellsCompared)

	var buf bytes.Buffer
	require.NoError(t, rep.WriteJSON(&buf))
	var back map[string]any
	require.NoError(t, json.Unmarshal(buf.Bytes(), &back))
	assert.Equal(t, true, back["changed"])
	assert.Len(t, back["cell_changes"], len(rep.Cells))
}

func TestNothingAPilotMustKnow(t *testing.T) {
	src, acs, tm := fixtures(t)
	for name, edited := range map[string]string{
		"identical":     src,
		"comment only":  "# checked 2027\n" + src,
		"name only":     strings.Replace(src, "name: Wrenmoor Field (demo)", "name: Wrenmoor Aerodrome (demo)", 1),
		"unit spelling": strings.Replace(src, "tora: 840 m", "tora: 2755.905511811 ft", 1),
	} {
		rep, err := Diff(acs, load(t, src), load(t, edited), tm)
		require.NoError(t, err)
		assert.False(t, rep.Changed, name)
		assert.Empty(t, rep.Cells, name)
	}
}

func TestAddedRemovedAndSurface(t *testing.T) {
	src, acs, tm := fixtures(t)
	grass := strings.Replace(src, "  - surface: paved", "  - surface: grass", 1)
	rep, err := Diff(acs, load(t, src), load(t, grass), tm)
	require.NoError(t, err)
	assert.Len(t, rep.Ends, 2, "surface of 07 and 25")
	for _, c := range rep.Cells {
		assert.Contains(t, []string{"07", "25"}, c.Designator)
	}
	oneWay := strings.Replace(src, "      - designator: \"25\"\n        heading: 248 deg\n        tora: 840 m\n        lda: 840 m\n", "", 1)
	require.NotEqual(t, src, oneWay)
	rep, err = Diff(acs, load(t, src), load(t, oneWay), tm)
	require.NoError(t, err)
	assert.Equal(t, []string{"25"}, rep.Removed)
	var buf bytes.Buffer
	require.NoError(t, rep.WriteText(&buf))
	assert.Contains(t, buf.String(), "runway 25: REMOVED")
}

// Issue 11 item 5: an LDA change flags exactly that runway end's landing cells, and
// no takeoff cell; a shorter LDA never improves a cell.
func TestShorterLDAChangesOnlyThatEndsLanding(t *testing.T) {
	src, acs, tm := fixtures(t)
	edited := strings.Replace(src, "lda: 780 m", "lda: 640 m", 1)
	require.NotEqual(t, src, edited)
	rep, err := Diff(acs, load(t, src), load(t, edited), tm)
	require.NoError(t, err)
	assert.True(t, rep.Changed)
	require.Len(t, rep.Ends, 1)
	assert.Equal(t, FieldChange{Designator: "07", Field: "LDA", Old: "780 m", New: "640 m"}, rep.Ends[0])
	require.NotEmpty(t, rep.Cells)
	order := map[string]int{"go": 0, "tight": 1, "no-go": 2, "no-data": 3, "beyond-limits": 4}
	aircraft := map[string]bool{}
	for _, c := range rep.Cells {
		assert.Equal(t, "07", c.Designator)
		assert.Equal(t, "landing", c.Side)
		assert.Greater(t, order[c.New], order[c.Old], "a shorter LDA never improves a cell: %s", c)
		assert.Equal(t, 640.0, *c.NewAvailable)
		aircraft[c.Aircraft] = true
	}
	assert.Len(t, aircraft, 2, "both demo aircraft have landing cells that change")
	var buf bytes.Buffer
	require.NoError(t, rep.WriteText(&buf))
	assert.Contains(t, buf.String(), "runway 07: LDA 780 m -> 640 m")
	assert.Contains(t, buf.String(), "runway 07 landing, ")

	// A template that leaves the landing out compares no landing cell.
	tm.Landing = spec.LandingNone
	rep, err = Diff(acs, load(t, src), load(t, edited), tm)
	require.NoError(t, err)
	assert.Empty(t, rep.Cells)
	assert.True(t, rep.Changed, "the LDA itself still changed")
}
