package proof

import (
	"bytes"
	"io/fs"
	"os"
	"strconv"
	"strings"
	"testing"
	"time"

	"github.com/pdfcpu/pdfcpu/pkg/api"
	"github.com/pdfcpu/pdfcpu/pkg/pdfcpu/model"
	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
	"gonum.org/v1/plot/vg"
	"gonum.org/v1/plot/vg/draw"
	"gonum.org/v1/plot/vg/recorder"

	"kneeprint/airfields"
	"kneeprint/cmd/internal/spec"
	"kneeprint/templates"
)

var sampleDate = time.Date(2026, 12, 1, 0, 0, 0, 0, time.UTC)

type input struct {
	fsys fs.FS
	name string
}

var demoInputs = []input{
	{templates.FS, "aircraft/sedgefin-sf2.yaml"},
	{templates.FS, "aircraft/quillwing-qt6.yaml"},
	{airfields.FS, "wrenmoor.yaml"},
	{airfields.FS, "saltpan.yaml"},
	{os.DirFS("testdata"), "planted.yaml"},
}

func render(t *testing.T, in input, opt Options) ([]byte, *spec.Document) {
	t.Helper()
	data, err := fs.ReadFile(in.fsys, in.name)
	require.NoError(t, err)
	doc, err := spec.Parse(in.name, data)
	require.NoError(t, err)
	var buf bytes.Buffer
	require.NoError(t, Write(&buf, Source{Name: in.name, Data: data}, doc, opt))
	return buf.Bytes(), doc
}

// Every proof sheet of the demo files and of the planted table is a valid PDF
// (pdfcpu, strict), its fonts are embedded, and the same file and date give the
// same bytes while another date gives others.
func TestProofPDFs(t *testing.T) {
	for _, in := range demoInputs {
		t.Run(in.name, func(t *testing.T) {
			opt := Options{Date: sampleDate, Version: "test"}
			pdf, _ := render(t, in, opt)
			conf := model.NewDefaultConfiguration()
			conf.ValidationMode = model.ValidationStrict
			require.NoError(t, api.Validate(bytes.NewReader(pdf), conf))
			n, err := api.PageCount(bytes.NewReader(pdf), conf)
			require.NoError(t, err)
			assert.GreaterOrEqual(t, n, 1)
			// Two fonts, both embedded (TrueType font files), none left to the system.
			assert.Equal(t, 2, bytes.Count(pdf, []byte("/FontFile2")), "both Go fonts embedded")
			assert.Equal(t, bytes.Count(pdf, []byte("/Type /FontDescriptor")), bytes.Count(pdf, []byte("/FontFile2")), "every font has its file")
			assert.Equal(t, 2, bytes.Count(pdf, []byte("/Subtype /Type0")), "no other font")

			again, _ := render(t, in, opt)
			assert.True(t, bytes.Equal(pdf, again), "same file and date: same bytes")
			other, _ := render(t, in, Options{Date: sampleDate.AddDate(0, 0, 1), Version: "test"})
			assert.False(t, bytes.Equal(pdf, other), "another date: other bytes")
			letter, _ := render(t, in, Options{Date: sampleDate, Version: "test", Paper: "letter"})
			require.NoError(t, api.Validate(bytes.NewReader(letter), conf))
		})
	}
}

// The page counts follow the content: the table profile has a summary, its table
// page and its plots; the physics profile a summary and its calibration.
func TestProofPages(t *testing.T) {
	conf := model.NewDefaultConfiguration()
	for _, tc := range []struct {
		in   input
		want int
	}{
		{demoInputs[0], 5}, // summary, takeoff table (3 blocks) and plots (3 x 2 panels), landing table and plots
		{demoInputs[1], 2}, // summary, physics
		{demoInputs[2], 2}, // data and runway 07/25, runway 15/33
		{demoInputs[3], 1},
	} {
		pdf, _ := render(t, tc.in, Options{Date: sampleDate})
		n, err := api.PageCount(bytes.NewReader(pdf), conf)
		require.NoError(t, err)
		assert.Equal(t, tc.want, n, tc.in.name)
	}
}

// The planted transposition is listed with its line and column and circled on its
// row's plot with its file line; the clean demo table lists nothing.
func TestProofShowsThePlantedSlip(t *testing.T) {
	data, err := os.ReadFile("testdata/planted.yaml")
	require.NoError(t, err)
	line := 0
	for i, l := range strings.Split(string(data), "\n") {
		if strings.Contains(l, "1580") && strings.HasPrefix(strings.TrimSpace(l), "- [") {
			line = i + 1
		}
	}
	require.NotZero(t, line)
	_, doc := render(t, demoInputs[4], Options{Date: sampleDate})
	flagged, order := flaggedCells(doc.Tables)
	rows := outlierRows(flagged, order)
	require.Len(t, rows, 1)
	assert.Equal(t, "table.weights[2].to_50ft[2][2]", rows[0][1])
	assert.Equal(t, "1580", rows[0][3])
	assert.Contains(t, rows[0][0], strconv.Itoa(line)+":")

	// The plot of that row: a ring around the cell and the label with its line.
	s, err := newSheet(Source{Name: "planted.yaml", Data: data}, "t", Options{Date: sampleDate})
	require.NoError(t, err)
	var to50 = doc.Tables[1]
	xs, unit := temperatureAxis(to50.Temperatures)
	p, err := s.rowPlot(to50, 2, xs, unit, flagged)
	require.NoError(t, err)
	rec := &recorder.Canvas{}
	p.Draw(draw.NewCanvas(rec, 90*vg.Millimeter, 70*vg.Millimeter))
	assert.Contains(t, texts(rec), "line "+strconv.Itoa(line))
	assert.Contains(t, texts(rec), "off its neighbours (file line)")

	_, clean := render(t, demoInputs[0], Options{Date: sampleDate})
	f, o := flaggedCells(clean.Tables)
	assert.Empty(t, outlierRows(f, o))
}

func texts(rec *recorder.Canvas) []string {
	var out []string
	for _, a := range rec.Actions {
		if fs, ok := a.(*recorder.FillString); ok {
			out = append(out, fs.String)
		}
	}
	return out
}
