package report

import (
	"bytes"
	"fmt"
	"os"
	"path/filepath"
	"strconv"
	"strings"
	"testing"

	"github.com/sparkmargin/sparkmargin/inventory"
	"github.com/sparkmargin/sparkmargin/report/audit"
	"github.com/sparkmargin/sparkmargin/report/outfile"
	"github.com/xuri/excelize/v2"
)

// demoSurvey writes the demo survey (an invented plant) into a temporary
// folder and returns its path and the audit path beside it.
func demoSurvey(t *testing.T) (survey, book string) {
	t.Helper()
	data, err := inventory.DemoSurveyBytes()
	if err != nil {
		t.Fatal(err)
	}
	dir := t.TempDir()
	survey = filepath.Join(dir, "survey.xlsx")
	if err := os.WriteFile(survey, data, 0o644); err != nil {
		t.Fatal(err)
	}
	return survey, filepath.Join(dir, "survey-audit.xlsx")
}

func assessTo(t *testing.T, survey, book string, force bool) (string, error) {
	t.Helper()
	var out bytes.Buffer
	r := &Run{Workspace: outfile.NewWorkspace(t.TempDir()), Out: &out, Force: force}
	defer r.Workspace.Close()
	err := r.AssessOne(survey, Outputs{Workbook: book}, PortfolioFiles{})
	if err != nil && KindOf(err) != Problems {
		return out.String(), err
	}
	return out.String(), nil
}

// findingsSheet reads the Findings sheet as rows of cells by header, shown
// values; closed tells the rows under the "Closed since last run" title.
type findingCells struct {
	key    audit.FindingKey
	cells  map[string]string
	row    int
	closed bool
}

func readFindings(t *testing.T, book string) []findingCells {
	t.Helper()
	f, err := excelize.OpenFile(book)
	if err != nil {
		t.Fatal(err)
	}
	defer f.Close()
	rows, err := f.GetRows(audit.SheetFindings)
	if err != nil {
		t.Fatal(err)
	}
	var out []findingCells
	closed := false
	for i, r := range rows[1:] {
		if len(r) > 0 && strings.HasPrefix(r[0], "Closed since last run") {
			closed = true
			continue
		}
		if len(r) < 5 || r[4] == "Check" || r[4] == "" {
			continue
		}
		c := map[string]string{}
		for j, h := range rows[0] {
			if j < len(r) {
				c[h] = r[j]
			}
		}
		out = append(out, findingCells{audit.FindingKey{Station: c["Station"], Object: c["Object"], Check: c["Check"]}, c, i + 2, closed})
	}
	return out
}

// TestActionsSurviveRerun types actions into an audit as a site would (with
// excelize), reruns, and finds them carried; then removes one finding's
// object from the survey, reruns, and finds that finding listed closed with
// its action, the other action still carried.
func TestActionsSurviveRerun(t *testing.T) {
	survey, book := demoSurvey(t)
	if out, err := assessTo(t, survey, book, false); err != nil {
		t.Fatal(err)
	} else if strings.Contains(out, "Actions:") {
		t.Errorf("a first run reports carried actions:\n%s", out)
	}
	fs := readFindings(t, book)
	if len(fs) < 3 {
		t.Fatalf("the demo audit has %d findings; the test needs 3", len(fs))
	}
	// Two findings on different objects; the first one's object is removed later.
	a, b := fs[0], fs[1]
	for _, x := range fs[1:] {
		if x.key.Object != a.key.Object && x.key.Object != "" {
			b = x
			break
		}
	}
	f, err := excelize.OpenFile(book)
	if err != nil {
		t.Fatal(err)
	}
	col := map[string]string{"Action owner": "I", "Due": "J", "Status": "K", "Comment": "L"}
	hdr, _ := f.GetRows(audit.SheetFindings)
	for h, c := range col {
		if got, _ := f.GetCellValue(audit.SheetFindings, c+"1"); got != h {
			t.Fatalf("Findings %s1 is %q, want %q (headers %v)", c, got, h, hdr[0])
		}
	}
	put := func(row int, owner string, due any, status, comment string) {
		for c, v := range map[string]any{"I": owner, "J": due, "K": status, "L": comment} {
			if err := f.SetCellValue(audit.SheetFindings, c+itoa(row), v); err != nil {
				t.Fatal(err)
			}
		}
	}
	put(a.row, "J. Okafor (maintenance)", "2026-04-30", "open", "earth bond ordered")
	put(b.row, "EHS", 46142.0, "in progress", "") // a date serial: 2026-04-30
	dateStyle, _ := f.NewStyle(&excelize.Style{NumFmt: 14})
	_ = f.SetCellStyle(audit.SheetFindings, "J"+itoa(b.row), "J"+itoa(b.row), dateStyle)
	if err := f.Save(); err != nil {
		t.Fatal(err)
	}
	f.Close()

	out, err := assessTo(t, survey, book, false)
	if err != nil {
		t.Fatal(err)
	}
	if !strings.Contains(out, "Actions: 2 carried over") || !strings.Contains(out, "0 finding(s) closed") || !strings.Contains(out, "0 new finding(s)") {
		t.Errorf("terminal after an unchanged rerun:\n%s", out)
	}
	got := map[audit.FindingKey]findingCells{}
	for _, x := range readFindings(t, book) {
		got[x.key] = x
	}
	if x := got[a.key]; x.cells["Action owner"] != "J. Okafor (maintenance)" || x.cells["Due"] != "2026-04-30" || x.cells["Status"] != "open" || x.cells["Comment"] != "earth bond ordered" || x.closed {
		t.Errorf("finding %v after rerun: %v", a.key, x.cells)
	}
	if x := got[b.key]; x.cells["Action owner"] != "EHS" || x.cells["Status"] != "in progress" || x.closed {
		t.Errorf("finding %v after rerun: %v", b.key, x.cells)
	}
	// The date typed as a date stays a date (serial 46142 = 2026-04-30; Source: days since 1899-12-30, python3 date(2026,4,30)-date(1899,12,30)).
	g, _ := excelize.OpenFile(book)
	raw, _ := g.GetCellValue(audit.SheetFindings, "J"+itoa(got[b.key].row), excelize.Options{RawCellValue: true})
	shown, _ := g.GetCellValue(audit.SheetFindings, "J"+itoa(got[b.key].row))
	g.Close()
	if raw != "46142" || shown != "2026-04-30" {
		t.Errorf("due date carried as raw %q shown %q, want 46142 shown 2026-04-30", raw, shown)
	}

	// The condensed report shows the actions beside their findings.
	g, _ = excelize.OpenFile(book)
	rep, _ := g.GetRows(audit.SheetReport)
	g.Close()
	if flat := fmt.Sprint(rep); !strings.Contains(flat, "J. Okafor (maintenance) · 2026-04-30 · open · earth bond ordered") || !strings.Contains(flat, "EHS · 2026-04-30 · in progress") {
		t.Errorf("the Report sheet does not show the carried actions")
	}

	// Remove the first finding's object from the survey: its findings close.
	removeObject(t, survey, a.key.Object)
	out, err = assessTo(t, survey, book, false)
	if err != nil {
		t.Fatal(err)
	}
	if !strings.Contains(out, "Actions: 1 carried over") || strings.Contains(out, " 0 finding(s) closed") || !strings.Contains(out, "(1 with an action)") {
		t.Errorf("terminal after removing object %s:\n%s", a.key.Object, out)
	}
	var closedA, openB bool
	for _, x := range readFindings(t, book) {
		if x.key == a.key {
			closedA = x.closed && x.cells["Action owner"] == "J. Okafor (maintenance)" && x.cells["Comment"] == "earth bond ordered"
		}
		if x.key == b.key {
			openB = !x.closed && x.cells["Action owner"] == "EHS"
		}
	}
	if !closedA || !openB {
		t.Errorf("after removing %s: finding %v listed closed with its action %v; finding %v still open with its action %v\n%s", a.key.Object, a.key, closedA, b.key, openB, out)
	}

	// A further rerun keeps the closed finding with its action (closed earlier).
	if _, err = assessTo(t, survey, book, false); err != nil {
		t.Fatal(err)
	}
	kept := false
	g, _ = excelize.OpenFile(book)
	rows, _ := g.GetRows(audit.SheetFindings)
	g.Close()
	for _, r := range rows {
		if len(r) > 8 && r[3] == a.key.Object && r[4] == a.key.Check && r[8] == "J. Okafor (maintenance)" {
			kept = true
		}
	}
	if !kept {
		t.Errorf("a second rerun dropped the closed finding %v and its action", a.key)
	}
}

func itoa(n int) string { return strconv.Itoa(n) }

// removeObject deletes the Objects row of object id from the survey file.
func removeObject(t *testing.T, survey, id string) {
	t.Helper()
	f, err := excelize.OpenFile(survey)
	if err != nil {
		t.Fatal(err)
	}
	defer f.Close()
	rows, err := f.GetRows(inventory.SheetObjects)
	if err != nil {
		t.Fatal(err)
	}
	for i, r := range rows {
		if len(r) > 0 && r[0] == id {
			if err := f.RemoveRow(inventory.SheetObjects, i+1); err != nil {
				t.Fatal(err)
			}
			if err := f.Save(); err != nil {
				t.Fatal(err)
			}
			return
		}
	}
	t.Fatalf("object %s not on the survey's Objects sheet", id)
}

// TestRefuseToOverwriteAForeignWorkbook: a workbook that is not a
// sparkmargin audit is not written over without --force, and is with it.
func TestRefuseToOverwriteAForeignWorkbook(t *testing.T) {
	survey, book := demoSurvey(t)
	f := excelize.NewFile()
	_ = f.SetCellValue("Sheet1", "A1", "the site's own action tracker")
	// Named like an audit and even with a Findings sheet: the name proves nothing.
	_, _ = f.NewSheet(audit.SheetFindings)
	if err := f.SaveAs(book); err != nil {
		t.Fatal(err)
	}
	before, _ := os.ReadFile(book)
	_, err := assessTo(t, survey, book, false)
	if err == nil || KindOf(err) != Unusable || !strings.Contains(err.Error(), "not a sparkmargin audit") || !strings.Contains(err.Error(), "--force") {
		t.Fatalf("writing over a foreign workbook: err %v, want an Unusable refusal naming --force", err)
	}
	if after, _ := os.ReadFile(book); !bytes.Equal(before, after) {
		t.Fatal("the refused file was changed")
	}
	// A file that is no workbook at all is refused the same way.
	txt := filepath.Join(filepath.Dir(book), "notes.xlsx")
	_ = os.WriteFile(txt, []byte("not a zip"), 0o644)
	if _, err := assessTo(t, survey, txt, false); err == nil || !strings.Contains(err.Error(), "not a sparkmargin audit") {
		t.Fatalf("writing over a text file: err %v", err)
	}
	if _, err := assessTo(t, survey, book, true); err != nil {
		t.Fatalf("--force: %v", err)
	}
	if _, err := audit.ReadPreviousAudit(book, t.TempDir()); err != nil {
		t.Fatalf("after --force the file is not an audit: %v", err)
	}
}
