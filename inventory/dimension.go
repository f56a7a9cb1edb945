package inventory

import (
	"bytes"
	"io"
)

// dimensionScanBytes is how much of a sheet part is searched for its
// <dimension> element, which stands before <sheetData> (ECMA-376 Part 1,
// 18.3.1.35 and the order of CT_Worksheet): the sheet's properties and views
// come before it and take well under this.
const dimensionScanBytes = 16 << 10

// declaredLastRow returns the last row the sheet part's <dimension ref="A1:K5001"/>
// declares (5001), or 0 when the part has none or it cannot be read. It is a
// writer's claim, not a count: used for the progress line's estimate only,
// never to judge or to stop reading.
func (p *xlsxPkg) declaredLastRow(part string) int {
	rc, err := p.openPart(part)
	if err != nil {
		return 0
	}
	defer rc.Close()
	buf, _ := io.ReadAll(io.LimitReader(rc, dimensionScanBytes))
	return dimensionLastRow(buf)
}

// dimensionLastRow finds the <dimension ref="..."/> element in the start of a
// sheet part and returns the row of the reference's end cell; 0 when absent
// or malformed.
func dimensionLastRow(b []byte) int {
	i := bytes.Index(b, []byte("dimension "))
	if i < 1 || (b[i-1] != '<' && b[i-1] != ':') {
		return 0
	}
	if j := bytes.Index(b, []byte("sheetData")); j >= 0 && j < i {
		return 0
	}
	b = b[i:]
	if end := bytes.IndexByte(b, '>'); end >= 0 {
		b = b[:end]
	} else {
		return 0
	}
	k := bytes.Index(b, []byte("ref="))
	if k < 0 || k+5 > len(b) {
		return 0
	}
	q := b[k+4]
	if q != '"' && q != '\'' {
		return 0
	}
	ref := b[k+5:]
	if e := bytes.IndexByte(ref, q); e >= 0 {
		ref = ref[:e]
	} else {
		return 0
	}
	if c := bytes.LastIndexByte(ref, ':'); c >= 0 {
		ref = ref[c+1:]
	}
	_, row, ok := parseCellRef(ref)
	if !ok || row < 1 || row > sheetMaxRow {
		return 0
	}
	return row
}

// countedRows counts the <row> elements of a sheet part by one quick pass
// over its unpacked bytes (no parsing), for a sheet that declares no range;
// 0 when the part cannot be read or unpacks to more than it declared.
func (p *xlsxPkg) countedRows(part string) int {
	zf := p.files[partKey(part)]
	if zf == nil {
		return 0
	}
	rc, err := p.openPart(part)
	if err != nil {
		return 0
	}
	defer rc.Close()
	return countRowTags(io.LimitReader(rc, int64(min(zf.UncompressedSize64, 1<<40))+1), int64(zf.UncompressedSize64))
}

// countRowTags counts "<row" and "<x:row" start tags (followed by a space,
// '>' or '/') in r; 0 when r holds more than limit bytes or fails.
func countRowTags(r io.Reader, limit int64) int {
	const keep = 32 // bytes carried over a chunk boundary: "<" and a prefix before "row"
	buf := make([]byte, 64<<10)
	var carry []byte
	n, total := 0, int64(0)
	for {
		m, err := r.Read(buf)
		total += int64(m)
		if total > limit {
			return 0
		}
		chunk := append(carry, buf[:m]...)
		n += rowTagsIn(chunk, len(carry))
		if len(chunk) > keep {
			carry = append(carry[:0], chunk[len(chunk)-keep:]...)
		} else {
			carry = append(carry[:0], chunk...)
		}
		if err == io.EOF {
			return n
		}
		if err != nil {
			return 0
		}
	}
}

// rowTagsIn counts row start tags in b whose following byte lies at or after
// from (so a tag split over two chunks is counted once, in the second).
func rowTagsIn(b []byte, from int) int {
	n := 0
	for i := 0; ; {
		j := bytes.Index(b[i:], []byte("row"))
		if j < 0 {
			return n
		}
		k := i + j
		i = k + 3
		if k == 0 || k+3 >= len(b) || k+3 < from {
			continue
		}
		switch b[k-1] {
		case '<':
		case ':': // a prefixed tag: "<x:row", not the end tag "</x:row>"
			p := k - 2
			for p >= 0 && (b[p] >= 'a' && b[p] <= 'z' || b[p] >= 'A' && b[p] <= 'Z' || b[p] >= '0' && b[p] <= '9') {
				p--
			}
			if p < 0 || b[p] != '<' {
				continue
			}
		default:
			continue
		}
		switch b[k+3] {
		case ' ', '>', '/', '\t', '\n', '\r':
			n++
		}
	}
}
