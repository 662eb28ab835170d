package batch

import (
	"errors"
	"fmt"
	"io"
	"os"
	"path/filepath"
	"sort"
	"strings"

	"kneeprint/cmd/internal/cards"
	"kneeprint/cmd/internal/changes"
	"kneeprint/cmd/internal/inputs"
	"kneeprint/cmd/internal/spec"
	"kneeprint/layout"
	"kneeprint/perf"
)

// StaleCard is one printed card (one runway end of one card file) that no longer
// matches its inputs, and why.
type StaleCard struct {
	File       string   `json:"file"`
	Designator string   `json:"designator"`
	Page       string   `json:"page,omitempty"` // "15 wet" when the runway end has a page per condition
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
	aircraftSrc string
	airfieldSrc string
	err         error
}

// Stale compares the index in dir with the current input files: those the index
// records, or, with a plan, those the plan names now. Every card whose inputs changed
// is listed with the reasons; so is every runway end that has no card.
func Stale(dir string, plan *spec.Plan, planDir, version string) (*StaleReport, error) {
	idx, err := ReadIndex(dir)
	if err != nil {
		if errors.Is(err, os.ErrNotExist) {
			return nil, fmt.Errorf("%s has no %s: only a folder written by 'kneeprint cards --plan' can be checked", dir, IndexName)
		}
		return nil, err
	}
	rep := &StaleReport{Dir: dir}
	var planned map[string]*Entry
	if plan != nil {
		prep, err := Prepare(plan, planDir, dir, version, true)
		if err != nil {
			return nil, err
		}
		for _, e := range prep.InputErrors {
			rep.Errors = append(rep.Errors, e.Error())
		}
		planned = map[string]*Entry{}
		for _, e := range prep.Entries {
			planned[e.Name] = e
		}
	}
	loaded := map[string]current{}
	lookup := func(c IndexCard) current {
		if planned != nil {
			e, ok := planned[c.File]
			if !ok {
				return current{err: errors.New("the plan no longer makes this card file (or could not read its inputs)")}
			}
			return current{aircraft: e.Job.Aircraft, airfield: e.Job.Airfield, template: &e.Job.Template, page: e.Job.Page, aircraftSrc: e.AircraftSrc, airfieldSrc: e.AirfieldSrc}
		}
		key := c.Aircraft.Source + "\x00" + c.Airfield.Source + "\x00" + c.Template.Source
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
		} else if cur.page, err = layout.PageByName(c.Page); err != nil {
			cur.err = err
		}
		loaded[key] = cur
		return cur
	}
	seen := map[string]bool{}
	for _, c := range idx.Cards {
		seen[c.File] = true
		var fileReasons []string
		data, err := os.ReadFile(filepath.Join(dir, c.File))
		switch {
		case err != nil:
			fileReasons = append(fileReasons, "card file missing")
		case sha256Hex(data) != c.SHA256:
			fileReasons = append(fileReasons, "card file changed after kneeprint wrote it")
		}
		cur := lookup(c)
		if cur.err != nil {
			fileReasons = append(fileReasons, cur.err.Error())
		} else {
			if h := cards.AircraftHash(cur.aircraft); h != c.Aircraft.Hash {
				fileReasons = append(fileReasons, fmt.Sprintf("aircraft profile %s changed", cur.aircraftSrc))
			}
			t := *cur.template
			if plan == nil {
				// A plan may set the policy and unit for the batch: compare like with like.
				t.Policy, t.Unit = c.Policy, c.Unit
			}
			if h := cards.TemplateHash(t, cur.page); h != c.Template.Hash || t.Policy != c.Policy {
				fileReasons = append(fileReasons, fmt.Sprintf("card template %s changed", c.Template.Name))
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
						what = append(what, fmt.Sprintf("%s %s -> %s", fc.Field, fc.Old, fc.New))
					}
					if len(what) == 0 {
						what = append(what, "airfield name, identifier or elevation")
					}
					reasons = append(reasons, fmt.Sprintf("runway end %s changed in %s: %s", ie.Designator, cur.airfieldSrc, strings.Join(what, ", ")))
				}
			}
			if len(reasons) > 0 {
				rep.Stale = append(rep.Stale, StaleCard{File: c.File, Designator: ie.Designator, Page: ie.Page, Reasons: reasons})
			}
		}
		if cur.airfield != nil {
			for _, e := range cur.airfield.Ends() {
				if !had[e.Designator] {
					rep.Stale = append(rep.Stale, StaleCard{File: c.File, Designator: e.Designator,
						Reasons: []string{fmt.Sprintf("runway end %s is in %s but has no card", e.Designator, cur.airfieldSrc)}})
				}
			}
		}
	}
	for name, e := range planned {
		if !seen[name] {
			for _, end := range e.Job.Airfield.Ends() {
				rep.Stale = append(rep.Stale, StaleCard{File: name, Designator: end.Designator, Reasons: []string{"in the plan but never printed"}})
			}
		}
	}
	sort.Slice(rep.Stale, func(i, j int) bool {
		if rep.Stale[i].File != rep.Stale[j].File {
			return rep.Stale[i].File < rep.Stale[j].File
		}
		if rep.Stale[i].Designator != rep.Stale[j].Designator {
			return rep.Stale[i].Designator < rep.Stale[j].Designator
		}
		return rep.Stale[i].Page < rep.Stale[j].Page
	})
	return rep, nil
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
			which := s.Designator
			if s.Page != "" {
				which = s.Page
			}
			fmt.Fprintf(b, "  %s  runway %s\n", s.File, which)
			for _, why := range s.Reasons {
				fmt.Fprintf(b, "      - %s\n", why)
			}
		}
	}
	_, err := io.WriteString(w, b.String())
	return err
}
