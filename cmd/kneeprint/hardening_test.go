package main

import (
	"bytes"
	"encoding/json"
	"fmt"
	"os"
	"path/filepath"
	"regexp"
	"strings"
	"sync"
	"testing"
	"time"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
)

// runCLIAt is runCLI on another day (stale's expiry).
func runCLIAt(t *testing.T, day time.Time, args ...string) (int, string, string) {
	t.Helper()
	var out, errb bytes.Buffer
	code := run(args, env{stdout: &out, stderr: &errb, now: func() time.Time { return day }})
	return code, out.String(), errb.String()
}

// demoFolder writes the demo files into a fresh folder and returns it with the
// demo plan's path.
func demoFolder(t *testing.T) (dir, plan string) {
	t.Helper()
	dir = t.TempDir()
	code, _, errOut := runCLI(t, "init", "--demo", dir)
	require.Equal(t, exitOK, code, errOut)
	return dir, filepath.Join(dir, "demo-season.yaml")
}

// writePlan writes a plan into dir naming the given files and output folder.
func writePlan(t *testing.T, dir, name string, aircraft, airfields, templates []string, output string) string {
	t.Helper()
	p := fmt.Sprintf("kind: plan\nname: test\naircraft: [%s]\nairfields: [%s]\ntemplates: [%s]\ndate: 2027-03-01\nvalid_until: 2027-10-31\noutput: %s\n",
		strings.Join(aircraft, ", "), strings.Join(airfields, ", "), strings.Join(templates, ", "), output)
	path := filepath.Join(dir, name)
	require.NoError(t, os.WriteFile(path, []byte(p), 0o644))
	return path
}

func pdfsIn(t *testing.T, dir string) []string {
	t.Helper()
	entries, err := os.ReadDir(dir)
	require.NoError(t, err)
	var out []string
	for _, e := range entries {
		if strings.HasSuffix(e.Name(), ".pdf") {
			out = append(out, e.Name())
		}
	}
	return out
}

var writtenRE = regexp.MustCompile(`(\d+) card file\(s\), (\d+) card page\(s\) written`)

func claimedFiles(t *testing.T, out string) int {
	t.Helper()
	m := writtenRE.FindStringSubmatch(out)
	require.NotNil(t, m, out)
	var n int
	fmt.Sscan(m[1], &n)
	return n
}

// Issue 14 item 6: --page used to reset the clash suffixes, so two templates (or two
// profiles of one name) wrote one file and the run claimed two.
func TestPageOverrideKeepsNamesUnique(t *testing.T) {
	dir, _ := demoFolder(t)
	data, err := os.ReadFile(filepath.Join(dir, "sedgefin-sf2.yaml"))
	require.NoError(t, err)
	// A second profile of the same aircraft name (another tail number's copy).
	require.NoError(t, os.WriteFile(filepath.Join(dir, "sedgefin-copy.yaml"), data, 0o644))
	plan := writePlan(t, dir, "p.yaml", []string{"sedgefin-sf2.yaml", "sedgefin-copy.yaml"}, []string{"wrenmoor.yaml", "saltpan.yaml"},
		[]string{"a5", "half-letter"}, "out")
	// half-letter: a 5 x 8 in page no longer holds the demo's two weight blocks of
	// seven rows once a runway end lists obstacles (issue 12: the obstacle line and
	// the climb row), and says so; the names are what this test is about.
	code, out, errOut := runCLI(t, "cards", "--plan", plan, "--page", "half-letter")
	require.Equal(t, exitOK, code, out+errOut)
	pdfs := pdfsIn(t, filepath.Join(dir, "out"))
	assert.Len(t, pdfs, 8, "2 profiles x 2 airfields x 2 templates, each its own file: %v", pdfs)
	assert.Equal(t, len(pdfs), claimedFiles(t, out), "the summary counts the files there are")

	// The page chosen on the command line is not a template change.
	code, out, _ = runCLI(t, "stale", filepath.Join(dir, "out"))
	assert.Equal(t, exitOK, code, out)
	assert.Contains(t, out, "all 48 card(s) match their inputs")
	code, out, _ = runCLI(t, "stale", filepath.Join(dir, "out"), "--plan", plan)
	assert.Equal(t, exitOK, code, out)
	assert.NotContains(t, out, "template")
}

// Issue 14 item 7: a second batch into a folder another batch is writing waits for
// it (the lock), and only kneeprint's own temporaries are cleared.
func TestSecondBatchWaitsForTheFirst(t *testing.T) {
	dir, plan := demoFolder(t)
	out := filepath.Join(dir, "cards")
	require.NoError(t, os.MkdirAll(out, 0o755))
	userTmp := filepath.Join(out, ".my-notes.tmp")
	require.NoError(t, os.WriteFile(userTmp, []byte("mine"), 0o644))

	// Another batch holds the folder: here, this test, through the same lock.
	hold := holdLock(t, filepath.Join(out, ".kneeprint-lock"))
	type res struct {
		code     int
		out, err string
	}
	done := make(chan res, 1)
	errb := &syncBuffer{}
	go func() {
		var o bytes.Buffer
		code := run([]string{"cards", "--plan", plan}, env{stdout: &o, stderr: errb, now: time.Now})
		done <- res{code, o.String(), errb.String()}
	}()
	select {
	case r := <-done:
		t.Fatalf("the batch ran while another held the folder: %+v", r)
	case <-time.After(1500 * time.Millisecond):
	}
	assert.Contains(t, errb.String(), "waiting: another kneeprint batch (process ")
	assert.Empty(t, pdfsIn(t, out), "nothing written while waiting")
	hold()
	select {
	case r := <-done:
		require.Equal(t, exitOK, r.code, r.out+r.err)
		assert.Equal(t, 4, claimedFiles(t, r.out))
	case <-time.After(60 * time.Second):
		t.Fatal("the waiting batch did not run once the folder was free")
	}
	data, err := os.ReadFile(userTmp)
	require.NoError(t, err, "a user's own .tmp file is not a kneeprint temporary")
	assert.Equal(t, "mine", string(data))
}

// Issue 14 item 7: two batches started together into one folder both finish, and
// the index lists every card of both (it was an unlocked read-modify-write).
func TestTwoBatchesIntoOneFolder(t *testing.T) {
	dir, _ := demoFolder(t)
	for trial := 0; trial < 4; trial++ {
		out := fmt.Sprintf("out%d", trial)
		plans := []string{
			writePlan(t, dir, fmt.Sprintf("a%d.yaml", trial), []string{"sedgefin-sf2.yaml"}, []string{"wrenmoor.yaml", "saltpan.yaml"}, []string{"a5"}, out),
			writePlan(t, dir, fmt.Sprintf("b%d.yaml", trial), []string{"quillwing-qt6.yaml"}, []string{"wrenmoor.yaml", "saltpan.yaml"}, []string{"a5"}, out),
		}
		var wg sync.WaitGroup
		codes := make([]int, 2)
		outs := make([]string, 2)
		for i, p := range plans {
			wg.Add(1)
			go func() {
				defer wg.Done()
				var o, e bytes.Buffer
				codes[i] = run([]string{"cards", "--plan", p}, env{stdout: &o, stderr: &e, now: time.Now})
				outs[i] = o.String() + e.String()
			}()
		}
		wg.Wait()
		for i := range codes {
			require.Equal(t, exitOK, codes[i], outs[i])
		}
		assert.Len(t, pdfsIn(t, filepath.Join(dir, out)), 4)
		code, sout, _ := runCLI(t, "stale", filepath.Join(dir, out))
		assert.Equal(t, exitOK, code, sout)
		assert.Contains(t, sout, "all 24 card(s) match their inputs", "trial %d: every card of both batches is indexed", trial)
	}
}

// Issue 14 item 8: -o naming a file used to report "4 card file(s) written".
func TestOutputIsAFile(t *testing.T) {
	dir := t.TempDir()
	file := filepath.Join(dir, "cards.pdf")
	require.NoError(t, os.WriteFile(file, []byte("not a folder"), 0o644))
	code, out, errOut := runCLI(t, "cards", "--demo", "-o", file)
	assert.Equal(t, exitUsage, code)
	assert.Contains(t, errOut, "-o "+file+" is a file: give a folder")
	assert.NotContains(t, out, "written")

	// A plan whose output is a file: nothing is claimed, the reason is given.
	d2, _ := demoFolder(t)
	require.NoError(t, os.WriteFile(filepath.Join(d2, "taken"), []byte("x"), 0o644))
	plan := writePlan(t, d2, "p.yaml", []string{"sedgefin-sf2.yaml"}, []string{"wrenmoor.yaml"}, []string{"a5"}, "taken")
	code, out, _ = runCLI(t, "cards", "--plan", plan)
	assert.Equal(t, exitFailure, code)
	assert.Equal(t, 0, claimedFiles(t, out))
	assert.Contains(t, out, "is a file, not a folder")
}

// Issue 14 item 11: --workers 100000 is capped at one per card file.
func TestWorkersCapped(t *testing.T) {
	code, _, errOut := runCLI(t, "cards", "--demo", "-o", t.TempDir(), "--workers", "100000")
	require.Equal(t, exitOK, code, errOut)
	assert.Contains(t, errOut, "--workers 100000: 4 used")
	code, _, errOut = runCLI(t, "cards", "--demo", "-o", t.TempDir(), "--workers", "-1")
	assert.Equal(t, exitUsage, code, errOut)
}

// Issue 9 item 12: stale lists the cards past their valid-until date, with the date.
func TestStaleListsExpiredCards(t *testing.T) {
	dir := t.TempDir()
	code, _, errOut := runCLI(t, "cards", "--aircraft", "demo:sedgefin-sf2", "--airfield", "demo:saltpan", "-o", dir,
		"--date", "2026-12-01", "--valid-until", "2026-12-15")
	require.Equal(t, exitOK, code, errOut)
	code, out, _ := runCLIAt(t, time.Date(2026, 12, 15, 23, 0, 0, 0, time.UTC), "stale", dir)
	assert.Equal(t, exitOK, code, "valid through its last day: %s", out)
	code, out, _ = runCLIAt(t, time.Date(2026, 12, 16, 8, 0, 0, 0, time.UTC), "stale", dir)
	assert.Equal(t, exitFailure, code, out)
	assert.Contains(t, out, "expired: valid until 2026-12-15")
	code, out, _ = runCLIAt(t, time.Date(2026, 12, 16, 8, 0, 0, 0, time.UTC), "stale", dir, "--json")
	assert.Equal(t, exitFailure, code)
	var rep struct {
		Stale []struct {
			Page       string `json:"page"`
			ValidUntil string `json:"valid_until"`
			Expired    bool   `json:"expired"`
		} `json:"stale"`
	}
	require.NoError(t, json.Unmarshal([]byte(out), &rep), out)
	require.Len(t, rep.Stale, 4, "both runway ends of the gravel strip, each dry and wet")
	for _, s := range rep.Stale {
		assert.True(t, s.Expired)
		assert.Equal(t, "2026-12-15", s.ValidUntil)
	}
}

// Issue 14: edits to fields no card prints and no figure uses do not make a card
// stale; a printed one does.
func TestStaleIgnoresUnprintedFields(t *testing.T) {
	dir, plan := demoFolder(t)
	code, _, errOut := runCLI(t, "cards", "--plan", plan)
	require.Equal(t, exitOK, code, errOut)
	cardsDir := filepath.Join(dir, "cards")
	edit := func(file, old, new string) {
		t.Helper()
		p := filepath.Join(dir, file)
		data, err := os.ReadFile(p)
		require.NoError(t, err)
		edited := strings.Replace(string(data), old, new, 1)
		require.NotEqual(t, string(data), edited, "%s: %q not found", file, old)
		require.NoError(t, os.WriteFile(p, []byte(edited), 0o644))
	}
	edit("sedgefin-sf2.yaml", "notes: Demo data, invented.", "notes: Demo data, invented, checked again.")
	edit("sedgefin-sf2.yaml", "type: Sedgefin SF-2 (fictional", "type: Sedgefin SF-2A (fictional")
	edit("wrenmoor.yaml", "variation: 1 deg W", "variation: 2 deg W")
	code, out, _ := runCLI(t, "stale", cardsDir)
	assert.Equal(t, exitOK, code, "type, notes and variation are neither printed nor used for a card's figures: %s", out)
	code, out, _ = runCLI(t, "stale", cardsDir, "--plan", plan)
	assert.Equal(t, exitOK, code, out)

	edit("sedgefin-sf2.yaml", "name: Sedgefin SF-2 demo trainer", "name: Sedgefin SF-2 demo trainer G-XXXX")
	code, out, _ = runCLI(t, "stale", cardsDir)
	assert.Equal(t, exitFailure, code, "the name is printed")
	assert.Contains(t, out, "aircraft profile")
}

// Issue 9 item 12: validate on a plan checks every file it names.
func TestValidatePlanChecksItsFiles(t *testing.T) {
	dir, plan := demoFolder(t)
	code, out, _ := runCLI(t, "validate", plan)
	require.Equal(t, exitOK, code, out)

	require.NoError(t, os.WriteFile(filepath.Join(dir, "out-file"), []byte("x"), 0o644))
	bad := writePlan(t, dir, "bad.yaml", []string{"sedgefin-sf2.yaml", "wrenmoor.yaml", "missing.yaml"},
		[]string{"saltpan.yaml", "quillwing-qt6.yaml"}, []string{"a5", "a6", "nope/tmpl.yaml"}, "out-file")
	code, out, _ = runCLI(t, "validate", bad)
	assert.Equal(t, exitFailure, code)
	for _, want := range []string{
		"bad.yaml:3:31: aircraft[1]: " + filepath.Join(dir, "wrenmoor.yaml") + " is an airfield file, an aircraft file is needed here",
		"bad.yaml:3:46: aircraft[2]: " + filepath.Join(dir, "missing.yaml") + ": no such file",
		"bad.yaml:4:27: airfields[1]: " + filepath.Join(dir, "quillwing-qt6.yaml") + " is an aircraft file, an airfield file is needed here",
		"bad.yaml:5:17: templates[1]: ",
		"bad.yaml:5:21: templates[2]: ",
		"bad.yaml:8:9: output: " + filepath.Join(dir, "out-file") + " is a file, not a folder",
	} {
		assert.Contains(t, out, want)
	}
	assert.NotContains(t, out, "aircraft[0]")
	assert.NotContains(t, out, "airfields[0]")
}

// init --demo DIR --force replaces a symbolic link in DIR, never the file it points
// to; without --force it checks every target before it writes any.
func TestInitDemoNeverFollowsLinks(t *testing.T) {
	outside := t.TempDir()
	victim := filepath.Join(outside, "precious.yaml")
	require.NoError(t, os.WriteFile(victim, []byte("keep me"), 0o644))
	dir := t.TempDir()
	link := filepath.Join(dir, "wrenmoor.yaml")
	require.NoError(t, os.Symlink(victim, link))

	code, _, errOut := runCLI(t, "init", "--demo", dir)
	assert.Equal(t, exitFailure, code)
	assert.Contains(t, errOut, "wrenmoor.yaml already exists")
	entries, _ := os.ReadDir(dir)
	assert.Len(t, entries, 1, "nothing written when one target exists")

	code, _, errOut = runCLI(t, "init", "--demo", dir, "--force")
	require.Equal(t, exitOK, code, errOut)
	data, _ := os.ReadFile(victim)
	assert.Equal(t, "keep me", string(data), "the file the link points to is untouched")
	st, err := os.Lstat(link)
	require.NoError(t, err)
	assert.True(t, st.Mode().IsRegular(), "the link was replaced by the demo file")
	entries, _ = os.ReadDir(dir)
	assert.Len(t, entries, 5)

	// The same for a starter written over a link.
	starter := filepath.Join(dir, "mine.yaml")
	require.NoError(t, os.Symlink(victim, starter))
	code, _, errOut = runCLI(t, "init", "airfield", starter, "--force")
	require.Equal(t, exitOK, code, errOut)
	data, _ = os.ReadFile(victim)
	assert.Equal(t, "keep me", string(data))
}

// syncBuffer is a bytes.Buffer safe for a writer and a reader in two goroutines.
type syncBuffer struct {
	mu sync.Mutex
	b  bytes.Buffer
}

func (s *syncBuffer) Write(p []byte) (int, error) {
	s.mu.Lock()
	defer s.mu.Unlock()
	return s.b.Write(p)
}

func (s *syncBuffer) String() string {
	s.mu.Lock()
	defer s.mu.Unlock()
	return s.b.String()
}
