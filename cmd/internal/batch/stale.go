package batch

import (
	"crypto/sha256"
	"encoding/hex"
	"errors"
	"fmt"
	"io"
	"path/filepath"
	"sort"
	"strings"
	"time"

	"kneeprint/cmd/internal/cards"
	"kneeprint/cmd/internal/changes"
	"kneeprint/cmd/internal/files"
	"kneeprint/cmd/internal/inputs"
	"kneeprint/cmd/internal/spec"
	"kneeprint/layout"
	"kneeprint/perf"
)

// StaleCard is one printed card (one page of one card file) that no longer matches
// its inputs, or is past its valid-until date, and why.
type StaleCard struct {
	File string `json:"file"`
	// In a bundle (cards --bundle): the pair the card belongs to (the name its file
	// has on its own), its aircraft and airfield, and the bundle's pages the card is
	// printed on (takeoff side, then landing side; none when it was never printed).
	Part       string   `json:"part,omitempty"`
	Aircraft   string   `json:"aircraft,omitempty"`
	Airfield   string   `json:"airfield,omitempty"`
	PDFPages   []int    `json:"pdf_pages,omitempty"`
	Page       string   `json:"page"` // the card's identity within its file (and part)
	Designator string   `json:"designator"`
	ValidUntil string   `json:"valid_until,omitempty"`
	Expired    bool     `json:"expired"`
	Reasons    []string `json:"reasons"`
}

// staleIn is a stale card of index line c: its file, and its part in a bundle.
func staleIn(c IndexCard) StaleCard {
	sc := StaleCard{File: c.File}
	if c.Part != "" {
		sc.Part, sc.Aircraft, sc.Airfield = c.Part, c.Aircraft.Name, c.Airfield.Name
	}
	return sc
}

// partKey identifies an index line, and the planned entry it is compared with: a
// card file, or a bundle's pair.
func partKey(file, part string) string { return file + "\x00" + part }

// StaleReport is the outcome of a stale check.
type StaleReport struct {
	Dir     string      `json:"dir"`
	Checked int         `json:"cards_checked"`
	Stale   []StaleCard `json:"stale"`
	Errors  []string    `json:"errors"`
}

// current is what a card would be made from today.
type current struct {
	aircraft    *perf.Aircraft
	airfield    *perf.Airfield
	template    *spec.CardTemplate
	page        layout.Page
	validUntil  string // with a plan: the valid-until the plan gives now
	aircraftSrc string
	airfieldSrc string
	err         error
}

// Stale compares the index in dir with the current input files: those the index
// records, or, with a plan, those the plan names now. Every card whose inputs changed
// in a way that counts (see aircraftKey, templateKey, cards.EndHash) is listed with
// the reasons; so is every card past its valid-until date on today, and every runway
// end that has no card. A page given with cards --page is taken as chosen, not as a
// template change.
func Stale(dir string, plan *spec.Plan, planDir, version string, today time.Time) (*StaleReport, error) {
	idx, err := ReadIndex(dir)
	if err != nil {
		if isNotExist(err) {
			return nil, fmt.Errorf("%s has no %s: only a folder written by 'kneeprint cards' can be checked", dir, IndexName)
		}
		return nil, err
	}
	rep := &StaleReport{Dir: dir}
	var planned map[string]*Entry
	if plan != nil {
		if planned, err = plannedEntries(plan, planDir, dir, version, idx, rep); err != nil {
			return nil, err
		}
	}
	loaded := map[string]current{}
	lookup := func(c IndexCard) current {
		if planned != nil {
			e, ok := planned[partKey(c.File, c.Part)]
			if !ok {
				return current{err: errors.New("the plan no longer makes this card file (or could not read its inputs)")}
			}
			return current{aircraft: e.Job.Aircraft, airfield: e.Job.Airfield, template: &e.Job.Template, page: e.Job.Page,
				validUntil: e.Job.ValidUntil.Format("2006-01-02"), aircraftSrc: e.AircraftSrc, airfieldSrc: e.AirfieldSrc}
		}
		key := c.Aircraft.Source + "\x00" + c.Airfield.Source + "\x00" + c.Template.Source + "\x00" + c.PageOverride
		if cur, ok := loaded[key]; ok {
			return cur
		}
		cur := current{aircraftSrc: sourceFrom(dir, c.Aircraft.Source), airfieldSrc: sourceFrom(dir, c.Airfield.Source)}
		var err error
		if cur.aircraft, _, err = inputs.Aircraft(cur.aircraftSrc); err != nil {
			cur.err = fmt.Errorf("aircraft profile %s cannot be read: %s", cur.aircraftSrc, firstLine(err.Error()))
		} else if cur.airfield, _, err = inputs.Airfield(cur.airfieldSrc); err != nil {
			cur.err = fmt.Errorf("airfield file %s cannot be read: %s", cur.airfieldSrc, firstLine(err.Error()))
		} else if cur.template, err = inputs.Template(sourceFrom(dir, c.Template.Source)); err != nil {
			cur.err = fmt.Errorf("card template %s cannot be read: %s", c.Template.Source, firstLine(err.Error()))
		} else {
			// As the card was made: a plan may have set the policy and unit for
			// the batch, and cards --page the page.
			cur.template.Policy, cur.template.Unit = c.Policy, c.Unit
			if c.PageOverride != "" {
				cur.template.Page = c.PageOverride
			}
			if cur.page, err = layout.PageByName(cur.template.Page); err != nil {
				cur.err = err
			}
		}
		loaded[key] = cur
		return cur
	}
	day := today.Format("2006-01-02")
	seen := map[string]bool{}
	for _, c := range idx.Cards {
		seen[partKey(c.File, c.Part)] = true
		var fileReasons []string
		sum, err := fileSHA256(filepath.Join(dir, c.File))
		switch {
		case isNotExist(err):
			fileReasons = append(fileReasons, "card file missing")
		case err != nil:
			fileReasons = append(fileReasons, fmt.Sprintf("card file unreadable: %v", err))
		case sum != c.SHA256:
			fileReasons = append(fileReasons, "card file changed after kneeprint wrote it")
		}
		expired := c.ValidUntil != "" && c.ValidUntil < day // both YYYY-MM-DD
		if expired {
			fileReasons = append(fileReasons, fmt.Sprintf("expired: valid until %s", c.ValidUntil))
		}
		cur := lookup(c)
		if cur.err != nil {
			fileReasons = append(fileReasons, cur.err.Error())
		} else {
			if h := aircraftKey(cur.aircraft); h != c.Aircraft.Hash {
				fileReasons = append(fileReasons, fmt.Sprintf("aircraft profile %s changed", cur.aircraftSrc))
			}
			if h := templateKey(*cur.template, cur.page); h != c.Template.Hash {
				fileReasons = append(fileReasons, fmt.Sprintf("card template %s changed", c.Template.Name))
			}
			if cur.validUntil != "" && cur.validUntil != c.ValidUntil {
				fileReasons = append(fileReasons, fmt.Sprintf("the plan now gives valid until %s, the card says %s", cur.validUntil, c.ValidUntil))
			}
			if c.Version != version {
				fileReasons = append(fileReasons, fmt.Sprintf("made by kneeprint %s, this is kneeprint %s", c.Version, version))
			}
		}
		now := map[string]perf.RunwayEnd{}
		if cur.airfield != nil {
			for _, e := range cur.airfield.Ends() {
				now[e.Designator] = e
			}
		}
		had := map[string]bool{}
		for _, ie := range c.Ends {
			had[ie.Designator] = true
			rep.Checked++
			reasons := append([]string(nil), fileReasons...)
			if cur.airfield != nil {
				ne, ok := now[ie.Designator]
				switch {
				case !ok:
					reasons = append(reasons, fmt.Sprintf("runway end %s is no longer in %s", ie.Designator, cur.airfieldSrc))
				case cards.EndHash(cur.airfield, ne) != ie.EndHash:
					var what []string
					for _, fc := range changes.EndFields(ie.End, ne) {
						w := fmt.Sprintf("%s %s -> %s", fc.Field, fc.Old, fc.New)
						if fc.Field == "LDA" && ie.LandingStates != nil {
							w += " (its landing side)"
						}
						what = append(what, w)
					}
					if len(what) == 0 {
						what = append(what, "airfield name, identifier or elevation, or the runway's other threshold elevation")
					}
					reasons = append(reasons, fmt.Sprintf("runway end %s changed in %s: %s", ie.Designator, cur.airfieldSrc, strings.Join(what, ", ")))
				}
			}
			if len(reasons) > 0 {
				page := ie.Page
				if page == "" {
					page = ie.Designator
				}
				sc := staleIn(c)
				sc.Page, sc.Designator, sc.ValidUntil, sc.Expired, sc.Reasons = page, ie.Designator, c.ValidUntil, expired, reasons
				if c.Part != "" {
					sc.PDFPages = ie.PDFPages
				}
				rep.Stale = append(rep.Stale, sc)
			}
		}
		if cur.airfield != nil {
			for _, e := range cur.airfield.Ends() {
				if !had[e.Designator] {
					sc := staleIn(c)
					sc.Page, sc.Designator = e.Designator, e.Designator
					sc.Reasons = []string{fmt.Sprintf("runway end %s is in %s but has no card", e.Designator, cur.airfieldSrc)}
					rep.Stale = append(rep.Stale, sc)
				}
			}
		}
	}
	for key, e := range planned {
		if !seen[key] {
			for _, end := range e.Job.Airfield.Ends() {
				sc := StaleCard{File: e.File(), Page: end.Designator, Designator: end.Designator, Reasons: []string{"in the plan but never printed"}}
				if e.Bundle != "" {
					sc.Part, sc.Aircraft, sc.Airfield = e.Name, e.Job.Aircraft.Name, e.Job.Airfield.Ident
				}
				rep.Stale = append(rep.Stale, sc)
			}
		}
	}
	sort.Slice(rep.Stale, func(i, j int) bool {
		a, b := rep.Stale[i], rep.Stale[j]
		if a.File != b.File {
			return a.File < b.File
		}
		if (len(a.PDFPages) > 0) != (len(b.PDFPages) > 0) {
			return len(a.PDFPages) > 0 // printed before never printed
		}
		if len(a.PDFPages) > 0 && a.PDFPages[0] != b.PDFPages[0] {
			return a.PDFPages[0] < b.PDFPages[0] // a bundle's cards in page order
		}
		if a.Part != b.Part {
			return a.Part < b.Part
		}
		return a.Page < b.Page
	})
	return rep, nil
}

// plannedEntries is what the plan makes now, by file and part (partKey): printed on
// the page of each template, and on every page the index records as given with
// cards --page, in every bundle mode the index records (cards --bundle).
func plannedEntries(plan *spec.Plan, planDir, dir, version string, idx *Index, rep *StaleReport) (map[string]*Entry, error) {
	prep, err := Prepare(plan, planDir, dir, version, true)
	if err != nil {
		return nil, err
	}
	for _, e := range prep.InputErrors {
		rep.Errors = append(rep.Errors, e.Error())
	}
	ways := map[string]bool{} // page override and bundle mode, as the index records them
	for _, c := range idx.Cards {
		ways[c.PageOverride+"\x00"+c.Bundle] = true
	}
	if len(ways) == 0 {
		ways["\x00"] = true
	}
	planned := map[string]*Entry{}
	for _, way := range sortedKeys(ways) {
		name, mode, _ := strings.Cut(way, "\x00")
		var page *layout.Page
		if name != "" {
			pg, err := layout.PageByName(name)
			if err != nil {
				rep.Errors = append(rep.Errors, fmt.Sprintf("%s: page %q of cards --page: %v", IndexName, name, err))
				continue
			}
			page = &pg
		}
		es, err := prep.printedAs(page, mode)
		if err != nil {
			rep.Errors = append(rep.Errors, fmt.Sprintf("%s: bundle %q of cards --bundle: %v", IndexName, mode, err))
			continue
		}
		for _, e := range es {
			part := ""
			if e.Bundle != "" {
				part = e.Name
			}
			planned[partKey(e.File(), part)] = e
		}
	}
	return planned, nil
}

func sortedKeys(m map[string]bool) []string {
	out := make([]string, 0, len(m))
	for k := range m {
		out = append(out, k)
	}
	sort.Strings(out)
	return out
}

// fileSHA256 hashes a card file, refusing anything but a regular file (a named pipe
// planted in its place would block the reader).
func fileSHA256(path string) (string, error) {
	f, err := files.OpenRegular(path)
	if err != nil {
		return "", err
	}
	defer f.Close()
	h := sha256.New()
	if _, err := io.Copy(h, f); err != nil {
		return "", err
	}
	return hex.EncodeToString(h.Sum(nil)), nil
}

// WriteText prints the stale report.
func (r *StaleReport) WriteText(w io.Writer) error {
	b := &strings.Builder{}
	for _, e := range r.Errors {
		fmt.Fprintf(b, "error: %s\n", e)
	}
	if len(r.Stale) == 0 {
		fmt.Fprintf(b, "%s: all %d card(s) match their inputs\n", r.Dir, r.Checked)
	} else {
		fmt.Fprintf(b, "%s: %d card(s) no longer match their inputs (of %d checked):\n", r.Dir, len(r.Stale), r.Checked)
		for _, s := range r.Stale {
			switch {
			case s.Part == "":
				fmt.Fprintf(b, "  %s  runway %s\n", s.File, s.Page)
			case len(s.PDFPages) == 0:
				fmt.Fprintf(b, "  %s  %s at %s, runway %s\n", s.File, s.Aircraft, s.Airfield, s.Page)
			default:
				fmt.Fprintf(b, "  %s  pages %s: %s at %s, runway %s\n", s.File, pagesText(s.PDFPages), s.Aircraft, s.Airfield, s.Page)
			}
			for _, why := range s.Reasons {
				fmt.Fprintf(b, "      - %s\n", why)
			}
		}
	}
	_, err := io.WriteString(w, b.String())
	return err
}
