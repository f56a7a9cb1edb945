package main

import (
	"bytes"
	"errors"
	"os"
	"os/exec"
	"path/filepath"
	"runtime"
	"strings"
	"syscall"
	"testing"
	"time"
)

// buildTools builds sparkmargin and gensurvey into a temporary folder, as a
// user runs them (no race detector, whatever the test binary has).
func buildTools(t *testing.T) (sparkmargin, gensurvey string) {
	t.Helper()
	goTool, err := exec.LookPath("go")
	if err != nil {
		goTool = filepath.Join(runtime.GOROOT(), "bin", "go")
		if _, err := os.Stat(goTool); err != nil {
			t.Skip("no go tool to build the binaries with")
		}
	}
	bin := t.TempDir()
	sparkmargin, gensurvey = filepath.Join(bin, "sparkmargin"), filepath.Join(bin, "gensurvey")
	for _, b := range []struct{ out, pkg string }{{sparkmargin, "."}, {gensurvey, "../gensurvey"}} {
		c := exec.Command(goTool, "build", "-o", b.out, b.pkg)
		if out, err := c.CombinedOutput(); err != nil {
			t.Fatalf("go build %s: %v\n%s", b.pkg, err, out)
		}
	}
	return sparkmargin, gensurvey
}

// waitForRunFolder waits until the run's private folder appears in tmp.
func waitForRunFolder(t *testing.T, tmp string, deadline time.Time) string {
	t.Helper()
	for time.Now().Before(deadline) {
		if m, _ := filepath.Glob(filepath.Join(tmp, "sparkmargin-run-*")); len(m) > 0 {
			return m[0]
		}
		time.Sleep(5 * time.Millisecond)
	}
	t.Fatal("the run's temporary folder never appeared")
	return ""
}

// TestInterruptedAssess builds the binary, generates a large survey with
// gensurvey, starts assess on it with a previous audit in place, and stops it
// with SIGINT (then SIGTERM) while it runs: the run exits 130 saying the
// previous audit is kept, its temporary folder is gone, no temporary file is
// left beside the outputs, and the previous audit and JSON are as they were.
// A run killed with SIGKILL leaves its folder, which the next run removes.
func TestInterruptedAssess(t *testing.T) {
	if testing.Short() {
		t.Skip("-short: builds the binaries and runs them")
	}
	if runtime.GOOS == "windows" {
		t.Skip("signals are Unix's")
	}
	sm, gs := buildTools(t)
	work, tmp := t.TempDir(), t.TempDir()
	survey := filepath.Join(work, "big.xlsx")
	// About 2 s of assessing on two cores: long enough to be stopped in.
	n := "30000"
	if raceEnabled {
		n = "15000"
	}
	if out, err := exec.Command(gs, "-n", n, "-o", survey).CombinedOutput(); err != nil {
		t.Fatalf("gensurvey: %v\n%s", err, out)
	}
	audit, doc := filepath.Join(work, "big-audit.xlsx"), filepath.Join(work, "big-audit.json")
	previous := map[string][]byte{audit: []byte("the previous audit workbook"), doc: []byte(`{"previous": "audit JSON"}`)}
	for p, b := range previous {
		if err := os.WriteFile(p, b, 0o644); err != nil {
			t.Fatal(err)
		}
	}
	env := append(os.Environ(), "TMPDIR="+tmp)
	start := func() (*exec.Cmd, *bytes.Buffer) {
		var errOut bytes.Buffer
		// --force: the "previous audit" here is a stand-in, not an audit.
		c := exec.Command(sm, "assess", survey, "-o", audit, "--json", doc, "--force")
		c.Env, c.Stderr = env, &errOut
		if err := c.Start(); err != nil {
			t.Fatal(err)
		}
		return c, &errOut
	}
	for _, tc := range []struct {
		name  string
		sig   syscall.Signal
		delay time.Duration // after the run's folder appears
	}{
		{"SIGINT while reading", syscall.SIGINT, 200 * time.Millisecond},
		{"SIGTERM while assessing", syscall.SIGTERM, 900 * time.Millisecond},
	} {
		t.Run(tc.name, func(t *testing.T) {
			began := time.Now()
			c, errOut := start()
			waitForRunFolder(t, tmp, time.Now().Add(10*time.Second))
			time.Sleep(tc.delay)
			if err := c.Process.Signal(tc.sig); err != nil {
				t.Fatal(err)
			}
			err := c.Wait()
			var ee *exec.ExitError
			if !errors.As(err, &ee) || ee.ExitCode() != exitInterrupted {
				t.Fatalf("exit %v after %v, want %d (the run ended before the signal?); stderr %q", err, time.Since(began), exitInterrupted, errOut)
			}
			if !strings.Contains(errOut.String(), "the previous audit, if any, is kept as it was") {
				t.Errorf("stderr %q does not say the previous audit is kept", errOut)
			}
			if ents, _ := os.ReadDir(tmp); len(ents) > 0 {
				t.Errorf("left in the temporary folder: %v", ents)
			}
			if m, _ := filepath.Glob(filepath.Join(work, ".*.tmp-*")); len(m) > 0 {
				t.Errorf("temporary files left beside the outputs: %v", m)
			}
			for p, want := range previous {
				if got, _ := os.ReadFile(p); !bytes.Equal(got, want) {
					t.Errorf("%s changed: %q", filepath.Base(p), got)
				}
			}
		})
	}
	t.Run("SIGKILL, then the next run cleans up", func(t *testing.T) {
		c, _ := start()
		dir := waitForRunFolder(t, tmp, time.Now().Add(10*time.Second))
		time.Sleep(200 * time.Millisecond)
		_ = c.Process.Signal(syscall.SIGKILL)
		_ = c.Wait()
		if _, err := os.Stat(dir); err != nil {
			t.Skipf("the killed run left nothing to clean (%v)", err)
		}
		next := exec.Command(sm, "library")
		next.Env = env
		if out, err := next.CombinedOutput(); err != nil {
			t.Fatalf("library: %v\n%s", err, out)
		}
		if _, err := os.Stat(dir); !os.IsNotExist(err) {
			t.Errorf("the next run left the killed run's folder %s (%v)", dir, err)
		}
	})
}
