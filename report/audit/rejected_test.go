package audit

import (
	"bytes"
	"encoding/json"
	"fmt"
	"strings"
	"testing"

	"github.com/sparkmargin/sparkmargin/inventory"
	"github.com/xuri/excelize/v2"
)

// TestRejectedSheetCapped: a survey with more problems than the Rejected
// sheet holds (the cap lowered from 1,048,574 so that the test stays small)
// gets its audit, with the first problems and a closing note on the sheet and
// a line on the terminal, and a JSON listing every problem.
func TestRejectedSheetCapped(t *testing.T) {
	defer func(n int) { maxRejectedRows = n }(maxRejectedRows)
	maxRejectedRows = 30
	a := demoAudit(t, 0)
	s := *a.Survey
	s.Problems = append([]inventory.Problem(nil), s.Problems...)
	const extra = 95
	for i := 0; i < extra; i++ {
		s.Problems = append(s.Problems, inventory.Problem{Sheet: inventory.SheetObjects, Row: 1000 + i, Column: "K", Field: "Field",
			Severity: inventory.Warning, Message: fmt.Sprintf("made-up warning %d", i)})
	}
	a.Survey = &s
	total, listed := ProblemsListed(&s)
	if total < extra || listed != 30 {
		t.Fatalf("ProblemsListed = %d, %d; want at least %d, 30", total, listed, extra)
	}
	for _, streamed := range []bool{false, true} {
		var xb []byte
		if streamed {
			xb, _ = streamedOutputs(t, a, t.TempDir())
		} else {
			var buf bytes.Buffer
			if err := WriteWorkbook(&buf, a, testInfo()); err != nil {
				t.Fatal(err)
			}
			xb = buf.Bytes()
		}
		f, err := excelize.OpenReader(bytes.NewReader(xb))
		if err != nil {
			t.Fatal(err)
		}
		rows, err := f.GetRows(SheetRejected)
		if err != nil {
			t.Fatal(err)
		}
		if len(rows) != 1+30+1 {
			t.Fatalf("streamed %v: Rejected sheet has %d rows, want header + 30 + note", streamed, len(rows))
		}
		note := rows[len(rows)-1]
		if note[0] != "note" || !strings.Contains(note[7], fmt.Sprintf("%d more problems are not listed", total-30)) {
			t.Errorf("streamed %v: closing row %q", streamed, note)
		}
	}
	// The Findings sheet is capped the same way (the cap is below the demo's findings count here).
	if len(a.Findings) > 30 {
		var buf bytes.Buffer
		if err := WriteWorkbook(&buf, a, testInfo()); err != nil {
			t.Fatal(err)
		}
		f, err := excelize.OpenReader(bytes.NewReader(buf.Bytes()))
		if err != nil {
			t.Fatal(err)
		}
		rows, _ := f.GetRows(SheetFindings)
		if len(rows) != 1+30+1 || rows[31][0] != "note" || !strings.Contains(rows[31][1], fmt.Sprintf("%d more findings are not listed", len(a.Findings)-30)) {
			t.Errorf("Findings sheet: %d rows, last %q", len(rows), rows[len(rows)-1])
		}
	} else {
		t.Errorf("the demo has %d findings: the Findings cap is not tried", len(a.Findings))
	}
	var js bytes.Buffer
	if err := WriteJSON(&js, a, testInfo()); err != nil {
		t.Fatal(err)
	}
	var doc struct {
		Rejected []json.RawMessage `json:"rejected"`
		Warnings []json.RawMessage `json:"warnings"`
	}
	if err := json.Unmarshal(js.Bytes(), &doc); err != nil {
		t.Fatal(err)
	}
	if n := len(doc.Rejected) + len(doc.Warnings); n != total {
		t.Errorf("JSON lists %d problems, want all %d", n, total)
	}
	var term bytes.Buffer
	if err := WriteSummary(&term, a); err != nil {
		t.Fatal(err)
	}
	if want := fmt.Sprintf("Rejected sheet: the first 30 of %d problems", total); !strings.Contains(term.String(), want) {
		t.Errorf("terminal summary lacks %q:\n%s", want, term.String())
	}
}

// A problem on a Changes row is listed on the assess audit's Rejected sheet
// as a note that the sheet is not used by this command (only whatif uses it),
// not as a rejected row: by the workbook writer and the streamed one.
func TestRejectedChangesRowIsANote(t *testing.T) {
	a := demoAudit(t, 0)
	s := *a.Survey
	p := inventory.Problem{Sheet: inventory.SheetChanges, Row: 4, Column: "A", Field: "Change", Severity: inventory.Error, Message: `change "paint" is not known`}
	s.Rejected = append(append([]inventory.Rejected(nil), s.Rejected...), inventory.Rejected{Sheet: inventory.SheetChanges, Row: 4, Problems: []inventory.Problem{p}})
	s.Problems = append(append([]inventory.Problem(nil), s.Problems...), p)
	a.Survey = &s
	for _, streamed := range []bool{false, true} {
		var xb []byte
		if streamed {
			xb, _ = streamedOutputs(t, a, t.TempDir())
		} else {
			var buf bytes.Buffer
			if err := WriteWorkbook(&buf, a, testInfo()); err != nil {
				t.Fatal(err)
			}
			xb = buf.Bytes()
		}
		f, err := excelize.OpenReader(bytes.NewReader(xb))
		if err != nil {
			t.Fatal(err)
		}
		rows, _ := f.GetRows(SheetRejected)
		n := 0
		for _, r := range rows {
			if len(r) > 2 && r[2] == inventory.SheetChanges {
				n++
				if r[0] != "note" || r[1] != ChangesNotUsed {
					t.Errorf("streamed %v: Changes row listed as %q", streamed, r)
				}
			}
		}
		if n != 1 {
			t.Errorf("streamed %v: %d Changes rows on the Rejected sheet, want 1", streamed, n)
		}
	}
}
