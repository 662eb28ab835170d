package proof

import (
	"bytes"
	"io/fs"
	"strings"
	"os"
	"testing"
	"time"

	"github.com/stretchr/testify/require"

	"kneeprint/airfields"
	"kneeprint/cmd/internal/spec"
	"kneeprint/templates"
)

func TestScratch(t *testing.T) {
	for _, name := range []string{"aircraft/sedgefin-sf2.yaml", "aircraft/quillwing-qt6.yaml", "wrenmoor.yaml", "saltpan.yaml"} {
		var fsys fs.FS = templates.FS
		if !strings.HasPrefix(name, "aircraft") {
			fsys = airfields.FS
		}
		data, err := fs.ReadFile(fsys, name)
		require.NoError(t, err)
		doc, err := spec.Parse(name, data)
		require.NoError(t, err)
		var buf bytes.Buffer
		require.NoError(t, Write(&buf, Source{Name: name, Data: data}, doc, Options{Date: time.Date(2026, 12, 1, 0, 0, 0, 0, time.UTC), Version: "sample"}))
		require.NoError(t, os.WriteFile("/tmp/proof-"+strings.TrimPrefix(name, "aircraft/")+".pdf", buf.Bytes(), 0o644))
	}
}
