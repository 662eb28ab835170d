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
	File       string   `json:"file"`
	Page       string   `json:"page"` // the card's identity within its file
	Designator string   `json:"designator"`
	ValidUntil string   `json:"valid_until,omitempty"`
	Expired    bool     `json:"expired"`
	Reasons    []string `json:"reasons"`
}

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
			e, ok := planned[c.File]
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
		seen[c.File] = true
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
				rep.Stale = append(rep.Stale, StaleCard{File: c.File, Page: page, Designator: ie.Designator,
					ValidUntil: c.ValidUntil, Expired: expired, Reasons: reasons})
			}
		}
		if cur.airfield != nil {
			for _, e := range cur.airfield.Ends() {
				if !had[e.Designator] {
					rep.Stale = append(rep.Stale, StaleCard{File: c.File, Page: e.Designator, Designator: e.Designator,
						Reasons: []string{fmt.Sprintf("runway end %s is in %s but has no card", e.Designator, cur.airfieldSrc)}})
				}
			}
		}
	}
	for name, e := range planned {
		if !seen[name] {
			for _, end := range e.Job.Airfield.Ends() {
				rep.Stale = append(rep.Stale, StaleCard{File: name, Page: end.Designator, Designator: end.Designator, Reasons: []string{"in the plan but never printed"}})
			}
		}
	}
	sort.Slice(rep.Stale, func(i, j int) bool {
		if rep.Stale[i].File != rep.Stale[j].File {
			return rep.Stale[i].File < rep.Stale[j].File
		}
		return rep.Stale[i].Page < rep.Stale[j].Page
	})
	return rep, nil
}

// plannedEntries is what the plan makes now, by file name: printed on the page of
// each template, and on every page the index records as given with cards --page.
func plannedEntries(plan *spec.Plan, planDir, dir, version string, idx *Index, rep *StaleReport) (map[string]*Entry, error) {
	prep, err := Prepare(plan, planDir, dir, version, true)
	if err != nil {
		return nil, err
	}
	for _, e := range prep.InputErrors {
		rep.Errors = append(rep.Errors, e.Error())
	}
	pages := map[string]bool{}
	for _, c := range idx.Cards {
		pages[c.PageOverride] = true
	}
	if len(pages) == 0 {
		pages[""] = true
	}
	planned := map[string]*Entry{}
	for _, name := range sortedKeys(pages) {
		es := prep.Entries
		if name != "" {
			page, err := layout.PageByName(name)
			if err != nil {
				rep.Errors = append(rep.Errors, fmt.Sprintf("%s: page %q of cards --page: %v", IndexName, name, err))
				continue
			}
			es = prep.withPage(page)
		}
		for _, e := range es {
			planned[e.Name] = e
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
			fmt.Fprintf(b, "  %s  runway %s\n", s.File, s.Page)
			for _, why := range s.Reasons {
				fmt.Fprintf(b, "      - %s\n", why)
			}
		}
	}
	_, err := io.WriteString(w, b.String())
	return err
}
