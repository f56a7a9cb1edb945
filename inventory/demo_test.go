package inventory

import (
	"bytes"
	"fmt"
	"os"
	"path/filepath"
	"slices"
	"strings"
	"testing"

	"github.com/xuri/excelize/v2"
)

// TestDemoSurveyShape checks the demo against what it was built to show.
// Source of the expected counts and contents: the project's survey issue (30-60
// objects over 6-10 stations, liquid and bag rows, mixed outcomes); the values
// themselves are invented for the demo.
func TestDemoSurveyShape(t *testing.T) {
	s := DemoSurvey()
	var names []string
	for _, sh := range s {
		names = append(names, sh.Name)
	}
	if !slices.Equal(names, Sheets()) {
		t.Fatalf("demo sheets = %v, want %v", names, Sheets())
	}
	for _, sh := range s[1:] {
		want := headerRow(SheetColumns(sh.Name))
		if !slices.Equal(sh.Rows[0], want) {
			t.Errorf("%s header = %v, want %v", sh.Name, sh.Rows[0], want)
		}
		for i, r := range sh.Rows {
			if len(r) > len(want) {
				t.Errorf("%s row %d has %d cells, more than the %d columns", sh.Name, i+1, len(r), len(want))
			}
		}
	}
	atm := idsOf(t, s, SheetAtmospheres)
	st := idsOf(t, s, SheetStations)
	obj := idsOf(t, s, SheetObjects)
	if n := len(obj); n < 30 || n > 60 {
		t.Errorf("%d objects, want 30-60", n) // Source: survey issue, item 8
	}
	if n := len(st); n < 6 || n > 10 {
		t.Errorf("%d stations, want 6-10", n) // Source: survey issue, item 8
	}
	stCols := SheetColumns(SheetStations)
	for i, r := range s.Sheet(SheetStations).Rows[1:] {
		if a := cellText(r, columnIndex(stCols, "Atmosphere")); a != "" && !slices.Contains(atm, a) {
			t.Errorf("Stations row %d: atmosphere %q not on the Atmospheres sheet", i+2, a)
		}
	}
	objCols := SheetColumns(SheetObjects)
	kinds := map[string]int{}
	var bagTypes []string
	var conductivities []float64
	used := map[string]bool{}
	for i, r := range s.Sheet(SheetObjects).Rows[1:] {
		station := cellText(r, columnIndex(objCols, "Station"))
		used[station] = true
		if !slices.Contains(st, station) {
			t.Errorf("Objects row %d: station %q not on the Stations sheet", i+2, station)
		}
		kind := cellText(r, columnIndex(objCols, "Kind"))
		if !slices.Contains(Kinds(), kind) {
			t.Errorf("Objects row %d: kind %q unknown", i+2, kind)
		}
		kinds[kind]++
		switch kind {
		case KindBag:
			bagTypes = append(bagTypes, cellText(r, columnIndex(objCols, "Bag type")))
		case KindLiquid:
			if k, ok := cellAt(r, columnIndex(objCols, "Conductivity")).(float64); ok {
				conductivities = append(conductivities, k)
			}
		}
	}
	for _, id := range st {
		if !used[id] {
			t.Errorf("station %s has no objects", id)
		}
	}
	for _, k := range Kinds() {
		if kinds[k] == 0 {
			t.Errorf("no %s row in the demo", k)
		}
	}
	// Source: liquid and bag issue, item 3 (bag types A, B, C earthed and not, D, blank).
	slices.Sort(bagTypes)
	if want := []string{"", "A", "B", "C", "C", "D"}; !slices.Equal(bagTypes, want) {
		t.Errorf("bag types %q, want %q", bagTypes, want)
	}
	// One low-conductivity liquid (<= 50 pS/m, reference section 8) and one above.
	low, high := 0, 0
	for _, k := range conductivities {
		if k <= 50 {
			low++
		} else {
			high++
		}
	}
	if low == 0 || high == 0 {
		t.Errorf("liquid conductivities %v: want at least one <= 50 pS/m and one above", conductivities)
	}
}

// TestDemoSurveyHasCellUnits checks that some cells carry their own unit, so the
// demo exercises per-cell units.
func TestDemoSurveyHasCellUnits(t *testing.T) {
	var withUnit []string
	for _, r := range DemoSurvey().Sheet(SheetObjects).Rows[1:] {
		for _, c := range r {
			if v, ok := c.(string); ok && strings.ContainsAny(v, "0123456789") && strings.ContainsAny(v, "ΩFVmµk") {
				withUnit = append(withUnit, v)
			}
		}
	}
	for _, want := range []string{"1 TΩ", "15 pF", "100 kΩ", "23 µm"} {
		if !slices.Contains(withUnit, want) {
			t.Errorf("no demo cell %q (cells with units: %q)", want, withUnit)
		}
	}
}

func TestDemoSurveyDeterministic(t *testing.T) {
	a, err := DemoSurveyBytes()
	if err != nil {
		t.Fatal(err)
	}
	b, err := DemoSurveyBytes()
	if err != nil {
		t.Fatal(err)
	}
	if !bytes.Equal(a, b) {
		t.Error("two writes of the demo survey differ")
	}
}

// TestDemoSurveyFile checks that testdata/demo/demo-survey.xlsx holds what the Go
// source generates (cells, not bytes); -update rewrites it.
func TestDemoSurveyFile(t *testing.T) {
	data, err := DemoSurveyBytes()
	if err != nil {
		t.Fatal(err)
	}
	checkGeneratedWorkbook(t, filepath.Join("..", "testdata", "demo", "demo-survey.xlsx"), data)
}

// TestWriteSurveyCells writes a small survey and reads the cells back.
func TestWriteSurveyCells(t *testing.T) {
	sheets := SurveySheets{
		{Name: "One", Rows: [][]any{{"A", "B"}, {1.5, "2 kV"}, {nil, 7}}},
		{Name: "Two", Rows: [][]any{{"X"}}},
	}
	var buf bytes.Buffer
	if err := WriteSurvey(&buf, sheets); err != nil {
		t.Fatal(err)
	}
	got := workbookCells(t, buf.Bytes())
	want := map[string][][]string{
		"One": {{"A", "B"}, {"1.5", "2 kV"}, {"", "7"}},
		"Two": {{"X"}},
	}
	if fmt.Sprint(got) != fmt.Sprint(want) {
		t.Errorf("cells = %v, want %v", got, want)
	}
	if err := WriteSurvey(&buf, SurveySheets{{Name: "Bad", Rows: [][]any{{struct{}{}}}}}); err == nil {
		t.Error("WriteSurvey accepted a cell of an unsupported type")
	}
}

func idsOf(t *testing.T, s SurveySheets, sheet string) []string {
	t.Helper()
	seen := map[string]bool{}
	var ids []string
	for i, r := range s.Sheet(sheet).Rows[1:] {
		id := cellText(r, 0)
		if id == "" || seen[id] {
			t.Errorf("%s row %d: ID %q empty or repeated", sheet, i+2, id)
		}
		seen[id] = true
		ids = append(ids, id)
	}
	return ids
}

func cellAt(r []any, i int) any {
	if i < 0 || i >= len(r) {
		return nil
	}
	return r[i]
}

func cellText(r []any, i int) string {
	s, _ := cellAt(r, i).(string)
	return s
}

// workbookCells reads every sheet's raw cell values.
func workbookCells(t *testing.T, data []byte) map[string][][]string {
	t.Helper()
	f, err := excelize.OpenReader(bytes.NewReader(data))
	if err != nil {
		t.Fatalf("open workbook: %v", err)
	}
	defer f.Close()
	out := map[string][][]string{}
	for _, s := range f.GetSheetList() {
		rows, err := f.GetRows(s, excelize.Options{RawCellValue: true})
		if err != nil {
			t.Fatalf("sheet %s: %v", s, err)
		}
		out[s] = rows
	}
	return out
}

// checkGeneratedWorkbook compares the cells of the checked-in file at path with
// data, or rewrites the file with -update.
func checkGeneratedWorkbook(t *testing.T, path string, data []byte) {
	t.Helper()
	old, ok := readGenerated(t, path, data)
	if !ok {
		return
	}
	if bytes.Equal(old, data) {
		return // the writer is deterministic: equal bytes, equal cells
	}
	got, want := workbookCells(t, old), workbookCells(t, data)
	if d := firstCellDifference(got, want); d != "" {
		t.Errorf("%s is out of date with its Go source: %s (run go test ./inventory -update)", path, d)
	}
}

func firstCellDifference(got, want map[string][][]string) string {
	var names []string
	for s := range want {
		names = append(names, s)
	}
	for s := range got {
		if _, ok := want[s]; !ok {
			return "extra sheet " + s
		}
	}
	slices.Sort(names)
	for _, s := range names {
		g, ok := got[s]
		if !ok {
			return "missing sheet " + s
		}
		w := want[s]
		for r := 0; r < max(len(g), len(w)); r++ {
			var gr, wr []string
			if r < len(g) {
				gr = g[r]
			}
			if r < len(w) {
				wr = w[r]
			}
			for c := 0; c < max(len(gr), len(wr)); c++ {
				gv, wv := "", ""
				if c < len(gr) {
					gv = gr[c]
				}
				if c < len(wr) {
					wv = wr[c]
				}
				if gv != wv {
					cell, _ := excelize.CoordinatesToCellName(c+1, r+1)
					return fmt.Sprintf("%s!%s is %q, the source gives %q", s, cell, gv, wv)
				}
			}
		}
	}
	return ""
}

func TestFirstCellDifference(t *testing.T) {
	a := map[string][][]string{"S": {{"x", "y"}, {"1"}}}
	tests := []struct {
		name string
		b    map[string][][]string
		want string
	}{
		{"same", map[string][][]string{"S": {{"x", "y"}, {"1"}}}, ""},
		{"cell", map[string][][]string{"S": {{"x", "y"}, {"2"}}}, `S!A2 is "1", the source gives "2"`},
		{"longer row", map[string][][]string{"S": {{"x", "y", "z"}, {"1"}}}, `S!C1 is "", the source gives "z"`},
		{"missing sheet", map[string][][]string{"S": {{"x", "y"}, {"1"}}, "T": nil}, "missing sheet T"},
		{"extra sheet", map[string][][]string{}, "extra sheet S"},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			if got := firstCellDifference(a, tc.b); got != tc.want {
				t.Errorf("got %q, want %q", got, tc.want)
			}
		})
	}
}

// readGenerated returns the checked-in file at path for comparison with data;
// with -update it rewrites the file from data instead and returns false.
func readGenerated(t *testing.T, path string, data []byte) ([]byte, bool) {
	t.Helper()
	if *update {
		if err := os.MkdirAll(filepath.Dir(path), 0o755); err != nil {
			t.Fatal(err)
		}
		if err := os.WriteFile(path, data, 0o644); err != nil {
			t.Fatal(err)
		}
		return nil, false
	}
	old, err := os.ReadFile(path)
	if err != nil {
		t.Fatalf("%v (run go test ./inventory -update to generate it)", err)
	}
	return old, true
}
