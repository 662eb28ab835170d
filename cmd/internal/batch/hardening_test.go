package batch

import (
	"context"
	"encoding/json"
	"errors"
	"fmt"
	"os"
	"path/filepath"
	"runtime"
	"strings"
	"sync/atomic"
	"testing"
	"time"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"

	"kneeprint/cmd/internal/files"
	"kneeprint/layout"
)

// Issue 14 item 6: after a page override, and for one file named twice in two
// spellings, every name is still unique; a run refuses two entries of one name.
func TestNamesUniqueAfterEveryOverride(t *testing.T) {
	dir := demoDir(t)
	p := demoPlan(dir)
	p.Aircraft = []string{"sedgefin-sf2.yaml", "./sedgefin-sf2.yaml", "quillwing-qt6.yaml"}
	p.Templates = []string{"a5", "half-letter", "5x8"}
	prep, err := Prepare(p, dir, "", "test", false)
	require.NoError(t, err)
	page, err := layout.PageByName("a5")
	require.NoError(t, err)
	prep.SetPage(page)
	seen := map[string]bool{}
	for _, e := range prep.Entries {
		k := strings.ToLower(e.Name)
		assert.False(t, seen[k], "clash: %s", e.Name)
		seen[k] = true
		assert.Equal(t, "a5", e.Job.Page.Name)
		assert.Equal(t, "a5", e.PageOverride)
	}
	assert.Len(t, seen, 18)

	// A batch whose entries share a name (a defect upstream) writes nothing.
	prep.Entries[1].Name = strings.ToUpper(prep.Entries[0].Name)
	s := prep.Run(context.Background(), Options{Workers: 1})
	require.Error(t, s.RunErr)
	assert.Contains(t, s.RunErr.Error(), "two card files of this batch are named")
	assert.True(t, s.Failed())
	entries, _ := os.ReadDir(filepath.Join(dir, "cards"))
	assert.Empty(t, entries)
}

// Issue 14 item 7: the folder's lock is held for the whole run; a second run waits,
// says so once, and gives up when cancelled; a stale lock file (no holder) does not
// stop a run.
func TestRunWaitsForTheFolderLock(t *testing.T) {
	dir := demoDir(t)
	out := filepath.Join(dir, "cards")
	require.NoError(t, os.MkdirAll(out, 0o755))
	// A lock file left by a killed batch: nobody holds it.
	require.NoError(t, os.WriteFile(filepath.Join(out, LockName), []byte("999999\n"), 0o644))
	s := run(t, dir, demoPlan(dir))
	require.False(t, s.Failed(), "%v", s.RunErr)
	_, err := os.Lstat(filepath.Join(out, LockName))
	assert.True(t, os.IsNotExist(err), "the lock file goes with the run")

	l, err := files.TryLock(filepath.Join(out, LockName))
	require.NoError(t, err)
	defer l.Unlock()
	prep, err := Prepare(demoPlan(dir), dir, "", "test", false)
	require.NoError(t, err)
	ctx, cancel := context.WithCancel(context.Background())
	var told []string
	go func() { time.Sleep(3 * lockPoll); cancel() }()
	s = prep.Run(ctx, Options{Workers: 1, Waiting: func(m string) { told = append(told, m) }})
	require.Error(t, s.RunErr)
	assert.Contains(t, s.RunErr.Error(), "interrupted while waiting for the batch writing into")
	require.Len(t, told, 1, "said once")
	assert.Contains(t, told[0], fmt.Sprintf("(process %d)", os.Getpid()))
	for _, r := range s.Results {
		assert.False(t, r.Written)
	}
}

// Issue 14 item 7: leftovers of a killed batch are removed; a user's own temporary
// files, and folders, are not.
func TestOnlyKneeprintTemporariesRemoved(t *testing.T) {
	dir := demoDir(t)
	out := filepath.Join(dir, "cards")
	require.NoError(t, os.MkdirAll(filepath.Join(out, ".x.pdf.kneeprint-7.tmp"), 0o755)) // a folder of that name
	ours := filepath.Join(out, ".kp-spm_x_a5.pdf.kneeprint-4242.tmp")
	require.NoError(t, os.WriteFile(ours, []byte("%PDF half"), 0o644))
	keep := []string{".notes.tmp", ".kp-wrm_x.pdf.12345.tmp", "kneeprint-1.tmp", ".a.kneeprint-12x.tmp"}
	for _, k := range keep {
		require.NoError(t, os.WriteFile(filepath.Join(out, k), []byte("mine"), 0o644))
	}
	run(t, dir, demoPlan(dir))
	_, err := os.Stat(ours)
	assert.True(t, os.IsNotExist(err))
	for _, k := range append(keep, ".x.pdf.kneeprint-7.tmp") {
		_, err := os.Stat(filepath.Join(out, k))
		assert.NoError(t, err, "%s is not kneeprint's", k)
	}
}

// Issue 14 item 8: a run that cannot start claims nothing.
func TestSummaryCountsOnlyFilesInPlace(t *testing.T) {
	dir := demoDir(t)
	file := filepath.Join(dir, "cards")
	require.NoError(t, os.WriteFile(file, []byte("x"), 0o644))
	s := run(t, dir, demoPlan(dir))
	assert.True(t, s.Failed())
	var b strings.Builder
	s.WriteSummary(&b)
	assert.Contains(t, b.String(), "\n0 card file(s), 0 card page(s) written to "+file)
	assert.Contains(t, b.String(), "not started: the output "+file+" is a file, not a folder")
}

// Issue 14 item 11: workers are capped at the jobs and WorkersPerCPU per CPU, and a
// batch parses its fonts once, on its first job, and shares them between workers.
func TestWorkersCappedAndFontsLazy(t *testing.T) {
	cpus := runtime.GOMAXPROCS(0)
	for _, tc := range []struct{ requested, jobs, want int }{
		{0, 100, cpus}, {100000, 4, 4}, {100000, 100000, WorkersPerCPU * cpus}, {3, 100, min(3, WorkersPerCPU*cpus)}, {-5, 10, min(cpus, 10)}, {8, 0, 0},
	} {
		assert.Equal(t, tc.want, Workers(tc.requested, tc.jobs), "%+v", tc)
	}
	dir := demoDir(t)
	prep, err := Prepare(demoPlan(dir), dir, "", "test", false)
	require.NoError(t, err)
	var parsed atomic.Int32
	prep.newFonts = func() (*layout.Fonts, error) { parsed.Add(1); return layout.NewFonts() }
	s := prep.Run(context.Background(), Options{Workers: 100000})
	require.False(t, s.Failed())
	assert.Equal(t, 4, s.Workers)
	assert.Equal(t, int32(1), parsed.Load(), "one Fonts for the whole batch")

	parsed.Store(0)
	ctx, cancel := context.WithCancel(context.Background())
	cancel()
	s = prep.Run(ctx, Options{Workers: 4})
	assert.True(t, s.Failed())
	assert.Zero(t, parsed.Load(), "no fonts parsed for jobs that never start")
}

// Issue 14 item 10: a batch keeps a few kilobytes per card file once it is written,
// not the job's model (it held ~75 kB of memoized figures per file, ~450 kB of peak
// memory per file with the batch's collector setting). The target for a whole
// season is in BenchmarkSeasonMemory.
func TestMemoryReleasedPerJob(t *testing.T) {
	es := seasonEntries(t, 12, 5, false)
	p := &Prepared{Dir: t.TempDir(), Entries: es}
	var before, after runtime.MemStats
	runtime.GC()
	runtime.GC()
	runtime.ReadMemStats(&before)
	s := p.Run(context.Background(), Options{Workers: 2})
	require.False(t, s.Failed())
	runtime.GC()
	runtime.GC()
	runtime.ReadMemStats(&after)
	perFile := (int64(after.HeapAlloc) - int64(before.HeapAlloc)) / int64(len(es))
	assert.Less(t, perFile, int64(16<<10), "bytes kept per card file")
	t.Logf("kept per card file: %d bytes", perFile)
	runtime.KeepAlive(s)
	runtime.KeepAlive(p)
}

// minimalCard is the smallest index line the writer writes.
func minimalCard(i int) IndexCard {
	return IndexCard{File: fmt.Sprintf("c%06d.pdf", i), Ends: []IndexEnd{}}
}

// writeRawIndex writes an index of n cards through the writer's own encoding.
func writeRawIndex(t *testing.T, dir string, n int, extra func(i int, c *IndexCard)) {
	t.Helper()
	var b strings.Builder
	b.WriteString(`{"format":2,"kind":"kneeprint-index"}` + "\n")
	for i := 0; i < n; i++ {
		c := minimalCard(i)
		if extra != nil {
			extra(i, &c)
		}
		line, err := json.Marshal(c)
		require.NoError(t, err)
		b.Write(line)
		b.WriteByte('\n')
	}
	require.NoError(t, os.WriteFile(filepath.Join(dir, IndexName), []byte(b.String()), 0o644))
}

// Issue 14 item 12: the writer and the reader share one limit. An index of exactly
// MaxIndexCards card files is read; one more is refused by the reader, and a batch
// that would make the index longer refuses to start (rather than leave an index no
// later run could read).
func TestIndexAtTheLimit(t *testing.T) {
	if testing.Short() {
		t.Skip("writes 50,000 index lines")
	}
	dir := t.TempDir()
	writeRawIndex(t, dir, MaxIndexCards, nil)
	idx, err := ReadIndex(dir)
	require.NoError(t, err)
	assert.Len(t, idx.Cards, MaxIndexCards)

	// A batch adding one card file to a full folder does not start.
	d := demoDir(t)
	prep, err := Prepare(demoPlan(d), d, dir, "test", false)
	require.NoError(t, err)
	prep.Entries = prep.Entries[:1]
	s := prep.Run(context.Background(), Options{Workers: 1})
	require.Error(t, s.RunErr)
	assert.Contains(t, s.RunErr.Error(), fmt.Sprintf("would list %d card files, more than the %d", MaxIndexCards+1, MaxIndexCards))
	assert.Empty(t, pdfNames(t, dir), "nothing written")

	writeRawIndex(t, dir, MaxIndexCards+1, nil)
	_, err = ReadIndex(dir)
	require.Error(t, err)
	assert.Contains(t, err.Error(), fmt.Sprintf("%s:%d: more than the %d card files an index lists", IndexName, MaxIndexCards+2, MaxIndexCards))
}

// One line may be MaxIndexLineBytes long, not a byte more; the writer refuses to
// write a line the reader would refuse.
func TestIndexLineLimit(t *testing.T) {
	dir := t.TempDir()
	pad := func(n int) func(int, *IndexCard) {
		return func(i int, c *IndexCard) {
			base, _ := json.Marshal(*c)
			c.Policy = strings.Repeat("p", n-len(base))
		}
	}
	writeRawIndex(t, dir, 2, pad(MaxIndexLineBytes))
	idx, err := ReadIndex(dir)
	require.NoError(t, err)
	require.Len(t, idx.Cards, 2)
	line, _ := json.Marshal(idx.Cards[0])
	require.Len(t, line, MaxIndexLineBytes, "the line is exactly at the limit")

	writeRawIndex(t, dir, 2, pad(MaxIndexLineBytes+1))
	_, err = ReadIndex(dir)
	require.Error(t, err)
	assert.Contains(t, err.Error(), IndexName+":2: a line longer than the 1048576 bytes an index line may have")
}

func TestIndexRefusesBadLines(t *testing.T) {
	dir := t.TempDir()
	for _, tc := range []struct{ name, data, want string }{
		{"no header", `{"file":"a.pdf"}` + "\n", ":1: not a kneeprint index"},
		{"other format", `{"format":3,"kind":"kneeprint-index"}` + "\n", ":1: index format 3, this kneeprint reads format 2"},
		{"unknown field", `{"format":2,"kind":"kneeprint-index"}` + "\n" + `{"file":"a.pdf","surprise":1}` + "\n", `:2: not a kneeprint index line: json: unknown field "surprise"`},
		{"path in file", `{"format":2,"kind":"kneeprint-index"}` + "\n" + `{"file":"../a.pdf"}` + "\n", `:2: "../a.pdf" is not a card file name`},
		{"listed twice", `{"format":2,"kind":"kneeprint-index"}` + "\n" + `{"file":"a.pdf"}` + "\n\n" + `{"file":"a.pdf"}` + "\n", ":4: a.pdf is listed twice (first at line 2)"},
		{"empty", "", ": empty, not a kneeprint index"},
	} {
		t.Run(tc.name, func(t *testing.T) {
			require.NoError(t, os.WriteFile(filepath.Join(dir, IndexName), []byte(tc.data), 0o644))
			_, err := ReadIndex(dir)
			require.Error(t, err)
			assert.Contains(t, err.Error(), IndexName+tc.want)
		})
	}
}

// A folder indexed by an earlier kneeprint: stale says what to do, a batch replaces
// the index and says so.
func TestOldIndexReplaced(t *testing.T) {
	dir := demoDir(t)
	out := filepath.Join(dir, "cards")
	require.NoError(t, os.MkdirAll(out, 0o755))
	require.NoError(t, os.WriteFile(filepath.Join(out, "kneeprint-index.json"), []byte("{\n  \"format\": 1,\n  \"cards\": []\n}\n"), 0o644))
	_, err := Stale(out, nil, "", "test", planDate)
	require.Error(t, err)
	assert.True(t, errors.Is(err, errOldIndex))
	assert.Contains(t, err.Error(), "run 'kneeprint cards' into this folder again")
	s := run(t, dir, demoPlan(dir))
	require.False(t, s.Failed())
	require.Len(t, s.Notes, 1)
	assert.Contains(t, s.Notes[0], "written by an earlier kneeprint")
	_, err = os.Stat(filepath.Join(out, "kneeprint-index.json"))
	assert.True(t, os.IsNotExist(err))
	rep, err := Stale(out, nil, "", "test", planDate)
	require.NoError(t, err)
	assert.Empty(t, rep.Stale)
}

// Cards made with a page override are compared as made: no "template changed".
func TestStaleAfterPageOverride(t *testing.T) {
	dir := demoDir(t)
	p := demoPlan(dir)
	p.Templates = []string{"half-letter", "5x8"}
	prep, err := Prepare(p, dir, "", "test", false)
	require.NoError(t, err)
	page, _ := layout.PageByName("a5")
	prep.SetPage(page)
	s := prep.Run(context.Background(), Options{Workers: 2})
	for _, r := range s.Results {
		require.NoError(t, r.Err)
	}
	require.False(t, s.Failed())
	out := filepath.Join(dir, "cards")
	idx, err := ReadIndex(out)
	require.NoError(t, err)
	require.Len(t, idx.Cards, 8)
	for _, c := range idx.Cards {
		assert.Equal(t, "a5", c.PageOverride)
		assert.Equal(t, "a5", c.Page)
	}
	for _, plan := range []bool{false, true} {
		var rep *StaleReport
		if plan {
			rep, err = Stale(out, p, dir, "test", planDate)
		} else {
			rep, err = Stale(out, nil, "", "test", planDate)
		}
		require.NoError(t, err)
		assert.Empty(t, rep.Stale, "with plan: %v", plan)
		assert.Equal(t, 48, rep.Checked, "8 card files, every end with a dry and a wet page")
	}
	// A real change of the template still counts.
	tmpl := filepath.Join(dir, "my.yaml")
	data, err := os.ReadFile("../../../templates/cards/a5.yaml")
	require.NoError(t, err)
	require.NoError(t, os.WriteFile(tmpl, data, 0o644))
	p.Templates = []string{"my.yaml"}
	run(t, dir, p)
	require.NoError(t, os.WriteFile(tmpl, []byte(strings.Replace(string(data), "tight_margin: 10 %", "tight_margin: 15 %", 1)), 0o644))
	rep, err := Stale(out, nil, "", "test", planDate)
	require.NoError(t, err)
	require.NotEmpty(t, rep.Stale)
	for _, st := range rep.Stale {
		assert.Contains(t, strings.Join(st.Reasons, ";"), "card template a5 changed")
	}
	// Its name and valid_days are not printed as such: no change.
	require.NoError(t, os.WriteFile(tmpl, []byte(strings.Replace(strings.Replace(string(data), "name: a5", "name: club a5", 1), "valid_days: 120", "valid_days: 90", 1)), 0o644))
	rep, err = Stale(out, nil, "", "test", planDate)
	require.NoError(t, err)
	assert.Empty(t, rep.Stale)
}

func pdfNames(t *testing.T, dir string) []string {
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
