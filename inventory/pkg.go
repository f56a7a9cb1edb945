package inventory

import (
	"archive/zip"
	"bytes"
	"compress/flate"
	"errors"
	"fmt"
	"io"
	"net/url"
	"path"
	"strconv"
	"strings"
)

// xlsxPkg is a workbook's zip package as the reader sees it: its entries by
// name, the workbook's sheets with the parts their relationships point to
// (wherever they are stored), the date system, which styles show dates, and
// the shared strings. Every part is read once, through xmlTok, which is also
// its check; a part that cannot be read is a *pkgFault whose reason names it.
type xlsxPkg struct {
	files    map[string]*zip.File // by normalised name (see partKey)
	size     int64                // of the file, for the bounds that grow with it
	opts     ReadOptions
	tok      *xmlTok
	workbook string

	sheets   []wbSheet
	date1904 bool
	// styles: per cell format (cellXfs) index, whether its number format
	// shows a date or time; nil when the workbook has no style table.
	styleDate []bool
	sst       *sharedStrings
}

// wbSheet is one sheet of the workbook's sheet list.
type wbSheet struct {
	Name  string
	Part  string // the part its relationship points to
	State string // "", "visible", "hidden", "veryHidden"
}

// pkgFault is a reason the workbook cannot be read, one clause for an
// UnreadableError.
type pkgFault struct{ reason string }

func (e *pkgFault) Error() string { return e.reason }

// Relationship types (ECMA-376 Part 1, 15.2 and Part 2, 9.3); the
// transitional and strict namespaces differ before the last element.
const (
	relOfficeDocument = "/officeDocument"
	relWorksheet      = "/worksheet"
	relStyles         = "/styles"
	relSharedStrings  = "/sharedStrings"
)

// partKey normalises a zip entry or part name for lookup: forward slashes,
// no leading slash, lower case (OPC part names compare case-insensitively;
// ECMA-376 Part 2, 9.1.1.1).
func partKey(name string) string {
	return strings.ToLower(strings.TrimPrefix(strings.ReplaceAll(name, `\`, "/"), "/"))
}

// openPkg indexes a workbook's zip and reads its metadata: the workbook part
// (through the package relationships), its sheet list, date system and
// relationships, the style table and the shared strings.
func openPkg(zr *zip.Reader, size int64, opts ReadOptions) (*xlsxPkg, error) {
	var total uint64
	for _, zf := range zr.File {
		total += zf.UncompressedSize64
	}
	if total > uint64(opts.UnzipSizeLimit) {
		return nil, &pkgFault{fmt.Sprintf("its contents unpack to more than the %s limit (a damaged or hostile file)", sizeText(opts.UnzipSizeLimit))}
	}
	p := &xlsxPkg{files: make(map[string]*zip.File, len(zr.File)), size: size, opts: opts, tok: newXMLTok(nil)}
	for _, zf := range zr.File {
		k := partKey(zf.Name)
		if _, dup := p.files[k]; dup {
			return nil, &pkgFault{fmt.Sprintf("it is a damaged .xlsx (its zip holds two entries named %s, and which one is meant cannot be told)", short(zf.Name, 60))}
		}
		p.files[k] = zf
	}
	if why := otherDocument(zr); why != "" {
		return nil, &pkgFault{why}
	}
	p.workbook = "xl/workbook.xml"
	if rels, err := p.readRels("", "_rels/.rels"); err != nil {
		return nil, err
	} else if t, ok := rels.byType(relOfficeDocument); ok {
		p.workbook = t
	}
	if p.files[partKey(p.workbook)] == nil {
		return nil, &pkgFault{fmt.Sprintf("it is a damaged .xlsx (its workbook part %s is missing)", short(p.workbook, 60))}
	}
	type sheetRef struct{ name, rid, state string }
	var refs []sheetRef
	err := p.scanPart(p.workbook, func(x *xmlTok) error {
		switch string(x.local) {
		case "workbookPr":
			if v, ok := x.attr("date1904"); ok {
				p.date1904 = xmlBool(v)
			}
		case "sheet":
			if len(refs) >= maxSheets {
				return &pkgFault{fmt.Sprintf("its workbook lists more than %d sheets (a damaged or hostile file)", maxSheets)}
			}
			name, _ := x.attr("name")
			rid, _ := x.attr("id")
			state, _ := x.attr("state")
			refs = append(refs, sheetRef{string(name), string(rid), string(state)})
		}
		return nil
	})
	if err != nil {
		return nil, err
	}
	dir := path.Dir(p.workbook)
	rels, err := p.readRels(dir, path.Join(dir, "_rels", path.Base(p.workbook)+".rels"))
	if err != nil {
		return nil, err
	}
	for _, r := range refs {
		rel, ok := rels.byID[r.rid]
		switch {
		case !ok:
			return nil, &pkgFault{fmt.Sprintf("it is a damaged .xlsx (the workbook's sheet %q has no relationship %q to its part)", short(r.name, 60), short(r.rid, 20))}
		case rel.outside:
			return nil, &pkgFault{fmt.Sprintf("the workbook's relationship for sheet %q points outside the package (to %s), which is never followed (a damaged or hostile file)", short(r.name, 60), short(rel.target, 80))}
		case p.files[partKey(rel.target)] == nil:
			return nil, &pkgFault{fmt.Sprintf("it is a damaged .xlsx (the part %s of sheet %q is missing)", short(rel.target, 60), short(r.name, 60))}
		}
		p.sheets = append(p.sheets, wbSheet{Name: r.name, Part: rel.target, State: r.state})
	}
	styles, ok := rels.byType(relStyles)
	if !ok && p.files["xl/styles.xml"] != nil {
		styles = "xl/styles.xml"
	}
	if styles != "" {
		if err := p.readStyles(styles); err != nil {
			return nil, err
		}
	}
	sst, ok := rels.byType(relSharedStrings)
	if !ok && p.files["xl/sharedstrings.xml"] != nil {
		sst = "xl/sharedStrings.xml"
	}
	p.sst = &sharedStrings{}
	if sst != "" {
		if err := p.readSharedStrings(sst); err != nil {
			return nil, err
		}
	}
	return p, nil
}

// maxSheets bounds a workbook's sheet list (a spreadsheet program allows as
// many as memory does; a survey has six). // common practice, no source
const maxSheets = 4096

func xmlBool(v []byte) bool { return string(v) == "1" || string(v) == "true" }

// rel is one relationship, its target resolved to a part name.
type rel struct {
	typ, target string
	outside     bool // external, or a path above the package's root
}

type relSet struct {
	byID  map[string]rel
	order []string
}

// byType returns the target of the first relationship whose type ends in suffix.
func (rs relSet) byType(suffix string) (string, bool) {
	for _, id := range rs.order {
		if r := rs.byID[id]; strings.HasSuffix(r.typ, suffix) && !r.outside {
			return r.target, true
		}
	}
	return "", false
}

// readRels reads a relationships part (absent: none), resolving each target
// against dir, the folder of the part it belongs to (ECMA-376 Part 2, 9.3).
func (p *xlsxPkg) readRels(dir, name string) (relSet, error) {
	rs := relSet{byID: map[string]rel{}}
	if p.files[partKey(name)] == nil {
		return rs, nil
	}
	err := p.scanPart(name, func(x *xmlTok) error {
		if string(x.local) != "Relationship" {
			return nil
		}
		if len(rs.order) >= maxSheets*4 {
			return &pkgFault{fmt.Sprintf("its part %s holds too many relationships (a damaged or hostile file)", short(name, 60))}
		}
		id, _ := x.attr("Id")
		typ, _ := x.attr("Type")
		target, _ := x.attr("Target")
		mode, _ := x.attr("TargetMode")
		r := rel{typ: string(typ)}
		r.target, r.outside = resolveTarget(dir, string(target))
		if strings.EqualFold(string(mode), "External") {
			r.outside, r.target = true, string(target)
		}
		if _, dup := rs.byID[string(id)]; !dup {
			rs.order = append(rs.order, string(id))
			rs.byID[string(id)] = r
		}
		return nil
	})
	return rs, err
}

// resolveTarget resolves a relationship's target against dir; outside is
// true when it names a URL or climbs above the package's root.
func resolveTarget(dir, target string) (string, bool) {
	t := strings.ReplaceAll(target, `\`, "/")
	if i := strings.IndexAny(t, "#?"); i >= 0 {
		t = t[:i]
	}
	if strings.Contains(t, "%") { // a part name is a URI: "sheet%201.xml" is "sheet 1.xml"
		if u, err := url.PathUnescape(t); err == nil {
			t = u
		}
	}
	if strings.Contains(t, "://") || strings.HasPrefix(strings.ToLower(t), "file:") || strings.HasPrefix(t, "//") {
		return target, true
	}
	var full string
	if strings.HasPrefix(t, "/") {
		full = t[1:]
	} else {
		full = path.Join(dir, t)
		if dir == "" || dir == "." {
			full = t
		}
	}
	depth := 0
	for _, seg := range strings.Split(full, "/") {
		switch seg {
		case "", ".":
		case "..":
			if depth--; depth < 0 {
				return target, true
			}
		default:
			depth++
		}
	}
	return path.Clean("/" + full)[1:], false
}

// openPart opens a part for reading, refusing a compression method the zip
// reader does not know.
func (p *xlsxPkg) openPart(name string) (io.ReadCloser, error) {
	zf := p.files[partKey(name)]
	if zf == nil {
		return nil, &pkgFault{fmt.Sprintf("it is a damaged .xlsx (its part %s is missing)", short(name, 60))}
	}
	rc, err := zf.Open()
	switch {
	case errors.Is(err, zip.ErrAlgorithm):
		return nil, &pkgFault{fmt.Sprintf("its part %s is compressed with a method (number %d) that this program does not read; open the workbook in a spreadsheet program and save it as a normal .xlsx", short(name, 60), zf.Method)}
	case err != nil:
		return nil, &pkgFault{fmt.Sprintf("it is a damaged .xlsx (its part %s cannot be unpacked: %s)", short(name, 60), short(err.Error(), 80))}
	}
	return rc, nil
}

// partFault words why a part could not be read to its end; where says where
// reading stopped ("" when nothing was read from it yet).
func partFault(name string, err error, where string) error {
	if err == nil {
		return nil
	}
	var pf *pkgFault
	if errors.As(err, &pf) {
		return err
	}
	if where != "" {
		where = "; " + where
	}
	n := short(name, 60)
	var xf *xmlFault
	var ce flate.CorruptInputError
	switch {
	case errors.As(err, &xf) && (strings.HasPrefix(xf.msg, "is cut short") || strings.HasPrefix(xf.msg, "is malformed") || strings.HasPrefix(xf.msg, "is empty")):
		return &pkgFault{fmt.Sprintf("it is a damaged .xlsx (its part %s %s%s)", n, xf.msg, where)}
	case errors.As(err, &xf):
		return &pkgFault{fmt.Sprintf("its part %s %s%s", n, xf.msg, where)}
	case errors.Is(err, zip.ErrFormat), errors.Is(err, io.ErrUnexpectedEOF):
		return &pkgFault{fmt.Sprintf("it is a damaged .xlsx (its part %s does not unpack as its zip header states: its size differs%s)", n, where)}
	case errors.Is(err, zip.ErrChecksum):
		return &pkgFault{fmt.Sprintf("it is a damaged .xlsx (its part %s does not unpack as its zip header states: its checksum differs%s)", n, where)}
	case errors.As(err, &ce):
		return &pkgFault{fmt.Sprintf("it is a damaged .xlsx (its part %s cannot be unpacked: the compressed data is damaged%s)", n, where)}
	}
	return &pkgFault{fmt.Sprintf("it is a damaged .xlsx (its part %s cannot be read: %s%s)", n, short(err.Error(), 80), where)}
}

// scanPart reads a whole part, calling start for every start tag.
func (p *xlsxPkg) scanPart(name string, start func(x *xmlTok) error) error {
	return p.scanPartTags(name, func(x *xmlTok, end bool) error {
		if end {
			return nil
		}
		return start(x)
	})
}

// maxStyles bounds a workbook's cell formats (a spreadsheet program allows
// 64,000). Source: Microsoft, "Excel specifications and limits" (cell styles
// and formats per workbook: 64,000).
const maxStyles = 1 << 16

// readStyles reads the style table: for each cell format (cellXfs), whether
// its number format shows a date or time.
func (p *xlsxPkg) readStyles(name string) error {
	custom := map[int]bool{} // custom number format id -> shows a date
	var xfs []int32
	inXfs := -1
	err := p.scanPartTags(name, func(x *xmlTok, end bool) error {
		switch string(x.local) {
		case "cellXfs":
			if end {
				inXfs = -1
			} else if !x.empty {
				inXfs = x.depth()
			}
		case "numFmt":
			if end {
				return nil
			}
			id, err := strconv.Atoi(string(attrOr(x, "numFmtId")))
			if err != nil {
				return &pkgFault{fmt.Sprintf("it is a damaged .xlsx (its part %s has a number format without a valid id)", short(name, 60))}
			}
			if len(custom) >= maxStyles {
				return &pkgFault{fmt.Sprintf("its part %s holds more than %d number formats (a damaged or hostile file)", short(name, 60), maxStyles)}
			}
			custom[id] = dateFormatCode(string(attrOr(x, "formatCode")))
		case "xf":
			if end || inXfs < 0 || x.depth() != inXfs+1 {
				return nil
			}
			if len(xfs) >= maxStyles {
				return &pkgFault{fmt.Sprintf("its part %s holds more than %d cell formats (a damaged or hostile file)", short(name, 60), maxStyles)}
			}
			id := int64(0)
			if v, ok := x.attr("numFmtId"); ok {
				var err error
				if id, err = strconv.ParseInt(string(v), 10, 32); err != nil {
					id = -1 // unknown: not a date format by itself
				}
			}
			xfs = append(xfs, int32(id))
		}
		return nil
	})
	if err != nil {
		return err
	}
	p.styleDate = make([]bool, len(xfs))
	for i, id := range xfs {
		if d, ok := custom[int(id)]; ok {
			p.styleDate[i] = d
		} else {
			p.styleDate[i] = builtinDateFormat(int(id))
		}
	}
	return nil
}

// builtinDateFormat reports whether a built-in number format shows a date or
// time. Source: ECMA-376 Part 1, 18.8.30 (numFmt: ids 14-22 and 45-47), and
// the East Asian built-in date formats 27-36 and 50-58 of the same table.
func builtinDateFormat(id int) bool {
	return id >= 14 && id <= 22 || id >= 27 && id <= 36 || id >= 45 && id <= 47 || id >= 50 && id <= 58
}

func attrOr(x *xmlTok, local string) []byte {
	v, _ := x.attr(local)
	return v
}

// scanPartTags reads a whole part, calling fn for every start tag (end
// false) and end tag (end true).
func (p *xlsxPkg) scanPartTags(name string, fn func(x *xmlTok, end bool) error) error {
	rc, err := p.openPart(name)
	if err != nil {
		return err
	}
	defer rc.Close()
	x := p.tok
	x.reset(rc)
	for {
		k, err := x.next()
		if err != nil {
			return partFault(name, err, "")
		}
		switch k {
		case tokEOF:
			return nil
		case tokStart, tokEnd:
			if err := fn(x, k == tokEnd); err != nil {
				return err
			}
		}
	}
}

// sharedStrings holds a workbook's shared strings in one block of text with
// their ends, so that a string costs four bytes beside its text.
type sharedStrings struct {
	text []byte
	ends []uint32
	// cache holds the strings already made, so that a string used in many
	// cells is made once (nil until the first use).
	cache []string
}

// maxSharedCache is the most shared strings whose made strings are kept
// (16 bytes each beside their text). // common practice, no source
const maxSharedCache = 1 << 20

func (s *sharedStrings) len() int { return len(s.ends) }

func (s *sharedStrings) at(i int) string {
	if s.cache == nil && len(s.ends) <= maxSharedCache {
		s.cache = make([]string, len(s.ends))
	}
	if s.cache != nil && s.cache[i] != "" {
		return s.cache[i]
	}
	start := uint32(0)
	if i > 0 {
		start = s.ends[i-1]
	}
	c := string(s.text[start:s.ends[i]])
	if s.cache != nil {
		s.cache[i] = c
	}
	return c
}

// Bounds of the shared strings, which grow with the file's size: a string
// in a real workbook costs more than one byte of the compressed file, and
// its text does not unpack to more than 16 times its compressed size.
// // common practice, no source
const (
	minSharedStrings    = 1 << 20
	minSharedStringText = 64 << 20
	sharedTextPerByte   = 16
)

// readSharedStrings reads the shared strings part: each <si>'s text is its
// <t> and the <t> of its runs <r> (not its phonetic runs <rPh>), with the
// _xHHHH_ escapes of ECMA-376 Part 1, 22.9.2.19 (ST_Xstring) decoded.
func (p *xlsxPkg) readSharedStrings(name string) error {
	rc, err := p.openPart(name)
	if err != nil {
		return err
	}
	defer rc.Close()
	maxCount := max(minSharedStrings, p.size)
	maxText := max(minSharedStringText, sharedTextPerByte*p.size)
	s := p.sst
	x := p.tok
	x.reset(rc)
	siDepth, inT, inPh := -1, false, 0
	start := 0
	for {
		k, err := x.next()
		if err != nil {
			return partFault(name, err, fmt.Sprintf("after shared string %d", len(s.ends)))
		}
		switch k {
		case tokEOF:
			return nil
		case tokStart:
			switch string(x.local) {
			case "si":
				if siDepth >= 0 {
					return partFault(name, malformed("a string inside a string"), "")
				}
				if int64(len(s.ends)) >= maxCount {
					return &pkgFault{fmt.Sprintf("its part %s holds more than %d shared strings for a file of %s (a damaged or hostile file)", short(name, 60), maxCount, sizeText(p.size))}
				}
				siDepth, start = x.depth(), len(s.text)
			case "rPh":
				inPh++
			case "t":
				inT = siDepth >= 0 && inPh == 0
			}
		case tokEnd:
			switch string(x.local) {
			case "si":
				if x.depth() == siDepth-1 {
					s.text = append(s.text[:start], unescapeXString(s.text[start:])...)
					s.ends = append(s.ends, uint32(len(s.text)))
					siDepth = -1
				}
			case "rPh":
				inPh--
			case "t":
				inT = false
			}
		case tokText:
			if inT {
				if int64(len(s.text)+len(x.text)) > maxText || len(s.text)+len(x.text) > 1<<32-1 {
					return &pkgFault{fmt.Sprintf("its part %s holds more than %s of shared text for a file of %s (a damaged or hostile file)", short(name, 60), sizeText(maxText), sizeText(p.size))}
				}
				s.text = append(s.text, x.text...)
			}
		}
	}
}

// unescapeXString decodes the _xHHHH_ escapes of ST_Xstring (ECMA-376 Part
// 1, 22.9.2.19) as a spreadsheet program does: _x005F_ is a literal
// underscore, any other _xHHHH_ the character U+HHHH. It returns b itself
// when it holds no escape.
func unescapeXString(b []byte) []byte {
	i := indexXEscape(b, 0)
	if i < 0 {
		return b
	}
	out := make([]byte, 0, len(b))
	last := 0
	for ; i >= 0; i = indexXEscape(b, last) {
		out = append(out, b[last:i]...)
		v, _ := strconv.ParseUint(string(b[i+2:i+6]), 16, 32)
		if v == 0x5F {
			out = append(out, '_')
		} else {
			out = appendRuneOrReplacement(out, rune(v))
		}
		last = i + 7
	}
	return append(out, b[last:]...)
}

// appendRuneOrReplacement appends r; a surrogate half, which is no
// character, is dropped (as a spreadsheet program drops it).
func appendRuneOrReplacement(b []byte, r rune) []byte {
	if r >= 0xD800 && r <= 0xDFFF {
		return b
	}
	return append(b, string(r)...)
}

// indexXEscape finds the next _xHHHH_ at or after from.
func indexXEscape(b []byte, from int) int {
	for i := from; i+7 <= len(b); i++ {
		if b[i] != '_' || b[i+1] != 'x' || b[i+6] != '_' {
			continue
		}
		if isHex(b[i+2]) && isHex(b[i+3]) && isHex(b[i+4]) && isHex(b[i+5]) {
			return i
		}
	}
	return -1
}

func isHex(c byte) bool {
	return c >= '0' && c <= '9' || c >= 'a' && c <= 'f' || c >= 'A' && c <= 'F'
}

// otherDocument tells a zip that holds no workbook: an OpenDocument file, a
// word-processor or presentation document, or any other zip.
func otherDocument(zr *zip.Reader) string {
	has := map[string]*zip.File{}
	workbook := false
	for _, zf := range zr.File {
		name := strings.ToLower(strings.ReplaceAll(zf.Name, `\`, "/"))
		has[name] = zf
		if strings.HasSuffix(name, "workbook.xml") {
			workbook = true
		}
	}
	if zf, ok := has["mimetype"]; ok && zf.UncompressedSize64 < 200 {
		if rc, err := zf.Open(); err == nil {
			b, _ := io.ReadAll(io.LimitReader(rc, 200))
			rc.Close()
			if bytes.HasPrefix(b, []byte("application/vnd.oasis.opendocument")) {
				return "it is an OpenDocument file (such as .ods), not an .xlsx; save it in the spreadsheet program as an Excel workbook (.xlsx)"
			}
		}
	}
	switch {
	case workbook:
		return ""
	case has["word/document.xml"] != nil:
		return "it is a word-processor document (.docx) renamed, not a workbook"
	case has["ppt/presentation.xml"] != nil:
		return "it is a presentation (.pptx) renamed, not a workbook"
	}
	return "it is a zip file that holds no workbook (no workbook.xml part)"
}
