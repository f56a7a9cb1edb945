package main

import (
	"bytes"
	"crypto/sha256"
	"encoding/hex"
	"io"
	"os"
	"path/filepath"
	"reflect"
	"strings"
	"testing"

	"github.com/xuri/excelize/v2"

	"github.com/sparkmargin/sparkmargin/inventory"
	"github.com/sparkmargin/sparkmargin/model"
	"github.com/sparkmargin/sparkmargin/report"
	"github.com/sparkmargin/sparkmargin/report/assess"
	"github.com/sparkmargin/sparkmargin/report/audit"
	"github.com/sparkmargin/sparkmargin/report/outfile"
)

func copyFile(t *testing.T, from, to string) {
	t.Helper()
	b, err := os.ReadFile(from)
	if err != nil {
		t.Fatal(err)
	}
	if err := os.WriteFile(to, b, 0o600); err != nil {
		t.Fatal(err)
	}
}

func sheetRows(t *testing.T, path, sheet string) [][]string {
	t.Helper()
	f, err := excelize.OpenFile(path)
	if err != nil {
		t.Fatal(err)
	}
	defer f.Close()
	rows, err := f.GetRows(sheet, excelize.Options{RawCellValue: true})
	if err != nil {
		t.Fatal(err)
	}
	return rows
}

// TestAssessFolderPortfolio: a folder with two copies of the demo survey (and
// an audit and a lock file, which are skipped) gives an audit and a JSON per
// survey and a portfolio that knows the two as repeat surveys of one site:
// one site ranked with its stations, both surveys on the Trend sheet.
func TestAssessFolderPortfolio(t *testing.T) {
	dir := t.TempDir()
	in := filepath.Join(dir, "surveys")
	if err := os.Mkdir(in, 0o755); err != nil {
		t.Fatal(err)
	}
	demo := writeDemo(t, dir)
	copyFile(t, demo, filepath.Join(in, "works-a.xlsx"))
	copyFile(t, demo, filepath.Join(in, "works-b.xlsx"))
	copyFile(t, demo, filepath.Join(in, "old-audit.xlsx"))
	copyFile(t, demo, filepath.Join(in, "~$works-a.xlsx"))
	out, js := filepath.Join(dir, "out"), filepath.Join(dir, "json")
	code, stdout, errOut := runCLI(t, "assess", in, "-o", out, "--json", js)
	if code != exitOK {
		t.Fatalf("exit %d: %s", code, errOut)
	}
	for _, p := range []string{"out/works-a-audit.xlsx", "out/works-b-audit.xlsx", "out/portfolio.xlsx",
		"json/works-a-audit.json", "json/works-b-audit.json", "json/portfolio.json"} {
		if _, err := os.Stat(filepath.Join(dir, p)); err != nil {
			t.Errorf("%s not written", p)
		}
	}
	if strings.Contains(stdout, "old-audit") || strings.Contains(stdout, "~$") {
		t.Error("an audit or a lock file was assessed as a survey")
	}
	sites := sheetRows(t, filepath.Join(out, "portfolio.xlsx"), audit.PortfolioSites)
	if len(sites) != 2 {
		t.Fatalf("Sites sheet has %d rows, want a header and 1 site (two surveys of one site)", len(sites))
	}
	if trend := sheetRows(t, filepath.Join(out, "portfolio.xlsx"), audit.PortfolioTrend); len(trend) != 3 {
		t.Errorf("Trend sheet has %d rows, want a header and the 2 surveys", len(trend))
	}
	if !strings.Contains(stdout, "Repeat surveys of") {
		t.Errorf("the repeat surveys are not named:\n%s", stdout)
	}
	stations := sheetRows(t, filepath.Join(out, "portfolio.xlsx"), audit.PortfolioStations)
	s, err := inventory.ReadFile(demo, inventory.ReadOptions{})
	if err != nil {
		t.Fatal(err)
	}
	if len(stations) != 1+len(s.Stations) {
		t.Errorf("Stations sheet has %d rows, want %d (the latest survey's)", len(stations), 1+len(s.Stations))
	}
}

// TestAssessSeveralExitCodes: every survey is tried; exit 0 when all were
// assessed, 1 when one had no object to assess, 2 when one is unreadable or
// missing, and the readable ones still get their audits and the portfolio.
func TestAssessSeveralExitCodes(t *testing.T) {
	dir := t.TempDir()
	demo := writeDemo(t, dir)
	a, b := filepath.Join(dir, "a.xlsx"), filepath.Join(dir, "b.xlsx")
	copyFile(t, demo, a)
	copyFile(t, demo, b)
	noObjects := filepath.Join(dir, "no-objects.xlsx")
	copyFile(t, filepath.Join("..", "..", "testdata", "broken", "missing-objects-sheet.xlsx"), noObjects)
	empty := filepath.Join(dir, "empty.xlsx")
	if err := os.WriteFile(empty, nil, 0o600); err != nil {
		t.Fatal(err)
	}
	out := filepath.Join(dir, "out")
	for _, c := range []struct {
		name    string
		args    []string
		code    int
		stderr  string
		audits  []string
		ranked  int
		outFile bool
	}{
		// Copies of one survey are repeat surveys of one site: one site ranked.
		{"all assessed", []string{a, b}, exitOK, "", []string{"a-audit.xlsx", "b-audit.xlsx"}, 1, false},
		{"one with no objects", []string{a, noObjects}, exitProblems, "no object could be assessed", []string{"a-audit.xlsx", "no-objects-audit.xlsx"}, -1, false},
		{"one unreadable", []string{empty, a}, exitUsage, "empty.xlsx", []string{"a-audit.xlsx"}, 1, false},
		{"one missing", []string{a, filepath.Join(dir, "nope.xlsx"), noObjects}, exitUsage, "nope.xlsx", []string{"a-audit.xlsx"}, -1, false},
		{"-o is a file", []string{a, b}, exitUsage, "names a folder", nil, 0, true},
		{"-p is a survey", []string{a, b, "-p", b}, exitUsage, "survey itself", nil, 0, false},
	} {
		t.Run(c.name, func(t *testing.T) {
			o := filepath.Join(out, strings.ReplaceAll(c.name, " ", "-"))
			if c.outFile {
				_ = os.MkdirAll(filepath.Dir(o), 0o755)
				_ = os.WriteFile(o, []byte("x"), 0o600)
			}
			code, _, errOut := runCLI(t, append([]string{"assess", "-o", o}, c.args...)...)
			if code != c.code || !strings.Contains(errOut, c.stderr) {
				t.Fatalf("exit %d, stderr %q; want %d and %q", code, errOut, c.code, c.stderr)
			}
			for _, f := range c.audits {
				if _, err := os.Stat(filepath.Join(o, f)); err != nil {
					t.Errorf("%s not written", f)
				}
			}
			if c.ranked != 0 {
				rows := sheetRows(t, filepath.Join(o, "portfolio.xlsx"), audit.PortfolioSites)
				if c.ranked > 0 && len(rows) != 1+c.ranked {
					t.Errorf("portfolio ranks %d sites, want %d", len(rows)-1, c.ranked)
				}
				// -1: a survey with no object is ranked as a site of its own or,
				// when it names the same site on the same date, never over a survey with objects.
				if c.ranked < 0 && (len(rows) < 2 || rows[1][colOf(t, rows[0], "Survey file")] != "a.xlsx") {
					t.Errorf("portfolio Sites sheet %v: want a.xlsx ranked first", rows)
				}
			}
		})
	}
}

// TestAssessStreamedSameCells: the assess command's streamed audit has the
// cells of the in-memory path (ReadFile, Assess, WriteWorkbook) on the demo,
// with and without sampling; the JSON has the same bytes.
func TestAssessStreamedSameCells(t *testing.T) {
	dir := t.TempDir()
	demo := writeDemo(t, dir)
	for _, samples := range []string{"0", "200"} {
		xlsx, js := filepath.Join(dir, "cli-"+samples+".xlsx"), filepath.Join(dir, "cli-"+samples+".json")
		args := []string{"assess", demo, "-o", xlsx, "--json", js, "--samples", samples}
		if code, _, errOut := runCLI(t, args...); code != exitOK {
			t.Fatalf("assess: exit %d: %s", code, errOut)
		}
		s, err := inventory.ReadFile(demo, inventory.ReadOptions{})
		if err != nil {
			t.Fatal(err)
		}
		lim := assess.LimitsFromSite(s.Site, model.DefaultLimits())
		unc := assess.UncertaintiesFromSite(s.Site, assess.DefaultUncertainties())
		n := map[string]int{"0": 0, "200": 200}[samples]
		a := assess.Assess(s, assess.Options{Limits: lim, Samples: n, Seed: assess.DefaultSeed, Uncertainties: unc})
		// The command line as the command records it (the Method sheet shows it).
		info := (&report.Run{ToolVersion: version, CommandLine: []string{"sparkmargin", "assess", "--json=" + js, "--output=" + xlsx, "--samples=" + samples, demo}}).Info(s)
		want := filepath.Join(dir, "mem-"+samples+".xlsx")
		if err := outfile.WriteAtomic(want, func(w io.Writer) error { return audit.WriteWorkbook(w, a, info) }); err != nil {
			t.Fatal(err)
		}
		for _, sh := range audit.Sheets() {
			g, w := sheetRows(t, xlsx, sh), sheetRows(t, want, sh)
			if !reflect.DeepEqual(g, w) {
				for i := range w {
					if i >= len(g) || !reflect.DeepEqual(g[i], w[i]) {
						t.Errorf("samples %s: sheet %s row %d differs:\n%q\n%q", samples, sh, i+1, g[min(i, len(g)-1)], w[i])
						break
					}
				}
			}
		}
		var jb bytes.Buffer
		wb, err := os.ReadFile(xlsx)
		if err != nil {
			t.Fatal(err)
		}
		sum := sha256.Sum256(wb)
		info.Workbook, info.WorkbookSHA256 = filepath.Base(xlsx), hex.EncodeToString(sum[:])
		if err := audit.WriteJSON(&jb, a, info); err != nil {
			t.Fatal(err)
		}
		if got, _ := os.ReadFile(js); !bytes.Equal(got, jb.Bytes()) {
			t.Errorf("samples %s: JSON differs from the in-memory path's", samples)
		}
	}
}

func colOf(t *testing.T, header []string, name string) int {
	t.Helper()
	for i, h := range header {
		if h == name {
			return i
		}
	}
	t.Fatalf("no column %q in %v", name, header)
	return -1
}

// writeDemoSite writes the demo survey with its Site items changed (item name
// → value; nil removes the value, a missing item is added), as a surveyor
// would for a repeat survey. Values invented for the demo.
func writeDemoSite(t *testing.T, path string, items map[string]any) {
	t.Helper()
	sh := inventory.DemoSurvey().Clone()
	site := sh.Sheet(inventory.SheetSite)
	done := map[string]bool{}
	for i, r := range site.Rows {
		name, _ := r[0].(string)
		for k, v := range items {
			if name == k || strings.HasPrefix(name, k+" [") {
				site.Rows[i] = []any{r[0], v}
				done[k] = true
			}
		}
	}
	for k, v := range items {
		if !done[k] {
			site.Rows = append(site.Rows, []any{k, v})
		}
	}
	var buf bytes.Buffer
	if err := inventory.WriteSurvey(&buf, sh); err != nil {
		t.Fatal(err)
	}
	if err := os.WriteFile(path, buf.Bytes(), 0o644); err != nil {
		t.Fatal(err)
	}
}

// TestAssessRepeatSurveysFolder: a folder with three surveys of one line (two
// dates and a draft without a date) and a survey of another site gives a
// portfolio of two sites: the line ranked on its latest dated survey, the
// earlier survey and the draft on the Trend sheet; the two sites, equal in
// verdict and worst ratio (the same readings), share rank 1; labels differ.
func TestAssessRepeatSurveysFolder(t *testing.T) {
	dir := t.TempDir()
	in := filepath.Join(dir, "surveys")
	if err := os.Mkdir(in, 0o755); err != nil {
		t.Fatal(err)
	}
	writeDemoSite(t, filepath.Join(in, "c2-2025.xlsx"), map[string]any{"Survey date": "2025-02-10"})
	writeDemoSite(t, filepath.Join(in, "c2-2026.xlsx"), map[string]any{"Survey date": "2026-02-10"})
	writeDemoSite(t, filepath.Join(in, "c2-draft.xlsx"), map[string]any{"Survey date": nil})
	writeDemoSite(t, filepath.Join(in, "bramley.xlsx"), map[string]any{"Site": "Bramley mill (invented)", "Site ID": "BRM-1"})
	out := filepath.Join(dir, "out")
	code, stdout, errOut := runCLI(t, "assess", in, "-o", out, "--json", out)
	// The draft has no survey date, a required item: its audit is still written.
	if code != exitOK && code != exitProblems {
		t.Fatalf("exit %d: %s", code, errOut)
	}
	pf := filepath.Join(out, "portfolio.xlsx")
	sites := sheetRows(t, pf, audit.PortfolioSites)
	if len(sites) != 3 {
		t.Fatalf("Sites sheet: %v, want a header and 2 sites", sites)
	}
	file, rank, label := colOf(t, sites[0], "Survey file"), colOf(t, sites[0], "Rank"), colOf(t, sites[0], "Site")
	got := map[string]string{}
	for _, r := range sites[1:] {
		got[r[file]] = r[rank]
	}
	if got["c2-2026.xlsx"] != "1" || got["bramley.xlsx"] != "1" || sites[1][label] == sites[2][label] {
		t.Errorf("sites ranked %v (labels %q, %q), want c2-2026 and bramley both at rank 1 with different labels", got, sites[1][label], sites[2][label])
	}
	f, err := excelize.OpenFile(pf)
	if err != nil {
		t.Fatal(err)
	}
	defer f.Close()
	if shown, _ := f.GetCellValue(audit.PortfolioSites, "A2"); shown != "=1" {
		t.Errorf("shared rank shown %q, want =1", shown)
	}
	trend := sheetRows(t, pf, audit.PortfolioTrend)
	if len(trend) != 5 {
		t.Errorf("Trend sheet: %d rows, want a header and the 4 surveys", len(trend))
	}
	var roles []string
	for _, r := range trend[1:] {
		roles = append(roles, r[colOf(t, trend[0], "Survey file")]+": "+r[colOf(t, trend[0], "Role")])
	}
	joined := strings.Join(roles, "; ")
	for _, want := range []string{"c2-2026.xlsx: latest: ranked", "c2-2025.xlsx: earlier: not ranked", "c2-draft.xlsx: draft (no date): not ranked", "bramley.xlsx: latest: ranked"} {
		if !strings.Contains(joined, want) {
			t.Errorf("Trend roles %q lack %q", joined, want)
		}
	}
	if !strings.Contains(stdout, "Repeat surveys of") || !strings.Contains(stdout, "c2-2026.xlsx ranked") {
		t.Errorf("the repeat surveys are not named:\n%s", stdout)
	}
}
