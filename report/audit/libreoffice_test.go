package audit

import (
	"bytes"
	"encoding/csv"
	"os"
	"os/exec"
	"path/filepath"
	"strings"
	"testing"
	"time"
)

// TestLibreOfficeOpensTheAudit: LibreOffice converts the demo audit (its
// Objects and Findings rows written by the direct row writer) to PDF without
// complaint, and reads the Objects and Findings sheets' cells as we wrote
// them (exported to CSV). It runs where LibreOffice is installed (Debian's
// libreoffice-calc-nogui) and is skipped elsewhere.
func TestLibreOfficeOpensTheAudit(t *testing.T) {
	soffice, err := exec.LookPath("soffice")
	if err != nil {
		t.Skip("LibreOffice (soffice) is not installed: apt-get install libreoffice-calc-nogui to run this test")
	}
	if testing.Short() {
		t.Skip("-short: LibreOffice takes tens of seconds")
	}
	a := demoAudit(t, 0)
	var buf bytes.Buffer
	if err := WriteWorkbook(&buf, a, testInfo()); err != nil {
		t.Fatal(err)
	}
	dir := t.TempDir()
	in := filepath.Join(dir, "audit.xlsx")
	if err := os.WriteFile(in, buf.Bytes(), 0o644); err != nil {
		t.Fatal(err)
	}
	profile := "-env:UserInstallation=file://" + filepath.Join(dir, "profile")
	run := func(args ...string) string {
		cmd := exec.Command(soffice, append([]string{profile, "--headless", "--norestore"}, args...)...)
		cmd.Dir = dir
		done := make(chan struct{})
		var out []byte
		var err error
		go func() { out, err = cmd.CombinedOutput(); close(done) }()
		select {
		case <-done:
		case <-time.After(3 * time.Minute):
			_ = cmd.Process.Kill()
			<-done
			t.Fatalf("LibreOffice did not finish in 3 minutes")
		}
		if err != nil {
			t.Fatalf("LibreOffice %v: %v\n%s", args, err, out)
		}
		return string(out)
	}
	out := run("--convert-to", "pdf", "--outdir", dir, in)
	if fi, err := os.Stat(filepath.Join(dir, "audit.pdf")); err != nil || fi.Size() < 10000 {
		t.Fatalf("LibreOffice made no PDF of the audit (%v):\n%s", err, out)
	}
	if strings.Contains(strings.ToLower(out), "error") {
		t.Errorf("LibreOffice complained converting the audit:\n%s", out)
	}
	// Every sheet to CSV (filter option token 12 = -1: all sheets, one file each).
	csvDir := filepath.Join(dir, "csv")
	run("--convert-to", `csv:Text - txt - csv (StarCalc):44,34,76,1,,0,false,true,false,false,false,-1`, "--outdir", csvDir, in)
	read := func(sheet string) [][]string {
		b, err := os.ReadFile(filepath.Join(csvDir, "audit-"+sheet+".csv"))
		if err != nil {
			t.Fatalf("sheet %s: %v", sheet, err)
		}
		r := csv.NewReader(bytes.NewReader(b))
		r.FieldsPerRecord = -1
		recs, err := r.ReadAll()
		if err != nil {
			t.Fatalf("sheet %s: %v", sheet, err)
		}
		return recs
	}
	objs := read(SheetObjects)
	if len(objs) != len(a.Objects)+1 {
		t.Fatalf("LibreOffice reads %d rows on Objects, want %d", len(objs), len(a.Objects)+1)
	}
	for i := range a.Objects {
		o := &a.Objects[i]
		if objs[i+1][0] != o.Object.ID || objs[i+1][4] != o.Verdict.String() {
			t.Errorf("Objects row %d: %q %q, want %q %q", i+2, objs[i+1][0], objs[i+1][4], o.Object.ID, o.Verdict.String())
		}
	}
	fs := read(SheetFindings)
	if len(fs) != len(a.Findings)+1 {
		t.Fatalf("LibreOffice reads %d rows on Findings, want %d", len(fs), len(a.Findings)+1)
	}
	for i := range a.Findings {
		if got, want := fs[i+1][5], a.Findings[i].Message; got != want {
			t.Errorf("Findings row %d: message %q, want %q", i+2, got, want)
		}
	}
}
