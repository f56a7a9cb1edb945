package inventory

import (
	"archive/zip"
	"bytes"
	"encoding/xml"
	"errors"
	"fmt"
	"io"
	"path"
	"strings"
)

// Bounds of the check of a workbook's sheet parts before excelize reads them.
const (
	// maxTextRun is the longest run of bytes without markup a sheet part may
	// hold. A cell holds at most 32767 characters (4 bytes each in UTF-8, up to
	// 6 as an XML entity), so 4 MiB is far above any real cell; excelize's XML
	// decoder would gather a longer run in memory before rejecting it.
	maxTextRun = 4 << 20
	// maxXMLCheck is the largest sheet part whose XML is checked token by token
	// (excelize's row iterator stops silently at a syntax error, so a damaged
	// part would look like a shorter sheet). Larger parts, far beyond a
	// survey's size, are checked for their closing tag and text runs only.
	maxXMLCheck = 64 << 20
)

// checkParts looks at the worksheet and shared-strings parts of a workbook's
// zip before excelize opens it, and returns a reason when a part is damaged or
// hostile in a way excelize would not report: a part that unpacks to more
// than its header states (archive/zip stops there, excelize ignores the
// error), a run of text without markup longer than maxTextRun (which
// excelize's decoder would hold in memory whole), or XML that is cut short or
// malformed (which excelize's row iterator takes for the end of the sheet).
// A workbook whose parts declare more than opts.UnzipSizeLimit unpacked is
// refused from the zip's directory alone. It reads every part as a stream in bounded memory; a zip it cannot open is
// left to excelize to word. The check never resolves entities or runs anything.
func checkParts(zr *zip.Reader, opts ReadOptions) string {
	var total uint64
	for _, zf := range zr.File {
		total += zf.UncompressedSize64
	}
	if total > uint64(opts.UnzipSizeLimit) {
		return fmt.Sprintf("its contents unpack to more than the %s limit (a damaged or hostile file)", sizeText(opts.UnzipSizeLimit))
	}
	if why := otherDocument(zr); why != "" {
		return why
	}
	for _, zf := range zr.File {
		name := strings.ReplaceAll(zf.Name, `\`, "/")
		lower := strings.ToLower(name)
		if !(strings.HasPrefix(lower, "xl/worksheets/") && path.Ext(lower) == ".xml") && lower != "xl/sharedstrings.xml" {
			continue
		}
		if why := checkPart(zf, name); why != "" {
			return why
		}
	}
	return ""
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

// partScanner follows a part's bytes: the longest run without '<' and the
// last bytes.
type partScanner struct {
	run  int64
	tail []byte
	long bool
}

func (p *partScanner) Write(b []byte) (int, error) {
	n := len(b)
	p.keepTail(b)
	for len(b) > 0 {
		i := bytes.IndexByte(b, '<')
		if i < 0 {
			p.run += int64(len(b))
			break
		}
		p.run += int64(i)
		if p.run > maxTextRun {
			p.long = true
		}
		p.run = 0
		b = b[i+1:]
	}
	if p.run > maxTextRun {
		p.long = true
	}
	if p.long {
		return 0, errTextRun
	}
	return n, nil
}

func (p *partScanner) keepTail(b []byte) {
	const n = 64
	if len(b) >= n {
		p.tail = append(p.tail[:0], b[len(b)-n:]...)
		return
	}
	p.tail = append(p.tail, b...)
	if len(p.tail) > n {
		p.tail = append(p.tail[:0], p.tail[len(p.tail)-n:]...)
	}
}

var errTextRun = errors.New("text run too long")

func checkPart(zf *zip.File, name string) string {
	if zf.UncompressedSize64 <= maxXMLCheck && quickCheckPart(zf) {
		return ""
	}
	return fullCheckPart(zf, name)
}

// quickCheckPart reports whether a part is sound by one pass of xmlScan over
// its bytes: it unpacks without an error, holds no run of text longer than
// maxTextRun, and is well-formed XML in the subset xmlScan is sure of, with
// its root closed and at most maxFarCells far cells, which is when
// fullCheckPart finds nothing either. When it cannot tell, fullCheckPart
// reads the part again and words what is wrong.
func quickCheckPart(zf *zip.File) bool {
	rc, err := zf.Open()
	if err != nil {
		return false
	}
	defer rc.Close()
	var sc partScanner
	tee := io.TeeReader(rc, &sc)
	x := newXMLScan(tee)
	if !x.scan() {
		return false
	}
	if _, err := io.Copy(io.Discard, tee); err != nil || x.err != nil || sc.long {
		return false
	}
	return x.depth == 0 && x.elements > 0 && x.far <= maxFarCells
}

// fullCheckPart checks a part token by token with encoding/xml.
func fullCheckPart(zf *zip.File, name string) string {
	rc, err := zf.Open()
	if err != nil {
		return "" // excelize words an unreadable zip
	}
	defer rc.Close()
	var sc partScanner
	var copyErr, xmlErr error
	checked := zf.UncompressedSize64 <= maxXMLCheck
	if checked {
		pr, pw := io.Pipe()
		done := make(chan error, 1)
		go func() {
			d := xml.NewDecoder(pr)
			d.Strict = true
			d.CharsetReader = func(label string, r io.Reader) (io.Reader, error) {
				if strings.Contains(label, "16") || strings.Contains(label, "32") {
					return nil, errNotChecked
				}
				return r, nil // only the structure is checked
			}
			var err error
			depth, elements, far := 0, 0, 0
			for err == nil {
				var tok xml.Token
				tok, err = d.RawToken()
				switch e := tok.(type) {
				case xml.StartElement:
					depth++
					elements++
					if e.Name.Local == "c" && farCell(e.Attr) {
						if far++; far > maxFarCells {
							err = errFarCells
						}
					}
				case xml.EndElement:
					depth--
				}
			}
			switch {
			case errors.Is(err, errNotChecked):
				err = nil
			case err == io.EOF && (depth != 0 || elements == 0):
				err = errCutShort
			case err == io.EOF:
				err = nil
			}
			if err != nil {
				pr.CloseWithError(err)
			} else {
				_, _ = io.Copy(io.Discard, pr) // let the copy run to its end
			}
			done <- err
		}()
		_, copyErr = io.Copy(io.MultiWriter(&sc, pw), rc)
		pw.CloseWithError(copyErr)
		xmlErr = <-done
	} else {
		_, copyErr = io.Copy(&sc, rc)
	}
	switch {
	case sc.long:
		return fmt.Sprintf("its part %s holds more than %s of text without markup (a damaged or hostile file)", short(name, 60), sizeText(maxTextRun))
	case errors.Is(copyErr, zip.ErrFormat), errors.Is(copyErr, zip.ErrChecksum):
		return fmt.Sprintf("it is a damaged .xlsx (its part %s does not unpack as its zip header states)", short(name, 60))
	case copyErr != nil && copyErr != xmlErr:
		return fmt.Sprintf("it is a damaged .xlsx (its part %s cannot be unpacked: %s)", short(name, 60), short(copyErr.Error(), 80))
	case errors.Is(xmlErr, errFarCells):
		return fmt.Sprintf("its part %s has more than %d cells beyond column %s, where no survey data goes (a damaged or hostile file)", short(name, 60), maxFarCells, ColumnLetter(maxColumns-1))
	case errors.Is(xmlErr, errCutShort), !checked && !closesRoot(sc.tail):
		return fmt.Sprintf("it is a damaged .xlsx (its part %s is cut short)", short(name, 60))
	case xmlErr != nil:
		return fmt.Sprintf("it is a damaged .xlsx (the XML of its part %s is malformed: %s)", short(name, 60), short(xmlMessage(xmlErr), 80))
	}
	return ""
}

var (
	errNotChecked = errors.New("encoding not checked")
	errCutShort   = errors.New("the part ends before its root element is closed")
	errFarCells   = errors.New("too many cells beyond maxColumns")
)

// maxFarCells is how many cells beyond column maxColumns a sheet part may
// have: excelize's row reader makes every such row a slice out to that column
// (16384 cells at XFD), so a few thousand of them cost gigabytes. A handful of
// stray values are read (and warned about); more are refused.
const maxFarCells = 200

// farCell reports whether a cell element's reference lies beyond maxColumns.
func farCell(attrs []xml.Attr) bool {
	for _, a := range attrs {
		if a.Name.Local != "r" {
			continue
		}
		col := 0
		for i := 0; i < len(a.Value) && a.Value[i] >= 'A' && a.Value[i] <= 'Z' && col <= maxColumns; i++ {
			col = col*26 + int(a.Value[i]-'A') + 1
		}
		return col > maxColumns
	}
	return false
}

// closesRoot reports whether the part's last bytes close its root element
// (</worksheet>, </x:worksheet>, </sst>).
func closesRoot(tail []byte) bool {
	t := bytes.TrimRight(tail, " \t\r\n\x00")
	i := bytes.LastIndex(t, []byte("</"))
	if i < 0 || !bytes.HasSuffix(t, []byte(">")) {
		return false
	}
	tag := string(bytes.TrimSpace(t[i+2 : len(t)-1]))
	if j := strings.LastIndexByte(tag, ':'); j >= 0 {
		tag = tag[j+1:]
	}
	switch tag {
	case "worksheet", "sst", "chartsheet", "dialogsheet", "macrosheet":
		return true
	}
	return false
}

// xmlMessage words an XML decoder error without its type prefix.
func xmlMessage(err error) string {
	var se *xml.SyntaxError
	if errors.As(err, &se) {
		return fmt.Sprintf("%s on line %d", se.Msg, se.Line)
	}
	if errors.Is(err, io.ErrUnexpectedEOF) {
		return "it ends in the middle of an element"
	}
	return err.Error()
}
