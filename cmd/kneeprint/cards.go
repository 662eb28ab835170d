package main

import (
	"errors"
	"fmt"
	"io/fs"
	"os"
	"sort"
	"strings"
	"time"

	"github.com/spf13/cobra"

	"kneeprint/cmd/internal/cards"
	"kneeprint/cmd/internal/inputs"
	"kneeprint/cmd/internal/spec"
	"kneeprint/layout"
	"kneeprint/perf"
	"kneeprint/templates"
)

type cardsOptions struct {
	demo               bool
	aircraft, airfield string
	template           string
	page, sheet        string
	policy             string
	date, validUntil   string
	out                string
	noCompress         bool
}

func newCardsCmd(e env) *cobra.Command {
	opts := &cardsOptions{}
	cmd := &cobra.Command{
		Use:   "cards (--demo | --aircraft FILE --airfield FILE) -o DIR [flags]",
		Short: "Write kneeboard cards: one PDF per aircraft and airfield, one card per runway end",
		Long: `cards computes every runway end's grid and writes printable kneeboard cards, one PDF
per aircraft x airfield and one page per runway end (or one sheet per two cards with
--sheet). The same inputs and --date give a byte-identical PDF. Card presets (page,
unit, axes, margin, policy) are YAML: a5 (default), half-letter, 5x8, or your own file.
Files are written atomically: a crash never leaves half a PDF.

` + caution,
		Example: `  kneeprint cards --demo -o cards
  kneeprint cards --aircraft my-plane.yaml --airfield home.yaml --template half-letter --date 2027-03-01 --valid-until 2027-10-31 -o cards
  kneeprint cards --demo --sheet a4 -o print`,
		Args: cobra.NoArgs,
		RunE: func(cmd *cobra.Command, _ []string) error { return cardsRun(e, opts) },
	}
	f := cmd.Flags()
	f.BoolVar(&opts.demo, "demo", false, "every embedded demo aircraft at every demo airfield (invented data)")
	f.StringVar(&opts.aircraft, "aircraft", "", "aircraft profile file, or demo:NAME")
	f.StringVar(&opts.airfield, "airfield", "", "airfield file, or demo:NAME")
	f.StringVar(&opts.template, "template", templates.DefaultCard, "card preset: a5, half-letter, 5x8, or a card-template file")
	f.StringVar(&opts.page, "page", "", "card size a5|half-letter|5x8 (default: the template's)")
	f.StringVar(&opts.sheet, "sheet", "", "print two cards per a4|letter sheet, with cut marks")
	f.StringVar(&opts.policy, "policy", "", "safety policy (default: the template's): "+policyList())
	f.StringVar(&opts.date, "date", "", "card date YYYY-MM-DD (default: today)")
	f.StringVar(&opts.validUntil, "valid-until", "", "valid-until date YYYY-MM-DD (default: date + the template's valid_days)")
	f.StringVarP(&opts.out, "out", "o", "", "output folder (created if needed)")
	f.BoolVar(&opts.noCompress, "no-compress", false, "do not deflate page streams (faster, larger files)")
	return cmd
}

// loadTemplate resolves a preset name or a file.
func loadTemplate(arg string) (*spec.CardTemplate, error) {
	var doc *spec.Document
	var err error
	if _, statErr := fs.Stat(templates.FS, templates.CardsDir+"/"+arg+".yaml"); statErr == nil {
		doc, err = spec.Load(templates.FS, templates.CardsDir+"/"+arg+".yaml")
	} else {
		if _, statErr := os.Stat(arg); statErr != nil {
			return nil, fmt.Errorf("--template %q: not a preset (a5, half-letter, 5x8) nor a readable file", arg)
		}
		doc, err = spec.LoadFile(arg)
	}
	if err != nil {
		return nil, fileError(err)
	}
	if doc.Kind != spec.KindCardTemplate {
		return nil, dataError{fmt.Errorf("%s: kind: this is an %s file, a card-template file is needed here", arg, doc.Kind)}
	}
	return doc.Template, nil
}

func parseDate(flag, s string) (time.Time, error) {
	t, err := time.Parse("2006-01-02", s)
	if err != nil {
		return time.Time{}, fmt.Errorf("--%s %q: write the date as YYYY-MM-DD", flag, s)
	}
	return t, nil
}

func cardsRun(e env, opts *cardsOptions) error {
	if opts.out == "" {
		return errors.New("-o DIR is required: the folder the cards are written to")
	}
	if opts.demo == (opts.aircraft != "" || opts.airfield != "") {
		return errors.New("give either --demo, or --aircraft and --airfield")
	}
	tmpl, err := loadTemplate(opts.template)
	if err != nil {
		return err
	}
	if opts.policy != "" {
		if _, err := perf.PolicyByID(opts.policy); err != nil {
			return err
		}
		tmpl.Policy = opts.policy
	}
	pageName := tmpl.Page
	if opts.page != "" {
		pageName = opts.page
	}
	page, err := layout.PageByName(pageName)
	if err != nil {
		return err
	}
	var sheet *layout.Sheet
	if opts.sheet != "" {
		s, err := layout.SheetByName(opts.sheet)
		if err != nil {
			return err
		}
		sheet = &s
	}
	now := e.now().UTC()
	date := time.Date(now.Year(), now.Month(), now.Day(), 0, 0, 0, 0, time.UTC)
	if opts.date != "" {
		if date, err = parseDate("date", opts.date); err != nil {
			return err
		}
	}
	valid := date.AddDate(0, 0, tmpl.ValidDays)
	if opts.validUntil != "" {
		if valid, err = parseDate("valid-until", opts.validUntil); err != nil {
			return err
		}
		if !valid.After(date) {
			return errors.New("--valid-until must be after --date")
		}
	}

	var acArgs, afArgs []string
	if opts.demo {
		ac, af := inputs.Demo()
		for _, s := range ac {
			acArgs = append(acArgs, inputs.DemoPrefix+strings.TrimSuffix(s.Path[strings.LastIndex(s.Path, "/")+1:], ".yaml"))
		}
		for _, s := range af {
			afArgs = append(afArgs, inputs.DemoPrefix+strings.TrimSuffix(s.Path[strings.LastIndex(s.Path, "/")+1:], ".yaml"))
		}
	} else {
		acArgs, afArgs = []string{opts.aircraft}, []string{opts.airfield}
	}
	if err := os.MkdirAll(opts.out, 0o755); err != nil {
		return dataError{err}
	}
	fonts, err := layout.NewFonts()
	if err != nil {
		return err
	}
	failed := 0
	for _, aa := range acArgs {
		a, _, err := inputs.Aircraft(aa)
		if err != nil {
			failed++
			fmt.Fprintf(e.stderr, "%s: %v\n", aa, err)
			continue
		}
		for _, fa := range afArgs {
			f, _, err := inputs.Airfield(fa)
			if err != nil {
				failed++
				fmt.Fprintf(e.stderr, "%s: %v\n", fa, err)
				continue
			}
			job := &cards.Job{Aircraft: a, Airfield: f, Template: *tmpl, Page: page, Sheet: sheet,
				Date: date, ValidUntil: valid, Version: version, Compress: !opts.noCompress}
			res, err := job.Write(opts.out, fonts)
			if err != nil {
				failed++
				fmt.Fprintf(e.stderr, "%s at %s: %v\n", a.Name, f.Ident, err)
				continue
			}
			fmt.Fprintf(e.stdout, "wrote %s (%d page(s))\n", res.Path, res.Pages)
			for _, s := range res.Ends {
				fmt.Fprintf(e.stdout, "  %-4s %s  fingerprint %s\n", s.Designator, countsText(s.Counts), s.Fingerprint)
			}
		}
	}
	if failed > 0 {
		return dataError{fmt.Errorf("%d card file(s) could not be made", failed)}
	}
	return nil
}

func countsText(c map[perf.State]int) string {
	var parts []string
	for _, s := range perf.States() {
		parts = append(parts, fmt.Sprintf("%s %d", s, c[s]))
	}
	sort.Strings(nil)
	return strings.Join(parts, ", ")
}
