package outfile

import (
	"fmt"
	"os"
	"path/filepath"
	"runtime"
	"strings"
)

// kernelPath returns the absolute path the kernel reaches when it creates or
// renames a file at p: the longest existing leading folder of p resolved
// with filepath.EvalSymlinks (symlinks, then "..", component by component,
// as the kernel walks them), joined with the rest of p. The last component
// is not followed: a rename replaces a symlink there, it does not write
// through it (file identity, below, catches a symlink to an input).
//
// p is split at its last separator without cleaning it first: cleaning
// "B/l/../s.xlsx" lexically gives "B/s.xlsx", which is not where the kernel
// goes when B/l is a symlink to another folder.
func kernelPath(p string) string {
	abs, err := absolute(p)
	if err != nil {
		return filepath.Clean(p)
	}
	i := lastSeparator(abs)
	dir, base := abs[:i+1], abs[i+1:]
	var rest []string
	for {
		if r, err := filepath.EvalSymlinks(dir); err == nil {
			parts := append([]string{r}, rest...)
			return filepath.Join(append(parts, base)...)
		}
		// The folder does not exist (the write will fail there anyway): step
		// up and keep the missing part as written.
		trimmed := strings.TrimRightFunc(dir, func(r rune) bool { return r < 0x80 && os.IsPathSeparator(uint8(r)) })
		j := lastSeparator(trimmed)
		if j < 0 || trimmed == filepath.VolumeName(trimmed) {
			return filepath.Clean(abs)
		}
		rest = append([]string{trimmed[j+1:]}, rest...)
		dir = trimmed[:j+1]
	}
}

// absolute makes p absolute as the system will when it opens it. On Windows
// that is filepath.Abs: the system itself removes "." and ".." by name
// before it walks the path, and a path rooted without a drive letter
// (\Surveys\a.xlsx) or with a drive and no root (D:a.xlsx) is resolved
// against the current drive or that drive's folder. Elsewhere the current
// folder is joined without cleaning (see kernelPath).
func absolute(p string) (string, error) {
	if runtime.GOOS == "windows" {
		return filepath.Abs(p)
	}
	if filepath.IsAbs(p) {
		return p, nil
	}
	wd, err := os.Getwd()
	if err != nil {
		return "", err
	}
	return wd + string(filepath.Separator) + p, nil
}

// lastSeparator is the index of the last path separator of p (on Windows
// both \ and /), -1 when there is none.
func lastSeparator(p string) int {
	for i := len(p) - 1; i >= 0; i-- {
		if os.IsPathSeparator(p[i]) {
			return i
		}
	}
	return -1
}

// inputPath returns the file a read of p opens: p with every symlink
// resolved (reading follows a symlink in the last component too).
func inputPath(p string) string {
	if r, err := filepath.EvalSymlinks(p); err == nil {
		if a, err := filepath.Abs(r); err == nil {
			return a
		}
	}
	return kernelPath(p)
}

// SameTarget reports whether paths a and b reach the same file: the same
// resolved path, or (for files that exist) the same file by identity, which
// catches hard links and a symlink in the last component.
func SameTarget(a, b string, aIsInput, bIsInput bool) bool {
	ra, rb := kernelPath(a), kernelPath(b)
	if aIsInput {
		ra = inputPath(a)
	}
	if bIsInput {
		rb = inputPath(b)
	}
	if ra == rb {
		return true
	}
	fa, errA := os.Stat(a)
	fb, errB := os.Stat(b)
	return errA == nil && errB == nil && os.SameFile(fa, fb)
}

// NamedPath is one input or output of a run, with how the user named it.
type NamedPath struct {
	Role string // "the survey", "-o", "--json", ...
	Path string
}

// RefuseClashes refuses a run whose outputs reach one of its inputs, or
// reach each other, after resolving symlinks and ".." as the kernel will and
// comparing file identities (hard links). Empty paths are skipped.
func RefuseClashes(inputs, outputs []NamedPath) error {
	for i, o := range outputs {
		if o.Path == "" {
			continue
		}
		if IsStdout(o.Path) {
			for _, o2 := range outputs[:i] {
				if IsStdout(o2.Path) {
					return fmt.Errorf("%s and %s both name standard output (-); only one output can go there", o2.Role, o.Role)
				}
			}
			continue
		}
		for _, in := range inputs {
			if in.Path != "" && SameTarget(o.Path, in.Path, false, true) {
				return fmt.Errorf("refusing to write %s %s: it is %s itself (%s, the file %s); choose another output name",
					o.Role, o.Path, in.Role, in.Path, inputPath(in.Path))
			}
		}
		for _, o2 := range outputs[:i] {
			if o2.Path != "" && SameTarget(o.Path, o2.Path, false, false) {
				return fmt.Errorf("%s %s and %s %s name the same file (%s); give each output its own name",
					o2.Role, o2.Path, o.Role, o.Path, kernelPath(o.Path))
			}
		}
	}
	return nil
}

// ShownPath is an output path as the terminal names it: "standard output"
// for "-".
func ShownPath(p string) string {
	if IsStdout(p) {
		return "standard output"
	}
	return p
}

// DefaultAuditPath is "<dir>/<name>-audit.xlsx" beside the survey.
func DefaultAuditPath(survey string) string {
	dir, base := filepath.Split(survey)
	name := strings.TrimSuffix(base, filepath.Ext(base))
	return filepath.Join(dir, name+"-audit.xlsx")
}

// SiblingPath is "<dir>/<name><suffix>" beside the survey.
func SiblingPath(survey, suffix string) string {
	dir, base := filepath.Split(survey)
	return filepath.Join(dir, strings.TrimSuffix(base, filepath.Ext(base))+suffix)
}
