package book

import (
	"fmt"
	"unicode"
	"unicode/utf8"

	"github.com/xuri/excelize/v2"
)

// RowSink writes the rows of one sheet, in normal mode or through a StreamWriter.
type RowSink interface {
	Row(r int, cells []Cell, height float64) error
	Header(r int, headers []string) error
}

// NormalSink writes cells one by one (small sheets, charts allowed).
type NormalSink struct {
	F     *excelize.File
	Sheet string
	St    *Styles
}

// Row writes one row.
func (n NormalSink) Row(r int, cells []Cell, height float64) error {
	if height > 0 {
		if err := n.F.SetRowHeight(n.Sheet, r, height); err != nil {
			return err
		}
	}
	for i, c := range cells {
		ref, err := excelize.CoordinatesToCellName(i+1, r)
		if err != nil {
			return err
		}
		if c.V != nil {
			if err := n.F.SetCellValue(n.Sheet, ref, c.V); err != nil {
				return fmt.Errorf("sheet %s cell %s: %w", n.Sheet, ref, err)
			}
		}
		if c.Styled() {
			if err := n.F.SetCellStyle(n.Sheet, ref, ref, n.St.Of(c)); err != nil {
				return fmt.Errorf("sheet %s cell %s: %w", n.Sheet, ref, err)
			}
		}
	}
	return nil
}

// Header writes a header row.
func (n NormalSink) Header(r int, headers []string) error {
	hs := n.St.Header()
	for i, h := range headers {
		ref, err := excelize.CoordinatesToCellName(i+1, r)
		if err != nil {
			return err
		}
		if err := n.F.SetCellValue(n.Sheet, ref, h); err != nil {
			return err
		}
		if err := n.F.SetCellStyle(n.Sheet, ref, ref, hs); err != nil {
			return err
		}
	}
	return nil
}

// StreamSink writes rows through a StreamWriter (big sheets: Objects, Findings).
type StreamSink struct {
	SW *excelize.StreamWriter
	St *Styles
}

// Row writes one row.
func (s StreamSink) Row(r int, cells []Cell, height float64) error {
	vals := make([]any, len(cells))
	for i, c := range cells {
		if !c.Styled() {
			vals[i] = nil
			continue
		}
		vals[i] = excelize.Cell{StyleID: s.St.Of(c), Value: c.V}
	}
	if height > 0 {
		return s.SW.SetRow(fmt.Sprintf("A%d", r), vals, excelize.RowOpts{Height: height})
	}
	return s.SW.SetRow(fmt.Sprintf("A%d", r), vals)
}

// Header writes a header row.
func (s StreamSink) Header(r int, headers []string) error {
	hs := s.St.Header()
	vals := make([]any, len(headers))
	for i, h := range headers {
		vals[i] = excelize.Cell{StyleID: hs, Value: h}
	}
	return s.SW.SetRow(fmt.Sprintf("A%d", r), vals, excelize.RowOpts{Height: 42})
}

// Column is one column of a table sheet over rows of type T.
type Column[T any] struct {
	Header string
	Width  float64
	Value  func(T) Cell
}

// Headers returns the columns' headers.
func Headers[T any](cols []Column[T]) []string {
	out := make([]string, len(cols))
	for i, c := range cols {
		out[i] = c.Header
	}
	return out
}

// RowCells returns the cells of one row.
func RowCells[T any](cols []Column[T], v T) []Cell {
	out := make([]Cell, len(cols))
	for i, c := range cols {
		out[i] = c.Value(v)
	}
	return out
}

// RowHeight returns the height (points) a row needs for its wrapped texts in
// columns of the given widths, or 0 when one line is enough. Workbooks store
// heights, not layouts, and LibreOffice does not grow streamed rows itself.
func RowHeight(widths []float64, cells []Cell) float64 {
	lines := 1
	for i, c := range cells {
		t, ok := c.V.(string)
		if !ok || !c.Wrap || i >= len(widths) {
			continue
		}
		if n := WrappedLines(t, widths[i]); n > lines {
			lines = n
		}
	}
	if lines == 1 {
		return 0
	}
	if lines > MaxLines {
		lines = MaxLines // the cell keeps the whole text; print shows the first lines
	}
	return LineHeight*float64(lines) + 2
}

// MaxLines caps a table row's height so that one wordy cell does not make a
// row take half a page.
const MaxLines = 8

// LineHeight is the height in points of one line of 10 pt text.
const LineHeight = 12.75

// WrappedLines counts the lines a text takes in a column of width characters,
// wrapping greedily at spaces as a spreadsheet does.
func WrappedLines(s string, width float64) int {
	capacity := int(width*1.4) - 1 // 10 pt text in a column measured in 11 pt digits (measured in LibreOffice)
	if capacity < 4 {
		capacity = 4
	}
	// One pass over the bytes, no split strings: paragraphs at '\n', words
	// between white space (unicode.IsSpace, as strings.Fields), word lengths
	// in runes.
	n, used, word := 1, 0, 0
	endWord := func() {
		if word == 0 {
			return
		}
		switch {
		case used == 0:
			used = word
		case used+1+word <= capacity:
			used += 1 + word
		default:
			n++
			used = word
		}
		for used > capacity { // a word longer than the column breaks
			n++
			used -= capacity
		}
		word = 0
	}
	for i := 0; i < len(s); {
		c := s[i]
		if c < utf8.RuneSelf {
			i++
			switch {
			case c == '\n':
				endWord()
				n++
				used = 0
			case c == ' ' || c == '\t' || c == '\v' || c == '\f' || c == '\r':
				endWord()
			default:
				word++
			}
			continue
		}
		r, size := utf8.DecodeRuneInString(s[i:])
		i += size
		if unicode.IsSpace(r) {
			endWord()
		} else {
			word++
		}
	}
	endWord()
	return n
}

// LastCol returns the column letters of the n-th column (1-based).
func LastCol(n int) string {
	s, _ := excelize.ColumnNumberToName(n)
	return s
}

// SetWidths sets column widths in normal mode.
func SetWidths(f *excelize.File, sheet string, widths []float64) error {
	for i, w := range widths {
		c := LastCol(i + 1)
		if err := f.SetColWidth(sheet, c, c, w); err != nil {
			return err
		}
	}
	return nil
}

// WidthsOf returns the columns' widths.
func WidthsOf[T any](cols []Column[T]) []float64 {
	out := make([]float64, len(cols))
	for i, c := range cols {
		out[i] = c.Width
	}
	return out
}
