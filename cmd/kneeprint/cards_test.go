package main

import (
	"encoding/json"
	"os"
	"path/filepath"
	"strings"
	"testing"
	"time"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
)

func TestCardsDemo(t *testing.T) {
	dir := t.TempDir()
	code, out, errOut := runCLI(t, "cards", "--demo", "-o", dir, "--date", "2026-12-01")
	require.Equal(t, exitOK, code, errOut)
	entries, err := os.ReadDir(dir)
	require.NoError(t, err)
	assert.Len(t, entries, 5, "2 aircraft x 2 airfields, and the index")
	for _, e := range entries {
		assert.True(t, strings.HasSuffix(e.Name(), ".pdf") || e.Name() == "kneeprint-index.jsonl", "no temporary file left: %s", e.Name())
	}
	assert.Contains(t, out, "kp-spm_sedgefin-sf-2-demo-trainer_a5.pdf (8 page(s))")
	assert.Contains(t, out, "no-go")
}

func TestCardsUserFilesAndOptions(t *testing.T) {
	dir := t.TempDir()
	code, out, errOut := runCLI(t, "cards", "--aircraft", "demo:quillwing-qt6", "--airfield", "demo:saltpan", "--template", "5x8",
		"--sheet", "letter", "--date", "2027-03-01", "--valid-until", "2027-10-31", "--policy", "eu-class-b", "-o", dir)
	require.Equal(t, exitOK, code, errOut)
	assert.Contains(t, out, "kp-spm_quillwing-qt-6-demo-tourer_5x8_letter-2up.pdf (4 page(s))")
	_, err := os.Stat(filepath.Join(dir, "kp-spm_quillwing-qt-6-demo-tourer_5x8_letter-2up.pdf"))
	assert.NoError(t, err)
}

func TestCardsBadInput(t *testing.T) {
	dir := t.TempDir()
	for _, args := range [][]string{
		{"cards", "--demo"},
		{"cards", "--demo", "-o", dir, "--template", "a6"},
		{"cards", "--demo", "-o", dir, "--date", "1 Dec 2026"},
		{"cards", "--demo", "-o", dir, "--date", "2026-12-01", "--valid-until", "2026-11-01"},
		{"cards", "--demo", "-o", dir, "--sheet", "a3"},
		{"cards", "--demo", "--aircraft", "x.yaml", "-o", dir},
	} {
		code, _, errOut := runCLI(t, args...)
		assert.Equal(t, exitUsage, code, strings.Join(args, " ")+": "+errOut)
	}
	// A bad airfield file is reported with file and line, and nothing is written for it.
	code, out, _ := runCLI(t, "cards", "--aircraft", "demo:sedgefin-sf2", "--airfield", "../internal/spec/testdata/bad/af-toda-short.yaml", "-o", dir)
	assert.Equal(t, exitFailure, code)
	assert.Contains(t, out, "af-toda-short.yaml:10:15: runways[0].ends[0].toda")
	entries, _ := os.ReadDir(dir)
	assert.Empty(t, entries)
}

// Issue 8.10: a card on which no cell has a figure is never printed quietly. The demo
// trainer's table stops at 8000 ft of pressure altitude: an airfield at 9000 ft has no
// data in any cell. The summary lists it and the command exits 1 unless --allow-empty.
func TestCardsEmptyCardIsNotSilent(t *testing.T) {
	dir := t.TempDir()
	af := filepath.Join(dir, "high.yaml")
	require.NoError(t, os.WriteFile(af, []byte(`kind: airfield
name: High Test Strip
ident: HITS
elevation: 9000 ft
runways:
  - surface: paved
    condition: dry
    ends:
      - {designator: "09", tora: 2000 m}
      - {designator: "27", tora: 2000 m}
`), 0o644))
	out := filepath.Join(dir, "cards")
	code, stdout, errOut := runCLI(t, "cards", "--aircraft", "demo:sedgefin-sf2", "--airfield", af, "-o", out)
	assert.Equal(t, exitFailure, code, stdout+errOut)
	assert.Contains(t, stdout, "card pages with no figure at all (4):")
	assert.Contains(t, stdout, "hits_sedgefin-sf-2-demo-trainer_a5.pdf runway 09 dry: ")
	assert.Contains(t, stdout, "above the table's highest")
	assert.Contains(t, errOut, "--allow-empty")

	code, stdout, errOut = runCLI(t, "cards", "--aircraft", "demo:sedgefin-sf2", "--airfield", af, "-o", out, "--allow-empty")
	assert.Equal(t, exitOK, code, stdout+errOut)
	assert.Contains(t, stdout, "card pages with no figure at all (4):", "still listed")
}

// Issue 8.11: cards --data writes the card's content beside each PDF.
func TestCardsData(t *testing.T) {
	dir := t.TempDir()
	code, out, errOut := runCLI(t, "cards", "--aircraft", "demo:sedgefin-sf2", "--airfield", "demo:wrenmoor", "--data", "-o", dir, "--date", "2026-12-01")
	require.Equal(t, exitOK, code, out+errOut)
	data, err := os.ReadFile(filepath.Join(dir, "kp-wrm_sedgefin-sf-2-demo-trainer_a5.json"))
	require.NoError(t, err)
	var f struct {
		Format int `json:"format"`
		Pages  []struct {
			Page     string `json:"page"`
			Unit     string `json:"unit"`
			Declared struct {
				TORA *float64 `json:"tora"`
				LDA  *float64 `json:"lda"`
			} `json:"declared"`
			Blocks []struct {
				Weight float64 `json:"weight"`
				Cells  []struct {
					Figure *float64 `json:"figure"`
					State  string   `json:"state"`
				} `json:"cells"`
			} `json:"blocks"`
			Landing *struct {
				LDA      *float64 `json:"lda"`
				Approach []struct {
					KIAS float64 `json:"kias"`
				} `json:"approach"`
				Blocks []struct {
					Weight float64 `json:"weight"`
					MLM    bool    `json:"mlm"`
					Cells  []struct {
						Figure *float64 `json:"figure"`
						State  string   `json:"state"`
					} `json:"cells"`
				} `json:"blocks"`
			} `json:"landing"`
		} `json:"pages"`
	}
	require.NoError(t, json.Unmarshal(data, &f))
	assert.Equal(t, 1, f.Format)
	var pages []string
	for _, p := range f.Pages {
		pages = append(pages, p.Page)
		assert.Equal(t, "m", p.Unit)
		require.NotEmpty(t, p.Blocks)
		assert.Len(t, p.Blocks[0].Cells, 8*7)
	}
	assert.Equal(t, []string{"07 dry", "07 wet", "25 dry", "25 wet", "15 dry", "15 wet", "33 dry", "33 wet"}, pages, "every end dry and wet: the profile has landing data")
	assert.Equal(t, 840.0, *f.Pages[0].Declared.TORA)
	// The LDA is on the card's landing side (the back), with the landing blocks:
	// the maximum landing mass (the MTOW of this profile) first.
	assert.Nil(t, f.Pages[0].Declared.LDA, "the takeoff side prints TORA, TODA and ASDA")
	for _, p := range f.Pages {
		require.NotNil(t, p.Landing, "page %s has a landing side", p.Page)
		require.NotEmpty(t, p.Landing.Blocks)
		assert.True(t, p.Landing.Blocks[0].MLM)
		assert.Equal(t, 1000.0, p.Landing.Blocks[0].Weight)
		assert.Len(t, p.Landing.Blocks[0].Cells, 8*7)
		assert.Equal(t, 58.0, p.Landing.Approach[0].KIAS, "the profile's approach speed")
	}
	assert.Equal(t, 780.0, *f.Pages[0].Landing.LDA)
	assert.Equal(t, 510.0, *f.Pages[6].Landing.LDA, "33: threshold displaced 50 m")
	// Without --data, no JSON beside the cards.
	dir2 := t.TempDir()
	code, _, _ = runCLI(t, "cards", "--aircraft", "demo:sedgefin-sf2", "--airfield", "demo:wrenmoor", "-o", dir2)
	require.Equal(t, exitOK, code)
	matches, _ := filepath.Glob(filepath.Join(dir2, "*.json"))
	assert.Empty(t, matches, "the index is kneeprint-index.jsonl; no card data without --data")
}

// Issue 15 item 3: cards --bundle end to end: one PDF per airfield with every
// aircraft (or one for the whole run), the index that stale reads, and a bundle
// mode the command does not know refused as a usage error.
func TestCardsBundle(t *testing.T) {
	dir := t.TempDir()
	code, out, errOut := runCLI(t, "cards", "--demo", "--bundle", "airfield", "-o", dir, "--date", "2026-12-01")
	require.Equal(t, exitOK, code, errOut)
	entries, err := os.ReadDir(dir)
	require.NoError(t, err)
	var names []string
	for _, e := range entries {
		names = append(names, e.Name())
	}
	assert.ElementsMatch(t, []string{"kp-spm_all-aircraft_a5.pdf", "kp-wrm_all-aircraft_a5.pdf", "kneeprint-index.jsonl"}, names)
	assert.Contains(t, out, "[4/4] wrote kp-wrm_all-aircraft_a5.pdf, ")
	assert.Contains(t, out, "2 card file(s), 48 card page(s) written")
	code, out, errOut = runCLIAt(t, time.Date(2026, 12, 1, 0, 0, 0, 0, time.UTC), "stale", dir)
	assert.Equal(t, exitOK, code, out+errOut)
	assert.Contains(t, out, "all 24 card(s) match their inputs")

	plan := t.TempDir()
	code, _, errOut = runCLI(t, "cards", "--demo", "--bundle", "plan", "-o", plan, "--date", "2026-12-01")
	require.Equal(t, exitOK, code, errOut)
	_, err = os.Stat(filepath.Join(plan, "demo_a5.pdf"))
	assert.NoError(t, err)

	code, _, errOut = runCLI(t, "cards", "--demo", "--bundle", "aircraft", "-o", t.TempDir())
	assert.Equal(t, exitUsage, code)
	assert.Contains(t, errOut, `--bundle "aircraft": give airfield or plan`)
}
