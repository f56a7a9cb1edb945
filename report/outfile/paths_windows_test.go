//go:build windows

package outfile

import (
	"os"
	"path/filepath"
	"strings"
	"testing"
)

// TestWindowsOutputNames: drive letters, backslashes and forward slashes in
// the survey's path give the audit beside it, in the system's own spelling.
func TestWindowsOutputNames(t *testing.T) {
	for _, c := range []struct{ survey, audit, sibling string }{
		{`C:\Surveys\line 3.xlsx`, `C:\Surveys\line 3-audit.xlsx`, `C:\Surveys\line 3-whatif.xlsx`},
		{`C:/Surveys/line3.xlsx`, `C:\Surveys\line3-audit.xlsx`, `C:\Surveys\line3-whatif.xlsx`},
		{`D:survey.xlsx`, `D:survey-audit.xlsx`, `D:survey-whatif.xlsx`},
		{`\\server\share\s.xlsx`, `\\server\share\s-audit.xlsx`, `\\server\share\s-whatif.xlsx`},
	} {
		if got := DefaultAuditPath(c.survey); got != c.audit {
			t.Errorf("DefaultAuditPath(%q) = %q, want %q", c.survey, got, c.audit)
		}
		if got := SiblingPath(c.survey, "-whatif.xlsx"); got != c.sibling {
			t.Errorf("SiblingPath(%q) = %q, want %q", c.survey, got, c.sibling)
		}
	}
}

// TestWindowsClashes: one file named with either separator, with "..", or
// rooted without its drive letter is the same file.
func TestWindowsClashes(t *testing.T) {
	dir := t.TempDir()
	survey := filepath.Join(dir, "s.xlsx")
	if err := os.WriteFile(survey, []byte("survey"), 0o644); err != nil {
		t.Fatal(err)
	}
	vol := filepath.VolumeName(survey)
	for _, out := range []string{
		strings.ReplaceAll(survey, `\`, `/`),
		filepath.Join(dir, "sub") + `\..\s.xlsx`,
		strings.TrimPrefix(survey, vol), // \Users\...\s.xlsx on the current drive
		strings.ToUpper(survey),         // names are not case-sensitive
	} {
		if vol == "" {
			break
		}
		err := RefuseClashes([]NamedPath{{Role: "the survey", Path: survey}}, []NamedPath{{Role: "-o", Path: out}})
		if err == nil {
			t.Errorf("-o %s: not refused, but it is the survey %s", out, survey)
		}
	}
}
