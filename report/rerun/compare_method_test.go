package rerun

import (
	"bytes"
	"fmt"
	"slices"
	"testing"

	"github.com/xuri/excelize/v2"

	"github.com/sparkmargin/sparkmargin/report/book"
)

// Review item 16: the compare Method sheet's notes print legibly: each note
// spans columns B and C, wraps, and its row is at least as tall as its lines
// (book.WrappedLines at the 88-character width of B and C). A row of the
// default height would overlap the next one in print.
func TestCompareMethodNotesWrapAndFit(t *testing.T) {
	old, new := drumSurveys()
	c := compareOf(old, new)
	var b bytes.Buffer
	if err := WriteCompareWorkbook(&b, c, new, RunInfo{ToolVersion: "test"}); err != nil {
		t.Fatal(err)
	}
	f, err := excelize.OpenReader(bytes.NewReader(b.Bytes()))
	if err != nil {
		t.Fatal(err)
	}
	defer f.Close()
	merged, err := f.GetMergeCells(SheetMethod)
	if err != nil {
		t.Fatal(err)
	}
	var areas []string
	for _, m := range merged {
		areas = append(areas, m.GetStartAxis()+":"+m.GetEndAxis())
	}
	rows, _ := f.GetRows(SheetMethod)
	found := 0
	for _, n := range compareNotes() {
		for i, r := range rows {
			if len(r) < 2 || r[0] != n[0] || r[1] != n[1] {
				continue
			}
			found++
			row := i + 1
			if !slices.Contains(areas, fmt.Sprintf("B%d:C%d", row, row)) {
				t.Errorf("note %q (row %d) not merged across B:C (%v)", n[0], row, areas)
			}
			h, _ := f.GetRowHeight(SheetMethod, row)
			if lines := book.WrappedLines(n[1], 88); lines > 1 && h < book.LineHeight*float64(lines) {
				t.Errorf("note %q: row height %.1f pt for %d lines (want at least %.1f)", n[0], h, lines, book.LineHeight*float64(lines))
			}
			style, _ := f.GetCellStyle(SheetMethod, fmt.Sprintf("B%d", row))
			if st, _ := f.GetStyle(style); st == nil || st.Alignment == nil || !st.Alignment.WrapText {
				t.Errorf("note %q: cell B%d does not wrap", n[0], row)
			}
		}
	}
	if found != len(compareNotes()) {
		t.Errorf("found %d of %d notes on the Method sheet", found, len(compareNotes()))
	}
}
