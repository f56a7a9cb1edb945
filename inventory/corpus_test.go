package inventory

import (
	"errors"
	"os"
	"os/exec"
	"path/filepath"
	"runtime"
	"strings"
	"testing"
	"time"
)

// Bounds every corpus input must be read within. Loose on purpose: they catch
// a reader that unpacks a bomb or loops, not a slow machine.
const (
	corpusTimeLimit   = 10 * time.Second // common practice, no source
	corpusAllocLimit  = 512 << 20        // bytes allocated while reading one input; common practice, no source
	corpusHeapGrowMax = 128 << 20        // live heap growth after reading; common practice, no source
)

// TestCorpus reads every corpus input and compares the outcome with its
// hand-written golden: the exit code check gives (2 unreadable, 1 errors,
// 0 otherwise), the unreadable sentence, the rows read/accepted/rejected per
// sheet and every problem with its cell. Every input is read in bounded time
// and memory, without a panic, and no row is lost.
func TestCorpus(t *testing.T) {
	for i, c := range corpusCases() {
		if (raceEnabled || testing.Short()) && !c.transient && i%5 != 0 {
			continue // a sample (and the bombs) under -race and -short; every input in the plain go test
		}
		t.Run(c.name, func(t *testing.T) {
			g, err := readCorpusGolden(filepath.Join(corpusDir(), c.name+".golden"))
			if err != nil {
				t.Fatal(err)
			}
			path := filepath.Join(corpusDir(), c.name+".xlsx")
			if c.transient {
				path = filepath.Join(t.TempDir(), c.name+".xlsx")
				c.write(t, path)
			}
			checkCorpusOutcome(t, path, c.opts, g)
		})
	}
	t.Run("libreoffice-fresh", func(t *testing.T) {
		// The checked-in file is read above; when LibreOffice is here, a fresh
		// save of today's demo must read the same way.
		if testing.Short() || raceEnabled {
			t.Skip("-short or -race: LibreOffice takes seconds to start")
		}
		if _, err := exec.LookPath("soffice"); err != nil {
			t.Skip("soffice not installed")
		}
		g, err := readCorpusGolden(filepath.Join(corpusDir(), "libreoffice-saved.golden"))
		if err != nil {
			t.Fatal(err)
		}
		data, err := DemoSurveyBytes()
		if err != nil {
			t.Fatal(err)
		}
		path := filepath.Join(t.TempDir(), "libreoffice-saved.xlsx")
		writeWithLibreOffice(t, data, path)
		checkCorpusOutcome(t, path, ReadOptions{}, g)
	})
}

// checkCorpusOutcome reads path and compares the outcome with g.
func checkCorpusOutcome(t *testing.T, path string, opts ReadOptions, g *corpusGolden) {
	t.Helper()
	runtime.GC()
	var before, after runtime.MemStats
	runtime.ReadMemStats(&before)
	start := time.Now()
	s, err := ReadFile(path, opts)
	took := time.Since(start)
	runtime.ReadMemStats(&after)
	if took > corpusTimeLimit {
		t.Errorf("reading took %v, over %v", took, corpusTimeLimit)
	}
	if d := after.TotalAlloc - before.TotalAlloc; d > corpusAllocLimit {
		t.Errorf("reading allocated %d MiB, over %d MiB", d>>20, corpusAllocLimit>>20)
	}
	runtime.GC()
	runtime.ReadMemStats(&after)
	if after.HeapAlloc > before.HeapAlloc && after.HeapAlloc-before.HeapAlloc > corpusHeapGrowMax {
		t.Errorf("live heap grew by %d MiB", (after.HeapAlloc-before.HeapAlloc)>>20)
	}
	exit := 0
	switch {
	case err != nil:
		exit = 2
	case len(s.Errors()) > 0:
		exit = 1
	}
	if exit != g.Exit {
		msg := ""
		if err != nil {
			msg = err.Error()
		} else {
			msg = utDump(s)
		}
		t.Fatalf("check would exit %d, golden says %d\n%s", exit, g.Exit, msg)
	}
	if err != nil {
		if !errors.Is(err, ErrUnreadable) {
			t.Errorf("error %v does not wrap ErrUnreadable", err)
		}
		msg := err.Error()
		if !strings.Contains(msg, g.Unreadable) {
			t.Errorf("message %q does not say %q", msg, g.Unreadable)
		}
		if strings.Count(msg, ". ") > 0 || !strings.HasSuffix(msg, ".") || strings.Contains(msg, "\n") {
			t.Errorf("message is not one sentence: %q", msg)
		}
		return
	}
	checkRowsKept(t, s)
	got := map[string][3]int{}
	for _, c := range s.Counts {
		got[c.Sheet] = [3]int{c.Read, c.Accepted, c.Rejected}
		if w, ok := g.Rows[c.Sheet]; !ok {
			t.Errorf("sheet %s: rows %v, golden has no rows line", c.Sheet, got[c.Sheet])
		} else if w != got[c.Sheet] {
			t.Errorf("sheet %s: read/accepted/rejected %v, golden says %v", c.Sheet, got[c.Sheet], w)
		}
	}
	for _, sh := range g.RowOrder {
		if _, ok := got[sh]; !ok {
			t.Errorf("golden counts sheet %s, the reader does not", sh)
		}
	}
	compareProblems(t, s.Problems, g.Problems)
	for _, p := range s.Problems {
		if p.Sheet == "" || p.Message == "" {
			t.Errorf("problem without place or message: %+v", p)
		}
		if len(p.Message) > 400 {
			t.Errorf("message of %d bytes at %s", len(p.Message), p.Cell())
		}
	}
}

// FuzzReadCorpus mutates the corpus files' bytes (every checked-in workbook,
// odd or hostile): the reader never panics and returns either ErrUnreadable
// or a survey whose rows are all accounted for.
func FuzzReadCorpus(f *testing.F) {
	for i, c := range corpusCases() {
		if c.transient || (raceEnabled && i%5 != 0) {
			continue
		}
		data, err := os.ReadFile(filepath.Join(corpusDir(), c.name+".xlsx"))
		if err != nil {
			f.Fatal(err)
		}
		f.Add(data)
	}
	f.Fuzz(func(t *testing.T, b []byte) {
		s, err := Read(b, "fuzz.xlsx", ReadOptions{MaxRows: 1000})
		if err != nil {
			if !errors.Is(err, ErrUnreadable) {
				t.Fatalf("error %v does not wrap ErrUnreadable", err)
			}
			if msg := err.Error(); strings.Contains(msg, "\n") || !strings.HasSuffix(msg, ".") {
				t.Fatalf("message is not one sentence: %q", msg)
			}
			return
		}
		utAccounted(t, s)
		for _, p := range s.Problems {
			if p.Sheet == "" || p.Message == "" {
				t.Fatalf("problem without place or message: %+v", p)
			}
		}
	})
}
