package inventory

import (
	"errors"
	"strings"
	"testing"

	"github.com/xuri/excelize/v2"
)

// Odd but readable input: every row accounted for, no panic, clear problems.
// Values invented for the test.
func TestOddInput(t *testing.T) {
	t.Run("trailing spaces in references and non-ASCII IDs", func(t *testing.T) {
		b := utValidBook().set(SheetObjects, "W-1", "Station", " ST-1  ").set(SheetObjects, "R-1", "ID", "Walze-Ø1 µ")
		b = b.set(SheetObjects, "B-1", "Material", " rubber belt ")
		s := utReadBook(t, b)
		if len(s.Errors()) != 0 || s.Objects[0].Station != "ST-1" || s.Objects[1].Material != "rubber belt" {
			t.Fatalf("\n%s", utDump(s))
		}
	})
	t.Run("very long ID is kept and messages stay short", func(t *testing.T) {
		long := strings.Repeat("X", 5000)
		b := utValidBook().addRow(SheetObjects, map[string]any{"ID": long, "Station": "nowhere", "Kind": "person", "Surface potential": 2})
		s := utReadBook(t, b)
		if len(s.Rejected) != 1 || s.Rejected[0].ID != long {
			t.Fatalf("rejected %d", len(s.Rejected))
		}
		for _, p := range s.Problems {
			if len(p.Message) > 400 {
				t.Errorf("message of %d bytes", len(p.Message))
			}
		}
	})
	t.Run("formula with and without a cached value", func(t *testing.T) {
		b := utValidBook().set(SheetObjects, "W-1", "Field", "=40+5")
		s := utReadBook(t, b)
		// excelize writes no cached value: the cell reads as blank, so W-1 lacks its reading.
		if len(s.Rejected) != 1 || s.Rejected[0].ID != "W-1" {
			t.Fatalf("\n%s", utDump(s))
		}
		p := utWriteBook(t, utValidBook())
		f, err := excelize.OpenFile(p)
		if err != nil {
			t.Fatal(err)
		}
		// A formula cell with a cached value: the value counts.
		f.SetCellFormula(SheetObjects, "L2", "40+5")
		f.SetCellValue(SheetObjects, "L2", 45)
		f.SetCellFormula(SheetObjects, "L2", "40+5")
		f.Save()
		f.Close()
		s2, err := ReadFile(p, ReadOptions{})
		if err != nil {
			t.Fatal(err)
		}
		utAccounted(t, s2)
		if len(s2.Errors()) != 0 {
			t.Fatalf("\n%s", utDump(s2))
		}
	})
	t.Run("hidden row and hidden sheet are read with a warning", func(t *testing.T) {
		p := utWriteBook(t, utValidBook())
		f, _ := excelize.OpenFile(p)
		f.SetRowVisible(SheetObjects, 3, false)
		f.SetSheetVisible(SheetMaterials, false)
		f.Save()
		f.Close()
		s, err := ReadFile(p, ReadOptions{})
		if err != nil {
			t.Fatal(err)
		}
		utAccounted(t, s)
		if len(s.Objects) != 9 || len(utProblemsAt(s, "Objects!3")) != 1 || len(utProblemsAt(s, "Materials")) != 1 {
			t.Fatalf("\n%s", utDump(s))
		}
	})
	t.Run("row cap", func(t *testing.T) {
		b := utValidBook()
		for i := 0; i < 30; i++ {
			b = b.addRow(SheetStations, map[string]any{"ID": strings.Repeat("S", i+5)})
		}
		s, err := ReadFile(utWriteBook(t, b), ReadOptions{MaxRows: 10})
		if err != nil {
			t.Fatal(err)
		}
		utAccounted(t, s)
		found := false
		for _, p := range s.Errors() {
			if p.Sheet == SheetStations && strings.Contains(p.Message, "more than 10 rows") {
				found = true
			}
		}
		if !found {
			t.Errorf("no row-cap error\n%s", utDump(s))
		}
	})
	t.Run("booleans and numbers in text columns", func(t *testing.T) {
		b := utValidBook().set(SheetObjects, "W-1", "Description", 12.5).set(SheetObjects, "B-1", "Length", true)
		s := utReadBook(t, b)
		if s.Objects[0].Description != "12.5" {
			t.Errorf("description %q", s.Objects[0].Description)
		}
		ps := utProblemsAt(s, "Objects!F3")
		if len(ps) != 1 || !errors.Is(ps[0], ErrNotANumber) || !strings.Contains(ps[0].Message, "TRUE or FALSE") {
			t.Fatalf("F3: %+v\n%s", ps, utDump(s))
		}
		if len(s.Rejected) != 1 {
			t.Errorf("rejected %+v", s.Rejected)
		}
	})
}

// FuzzReadCells puts arbitrary text into header and data cells of a valid
// survey: the reader never panics and every row is accounted for.
func FuzzReadCells(f *testing.F) {
	f.Add("Field [kV/m]", "12 kV/mm", "ST-1", "sheet", "PET", "45")
	f.Add("Capacitance [Ω]", "150 pF", "st-1 ", "roler", "pett", "0.45")
	f.Add("", "=1/0", "", "", "", "")
	f.Add("ID", "#DIV/0!", "ST-9", "bag", "polyethylene", "n/a")
	f.Fuzz(func(t *testing.T, header, value, station, kind, material, rh string) {
		b := utValidBook()
		b[3].Rows[0][11] = header
		b = b.set(SheetObjects, "W-1", "Field", value).set(SheetObjects, "W-1", "Station", station).
			set(SheetObjects, "W-1", "Kind", kind).set(SheetObjects, "W-1", "Material", material)
		b[0].Rows[4][1] = rh
		data := utBookBytes(t, b)
		s, err := Read(data, "fuzz.xlsx", ReadOptions{})
		if err != nil {
			t.Fatalf("valid workbook unreadable: %v", err)
		}
		utAccounted(t, s)
		for _, p := range s.Problems {
			if p.Sheet == "" || p.Message == "" {
				t.Fatalf("problem without place or message: %+v", p)
			}
		}
	})
}
