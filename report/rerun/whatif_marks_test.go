package rerun

import (
	"bytes"
	"encoding/json"
	"strings"
	"testing"

	"github.com/sparkmargin/sparkmargin/inventory"
	"github.com/sparkmargin/sparkmargin/report/assess"
)

// Review items 2, 5 and 15 on whatif and sweep: ST-A holds BIG, a drum whose
// resistance to earth is not measured (taken as unearthed, the stricter case:
// its ratio is at least 1, its size no figure, reference section 12), and a
// row rejected for a misspelt material (invented for the demo); ST-B a drum
// earthed through 1e6 Ω (5 V, no spark; derived from reference section 10
// item 6). Before and after an RH change the station is incomplete and its
// worst ratio is the assumed-resistance mark, on the terminal and in the JSON.
func TestWhatifCarriesIncompleteAndAssumedMarks(t *testing.T) {
	s := stationsSurvey("survey-1", drumAt("BIG", "ST-A", -1, 100e-12), drumAt("MID", "ST-B", 1e6, 50e-12))
	s.Rejected = []inventory.Rejected{{Sheet: inventory.SheetObjects, Row: 4, ID: "TYPO", Station: "ST-A",
		Problems: []inventory.Problem{{Sheet: inventory.SheetObjects, Row: 4, Message: `material "Steal" is neither built in nor on the Materials sheet`}}}}
	w := run(t, s, [2]string{"rh", "55"})
	var a *StationDelta
	for i := range w.Stations {
		if w.Stations[i].ID == "ST-A" {
			a = &w.Stations[i]
		}
	}
	if a == nil || !a.After.WorstRatioAssumed || a.After.RejectedRows != 1 {
		t.Fatalf("ST-A after: %+v; want the worst ratio assumed and 1 rejected row", a)
	}
	var term bytes.Buffer
	if err := WriteWhatifSummary(&term, w); err != nil {
		t.Fatal(err)
	}
	for _, want := range []string{assess.RatioAssumedText, "incomplete: 1 object row rejected"} {
		if !strings.Contains(term.String(), want) {
			t.Errorf("terminal lacks %q:\n%s", want, term.String())
		}
	}
	var js bytes.Buffer
	if err := WriteWhatifJSON(&js, w, JSONInfo{ToolVersion: "9.9", Workbook: "w.xlsx", WorkbookSHA256: strings.Repeat("e", 64)}); err != nil {
		t.Fatal(err)
	}
	var d struct {
		Tool struct {
			Name, Version string
		} `json:"tool"`
		Workbook *struct {
			File   string `json:"file"`
			SHA256 string `json:"sha256"`
		} `json:"workbook"`
		Stations []struct {
			ID    string `json:"id"`
			After struct {
				Assumed  bool `json:"worst_ratio_assumed_resistance"`
				Rejected int  `json:"rejected_rows"`
			} `json:"after"`
		} `json:"stations"`
	}
	if err := json.Unmarshal(js.Bytes(), &d); err != nil {
		t.Fatal(err)
	}
	if d.Tool.Name != "sparkmargin" || d.Tool.Version != "9.9" || d.Workbook == nil || d.Workbook.File != "w.xlsx" || d.Workbook.SHA256 != strings.Repeat("e", 64) {
		t.Errorf("tool %+v workbook %+v", d.Tool, d.Workbook)
	}
	found := false
	for _, st := range d.Stations {
		if st.ID == "ST-A" {
			found = st.After.Assumed && st.After.Rejected == 1
		}
	}
	if !found {
		t.Errorf("JSON station ST-A lacks the marks:\n%s", js.String())
	}

	sw := RunSweep(s, []float64{30, 60}, SweepOptions{})
	var st, sj bytes.Buffer
	if err := WriteSweepSummary(&st, sw, 0); err != nil {
		t.Fatal(err)
	}
	for _, want := range []string{assess.RatioAssumedText, "ST-A incomplete: 1 object row rejected"} {
		if !strings.Contains(st.String(), want) {
			t.Errorf("sweep terminal lacks %q:\n%s", want, st.String())
		}
	}
	if err := WriteSweepJSONWith(&sj, sw, JSONInfo{ToolVersion: "9.9"}); err != nil {
		t.Fatal(err)
	}
	for _, want := range []string{`"version": "9.9"`, `"worst_ratio_assumed_resistance": true`, `"rejected_rows": 1`} {
		if !strings.Contains(sj.String(), want) {
			t.Errorf("sweep JSON lacks %s", want)
		}
	}
}
