package audit

import (
	"archive/zip"
	"bytes"
	"errors"
	"io"
	"os"
	"path/filepath"
	"testing"
)

// withoutPart copies the zip package b without the part named drop.
func withoutPart(t *testing.T, b []byte, drop string) []byte {
	t.Helper()
	zr, err := zip.NewReader(bytes.NewReader(b), int64(len(b)))
	if err != nil {
		t.Fatal(err)
	}
	var out bytes.Buffer
	zw := zip.NewWriter(&out)
	for _, f := range zr.File {
		if f.Name == drop {
			continue
		}
		rc, _ := f.Open()
		data, _ := io.ReadAll(rc)
		rc.Close()
		w, _ := zw.Create(f.Name)
		_, _ = w.Write(data)
	}
	if err := zw.Close(); err != nil {
		t.Fatal(err)
	}
	return out.Bytes()
}

// TestReadPreviousAudit: an audit is known by its mark; an audit of an
// earlier version (no mark, the tool as its creator) is still read, flagged
// Legacy; another workbook with a Findings sheet is not an audit.
func TestReadPreviousAudit(t *testing.T) {
	dir := t.TempDir()
	b := testWorkbook(t)
	write := func(name string, data []byte) string {
		p := filepath.Join(dir, name)
		if err := os.WriteFile(p, data, 0o644); err != nil {
			t.Fatal(err)
		}
		return p
	}
	p, err := ReadPreviousAudit(write("marked.xlsx", b), dir)
	if err != nil || p.Legacy || len(p.rows) != len(testAudit().Findings) {
		t.Fatalf("marked audit: %+v, %v; want %d findings read", p, err, len(testAudit().Findings))
	}
	p, err = ReadPreviousAudit(write("legacy.xlsx", withoutPart(t, b, "docProps/custom.xml")), dir)
	if err != nil || !p.Legacy || len(p.rows) != len(testAudit().Findings) {
		t.Fatalf("audit without the mark: %+v, %v; want read as an earlier version's audit", p, err)
	}
	// The same without the creator property either: not an audit.
	if _, err := ReadPreviousAudit(write("foreign.xlsx", withoutPart(t, withoutPart(t, b, "docProps/custom.xml"), "docProps/core.xml")), dir); !errors.Is(err, ErrNotAnAudit) {
		t.Fatalf("workbook with neither mark nor creator: %v, want ErrNotAnAudit", err)
	}
}
