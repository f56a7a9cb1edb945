package outfile

import (
	"bytes"
	"errors"
	"fmt"
	"io"
	"math/rand/v2"
	"os"
	"os/exec"
	"path/filepath"
	"strconv"
	"strings"
	"syscall"
	"testing"
	"time"

	"github.com/xuri/excelize/v2"
)

// fullDisk is a writer that takes limit bytes and then fails as a full disk does.
type fullDisk struct {
	w     io.Writer
	limit int
}

func (d *fullDisk) Write(p []byte) (int, error) {
	if len(p) > d.limit {
		n, _ := d.w.Write(p[:d.limit])
		d.limit = 0
		return n, &os.PathError{Op: "write", Path: "audit", Err: syscall.ENOSPC}
	}
	d.limit -= len(p)
	return d.w.Write(p)
}

// workbookBytes returns a small valid workbook whose A1 says label.
func workbookBytes(t testing.TB, label string, rows int) []byte {
	t.Helper()
	f := excelize.NewFile()
	defer f.Close()
	for r := 1; r <= rows; r++ {
		if err := f.SetCellValue("Sheet1", fmt.Sprintf("A%d", r), label); err != nil {
			t.Fatal(err)
		}
		if err := f.SetCellValue("Sheet1", fmt.Sprintf("B%d", r), strings.Repeat("x", 200)+strconv.Itoa(r)); err != nil {
			t.Fatal(err)
		}
	}
	var buf bytes.Buffer
	if _, err := f.WriteTo(&buf); err != nil {
		t.Fatal(err)
	}
	return buf.Bytes()
}

// labelOf opens a workbook and returns its A1, failing when it does not open.
func labelOf(t *testing.T, path string) string {
	t.Helper()
	f, err := excelize.OpenFile(path)
	if err != nil {
		t.Fatalf("%s does not open as a workbook: %v", path, err)
	}
	defer f.Close()
	v, err := f.GetCellValue("Sheet1", "A1")
	if err != nil {
		t.Fatal(err)
	}
	return v
}

func TestWriteAtomicPanicKeepsPrevious(t *testing.T) {
	dir := t.TempDir()
	p := filepath.Join(dir, "audit.xlsx")
	prev := workbookBytes(t, "previous", 3)
	if err := os.WriteFile(p, prev, 0o644); err != nil {
		t.Fatal(err)
	}
	func() {
		defer func() {
			if r := recover(); r == nil {
				t.Fatal("the panic did not reach the caller")
			}
		}()
		_ = WriteAtomic(p, func(w io.Writer) error {
			w.Write(workbookBytes(t, "new", 3)[:500])
			panic("writer failed midway")
		})
	}()
	if got := labelOf(t, p); got != "previous" {
		t.Errorf("target holds %q, want the previous audit", got)
	}
	assertNoTemps(t, dir)
}

func TestWriteAtomicDiskFull(t *testing.T) {
	dir := t.TempDir()
	p := filepath.Join(dir, "audit.xlsx")
	if err := os.WriteFile(p, workbookBytes(t, "previous", 3), 0o644); err != nil {
		t.Fatal(err)
	}
	data := workbookBytes(t, "new", 50)
	for _, limit := range []int{0, 100, len(data) / 2, len(data) - 1} {
		err := writeAtomic(p, func(w io.Writer) io.Writer { return &fullDisk{w: w, limit: limit} },
			func(w io.Writer) error { _, err := w.Write(data); return err })
		want := "disk full while writing " + p + ": no space left on device; the previous file is untouched"
		if err == nil || err.Error() != want || !errors.Is(err, syscall.ENOSPC) {
			t.Errorf("limit %d: error %v, want %q", limit, err, want)
		}
		if got := labelOf(t, p); got != "previous" {
			t.Errorf("limit %d: target holds %q", limit, got)
		}
		assertNoTemps(t, dir)
	}
	// No previous file: the message says nothing was written.
	q := filepath.Join(dir, "new.xlsx")
	err := writeAtomic(q, func(w io.Writer) io.Writer { return &fullDisk{w: w, limit: 10} },
		func(w io.Writer) error { _, err := w.Write(data); return err })
	if err == nil || !strings.HasSuffix(err.Error(), "nothing was written there") {
		t.Errorf("error %v", err)
	}
	if _, err := os.Stat(q); !errors.Is(err, os.ErrNotExist) {
		t.Errorf("a failed first write left %s", q)
	}
}

// TestWriteAtomicReadOnlyFolderAsRoot: chmod does not stop root, so a
// folder no one may create files in is used: /sys (sysfs). Skipped where /sys
// takes new files or is absent.
func TestWriteAtomicReadOnlyFolderAsRoot(t *testing.T) {
	probe, err := os.CreateTemp("/sys", ".sparkmargin-probe-*")
	if err == nil {
		probe.Close()
		os.Remove(probe.Name())
		t.Skip("/sys takes new files here")
	}
	if _, err := os.Stat("/sys"); err != nil {
		t.Skip("no /sys")
	}
	err = WriteAtomic("/sys/audit.xlsx", writeString("x"))
	if err == nil || !strings.Contains(err.Error(), "folder /sys is not writable") {
		t.Fatalf("error = %v, want 'folder /sys is not writable'", err)
	}
}

// killHelperEnv names the target the helper process writes slowly.
const killHelperEnv = "SPARKMARGIN_ATOMIC_KILL_TARGET"

// killHelperHold makes the helper hold its write open until its standard
// input closes (TestConcurrentRunKeepsOtherRunsTemp).
const killHelperHold = "SPARKMARGIN_ATOMIC_KILL_HOLD"

// TestAtomicKillHelper is not a test: run as a child process with
// killHelperEnv set, it writes a workbook slowly to the target through
// WriteAtomic, so that its parent can kill it at any moment.
func TestAtomicKillHelper(t *testing.T) {
	target := os.Getenv(killHelperEnv)
	if target == "" {
		t.Skip("helper process only")
	}
	data := workbookBytes(t, "new", 200)
	// With killHelperHold set, the helper says "writing" only once its
	// temporary file exists and then waits for its standard input to close
	// before it writes the rest: the parent acts while the write is live,
	// however slow the machine (a busy machine once let the whole write finish
	// before the parent looked).
	hold := os.Getenv(killHelperHold) != ""
	if !hold {
		fmt.Println("writing")
	}
	first := true
	err := WriteAtomic(target, func(w io.Writer) error {
		for len(data) > 0 {
			n := min(len(data), 256)
			if _, err := w.Write(data[:n]); err != nil {
				return err
			}
			data = data[n:]
			if first && hold {
				first = false
				fmt.Println("writing")
				_, _ = io.Copy(io.Discard, os.Stdin)
			}
			time.Sleep(2 * time.Millisecond)
		}
		return nil
	})
	if err != nil {
		t.Fatal(err)
	}
}

// TestWriteAtomicKilled kills a process writing an audit at random
// moments (SIGKILL: no deferred clean-up runs): the target is always either
// the previous complete workbook or the new complete one, never half of one;
// the next run's CleanStaleTemps removes what the killed run left.
func TestWriteAtomicKilled(t *testing.T) {
	if testing.Short() {
		t.Skip("-short: starts child processes")
	}
	dir := t.TempDir()
	p := filepath.Join(dir, "audit.xlsx")
	if err := os.WriteFile(p, workbookBytes(t, "previous", 3), 0o644); err != nil {
		t.Fatal(err)
	}
	rng := rand.New(rand.NewPCG(3, 4))
	seen := map[string]int{}
	kills := 8
	if raceEnabled {
		kills = 3
	}
	for i := 0; i < kills; i++ {
		cmd := exec.Command(os.Args[0], "-test.run=^TestAtomicKillHelper$", "-test.count=1")
		cmd.Env = append(os.Environ(), killHelperEnv+"="+p)
		out, err := cmd.StdoutPipe()
		if err != nil {
			t.Fatal(err)
		}
		if err := cmd.Start(); err != nil {
			t.Fatal(err)
		}
		// Wait until it writes, then kill it somewhere in the write (or after).
		buf := make([]byte, 8)
		_, _ = out.Read(buf)
		time.Sleep(time.Duration(rng.IntN(100)) * time.Millisecond)
		_ = cmd.Process.Signal(syscall.SIGKILL)
		_ = cmd.Wait()
		label := labelOf(t, p)
		if label != "previous" && label != "new" {
			t.Fatalf("kill %d: target holds %q", i, label)
		}
		seen[label]++
		if temps, _ := filepath.Glob(filepath.Join(dir, ".audit.xlsx.tmp-*")); len(temps) > 0 {
			seen["temporary file left"]++
		}
		CleanStaleTemps(dir, "audit.xlsx")
		assertNoTemps(t, dir)
		if label == "new" { // start again from a previous audit
			if err := os.WriteFile(p, workbookBytes(t, "previous", 3), 0o644); err != nil {
				t.Fatal(err)
			}
		}
	}
	t.Logf("after the kills the target held: %v", seen)
}

// TestConcurrentRunKeepsOtherRunsTemp: while another process writes the same
// target slowly, this process's stale clean-up and its own write of the
// target leave the other's temporary file alone, and both writes succeed
// (before, each run's clean-up deleted the other live run's file and its
// rename failed with "no such file").
func TestConcurrentRunKeepsOtherRunsTemp(t *testing.T) {
	if testing.Short() {
		t.Skip("-short: starts a child process")
	}
	dir := t.TempDir()
	p := filepath.Join(dir, "audit.xlsx")
	cmd := exec.Command(os.Args[0], "-test.run=^TestAtomicKillHelper$", "-test.count=1")
	cmd.Env = append(os.Environ(), killHelperEnv+"="+p, killHelperHold+"=1")
	out, err := cmd.StdoutPipe()
	if err != nil {
		t.Fatal(err)
	}
	release, err := cmd.StdinPipe()
	if err != nil {
		t.Fatal(err)
	}
	var childErr bytes.Buffer
	cmd.Stderr = &childErr
	if err := cmd.Start(); err != nil {
		t.Fatal(err)
	}
	buf := make([]byte, 8)
	_, _ = out.Read(buf) // the child is writing
	var theirs []string
	for deadline := time.Now().Add(5 * time.Second); len(theirs) == 0 && time.Now().Before(deadline); {
		theirs, _ = filepath.Glob(filepath.Join(dir, ".audit.xlsx.tmp-"+strconv.Itoa(cmd.Process.Pid)+"-*"))
		time.Sleep(time.Millisecond)
	}
	if len(theirs) == 0 {
		t.Fatal("the other process's temporary file never appeared")
	}
	CleanStaleTemps(dir, "audit.xlsx")
	if err := WriteAtomic(p, func(w io.Writer) error { _, err := w.Write(workbookBytes(t, "mine", 3)); return err }); err != nil {
		t.Fatal(err)
	}
	// Had its temporary file been removed, the other process's rename would
	// fail ("no such file"); whichever rename came last, the target is whole.
	_ = release.Close() // the other process writes the rest and renames
	_, _ = io.Copy(io.Discard, out)
	if err := cmd.Wait(); err != nil {
		t.Fatalf("the other process's write failed: %v\n%s", err, childErr.String())
	}
	if l := labelOf(t, p); l != "new" && l != "mine" {
		t.Errorf("target holds %q, want one of the two writes whole", l)
	}
	assertNoTemps(t, dir)
}
