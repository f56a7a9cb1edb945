package outfile

import (
	"crypto/sha256"
	"encoding/hex"
	"errors"
	"fmt"
	"hash"
	"io"
	"io/fs"
	"os"
	"path/filepath"
	"strconv"
	"strings"
	"syscall"
	"time"
)

// An output is written in two steps: Prepare writes it whole into a
// temporary file beside the target, named ".<target>.tmp-<pid>-<random>"
// and locked by the writing process while it lives; Commit renames one or
// more prepared files into place one right after the other. The previous
// file stays untouched until its rename. A run killed before the rename
// leaves at most its temporary file, which the next run writing the same
// target removes (CleanStaleTemps): only when the process named in it is
// gone and nothing holds its lock, so two runs writing the same target at
// once never delete each other's file.

// tempPrefix is the start of the names of the temporary files of target base.
func tempPrefix(base string) string { return "." + base + ".tmp-" }

// Pending is an output written whole into its temporary file beside the
// target and not yet renamed into place (Prepare, Commit, Discard).
type Pending struct {
	path, tmp string
	f         *os.File // open while pending: it holds the lock
	sum       string
	ws        *Workspace
	stdout    io.Writer // path is Stdout: commit copies the file there instead of renaming it
}

// Stdout is the output name that means standard output: a JSON path given as
// "-" is written whole into the run's private folder first and copied to the
// workspace's standard output at Commit, in its turn with the other outputs.
const Stdout = "-"

// IsStdout reports whether an output path names standard output.
func IsStdout(path string) bool { return path == Stdout }

// Path returns the target the pending output will replace.
func (p *Pending) Path() string { return p.path }

// SHA256 returns the hex SHA-256 of the bytes written.
func (p *Pending) SHA256() string { return p.sum }

// WriteAtomic writes a file through write into a temporary file in the
// target's folder, syncs and closes it, then renames it over path. The previous
// file, if any, is untouched until the rename; on any error (or a panic in
// write) the temporary file is removed and the previous file stays as it was.
// A target that is a folder is refused; a full disk is said in plain words.
// A run killed before the rename leaves at most a temporary file, which the
// next write of the same target removes once the killed process is gone.
func WriteAtomic(path string, write func(io.Writer) error) error {
	return writeAtomic(path, nil, write)
}

// writeAtomic is WriteAtomic with an optional wrapper of the
// temporary file's writer (tests use it to simulate a full disk).
func writeAtomic(path string, wrap func(io.Writer) io.Writer, write func(io.Writer) error) error {
	p, err := prepare(nil, path, wrap, write)
	if err != nil {
		return err
	}
	return commit(nil, []*Pending{p})
}

// prepare writes path's temporary file, registered with ws when ws is not nil.
func prepare(ws *Workspace, path string, wrap func(io.Writer) io.Writer, write func(io.Writer) error) (_ *Pending, err error) {
	if path == "" {
		return nil, errors.New("write output: empty file name")
	}
	if IsStdout(path) {
		return prepareStdout(ws, wrap, write)
	}
	if fi, statErr := os.Stat(path); statErr == nil && fi.IsDir() {
		return nil, fmt.Errorf("write %s: the target is a folder, give a file name", path)
	}
	dir, base := filepath.Dir(path), filepath.Base(path)
	if fi, statErr := os.Stat(dir); statErr != nil {
		return nil, fmt.Errorf("write %s: folder %s: %w", path, dir, statErr)
	} else if !fi.IsDir() {
		return nil, fmt.Errorf("write %s: %s is not a folder", path, dir)
	}
	CleanStaleTemps(dir, base)
	create := func() (*os.File, error) {
		return os.CreateTemp(dir, tempPrefix(base)+strconv.Itoa(os.Getpid())+"-*")
	}
	var tmp *os.File
	if ws != nil {
		tmp, err = ws.register(create)
	} else {
		tmp, err = create()
	}
	if err != nil {
		switch {
		case errors.Is(err, errAborted):
			return nil, err
		case errors.Is(err, fs.ErrPermission), errors.Is(err, syscall.EROFS):
			return nil, fmt.Errorf("write %s: folder %s is not writable: %w", path, dir, err)
		case errors.Is(err, syscall.ENOSPC):
			return nil, fmt.Errorf("disk full while writing %s: %w; %s", path, syscall.ENOSPC, untouched(path))
		}
		return nil, fmt.Errorf("write %s: create temporary file: %w", path, err)
	}
	lockFile(tmp)
	p := &Pending{path: path, tmp: tmp.Name(), f: tmp, ws: ws}
	done := false
	defer func() {
		if !done { // an error or a panic in write: the previous file stays
			p.discard()
		}
	}()
	h := sha256.New()
	var w io.Writer = io.MultiWriter(tmp, h)
	if wrap != nil {
		w = wrap(w)
	}
	diskFull := func() error {
		return fmt.Errorf("disk full while writing %s: %w; %s", path, syscall.ENOSPC, untouched(path))
	}
	if err = write(w); err != nil {
		if errors.Is(err, syscall.ENOSPC) {
			return nil, diskFull()
		}
		return nil, fmt.Errorf("write %s: %w", path, err)
	}
	if err = tmp.Sync(); err != nil {
		if errors.Is(err, syscall.ENOSPC) {
			return nil, diskFull()
		}
		return nil, fmt.Errorf("write %s: sync: %w", path, err)
	}
	// CreateTemp makes the file 0600; an audit is a document for others to read.
	_ = tmp.Chmod(0o644)
	p.sum = hexSum(h)
	done = true
	return p, nil
}

// prepareStdout writes an output meant for standard output whole into the
// run's private folder, so that a failure half-way prints nothing.
func prepareStdout(ws *Workspace, wrap func(io.Writer) io.Writer, write func(io.Writer) error) (_ *Pending, err error) {
	if ws == nil || ws.stdout == nil {
		return nil, errors.New("write to standard output: no standard output for this run")
	}
	dir, err := ws.Dir()
	if err != nil {
		return nil, err
	}
	tmp, err := ws.register(func() (*os.File, error) { return os.CreateTemp(dir, "stdout-*") })
	if err != nil {
		return nil, fmt.Errorf("write to standard output: create temporary file: %w", err)
	}
	p := &Pending{path: Stdout, tmp: tmp.Name(), f: tmp, ws: ws, stdout: ws.stdout}
	h := sha256.New()
	var w io.Writer = io.MultiWriter(tmp, h)
	if wrap != nil {
		w = wrap(w)
	}
	if err := write(w); err != nil {
		p.discard()
		return nil, fmt.Errorf("write to standard output: %w", err)
	}
	p.sum = hexSum(h)
	return p, nil
}

func hexSum(h hash.Hash) string { return hex.EncodeToString(h.Sum(nil)) }

// commit renames every pending file into place, in order, one right after
// the other (under ws's lock, so that an interrupt waits for the renames
// rather than falling between them). After a failed rename the files not yet
// renamed are removed and their previous files stay.
func commit(ws *Workspace, ps []*Pending) error {
	if ws != nil {
		ws.mu.Lock()
		defer ws.mu.Unlock()
		if ws.aborted {
			for _, p := range ps {
				if p != nil {
					p.discardLocked()
				}
			}
			return errAborted
		}
	}
	var err error
	for _, p := range ps {
		if p == nil {
			continue
		}
		if err != nil {
			p.discardLocked()
			continue
		}
		err = p.rename()
		if err == nil && ws != nil {
			ws.committed = append(ws.committed, p.path)
		}
	}
	return err
}

// rename closes the temporary file (keeping its lock to the last moment
// where the system allows renaming an open file) and renames it into place.
func (p *Pending) rename() error {
	if p.stdout != nil {
		return p.copyOut()
	}
	if !renameOpenFile {
		_ = p.f.Close()
	}
	if err := os.Rename(p.tmp, p.path); err != nil {
		p.discardLocked()
		hint := ""
		if targetInUse(err) {
			hint = inUseHint
		}
		return fmt.Errorf("write %s: rename into place: %w%s", p.path, err, hint)
	}
	if p.ws != nil {
		delete(p.ws.pending, p.tmp)
	}
	if renameOpenFile {
		if err := p.f.Close(); err != nil {
			return fmt.Errorf("write %s: close: %w", p.path, err)
		}
	}
	return nil
}

// copyOut copies an output meant for standard output there and removes its
// temporary file.
func (p *Pending) copyOut() error {
	defer p.discardLocked()
	if _, err := p.f.Seek(0, io.SeekStart); err != nil {
		return fmt.Errorf("write to standard output: %w", err)
	}
	if _, err := io.Copy(p.stdout, p.f); err != nil {
		return fmt.Errorf("write to standard output: %w", err)
	}
	return nil
}

// discard removes the temporary file, taking ws's lock.
func (p *Pending) discard() {
	if p.ws != nil {
		p.ws.mu.Lock()
		defer p.ws.mu.Unlock()
	}
	p.discardLocked()
}

// discardLocked removes the temporary file; ws's lock is held (or there is no ws).
func (p *Pending) discardLocked() {
	_ = p.f.Close()
	_ = os.Remove(p.tmp)
	if p.ws != nil {
		delete(p.ws.pending, p.tmp)
	}
}

// untouched says what became of the target after a failed write.
func untouched(path string) string {
	if _, err := os.Stat(path); err == nil {
		return "the previous file is untouched"
	}
	return "nothing was written there"
}

// legacyTempAge is how old a temporary file of an earlier version of the
// tool (named without the process id) must be before it counts as stale:
// those runs held their temporary file for seconds.
const legacyTempAge = time.Hour

// CleanStaleTemps removes the temporary files that runs killed before their
// rename left in dir for the target name base: a file named with a process
// id is removed when that process is gone and no process holds its lock; a
// file of an earlier version (no process id in the name) when it is unlocked
// and untouched for an hour. A live run's file is never removed. Errors are
// ignored: a leftover that cannot be removed does no harm.
func CleanStaleTemps(dir, base string) {
	if dir == "" {
		dir = "."
	}
	ents, err := os.ReadDir(dir)
	if err != nil {
		return
	}
	prefix := tempPrefix(base)
	for _, e := range ents {
		name := e.Name()
		if !strings.HasPrefix(name, prefix) || !e.Type().IsRegular() {
			continue
		}
		p := filepath.Join(dir, name)
		if staleFile(p, strings.TrimPrefix(name, prefix), legacyTempAge) {
			_ = os.Remove(p)
		}
	}
}

// staleFile decides whether the temporary file (or folder) at p, whose name
// ends in tail ("<pid>-<random>", or an earlier version's "<random>"), was
// left by a run that is gone.
func staleFile(p, tail string, legacyAge time.Duration) bool {
	pidText, _, named := strings.Cut(tail, "-")
	if named {
		pid, err := strconv.Atoi(pidText)
		if err != nil || pid <= 0 {
			named = false
		} else if pid == os.Getpid() || processAlive(pid) {
			return false
		}
	}
	if !named {
		fi, err := os.Lstat(p)
		if err != nil || time.Since(fi.ModTime()) < legacyAge {
			return false
		}
	}
	return !lockHeld(p)
}

// WritePair writes a workbook (when xlsx is set) and a JSON (when jsonPath
// is set) of one run, each whole into a temporary file of the workspace
// first, then renames both into place together.
func (w *Workspace) WritePair(xlsx, jsonPath string, book, doc func(io.Writer) error) error {
	var pw, pj *Pending
	var err error
	if xlsx != "" {
		if pw, err = w.Prepare(xlsx, book); err != nil {
			return fmt.Errorf("writing the workbook: %w", err)
		}
	}
	if jsonPath != "" {
		if pj, err = w.Prepare(jsonPath, doc); err != nil {
			w.Discard(pw)
			return fmt.Errorf("writing the JSON: %w", err)
		}
	}
	if err := w.Commit(pw, pj); err != nil {
		return fmt.Errorf("writing the outputs: %w", err)
	}
	return nil
}
