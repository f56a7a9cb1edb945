package outfile

import (
	"crypto/sha256"
	"encoding/hex"
	"errors"
	"fmt"
	"io"
	"os"
	"path/filepath"
	"strconv"
	"strings"
	"sync"
	"testing"
	"time"
)

// TestWorkspaceFolder: the run's private folder is named with the process id,
// made on first use, the same on later calls, and gone after Close, with
// whatever the run put in it.
func TestWorkspaceFolder(t *testing.T) {
	root := t.TempDir()
	ws := NewWorkspace(root)
	dir, err := ws.Dir()
	if err != nil {
		t.Fatal(err)
	}
	if want := runPrefix + strconv.Itoa(os.Getpid()) + "-"; !strings.HasPrefix(filepath.Base(dir), want) || filepath.Dir(dir) != root {
		t.Errorf("folder %s, want %s/%s*", dir, root, want)
	}
	if again, _ := ws.Dir(); again != dir {
		t.Errorf("second Dir %s, want %s", again, dir)
	}
	if err := os.WriteFile(filepath.Join(dir, "scratch"), []byte("x"), 0o600); err != nil {
		t.Fatal(err)
	}
	if err := ws.Close(); err != nil {
		t.Fatal(err)
	}
	if ents, _ := os.ReadDir(root); len(ents) != 0 {
		t.Errorf("left in the temporary folder: %v", ents)
	}
}

// TestCleanStaleRuns: a new run removes the folders of runs whose process is
// gone and whose lock nobody holds, and keeps a live run's (its process
// alive, or its lock held), this process's own, another program's, and an
// earlier version's scratch files younger than a day.
func TestCleanStaleRuns(t *testing.T) {
	root := t.TempDir()
	dead := strconv.Itoa(deadPID(t))
	mk := func(name string, lock bool) string {
		p := filepath.Join(root, name)
		if err := os.Mkdir(p, 0o700); err != nil {
			t.Fatal(err)
		}
		if lock {
			if err := os.WriteFile(filepath.Join(p, lockName), nil, 0o600); err != nil {
				t.Fatal(err)
			}
		}
		return p
	}
	gone := mk(runPrefix+dead+"-1", true)
	goneNoLock := mk(runPrefix+dead+"-2", false)
	liveParent := mk(runPrefix+strconv.Itoa(os.Getppid())+"-3", true)
	heldLock := mk(runPrefix+dead+"-4", true) // a live run the pid cannot show (another pid namespace)
	h, err := os.Open(filepath.Join(heldLock, lockName))
	if err != nil {
		t.Fatal(err)
	}
	defer h.Close()
	lockFile(h)
	other := mk("someone-else-"+dead, false)
	oldLegacy := mk("sparkmargin-read-123", false)
	freshLegacy := filepath.Join(root, "sparkmargin-objects-9.json")
	if err := os.WriteFile(freshLegacy, nil, 0o600); err != nil {
		t.Fatal(err)
	}
	day := time.Now().Add(-25 * time.Hour)
	if err := os.Chtimes(oldLegacy, day, day); err != nil {
		t.Fatal(err)
	}
	mine := NewWorkspace(root)
	myDir, err := mine.Dir()
	if err != nil {
		t.Fatal(err)
	}
	defer mine.Close()

	NewWorkspace(root) // a second run in this process
	for _, c := range []struct {
		p    string
		kept bool
	}{{gone, false}, {goneNoLock, false}, {liveParent, true}, {heldLock, true}, {other, true}, {oldLegacy, false}, {freshLegacy, true}, {myDir, true}} {
		_, err := os.Stat(c.p)
		if kept := err == nil; kept != c.kept {
			t.Errorf("%s: kept %v, want %v", filepath.Base(c.p), kept, c.kept)
		}
	}
}

// TestCommitTogether: two prepared outputs are renamed into place by one
// Commit; the JSON may record the workbook's SHA-256 from Pending; after
// Abort nothing prepared is renamed, the temporary files are gone and the
// previous files are kept.
func TestCommitTogether(t *testing.T) {
	dir := t.TempDir()
	ws := NewWorkspace(t.TempDir())
	book, doc := filepath.Join(dir, "a.xlsx"), filepath.Join(dir, "a.json")
	pb, err := ws.Prepare(book, writeString("book"))
	if err != nil {
		t.Fatal(err)
	}
	sum := sha256.Sum256([]byte("book"))
	if pb.SHA256() != hex.EncodeToString(sum[:]) {
		t.Errorf("SHA256 %s, want %x", pb.SHA256(), sum)
	}
	pd, err := ws.Prepare(doc, writeString("doc of "+pb.SHA256()))
	if err != nil {
		t.Fatal(err)
	}
	if _, err := os.Stat(book); !os.IsNotExist(err) {
		t.Fatal("the workbook is in place before Commit")
	}
	if err := ws.Commit(pb, nil, pd); err != nil {
		t.Fatal(err)
	}
	for p, want := range map[string]string{book: "book", doc: "doc of " + pb.SHA256()} {
		if b, _ := os.ReadFile(p); string(b) != want {
			t.Errorf("%s holds %q, want %q", p, b, want)
		}
	}

	pb, err = ws.Prepare(book, writeString("new book"))
	if err != nil {
		t.Fatal(err)
	}
	pd, err = ws.Prepare(doc, writeString("new doc"))
	if err != nil {
		t.Fatal(err)
	}
	if written := ws.Abort(); len(written) != 2 {
		t.Errorf("Abort reports %v written, want the two of the first Commit", written)
	}
	if err := ws.Commit(pb, pd); !errors.Is(err, errAborted) {
		t.Errorf("Commit after Abort: %v, want errAborted", err)
	}
	if b, _ := os.ReadFile(book); string(b) != "book" {
		t.Errorf("after Abort the workbook holds %q, want the previous", b)
	}
	assertNoTemps(t, dir)
	if _, err := ws.Prepare(book, writeString("x")); !errors.Is(err, errAborted) {
		t.Errorf("Prepare after Abort: %v, want errAborted", err)
	}
}

// TestAbortWaitsForCommit: an interrupt during a Commit waits until every
// output of it is renamed: the pair is replaced together or not at all.
func TestAbortWaitsForCommit(t *testing.T) {
	for i := range 50 {
		dir := t.TempDir()
		ws := NewWorkspace(t.TempDir())
		var ps []*Pending
		for _, n := range []string{"a.xlsx", "a.json"} {
			p := filepath.Join(dir, n)
			if err := os.WriteFile(p, []byte("old"), 0o644); err != nil {
				t.Fatal(err)
			}
			pp, err := ws.Prepare(p, writeString("new"))
			if err != nil {
				t.Fatal(err)
			}
			ps = append(ps, pp)
		}
		var wg sync.WaitGroup
		wg.Add(1)
		go func() { defer wg.Done(); _ = ws.Commit(ps...) }()
		if i%2 == 0 {
			time.Sleep(time.Duration(i) * time.Microsecond)
		}
		ws.Abort()
		wg.Wait()
		a, _ := os.ReadFile(filepath.Join(dir, "a.xlsx"))
		b, _ := os.ReadFile(filepath.Join(dir, "a.json"))
		if string(a) != string(b) {
			t.Fatalf("try %d: workbook %q beside JSON %q", i, a, b)
		}
		assertNoTemps(t, dir)
	}
}

// TestConcurrentWritesSameTarget: runs writing the same output at once do not
// remove each other's temporary file: every write succeeds and the target
// holds one of them whole.
func TestConcurrentWritesSameTarget(t *testing.T) {
	dir := t.TempDir()
	p := filepath.Join(dir, "audit.xlsx")
	var wg sync.WaitGroup
	errs := make(chan error, 8)
	for i := range 8 {
		wg.Add(1)
		go func() {
			defer wg.Done()
			ws := NewWorkspace(t.TempDir())
			defer ws.Close()
			body := strings.Repeat(fmt.Sprint(i), 1<<16)
			errs <- ws.WriteFile(p, func(w io.Writer) error {
				for k := 0; k < len(body); k += 4096 {
					if _, err := io.WriteString(w, body[k:k+4096]); err != nil {
						return err
					}
					time.Sleep(50 * time.Microsecond)
				}
				return nil
			})
		}()
	}
	wg.Wait()
	close(errs)
	for err := range errs {
		if err != nil {
			t.Error(err)
		}
	}
	b, _ := os.ReadFile(p)
	if len(b) != 1<<16 || strings.Count(string(b), string(b[:1])) != len(b) {
		t.Errorf("target holds %d bytes, not one write whole", len(b))
	}
	assertNoTemps(t, dir)
}
