// Package batch renders a season plan: every aircraft at every airfield with every
// card template, concurrently, each file written atomically, with an index that later
// tells which printed cards are stale.
package batch

import (
	"context"
	"errors"
	"fmt"
	"io"
	"io/fs"
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

// WorkersPerCPU caps the workers of a batch: rendering is computation, so more
// workers than CPUs gain little (a little more while others wait on the disk), and
// each holds its fonts and a card file in memory.
const WorkersPerCPU = 4

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
	Job          *cards.Job
	Name         string // output file name, unique in the folder; in a bundle, the pair's name within it
	AircraftSrc  string // as written, resolved against the plan's folder
	AirfieldSrc  string
	TemplateSrc  string
	PageOverride string // the page given on the command line over the template's, or ""
	// Bundle is the file the entry's cards are printed in with others (cards
	// --bundle), or "" for a file of its own.
	Bundle     string
	bundleMode string // cards.BundleAirfield or cards.BundlePlan with a Bundle

	ac, af, tm int // the entry's aircraft, airfield and template in plan order
}

// File is the file the entry's cards are printed in: its bundle, or its own.
func (e *Entry) File() string {
	if e.Bundle != "" {
		return e.Bundle
	}
	return e.Name
}

// Prepared is a plan with its inputs loaded.
type Prepared struct {
	Dir         string // output folder
	Entries     []*Entry
	InputErrors []error // files that could not be read: their jobs are not in Entries

	planName string
	bundle   string     // cards.BundleAirfield, cards.BundlePlan or "" (SetBundle)
	bundles  [][]*Entry // the entries of each bundle in print order, bundles in run order

	// newFonts makes the batch's fonts (layout.NewFonts when nil); tests count calls.
	newFonts func() (*layout.Fonts, error)
}

// Prepare loads every input of plan (paths relative to planDir) and lays out the jobs.
// A file that cannot be read is reported in InputErrors and its jobs are left out;
// the others go on.
func Prepare(plan *spec.Plan, planDir, outDir, version string, compress bool) (*Prepared, error) {
	p := &Prepared{Dir: outDir, planName: plan.Name}
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
		src := templateSource(planDir, arg)
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
	for ti, tm := range tms {
		page, err := layout.PageByName(tm.t.Page)
		if err != nil {
			p.InputErrors = append(p.InputErrors, fmt.Errorf("template %s: %w", tm.src, err))
			continue
		}
		valid := plan.ValidUntil
		if valid.IsZero() {
			valid = plan.Date.AddDate(0, 0, tm.t.ValidDays)
		}
		for ai, ac := range acs {
			for fi, af := range afs {
				j := &cards.Job{Aircraft: ac.a, Airfield: af.f, Template: *tm.t, Page: page, Sheet: sheet,
					Date: plan.Date, ValidUntil: valid, Version: version, Compress: compress, Hashes: hashes}
				p.Entries = append(p.Entries, &Entry{Job: j, Name: j.FileName(), AircraftSrc: ac.src, AirfieldSrc: af.src, TemplateSrc: tm.src,
					ac: ai, af: fi, tm: ti})
			}
		}
	}
	uniqueNames(p.Entries)
	return p, nil
}

// templateSource resolves a plan's template entry: a preset name stays a name, a
// file is taken from the plan's folder.
func templateSource(planDir, arg string) string {
	if strings.ContainsAny(arg, `/\.`) {
		return inputs.In(planDir, arg)
	}
	return arg
}

// SetPage prints every card of the batch on page instead of its template's page
// (cards --page), and makes the file names unique again: two templates, or two
// profiles, that differed only by their page now share a name.
func (p *Prepared) SetPage(page layout.Page) {
	for _, e := range p.Entries {
		e.Job.Page = page
		e.Job.Template.Page = page.Name
		e.PageOverride = page.Name
		e.Name = e.Job.FileName()
	}
	uniqueNames(p.Entries)
	if p.bundle != "" {
		p.nameBundles() // the page is in a bundle's name
	}
}

// printedAs is a copy of the entries printed on page (see SetPage; nil: the
// templates' pages) in bundles of mode (see SetBundle; "": none); p is unchanged.
func (p *Prepared) printedAs(page *layout.Page, mode string) ([]*Entry, error) {
	c := &Prepared{planName: p.planName}
	for _, e := range p.Entries {
		j := *e.Job
		ce := *e
		ce.Job = &j
		c.Entries = append(c.Entries, &ce)
	}
	if page != nil {
		c.SetPage(*page)
	}
	if mode != "" {
		if err := c.SetBundle(mode); err != nil {
			return nil, err
		}
	}
	return c.Entries, nil
}

// uniqueNames makes output names unique without regard to case (file systems that
// ignore case would otherwise overwrite one card with another): every name shared by
// several jobs gets a short hash of the job's sources, and should two still meet
// (one file named twice in different spellings), a number in plan order.
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
	used := map[string]bool{}
	for _, e := range es {
		base, name := strings.TrimSuffix(e.Name, ".pdf"), e.Name
		for n := 2; used[strings.ToLower(name)]; n++ {
			name = fmt.Sprintf("%s-%d.pdf", base, n)
		}
		e.Name = name
		used[strings.ToLower(name)] = true
	}
}

// sameNames reports two entries that would write one path (without regard to case).
func sameNames(es []*Entry) error {
	seen := map[string]string{}
	for _, e := range es {
		k := strings.ToLower(e.Name)
		if prev, ok := seen[k]; ok {
			return fmt.Errorf("two card files of this batch are named %s and %s: nothing written", prev, e.Name)
		}
		seen[k] = e.Name
	}
	return nil
}

// JobResult is what happened to one job.
type JobResult struct {
	Entry   *Entry
	Written bool // the PDF is in place, whole
	Pages   int  // pages of the PDF the entry's cards are on
	// FilePages is the number of pages of the whole file: Pages, or in a bundle
	// the bundle's.
	FilePages int
	Ends      []cards.EndSummary
	SHA256    string
	Err       error
	Canceled  bool
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
	Workers  int // 0: GOMAXPROCS; capped (see Workers)
	Progress Progress
	// Waiting, when set, hears once that another batch holds the output folder and
	// this one waits for it.
	Waiting func(msg string)
}

// Summary is the outcome of a run.
type Summary struct {
	Dir         string
	Results     []JobResult // in plan order
	InputErrors []error
	RunErr      error // the run could not start (folder, lock, index): nothing written
	IndexErr    error
	Notes       []string // things the user should know that are not errors
	Workers     int      // workers started
	Elapsed     time.Duration
}

// Failed reports whether anything failed or was not done.
func (s *Summary) Failed() bool {
	if len(s.InputErrors) > 0 || s.IndexErr != nil || s.RunErr != nil {
		return true
	}
	for _, r := range s.Results {
		if !r.Written {
			return true
		}
	}
	return false
}

// Workers is the number of workers a run of jobs uses when asked for requested
// (0: one per CPU): never more than the jobs, nor WorkersPerCPU per CPU.
func Workers(requested, jobs int) int {
	cpus := runtime.GOMAXPROCS(0)
	w := requested
	if w <= 0 {
		w = cpus
	}
	return max(0, min(w, WorkersPerCPU*cpus, jobs))
}

// Run renders every entry with up to opts.Workers workers. It holds an exclusive lock
// on the output folder from start to end: a second batch into the same folder waits
// for it (reporting so through opts.Waiting), and gives up when ctx is cancelled. A
// job that fails is reported and the others go on. When ctx is cancelled no new job
// starts, and a job whose PDF is not yet in place leaves nothing behind.
func (p *Prepared) Run(ctx context.Context, opts Options) *Summary {
	start := time.Now()
	s := &Summary{Dir: p.Dir, InputErrors: p.InputErrors, Results: make([]JobResult, len(p.Entries))}
	defer func() { s.Elapsed = time.Since(start) }()
	for i, e := range p.Entries {
		s.Results[i].Entry = e
	}
	if s.RunErr = sameNames(p.Entries); s.RunErr != nil {
		return s
	}
	if s.RunErr = makeFolder(p.Dir); s.RunErr != nil {
		return s
	}
	lock, err := lockFolder(ctx, p.Dir, opts.Waiting)
	if err != nil {
		s.RunErr = err
		return s
	}
	defer lock.Unlock()
	idx, err := readIndexForUpdate(p.Dir)
	switch {
	case errors.Is(err, errOldIndex):
		s.Notes = append(s.Notes, fmt.Sprintf("%s was written by an earlier kneeprint: replaced by one listing only the cards of this run", filepath.Join(p.Dir, IndexName)))
		idx = &rawIndex{lines: map[string][][]byte{}}
	case err != nil:
		s.RunErr = fmt.Errorf("%w: nothing written", err)
		return s
	}
	if n := idx.countWith(p.Entries); n > MaxIndexCards {
		s.RunErr = fmt.Errorf("%s would list %d card files, more than the %d one folder's index holds: write into another folder", p.Dir, n, MaxIndexCards)
		return s
	}
	removeLeftovers(p.Dir)

	s.Workers = Workers(opts.Workers, len(p.Entries))
	if opts.Progress != nil {
		opts.Progress.Start(len(p.Entries))
	}
	newFonts := p.newFonts
	if newFonts == nil {
		newFonts = layout.NewFonts
	}
	if p.bundle != "" {
		p.runBundles(ctx, s.Workers, s, newFonts, opts.Progress)
		if opts.Progress != nil {
			opts.Progress.Finish()
		}
		s.IndexErr = idx.update(p.Dir, p.Entries, s.Results)
		return s
	}
	jobs := make(chan int)
	var mu sync.Mutex
	var wg sync.WaitGroup
	// One Fonts for every worker (it is safe for concurrent use and caches each
	// character set's subset once), made on the first job, not before: a batch whose
	// jobs never start parses nothing.
	var fontsOnce sync.Once
	var fonts *layout.Fonts
	var fontErr error
	for w := 0; w < s.Workers; w++ {
		wg.Add(1)
		go func() {
			defer wg.Done()
			for i := range jobs {
				r := JobResult{Entry: p.Entries[i]}
				switch {
				case ctx.Err() != nil:
					r.Canceled = true
				default:
					fontsOnce.Do(func() { fonts, fontErr = newFonts() })
					if fontErr != nil {
						r.Err = fontErr
					} else {
						r = p.runOne(ctx, p.Entries[i], fonts)
					}
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
		jobs <- i
	}
	close(jobs)
	wg.Wait()
	if opts.Progress != nil {
		opts.Progress.Finish()
	}
	s.IndexErr = idx.update(p.Dir, p.Entries, s.Results)
	return s
}

// makeFolder creates the output folder, refusing a path that is a file.
func makeFolder(dir string) error {
	if st, err := os.Stat(dir); err == nil && !st.IsDir() {
		return fmt.Errorf("the output %s is a file, not a folder: nothing written", dir)
	}
	if err := os.MkdirAll(dir, 0o755); err != nil {
		return fmt.Errorf("output folder: %w", err)
	}
	return nil
}

func (p *Prepared) runOne(ctx context.Context, e *Entry, fonts *layout.Fonts) JobResult {
	r := JobResult{Entry: e}
	// Once the PDF is made the job's model is not needed: memory stays flat however
	// many card files the batch makes (BenchmarkSeasonMemory).
	defer e.Job.Release()
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
	if rd.Data != nil {
		// The card data (cards --data) first: the PDF's arrival marks the pair complete.
		if err := cards.WriteAtomicCtx(ctx, cards.DataPath(filepath.Join(p.Dir, e.Name)), rd.Data); err != nil {
			if errors.Is(err, context.Canceled) {
				r.Canceled = true
			} else {
				r.Err = err
			}
			return r
		}
	}
	if err := cards.WriteAtomicCtx(ctx, filepath.Join(p.Dir, e.Name), data); err != nil {
		if errors.Is(err, context.Canceled) {
			r.Canceled = true
		} else {
			r.Err = err
		}
		return r
	}
	r.Written, r.Pages, r.FilePages, r.Ends, r.SHA256 = true, pages, pages, sums, sha256Hex(data)
	return r
}

// removeLeftovers deletes the temporary files a killed batch may have left: only
// regular files named as kneeprint names its temporaries (cards.IsTemp), never a
// user's own file. It runs under the folder's lock, so no other batch is writing
// them. A card appears only by rename, whole.
func removeLeftovers(dir string) {
	entries, err := os.ReadDir(dir)
	if err != nil {
		return
	}
	for _, e := range entries {
		if e.Type().IsRegular() && cards.IsTemp(e.Name()) {
			os.Remove(filepath.Join(dir, e.Name()))
		}
	}
}

// SoftMemoryLimit is the soft memory limit the cards command sets for a batch
// (runtime/debug.SetMemoryLimit): the collector, lazy for speed (400 %), works harder
// only as the heap nears it, so that a season of two-sided cards stays within the
// 300 MB target of BenchmarkSeasonMemory.
const SoftMemoryLimit = 224 << 20

// WriteSummary prints what a run did: files and pages written, the runway ends with
// no-go or beyond-limit cells, and every error. Only files in place are counted.
func (s *Summary) WriteSummary(w io.Writer) {
	files, pages, canceled, notMade := 0, 0, 0, 0
	var failed, flagged []string
	empty := s.Empty()
	written := map[string]bool{} // a bundle is one file of several entries
	for _, r := range s.Results {
		switch {
		case r.Written:
			if !written[r.Entry.File()] {
				written[r.Entry.File()] = true
				files++
				pages += r.FilePages
			}
			flagged = append(flagged, flaggedEnds(r)...)
		case r.Canceled:
			canceled++
		case r.Err != nil:
			failed = append(failed, fmt.Sprintf("%s: %v", r.Entry.label(), r.Err))
		default:
			notMade++
		}
	}
	fmt.Fprintf(w, "\n%d card file(s), %d card page(s) written to %s in %.1f s\n", files, pages, s.Dir, s.Elapsed.Seconds())
	if len(flagged) > 0 {
		sortListed(flagged)
		fmt.Fprintf(w, "card sides with no-go or beyond-limit cells, or without an LDA (%d):\n", len(flagged))
		for _, f := range flagged {
			fmt.Fprintf(w, "  %s\n", f)
		}
	}
	if len(empty) > 0 {
		fmt.Fprintf(w, "card pages with no figure at all (%d):\n", len(empty))
		for _, e := range empty {
			fmt.Fprintf(w, "  %s\n", e)
		}
	}
	if canceled > 0 {
		fmt.Fprintf(w, "interrupted: %d card file(s) not made (nothing half-written is left)\n", canceled)
	}
	if s.RunErr != nil {
		fmt.Fprintf(w, "not started: %v\n", s.RunErr)
	} else if notMade > 0 {
		fmt.Fprintf(w, "%d card file(s) not made\n", notMade)
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
	for _, n := range s.Notes {
		fmt.Fprintf(w, "note: %s\n", n)
	}
}

// pageID names a card page in the summary: its identity ("15 wet"), or its runway end.
func pageID(e cards.EndSummary) string {
	if e.Page != "" {
		return e.Page
	}
	return e.Designator
}

// label names an entry in messages: its file, or in a bundle the bundle, the
// aircraft and the airfield.
func (e *Entry) label() string {
	if e.Bundle == "" {
		return e.Name
	}
	return fmt.Sprintf("%s, %s at %s", e.Bundle, e.Job.Aircraft.Name, e.Job.Airfield.Ident)
}

// cardRef names a card page of a written entry in the summary: "FILE runway 15
// wet", or in a bundle "BUNDLE pages 13-14, AIRCRAFT at IDENT, runway 15 wet".
func cardRef(r JobResult, e cards.EndSummary) string {
	if r.Entry.Bundle == "" {
		return r.Entry.Name + " runway " + pageID(e)
	}
	return fmt.Sprintf("%s pages %s, %s at %s, runway %s", r.Entry.Bundle, pagesText(e.PDFPages), r.Entry.Job.Aircraft.Name, r.Entry.Job.Airfield.Ident, pageID(e))
}

// Empty lists the card pages written on which no cell has a figure (a pressure
// altitude above the table, every cell past a limit...), with the reason: such a
// card must never be printed quietly.
func (s *Summary) Empty() []string {
	var out []string
	for _, r := range s.Results {
		if !r.Written || r.Entry == nil {
			continue
		}
		for _, e := range r.Ends {
			if e.Empty {
				out = append(out, fmt.Sprintf("%s: %s", cardRef(r, e), e.EmptyWhy))
			}
			if e.LandingEmpty {
				out = append(out, fmt.Sprintf("%s, landing side: %s", cardRef(r, e), e.LandingEmptyWhy))
			}
		}
	}
	sortListed(out)
	return out
}

// sortListed sorts the summary's lines of card pages: by name, and a bundle's by
// its pages ("FILE pages 9-10, ..." before "FILE pages 11-12, ...").
func sortListed(lines []string) {
	key := func(l string) (string, int, string) {
		if file, rest, ok := strings.Cut(l, " pages "); ok {
			n := 0
			for _, r := range rest {
				if r < '0' || r > '9' {
					break
				}
				n = n*10 + int(r-'0')
			}
			return file, n, l
		}
		return l, 0, l
	}
	sort.SliceStable(lines, func(i, j int) bool {
		fi, pi, li := key(lines[i])
		fj, pj, lj := key(lines[j])
		if fi != fj {
			return fi < fj
		}
		if pi != pj {
			return pi < pj
		}
		return li < lj
	})
}

// flaggedEnds lists a written card file's pages with no-go or beyond-limit cells.
func flaggedEnds(r JobResult) []string {
	var out []string
	for _, e := range r.Ends {
		if e.Counts[perf.NoGo] > 0 || e.Counts[perf.BeyondLimits] > 0 {
			out = append(out, fmt.Sprintf("%s: %d no-go, %d beyond-limits cells", cardRef(r, e), e.Counts[perf.NoGo], e.Counts[perf.BeyondLimits]))
		}
		if e.LandingCounts[perf.NoGo] > 0 || e.LandingCounts[perf.BeyondLimits] > 0 {
			out = append(out, fmt.Sprintf("%s, landing side: %d no-go, %d beyond-limits cells", cardRef(r, e), e.LandingCounts[perf.NoGo], e.LandingCounts[perf.BeyondLimits]))
		}
		if e.NoLDA {
			out = append(out, fmt.Sprintf("%s, landing side: no LDA declared, no landing figure", cardRef(r, e)))
		}
	}
	return out
}

// isNotExist reports a missing file.
func isNotExist(err error) bool { return errors.Is(err, fs.ErrNotExist) }
