package inventory

import (
	"fmt"
	"io"
	"time"

	"github.com/xuri/excelize/v2"
)

// GeneratedObjectsPerStation is the default number of objects per station of a
// generated survey.
const GeneratedObjectsPerStation = 200

// MaxObjectRows is the number of object rows a sheet holds below its header
// (the sheet's own row limit, 1,048,576, less the header row).
const MaxObjectRows = excelize.TotalRows - 1

// GenerateOptions size a generated survey.
type GenerateOptions struct {
	Objects           int // object rows, at most MaxObjectRows
	ObjectsPerStation int // 0 takes GeneratedObjectsPerStation
	// TmpDir is the folder for the stream writers' spill files ("" for the system's).
	TmpDir string
}

// GeneratedSurvey returns the sheets of a large invented survey, for tests and
// benchmarks of scale: the demo plant's Site, Atmospheres and Materials sheets,
// ceil(Objects/ObjectsPerStation) stations that repeat the demo's stations in
// turn (same line and atmosphere, numbered names), and Objects object rows that
// repeat each demo station's object rows with their own IDs and readings
// varied by up to ±20 %. Every value is invented for the demo.
//
// The rows are built on demand by the returned function (row i of the Objects
// sheet, 0 = header), so that a million-row survey need not be held in memory.
func GeneratedSurvey(opts GenerateOptions) (sheets SurveySheets, objectRows int, objectRow func(i int) []any) {
	per := opts.ObjectsPerStation
	if per <= 0 {
		per = GeneratedObjectsPerStation
	}
	n := max(0, min(opts.Objects, MaxObjectRows))
	demo := DemoSurvey()
	stCols := SheetColumns(SheetStations)
	obCols := SheetColumns(SheetObjects)
	demoSt := demo.Sheet(SheetStations).Rows[1:]
	demoOb := demo.Sheet(SheetObjects).Rows[1:]
	idCol, stCol := columnIndex(stCols, "ID"), columnIndex(stCols, "Name")
	obID, obSt := columnIndex(obCols, "ID"), columnIndex(obCols, "Station")
	// Object patterns by demo station.
	patterns := make([][][]any, len(demoSt))
	for j, st := range demoSt {
		for _, o := range demoOb {
			if len(o) > obSt && o[obSt] == st[idCol] {
				patterns[j] = append(patterns[j], o)
			}
		}
	}
	stations := [][]any{headerRow(stCols)}
	nst := (n + per - 1) / per
	for i := 0; i < nst; i++ {
		p := demoSt[i%len(demoSt)]
		row := append([]any(nil), p...)
		row[idCol] = fmt.Sprintf("ST-%05d", i+1)
		if name, ok := p[stCol].(string); ok {
			row[stCol] = fmt.Sprintf("%s %d", name, i/len(demoSt)+1)
		}
		stations = append(stations, row)
	}
	varied := map[string]bool{"Field": true, "Surface potential": true, "Speed": true, "Charging current": true,
		"Mass flow": true, "Length": true, "Width": true}
	vary := make([]bool, len(obCols))
	for i, c := range obCols {
		vary[i] = varied[c.Name]
	}
	objectRow = func(i int) []any {
		if i == 0 {
			return headerRow(obCols)
		}
		k := i - 1
		s := k / per
		pats := patterns[s%len(demoSt)]
		if len(pats) == 0 {
			pats = demoOb
		}
		p := pats[(k%per)%len(pats)]
		row := append([]any(nil), p...)
		if base, ok := p[obID].(string); ok {
			row[obID] = fmt.Sprintf("%s-%07d", base, i)
		}
		row[obSt] = fmt.Sprintf("ST-%05d", s+1)
		f := 0.8 + 0.4*float64((k*7919)%101)/100 // invented for the demo: a spread of readings
		for c, v := range row {
			if x, ok := v.(float64); ok && vary[c] && x != 0 {
				row[c] = x * f
			}
		}
		return row
	}
	sheets = SurveySheets{
		{Name: SheetSite, Rows: demo.Sheet(SheetSite).Rows},
		{Name: SheetAtmospheres, Rows: demo.Sheet(SheetAtmospheres).Rows},
		{Name: SheetStations, Rows: stations},
		{Name: SheetObjects},
		{Name: SheetMaterials, Rows: demo.Sheet(SheetMaterials).Rows},
	}
	return sheets, n + 1, objectRow
}

// WriteGeneratedSurvey writes a generated survey (see GeneratedSurvey) to w,
// every sheet through an excelize StreamWriter so that memory stays flat. The
// same options give the same cells.
func WriteGeneratedSurvey(w io.Writer, opts GenerateOptions) error {
	sheets, rows, objectRow := GeneratedSurvey(opts)
	f := excelize.NewFile(excelize.Options{TmpDir: opts.TmpDir})
	defer f.Close()
	date, err := f.NewStyle(&excelize.Style{NumFmt: 14})
	if err != nil {
		return err
	}
	bold, err := f.NewStyle(&excelize.Style{Font: &excelize.Font{Bold: true}})
	if err != nil {
		return err
	}
	for i, sh := range sheets {
		if i == 0 {
			if err := f.SetSheetName("Sheet1", sh.Name); err != nil {
				return err
			}
		} else if _, err := f.NewSheet(sh.Name); err != nil {
			return err
		}
	}
	for _, sh := range sheets {
		sw, err := f.NewStreamWriter(sh.Name)
		if err != nil {
			return err
		}
		n, row := len(sh.Rows), func(i int) []any { return sh.Rows[i] }
		if sh.Name == SheetObjects {
			n, row = rows, objectRow
		}
		for i := 0; i < n; i++ {
			r := row(i)
			cells := make([]any, len(r))
			for c, v := range r {
				switch x := v.(type) {
				case time.Time:
					cells[c] = excelize.Cell{StyleID: date, Value: x}
				default:
					if i == 0 {
						cells[c] = excelize.Cell{StyleID: bold, Value: v}
					} else {
						cells[c] = v
					}
				}
			}
			ref, _ := excelize.CoordinatesToCellName(1, i+1)
			if err := sw.SetRow(ref, cells); err != nil {
				return fmt.Errorf("generated survey: %s row %d: %w", sh.Name, i+1, err)
			}
		}
		if err := sw.Flush(); err != nil {
			return err
		}
	}
	_, err = f.WriteTo(w)
	return err
}
