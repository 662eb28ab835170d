package batch

import (
	"bytes"
	"context"
	"fmt"
	"io/fs"
	"os"
	"path/filepath"
	"runtime"
	"runtime/debug"
	"runtime/metrics"
	"testing"
	"time"

	"kneeprint/airfields"
	"kneeprint/cmd/internal/cards"
	"kneeprint/cmd/internal/inputs"
	"kneeprint/cmd/internal/spec"
	"kneeprint/layout"
	"kneeprint/perf"
)

// seasonEntries scales the demo plan to nAircraft x nAirfields card files: aircraft
// are renamed copies of the two demo aircraft with their weights shifted, airfields
// renamed copies of the demo airfields, Wrenmoor, Wrenmoor, Saltpan in turn
// (Wrenmoor: four ends, each dry and wet, eight takeoff pages; Saltpan: two gravel
// ends, four takeoff pages; each takeoff page with its landing side behind it) with
// shifted distances and elevation, so every card is computed afresh. Three airfields
// give 16 + 16 + 8 = 40 pages per aircraft: 20 aircraft x 15 airfields give 300 files
// and 4,000 pages.
func seasonEntries(b testing.TB, nAircraft, nAirfields int, compress bool) []*Entry {
	b.Helper()
	ac, _ := inputs.Demo()
	var base []*perf.Aircraft
	for _, s := range ac {
		d, err := s.Load()
		if err != nil {
			b.Fatal(err)
		}
		base = append(base, d.Aircraft)
	}
	var fields []*perf.Airfield
	for _, name := range []string{"wrenmoor.yaml", "saltpan.yaml"} {
		fd, err := spec.Load(airfieldsFS(), name)
		if err != nil {
			b.Fatal(err)
		}
		fields = append(fields, fd.Airfield)
	}
	tmpl, err := inputs.Template("a5")
	if err != nil {
		b.Fatal(err)
	}
	page, _ := layout.PageByName(tmpl.Page)
	var acs []*perf.Aircraft
	for i := 0; i < nAircraft; i++ {
		a := *base[i%len(base)]
		a.Name = fmt.Sprintf("%s %02d", a.Name, i)
		a.WeightsKg = nil
		for _, w := range base[i%len(base)].WeightsKg {
			a.WeightsKg = append(a.WeightsKg, w-float64(i))
		}
		acs = append(acs, &a)
	}
	var afs []*perf.Airfield
	for i := 0; i < nAirfields; i++ {
		fd := fields[[3]int{0, 0, 1}[i%3]]
		f := *fd
		f.Ident = fmt.Sprintf("KP-%03d", i)
		f.ElevationM += float64(i/3) * 20
		f.Runways = nil
		for _, r := range fd.Runways {
			r2 := r
			r2.Ends = nil
			for _, e := range r.Ends {
				shift := float64(i/len(fields)) * 5
				e.TORAM += shift
				e.TODAM += shift
				e.ASDAM += shift
				r2.Ends = append(r2.Ends, e)
			}
			f.Runways = append(f.Runways, r2)
		}
		afs = append(afs, &f)
	}
	date := time.Date(2027, 3, 1, 0, 0, 0, 0, time.UTC)
	var es []*Entry
	hashes := &cards.HashCache{}
	for _, a := range acs {
		for _, f := range afs {
			j := &cards.Job{Aircraft: a, Airfield: f, Template: *tmpl, Page: page, Date: date,
				ValidUntil: date.AddDate(0, 6, 0), Version: "bench", Compress: compress, Hashes: hashes}
			es = append(es, &Entry{Job: j, Name: j.FileName(), AircraftSrc: a.Name, AirfieldSrc: f.Ident, TemplateSrc: "a5"})
		}
	}
	return es
}

// BenchmarkSeason renders the demo plan scaled to 20 aircraft x 15 airfields (300
// card files of 16 or 8 pages, 4,000 card pages: see seasonEntries) with every CPU,
// and reports card pages per second, bytes per page, the peak memory and the share
// of time spent computing (perf), laying out (card data and card models) and
// writing PDFs. Targets on the 2-core machine (issue 15): twice the pages per second
// of the single-sided cards before the PDF work, side by side; compressed pages of
// 14 KB or less; computation under 10 %.
func BenchmarkSeason(b *testing.B) {
	// As the cards command does for a batch (see cardsRun).
	defer debug.SetGCPercent(debug.SetGCPercent(400))
	defer debug.SetMemoryLimit(debug.SetMemoryLimit(SoftMemoryLimit))
	for _, compress := range []bool{false, true} {
		b.Run(fmt.Sprintf("compress=%v", compress), func(b *testing.B) {
			es := seasonEntries(b, 20, 15, compress)
			b.ReportAllocs()
			runtime.GC()
			peak := watchPeakMemory()
			b.ResetTimer()
			var pages int
			var size int64
			var compute, lay, pdf time.Duration
			for i := 0; i < b.N; i++ {
				p := &Prepared{Dir: b.TempDir(), Entries: es}
				s := p.Run(context.Background(), Options{Workers: runtime.GOMAXPROCS(0)})
				if s.Failed() {
					b.Fatalf("batch failed: %v %v", s.InputErrors, s.Results[0].Err)
				}
				for _, r := range s.Results {
					pages += r.Pages
					compute += r.Compute
					lay += r.Layout
					pdf += r.PDFTime
				}
				b.StopTimer()
				size += folderPDFBytes(b, p.Dir)
				b.StartTimer()
			}
			b.StopTimer()
			b.ReportMetric(float64(pages)/b.Elapsed().Seconds(), "pages/s")
			b.ReportMetric(float64(pages)/float64(b.N), "pages/op")
			b.ReportMetric(float64(size)/float64(pages), "bytes/page")
			b.ReportMetric(float64(peak())/(1<<20), "peak-MiB")
			total := compute + lay + pdf
			b.ReportMetric(100*float64(compute)/float64(total), "compute-%")
			b.ReportMetric(100*float64(lay)/float64(total), "layout-%")
			b.ReportMetric(100*float64(pdf)/float64(total), "pdf-%")
		})
	}
}

// BenchmarkSeasonBundle renders a quarter of the season (25 aircraft x 3 airfields:
// 75 pairs, 1,000 card pages, the most one bundle holds) compressed, as the command
// does, one PDF per pair (bundle=none), per airfield (3 PDFs of 400, 400 and 200
// pages) and for the whole plan (one PDF), and reports what bundling saves: pages
// per second, bytes per page, the peak memory and the PDF's share of the time.
func BenchmarkSeasonBundle(b *testing.B) {
	defer debug.SetGCPercent(debug.SetGCPercent(400))
	defer debug.SetMemoryLimit(debug.SetMemoryLimit(SoftMemoryLimit))
	for _, mode := range []string{"", cards.BundleAirfield, cards.BundlePlan} {
		name := mode
		if name == "" {
			name = "none"
		}
		b.Run("bundle="+name, func(b *testing.B) {
			es := seasonEntries(b, 25, 3, true)
			p := &Prepared{Entries: es, planName: "bench"}
			if err := p.SetBundle(mode); err != nil {
				b.Fatal(err)
			}
			b.ReportAllocs()
			runtime.GC()
			peak := watchPeakMemory()
			b.ResetTimer()
			var pages int
			var size int64
			var compute, lay, pdf time.Duration
			for i := 0; i < b.N; i++ {
				p.Dir = b.TempDir()
				s := p.Run(context.Background(), Options{Workers: runtime.GOMAXPROCS(0)})
				if s.Failed() {
					b.Fatalf("batch failed: %v %v", s.InputErrors, s.Results[0].Err)
				}
				files := map[string]bool{}
				for _, r := range s.Results {
					if !files[r.Entry.File()] {
						files[r.Entry.File()] = true
						pages += r.FilePages
					}
					compute += r.Compute
					lay += r.Layout
					pdf += r.PDFTime
				}
				b.StopTimer()
				size += folderPDFBytes(b, p.Dir)
				b.StartTimer()
			}
			b.StopTimer()
			b.ReportMetric(float64(pages)/b.Elapsed().Seconds(), "pages/s")
			b.ReportMetric(float64(size)/float64(pages), "bytes/page")
			b.ReportMetric(float64(peak())/(1<<20), "peak-MiB")
			total := compute + lay + pdf
			b.ReportMetric(100*float64(compute)/float64(total), "compute-%")
			b.ReportMetric(100*float64(pdf)/float64(total), "pdf-%")
		})
	}
}

// BenchmarkPDF measures what a PDF costs per document and per page: each iteration
// writes one document of 1 card page and one of 16 (real demo card models, made
// beforehand), and the two times give the fixed cost of a document (doc-us) and the
// cost of each further page (page-us) by a straight line through both. The
// sub-benchmarks time documents of 1, 4 and 16 pages alone.
func BenchmarkPDF(b *testing.B) {
	fonts, err := layout.NewFonts()
	if err != nil {
		b.Fatal(err)
	}
	cs := seasonCards(b, fonts, 16)
	opt := layout.RenderOptions{Compress: true, Date: time.Date(2027, 3, 1, 0, 0, 0, 0, time.UTC), Fonts: fonts, Title: "bench"}
	render := func(b *testing.B, n int) int {
		var buf bytes.Buffer
		if err := layout.RenderPDF(&buf, cs[:n], opt); err != nil {
			b.Fatal(err)
		}
		return buf.Len()
	}
	b.Run("fit", func(b *testing.B) {
		b.ReportAllocs()
		var one, sixteen time.Duration
		for i := 0; i < b.N; i++ {
			t0 := time.Now()
			render(b, 1)
			t1 := time.Now()
			render(b, 16)
			one, sixteen = one+t1.Sub(t0), sixteen+time.Since(t1)
		}
		page := (sixteen - one) / 15 / time.Duration(b.N)
		b.ReportMetric(float64(one/time.Duration(b.N)-page)/1e3, "doc-us")
		b.ReportMetric(float64(page)/1e3, "page-us")
	})
	for _, n := range []int{1, 4, 16} {
		b.Run(fmt.Sprintf("pages=%d", n), func(b *testing.B) {
			b.ReportAllocs()
			size := 0
			for i := 0; i < b.N; i++ {
				size = render(b, n)
			}
			b.ReportMetric(float64(b.Elapsed().Nanoseconds())/float64(b.N*n), "ns/page")
			b.ReportMetric(float64(size)/float64(n), "bytes/page")
		})
	}
}

// seasonCards lays out n card models of the scaled demo (every page of each airfield
// in turn: a runway end, dry and wet on grass and gravel).
func seasonCards(b *testing.B, fonts *layout.Fonts, n int) []*layout.Card {
	b.Helper()
	var cs []*layout.Card
	for _, e := range seasonEntries(b, 1, (n+3)/4, true) {
		for _, end := range e.Job.Airfield.Ends() {
			for _, cond := range e.Job.Conditions(end) {
				d, _, err := e.Job.Card(end, cond)
				if err != nil {
					b.Fatal(err)
				}
				c, err := layout.Build(d, e.Job.Page, fonts)
				if err != nil {
					b.Fatal(err)
				}
				cs = append(cs, c)
			}
		}
	}
	return cs[:n]
}

// watchPeakMemory samples the memory the Go runtime holds from the operating system
// (all mapped memory less what it has returned) every 5 ms until the returned
// function is called, which gives the highest value seen.
func watchPeakMemory() func() uint64 {
	samples := []metrics.Sample{{Name: "/memory/classes/total:bytes"}, {Name: "/memory/classes/heap/released:bytes"}}
	var peak uint64
	read := func() {
		metrics.Read(samples)
		if v := samples[0].Value.Uint64() - samples[1].Value.Uint64(); v > peak {
			peak = v
		}
	}
	done, stopped := make(chan struct{}), make(chan struct{})
	go func() {
		defer close(stopped)
		t := time.NewTicker(5 * time.Millisecond)
		defer t.Stop()
		for {
			read()
			select {
			case <-done:
				return
			case <-t.C:
			}
		}
	}()
	return func() uint64 {
		close(done)
		<-stopped
		return peak
	}
}

// folderPDFBytes is the size of the PDFs in dir.
func folderPDFBytes(b *testing.B, dir string) int64 {
	b.Helper()
	es, err := os.ReadDir(dir)
	if err != nil {
		b.Fatal(err)
	}
	var n int64
	for _, e := range es {
		if filepath.Ext(e.Name()) != ".pdf" {
			continue
		}
		info, err := e.Info()
		if err != nil {
			b.Fatal(err)
		}
		n += info.Size()
	}
	return n
}

func airfieldsFS() fs.FS { return airfields.FS }

// BenchmarkSeasonMemory renders a 3,000-file plan (60 aircraft x 50 airfields, the
// two demo airfields in turn: 30,000 pages with the landing sides) as the cards
// command does (compressed, every CPU, the collector at 400 % under the
// SoftMemoryLimit) and reports the peak memory: the heap's peak (live and not yet
// collected objects, sampled every 2 ms) and, on Linux, the process's peak resident
// set. Target: under 300 MB for the 3,000 files.
func BenchmarkSeasonMemory(b *testing.B) {
	defer debug.SetGCPercent(debug.SetGCPercent(400))
	defer debug.SetMemoryLimit(debug.SetMemoryLimit(SoftMemoryLimit))
	b.ReportAllocs()
	var heapPeak, rssPeak uint64
	for i := 0; i < b.N; i++ {
		b.StopTimer()
		es := seasonEntries(b, 60, 50, true)
		runtime.GC()
		resetPeakRSS()
		s := startPeakSampler()
		b.StartTimer()
		p := &Prepared{Dir: b.TempDir(), Entries: es}
		sum := p.Run(context.Background(), Options{Workers: runtime.GOMAXPROCS(0)})
		b.StopTimer()
		heapPeak = max(heapPeak, s.Stop())
		rssPeak = max(rssPeak, peakRSS())
		if sum.Failed() || len(sum.Results) != 3000 {
			b.Fatalf("batch failed: %d results", len(sum.Results))
		}
	}
	b.ReportMetric(float64(heapPeak)/(1<<20), "peak-heap-MB")
	if rssPeak > 0 {
		b.ReportMetric(float64(rssPeak)/(1<<20), "peak-rss-MB")
	}
}

// BenchmarkCardCheck runs the layout checks on 16 real card models (each page of
// four scaled demo airfields): what every card costs before it is drawn.
func BenchmarkCardCheck(b *testing.B) {
	fonts, err := layout.NewFonts()
	if err != nil {
		b.Fatal(err)
	}
	cs := seasonCards(b, fonts, 16)
	b.ReportAllocs()
	b.ResetTimer()
	for i := 0; i < b.N; i++ {
		for _, c := range cs {
			if probs := c.Check(); len(probs) > 0 {
				b.Fatal(probs)
			}
		}
	}
}
