package book

import (
	"bufio"
	"errors"
	"fmt"
	"github.com/klauspost/compress/flate"
	"hash/crc32"
	"io"
	"math"
	"os"
	"strconv"
	"unicode/utf16"
	"unicode/utf8"
)

// RowWriter writes the data rows of one big table sheet (Objects, Findings)
// as worksheet XML straight into a compressed temporary file: no excelize
// cell values, no per-cell style hashing, and the deflate running on a second
// goroutine (the second core) while the next rows are made. excelize writes
// the sheet around the rows (header row, columns, panes, autofilter, print
// set-up); CanonicalZip splices the rows in before </sheetData>.
//
// The cells read back as those excelize's StreamWriter writes for the same
// cells (TestRowWriterReadsAsStreamWriter): text as inline strings with the
// same escaping (XML escaping, characters XML cannot hold replaced by U+FFFD,
// _xHHHH_ sequences protected as _x005F_xHHHH_, at most 32,767 UTF-16 units,
// xml:space="preserve" on leading or trailing white space), numbers in the
// shortest form that reads back the same at 15 significant digits, text
// starting with "=" kept as text. The XML is slimmer: a cell's reference is
// left out (it follows its neighbour or the row start; ECMA-376 Part 1,
// 18.3.1.4 makes r optional) except after a skipped cell, and an empty styled
// cell is self-closed.
type RowWriter struct {
	st   *Styles
	file *os.File
	buf  []byte
	// per column, the last style key and its id: a table column's cells have
	// one or two styles, so a struct compare replaces the map lookup.
	lastKey []styleKey
	lastID  []int
	lastRow int
	maxCol  int
	fixed   int // a style id every cell of the row takes (HeaderRow); 0: each cell's own

	// the compressing goroutine
	work chan []byte
	free chan []byte
	done chan error
	crc  uint32
	raw  int64
	err  error
}

// rowChunk is the size of the XML handed to the compressing goroutine at once.
const rowChunk = 256 << 10

// NewRowWriter starts the rows of a sheet; its compressed temporary file is
// made in dir ("" for the system's) and removed by Close.
func NewRowWriter(dir string, st *Styles) (*RowWriter, error) {
	f, err := os.CreateTemp(dir, "sparkmargin-rows-*.deflate")
	if err != nil {
		return nil, fmt.Errorf("rows: %w", err)
	}
	w := &RowWriter{st: st, file: f, work: make(chan []byte, 2), free: make(chan []byte, 3), done: make(chan error, 1)}
	for i := 0; i < 2; i++ {
		w.free <- make([]byte, 0, rowChunk+64<<10)
	}
	w.buf = make([]byte, 0, rowChunk+64<<10)
	go w.compress(w.work)
	return w, nil
}

// compress deflates the chunks in order; the stream ends with a sync flush
// (no final block) so that the rows can sit between the sheet's compressed
// head and tail in one deflate stream.
func (w *RowWriter) compress(work <-chan []byte) {
	bw := bufio.NewWriterSize(w.file, 256<<10)
	zw, err := flate.NewWriter(bw, flate.BestSpeed)
	for b := range work {
		if err == nil {
			w.crc = crc32.Update(w.crc, crc32.IEEETable, b)
			w.raw += int64(len(b))
			_, err = zw.Write(b)
		}
		w.free <- b[:0]
	}
	if err == nil {
		err = zw.Flush()
	}
	if err == nil {
		err = bw.Flush()
	}
	w.done <- err
}

// Row appends sheet row r (1-based; rows in increasing order) with the given
// cells from column A; height > 0 sets a custom row height in points.
func (w *RowWriter) Row(r int, cells []Cell, height float64) error {
	if w.err != nil {
		return w.err
	}
	if r <= w.lastRow || r > MaxSheetRows {
		return fmt.Errorf("rows: row %d after row %d (a sheet holds %d)", r, w.lastRow, MaxSheetRows)
	}
	w.lastRow = r
	for len(w.lastKey) < len(cells) {
		w.lastKey = append(w.lastKey, styleKey{})
		w.lastID = append(w.lastID, -1)
	}
	b := w.buf
	b = append(b, `<row r="`...)
	b = strconv.AppendInt(b, int64(r), 10)
	b = append(b, '"')
	if height > 0 {
		b = append(b, ` ht="`...)
		b = strconv.AppendFloat(b, height, 'f', -1, 64)
		b = append(b, `" customHeight="1"`...)
	}
	b = append(b, '>')
	skipped := false
	for i := range cells {
		c := &cells[i]
		if !c.Styled() {
			skipped = true
			continue
		}
		if i+1 > w.maxCol {
			w.maxCol = i + 1
		}
		k := styleKey{numFmt: c.NumFmt, mark: c.Mark, wrap: c.Wrap, bold: c.Bold, align: c.Align}
		if c.Fill != "" {
			k.fill, k.color = c.Fill, c.Color
		}
		if w.lastID[i] < 0 || w.lastKey[i] != k {
			w.lastKey[i], w.lastID[i] = k, w.st.get(k)
		}
		style := w.lastID[i]
		if w.fixed != 0 {
			style = w.fixed
		}
		b = append(b, "<c"...)
		if skipped {
			b = append(b, ` r="`...)
			b = appendColName(b, i+1)
			b = strconv.AppendInt(b, int64(r), 10)
			b = append(b, '"')
			skipped = false
		}
		if style != 0 {
			b = append(b, ` s="`...)
			b = strconv.AppendInt(b, int64(style), 10)
			b = append(b, '"')
		}
		b = AppendCellValue(b, c.V)
	}
	b = append(b, "</row>"...)
	w.buf = b
	if len(b) >= rowChunk {
		w.work <- b
		w.buf = <-w.free
	}
	return nil
}

// HeaderRow appends sheet row r as a table header (the header style, as
// StreamSink.Header writes it): a header repeated below the data rows (the
// Findings sheet's closed part) must come through the same writer, in order.
func (w *RowWriter) HeaderRow(r int, headers []string) error {
	cells := make([]Cell, len(headers))
	for i, h := range headers {
		cells[i] = Cell{V: h}
	}
	w.fixed = w.st.Header()
	defer func() { w.fixed = 0 }()
	return w.Row(r, cells, 42)
}

// MaxSheetRows is the most rows a worksheet holds (ECMA-376 and the
// spreadsheet programs: 1,048,576).
const MaxSheetRows = 1048576

// AppendCellValue appends the rest of a cell element after its attributes:
// ` t="inlineStr"><is><t>…</t></is></c>` for text, `><v>…</v></c>` for a
// number, `/>` for an empty cell.
func AppendCellValue(b []byte, v any) []byte {
	switch x := v.(type) {
	case nil:
		return append(b, "/>"...)
	case string:
		return appendInlineStr(b, x)
	case float64:
		if math.IsNaN(x) || math.IsInf(x, 0) {
			return appendInlineStr(b, strconv.FormatFloat(x, 'g', -1, 64)) // as excelize: "NaN", "+Inf"
		}
		b = append(b, "><v>"...)
		b = appendFloat(b, x)
		return append(b, "</v></c>"...)
	case int:
		b = append(b, "><v>"...)
		b = strconv.AppendInt(b, int64(x), 10)
		return append(b, "</v></c>"...)
	case bool:
		if x {
			return append(b, ` t="b"><v>1</v></c>`...)
		}
		return append(b, ` t="b"><v>0</v></c>`...)
	}
	return appendInlineStr(b, fmt.Sprint(v))
}

// appendFloat writes a number as excelize does: the shortest decimal that
// reads back the same, cut to 15 significant digits (what a spreadsheet keeps).
func appendFloat(b []byte, v float64) []byte {
	start := len(b)
	b = strconv.AppendFloat(b, v, 'f', -1, 64)
	if math.Abs(v) == math.MaxFloat64 {
		return b
	}
	str := b[start:]
	decimal := -1
	for i, c := range str {
		if c == '.' {
			decimal = i
			break
		}
	}
	significant := 0
	for idx := 0; idx < len(str); idx++ {
		c := str[idx]
		if c < '0' || c > '9' || significant == 0 && c == '0' {
			continue
		}
		significant++
		if significant <= 15 {
			continue
		}
		if decimal >= 0 && idx > decimal {
			end := idx
			if str[end-1] == '.' {
				end--
			}
			return b[:start+end]
		}
		if decimal < 0 {
			decimal = len(str)
		}
		for ; idx < decimal; idx++ {
			str[idx] = '0'
		}
		return b[:start+decimal]
	}
	return b
}

// appendInlineStr writes ` t="inlineStr"><is><t>text</t></is></c>` with the
// escaping rules of excelize's inline strings.
func appendInlineStr(b []byte, s string) []byte {
	s = truncateUTF16(s, maxCellUnits)
	b = append(b, ` t="inlineStr"><is><t`...)
	if s != "" {
		p, q := s[0], s[len(s)-1]
		if p == 9 || p == 10 || p == 13 || p == 32 || q == 9 || q == 10 || q == 13 || q == 32 {
			b = append(b, ` xml:space="preserve"`...)
		}
	}
	b = append(b, '>')
	b = appendXString(b, s)
	return append(b, "</t></is></c>"...)
}

// maxCellUnits is the most text a cell holds: 32,767 characters, counted in
// UTF-16 code units as the spreadsheet programs count them.
const maxCellUnits = 32767

func truncateUTF16(s string, n int) string {
	if len(s) <= n { // a UTF-16 unit takes at least one UTF-8 byte
		return s
	}
	cnt := 0
	for i, r := range s {
		if cnt += utf16.RuneLen(r); cnt > n {
			return s[:i]
		}
	}
	return s
}

// appendXString writes s XML-escaped (as encoding/xml's EscapeText, but a
// newline kept as it is) with every _xHHHH_ that a reader would decode
// protected by the _x005F_ escape of ECMA-376 Part 1, 22.9.2.19.
func appendXString(b []byte, s string) []byte {
	last := 0
	flush := func(i int) {
		b = append(b, s[last:i]...)
	}
	for i := 0; i < len(s); {
		c := s[i]
		if c < utf8.RuneSelf {
			var esc string
			switch c {
			case '"':
				esc = "&#34;"
			case '\'':
				esc = "&#39;"
			case '&':
				esc = "&amp;"
			case '<':
				esc = "&lt;"
			case '>':
				esc = "&gt;"
			case '\t':
				esc = "&#x9;"
			case '\r':
				esc = "&#xD;"
			case '\n':
				i++
				continue
			case '_':
				n, rep := xEscapeAt(s, i)
				if rep != "" {
					flush(i)
					b = append(b, rep...)
					last = i + n
				}
				if n == 0 {
					n = 1
				}
				i += n
				continue
			default:
				if c < 0x20 {
					esc = "\uFFFD"
				} else {
					i++
					continue
				}
			}
			flush(i)
			b = append(b, esc...)
			i++
			last = i
			continue
		}
		r, size := utf8.DecodeRuneInString(s[i:])
		if r == utf8.RuneError && size == 1 || !xmlChar(r) {
			flush(i)
			b = append(b, "\uFFFD"...)
			i += size
			last = i
			continue
		}
		i += size
	}
	flush(len(s))
	return b
}

// xmlChar reports whether r is a character XML 1.0 allows (above U+007F).
func xmlChar(r rune) bool {
	return r >= 0x80 && r <= 0xD7FF || r >= 0xE000 && r <= 0xFFFD || r >= 0x10000 && r <= 0x10FFFF
}

// xEscapeAt looks at s[i:], which starts with '_': when it is an _xHHHH_ it
// returns the 7 bytes it covers and, when a reader would decode it, what to
// write instead (the sequences of excelize's bstrMarshal; an _xHHHH_ naming
// no character is kept as it is, and the scan goes on after it).
func xEscapeAt(s string, i int) (int, string) {
	if !isXEscape(s, i) {
		return 0, ""
	}
	sub := s[i : i+7]
	if sub == "_x005F_" {
		if i+7+6 <= len(s) && isXEscapeTail(s, i+7) {
			if validEscape(s[i+8 : i+12]) {
				return 7, "_x005F_x005F_x005F_"
			}
		}
		return 7, "_x005F_x005F_"
	}
	if !validEscape(s[i+2 : i+6]) {
		return 7, ""
	}
	return 7, "_x005F" + sub
}

func isHex(c byte) bool { return c >= '0' && c <= '9' || c >= 'a' && c <= 'f' || c >= 'A' && c <= 'F' }

// isXEscape reports whether s[i:] starts with _xHHHH_.
func isXEscape(s string, i int) bool {
	return i+7 <= len(s) && s[i] == '_' && s[i+1] == 'x' && isHex(s[i+2]) && isHex(s[i+3]) && isHex(s[i+4]) && isHex(s[i+5]) && s[i+6] == '_'
}

// isXEscapeTail reports whether s[i:] starts with xHHHH_.
func isXEscapeTail(s string, i int) bool {
	return i+6 <= len(s) && s[i] == 'x' && isHex(s[i+1]) && isHex(s[i+2]) && isHex(s[i+3]) && isHex(s[i+4]) && s[i+5] == '_'
}

// validEscape reports whether HHHH names a character (not a lone surrogate).
func validEscape(h string) bool {
	v, err := strconv.ParseUint(h, 16, 32)
	return err == nil && !(v >= 0xD800 && v <= 0xDFFF)
}

// appendColName appends the letters of column n (1-based).
func appendColName(b []byte, n int) []byte {
	var tmp [4]byte
	i := len(tmp)
	for n > 0 {
		n--
		i--
		tmp[i] = byte('A' + n%26)
		n /= 26
	}
	return append(b, tmp[i:]...)
}

// Rows is the finished, compressed XML of a sheet's data rows.
type Rows struct {
	Path     string // the compressed file: a deflate stream without its final block
	CRC      uint32 // of the uncompressed XML
	Size     int64  // uncompressed bytes
	LastRow  int    // the last row written (0 for none)
	LastCol  int    // the last column holding a cell
	Compress int64  // compressed bytes
}

// Finish ends the rows and returns where they are.
func (w *RowWriter) Finish() (*Rows, error) {
	if w.work == nil {
		return nil, errors.New("rows: finished twice")
	}
	if len(w.buf) > 0 {
		w.work <- w.buf
		w.buf = nil
	}
	close(w.work)
	w.work = nil
	if err := <-w.done; err != nil {
		return nil, fmt.Errorf("rows: %w", err)
	}
	n, err := w.file.Seek(0, io.SeekEnd)
	if err != nil {
		return nil, fmt.Errorf("rows: %w", err)
	}
	return &Rows{Path: w.file.Name(), CRC: w.crc, Size: w.raw, LastRow: w.lastRow, LastCol: w.maxCol, Compress: n}, nil
}

// Close stops the writer and removes its file; it may be called more than once.
func (w *RowWriter) Close() error {
	if w.work != nil {
		close(w.work)
		w.work = nil
		<-w.done
	}
	if w.file == nil {
		return nil
	}
	_ = w.file.Close()
	err := os.Remove(w.file.Name())
	w.file = nil
	return err
}
