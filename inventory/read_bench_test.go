package inventory

import (
	"archive/zip"
	"os"
	"path/filepath"
	"sync"
	"testing"
)

// benchObjects is the size of the survey the reading benchmarks read: the
// 50,000-object survey of issue 17's target.
const benchObjects = 50000

var (
	benchOnce sync.Once
	benchPath string
	benchErr  error
)

// benchSurvey writes the generated survey once per test binary (as
// cmd/gensurvey makes it).
func benchSurvey(b *testing.B) string {
	b.Helper()
	benchOnce.Do(func() {
		dir, err := os.MkdirTemp("", "sparkmargin-bench-")
		if err != nil {
			benchErr = err
			return
		}
		benchPath = filepath.Join(dir, "survey-50k.xlsx")
		f, err := os.Create(benchPath)
		if err != nil {
			benchErr = err
			return
		}
		if benchErr = WriteGeneratedSurvey(f, GenerateOptions{Objects: benchObjects}); benchErr == nil {
			benchErr = f.Close()
		}
	})
	if benchErr != nil {
		b.Fatal(benchErr)
	}
	return benchPath
}

// BenchmarkReadSurvey50k: reading and validating the 50,000-object survey
// with ReadFile (every object kept), as `check` does.
func BenchmarkReadSurvey50k(b *testing.B) {
	path := benchSurvey(b)
	b.ReportAllocs()
	for b.Loop() {
		if _, err := ReadFile(path, ReadOptions{}); err != nil {
			b.Fatal(err)
		}
	}
}

// BenchmarkStreamSurvey50k: reading and validating the 50,000-object survey
// with StreamFile (objects handed over, not kept), as `assess` does.
func BenchmarkStreamSurvey50k(b *testing.B) {
	path := benchSurvey(b)
	b.ReportAllocs()
	for b.Loop() {
		if _, err := StreamFile(path, ReadOptions{}, nil, func(Object) error { return nil }); err != nil {
			b.Fatal(err)
		}
	}
}

// BenchmarkScanSurvey50k: the reader's own part of the work on the
// 50,000-object survey: unpacking and scanning every part once, without
// validating (the rest of BenchmarkStreamSurvey50k is validation).
func BenchmarkScanSurvey50k(b *testing.B) {
	path := benchSurvey(b)
	b.ReportAllocs()
	for b.Loop() {
		zr, err := zip.OpenReader(path)
		if err != nil {
			b.Fatal(err)
		}
		fi, _ := os.Stat(path)
		p, err := openPkg(&zr.Reader, fi.Size(), ReadOptions{}.withDefaults())
		if err != nil {
			b.Fatal(err)
		}
		for _, sh := range p.sheets {
			if _, err := p.scanSheet(sh.Name, sh.Part, func(rawRow) bool { return true }); err != nil {
				b.Fatal(err)
			}
		}
		zr.Close()
	}
}
