package spec

import (
	"strings"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
)

// runwayFile is an invented airfield with one grass runway: its length line (empty for
// none) and its two ends as YAML flow mappings.
func runwayFile(length, end1, end2 string) string {
	s := "kind: airfield\nname: Test field\nident: TST-1\nelevation: 272 ft\nrunways:\n  - surface: grass\n"
	if length != "" {
		s += "    length: " + length + "\n"
	}
	return s + "    ends:\n      - " + end1 + "\n      - " + end2 + "\n"
}

// A TORA or an LDA is a length of runway (ICAO Annex 14, Vol I, ch. 1, definitions):
// never longer than the runway's declared length, TODA and ASDA may be (clearway,
// stopway). The bounds: 1 m of slack for one figure in whole feet and the other in
// whole metres (common practice: 2000 ft = 609.6 m, typed 610 m).
func TestRunLengthsAgainstTheRunway(t *testing.T) {
	cases := []struct {
		name, length, end1, end2 string
		wantErr                  []string // each a line's start after the file name
	}{
		{"equal", "610 m", `{designator: "15", tora: 610 m, lda: 610 m}`, `{designator: "33", tora: 560 m, toda: 700 m, asda: 650 m, lda: 510 m}`, nil},
		{"feet against metres", "2000 ft", `{designator: "15", tora: 610 m}`, `{designator: "33", tora: 2000 ft}`, nil},
		{"extra zero in a TORA", "610 m", `{designator: "15", tora: 610 m}`, `{designator: "33", tora: 5600 m, toda: 5600 m}`,
			[]string{":10:34: runways[0].ends[1].tora: TORA 5600 m is longer than the runway's length 610 m"}},
		{"LDA in feet", "610 m", `{designator: "15", tora: 610 m, lda: 2100 ft}`, `{designator: "33", tora: 610 m}`,
			[]string{":9:46: runways[0].ends[0].lda: LDA 2100 ft is longer than the runway's length 2001 ft"}},
		{"2 m over", "610 m", `{designator: "15", tora: 612 m}`, `{designator: "33", tora: 610 m}`,
			[]string{":9:34: runways[0].ends[0].tora: TORA 612 m is longer than the runway's length 610 m"}},
	}
	for _, tc := range cases {
		t.Run(tc.name, func(t *testing.T) {
			_, err := Parse("f.yaml", []byte(runwayFile(tc.length, tc.end1, tc.end2)))
			if tc.wantErr == nil {
				require.NoError(t, err)
				return
			}
			require.Error(t, err)
			lines := strings.Split(err.Error(), "\n")
			require.Len(t, lines, len(tc.wantErr), err.Error())
			for i, w := range tc.wantErr {
				assert.True(t, strings.HasPrefix(lines[i], "f.yaml"+w), "got %q, want it to start %q", lines[i], "f.yaml"+w)
			}
		})
	}
}

// Without a length the two ends are held against each other: a TORA or an LDA more
// than 1.5 times the other end's is warned about (an extra digit is 10 times, a length
// in feet typed as metres 3.28 times; a displaced threshold is far less: common
// practice); the demo's 50 m displaced threshold (560 m and 610 m) is not.
func TestRunLengthsWithoutLength(t *testing.T) {
	cases := []struct {
		name, end1, end2 string
		want             string // a warning's text, "" for none
	}{
		{"displaced threshold", `{designator: "15", tora: 610 m, lda: 610 m}`, `{designator: "33", tora: 560 m, lda: 510 m}`, ""},
		{"just under 1.5", `{designator: "15", tora: 600 m}`, `{designator: "33", tora: 900 m}`, ""},
		{"extra zero", `{designator: "15", tora: 610 m}`, `{designator: "33", tora: 5600 m, toda: 5600 m}`,
			"f.yaml:9: runways[0].ends[1].tora: TORA 5600 m of 33 is 9.2 times the 610 m of 15"},
		{"feet typed as metres", `{designator: "15", tora: 610 m, lda: 2000 m}`, `{designator: "33", tora: 610 m, lda: 600 m}`,
			"f.yaml:8: runways[0].ends[0].lda: LDA 2000 m of 15 is 3.3 times the 600 m of 33"},
	}
	for _, tc := range cases {
		t.Run(tc.name, func(t *testing.T) {
			doc, err := Parse("f.yaml", []byte(runwayFile("", tc.end1, tc.end2)))
			require.NoError(t, err)
			if tc.want == "" {
				assert.Empty(t, doc.Warnings)
				return
			}
			require.Len(t, doc.Warnings, 1, doc.Warnings)
			assert.True(t, strings.HasPrefix(doc.Warnings[0], tc.want), "got %q, want it to start %q", doc.Warnings[0], tc.want)
		})
	}
}
