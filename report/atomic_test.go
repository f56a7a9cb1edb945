package report

import (
	"errors"
	"io"
	"os"
	"path/filepath"
	"strings"
	"testing"
)

func writeString(s string) func(io.Writer) error {
	return func(w io.Writer) error { _, err := io.WriteString(w, s); return err }
}

func TestWriteFileAtomicReplaces(t *testing.T) {
	dir := t.TempDir()
	p := filepath.Join(dir, "audit.xlsx")
	if err := os.WriteFile(p, []byte("old"), 0o644); err != nil {
		t.Fatal(err)
	}
	if err := WriteFileAtomic(p, writeString("new")); err != nil {
		t.Fatalf("WriteFileAtomic: %v", err)
	}
	if b, _ := os.ReadFile(p); string(b) != "new" {
		t.Errorf("content = %q, want new", b)
	}
	assertNoTemps(t, dir)
}

func TestWriteFileAtomicFailureKeepsPrevious(t *testing.T) {
	dir := t.TempDir()
	p := filepath.Join(dir, "audit.json")
	if err := os.WriteFile(p, []byte("previous"), 0o644); err != nil {
		t.Fatal(err)
	}
	boom := errors.New("boom")
	err := WriteFileAtomic(p, func(w io.Writer) error {
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

func TestWriteFileAtomicRefusesFolder(t *testing.T) {
	dir := t.TempDir()
	err := WriteFileAtomic(dir, writeString("x"))
	if err == nil || !strings.Contains(err.Error(), "folder") {
		t.Fatalf("error = %v, want a clear 'is a folder' error", err)
	}
}

func TestWriteFileAtomicParentNotAFolder(t *testing.T) {
	dir := t.TempDir()
	file := filepath.Join(dir, "plain")
	if err := os.WriteFile(file, []byte("x"), 0o644); err != nil {
		t.Fatal(err)
	}
	err := WriteFileAtomic(filepath.Join(file, "audit.xlsx"), writeString("x"))
	if err == nil || !strings.Contains(err.Error(), "not a folder") {
		t.Fatalf("error = %v, want 'not a folder'", err)
	}
}

func TestWriteFileAtomicReadOnlyFolder(t *testing.T) {
	if os.Geteuid() == 0 {
		t.Skip("root can write into a read-only folder; covered by TestWriteFileAtomicParentNotAFolder")
	}
	dir := t.TempDir()
	if err := os.Chmod(dir, 0o555); err != nil {
		t.Fatal(err)
	}
	t.Cleanup(func() { _ = os.Chmod(dir, 0o755) })
	err := WriteFileAtomic(filepath.Join(dir, "audit.xlsx"), writeString("x"))
	if err == nil || !strings.Contains(err.Error(), "not writable") {
		t.Fatalf("error = %v, want 'not writable'", err)
	}
}

func TestCleanStaleTemps(t *testing.T) {
	dir := t.TempDir()
	for _, n := range []string{".audit.xlsx.tmp-123", ".audit.xlsx.tmp-abc", "audit.xlsx", ".other.tmp-1"} {
		if err := os.WriteFile(filepath.Join(dir, n), nil, 0o644); err != nil {
			t.Fatal(err)
		}
	}
	CleanStaleTemps(dir, "audit.xlsx")
	var left []string
	ents, _ := os.ReadDir(dir)
	for _, e := range ents {
		left = append(left, e.Name())
	}
	if strings.Join(left, ",") != ".other.tmp-1,audit.xlsx" {
		t.Errorf("left %v, want .other.tmp-1 and audit.xlsx", left)
	}
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
