package inventory

import (
	"os"
	"path/filepath"
	"strings"
	"testing"

	"github.com/xuri/excelize/v2"
)

// utSheet is one sheet to write: its name and its rows from row 1.
type utSheet struct {
	Name string
	Rows [][]any
}

// utBook is a workbook under construction for a test.
type utBook []utSheet

// writeBook writes the sheets to a temporary .xlsx and returns its path.
// Cells are written with SetCellValue, so numbers are stored as numbers and
// strings as strings; a string starting with "=" is written as a formula
// without a cached value.
func utWriteBook(t testing.TB, b utBook) string {
	t.Helper()
	data := utBookBytes(t, b)
	p := filepath.Join(t.TempDir(), "survey.xlsx")
	if err := os.WriteFile(p, data, 0o600); err != nil {
		t.Fatal(err)
	}
	return p
}

// utBookBytes writes the sheets into an .xlsx held in memory.
func utBookBytes(t testing.TB, b utBook) []byte {
	t.Helper()
	f := excelize.NewFile()
	defer f.Close()
	for i, sh := range b {
		if i == 0 {
			if err := f.SetSheetName("Sheet1", sh.Name); err != nil {
				t.Fatal(err)
			}
		} else if _, err := f.NewSheet(sh.Name); err != nil {
			t.Fatal(err)
		}
		for r, row := range sh.Rows {
			for c, v := range row {
				if v == nil {
					continue
				}
				cell, _ := excelize.CoordinatesToCellName(c+1, r+1)
				if s, ok := v.(string); ok && strings.HasPrefix(s, "=") {
					if err := f.SetCellFormula(sh.Name, cell, s[1:]); err != nil {
						t.Fatal(err)
					}
					continue
				}
				if err := f.SetCellValue(sh.Name, cell, v); err != nil {
					t.Fatal(err)
				}
			}
		}
	}
	if len(b) == 0 {
		f.SetSheetName("Sheet1", "Empty")
	}
	buf, err := f.WriteToBuffer()
	if err != nil {
		t.Fatal(err)
	}
	return buf.Bytes()
}

// headerRow returns the template's header texts of a sheet.
func utHeader(sheet string) []any {
	var out []any
	for _, c := range SheetColumns(sheet) {
		out = append(out, c.Header())
	}
	return out
}

// rowOf builds a data row of a sheet from column name -> value.
func utRow(sheet string, vals map[string]any) []any {
	cols := SheetColumns(sheet)
	out := make([]any, len(cols))
	for i, c := range cols {
		if v, ok := vals[c.Name]; ok {
			out[i] = v
		}
	}
	return out
}

// validBook returns a small survey that passes validation: one row per sheet
// and one object per kind. Values invented for the test.
func utValidBook() utBook {
	return utBook{
		{SheetSite, [][]any{
			{"Item", "Value"},
			{"Site", "Test plant"},
			{"Survey date", "2026-03-14"},
			{"Surveyed by", "QA"},
			{"Relative humidity [%]", 45},
			{"Air temperature [°C]", 21},
			{"Required margin", 10},
		}},
		{SheetAtmospheres, [][]any{
			utHeader(SheetAtmospheres),
			utRow(SheetAtmospheres, map[string]any{"ID": "A-TOL", "Substance": "toluene", "Kind": "vapour", "Zone": "1"}),
			utRow(SheetAtmospheres, map[string]any{"ID": "A-DUST", "Kind": "dust", "MIE": 30, "Group": "IIIB", "Zone": "21"}),
		}},
		{SheetStations, [][]any{
			utHeader(SheetStations),
			utRow(SheetStations, map[string]any{"ID": "ST-1", "Name": "Coater", "Atmosphere": "A-TOL"}),
			utRow(SheetStations, map[string]any{"ID": "ST-2", "Name": "Bag tip", "Atmosphere": "A-DUST", "Relative humidity": 35}),
			utRow(SheetStations, map[string]any{"ID": "ST-3", "Name": "Warehouse"}),
		}},
		{SheetObjects, [][]any{
			utHeader(SheetObjects),
			utRow(SheetObjects, map[string]any{"ID": "W-1", "Station": "ST-1", "Kind": "sheet", "Material": "PET", "Length": 2, "Width": 1.2, "Field": 45, "Field distance": 0.1}),
			utRow(SheetObjects, map[string]any{"ID": "B-1", "Station": "ST-1", "Kind": "belt", "Material": "rubber belt", "Length": 5, "Width": 0.5, "Surface potential": 8, "Distance to earth": 0.3, "Speed": 2}),
			utRow(SheetObjects, map[string]any{"ID": "R-1", "Station": "ST-1", "Kind": "roller", "Diameter": 0.2, "Surface potential": 3, "Distance to earth": 0.1}),
			utRow(SheetObjects, map[string]any{"ID": "C-1", "Station": "ST-2", "Kind": "container", "Mass flow": 0.5, "Charge-to-mass": 10}),
			utRow(SheetObjects, map[string]any{"ID": "P-1", "Station": "ST-1", "Kind": "part", "Charging current": 1}),
			utRow(SheetObjects, map[string]any{"ID": "OP-1", "Station": "ST-1", "Kind": "person", "Resistance to earth": "1e8"}),
			utRow(SheetObjects, map[string]any{"ID": "PW-1", "Station": "ST-2", "Kind": "powder", "Mass flow": 0.5, "Diameter": 1, "Particle size": 1}),
			utRow(SheetObjects, map[string]any{"ID": "L-1", "Station": "ST-1", "Kind": "liquid", "Speed": 1, "Diameter": 0.05, "Conductivity": 1,
				"Filling": "bottom", "Vessel material": "metal", "Vessel class": "drum", "Inlet velocity": 0.5, "Filter": "none", "Second phase": "none"}),
			utRow(SheetObjects, map[string]any{"ID": "BG-1", "Station": "ST-2", "Kind": "bag", "Bag type": "C", "Resistance to earth": "1e6"}),
		}},
		{SheetMaterials, [][]any{
			utHeader(SheetMaterials),
			utRow(SheetMaterials, map[string]any{"Name": "coated board", "Class": "dissipative", "Relative permittivity": 3, "Surface resistivity": "1e10", "Humidity slope": 0.5}),
		}},
	}
}

// set replaces (or adds) a value of the data row whose first cell is id.
func (b utBook) set(sheet, id, col string, v any) utBook {
	for si := range b {
		if b[si].Name != sheet {
			continue
		}
		cols := SheetColumns(sheet)
		ci := -1
		for i, c := range cols {
			if c.Name == col {
				ci = i
			}
		}
		for ri, r := range b[si].Rows {
			if len(r) > 0 && r[0] == id {
				for len(b[si].Rows[ri]) <= ci {
					b[si].Rows[ri] = append(b[si].Rows[ri], nil)
				}
				b[si].Rows[ri][ci] = v
			}
		}
	}
	return b
}

// addRow appends a data row to a sheet.
func (b utBook) addRow(sheet string, vals map[string]any) utBook {
	for si := range b {
		if b[si].Name == sheet {
			b[si].Rows = append(b[si].Rows, utRow(sheet, vals))
		}
	}
	return b
}

// readBook writes and reads a utBook, failing on an unreadable error.
func utReadBook(t testing.TB, b utBook) *Survey {
	t.Helper()
	s, err := ReadFile(utWriteBook(t, b), ReadOptions{})
	if err != nil {
		t.Fatalf("ReadFile: %v", err)
	}
	utAccounted(t, s)
	return s
}

// assertAccounted checks that every row read is accepted or rejected.
func utAccounted(t testing.TB, s *Survey) {
	t.Helper()
	rejected := map[string]int{}
	for _, r := range s.Rejected {
		rejected[r.Sheet]++
		if len(r.Problems) == 0 {
			t.Errorf("rejected %s!%d has no reason", r.Sheet, r.Row)
		}
	}
	accepted := map[string]int{SheetAtmospheres: len(s.Atmospheres), SheetStations: len(s.Stations), SheetObjects: len(s.Objects), SheetChanges: len(s.Changes)}
	for _, c := range s.Counts {
		if c.Read != c.Accepted+c.Rejected {
			t.Errorf("%s: read %d != accepted %d + rejected %d", c.Sheet, c.Read, c.Accepted, c.Rejected)
		}
		if c.Rejected != rejected[c.Sheet] {
			t.Errorf("%s: count says %d rejected, Rejected lists %d", c.Sheet, c.Rejected, rejected[c.Sheet])
		}
		if n, ok := accepted[c.Sheet]; ok && n != c.Accepted {
			t.Errorf("%s: count says %d accepted, survey holds %d", c.Sheet, c.Accepted, n)
		}
	}
}

// problemAt returns the problems at a cell ("Objects!K3") or row ("Objects!3").
func utProblemsAt(s *Survey, cell string) []Problem {
	var out []Problem
	for _, p := range s.Problems {
		if p.Cell() == cell {
			out = append(out, p)
		}
	}
	return out
}

func utDump(s *Survey) string {
	var b strings.Builder
	for _, p := range s.Problems {
		b.WriteString("  " + p.Severity.String() + " " + p.Error() + "\n")
	}
	return b.String()
}
