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
	for i := 0; i < b.N; i++ {
		jj := *j
		jj.model = nil
		if _, err := jj.Render(fonts); err != nil {
			b.Fatal(err)
		}
	}
	b.ReportMetric(float64(b.N*4)/b.Elapsed().Seconds(), "pages/s")
}

func BenchmarkRenderFourPagesCompressed(b *testing.B) { benchmarkRender(b, true) }
func BenchmarkRenderFourPagesPlain(b *testing.B)      { benchmarkRender(b, false) }

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
			if _, _, err := jj.Card(e); err != nil {
				b.Fatal(err)
			}
		}
	}
}
