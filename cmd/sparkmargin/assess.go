package main

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

	"github.com/spf13/cobra"

	"github.com/sparkmargin/sparkmargin/inventory"
	"github.com/sparkmargin/sparkmargin/model"
	"github.com/sparkmargin/sparkmargin/report"
	"github.com/sparkmargin/sparkmargin/report/assess"
	"github.com/sparkmargin/sparkmargin/report/audit"
)

type assessOptions struct {
	ws            *report.Workspace
	survey        string
	surveys       []string // several surveys or folders (survey is then empty)
	output        string
	json          string
	portfolio     string
	portfolioJSON string
	strict        bool
	samples       int
	seed          uint64
	workers       int
	args          []string // the command line, for the Method sheet
}

func newAssessCmd(ws *report.Workspace) *cobra.Command {
	o := assessOptions{ws: ws}
	c := &cobra.Command{
		Use:   "assess SURVEY.xlsx... | FOLDER",
		Short: "Assess a survey: verdicts, findings, station ranking and the audit workbook",
		Long: "assess reads a line-survey workbook, estimates fields, potentials and discharge energies for every\n" +
			"accepted object, compares them with the atmosphere's MIE and the published limits, and writes an\n" +
			"audit workbook (default: <survey>-audit.xlsx beside the survey) and optionally JSON.\n" +
			"Several surveys, or a folder (every *.xlsx in it, by name, except *-audit.xlsx, hidden and ~$ lock\n" +
			"files), give one audit per survey (-o and --json then name folders) and a portfolio workbook\n" +
			"ranking the sites and stations across them (-p; default portfolio.xlsx in the -o folder, else in\n" +
			"the current folder). Rows stream in and the Objects sheet streams out, so a survey of any size fits.\n" +
			"Exit status: 0 assessed (rejected rows are counted in the summary), 1 nothing could be assessed\n" +
			"(or, with --strict, any row rejected), 2 usage or unreadable input; with several surveys the worst\n" +
			"of them, every survey being tried.",
		Args: cobra.MinimumNArgs(1),
		RunE: func(c *cobra.Command, args []string) error {
			if len(args) == 1 {
				o.survey = args[0]
			} else {
				o.surveys = args
			}
			o.args = commandLine(c, args)
			return runAssess(c.OutOrStdout(), c.ErrOrStderr(), o)
		},
	}
	c.Flags().StringVarP(&o.output, "output", "o", "", "audit workbook to write (default <survey>-audit.xlsx beside the survey); a folder with several surveys")
	c.Flags().StringVar(&o.json, "json", "", "also write the audit as JSON to this file; a folder with several surveys (also gets portfolio.json)")
	c.Flags().StringVarP(&o.portfolio, "portfolio", "p", "", "portfolio workbook ranking sites and stations across the surveys (default portfolio.xlsx in the -o folder, else the current folder; written for one survey only when given)")
	c.Flags().StringVar(&o.portfolioJSON, "portfolio-json", "", "also write the portfolio as JSON to this file")
	c.Flags().BoolVar(&o.strict, "strict", false, "exit 1 when any row was rejected")
	c.Flags().IntVar(&o.samples, "samples", 0, "Monte Carlo samples per object for the probability of each verdict (0: point estimate only)")
	c.Flags().Uint64Var(&o.seed, "seed", assess.DefaultSeed, "Monte Carlo seed, recorded on the Method sheet and in the JSON")
	c.Flags().IntVar(&o.workers, "workers", 0, "Monte Carlo worker goroutines (0: all cores); results do not depend on it")
	return c
}

func runAssess(out, errOut io.Writer, o assessOptions) error {
	if o.samples < 0 || o.workers < 0 {
		return withCode(exitUsage, fmt.Errorf("--samples and --workers take a count of 0 or more (got --samples %d, --workers %d)", o.samples, o.workers))
	}
	if o.survey != "" {
		if fi, err := os.Stat(o.survey); err == nil && fi.IsDir() {
			o.surveys, o.survey = []string{o.survey}, ""
		}
	}
	if o.survey == "" {
		return runPortfolio(out, errOut, o)
	}
	xlsx := o.output
	if xlsx == "" {
		xlsx = defaultAuditPath(o.survey)
	}
	if err := refuseClashes([]namedPath{{"the survey", o.survey}},
		[]namedPath{{"the audit workbook", xlsx}, {"--json", o.json}, {"--portfolio", o.portfolio}, {"--portfolio-json", o.portfolioJSON}}); err != nil {
		return err
	}
	prog := newProgress(errOut)
	prog.begin(filepath.Base(o.survey))
	a, err := assessStreamed(o.survey, xlsx, o.json, o, prog)
	if err != nil {
		return err
	}
	s := a.Survey
	audit.WriteSummary(out, a)
	fmt.Fprintf(out, "\nAudit workbook: %s\n", xlsx)
	if o.json != "" {
		fmt.Fprintf(out, "Audit JSON:     %s\n", o.json)
	}
	if o.portfolio != "" || o.portfolioJSON != "" {
		p := audit.Portfolio{Surveys: []audit.PortfolioSurvey{audit.PortfolioEntry(a, filepath.Base(o.survey), xlsx)}}
		if err := writePortfolio(o.ws, out, p, runInfo(s, o.args), o.portfolio, o.portfolioJSON); err != nil {
			return err
		}
	}
	switch {
	case objectCount(a) == 0:
		return withCode(exitProblems, fmt.Errorf("no object of %s could be assessed: run 'sparkmargin check %s' for the problems", o.survey, o.survey))
	case o.strict && len(s.Rejected) > 0:
		return withCode(exitProblems, fmt.Errorf("--strict: %d row(s) were rejected; see the Rejected sheet", len(s.Rejected)))
	}
	return nil
}

func objectCount(a *assess.Audit) int {
	n := 0
	for _, c := range a.Counts {
		n += c
	}
	return n
}

// streamBatch is the number of objects assessed (and sampled in parallel) at a time.
const streamBatch = 1024

// assessStreamed reads, assesses and writes one survey in one pass: objects
// are read row by row (inventory.StreamFile), assessed in batches
// (assess.Streamer), and each batch's rows go straight to the audit
// workbook's Objects sheet and the JSON (audit.WorkbookWriter,
// audit.JSONWriter); only the station aggregates, findings and problems are
// kept. The outputs have the cells and bytes of the in-memory path
// (assess.Assess, audit.WriteWorkbook, audit.WriteJSON).
func assessStreamed(path, xlsx, jsonPath string, o assessOptions, prog *progress) (a *assess.Audit, err error) {
	if err := requireRegular(path); err != nil {
		prog.end()
		return nil, err
	}
	var (
		st    *assess.Streamer
		ww    *audit.WorkbookWriter
		jw    *audit.JSONWriter
		extra []inventory.Problem
		batch = make([]inventory.Object, 0, streamBatch)
	)
	defer func() {
		prog.end()
		if ww != nil {
			_ = ww.Close()
		}
		if jw != nil {
			_ = jw.Close()
		}
	}()
	flush := func() error {
		rs := st.Add(batch)
		batch = batch[:0]
		if err := ww.Add(rs); err != nil {
			return err
		}
		if jw != nil {
			if err := jw.Add(rs); err != nil {
				return err
			}
		}
		prog.set(st.Objects())
		return nil
	}
	tmp, err := o.ws.Dir()
	if err != nil {
		return nil, withCode(exitUsage, err)
	}
	s, err := inventory.StreamFile(path, inventory.ReadOptions{TmpDir: tmp}, func(s *inventory.Survey) error {
		lim, p1 := assess.LimitsFromSite(s.Site, model.DefaultLimits())
		unc, p2 := assess.UncertaintiesFromSite(s.Site, assess.DefaultUncertainties())
		extra = append(p1, p2...)
		st = assess.NewStreamer(s, assess.Options{Limits: lim, Samples: o.samples, Seed: o.seed, Workers: o.workers, Uncertainties: unc})
		var err error
		if ww, err = audit.NewWorkbookWriter(s, runInfo(s, o.args), o.samples > 0, tmp); err != nil {
			return err
		}
		if jsonPath != "" {
			if jw, err = audit.NewJSONWriter(tmp); err != nil {
				return err
			}
		}
		return nil
	}, func(obj inventory.Object) error {
		batch = append(batch, obj)
		if len(batch) == streamBatch {
			return flush()
		}
		return nil
	})
	if err != nil {
		if errors.Is(err, inventory.ErrUnreadable) {
			return nil, withCode(exitUsage, err)
		}
		return nil, withCode(exitUsage, fmt.Errorf("assessing %s: %w", path, err))
	}
	if err := flush(); err != nil {
		return nil, withCode(exitUsage, fmt.Errorf("assessing %s: %w", path, err))
	}
	// The Site's limit and uncertainty problems come after the reader's, as
	// the in-memory path appends them.
	s.Problems = append(s.Problems, extra...)
	a = st.Finish()
	a.Survey = s
	// The workbook and the JSON are each written whole, then renamed into
	// place together; the JSON records the workbook's name and SHA-256, so
	// that a pair one of whose renames a kill prevented is told apart.
	info := runInfo(s, o.args)
	pw, err := o.ws.Prepare(xlsx, func(w io.Writer) error { return ww.Finish(a, w) })
	if err != nil {
		return nil, withCode(exitUsage, fmt.Errorf("writing the audit workbook: %w", err))
	}
	var pj *report.Pending
	if jsonPath != "" {
		info.Workbook, info.WorkbookSHA256 = filepath.Base(xlsx), pw.SHA256()
		if pj, err = o.ws.Prepare(jsonPath, func(w io.Writer) error { return jw.Finish(a, info, w) }); err != nil {
			o.ws.Discard(pw)
			return nil, withCode(exitUsage, fmt.Errorf("writing the audit JSON: %w", err))
		}
	}
	if err := o.ws.Commit(pw, pj); err != nil {
		return nil, withCode(exitUsage, fmt.Errorf("writing the audit: %w", err))
	}
	return a, nil
}

// runPortfolio assesses several surveys (files or folders), each to its own
// audit, then writes the portfolio; every survey is tried and reported.
func runPortfolio(out, errOut io.Writer, o assessOptions) error {
	outDir, jsonDir := o.output, o.json
	for _, d := range []struct{ flag, dir string }{{"-o", outDir}, {"--json", jsonDir}} {
		if d.dir == "" {
			continue
		}
		if fi, err := os.Stat(d.dir); err == nil && !fi.IsDir() {
			return withCode(exitUsage, fmt.Errorf("%s %s: with several surveys %s names a folder, and this is a file", d.flag, d.dir, d.flag))
		}
		if err := os.MkdirAll(d.dir, 0o755); err != nil {
			return withCode(exitUsage, fmt.Errorf("%s %s: %w", d.flag, d.dir, err))
		}
	}
	portfolio := o.portfolio
	if portfolio == "" {
		portfolio = filepath.Join(cmpOr(outDir, "."), "portfolio.xlsx")
	}
	portfolioJSON := o.portfolioJSON
	if portfolioJSON == "" && jsonDir != "" {
		portfolioJSON = filepath.Join(jsonDir, "portfolio.json")
	}
	files, code, err := expandSurveys(errOut, o.surveys, portfolio)
	if err != nil {
		return err
	}
	inputs := make([]namedPath, len(files))
	for i, f := range files {
		inputs[i] = namedPath{"the survey", f}
	}
	if err := refuseClashes(inputs, []namedPath{{"the portfolio workbook", portfolio}, {"the portfolio JSON", portfolioJSON}}); err != nil {
		return err
	}
	var p audit.Portfolio
	var written []namedPath // the outputs of the surveys before, and the portfolio's
	written = append(written, namedPath{"the portfolio workbook", portfolio}, namedPath{"the portfolio JSON", portfolioJSON})
	failed := 0
	for i, file := range files {
		if i > 0 {
			fmt.Fprintln(out)
		}
		fmt.Fprintf(out, "== %s ==\n", file)
		name := strings.TrimSuffix(filepath.Base(file), filepath.Ext(file))
		xlsx, jsonPath := defaultAuditPath(file), ""
		if outDir != "" {
			xlsx = filepath.Join(outDir, name+"-audit.xlsx")
		}
		if jsonDir != "" {
			jsonPath = filepath.Join(jsonDir, name+"-audit.json")
		}
		fail := func(c int, err error) {
			fmt.Fprintf(errOut, "sparkmargin: %s: %v\n", file, err)
			p.Failed = append(p.Failed, audit.PortfolioFailure{File: file, Reason: err.Error()})
			code = max(code, c)
			failed++
		}
		mine := []namedPath{{"its audit workbook", xlsx}, {"its audit JSON", jsonPath}}
		if err := refuseClashes(inputs, mine); err != nil {
			fail(exitUsage, err)
			continue
		}
		if err := refuseClashes(nil, append(append([]namedPath(nil), written...), mine...)); err != nil {
			fail(exitUsage, fmt.Errorf("its outputs would overwrite another output of this run (%w); give the surveys different names", err))
			continue
		}
		written = append(written, mine...)
		prog := newProgress(errOut)
		prog.begin(fmt.Sprintf("%s (survey %d of %d)", filepath.Base(file), i+1, len(files)))
		o1 := o
		o1.survey = file
		a, err := assessStreamed(file, xlsx, jsonPath, o1, prog)
		if err != nil {
			c := exitUsage
			var ee *exitError
			if errors.As(err, &ee) {
				c = ee.code
			}
			fail(c, err)
			continue
		}
		audit.WriteSummary(out, a)
		fmt.Fprintf(out, "\nAudit workbook: %s\n", xlsx)
		if jsonPath != "" {
			fmt.Fprintf(out, "Audit JSON:     %s\n", jsonPath)
		}
		p.Surveys = append(p.Surveys, audit.PortfolioEntry(a, filepath.Base(file), xlsx))
		switch {
		case objectCount(a) == 0:
			fmt.Fprintf(errOut, "sparkmargin: %s: no object could be assessed: run 'sparkmargin check %s' for the problems\n", file, file)
			code = max(code, exitProblems)
			failed++
		case o.strict && len(a.Survey.Rejected) > 0:
			fmt.Fprintf(errOut, "sparkmargin: %s: --strict: %d row(s) were rejected; see the Rejected sheet\n", file, len(a.Survey.Rejected))
			code = max(code, exitProblems)
			failed++
		}
	}
	fmt.Fprintln(out)
	info := audit.RunInfo{ToolVersion: version, CommandLine: strings.Join(o.args, " ")}
	if err := writePortfolio(o.ws, out, p, info, portfolio, portfolioJSON); err != nil {
		return err
	}
	if code != exitOK {
		return withCode(code, fmt.Errorf("%d of %d survey(s) not assessed cleanly (see the messages above)", failed, len(files)))
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
// does not exist is reported and gives exit code 2; none at all is a usage error.
func expandSurveys(errOut io.Writer, args []string, portfolio string) ([]string, int, error) {
	var files []string
	code := exitOK
	for _, a := range args {
		fi, err := os.Stat(a)
		if err != nil || !fi.IsDir() {
			// A file, or a name that does not exist (reported when read, as with one survey).
			files = append(files, a)
			continue
		}
		entries, err := os.ReadDir(a)
		if err != nil {
			fmt.Fprintf(errOut, "sparkmargin: %s: the folder cannot be read: %v\n", a, err)
			code = exitUsage
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
			if sameTarget(p, portfolio, true, false) && isPortfolioWorkbook(p) {
				// The previous run's portfolio; a survey named as -p is kept and refused below.
				continue
			}
			found = append(found, p)
		}
		sort.Strings(found)
		if len(found) == 0 {
			fmt.Fprintf(errOut, "sparkmargin: %s: no survey (.xlsx) in the folder\n", a)
			code = exitUsage
		}
		files = append(files, found...)
	}
	if len(files) == 0 {
		return nil, code, withCode(exitUsage, errors.New("no survey to assess"))
	}
	return files, code, nil
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

// writePortfolio writes the portfolio workbook and, when jsonPath is set, its JSON.
func writePortfolio(ws *report.Workspace, out io.Writer, p audit.Portfolio, info audit.RunInfo, xlsx, jsonPath string) error {
	var pw, pj *report.Pending
	var err error
	if info.TmpDir, err = ws.Dir(); err != nil {
		return withCode(exitUsage, err)
	}
	if xlsx != "" {
		if pw, err = ws.Prepare(xlsx, func(w io.Writer) error { return audit.WritePortfolio(w, p, info) }); err != nil {
			return withCode(exitUsage, fmt.Errorf("writing the portfolio workbook: %w", err))
		}
	}
	if jsonPath != "" {
		if pw != nil {
			info.Workbook, info.WorkbookSHA256 = filepath.Base(xlsx), pw.SHA256()
		}
		if pj, err = ws.Prepare(jsonPath, func(w io.Writer) error { return audit.WritePortfolioJSON(w, p, info) }); err != nil {
			ws.Discard(pw)
			return withCode(exitUsage, fmt.Errorf("writing the portfolio JSON: %w", err))
		}
	}
	if err := ws.Commit(pw, pj); err != nil {
		return withCode(exitUsage, fmt.Errorf("writing the portfolio: %w", err))
	}
	if xlsx != "" {
		fmt.Fprintf(out, "Portfolio workbook: %s (%d site(s) ranked)\n", xlsx, len(p.Surveys))
	}
	if jsonPath != "" {
		fmt.Fprintf(out, "Portfolio JSON:     %s\n", jsonPath)
	}
	return nil
}

func runInfo(s *inventory.Survey, args []string) audit.RunInfo {
	return audit.RunInfo{
		ToolVersion:  version,
		SurveyFile:   filepath.Base(s.Path),
		SurveySHA256: s.SHA256,
		CommandLine:  strings.Join(args, " "),
	}
}
