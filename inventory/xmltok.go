package inventory

import (
	"bytes"
	"fmt"
	"io"
	"regexp"
	"strings"
	"unicode/utf8"
)

// xmlTok reads one XML part of a workbook as a stream of tokens (start tags
// with their attributes, end tags, character data) in one pass over its
// bytes, and is at the same time the part's safety check: it refuses a part
// that is not well-formed (tags not closed in order, a part cut short, bad
// characters or entities, more than one root), a DOCTYPE (so no entity is
// ever declared or expanded), a text encoding other than UTF-8 (a UTF-16 part
// is named as such), a tag longer than maxTagLen, a run of text longer than
// maxTextRun and elements nested deeper than maxDepth, before any of them
// costs memory. Its faults are *xmlFault. Names are matched by their local
// part (after the last colon), as a spreadsheet's own namespaces are.
//
// Source: W3C XML 1.0 (Fifth Edition): 2.2 (Char), 2.3 (names), 2.4 (]]> in
// character data), 2.8 (prolog, DOCTYPE), 4.1 (character and entity
// references), 4.3.3 (encodings); and ECMA-376 Part 2 (OPC), which has
// packages' XML parts in UTF-8 or UTF-16.
type xmlTok struct {
	r        io.Reader
	buf      []byte
	pos, end int
	eof      bool
	rerr     error // a read error other than io.EOF
	consumed int64 // bytes dropped from the front of buf

	// The current token.
	kind  tokKind
	local []byte  // local name of a start or end tag (a slice of buf)
	empty bool    // a start tag closed by "/>" (its end tag follows as a token)
	attrs []xattr // of a start tag (slices of buf or of scratch)
	text  []byte  // character data, entities decoded (valid until the next call)

	stack    []byte // qualified names of the open elements, one after another
	stackEnd []int
	pendEnd  bool // a "/>" start tag was returned; its end tag comes next
	rootDone bool
	started  bool
	scratch  []byte
}

type tokKind uint8

const (
	tokNone tokKind = iota
	tokStart
	tokEnd
	tokText
	tokEOF
)

type xattr struct{ local, value []byte }

// Bounds of a part's XML.
const (
	// maxTextRun is the longest run of character data or attribute value a
	// part may hold. A cell holds at most 32767 characters (4 bytes each in
	// UTF-8, up to 10 as a character reference), so 4 MiB is far above any
	// real cell. // common practice, no source
	maxTextRun = 4 << 20
	// maxTagLen bounds one tag with its attributes (a sheet's tags are tens
	// of bytes). // common practice, no source
	maxTagLen = 1 << 20
	// maxDepth bounds the nesting of elements (a sheet nests six deep).
	// // common practice, no source
	maxDepth = 256
	// maxNameLen bounds an element's name, which is kept while the element
	// is open (a workbook's names are a few bytes). // common practice, no source
	maxNameLen = 1024
)

// xmlFault is a part that is not the XML this reader reads.
type xmlFault struct {
	msg string // "is cut short", "is UTF-16 text ...", "is malformed XML (...)"
}

func (e *xmlFault) Error() string { return e.msg }

func newXMLTok(r io.Reader) *xmlTok {
	return &xmlTok{r: r, buf: make([]byte, 64<<10)}
}

// reset lets one tokenizer read another part, keeping its buffers.
func (x *xmlTok) reset(r io.Reader) {
	buf, scratch, attrs, text, stack, stackEnd := x.buf, x.scratch, x.attrs, x.text, x.stack, x.stackEnd
	*x = xmlTok{r: r, buf: buf, scratch: scratch[:0], attrs: attrs[:0], text: text[:0], stack: stack[:0], stackEnd: stackEnd[:0]}
}

func malformed(format string, args ...any) *xmlFault {
	return &xmlFault{msg: "is malformed XML (" + fmt.Sprintf(format, args...) + ")"}
}

var errCutShort = &xmlFault{msg: "is cut short"}

// fill makes at least need bytes available after pos unless the part ends
// first, moving the unread bytes to the front of buf (slices into buf held
// by the caller become invalid) and growing buf up to need. It returns the
// bytes available.
func (x *xmlTok) fill(need int) int {
	for x.end-x.pos < need && !x.eof {
		if x.pos > 0 {
			x.consumed += int64(x.pos)
			x.end = copy(x.buf, x.buf[x.pos:x.end])
			x.pos = 0
		}
		if x.end == len(x.buf) {
			nb := make([]byte, 2*len(x.buf))
			copy(nb, x.buf[:x.end])
			x.buf = nb
		}
		n, err := x.r.Read(x.buf[x.end:])
		x.end += n
		if err == io.EOF {
			x.eof = true
		} else if err != nil {
			x.eof, x.rerr = true, err
		}
	}
	return x.end - x.pos
}

// offset is the number of bytes of the part read up to the current position.
func (x *xmlTok) offset() int64 { return x.consumed + int64(x.pos) }

// attr returns the value of the current start tag's attribute with the given
// local name.
func (x *xmlTok) attr(local string) ([]byte, bool) {
	for _, a := range x.attrs {
		if string(a.local) == local {
			return a.value, true
		}
	}
	return nil, false
}

// depth is the number of open elements.
func (x *xmlTok) depth() int { return len(x.stackEnd) }

// next reads the next token. At the end of a well-formed part it returns
// tokEOF; a fault is an *xmlFault, a failure to read the part the read error.
func (x *xmlTok) next() (tokKind, error) {
	if x.pendEnd {
		x.pendEnd = false
		x.pop()
		x.kind = tokEnd
		return tokEnd, nil
	}
	if !x.started {
		x.started = true
		if err := x.prolog(); err != nil {
			return tokNone, err
		}
	}
	for {
		if x.pos >= x.end && x.fill(1) == 0 {
			if x.rerr != nil {
				return tokNone, x.rerr
			}
			if x.depth() > 0 || !x.rootDone {
				return tokNone, errCutShort
			}
			x.kind = tokEOF
			return tokEOF, nil
		}
		if x.buf[x.pos] != '<' {
			if err := x.charData(); err != nil {
				return tokNone, err
			}
			if x.depth() == 0 {
				if len(bytes.TrimLeft(x.text, " \t\r\n")) > 0 {
					return tokNone, malformed("text outside the root element")
				}
				continue
			}
			x.kind = tokText
			return tokText, nil
		}
		if x.fill(2) < 2 {
			return tokNone, errCutShort
		}
		switch x.buf[x.pos+1] {
		case '/':
			return x.endTag()
		case '?':
			if err := x.skipPI(); err != nil {
				return tokNone, err
			}
		case '!':
			k, err := x.bang()
			if err != nil || k != tokNone {
				return k, err
			}
		default:
			return x.startTag()
		}
	}
}

// prolog checks the part's first bytes: a byte-order mark or the bytes of
// UTF-16 text, and the encoding of an XML declaration.
func (x *xmlTok) prolog() error {
	n := x.fill(4)
	b := x.buf[x.pos : x.pos+n]
	switch {
	case n == 0:
		return &xmlFault{msg: "is empty"}
	case bytes.HasPrefix(b, []byte{0xFE, 0xFF}), bytes.HasPrefix(b, []byte{0xFF, 0xFE}),
		n >= 2 && (b[0] == '<' && b[1] == 0 || b[0] == 0 && b[1] == '<'):
		return &xmlFault{msg: "is UTF-16 text, which this program does not read; open the workbook in a spreadsheet program and save it as a normal .xlsx (Excel Workbook)"}
	case bytes.HasPrefix(b, []byte{0xEF, 0xBB, 0xBF}):
		x.pos += 3
	}
	x.fill(512)
	rest := x.buf[x.pos:x.end]
	if !bytes.HasPrefix(rest, []byte("<?xml")) || len(rest) > 5 && !isXMLSpace(rest[5]) && rest[5] != '?' {
		return nil
	}
	end := bytes.Index(rest, []byte("?>"))
	if end < 0 {
		return malformed("the XML declaration is not closed")
	}
	m := xmlDecl.FindSubmatch(rest[:end+2])
	if m == nil {
		return malformed("a bad XML declaration")
	}
	if enc := strings.ToLower(string(append(m[1], m[2]...))); enc != "" {
		switch enc {
		case "utf-8", "utf8", "us-ascii", "ascii":
		default:
			if strings.Contains(enc, "16") {
				return &xmlFault{msg: "is declared as UTF-16 text, which this program does not read; open the workbook in a spreadsheet program and save it as a normal .xlsx (Excel Workbook)"}
			}
			return &xmlFault{msg: fmt.Sprintf("is written in the text encoding %q, which this program does not read (it reads UTF-8, which spreadsheet programs write); open the workbook in a spreadsheet program and save it as a normal .xlsx", short(enc, 30))}
		}
	}
	x.pos += end + 2
	return nil
}

// xmlDecl is the XML declaration (XML 1.0, 2.8 and 4.3.3), version 1.0,
// with the encoding in group 1 or 2.
var xmlDecl = regexp.MustCompile(`^<\?xml[ \t\r\n]+version[ \t\r\n]*=[ \t\r\n]*(?:"1\.0"|'1\.0')` +
	`(?:[ \t\r\n]+encoding[ \t\r\n]*=[ \t\r\n]*(?:"([A-Za-z][A-Za-z0-9._-]*)"|'([A-Za-z][A-Za-z0-9._-]*)'))?` +
	`(?:[ \t\r\n]+standalone[ \t\r\n]*=[ \t\r\n]*(?:"(?:yes|no)"|'(?:yes|no)'))?[ \t\r\n]*\?>$`)

func isXMLSpace(b byte) bool { return b == ' ' || b == '\t' || b == '\r' || b == '\n' }

// skipPI skips a processing instruction "<?...?>" (an XML declaration after
// the start is an error).
func (x *xmlTok) skipPI() error {
	x.fill(64)
	if rest := x.buf[x.pos:x.end]; bytes.HasPrefix(rest, []byte("<?xml")) && (len(rest) == 5 || isXMLSpace(rest[5]) || rest[5] == '?') {
		return malformed("an XML declaration not at the start")
	}
	if end, _, ok := readName(x.buf[x.pos+2:x.end], 0); !ok || end+2 >= x.end-x.pos ||
		!isXMLSpace(x.buf[x.pos+2+end]) && x.buf[x.pos+2+end] != '?' || strings.EqualFold(string(x.buf[x.pos+2:x.pos+2+end]), "xml") {
		return malformed("a bad processing instruction")
	}
	return x.skipPast("?>", "a processing instruction")
}

// skipPast moves past the next occurrence of end, within maxTextRun bytes.
func (x *xmlTok) skipPast(end, what string) error {
	x.pos += 2
	for {
		i := bytes.Index(x.buf[x.pos:x.end], []byte(end))
		if i >= 0 {
			x.pos += i + len(end)
			return nil
		}
		keep := max(0, x.end-x.pos-len(end)+1)
		if keep > maxTextRun {
			return &xmlFault{msg: fmt.Sprintf("holds %s longer than %s", what, sizeText(maxTextRun))}
		}
		// drop what was searched, keep the last bytes that may start end
		x.pos += keep
		if avail := x.end - x.pos; x.fill(avail+1) <= avail {
			if x.rerr != nil {
				return x.rerr
			}
			return errCutShort
		}
	}
}

// bang reads "<!": a comment, a CDATA section (returned as text) or a
// DOCTYPE (refused).
func (x *xmlTok) bang() (tokKind, error) {
	x.fill(9)
	rest := x.buf[x.pos:x.end]
	switch {
	case bytes.HasPrefix(rest, []byte("<!--")):
		x.pos += 2
		return tokNone, x.skipPast("-->", "a comment")
	case bytes.HasPrefix(rest, []byte("<![CDATA[")):
		if x.depth() == 0 {
			return tokNone, malformed("a CDATA section outside the root element")
		}
		x.pos += 7
		start := x.pos + 2
		x.text = x.text[:0]
		for {
			i := bytes.Index(x.buf[start:x.end], []byte("]]>"))
			if i >= 0 {
				if err := x.appendChars(x.buf[start : start+i]); err != nil {
					return tokNone, err
				}
				x.pos = start + i + 3
				break
			}
			n := max(0, x.end-start-2)
			if err := x.appendChars(x.buf[start : start+n]); err != nil {
				return tokNone, err
			}
			x.pos = start + n
			if avail := x.end - x.pos; x.fill(avail+1) <= avail {
				if x.rerr != nil {
					return tokNone, x.rerr
				}
				return tokNone, errCutShort
			}
			start = x.pos
		}
		x.kind = tokText
		return tokText, nil
	case bytes.HasPrefix(rest, []byte("<!DOCTYPE")), bytes.HasPrefix(rest, []byte("<!ENTITY")):
		return tokNone, &xmlFault{msg: "declares a DOCTYPE or entities, which a workbook never holds, and is refused as malformed (a damaged or hostile file)"}
	}
	return tokNone, malformed("an unknown <! declaration")
}

// appendChars appends raw CDATA bytes to text, checking the characters.
func (x *xmlTok) appendChars(b []byte) error {
	if len(x.text)+len(b) > maxTextRun {
		return &xmlFault{msg: fmt.Sprintf("holds more than %s of text without markup (a damaged or hostile file)", sizeText(maxTextRun))}
	}
	for i := 0; i < len(b); {
		c := b[i]
		if c < utf8.RuneSelf {
			if c < 0x20 && c != '\t' && c != '\n' && c != '\r' {
				return malformed("the control character %#02x", c)
			}
			i++
			continue
		}
		r, size := utf8.DecodeRune(b[i:])
		if r == utf8.RuneError && size == 1 || !isXMLChar(r) {
			return malformed("bytes that are not UTF-8 text")
		}
		i += size
	}
	x.text = append(x.text, b...)
	return nil
}

// charData reads character data up to the next '<' into text, decoding
// entities and turning "\r\n" and a lone "\r" into "\n" as XML does.
//
// A bad character is reported at the end of its run of text, so that a run
// of zero bytes (a bomb) is named for its length when it is longer than
// maxTextRun.
func (x *xmlTok) charData() error {
	x.text = x.text[:0]
	var b0, b1 byte
	var bad error
	for {
		if x.pos >= x.end && x.fill(1) == 0 {
			if x.rerr != nil {
				return x.rerr
			}
			return bad // the caller finds the end
		}
		// A fast path over plain ASCII.
		i := x.pos
		for i < x.end {
			c := x.buf[i]
			if c < 0x20 || c >= utf8.RuneSelf || c == '<' || c == '&' || c == '>' || c == ']' {
				break
			}
			i++
		}
		if i > x.pos {
			x.text = append(x.text, x.buf[x.pos:i]...)
			b0, b1 = 0, 0
			x.pos = i
		}
		if len(x.text) > maxTextRun {
			return &xmlFault{msg: fmt.Sprintf("holds more than %s of text without markup (a damaged or hostile file)", sizeText(maxTextRun))}
		}
		if x.pos >= x.end {
			continue
		}
		c := x.buf[x.pos]
		switch {
		case c == '<':
			return bad
		case c == '&':
			r, err := x.entity()
			if err != nil {
				return err
			}
			x.text = utf8.AppendRune(x.text, r)
			b0, b1 = 0, 0
			continue
		case c == '>' && b0 == ']' && b1 == ']':
			return malformed("]]> in text")
		case c == '\r':
			x.pos++
			if x.fill(1) > 0 && x.buf[x.pos] == '\n' {
				x.pos++
			}
			x.text = append(x.text, '\n')
			b0, b1 = 0, 0
			continue
		case c < 0x20 && c != '\t' && c != '\n':
			if bad == nil {
				bad = malformed("the control character %#02x", c)
			}
			x.text = append(x.text, c) // counted in the run, never used
			x.pos++
			continue
		case c >= utf8.RuneSelf:
			x.fill(utf8.UTFMax)
			r, size := utf8.DecodeRune(x.buf[x.pos:x.end])
			if r == utf8.RuneError && size == 1 || !isXMLChar(r) {
				return malformed("bytes that are not UTF-8 text")
			}
			x.text = append(x.text, x.buf[x.pos:x.pos+size]...)
			x.pos += size
			b0, b1 = 0, 0
			continue
		}
		x.text = append(x.text, c)
		x.pos++
		b0, b1 = b1, c
	}
}

// entity reads an entity at '&': one of the five XML defines or a numeric
// character reference to a character XML allows.
func (x *xmlTok) entity() (rune, error) {
	x.fill(12)
	rest := x.buf[x.pos+1 : x.end]
	for _, e := range [...]struct {
		name string
		r    rune
	}{{"amp;", '&'}, {"lt;", '<'}, {"gt;", '>'}, {"quot;", '"'}, {"apos;", '\''}} {
		if bytes.HasPrefix(rest, []byte(e.name)) {
			x.pos += 1 + len(e.name)
			return e.r, nil
		}
	}
	if len(rest) < 3 || rest[0] != '#' {
		j := bytes.IndexByte(rest, ';')
		if j < 0 {
			j = 0
		}
		return 0, malformed("the undefined entity &%s", short(string(rest[:j]), 20))
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
	if i == start || i >= len(rest) || rest[i] != ';' || !isXMLChar(v) {
		return 0, malformed("a bad character reference")
	}
	x.pos += 1 + i + 1
	return v, nil
}

// isXMLChar reports whether r is a character XML allows (XML 1.0, 2.2).
func isXMLChar(r rune) bool {
	return r == 0x09 || r == 0x0A || r == 0x0D ||
		r >= 0x20 && r <= 0xD7FF ||
		r >= 0xE000 && r <= 0xFFFD ||
		r >= 0x10000 && r <= 0x10FFFF
}

func isNameByte(b byte) bool {
	return b >= 'a' && b <= 'z' || b >= 'A' && b <= 'Z' || b >= '0' && b <= '9' || b == '_' || b == ':' || b == '.' || b == '-' || b >= utf8.RuneSelf
}

func isNameStartByte(b byte) bool {
	return b >= 'a' && b <= 'z' || b >= 'A' && b <= 'Z' || b == '_' || b == ':' || b >= utf8.RuneSelf
}

// tagEnd makes the whole tag starting at pos available and returns the index
// of its closing '>' (outside quoted attribute values).
func (x *xmlTok) tagEnd() (int, error) {
	var quote byte
	i := x.pos + 1
	for {
		for ; i < x.end; i++ {
			c := x.buf[i]
			switch {
			case quote != 0:
				if c == quote {
					quote = 0
				}
			case c == '"' || c == '\'':
				quote = c
			case c == '>':
				return i, nil
			}
		}
		if i-x.pos > maxTagLen {
			return 0, &xmlFault{msg: fmt.Sprintf("holds a tag longer than %s (a damaged or hostile file)", sizeText(maxTagLen))}
		}
		off := i - x.pos
		if x.fill(x.end-x.pos+1) <= off {
			if x.rerr != nil {
				return 0, x.rerr
			}
			return 0, errCutShort
		}
		i = x.pos + off
	}
}

// name reads a name at b[i:] and returns its end and the start of its local part.
func readName(b []byte, i int) (end, local int, ok bool) {
	if i >= len(b) || !isNameStartByte(b[i]) {
		return i, i, false
	}
	local = i
	colons := 0
	for end = i; end < len(b) && isNameByte(b[end]); end++ {
		if b[end] == ':' {
			local = end + 1
			colons++
		}
	}
	// a qualified name has at most one colon, inside it (Namespaces in XML 1.0, 4)
	if !utf8.Valid(b[i:end]) || local == end || colons > 1 || b[i] == ':' {
		return end, local, false
	}
	return end, local, true
}

func (x *xmlTok) startTag() (tokKind, error) {
	if x.rootDone && x.depth() == 0 {
		return tokNone, malformed("a second root element")
	}
	gt, err := x.tagEnd()
	if err != nil {
		return tokNone, err
	}
	tag := x.buf[x.pos+1 : gt] // without '<' and '>'
	x.pos = gt + 1
	end, local, ok := readName(tag, 0)
	if !ok {
		return tokNone, malformed("a bad element name")
	}
	if end > maxNameLen {
		return tokNone, &xmlFault{msg: fmt.Sprintf("holds an element name longer than %d bytes (a damaged or hostile file)", maxNameLen)}
	}
	if x.depth() >= maxDepth {
		return tokNone, &xmlFault{msg: fmt.Sprintf("nests elements more than %d deep (a damaged or hostile file)", maxDepth)}
	}
	x.stack = append(x.stack, tag[:end]...)
	x.stackEnd = append(x.stackEnd, len(x.stack))
	x.local = tag[local:end]
	x.attrs = x.attrs[:0]
	x.scratch = x.scratch[:0]
	x.empty = false
	i := end
	for {
		sp := i
		for i < len(tag) && isXMLSpace(tag[i]) {
			i++
		}
		if i == len(tag) {
			break
		}
		if tag[i] == '/' {
			if i != len(tag)-1 {
				return tokNone, malformed("a bad tag <%s>", short(string(x.local), 40))
			}
			x.empty = true
			break
		}
		if i == sp {
			return tokNone, malformed("attributes not separated by space in <%s>", short(string(x.local), 40))
		}
		aend, alocal, ok := readName(tag, i)
		if !ok {
			return tokNone, malformed("a bad attribute name in <%s>", short(string(x.local), 40))
		}
		name := tag[alocal:aend]
		i = aend
		for i < len(tag) && isXMLSpace(tag[i]) {
			i++
		}
		if i >= len(tag) || tag[i] != '=' {
			return tokNone, malformed("an attribute without a value in <%s>", short(string(x.local), 40))
		}
		i++
		for i < len(tag) && isXMLSpace(tag[i]) {
			i++
		}
		if i >= len(tag) || tag[i] != '"' && tag[i] != '\'' {
			return tokNone, malformed("an unquoted attribute value in <%s>", short(string(x.local), 40))
		}
		q := tag[i]
		j := bytes.IndexByte(tag[i+1:], q)
		if j < 0 {
			return tokNone, errCutShort
		}
		val := tag[i+1 : i+1+j]
		i += j + 2
		v, err := x.attrValue(val)
		if err != nil {
			return tokNone, err
		}
		x.attrs = append(x.attrs, xattr{local: name, value: v})
	}
	if x.empty {
		x.pendEnd = true
	}
	x.kind = tokStart
	return tokStart, nil
}

// attrValue checks an attribute value and decodes its entities (into
// scratch when it has any).
func (x *xmlTok) attrValue(v []byte) ([]byte, error) {
	plain := true
	for _, c := range v {
		if c == '&' || c == '<' || c < 0x20 || c >= utf8.RuneSelf {
			plain = false
			break
		}
	}
	if plain {
		return v, nil
	}
	start := len(x.scratch)
	for i := 0; i < len(v); {
		c := v[i]
		switch {
		case c == '<':
			return nil, malformed("'<' in an attribute value")
		case c == '&':
			r, n, err := decodeEntity(v[i:])
			if err != nil {
				return nil, err
			}
			x.scratch = utf8.AppendRune(x.scratch, r)
			i += n
			continue
		case c == '\r':
			x.scratch = append(x.scratch, '\n')
			if i+1 < len(v) && v[i+1] == '\n' {
				i++
			}
		case c < 0x20 && c != '\t' && c != '\n':
			return nil, malformed("the control character %#02x", c)
		case c >= utf8.RuneSelf:
			r, size := utf8.DecodeRune(v[i:])
			if r == utf8.RuneError && size == 1 || !isXMLChar(r) {
				return nil, malformed("bytes that are not UTF-8 text")
			}
			x.scratch = append(x.scratch, v[i:i+size]...)
			i += size
			continue
		default:
			x.scratch = append(x.scratch, c)
		}
		i++
	}
	return x.scratch[start:len(x.scratch):len(x.scratch)], nil
}

// decodeEntity decodes the entity at the start of b (which starts with '&').
func decodeEntity(b []byte) (rune, int, error) {
	t := &xmlTok{buf: b, end: len(b), eof: true}
	r, err := t.entity()
	return r, t.pos, err
}

func (x *xmlTok) endTag() (tokKind, error) {
	gt, err := x.tagEnd()
	if err != nil {
		return tokNone, err
	}
	tag := x.buf[x.pos+2 : gt]
	x.pos = gt + 1
	end, local, ok := readName(tag, 0)
	if !ok || len(bytes.TrimRight(tag[end:], " \t\r\n")) > 0 {
		return tokNone, malformed("a bad end tag")
	}
	if x.depth() == 0 {
		return tokNone, malformed("an end tag </%s> without its start", short(string(tag[:end]), 40))
	}
	from := 0
	if n := len(x.stackEnd); n > 1 {
		from = x.stackEnd[n-2]
	}
	if open := x.stack[from:]; !bytes.Equal(open, tag[:end]) {
		return tokNone, malformed("the element <%s> closed by </%s>", short(string(open), 40), short(string(tag[:end]), 40))
	}
	x.local = tag[local:end]
	x.pop()
	x.kind = tokEnd
	return tokEnd, nil
}

func (x *xmlTok) pop() {
	n := len(x.stackEnd) - 1
	x.stackEnd = x.stackEnd[:n]
	if n == 0 {
		x.stack = x.stack[:0]
		x.rootDone = true
	} else {
		x.stack = x.stack[:x.stackEnd[n-1]]
	}
}

// skipElement reads to the end of the element whose start tag was just read.
func (x *xmlTok) skipElement() error {
	d := x.depth() - 1
	for x.depth() > d {
		if _, err := x.next(); err != nil {
			return err
		}
	}
	return nil
}
