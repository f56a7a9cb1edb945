//go:build unix

package inventory

import (
	"errors"
	"path/filepath"
	"strings"
	"syscall"
	"testing"
	"time"
)

// TestReadFileRefusesNamedPipe: the reader itself refuses a named pipe before
// opening it (opening one would wait for a writer for ever), whoever calls it.
func TestReadFileRefusesNamedPipe(t *testing.T) {
	p := filepath.Join(t.TempDir(), "survey.xlsx")
	if err := syscall.Mkfifo(p, 0o600); err != nil {
		t.Skipf("mkfifo: %v", err)
	}
	done := make(chan error, 1)
	go func() { _, err := ReadFile(p, ReadOptions{}); done <- err }()
	select {
	case err := <-done:
		if !errors.Is(err, ErrUnreadable) || !strings.Contains(err.Error(), "named pipe") {
			t.Fatalf("ReadFile on a FIFO: %v, want an unreadable error naming the pipe", err)
		}
	case <-time.After(10 * time.Second):
		t.Fatal("ReadFile on a FIFO did not return: it opened the pipe")
	}
}
