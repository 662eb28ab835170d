package layout

import (
	"encoding/binary"
	"errors"
	"fmt"
	"sort"

	"golang.org/x/image/font/sfnt"
)

// subsetTTF returns a TrueType font holding only the glyphs of runes (and the glyphs
// their composite glyphs are made of), with a cmap of just those runes. Glyph numbers
// are kept, unused glyphs are emptied, so hmtx and the hinting tables stay valid.
//
// Why: fpdf parses, hashes and re-subsets the whole embedded font in every document.
// With the full Go fonts that is most of the cost of a card file; with a subset of the
// few hundred glyphs a card can use it is a small fraction (see BenchmarkSeason).
// Runes outside the Basic Multilingual Plane are not mapped (cmap format 4).
func subsetTTF(ttf []byte, runes []rune) ([]byte, error) {
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
	for _, t := range []string{"head", "hhea", "maxp", "hmtx", "loca", "glyf", "cmap", "post"} {
		if tables[t] == nil {
			return nil, fmt.Errorf("font has no %q table", t)
		}
	}
	head, maxp := tables["head"], tables["maxp"]
	numGlyphs := int(binary.BigEndian.Uint16(maxp[4:]))
	longLoca := binary.BigEndian.Uint16(head[50:]) == 1
	loca := make([]int, numGlyphs+1)
	for g := 0; g <= numGlyphs; g++ {
		if longLoca {
			loca[g] = int(binary.BigEndian.Uint32(tables["loca"][4*g:]))
		} else {
			loca[g] = 2 * int(binary.BigEndian.Uint16(tables["loca"][2*g:]))
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
		todo = append(todo, components(glyph(g))...)
	}

	var newGlyf []byte
	newLoca := make([]byte, 4*(numGlyphs+1))
	for g := 0; g < numGlyphs; g++ {
		binary.BigEndian.PutUint32(newLoca[4*g:], uint32(len(newGlyf)))
		if keep[g] {
			newGlyf = append(newGlyf, glyph(g)...)
			for len(newGlyf)%4 != 0 {
				newGlyf = append(newGlyf, 0)
			}
		}
	}
	binary.BigEndian.PutUint32(newLoca[4*numGlyphs:], uint32(len(newGlyf)))

	newHead := append([]byte(nil), head...)
	binary.BigEndian.PutUint16(newHead[50:], 1) // long loca
	binary.BigEndian.PutUint32(newHead[8:], 0)  // checkSumAdjustment, set last
	post := append([]byte(nil), tables["post"][:32]...)
	binary.BigEndian.PutUint32(post, 0x00030000) // format 3: no glyph names

	out := map[string][]byte{
		"head": newHead, "hhea": tables["hhea"], "maxp": maxp, "hmtx": tables["hmtx"],
		"loca": newLoca, "glyf": newGlyf, "cmap": cmapFormat4(cmap), "post": post,
	}
	for _, t := range []string{"OS/2", "name", "cvt ", "fpgm", "prep", "gasp"} {
		if tables[t] != nil {
			out[t] = tables[t]
		}
	}
	return writeTTF(out), nil
}

// components lists the glyphs a composite glyph is made of (OpenType glyf table,
// composite glyph description).
func components(g []byte) []int {
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
		out = append(out, int(binary.BigEndian.Uint16(g[p+2:])))
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
