package audit

// Benchmarks of scale: import, model, write and the whole streamed
// assessment, per object, on generated surveys of 1k, 10k and 100k objects
// (100k skipped with -short), and the floor they are compared with: the same
// file only streamed in and an equally wide sheet only streamed out with
// excelize. Monte Carlo benchmarks are in report/assess (BenchmarkMonteCarlo*),
// the model's hot loop in model (BenchmarkEvaluate). Run:
//
//	go test ./report -run '^$' -bench 'Scale' -benchmem [-short]
//
// Each reports ns/object; DEVELOPERS.md "Performance and scale" gives the ratios.

import (
	"flag"
	"fmt"
	"io"
	"os"
	"path/filepath"
	"testing"

	"github.com/sparkmargin/sparkmargin/inventory"
	"github.com/sparkmargin/sparkmargin/report/assess"
	"github.com/xuri/excelize/v2"
)

var scaleSizes = []int{1000, 10000, 100000}

// scaleObjects adds one more size, e.g. -scale-objects 50000 for the 50k targets.
var scaleObjects = flag.Int("scale-objects", 0, "also run the Scale benchmarks on a generated survey of this many objects")

// generatedSurvey writes a generated survey of n objects into the
// benchmark's temporary folder (removed after it).
func generatedSurvey(b *testing.B, n int) string {
	b.Helper()
	p := filepath.Join(b.TempDir(), fmt.Sprintf("survey-%d.xlsx", n))
	f, err := os.Create(p)
	if err != nil {
		b.Fatal(err)
	}
	if err := inventory.WriteGeneratedSurvey(f, inventory.GenerateOptions{Objects: n}); err != nil {
		b.Fatal(err)
	}
	if err := f.Close(); err != nil {
		b.Fatal(err)
	}
	return p
}

func eachSize(b *testing.B, fn func(b *testing.B, n int, path string)) {
	sizes := scaleSizes
	if *scaleObjects > 0 {
		sizes = append(sizes[:len(sizes):len(sizes)], *scaleObjects)
	}
	for _, n := range sizes {
		b.Run(fmt.Sprintf("%dk", n/1000), func(b *testing.B) {
			if n > 10000 && n != *scaleObjects && testing.Short() {
				b.Skip("100k objects skipped with -short")
			}
			path := generatedSurvey(b, n)
			b.ResetTimer()
			fn(b, n, path)
			b.ReportMetric(float64(b.Elapsed().Nanoseconds())/float64(b.N)/float64(n), "ns/object")
		})
	}
}

// readAll reads the survey with its objects (for the model and write benchmarks).
func readAll(b *testing.B, path string) (*inventory.Survey, []inventory.Object) {
	var objs []inventory.Object
	s, err := inventory.StreamFile(path, inventory.ReadOptions{}, nil, func(o inventory.Object) error {
		objs = append(objs, o)
		return nil
	})
	if err != nil {
		b.Fatal(err)
	}
	return s, objs
}

// BenchmarkScaleImport: reading and validating the survey, row by row.
func BenchmarkScaleImport(b *testing.B) {
	eachSize(b, func(b *testing.B, n int, path string) {
		for b.Loop() {
			if _, err := inventory.StreamFile(path, inventory.ReadOptions{}, nil, func(inventory.Object) error { return nil }); err != nil {
				b.Fatal(err)
			}
		}
	})
}

// BenchmarkScaleModel: assessing the objects (model, checks, findings,
// station aggregates), point estimate, batches of 1024 as the command does.
func BenchmarkScaleModel(b *testing.B) {
	eachSize(b, func(b *testing.B, n int, path string) {
		b.StopTimer()
		s, objs := readAll(b, path)
		b.StartTimer()
		for b.Loop() {
			st := assess.NewStreamer(s, assess.Options{})
			for i := 0; i < len(objs); i += 1024 {
				st.Add(objs[i:min(i+1024, len(objs))])
			}
			st.Finish()
		}
	})
}

// BenchmarkScaleWrite: writing the audit workbook from assessed objects.
func BenchmarkScaleWrite(b *testing.B) {
	eachSize(b, func(b *testing.B, n int, path string) {
		b.StopTimer()
		s, objs := readAll(b, path)
		st := assess.NewStreamer(s, assess.Options{})
		var rs []assess.ObjectResult
		for i := 0; i < len(objs); i += 1024 {
			rs = append(rs, st.Add(objs[i:min(i+1024, len(objs))])...)
		}
		a := st.Finish()
		b.StartTimer()
		for b.Loop() {
			w, err := NewWorkbookWriter(s, RunInfo{}, false, "")
			if err != nil {
				b.Fatal(err)
			}
			if err := w.Add(rs); err != nil {
				b.Fatal(err)
			}
			if err := w.Finish(a, io.Discard); err != nil {
				b.Fatal(err)
			}
			w.Close()
		}
	})
}

// BenchmarkScaleAssess: the whole streamed assessment as the command runs it:
// read row by row, assess in batches, write each batch's rows, then the
// other sheets (no JSON).
func BenchmarkScaleAssess(b *testing.B) {
	eachSize(b, func(b *testing.B, n int, path string) {
		for b.Loop() {
			if err := streamAssess(path, io.Discard); err != nil {
				b.Fatal(err)
			}
		}
	})
}

func streamAssess(path string, out io.Writer) error {
	var st *assess.Streamer
	var w *WorkbookWriter
	batch := make([]inventory.Object, 0, 1024)
	flush := func() error {
		rs := st.Add(batch)
		batch = batch[:0]
		return w.Add(rs)
	}
	s, err := inventory.StreamFile(path, inventory.ReadOptions{}, func(s *inventory.Survey) error {
		st = assess.NewStreamer(s, assess.Options{})
		var err error
		w, err = NewWorkbookWriter(s, RunInfo{}, false, "")
		return err
	}, func(o inventory.Object) error {
		batch = append(batch, o)
		if len(batch) == cap(batch) {
			return flush()
		}
		return nil
	})
	if err != nil {
		return err
	}
	defer w.Close()
	if err := flush(); err != nil {
		return err
	}
	a := st.Finish()
	a.Survey = s
	return w.Finish(a, out)
}

// BenchmarkScaleFloor: the least any streamed assessment can cost: every row
// of every sheet streamed in (excelize Rows/Columns) and a sheet as wide as
// the audit's Objects sheet, one row per object, streamed out (StreamWriter,
// numbers and short texts, no styles, no canonical zip pass).
func BenchmarkScaleFloor(b *testing.B) {
	width := len(objectColumns(false))
	eachSize(b, func(b *testing.B, n int, path string) {
		for b.Loop() {
			if err := floor(path, width, io.Discard); err != nil {
				b.Fatal(err)
			}
		}
	})
}

func floor(path string, width int, out io.Writer) error {
	in, err := excelize.OpenFile(path)
	if err != nil {
		return err
	}
	defer in.Close()
	f := excelize.NewFile()
	defer f.Close()
	sw, err := f.NewStreamWriter("Sheet1")
	if err != nil {
		return err
	}
	row := make([]any, width)
	r := 0
	for _, sheet := range in.GetSheetList() {
		rows, err := in.Rows(sheet)
		if err != nil {
			return err
		}
		for rows.Next() {
			cells, err := rows.Columns(excelize.Options{RawCellValue: true})
			if err != nil {
				return err
			}
			if sheet != inventory.SheetObjects {
				continue
			}
			r++
			for i := range row {
				if i < len(cells) && i%2 == 0 {
					row[i] = cells[i]
				} else {
					row[i] = float64(r) * 1.5e-3 // invented for the demo: filler numbers of the floor sheet
				}
			}
			if err := sw.SetRow(fmt.Sprintf("A%d", r), row); err != nil {
				return err
			}
		}
		if err := rows.Close(); err != nil {
			return err
		}
	}
	if err := sw.Flush(); err != nil {
		return err
	}
	_, err = f.WriteTo(out)
	return err
}
