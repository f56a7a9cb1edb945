package report

import (
	"errors"
	"fmt"
	"io"
	"path/filepath"
	"strings"

	"github.com/sparkmargin/sparkmargin/inventory"
	"github.com/sparkmargin/sparkmargin/model"
	"github.com/sparkmargin/sparkmargin/report/assess"
	"github.com/sparkmargin/sparkmargin/report/audit"
	"github.com/sparkmargin/sparkmargin/report/outfile"
)

// Progress hears how far a run has gone; a nil Progress hears nothing.
type Progress interface {
	Begin(label string) // a survey starts (label names it)
	Total(rows int)     // the rows its Objects sheet declares, before any Set (0: unknown)
	Set(objects int)    // objects assessed so far in that survey
	End()               // the survey is done (or failed)
}

// Run is one assess run: where its temporary files go, the Monte Carlo
// settings, what the Method sheet records, and where the terminal summary and
// progress go. The zero value of every field but Workspace is usable.
type Run struct {
	Workspace   *outfile.Workspace
	Samples     int    // Monte Carlo samples per object (0: point estimate only)
	Seed        uint64 // Monte Carlo seed
	Workers     int    // Monte Carlo workers (0: all cores)
	Strict      bool   // any rejected row makes the run fail with Problems
	ToolVersion string
	CommandLine []string // the command as run, for the Method sheet
	Out         io.Writer
	ErrOut      io.Writer
	Progress    Progress
	Summary     audit.SummaryOptions // trims the terminal summary (--top, --quiet)
	// Force writes an audit over a file that is not a sparkmargin audit
	// (refused otherwise: see previousAudit in actions.go).
	Force bool
	plans map[string]*audit.ActionPlan // the actions carried, by audit workbook written
}

// Info returns the run facts the outputs record for survey s.
func (r *Run) Info(s *inventory.Survey) audit.RunInfo {
	return audit.RunInfo{
		ToolVersion:  r.ToolVersion,
		SurveyFile:   filepath.Base(s.Path),
		SurveySHA256: s.SHA256,
		CommandLine:  strings.Join(r.CommandLine, " "),
	}
}

func (r *Run) out() io.Writer {
	if r.Out == nil {
		return io.Discard
	}
	return r.Out
}

func (r *Run) errOut() io.Writer {
	if r.ErrOut == nil {
		return io.Discard
	}
	return r.ErrOut
}

func (r *Run) begin(label string) {
	if r.Progress != nil {
		r.Progress.Begin(label)
	}
}

func (r *Run) total(rows int) {
	if r.Progress != nil {
		r.Progress.Total(rows)
	}
}

func (r *Run) set(n int) {
	if r.Progress != nil {
		r.Progress.Set(n)
	}
}

func (r *Run) end() {
	if r.Progress != nil {
		r.Progress.End()
	}
}

// Outputs names the files of one survey's audit: the workbook (required),
// the JSON and the HTML report (optional).
type Outputs struct {
	Workbook string
	JSON     string
	HTML     string
}

// streamBatch is the number of objects assessed (and sampled in parallel) at a time.
const streamBatch = assess.AssessBatch

// AssessFile reads, assesses and writes one survey in one pass: objects
// are read row by row (inventory.StreamFile), assessed in batches
// (assess.Streamer), and each batch's rows go straight to the audit
// workbook's Objects sheet and the JSON (audit.WorkbookWriter,
// audit.JSONWriter); only the station aggregates, findings and problems are
// kept. The workbook and the JSON are renamed into place together. A failure
// is an *Error of class Unusable.
func (r *Run) AssessFile(path string, out Outputs) (a *assess.Audit, err error) {
	if err := RequireRegular(path); err != nil {
		r.end()
		return nil, err
	}
	var (
		st    *assess.Streamer
		ww    *audit.WorkbookWriter
		jw    *audit.JSONWriter
		hw    *audit.HTMLWriter
		batch = make([]inventory.Object, 0, streamBatch)
		// kept only for the HTML report's humidity sweep, which
		// reassesses the whole survey at each step
		kept []inventory.Object
	)
	if out.HTML != "" {
		hw = audit.NewHTMLWriter()
	}
	defer func() {
		r.end()
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
		if hw != nil {
			if err := hw.Add(rs); err != nil {
				return err
			}
		}
		r.set(st.Objects())
		return nil
	}
	tmp, err := r.Workspace.Dir()
	if err != nil {
		return nil, unusable(err)
	}
	prev, err := r.previousAudit(out.Workbook, tmp)
	if err != nil {
		return nil, err
	}
	opts := inventory.ReadOptions{TmpDir: tmp, CountObjectRows: r.Progress != nil}
	s, err := inventory.StreamFile(path, opts, func(s *inventory.Survey) error {
		r.total(s.DeclaredObjectRows)
		lim := assess.LimitsFromSite(s.Site, model.DefaultLimits())
		unc := assess.UncertaintiesFromSite(s.Site, assess.DefaultUncertainties())
		st = assess.NewStreamer(s, assess.Options{Limits: lim, Samples: r.Samples, Seed: r.Seed, Workers: r.Workers, Uncertainties: unc})
		var err error
		if ww, err = audit.NewWorkbookWriter(s, r.Info(s), r.Samples > 0, tmp); err != nil {
			return err
		}
		if out.JSON != "" {
			if jw, err = audit.NewJSONWriter(tmp); err != nil {
				return err
			}
		}
		return nil
	}, func(obj inventory.Object) error {
		batch = append(batch, obj)
		if hw != nil {
			kept = append(kept, obj)
		}
		if len(batch) == streamBatch {
			return flush()
		}
		return nil
	})
	if err != nil {
		if errors.Is(err, inventory.ErrUnreadable) {
			return nil, unusable(err)
		}
		return nil, unusable(fmt.Errorf("assessing %s: %w", path, err))
	}
	if err := flush(); err != nil {
		return nil, unusable(fmt.Errorf("assessing %s: %w", path, err))
	}
	a = st.Finish()
	a.Survey = s
	plan := audit.PlanActions(prev, a.Findings)
	ww.SetActions(plan)
	// The workbook and the JSON are each written whole, then renamed into
	// place together; the JSON records the workbook's name and SHA-256, so
	// that a pair one of whose renames a kill prevented is told apart.
	info := r.Info(s)
	pw, err := r.Workspace.Prepare(out.Workbook, func(w io.Writer) error { return ww.Finish(a, w) })
	if err != nil {
		// The JSON is complete without the workbook: written all the same
		// (it records no workbook), so the assessment is not lost.
		if out.JSON != "" {
			_ = r.Workspace.WriteFile(out.JSON, func(w io.Writer) error { return jw.Finish(a, info, w) })
		}
		return nil, unusable(fmt.Errorf("writing the audit workbook: %w", err))
	}
	var pj *outfile.Pending
	if out.JSON != "" {
		info.Workbook, info.WorkbookSHA256 = filepath.Base(out.Workbook), pw.SHA256()
		if pj, err = r.Workspace.Prepare(out.JSON, func(w io.Writer) error { return jw.Finish(a, info, w) }); err != nil {
			r.Workspace.Discard(pw)
			return nil, unusable(fmt.Errorf("writing the audit JSON: %w", err))
		}
	}
	var ph *outfile.Pending
	if hw != nil {
		whole := *s
		whole.Objects = kept
		hum := HumidityGrid(&whole)
		if ph, err = r.Workspace.Prepare(out.HTML, func(w io.Writer) error { return hw.Finish(a, r.Info(s), hum, w) }); err != nil {
			r.Workspace.Discard(pw, pj)
			return nil, unusable(fmt.Errorf("writing the HTML report: %w", err))
		}
	}
	if err := r.Workspace.Commit(pw, pj, ph); err != nil {
		return nil, unusable(fmt.Errorf("writing the audit: %w", err))
	}
	r.notePlan(out.Workbook, plan)
	return a, nil
}

// ObjectCount is the number of objects an audit judged.
func ObjectCount(a *assess.Audit) int {
	n := 0
	for _, c := range a.Counts {
		n += c
	}
	return n
}

// PortfolioFiles names the portfolio's outputs; an empty name is not written.
type PortfolioFiles struct {
	Workbook string
	JSON     string
}

// AssessOne assesses one survey to out, prints its summary, writes the
// portfolio when pf names a file, and fails with Problems when nothing could
// be assessed or, under Strict, a row was rejected.
func (r *Run) AssessOne(survey string, out Outputs, pf PortfolioFiles) error {
	if err := outfile.RefuseClashes([]outfile.NamedPath{{Role: "the survey", Path: survey}},
		[]outfile.NamedPath{{Role: "the audit workbook", Path: out.Workbook}, {Role: "--json", Path: out.JSON}, {Role: "--html", Path: out.HTML}, {Role: "--portfolio", Path: pf.Workbook}, {Role: "--portfolio-json", Path: pf.JSON}}); err != nil {
		return unusable(err)
	}
	r.begin(filepath.Base(survey))
	a, err := r.AssessFile(survey, out)
	if err != nil {
		return err
	}
	r.printAudit(a, out)
	if pf.Workbook != "" || pf.JSON != "" {
		p := audit.Portfolio{Surveys: []audit.PortfolioSurvey{audit.PortfolioEntry(a, filepath.Base(survey), out.Workbook)}}
		if err := r.WritePortfolio(p, r.Info(a.Survey), pf); err != nil {
			return err
		}
	}
	if err := r.shortfall(a, survey); err != nil {
		return problems(fmt.Errorf("%s: %w", survey, err))
	}
	return nil
}

// shortfall says why an assessed survey still fails the run (class
// Problems), or nil: nothing could be assessed; an object row was rejected
// (an object not assessed is a hazard the audit does not cover); under
// Strict, any row of a sheet the assessment uses was rejected. The audit is written in every case.
func (r *Run) shortfall(a *assess.Audit, survey string) error {
	switch {
	case ObjectCount(a) == 0:
		return fmt.Errorf("no object could be assessed: run 'sparkmargin check %s' for the problems", survey)
	case RejectedObjects(a.Survey) > 0:
		return fmt.Errorf("%d object row(s) were rejected: the audit is written, but the stations marked incomplete are ranked without them; see the Rejected sheet", RejectedObjects(a.Survey))
	case r.Strict && a.Survey.RejectedUsed() > 0:
		// A Changes row with a problem is a note, not a rejected row: the
		// sheet is not used by this command (inventory.SheetCount.NotUsedByAssess).
		return fmt.Errorf("--strict: %d row(s) were rejected; see the Rejected sheet", a.Survey.RejectedUsed())
	}
	return nil
}

// RejectedObjects counts the rejected Objects rows: an object not assessed is
// a hazard the audit does not cover, so assess exits 1 (the audit is still
// written, its stations marked incomplete).
func RejectedObjects(s *inventory.Survey) int {
	n := 0
	for _, r := range s.Rejected {
		if r.Sheet == inventory.SheetObjects {
			n++
		}
	}
	return n
}

// printAudit writes the terminal summary of a and the files written.
func (r *Run) printAudit(a *assess.Audit, out Outputs) {
	w := r.out()
	audit.WriteSummaryWith(w, a, r.Summary)
	fmt.Fprintf(w, "\nAudit workbook: %s\n", out.Workbook)
	r.printActions(out.Workbook)
	if out.JSON != "" {
		fmt.Fprintf(w, "Audit JSON:     %s\n", outfile.ShownPath(out.JSON))
	}
	if out.HTML != "" {
		fmt.Fprintf(w, "HTML report:    %s\n", out.HTML)
	}
}

// WritePortfolio writes the portfolio workbook and, when pf.JSON is set, its
// JSON, renamed into place together.
func (r *Run) WritePortfolio(p audit.Portfolio, info audit.RunInfo, pf PortfolioFiles) error {
	ws := r.Workspace
	var pw, pj *outfile.Pending
	var err error
	if info.TmpDir, err = ws.Dir(); err != nil {
		return unusable(err)
	}
	if pf.Workbook != "" {
		if pw, err = ws.Prepare(pf.Workbook, func(w io.Writer) error { return audit.WritePortfolio(w, p, info) }); err != nil {
			return unusable(fmt.Errorf("writing the portfolio workbook: %w", err))
		}
	}
	if pf.JSON != "" {
		if pw != nil {
			info.Workbook, info.WorkbookSHA256 = filepath.Base(pf.Workbook), pw.SHA256()
		}
		if pj, err = ws.Prepare(pf.JSON, func(w io.Writer) error { return audit.WritePortfolioJSON(w, p, info) }); err != nil {
			ws.Discard(pw)
			return unusable(fmt.Errorf("writing the portfolio JSON: %w", err))
		}
	}
	if err := ws.Commit(pw, pj); err != nil {
		return unusable(fmt.Errorf("writing the portfolio: %w", err))
	}
	if pf.Workbook != "" {
		fmt.Fprintf(r.out(), "Portfolio workbook: %s (%d survey(s), %d site(s) ranked)\n", pf.Workbook, len(p.Surveys), len(p.Groups()))
	}
	if pf.JSON != "" {
		fmt.Fprintf(r.out(), "Portfolio JSON:     %s\n", outfile.ShownPath(pf.JSON))
	}
	return nil
}
