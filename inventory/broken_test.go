package inventory

import (
	"bytes"
	"fmt"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"github.com/xuri/excelize/v2"
)

// TestBrokenSurveys reads each broken survey and compares its problems with the
// hand-written golden (cell, severity, and field where the golden names one).
func TestBrokenSurveys(t *testing.T) {
	for _, b := range brokenSurveys() {
		t.Run(b.name, func(t *testing.T) {
			dir := filepath.Join("..", "testdata", "broken")
			_, want, err := readGolden(filepath.Join(dir, b.name+".golden"))
			if err != nil {
				t.Fatal(err)
			}
			s, err := ReadFile(filepath.Join(dir, b.name+".xlsx"), ReadOptions{})
			if err != nil {
				t.Fatalf("ReadFile: %v", err)
			}
			compareProblems(t, s.Problems, want)
			checkRowsKept(t, s)
		})
	}
}

// TestDemoSurveyReadsClean: the demo survey has no errors (check exits 0 on it),
// only the warnings it raises on purpose.
func TestDemoSurveyReadsClean(t *testing.T) {
	data, err := DemoSurveyBytes()
	if err != nil {
		t.Fatal(err)
	}
	path := filepath.Join(t.TempDir(), "demo.xlsx")
	if err := os.WriteFile(path, data, 0o644); err != nil {
		t.Fatal(err)
	}
	s, err := ReadFile(path, ReadOptions{})
	if err != nil {
		t.Fatal(err)
	}
	// The demo raises two warnings on purpose and no errors.
	compareProblems(t, s.Problems, []expectedProblem{
		{Cell: "Objects!Y38", Field: "Bag type", Severity: "warning"}, // BAG-X has no bag type
		{Cell: "Materials!A4", Field: "Name", Severity: "warning"},    // PE overrides the built-in
	})
	if len(s.Objects) != len(DemoSurvey().Sheet(SheetObjects).Rows)-1 {
		t.Errorf("%d objects accepted, want every demo row", len(s.Objects))
	}
	checkRowsKept(t, s)
}

// TestTemplateRoundTrip fills one valid row per sheet of a blank template and
// reads it back without errors.
func TestTemplateRoundTrip(t *testing.T) {
	var names []string
	for _, m := range BuiltinMaterials() {
		names = append(names, m.Name)
	}
	var subs []string
	for _, s := range BuiltinSubstances() {
		subs = append(subs, s.Name)
	}
	var buf bytes.Buffer
	if err := WriteTemplate(&buf, TemplateOptions{Materials: names, Substances: subs, Cautions: []string{"A caution."}}); err != nil {
		t.Fatal(err)
	}
	f, err := excelize.OpenReader(&buf)
	if err != nil {
		t.Fatal(err)
	}
	defer f.Close()
	// One valid row per sheet; values invented for the test.
	fill := map[string]map[string]any{
		SheetAtmospheres: {"ID": "A-1", "Description": "toluene vapour", "Substance": "toluene", "Kind": "vapour", "MIE": 0.24, "Group": "IIA", "Zone": "1"},
		SheetStations:    {"ID": "ST-1", "Name": "Coater", "Line": "L1", "Atmosphere": "A-1"},
		SheetObjects: {"ID": "O-1", "Station": "ST-1", "Kind": "container", "Description": "drum", "Material": "steel",
			"Diameter": 0.6, "Charging current": 1.0, "Resistance to earth": 10.0, "Capacitance": 100.0},
		SheetMaterials: {"Name": "site film", "Class": "insulating", "Relative permittivity": 3.0, "Surface resistivity": 1e13,
			"Humidity slope": 0.0, "Volume resistivity": 1e14, "Breakdown strength": 100.0},
	}
	for sheet, values := range fill {
		for i, c := range SheetColumns(sheet) {
			if v, ok := values[c.Name]; ok {
				cell, _ := excelize.CoordinatesToCellName(i+1, 2)
				if err := f.SetCellValue(sheet, cell, v); err != nil {
					t.Fatal(err)
				}
			}
		}
	}
	site := map[string]any{"Site": "Test works", "Survey date": "2026-03-14", "Relative humidity": 40.0}
	for i, it := range SiteItems() {
		if v, ok := site[it.Name]; ok {
			if err := f.SetCellValue(SheetSite, fmt.Sprintf("B%d", i+2), v); err != nil {
				t.Fatal(err)
			}
		}
	}
	path := filepath.Join(t.TempDir(), "filled.xlsx")
	if err := f.SaveAs(path); err != nil {
		t.Fatal(err)
	}
	s, err := ReadFile(path, ReadOptions{})
	if err != nil {
		t.Fatal(err)
	}
	for _, p := range s.Errors() {
		t.Errorf("filled template: %s", p.Error())
	}
	if len(s.Objects) != 1 || len(s.Stations) != 1 || len(s.Atmospheres) != 1 {
		t.Errorf("accepted %d objects, %d stations, %d atmospheres; want 1 each", len(s.Objects), len(s.Stations), len(s.Atmospheres))
	}
}

// compareProblems matches problems to golden lines one to one.
func compareProblems(t *testing.T, got []Problem, want []expectedProblem) {
	t.Helper()
	used := make([]bool, len(got))
	for _, w := range want {
		found := false
		for i, p := range got {
			if !used[i] && problemMatches(p, w) {
				used[i], found = true, true
				break
			}
		}
		if !found {
			t.Errorf("missing problem %s (%s) %s", w.Cell, w.Field, w.Severity)
		}
	}
	for i, p := range got {
		if !used[i] {
			t.Errorf("unexpected problem %s %s: %s", p.Cell(), p.Severity, p.Error())
		}
	}
}

func problemMatches(p Problem, w expectedProblem) bool {
	if p.Severity.String() != w.Severity {
		return false
	}
	if w.Field != "" && p.Field != "" && normaliseField(p.Field) != normaliseField(w.Field) {
		return false
	}
	sheet, ref, hasRef := strings.Cut(w.Cell, "!")
	if !strings.EqualFold(p.Sheet, sheet) {
		return false
	}
	if !hasRef {
		return p.Row == 0
	}
	if strings.Trim(ref, "0123456789") == "" { // a row without column: any column of the row
		return fmt.Sprint(p.Row) == ref
	}
	return p.Cell() == w.Cell
}

func normaliseField(s string) string {
	if i := strings.Index(s, "["); i >= 0 {
		s = s[:i]
	}
	return strings.ToLower(strings.TrimSpace(s))
}

// checkRowsKept: rows read = accepted + rejected on every sheet.
func checkRowsKept(t *testing.T, s *Survey) {
	t.Helper()
	for _, c := range s.Counts {
		if c.Read != c.Accepted+c.Rejected {
			t.Errorf("%s: read %d, accepted %d + rejected %d", c.Sheet, c.Read, c.Accepted, c.Rejected)
		}
	}
}
