package outfile

import (
	"os"
	"path/filepath"
	"runtime"
	"testing"
)

// TestKernelPath: the lexical clean of B/l/../s.xlsx is B/s.xlsx, but the
// kernel follows B/l first (B/l is a symlink to S/sub) and reaches S/s.xlsx.
func TestKernelPath(t *testing.T) {
	if runtime.GOOS == "windows" {
		t.Skip("symlinks need privileges on Windows")
	}
	dir := t.TempDir()
	s := filepath.Join(dir, "S")
	for _, d := range []string{s, filepath.Join(s, "sub"), filepath.Join(s, "x"), filepath.Join(dir, "B")} {
		if err := os.MkdirAll(d, 0o755); err != nil {
			t.Fatal(err)
		}
	}
	survey := filepath.Join(s, "s.xlsx")
	if err := os.WriteFile(survey, []byte("survey"), 0o644); err != nil {
		t.Fatal(err)
	}
	if err := os.Symlink(filepath.Join(s, "sub"), filepath.Join(dir, "B", "l")); err != nil {
		t.Fatal(err)
	}
	viaDotDot := filepath.Join(dir, "B", "l") + "/../s.xlsx"
	twice := s + "/./x/../s.xlsx"
	real, err := filepath.EvalSymlinks(survey)
	if err != nil {
		t.Fatal(err)
	}
	if lexical := filepath.Clean(viaDotDot); lexical == real {
		t.Fatalf("the trick is no trick: %s cleans to the survey", viaDotDot)
	}
	for _, p := range []string{viaDotDot, twice} {
		if got := kernelPath(p); got != real {
			t.Errorf("kernelPath(%s) = %s, want %s", p, got, real)
		}
	}
	// A missing folder keeps the missing part as written.
	missing := filepath.Join(dir, "B", "l", "nowhere", "a.xlsx")
	if got, want := kernelPath(missing), filepath.Join(filepath.Dir(real), "sub", "nowhere", "a.xlsx"); got != want {
		t.Errorf("kernelPath(%s) = %s, want %s", missing, got, want)
	}
}
