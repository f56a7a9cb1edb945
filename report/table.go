package report

import (
	"fmt"

	"github.com/xuri/excelize/v2"
)

// rowSink writes the rows of one sheet, in normal mode or through a StreamWriter.
type rowSink interface {
	row(r int, cells []cell) error
	header(r int, headers []string) error
}

// normalSink writes cells one by one (small sheets, charts allowed).
type normalSink struct {
	f     *excelize.File
	sheet string
	st    *styles
}

func (n normalSink) row(r int, cells []cell) error {
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

func (s streamSink) row(r int, cells []cell) error {
	vals := make([]any, len(cells))
	for i, c := range cells {
		if c.v == nil && c.numFmt == "" && !c.verdict {
			vals[i] = nil
			continue
		}
		vals[i] = excelize.Cell{StyleID: s.st.of(c), Value: c.v}
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
