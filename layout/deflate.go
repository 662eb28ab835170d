package layout

import (
	"bytes"
	"compress/zlib"
	"errors"
	"fmt"
	"io"
	"sort"
	"strconv"
	"sync"
)

// pageDeflateLevel is the zlib level for page content streams. fpdf deflates each
// stream with a new zlib writer at BestSpeed (about 1 ms and 1.2 MB of allocation per
// page, most of a page's cost); deflateStreams reuses writers instead.
const pageDeflateLevel = zlib.BestSpeed

// zlibWriters recycles zlib writers, one pool per level (1 to 9). A writer is Reset
// before each use, so nothing passes between documents; the pools only save the
// allocation.
var zlibWriters [zlib.BestCompression + 1]sync.Pool

func getZlib(w io.Writer, level int) (*zlib.Writer, error) {
	if level < zlib.BestSpeed || level > zlib.BestCompression {
		return nil, fmt.Errorf("zlib level %d: want 1 to 9", level)
	}
	if z, ok := zlibWriters[level].Get().(*zlib.Writer); ok {
		z.Reset(w)
		return z, nil
	}
	return zlib.NewWriterLevel(w, level)
}

// deflateStreams copies the PDF fpdf wrote with compression off to w, deflating
// every stream whose dictionary is exactly <</Length n>> (the page contents) with a
// pooled writer at level, and writing a new cross-reference table for the moved
// objects (ISO 32000-1, 7.5.4 and 7.3.8). Every other byte is copied unchanged.
// The result is what fpdf writes with compression on, at less cost.
func deflateStreams(w io.Writer, pdf []byte, level int) error {
	sx := bytes.LastIndex(pdf, []byte("\nstartxref\n"))
	if sx < 0 {
		return errors.New("pdf: no startxref")
	}
	end := bytes.IndexByte(pdf[sx+11:], '\n')
	if end < 0 {
		return errors.New("pdf: startxref truncated")
	}
	xref, err := strconv.Atoi(string(pdf[sx+11 : sx+11+end]))
	if err != nil || xref < 0 || xref > sx {
		return fmt.Errorf("pdf: bad startxref: %v", err)
	}
	// "xref\n0 N\n" then N entries of 20 bytes; the first is the free entry 0.
	p := pdf[xref:]
	var n int
	if _, err := fmt.Sscanf(string(p[:min(len(p), 32)]), "xref\n0 %d\n", &n); err != nil || n < 1 {
		return fmt.Errorf("pdf: bad xref header: %v", err)
	}
	entries := bytes.IndexByte(p[5:], '\n') + 6
	trailer := entries + 20*n
	if trailer > len(p) {
		return errors.New("pdf: xref truncated")
	}
	type obj struct{ num, off int }
	objs := make([]obj, 0, n-1)
	for i := 1; i < n; i++ {
		e := p[entries+20*i : entries+20*i+20]
		off, err := strconv.Atoi(string(e[:10]))
		if err != nil || off <= 0 || off >= xref || string(e[10:18]) != " 00000 n" {
			return fmt.Errorf("pdf: bad xref entry %d", i)
		}
		objs = append(objs, obj{i, off})
	}
	sort.Slice(objs, func(i, j int) bool { return objs[i].off < objs[j].off })

	cw := &countWriter{w: w}
	cw.Write(pdf[:objs[0].off])
	newOff := make([]int, n)
	var z bytes.Buffer
	zw, err := getZlib(&z, level)
	if err != nil {
		return err
	}
	defer zlibWriters[level].Put(zw)
	for i, o := range objs {
		stop := xref
		if i+1 < len(objs) {
			stop = objs[i+1].off
		}
		span := pdf[o.off:stop]
		newOff[o.num] = cw.n
		data, ok := plainStream(span, o.num)
		if !ok {
			cw.Write(span)
			continue
		}
		z.Reset()
		zw.Reset(&z)
		zw.Write(data)
		if err := zw.Close(); err != nil {
			return err
		}
		fmt.Fprintf(cw, "%d 0 obj\n<</Filter /FlateDecode /Length %d>>\nstream\n", o.num, z.Len())
		cw.Write(z.Bytes())
		cw.Write([]byte("\nendstream\nendobj\n"))
	}
	start := cw.n
	fmt.Fprintf(cw, "xref\n0 %d\n0000000000 65535 f \n", n)
	var line []byte
	for i := 1; i < n; i++ {
		line = strconv.AppendInt(line[:0], int64(newOff[i]), 10)
		cw.Write([]byte("0000000000"[len(line):]))
		cw.Write(line)
		cw.Write([]byte(" 00000 n \n"))
	}
	cw.Write(p[trailer : sx-xref+1])
	fmt.Fprintf(cw, "startxref\n%d\n%%%%EOF\n", start)
	return cw.err
}

// plainStream returns the data of an object "num 0 obj\n<</Length n>>\nstream\n...
// \nendstream\nendobj\n", as fpdf writes an uncompressed stream, and false for any
// other object.
func plainStream(span []byte, num int) ([]byte, bool) {
	head := strconv.Itoa(num) + " 0 obj\n<</Length "
	if !bytes.HasPrefix(span, []byte(head)) {
		return nil, false
	}
	rest := span[len(head):]
	i := bytes.Index(rest, []byte(">>\nstream\n"))
	if i < 0 {
		return nil, false
	}
	length, err := strconv.Atoi(string(rest[:i]))
	if err != nil || length < 0 {
		return nil, false
	}
	rest = rest[i+10:]
	const tail = "\nendstream\nendobj\n"
	if len(rest) != length+len(tail) || string(rest[length:]) != tail {
		return nil, false
	}
	return rest[:length], true
}

// countWriter counts the bytes written and keeps the first error.
type countWriter struct {
	w   io.Writer
	n   int
	err error
}

func (c *countWriter) Write(b []byte) (int, error) {
	if c.err != nil {
		return 0, c.err
	}
	n, err := c.w.Write(b)
	c.n += n
	c.err = err
	return n, err
}
