package audit

import (
	"errors"
	"fmt"

	"github.com/sparkmargin/sparkmargin/inventory"
	"github.com/sparkmargin/sparkmargin/report/assess"
	"github.com/sparkmargin/sparkmargin/report/book"
	"github.com/xuri/excelize/v2"
)

// Cell is one workbook cell before styling, for workbooks other than the audit
// (the rerun workbooks) that want the audit's look: its fonts, verdict colours
// and number formats. Make one with the constructors below.
type Cell struct {
	c    book.Cell
	kind int // 0 a table cell, 1 title, 2 section, 3 caution
}

// TextCell is a plain text cell; "" is an empty cell.
func TextCell(s string) Cell { return Cell{c: book.OptText(s)} }

// WrapCell is a text cell that wraps in its column.
func WrapCell(s string) Cell { return Cell{c: book.WrapText(s)} }

// BoldWrapCell is a bold text cell that wraps in its column.
func BoldWrapCell(s string) Cell { return Cell{c: book.Cell{V: s, Wrap: true, Bold: true}} }

// CodeCell is a short code or label, centred; "" is an empty cell.
func CodeCell(s string) Cell { return Cell{c: book.Code(s)} }

// CountCell is a whole number (a count or a rank), centred.
func CountCell(n int) Cell { return Cell{c: book.Integer(n)} }

// VerdictCell is a verdict in the audit's verdict colours.
func VerdictCell(v assess.Verdict) Cell { return Cell{c: verdictCell(v)} }

// QuantityCell is an SI value shown in unit u, with u's number format; a value
// that is not finite is an empty cell.
func QuantityCell(u book.Unit, si float64) Cell { return Cell{c: book.Quantity(u, si)} }

// NumberCell is a number already in its display unit, with the number format
// numFmt ("" for general); used where the unit is not one of book's (a Site limit item).
func NumberCell(v float64, numFmt string) Cell { return Cell{c: book.Cell{V: v, NumFmt: numFmt}} }

// RatioCell is a ratio E/MIE in the audit's format; nil is an empty cell.
func RatioCell(r *float64) Cell { return Cell{c: ratioText(book.FinitePtr(r))} }

// FormatRatio is a ratio beside a verdict as text: the number to three
// significant figures, "no discharge" for 0, "n/a" for none (never a 0 or a
// dash beside a hazard verdict).
func FormatRatio(r *float64) string {
	r = book.FinitePtr(r)
	if t := assess.RatioText(r); t != "" {
		return t
	}
	return book.FormatRatio(r)
}

// EmptyCell is an empty, unstyled cell.
func EmptyCell() Cell { return Cell{} }

// TitleCell is a sheet title (16 pt bold).
func TitleCell(s string) Cell { return Cell{c: book.Text(s), kind: 1} }

// SectionCell is a section heading (12 pt bold, ruled under).
func SectionCell(s string) Cell { return Cell{c: book.Text(s), kind: 2} }

// CautionCell is a caution: bold, wrapped, on the audit's caution fill.
func CautionCell(s string) Cell { return Cell{c: book.WrapText(s), kind: 3} }

// MethodNotes is a titled list of (topic, text) rows that a workbook built on
// the audit adds to its Method sheet, after the audit identity: how the run
// differs from a plain audit.
type MethodNotes struct {
	Title string
	Notes [][2]string
}

// Book writes sheets into an excelize workbook with the audit workbook's cell
// styles, table layout and print setup, and can add the audit's own Method,
// Cautions and Rejected sheets. Audit a gives the site, survey date and the
// Method sheet's content; info the tool and command. The first error is kept
// and returned by Err; later calls do nothing.
type Book struct {
	wb  *workbook
	err error
}

// NewBook starts a Book on f for audit a. heading is the page-header text
// before the sheet name ("" is the audit's "Electrostatic screening audit").
func NewBook(f *excelize.File, a *assess.Audit, info RunInfo, heading string) *Book {
	b := &Book{wb: &workbook{f: f, st: book.NewStyles(f), a: a, info: info, heading: heading}}
	if a == nil || a.Survey == nil {
		b.err = errors.New("workbook: no audit or no survey")
	}
	return b
}

// Err returns the first error met, including a failure to create a style.
func (b *Book) Err() error {
	if b.err != nil {
		return b.err
	}
	if b.wb.st.Err() != nil {
		return b.wb.st.Err()
	}
	return nil
}

func (b *Book) do(what string, fn func() error) {
	if b.err != nil {
		return
	}
	if err := fn(); err != nil {
		b.err = fmt.Errorf("%s: %w", what, err)
	}
}

// sheet creates the sheet unless it exists.
func (b *Book) sheet(name string) error {
	if idx, err := b.wb.f.GetSheetIndex(name); err != nil || idx >= 0 {
		return err
	}
	_, err := b.wb.f.NewSheet(name)
	return err
}

// Put writes one cell at (col, row), 1-based, creating the sheet if needed.
func (b *Book) Put(sheet string, col, row int, c Cell) {
	b.do("sheet "+sheet, func() error {
		if err := b.sheet(sheet); err != nil {
			return err
		}
		ref, err := excelize.CoordinatesToCellName(col, row)
		if err != nil {
			return err
		}
		if c.c.V != nil {
			if err := b.wb.f.SetCellValue(sheet, ref, c.c.V); err != nil {
				return fmt.Errorf("cell %s: %w", ref, err)
			}
		}
		var id int
		switch c.kind {
		case 1:
			id = b.wb.st.Title()
		case 2:
			id = b.wb.st.Section()
		case 3:
			id = b.wb.st.Caution()
		default:
			if !c.c.Styled() {
				return nil
			}
			id = b.wb.st.Of(c.c)
		}
		return b.wb.f.SetCellStyle(sheet, ref, ref, id)
	})
}

// Table writes a header row at row at and the rows under it in the audit's
// table style, sets the column widths and the heights of rows with wrapped
// text, and returns the next free row. A table at row 1 is a table sheet: its
// header is frozen and carries an autofilter, as the audit's tables do.
func (b *Book) Table(sheet string, at int, headers []string, widths []float64, rows [][]Cell) int {
	b.do("sheet "+sheet, func() error {
		if err := b.sheet(sheet); err != nil {
			return err
		}
		f := b.wb.f
		if err := book.SetWidths(f, sheet, widths); err != nil {
			return err
		}
		sink := book.NormalSink{F: f, Sheet: sheet, St: b.wb.st}
		if err := sink.Header(at, headers); err != nil {
			return err
		}
		hdr := make([]book.Cell, len(headers))
		for i, h := range headers {
			hdr[i] = book.WrapText(h)
		}
		height := book.RowHeight(widths, hdr)
		if at == 1 {
			height = 42
		}
		if height > 0 {
			if err := f.SetRowHeight(sheet, at, height); err != nil {
				return err
			}
		}
		for i, row := range rows {
			cells := make([]book.Cell, len(row))
			for j, c := range row {
				cells[j] = c.c
			}
			if err := sink.Row(at+1+i, cells, book.RowHeight(widths, cells)); err != nil {
				return err
			}
		}
		if at != 1 {
			return nil
		}
		if err := f.SetPanes(sheet, &excelize.Panes{Freeze: true, YSplit: 1, TopLeftCell: "A2", ActivePane: "bottomLeft"}); err != nil {
			return err
		}
		return f.AutoFilter(sheet, fmt.Sprintf("A1:%s%d", book.LastCol(len(headers)), len(rows)+1), nil)
	})
	return at + 1 + len(rows)
}

// PrintSetup makes a sheet print-ready as the audit's are: landscape A4, one
// page wide, titleRows (e.g. "$1:$1", "" for none) repeated on every page, and
// the header and footer with site, survey date and page number.
func (b *Book) PrintSetup(sheet, titleRows string) {
	b.do("sheet "+sheet+": print setup", func() error { return b.wb.printSetup(sheet, 1, titleRows, "") })
}

// AddMethodSheet adds the audit's Method sheet (identity of the run, formulas
// with their sources, constants, limits applied and their sources, defaults
// applied, materials used) for the Book's audit, with the extra notes after
// the identity.
func (b *Book) AddMethodSheet(extra ...MethodNotes) {
	b.do("sheet "+SheetMethod, func() error {
		if err := b.sheet(SheetMethod); err != nil {
			return err
		}
		b.wb.methodNotes = extra
		return b.wb.method()
	})
}

// AddCautionsSheet adds the audit's Cautions sheet (templates.Cautions()).
func (b *Book) AddCautionsSheet() {
	b.do("sheet "+SheetCautions, func() error {
		if err := b.sheet(SheetCautions); err != nil {
			return err
		}
		return b.wb.cautions()
	})
}

// AddRejectedSheet adds the audit's Rejected sheet for survey s: every problem
// of a rejected row, then sheet-level errors, then the warnings of accepted rows.
func (b *Book) AddRejectedSheet(s *inventory.Survey) {
	b.do("sheet "+SheetRejected, func() error {
		if s == nil {
			return errors.New("no survey")
		}
		if err := b.sheet(SheetRejected); err != nil {
			return err
		}
		return tableSheetNormal(b.wb, SheetRejected, problemColumns(), problemRows(s))
	})
}
