package main

import (
	"bytes"
	"crypto/sha256"
	"errors"
	"fmt"
	"io"
	"io/fs"
	"os"
	"path"
	"path/filepath"
	"strings"
	"time"

	"github.com/spf13/cobra"

	"kneeprint/cmd/internal/cards"
	"kneeprint/cmd/internal/files"
	"kneeprint/cmd/internal/inputs"
	"kneeprint/cmd/internal/proof"
	"kneeprint/cmd/internal/spec"
	"kneeprint/cmd/internal/typedtable"
)

type proofOptions struct {
	files []string
	out   string
	date  string
	paper string
}

func newProofCmd(e env) *cobra.Command {
	opts := &proofOptions{}
	cmd := &cobra.Command{
		Use:   "proof FILE... -o DIR [--date YYYY-MM-DD] [--paper a4|letter]",
		Short: "Write a proof sheet per aircraft or airfield file, to check by eye against the manual or chart",
		Long: `proof writes one PDF per file into the folder DIR (NAME-proof.pdf), to print and hold
beside the flight manual or the aerodrome chart:

  aircraft profile: its tables (takeoff, rate of climb, landing) re-printed exactly as
  typed, laid out like a manual's page (rows pressure altitude, columns temperature,
  one block per weight, in the table's unit) with a box to tick per figure and the
  file lines of each row; a plot of every row (figure against temperature, one curve
  per pressure altitude, one panel per weight and per quantity); every figure that
  breaks the smooth pattern of its neighbours circled and listed with its file:line
  (the rule is on the sheet and in the README); the correction notes in words; the
  climb speed and where the rates come from; the landing flap, approach speed and
  maximum landing mass; the physics descriptions, fitted values and residuals (takeoff
  and landing) when the profile has them; the reference figures of validate.

  airfield: the data and the obstacles as typed, and a to-scale drawing of each
  runway: its ends and headings, TORA, TODA, ASDA and LDA as bars, clearway and
  stopway, displaced starts and thresholds, the slope, and each obstacle past the end
  of the TORA where it stands.

A file with errors gets no sheet: its errors are listed as validate lists them, the
other files are still proofed, and proof exits 1. Each PDF is written whole or not at
all. The same file and --date give a byte-identical PDF.

` + caution,
		Example: `  kneeprint proof my-trainer.yaml home.yaml -o proofs
  kneeprint proof demo:sedgefin-sf2 demo:wrenmoor -o proofs --date 2027-03-01`,
		RunE: func(cmd *cobra.Command, args []string) error {
			opts.files = args
			return proofRun(e, opts)
		},
	}
	f := cmd.Flags()
	f.StringVarP(&opts.out, "out", "o", "", "folder to write the proof sheets into (made if missing)")
	f.StringVar(&opts.date, "date", "", "date printed on the sheets, YYYY-MM-DD (default: today)")
	f.StringVar(&opts.paper, "paper", "a4", "paper size: a4 or letter")
	return cmd
}

func proofRun(e env, opts *proofOptions) error {
	if len(opts.files) == 0 {
		return errors.New("proof needs one or more aircraft or airfield files (or demo:NAME)")
	}
	if opts.out == "" {
		return errors.New("proof needs -o DIR, the folder to write the sheets into")
	}
	if opts.paper != "a4" && opts.paper != "letter" {
		return fmt.Errorf("--paper %q: a4 or letter", opts.paper)
	}
	now := e.now()
	popt := proof.Options{Date: time.Date(now.Year(), now.Month(), now.Day(), 0, 0, 0, 0, time.UTC), Version: version, Paper: opts.paper}
	if opts.date != "" {
		d, err := parseDate("date", opts.date)
		if err != nil {
			return err
		}
		popt.Date = d
	}
	if st, err := os.Stat(opts.out); err == nil && !st.IsDir() {
		return fmt.Errorf("-o %s is a file: give a folder (one proof sheet per input file is written into it)", opts.out)
	}
	var srcs []inputs.Source
	for _, f := range opts.files {
		src, err := inputs.Resolve(f)
		if err != nil {
			return err
		}
		srcs = append(srcs, src)
	}
	names := proofNames(srcs)
	if err := os.MkdirAll(opts.out, 0o755); err != nil {
		return dataError{err}
	}
	failed := 0
	for i, s := range srcs {
		data, err := readSource(s)
		var doc *spec.Document
		if err == nil {
			doc, err = spec.Parse(s.Name, data)
		}
		if err == nil && doc.Aircraft == nil && doc.Airfield == nil {
			err = fmt.Errorf("%s: %w (this is a %s file)", s.Name, proof.ErrKind, doc.Kind)
		}
		if err != nil {
			failed++
			fmt.Fprintf(e.stdout, "%s: ERRORS, no proof sheet\n", s.Name)
			var list spec.ErrorList
			if errors.As(err, &list) {
				for _, fe := range list {
					fmt.Fprintf(e.stdout, "  %s\n", fe.Error())
				}
			} else {
				fmt.Fprintf(e.stdout, "  %s\n", err)
			}
			continue
		}
		var buf bytes.Buffer
		if err := proof.Write(&buf, proof.Source{Name: s.Name, Data: data}, doc, popt); err != nil {
			return dataError{fmt.Errorf("%s: %w", s.Name, err)}
		}
		dst := filepath.Join(opts.out, names[i])
		if err := cards.WriteAtomic(dst, buf.Bytes()); err != nil {
			return dataError{err}
		}
		suspicious := 0
		for _, t := range doc.Tables {
			suspicious += len(typedtable.Outliers(t))
		}
		fmt.Fprintf(e.stdout, "%s: wrote %s", s.Name, dst)
		if doc.Aircraft != nil && len(doc.Tables) > 0 {
			fmt.Fprintf(e.stdout, " (%d figure(s) off the smooth pattern of their neighbours)", suspicious)
		}
		fmt.Fprintln(e.stdout)
		for _, w := range doc.Warnings {
			fmt.Fprintf(e.stdout, "  ! %s\n", w)
		}
	}
	if failed > 0 {
		return dataError{fmt.Errorf("%d of %d file(s) have errors: no proof sheet for them", failed, len(srcs))}
	}
	return nil
}

// proofNames names each source's sheet NAME-proof.pdf after its file name; names
// that would clash (even by case only) get a short hash of the argument.
func proofNames(srcs []inputs.Source) []string {
	base := make([]string, len(srcs))
	count := map[string]int{}
	for i, s := range srcs {
		b := strings.TrimSuffix(path.Base(filepath.ToSlash(s.Path)), path.Ext(s.Path))
		base[i] = b
		count[strings.ToLower(b)]++
	}
	out := make([]string, len(srcs))
	for i, s := range srcs {
		out[i] = base[i] + "-proof.pdf"
		if count[strings.ToLower(base[i])] > 1 {
			sum := sha256.Sum256([]byte(s.Name))
			out[i] = fmt.Sprintf("%s-%x-proof.pdf", base[i], sum[:3])
		}
	}
	return out
}

// readSource reads a source's bytes: embedded, or a regular file on disk (anything
// else is refused without being read), at most one byte past spec's limit so that
// the loader reports an oversize file.
func readSource(s inputs.Source) ([]byte, error) {
	if s.FS != nil {
		return fs.ReadFile(s.FS, s.Path)
	}
	f, err := files.OpenRegular(s.Path)
	if err != nil {
		return nil, err
	}
	defer f.Close()
	data, err := io.ReadAll(io.LimitReader(f, spec.MaxFileBytes+1))
	if err != nil {
		return nil, fmt.Errorf("%s: %w", s.Path, err)
	}
	return data, nil
}
