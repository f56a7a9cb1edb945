package outfile

import (
	"errors"
	"io"
	"os"
	"os/exec"
	"path/filepath"
	"strconv"
	"strings"
	"testing"
	"time"
)

func writeString(s string) func(io.Writer) error {
	return func(w io.Writer) error { _, err := io.WriteString(w, s); return err }
}

func TestWriteAtomicReplaces(t *testing.T) {
	dir := t.TempDir()
	p := filepath.Join(dir, "audit.xlsx")
	if err := os.WriteFile(p, []byte("old"), 0o644); err != nil {
		t.Fatal(err)
	}
	if err := WriteAtomic(p, writeString("new")); err != nil {
		t.Fatalf("WriteAtomic: %v", err)
	}
	if b, _ := os.ReadFile(p); string(b) != "new" {
		t.Errorf("content = %q, want new", b)
	}
	assertNoTemps(t, dir)
}

func TestWriteAtomicFailureKeepsPrevious(t *testing.T) {
	dir := t.TempDir()
	p := filepath.Join(dir, "audit.json")
	if err := os.WriteFile(p, []byte("previous"), 0o644); err != nil {
		t.Fatal(err)
	}
	boom := errors.New("boom")
	err := WriteAtomic(p, func(w io.Writer) error {
		_, _ = io.WriteString(w, "half")
		return boom
	})
	if !errors.Is(err, boom) {
		t.Fatalf("error = %v, want it to wrap boom", err)
	}
	if b, _ := os.ReadFile(p); string(b) != "previous" {
		t.Errorf("content = %q, want previous", b)
	}
	assertNoTemps(t, dir)
}

func TestWriteAtomicRefusesFolder(t *testing.T) {
	dir := t.TempDir()
	err := WriteAtomic(dir, writeString("x"))
	if err == nil || !strings.Contains(err.Error(), "folder") {
		t.Fatalf("error = %v, want a clear 'is a folder' error", err)
	}
}

func TestWriteAtomicParentNotAFolder(t *testing.T) {
	dir := t.TempDir()
	file := filepath.Join(dir, "plain")
	if err := os.WriteFile(file, []byte("x"), 0o644); err != nil {
		t.Fatal(err)
	}
	err := WriteAtomic(filepath.Join(file, "audit.xlsx"), writeString("x"))
	if err == nil || !strings.Contains(err.Error(), "not a folder") {
		t.Fatalf("error = %v, want 'not a folder'", err)
	}
}

func TestWriteAtomicReadOnlyFolder(t *testing.T) {
	if os.Geteuid() == 0 {
		t.Skip("root can write into a read-only folder; covered by TestWriteAtomicParentNotAFolder")
	}
	dir := t.TempDir()
	if err := os.Chmod(dir, 0o555); err != nil {
		t.Fatal(err)
	}
	t.Cleanup(func() { _ = os.Chmod(dir, 0o755) })
	err := WriteAtomic(filepath.Join(dir, "audit.xlsx"), writeString("x"))
	if err == nil || !strings.Contains(err.Error(), "not writable") {
		t.Fatalf("error = %v, want 'not writable'", err)
	}
}

// TestCleanStaleTemps: a temporary file beside a target is removed when the
// process named in it is gone and nobody holds its lock; a live run's (this
// process, the parent process, or a lock held) is kept; an earlier version's
// file (no process id) only when an hour old; other targets' files are left.
func TestCleanStaleTemps(t *testing.T) {
	dir := t.TempDir()
	dead := strconv.Itoa(deadPID(t))
	old := time.Now().Add(-2 * time.Hour)
	files := []struct {
		name    string
		old     bool
		locked  bool
		removed bool
	}{
		{".audit.xlsx.tmp-" + dead + "-123", false, false, true},
		{".audit.xlsx.tmp-" + dead + "-124", false, true, false}, // a lock held: a live run in another pid namespace
		{".audit.xlsx.tmp-" + strconv.Itoa(os.Getpid()) + "-5", false, false, false},
		{".audit.xlsx.tmp-" + strconv.Itoa(os.Getppid()) + "-6", false, false, false},
		{".audit.xlsx.tmp-123", true, false, true},   // an earlier version's, two hours old
		{".audit.xlsx.tmp-abc", true, false, true},   // idem
		{".audit.xlsx.tmp-456", false, false, false}, // an earlier version's, fresh: maybe live
		{"audit.xlsx", false, false, false},
		{".other.tmp-" + dead + "-1", false, false, false},
	}
	for _, f := range files {
		p := filepath.Join(dir, f.name)
		if err := os.WriteFile(p, nil, 0o644); err != nil {
			t.Fatal(err)
		}
		if f.old {
			if err := os.Chtimes(p, old, old); err != nil {
				t.Fatal(err)
			}
		}
		if f.locked {
			h, err := os.Open(p)
			if err != nil {
				t.Fatal(err)
			}
			defer h.Close()
			lockFile(h)
		}
	}
	CleanStaleTemps(dir, "audit.xlsx")
	for _, f := range files {
		_, err := os.Stat(filepath.Join(dir, f.name))
		if gone := os.IsNotExist(err); gone != f.removed {
			t.Errorf("%s: removed %v, want %v", f.name, gone, f.removed)
		}
	}
}

// deadPID returns the id of a process that has ended (a child started and
// waited for; its id is not reused within a test).
func deadPID(t *testing.T) int {
	t.Helper()
	c := exec.Command(os.Args[0], "-test.run=^$")
	if err := c.Run(); err != nil {
		t.Fatal(err)
	}
	return c.Process.Pid
}

func assertNoTemps(t *testing.T, dir string) {
	t.Helper()
	ents, _ := os.ReadDir(dir)
	for _, e := range ents {
		if strings.Contains(e.Name(), ".tmp-") {
			t.Errorf("temporary file %s left behind", e.Name())
		}
	}
}
