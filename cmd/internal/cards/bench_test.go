package cards

import (
	"testing"

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
