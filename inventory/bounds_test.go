package inventory

import (
	"archive/zip"
	"bytes"
	"compress/flate"
	"errors"
	"io"
	"os"
	"path/filepath"
	"runtime"
	"strings"
	"testing"
	"time"

	"github.com/xuri/excelize/v2"
)

// The cell-type checks (boolean, formula without a result, date) run on
// every sheet size: a generated survey of 6000 objects, past the 5000 rows
// the old whole-sheet check stopped at, with a TRUE at L5500, a formula
// without a stored result at U5600 and a date at L5700, all below row 5000.
// Values invented for the test.
func TestCellChecksOnLargeSheet(t *testing.T) {
	if testing.Short() {
		t.Skip("-short: writes a 6000-object survey")
	}
	var buf bytes.Buffer
	if err := WriteGeneratedSurvey(&buf, GenerateOptions{Objects: 6000}); err != nil {
		t.Fatal(err)
	}
	f, err := excelize.OpenReader(&buf)
	if err != nil {
		t.Fatal(err)
	}
	if err := f.SetCellBool(SheetObjects, "L5500", true); err != nil {
		t.Fatal(err)
	}
	if err := f.SetCellValue(SheetObjects, "L5700", time.Date(2026, 1, 3, 0, 0, 0, 0, time.UTC)); err != nil {
		t.Fatal(err)
	}
	if err := f.SetCellFormula(SheetObjects, "U5600", "1+1"); err != nil {
		t.Fatal(err)
	}
	if err := f.SetCellDefault(SheetObjects, "U5600", ""); err != nil {
		t.Fatal(err)
	}
	if err := f.SetCellFormula(SheetObjects, "U5600", "1+1"); err != nil {
		t.Fatal(err)
	}
	path := filepath.Join(t.TempDir(), "large.xlsx")
	if err := f.SaveAs(path); err != nil {
		t.Fatal(err)
	}
	f.Close()
	read, err := ReadFile(path, ReadOptions{})
	if err != nil {
		t.Fatal(err)
	}
	streamedSurvey, err := StreamFile(path, ReadOptions{}, nil, func(Object) error { return nil })
	if err != nil {
		t.Fatal(err)
	}
	for name, s := range map[string]*Survey{"ReadFile": read, "StreamFile": streamedSurvey} {
		found := map[string]bool{}
		for _, p := range s.Errors() {
			found[p.Cell()] = true
		}
		for _, cell := range []string{"Objects!L5500", "Objects!U5600", "Objects!L5700"} {
			if !found[cell] {
				t.Errorf("%s: no error at %s", name, cell)
			}
		}
	}
}

// hostileCells writes the demo survey with its Objects sheet replaced by
// rows x cols cells holding 1, written without references (so that they
// compress to almost nothing): a small file whose cells, all kept, would cost
// gigabytes.
func hostileCells(t *testing.T, rows, cols int) []byte {
	t.Helper()
	demo, err := DemoSurveyBytes()
	if err != nil {
		t.Fatal(err)
	}
	zr, err := zip.NewReader(bytes.NewReader(demo), int64(len(demo)))
	if err != nil {
		t.Fatal(err)
	}
	var out bytes.Buffer
	zw := zip.NewWriter(&out)
	zw.RegisterCompressor(zip.Deflate, func(w io.Writer) (io.WriteCloser, error) { return flate.NewWriter(w, flate.BestCompression) })
	for _, zf := range zr.File {
		if zf.Name != "xl/worksheets/sheet4.xml" {
			if err := zw.Copy(zf); err != nil {
				t.Fatal(err)
			}
			continue
		}
		w, err := zw.Create(zf.Name)
		if err != nil {
			t.Fatal(err)
		}
		row := "<row>" + strings.Repeat("<c><v>1</v></c>", cols) + "</row>"
		io.WriteString(w, `<?xml version="1.0" encoding="UTF-8"?><worksheet xmlns="http://schemas.openxmlformats.org/spreadsheetml/2006/main"><sheetData>`)
		for i := 0; i < rows; i++ {
			io.WriteString(w, row)
		}
		io.WriteString(w, `</sheetData></worksheet>`)
	}
	if err := zw.Close(); err != nil {
		t.Fatal(err)
	}
	return out.Bytes()
}

// Hostile inputs are read or refused in bounded memory: each allocates at
// most corpusAllocLimit (512 MiB) while it is read, whatever it unpacks to.
func TestHostileInputsBounded(t *testing.T) {
	if testing.Short() || raceEnabled {
		t.Skip("-short or -race: builds inputs that unpack to 150 MB")
	}
	cases := []struct {
		name string
		data func(t *testing.T) []byte
		want string // part of the refusal, "" when read
	}{
		// 10 million cells (150 MB of XML) in a file of well under a megabyte.
		{"well-compressed cells", func(t *testing.T) []byte { return hostileCells(t, 100000, 100) }, "more cells or text than a workbook of"},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			data := c.data(t)
			path := filepath.Join(t.TempDir(), "hostile.xlsx")
			if err := os.WriteFile(path, data, 0o600); err != nil {
				t.Fatal(err)
			}
			data = nil
			runtime.GC()
			var before, after runtime.MemStats
			runtime.ReadMemStats(&before)
			_, err := ReadFile(path, ReadOptions{})
			runtime.ReadMemStats(&after)
			if d := after.TotalAlloc - before.TotalAlloc; d > corpusAllocLimit {
				t.Errorf("reading allocated %d MiB, over %d MiB", d>>20, corpusAllocLimit>>20)
			}
			switch {
			case c.want == "" && err != nil:
				t.Errorf("refused: %v", err)
			case c.want != "" && (err == nil || !errors.Is(err, ErrUnreadable) || !strings.Contains(err.Error(), c.want)):
				t.Errorf("got %v, want a refusal saying %q", err, c.want)
			}
			t.Logf("allocated %s: %v", sizeText(int64(after.TotalAlloc-before.TotalAlloc)), err)
		})
	}
}

// A sheet that cannot be read to its end stops StreamFile (as `assess`
// reads) with an unreadable survey naming the part and the last row read,
// after the objects before the fault were handed over: the caller writes
// nothing. The corpus file's Objects part is cut after row 10.
func TestStreamStopsAtDamagedSheet(t *testing.T) {
	calls := 0
	_, err := StreamFile(filepath.Join(corpusDir(), "sheet-part-elsewhere-truncated.xlsx"), ReadOptions{}, nil, func(Object) error {
		calls++
		return nil
	})
	if err == nil || !errors.Is(err, ErrUnreadable) || !strings.Contains(err.Error(), "xl/data/objects.xml is cut short; reading stopped after row 10 of sheet Objects") {
		t.Fatalf("got %v, want an unreadable survey naming the part and row 10", err)
	}
	if calls > 9 {
		t.Errorf("%d objects handed over; the sheet holds 9 rows before the cut", calls)
	}
}
