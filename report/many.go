package report

import (
	"archive/zip"
	"bytes"
	"errors"
	"fmt"
	"io"
	"os"
	"path/filepath"
	"sort"
	"strings"

	"github.com/sparkmargin/sparkmargin/report/audit"
	"github.com/sparkmargin/sparkmargin/report/outfile"
)

// AssessMany assesses several surveys (files, or folders of them), each to
// its own audit (outDir and jsonDir, when set, are the folders of the
// workbooks and JSON files; else each workbook goes beside its survey), then
// writes the portfolio (pf; its workbook defaults to portfolio.xlsx in outDir,
// else the current folder, its JSON to portfolio.json in jsonDir). Every
// survey is tried and reported; the error's class is the worst of them.
func (r *Run) AssessMany(surveys []string, outDir, jsonDir string, pf PortfolioFiles) error {
	for _, d := range []struct{ flag, dir string }{{"-o", outDir}, {"--json", jsonDir}} {
		if d.dir == "" {
			continue
		}
		if fi, err := os.Stat(d.dir); err == nil && !fi.IsDir() {
			return unusable(fmt.Errorf("%s %s: with several surveys %s names a folder, and this is a file", d.flag, d.dir, d.flag))
		}
		if err := os.MkdirAll(d.dir, 0o755); err != nil {
			return unusable(fmt.Errorf("%s %s: %w", d.flag, d.dir, err))
		}
	}
	if pf.Workbook == "" {
		pf.Workbook = filepath.Join(cmpOr(outDir, "."), "portfolio.xlsx")
	}
	if pf.JSON == "" && jsonDir != "" {
		pf.JSON = filepath.Join(jsonDir, "portfolio.json")
	}
	out, errOut := r.out(), r.errOut()
	files, worst, err := r.expandSurveys(surveys, pf.Workbook)
	if err != nil {
		return err
	}
	inputs := make([]outfile.NamedPath, len(files))
	for i, f := range files {
		inputs[i] = outfile.NamedPath{Role: "the survey", Path: f}
	}
	if err := outfile.RefuseClashes(inputs, []outfile.NamedPath{{Role: "the portfolio workbook", Path: pf.Workbook}, {Role: "the portfolio JSON", Path: pf.JSON}}); err != nil {
		return unusable(err)
	}
	var p audit.Portfolio
	// The outputs of the surveys before, and the portfolio's.
	written := []outfile.NamedPath{{Role: "the portfolio workbook", Path: pf.Workbook}, {Role: "the portfolio JSON", Path: pf.JSON}}
	failed := 0
	for i, file := range files {
		if i > 0 {
			fmt.Fprintln(out)
		}
		fmt.Fprintf(out, "== %s ==\n", file)
		name := strings.TrimSuffix(filepath.Base(file), filepath.Ext(file))
		o := Outputs{Workbook: outfile.DefaultAuditPath(file)}
		if outDir != "" {
			o.Workbook = filepath.Join(outDir, name+"-audit.xlsx")
		}
		if jsonDir != "" {
			o.JSON = filepath.Join(jsonDir, name+"-audit.json")
		}
		fail := func(err error) {
			fmt.Fprintf(errOut, "sparkmargin: %s: %v\n", file, err)
			p.Failed = append(p.Failed, audit.PortfolioFailure{File: file, Reason: err.Error()})
			worst = max(worst, KindOf(err))
			failed++
		}
		mine := []outfile.NamedPath{{Role: "its audit workbook", Path: o.Workbook}, {Role: "its audit JSON", Path: o.JSON}}
		if err := outfile.RefuseClashes(inputs, mine); err != nil {
			fail(unusable(err))
			continue
		}
		if err := outfile.RefuseClashes(nil, append(append([]outfile.NamedPath(nil), written...), mine...)); err != nil {
			fail(unusable(fmt.Errorf("its outputs would overwrite another output of this run (%w); give the surveys different names", err)))
			continue
		}
		written = append(written, mine...)
		r.begin(fmt.Sprintf("%s (survey %d of %d)", filepath.Base(file), i+1, len(files)))
		a, err := r.AssessFile(file, o)
		if err != nil {
			fail(err)
			continue
		}
		r.printAudit(a, o)
		p.Surveys = append(p.Surveys, audit.PortfolioEntry(a, filepath.Base(file), o.Workbook))
		if err := r.shortfall(a, file); err != nil {
			fmt.Fprintf(errOut, "sparkmargin: %s: %v\n", file, err)
			worst = max(worst, Problems)
			failed++
		}
	}
	fmt.Fprintln(out)
	printRepeatSurveys(out, &p)
	info := audit.RunInfo{ToolVersion: r.ToolVersion, CommandLine: strings.Join(r.CommandLine, " ")}
	if err := r.WritePortfolio(p, info, pf); err != nil {
		return err
	}
	if worst != 0 {
		return &Error{Kind: worst, Err: fmt.Errorf("%d of %d survey(s) not assessed cleanly (see the messages above)", failed, len(files))}
	}
	return nil
}

func cmpOr(a, b string) string {
	if a != "" {
		return a
	}
	return b
}

// expandSurveys lists the surveys named: files as given, folders as every
// *.xlsx in them sorted by name, skipping audits (*-audit.xlsx), hidden and
// temporary files (".name", "~$name") and the portfolio itself. A name that
// does not exist is reported (worst Unusable); none at all is an Unusable error.
func (r *Run) expandSurveys(args []string, portfolio string) ([]string, Failure, error) {
	var files []string
	var worst Failure
	for _, a := range args {
		fi, err := os.Stat(a)
		if err != nil || !fi.IsDir() {
			// A file, or a name that does not exist (reported when read, as with one survey).
			files = append(files, a)
			continue
		}
		entries, err := os.ReadDir(a)
		if err != nil {
			fmt.Fprintf(r.errOut(), "sparkmargin: %s: the folder cannot be read: %v\n", a, err)
			worst = Unusable
			continue
		}
		var found []string
		for _, e := range entries {
			n := e.Name()
			if e.IsDir() || !strings.EqualFold(filepath.Ext(n), ".xlsx") || strings.HasPrefix(n, ".") || strings.HasPrefix(n, "~$") ||
				strings.HasSuffix(strings.ToLower(strings.TrimSuffix(n, filepath.Ext(n))), "-audit") {
				continue
			}
			p := filepath.Join(a, n)
			if outfile.SameTarget(p, portfolio, true, false) && isPortfolioWorkbook(p) {
				// The previous run's portfolio; a survey named as -p is kept and refused below.
				continue
			}
			found = append(found, p)
		}
		sort.Strings(found)
		if len(found) == 0 {
			fmt.Fprintf(r.errOut(), "sparkmargin: %s: no survey (.xlsx) in the folder\n", a)
			worst = Unusable
		}
		files = append(files, found...)
	}
	if len(files) == 0 {
		return nil, worst, unusable(errors.New("no survey to assess"))
	}
	return files, worst, nil
}

// isPortfolioWorkbook reports whether the regular file at path is a
// portfolio workbook this tool wrote (its document title says so); it reads
// at most 64 KiB of the document properties part.
func isPortfolioWorkbook(path string) bool {
	if fi, err := os.Stat(path); err != nil || !fi.Mode().IsRegular() {
		return false
	}
	zr, err := zip.OpenReader(path)
	if err != nil {
		return false
	}
	defer zr.Close()
	for _, f := range zr.File {
		if f.Name != "docProps/core.xml" {
			continue
		}
		rc, err := f.Open()
		if err != nil {
			return false
		}
		defer rc.Close()
		b, _ := io.ReadAll(io.LimitReader(rc, 64<<10))
		return bytes.Contains(b, []byte(audit.PortfolioTitlePrefix))
	}
	return false
}

// printRepeatSurveys names each site assessed more than once: the survey
// ranked (the latest dated) and the earlier ones and drafts kept as its trend.
func printRepeatSurveys(out io.Writer, p *audit.Portfolio) {
	for _, s := range p.Sites() {
		if len(s.Earlier) == 0 {
			continue
		}
		fmt.Fprintf(out, "Repeat surveys of %s: %s ranked; earlier: %s\n", s.Label, s.File, s.TrendText())
	}
}
