package outfile

import (
	"errors"
	"fmt"
	"io"
	"os"
	"path/filepath"
	"strconv"
	"strings"
	"sync"
	"time"
)

// errAborted: the run was interrupted and its workspace cleaned up.
var errAborted = errors.New("the run was interrupted")

// Workspace owns every temporary file of one run: a private folder in the
// system's temporary folder for the reader's and writers' scratch files
// (Dir), and the temporary files beside the outputs (Prepare, Commit).
// Close removes them all on every way out of the run; Abort does the same
// from a signal handler, waiting for renames in progress so that the
// outputs of one Commit are replaced together or not at all.
//
// The private folder is named "sparkmargin-run-<pid>-<random>" and holds a
// lock file that the run keeps locked while it lives; NewWorkspace removes
// the folders of runs whose process is gone and whose lock nobody holds,
// and never a live run's.
type Workspace struct {
	root string

	mu        sync.Mutex
	dir       string   // "" until Dir makes it
	lock      *os.File // the locked file in dir
	pending   map[string]*Pending
	committed []string // outputs renamed into place, in order
	aborted   bool
	stdout    io.Writer // where an output named Stdout ("-") goes; nil refuses it
}

// SetStdout names where outputs given as "-" (Stdout) are written at Commit.
func (w *Workspace) SetStdout(out io.Writer) {
	w.mu.Lock()
	defer w.mu.Unlock()
	w.stdout = out
}

// runPrefix begins the name of every run's private folder.
const runPrefix = "sparkmargin-run-"

// lockName is the file in a run's folder that the run keeps locked.
const lockName = ".lock"

// legacyScratch are the name prefixes of the scratch files and folders that
// earlier versions of the tool made straight in the system's temporary
// folder; they are removed when unlocked and a day old (legacyRunAge).
var legacyScratch = []string{"sparkmargin-read-", "sparkmargin-write-", "sparkmargin-objects-", "sparkmargin-audit-"}

// legacyRunAge: a scratch file of an earlier version untouched this long
// belongs to no live run (a survey of a full sheet is read in minutes).
const legacyRunAge = 24 * time.Hour

// NewWorkspace returns the workspace of a run whose private folder will be
// made in root ("" for os.TempDir()) when first needed, and removes what
// runs that are gone left in root.
func NewWorkspace(root string) *Workspace {
	if root == "" {
		root = os.TempDir()
	}
	CleanStaleRuns(root)
	return &Workspace{root: root, pending: map[string]*Pending{}}
}

// Dir returns the run's private folder, making it on first use.
func (w *Workspace) Dir() (string, error) {
	w.mu.Lock()
	defer w.mu.Unlock()
	if w.aborted {
		return "", errAborted
	}
	if w.dir != "" {
		return w.dir, nil
	}
	dir, err := os.MkdirTemp(w.root, runPrefix+strconv.Itoa(os.Getpid())+"-*")
	if err != nil {
		return "", fmt.Errorf("making the run's temporary folder in %s: %w", w.root, err)
	}
	lock, err := os.OpenFile(filepath.Join(dir, lockName), os.O_CREATE|os.O_RDWR|os.O_EXCL, 0o600)
	if err != nil {
		_ = os.RemoveAll(dir)
		return "", fmt.Errorf("making the run's temporary folder in %s: %w", w.root, err)
	}
	lockFile(lock)
	w.dir, w.lock = dir, lock
	return dir, nil
}

// Prepare writes the output path whole into a temporary file beside it,
// which Close and Abort remove unless Commit renamed it into place first.
func (w *Workspace) Prepare(path string, write func(io.Writer) error) (*Pending, error) {
	return prepare(w, path, nil, write)
}

// Commit renames the prepared outputs into place in order, one right after
// the other; nil entries are skipped. An interrupt waits until all are renamed.
func (w *Workspace) Commit(ps ...*Pending) error { return commit(w, ps) }

// Discard removes prepared outputs that are not to be committed.
func (w *Workspace) Discard(ps ...*Pending) {
	for _, p := range ps {
		if p != nil {
			p.discard()
		}
	}
}

// WriteFile prepares and commits one output.
func (w *Workspace) WriteFile(path string, write func(io.Writer) error) error {
	p, err := w.Prepare(path, write)
	if err != nil {
		return err
	}
	return w.Commit(p)
}

// register creates a temporary file beside an output with create and keeps
// its name for Close and Abort.
func (w *Workspace) register(create func() (*os.File, error)) (*os.File, error) {
	w.mu.Lock()
	defer w.mu.Unlock()
	if w.aborted {
		return nil, errAborted
	}
	f, err := create()
	if err != nil {
		return nil, err
	}
	w.pending[f.Name()] = &Pending{tmp: f.Name(), f: f}
	return f, nil
}

// Close removes the run's private folder and every temporary file beside an
// output not renamed into place. It may be called more than once.
func (w *Workspace) Close() error {
	w.mu.Lock()
	defer w.mu.Unlock()
	return w.cleanLocked()
}

// Abort is Close for a signal handler: it waits for a Commit in progress,
// removes everything, refuses any later use, and returns the outputs that
// were renamed into place before it (the rest keep their previous files).
func (w *Workspace) Abort() (committed []string) {
	w.mu.Lock()
	defer w.mu.Unlock()
	w.aborted = true
	_ = w.cleanLocked()
	return append([]string(nil), w.committed...)
}

func (w *Workspace) cleanLocked() error {
	for name, p := range w.pending {
		if p.f != nil {
			_ = p.f.Close()
		}
		_ = os.Remove(name)
		delete(w.pending, name)
	}
	if w.dir == "" {
		return nil
	}
	var err error
	// A writer may still add a file while the folder is being removed: try again.
	for range 3 {
		if err = os.RemoveAll(w.dir); err == nil {
			break
		}
	}
	if w.lock != nil {
		_ = w.lock.Close()
		w.lock = nil
	}
	if err != nil {
		return fmt.Errorf("removing the run's temporary folder %s: %w", w.dir, err)
	}
	w.dir = ""
	return nil
}

// CleanStaleRuns removes from root the private folders of runs whose
// process is gone and whose lock nobody holds, and the scratch files and
// folders of earlier versions of the tool (unlocked and a day old). A live
// run's folder is never removed. Errors are ignored.
func CleanStaleRuns(root string) {
	ents, err := os.ReadDir(root)
	if err != nil {
		return
	}
	for _, e := range ents {
		name := e.Name()
		p := filepath.Join(root, name)
		switch {
		case strings.HasPrefix(name, runPrefix) && e.IsDir():
			if fi, err := os.Lstat(p); err != nil || !fi.IsDir() || !ownedByMe(fi) {
				continue
			}
			if staleRun(p, strings.TrimPrefix(name, runPrefix)) {
				_ = os.RemoveAll(p)
			}
		case hasAnyPrefix(name, legacyScratch):
			fi, err := os.Lstat(p)
			if err != nil || !(fi.IsDir() || fi.Mode().IsRegular()) || !ownedByMe(fi) || time.Since(fi.ModTime()) < legacyRunAge {
				continue
			}
			if fi.Mode().IsRegular() && lockHeld(p) {
				continue
			}
			_ = os.RemoveAll(p)
		}
	}
}

// staleRun decides whether the run folder at p (name tail "<pid>-<random>")
// belongs to a run that is gone: its process does not exist and its lock
// file is not held (a folder whose lock file is not made yet counts as live
// while its process is).
func staleRun(p, tail string) bool {
	pidText, _, ok := strings.Cut(tail, "-")
	pid, err := strconv.Atoi(pidText)
	if !ok || err != nil || pid <= 0 || pid == os.Getpid() || processAlive(pid) {
		return false
	}
	lock := filepath.Join(p, lockName)
	if _, err := os.Lstat(lock); err != nil {
		return true // the process is gone and never locked it
	}
	return !lockHeld(lock)
}

func hasAnyPrefix(s string, prefixes []string) bool {
	for _, p := range prefixes {
		if strings.HasPrefix(s, p) {
			return true
		}
	}
	return false
}
