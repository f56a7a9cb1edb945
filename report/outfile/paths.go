package outfile

import (
	"fmt"
	"os"
	"path/filepath"
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
	abs := p
	if !filepath.IsAbs(abs) {
		wd, err := os.Getwd()
		if err != nil {
			return filepath.Clean(p)
		}
		abs = wd + string(filepath.Separator) + p
	}
	i := strings.LastIndexByte(abs, filepath.Separator)
	dir, base := abs[:i+1], abs[i+1:]
	var rest []string
	for {
		if r, err := filepath.EvalSymlinks(dir); err == nil {
			parts := append([]string{r}, rest...)
			return filepath.Join(append(parts, base)...)
		}
		// The folder does not exist (the write will fail there anyway): step
		// up and keep the missing part as written.
		trimmed := strings.TrimRight(dir, string(filepath.Separator))
		j := strings.LastIndexByte(trimmed, filepath.Separator)
		if j < 0 {
			return filepath.Clean(abs)
		}
		rest = append([]string{trimmed[j+1:]}, rest...)
		dir = trimmed[:j+1]
	}
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
