package audit

import (
	"bytes"
	"encoding/json"
	"testing"
)

// TestSiteIDShown: the optional Site ID item is in the audit JSON (site.id),
// so compare can match an audit JSON with a survey of the same site, and on
// the Summary and Report sheets' identity; a survey without one gets no row.
func TestSiteIDShown(t *testing.T) {
	const id = "RFW-L1" // invented for the demo
	a := testAudit()
	a.Survey.Site.ID = id
	var jb bytes.Buffer
	if err := WriteJSON(&jb, a, testInfo()); err != nil {
		t.Fatal(err)
	}
	var doc struct {
		Site struct {
			ID string `json:"id"`
		} `json:"site"`
	}
	if err := json.Unmarshal(jb.Bytes(), &doc); err != nil {
		t.Fatal(err)
	}
	if doc.Site.ID != id {
		t.Errorf("JSON site.id = %q, want %q", doc.Site.ID, id)
	}
	var wb bytes.Buffer
	if err := WriteWorkbook(&wb, a, testInfo()); err != nil {
		t.Fatal(err)
	}
	f := openWorkbook(t, wb.Bytes())
	for _, sheet := range []string{SheetSummary, SheetReport} {
		found := false
		for _, row := range rowsOf(t, f, sheet) {
			for i := 0; i+1 < len(row); i++ {
				if row[i] == "Site ID" {
					for _, v := range row[i+1:] {
						found = found || v == id
					}
				}
			}
		}
		if !found {
			t.Errorf("%s: no Site ID row giving %q", sheet, id)
		}
	}
	// Without a Site ID the Summary has no empty Site ID row.
	var nb bytes.Buffer
	if err := WriteWorkbook(&nb, testAudit(), testInfo()); err != nil {
		t.Fatal(err)
	}
	for _, row := range rowsOf(t, openWorkbook(t, nb.Bytes()), SheetSummary) {
		if len(row) > 0 && row[0] == "Site ID" {
			t.Error("Summary shows a Site ID row for a survey that gives none")
		}
	}
}
