package main

import (
	"crypto/sha256"
	"encoding/hex"
	"encoding/json"
	"os"
	"os/exec"
	"path/filepath"
	"strconv"
	"strings"
	"testing"

	"github.com/xuri/excelize/v2"
)

// TestAssessOutputFaults: a target that is a folder, a target whose parent is
// a file, a folder no one may write in and a missing folder each give one
// clear error and exit 2, and leave no temporary file. (A full disk is
// simulated in report/outfile's TestWriteAtomicDiskFull: it cannot be made here
// without mounting a small file system.)
func TestAssessOutputFaults(t *testing.T) {
	dir := t.TempDir()
	survey := writeDemo(t, dir)
	plain := filepath.Join(dir, "plain.txt")
	if err := os.WriteFile(plain, []byte("x"), 0o644); err != nil {
		t.Fatal(err)
	}
	folder := filepath.Join(dir, "audits")
	if err := os.Mkdir(folder, 0o755); err != nil {
		t.Fatal(err)
	}
	tests := []struct {
		name string
		args []string
		want string // part of the one error line
	}{
		{"workbook target is a folder", []string{"-o", folder}, "the target is a folder"},
		{"JSON target is a folder", []string{"-o", filepath.Join(dir, "a.xlsx"), "--json", folder}, "the target is a folder"},
		{"parent is a file", []string{"-o", filepath.Join(plain, "audit.xlsx")}, "is not a folder"},
		{"missing folder", []string{"-o", filepath.Join(dir, "nowhere", "audit.xlsx")}, "no such file or directory"},
	}
	if probe, err := os.CreateTemp("/sys", ".probe-*"); err != nil {
		if _, serr := os.Stat("/sys"); serr == nil {
			tests = append(tests, struct {
				name string
				args []string
				want string
			}{"read-only folder", []string{"-o", "/sys/audit.xlsx"}, "folder /sys is not writable"})
		}
	} else {
		probe.Close()
		os.Remove(probe.Name())
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			code, _, errOut := runCLI(t, append([]string{"assess", survey}, tc.args...)...)
			if code != exitUsage {
				t.Fatalf("exit %d, want %d; stderr %q", code, exitUsage, errOut)
			}
			if !strings.Contains(errOut, tc.want) || strings.Count(strings.TrimSpace(errOut), "\n") > 0 {
				t.Errorf("stderr %q: want one line saying %q", errOut, tc.want)
			}
			for _, d := range []string{dir, folder} {
				if temps, _ := filepath.Glob(filepath.Join(d, ".*.tmp-*")); len(temps) > 0 {
					t.Errorf("temporary files left: %v", temps)
				}
			}
		})
	}
}

// TestAssessCleansStaleTemps: temporary files a killed run left beside the
// audit (its process gone) are removed by the next run, those of a live run
// are kept, and the previous audit is replaced whole.
func TestAssessCleansStaleTemps(t *testing.T) {
	dir := t.TempDir()
	survey := writeDemo(t, dir)
	audit := filepath.Join(dir, "audit.xlsx")
	dead := strconv.Itoa(deadPID(t))
	stale := []string{filepath.Join(dir, ".audit.xlsx.tmp-"+dead+"-123456"), filepath.Join(dir, ".audit.json.tmp-"+dead+"-9")}
	for _, p := range stale {
		if err := os.WriteFile(p, []byte("half an audit"), 0o600); err != nil {
			t.Fatal(err)
		}
	}
	// A live run's (this process's parent, which outlives the test).
	live := filepath.Join(dir, ".audit.xlsx.tmp-"+strconv.Itoa(os.Getppid())+"-77")
	if err := os.WriteFile(live, []byte("another run is writing this"), 0o600); err != nil {
		t.Fatal(err)
	}
	if err := os.WriteFile(audit, []byte("previous"), 0o644); err != nil {
		t.Fatal(err)
	}
	// --force: "previous" stands in for an audit without being one.
	if code, _, errOut := runCLI(t, "assess", survey, "-o", audit, "--json", filepath.Join(dir, "audit.json"), "--force"); code != exitOK {
		t.Fatalf("exit %d: %s", code, errOut)
	}
	for _, p := range stale {
		if _, err := os.Stat(p); !os.IsNotExist(err) {
			t.Errorf("stale %s not removed", p)
		}
	}
	if _, err := os.Stat(live); err != nil {
		t.Errorf("a live run's temporary file was removed: %v", err)
	}
	f, err := excelize.OpenFile(audit)
	if err != nil {
		t.Fatalf("the new audit does not open: %v", err)
	}
	f.Close()
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

// TestJSONRecordsItsWorkbook: in a folder run every audit JSON and the
// portfolio JSON record the workbook written with them, by file name and
// SHA-256, so that a reader can tell a JSON beside a workbook of another run.
func TestJSONRecordsItsWorkbook(t *testing.T) {
	dir := t.TempDir()
	surveys := filepath.Join(dir, "surveys")
	if err := os.Mkdir(surveys, 0o755); err != nil {
		t.Fatal(err)
	}
	writeDemo(t, surveys)
	out := filepath.Join(dir, "out")
	if code, _, errOut := runCLI(t, "assess", surveys, "-o", out, "--json", out); code != exitOK {
		t.Fatalf("exit %d: %s", code, errOut)
	}
	for doc, book := range map[string]string{"survey-audit.json": "survey-audit.xlsx", "portfolio.json": "portfolio.xlsx"} {
		b, err := os.ReadFile(filepath.Join(out, doc))
		if err != nil {
			t.Fatal(err)
		}
		var rec struct {
			Workbook struct{ File, SHA256 string } `json:"workbook"`
		}
		if err := json.Unmarshal(b, &rec); err != nil {
			t.Fatal(err)
		}
		wb, err := os.ReadFile(filepath.Join(out, book))
		if err != nil {
			t.Fatal(err)
		}
		sum := sha256.Sum256(wb)
		if rec.Workbook.File != book || rec.Workbook.SHA256 != hex.EncodeToString(sum[:]) {
			t.Errorf("%s records %+v, want %s with SHA-256 %x", doc, rec.Workbook, book, sum)
		}
	}
}
