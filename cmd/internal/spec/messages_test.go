package spec

import (
	"io/fs"
	"strings"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"

	"kneeprint/templates"
)

// A value out of range is answered in the unit it was written in, rounded to what a
// user can tell apart (review: "5 ft is outside the accepted range 3.048 to 152.4 m",
// a feet table's cells "1 to 19685.03937007874"). 10 and 500 ft are the template's
// obstacle margin bounds; 6000 m = 19685.04 ft (1 ft = 0.3048 m, 1959 agreement);
// 60 C = 140 F (ISO 80000-5).
func TestMessagesInTheUnitWritten(t *testing.T) {
	cards, err := fs.ReadFile(templates.FS, "cards/a5.yaml")
	require.NoError(t, err)
	ac, err := fs.ReadFile(templates.FS, "aircraft/sedgefin-sf2.yaml")
	require.NoError(t, err)
	for _, tc := range []struct {
		name, file, want string
	}{
		{"margin in ft", strings.Replace(string(cards), "obstacle_margin: 50 ft", "obstacle_margin: 5 ft", 1),
			"obstacle_margin: 5 ft is outside the accepted range 10 to 500 ft"},
		{"margin in m", strings.Replace(string(cards), "obstacle_margin: 50 ft", "obstacle_margin: 200 m", 1),
			"obstacle_margin: 200 m is outside the accepted range 3.048 to 152.4 m"},
		{"a cell of a table in feet", strings.Replace(string(ac), "[ 415,  450,", "[ 41500000,  450,", 1),
			"table.weights[0].ground_roll[0][0]: 41500000 is outside the accepted range 1 to 19685"},
		{"a temperature in F", strings.Replace(string(ac), "max_tailwind: 10 kt", "max_tailwind: 10 kt\n  max_temperature: 200 F", 1),
			"limits.max_temperature: 200 F is outside the accepted range -76 to 140 F"},
	} {
		t.Run(tc.name, func(t *testing.T) {
			_, err := Parse("f.yaml", []byte(tc.file))
			require.Error(t, err)
			assert.Contains(t, err.Error(), tc.want)
			assert.NotContains(t, err.Error(), "19685.0", "no raw conversion")
		})
	}
}

// "up to 1 weight blocks" read wrong in validate: one block is one block.
func TestTemplateSummaryOneBlock(t *testing.T) {
	doc, err := Load(templates.FS, "cards/5x8.yaml")
	require.NoError(t, err)
	var out strings.Builder
	Summarize(&out, doc)
	assert.Contains(t, out.String(), "8 temperatures x 7 winds, one weight block;")
	assert.NotContains(t, out.String(), "1 weight blocks")
}
