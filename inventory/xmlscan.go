package inventory

import (
	"io"
	"unicode/utf8"
)

// xmlScan is a quick check of a sheet part's XML, run before the token-by-token
// check of checkPart: it accepts only a part that encoding/xml's strict
// RawToken reads to its end without an error, written in the plain subset a
// spreadsheet program writes (ASCII names, quoted attributes, the five named
// entities and numeric character references, an XML declaration in UTF-8, no
// comments, CDATA sections, DOCTYPE or other processing instructions), and
// counts its elements, depth and far cells as checkPart does. Anything else,
// including every error, makes it unsure, and checkPart then runs the full
// check, so that its outcome and wording are the same as without the quick
// check. It reads the part once, in bytes, without allocating per token.
type xmlScan struct {
	r        io.Reader
	buf      []byte
	pos, end int
	eof      bool
	err      error // a read error other than io.EOF

	depth, elements, far int
}

func newXMLScan(r io.Reader) *xmlScan {
	return &xmlScan{r: r, buf: make([]byte, 64<<10)}
}

// fill makes at least need bytes available after pos unless the part ends
// first; it reports whether at least one byte is available.
func (x *xmlScan) fill(need int) bool {
	for x.end-x.pos < need && !x.eof {
		if x.pos > 0 {
			x.end = copy(x.buf, x.buf[x.pos:x.end])
			x.pos = 0
		}
		n, err := x.r.Read(x.buf[x.end:])
		x.end += n
		if err == io.EOF {
			x.eof = true
		} else if err != nil {
			x.eof, x.err = true, err
		}
	}
	return x.end > x.pos
}

// next returns the next byte, false at the end of the part.
func (x *xmlScan) next() (byte, bool) {
	if x.pos < x.end {
		b := x.buf[x.pos]
		x.pos++
		return b, true
	}
	return x.refill()
}

// refill is next when the buffer is used up.
func (x *xmlScan) refill() (byte, bool) {
	if !x.fill(1) {
		return 0, false
	}
	b := x.buf[x.pos]
	x.pos++
	return b, true
}

func (x *xmlScan) unget() { x.pos-- }

// scan reads the whole part and reports whether it is sure the part is
// well-formed; depth, elements and far are then those of checkPart's count.
func (x *xmlScan) scan() bool {
	first := true
	for {
		b, ok := x.next()
		if !ok {
			return x.err == nil
		}
		if b != '<' {
			x.unget()
			if !x.text(-1) {
				return false
			}
			first = false
			continue
		}
		b, ok = x.next()
		if !ok {
			return false
		}
		switch b {
		case '/':
			if _, ok := x.name(); !ok {
				return false
			}
			x.space()
			if b, ok := x.next(); !ok || b != '>' {
				return false
			}
			x.depth--
		case '?':
			if !first || !x.declaration() {
				return false
			}
		case '!':
			return false
		default:
			x.unget()
			if !x.element() {
				return false
			}
		}
		first = false
	}
}

// declaration reads the rest of an XML declaration after "<?" and accepts
// only the usual UTF-8 ones.
func (x *xmlScan) declaration() bool {
	const maxDecl = 128
	x.fill(maxDecl)
	rest := x.buf[x.pos:x.end]
	for _, d := range []string{
		`xml version="1.0" encoding="UTF-8" standalone="yes"?>`,
		`xml version="1.0" encoding="UTF-8"?>`,
		`xml version="1.0" encoding="utf-8" standalone="yes"?>`,
		`xml version="1.0" encoding="utf-8"?>`,
		`xml version="1.0" encoding="UTF-8" standalone="no"?>`,
		`xml version="1.0"?>`,
	} {
		if len(rest) >= len(d) && string(rest[:len(d)]) == d {
			x.pos += len(d)
			return true
		}
	}
	return false
}

func isNameStart(b byte) bool {
	return b >= 'a' && b <= 'z' || b >= 'A' && b <= 'Z' || b == '_' || b == ':'
}

func isNameRest(b byte) bool {
	return isNameStart(b) || b >= '0' && b <= '9' || b == '.' || b == '-'
}

// name reads an element or attribute name of ASCII name characters with at
// most one colon, and returns its local part's being "c" or "r" as 'c', 'r'
// or 0.
func (x *xmlScan) name() (byte, bool) {
	b, ok := x.next()
	if !ok || !isNameStart(b) {
		return 0, false
	}
	colons, n := 0, 0
	var local [2]byte // the local part, when at most one byte long
	localLen := 0
	for {
		if b == ':' {
			colons++
			localLen = 0
		} else {
			if localLen < len(local) {
				local[localLen] = b
			}
			localLen++
		}
		n++
		if b, ok = x.next(); !ok {
			return 0, false
		}
		if b >= utf8.RuneSelf {
			return 0, false
		}
		if !isNameRest(b) {
			x.unget()
			break
		}
	}
	if colons > 1 {
		return 0, false
	}
	if colons == 1 && localLen == 0 {
		return 0, false // "c:" is a whole Local name; not worth telling apart
	}
	if localLen == 1 && (local[0] == 'c' || local[0] == 'r') && !(colons == 1 && n == 2) {
		return local[0], true
	}
	if localLen == 1 && colons == 1 && n == 2 {
		return 0, false // ":c": Local is the whole name
	}
	return 0, true
}

func (x *xmlScan) space() {
	for {
		b, ok := x.next()
		if !ok {
			return
		}
		if b != ' ' && b != '\r' && b != '\n' && b != '\t' {
			x.unget()
			return
		}
	}
}

// element reads a start tag after "<".
func (x *xmlScan) element() bool {
	kind, ok := x.name()
	if !ok {
		return false
	}
	x.depth++
	x.elements++
	seenR := false
	for {
		x.space()
		b, ok := x.next()
		if !ok {
			return false
		}
		switch b {
		case '/':
			if b, ok := x.next(); !ok || b != '>' {
				return false
			}
			x.depth--
			return true
		case '>':
			return true
		}
		x.unget()
		attr, ok := x.name()
		if !ok {
			return false
		}
		x.space()
		if b, ok := x.next(); !ok || b != '=' {
			return false
		}
		x.space()
		q, ok := x.next()
		if !ok || q != '"' && q != '\'' {
			return false
		}
		if kind == 'c' && attr == 'r' && !seenR {
			seenR = true
			far, ok := x.cellRef(q)
			if !ok {
				return false
			}
			if far {
				if x.far++; x.far > maxFarCells {
					return false
				}
			}
			continue
		}
		if !x.text(int(q)) {
			return false
		}
	}
}

// cellRef reads a cell's r attribute value (plain letters and digits only)
// and reports whether its column lies beyond maxColumns, as farCell does.
func (x *xmlScan) cellRef(quote byte) (bool, bool) {
	col, letters := 0, true
	for {
		b, ok := x.next()
		if !ok {
			return false, false
		}
		switch {
		case b == quote:
			return col > maxColumns, true
		case b >= 'A' && b <= 'Z':
			if letters && col <= maxColumns {
				col = col*26 + int(b-'A') + 1
			}
		case b >= '0' && b <= '9' || b >= 'a' && b <= 'z':
			letters = false
		default:
			return false, false
		}
	}
}

// text reads character data up to '<' (quote < 0) or an attribute value up
// to its closing quote, checking its characters and entities as
// encoding/xml's text does.
func (x *xmlScan) text(quote int) bool {
	var b0, b1 byte
	for {
		b, ok := x.next()
		if !ok {
			return quote < 0 && x.err == nil
		}
		switch {
		case quote < 0 && b == '>' && b0 == ']' && b1 == ']':
			return false
		case b == '<':
			if quote >= 0 {
				return false
			}
			x.unget()
			return true
		case quote >= 0 && int(b) == quote:
			return true
		case b == '&':
			if !x.entity() {
				return false
			}
			b0, b1 = 0, 0
			continue
		case b >= utf8.RuneSelf:
			x.unget()
			x.fill(utf8.UTFMax)
			r, size := utf8.DecodeRune(x.buf[x.pos:x.end])
			if r == utf8.RuneError && size == 1 || !isXMLChar(r) {
				return false
			}
			x.pos += size
		case b < 0x20 && b != '\t' && b != '\n' && b != '\r':
			return false
		}
		b0, b1 = b1, b
	}
}

// entity reads an entity after '&': one of the five named ones or a numeric
// character reference to a character XML allows.
func (x *xmlScan) entity() bool {
	x.fill(12)
	rest := x.buf[x.pos:x.end]
	for _, e := range []string{"amp;", "lt;", "gt;", "quot;", "apos;"} {
		if len(rest) >= len(e) && string(rest[:len(e)]) == e {
			x.pos += len(e)
			return true
		}
	}
	if len(rest) < 3 || rest[0] != '#' {
		return false
	}
	i, base := 1, rune(10)
	if rest[1] == 'x' {
		i, base = 2, 16
	}
	var v rune
	start := i
	for ; i < len(rest) && i-start < 7; i++ {
		c := rest[i]
		switch {
		case c >= '0' && c <= '9':
			v = v*base + rune(c-'0')
		case base == 16 && c >= 'a' && c <= 'f':
			v = v*base + rune(c-'a'+10)
		case base == 16 && c >= 'A' && c <= 'F':
			v = v*base + rune(c-'A'+10)
		default:
			goto done
		}
	}
done:
	if i == start || i >= len(rest) || rest[i] != ';' || !isXMLChar(v) || v >= 0xD800 && v <= 0xDFFF {
		return false
	}
	x.pos += i + 1
	return true
}

// isXMLChar is encoding/xml's isInCharacterRange.
func isXMLChar(r rune) bool {
	return r == 0x09 || r == 0x0A || r == 0x0D ||
		r >= 0x20 && r <= 0xD7FF ||
		r >= 0xE000 && r <= 0xFFFD ||
		r >= 0x10000 && r <= 0x10FFFF
}
