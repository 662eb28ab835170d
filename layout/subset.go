package layout

import (
	"encoding/binary"
	"errors"
	"fmt"
	"sort"

	"golang.org/x/image/font/sfnt"
)

// subsetTTF returns a TrueType font holding only the glyphs of runes (and the glyphs
// their composite glyphs are made of), numbered afresh from 1 in the order of the
// original font (glyph 0 stays .notdef), with a cmap of just those runes. Outlines,
// advances and hinting instructions are copied unchanged; the name table keeps the
// Windows records of the names, the copyright and the licence (OpenType "name"
// table, name IDs 0-6, 13, 14) and drops the rest.
//
// Why: a PDF embeds the font program; a card uses about 70 of the Go fonts' 712
// glyphs, and with the glyphs renumbered the metrics (hmtx) and index (loca) tables
// shrink with them. Runes outside the Basic Multilingual Plane are not mapped (cmap
// format 4).
func subsetTTF(ttf []byte, runes []rune) ([]byte, error) {
	tables, err := ttfTables(ttf)
	if err != nil {
		return nil, err
	}
	for _, t := range []string{"head", "hhea", "maxp", "hmtx", "loca", "glyf", "cmap", "post"} {
		if tables[t] == nil {
			return nil, fmt.Errorf("font has no %q table", t)
		}
	}
	head, hhea, maxp, hmtx := tables["head"], tables["hhea"], tables["maxp"], tables["hmtx"]
	if len(head) < 54 || len(hhea) < 36 || len(maxp) < 6 || len(tables["post"]) < 32 {
		return nil, errors.New("font header tables truncated")
	}
	be := binary.BigEndian
	numGlyphs := int(be.Uint16(maxp[4:]))
	numHMetrics := int(be.Uint16(hhea[34:]))
	longLoca := be.Uint16(head[50:]) == 1
	if numHMetrics < 1 || numHMetrics > numGlyphs || len(hmtx) < 4*numHMetrics+2*(numGlyphs-numHMetrics) {
		return nil, errors.New("font hmtx table truncated")
	}
	if (longLoca && len(tables["loca"]) < 4*(numGlyphs+1)) || (!longLoca && len(tables["loca"]) < 2*(numGlyphs+1)) {
		return nil, errors.New("font loca table truncated")
	}
	loca := make([]int, numGlyphs+1)
	for g := 0; g <= numGlyphs; g++ {
		if longLoca {
			loca[g] = int(be.Uint32(tables["loca"][4*g:]))
		} else {
			loca[g] = 2 * int(be.Uint16(tables["loca"][2*g:]))
		}
	}
	glyf := tables["glyf"]
	glyph := func(g int) []byte {
		if g < 0 || g >= numGlyphs || loca[g] >= loca[g+1] || loca[g+1] > len(glyf) {
			return nil
		}
		return glyf[loca[g]:loca[g+1]]
	}

	f, err := sfnt.Parse(ttf)
	if err != nil {
		return nil, err
	}
	var buf sfnt.Buffer
	keep := map[int]bool{0: true}
	cmap := map[rune]int{}
	var todo []int
	for _, r := range runes {
		if r > 0xFFFF {
			continue
		}
		gi, err := f.GlyphIndex(&buf, r)
		if err != nil || gi == 0 {
			continue
		}
		cmap[r] = int(gi)
		todo = append(todo, int(gi))
	}
	for len(todo) > 0 {
		g := todo[len(todo)-1]
		todo = todo[:len(todo)-1]
		if keep[g] && g != 0 {
			continue
		}
		keep[g] = true
		for _, off := range componentOffsets(glyph(g)) {
			todo = append(todo, int(be.Uint16(glyph(g)[off:])))
		}
	}
	old := make([]int, 0, len(keep)) // old glyph number by new one
	for g := range keep {
		if g < numGlyphs {
			old = append(old, g)
		}
	}
	sort.Ints(old)
	renum := make(map[int]int, len(old))
	for n, g := range old {
		renum[g] = n
	}
	for r, g := range cmap {
		cmap[r] = renum[g]
	}

	n := len(old)
	var newGlyf []byte
	newLoca := make([]byte, 4*(n+1))
	newHmtx := make([]byte, 4*n)
	for i, g := range old {
		be.PutUint32(newLoca[4*i:], uint32(len(newGlyf)))
		start := len(newGlyf)
		newGlyf = append(newGlyf, glyph(g)...)
		for _, off := range componentOffsets(newGlyf[start:]) {
			c := int(be.Uint16(newGlyf[start+off:]))
			be.PutUint16(newGlyf[start+off:], uint16(renum[c]))
		}
		for len(newGlyf)%4 != 0 {
			newGlyf = append(newGlyf, 0)
		}
		// Glyphs past numberOfHMetrics share the last advance (OpenType hmtx table).
		var adv, lsb []byte
		if g < numHMetrics {
			adv, lsb = hmtx[4*g:], hmtx[4*g+2:]
		} else {
			adv, lsb = hmtx[4*(numHMetrics-1):], hmtx[4*numHMetrics+2*(g-numHMetrics):]
		}
		copy(newHmtx[4*i:4*i+2], adv[:2])
		copy(newHmtx[4*i+2:4*i+4], lsb[:2])
	}
	be.PutUint32(newLoca[4*n:], uint32(len(newGlyf)))

	newHead := append([]byte(nil), head...)
	be.PutUint16(newHead[50:], 1) // long loca
	be.PutUint32(newHead[8:], 0)  // checkSumAdjustment, set last
	newHhea := append([]byte(nil), hhea...)
	be.PutUint16(newHhea[34:], uint16(n))
	newMaxp := append([]byte(nil), maxp...)
	be.PutUint16(newMaxp[4:], uint16(n))
	post := append([]byte(nil), tables["post"][:32]...)
	be.PutUint32(post, 0x00030000) // format 3: no glyph names

	out := map[string][]byte{
		"head": newHead, "hhea": newHhea, "maxp": newMaxp, "hmtx": newHmtx,
		"loca": newLoca, "glyf": newGlyf, "cmap": cmapFormat4(cmap), "post": post,
	}
	if t := tables["name"]; t != nil {
		out["name"] = trimName(t)
	}
	for _, t := range []string{"OS/2", "cvt ", "fpgm", "prep", "gasp"} {
		if tables[t] != nil {
			out[t] = tables[t]
		}
	}
	return writeTTF(out), nil
}

// ttfTables returns the tables of a TrueType font file by tag (OpenType "Table
// directory"), each a slice of ttf.
func ttfTables(ttf []byte) (map[string][]byte, error) {
	if len(ttf) < 12 {
		return nil, errors.New("font too short")
	}
	numTables := int(binary.BigEndian.Uint16(ttf[4:]))
	tables := map[string][]byte{}
	for i := 0; i < numTables; i++ {
		rec := 12 + 16*i
		if rec+16 > len(ttf) {
			return nil, errors.New("font table directory truncated")
		}
		tag := string(ttf[rec : rec+4])
		off := int(binary.BigEndian.Uint32(ttf[rec+8:]))
		n := int(binary.BigEndian.Uint32(ttf[rec+12:]))
		if off < 0 || n < 0 || off+n > len(ttf) {
			return nil, fmt.Errorf("font table %q out of bounds", tag)
		}
		tables[tag] = ttf[off : off+n]
	}
	return tables, nil
}

// componentOffsets returns, for a composite glyph, the byte offset of each
// component's glyph index (OpenType glyf table, composite glyph description);
// nothing for a simple or empty glyph.
func componentOffsets(g []byte) []int {
	if len(g) < 10 || int16(binary.BigEndian.Uint16(g)) >= 0 {
		return nil
	}
	const (
		argsAreWords = 0x0001
		haveScale    = 0x0008
		moreComps    = 0x0020
		haveXYScale  = 0x0040
		haveTwoByTwo = 0x0080
	)
	var out []int
	p := 10
	for p+4 <= len(g) {
		flags := binary.BigEndian.Uint16(g[p:])
		out = append(out, p+2)
		p += 4
		if flags&argsAreWords != 0 {
			p += 4
		} else {
			p += 2
		}
		switch {
		case flags&haveScale != 0:
			p += 2
		case flags&haveXYScale != 0:
			p += 4
		case flags&haveTwoByTwo != 0:
			p += 8
		}
		if flags&moreComps == 0 {
			break
		}
	}
	return out
}

// trimName keeps the Windows-platform records (platform 3) of name IDs 0-6 (copyright,
// family, subfamily, unique ID, full name, version, PostScript name) and 13-14 (the
// licence and its URL) of a format 0 name table (OpenType "name" table); any other
// table is returned unchanged.
func trimName(t []byte) []byte {
	be := binary.BigEndian
	if len(t) < 6 || be.Uint16(t) != 0 {
		return t
	}
	count, strOff := int(be.Uint16(t[2:])), int(be.Uint16(t[4:]))
	if 6+12*count > len(t) || strOff > len(t) {
		return t
	}
	type rec struct{ head, s []byte }
	var keep []rec
	for i := 0; i < count; i++ {
		r := t[6+12*i : 6+12*i+12]
		platform, id := be.Uint16(r), be.Uint16(r[6:])
		n, off := int(be.Uint16(r[8:])), strOff+int(be.Uint16(r[10:]))
		if off+n > len(t) {
			return t
		}
		if platform == 3 && (id <= 6 || id == 13 || id == 14) {
			keep = append(keep, rec{r, t[off : off+n]})
		}
	}
	out := make([]byte, 6+12*len(keep))
	be.PutUint16(out[2:], uint16(len(keep)))
	be.PutUint16(out[4:], uint16(len(out)))
	var storage []byte
	for i, r := range keep {
		h := out[6+12*i:]
		copy(h, r.head[:8])
		be.PutUint16(h[8:], uint16(len(r.s)))
		be.PutUint16(h[10:], uint16(len(storage)))
		storage = append(storage, r.s...)
	}
	return append(out, storage...)
}

// cmapFormat4 builds a cmap table with one Windows Unicode BMP subtable (platform 3,
// encoding 1, format 4), one segment per rune.
func cmapFormat4(m map[rune]int) []byte {
	runes := make([]int, 0, len(m)+1)
	for r := range m {
		runes = append(runes, int(r))
	}
	sort.Ints(runes)
	segs := len(runes) + 1
	sub := make([]byte, 16+8*segs)
	be := binary.BigEndian
	be.PutUint16(sub[0:], 4)
	be.PutUint16(sub[2:], uint16(len(sub)))
	be.PutUint16(sub[6:], uint16(2*segs))
	sr := 2
	sel := 0
	for sr*2 <= 2*segs {
		sr *= 2
		sel++
	}
	be.PutUint16(sub[8:], uint16(sr))
	be.PutUint16(sub[10:], uint16(sel))
	be.PutUint16(sub[12:], uint16(2*segs-sr))
	ends, starts := 14, 16+2*segs
	deltas, ranges := starts+2*segs, starts+4*segs
	for i, r := range runes {
		be.PutUint16(sub[ends+2*i:], uint16(r))
		be.PutUint16(sub[starts+2*i:], uint16(r))
		be.PutUint16(sub[deltas+2*i:], uint16(m[rune(r)]-r))
		be.PutUint16(sub[ranges+2*i:], 0)
	}
	last := segs - 1
	be.PutUint16(sub[ends+2*last:], 0xFFFF)
	be.PutUint16(sub[starts+2*last:], 0xFFFF)
	be.PutUint16(sub[deltas+2*last:], 1)
	head := make([]byte, 12)
	be.PutUint16(head[2:], 1)
	be.PutUint16(head[4:], 3)
	be.PutUint16(head[6:], 1)
	be.PutUint32(head[8:], 12)
	return append(head, sub...)
}

// writeTTF assembles tables into a font file with checksums (OpenType "Table
// directory" and head.checkSumAdjustment).
func writeTTF(tables map[string][]byte) []byte {
	tags := make([]string, 0, len(tables))
	for t := range tables {
		tags = append(tags, t)
	}
	sort.Strings(tags)
	n := len(tags)
	be := binary.BigEndian
	out := make([]byte, 12+16*n)
	be.PutUint32(out[0:], 0x00010000)
	be.PutUint16(out[4:], uint16(n))
	sr, sel := 1, 0
	for sr*2 <= n {
		sr *= 2
		sel++
	}
	be.PutUint16(out[6:], uint16(16*sr))
	be.PutUint16(out[8:], uint16(sel))
	be.PutUint16(out[10:], uint16(16*n-16*sr))
	headOff := 0
	for i, t := range tags {
		data := tables[t]
		rec := 12 + 16*i
		copy(out[rec:], t)
		be.PutUint32(out[rec+4:], checksum(data))
		be.PutUint32(out[rec+8:], uint32(len(out)))
		be.PutUint32(out[rec+12:], uint32(len(data)))
		if t == "head" {
			headOff = len(out)
		}
		out = append(out, data...)
		for len(out)%4 != 0 {
			out = append(out, 0)
		}
	}
	be.PutUint32(out[headOff+8:], 0xB1B0AFBA-checksum(out))
	return out
}

func checksum(b []byte) uint32 {
	var sum uint32
	for i := 0; i < len(b); i += 4 {
		var w [4]byte
		copy(w[:], b[i:])
		sum += binary.BigEndian.Uint32(w[:])
	}
	return sum
}
