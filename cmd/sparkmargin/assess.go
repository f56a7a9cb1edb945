package main

import (
	"fmt"
	"io"
	"os"

	"github.com/spf13/cobra"

	"github.com/sparkmargin/sparkmargin/report"
	"github.com/sparkmargin/sparkmargin/report/assess"
	"github.com/sparkmargin/sparkmargin/report/audit"
	"github.com/sparkmargin/sparkmargin/report/outfile"
)

type assessOptions struct {
	ws            *outfile.Workspace
	survey        string
	surveys       []string // several surveys or folders (survey is then empty)
	output        string
	json          string
	html          string // the HTML report (one survey only)
	portfolio     string
	portfolioJSON string
	strict        bool
	samples       int
	seed          uint64
	workers       int
	top           int      // print only the top worst stations
	quiet         bool     // no station table
	force         bool     // write the audit over a file that is not a sparkmargin audit
	args          []string // the command line, for the Method sheet
}

func newAssessCmd(ws *outfile.Workspace) *cobra.Command {
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
			"Exit status: 0 assessed, 1 nothing could be assessed or an Objects row was rejected (the audit is\n" +
			"written, its stations marked incomplete; with --strict, any row rejected), 2 usage or unreadable\n" +
			"input; with several surveys the worst\n" +
			"of them, every survey being tried.\n" +
			"Rerun over an existing audit: the actions typed into its Findings sheet (Action owner, Due, Status,\n" +
			"Comment) are carried to the same findings (station, object, check) of the new audit, findings that\n" +
			"closed are listed at the foot of the Findings sheet, and the terminal says how many; a file there\n" +
			"that is not a sparkmargin audit is not written over without --force.",
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
	c.Flags().StringVar(&o.json, "json", "", "also write the audit as JSON to this file (- for standard output, the summary then going to standard error); a folder with several surveys (also gets portfolio.json)")
	c.Flags().StringVar(&o.html, "html", "", "also write a self-contained HTML report (plots, findings, cautions; prints from a browser) to this file; one survey only. It reassesses the survey at 10-90 % RH for its humidity plot")
	c.Flags().StringVarP(&o.portfolio, "portfolio", "p", "", "portfolio workbook ranking sites and stations across the surveys (default portfolio.xlsx in the -o folder, else the current folder; written for one survey only when given)")
	c.Flags().StringVar(&o.portfolioJSON, "portfolio-json", "", "also write the portfolio as JSON to this file (- for standard output)")
	c.Flags().BoolVar(&o.strict, "strict", false, "exit 1 when any row was rejected")
	c.Flags().IntVar(&o.samples, "samples", 0, "Monte Carlo samples per object for the probability of each verdict (0: point estimate only)")
	c.Flags().Uint64Var(&o.seed, "seed", assess.DefaultSeed, "Monte Carlo seed, recorded on the Method sheet and in the JSON")
	c.Flags().IntVar(&o.workers, "workers", 0, "Monte Carlo worker goroutines (0: all cores); results do not depend on it")
	c.Flags().IntVar(&o.top, "top", 0, "print only the N worst stations, then how many more the workbook holds (0: all)")
	c.Flags().BoolVarP(&o.quiet, "quiet", "q", false, "no station table: only the counts, the survey rows line, the cautions and the files written (errors still printed); not with --top")
	c.Flags().BoolVar(&o.force, "force", false, "write the audit workbook over an existing file that is not a sparkmargin audit (refused otherwise); an existing audit is always replaced, its actions carried over")
	return c
}

// runAssess runs the report pipeline on one survey or many; report's errors
// carry their class, which run maps to the exit code.
func runAssess(out, errOut io.Writer, o assessOptions) error {
	if o.top < 0 {
		return withCode(exitUsage, fmt.Errorf("--top takes a count of 1 or more, or 0 for all stations (got %d)", o.top))
	}
	if o.top > 0 && o.quiet {
		return withCode(exitUsage, fmt.Errorf("--top and --quiet do not go together: --top %d prints the worst stations, --quiet no station table; give one", o.top))
	}
	if o.survey != "" {
		if fi, err := os.Stat(o.survey); err == nil && fi.IsDir() {
			o.surveys, o.survey = []string{o.survey}, ""
		}
	}
	books := []outputFlag{{"-o", o.output}, {"--portfolio", o.portfolio}}
	var inputs []outfile.NamedPath // several surveys: -o and --json name folders, checked by AssessMany
	if len(o.surveys) == 0 {
		inputs = []outfile.NamedPath{{Role: "the survey", Path: o.survey}}
	}
	if err := checkOutputs(inputs, books, []outputFlag{{"--json", o.json}, {"--portfolio-json", o.portfolioJSON}}); err != nil {
		return err
	}
	if o.survey == "" && outfile.IsStdout(o.json) {
		return withCode(exitUsage, fmt.Errorf("--json -: with several surveys --json names a folder; give one survey to write its JSON to standard output (--portfolio-json - takes the portfolio's)"))
	}
	if err := checkHTML(o.html, o.survey == ""); err != nil {
		return err
	}
	out = summaryOut(out, errOut, o.json, o.portfolioJSON)
	if o.samples < 0 || o.workers < 0 {
		return withCode(exitUsage, fmt.Errorf("--samples and --workers take a count of 0 or more (got --samples %d, --workers %d)", o.samples, o.workers))
	}
	r := &report.Run{
		Workspace: o.ws, Samples: o.samples, Seed: o.seed, Workers: o.workers, Strict: o.strict,
		ToolVersion: version, CommandLine: o.args, Out: out, ErrOut: errOut, Progress: progressFor(errOut),
		Summary: audit.SummaryOptions{Top: o.top, Quiet: o.quiet}, Force: o.force,
	}
	pf := report.PortfolioFiles{Workbook: o.portfolio, JSON: o.portfolioJSON}
	if o.survey == "" {
		return r.AssessMany(o.surveys, o.output, o.json, pf)
	}
	xlsx := o.output
	if xlsx == "" {
		xlsx = outfile.DefaultAuditPath(o.survey)
	}
	return r.AssessOne(o.survey, report.Outputs{Workbook: xlsx, JSON: o.json, HTML: o.html}, pf)
}
