package batch

import (
	"context"
	"os"
	"path/filepath"
	"strings"
	"testing"
	"time"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"

	"kneeprint/airfields"
	"kneeprint/cmd/internal/spec"
	"kneeprint/templates"
)

var planDate = time.Date(2027, 3, 1, 0, 0, 0, 0, time.UTC)

// demoDir copies the demo files into a temporary folder, as 'init --demo' does, and
// returns the folder.
func demoDir(t *testing.T) string {
	t.Helper()
	dir := t.TempDir()
	copyFS := func(data []byte, err error, name string) {
		require.NoError(t, err)
		require.NoError(t, os.WriteFile(filepath.Join(dir, name), data, 0o644))
	}
	for _, n := range []string{"sedgefin-sf2.yaml", "quillwing-qt6.yaml"} {
		data, err := templates.FS.ReadFile("aircraft/" + n)
		copyFS(data, err, n)
	}
	for _, n := range []string{"wrenmoor.yaml", "saltpan.yaml"} {
		data, err := airfields.FS.ReadFile(n)
		copyFS(data, err, n)
	}
	return dir
}

func demoPlan(dir string) *spec.Plan {
	return &spec.Plan{Name: "test", Aircraft: []string{"sedgefin-sf2.yaml", "quillwing-qt6.yaml"},
		Airfields: []string{"wrenmoor.yaml", "saltpan.yaml"}, Templates: []string{"a5"},
		Date: planDate, Output: "cards"}
}

func run(t *testing.T, dir string, p *spec.Plan) *Summary {
	t.Helper()
	prep, err := Prepare(p, dir, "", "test", false)
	require.NoError(t, err)
	return prep.Run(context.Background(), Options{Workers: 2})
}

func TestRunPlanAndIndex(t *testing.T) {
	dir := demoDir(t)
	s := run(t, dir, demoPlan(dir))
	require.False(t, s.Failed(), "%+v", s.InputErrors)
	require.Len(t, s.Results, 4)
	idx, err := ReadIndex(filepath.Join(dir, "cards"))
	require.NoError(t, err)
	require.Len(t, idx.Cards, 4)
	ends := 0
	for _, c := range idx.Cards {
		_, err := os.Stat(filepath.Join(dir, "cards", c.File))
		assert.NoError(t, err)
		assert.Equal(t, "2027-03-01", c.Date)
		ends += len(c.Ends)
	}
	// 2 aircraft x (4 + 2 ends), every end a dry and a wet page (the demo aircraft have
	// landing data: paved ends too).
	assert.Equal(t, 24, ends)
	rep, err := Stale(filepath.Join(dir, "cards"), nil, "", "test", planDate)
	require.NoError(t, err)
	assert.Empty(t, rep.Stale)
	assert.Equal(t, 24, rep.Checked)

	var sb strings.Builder
	s.WriteSummary(&sb)
	assert.Contains(t, sb.String(), "4 card file(s), 48 card page(s) written")
	assert.Contains(t, sb.String(), "kp-spm_sedgefin-sf-2-demo-trainer_a5.pdf runway 04 dry:")
	assert.Contains(t, sb.String(), "kp-spm_sedgefin-sf-2-demo-trainer_a5.pdf runway 04 wet:")
}

// One bad airfield is reported; every other card is still made.
func TestBadAirfieldDoesNotStopOthers(t *testing.T) {
	dir := demoDir(t)
	require.NoError(t, os.WriteFile(filepath.Join(dir, "broken.yaml"), []byte("kind: airfield\nname: Broken\nident: BRK\nelevation: 100\nrunways: []\n"), 0o644))
	p := demoPlan(dir)
	p.Airfields = append(p.Airfields, "broken.yaml", "missing.yaml")
	s := run(t, dir, p)
	assert.True(t, s.Failed())
	require.Len(t, s.InputErrors, 2)
	assert.Contains(t, s.InputErrors[0].Error(), "broken.yaml:4:12: elevation")
	assert.Contains(t, s.InputErrors[1].Error(), "missing.yaml")
	written := 0
	for _, r := range s.Results {
		if r.Err == nil && !r.Canceled {
			written++
		}
	}
	assert.Equal(t, 4, written)
}

// Editing one runway's TORA names exactly the cards of that runway end, for every
// aircraft, and nothing else.
func TestStaleNamesExactlyTheAffectedCards(t *testing.T) {
	dir := demoDir(t)
	run(t, dir, demoPlan(dir))
	out := filepath.Join(dir, "cards")
	path := filepath.Join(dir, "wrenmoor.yaml")
	data, _ := os.ReadFile(path)
	edited := strings.Replace(string(data), "tora: 610 m", "tora: 580 m", 1) // runway 15
	require.NotEqual(t, string(data), edited)
	// A comment alone changes nothing.
	unitSpelling := strings.Replace(string(data), "tora: 840 m", "tora: 2755.905511811 ft", 1)
	require.NoError(t, os.WriteFile(path, []byte("# reviewed\n"+unitSpelling), 0o644))
	rep, err := Stale(out, nil, "", "test", planDate)
	require.NoError(t, err)
	assert.Empty(t, rep.Stale, "formatting, comments and the unit a value is written in do not make a card stale")

	require.NoError(t, os.WriteFile(path, []byte(edited), 0o644))
	rep, err = Stale(out, nil, "", "test", planDate)
	require.NoError(t, err)
	require.Len(t, rep.Stale, 4, "2 aircraft x the dry and the wet page of grass runway 15")
	for _, s := range rep.Stale {
		assert.Equal(t, "15", s.Designator)
		assert.Contains(t, []string{"15 dry", "15 wet"}, s.Page)
		assert.True(t, strings.HasPrefix(s.File, "kp-wrm_"))
		require.Len(t, s.Reasons, 1)
		assert.Contains(t, s.Reasons[0], "runway end 15 changed in")
		assert.Contains(t, s.Reasons[0], "TORA 610 m -> 580 m")
	}
}

// Issue 11 item 5: editing one runway end's LDA names exactly the cards of that end
// (their landing side holds the LDA), for every aircraft, and says so.
func TestStaleLDAChangeNamesThatEndsCards(t *testing.T) {
	dir := demoDir(t)
	run(t, dir, demoPlan(dir))
	out := filepath.Join(dir, "cards")
	path := filepath.Join(dir, "wrenmoor.yaml")
	data, _ := os.ReadFile(path)
	edited := strings.Replace(string(data), "lda: 780 m", "lda: 700 m", 1) // runway 07
	require.NotEqual(t, string(data), edited)
	require.NoError(t, os.WriteFile(path, []byte(edited), 0o644))
	rep, err := Stale(out, nil, "", "test", planDate)
	require.NoError(t, err)
	require.Len(t, rep.Stale, 4, "2 aircraft x the dry and the wet card of runway 07")
	for _, s := range rep.Stale {
		assert.Contains(t, []string{"07 dry", "07 wet"}, s.Page)
		assert.True(t, strings.HasPrefix(s.File, "kp-wrm_"))
		require.Len(t, s.Reasons, 1)
		assert.Contains(t, s.Reasons[0], "LDA 780 m -> 700 m (its landing side)")
	}
	// The index counts each card's landing cells by state.
	idx, err := ReadIndex(out)
	require.NoError(t, err)
	for _, c := range idx.Cards {
		for _, e := range c.Ends {
			total := 0
			for _, n := range e.LandingStates {
				total += n
			}
			assert.Equal(t, 7*8*2, total, "%s %s: 7 winds x 8 temperatures x 2 landing blocks", c.File, e.Page)
		}
	}
}

func TestStaleReasons(t *testing.T) {
	dir := demoDir(t)
	run(t, dir, demoPlan(dir))
	out := filepath.Join(dir, "cards")
	// The aircraft changes: every card of that aircraft, every runway end.
	ap := filepath.Join(dir, "sedgefin-sf2.yaml")
	data, _ := os.ReadFile(ap)
	require.NoError(t, os.WriteFile(ap, []byte(strings.Replace(string(data), "demonstrated_crosswind: 15 kt", "demonstrated_crosswind: 12 kt", 1)), 0o644))
	// A card file altered, another removed.
	require.NoError(t, os.WriteFile(filepath.Join(out, "kp-spm_quillwing-qt-6-demo-tourer_a5.pdf"), []byte("%PDF-1.4 tampered"), 0o644))
	require.NoError(t, os.Remove(filepath.Join(out, "kp-wrm_quillwing-qt-6-demo-tourer_a5.pdf")))
	rep, err := Stale(out, nil, "", "test", planDate)
	require.NoError(t, err)
	why := map[string]string{}
	for _, s := range rep.Stale {
		why[s.File+" "+s.Designator] = strings.Join(s.Reasons, "; ")
	}
	assert.Len(t, why, 12)
	assert.Contains(t, why["kp-wrm_sedgefin-sf-2-demo-trainer_a5.pdf 07"], "aircraft profile")
	assert.Contains(t, why["kp-spm_quillwing-qt-6-demo-tourer_a5.pdf 04"], "card file changed after kneeprint wrote it")
	assert.Contains(t, why["kp-wrm_quillwing-qt-6-demo-tourer_a5.pdf 33"], "card file missing")
	// A new kneeprint version makes every card stale, saying so.
	rep, err = Stale(out, nil, "", "test-2", planDate)
	require.NoError(t, err)
	assert.Contains(t, strings.Join(rep.Stale[0].Reasons, ";"), "made by kneeprint test, this is kneeprint test-2")
}

func TestStaleWithPlan(t *testing.T) {
	dir := demoDir(t)
	p := demoPlan(dir)
	run(t, dir, p)
	// The plan now names an edited copy of an airfield, and one more template.
	data, _ := os.ReadFile(filepath.Join(dir, "saltpan.yaml"))
	require.NoError(t, os.WriteFile(filepath.Join(dir, "saltpan-2027.yaml"), []byte(strings.Replace(string(data), "surface: gravel", "surface: grass", 1)), 0o644))
	p.Airfields = []string{"wrenmoor.yaml", "saltpan-2027.yaml"}
	p.Templates = []string{"a5", "half-letter"}
	rep, err := Stale(filepath.Join(dir, "cards"), p, dir, "test", planDate)
	require.NoError(t, err)
	var surface, unprinted int
	for _, s := range rep.Stale {
		r := strings.Join(s.Reasons, ";")
		switch {
		case strings.Contains(r, "surface gravel -> grass"):
			surface++
		case strings.Contains(r, "in the plan but never printed"):
			unprinted++
		default:
			t.Errorf("unexpected %+v", s)
		}
	}
	assert.Equal(t, 8, surface, "2 aircraft x 2 runway ends x dry and wet pages at the edited strip")
	assert.Equal(t, 12, unprinted, "the half-letter cards were never printed (one line per runway end)")
}

// A cancelled batch leaves no file of a card that was not finished, and no temporary.
func TestCancelLeavesNoPartialFile(t *testing.T) {
	dir := demoDir(t)
	prep, err := Prepare(demoPlan(dir), dir, "", "test", false)
	require.NoError(t, err)
	ctx, cancel := context.WithCancel(context.Background())
	prog := &cancelAfter{n: 1, cancel: cancel}
	s := prep.Run(ctx, Options{Workers: 1, Progress: prog})
	assert.True(t, s.Failed())
	entries, err := os.ReadDir(filepath.Join(dir, "cards"))
	require.NoError(t, err)
	names := map[string]bool{}
	for _, e := range entries {
		assert.False(t, strings.HasSuffix(e.Name(), ".tmp"), "temporary left: %s", e.Name())
		names[e.Name()] = true
	}
	for _, r := range s.Results {
		if r.Canceled {
			assert.False(t, names[r.Entry.Name], "%s was cancelled but exists", r.Entry.Name)
		}
	}
	idx, err := ReadIndex(filepath.Join(dir, "cards"))
	require.NoError(t, err)
	assert.Len(t, idx.Cards, len(entries)-1, "the index lists exactly the cards written")
}

type cancelAfter struct {
	n, seen int
	cancel  func()
}

func (c *cancelAfter) Start(int) {}
func (c *cancelAfter) Done(JobResult) {
	c.seen++
	if c.seen == c.n {
		c.cancel()
	}
}
func (c *cancelAfter) Finish() {}

func TestLeftoverTemporariesRemoved(t *testing.T) {
	dir := demoDir(t)
	out := filepath.Join(dir, "cards")
	require.NoError(t, os.MkdirAll(out, 0o755))
	leftover := filepath.Join(out, ".kp-wrm_sedgefin-sf-2-demo-trainer_a5.pdf.kneeprint-12345.tmp")
	require.NoError(t, os.WriteFile(leftover, []byte("%PDF-1.4 half"), 0o644))
	run(t, dir, demoPlan(dir))
	_, err := os.Stat(leftover)
	assert.True(t, os.IsNotExist(err), "a killed batch's temporary is cleaned up")
}

// Names from user data never escape the folder nor clash, even by case only.
func TestNamesSafeAndUnique(t *testing.T) {
	dir := demoDir(t)
	data, _ := os.ReadFile(filepath.Join(dir, "wrenmoor.yaml"))
	s := string(data)
	for i, ident := range []string{"kp-wrm", "KP-wrm"} {
		require.NoError(t, os.WriteFile(filepath.Join(dir, []string{"a.yaml", "b.yaml"}[i]), []byte(strings.Replace(s, "ident: KP-WRM", "ident: "+ident, 1)), 0o644))
	}
	ap := filepath.Join(dir, "sedgefin-sf2.yaml")
	ad, _ := os.ReadFile(ap)
	require.NoError(t, os.WriteFile(ap, []byte(strings.Replace(string(ad), "name: Sedgefin SF-2 demo trainer", `name: "../../etc/passwd `+strings.Repeat("x", 300)+`"`, 1)), 0o644))
	p := demoPlan(dir)
	p.Airfields = []string{"wrenmoor.yaml", "a.yaml", "b.yaml"}
	prep, err := Prepare(p, dir, "", "test", false)
	require.NoError(t, err)
	seen := map[string]bool{}
	for _, e := range prep.Entries {
		assert.NotContains(t, e.Name, "/")
		assert.NotContains(t, e.Name, "..")
		assert.Less(t, len(e.Name), 140)
		k := strings.ToLower(e.Name)
		assert.False(t, seen[k], "clash: %s", e.Name)
		seen[k] = true
	}
	assert.Len(t, seen, 6)
}

func TestProgress(t *testing.T) {
	e := &Entry{Name: "x.pdf"}
	var term, plain strings.Builder
	for _, p := range []Progress{NewProgress(&term, true), NewProgress(&plain, false)} {
		p.Start(2)
		p.Done(JobResult{Entry: e, Pages: 4})
		p.Done(JobResult{Entry: e, Err: os.ErrPermission})
		p.Finish()
	}
	assert.Contains(t, term.String(), "\r[###############...............] 1/2 card files")
	assert.Contains(t, term.String(), "\r[##############################] 2/2 card files")
	assert.NotContains(t, plain.String(), "\r")
	assert.Contains(t, plain.String(), "[1/2] wrote x.pdf (4 page(s))\n[2/2] FAILED x.pdf: permission denied\n")
}
