package audit

import (
	"bytes"
	"strings"
	"testing"

	"github.com/sparkmargin/sparkmargin/report/assess"
)

// The probabilities and ratios are invented for the test; the expected texts follow from them by
// the rules stated on the Method sheet (borderline threshold, "no discharge" for a zero ratio).

// TestNoZeroRatioBesideAHazard: a station judged marginal (or incendive) on
// a finding other than the energy, with no discharge possible (ratio 0), shows
// "no discharge" on the terminal, the Summary and the Stations sheet, never 0;
// a station without a ratio shows "n/a" (issue 15 item 2).
func TestNoZeroRatioBesideAHazard(t *testing.T) {
	for _, v := range []assess.Verdict{assess.Marginal, assess.Incendive} {
		a := testAudit()
		zero := 0.0
		a.Stations[1].WorstRatio, a.Stations[1].Verdict = &zero, v
		var term bytes.Buffer
		if err := WriteSummary(&term, a); err != nil {
			t.Fatal(err)
		}
		line := lineWith(term.String(), "S2 ")
		if f := strings.Fields(line); len(f) < 7 || f[4] != v.String() || f[5]+" "+f[6] != "no discharge" { // rank, ID, name (two words), verdict, ratio
			t.Errorf("%v: terminal line %q, want the verdict beside \"no discharge\"", v, line)
		}
		if s3 := lineWith(term.String(), "S3 "); !strings.Contains(s3, NoAtmosphereText) {
			t.Errorf("terminal S3 line %q, want %q (S3 has no atmosphere)", s3, NoAtmosphereText)
		}
		var b bytes.Buffer
		if err := WriteWorkbook(&b, a, testInfo()); err != nil {
			t.Fatal(err)
		}
		f := openWorkbook(t, b.Bytes())
		for _, sheet := range []string{SheetSummary, SheetStations} {
			found := false
			id, ratio := 0, 4 // Summary: Station, ..., Worst ratio in E
			if sheet == SheetStations {
				id, ratio = 1, 10 // Stations: Rank, Station, ..., Worst ratio in K
			}
			for _, r := range rowsOf(t, f, sheet) {
				if len(r) <= ratio || r[id] != "S2" {
					continue
				}
				found = true
				if r[ratio-1] != v.String() || r[ratio] != "no discharge" {
					t.Errorf("%v: %s row %v, want the verdict beside \"no discharge\"", v, sheet, r)
				}
			}
			if !found {
				t.Errorf("%s: no S2 row", sheet)
			}
		}
	}
}

// TestMainReasonShown: each station row carries its main reason on the
// terminal, the Summary and the Stations sheet.
func TestMainReasonShown(t *testing.T) {
	a := testAudit()
	want := a.Stations[0].Main.String() // "O3 energy-vs-mie: spark energy 10 mJ ≥ MIE 0.24 mJ (ratio 41.7)"
	var b bytes.Buffer
	if err := WriteWorkbook(&b, a, testInfo()); err != nil {
		t.Fatal(err)
	}
	f := openWorkbook(t, b.Bytes())
	for _, sheet := range []string{SheetSummary, SheetStations} {
		if !strings.Contains(flatten(rowsOf(t, f, sheet)), want) {
			t.Errorf("%s lacks the main reason %q", sheet, want)
		}
	}
	var term bytes.Buffer
	if err := WriteSummary(&term, a); err != nil {
		t.Fatal(err)
	}
	if !strings.Contains(term.String(), "O3 energy-vs-mie: spark energy 10 mJ") {
		t.Errorf("terminal lacks the main reason:\n%s", term.String())
	}
}

// TestSummaryUncertaintyRun: with samples, the Summary says the run was made
// (samples, seed) and lists what to measure next for each borderline object.
func TestSummaryUncertaintyRun(t *testing.T) {
	a := testAudit()
	a.Borderline = []assess.BorderlineObject{{ObjectID: "O2", StationID: "S1", Verdict: assess.Marginal,
		Probability: assess.Probability{Samples: 1000, Marginal: 0.52, Incendive: 0.48},
		Measure:     "measure the resistance to earth (now estimated): it drives the outcome most"}}
	var b bytes.Buffer
	if err := WriteWorkbook(&b, a, testInfo()); err != nil {
		t.Fatal(err)
	}
	flat := flatten(rowsOf(t, openWorkbook(t, b.Bytes()), SheetSummary))
	for _, want := range []string{"Uncertainty run", "1000 samples per object, seed 7", "1 object(s) borderline", "What to measure next",
		"O2|S1|marginal|0.48|0.52|0|measure the resistance to earth"} {
		if !strings.Contains(flat, want) {
			t.Errorf("Summary lacks %q", want)
		}
	}
	var term bytes.Buffer
	if err := WriteSummary(&term, a); err != nil {
		t.Fatal(err)
	}
	if !strings.Contains(term.String(), "Borderline: 1 object(s)") {
		t.Errorf("terminal lacks the borderline line:\n%s", term.String())
	}
}

func lineWith(s, prefix string) string {
	for _, l := range strings.Split(s, "\n") {
		if strings.Contains(l, prefix) {
			return l
		}
	}
	return ""
}

func flatten(rows [][]string) string {
	var b strings.Builder
	for _, r := range rows {
		b.WriteString(strings.Join(r, "|"))
		b.WriteString("\n")
	}
	return b.String()
}
