package report

import (
	"encoding/json"
	"io"
	"os"
	"path/filepath"
	"testing"

	"github.com/sparkmargin/sparkmargin/inventory"
	"github.com/sparkmargin/sparkmargin/report/outfile"
)

// TestJSONWrittenWhenTheWorkbookFails: the audit JSON is complete without
// the workbook, so it is written even when the workbook cannot be (here its
// folder does not exist); the run still fails.
func TestJSONWrittenWhenTheWorkbookFails(t *testing.T) {
	dir := t.TempDir()
	b, err := inventory.DemoSurveyBytes()
	if err != nil {
		t.Fatal(err)
	}
	survey := filepath.Join(dir, "demo.xlsx")
	if err := os.WriteFile(survey, b, 0o644); err != nil {
		t.Fatal(err)
	}
	ws := outfile.NewWorkspace(dir)
	defer ws.Close()
	r := &Run{Workspace: ws, Out: io.Discard, ErrOut: io.Discard}
	js := filepath.Join(dir, "demo.json")
	_, err = r.AssessFile(survey, Outputs{Workbook: filepath.Join(dir, "no such folder", "demo-audit.xlsx"), JSON: js})
	if err == nil {
		t.Fatal("the workbook could not be written, but the run did not fail")
	}
	jb, err := os.ReadFile(js)
	if err != nil {
		t.Fatalf("no JSON after the workbook failed: %v", err)
	}
	var doc struct {
		Objects []json.RawMessage `json:"objects"`
	}
	if err := json.Unmarshal(jb, &doc); err != nil || len(doc.Objects) == 0 {
		t.Fatalf("JSON not complete (%v): %d objects", err, len(doc.Objects))
	}
}
