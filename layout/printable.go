package layout

import "sync"

// printable holds the fonts Printable asks; it is made once, on first use, and then
// only read (under mu: measuring uses the fonts' scratch buffer).
var printable struct {
	once  sync.Once
	mu    sync.Mutex
	fonts *Fonts
}

// Printable reports whether a card can print r in both of its faces, as the card's
// own check (Fonts.Missing) decides: the input files are checked against the same
// set, so a text a card cannot print is refused where it is written, with its line.
func Printable(r rune) bool {
	printable.once.Do(func() {
		f, err := NewFonts()
		if err != nil {
			panic("kneeprint: embedded fonts unreadable: " + err.Error()) // a build defect
		}
		printable.fonts = f
	})
	printable.mu.Lock()
	defer printable.mu.Unlock()
	s := string(r)
	return len(printable.fonts.Missing(s, Regular)) == 0 && len(printable.fonts.Missing(s, Bold)) == 0
}
