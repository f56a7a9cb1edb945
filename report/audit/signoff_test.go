package audit

import (
	"bytes"
	"encoding/json"
	"strings"
	"testing"
	"time"

	"github.com/sparkmargin/sparkmargin/inventory"
)

// signoffRows returns the Summary's sign-off rows from "Sign-off" on, by
// their first cell.
func signoffRows(t *testing.T, b []byte) map[string][]string {
	t.Helper()
	f := openWorkbook(t, b)
	defer f.Close()
	rows := rowsOf(t, f, SheetSummary)
	out := map[string][]string{}
	in := false
	for _, r := range rows {
		if len(r) > 0 && r[0] == "Sign-off" {
			in = true
			continue
		}
		if in && len(r) > 0 && r[0] != "" {
			out[r[0]] = r
		}
	}
	if !in {
		t.Fatal("no Sign-off section on the Summary")
	}
	return out
}

// TestSignoffFilledAndBlank: the block shows the Site sheet's sign-off items
// where given and empty lines to sign where not; the signature is always blank.
func TestSignoffFilledAndBlank(t *testing.T) {
	for _, tc := range []struct {
		name string
		so   inventory.SignOff
		want map[string][]string // first cell -> cells B.. (name at B, signature D, date G)
	}{
		{"blank", inventory.SignOff{}, map[string][]string{
			"Prepared by": {"", "", "", "", "", ""}, "Reviewed by": {"", "", "", "", "", ""}, "Approved by": {"", "", "", "", "", ""},
			"Revision": {""}, "Scope": {""},
		}},
		{"filled", inventory.SignOff{ // invented for the test
			PreparedBy: "A. Rahman", PreparedOn: time.Date(2026, 3, 20, 0, 0, 0, 0, time.UTC),
			ReviewedBy: "K. Ilunga", ApprovedBy: "M. Sato", ApprovedOn: time.Date(2026, 3, 27, 0, 0, 0, 0, time.UTC),
			Revision: "B", Scope: "Line C2 coating hall",
		}, map[string][]string{
			"Prepared by": {"A. Rahman", "", "", "", "", "2026-03-20"}, "Reviewed by": {"K. Ilunga", "", "", "", "", ""},
			"Approved by": {"M. Sato", "", "", "", "", "2026-03-27"}, "Revision": {"B"}, "Scope": {"Line C2 coating hall"},
		}},
	} {
		t.Run(tc.name, func(t *testing.T) {
			a := testAudit()
			a.Survey.Site.SignOff = tc.so
			var buf bytes.Buffer
			if err := WriteWorkbook(&buf, a, RunInfo{ToolVersion: "test"}); err != nil {
				t.Fatal(err)
			}
			got := signoffRows(t, buf.Bytes())
			for k, want := range tc.want {
				row, ok := got[k]
				if !ok {
					t.Errorf("no %q row in the sign-off block", k)
					continue
				}
				cells := append(row[1:], make([]string, 8)...)[:len(want)]
				if strings.Join(cells, "|") != strings.Join(want, "|") {
					t.Errorf("%s: %q, want %q", k, cells, want)
				}
			}
			var j bytes.Buffer
			if err := WriteJSON(&j, a, RunInfo{}); err != nil {
				t.Fatal(err)
			}
			var doc struct {
				SignOff map[string]string `json:"signoff"`
			}
			if err := json.Unmarshal(j.Bytes(), &doc); err != nil {
				t.Fatal(err)
			}
			if doc.SignOff["prepared_by"] != tc.so.PreparedBy || doc.SignOff["scope"] != tc.so.Scope || len(doc.SignOff) != 8 {
				t.Errorf("JSON signoff %v", doc.SignOff)
			}
		})
	}
}
