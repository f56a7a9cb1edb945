package inventory

import (
	"bytes"
	"fmt"
	"strconv"
	"strings"
)

// Limits of a sheet (ECMA-376 Part 1, 18.3.1.73 and 18.3.1.4: row numbers
// 1 to 1,048,576, columns A to XFD). Source: Microsoft, "Excel
// specifications and limits".
const (
	sheetMaxRow = 1 << 20
	sheetMaxCol = 1 << 14
)

// maxCellBytes is the most text a cell may hold: 32,767 characters of at
// most 4 bytes each in UTF-8. Source: Microsoft, "Excel specifications and
// limits" (total number of characters that a cell can contain: 32,767).
const maxCellBytes = 4 * 32767

// maxFaultyRows is how many rows of one sheet may be out of order, repeated
// or otherwise unplaceable before the sheet is refused: each one is kept as
// a rejected row, and a hostile sheet could repeat one row without end.
// // common practice, no source
const maxFaultyRows = 1000

// markKind says what is special about a cell the reader notes (see cellMark).
type markKind uint8

const (
	markBool    markKind = iota + 1 // stored as a boolean (TRUE/FALSE)
	markFormula                     // a formula without a stored result (text: the formula)
	markDated                       // a number whose style shows a date
	markFault                       // the cell cannot be read (text: why)
)

// cellMark notes one cell of a row: a boolean, a formula without a result,
// a date-formatted number, or a cell that cannot be read.
type cellMark struct {
	col  int
	kind markKind
	text string
}

// rowFault is why a whole row cannot be placed or trusted: out of order,
// repeated, a bad row number, a cell with a bad reference or two cells at
// one place. The row is rejected; its cells that could be placed are read,
// so that its problems can name it.
type rowFault struct {
	msg, fix string
}

// sheetScan reads one sheet part, row by row, placing every cell by its
// reference; see scanSheet.
type sheetScan struct {
	p           *xlsxPkg
	part, sheet string
	x           *xmlTok

	lastRow    int // the last row placed
	faultyRows int
	far        int // cells beyond maxColumns
	farRow     int // the first row with one
	maxRows    int

	// The row being read.
	num       int // its number, 0 while unknown
	hidden    bool
	fault     *rowFault
	cells     []string
	set       []bool // columns given a cell in this row
	marks     []cellMark
	lastCol   int  // the last column given a cell in this row (0-based), -1 at the start
	unordered bool // a cell of the row stood left of the one before it
	shared    map[string]string
	// buffers of a cell's value, formula and inline text, reused
	vbuf, fbuf, ibuf []byte
	// the row's text block and the cells whose text lies in it (settleText)
	rowText   []byte
	pend      []pendCell
	rowsRead  int
	width     int // the widest row so far, the room a new row's cells get
	stopAfter int // the last row handed over, for the message when reading stops
}

// scanSheet reads the sheet part of sheet and calls fn for every row that
// holds a cell or a fault, in the part's order: the row's number, its cells
// by column (trailing blanks dropped, cut at maxColumns), whether it is
// hidden, the cells of note, and the row's fault. fn returns false to stop.
// It returns the first row with a value beyond maxColumns (0: none), and a
// *pkgFault when the part cannot be read to its end, naming the last row
// read.
func (p *xlsxPkg) scanSheet(sheet, part string, fn func(rr rawRow) bool) (farRow int, err error) {
	rc, err := p.openPart(part)
	if err != nil {
		return 0, err
	}
	defer rc.Close()
	sc := &sheetScan{p: p, part: part, sheet: sheet, x: p.tok, lastCol: -1}
	sc.x.reset(rc)
	err = sc.run(fn)
	if err != nil {
		where := fmt.Sprintf("reading stopped after row %d of sheet %s", sc.stopAfter, short(sheet, 60))
		if sc.stopAfter == 0 {
			where = fmt.Sprintf("reading stopped before the first row of sheet %s", short(sheet, 60))
		}
		return sc.farRow, partFault(part, err, where)
	}
	return sc.farRow, nil
}

// errStopScan ends a scan early when fn asks.
var errStopScan = &pkgFault{"stopped"}

func (sc *sheetScan) run(fn func(rr rawRow) bool) error {
	x := sc.x
	inData := -1 // depth of <sheetData>, -1 outside it
	for {
		k, err := x.next()
		if err != nil {
			return err
		}
		switch k {
		case tokEOF:
			return nil
		case tokStart:
			switch {
			case inData < 0 && string(x.local) == "sheetData":
				inData = x.depth()
			case inData >= 0 && x.depth() == inData+1 && string(x.local) == "row":
				if err := sc.row(); err != nil {
					return err
				}
				if sc.faultyRows > maxFaultyRows {
					return &pkgFault{fmt.Sprintf("it is a damaged .xlsx (its sheet %s has more than %d rows out of order, repeated or with cells out of place; reading stopped at row %d)", short(sc.sheet, 60), maxFaultyRows, sc.num)}
				}
				if sc.rowHasContent() {
					if !fn(sc.rawRow()) {
						return nil
					}
				}
				sc.stopAfter = max(sc.stopAfter, sc.num)
			}
		case tokEnd:
			if inData >= 0 && x.depth() < inData {
				inData = -1
			}
		}
	}
}

func (sc *sheetScan) rowHasContent() bool {
	return sc.fault != nil || len(sc.cells) > 0 || len(sc.marks) > 0
}

// rawRow hands the row over; its cells are the row's own.
func (sc *sheetScan) rawRow() rawRow {
	rr := rawRow{Row: sc.num, Cells: sc.cells, Hidden: sc.hidden, Marks: sc.marks, Fault: sc.fault, Unordered: sc.unordered}
	sc.cells, sc.marks = nil, nil
	return rr
}

// parseRowNumber reads a row number, 0 when it is no valid one.
func parseRowNumber(b []byte) int {
	if len(b) == 0 || len(b) > 7 {
		return 0
	}
	n := 0
	for _, c := range b {
		if c < '0' || c > '9' {
			return 0
		}
		n = n*10 + int(c-'0')
	}
	if n < 1 || n > sheetMaxRow {
		return 0
	}
	return n
}

// parseCellRef reads a cell reference such as "AB12" into a 0-based column
// and a row, ok false when it is no valid reference (A0, ZZZZZ5, a row past
// 1,048,576, anything else).
func parseCellRef(b []byte) (col, row int, ok bool) {
	i := 0
	for ; i < len(b) && i < 4; i++ {
		c := b[i]
		switch {
		case c >= 'A' && c <= 'Z':
			col = col*26 + int(c-'A') + 1
		case c >= 'a' && c <= 'z':
			col = col*26 + int(c-'a') + 1
		default:
			goto digits
		}
	}
digits:
	if i == 0 || col > sheetMaxCol {
		return 0, 0, false
	}
	row = parseRowNumber(b[i:])
	if row == 0 {
		return 0, 0, false
	}
	return col - 1, row, true
}

// row reads one <row> element (its start tag just read).
func (sc *sheetScan) row() error {
	x := sc.x
	sc.hidden, sc.fault, sc.lastCol, sc.unordered = false, nil, -1, false
	sc.cells, sc.marks = sc.cells[:0], sc.marks[:0]
	sc.pend, sc.rowText = sc.pend[:0], sc.rowText[:0]
	for i := range sc.set {
		sc.set[i] = false
	}
	if v, ok := x.attr("hidden"); ok {
		sc.hidden = xmlBool(v)
	}
	sc.num = 0
	if v, ok := x.attr("r"); ok {
		if sc.num = parseRowNumber(v); sc.num == 0 {
			sc.setFault(fmt.Sprintf("a row numbered %q follows row %d; a sheet has rows 1 to 1,048,576 only, so it cannot be placed", short(string(v), 20), sc.lastRow), "")
		}
	}
	numbered := sc.num > 0
	if x.empty {
		_, err := x.next() // its end tag
		sc.place(numbered)
		return err
	}
	depth := x.depth()
	for {
		k, err := x.next()
		if err != nil {
			return err
		}
		if k == tokEnd && x.depth() < depth {
			break
		}
		if k == tokStart && x.depth() == depth+1 && string(x.local) == "c" {
			if err := sc.cell(&numbered); err != nil {
				return err
			}
		}
	}
	sc.place(numbered)
	return nil
}

// place settles the row's number: out of order or repeated rows are faults,
// never merged into another row.
func (sc *sheetScan) place(numbered bool) {
	sc.settleText()
	if sc.num == 0 {
		sc.num = sc.lastRow + 1
		if sc.fault == nil && sc.num > sheetMaxRow {
			sc.setFault(fmt.Sprintf("a row follows row %d, the last a sheet has", sheetMaxRow), "")
		}
	} else if sc.num <= sc.lastRow && sc.fault == nil {
		if sc.num == sc.lastRow {
			sc.setFault(fmt.Sprintf("row %d appears twice in the sheet's file; the second is rejected, since which of the two is meant cannot be told", sc.num), "")
		} else {
			sc.setFault(fmt.Sprintf("row %d comes after row %d in the sheet's file (rows out of order); it is rejected, since where it belongs cannot be trusted", sc.num, sc.lastRow), "")
		}
	}
	// trailing blanks off, as a spreadsheet shows them
	n := len(sc.cells)
	for n > 0 && strings.TrimSpace(sc.cells[n-1]) == "" {
		n--
	}
	sc.cells = sc.cells[:n:n]
	sc.width = max(sc.width, n)
	if sc.fault != nil {
		sc.faultyRows++
		switch {
		case !numbered || sc.num > sheetMaxRow:
			sc.num = min(sc.lastRow+1, sheetMaxRow) // where the row stands in the file
		case sc.num > sc.lastRow:
			sc.lastRow = sc.num // placed, its cells not trusted
		}
		return
	}
	sc.lastRow = sc.num
}

func (sc *sheetScan) setFault(msg, fix string) {
	if sc.fault == nil {
		if fix == "" {
			fix = "open the workbook in a spreadsheet program, check the sheet and save it again"
		}
		sc.fault = &rowFault{msg: msg, fix: fix}
	}
}

// cell reads one <c> element (its start tag just read) into the row.
func (sc *sheetScan) cell(numbered *bool) error {
	x := sc.x
	col := sc.lastCol + 1
	ref, hasRef := x.attr("r")
	if hasRef {
		c, r, ok := parseCellRef(ref)
		switch {
		case !ok:
			sc.setFault(fmt.Sprintf("a cell of the row has the reference %q, which is no cell of a sheet (columns A to XFD, rows 1 to 1,048,576); its value cannot be placed", short(string(ref), 20)), "")
			col = -1
		case !*numbered && sc.num == 0:
			sc.num, *numbered = r, true
			col = c
		case r != sc.num:
			sc.setFault(fmt.Sprintf("the cell %s lies in row %d's part of the sheet; its value cannot be placed", short(string(ref), 20), sc.num), "")
			col = -1
		default:
			col = c
		}
	}
	if col >= 0 && col >= sheetMaxCol {
		sc.setFault("a cell of the row lies beyond column XFD, the last a sheet has", "")
		col = -1
	}
	typ := cellType(attrOr(x, "t"))
	style, styleOK := 0, true
	if v, ok := x.attr("s"); ok {
		n, err := strconv.Atoi(string(v))
		if err != nil || n < 0 || n > 0 && (sc.p.styleDate == nil || n >= len(sc.p.styleDate)) {
			styleOK = false
		}
		style = n
		if !styleOK {
			sc.mark(col, markFault, fmt.Sprintf("the cell's style s=%q is not in the workbook's style table (a damaged file), so whether it shows a date cannot be told", short(string(v), 20)))
		}
	}
	value, formula := sc.vbuf[:0], sc.fbuf[:0]
	defer func() { sc.vbuf, sc.fbuf = value[:0], formula[:0] }()
	hasV, hasF, hasIS, sharedF := false, false, false, ""
	if !x.empty {
		depth := x.depth()
		var isDepth, tDepth, phDepth = -1, -1, 0
		var into *[]byte
		buf := sc.ibuf[:0]
		defer func() { sc.ibuf = buf[:0] }()
		for {
			k, err := x.next()
			if err != nil {
				return err
			}
			if k == tokEnd && x.depth() < depth {
				break
			}
			switch k {
			case tokStart:
				switch d := x.depth(); {
				case d == depth+1 && string(x.local) == "v":
					hasV, into = true, &value
				case d == depth+1 && string(x.local) == "f":
					hasF, into = true, &formula
					if string(attrOr(x, "t")) == "shared" {
						sharedF = string(attrOr(x, "si"))
					}
				case d == depth+1 && string(x.local) == "is":
					hasIS, isDepth = true, d
				case isDepth >= 0 && string(x.local) == "rPh":
					phDepth++
				case isDepth >= 0 && phDepth == 0 && string(x.local) == "t":
					tDepth, into = d, &buf
				}
			case tokEnd:
				switch {
				case string(x.local) == "rPh" && phDepth > 0:
					phDepth--
				case tDepth >= 0 && x.depth() < tDepth:
					tDepth, into = -1, nil
				case isDepth >= 0 && x.depth() < isDepth:
					isDepth = -1
				case x.depth() == depth:
					into = nil
				}
			case tokText:
				if into != nil {
					*into = append(*into, x.text...)
				}
			}
		}
		if hasIS {
			value = buf
		}
	}
	if sharedF != "" && len(formula) > 0 && len(sc.shared) < 1<<16 {
		// the first cell of a shared formula holds its text
		if sc.shared == nil {
			sc.shared = map[string]string{}
		}
		sc.shared[sharedF] = string(formula)
	}
	if col < 0 {
		return nil
	}
	if col <= sc.lastCol {
		sc.unordered = true
	}
	sc.lastCol = col
	if len(value) > maxCellBytes {
		sc.mark(col, markFault, fmt.Sprintf("the cell holds %s of text, more than the 32,767 characters a spreadsheet cell can hold (a damaged or hostile file)", sizeText(int64(len(value)))))
		value = nil
	}
	if col >= maxColumns {
		if len(bytes.TrimSpace(value)) > 0 || hasF {
			if sc.far++; sc.far > maxFarCells {
				return &xmlFault{msg: fmt.Sprintf("has more than %d cells beyond column %s, where no survey data goes (a damaged or hostile file)", maxFarCells, ColumnLetter(maxColumns-1))}
			}
			if sc.farRow == 0 {
				sc.farRow = sc.num
			}
		}
		return nil
	}
	for len(sc.set) <= col {
		sc.set = append(sc.set, false)
	}
	if sc.set[col] {
		sc.setFault(fmt.Sprintf("two cells of the row are at column %s; which one holds the value cannot be told", ColumnLetter(col)), "")
		return nil
	}
	sc.set[col] = true
	// A cell's text is its shared string, or bytes of the row's text block
	// (made into one string when the row ends: one allocation per row).
	text, own, blank := "", []byte(nil), true
	switch typ {
	case "s":
		v := bytes.TrimSpace(value)
		if !hasV || len(v) == 0 {
			break
		}
		i, ok := parseIndex(v)
		if !ok || i >= sc.p.sst.len() {
			sc.mark(col, markFault, fmt.Sprintf("the cell refers to shared string number %q, which the workbook does not have (a damaged file); its value cannot be read", short(string(value), 20)))
			break
		}
		text = sc.p.sst.at(i)
		blank = strings.TrimSpace(text) == ""
	case "inlineStr":
		own = value
		if hasIS {
			own = unescapeXString(value)
		}
	case "b":
		own = value
		if hasV {
			sc.mark(col, markBool, "")
		}
	case "", "n", "str", "e", "d":
		own = value
		if (typ == "" || typ == "n") && style > 0 && styleOK && sc.p.styleDate[style] && hasV {
			sc.mark(col, markDated, "")
		}
	default:
		sc.mark(col, markFault, fmt.Sprintf("the cell's type t=%q is not one a workbook uses (a damaged file); its value cannot be read", short(typ, 20)))
	}
	if own != nil {
		blank = len(bytes.TrimSpace(own)) == 0
	}
	if hasF && blank {
		fm := string(formula)
		if fm == "" && sharedF != "" {
			fm = sc.shared[sharedF]
		}
		if strings.TrimSpace(fm) != "" {
			sc.mark(col, markFormula, fm)
		}
	}
	if col >= len(sc.cells) {
		if col >= cap(sc.cells) {
			grown := make([]string, col+1, max(2*cap(sc.cells), col+1, sc.width))
			copy(grown, sc.cells)
			sc.cells = grown
		} else {
			n := len(sc.cells)
			sc.cells = sc.cells[:col+1]
			clear(sc.cells[n:])
		}
	}
	sc.cells[col] = text
	if len(own) > 0 {
		sc.pend = append(sc.pend, pendCell{col: col, start: len(sc.rowText), end: len(sc.rowText) + len(own)})
		sc.rowText = append(sc.rowText, own...)
	}
	return nil
}

// pendCell is a cell whose text lies in the row's text block.
type pendCell struct{ col, start, end int }

// settleText makes the row's text block one string and gives each cell its part.
func (sc *sheetScan) settleText() {
	if len(sc.pend) == 0 {
		return
	}
	all := string(sc.rowText)
	for _, p := range sc.pend {
		sc.cells[p.col] = all[p.start:p.end]
	}
	sc.pend, sc.rowText = sc.pend[:0], sc.rowText[:0]
}

func (sc *sheetScan) mark(col int, kind markKind, text string) {
	if col < 0 || col >= maxColumns {
		return
	}
	sc.marks = append(sc.marks, cellMark{col: col, kind: kind, text: text})
}

// parseIndex reads a shared-string index: decimal digits only.
func parseIndex(b []byte) (int, bool) {
	if len(b) == 0 || len(b) > 10 {
		return 0, false
	}
	n := 0
	for _, c := range b {
		if c < '0' || c > '9' {
			return 0, false
		}
		n = n*10 + int(c-'0')
	}
	return n, true
}

// cellType returns a cell's t attribute as one of the constant strings of
// ECMA-376 Part 1, 18.18.11 (ST_CellType), without allocating; any other
// value is returned as a new string.
func cellType(b []byte) string {
	switch string(b) {
	case "":
		return ""
	case "s":
		return "s"
	case "n":
		return "n"
	case "b":
		return "b"
	case "str":
		return "str"
	case "inlineStr":
		return "inlineStr"
	case "e":
		return "e"
	case "d":
		return "d"
	}
	return string(b)
}
