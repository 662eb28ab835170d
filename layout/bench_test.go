package layout

import (
	"bytes"
	"compress/zlib"
	"fmt"
	"testing"
)

// BenchmarkSimpleFont makes the simple font of one style for a new character set
// (what a document with characters not seen before in the process costs once):
// the subset of ASCII and a card's symbols, deflated at each zlib level, with its
// size. It backs fontDeflateLevel.
func BenchmarkSimpleFont(b *testing.B) {
	f, err := NewFonts()
	if err != nil {
		b.Fatal(err)
	}
	more := sortedRunes("°·×←≤ÆØøé")
	runes := append([]rune(nil), more...)
	for r := rune(0x20); r <= 0x7E; r++ {
		runes = append(runes, r)
	}
	b.Run("subset", func(b *testing.B) {
		b.ReportAllocs()
		for i := 0; i < b.N; i++ {
			if _, err := subsetTTF(f.faces[Regular].ttf, runes); err != nil {
				b.Fatal(err)
			}
		}
	})
	sub, err := subsetTTF(f.faces[Regular].ttf, runes)
	if err != nil {
		b.Fatal(err)
	}
	for _, level := range []int{zlib.BestSpeed, zlib.DefaultCompression, zlib.BestCompression} {
		b.Run(fmt.Sprintf("deflate=%d", level), func(b *testing.B) {
			b.ReportAllocs()
			var z []byte
			for i := 0; i < b.N; i++ {
				if z, err = deflate(sub, level); err != nil {
					b.Fatal(err)
				}
			}
			b.ReportMetric(float64(len(z)), "bytes")
			b.ReportMetric(float64(len(sub)), "subset-bytes")
		})
	}
}

// BenchmarkWidthMM measures a card-sized line of text from the glyph tables.
func BenchmarkWidthMM(b *testing.B) {
	f, err := NewFonts()
	if err != nil {
		b.Fatal(err)
	}
	s := "Figures for QNH 1013 hPa and above (pressure altitude 840 ft). Each hPa lower adds 27 ft."
	b.ReportAllocs()
	for i := 0; i < b.N; i++ {
		f.WidthMM(s, 7.5, Regular)
	}
}

// BenchmarkDeflatePages compresses the page streams of a rendered test document with
// each zlib level: the choice of pageDeflateLevel.
func BenchmarkDeflatePages(b *testing.B) {
	f, err := NewFonts()
	if err != nil {
		b.Fatal(err)
	}
	var cards []*Card
	for i := 0; i < 4; i++ {
		cards = append(cards, testCard(b, f, fmt.Sprintf("Field %d", i), manyWords()))
	}
	plain := render(b, cards, RenderOptions{Fonts: f})
	for _, level := range []int{zlib.BestSpeed, 4, 6, zlib.BestCompression} {
		b.Run(fmt.Sprintf("level=%d", level), func(b *testing.B) {
			b.ReportAllocs()
			var out bytes.Buffer
			for i := 0; i < b.N; i++ {
				out.Reset()
				if err := deflateStreams(&out, plain, level); err != nil {
					b.Fatal(err)
				}
			}
			b.ReportMetric(float64(out.Len()), "bytes")
		})
	}
}

// manyWords is a page's worth of short texts, like a card's grid.
func manyWords() string {
	var b bytes.Buffer
	for i := 0; i < 60; i++ {
		fmt.Fprintf(&b, "%d ", 400+i*37)
	}
	return b.String()
}
