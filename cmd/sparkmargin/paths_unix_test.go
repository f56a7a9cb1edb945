//go:build unix

package main

import (
	"os"
	"path/filepath"
	"strings"
	"syscall"
	"testing"
)

// TestOnlyRegularFilesRead: a named pipe (which would block a read for
// ever), a device, given alone or found in a folder, is refused in one
// sentence with exit 2 without being opened.
func TestOnlyRegularFilesRead(t *testing.T) {
	dir := t.TempDir()
	folder := filepath.Join(dir, "surveys")
	if err := os.Mkdir(folder, 0o755); err != nil {
		t.Fatal(err)
	}
	writeDemo(t, folder)
	fifo := filepath.Join(folder, "pipe.xlsx")
	if err := syscall.Mkfifo(fifo, 0o600); err != nil {
		t.Skipf("no named pipes here: %v", err)
	}
	jsonFifo := filepath.Join(dir, "pipe.json")
	if err := syscall.Mkfifo(jsonFifo, 0o600); err != nil {
		t.Fatal(err)
	}
	tests := []struct {
		name string
		args []string
		want string
	}{
		{"check FIFO", []string{"check", fifo}, "it is a named pipe (FIFO), not a regular file"},
		{"assess FIFO", []string{"assess", fifo, "-o", filepath.Join(dir, "a.xlsx")}, "it is a named pipe (FIFO), not a regular file"},
		{"whatif FIFO", []string{"whatif", fifo, "--rh", "50", "-o", filepath.Join(dir, "w.xlsx")}, "named pipe"},
		{"sweep FIFO", []string{"sweep", fifo}, "named pipe"},
		{"compare FIFO JSON", []string{"compare", jsonFifo, jsonFifo}, "named pipe"},
		{"check device", []string{"check", os.DevNull}, "it is a device, not a regular file"},
		{"folder with a FIFO", []string{"assess", folder, "-o", filepath.Join(dir, "audits")}, "it is a named pipe (FIFO)"},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			code, _, errOut := runCLI(t, tc.args...)
			if code != exitUsage {
				t.Fatalf("exit %d, want %d; stderr %q", code, exitUsage, errOut)
			}
			if !strings.Contains(errOut, tc.want) {
				t.Errorf("stderr %q lacks %q", errOut, tc.want)
			}
		})
	}
	// The folder run still assessed the survey beside the pipe.
	if _, err := os.Stat(filepath.Join(dir, "audits", "survey-audit.xlsx")); err != nil {
		t.Errorf("the folder run did not assess the survey beside the pipe: %v", err)
	}
}
