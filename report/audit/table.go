package audit

import (
	"fmt"
	"strings"

	"github.com/xuri/excelize/v2"
)

// rowSink writes the rows of one sheet, in normal mode or through a StreamWriter.
type rowSink interface {
	row(r int, cells []cell, height float64) error
	header(r int, headers []string) error
}

// normalSink writes cells one by one (small sheets, charts allowed).
type normalSink struct {
	f     *excelize.File
	sheet string
	st    *styles
}

func (n normalSink) row(r int, cells []cell, height float64) error {
	if height > 0 {
		if err := n.f.SetRowHeight(n.sheet, r, height); err != nil {
			return err
		}
	}
	for i, c := range cells {
		ref, err := excelize.CoordinatesToCellName(i+1, r)
		if err != nil {
			return err
		}
		if c.v != nil {
			if err := n.f.SetCellValue(n.sheet, ref, c.v); err != nil {
				return fmt.Errorf("sheet %s cell %s: %w", n.sheet, ref, err)
			}
		}
		if c.v != nil || c.numFmt != "" || c.verdict {
			if err := n.f.SetCellStyle(n.sheet, ref, ref, n.st.of(c)); err != nil {
				return fmt.Errorf("sheet %s cell %s: %w", n.sheet, ref, err)
			}
		}
	}
	return nil
}

func (n normalSink) header(r int, headers []string) error {
	hs := n.st.header()
	for i, h := range headers {
		ref, err := excelize.CoordinatesToCellName(i+1, r)
		if err != nil {
			return err
		}
		if err := n.f.SetCellValue(n.sheet, ref, h); err != nil {
			return err
		}
		if err := n.f.SetCellStyle(n.sheet, ref, ref, hs); err != nil {
			return err
		}
	}
	return nil
}

// streamSink writes rows through a StreamWriter (big sheets: Objects, Findings).
type streamSink struct {
	sw *excelize.StreamWriter
	st *styles
}

func (s streamSink) row(r int, cells []cell, height float64) error {
	vals := make([]any, len(cells))
	for i, c := range cells {
		if c.v == nil && c.numFmt == "" && !c.verdict {
			vals[i] = nil
			continue
		}
		vals[i] = excelize.Cell{StyleID: s.st.of(c), Value: c.v}
	}
	if height > 0 {
		return s.sw.SetRow(fmt.Sprintf("A%d", r), vals, excelize.RowOpts{Height: height})
	}
	return s.sw.SetRow(fmt.Sprintf("A%d", r), vals)
}

func (s streamSink) header(r int, headers []string) error {
	hs := s.st.header()
	vals := make([]any, len(headers))
	for i, h := range headers {
		vals[i] = excelize.Cell{StyleID: hs, Value: h}
	}
	return s.sw.SetRow(fmt.Sprintf("A%d", r), vals, excelize.RowOpts{Height: 42})
}

// column is one column of a table sheet over rows of type T.
type column[T any] struct {
	header string
	width  float64
	value  func(T) cell
}

func headers[T any](cols []column[T]) []string {
	out := make([]string, len(cols))
	for i, c := range cols {
		out[i] = c.header
	}
	return out
}

func rowCells[T any](cols []column[T], v T) []cell {
	out := make([]cell, len(cols))
	for i, c := range cols {
		out[i] = c.value(v)
	}
	return out
}

// rowHeight returns the height (points) a row needs for its wrapped texts in
// columns of the given widths, or 0 when one line is enough. Workbooks store
// heights, not layouts, and LibreOffice does not grow streamed rows itself.
func rowHeight(widths []float64, cells []cell) float64 {
	lines := 1
	for i, c := range cells {
		t, ok := c.v.(string)
		if !ok || !c.wrap || i >= len(widths) {
			continue
		}
		if n := wrappedLines(t, widths[i]); n > lines {
			lines = n
		}
	}
	if lines == 1 {
		return 0
	}
	if lines > maxLines {
		lines = maxLines // the cell keeps the whole text; print shows the first lines
	}
	return lineHeight*float64(lines) + 2
}

// maxLines caps a table row's height so that one wordy cell does not make a
// row take half a page.
const maxLines = 8

// lineHeight is the height in points of one line of 10 pt text.
const lineHeight = 12.75

// wrappedLines counts the lines a text takes in a column of width characters,
// wrapping greedily at spaces as a spreadsheet does.
func wrappedLines(s string, width float64) int {
	capacity := int(width*1.4) - 1 // 10 pt text in a column measured in 11 pt digits (measured in LibreOffice)
	if capacity < 4 {
		capacity = 4
	}
	n := 0
	for _, para := range strings.Split(s, "\n") {
		n++
		used := 0
		for _, w := range strings.Fields(para) {
			l := len([]rune(w))
			switch {
			case used == 0:
				used = l
			case used+1+l <= capacity:
				used += 1 + l
			default:
				n++
				used = l
			}
			for used > capacity { // a word longer than the column breaks
				n++
				used -= capacity
			}
		}
	}
	return n
}

// lastCol returns the column letters of the n-th column (1-based).
func lastCol(n int) string {
	s, _ := excelize.ColumnNumberToName(n)
	return s
}

// setWidths sets column widths in normal mode.
func setWidths(f *excelize.File, sheet string, widths []float64) error {
	for i, w := range widths {
		c := lastCol(i + 1)
		if err := f.SetColWidth(sheet, c, c, w); err != nil {
			return err
		}
	}
	return nil
}

func widthsOf[T any](cols []column[T]) []float64 {
	out := make([]float64, len(cols))
	for i, c := range cols {
		out[i] = c.width
	}
	return out
}
