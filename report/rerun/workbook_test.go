package rerun

import (
	"bytes"
	"slices"
	"strings"
	"testing"

	"github.com/sparkmargin/sparkmargin/inventory"
	"github.com/sparkmargin/sparkmargin/report/audit"
	"github.com/xuri/excelize/v2"
)

// No numeric expectations here: the test checks that the rerun workbooks carry
// package report's own Method, Cautions and Rejected sheets, cell for cell.

func sheetRows(t *testing.T, data []byte, sheet string) [][]string {
	t.Helper()
	f, err := excelize.OpenReader(bytes.NewReader(data))
	if err != nil {
		t.Fatal(err)
	}
	defer f.Close()
	rows, err := f.GetRows(sheet)
	if err != nil {
		t.Fatalf("sheet %s: %v", sheet, err)
	}
	return rows
}

// TestWhatifWorkbookSheetsAreTheAudits compares the whatif workbook's Method,
// Cautions and Rejected sheets with the audit workbook of the run after the
// changes: the same rows, the Method sheet with the rerun notes added after the
// audit identity.
func TestWhatifWorkbookSheetsAreTheAudits(t *testing.T) {
	s := goldenSurvey()
	s.SHA256 = "00ff"
	s.Problems = append(s.Problems, inventory.Problem{Sheet: "Objects", Row: 9, Column: "K", Field: "Field", ID: "X9",
		Severity: inventory.Warning, Message: "field reading has no distance", Fix: "give the distance"})
	s.Rejected = append(s.Rejected, inventory.Rejected{Sheet: "Objects", Row: 12, Problems: []inventory.Problem{{Sheet: "Objects", Row: 12,
		Field: "Kind", Severity: inventory.Error, Message: "kind \"blob\" is not known", Fix: "use one of the listed kinds"}}})
	w := run(t, s, [2]string{"rh", "65"}, [2]string{"earth", "DRUM=1e6"}, [2]string{"margin", "20"})
	info := RunInfo{ToolVersion: "test", CommandLine: "sparkmargin whatif golden.xlsx --rh 65"}
	var got, want, before bytes.Buffer
	if err := WriteWhatifWorkbook(&got, w, info); err != nil {
		t.Fatal(err)
	}
	ri := audit.RunInfo{ToolVersion: info.ToolVersion, CommandLine: info.CommandLine}
	if err := audit.WriteWorkbook(&want, w.After, ri); err != nil {
		t.Fatal(err)
	}
	if err := audit.WriteWorkbook(&before, w.Before, ri); err != nil {
		t.Fatal(err)
	}
	f, err := excelize.OpenReader(bytes.NewReader(got.Bytes()))
	if err != nil {
		t.Fatal(err)
	}
	sheets := f.GetSheetList()
	f.Close()
	if !slices.Equal(sheets, []string{SheetSummary, SheetObjects, SheetStations, SheetChanges, SheetMethod, SheetCautions, SheetRejected}) {
		t.Errorf("sheets %v", sheets)
	}
	for _, sh := range []string{audit.SheetCautions, audit.SheetRejected} {
		if g, a := sheetRows(t, got.Bytes(), sh), sheetRows(t, want.Bytes(), sh); !slices.EqualFunc(g, a, slices.Equal) {
			t.Errorf("sheet %s differs from the audit's:\n got %q\nwant %q", sh, g, a)
		}
	}

	if rej := sheetRows(t, got.Bytes(), audit.SheetRejected); len(rej) != 3 {
		t.Errorf("Rejected sheet has %d rows, want the header, the rejected row and the warning: %q", len(rej), rej)
	}

	method := sheetRows(t, got.Bytes(), audit.SheetMethod)
	// Cut the rerun notes: from their section title to the blank row after them.
	start := slices.IndexFunc(method, func(r []string) bool { return len(r) > 0 && strings.HasPrefix(r[0], "How this what-if works") })
	if start < 0 {
		t.Fatalf("Method sheet has no rerun notes:\n%q", method)
	}
	end := start + slices.IndexFunc(method[start:], func(r []string) bool { return len(r) == 0 })
	notes := method[start+1 : end]
	if len(notes) != len(whatifNotes()) || notes[0][0] != whatifNotes()[0][0] || notes[len(notes)-1][0] != "Change kinds" {
		t.Errorf("rerun notes %q", notes)
	}
	rest := append(slices.Clone(method[:start]), method[end+1:]...)
	auditRows := sheetRows(t, want.Bytes(), audit.SheetMethod)
	if !slices.EqualFunc(rest, auditRows, slices.Equal) {
		t.Errorf("Method sheet without the notes differs from the after-run audit's:\n got %q\nwant %q", rest, auditRows)
	}
	// The after run's margin is the one shown, not the survey's.
	if slices.EqualFunc(auditRows, sheetRows(t, before.Bytes(), audit.SheetMethod), slices.Equal) {
		t.Error("after-run Method sheet equals the before-run one although the margin changed")
	}
	for _, wantText := range []string{"Survey file SHA-256", "00ff", "Limits applied", "Formulas", "Constants", "Defaults applied"} {
		found := false
		for _, r := range method {
			for _, c := range r {
				found = found || c == wantText
			}
		}
		if !found {
			t.Errorf("Method sheet lacks %q", wantText)
		}
	}
}
