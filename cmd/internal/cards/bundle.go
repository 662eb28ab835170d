package cards

import (
	"bytes"
	"errors"
	"fmt"
	"time"

	"kneeprint/layout"
)

// Bundle modes (cards --bundle): the cards of several aircraft x airfield pairs in
// one PDF, for printing runs. The default is one PDF per pair.
const (
	BundleAirfield = "airfield" // one PDF per airfield: every aircraft, in plan order
	BundlePlan     = "plan"     // one PDF per plan: airfield by airfield, aircraft by aircraft
)

// BundleModes lists the bundle modes.
func BundleModes() []string { return []string{BundleAirfield, BundlePlan} }

// MaxBundlePages bounds one bundle: its card models are held in memory until all
// are laid out, then its PDF is drawn (they go page by page) and held until it is
// written: about 0.12 MB a page at the peak (BenchmarkSeasonBundle: 1,000 pages in
// one bundle peak near 120 MiB, about twice what one PDF per pair needs). A
// printing run larger than this is split by airfield.
const MaxBundlePages = 1000

// BundleRendered is a bundle's PDF and what went into it.
type BundleRendered struct {
	PDF   []byte
	Data  []byte // the card data as JSON (CardBundle), when the jobs have Job.Data set
	Pages int    // pages of the PDF
	// Ends is each part's EndSummary list with PDFPages set.
	Ends    [][]EndSummary
	PDFTime time.Duration
}

// CardBundle is the card data of a bundle (cards --bundle --data): the card data of
// each aircraft x airfield pair it holds, in print order, each with the PDF pages
// of its cards. The fields are documented in the README.
type CardBundle struct {
	Format    int        `json:"format"`
	Version   string     `json:"kneeprint_version"`
	Bundle    string     `json:"bundle"`
	Caution   string     `json:"caution"`
	CardFiles []CardFile `json:"card_files"`
}

// RenderBundle writes the laid-out cards of several jobs into one PDF, in the order
// given (taking their cards: each part's Cards is nil after), as one job's Render does: takeoff sides each followed by its landing side
// when the cards have one (then every job must have it: a duplex run never holds a
// one-sided card), two cards a sheet when the jobs have a Sheet. Every job must print
// on the same page and sheet. Each part's ends get the PDF pages their cards are on.
func RenderBundle(parts []*Laid, mode, title string, fonts *layout.Fonts) (*BundleRendered, error) {
	if len(parts) == 0 {
		return nil, errors.New("an empty bundle")
	}
	j0 := parts[0].Job
	duplex := j0.HasLandingSide()
	var cs []*layout.Card
	for _, p := range parts {
		j := p.Job
		switch {
		case j.HasLandingSide() != duplex:
			return nil, fmt.Errorf("bundle %q: %s at %s has %s landing side, %s at %s %s: one- and two-sided cards print apart",
				title, j.Aircraft.Name, j.Airfield.Ident, sidedWord(j.HasLandingSide()), j0.Aircraft.Name, j0.Airfield.Ident, sidedVerb(duplex))
		case j.Page != j0.Page || (j.Sheet == nil) != (j0.Sheet == nil) || (j.Sheet != nil && *j.Sheet != *j0.Sheet):
			return nil, fmt.Errorf("bundle %q: %s at %s prints on another page or sheet than %s at %s", title, j.Aircraft.Name, j.Airfield.Ident, j0.Aircraft.Name, j0.Airfield.Ident)
		}
		cs = append(cs, p.Cards...)
	}
	cardsOf := make([]int, len(parts))
	for i, p := range parts {
		cardsOf[i] = len(p.Cards)
		p.Cards = nil // the bundle's now: freed page by page as they are drawn (DropDrawn)
	}
	if len(cs) > MaxBundlePages {
		return nil, fmt.Errorf("bundle %q: %d card pages, more than the %d one bundle holds", title, len(cs), MaxBundlePages)
	}
	out := &BundleRendered{}
	// PDF page (1-based) of each card, in the order of cs.
	page := make([]int, len(cs))
	out.Pages = len(cs)
	if j0.Sheet != nil {
		sheets := layout.Impose(len(cs), duplex)
		for si, sh := range sheets {
			for _, ci := range sh {
				if ci >= 0 {
					page[ci] = si + 1
				}
			}
		}
		out.Pages = len(sheets)
	} else {
		for i := range page {
			page[i] = i + 1
		}
	}
	off := 0
	for pi, p := range parts {
		ends := append([]EndSummary(nil), p.Ends...)
		for i := range ends {
			k := off + p.first[i]
			ends[i].PDFPages = []int{page[k]}
			if duplex {
				ends[i].PDFPages = append(ends[i].PDFPages, page[k+1])
			}
		}
		out.Ends = append(out.Ends, ends)
		off += cardsOf[pi]
	}
	if j0.Data {
		b := CardBundle{Format: DataFormat, Version: j0.Version, Bundle: mode, Caution: Caution, CardFiles: []CardFile{}}
		for pi, p := range parts {
			f, err := p.cardFile()
			if err != nil {
				return nil, err
			}
			f.Part = p.Part
			for i := range f.Pages {
				f.Pages[i].PDFPages = out.Ends[pi][i].PDFPages
			}
			b.CardFiles = append(b.CardFiles, f)
		}
		var err error
		if out.Data, err = encodeData(b); err != nil {
			return nil, err
		}
	}
	t0 := time.Now()
	var buf bytes.Buffer
	opt := layout.RenderOptions{Sheet: j0.Sheet, Compress: j0.Compress, Date: j0.Date, Duplex: duplex,
		Title: "kneeprint cards: " + title, Author: "kneeprint " + j0.Version, Fonts: fonts, DropDrawn: true}
	if err := layout.RenderPDF(&buf, cs, opt); err != nil {
		return nil, err
	}
	out.PDFTime = time.Since(t0)
	out.PDF = buf.Bytes()
	return out, nil
}

func sidedWord(two bool) string {
	if two {
		return "a"
	}
	return "no"
}

func sidedVerb(two bool) string {
	if two {
		return "has"
	}
	return "has none"
}
