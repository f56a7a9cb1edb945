package audit

import (
	"bytes"
	"encoding/json"
	"strings"
	"testing"
	"time"

	"github.com/sparkmargin/sparkmargin/report/assess"
)

// Review item 5: a site whose worst station rests on an assumed resistance
// to earth (an unmeasured tank taken as unearthed: its ratio, here 156.25,
// is the 50 kV cap times its capacitance, no figure; reference section 12)
// is neither ranked nor drawn by that size. The figures are invented for the
// demo: site HF-P4's worst measured ratio 200, site BR-D1's tank assumed.
func TestPortfolioAssumedResistanceNotRankedBySize(t *testing.T) {
	r := func(v float64) *float64 { return &v }
	counts := func(inc int) map[assess.Verdict]int { return map[assess.Verdict]int{assess.Incendive: inc} }
	p := Portfolio{Surveys: []PortfolioSurvey{
		{File: "p4.xlsx", Site: "Plant 4", SiteID: "HF-P4", SurveyDate: time.Date(2026, 6, 20, 0, 0, 0, 0, time.UTC), Counts: counts(3),
			Stations: []PortfolioStation{{ID: "ST-PWD", Verdict: assess.Incendive, WorstRatio: r(200), Objects: 2, Counts: counts(2)}}},
		{File: "br.xlsx", Site: "Depot", SiteID: "BR-D1", SurveyDate: time.Date(2026, 3, 3, 0, 0, 0, 0, time.UTC), Counts: counts(1),
			Stations: []PortfolioStation{
				{ID: "ST-TNK", Verdict: assess.Incendive, WorstRatio: r(156.25), WorstRatioAssumed: true, Objects: 1, Counts: counts(1)},
				{ID: "ST-OFF", Verdict: assess.NonIncendive, WorstRatio: r(0.5), Objects: 1, Counts: counts(0)},
			}},
	}}
	sites := p.Sites()
	if sites[0].SiteID != "BR-D1" || !sites[0].WorstRatioAssumed {
		t.Fatalf("first site %s (assumed %v); want BR-D1 ranked first on its assumed resistance (the stricter case)", sites[0].SiteID, sites[0].WorstRatioAssumed)
	}
	// The site's worst ratio that rests on no assumption: ST-OFF's 0.5.
	if sites[0].WorstRatio == nil || *sites[0].WorstRatio != 0.5 {
		t.Errorf("BR-D1 worst ratio %v, want 0.5 (the assumed 156.25 left out)", sites[0].WorstRatio)
	}
	if v := siteChartValue(sites[0]); v == nil || *v != 1 {
		t.Errorf("chart bar %v, want 1 (at least the MIE), not 156.25", v)
	}
	if l := siteChartLabel(sites[0]); !strings.Contains(l, assess.RatioAssumedText) {
		t.Errorf("chart label %q lacks the mark", l)
	}
	st := p.Stations()
	if st[0].ID != "ST-TNK" || st[1].ID != "ST-PWD" {
		t.Errorf("stations %s, %s; want ST-TNK (assumed) then ST-PWD (200)", st[0].ID, st[1].ID)
	}
	var js bytes.Buffer
	if err := WritePortfolioJSON(&js, p, RunInfo{ToolVersion: "test"}); err != nil {
		t.Fatal(err)
	}
	var d struct {
		Sites []struct {
			SiteID  string `json:"site_id"`
			Assumed bool   `json:"worst_ratio_assumed_resistance"`
		} `json:"sites"`
		Stations []struct {
			Station string `json:"station"`
			Assumed bool   `json:"worst_ratio_assumed_resistance"`
		} `json:"stations"`
	}
	if err := json.Unmarshal(js.Bytes(), &d); err != nil {
		t.Fatal(err)
	}
	if !d.Sites[0].Assumed || d.Sites[1].Assumed || !d.Stations[0].Assumed {
		t.Errorf("JSON marks: %+v", d)
	}
	var wb bytes.Buffer
	if err := WritePortfolio(&wb, p, RunInfo{ToolVersion: "test"}); err != nil {
		t.Fatal(err)
	}
}
