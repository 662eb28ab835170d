package batch

import (
	"bufio"
	"bytes"
	"crypto/sha256"
	"encoding/hex"
	"encoding/json"
	"errors"
	"fmt"
	"os"
	"path/filepath"
	"sort"
	"strings"

	"kneeprint/cmd/internal/cards"
	"kneeprint/cmd/internal/files"
	"kneeprint/cmd/internal/inputs"
	"kneeprint/cmd/internal/spec"
	"kneeprint/layout"
	"kneeprint/perf"
)

// IndexName is the index a batch writes next to its cards: JSON Lines, a header line
// then one line per card file, so that it is read a line at a time however many
// cards a folder holds.
const IndexName = "kneeprint-index.jsonl"

// oldIndexName is the single-document index of kneeprint before index format 2.
const oldIndexName = "kneeprint-index.json"

// indexFormat is the version of the index layout.
const indexFormat = 2

// The index's limits, the same for the writer and the reader: a batch refuses to
// start when its folder's index would list more card files, and the writer refuses a
// line the reader would not read. A line (one card file) is a few kilobytes.
const (
	MaxIndexCards     = 50_000 // two and a half of the largest plans into one folder
	MaxIndexLineBytes = 1 << 20
)

// errOldIndex marks a folder indexed by an earlier kneeprint.
var errOldIndex = errors.New("index of an earlier kneeprint")

// Index lists every card file of a folder and what it was made from.
type Index struct {
	Format int         `json:"format"`
	Cards  []IndexCard `json:"cards"`
}

// indexHeader is the index's first line.
type indexHeader struct {
	Format int    `json:"format"`
	Kind   string `json:"kind"`
}

const indexKind = "kneeprint-index"

// IndexCard is one card file, or one aircraft x airfield pair of a bundle (cards
// --bundle): a bundle has a line per pair, each naming the bundle's file, the
// bundle mode and the pair (Part).
type IndexCard struct {
	File         string     `json:"file"`
	Bundle       string     `json:"bundle,omitempty"` // "airfield" or "plan": File is a bundle
	Part         string     `json:"part,omitempty"`   // in a bundle: the name the pair's file has on its own
	SHA256       string     `json:"sha256"`
	Pages        int        `json:"pages"` // of the file
	Aircraft     Component  `json:"aircraft"`
	Airfield     Component  `json:"airfield"`
	Template     Component  `json:"template"`
	Policy       string     `json:"policy"`
	Unit         string     `json:"unit"`
	Page         string     `json:"page"`
	PageOverride string     `json:"page_override,omitempty"` // cards --page: the page over the template's
	Sheet        string     `json:"sheet,omitempty"`
	Version      string     `json:"kneeprint_version"`
	Date         string     `json:"date"`
	ValidUntil   string     `json:"valid_until"`
	Ends         []IndexEnd `json:"runway_ends"`
}

// Component is one input of a card: where it was read and the hash of the canonical
// form of what of it counts for the card (see aircraftKey, cards.EndHash,
// templateKey): comments, formatting, units written and unprinted fields do not.
type Component struct {
	Source string `json:"source"` // relative to the index's folder, demo:NAME, or a preset name
	Name   string `json:"name"`
	Hash   string `json:"hash"`
}

// IndexEnd is one page of a card file: a runway end's card. Page identifies it
// within the file.
type IndexEnd struct {
	Page        string         `json:"page"` // the page's identity: "15 wet" when the end has a page per condition
	Designator  string         `json:"designator"`
	Fingerprint string         `json:"fingerprint"`
	EndHash     string         `json:"end_hash"`
	End         perf.RunwayEnd `json:"end"`
	States      map[string]int `json:"states"`
	// LandingStates counts the cells of the card's landing side by state; absent
	// when the card has none.
	LandingStates map[string]int `json:"landing_states,omitempty"`
	// PDFPages are, in a bundle, the pages of its file the card is printed on
	// (takeoff side, then landing side); absent outside a bundle.
	PDFPages []int `json:"pdf_pages,omitempty"`
}

// aircraftKey hashes what of a profile counts for its cards: all of it but its type
// and notes, which no card prints and no figure uses.
func aircraftKey(a *perf.Aircraft) string {
	c := *a
	c.Type, c.Notes = "", ""
	return cards.AircraftHash(&c)
}

// templateKey hashes what of a card template counts for its cards: all of it but its
// name (not printed) and valid_days (the validity printed is checked on its own: a
// card past it is listed by stale, and with a plan so is a changed valid-until).
func templateKey(t spec.CardTemplate, p layout.Page) string {
	t.Name, t.ValidDays = "", 0
	return cards.TemplateHash(t, p)
}

func sha256Hex(data []byte) string {
	sum := sha256.Sum256(data)
	return hex.EncodeToString(sum[:])
}

// readIndex reads dir's index a line at a time, checking the header and every line,
// and hands each card to fn with its raw line. An index of an earlier kneeprint gives
// errOldIndex; no index at all, an error matching fs.ErrNotExist.
func readIndex(dir string, fn func(c *IndexCard, raw []byte)) error {
	path := filepath.Join(dir, IndexName)
	f, err := files.OpenRegular(path)
	if err != nil {
		if isNotExist(err) {
			if _, oldErr := os.Lstat(filepath.Join(dir, oldIndexName)); oldErr == nil {
				return fmt.Errorf("%s: %w (%s): run 'kneeprint cards' into this folder again to index its cards", dir, errOldIndex, oldIndexName)
			}
		}
		return err
	}
	defer f.Close()
	sc := bufio.NewScanner(f)
	sc.Buffer(make([]byte, 0, 64<<10), MaxIndexLineBytes+1)
	line := 0
	seen := map[string]int{} // by file and part: a bundle's file has a line per pair
	for sc.Scan() {
		line++
		raw := sc.Bytes()
		if line == 1 {
			var h indexHeader
			if err := json.Unmarshal(raw, &h); err != nil || h.Kind != indexKind {
				return fmt.Errorf("%s:1: not a kneeprint index", path)
			}
			if h.Format != indexFormat {
				return fmt.Errorf("%s:1: index format %d, this kneeprint reads format %d", path, h.Format, indexFormat)
			}
			continue
		}
		if len(bytes.TrimSpace(raw)) == 0 {
			continue
		}
		if len(seen) == MaxIndexCards {
			return fmt.Errorf("%s:%d: more than the %d card files an index lists", path, line, MaxIndexCards)
		}
		var c IndexCard
		dec := json.NewDecoder(bytes.NewReader(raw))
		dec.DisallowUnknownFields()
		if err := dec.Decode(&c); err != nil {
			return fmt.Errorf("%s:%d: not a kneeprint index line: %w", path, line, err)
		}
		if c.File == "" || c.File != filepath.Base(c.File) || strings.HasPrefix(c.File, ".") {
			return fmt.Errorf("%s:%d: %q is not a card file name", path, line, c.File)
		}
		if (c.Bundle == "") != (c.Part == "") {
			return fmt.Errorf("%s:%d: %s: a bundle's line names its bundle mode and its part, a card file's neither", path, line, c.File)
		}
		k := c.File + "\x00" + c.Part
		if prev, dup := seen[k]; dup {
			what := c.File
			if c.Part != "" {
				what += " (" + c.Part + ")"
			}
			return fmt.Errorf("%s:%d: %s is listed twice (first at line %d)", path, line, what, prev)
		}
		seen[k] = line
		fn(&c, raw)
	}
	if err := sc.Err(); err != nil {
		if errors.Is(err, bufio.ErrTooLong) {
			return fmt.Errorf("%s:%d: a line longer than the %d bytes an index line may have", path, line+1, MaxIndexLineBytes)
		}
		return fmt.Errorf("%s: %w", path, err)
	}
	if line == 0 {
		return fmt.Errorf("%s: empty, not a kneeprint index", path)
	}
	return nil
}

// ReadIndex reads dir's index.
func ReadIndex(dir string) (*Index, error) {
	idx := &Index{Format: indexFormat}
	err := readIndex(dir, func(c *IndexCard, _ []byte) { idx.Cards = append(idx.Cards, *c) })
	if err != nil {
		return nil, err
	}
	return idx, nil
}

// rawIndex is an index as read for an update: each card file's lines as written
// (one, or a bundle's one per pair).
type rawIndex struct {
	lines map[string][][]byte
}

// readIndexForUpdate reads dir's index, keeping its lines; none gives an empty one.
func readIndexForUpdate(dir string) (*rawIndex, error) {
	idx := &rawIndex{lines: map[string][][]byte{}}
	err := readIndex(dir, func(c *IndexCard, raw []byte) { idx.lines[c.File] = append(idx.lines[c.File], bytes.Clone(raw)) })
	if isNotExist(err) {
		return idx, nil
	}
	return idx, err
}

// countWith is how many lines the index has once entries are written: those of
// the files they do not write, and one per entry.
func (x *rawIndex) countWith(entries []*Entry) int {
	writes := map[string]bool{}
	for _, e := range entries {
		writes[e.File()] = true
	}
	n := len(entries)
	for f, ls := range x.lines {
		if !writes[f] {
			n += len(ls)
		}
	}
	return n
}

// relSource records a source so that the index still finds it when read from dir.
func relSource(dir, src string) string {
	if strings.HasPrefix(src, inputs.DemoPrefix) || !strings.ContainsAny(src, `/\.`) {
		return src // demo file or preset name
	}
	abs, err := filepath.Abs(src)
	if err != nil {
		return src
	}
	absDir, err := filepath.Abs(dir)
	if err != nil {
		return abs
	}
	if rel, err := filepath.Rel(absDir, abs); err == nil {
		return filepath.ToSlash(rel)
	}
	return abs
}

// sourceFrom turns a recorded source back into a path usable from the working folder.
func sourceFrom(dir, src string) string {
	if strings.HasPrefix(src, inputs.DemoPrefix) || !strings.ContainsAny(src, `/\.`) || filepath.IsAbs(src) {
		return src
	}
	return filepath.Join(dir, filepath.FromSlash(src))
}

// indexHashes keeps what the index lines of one run share: the hash of each
// aircraft and runway end (twenty aircraft at one airfield hash its ends once, not
// twenty times) and each source as recorded. An index update is serial, after the
// cards are made.
type indexHashes struct {
	aircraft map[*perf.Aircraft]string
	ends     map[endRef]string
	sources  map[string]string
}

// endRef is a runway end of a loaded airfield: designators are unique in a file.
type endRef struct {
	f *perf.Airfield
	d string
}

func newIndexHashes() *indexHashes {
	return &indexHashes{aircraft: map[*perf.Aircraft]string{}, ends: map[endRef]string{}, sources: map[string]string{}}
}

func (h *indexHashes) aircraftKey(a *perf.Aircraft) string {
	k, ok := h.aircraft[a]
	if !ok {
		k = aircraftKey(a)
		h.aircraft[a] = k
	}
	return k
}

func (h *indexHashes) endHash(f *perf.Airfield, e perf.RunwayEnd) string {
	r := endRef{f, e.Designator}
	k, ok := h.ends[r]
	if !ok {
		k = cards.EndHash(f, e)
		h.ends[r] = k
	}
	return k
}

func (h *indexHashes) relSource(dir, src string) string {
	k, ok := h.sources[src]
	if !ok {
		k = relSource(dir, src)
		h.sources[src] = k
	}
	return k
}

func entryCard(dir string, e *Entry, r JobResult, h *indexHashes) IndexCard {
	j := e.Job
	c := IndexCard{
		File: e.File(), SHA256: r.SHA256, Pages: r.FilePages,
		Aircraft: Component{h.relSource(dir, e.AircraftSrc), j.Aircraft.Name, h.aircraftKey(j.Aircraft)},
		Airfield: Component{h.relSource(dir, e.AirfieldSrc), j.Airfield.Ident, ""},
		Template: Component{h.relSource(dir, e.TemplateSrc), j.Template.Name, templateKey(j.Template, j.Page)},
		Policy:   j.Template.Policy, Unit: j.Template.Unit, Page: j.Page.Name, PageOverride: e.PageOverride,
		Version: j.Version, Date: j.Date.Format("2006-01-02"), ValidUntil: j.ValidUntil.Format("2006-01-02"),
	}
	if j.Sheet != nil {
		c.Sheet = j.Sheet.Name
	}
	if e.Bundle != "" {
		c.Part = e.Name
		c.Bundle = e.bundleMode
	}
	for _, s := range r.Ends {
		st := map[string]int{}
		for k, v := range s.Counts {
			st[k.String()] = v
		}
		ie := IndexEnd{Page: pageID(s), Designator: s.Designator, Fingerprint: s.Fingerprint,
			EndHash: h.endHash(j.Airfield, s.End), End: s.End, States: st, PDFPages: s.PDFPages}
		if s.Landing {
			ie.LandingStates = map[string]int{}
			for k, v := range s.LandingCounts {
				ie.LandingStates[k.String()] = v
			}
		}
		c.Ends = append(c.Ends, ie)
	}
	return c
}

// update merges a run's results into the index and writes it atomically: the lines
// of every file written replace its old ones (a bundle's, all of them), lines whose
// file is gone are dropped. A folder with no index and no card written gets none.
func (x *rawIndex) update(dir string, entries []*Entry, results []JobResult) error {
	written := false
	var tooLong []string
	fresh := map[string][][]byte{}
	h := newIndexHashes()
	for i, r := range results {
		if !r.Written {
			continue
		}
		f := entries[i].File()
		line, err := json.Marshal(entryCard(dir, entries[i], r, h))
		if err != nil {
			return err
		}
		if _, ok := fresh[f]; !ok {
			fresh[f] = [][]byte{} // written: its old lines go, even if none of its new ones fits
		}
		if len(line) > MaxIndexLineBytes {
			tooLong = append(tooLong, entries[i].label())
			continue
		}
		fresh[f] = append(fresh[f], line)
		written = true
	}
	for f, ls := range fresh {
		x.lines[f] = ls
	}
	old := filepath.Join(dir, oldIndexName)
	_, oldErr := os.Lstat(old)
	if _, err := os.Lstat(filepath.Join(dir, IndexName)); isNotExist(err) && !written && oldErr != nil {
		return nil // nothing to index, and no index to keep
	}
	names := make([]string, 0, len(x.lines))
	for name := range x.lines {
		if st, err := os.Lstat(filepath.Join(dir, name)); err == nil && st.Mode().IsRegular() {
			names = append(names, name)
		}
	}
	sort.Strings(names)
	var buf bytes.Buffer
	head, _ := json.Marshal(indexHeader{Format: indexFormat, Kind: indexKind})
	buf.Write(head)
	buf.WriteByte('\n')
	for _, name := range names {
		for _, l := range x.lines[name] {
			buf.Write(l)
			buf.WriteByte('\n')
		}
	}
	if err := cards.WriteAtomic(filepath.Join(dir, IndexName), buf.Bytes()); err != nil {
		return err
	}
	if oldErr == nil {
		os.Remove(old) // replaced by the index just written
	}
	if len(tooLong) > 0 {
		return fmt.Errorf("not indexed (a line over %d bytes): %s", MaxIndexLineBytes, strings.Join(tooLong, ", "))
	}
	return nil
}
