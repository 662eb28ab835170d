// Package batch renders a season plan: every aircraft at every airfield with every
// card template, concurrently, each file written atomically, with an index that later
// tells which printed cards are stale.
package batch

import (
	"context"
	"errors"
	"fmt"
	"io"
	"os"
	"path/filepath"
	"runtime"
	"sort"
	"strings"
	"sync"
	"time"

	"kneeprint/cmd/internal/cards"
	"kneeprint/cmd/internal/inputs"
	"kneeprint/cmd/internal/spec"
	"kneeprint/layout"
	"kneeprint/perf"
)

// MaxJobs bounds one plan: a club's season is a few hundred files; more is a mistake.
const MaxJobs = 20000

// LoadPlan reads a plan file.
func LoadPlan(path string) (*spec.Plan, error) {
	doc, err := spec.LoadFile(path)
	if err != nil {
		return nil, err
	}
	if doc.Kind != spec.KindPlan {
		return nil, spec.ErrorList{{File: path, Field: "kind", Msg: fmt.Sprintf("this is an %s file, a plan file is needed here", doc.Kind)}}
	}
	return doc.Plan, nil
}

// Entry is one job of a plan with the sources it came from.
type Entry struct {
	Job         *cards.Job
	Name        string // output file name, unique in the folder
	AircraftSrc string // as written, resolved against the plan's folder
	AirfieldSrc string
	TemplateSrc string
}

// Prepared is a plan with its inputs loaded.
type Prepared struct {
	Dir         string // output folder
	Entries     []*Entry
	InputErrors []error // files that could not be read: their jobs are not in Entries
}

// Prepare loads every input of plan (paths relative to planDir) and lays out the jobs.
// A file that cannot be read is reported in InputErrors and its jobs are left out;
// the others go on.
func Prepare(plan *spec.Plan, planDir, outDir, version string, compress bool) (*Prepared, error) {
	p := &Prepared{Dir: outDir}
	if p.Dir == "" {
		p.Dir = inputs.In(planDir, plan.Output)
	}
	type acIn struct {
		src string
		a   *perf.Aircraft
	}
	type afIn struct {
		src string
		f   *perf.Airfield
	}
	type tmIn struct {
		src string
		t   *spec.CardTemplate
	}
	var acs []acIn
	var afs []afIn
	var tms []tmIn
	for _, arg := range plan.Aircraft {
		src := inputs.In(planDir, arg)
		a, _, err := inputs.Aircraft(src)
		if err != nil {
			p.InputErrors = append(p.InputErrors, fmt.Errorf("aircraft %s: %w", src, err))
			continue
		}
		acs = append(acs, acIn{src, a})
	}
	for _, arg := range plan.Airfields {
		src := inputs.In(planDir, arg)
		f, _, err := inputs.Airfield(src)
		if err != nil {
			p.InputErrors = append(p.InputErrors, fmt.Errorf("airfield %s: %w", src, err))
			continue
		}
		afs = append(afs, afIn{src, f})
	}
	for _, arg := range plan.Templates {
		src := arg
		if strings.ContainsAny(arg, `/\.`) {
			src = inputs.In(planDir, arg)
		}
		t, err := inputs.Template(src)
		if err != nil {
			p.InputErrors = append(p.InputErrors, fmt.Errorf("template %s: %w", src, err))
			continue
		}
		if plan.Unit != "" {
			t.Unit = plan.Unit
		}
		if plan.Policy != "" {
			t.Policy = plan.Policy
		}
		tms = append(tms, tmIn{src, t})
	}
	if n := len(acs) * len(afs) * len(tms); n > MaxJobs {
		return nil, fmt.Errorf("the plan makes %d card files, more than the %d one batch may make", n, MaxJobs)
	}
	var sheet *layout.Sheet
	if plan.Sheet != "" {
		s, err := layout.SheetByName(plan.Sheet)
		if err != nil {
			return nil, err
		}
		sheet = &s
	}
	hashes := &cards.HashCache{}
	for _, tm := range tms {
		page, err := layout.PageByName(tm.t.Page)
		if err != nil {
			p.InputErrors = append(p.InputErrors, fmt.Errorf("template %s: %w", tm.src, err))
			continue
		}
		valid := plan.ValidUntil
		if valid.IsZero() {
			valid = plan.Date.AddDate(0, 0, tm.t.ValidDays)
		}
		for _, ac := range acs {
			for _, af := range afs {
				j := &cards.Job{Aircraft: ac.a, Airfield: af.f, Template: *tm.t, Page: page, Sheet: sheet,
					Date: plan.Date, ValidUntil: valid, Version: version, Compress: compress, Hashes: hashes}
				p.Entries = append(p.Entries, &Entry{Job: j, Name: j.FileName(), AircraftSrc: ac.src, AirfieldSrc: af.src, TemplateSrc: tm.src})
			}
		}
	}
	uniqueNames(p.Entries)
	return p, nil
}

// uniqueNames makes output names unique without regard to case (file systems that
// ignore case would otherwise overwrite one card with another): every name shared by
// several jobs gets a short hash of the job's sources.
func uniqueNames(es []*Entry) {
	groups := map[string][]*Entry{}
	for _, e := range es {
		k := strings.ToLower(e.Name)
		groups[k] = append(groups[k], e)
	}
	for _, g := range groups {
		if len(g) < 2 {
			continue
		}
		for _, e := range g {
			tag := cards.Slug(cards.CombineFingerprint(e.AircraftSrc, e.AirfieldSrc, e.TemplateSrc, ""))[:8]
			e.Name = strings.TrimSuffix(e.Name, ".pdf") + "_" + tag + ".pdf"
		}
	}
}

// JobResult is what happened to one job.
type JobResult struct {
	Entry    *Entry
	Pages    int
	Ends     []cards.EndSummary
	SHA256   string
	Err      error
	Canceled bool
	// Time spent per stage (see cards.Rendered).
	Compute, Layout, PDFTime time.Duration
}

// Progress hears about a batch as it runs.
type Progress interface {
	Start(total int)
	Done(r JobResult)
	Finish()
}

// Options controls a run.
type Options struct {
	Workers  int // 0: GOMAXPROCS
	Progress Progress
}

// Summary is the outcome of a run.
type Summary struct {
	Dir         string
	Results     []JobResult // in plan order
	InputErrors []error
	IndexErr    error
	Elapsed     time.Duration
}

// Failed reports whether anything failed or was not done.
func (s *Summary) Failed() bool {
	if len(s.InputErrors) > 0 || s.IndexErr != nil {
		return true
	}
	for _, r := range s.Results {
		if r.Err != nil || r.Canceled {
			return true
		}
	}
	return false
}

// Run renders every entry with up to opts.Workers workers. A job that fails is
// reported and the others go on. When ctx is cancelled no new job starts, and a job
// whose PDF is not yet in place leaves nothing behind.
func (p *Prepared) Run(ctx context.Context, opts Options) *Summary {
	start := time.Now()
	s := &Summary{Dir: p.Dir, InputErrors: p.InputErrors, Results: make([]JobResult, len(p.Entries))}
	if err := os.MkdirAll(p.Dir, 0o755); err != nil {
		s.InputErrors = append(s.InputErrors, err)
		return s
	}
	removeLeftovers(p.Dir)
	workers := opts.Workers
	if workers <= 0 {
		workers = runtime.GOMAXPROCS(0)
	}
	if opts.Progress != nil {
		opts.Progress.Start(len(p.Entries))
	}
	idx := make(chan int)
	var mu sync.Mutex
	var wg sync.WaitGroup
	fonts, err := layout.NewFonts() // shared: each character set's fonts are made once
	for w := 0; w < workers; w++ {
		wg.Add(1)
		go func() {
			defer wg.Done()
			for i := range idx {
				r := JobResult{Entry: p.Entries[i]}
				switch {
				case err != nil:
					r.Err = err
				case ctx.Err() != nil:
					r.Canceled = true
				default:
					r = p.runOne(ctx, p.Entries[i], fonts)
				}
				mu.Lock()
				s.Results[i] = r
				if opts.Progress != nil {
					opts.Progress.Done(r)
				}
				mu.Unlock()
			}
		}()
	}
	for i := range p.Entries {
		idx <- i
	}
	close(idx)
	wg.Wait()
	if opts.Progress != nil {
		opts.Progress.Finish()
	}
	s.IndexErr = UpdateIndex(p.Dir, p.Entries, s.Results)
	s.Elapsed = time.Since(start)
	return s
}

func (p *Prepared) runOne(ctx context.Context, e *Entry, fonts *layout.Fonts) JobResult {
	r := JobResult{Entry: e}
	rd, err := e.Job.Render(fonts)
	if err != nil {
		r.Err = err
		return r
	}
	r.Compute, r.Layout, r.PDFTime = rd.Compute, rd.Layout, rd.PDFTime
	data, sums, pages := rd.PDF, rd.Ends, rd.Pages
	if ctx.Err() != nil {
		r.Canceled = true
		return r
	}
	if err := cards.WriteAtomicCtx(ctx, filepath.Join(p.Dir, e.Name), data); err != nil {
		if errors.Is(err, context.Canceled) {
			r.Canceled = true
		} else {
			r.Err = err
		}
		return r
	}
	r.Pages, r.Ends, r.SHA256 = pages, sums, sha256Hex(data)
	return r
}

// removeLeftovers deletes temporary files a killed batch may have left (they never
// carry a card's name: a card appears only by rename, whole).
func removeLeftovers(dir string) {
	matches, _ := filepath.Glob(filepath.Join(dir, ".*.tmp"))
	for _, m := range matches {
		os.Remove(m)
	}
}

// WriteSummary prints what a run did: files and pages written, the runway ends with
// no-go or beyond-limit cells, and every error.
func (s *Summary) WriteSummary(w io.Writer) {
	files, pages, canceled := 0, 0, 0
	var failed []string
	var flagged []string
	for _, r := range s.Results {
		switch {
		case r.Canceled:
			canceled++
		case r.Err != nil:
			failed = append(failed, fmt.Sprintf("%s: %v", r.Entry.Name, r.Err))
		default:
			files++
			pages += r.Pages
			for _, e := range r.Ends {
				if e.Counts[perf.NoGo] > 0 || e.Counts[perf.BeyondLimits] > 0 {
					flagged = append(flagged, fmt.Sprintf("%s runway %s: %d no-go, %d beyond-limits cells", r.Entry.Name, e.Designator, e.Counts[perf.NoGo], e.Counts[perf.BeyondLimits]))
				}
			}
		}
	}
	fmt.Fprintf(w, "\n%d card file(s), %d card page(s) written to %s in %.1f s\n", files, pages, s.Dir, s.Elapsed.Seconds())
	if len(flagged) > 0 {
		sort.Strings(flagged)
		fmt.Fprintf(w, "runway ends with no-go or beyond-limit cells (%d):\n", len(flagged))
		for _, f := range flagged {
			fmt.Fprintf(w, "  %s\n", f)
		}
	}
	if canceled > 0 {
		fmt.Fprintf(w, "interrupted: %d card file(s) not made (nothing half-written is left)\n", canceled)
	}
	if n := len(failed) + len(s.InputErrors); n > 0 {
		fmt.Fprintf(w, "errors (%d):\n", n)
		for _, e := range s.InputErrors {
			fmt.Fprintf(w, "  %s\n", strings.ReplaceAll(e.Error(), "\n", "\n    "))
		}
		for _, f := range failed {
			fmt.Fprintf(w, "  %s\n", f)
		}
	}
	if s.IndexErr != nil {
		fmt.Fprintf(w, "index not written: %v\n", s.IndexErr)
	}
}
