package main

import (
	"fmt"
	"io"
	"path/filepath"
	"strings"

	"github.com/spf13/cobra"

	"github.com/sparkmargin/sparkmargin/inventory"
	"github.com/sparkmargin/sparkmargin/model"
	"github.com/sparkmargin/sparkmargin/report"
	"github.com/sparkmargin/sparkmargin/report/assess"
)

type assessOptions struct {
	survey  string
	output  string
	json    string
	strict  bool
	samples int
	seed    uint64
	workers int
	args    []string // the command line, for the Method sheet
}

func newAssessCmd() *cobra.Command {
	var o assessOptions
	c := &cobra.Command{
		Use:   "assess SURVEY.xlsx",
		Short: "Assess a survey: verdicts, findings, station ranking and the audit workbook",
		Long: "assess reads a line-survey workbook, estimates fields, potentials and discharge energies for every\n" +
			"accepted object, compares them with the atmosphere's MIE and the published limits, and writes an\n" +
			"audit workbook (default: <survey>-audit.xlsx beside the survey) and optionally JSON.\n" +
			"Exit status: 0 assessed (rejected rows are counted in the summary), 1 nothing could be assessed\n" +
			"(or, with --strict, any row rejected), 2 usage or unreadable input.",
		Args: cobra.ExactArgs(1),
		RunE: func(c *cobra.Command, args []string) error {
			o.survey = args[0]
			o.args = commandLine(c, args)
			return runAssess(c.OutOrStdout(), c.ErrOrStderr(), o)
		},
	}
	c.Flags().StringVarP(&o.output, "output", "o", "", "audit workbook to write (default <survey>-audit.xlsx beside the survey)")
	c.Flags().StringVar(&o.json, "json", "", "also write the audit as JSON to this file")
	c.Flags().BoolVar(&o.strict, "strict", false, "exit 1 when any row was rejected")
	c.Flags().IntVar(&o.samples, "samples", 0, "Monte Carlo samples per object for the probability of each verdict (0: point estimate only)")
	c.Flags().Uint64Var(&o.seed, "seed", assess.DefaultSeed, "Monte Carlo seed, recorded on the Method sheet and in the JSON")
	c.Flags().IntVar(&o.workers, "workers", 0, "Monte Carlo worker goroutines (0: all cores); results do not depend on it")
	return c
}

// assessed is one survey's audit and where it went.
type assessed struct {
	survey *inventory.Survey
	audit  *assess.Audit
	xlsx   string
	json   string
}

func runAssess(out, errOut io.Writer, o assessOptions) error {
	s, err := loadSurvey(o.survey)
	if err != nil {
		return err
	}
	xlsx := o.output
	if xlsx == "" {
		xlsx = defaultAuditPath(o.survey)
	}
	if err := refuseSurveyPath(o.survey, xlsx, o.json); err != nil {
		return err
	}
	a, err := assessSurvey(s, o)
	if err != nil {
		return err
	}
	info := runInfo(s, o.args)
	if err := writeAudit(a, info, xlsx, o.json); err != nil {
		return err
	}
	report.WriteSummary(out, a)
	fmt.Fprintf(out, "\nAudit workbook: %s\n", xlsx)
	if o.json != "" {
		fmt.Fprintf(out, "Audit JSON:     %s\n", o.json)
	}
	switch {
	case len(a.Objects) == 0:
		return withCode(exitProblems, fmt.Errorf("no object of %s could be assessed: run 'sparkmargin check %s' for the problems", o.survey, o.survey))
	case o.strict && len(s.Rejected) > 0:
		return withCode(exitProblems, fmt.Errorf("--strict: %d row(s) were rejected; see the Rejected sheet", len(s.Rejected)))
	}
	return nil
}

// assessSurvey applies the site's limit overrides and runs the assessment.
func assessSurvey(s *inventory.Survey, o assessOptions) (*assess.Audit, error) {
	lim, problems := assess.LimitsFromSite(s.Site, model.DefaultLimits())
	s.Problems = append(s.Problems, problems...)
	unc, problems := assess.UncertaintiesFromSite(s.Site, assess.DefaultUncertainties())
	s.Problems = append(s.Problems, problems...)
	return assess.Assess(s, assess.Options{Limits: lim, Samples: o.samples, Seed: o.seed, Workers: o.workers, Uncertainties: unc}), nil
}

func runInfo(s *inventory.Survey, args []string) report.RunInfo {
	return report.RunInfo{
		ToolVersion:  version,
		SurveyFile:   filepath.Base(s.Path),
		SurveySHA256: s.SHA256,
		CommandLine:  strings.Join(args, " "),
	}
}

// refuseSurveyPath refuses output paths that would overwrite the survey.
func refuseSurveyPath(survey string, outputs ...string) error {
	for _, p := range outputs {
		if p != "" && sameFile(survey, p) {
			return withCode(exitUsage, fmt.Errorf("refusing to write %s: it is the survey itself; choose another output name", p))
		}
	}
	return nil
}

// writeAudit writes the workbook and, when jsonPath is set, the JSON, each atomically.
func writeAudit(a *assess.Audit, info report.RunInfo, xlsx, jsonPath string) error {
	report.CleanStaleTemps(filepath.Dir(xlsx), filepath.Base(xlsx))
	if err := report.WriteFileAtomic(xlsx, func(w io.Writer) error { return report.WriteWorkbook(w, a, info) }); err != nil {
		return withCode(exitUsage, fmt.Errorf("writing the audit workbook: %w", err))
	}
	if jsonPath != "" {
		report.CleanStaleTemps(filepath.Dir(jsonPath), filepath.Base(jsonPath))
		if err := report.WriteFileAtomic(jsonPath, func(w io.Writer) error { return report.WriteJSON(w, a, info) }); err != nil {
			return withCode(exitUsage, fmt.Errorf("writing the audit JSON: %w", err))
		}
	}
	return nil
}
