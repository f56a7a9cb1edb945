package main

import (
	"os"
	"os/exec"
	"path/filepath"
	"testing"
)

// offlineEnv names the folder the offline helper writes into.
const offlineEnv = "SPARKMARGIN_OFFLINE_DIR"

// TestOfflineHelper is not a test: run as a child process with offlineEnv
// set, it runs demo and check as a user would.
func TestOfflineHelper(t *testing.T) {
	dir := os.Getenv(offlineEnv)
	if dir == "" {
		t.Skip("helper process only")
	}
	if code, _, errOut := runCLI(t, "demo", "-o", dir); code != exitOK {
		t.Fatalf("demo exit %d: %s", code, errOut)
	}
	if code, _, errOut := runCLI(t, "check", filepath.Join(dir, "demo-survey.xlsx")); code != exitOK {
		t.Fatalf("check exit %d: %s", code, errOut)
	}
}

// TestRunsWithoutNetwork runs demo (survey, assessment, audit workbook and
// JSON) and check in a process with no network at all (a new network
// namespace of unshare -n, where even loopback is down): SAFETY.md says the
// tool needs no network. Skipped where unshare -n is not allowed.
func TestRunsWithoutNetwork(t *testing.T) {
	unshare, err := exec.LookPath("unshare")
	if err != nil || exec.Command(unshare, "-n", "true").Run() != nil {
		t.Skip("unshare -n is not available here")
	}
	dir := t.TempDir()
	cmd := exec.Command(unshare, "-n", os.Args[0], "-test.run=^TestOfflineHelper$", "-test.count=1", "-test.v")
	cmd.Env = append(os.Environ(), offlineEnv+"="+dir)
	out, err := cmd.CombinedOutput()
	if err != nil {
		t.Fatalf("offline run failed: %v\n%s", err, out)
	}
	for _, name := range []string{"demo-survey.xlsx", "demo-survey-audit.xlsx", "demo-survey-audit.json"} {
		if _, err := os.Stat(filepath.Join(dir, name)); err != nil {
			t.Errorf("offline demo did not write %s: %v\n%s", name, err, out)
		}
	}
}
