package cards

import (
	"bytes"
	"flag"
	"fmt"
	"io/fs"
	"os"
	"path/filepath"
	"sort"
	"strings"
	"testing"
	"time"

	"github.com/pdfcpu/pdfcpu/pkg/api"
	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"

	"kneeprint/cmd/internal/inputs"
	"kneeprint/cmd/internal/spec"
	"kneeprint/layout"
	"kneeprint/perf"
	"kneeprint/templates"
)

var update = flag.Bool("update", false, "rewrite sample-output/ from the demo")

// SampleDate is the date the committed sample cards carry.
var sampleDate = time.Date(2026, 12, 1, 0, 0, 0, 0, time.UTC)

func init() { api.DisableConfigDir() }

func template(t testing.TB, name string) spec.CardTemplate {
	t.Helper()
	doc, err := spec.Load(templates.FS, templates.CardsDir+"/"+name+".yaml")
	require.NoError(t, err)
	return *doc.Template
}

// demoJobs is every demo aircraft at every demo airfield with template name.
func demoJobs(t testing.TB, name string) []*Job {
	t.Helper()
	tm := template(t, name)
	page, err := layout.PageByName(tm.Page)
	require.NoError(t, err)
	ac, af := inputs.Demo()
	var jobs []*Job
	for _, as := range ac {
		ad, err := as.Load()
		require.NoError(t, err)
		for _, fs := range af {
			fd, err := fs.Load()
			require.NoError(t, err)
			jobs = append(jobs, &Job{Aircraft: ad.Aircraft, Airfield: fd.Airfield, Template: tm, Page: page,
				Date: sampleDate, ValidUntil: sampleDate.AddDate(0, 0, tm.ValidDays), Version: "test", Compress: true})
		}
	}
	return jobs
}

func TestDemoCardsPassLayoutChecks(t *testing.T) {
	fonts, err := layout.NewFonts()
	require.NoError(t, err)
	for _, name := range []string{"a5", "half-letter", "5x8"} {
		for _, j := range demoJobs(t, name) {
			for _, e := range j.Airfield.Ends() {
				for _, cond := range j.Conditions(e) {
					t.Run(fmt.Sprintf("%s/%s/%s/%s", name, j.Aircraft.Name, j.Airfield.Ident, j.PageID(e, cond)), func(t *testing.T) {
						d, _, err := j.Card(e, cond)
						require.NoError(t, err)
						c, err := layout.Build(d, j.Page, fonts)
						require.NoError(t, err)
						assert.Empty(t, c.Check())
						var all []string
						for _, b := range c.Blocks {
							for _, tx := range b.Texts {
								all = append(all, tx.S)
							}
						}
						text := strings.Join(all, " ")
						assert.Contains(t, text, "not a substitute for the approved flight manual", "the caution is on every card")
						assert.Contains(t, text, "RWY "+e.Designator)
						assert.Contains(t, text, j.Airfield.Name)
						for _, s := range []string{"GO", "TIGHT", "NO-GO", "NO TAKEOFF", "LIMIT", "NO DATA"} {
							assert.Contains(t, all, s, "legend names state %s in words", s)
						}
					})
				}
			}
		}
	}
}

// A card with a no-go cell shows it as a black cell with a white figure.
func TestNoGoCellMarked(t *testing.T) {
	fonts, _ := layout.NewFonts()
	for _, j := range demoJobs(t, "a5") {
		if j.Airfield.Ident != "KP-SPM" {
			continue
		}
		e := j.Airfield.Ends()[0]
		d, g, err := j.Card(e, e.Condition)
		require.NoError(t, err)
		c, err := layout.Build(d, j.Page, fonts)
		require.NoError(t, err)
		// The hot-and-high demo has no-go cells at MTOW with a 10 kt tailwind.
		cell := g.Cells[0][0][len(g.Spec.TempsK)-1]
		require.Equal(t, perf.NoGo, cell.State, cell.Reasons())
		want := fmt.Sprintf("%.0f", cell.ShownRequired)
		var grid layout.Block
		for _, b := range c.Blocks {
			if b.Name == "grid" {
				grid = b
			}
		}
		found := false
		for _, tx := range grid.Texts {
			if tx.S != want || tx.Color != layout.White || tx.Style != layout.Bold {
				continue
			}
			for _, s := range grid.Shapes {
				if s.Kind == layout.FillRect && s.Color == layout.Black && tx.Box.Inside(s.Box) {
					found = true
				}
			}
		}
		assert.True(t, found, "no-go figure %s drawn white on black", want)
		return
	}
	t.Fatal("demo airfield KP-SPM not found")
}

func TestPDFValidAndPageCount(t *testing.T) {
	fonts, _ := layout.NewFonts()
	for _, j := range demoJobs(t, "a5") {
		for _, sheet := range []string{"", "a4"} {
			jj := *j
			if sheet != "" {
				s, _ := layout.SheetByName(sheet)
				jj.Sheet = &s
			}
			rd, err := jj.Render(fonts)
			require.NoError(t, err)
			data, pages := rd.PDF, rd.Pages
			require.NoError(t, api.Validate(bytes.NewReader(data), nil), "pdfcpu validates %s", jj.FileName())
			n, err := api.PageCount(bytes.NewReader(data), nil)
			require.NoError(t, err)
			ends := 0
			for _, e := range jj.Airfield.Ends() {
				ends += len(jj.Conditions(e))
			}
			// A card with a landing side is two pages, front and back; on 2-up sheets
			// each sheet has a front page and a back page.
			sides := 1
			if jj.HasLandingSide() {
				sides = 2
			}
			want := ends * sides
			if sheet != "" {
				want = sides * ((ends + 1) / 2)
			}
			assert.Equal(t, want, n, jj.FileName())
			assert.Equal(t, want, pages)
		}
	}
}

func TestDeterministic(t *testing.T) {
	fonts, _ := layout.NewFonts()
	j := demoJobs(t, "a5")[0]
	a, err := j.Render(fonts)
	require.NoError(t, err)
	fonts2, _ := layout.NewFonts()
	b, err := j.Render(fonts2)
	require.NoError(t, err)
	assert.True(t, bytes.Equal(a.PDF, b.PDF), "same inputs and date give the same bytes")
	j.Date = j.Date.AddDate(0, 0, 1)
	c, err := j.Render(fonts)
	require.NoError(t, err)
	assert.False(t, bytes.Equal(a.PDF, c.PDF), "the date is printed")
}

func TestFingerprintFollowsInputs(t *testing.T) {
	j := demoJobs(t, "a5")[0]
	e := j.Airfield.Ends()[0]
	fp := j.Fingerprint(e)
	assert.Len(t, fp, 12)
	e2 := e
	e2.TORAM -= 10
	assert.NotEqual(t, fp, j.Fingerprint(e2), "a TORA change changes the fingerprint")
	other := j.Airfield.Ends()[1]
	assert.NotEqual(t, fp, j.Fingerprint(other))
	j2 := *j
	j2.Date = j.Date.AddDate(1, 0, 0)
	assert.Equal(t, fp, j2.Fingerprint(e), "the print date is not an input")
}

// A runway end's figures use the pressure altitude at the highest of the aerodrome
// elevation and the runway's thresholds (perf.TakeoffElevationM): raising the other
// end's threshold changes this end's card, so it must change its fingerprint too.
func TestFingerprintFollowsTheOtherThreshold(t *testing.T) {
	j := demoJobs(t, "a5")[0]
	f := *j.Airfield
	f.Runways = append([]perf.Runway(nil), f.Runways...)
	r := f.Runways[0]
	r.Ends = append([]perf.RunwayEnd(nil), r.Ends...)
	f.Runways[0] = r
	before := EndHash(&f, r.Ends[0])
	r.Ends[1].ElevationM = f.ElevationM + 30 // 30 m above the aerodrome elevation
	assert.NotEqual(t, before, EndHash(&f, r.Ends[0]), "the other threshold sets this end's pressure altitude")
}

func TestSlug(t *testing.T) {
	for in, want := range map[string]string{
		"KP-WRM": "kp-wrm", "../../etc/passwd": "etc-passwd", "Sedgefin SF-2 demo trainer": "sedgefin-sf-2-demo-trainer",
		"": "unnamed", "\x00\x01": "unnamed", "Ærø Field": "r-field", strings.Repeat("a", 100): strings.Repeat("a", 40),
	} {
		assert.Equal(t, want, Slug(in), in)
	}
}

// sample-output/ holds the demo cards; regenerating them must give the same bytes.
// go test ./cmd/internal/cards -run TestSampleOutput -update rewrites them.
func TestSampleOutput(t *testing.T) {
	dir := filepath.Join("..", "..", "..", "sample-output")
	fonts, _ := layout.NewFonts()
	want := map[string]bool{}
	for _, j := range demoJobs(t, "a5") {
		j.Version = SampleVersion
		rd, err := j.Render(fonts)
		require.NoError(t, err)
		data := rd.PDF
		name := j.FileName()
		want[name] = true
		path := filepath.Join(dir, name)
		if *update {
			require.NoError(t, WriteAtomic(path, data))
			continue
		}
		got, err := os.ReadFile(path)
		require.NoError(t, err, "missing golden file: run go test ./cmd/internal/cards -run TestSampleOutput -update")
		assert.True(t, bytes.Equal(got, data), "%s differs from a fresh render: regenerate with -update and review", name)
	}
	entries, err := fs.Glob(os.DirFS(dir), "*.pdf")
	require.NoError(t, err)
	sort.Strings(entries)
	for _, e := range entries {
		assert.True(t, want[e], "sample-output/%s is not produced by the demo any more", e)
	}
}

// Characters outside the base subset are embedded on demand; characters no embedded
// font has are refused with the text that holds them, never printed as blanks.
func TestNamesInOtherScripts(t *testing.T) {
	fonts, _ := layout.NewFonts()
	j := demoJobs(t, "a5")[0]
	f := *j.Airfield
	f.Name = "Πεδίο Δοκιμής"
	j.Airfield = &f
	rd, err := j.Render(fonts)
	require.NoError(t, err, "Greek is in the Go fonts")
	require.NoError(t, api.Validate(bytes.NewReader(rd.PDF), nil))
	f.Name = "試験飛行場"
	_, err = j.Render(fonts)
	require.Error(t, err)
	assert.Contains(t, err.Error(), "cannot print")
}
