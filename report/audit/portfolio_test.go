package audit

import (
	"bytes"
	"encoding/json"
	"math"
	"strconv"
	"testing"

	"github.com/sparkmargin/sparkmargin/report/assess"
)

// TestPortfolioTwoDemoCopies: two copies of the demo survey give two sites
// (tied on every count, so ordered by file name) and every station twice,
// ranked across both: each pair of equal stations sits side by side, in the
// order of one audit's ranking; the workbook reads back with its sheets.
func TestPortfolioTwoDemoCopies(t *testing.T) {
	a := demoAudit(t, 0)
	p := Portfolio{Surveys: []PortfolioSurvey{
		PortfolioEntry(a, "works-b.xlsx", "works-b-audit.xlsx"),
		PortfolioEntry(a, "works-a.xlsx", "works-a-audit.xlsx"),
	}, Failed: []PortfolioFailure{{File: "broken.xlsx", Reason: "it is empty"}}}
	sites := p.Sites()
	if len(sites) != 2 || sites[0].File != "works-a.xlsx" || sites[1].File != "works-b.xlsx" || sites[0].Rank != 1 || sites[1].Rank != 2 {
		t.Fatalf("sites ranked %+v", sites)
	}
	if sites[0].Verdict != a.Stations[0].Verdict || *sites[0].WorstRatio != *a.Stations[0].WorstRatio {
		t.Errorf("site verdict %v ratio %v; want the audit's worst station's %v %v", sites[0].Verdict, *sites[0].WorstRatio, a.Stations[0].Verdict, *a.Stations[0].WorstRatio)
	}
	st := p.Stations()
	if len(st) != 2*len(a.Stations) {
		t.Fatalf("%d stations, want %d", len(st), 2*len(a.Stations))
	}
	for i, s := range st {
		want := a.Stations[i/2]
		file := []string{"works-a.xlsx", "works-b.xlsx"}[i%2]
		if s.Rank != i+1 || s.ID != want.Station.ID || s.Site.File != file || s.SiteRank != want.Rank {
			t.Errorf("station rank %d: %s of %s (rank in site %d); want %s of %s (%d)", s.Rank, s.ID, s.Site.File, s.SiteRank, want.Station.ID, file, want.Rank)
		}
	}

	var b bytes.Buffer
	if err := WritePortfolio(&b, p, testInfo()); err != nil {
		t.Fatal(err)
	}
	f := openWorkbook(t, b.Bytes())
	want := []string{PortfolioSummary, PortfolioSites, PortfolioStations, PortfolioCautions}
	if got := f.GetSheetList(); len(got) != 4 || got[0] != want[0] || got[1] != want[1] || got[2] != want[2] || got[3] != want[3] {
		t.Errorf("sheets %v, want %v", got, want)
	}
	rows := rowsOf(t, f, PortfolioStations)
	if len(rows) != 1+len(st) {
		t.Fatalf("Stations sheet: %d rows", len(rows))
	}
	h := rows[0]
	rank, station, verdict, ratio := colIndex(t, h, "Rank"), colIndex(t, h, "Station"), colIndex(t, h, "Verdict"), colIndex(t, h, "Worst ratio E/MIE [–]")
	for i, r := range rows[1:] {
		if r[rank] != strconv.Itoa(i+1) || r[station] != st[i].ID || r[verdict] != st[i].Verdict.String() {
			t.Errorf("Stations row %d: %v", i+2, r)
		}
	}
	// The cell holds the ratio to the 15 significant digits a spreadsheet keeps: compare relatively.
	if got, _ := strconv.ParseFloat(rows[1][ratio], 64); st[0].WorstRatio != nil && math.Abs(got-*st[0].WorstRatio) > 1e-13*math.Abs(*st[0].WorstRatio) {
		t.Errorf("worst ratio cell %q, want %v", rows[1][ratio], *st[0].WorstRatio)
	}
	srows := rowsOf(t, f, PortfolioSites)
	if len(srows) != 3 || srows[1][colIndex(t, srows[0], "Survey file")] != "works-a.xlsx" {
		t.Errorf("Sites sheet: %v", srows)
	}
	var b2 bytes.Buffer
	if err := WritePortfolio(&b2, p, testInfo()); err != nil || !bytes.Equal(b.Bytes(), b2.Bytes()) {
		t.Error("the same portfolio gave different bytes")
	}

	var j bytes.Buffer
	if err := WritePortfolioJSON(&j, p, testInfo()); err != nil {
		t.Fatal(err)
	}
	var doc struct {
		Objects  map[string]int `json:"objects"`
		Sites    []struct{ File string }
		Stations []struct {
			Rank    int
			Station string
		}
		NotAssessed []struct{ File string } `json:"not_assessed"`
	}
	if err := json.Unmarshal(j.Bytes(), &doc); err != nil {
		t.Fatal(err)
	}
	if len(doc.Sites) != 2 || len(doc.Stations) != len(st) || len(doc.NotAssessed) != 1 || doc.Objects["incendive"] != 2*a.Counts[assess.Incendive] {
		t.Errorf("portfolio JSON: %s", j.String()[:min(400, j.Len())])
	}
}
