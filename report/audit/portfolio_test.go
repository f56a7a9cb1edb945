package audit

import (
	"bytes"
	"encoding/json"
	"math"
	"slices"
	"strconv"
	"strings"
	"testing"
	"time"

	"github.com/sparkmargin/sparkmargin/report/assess"
)

// TestPortfolioTwoDemoCopies: two copies of the demo survey given two Site IDs
// give two sites (tied on verdict and worst ratio, so sharing rank 1, ordered
// by their labels, made unique by the file name) and every station twice,
// ranked across both: each pair of equal stations sits side by side sharing a
// rank, in the order of one audit's ranking; the workbook reads back with its sheets.
func TestPortfolioTwoDemoCopies(t *testing.T) {
	a := demoAudit(t, 0)
	p := Portfolio{Surveys: []PortfolioSurvey{
		PortfolioEntry(a, "works-b.xlsx", "works-b-audit.xlsx"),
		PortfolioEntry(a, "works-a.xlsx", "works-a-audit.xlsx"),
	}, Failed: []PortfolioFailure{{File: "broken.xlsx", Reason: "it is empty"}}}
	p.Surveys[0].SiteID, p.Surveys[1].SiteID = "C2-B", "C2-A"
	sites := p.Sites()
	if len(sites) != 2 || sites[0].File != "works-a.xlsx" || sites[1].File != "works-b.xlsx" || sites[0].Rank != 1 || sites[1].Rank != 1 ||
		!sites[1].Shared || sites[1].RankText() != "=1" || sites[0].Label == sites[1].Label {
		t.Fatalf("sites ranked %+v", sites)
	}
	// The demo's worst station rests on an assumed resistance: the site carries
	// the mark, not the artefact's size.
	if sites[0].Verdict != a.Stations[0].Verdict || sites[0].WorstRatioAssumed != a.Stations[0].WorstRatioAssumed ||
		(!a.Stations[0].WorstRatioAssumed && *sites[0].WorstRatio != *a.Stations[0].WorstRatio) {
		t.Errorf("site verdict %v assumed %v; want the audit's worst station's %v %v", sites[0].Verdict, sites[0].WorstRatioAssumed, a.Stations[0].Verdict, a.Stations[0].WorstRatioAssumed)
	}
	st := p.Stations()
	if len(st) != 2*len(a.Stations) {
		t.Fatalf("%d stations, want %d", len(st), 2*len(a.Stations))
	}
	for i, s := range st {
		want := a.Stations[i/2]
		file := []string{"works-a.xlsx", "works-b.xlsx"}[i%2]
		if (i%2 == 1 && (s.Rank != st[i-1].Rank || !s.Shared)) || s.Rank > i+1 || s.ID != want.Station.ID || s.Site.File != file || s.SiteRank != want.Rank {
			t.Errorf("station rank %d: %s of %s (rank in site %d); want %s of %s (%d)", s.Rank, s.ID, s.Site.File, s.SiteRank, want.Station.ID, file, want.Rank)
		}
	}

	var b bytes.Buffer
	if err := WritePortfolio(&b, p, testInfo()); err != nil {
		t.Fatal(err)
	}
	f := openWorkbook(t, b.Bytes())
	want := []string{PortfolioSummary, PortfolioSites, PortfolioTrend, PortfolioStations, PortfolioCautions}
	if got := f.GetSheetList(); !slices.Equal(got, want) {
		t.Errorf("sheets %v, want %v", got, want)
	}
	rows := rowsOf(t, f, PortfolioStations)
	if len(rows) != 1+len(st) {
		t.Fatalf("Stations sheet: %d rows", len(rows))
	}
	h := rows[0]
	rank, station, verdict, ratio := colIndex(t, h, "Rank"), colIndex(t, h, "Station"), colIndex(t, h, "Verdict"), colIndex(t, h, "Worst ratio E/MIE [–]")
	for i, r := range rows[1:] {
		if r[rank] != strconv.Itoa(st[i].Rank) || r[station] != st[i].ID || r[verdict] != st[i].Verdict.String() {
			t.Errorf("Stations row %d: %v", i+2, r)
		}
	}
	// The cell holds the ratio to the 15 significant digits a spreadsheet keeps: compare relatively.
	if st[0].WorstRatioAssumed {
		if rows[1][ratio] != assess.RatioAssumedText {
			t.Errorf("worst ratio cell %q, want %q", rows[1][ratio], assess.RatioAssumedText)
		}
	} else if got, _ := strconv.ParseFloat(rows[1][ratio], 64); st[0].WorstRatio != nil && math.Abs(got-*st[0].WorstRatio) > 1e-13*math.Abs(*st[0].WorstRatio) {
		t.Errorf("worst ratio cell %q, want %v", rows[1][ratio], *st[0].WorstRatio)
	}
	// A shared rank stays a number, shown as "=1" by its number format.
	if shown, _ := f.GetCellValue(PortfolioStations, "A3"); shown != "="+strconv.Itoa(st[1].Rank) {
		t.Errorf("shared rank shown %q, want =%d", shown, st[1].Rank)
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

// TestPortfolioRepeatSurveys: three surveys of one line (two dates and a
// draft), another site tied with it, and a third site that shares the line's
// name but gives its own Site ID. The line is one site ranked on its latest
// dated survey (the draft does not beat it), with the earlier survey and the
// draft as its trend; equal verdicts and worst ratios share a rank (=1, =1,
// then 3); every label is unique. All data invented for the demo (the demo
// survey's audit, with dates, names and ratios changed).
func TestPortfolioRepeatSurveys(t *testing.T) {
	a := demoAudit(t, 0)
	entry := func(file, site, id string, date time.Time, scale float64) PortfolioSurvey {
		e := PortfolioEntry(a, file, file+"-audit.xlsx")
		e.Site, e.SiteID, e.SurveyDate = site, id, date
		for i := range e.Stations {
			// scaled ratios stand for other figures: none rests on an assumption here
			e.Stations[i].WorstRatioAssumed = false
			if r := e.Stations[i].WorstRatio; r != nil {
				x := *r * scale
				e.Stations[i].WorstRatio = &x
			}
		}
		return e
	}
	line := a.Survey.Site.Name
	d := func(y int) time.Time { return time.Date(y, 2, 10, 0, 0, 0, 0, time.UTC) }
	p := Portfolio{Surveys: []PortfolioSurvey{
		entry("c2-draft.xlsx", line, "", time.Time{}, 0.5),
		entry("c2-2026.xlsx", line, "", d(2026), 1),
		entry("c2-2025.xlsx", "  "+strings.ToUpper(line), "", d(2025), 2), // the same site, typed otherwise
		entry("bramley.xlsx", "Bramley mill (invented)", "", d(2026), 1),
		entry("ostmere-c3.xlsx", line, "OST-C3", d(2026), 0.1),
	}}
	if g := p.Groups(); len(g) != 3 {
		t.Fatalf("%d site groups, want 3: %+v", len(g), g)
	}
	sites := p.Sites()
	if len(sites) != 3 {
		t.Fatalf("%d sites ranked, want 3", len(sites))
	}
	byFile := map[string]RankedSite{}
	labels := map[string]bool{}
	for _, s := range sites {
		byFile[s.File] = s
		if labels[s.Label] {
			t.Errorf("label %q twice", s.Label)
		}
		labels[s.Label] = true
	}
	c2, br, c3 := byFile["c2-2026.xlsx"], byFile["bramley.xlsx"], byFile["ostmere-c3.xlsx"]
	if c2.PortfolioSurvey == nil || br.PortfolioSurvey == nil || c3.PortfolioSurvey == nil {
		t.Fatalf("latest surveys ranked: %v (want c2-2026, bramley, ostmere-c3)", byFile)
	}
	if c2.RankText() != "=1" || br.RankText() != "=1" || c3.RankText() != "3" {
		t.Errorf("ranks c2 %s, bramley %s, c3 %s; want =1, =1, 3 (worst ratio 1562.5 twice, then 156.25)", c2.RankText(), br.RankText(), c3.RankText())
	}
	if len(c2.Earlier) != 2 || c2.Earlier[0].File != "c2-2025.xlsx" || c2.Earlier[1].File != "c2-draft.xlsx" {
		t.Errorf("c2 trend %+v, want c2-2025 then the draft", c2.Earlier)
	}
	if tr := c2.TrendText(); !strings.Contains(tr, "2025-02-10: incendive") || !strings.Contains(tr, "draft (no date)") {
		t.Errorf("c2 trend text %q", tr)
	}
	if !strings.Contains(c3.Label, "ostmere-c3.xlsx") || !strings.Contains(c2.Label, "c2-2026.xlsx") || br.Label != "Bramley mill (invented) (2026-02-10)" {
		t.Errorf("labels %q / %q / %q: the two same-named sites are told apart by file, the other is not", c2.Label, c3.Label, br.Label)
	}
	if st := p.Stations(); len(st) != 3*len(a.Stations) {
		t.Errorf("%d stations ranked, want those of the 3 latest surveys (%d)", len(st), 3*len(a.Stations))
	}
	if tot := p.totals(); tot[assess.Incendive] != 3*a.Counts[assess.Incendive] {
		t.Errorf("incendive objects %d, want the latest surveys' %d", tot[assess.Incendive], 3*a.Counts[assess.Incendive])
	}

	var b bytes.Buffer
	if err := WritePortfolio(&b, p, testInfo()); err != nil {
		t.Fatal(err)
	}
	f := openWorkbook(t, b.Bytes())
	srows := rowsOf(t, f, PortfolioSites)
	site := colIndex(t, srows[0], "Site")
	seen := map[string]bool{}
	for _, r := range srows[1:] {
		if seen[r[site]] {
			t.Errorf("Sites sheet (the chart's labels): %q twice", r[site])
		}
		seen[r[site]] = true
	}
	if len(srows) != 4 {
		t.Errorf("Sites sheet: %d rows, want 3 sites", len(srows)-1)
	}
	if tr := rowsOf(t, f, PortfolioTrend); len(tr) != 6 {
		t.Errorf("Trend sheet: %d rows, want the 5 surveys", len(tr)-1)
	}
	// Each Trend row is labelled with its own survey's date (c2-2025's row with
	// 2025-02-10, not its site's latest 2026-02-10).
	tr := rowsOf(t, f, PortfolioTrend)
	tsite, tdate := colIndex(t, tr[0], "Site"), colIndex(t, tr[0], "Survey date")
	for _, r := range tr[1:] {
		if !strings.Contains(r[tsite], "("+r[tdate]) {
			t.Errorf("Trend row %q labelled with another survey's date (its own: %s)", r[tsite], r[tdate])
		}
	}
	// Page footers give the ranked surveys' date (all three latest on 2026-02-10), not "not given".
	for _, sh := range []string{PortfolioSummary, PortfolioSites, PortfolioTrend} {
		hf, err := f.GetHeaderFooter(sh)
		if err != nil || !strings.Contains(hf.OddFooter, "Survey date 2026-02-10") {
			t.Errorf("%s footer %q (%v), want the surveys' date 2026-02-10", sh, hf.OddFooter, err)
		}
	}
	if got := portfolioFooterDate([]RankedSite{{PortfolioSurvey: &PortfolioSurvey{SurveyDate: d(2025)}}, {PortfolioSurvey: &PortfolioSurvey{SurveyDate: d(2026)}}}); got != "Latest survey dates 2025-02-10 to 2026-02-10" {
		t.Errorf("footer date of two sites %q", got)
	}
	var j bytes.Buffer
	if err := WritePortfolioJSON(&j, p, testInfo()); err != nil {
		t.Fatal(err)
	}
	var doc struct {
		Sites []struct {
			Rank       int
			RankShared bool `json:"rank_shared"`
			File       string
			Earlier    []struct {
				File       string
				SurveyDate *string `json:"survey_date"`
			}
		}
	}
	if err := json.Unmarshal(j.Bytes(), &doc); err != nil {
		t.Fatal(err)
	}
	ok := len(doc.Sites) == 3
	for _, s := range doc.Sites {
		if s.File == "c2-2026.xlsx" {
			ok = ok && s.RankShared && s.Rank == 1 && len(s.Earlier) == 2 && s.Earlier[1].SurveyDate == nil
		}
	}
	if !ok {
		t.Errorf("portfolio JSON: %.600s", j.String())
	}
}

// TestPortfolioGroups: which surveys are one site (names and lines invented for the demo).
func TestPortfolioGroups(t *testing.T) {
	sv := func(file, site, id string, lines ...string) PortfolioSurvey {
		return PortfolioSurvey{File: file, Site: site, SiteID: id, Lines: lines, Counts: map[assess.Verdict]int{}}
	}
	cases := []struct {
		name    string
		surveys []PortfolioSurvey
		want    [][]string // files per group, latest first (all undated: by file name descending)
	}{
		{"a new line added: still one site", []PortfolioSurvey{sv("a", "Works", "", "C2"), sv("b", "Works", "", "C2", "Filling")}, [][]string{{"b", "a"}}},
		{"lines with nothing in common: two sites", []PortfolioSurvey{sv("a", "Works", "", "C2"), sv("b", "works ", "", "C3")}, [][]string{{"a"}, {"b"}}},
		{"no lines: one site", []PortfolioSurvey{sv("a", "Works", ""), sv("b", "Works", "", "C3")}, [][]string{{"b", "a"}}},
		{"Site IDs agree, names differ", []PortfolioSurvey{sv("a", "Works", "W-1", "C2"), sv("b", "Works renamed", "w-1", "C9")}, [][]string{{"b", "a"}}},
		{"Site IDs differ, same name", []PortfolioSurvey{sv("a", "Works", "W-1", "C2"), sv("b", "Works", "W-2", "C2")}, [][]string{{"a"}, {"b"}}},
		{"a Site ID on one only: two sites", []PortfolioSurvey{sv("a", "Works", "W-1", "C2"), sv("b", "Works", "", "C2")}, [][]string{{"a"}, {"b"}}},
		{"no site named: each its own", []PortfolioSurvey{sv("a", "", ""), sv("b", "", "")}, [][]string{{"a"}, {"b"}}},
	}
	for _, c := range cases {
		p := Portfolio{Surveys: c.surveys}
		var got [][]string
		for _, g := range p.Groups() {
			files := []string{g.Latest.File}
			for _, e := range g.Earlier {
				files = append(files, e.File)
			}
			got = append(got, files)
		}
		if !slices.EqualFunc(got, c.want, slices.Equal[[]string]) {
			t.Errorf("%s: groups %v, want %v", c.name, got, c.want)
		}
	}
}
