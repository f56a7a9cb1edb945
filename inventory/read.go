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
	// UnzipXMLSizeLimit is no longer used: the reader keeps no part whole,
	// in memory or on disk (it streams every part it reads).
	UnzipXMLSizeLimit int64
	// TmpDir is no longer used: the reader makes no temporary files.
	TmpDir string
	// CountObjectRows counts the Objects sheet's rows before reading them
	// when the sheet declares no range (one quick extra unpacking of that
	// part), so that Survey.DeclaredObjectRows can size a progress line.
	CountObjectRows bool
	// MaxRows caps the rows read per sheet (default DefaultMaxRows, the
	// sheet's own row limit); a sheet with more gets an error and the rest is
	// not read.
	MaxRows int
}

// Defaults of ReadOptions.
const (
	// A survey of a sheet's full 1,048,575 object rows is about 50 MiB and
	// unpacks to about 0.5 GiB; every part is read as a stream, so the
	// unpack limit bounds the work, not memory.
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
	if !fi.Mode().IsRegular() {
		// A named pipe would block the open for ever; a device or socket is no workbook.
		return nil, &UnreadableError{Path: path, Reason: notRegular(fi.Mode())}
	}
	if fi.Size() > opts.MaxFileSize {
		return nil, &UnreadableError{Path: path, Reason: fmt.Sprintf("it is %s, larger than the %s a survey may be", sizeText(fi.Size()), sizeText(opts.MaxFileSize))}
	}
	fh, err := os.Open(path)
	if err != nil {
		return nil, &UnreadableError{Path: path, Reason: "the file cannot be opened (" + plainOSError(err) + ")", Err: err}
	}
	defer fh.Close()
	// The one open file is hashed and read: a path swapped between the check
	// above and the open is refused, not read.
	if ofi, err := fh.Stat(); err != nil || !ofi.Mode().IsRegular() || !os.SameFile(fi, ofi) {
		return nil, &UnreadableError{Path: path, Reason: "the file changed while it was being opened; run again"}
	}
	h := sha256.New()
	head := &headBuffer{max: 512}
	n, err := io.Copy(io.MultiWriter(h, head), io.LimitReader(fh, opts.MaxFileSize+1))
	if err != nil {
		return nil, &UnreadableError{Path: path, Reason: "reading it failed (" + plainOSError(err) + ")", Err: err}
	}
	if n > opts.MaxFileSize {
		return nil, &UnreadableError{Path: path, Reason: fmt.Sprintf("it is larger than the %s a survey may be", sizeText(opts.MaxFileSize))}
	}
	if why := sniff(head.b, n); why != "" {
		return nil, &UnreadableError{Path: path, Reason: why}
	}
	zr, err := zip.NewReader(io.NewSectionReader(fh, 0, n), n)
	if err != nil {
		return nil, &UnreadableError{Path: path, Reason: zipFailure, Err: err}
	}
	sum := hex.EncodeToString(h.Sum(nil))
	if hooks != nil {
		hooks.path, hooks.sha = path, sum
	}
	s, err := readPackage(path, zr, n, opts, hooks)
	if err != nil {
		return nil, err
	}
	s.Path = path
	s.SHA256 = sum
	return s, nil
}

// zipFailure is the reason given for a file that starts as a zip but whose
// zip directory cannot be read.
const zipFailure = "it is a damaged or truncated .xlsx (the zip container cannot be read)"

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
	zr, err := zip.NewReader(bytes.NewReader(data), int64(len(data)))
	if err != nil {
		return nil, &UnreadableError{Path: name, Reason: zipFailure, Err: err}
	}
	s, err := readPackage(name, zr, int64(len(data)), opts, nil)
	if err != nil {
		return nil, err
	}
	sum := sha256.Sum256(data)
	s.SHA256 = hex.EncodeToString(sum[:])
	return s, nil
}

// readPackage reads the workbook in zr (of size bytes) and turns a fault of
// a part, or a panic inside the reader, into an UnreadableError. The reader
// unpacks every part it reads as a stream and keeps no part whole, in memory
// or on disk: it makes no temporary files.
func readPackage(name string, zr *zip.Reader, size int64, opts ReadOptions, hooks *streamHooks) (s *Survey, err error) {
	defer func() {
		if r := recover(); r != nil {
			if pf, ok := r.(*pkgFault); ok {
				s, err = nil, &UnreadableError{Path: name, Reason: pf.reason, Err: pf}
				return
			}
			s = nil
			err = &UnreadableError{Path: name, Reason: fmt.Sprintf("the workbook is malformed and reading it failed (%v)", short(fmt.Sprint(r), 120))}
		}
	}()
	p, err := openPkg(zr, size, opts)
	if err != nil {
		return nil, &UnreadableError{Path: name, Reason: err.Error(), Err: err}
	}
	r := &reader{p: p, opts: opts}
	if hooks != nil {
		return r.stream(hooks)
	}
	return r.read(), nil
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
	Marks  []cellMark // cells of note (booleans, formulas without a result, dates, unreadable cells)
	Fault  *rowFault  // why the row cannot be placed or trusted (it is rejected)
	// Unordered is true when a cell stood left of the one before it in the
	// file (each is placed by its reference; the differential test uses it).
	Unordered bool
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
	Fault     map[string]string   // A1 references of cells of known columns that cannot be read, with why
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
	p    *xlsxPkg
	opts ReadOptions
	// rowHook, when set, receives the data rows of hookSheet below its header
	// instead of Rows; it returns false to stop reading the sheet.
	rowHook   func(t *table, rr rawRow) bool
	hookSheet string
	date1904  bool
	sheets    map[string]wbSheet // normalised name -> the one sheet of that name
	// ambiguous holds the survey sheets that more than one sheet of the
	// workbook matches (the problem to report for each); none of them is read.
	ambiguous map[string]Problem
	// farRow is, per sheet, the first row with a value beyond maxColumns.
	farRow map[string]int
	// keptCells and keptText count what is kept of the rows read (see keep).
	keptCells, keptText int64
}

// helperSheets are sheet names a template or a spreadsheet program may add that
// are not survey data; they are ignored without a warning.
func helperSheets() map[string]bool {
	return map[string]bool{"lists": true, "help": true, "read me": true, "readme": true, "instructions": true, "about": true,
		NormalizeName(SheetKindNeeds): true} // the template's help sheet
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

// ErrAmbiguousSheet marks a survey sheet that more than one sheet of the
// workbook matches (names that differ only in case or spaces): none of them
// is read, since which one is meant cannot be told.
var ErrAmbiguousSheet = errors.New("two sheets match one survey sheet")

// compactName is a sheet name without case and spaces, to find sheets that
// a reader could take for one another ("Objects", "OBJECTS", "Obj ects").
func compactName(name string) string {
	return strings.ReplaceAll(NormalizeName(name), " ", "")
}

// readSheets lists the workbook's sheets (warning about unknown and hidden
// ones, refusing two that match one survey sheet), checks the parts of the
// sheets that are not read, and reads the Site sheet.
func (r *reader) readSheets() (*Survey, *siteSheet) {
	s := &Survey{}
	r.date1904 = r.p.date1904
	r.sheets = map[string]wbSheet{}
	r.ambiguous = map[string]Problem{}
	known := map[string]string{} // compact name -> normalised contract name
	for _, n := range append(Sheets(), SheetChanges) {
		known[compactName(n)] = NormalizeName(n)
	}
	groups := map[string][]string{}
	for _, sh := range r.p.sheets {
		if c := compactName(sh.Name); known[c] != "" {
			groups[c] = append(groups[c], sh.Name)
		}
	}
	for c, names := range groups {
		if len(names) > 1 {
			n := known[c]
			quoted := make([]string, len(names))
			for i, name := range names {
				quoted[i] = fmt.Sprintf("%q", short(name, 40))
			}
			r.ambiguous[n] = Problem{Sheet: contractSheetName(n), Severity: Error, Err: ErrAmbiguousSheet,
				Message: fmt.Sprintf("the workbook has %d sheets that match the %s sheet (%s); which one holds the survey cannot be told, so none of them is read", len(names), contractSheetName(n), strings.Join(quoted, ", ")),
				Fix:     "delete or rename all but one of them"}
		}
	}
	for _, sh := range r.p.sheets {
		n := NormalizeName(sh.Name)
		if _, amb := r.ambiguous[known[compactName(n)]]; amb {
			continue // reported once above
		}
		isKnown := known[compactName(n)] == n
		if _, dup := r.sheets[n]; dup {
			continue
		}
		if isKnown {
			r.sheets[n] = sh
		} else if !helperSheets()[n] {
			s.Problems = append(s.Problems, Problem{Sheet: sh.Name, Severity: Warning,
				Message: fmt.Sprintf("sheet %q is not part of the survey and is not read", short(sh.Name, 60)),
				Fix:     "rename it to one of Site, Atmospheres, Stations, Objects, Materials, Changes if it holds survey data"})
		}
		if isKnown && (sh.State == "hidden" || sh.State == "veryHidden") {
			s.Problems = append(s.Problems, Problem{Sheet: contractSheetName(n), Severity: Warning,
				Message: "the sheet is hidden; it is read like any other"})
		}
	}
	r.checkUnread()
	if sh, ok := r.sheets[NormalizeName(SheetObjects)]; ok {
		last := r.p.declaredLastRow(sh.Part)
		if last <= 1 && r.p.opts.CountObjectRows { // no range, or "A1" as some writers leave it
			last = r.p.countedRows(sh.Part)
		}
		s.DeclaredObjectRows = max(0, last-1) // less the header row
	}
	return s, r.readSite(s)
}

// checkUnread reads the part of every sheet that is not read as survey data
// (other sheets, helper sheets, sheets of an ambiguous name) to its end, so
// that a damaged or hostile part is refused wherever it is.
func (r *reader) checkUnread() {
	read := map[string]bool{}
	for _, sh := range r.sheets {
		read[partKey(sh.Part)] = true
	}
	for _, sh := range r.p.sheets {
		if k := partKey(sh.Part); !read[k] {
			read[k] = true
			r.streamRows(sh, func(rawRow) bool { return true })
		}
	}
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

// streamRows calls fn for every row of a sheet that holds a cell or a
// fault (see scanSheet), until fn returns false. A part that cannot be read
// to its end stops the whole reading: the workbook is refused, and the
// reason names the part and the last row read.
func (r *reader) streamRows(sh wbSheet, fn func(rr rawRow) bool) {
	streamed := r.rowHook != nil && NormalizeName(sh.Name) == NormalizeName(r.hookSheet)
	far, err := r.p.scanSheet(sh.Name, sh.Part, func(rr rawRow) bool {
		if !streamed {
			r.keep(sh.Name, rr)
		}
		return fn(rr)
	})
	if far > 0 {
		if r.farRow == nil {
			r.farRow = map[string]int{}
		}
		r.farRow[sh.Name] = far
	}
	if err != nil {
		panic(err) // a *pkgFault, which readPackage turns into an UnreadableError
	}
}

// Bounds of what the reader keeps of the rows it does not stream (every
// sheet read by ReadFile; all but Objects by StreamFile), which grow with
// the file's size: a real cell costs more than one byte of the compressed
// file, and its text does not unpack to more than 16 times its compressed
// size. A full survey of a million rows keeps some 30 million cells from a
// file of about 50 MB. // common practice, no source
const (
	minKeptCells    = 1 << 22
	minKeptText     = 64 << 20
	keptTextPerByte = 16
)

// keep counts the cells and text of a row the reader may keep, and stops the
// reading when a file holds far more than its size can really hold (a
// hostile file of well-compressed cells).
func (r *reader) keep(sheet string, rr rawRow) {
	r.keptCells += int64(len(rr.Cells))
	for _, c := range rr.Cells {
		r.keptText += int64(len(c))
	}
	maxCells, maxText := max(minKeptCells, r.p.size), max(minKeptText, keptTextPerByte*r.p.size)
	if r.keptCells > maxCells || r.keptText > maxText {
		panic(&pkgFault{fmt.Sprintf("it holds more cells or text than a workbook of %s can really hold (more than %d cells or %s of text; reading stopped at row %d of sheet %s): a damaged or hostile file", sizeText(r.p.size), maxCells, sizeText(maxText), rr.Row, short(sheet, 60))})
	}
}

// maxColumns is the widest row the reader keeps: a survey has some thirty
// columns, and a stray value (or a hostile one) at column XFD would otherwise
// make every row a slice of 16384 cells.
const maxColumns = 1024

// maxFarCells is how many cells beyond column maxColumns a sheet part may
// have: a handful of stray values are warned about and not read; more make
// the file one that is refused as damaged or hostile.
const maxFarCells = 200

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
// and collects the non-blank rows below it, noting the cells of known
// columns that are booleans, formulas without a result, dates or unreadable.
// A sheet without a header has every non-blank row read and rejected.
func (r *reader) readTable(sheet string) *table {
	t := &table{Sheet: sheet, Cols: map[int]HeaderMatch{}, Headed: map[int]bool{}, Index: map[string]int{}, BadUnit: map[string]Problem{},
		Bool: map[string]bool{}, Formula: map[string]string{}, Dated: map[string]string{}, Fault: map[string]string{}}
	n := NormalizeName(sheet)
	if p, ok := r.ambiguous[n]; ok {
		t.Present = true
		t.Problems = append(t.Problems, p)
		t.Missing = append(t.Missing, p)
		return t
	}
	sh, ok := r.sheets[n]
	if !ok {
		return t
	}
	t.Present, t.Actual = true, sh.Name
	cols := SheetColumns(sheet)
	need := min(2, len(cols))
	var above []rawRow // non-blank rows before the header, or every one of a sheet without
	limited, noHeader := false, false
	r.streamRows(sh, func(rr rawRow) bool {
		if t.HeaderRow == 0 && rr.Row > headerScanRows {
			noHeader = true
		}
		if noHeader {
			if !blankRow(rr.Cells) || rr.Fault != nil {
				if len(above) >= r.opts.MaxRows {
					return false
				}
				above = append(above, rr)
			}
			return true
		}
		if t.HeaderRow == 0 {
			if rr.Fault == nil && blankRow(rr.Cells) {
				return true
			}
			hits := 0
			for _, c := range rr.Cells {
				if _, ok, _ := MatchHeader(c, cols); ok {
					hits++
				}
			}
			if hits >= need && rr.Fault == nil {
				t.HeaderRow = rr.Row
				r.matchHeaderRow(t, cols, rr.Cells)
				return true
			}
			above = append(above, rr)
			return true
		}
		if !r.dataRow(t, &rr) {
			return true
		}
		if t.rowsSeen >= r.opts.MaxRows {
			limited = true
			return false
		}
		t.rowsSeen++
		if r.rowHook != nil && r.hookSheet == sheet {
			return r.rowHook(t, rr)
		}
		t.Rows = append(t.Rows, rr)
		return true
	})
	if row, ok := r.farRow[sh.Name]; ok {
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
		t.Rows = above
		if len(t.Rows) > 0 {
			p := Problem{Sheet: sheet, Row: t.Rows[0].Row, Severity: Error, Err: ErrMissingColumn,
				Message: fmt.Sprintf("no header row found in the first %d rows (a header names at least two columns such as %s)", headerScanRows, strings.Join(requiredColumns(sheet), ", ")),
				Fix:     "put the header row of the template above the data"}
			t.Problems = append(t.Problems, p)
			t.Missing = append(t.Missing, p)
		}
		return t
	}
	titled := false
	for _, rr := range above {
		if rr.Fault != nil {
			t.Problems = append(t.Problems, Problem{Sheet: sheet, Row: rr.Row, Severity: Error, Err: ErrUnreadableRow,
				Message: rr.Fault.msg, Fix: rr.Fault.fix})
			continue
		}
		if !titled {
			titled = true
			t.Problems = append(t.Problems, Problem{Sheet: sheet, Row: rr.Row, Severity: Warning,
				Message: fmt.Sprintf("rows above the header (row %d) are taken as a title and not read as data", t.HeaderRow)})
		}
	}
	return t
}

// ErrUnreadableRow marks a row or cell that cannot be read: out of order or
// repeated, a bad reference, a shared string or style the workbook does not
// have (a damaged file).
var ErrUnreadableRow = errors.New("row or cell cannot be read")

// dataRow notes the marked cells of a data row in the table's maps, and
// reports whether the row is to be read: it holds a value, or a fault, or a
// known column's cell that is a formula without a result or unreadable.
func (r *reader) dataRow(t *table, rr *rawRow) bool {
	if rr.Fault != nil && blankRow(rr.Cells) {
		// nothing of the row could be placed: its fault is the sheet's problem
		t.Problems = append(t.Problems, Problem{Sheet: t.Sheet, Row: rr.Row, Severity: Error, Err: ErrUnreadableRow, Message: rr.Fault.msg, Fix: rr.Fault.fix})
		return false
	}
	keep := rr.Fault != nil || !blankRow(rr.Cells)
	for _, m := range rr.Marks {
		cm, ok := t.Cols[m.col]
		if !ok {
			continue
		}
		ref := ColumnLetter(m.col) + strconv.Itoa(rr.Row)
		numeric := cm.Column.Dim != Text && cm.Column.Dim != Date
		c := ""
		if m.col < len(rr.Cells) {
			c = strings.TrimSpace(rr.Cells[m.col])
		}
		switch m.kind {
		case markBool:
			if numeric {
				t.Bool[ref] = true
			}
		case markFormula:
			keep = true
			t.Formula[ref] = m.text
			if numeric {
				for len(rr.Cells) <= m.col {
					rr.Cells = append(rr.Cells, "")
				}
				rr.Cells[m.col] = "=" + m.text // the cell counts as given
			}
		case markDated:
			if v, err := strconv.ParseFloat(c, 64); err == nil && numeric {
				t.Dated[ref] = c
				if d, err := excelize.ExcelDateToTime(v, r.date1904); err == nil {
					t.Dated[ref] = d.Format("2006-01-02")
				}
			}
		case markFault:
			keep = true
			t.Fault[ref] = m.text
		}
	}
	return keep
}

// rowFaults returns the errors of a row that cannot be read, or of its cells
// in known columns that cannot be read, for the validator.
func (t *table) rowFaults(rr rawRow, id string) []Problem {
	var ps []Problem
	if rr.Fault != nil {
		ps = append(ps, Problem{Sheet: t.Sheet, Row: rr.Row, ID: id, Severity: Error, Err: ErrUnreadableRow, Message: rr.Fault.msg, Fix: rr.Fault.fix})
	}
	for _, m := range rr.Marks {
		if m.kind != markFault {
			continue
		}
		cm, ok := t.Cols[m.col]
		if !ok {
			continue
		}
		ps = append(ps, Problem{Sheet: t.Sheet, Row: rr.Row, Column: ColumnLetter(m.col), Field: cm.Column.Name, ID: id, Severity: Error, Err: ErrUnreadableRow,
			Message: m.text, Fix: "open the workbook in a spreadsheet program, check the cell and save it again"})
	}
	return ps
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

// siteFaults returns the errors of a Site row that cannot be read, or whose
// item or value cell (columns A and B) cannot be read; such a row is not read.
func siteFaults(rr rawRow) []Problem {
	var ps []Problem
	if rr.Fault != nil {
		ps = append(ps, Problem{Sheet: SheetSite, Row: rr.Row, Severity: Error, Err: ErrUnreadableRow, Message: rr.Fault.msg, Fix: rr.Fault.fix})
	}
	for _, m := range rr.Marks {
		if m.kind == markFault && m.col < 2 {
			ps = append(ps, Problem{Sheet: SheetSite, Row: rr.Row, Column: ColumnLetter(m.col), Severity: Error, Err: ErrUnreadableRow,
				Message: m.text, Fix: "open the workbook in a spreadsheet program, check the cell and save it again"})
		}
	}
	return ps
}

// cellFaulted reports whether the row's cell in column name cannot be read
// (see rowFaults, which reports it).
func (t *table) cellFaulted(rr rawRow, name string) bool {
	if len(t.Fault) == 0 {
		return false
	}
	i, ok := t.Index[name]
	if !ok {
		return false
	}
	_, bad := t.Fault[ColumnLetter(i)+strconv.Itoa(rr.Row)]
	return bad
}
