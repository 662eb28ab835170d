package batch

import (
	"crypto/sha256"
	"encoding/hex"
	"encoding/json"
	"errors"
	"fmt"
	"io"
	"os"
	"path/filepath"
	"sort"
	"strings"

	"kneeprint/cmd/internal/cards"
	"kneeprint/cmd/internal/inputs"
	"kneeprint/perf"
)

// IndexName is the index a batch writes next to its cards.
const IndexName = "kneeprint-index.json"

// indexFormat is the version of the index layout.
const indexFormat = 1

// Index lists every card file of a folder and what it was made from.
type Index struct {
	Format int         `json:"format"`
	Cards  []IndexCard `json:"cards"`
}

// IndexCard is one card file.
type IndexCard struct {
	File       string     `json:"file"`
	SHA256     string     `json:"sha256"`
	Pages      int        `json:"pages"`
	Aircraft   Component  `json:"aircraft"`
	Airfield   Component  `json:"airfield"`
	Template   Component  `json:"template"`
	Policy     string     `json:"policy"`
	Unit       string     `json:"unit"`
	Page       string     `json:"page"`
	Sheet      string     `json:"sheet,omitempty"`
	Version    string     `json:"kneeprint_version"`
	Date       string     `json:"date"`
	ValidUntil string     `json:"valid_until"`
	Ends       []IndexEnd `json:"runway_ends"`
}

// Component is one input of a card: where it was read and the hash of its canonical
// form (comments and formatting do not count).
type Component struct {
	Source string `json:"source"` // relative to the index's folder, demo:NAME, or a preset name
	Name   string `json:"name"`
	Hash   string `json:"hash"`
}

// IndexEnd is one runway end's card.
type IndexEnd struct {
	Designator  string         `json:"designator"`
	Page        string         `json:"page,omitempty"` // the page's identity: "15 wet" when the end has a page per condition
	Fingerprint string         `json:"fingerprint"`
	EndHash     string         `json:"end_hash"`
	End         perf.RunwayEnd `json:"end"`
	States      map[string]int `json:"states"`
}

func sha256Hex(data []byte) string {
	sum := sha256.Sum256(data)
	return hex.EncodeToString(sum[:])
}

// ReadIndex reads dir's index.
func ReadIndex(dir string) (*Index, error) {
	f, err := os.Open(filepath.Join(dir, IndexName))
	if err != nil {
		return nil, err
	}
	defer f.Close()
	data, err := io.ReadAll(io.LimitReader(f, 64<<20))
	if err != nil {
		return nil, err
	}
	var idx Index
	dec := json.NewDecoder(strings.NewReader(string(data)))
	dec.DisallowUnknownFields()
	if err := dec.Decode(&idx); err != nil {
		return nil, fmt.Errorf("%s: not a kneeprint index: %w", filepath.Join(dir, IndexName), err)
	}
	if idx.Format != indexFormat {
		return nil, fmt.Errorf("%s: index format %d, this kneeprint reads format %d", filepath.Join(dir, IndexName), idx.Format, indexFormat)
	}
	return &idx, nil
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

func entryCard(dir string, e *Entry, r JobResult) IndexCard {
	j := e.Job
	c := IndexCard{
		File: e.Name, SHA256: r.SHA256, Pages: r.Pages,
		Aircraft: Component{relSource(dir, e.AircraftSrc), j.Aircraft.Name, cards.AircraftHash(j.Aircraft)},
		Airfield: Component{relSource(dir, e.AirfieldSrc), j.Airfield.Ident, ""},
		Template: Component{relSource(dir, e.TemplateSrc), j.Template.Name, cards.TemplateHash(j.Template, j.Page)},
		Policy:   j.Template.Policy, Unit: j.Template.Unit, Page: j.Page.Name, Version: j.Version,
		Date: j.Date.Format("2006-01-02"), ValidUntil: j.ValidUntil.Format("2006-01-02"),
	}
	if j.Sheet != nil {
		c.Sheet = j.Sheet.Name
	}
	for _, s := range r.Ends {
		st := map[string]int{}
		for k, v := range s.Counts {
			st[k.String()] = v
		}
		c.Ends = append(c.Ends, IndexEnd{Designator: s.Designator, Page: s.Page, Fingerprint: s.Fingerprint,
			EndHash: cards.EndHash(j.Airfield, s.End), End: s.End, States: st})
	}
	return c
}

// UpdateIndex merges a run's results into dir's index: cards written replace their
// old entries, entries whose file is gone are dropped; the index is written atomically.
func UpdateIndex(dir string, entries []*Entry, results []JobResult) error {
	idx, err := ReadIndex(dir)
	if err != nil {
		if !errors.Is(err, os.ErrNotExist) {
			return err
		}
		idx = &Index{}
		written := false
		for _, r := range results {
			written = written || (r.Err == nil && !r.Canceled && r.Entry != nil)
		}
		if !written {
			return nil // nothing to index, and no index to keep
		}
	}
	idx.Format = indexFormat
	byFile := map[string]IndexCard{}
	for _, c := range idx.Cards {
		byFile[c.File] = c
	}
	for i, r := range results {
		if r.Err == nil && !r.Canceled && r.Entry != nil {
			byFile[entries[i].Name] = entryCard(dir, entries[i], r)
		}
	}
	idx.Cards = idx.Cards[:0]
	for name, c := range byFile {
		if _, err := os.Stat(filepath.Join(dir, name)); err == nil {
			idx.Cards = append(idx.Cards, c)
		}
	}
	sort.Slice(idx.Cards, func(i, j int) bool { return idx.Cards[i].File < idx.Cards[j].File })
	data, err := json.MarshalIndent(idx, "", "  ")
	if err != nil {
		return err
	}
	return cards.WriteAtomic(filepath.Join(dir, IndexName), append(data, '\n'))
}
