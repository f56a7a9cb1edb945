package inventory

import (
	"archive/zip"
	"bytes"
	"crypto/sha256"
	"encoding/hex"
	"errors"
	"fmt"
	"io"
	"os"
	"strconv"
	"strings"
	"unicode/utf8"

	"github.com/xuri/excelize/v2"
)

// ErrUnreadable marks a file that is not a readable .xlsx survey at all (empty,
// a CSV renamed, truncated, password-protected, too large, random bytes). The
// command maps it to exit code 2. The error's text is one sentence.
var ErrUnreadable = errors.New("unreadable survey")

// UnreadableError says in one sentence why a file could not be read as a workbook.
type UnreadableError struct {
	Path   string
	Reason string // e.g. "it is empty"
	Err    error  // underlying cause, may be nil
}

// Error returns one sentence: `survey.xlsx cannot be read as a survey workbook: it is empty.`
func (e *UnreadableError) Error() string {
	name := e.Path
	if name == "" {
		name = "the survey"
	}
	return fmt.Sprintf("%s cannot be read as a survey workbook: %s.", name, e.Reason)
}

// Unwrap returns ErrUnreadable and the cause, for errors.Is.
func (e *UnreadableError) Unwrap() []error {
	if e.Err == nil {
		return []error{ErrUnreadable}
	}
	return []error{ErrUnreadable, e.Err}
}

// ReadOptions bounds what the reader accepts from an untrusted file. Zero
// values take the defaults.
type ReadOptions struct {
	// MaxFileSize refuses files larger than this many bytes before opening them
	// (default 256 MiB; a survey is a few hundred kB, a full sheet about 50 MiB).
	MaxFileSize int64
	// UnzipSizeLimit caps the unpacked size of the whole workbook (default 2 GiB).
	UnzipSizeLimit int64
	// UnzipXMLSizeLimit caps one unpacked part kept in memory; larger parts go
	// to temporary files in a private folder (default 16 MiB).
	UnzipXMLSizeLimit int64
	// TmpDir is the folder in which a private temporary folder is made and
	// removed again ("" for the system's).
	TmpDir string
	// MaxRows caps the rows read per sheet (default DefaultMaxRows, the
	// sheet's own row limit); a sheet with more gets an error and the rest is
	// not read.
	MaxRows int
}

// Defaults of ReadOptions.
const (
	// A survey of a sheet's full 1,048,575 object rows is about 50 MiB and
	// unpacks to about 0.5 GiB; parts above DefaultUnzipXMLSizeLimit are read
	// from temporary files, so the unpack limit bounds disk, not memory.
	DefaultMaxFileSize       = 256 << 20
	DefaultUnzipSizeLimit    = 2 << 30
	DefaultUnzipXMLSizeLimit = 16 << 20
	DefaultMaxRows           = excelize.TotalRows
)

func (o ReadOptions) withDefaults() ReadOptions {
	if o.MaxFileSize <= 0 {
		o.MaxFileSize = DefaultMaxFileSize
	}
	if o.UnzipSizeLimit <= 0 {
		o.UnzipSizeLimit = DefaultUnzipSizeLimit
	}
	if o.UnzipXMLSizeLimit <= 0 {
		o.UnzipXMLSizeLimit = DefaultUnzipXMLSizeLimit
	}
	if o.UnzipXMLSizeLimit > o.UnzipSizeLimit {
		o.UnzipXMLSizeLimit = o.UnzipSizeLimit
	}
	if o.MaxRows <= 0 {
		o.MaxRows = DefaultMaxRows
	}
	return o
}

// ReadFile reads and validates the survey workbook at path. It returns an
// error wrapping ErrUnreadable when the file is not a readable workbook (the
// file is refused before opening when larger than opts.MaxFileSize); every
// problem inside a readable workbook is a Problem in the Survey instead, and
// the error is nil. The file is never written to.
func ReadFile(path string, opts ReadOptions) (*Survey, error) {
	return readFile(path, opts, nil)
}

func readFile(path string, opts ReadOptions, hooks *streamHooks) (*Survey, error) {
	opts = opts.withDefaults()
	fi, err := os.Stat(path)
	if err != nil {
		return nil, &UnreadableError{Path: path, Reason: "the file cannot be opened (" + plainOSError(err) + ")", Err: err}
	}
	if fi.IsDir() {
		return nil, &UnreadableError{Path: path, Reason: "it is a folder, not a file"}
	}
	if fi.Size() > opts.MaxFileSize {
		return nil, &UnreadableError{Path: path, Reason: fmt.Sprintf("it is %s, larger than the %s a survey may be", sizeText(fi.Size()), sizeText(opts.MaxFileSize))}
	}
	fh, err := os.Open(path)
	if err != nil {
		return nil, &UnreadableError{Path: path, Reason: "the file cannot be opened (" + plainOSError(err) + ")", Err: err}
	}
	h := sha256.New()
	head := &headBuffer{max: 512}
	n, err := io.Copy(io.MultiWriter(h, head), io.LimitReader(fh, opts.MaxFileSize+1))
	fh.Close()
	if err != nil {
		return nil, &UnreadableError{Path: path, Reason: "reading it failed (" + plainOSError(err) + ")", Err: err}
	}
	if n > opts.MaxFileSize {
		return nil, &UnreadableError{Path: path, Reason: fmt.Sprintf("it is larger than the %s a survey may be", sizeText(opts.MaxFileSize))}
	}
	if why := sniff(head.b, n); why != "" {
		return nil, &UnreadableError{Path: path, Reason: why}
	}
	if zr, err := zip.OpenReader(path); err == nil {
		why := checkParts(&zr.Reader, opts)
		zr.Close()
		if why != "" {
			return nil, &UnreadableError{Path: path, Reason: why}
		}
	}
	sum := hex.EncodeToString(h.Sum(nil))
	if hooks != nil {
		hooks.path, hooks.sha = path, sum
	}
	s, err := openAndRead(path, opts, func(o excelize.Options) (*excelize.File, error) {
		return excelize.OpenFile(path, o)
	}, hooks)
	if err != nil {
		return s, err
	}
	s.Path = path
	s.SHA256 = sum
	return s, nil
}

// Read reads and validates a survey workbook held in memory (as ReadFile does;
// name is used in messages only).
func Read(data []byte, name string, opts ReadOptions) (*Survey, error) {
	opts = opts.withDefaults()
	if int64(len(data)) > opts.MaxFileSize {
		return nil, &UnreadableError{Path: name, Reason: fmt.Sprintf("it is %s, larger than the %s a survey may be", sizeText(int64(len(data))), sizeText(opts.MaxFileSize))}
	}
	if why := sniff(data, int64(len(data))); why != "" {
		return nil, &UnreadableError{Path: name, Reason: why}
	}
	if zr, err := zip.NewReader(bytes.NewReader(data), int64(len(data))); err == nil {
		if why := checkParts(zr, opts); why != "" {
			return nil, &UnreadableError{Path: name, Reason: why}
		}
	}
	s, err := openAndRead(name, opts, func(o excelize.Options) (*excelize.File, error) {
		return excelize.OpenReader(bytes.NewReader(data), o)
	}, nil)
	if err != nil {
		return nil, err
	}
	sum := sha256.Sum256(data)
	s.SHA256 = hex.EncodeToString(sum[:])
	return s, nil
}

// openAndRead opens the workbook in a private temporary folder, reads it and
// turns a panic inside excelize or the reader into an UnreadableError.
func openAndRead(name string, opts ReadOptions, open func(excelize.Options) (*excelize.File, error), hooks *streamHooks) (s *Survey, err error) {
	tmp, err := os.MkdirTemp(opts.TmpDir, "sparkmargin-read-")
	if err != nil {
		return nil, fmt.Errorf("making a temporary folder for reading %s: %w", name, err)
	}
	defer os.RemoveAll(tmp)
	defer func() {
		if r := recover(); r != nil {
			s = nil
			err = &UnreadableError{Path: name, Reason: fmt.Sprintf("the workbook is malformed and reading it failed (%v)", short(fmt.Sprint(r), 120))}
		}
	}()
	f, err := open(excelize.Options{
		UnzipSizeLimit:    opts.UnzipSizeLimit,
		UnzipXMLSizeLimit: opts.UnzipXMLSizeLimit,
		TmpDir:            tmp,
	})
	if err != nil {
		if f != nil {
			f.Close()
		}
		return nil, &UnreadableError{Path: name, Reason: openFailure(err, opts), Err: err}
	}
	defer f.Close()
	r := &reader{f: f, opts: opts}
	if hooks != nil {
		return r.stream(hooks)
	}
	s = r.read()
	return s, nil
}

// openFailure words an excelize open error for a surveyor.
func openFailure(err error, opts ReadOptions) string {
	msg := err.Error()
	switch {
	case errors.Is(err, excelize.ErrWorkbookFileFormat), errors.Is(err, excelize.ErrWorkbookPassword):
		return "it is password-protected (encrypted) or an old-format .xls; save it as an unprotected .xlsx"
	case strings.Contains(msg, "unzip size"):
		return fmt.Sprintf("its contents unpack to more than the %s limit (a damaged or hostile file)", sizeText(opts.UnzipSizeLimit))
	case strings.Contains(msg, "zip"):
		return "it is a damaged or truncated .xlsx (the zip container cannot be read)"
	default:
		return "it is not a valid .xlsx workbook (" + short(msg, 100) + ")"
	}
}

// sniff looks at the first bytes and returns a reason when the file is plainly no .xlsx.
func sniff(head []byte, size int64) string {
	switch {
	case size == 0:
		return "it is empty"
	case bytes.HasPrefix(head, []byte("PK\x03\x04")):
		return ""
	case bytes.HasPrefix(head, []byte{0xD0, 0xCF, 0x11, 0xE0, 0xA1, 0xB1, 0x1A, 0xE1}):
		return "it is password-protected (encrypted) or an old-format .xls; save it as an unprotected .xlsx"
	case bytes.HasPrefix(head, []byte("PK")):
		return "it is a damaged or truncated .xlsx (the zip container cannot be read)"
	case looksText(head):
		return "it is a text or CSV file, not an .xlsx workbook; open it in a spreadsheet program and save it as .xlsx"
	default:
		return "it is not an .xlsx workbook"
	}
}

// looksText reports whether b is mostly printable UTF-8 text.
func looksText(b []byte) bool {
	if !utf8.Valid(b) && !utf8.Valid(b[:max(0, len(b)-4)]) {
		return false
	}
	ctl := 0
	for _, c := range b {
		if c < 0x20 && c != '\n' && c != '\r' && c != '\t' {
			ctl++
		}
	}
	return ctl == 0
}

// headBuffer keeps the first max bytes written to it.
type headBuffer struct {
	b   []byte
	max int
}

func (h *headBuffer) Write(p []byte) (int, error) {
	if room := h.max - len(h.b); room > 0 {
		h.b = append(h.b, p[:min(room, len(p))]...)
	}
	return len(p), nil
}

func sizeText(n int64) string {
	switch {
	case n >= 1<<20:
		return fmt.Sprintf("%.1f MiB", float64(n)/(1<<20))
	case n >= 1<<10:
		return fmt.Sprintf("%.1f KiB", float64(n)/(1<<10))
	}
	return fmt.Sprintf("%d bytes", n)
}

func plainOSError(err error) string {
	var pe *os.PathError
	if errors.As(err, &pe) {
		return pe.Err.Error()
	}
	return err.Error()
}

// short cuts s to at most n runes, marking the cut.
func short(s string, n int) string {
	if len(s) <= n {
		return s // no more bytes than n, so no more runes
	}
	r := []rune(s)
	if len(r) <= n {
		return s
	}
	return string(r[:n]) + "…"
}

// rawRow is one non-blank data row of a table sheet.
type rawRow struct {
	Row    int
	Cells  []string
	Hidden bool
}

// table is one table sheet as read: its header and its non-blank data rows.
type table struct {
	Sheet     string // contract name
	Actual    string // name in the workbook
	Present   bool
	HeaderRow int                 // 0 when no header was found
	Cols      map[int]HeaderMatch // by 0-based column index
	Headed    map[int]bool        // columns with a non-blank header cell (known or not)
	Bool      map[string]bool     // A1 references of cells stored as booleans in numeric columns
	Formula   map[string]string   // A1 references of formula cells without a stored result, with the formula
	Dated     map[string]string   // A1 references of numbers formatted as dates in numeric columns, with the date shown
	Index     map[string]int      // column name -> index (first occurrence)
	BadUnit   map[string]Problem  // numeric columns whose header unit is wrong
	Missing   []Problem           // missing required columns (reject every row)
	Rows      []rawRow
	rowsSeen  int          // data rows read below the header (kept in Rows or handed to the row hook)
	units     map[int]Unit // parsed header units by column index (see headerUnit)
	refEnd    []int        // end of column j's letters in a row's references, without the row numbers (see field.ref)
	Problems  []Problem    // sheet and header problems
}

// reader holds one open workbook while it is read.
type reader struct {
	f    *excelize.File
	opts ReadOptions
	// rowHook, when set, receives the data rows of hookSheet below its header
	// instead of Rows; it returns false to stop reading the sheet.
	rowHook   func(t *table, rr rawRow) bool
	hookSheet string
	date1904  bool
	sheets    map[string]string // normalised name -> actual
	// dateStyles caches whether a style index shows dates (see dateStyled).
	dateStyles map[int]bool
	// farRow is, per sheet, the first row with a value beyond maxColumns.
	farRow map[string]int
}

// helperSheets are sheet names a template or a spreadsheet program may add that
// are not survey data; they are ignored without a warning.
func helperSheets() map[string]bool {
	return map[string]bool{"lists": true, "help": true, "read me": true, "readme": true, "instructions": true, "about": true}
}

func (r *reader) read() *Survey {
	s, site := r.readSheets()
	tables := map[string]*table{}
	for _, sh := range []string{SheetAtmospheres, SheetStations, SheetObjects, SheetMaterials, SheetChanges} {
		tables[sh] = r.readTable(sh)
	}
	validate(s, site, tables)
	return s
}

// readSheets lists the workbook's sheets (warning about unknown and hidden
// ones) and reads the Site sheet.
func (r *reader) readSheets() (*Survey, *siteSheet) {
	s := &Survey{}
	if p, err := r.f.GetWorkbookProps(); err == nil && p.Date1904 != nil {
		r.date1904 = *p.Date1904
	}
	r.sheets = map[string]string{}
	known := map[string]bool{}
	for _, n := range append(Sheets(), SheetChanges) {
		known[NormalizeName(n)] = true
	}
	for _, name := range r.f.GetSheetList() {
		n := NormalizeName(name)
		if _, dup := r.sheets[n]; dup {
			continue
		}
		r.sheets[n] = name
		if !known[n] && !helperSheets()[n] {
			s.Problems = append(s.Problems, Problem{Sheet: name, Severity: Warning,
				Message: fmt.Sprintf("sheet %q is not part of the survey and is not read", short(name, 60)),
				Fix:     "rename it to one of Site, Atmospheres, Stations, Objects, Materials, Changes if it holds survey data"})
		}
		if known[n] {
			if vis, err := r.f.GetSheetVisible(name); err == nil && !vis {
				s.Problems = append(s.Problems, Problem{Sheet: contractSheetName(n), Severity: Warning,
					Message: "the sheet is hidden; it is read like any other"})
			}
		}
	}
	return s, r.readSite(s)
}

// contractSheetName returns the contract spelling of a normalised sheet name.
func contractSheetName(n string) string {
	for _, sh := range append(Sheets(), SheetChanges) {
		if NormalizeName(sh) == n {
			return sh
		}
	}
	return n
}

// required columns per table sheet (their absence rejects every row).
func requiredColumns(sheet string) []string {
	switch sheet {
	case SheetAtmospheres:
		return []string{"ID", "Kind"}
	case SheetStations:
		return []string{"ID"}
	case SheetObjects:
		return []string{"ID", "Station", "Kind"}
	case SheetMaterials:
		return []string{"Name"}
	case SheetChanges:
		return []string{"Change", "Value"}
	}
	return nil
}

// headerScanRows is how many rows from the top may hold the header (a title
// row or two above it are allowed).
const headerScanRows = 10

// streamRows calls fn for every row of a sheet with its 1-based number and its
// raw cell values (numbers unformatted; formulas give their cached value).
func (r *reader) streamRows(actual string, fn func(row int, cells []string, hidden bool) bool) error {
	rows, err := r.f.Rows(actual)
	if err != nil {
		return err
	}
	defer rows.Close()
	n := 0
	for rows.Next() {
		n++
		cells, err := rows.Columns(excelize.Options{RawCellValue: true})
		if err != nil {
			return err
		}
		cells = r.boundCells(actual, n, cells)
		if !fn(n, cells, rows.GetRowOpts().Hidden) {
			break
		}
	}
	return rows.Error()
}

// maxColumns is the widest row the reader keeps: a survey has some thirty
// columns, and a stray value (or a hostile one) at column XFD would otherwise
// make every row a slice of 16384 cells.
const maxColumns = 1024

// boundCells drops a row's trailing blank cells (styled but empty cells far to
// the right are common) and cuts it at maxColumns, noting the first row of the
// sheet that had a value beyond.
func (r *reader) boundCells(sheet string, row int, cells []string) []string {
	n := len(cells)
	for n > 0 && strings.TrimSpace(cells[n-1]) == "" {
		n--
	}
	if n > maxColumns {
		if r.farRow == nil {
			r.farRow = map[string]int{}
		}
		if _, seen := r.farRow[sheet]; !seen {
			r.farRow[sheet] = row
		}
		n = maxColumns
	}
	return cells[:n:n]
}

func blankRow(cells []string) bool {
	for _, c := range cells {
		if strings.TrimSpace(c) != "" {
			return false
		}
	}
	return true
}

// readTable reads a table sheet: finds the header row (the first row within
// the first headerScanRows rows in which at least two cells, or every column
// of a sheet with fewer, match the contract's columns), matches its headers,
// and collects the non-blank rows below it.
func (r *reader) readTable(sheet string) *table {
	t := &table{Sheet: sheet, Cols: map[int]HeaderMatch{}, Headed: map[int]bool{}, Index: map[string]int{}, BadUnit: map[string]Problem{}}
	actual, ok := r.sheets[NormalizeName(sheet)]
	if !ok {
		return t
	}
	t.Present, t.Actual = true, actual
	cols := SheetColumns(sheet)
	need := min(2, len(cols))
	var above []int
	limited := false
	err := r.streamRows(actual, func(row int, cells []string, hidden bool) bool {
		if t.HeaderRow == 0 {
			if blankRow(cells) {
				return row < headerScanRows
			}
			hits := 0
			for _, c := range cells {
				if _, ok, _ := MatchHeader(c, cols); ok {
					hits++
				}
			}
			if hits >= need {
				t.HeaderRow = row
				r.matchHeaderRow(t, cols, cells)
				return true
			}
			above = append(above, row)
			return row < headerScanRows
		}
		if blankRow(cells) {
			return true
		}
		if t.rowsSeen >= r.opts.MaxRows {
			limited = true
			return false
		}
		t.rowsSeen++
		rr := rawRow{Row: row, Cells: cells, Hidden: hidden}
		if r.rowHook != nil && r.hookSheet == sheet {
			return r.rowHook(t, rr)
		}
		t.Rows = append(t.Rows, rr)
		return true
	})
	if err != nil {
		t.Problems = append(t.Problems, Problem{Sheet: sheet, Severity: Error, Err: err,
			Message: "the sheet cannot be read to its end (" + short(err.Error(), 100) + "); rows after the fault are not read",
			Fix:     "open the workbook in a spreadsheet program and save it again"})
	}
	if row, ok := r.farRow[actual]; ok {
		t.Problems = append(t.Problems, Problem{Sheet: sheet, Row: row, Severity: Warning,
			Message: fmt.Sprintf("values beyond column %s are not read (the first is on row %d)", ColumnLetter(maxColumns-1), row),
			Fix:     "move survey data into the template's columns"})
	}
	if limited {
		t.Problems = append(t.Problems, Problem{Sheet: sheet, Severity: Error,
			Message: fmt.Sprintf("the sheet has more than %d rows; rows after that are not read", r.opts.MaxRows),
			Fix:     "split the survey into several workbooks"})
	}
	if t.HeaderRow == 0 {
		// Every non-blank row is read and rejected: nothing is lost.
		_ = r.streamRows(actual, func(row int, cells []string, hidden bool) bool {
			if !blankRow(cells) {
				if len(t.Rows) >= r.opts.MaxRows {
					return false
				}
				t.Rows = append(t.Rows, rawRow{Row: row, Cells: cells, Hidden: hidden})
			}
			return true
		})
		if len(t.Rows) > 0 {
			p := Problem{Sheet: sheet, Row: t.Rows[0].Row, Severity: Error, Err: ErrMissingColumn,
				Message: fmt.Sprintf("no header row found in the first %d rows (a header names at least two columns such as %s)", headerScanRows, strings.Join(requiredColumns(sheet), ", ")),
				Fix:     "put the header row of the template above the data"}
			t.Problems = append(t.Problems, p)
			t.Missing = append(t.Missing, p)
		}
		return t
	}
	r.findBooleans(t)
	if len(above) > 0 {
		t.Problems = append(t.Problems, Problem{Sheet: sheet, Row: above[0], Severity: Warning,
			Message: fmt.Sprintf("rows above the header (row %d) are taken as a title and not read as data", t.HeaderRow)})
	}
	return t
}

// maxBoolCheckRows bounds the sheets in which cells reading 0 or 1 are checked
// for being booleans: the check loads the whole sheet, which a survey-sized
// sheet affords and a hostile one need not be given.
const maxBoolCheckRows = 5000

// maxBoolCheckCells bounds rows x widest row of a sheet checked cell by cell
// (5000 rows of the template's columns, with room to spare).
const maxBoolCheckCells = 5000 * 64

// findBooleans marks numeric cells stored as booleans (TRUE/FALSE), which the
// streaming reader returns as 1 and 0, and formula cells of known columns
// that hold no stored result, which it returns as blank (the reader never
// calculates a formula, so such a cell has no value; it must not pass for
// "not measured"). Only cells reading exactly 0 or 1, or blank, are asked
// about, after the rows are streamed. A formula without a result in a numeric
// column gets "=formula" as its text, so that the cell counts as given.
func (r *reader) findBooleans(t *table) {
	t.Bool = map[string]bool{}
	t.Formula = map[string]string{}
	t.Dated = map[string]string{}
	if len(t.Rows) > maxBoolCheckRows {
		return
	}
	// The per-cell questions load the whole sheet, which excelize fills out to
	// its widest row: bound rows x width too.
	width := 0
	for _, rr := range t.Rows {
		width = max(width, len(rr.Cells))
	}
	if len(t.Rows)*width > maxBoolCheckCells {
		return
	}
	for _, rr := range t.Rows {
		for i, m := range t.Cols {
			c := ""
			if i < len(rr.Cells) {
				c = rr.Cells[i]
			}
			ref := fmt.Sprintf("%s%d", ColumnLetter(i), rr.Row)
			numeric := m.Column.Dim != Text && m.Column.Dim != Date
			if strings.TrimSpace(c) == "" {
				if fm, err := r.f.GetCellFormula(t.Actual, ref); err == nil && strings.TrimSpace(fm) != "" {
					t.Formula[ref] = fm
					if numeric && i < len(rr.Cells) {
						rr.Cells[i] = "=" + fm
					}
				}
				continue
			}
			if !numeric {
				continue
			}
			if v, err := strconv.ParseFloat(c, 64); err == nil && r.dateStyled(t.Actual, ref) {
				t.Dated[ref] = c
				if d, err := excelize.ExcelDateToTime(v, r.date1904); err == nil {
					t.Dated[ref] = d.Format("2006-01-02")
				}
			}
			if c != "0" && c != "1" {
				continue
			}
			if ct, err := r.f.GetCellType(t.Actual, ref); err == nil && ct == excelize.CellTypeBool {
				t.Bool[ref] = true
			}
		}
	}
}

// dateStyled reports whether a cell's number format shows a date or time (a
// spreadsheet turns "1.3" or "3-5" typed in some locales into a date, whose
// serial number would otherwise be read as a plausible number).
func (r *reader) dateStyled(sheet, ref string) bool {
	idx, err := r.f.GetCellStyle(sheet, ref)
	if err != nil || idx == 0 {
		return false
	}
	if r.dateStyles == nil {
		r.dateStyles = map[int]bool{}
	}
	if d, ok := r.dateStyles[idx]; ok {
		return d
	}
	d := false
	if st, err := r.f.GetStyle(idx); err == nil {
		switch {
		case st.CustomNumFmt != nil:
			d = dateFormatCode(*st.CustomNumFmt)
		case st.NumFmt >= 14 && st.NumFmt <= 22, st.NumFmt >= 27 && st.NumFmt <= 36, st.NumFmt >= 45 && st.NumFmt <= 47, st.NumFmt >= 50 && st.NumFmt <= 58:
			d = true // the built-in date and time formats (ECMA-376 Part 1, 18.8.30)
		}
	}
	r.dateStyles[idx] = d
	return d
}

// dateFormatCode reports whether a number format code shows a date or time:
// outside quoted text, escapes and [..] sections it uses y, d, h or s.
func dateFormatCode(code string) bool {
	inQuote, inBracket := false, false
	for i := 0; i < len(code); i++ {
		c := code[i]
		switch {
		case inQuote:
			inQuote = c != '"'
		case inBracket:
			inBracket = c != ']'
		case c == '"':
			inQuote = true
		case c == '[':
			inBracket = true
		case c == 0x5c || c == '_' || c == '*': // backslash escape, padding, fill
			i++
		case strings.IndexByte("yYdDhHsS", c) >= 0:
			return true
		}
	}
	return false
}

// matchHeaderRow matches every header cell of a sheet.
func (r *reader) matchHeaderRow(t *table, cols []Column, cells []string) {
	row := t.HeaderRow
	for i, c := range cells {
		if strings.TrimSpace(c) == "" {
			continue
		}
		letter := ColumnLetter(i)
		t.Headed[i] = true
		m, ok, err := MatchHeader(c, cols)
		if !ok {
			fix := ""
			if near := Nearest(splitName(c), columnNames(cols)); near != "" {
				fix = fmt.Sprintf("did you mean %q?", near)
			}
			t.Problems = append(t.Problems, Problem{Sheet: t.Sheet, Row: row, Column: letter, Severity: Warning, Err: ErrUnknownColumn,
				Message: fmt.Sprintf("column %q is not part of the survey and is not read", short(strings.TrimSpace(c), 60)), Fix: fix})
			continue
		}
		if first, dup := t.Index[m.Column.Name]; dup {
			t.Problems = append(t.Problems, Problem{Sheet: t.Sheet, Row: row, Column: letter, Field: m.Column.Name, Severity: Error, Err: ErrDuplicateColumn,
				Message: fmt.Sprintf("column %s appears twice (%s and %s); only %s is read", m.Column.Name, ColumnLetter(first), letter, ColumnLetter(first)),
				Fix:     "delete or rename one of the two columns"})
			continue
		}
		if err != nil {
			sev := Error
			if m.Column.Dim == Text || m.Column.Dim == Date || m.Column.Dim == Dimensionless {
				sev = Warning
			}
			p := Problem{Sheet: t.Sheet, Row: row, Column: letter, Field: m.Column.Name, Severity: sev, Err: err,
				Message: strings.TrimPrefix(err.Error(), ErrHeaderUnit.Error()+": "),
				Fix:     fmt.Sprintf("write the header as %q", m.Column.Header())}
			t.Problems = append(t.Problems, p)
			if sev == Error {
				t.BadUnit[m.Column.Name] = p
			}
		}
		t.Cols[i] = m
		t.Index[m.Column.Name] = i
	}
	for _, name := range requiredColumns(t.Sheet) {
		if _, ok := t.Index[name]; !ok {
			p := Problem{Sheet: t.Sheet, Row: row, Field: name, Severity: Error, Err: ErrMissingColumn,
				Message: fmt.Sprintf("the header has no %s column, so no row of the sheet can be read", name),
				Fix:     fmt.Sprintf("add a column headed %q", name)}
			t.Problems = append(t.Problems, p)
			t.Missing = append(t.Missing, p)
		}
	}
}

// splitName returns the name part of a header ("Feild [kV/m]" -> "Feild").
func splitName(h string) string {
	n, _, _ := splitHeader(h)
	return n
}

// cellText returns the trimmed text of a row's cell in column name ("" when
// the column or the cell is absent), without its reference.
func (t *table) cellText(rr rawRow, name string) string {
	i, ok := t.Index[name]
	if !ok || i >= len(rr.Cells) {
		return ""
	}
	return strings.TrimSpace(rr.Cells[i])
}

// headerUnit returns the parsed unit of a numeric column's header, parsed
// once per column (ParseQuantity would parse it for every cell).
func (t *table) headerUnit(i int, unit string, dim Dimension) (Unit, error) {
	if u, ok := t.units[i]; ok {
		return u, nil
	}
	u, err := ParseUnit(unit, dim)
	if err != nil {
		return u, err // not kept: rare, and each cell gets its own error
	}
	if t.units == nil {
		t.units = map[int]Unit{}
	}
	t.units[i] = u
	return u, nil
}
