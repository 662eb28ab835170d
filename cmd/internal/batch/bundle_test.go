package batch

import (
	"bytes"
	"context"
	"encoding/json"
	"fmt"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"github.com/pdfcpu/pdfcpu/pkg/api"
	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"

	"kneeprint/cmd/internal/cards"
	"kneeprint/cmd/internal/spec"
	"kneeprint/layout"
)

// runBundled prepares plan p (files in dir) in bundles of mode and runs it.
func runBundled(t *testing.T, dir string, p *spec.Plan, mode string, prepare func(*Prepared)) *Summary {
	t.Helper()
	prep, err := Prepare(p, dir, "", "test", false)
	require.NoError(t, err)
	if prepare != nil {
		prepare(prep)
	}
	require.NoError(t, prep.SetBundle(mode))
	return prep.Run(context.Background(), Options{Workers: 2})
}

// pdfOutline lists a PDF's outline: one "pN title" per card, in the order drawn.
func pdfOutline(t *testing.T, path string) []string {
	t.Helper()
	data, err := os.ReadFile(path)
	require.NoError(t, err)
	require.NoError(t, api.Validate(bytes.NewReader(data), nil), "pdfcpu validates %s", path)
	bms, err := api.Bookmarks(bytes.NewReader(data), nil)
	require.NoError(t, err)
	var out []string
	for _, b := range bms {
		out = append(out, fmt.Sprintf("p%d %s", b.PageFrom, b.Title))
	}
	return out
}

// Issue 15 item 3: --bundle airfield writes one PDF per airfield holding every
// aircraft in plan order, each card's takeoff side followed by its landing side (the
// order that prints duplex), and the index has a line per aircraft x airfield pair
// whose pages are the pages the outline puts its cards on.
func TestBundleByAirfield(t *testing.T) {
	dir := demoDir(t)
	s := runBundled(t, dir, demoPlan(dir), cards.BundleAirfield, nil)
	require.False(t, s.Failed(), "%v", s.Results)
	out := filepath.Join(dir, "cards")
	names, err := os.ReadDir(out)
	require.NoError(t, err)
	var files []string
	for _, n := range names {
		files = append(files, n.Name())
	}
	assert.ElementsMatch(t, []string{"kp-spm_all-aircraft_a5.pdf", "kp-wrm_all-aircraft_a5.pdf", IndexName}, files)

	outline := pdfOutline(t, filepath.Join(out, "kp-spm_all-aircraft_a5.pdf"))
	require.Len(t, outline, 16, "2 aircraft x 2 gravel ends x dry and wet x 2 sides")
	var want []string
	page := 1
	for _, ac := range []string{"Sedgefin SF-2 demo trainer", "Quillwing QT-6 demo tourer"} { // plan order
		for _, id := range []string{"04 dry", "04 wet", "22 dry", "22 wet"} {
			for _, side := range []string{"takeoff", "landing"} {
				want = append(want, fmt.Sprintf("p%d KP-SPM runway %s, %s, %s", page, id, ac, side))
				page++
			}
		}
	}
	assert.Equal(t, want, outline)

	idx, err := ReadIndex(out)
	require.NoError(t, err)
	require.Len(t, idx.Cards, 4, "a line per aircraft x airfield pair")
	for _, c := range idx.Cards {
		assert.Equal(t, cards.BundleAirfield, c.Bundle)
		assert.True(t, strings.HasSuffix(c.Part, "_a5.pdf"), c.Part)
		outline := pdfOutline(t, filepath.Join(out, c.File))
		assert.Equal(t, len(outline), c.Pages, "the pages of the file")
		for _, e := range c.Ends {
			require.Len(t, e.PDFPages, 2, "%s %s: takeoff and landing side", c.File, e.Page)
			assert.Equal(t, e.PDFPages[0]+1, e.PDFPages[1], "the landing side behind its takeoff side")
			for k, side := range []string{"takeoff", "landing"} {
				assert.Contains(t, outline, fmt.Sprintf("p%d %s runway %s, %s, %s", e.PDFPages[k], c.Airfield.Name, e.Page, c.Aircraft.Name, side))
			}
		}
	}
	rep, err := Stale(out, nil, "", "test", planDate)
	require.NoError(t, err)
	assert.Empty(t, rep.Stale)
	assert.Equal(t, 24, rep.Checked, "every end dry and wet: the demo aircraft have landing data")

	var sb strings.Builder
	s.WriteSummary(&sb)
	assert.Contains(t, sb.String(), "2 card file(s), 48 card page(s) written")
	assert.Contains(t, sb.String(), "kp-spm_all-aircraft_a5.pdf pages 1-2, Sedgefin SF-2 demo trainer at KP-SPM, runway 04 dry:")
	// A bundle's pages listed in page order.
	assert.Less(t, strings.Index(sb.String(), "kp-spm_all-aircraft_a5.pdf pages 9-10"), strings.Index(sb.String(), "kp-spm_all-aircraft_a5.pdf pages 11-12"))
}

// Issue 15 item 3: editing one runway end makes stale name exactly its cards in the
// bundle, with the bundle's pages they are printed on, for every aircraft; with
// the plan too.
func TestBundleStaleNamesTheCard(t *testing.T) {
	dir := demoDir(t)
	p := demoPlan(dir)
	runBundled(t, dir, p, cards.BundleAirfield, nil)
	out := filepath.Join(dir, "cards")
	idx, err := ReadIndex(out)
	require.NoError(t, err)
	pages := map[string][]int{} // aircraft and page identity -> the bundle's pages
	for _, c := range idx.Cards {
		for _, e := range c.Ends {
			pages[c.Aircraft.Name+" "+c.Airfield.Name+" "+e.Page] = e.PDFPages
		}
	}
	path := filepath.Join(dir, "wrenmoor.yaml")
	data, _ := os.ReadFile(path)
	edited := strings.Replace(string(data), "tora: 610 m", "tora: 580 m", 1) // runway 15
	require.NotEqual(t, string(data), edited)
	require.NoError(t, os.WriteFile(path, []byte(edited), 0o644))
	for _, plan := range []*spec.Plan{nil, p} {
		rep, err := Stale(out, plan, dir, "test", planDate)
		require.NoError(t, err)
		require.Len(t, rep.Stale, 4, "2 aircraft x the dry and the wet page of grass runway 15")
		for _, s := range rep.Stale {
			assert.Equal(t, "kp-wrm_all-aircraft_a5.pdf", s.File)
			assert.Contains(t, []string{"15 dry", "15 wet"}, s.Page)
			assert.Equal(t, "KP-WRM", s.Airfield)
			assert.Equal(t, pages[s.Aircraft+" KP-WRM "+s.Page], s.PDFPages)
			assert.True(t, strings.HasPrefix(s.Part, "kp-wrm_"), s.Part)
			require.Len(t, s.Reasons, 1)
			assert.Contains(t, s.Reasons[0], "TORA 610 m -> 580 m")
		}
		var sb strings.Builder
		require.NoError(t, rep.WriteText(&sb))
		sd := pages["Sedgefin SF-2 demo trainer KP-WRM 15 dry"]
		assert.Contains(t, sb.String(), fmt.Sprintf("  kp-wrm_all-aircraft_a5.pdf  pages %d-%d: Sedgefin SF-2 demo trainer at KP-WRM, runway 15 dry\n", sd[0], sd[1]))
	}
	// A plan bundle that was never printed is listed by pair.
	p.Templates = []string{"a5", "half-letter"}
	rep, err := Stale(out, p, dir, "test", planDate)
	require.NoError(t, err)
	unprinted := 0
	for _, s := range rep.Stale {
		if strings.Contains(strings.Join(s.Reasons, ";"), "never printed") {
			unprinted++
			assert.Contains(t, s.File, "_all-aircraft_half-letter")
			assert.NotEmpty(t, s.Part)
			assert.Empty(t, s.PDFPages)
		}
	}
	assert.Equal(t, 12, unprinted, "the half-letter bundles: one line per runway end of each pair")
}

// Issue 15 item 3: --bundle plan writes one PDF for the plan, airfield by airfield
// and aircraft by aircraft in plan order; on 2-up sheets the duplex imposition runs
// over the whole bundle (each sheet's back page holds its two backs mirrored) and
// the index gives each card's sheet pages.
func TestBundlePlanOnSheets(t *testing.T) {
	dir := demoDir(t)
	p := demoPlan(dir)
	p.Sheet = "a4"
	s := runBundled(t, dir, p, cards.BundlePlan, nil)
	require.False(t, s.Failed())
	out := filepath.Join(dir, "cards")
	path := filepath.Join(out, "test_a5_a4-2up.pdf")
	outline := pdfOutline(t, path)
	require.Len(t, outline, 48, "every card side of the plan")
	// Wrenmoor first (the plan lists it first), Sedgefin first at each airfield.
	assert.Equal(t, "p1 KP-WRM runway 07 dry, Sedgefin SF-2 demo trainer, takeoff", outline[0])
	assert.Equal(t, "p1 KP-WRM runway 07 wet, Sedgefin SF-2 demo trainer, takeoff", outline[1])
	assert.Equal(t, "p2 KP-WRM runway 07 wet, Sedgefin SF-2 demo trainer, landing", outline[2], "the right card's back on the left")
	assert.Equal(t, "p2 KP-WRM runway 07 dry, Sedgefin SF-2 demo trainer, landing", outline[3])
	var order []string
	for _, l := range outline {
		if strings.HasSuffix(l, "takeoff") {
			_, rest, _ := strings.Cut(l, " ")
			order = append(order, rest[:6]+" "+strings.Split(rest, ", ")[1][:5])
		}
	}
	assert.Equal(t, "KP-WRM Sedge", order[0])
	assert.Equal(t, "KP-WRM Quill", order[8])
	assert.Equal(t, "KP-SPM Sedge", order[16])
	assert.Equal(t, "KP-SPM Quill", order[20])
	idx, err := ReadIndex(out)
	require.NoError(t, err)
	require.Len(t, idx.Cards, 4)
	for _, c := range idx.Cards {
		assert.Equal(t, "test_a5_a4-2up.pdf", c.File)
		assert.Equal(t, cards.BundlePlan, c.Bundle)
		assert.Equal(t, 24, c.Pages, "48 card sides on 12 sheets, both sides")
		for _, e := range c.Ends {
			require.Len(t, e.PDFPages, 2)
			assert.Equal(t, e.PDFPages[0]+1, e.PDFPages[1], "the back page of the same sheet")
			assert.Equal(t, 1, e.PDFPages[0]%2, "a front page")
			for k, side := range []string{"takeoff", "landing"} {
				assert.Contains(t, outline, fmt.Sprintf("p%d %s runway %s, %s, %s", e.PDFPages[k], c.Airfield.Name, e.Page, c.Aircraft.Name, side))
			}
		}
	}
	var sb strings.Builder
	s.WriteSummary(&sb)
	assert.Contains(t, sb.String(), "1 card file(s), 24 card page(s) written")
}

// Issue 15 item 3: a bundle is written whole or not at all. A job of it that fails
// leaves no bundle, no temporary and no index line of it, and says which job
// failed; the other bundles are written. A cancelled run leaves nothing half made.
func TestBundleAtomic(t *testing.T) {
	dir := demoDir(t)
	p := demoPlan(dir)
	s := runBundled(t, dir, p, cards.BundleAirfield, func(prep *Prepared) {
		for _, e := range prep.Entries {
			if e.Job.Airfield.Ident == "KP-SPM" && strings.HasPrefix(e.Job.Aircraft.Name, "Quillwing") {
				// An impossible page for this job alone: its layout fails.
				e.Job.Page = layout.Page{Name: "a5", WidthMM: 148, HeightMM: 40}
			}
		}
	})
	assert.True(t, s.Failed())
	out := filepath.Join(dir, "cards")
	entries, err := os.ReadDir(out)
	require.NoError(t, err)
	var files []string
	for _, e := range entries {
		files = append(files, e.Name())
	}
	assert.ElementsMatch(t, []string{"kp-wrm_all-aircraft_a5.pdf", IndexName}, files, "the failed bundle is not written, nor a temporary")
	var sb strings.Builder
	s.WriteSummary(&sb)
	assert.Contains(t, sb.String(), "kp-spm_all-aircraft_a5.pdf, Sedgefin SF-2 demo trainer at KP-SPM: not written: kp-spm_quillwing-qt-6-demo-tourer_a5.pdf in the same bundle failed")
	assert.Contains(t, sb.String(), "1 card file(s), 32 card page(s) written")
	idx, err := ReadIndex(out)
	require.NoError(t, err)
	for _, c := range idx.Cards {
		assert.Equal(t, "kp-wrm_all-aircraft_a5.pdf", c.File)
	}

	// Cancelled after the first bundle: the second is not written, nothing is left.
	dir = demoDir(t)
	prep, err := Prepare(demoPlan(dir), dir, "", "test", false)
	require.NoError(t, err)
	require.NoError(t, prep.SetBundle(cards.BundleAirfield))
	ctx, cancel := context.WithCancel(context.Background())
	s = prep.Run(ctx, Options{Workers: 1, Progress: &cancelAfter{n: 2, cancel: cancel}})
	assert.True(t, s.Failed())
	entries, err = os.ReadDir(filepath.Join(dir, "cards"))
	require.NoError(t, err)
	files = files[:0]
	for _, e := range entries {
		files = append(files, e.Name())
	}
	assert.ElementsMatch(t, []string{prep.bundles[0][0].Bundle, IndexName}, files)
	for _, r := range s.Results {
		if r.Entry.Bundle != prep.bundles[0][0].Bundle {
			assert.True(t, r.Canceled, "%s", r.Entry.label())
		}
	}
}

// Issue 15 item 3: --data with a bundle writes one JSON beside it: each pair's card
// data in print order, with its name and every page's PDF pages.
func TestBundleData(t *testing.T) {
	dir := demoDir(t)
	runBundled(t, dir, demoPlan(dir), cards.BundleAirfield, func(prep *Prepared) {
		for _, e := range prep.Entries {
			e.Job.Data = true
		}
	})
	out := filepath.Join(dir, "cards")
	data, err := os.ReadFile(filepath.Join(out, "kp-wrm_all-aircraft_a5.json"))
	require.NoError(t, err)
	var b cards.CardBundle
	dec := json.NewDecoder(bytes.NewReader(data))
	dec.DisallowUnknownFields()
	require.NoError(t, dec.Decode(&b))
	assert.Equal(t, cards.BundleAirfield, b.Bundle)
	assert.Equal(t, cards.Caution, b.Caution)
	require.Len(t, b.CardFiles, 2)
	assert.Equal(t, "Sedgefin SF-2 demo trainer", b.CardFiles[0].Aircraft)
	assert.Equal(t, "kp-wrm_sedgefin-sf-2-demo-trainer_a5.pdf", b.CardFiles[0].Part)
	page := 1
	for _, f := range b.CardFiles {
		require.Len(t, f.Pages, 8)
		for _, pg := range f.Pages {
			assert.Equal(t, []int{page, page + 1}, pg.PDFPages, "%s %s", f.Aircraft, pg.Page)
			assert.NotNil(t, pg.Landing)
			page += 2
		}
	}
}

// Issue 15 item 3: a card page with no figure in a bundle is listed (so that the
// command refuses it) by bundle, pages, aircraft and runway.
func TestBundleEmptyCardListed(t *testing.T) {
	dir := demoDir(t)
	data, _ := os.ReadFile(filepath.Join(dir, "saltpan.yaml"))
	// The demo trainer's table stops at 8000 ft of pressure altitude: at 9000 ft no
	// cell of its cards has a figure (as in the command's test of empty cards).
	require.NoError(t, os.WriteFile(filepath.Join(dir, "saltpan.yaml"), []byte(strings.Replace(string(data), "elevation: 4975 ft", "elevation: 9000 ft", 1)), 0o644))
	s := runBundled(t, dir, demoPlan(dir), cards.BundleAirfield, nil)
	require.Empty(t, s.InputErrors)
	found := false
	for _, e := range s.Empty() {
		if strings.HasPrefix(e, "kp-spm_all-aircraft_a5.pdf pages 1-2, Sedgefin SF-2 demo trainer at KP-SPM, runway 04 dry: ") {
			found = true
			assert.Contains(t, e, "above the table's highest")
		}
	}
	assert.True(t, found, "%q", s.Empty())
}

// Issue 15 item 3: cards without a landing side (a profile without landing data)
// print one-sided: they go to a bundle of their own, "_takeoff-only", so that a
// duplex bundle never holds a one-sided card; and a bundle larger than
// cards.MaxBundlePages is refused before anything is made.
func TestBundleSplitsOneSidedAndRefusesTooLarge(t *testing.T) {
	dir := demoDir(t)
	prep, err := Prepare(demoPlan(dir), dir, "", "test", false)
	require.NoError(t, err)
	for _, e := range prep.Entries {
		if strings.HasPrefix(e.Job.Aircraft.Name, "Quillwing") {
			a := *e.Job.Aircraft
			a.Landing = nil
			e.Job.Aircraft = &a
		}
	}
	require.NoError(t, prep.SetBundle(cards.BundleAirfield))
	got := map[string][]string{}
	for _, e := range prep.Entries {
		got[e.Bundle] = append(got[e.Bundle], e.Job.Aircraft.Name)
	}
	assert.Equal(t, map[string][]string{
		"kp-wrm_all-aircraft_a5.pdf":              {"Sedgefin SF-2 demo trainer"},
		"kp-spm_all-aircraft_a5.pdf":              {"Sedgefin SF-2 demo trainer"},
		"kp-wrm_all-aircraft_a5_takeoff-only.pdf": {"Quillwing QT-6 demo tourer"},
		"kp-spm_all-aircraft_a5_takeoff-only.pdf": {"Quillwing QT-6 demo tourer"},
	}, got)
	s := prep.Run(context.Background(), Options{Workers: 2})
	require.False(t, s.Failed(), "%v", s.Results)
	outline := pdfOutline(t, filepath.Join(dir, "cards", "kp-wrm_all-aircraft_a5_takeoff-only.pdf"))
	assert.Len(t, outline, 6, "takeoff sides only")
	for _, l := range outline {
		assert.True(t, strings.HasSuffix(l, "Quillwing QT-6 demo tourer"), l)
	}

	// Too large: 202 aircraft x 16 pages at one airfield.
	p := demoPlan(dir)
	p.Airfields = []string{"wrenmoor.yaml"}
	for i := 0; i < 200; i++ {
		p.Aircraft = append(p.Aircraft, "sedgefin-sf2.yaml")
	}
	prep, err = Prepare(p, dir, "", "test", false)
	require.NoError(t, err)
	err = prep.SetBundle(cards.BundleAirfield)
	require.Error(t, err)
	assert.Contains(t, err.Error(), fmt.Sprintf("kp-wrm_all-aircraft_a5.pdf would hold %d card pages, more than the %d one bundle may", 202*16, cards.MaxBundlePages))
	assert.Error(t, prep.SetBundle("runway"))
	assert.NoError(t, prep.SetBundle(""))
	for _, e := range prep.Entries {
		assert.Empty(t, e.Bundle)
	}
}

// A run in bundles replaces a bundle's index lines with the new ones (one per pair)
// and keeps the lines of the card files the run did not write; the reader refuses a
// pair listed twice, and a bundle line without its part.
func TestBundleIndexLines(t *testing.T) {
	dir := demoDir(t)
	run(t, dir, demoPlan(dir)) // one file per pair first
	runBundled(t, dir, demoPlan(dir), cards.BundleAirfield, nil)
	runBundled(t, dir, demoPlan(dir), cards.BundleAirfield, nil) // again: the same lines, not twice
	out := filepath.Join(dir, "cards")
	idx, err := ReadIndex(out)
	require.NoError(t, err)
	perFile := map[string]int{}
	for _, c := range idx.Cards {
		perFile[c.File]++
	}
	assert.Equal(t, 2, perFile["kp-wrm_all-aircraft_a5.pdf"])
	assert.Equal(t, 2, perFile["kp-spm_all-aircraft_a5.pdf"])
	assert.Equal(t, 1, perFile["kp-wrm_sedgefin-sf-2-demo-trainer_a5.pdf"])
	assert.Len(t, perFile, 6)

	data, err := os.ReadFile(filepath.Join(out, IndexName))
	require.NoError(t, err)
	lines := strings.Split(strings.TrimSpace(string(data)), "\n")
	var bundleLine string
	for _, l := range lines {
		if strings.Contains(l, `"bundle":"airfield"`) {
			bundleLine = l
			break
		}
	}
	require.NotEmpty(t, bundleLine)
	require.NoError(t, os.WriteFile(filepath.Join(out, IndexName), []byte(strings.Join(append(lines, bundleLine), "\n")+"\n"), 0o644))
	_, err = ReadIndex(out)
	require.Error(t, err)
	assert.Contains(t, err.Error(), "is listed twice")
	require.NoError(t, os.WriteFile(filepath.Join(out, IndexName), []byte(lines[0]+"\n"+strings.Replace(bundleLine, `"bundle":"airfield",`, "", 1)+"\n"), 0o644))
	_, err = ReadIndex(out)
	require.Error(t, err)
	assert.Contains(t, err.Error(), "a bundle's line names its bundle mode and its part")
}
