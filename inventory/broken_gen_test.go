package inventory

import (
	"bufio"
	"bytes"
	"os"
	"path/filepath"
	"reflect"
	"strings"
	"testing"
)

// brokenSurvey is one test survey with one fault: the demo survey with a single
// change. Its expected problems are in testdata/broken/<name>.golden, written by
// hand from the fault (cell, field, severity), not from the reader's output, so
// that they check the reader from outside.
type brokenSurvey struct {
	name   string
	fault  string // one line; also the golden file's "# fault:" line
	mutate func(s *SurveySheets)
}

// brokenSurveys lists the broken surveys. Object rows of the demo (row 1 is the
// header): UNW-OP 4, COAT-WEB 5, COAT-PAN 8, COAT-HOSE 9, DRY-TC 13, LAM-PAP 14,
// REW-SHAFT 20, MIX-TOL2 24, BAG-B 34, DRM-DRUM 41, DRM-LNC 42. Changed values
// are invented for the tests. Every golden also lists the two warnings the demo
// itself raises on purpose: BAG-X has no bag type (Objects!Y38) and the
// Materials sheet overrides the built-in PE (Materials!A4).
func brokenSurveys() []brokenSurvey {
	return []brokenSurvey{
		{"person-missing-reading", "person UNW-OP has neither Surface potential nor Resistance to earth",
			func(s *SurveySheets) { setObjectCell(*s, "UNW-OP", "Resistance to earth", nil) }},
		{"site-rh-120", "Site relative humidity 120 %",
			func(s *SurveySheets) { setSiteValue(*s, "Relative humidity", 120.0) }},
		{"negative-width", "COAT-WEB width -1.32 m",
			func(s *SurveySheets) { setObjectCell(*s, "COAT-WEB", "Width", -1.32) }},
		{"zero-resistance", "DRM-DRUM resistance to earth 0 ohm",
			func(s *SurveySheets) { setObjectCell(*s, "DRM-DRUM", "Resistance to earth", 0.0) }},
		{"field-unit-slip", "COAT-WEB field written as 12 kV/mm, beyond what air can hold",
			func(s *SurveySheets) { setObjectCell(*s, "COAT-WEB", "Field", "12 kV/mm") }},
		{"capacitance-in-resistance", "REW-SHAFT resistance to earth written as 150 pF",
			func(s *SurveySheets) { setObjectCell(*s, "REW-SHAFT", "Resistance to earth", "150 pF") }},
		{"unknown-material", "UNW-WEB material PTE (a typo)",
			func(s *SurveySheets) { setObjectCell(*s, "UNW-WEB", "Material", "PTE") }},
		{"unknown-station", "DRY-TC references station ST-DRYY, not on the Stations sheet",
			func(s *SurveySheets) { setObjectCell(*s, "DRY-TC", "Station", "ST-DRYY") }},
		{"unknown-atmosphere", "a new station ST-SLT references atmosphere A-TOL3, not on the Atmospheres sheet",
			func(s *SurveySheets) {
				appendRow(*s, SheetStations, "ID", "ST-SLT", "Name", "Slitter (idle)", "Line", "Coating line C2", "Atmosphere", "A-TOL3")
			}},
		{"duplicate-id", "DRM-LNC renamed DRM-DRUM, an ID already used two rows above",
			func(s *SurveySheets) { setObjectCell(*s, "DRM-LNC", "ID", "DRM-DRUM") }},
		{"unknown-kind", "COAT-HOSE kind hose, not an object kind",
			func(s *SurveySheets) { setObjectCell(*s, "COAT-HOSE", "Kind", "hose") }},
		{"bad-zone", "a new atmosphere A-IPA with zone 3",
			func(s *SurveySheets) {
				appendRow(*s, SheetAtmospheres, "ID", "A-IPA", "Description", "Isopropanol vapour at the cleaning bench",
					"Substance", "isopropanol", "Kind", "vapour", "MIE", 0.65, "Group", "IIA", "Zone", "3")
			}},
		{"dust-group-on-vapour", "a new vapour atmosphere A-IPA with the dust group IIIB",
			func(s *SurveySheets) {
				appendRow(*s, SheetAtmospheres, "ID", "A-IPA", "Description", "Isopropanol vapour at the cleaning bench",
					"Substance", "isopropanol", "Kind", "vapour", "MIE", 0.65, "Group", "IIIB", "Zone", "1")
			}},
		{"missing-survey-date", "Site survey date left blank",
			func(s *SurveySheets) { setSiteValue(*s, "Survey date", nil) }},
		{"missing-objects-sheet", "the Objects sheet is missing",
			func(s *SurveySheets) { dropSheet(s, SheetObjects) }},
		{"text-in-number", "LAM-PAP speed written as about 3.5",
			func(s *SurveySheets) { setObjectCell(*s, "LAM-PAP", "Speed", "about 3.5") }},
		{"unknown-column", "an extra Objects column Shift (a warning only)",
			func(s *SurveySheets) {
				addObjectColumn(*s, "Shift", map[string]any{"UNW-WEB": "early", "COAT-WEB": "late"})
			}},
		{"decimal-comma", "DRY-TC surface potential written 2,5 kV with a decimal comma (accepted: no problem)",
			func(s *SurveySheets) { setObjectCell(*s, "DRY-TC", "Surface potential", "2,5 kV") }},
		{"not-applicable", "COAT-PAN length written n/a (read as blank, with a warning)",
			func(s *SurveySheets) { setObjectCell(*s, "COAT-PAN", "Length", "n/a") }},
		{"bad-bag-type", "BAG-B bag type E, not one of A, B, C, D",
			func(s *SurveySheets) { setObjectCell(*s, "BAG-B", "Bag type", "E") }},
		{"bad-filling", "MIX-TOL2 filling pumped, not top, bottom or dip pipe",
			func(s *SurveySheets) { setObjectCell(*s, "MIX-TOL2", "Filling", "pumped") }},
		{"bad-vessel-class", "MIX-TOL2 vessel class barge, not one of the vessel classes",
			func(s *SurveySheets) { setObjectCell(*s, "MIX-TOL2", "Vessel class", "barge") }},
		{"negative-residence", "MIX-TOL2 residence time after the filter -5 s",
			func(s *SurveySheets) { setObjectCell(*s, "MIX-TOL2", "Residence time", -5.0) }},
	}
}

// sheets returns the demo with the case's fault.
func (b brokenSurvey) sheets() SurveySheets {
	s := DemoSurvey().Clone()
	b.mutate(&s)
	return s
}

// TestBrokenSurveyFiles checks that each testdata/broken/<name>.xlsx holds what
// its Go source generates (-update rewrites them) and that each has a
// hand-written golden whose fault line matches the table.
func TestBrokenSurveyFiles(t *testing.T) {
	if n := len(brokenSurveys()); n < 15 {
		t.Errorf("%d broken surveys, want at least 15", n) // Source: survey issue, item 8
	}
	demo := DemoSurvey()
	seen := map[string]bool{}
	for _, b := range brokenSurveys() {
		t.Run(b.name, func(t *testing.T) {
			if seen[b.name] {
				t.Fatalf("name %s used twice", b.name)
			}
			seen[b.name] = true
			sheets := b.sheets()
			if reflect.DeepEqual(sheets, demo) {
				t.Fatal("the mutation changed nothing")
			}
			data := mustSurveyBytes(t, sheets)
			checkGeneratedWorkbook(t, filepath.Join("..", "testdata", "broken", b.name+".xlsx"), data)
			fault, _, err := readGolden(filepath.Join("..", "testdata", "broken", b.name+".golden"))
			if err != nil {
				t.Fatalf("golden: %v (goldens are written by hand, never by -update)", err)
			}
			if fault != b.fault {
				t.Errorf("golden fault line %q, table says %q", fault, b.fault)
			}
		})
	}
}

func mustSurveyBytes(t *testing.T, s SurveySheets) []byte {
	t.Helper()
	var buf bytes.Buffer
	if err := WriteSurvey(&buf, s); err != nil {
		t.Fatal(err)
	}
	return buf.Bytes()
}

// expectedProblem is one line of a golden file: `Objects!L5 (Field) error`.
// A cell without column (`Objects!4`) matches a problem anywhere on that row;
// a bare sheet (`Objects`) matches a sheet-level problem.
type expectedProblem struct {
	Cell     string
	Field    string // "" when the golden does not name one
	Severity string // "error" or "warning"
}

// readGolden reads a hand-written golden: a "# fault: ..." line, other comment
// lines, then one expected problem a line.
func readGolden(path string) (fault string, want []expectedProblem, err error) {
	f, err := os.Open(path)
	if err != nil {
		return "", nil, err
	}
	defer f.Close()
	sc := bufio.NewScanner(f)
	for sc.Scan() {
		line := strings.TrimSpace(sc.Text())
		switch {
		case line == "":
		case strings.HasPrefix(line, "# fault:"):
			fault = strings.TrimSpace(strings.TrimPrefix(line, "# fault:"))
		case strings.HasPrefix(line, "#"):
		default:
			e, ok := parseProblemLine(line)
			if !ok {
				return "", nil, &os.PathError{Op: "parse", Path: path, Err: errBadGoldenLine(line)}
			}
			want = append(want, e)
		}
	}
	return fault, want, sc.Err()
}

// parseProblemLine parses `CELL (FIELD) SEVERITY` or `CELL SEVERITY`; a cell
// whose sheet name holds spaces or brackets is quoted: `"Objects (2)" warning`.
func parseProblemLine(line string) (expectedProblem, bool) {
	var e expectedProblem
	if rest, ok := strings.CutPrefix(line, `"`); ok {
		cell, after, ok := strings.Cut(rest, `"`)
		if !ok {
			return e, false
		}
		e, ok = parseProblemLine("x" + after)
		e.Cell = cell
		return e, ok
	}
	if i := strings.Index(line, " ("); i >= 0 {
		j := strings.LastIndex(line, ")")
		if j < i {
			return e, false
		}
		e.Cell, e.Field, e.Severity = line[:i], line[i+2:j], strings.TrimSpace(line[j+1:])
	} else {
		parts := strings.Fields(line)
		if len(parts) == 2 {
			e.Cell, e.Severity = parts[0], parts[1]
		}
	}
	return e, e.Cell != "" && (e.Severity == "error" || e.Severity == "warning")
}

type errBadGoldenLine string

func (e errBadGoldenLine) Error() string { return "bad golden line " + string(e) }

func TestReadGolden(t *testing.T) {
	path := filepath.Join(t.TempDir(), "x.golden")
	text := "# fault: a fault\n# comment\n\nObjects!L5 (Field) error\nObjects!4 error\nObjects warning\n"
	if err := os.WriteFile(path, []byte(text), 0o644); err != nil {
		t.Fatal(err)
	}
	fault, want, err := readGolden(path)
	if err != nil {
		t.Fatal(err)
	}
	if fault != "a fault" || len(want) != 3 ||
		want[0] != (expectedProblem{"Objects!L5", "Field", "error"}) ||
		want[1] != (expectedProblem{"Objects!4", "", "error"}) ||
		want[2] != (expectedProblem{"Objects", "", "warning"}) {
		t.Errorf("readGolden = %q, %+v", fault, want)
	}
}

// setObjectCell sets a cell of the object row with the given ID (column name without unit).
func setObjectCell(s SurveySheets, id, column string, v any) {
	setCell(s, SheetObjects, id, column, v)
}

func setCell(s SurveySheets, sheet, id, column string, v any) {
	sh := s.Sheet(sheet)
	j := columnIndex(SheetColumns(sheet), column)
	if sh == nil || j < 0 {
		panic("inventory test: no sheet " + sheet + " or column " + column)
	}
	for i, r := range sh.Rows[1:] {
		if cellText(r, 0) == id {
			for len(r) <= j {
				r = append(r, nil)
			}
			r[j] = v
			sh.Rows[i+1] = r
			return
		}
	}
	panic("inventory test: no row " + id + " on " + sheet)
}

func setSiteValue(s SurveySheets, item string, v any) {
	for _, it := range SiteItems() {
		if it.Name != item {
			continue
		}
		sh := s.Sheet(SheetSite)
		for i, r := range sh.Rows {
			if cellText(r, 0) == it.Header() {
				sh.Rows[i] = []any{r[0], v}
				return
			}
		}
	}
	panic("inventory test: no Site item " + item)
}

func appendRow(s SurveySheets, sheet string, kv ...any) {
	sh := s.Sheet(sheet)
	sh.Rows = append(sh.Rows, rowOf(SheetColumns(sheet), kv...))
}

func dropSheet(s *SurveySheets, name string) {
	for i := range *s {
		if (*s)[i].Name == name {
			*s = append((*s)[:i], (*s)[i+1:]...)
			return
		}
	}
	panic("inventory test: no sheet " + name)
}

func addObjectColumn(s SurveySheets, header string, values map[string]any) {
	sh := s.Sheet(SheetObjects)
	n := len(SheetColumns(SheetObjects))
	for i, r := range sh.Rows {
		for len(r) < n {
			r = append(r, nil)
		}
		if i == 0 {
			r = append(r, header)
		} else {
			r = append(r, values[cellText(r, 0)])
		}
		sh.Rows[i] = r
	}
}
