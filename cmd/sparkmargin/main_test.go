package main

import (
	"bytes"
	"encoding/json"
	"os"
	"path/filepath"
	"regexp"
	"strconv"
	"strings"
	"testing"

	"github.com/xuri/excelize/v2"

	"github.com/sparkmargin/sparkmargin/inventory"
)

// runCLI runs the command line in-process and returns exit code, stdout and stderr.
func runCLI(t *testing.T, args ...string) (int, string, string) {
	t.Helper()
	var out, errOut bytes.Buffer
	code := run(args, &out, &errOut)
	return code, out.String(), errOut.String()
}

func writeDemo(t *testing.T, dir string) string {
	t.Helper()
	data, err := inventory.DemoSurveyBytes()
	if err != nil {
		t.Fatal(err)
	}
	p := filepath.Join(dir, "survey.xlsx")
	if err := os.WriteFile(p, data, 0o644); err != nil {
		t.Fatal(err)
	}
	return p
}

func TestVersionAndUsage(t *testing.T) {
	tests := []struct {
		name string
		args []string
		code int
		out  string // substring of stdout
		err  string // substring of stderr
	}{
		{"version", []string{"--version"}, exitOK, "sparkmargin version", ""},
		{"help", []string{"--help"}, exitOK, "assess", ""},
		{"unknown command", []string{"frobnicate"}, exitUsage, "", "unknown command"},
		{"unknown flag", []string{"check", "--nope", "x.xlsx"}, exitUsage, "", "unknown flag"},
		{"missing argument", []string{"check"}, exitUsage, "", "accepts 1 arg"},
		{"completion", []string{"completion", "bash"}, exitOK, "bash completion", ""},
		{"negative samples", []string{"assess", "--samples", "-5", "x.xlsx"}, exitUsage, "", "--samples and --workers take a count"},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			code, out, errOut := runCLI(t, tc.args...)
			if code != tc.code {
				t.Fatalf("exit %d, want %d (stderr %q)", code, tc.code, errOut)
			}
			if !strings.Contains(out, tc.out) {
				t.Errorf("stdout %q lacks %q", out, tc.out)
			}
			if !strings.Contains(errOut, tc.err) {
				t.Errorf("stderr %q lacks %q", errOut, tc.err)
			}
			if n := strings.Count(errOut, "sparkmargin:"); n > 1 {
				t.Errorf("error printed %d times: %q", n, errOut)
			}
		})
	}
}

func TestCheckExitCodes(t *testing.T) {
	dir := t.TempDir()
	demo := writeDemo(t, dir)
	csv := filepath.Join(dir, "survey-as-csv.xlsx")
	os.WriteFile(csv, []byte("ID,Station,Kind\nP-1,ST-1,person\n"), 0o644)
	empty := filepath.Join(dir, "empty.xlsx")
	os.WriteFile(empty, nil, 0o644)

	code, out, errOut := runCLI(t, "check", demo)
	if code != exitOK {
		t.Fatalf("check demo: exit %d, want 0\n%s%s", code, out, errOut)
	}
	if !strings.Contains(out, "Objects") {
		t.Errorf("check output lacks the per-sheet counts: %q", out)
	}

	for _, p := range []string{csv, empty, filepath.Join(dir, "missing.xlsx")} {
		code, _, errOut := runCLI(t, "check", p)
		if code != exitUsage {
			t.Errorf("check %s: exit %d, want 2", filepath.Base(p), code)
		}
		if lines := strings.Count(strings.TrimSpace(errOut), "\n") + 1; lines != 1 {
			t.Errorf("check %s: want one sentence on stderr, got %d lines: %q", filepath.Base(p), lines, errOut)
		}
	}

	broken, _ := filepath.Glob(filepath.Join("..", "..", "testdata", "broken", "*.xlsx"))
	if len(broken) < 15 {
		t.Fatalf("found %d broken surveys, want at least 15", len(broken))
	}
	for _, p := range broken {
		golden, err := os.ReadFile(strings.TrimSuffix(p, ".xlsx") + ".golden")
		if err != nil {
			t.Fatal(err)
		}
		wantErr := strings.Contains(string(golden), " error")
		code, out, _ := runCLI(t, "check", p)
		want := exitOK
		if wantErr {
			want = exitProblems
		}
		if code != want {
			t.Errorf("check %s: exit %d, want %d\n%s", filepath.Base(p), code, want, out)
		}
		// every expected cell is named in the output
		for _, l := range strings.Split(string(golden), "\n") {
			l = strings.TrimSpace(l)
			if l == "" || strings.HasPrefix(l, "#") {
				continue
			}
			cell := strings.Fields(l)[0]
			if !cellNamed(out, cell) {
				t.Errorf("check %s: output does not name %s\n%s", filepath.Base(p), cell, out)
			}
		}
	}
}

func TestCheckJSON(t *testing.T) {
	demo := writeDemo(t, t.TempDir())
	code, out, _ := runCLI(t, "check", "--json", demo)
	if code != exitOK {
		t.Fatalf("exit %d", code)
	}
	var j struct {
		Sheets []struct {
			Sheet                    string
			Read, Accepted, Rejected int
		}
		Errors int
	}
	if err := json.Unmarshal([]byte(out), &j); err != nil {
		t.Fatalf("check --json is not JSON: %v\n%s", err, out)
	}
	if len(j.Sheets) == 0 || j.Errors != 0 {
		t.Errorf("unexpected check JSON: %+v", j)
	}
	for _, s := range j.Sheets {
		if s.Read != s.Accepted+s.Rejected {
			t.Errorf("%s: read %d != accepted %d + rejected %d", s.Sheet, s.Read, s.Accepted, s.Rejected)
		}
	}
}

// TestTemplateOutputFlag: template takes -o FILE as every other writer does,
// as well as the positional FILE; giving the file both ways, or not at all, is a usage error.
func TestTemplateOutputFlag(t *testing.T) {
	dir := t.TempDir()
	p := filepath.Join(dir, "blank.xlsx")
	if code, _, errOut := runCLI(t, "template", "-o", p); code != exitOK {
		t.Fatalf("template -o: exit %d: %s", code, errOut)
	}
	if _, err := os.Stat(p); err != nil {
		t.Fatalf("template -o wrote nothing: %v", err)
	}
	q := filepath.Join(dir, "other.xlsx")
	if code, _, _ := runCLI(t, "template", q, "-o", filepath.Join(dir, "third.xlsx")); code != exitUsage {
		t.Errorf("template FILE -o FILE: exit %d, want %d", code, exitUsage)
	}
	if code, _, _ := runCLI(t, "template"); code != exitUsage {
		t.Errorf("template without a file: exit %d, want %d", code, exitUsage)
	}
}

// TestTemplateRoundTrip writes the template, fills one valid row per sheet, and checks it.
func TestTemplateRoundTrip(t *testing.T) {
	dir := t.TempDir()
	p := filepath.Join(dir, "blank.xlsx")
	if code, _, errOut := runCLI(t, "template", p); code != exitOK {
		t.Fatalf("template: exit %d: %s", code, errOut)
	}
	if code, _, _ := runCLI(t, "template", p); code != exitUsage {
		t.Errorf("template over an existing file: exit %d, want 2", code)
	}
	f, err := excelize.OpenFile(p)
	if err != nil {
		t.Fatal(err)
	}
	site := map[string]any{
		"Site": "Test works (invented for the demo)", "Survey date": "2026-03-14", "Relative humidity": 40,
	}
	rows, _ := f.GetRows(inventory.SheetSite)
	for i, r := range rows {
		if len(r) == 0 {
			continue
		}
		name := inventory.NormalizeName(strings.SplitN(r[0], "[", 2)[0])
		for k, v := range site {
			if name == inventory.NormalizeName(k) {
				f.SetCellValue(inventory.SheetSite, "B"+itoa(i+1), v)
			}
		}
	}
	fill := func(sheet string, vals map[string]any) {
		for i, c := range inventory.SheetColumns(sheet) {
			if v, ok := vals[c.Name]; ok {
				cell, _ := excelize.CoordinatesToCellName(i+1, 2)
				f.SetCellValue(sheet, cell, v)
			}
		}
	}
	// invented for the demo
	fill(inventory.SheetAtmospheres, map[string]any{"ID": "A1", "Description": "toluene vapour", "Substance": "toluene", "Kind": "vapour", "Zone": "1"})
	fill(inventory.SheetStations, map[string]any{"ID": "S1", "Name": "Coater", "Atmosphere": "A1"})
	fill(inventory.SheetObjects, map[string]any{"ID": "P1", "Station": "S1", "Kind": "person", "Surface potential": 5})
	fill(inventory.SheetMaterials, map[string]any{"Name": "site film", "Class": "insulating", "Relative permittivity": 3})
	filled := filepath.Join(dir, "filled.xlsx")
	if err := f.SaveAs(filled); err != nil {
		t.Fatal(err)
	}
	f.Close()
	code, out, errOut := runCLI(t, "check", filled)
	if code != exitOK {
		t.Fatalf("check on the filled template: exit %d\n%s%s", code, out, errOut)
	}
}

func itoa(i int) string { return strconv.Itoa(i) }

func TestAssessAndDemo(t *testing.T) {
	dir := t.TempDir()
	code, out, errOut := runCLI(t, "demo", "-o", dir)
	if code != exitOK {
		t.Fatalf("demo: exit %d\n%s%s", code, out, errOut)
	}
	for _, name := range []string{"demo-survey.xlsx", "demo-survey-audit.xlsx", "demo-survey-audit.json"} {
		if _, err := os.Stat(filepath.Join(dir, name)); err != nil {
			t.Errorf("demo did not write %s", name)
		}
	}
	if !strings.Contains(out, "Rank") || !strings.Contains(out, "competent person") {
		t.Errorf("demo output lacks the ranked table or the caution line:\n%s", out)
	}
	survey := filepath.Join(dir, "demo-survey.xlsx")
	before, _ := os.ReadFile(survey)

	// refuses to overwrite the survey
	if code, _, errOut := runCLI(t, "assess", survey, "-o", survey); code != exitUsage || !strings.Contains(errOut, "survey itself") {
		t.Errorf("assess -o SURVEY: exit %d, stderr %q; want 2 and a refusal", code, errOut)
	}
	if code, _, _ := runCLI(t, "assess", survey, "--json", survey); code != exitUsage {
		t.Errorf("assess --json SURVEY: exit %d, want 2", code)
	}
	after, _ := os.ReadFile(survey)
	if !bytes.Equal(before, after) {
		t.Fatal("the survey was modified")
	}

	// default output name beside the survey
	if code, _, errOut := runCLI(t, "assess", survey); code != exitOK {
		t.Fatalf("assess: exit %d: %s", code, errOut)
	}
	if _, err := os.Stat(filepath.Join(dir, "demo-survey-audit.xlsx")); err != nil {
		t.Error("assess did not write <name>-audit.xlsx beside the survey")
	}

	// same survey and command, same JSON (deterministic; the JSON records its
	// workbook's name and SHA-256, so the workbook is the same too)
	j := filepath.Join(dir, "a.json")
	runCLI(t, "assess", survey, "-o", filepath.Join(dir, "a.xlsx"), "--json", j)
	b1, _ := os.ReadFile(j)
	runCLI(t, "assess", survey, "-o", filepath.Join(dir, "a.xlsx"), "--json", j)
	b2, _ := os.ReadFile(j)
	if len(b1) == 0 || !bytes.Equal(b1, b2) {
		t.Error("two runs on the same survey gave different JSON")
	}
}

// cellNamed reports whether check's output names the golden's place: "Objects!K14" a cell,
// "Objects!4" any cell of row 4 (a row-level problem), "Objects" the sheet itself.
func cellNamed(out, place string) bool {
	sheet, ref, ok := strings.Cut(place, "!")
	if !ok {
		return strings.Contains(out, sheet+":")
	}
	row := strings.TrimLeft(ref, "ABCDEFGHIJKLMNOPQRSTUVWXYZ")
	col := `[A-Z]*`
	if row != ref {
		col = regexp.QuoteMeta(ref[:len(ref)-len(row)])
	}
	return regexp.MustCompile(regexp.QuoteMeta(sheet+"!") + col + regexp.QuoteMeta(row) + `\b`).MatchString(out)
}
