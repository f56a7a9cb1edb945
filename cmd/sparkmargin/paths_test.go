package main

import (
	"bytes"
	"os"
	"path/filepath"
	"runtime"
	"strings"
	"testing"
)

// pathTricks builds, in a fresh folder, a survey S/s.xlsx and the ways of
// naming it (or an output of the same run) that a lexical comparison misses.
type pathTricks struct {
	dir, survey string
	viaDotDot   string // B/l/../s.xlsx where B/l is a symlink to S/sub: the kernel reaches S/s.xlsx
	symlink     string // link.xlsx -> S/s.xlsx
	hardlink    string // hard.xlsx, a second name of S/s.xlsx
	twice       string // S/./x/../s.xlsx: the same path spelled another way
	data        []byte
}

func newPathTricks(t *testing.T) pathTricks {
	t.Helper()
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
	survey := writeDemo(t, s)
	if err := os.Rename(survey, filepath.Join(s, "s.xlsx")); err != nil {
		t.Fatal(err)
	}
	survey = filepath.Join(s, "s.xlsx")
	if err := os.Symlink(filepath.Join(s, "sub"), filepath.Join(dir, "B", "l")); err != nil {
		t.Fatal(err)
	}
	tr := pathTricks{dir: dir, survey: survey,
		viaDotDot: filepath.Join(dir, "B", "l") + "/../s.xlsx",
		symlink:   filepath.Join(dir, "link.xlsx"),
		hardlink:  filepath.Join(dir, "hard.xlsx"),
		twice:     s + "/./x/../s.xlsx",
	}
	if err := os.Symlink(survey, tr.symlink); err != nil {
		t.Fatal(err)
	}
	if err := os.Link(survey, tr.hardlink); err != nil {
		t.Skipf("no hard links here: %v", err)
	}
	data, err := os.ReadFile(survey)
	if err != nil {
		t.Fatal(err)
	}
	tr.data = data
	return tr
}

// TestOutputReachesInput: every command that writes refuses an output that
// reaches one of its inputs (through a symlinked folder and "..", a symlink
// to the survey, a hard link, or the same path spelled twice) or another
// output of the same run, with exit 2, and leaves the survey as it was.
func TestOutputReachesInput(t *testing.T) {
	tr := newPathTricks(t)
	out := filepath.Join(tr.dir, "out.xlsx")
	type tc struct {
		name string
		args []string
		want string
	}
	var tests []tc
	for _, trick := range []struct{ name, path string }{
		{"symlinked folder and ..", tr.viaDotDot}, {"symlink to the survey", tr.symlink},
		{"hard link", tr.hardlink}, {"same path spelled twice", tr.twice},
	} {
		tests = append(tests,
			tc{"assess -o " + trick.name, []string{"assess", tr.survey, "-o", trick.path}, "it is the survey itself"},
			tc{"assess --json " + trick.name, []string{"assess", tr.survey, "-o", out, "--json", trick.path}, "it is the survey itself"},
			tc{"assess -p " + trick.name, []string{"assess", tr.survey, "-o", out, "-p", trick.path}, "it is the survey itself"},
			tc{"folder -p " + trick.name, []string{"assess", filepath.Dir(tr.survey), "-o", filepath.Join(tr.dir, "audits"), "-p", trick.path}, "it is the survey itself"},
			tc{"whatif -o " + trick.name, []string{"whatif", tr.survey, "--rh", "50", "-o", trick.path}, "it is the survey itself"},
			tc{"sweep --json " + trick.name, []string{"sweep", tr.survey, "--rh", "30:50:10", "--json", trick.path}, "it is the survey itself"},
			tc{"compare -o " + trick.name, []string{"compare", tr.hardlink, tr.survey, "-o", trick.path}, "itself"},
		)
	}
	tests = append(tests,
		tc{"assess --json equal to -o", []string{"assess", tr.survey, "-o", out, "--json", out}, "name the same file"},
		tc{"assess --json equal to -o spelled twice", []string{"assess", tr.survey, "-o", out, "--json", tr.dir + "/S/../out.xlsx"}, "name the same file"},
		tc{"assess -p equal to --json", []string{"assess", tr.survey, "-o", out, "--json", filepath.Join(tr.dir, "a.json"), "-p", filepath.Join(tr.dir, "a.json")}, "name the same file"},
		tc{"whatif --json equal to -o", []string{"whatif", tr.survey, "--rh", "50", "-o", out, "--json", out}, "name the same file"},
		tc{"sweep --json equal to -o", []string{"sweep", tr.survey, "-o", out, "--json", out}, "name the same file"},
		tc{"compare --json equal to -o", []string{"compare", tr.survey, tr.survey, "-o", out, "--json", out}, "name the same file"},
		tc{"folder --json folder equal to -o folder", []string{"assess", filepath.Dir(tr.survey), "-o", filepath.Join(tr.dir, "o"), "--json", filepath.Join(tr.dir, "o"), "-p", filepath.Join(tr.dir, "o", "p.xlsx")}, ""},
	)
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			code, _, errOut := runCLI(t, tc.args...)
			if tc.want == "" { // a folder of audits may hold both kinds: only the survey must survive
				if code == exitOK || code == exitUsage {
					goto survey
				}
				t.Fatalf("exit %d; stderr %q", code, errOut)
			}
			if code != exitUsage {
				t.Fatalf("exit %d, want %d; stderr %q", code, exitUsage, errOut)
			}
			if !strings.Contains(errOut, tc.want) {
				t.Errorf("stderr %q lacks %q", errOut, tc.want)
			}
		survey:
			got, err := os.ReadFile(tr.survey)
			if err != nil || !bytes.Equal(got, tr.data) {
				t.Fatalf("the survey was changed (%v)", err)
			}
		})
	}
}

// TestDemoRefusesAuditOverSurvey: demo's audit name, a symlink to its own
// survey, is refused and the survey kept.
func TestDemoRefusesAuditOverSurvey(t *testing.T) {
	dir := t.TempDir()
	if err := os.Symlink("demo-survey.xlsx", filepath.Join(dir, "demo-survey-audit.xlsx")); err != nil {
		t.Skip(err)
	}
	code, _, errOut := runCLI(t, "demo", "-o", dir)
	if code != exitUsage || !strings.Contains(errOut, "it is the survey itself") {
		t.Fatalf("exit %d; stderr %q", code, errOut)
	}
	if _, err := os.Stat(filepath.Join(dir, "demo-survey.xlsx")); err != nil {
		t.Fatal(err)
	}
}

// TestMultiSurveyAuditReachesAnotherInput: with several surveys, one
// survey's audit that would land on another survey of the same run is
// refused (that survey fails, exit 2) and the other survey is kept.
func TestMultiSurveyAuditReachesAnotherInput(t *testing.T) {
	tr := newPathTricks(t)
	other := filepath.Join(filepath.Dir(tr.survey), "s-audit.xlsx") // s.xlsx's audit name, given as a survey
	if err := os.WriteFile(other, tr.data, 0o644); err != nil {
		t.Fatal(err)
	}
	code, _, errOut := runCLI(t, "assess", tr.survey, other, "-o", filepath.Dir(tr.survey), "-p", filepath.Join(tr.dir, "p.xlsx"))
	if code != exitUsage || !strings.Contains(errOut, "it is the survey itself") {
		t.Fatalf("exit %d; stderr %q", code, errOut)
	}
	for _, p := range []string{tr.survey, other} {
		if got, _ := os.ReadFile(p); !bytes.Equal(got, tr.data) {
			t.Errorf("%s was changed", p)
		}
	}
}
