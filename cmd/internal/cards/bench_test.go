package cards

import (
	"testing"
	"time"

	"kneeprint/layout"
)

func benchmarkRender(b *testing.B, compress bool) {
	fonts, _ := layout.NewFonts()
	var j *Job
	for _, jj := range demoJobs(b, "a5") {
		if jj.Airfield.Ident == "KP-WRM" && jj.Aircraft.Model == "physics" {
			j = jj
		}
	}
	j.Compress = compress
	b.ReportAllocs()
	b.ResetTimer()
	pages := 0
	for i := 0; i < b.N; i++ {
		jj := *j
		jj.model = nil
		rd, err := jj.Render(fonts)
		if err != nil {
			b.Fatal(err)
		}
		pages += rd.Pages
	}
	// Four runway ends, six pages: the grass ends have a dry and a wet card.
	b.ReportMetric(float64(pages)/b.Elapsed().Seconds(), "pages/s")
}

func BenchmarkRenderFourPagesCompressed(b *testing.B) { benchmarkRender(b, true) }
func BenchmarkRenderFourPagesPlain(b *testing.B)      { benchmarkRender(b, false) }

// Four runway ends, six pages: the grass ends have a dry and a wet page.
func BenchmarkCardDataFourEnds(b *testing.B) {
	var j *Job
	for _, jj := range demoJobs(b, "a5") {
		if jj.Airfield.Ident == "KP-WRM" && jj.Aircraft.Model == "physics" {
			j = jj
		}
	}
	b.ReportAllocs()
	for i := 0; i < b.N; i++ {
		jj := *j
		jj.model = nil // a fresh job: nothing memoized yet
		for _, e := range jj.Airfield.Ends() {
			for _, c := range jj.Conditions(e) {
				if _, _, err := jj.Card(e, c); err != nil {
					b.Fatal(err)
				}
			}
		}
	}
}

// BenchmarkComputeDemo computes every page of every demo card file, both sides (the
// four demo files: 20 takeoff pages and their landing sides), from fresh jobs, as a
// batch does before layout: grids, accelerate checks, obstacles and card data. It
// reports the share of the time spent in perf (compute-%), the part of a batch
// issue 15 wants under 10 %.
func BenchmarkComputeDemo(b *testing.B) {
	jobs := demoJobs(b, "a5")
	b.ReportAllocs()
	b.ResetTimer()
	var compute time.Duration
	for i := 0; i < b.N; i++ {
		for _, j := range jobs {
			jj := *j
			jj.model, jj.landingModel, jj.computeTime = nil, nil, 0
			for _, e := range jj.Airfield.Ends() {
				for _, c := range jj.Conditions(e) {
					if _, _, err := jj.Card(e, c); err != nil {
						b.Fatal(err)
					}
					if _, _, err := jj.LandingCard(e, c); err != nil {
						b.Fatal(err)
					}
				}
			}
			compute += jj.computeTime
		}
	}
	b.ReportMetric(100*float64(compute)/float64(b.Elapsed()), "compute-%")
}
