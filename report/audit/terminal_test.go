package audit

import (
	"bytes"
	"encoding/json"
	"strings"
	"testing"

	"github.com/sparkmargin/sparkmargin/inventory"
	"github.com/sparkmargin/sparkmargin/report/assess"
	"github.com/sparkmargin/sparkmargin/report/book"
	"github.com/sparkmargin/sparkmargin/templates"
)

func TestWriteSummaryGolden(t *testing.T) {
	var b bytes.Buffer
	if err := WriteSummary(&b, testAudit()); err != nil {
		t.Fatal(err)
	}
	golden(t, "summary.golden.txt", b.Bytes())
	s := b.String()
	// Rows: Site 6 + Atmospheres 2 + Stations 3 + Objects 10 = 21 read, one
	// Objects row rejected (the fixture's counts, invented for the demo).
	// Ranked order and the ratios worked by hand: 10 mJ / 0.24 mJ = 41.7,
	// 113.3 mJ / 10 mJ = 11.3 (derived).
	i1, i2, i3 := strings.Index(s, "S1 Coater"), strings.Index(s, "S2 Powder"), strings.Index(s, "S3 Warehouse")
	if !(i1 >= 0 && i1 < i2 && i2 < i3) {
		t.Errorf("stations not in rank order:\n%s", s)
	}
	for _, want := range []string{"41.7", "11.3", "9 (4 incendive, 1 marginal, 3 non-incendive, 1 not assessed)",
		"21 read, 20 accepted, 1 rejected (Objects 1)", templates.CautionLine} {
		if !strings.Contains(s, want) {
			t.Errorf("summary lacks %q:\n%s", want, s)
		}
	}
	if strings.Contains(s, "\x1b[") {
		t.Error("summary holds terminal colour codes")
	}
}

// TestWriteSummaryBlankSiteHumidity: a Site sheet without RH (an error for check)
// is assessed at the dry-day value, and the terminal says so with the value used.
func TestWriteSummaryBlankSiteHumidity(t *testing.T) {
	a := testAudit()
	s := *a.Survey
	s.Site.RelativeHumidity = inventory.Quantity{}
	a.Survey = &s
	var b bytes.Buffer
	if err := WriteSummary(&b, a); err != nil {
		t.Fatal(err)
	}
	if !strings.Contains(b.String(), "no relative humidity") || !strings.Contains(b.String(), "30 %RH") {
		t.Errorf("no warning with the RH used:\n%s", b.String())
	}
	if c := siteHumidityCell(s.Site); c.V == nil || c.Mark != book.EstMark {
		t.Errorf("Summary RH cell %+v, want the dry-day value marked est.", c)
	}
}

// TestStationNotes: a station with rejected object rows is marked incomplete,
// and one ranked on an assumed resistance shows ">= 1 (assumed)", on the
// terminal and in the JSON (keys added, numbers kept) (review items 6 and 11).
func TestStationNotes(t *testing.T) {
	a := testAudit()
	a.Stations[0].RejectedRows = 2
	a.Stations[0].WorstRatioAssumed = true
	var b bytes.Buffer
	if err := WriteSummary(&b, a); err != nil {
		t.Fatal(err)
	}
	for _, want := range []string{"Note", "incomplete: 2 object rows rejected, see Rejected", assess.RatioAssumedText, "rank rests on an assumed resistance"} {
		if !strings.Contains(b.String(), want) {
			t.Errorf("terminal lacks %q:\n%s", want, b.String())
		}
	}
	b.Reset()
	if err := WriteJSON(&b, a, testInfo()); err != nil {
		t.Fatal(err)
	}
	var doc struct {
		Stations []struct {
			RejectedRows int      `json:"rejected_rows"`
			Assumed      bool     `json:"worst_ratio_assumed_resistance"`
			WorstRatio   *float64 `json:"worst_ratio"`
		} `json:"stations"`
	}
	if err := json.Unmarshal(b.Bytes(), &doc); err != nil {
		t.Fatal(err)
	}
	st := doc.Stations[0]
	if st.RejectedRows != 2 || !st.Assumed || (a.Stations[0].WorstRatio != nil && st.WorstRatio == nil) {
		t.Errorf("JSON station %+v", st)
	}
}

// TestQuietKeepsCounts: --quiet keeps the counts and the survey-rows line even
// when no row was rejected or warned about (the README: counts always printed),
// and starts with the counts, not a blank line.
func TestQuietKeepsCounts(t *testing.T) {
	a := testAudit()
	a.Survey.Problems = nil
	for i := range a.Survey.Counts {
		a.Survey.Counts[i].Accepted += a.Survey.Counts[i].Rejected
		a.Survey.Counts[i].Rejected = 0
	}
	var b bytes.Buffer
	if err := WriteSummaryWith(&b, a, SummaryOptions{Quiet: true}); err != nil {
		t.Fatal(err)
	}
	s := b.String()
	// The fixture's 21 survey rows, now all accepted.
	if !strings.Contains(s, "Survey rows: 21 read, 21 accepted, 0 rejected") {
		t.Errorf("quiet summary lacks the survey rows line:\n%s", s)
	}
	if !strings.HasPrefix(s, "Objects: ") {
		t.Errorf("quiet summary does not start with the counts:\n%q", s)
	}
}

// TestWriteSummaryTrimmed: --top N shows the N worst stations (the fixture's
// three stations ranked S1, S2, S3) and counts the rest; --quiet shows no
// station table; the counts and cautions lines are printed whatever the
// options (the cautions line is a safety rule).
func TestWriteSummaryTrimmed(t *testing.T) {
	cases := []struct {
		name      string
		opt       SummaryOptions
		want, not []string
	}{
		{"top 1", SummaryOptions{Top: 1}, []string{"S1 Coater", "... 2 more station(s) in the audit workbook's Stations sheet"}, []string{"S2 Powder", "S3 Warehouse"}},
		{"top 2", SummaryOptions{Top: 2}, []string{"S1 Coater", "S2 Powder", "... 1 more station(s)"}, []string{"S3 Warehouse"}},
		{"top as many as stations", SummaryOptions{Top: 3}, []string{"S1 Coater", "S3 Warehouse"}, []string{"more station"}},
		{"top above", SummaryOptions{Top: 50}, []string{"S3 Warehouse"}, []string{"more station"}},
		{"quiet", SummaryOptions{Quiet: true}, []string{"Objects: 9", "21 read, 20 accepted, 1 rejected"}, []string{"Rank", "S1 Coater", "more station"}},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			var b bytes.Buffer
			if err := WriteSummaryWith(&b, testAudit(), c.opt); err != nil {
				t.Fatal(err)
			}
			s := b.String()
			for _, w := range append(c.want, "Objects: 9", templates.CautionLine) {
				if !strings.Contains(s, w) {
					t.Errorf("summary lacks %q:\n%s", w, s)
				}
			}
			for _, w := range c.not {
				if strings.Contains(s, w) {
					t.Errorf("summary holds %q:\n%s", w, s)
				}
			}
		})
	}
}

// Review N10: --quiet keeps the counts lines, and the Monte Carlo and
// borderline lines are counts (samples per object, borderline objects).
func TestQuietKeepsSamplingCounts(t *testing.T) {
	a := testAudit()
	a.Options.Samples, a.Options.Seed = 300, 7
	a.Borderline = []assess.BorderlineObject{{ObjectID: "O3", StationID: "S1"}}
	var b bytes.Buffer
	if err := WriteSummaryWith(&b, a, SummaryOptions{Quiet: true}); err != nil {
		t.Fatal(err)
	}
	for _, w := range []string{"Monte Carlo: 300 samples per object, seed 7", "Borderline: 1 object(s)"} {
		if !strings.Contains(b.String(), w) {
			t.Errorf("quiet summary lacks %q:\n%s", w, b.String())
		}
	}
}
