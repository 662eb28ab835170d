package batch

import (
	"context"
	"errors"
	"fmt"
	"path/filepath"
	"sort"
	"strings"
	"sync"
	"time"

	"kneeprint/cmd/internal/cards"
	"kneeprint/cmd/internal/spec"
	"kneeprint/layout"
)

// SetBundle prints the plan's cards in bundles (cards --bundle) instead of one file
// per aircraft x airfield: mode cards.BundleAirfield gives one PDF per airfield with
// every aircraft, cards.BundlePlan one PDF with every card of the plan, airfield by
// airfield and aircraft by aircraft, both in plan order; "" one file per pair again.
// Cards of different templates print on different paper, so each template gets its
// own bundles; so do cards without a landing side when the others have one (a
// profile without landing data), which print single-sided while the others print
// double-sided ("_takeoff-only"). A bundle of more than cards.MaxBundlePages card
// pages is refused: its models and PDF are held in memory until it is written.
func (p *Prepared) SetBundle(mode string) error {
	switch mode {
	case "":
		p.bundle, p.bundles = "", nil
		for _, e := range p.Entries {
			e.Bundle, e.bundleMode = "", ""
		}
		return nil
	case cards.BundleAirfield, cards.BundlePlan:
	default:
		return fmt.Errorf("--bundle %q: give %s", mode, strings.Join(cards.BundleModes(), " or "))
	}
	p.bundle = mode
	p.nameBundles()
	for _, es := range p.bundles {
		n := 0
		for _, e := range es {
			n += cardPages(e.Job)
		}
		if n > cards.MaxBundlePages {
			return fmt.Errorf("--bundle %s: %s would hold %d card pages, more than the %d one bundle may (its cards and PDF are held in memory until it is written): bundle by airfield, or split the plan",
				mode, es[0].Bundle, n, cards.MaxBundlePages)
		}
	}
	return nil
}

// cardPages is how many card pages job j prints: a page per runway end and
// condition, each with its landing side when the cards have one.
func cardPages(j *cards.Job) int {
	n := 0
	for _, e := range j.Airfield.Ends() {
		n += len(j.Conditions(e))
	}
	if j.HasLandingSide() {
		n *= 2
	}
	return n
}

// takeoffOnly reports whether job j's cards have no landing side while its template
// prints one behind each takeoff side: the profile has no landing data.
func takeoffOnly(j *cards.Job) bool {
	return !j.HasLandingSide() && (j.Template.Landing == "" || j.Template.Landing == spec.LandingBack)
}

// nameBundles groups the entries into bundles and names them (see SetBundle):
// "IDENT_all-aircraft_PAGE.pdf" by airfield, "PLAN-NAME_PAGE.pdf" for the plan, with
// "_SHEET-2up" on 2-up sheets and "_takeoff-only" for cards without a landing side
// among cards with one. Names two bundles would share get a short hash of what
// tells them apart.
func (p *Prepared) nameBundles() {
	type group struct {
		key, name string
		es        []*Entry
	}
	byKey := map[string]*group{}
	var groups []*group
	for _, e := range p.Entries {
		scope, name := "", cards.Slug(p.planName)
		if p.bundle == cards.BundleAirfield {
			scope, name = e.AirfieldSrc, cards.Slug(e.Job.Airfield.Ident)+"_all-aircraft"
		}
		name += "_" + cards.Slug(e.Job.Page.Name)
		if e.Job.Sheet != nil {
			name += "_" + cards.Slug(e.Job.Sheet.Name) + "-2up"
		}
		sided := "two"
		if !e.Job.HasLandingSide() {
			sided = "one"
		}
		if takeoffOnly(e.Job) {
			name += "_takeoff-only"
		}
		key := strings.Join([]string{scope, e.TemplateSrc, e.PageOverride, sided}, "\x00")
		g := byKey[key]
		if g == nil {
			g = &group{key: key, name: name + ".pdf"}
			byKey[key] = g
			groups = append(groups, g)
		}
		g.es = append(g.es, e)
	}
	// Names without regard to case, as uniqueNames does for card files.
	shared := map[string]int{}
	for _, g := range groups {
		shared[strings.ToLower(g.name)]++
	}
	used := map[string]bool{}
	p.bundles = p.bundles[:0]
	for _, g := range groups {
		if shared[strings.ToLower(g.name)] > 1 {
			g.name = strings.TrimSuffix(g.name, ".pdf") + "_" + cards.Slug(cards.CombineFingerprint(g.key, "", "", ""))[:8] + ".pdf"
		}
		base, name := strings.TrimSuffix(g.name, ".pdf"), g.name
		for n := 2; used[strings.ToLower(name)]; n++ {
			name = fmt.Sprintf("%s-%d.pdf", base, n)
		}
		used[strings.ToLower(name)] = true
		// Print order: airfield by airfield, aircraft by aircraft, as the plan lists them.
		sort.SliceStable(g.es, func(i, j int) bool {
			if g.es[i].af != g.es[j].af {
				return g.es[i].af < g.es[j].af
			}
			return g.es[i].ac < g.es[j].ac
		})
		for _, e := range g.es {
			e.Bundle, e.bundleMode = name, p.bundle
		}
		p.bundles = append(p.bundles, g.es)
	}
}

// bundleTitle is the title of the PDF of a bundle of es.
func (p *Prepared) bundleTitle(es []*Entry) string {
	t := p.planName
	if p.bundle == cards.BundleAirfield {
		t = "all aircraft at " + es[0].Job.Airfield.Name
	}
	if takeoffOnly(es[0].Job) {
		t += " (takeoff only)"
	}
	return t
}

// runBundles renders the bundles with up to workers workers: the jobs of a bundle
// are laid out in parallel, bundle after bundle, and the worker that lays out a
// bundle's last job draws its PDF and writes it, while the others go on with the
// next bundle's jobs. A bundle is written whole or not at all: when one of its jobs
// fails or the run is cancelled, none of its cards is written.
func (p *Prepared) runBundles(ctx context.Context, workers int, s *Summary, newFonts func() (*layout.Fonts, error), progress Progress) {
	type bundle struct {
		es   []*Entry
		idx  []int // each entry's index in p.Entries
		laid []*cards.Laid
		left int
	}
	at := map[*Entry]int{}
	for i, e := range p.Entries {
		at[e] = i
	}
	var bs []*bundle
	type job struct{ b, k int } // bundle, position in it
	var order []job
	for bi, es := range p.bundles {
		b := &bundle{es: es, laid: make([]*cards.Laid, len(es)), left: len(es)}
		for k, e := range es {
			b.idx = append(b.idx, at[e])
			order = append(order, job{bi, k})
		}
		bs = append(bs, b)
	}
	var mu sync.Mutex
	var fontsOnce sync.Once
	var fonts *layout.Fonts
	var fontErr error
	jobs := make(chan job)
	var wg sync.WaitGroup
	for w := 0; w < workers; w++ {
		wg.Add(1)
		go func() {
			defer wg.Done()
			for jb := range jobs {
				b := bs[jb.b]
				e := b.es[jb.k]
				r := JobResult{Entry: e}
				var laid *cards.Laid
				switch {
				case ctx.Err() != nil:
					r.Canceled = true
				default:
					fontsOnce.Do(func() { fonts, fontErr = newFonts() })
					if fontErr != nil {
						r.Err = fontErr
						break
					}
					l, err := e.Job.Lay(fonts)
					e.Job.Release() // the cards are laid out: the job's model is not needed
					if err != nil {
						r.Err = err
						break
					}
					l.Part = e.Name
					laid, r.Compute, r.Layout = l, l.Compute, l.Layout
				}
				mu.Lock()
				s.Results[b.idx[jb.k]] = r
				b.laid[jb.k] = laid
				b.left--
				last := b.left == 0
				mu.Unlock()
				if last {
					p.finishBundle(ctx, b.es, b.idx, b.laid, s, fonts, &mu, progress)
					b.laid = nil // the bundle is written: its card models go
				}
			}
		}()
	}
	for _, jb := range order {
		jobs <- jb
	}
	close(jobs)
	wg.Wait()
}

// finishBundle draws and writes the bundle of es (their results at idx in s, their
// cards laid) once every one of them is laid out, and reports each to progress.
func (p *Prepared) finishBundle(ctx context.Context, es []*Entry, idx []int, laid []*cards.Laid, s *Summary, fonts *layout.Fonts, mu *sync.Mutex, progress Progress) {
	results := make([]JobResult, len(es))
	mu.Lock()
	for k := range es {
		results[k] = s.Results[idx[k]]
	}
	mu.Unlock()
	var failed *JobResult
	canceled := false
	for k := range results {
		switch {
		case results[k].Err != nil && failed == nil:
			failed = &results[k]
		case results[k].Canceled:
			canceled = true
		}
	}
	var err error
	var rd *cards.BundleRendered
	switch {
	case failed != nil:
		err = fmt.Errorf("not written: %s in the same bundle failed", failed.Entry.Name)
	case canceled || ctx.Err() != nil:
		err = context.Canceled
	default:
		rd, err = cards.RenderBundle(laid, p.bundle, p.bundleTitle(es), fonts)
		if err == nil {
			err = p.writeBundle(ctx, es[0].Bundle, rd)
		}
	}
	sum := ""
	if err == nil {
		sum = sha256Hex(rd.PDF)
	}
	for k := range es {
		r := &results[k]
		switch {
		case r.Err != nil || r.Canceled:
			// its own failure, reported as it is
		case errors.Is(err, context.Canceled):
			r.Canceled = true
		case err != nil:
			r.Err = err
		default:
			r.Written, r.Ends, r.SHA256, r.FilePages = true, rd.Ends[k], sum, rd.Pages
			r.Pages = partPages(rd.Ends[k])
			// The bundle's PDF time, shared by its parts (BenchmarkSeason's split).
			r.PDFTime = rd.PDFTime / time.Duration(len(es))
		}
	}
	mu.Lock()
	for k := range es {
		s.Results[idx[k]] = results[k]
		if progress != nil {
			progress.Done(results[k])
		}
	}
	mu.Unlock()
}

// writeBundle writes a bundle's card data (when asked for) and then its PDF, each
// atomically: the PDF's arrival marks the pair complete.
func (p *Prepared) writeBundle(ctx context.Context, name string, rd *cards.BundleRendered) error {
	path := filepath.Join(p.Dir, name)
	if rd.Data != nil {
		if err := cards.WriteAtomicCtx(ctx, cards.DataPath(path), rd.Data); err != nil {
			return err
		}
	}
	return cards.WriteAtomicCtx(ctx, path, rd.PDF)
}

// partPages is how many pages of its bundle a part's cards are on.
func partPages(ends []cards.EndSummary) int {
	seen := map[int]bool{}
	for _, e := range ends {
		for _, pg := range e.PDFPages {
			seen[pg] = true
		}
	}
	return len(seen)
}

// pagesText prints a list of pages: "13-14", "7", "3, 5".
func pagesText(pages []int) string {
	if len(pages) == 2 && pages[1] == pages[0]+1 {
		return fmt.Sprintf("%d-%d", pages[0], pages[1])
	}
	var ss []string
	for _, pg := range pages {
		ss = append(ss, fmt.Sprint(pg))
	}
	return strings.Join(ss, ", ")
}
