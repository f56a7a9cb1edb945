package report

import (
	"errors"
	"fmt"
	"io"
	"io/fs"
	"os"
	"path/filepath"
	"strings"
	"syscall"
)

// tempPattern returns the os.CreateTemp pattern of the temporary files of base.
func tempPattern(base string) string { return "." + base + ".tmp-*" }

// WriteFileAtomic writes a file through write into a temporary file in the
// target's folder, syncs and closes it, then renames it over path. The previous
// file, if any, is untouched until the rename; on any error (or a panic in
// write) the temporary file is removed and the previous file stays as it was.
// A target that is a folder is refused; a full disk is said in plain words.
// A run killed before the rename leaves at most a temporary file, which
// CleanStaleTemps removes on the next run.
func WriteFileAtomic(path string, write func(io.Writer) error) error {
	return writeFileAtomic(path, nil, write)
}

// writeFileAtomic is WriteFileAtomic with an optional wrapper of the
// temporary file's writer (tests use it to simulate a full disk).
func writeFileAtomic(path string, wrap func(io.Writer) io.Writer, write func(io.Writer) error) (err error) {
	if path == "" {
		return errors.New("write output: empty file name")
	}
	if fi, statErr := os.Stat(path); statErr == nil && fi.IsDir() {
		return fmt.Errorf("write %s: the target is a folder, give a file name", path)
	}
	dir, base := filepath.Dir(path), filepath.Base(path)
	if fi, statErr := os.Stat(dir); statErr != nil {
		return fmt.Errorf("write %s: folder %s: %w", path, dir, statErr)
	} else if !fi.IsDir() {
		return fmt.Errorf("write %s: %s is not a folder", path, dir)
	}
	tmp, err := os.CreateTemp(dir, tempPattern(base))
	if err != nil {
		switch {
		case errors.Is(err, fs.ErrPermission), errors.Is(err, syscall.EROFS):
			return fmt.Errorf("write %s: folder %s is not writable: %w", path, dir, err)
		case errors.Is(err, syscall.ENOSPC):
			return fmt.Errorf("disk full while writing %s: %w; %s", path, syscall.ENOSPC, untouched(path))
		}
		return fmt.Errorf("write %s: create temporary file: %w", path, err)
	}
	tmpName := tmp.Name()
	done := false
	defer func() {
		if !done { // an error or a panic in write: the previous file stays
			_ = tmp.Close()
			_ = os.Remove(tmpName)
		}
	}()
	var w io.Writer = tmp
	if wrap != nil {
		w = wrap(tmp)
	}
	diskFull := func() error {
		return fmt.Errorf("disk full while writing %s: %w; %s", path, syscall.ENOSPC, untouched(path))
	}
	if err = write(w); err != nil {
		if errors.Is(err, syscall.ENOSPC) {
			return diskFull()
		}
		return fmt.Errorf("write %s: %w", path, err)
	}
	if err = tmp.Sync(); err != nil {
		if errors.Is(err, syscall.ENOSPC) {
			return diskFull()
		}
		return fmt.Errorf("write %s: sync: %w", path, err)
	}
	if err = tmp.Close(); err != nil {
		if errors.Is(err, syscall.ENOSPC) {
			return diskFull()
		}
		return fmt.Errorf("write %s: close: %w", path, err)
	}
	// CreateTemp makes the file 0600; an audit is a document for others to read.
	_ = os.Chmod(tmpName, 0o644)
	if err = os.Rename(tmpName, path); err != nil {
		return fmt.Errorf("write %s: rename into place: %w", path, err)
	}
	done = true
	return nil
}

// untouched says what became of the target after a failed write.
func untouched(path string) string {
	if _, err := os.Stat(path); err == nil {
		return "the previous file is untouched"
	}
	return "nothing was written there"
}

// CleanStaleTemps removes temporary files that WriteFileAtomic left in dir for
// the target name base when a run was killed before its rename. Errors are
// ignored: a leftover that cannot be removed does no harm.
func CleanStaleTemps(dir, base string) {
	if dir == "" {
		dir = "."
	}
	matches, err := filepath.Glob(filepath.Join(dir, globEscape(tempPattern(base))))
	if err != nil {
		return
	}
	for _, m := range matches {
		if fi, err := os.Lstat(m); err == nil && fi.Mode().IsRegular() {
			_ = os.Remove(m)
		}
	}
}

// globEscape escapes the glob metacharacters of a pattern except its final '*'.
func globEscape(pattern string) string {
	head := strings.TrimSuffix(pattern, "*")
	var b strings.Builder
	for _, r := range head {
		if strings.ContainsRune(`*?[\`, r) {
			b.WriteByte('\\')
		}
		b.WriteRune(r)
	}
	return b.String() + "*"
}
