package main

import (
	"context"
	"errors"
	"fmt"
	"os"
	"os/signal"
	"path/filepath"
	"runtime/debug"
	"strconv"
	"strings"
	"syscall"
	"time"

	"github.com/spf13/cobra"
	"golang.org/x/term"

	"kneeprint/cmd/internal/batch"
	"kneeprint/cmd/internal/cards"
	"kneeprint/cmd/internal/inputs"
	"kneeprint/cmd/internal/spec"
	"kneeprint/layout"
	"kneeprint/perf"
	"kneeprint/templates"
)

type cardsOptions struct {
	demo               bool
	plan               string
	aircraft, airfield string
	template           string
	page, sheet        string
	policy             string
	date, validUntil   string
	out                string
	noCompress         bool
	workers            int
	data               bool
	allowEmpty         bool
	bundle             string
}

func newCardsCmd(e env) *cobra.Command {
	opts := &cardsOptions{}
	cmd := &cobra.Command{
		Use:   "cards (--demo | --aircraft FILE --airfield FILE | --plan PLAN) -o DIR [flags]",
		Short: "Write kneeboard cards: one PDF per aircraft and airfield, one card per runway end",
		Long: `cards computes every runway end's grid and writes printable kneeboard cards, one PDF
per aircraft x airfield and one page per runway end, two (dry and wet) on grass and
gravel (or one sheet per two cards with --sheet). A plan file (kind: plan) names a whole season: every aircraft at every
airfield with every card template. Cards are made in parallel; each file is written
to a temporary name and renamed into place, so a crash or Ctrl-C never leaves half a
PDF. The folder gets an index (kneeprint-index.jsonl) that 'kneeprint stale' reads.
-o must name a folder (a file is refused, exit 2). One batch writes into a folder at
a time: a second one waits until the first has finished. The same inputs and --date
give byte-identical PDFs. Exit 1 if any card was not made.

A card page on which no cell has a figure (every cell no data, past a limit or no
takeoff: a pressure altitude above the table, say) is listed in the summary and makes
the command exit 1, unless --allow-empty is given: such a card is never printed
quietly. --data writes, beside each PDF, the card's content as JSON (NAME.json: the
figures as printed, the state of every cell; fields in the README).

A runway end that lists obstacles past its end gets an obstacle line and a climb %
row; a cell whose figure fits but whose climb does not clear an obstacle by the
template's obstacle_margin (default 50 ft) is no-go, with its own mark.

Landing: when the profile has landing data every card has a landing side, printed as
the next page behind its takeoff side (the landing distance from 50 ft against the
LDA, same marks and legend; a runway end without an LDA says so). Print the file
double-sided. With --sheet, each sheet's back page holds the two landing sides
mirrored: print it double-sided, flipping on the short edge (the sheet turns like a
book page), and each landing side lands behind its own takeoff side. A template with
landing: same-page (preset a5-one-page) prints both on one page; landing: none
leaves the landing out.

For printing runs, --bundle airfield writes one PDF per airfield holding every
aircraft's cards, --bundle plan one PDF holding every card of the plan (airfield by
airfield, aircraft by aircraft, as the plan lists them); each template gets its own,
and cards without a landing side (a profile without landing data) print in a
"_takeoff-only" one apart from double-sided ones. A bundle keeps every promise of
the card files: written whole or not at all, indexed card by card (stale names the
bundle's pages), duplex and 2-up order, --data (one JSON per bundle). At most
` + strconv.Itoa(cards.MaxBundlePages) + ` card pages a bundle.

Card presets (page, unit, axes, margin, policy) are YAML: a5 (default), half-letter,
5x8, a5-one-page, or your own file (copy one from templates/cards/).

` + caution,
		Example: `  kneeprint cards --demo -o cards
  kneeprint cards --plan season-2027.yaml
  kneeprint cards --aircraft my-plane.yaml --airfield home.yaml --template half-letter --date 2027-03-01 --valid-until 2027-10-31 -o cards
  kneeprint cards --demo --sheet a4 -o print
  kneeprint cards --plan season-2027.yaml --bundle airfield`,
		Args: cobra.NoArgs,
		RunE: func(cmd *cobra.Command, _ []string) error { return cardsRun(e, opts) },
	}
	f := cmd.Flags()
	f.BoolVar(&opts.demo, "demo", false, "every embedded demo aircraft at every demo airfield (invented data)")
	f.StringVar(&opts.plan, "plan", "", "a plan file: aircraft, airfields, templates, dates, output folder")
	f.StringVar(&opts.aircraft, "aircraft", "", "aircraft profile file, or demo:NAME")
	f.StringVar(&opts.airfield, "airfield", "", "airfield file, or demo:NAME")
	f.StringVar(&opts.template, "template", templates.DefaultCard, "card preset: a5, half-letter, 5x8, a5-one-page, or a card-template file")
	f.StringVar(&opts.page, "page", "", "card size a5|half-letter|5x8 (default: the template's)")
	f.StringVar(&opts.sheet, "sheet", "", "print two cards per a4|letter sheet, with cut marks (landing sides: print double-sided, flip on the short edge)")
	f.StringVar(&opts.policy, "policy", "", "safety policy (default: the template's): "+policyList())
	f.StringVar(&opts.date, "date", "", "card date YYYY-MM-DD (default: today; a plan gives its own)")
	f.StringVar(&opts.validUntil, "valid-until", "", "valid-until date YYYY-MM-DD (default: date + the template's valid_days)")
	f.StringVarP(&opts.out, "out", "o", "", "output folder, created if needed (a plan gives its own)")
	f.BoolVar(&opts.noCompress, "no-compress", false, "do not deflate page streams (faster, larger files)")
	f.IntVar(&opts.workers, "workers", 0, fmt.Sprintf("card files made at once (default: the number of CPUs; at most %d per CPU)", batch.WorkersPerCPU))
	f.BoolVar(&opts.data, "data", false, "also write each card's content as JSON beside its PDF (NAME.json)")
	f.BoolVar(&opts.allowEmpty, "allow-empty", false, "accept card pages on which no cell has a figure (exit 0)")
	f.StringVar(&opts.bundle, "bundle", "", "for printing runs: one PDF per airfield (every aircraft) or per plan: "+strings.Join(cards.BundleModes(), "|")+" (default: one PDF per aircraft and airfield)")
	return cmd
}

// loadTemplate resolves a preset name or a file.
func loadTemplate(arg string) (*spec.CardTemplate, error) {
	t, err := inputs.Template(arg)
	var list spec.ErrorList
	if errors.As(err, &list) {
		return nil, fileError(err)
	}
	return t, err
}

func parseDate(flag, s string) (time.Time, error) {
	t, err := time.Parse("2006-01-02", s)
	if err != nil {
		return time.Time{}, fmt.Errorf("--%s %q: write the date as YYYY-MM-DD", flag, s)
	}
	return t, nil
}

// planFromFlags builds the plan a command line describes.
func planFromFlags(e env, opts *cardsOptions) (*spec.Plan, error) {
	modes := 0
	for _, on := range []bool{opts.demo, opts.plan != "", opts.aircraft != "" || opts.airfield != ""} {
		if on {
			modes++
		}
	}
	if modes != 1 {
		return nil, errors.New("give one of --demo, --plan FILE, or --aircraft and --airfield")
	}
	if opts.plan != "" {
		p, err := batch.LoadPlan(opts.plan)
		if err != nil {
			return nil, fileError(err)
		}
		return p, nil
	}
	if opts.out == "" {
		return nil, errors.New("-o DIR is required: the folder the cards are written to")
	}
	// The name a plan bundle takes (--bundle plan): demo_a5.pdf, cards_a5.pdf.
	p := &spec.Plan{Name: "cards", Templates: []string{opts.template}, Output: opts.out}
	if opts.demo {
		p.Name = "demo"
		ac, af := inputs.Demo()
		for _, s := range ac {
			p.Aircraft = append(p.Aircraft, inputs.DemoPrefix+strings.TrimSuffix(filepath.Base(s.Path), ".yaml"))
		}
		for _, s := range af {
			p.Airfields = append(p.Airfields, inputs.DemoPrefix+strings.TrimSuffix(filepath.Base(s.Path), ".yaml"))
		}
	} else {
		if opts.aircraft == "" || opts.airfield == "" {
			return nil, errors.New("--aircraft and --airfield are both needed")
		}
		p.Aircraft, p.Airfields = []string{opts.aircraft}, []string{opts.airfield}
	}
	now := e.now().UTC()
	p.Date = time.Date(now.Year(), now.Month(), now.Day(), 0, 0, 0, 0, time.UTC)
	return p, nil
}

func cardsRun(e env, opts *cardsOptions) error {
	plan, err := planFromFlags(e, opts)
	if err != nil {
		return err
	}
	planDir := ""
	if opts.plan != "" {
		planDir = filepath.Dir(opts.plan)
	}
	// Command-line settings override the plan's.
	if opts.date != "" {
		if plan.Date, err = parseDate("date", opts.date); err != nil {
			return err
		}
	}
	if opts.validUntil != "" {
		if plan.ValidUntil, err = parseDate("valid-until", opts.validUntil); err != nil {
			return err
		}
	}
	if !plan.ValidUntil.IsZero() && !plan.ValidUntil.After(plan.Date) {
		return errors.New("--valid-until must be after --date")
	}
	if opts.policy != "" {
		if _, err := perf.PolicyByID(opts.policy); err != nil {
			return err
		}
		plan.Policy = opts.policy
	}
	if opts.sheet != "" {
		if _, err := layout.SheetByName(opts.sheet); err != nil {
			return err
		}
		plan.Sheet = opts.sheet
	}
	if opts.plan == "" {
		// Check the template now: a wrong name is a usage error, not a failed card.
		if _, err := loadTemplate(opts.template); err != nil {
			return err
		}
	}
	var page layout.Page
	if opts.page != "" {
		if page, err = layout.PageByName(opts.page); err != nil {
			return err
		}
	}
	if opts.out != "" {
		if st, err := os.Stat(opts.out); err == nil && !st.IsDir() {
			return fmt.Errorf("-o %s is a file: give a folder (one PDF per aircraft and airfield is written into it)", opts.out)
		}
	}
	if opts.bundle != "" && opts.bundle != cards.BundleAirfield && opts.bundle != cards.BundlePlan {
		return fmt.Errorf("--bundle %q: give %s (or leave it out: one PDF per aircraft and airfield)", opts.bundle, strings.Join(cards.BundleModes(), " or "))
	}
	if opts.workers < 0 {
		return fmt.Errorf("--workers %d: give a number of workers, or 0 for one per CPU", opts.workers)
	}
	prep, err := batch.Prepare(plan, planDir, opts.out, version, !opts.noCompress)
	if err != nil {
		return dataError{err}
	}
	if opts.page != "" {
		prep.SetPage(page) // names made unique again after the override
	}
	if err := prep.SetBundle(opts.bundle); err != nil {
		return dataError{err}
	}
	if w := batch.Workers(opts.workers, len(prep.Entries)); opts.workers > w {
		fmt.Fprintf(e.stderr, "--workers %d: %d used (at most one per card file and %d per CPU)\n", opts.workers, w, batch.WorkersPerCPU)
	}
	for _, en := range prep.Entries {
		en.Job.Data = opts.data
	}
	ctx, stop := signal.NotifyContext(context.Background(), os.Interrupt, syscall.SIGTERM)
	defer stop()
	// A batch allocates and drops megabytes per card file (fpdf's font tables): a
	// less eager collector saves about a tenth of the time (BenchmarkSeason) for a few
	// tens of megabytes of memory.
	defer debug.SetGCPercent(debug.SetGCPercent(400))
	// Two-sided cards hold twice the pages per file in flight: a soft limit makes the
	// lazy collector work harder only as the heap nears it (BenchmarkSeasonMemory).
	defer debug.SetMemoryLimit(debug.SetMemoryLimit(batch.SoftMemoryLimit))
	progress := batch.NewProgress(e.stderr, isTerminal(e.stderr))
	if opts.plan == "" {
		progress = batch.NewProgress(e.stdout, false)
	}
	waiting := func(msg string) { fmt.Fprintln(e.stderr, msg) }
	done := make(chan *batch.Summary, 1)
	go func() {
		done <- prep.Run(ctx, batch.Options{Workers: opts.workers, Progress: progress, Waiting: waiting})
	}()
	var sum *batch.Summary
	select {
	case sum = <-done:
	case <-ctx.Done():
		// Interrupted: no new card starts and the run ends within moments, unless it
		// is blocked in the file system. Then it is left behind: the cards in place
		// are whole (each appears only by rename), the lock goes with the process.
		stop() // a second Ctrl-C ends the process at once
		select {
		case sum = <-done:
		case <-time.After(stopGrace):
			return dataError{fmt.Errorf("interrupted: the batch did not stop within %s (blocked reading or writing a file?) and was abandoned; "+
				"the card files in place are whole, the index may not list the newest", stopGrace)}
		}
	}
	sum.WriteSummary(e.stdout)
	if sum.Failed() {
		return dataError{errors.New("not every card was made: see the errors above")}
	}
	if empty := sum.Empty(); len(empty) > 0 && !opts.allowEmpty {
		return dataError{fmt.Errorf("%d card page(s) have no figure at all (listed above): check the inputs, or give --allow-empty to keep them", len(empty))}
	}
	return nil
}

// stopGrace is how long an interrupted batch may take to stop before it is abandoned.
const stopGrace = 3 * time.Second

// isTerminal reports whether w is a terminal (for the progress bar).
func isTerminal(w any) bool {
	f, ok := w.(*os.File)
	return ok && term.IsTerminal(int(f.Fd()))
}
