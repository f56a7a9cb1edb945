package main

import (
	"bufio"
	"encoding/json"
	"fmt"
	"os"
	"path/filepath"
	"strconv"
	"strings"
	"testing"

	"github.com/xuri/excelize/v2"

	"github.com/sparkmargin/sparkmargin/inventory"
	"github.com/sparkmargin/sparkmargin/report/audit"
)

// corpusGolden is a hand-written expected outcome of testdata/corpus (format in
// testdata/corpus/README.md; inventory's TestCorpus reads the same files).
type corpusGolden struct {
	exit       int
	unreadable string
	rows       map[string][3]int
	problems   []corpusProblem
}

type corpusProblem struct{ cell, field, severity string }

func readCorpusGolden(t *testing.T, path string) corpusGolden {
	t.Helper()
	f, err := os.Open(path)
	if err != nil {
		t.Fatal(err)
	}
	defer f.Close()
	g := corpusGolden{exit: -1, rows: map[string][3]int{}}
	sc := bufio.NewScanner(f)
	for sc.Scan() {
		line := strings.TrimSpace(sc.Text())
		key, rest, _ := strings.Cut(line, " ")
		switch {
		case line == "" || strings.HasPrefix(line, "#"):
		case key == "exit":
			g.exit, err = strconv.Atoi(rest)
		case key == "unreadable":
			g.unreadable = rest
		case key == "rows":
			var sh string
			var n [3]int
			_, err = fmt.Sscanf(rest, "%s %d %d %d", &sh, &n[0], &n[1], &n[2])
			g.rows[sh] = n
		default:
			var p corpusProblem
			cell := line
			if q, ok := strings.CutPrefix(line, `"`); ok {
				cell, rest, _ = strings.Cut(q, `"`)
			} else {
				cell, rest, _ = strings.Cut(line, " ")
			}
			rest = strings.TrimSpace(rest)
			if strings.HasPrefix(rest, "(") {
				j := strings.LastIndex(rest, ")")
				p.field, rest = rest[1:j], strings.TrimSpace(rest[j+1:])
			}
			p.cell, p.severity = cell, rest
			if p.severity != "error" && p.severity != "warning" {
				t.Fatalf("%s: bad line %q", path, line)
			}
			g.problems = append(g.problems, p)
		}
		if err != nil {
			t.Fatalf("%s: line %q: %v", path, line, err)
		}
	}
	if g.exit < 0 {
		t.Fatalf("%s: no exit line", path)
	}
	return g
}

// matches reports whether a problem of check --json is the golden's line
// (a row without column stands for any column of the row; a bare sheet for a
// sheet-level problem; the field is compared without its unit).
func (w corpusProblem) matches(p audit.CheckProblem) bool {
	if p.Severity != w.severity {
		return false
	}
	field := func(s string) string {
		s, _, _ = strings.Cut(s, "[")
		return strings.ToLower(strings.TrimSpace(s))
	}
	if w.field != "" && p.Field != "" && field(w.field) != field(p.Field) {
		return false
	}
	sheet, ref, hasRef := strings.Cut(w.cell, "!")
	if !strings.EqualFold(sheet, p.Sheet) {
		return false
	}
	switch {
	case !hasRef:
		return p.Row == 0
	case strings.Trim(ref, "0123456789") == "":
		return strconv.Itoa(p.Row) == ref
	default:
		return p.Column+strconv.Itoa(p.Row) == ref
	}
}

// corpusInputs lists the checked-in corpus workbooks with their goldens, plus
// a sparse file over the size cap made here (the deflate bombs are read by
// inventory's TestCorpus; at this level they are one more unreadable file).
func corpusInputs(t *testing.T) map[string]string {
	t.Helper()
	goldens, err := filepath.Glob(filepath.Join("..", "..", "testdata", "corpus", "*.golden"))
	if err != nil || len(goldens) < 40 {
		t.Fatalf("%d corpus goldens (%v), want at least 40", len(goldens), err) // Source: issue 7, item 1
	}
	in := map[string]string{}
	for _, g := range goldens {
		x := strings.TrimSuffix(g, ".golden") + ".xlsx"
		if _, err := os.Stat(x); err == nil {
			in[g] = x
		}
	}
	big := filepath.Join(t.TempDir(), "over-size-cap.xlsx")
	f, err := os.Create(big)
	if err != nil {
		t.Fatal(err)
	}
	f.Write([]byte("PK\x03\x04"))
	f.Truncate(inventory.DefaultMaxFileSize + 1)
	f.Close()
	in[filepath.Join("..", "..", "testdata", "corpus", "over-size-cap.golden")] = big
	if raceEnabled || testing.Short() {
		// A sample: the race detector makes each run some ten times slower,
		// and the plain go test runs every input.
		sample := map[string]string{}
		for g, x := range in {
			switch strings.TrimSuffix(filepath.Base(g), ".golden") {
			case "formula-no-cache", "inf-text", "blank-id", "header-only-objects", "title-row", "truncated-zip", "over-size-cap":
				sample[g] = x
			}
		}
		return sample
	}
	return in
}

// TestCorpusCheck runs `check --json` on every corpus input and compares the
// exit code, the unreadable message, the rows per sheet and the problems with
// the golden; rows read = accepted + rejected on every sheet.
func TestCorpusCheck(t *testing.T) {
	for golden, input := range corpusInputs(t) {
		name := strings.TrimSuffix(filepath.Base(golden), ".golden")
		t.Run(name, func(t *testing.T) {
			g := readCorpusGolden(t, golden)
			code, out, errOut := runCLI(t, "check", "--json", input)
			if code != g.exit {
				t.Fatalf("exit %d, golden says %d\nstderr: %s", code, g.exit, errOut)
			}
			if code == exitUsage {
				if !strings.Contains(errOut, g.unreadable) || strings.Count(strings.TrimSpace(errOut), "\n") > 0 {
					t.Errorf("stderr %q: want one line saying %q", errOut, g.unreadable)
				}
				return
			}
			var j audit.CheckReport
			if err := json.Unmarshal([]byte(out), &j); err != nil {
				t.Fatalf("check --json: %v\n%s", err, out)
			}
			for _, c := range j.Sheets {
				if c.Read != c.Accepted+c.Rejected {
					t.Errorf("%s: read %d != accepted %d + rejected %d", c.Sheet, c.Read, c.Accepted, c.Rejected)
				}
				if w, ok := g.rows[c.Sheet]; !ok || w != [3]int{c.Read, c.Accepted, c.Rejected} {
					t.Errorf("%s: rows %d/%d/%d, golden %v", c.Sheet, c.Read, c.Accepted, c.Rejected, w)
				}
			}
			if len(j.Sheets) != len(g.rows) {
				t.Errorf("%d sheets counted, golden has %d", len(j.Sheets), len(g.rows))
			}
			used := make([]bool, len(j.Problems))
			for _, w := range g.problems {
				found := false
				for i, p := range j.Problems {
					if !used[i] && w.matches(p) {
						used[i], found = true, true
						break
					}
				}
				if !found {
					t.Errorf("missing problem %s (%s) %s", w.cell, w.field, w.severity)
				}
			}
			for i, p := range j.Problems {
				if !used[i] {
					t.Errorf("unexpected problem %s %s%d (%s): %s", p.Severity, p.Sheet, p.Row, p.Column, p.Message)
				}
			}
		})
	}
}

// TestCorpusAssess: for every readable corpus input, assess writes an audit
// whose Summary sheet shows rows read/accepted/rejected per sheet, and whose
// JSON's objects and rejected rows account for every Objects row read; the
// assessment goes on past bad rows (every accepted object is assessed).
func TestCorpusAssess(t *testing.T) {
	dir := t.TempDir()
	for golden, input := range corpusInputs(t) {
		name := strings.TrimSuffix(filepath.Base(golden), ".golden")
		g := readCorpusGolden(t, golden)
		if g.exit == exitUsage {
			continue
		}
		t.Run(name, func(t *testing.T) {
			t.Parallel()
			xlsx, js := filepath.Join(dir, name+"-audit.xlsx"), filepath.Join(dir, name+"-audit.json")
			code, _, errOut := runCLI(t, "assess", input, "-o", xlsx, "--json", js)
			want := exitOK
			if g.rows[inventory.SheetObjects][1] == 0 || g.rows[inventory.SheetObjects][2] > 0 {
				want = exitProblems // nothing could be assessed, or an object row was rejected (README exit codes)
			}
			if code != want {
				t.Fatalf("assess exit %d, want %d; stderr %s", code, want, errOut)
			}
			s, err := inventory.ReadFile(input, inventory.ReadOptions{})
			if err != nil {
				t.Fatal(err)
			}
			var doc struct {
				Counts struct {
					Rows []struct {
						Sheet                    string
						Read, Accepted, Rejected int
					}
				}
				Objects  []struct{ ID string }
				Rejected []struct {
					Sheet string
					Row   int
				}
			}
			b, err := os.ReadFile(js)
			if err != nil {
				t.Fatal(err)
			}
			if err := json.Unmarshal(b, &doc); err != nil {
				t.Fatal(err)
			}
			objectsRead := -1
			for _, r := range doc.Counts.Rows {
				if r.Read != r.Accepted+r.Rejected {
					t.Errorf("JSON %s: read %d != %d + %d", r.Sheet, r.Read, r.Accepted, r.Rejected)
				}
				if r.Sheet == inventory.SheetObjects {
					objectsRead = r.Read
				}
			}
			rejectedRows := map[int]bool{}
			for _, r := range s.Rejected {
				if r.Sheet == inventory.SheetObjects {
					rejectedRows[r.Row] = true
				}
			}
			listed := map[int]bool{}
			for _, p := range doc.Rejected {
				if p.Sheet == inventory.SheetObjects && rejectedRows[p.Row] {
					listed[p.Row] = true
				}
			}
			if len(listed) != len(rejectedRows) {
				t.Errorf("JSON lists %d of the %d rejected Objects rows", len(listed), len(rejectedRows))
			}
			if len(doc.Objects)+len(rejectedRows) != objectsRead {
				t.Errorf("JSON: %d objects + %d rejected rows != %d Objects rows read", len(doc.Objects), len(rejectedRows), objectsRead)
			}
			checkSummaryRows(t, xlsx, s)
		})
	}
}

// checkSummaryRows finds the rows table on the audit's Summary sheet and
// compares it with the survey's counts.
func checkSummaryRows(t *testing.T, xlsx string, s *inventory.Survey) {
	t.Helper()
	f, err := excelize.OpenFile(xlsx)
	if err != nil {
		t.Fatalf("audit does not open: %v", err)
	}
	defer f.Close()
	rows, err := f.GetRows("Summary")
	if err != nil {
		t.Fatal(err)
	}
	at := -1
	for i, r := range rows {
		if len(r) > 0 && r[0] == "Survey sheet" {
			at = i
		}
	}
	if at < 0 {
		t.Fatal("Summary has no rows table (Survey sheet | Read | Accepted | Rejected)")
	}
	for i, c := range s.Counts {
		want := []string{c.Sheet, strconv.Itoa(c.Read), strconv.Itoa(c.Accepted), strconv.Itoa(c.Rejected)}
		if c.NotUsedByAssess() {
			// The Changes sheet is not used by assess: its rows are neither
			// accepted nor rejected, its problems notes.
			want = []string{c.Sheet, strconv.Itoa(c.Read), "not used by this command", fmt.Sprintf("none (%d row(s) with a problem: notes)", c.Rejected)}
		}
		if at+1+i >= len(rows) || strings.Join(rows[at+1+i][:min(4, len(rows[at+1+i]))], "|") != strings.Join(want, "|") {
			t.Errorf("Summary rows table line %d: want %v", i+1, want)
		}
	}
}

// TestAuditWritesFormulaLikeTextAsText: descriptions beginning with "=" in the
// survey come out in the audit workbook as text cells, never as formulas
// (SAFETY.md, Untrusted input).
func TestAuditWritesFormulaLikeTextAsText(t *testing.T) {
	input := filepath.Join("..", "..", "testdata", "corpus", "formula-like-text.xlsx")
	xlsx := filepath.Join(t.TempDir(), "audit.xlsx")
	if code, _, errOut := runCLI(t, "assess", input, "-o", xlsx); code != exitOK {
		t.Fatalf("assess exit %d: %s", code, errOut)
	}
	f, err := excelize.OpenFile(xlsx)
	if err != nil {
		t.Fatal(err)
	}
	defer f.Close()
	want := map[string]bool{`=HYPERLINK("http://example.invalid/x","open")`: false, "=1+1": false}
	for _, sh := range f.GetSheetList() {
		rows, err := f.GetRows(sh, excelize.Options{RawCellValue: true})
		if err != nil {
			t.Fatal(err)
		}
		for r, row := range rows {
			for c, v := range row {
				ref, _ := excelize.CoordinatesToCellName(c+1, r+1)
				fm, err := f.GetCellFormula(sh, ref)
				if err != nil || fm != "" {
					t.Errorf("%s!%s holds the formula %q (%v); the audit writes no formulas", sh, ref, fm, err)
				}
				if _, ok := want[v]; !ok {
					continue
				}
				want[v] = true
				ct, _ := f.GetCellType(sh, ref)
				if ct != excelize.CellTypeSharedString && ct != excelize.CellTypeInlineString {
					t.Errorf("%s!%s %q has cell type %v, want a string", sh, ref, v, ct)
				}
			}
		}
	}
	for v, seen := range want {
		if !seen {
			t.Errorf("the description %q is not in the audit", v)
		}
	}
}
