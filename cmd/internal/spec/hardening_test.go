package spec

import (
	"errors"
	"os"
	"path/filepath"
	"runtime"
	"strings"
	"syscall"
	"testing"
	"time"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
)

const okAircraft = "kind: aircraft\nname: Test trainer\ntype: T\nmtow: 1000 kg\nlimits:\n  demonstrated_crosswind: 15 kt\ntakeoff_flap: \"0\"\ntable:\n  wind_factoring_included: true\n  distance_unit: m\n  pressure_altitudes: [0 ft, 2000 ft]\n  temperatures: [0 C, 30 C]\n  weights:\n    - weight: 1000 kg\n      ground_roll:\n        - [300, 330]\n        - [340, 370]\n      to_50ft:\n        - [500, 550]\n        - [560, 610]\n"

// withNotes is okAirfield with a runway-end note on line 10.
var withNotes = okAirfield + "        notes: NOTE\n"

// lineCases are hostile files whose one error must carry a line and column, with
// the field where a field is at fault. Each is also in the hostile corpus.
func lineCases() []struct{ name, data, want string } {
	return []struct{ name, data, want string }{
		// Invalid UTF-8 (RFC 3629 sec. 3: 0xFF never appears in UTF-8).
		{"invalid utf-8 in a value", strings.Replace(okAirfield, "Test field", "Test\xfffield", 1), "x.yaml:2:11: not UTF-8 text"},
		{"truncated utf-8 sequence", strings.Replace(okAirfield, "ident: TST-1", "ident: TST-1\xc3", 1), "x.yaml:3:13: not UTF-8 text"},
		{"utf-8 encoded surrogate", strings.Replace(okAirfield, "800 m", "800 m \xed\xa0\x80", 1), "x.yaml:9:21: not UTF-8 text"},
		{"utf-16 file", "\xff\xfek\x00i\x00n\x00d\x00", "x.yaml:1:1: the file is UTF-16"},
		// Junk after the document end marker (YAML 1.2.2 sec. 9.1.2, "...").
		{"junk after document end", okAirfield + "...\njunk here\n", "x.yaml:11:1: text after the end of the document"},
		{"junk after blank lines and comments", okAirfield + "...\n# c\n\n  junk: [\n", "x.yaml:13:3: text after the end of the document"},
		{"junk on the end marker line", okAirfield + "... junk\n", "x.yaml:10:5: text after the end of the document"},
		// Text a card cannot print, in the printed fields.
		{"cjk airfield name", strings.Replace(okAirfield, "Test field", "北京 field", 1), `x.yaml:2:7: name: a card cannot print "北" (U+5317), "京" (U+4EAC)`},
		{"emoji in runway note", strings.Replace(withNotes, "NOTE", "Birds 🐦 on final", 1), `x.yaml:10:16: runways[0].ends[0].notes: a card cannot print "🐦" (U+1F426)`},
		{"rtl mark in airfield name", strings.Replace(okAirfield, "Test field", "Test\u200ffield", 1), "x.yaml:2:7: name: contains an invisible formatting character (U+200F)"},
		{"bidi override in a note", strings.Replace(withNotes, "NOTE", "\"gnol m 008\u202e\"", 1), "x.yaml:10:16: runways[0].ends[0].notes: contains an invisible formatting character (U+202E)"},
		{"zero-width space in ident", strings.Replace(okAirfield, "TST-1", "\"TST\u200b1\"", 1), "x.yaml:3:8: ident: contains an invisible formatting character (U+200B)"},
		{"line break in a printed note", strings.Replace(withNotes, "NOTE", "\"first line\\nsecond line\"", 1), `x.yaml:10:16: runways[0].ends[0].notes: a card cannot print U+000A (a line break)`},
		{"cjk aircraft name", strings.Replace(okAircraft, "Test trainer", "練習機", 1), `x.yaml:2:7: name: a card cannot print "練" (U+7DF4)`},
		{"emoji flap", strings.Replace(okAircraft, `"0"`, `"0 👍"`, 1), `x.yaml:7:15: takeoff_flap: a card cannot print "👍" (U+1F44D)`},
		{"emoji landing flap", okAircraft + "landing:\n  flap: \"30 👍\"\n  table:\n    wind_factoring_included: true\n    distance_unit: m\n    pressure_altitudes: [0 ft, 2000 ft]\n    temperatures: [0 C, 30 C]\n    weights:\n      - weight: 1000 kg\n        ground_roll: [[300, 330], [340, 370]]\n        from_50ft: [[500, 550], [560, 610]]\n",
			`x.yaml:22:9: landing.flap: a card cannot print "👍" (U+1F44D)`},
		{"bidi override in a plan's output", "kind: plan\nname: p\naircraft: [a.yaml]\nairfields: [b.yaml]\ndate: 2027-03-01\noutput: \"cards\u202e\"\n", "x.yaml:6:9: output: contains an invisible formatting character (U+202E)"},
		{"junk after a plan", "kind: plan\nname: p\naircraft: [a.yaml]\nairfields: [b.yaml]\ndate: 2027-03-01\noutput: cards\n...\n- more.yaml\n", "x.yaml:8:1: text after the end of the document"},
		{"control character", strings.Replace(okAirfield, "Test field", "\"Test\\u0007field\"", 1), "x.yaml:2:7: name: contains a control character"},
	}
}

func TestHostileInputsCarryLines(t *testing.T) {
	for _, tc := range lineCases() {
		t.Run(tc.name, func(t *testing.T) {
			_, err := Parse("x.yaml", []byte(tc.data))
			require.Error(t, err)
			assert.True(t, strings.HasPrefix(err.Error(), tc.want), "got\n%s\nwant a first line starting\n%s", err, tc.want)
			assert.Len(t, strings.Split(err.Error(), "\n"), 1, "one problem, reported once: %s", err)
		})
	}
}

// Text the card can print is not refused: Latin letters with accents, the degree sign,
// the symbols kneeprint prints itself.
func TestPrintableTextAccepted(t *testing.T) {
	for _, s := range []string{"Ærøskøbing Łąka", "Flugplatz Süd – Piste", "Piste 10° ≤ 2 %"} {
		_, err := Parse("x.yaml", []byte(strings.Replace(withNotes, "NOTE", s, 1)))
		assert.NoError(t, err, s)
		_, err = Parse("x.yaml", []byte(strings.Replace(okAirfield, "Test field", s, 1)))
		assert.NoError(t, err, s)
	}
	// A text that is not printed may hold any script (an aircraft's notes).
	_, err := Parse("x.yaml", []byte(strings.Replace(okAircraft, "type: T", "type: T\nnotes: 練習機の資料", 1)))
	assert.NoError(t, err)
}

// A named pipe or a folder in place of an input file is refused at once.
func TestLoadFileRefusesNonRegular(t *testing.T) {
	dir := t.TempDir()
	_, err := LoadFile(dir)
	require.Error(t, err)
	assert.Contains(t, err.Error(), "is a folder, not a regular file")
	if runtime.GOOS == "windows" {
		return
	}
	fifo := filepath.Join(dir, "pipe.yaml")
	require.NoError(t, syscall.Mkfifo(fifo, 0o644))
	done := make(chan error, 1)
	go func() { _, err := LoadFile(fifo); done <- err }()
	select {
	case err := <-done:
		require.Error(t, err)
		assert.Contains(t, err.Error(), "is a named pipe, not a regular file")
	case <-time.After(10 * time.Second):
		t.Fatal("reading a named pipe as an input blocked")
	}
	_, err = LoadFile(filepath.Join(dir, "missing.yaml"))
	assert.True(t, errors.Is(err, os.ErrNotExist))
}
