package main

import (
	"fmt"
	"io"
	"strings"

	"github.com/spf13/cobra"

	"github.com/sparkmargin/sparkmargin/report/outfile"
	"github.com/sparkmargin/sparkmargin/report/rerun"
)

type sweepOptions struct {
	ws     *outfile.Workspace
	survey string
	rh     string
	output string
	json   string
	all    bool // also sweep the stations that give their own RH
	top    int  // stations in the terminal tables
	args   []string
}

func newSweepCmd(ws *outfile.Workspace) *cobra.Command {
	o := sweepOptions{ws: ws}
	c := &cobra.Command{
		Use:   "sweep SURVEY.xlsx --rh FROM:TO:STEP [-o FILE.xlsx]",
		Short: "Assess a survey over a range of relative humidity: counts, worst ratios, where each station clears",
		Long: "sweep assesses the survey once per RH step, with that RH as the site's, and lists the number of\n" +
			"incendive and marginal objects and each station's worst ratio per step, then the RH above which each\n" +
			"station becomes non-incendive, or why it never does (an input missing, a reading that holds, or humidity\n" +
			"alone not enough). A station that gives its own RH (a dryer exit at 20 %) keeps it unless --all-stations.\n" +
			"Only materials whose surface resistivity responds to humidity change. The survey file is never modified.\n" +
			"Exit status: 0 done, 1 an Objects row was rejected (the outputs are written, its station marked incomplete,\n" +
			"as assess) or nothing could be assessed, 2 usage or unreadable survey.",
		Example: "  sparkmargin sweep demo-out/demo-survey.xlsx --rh 10:90:5 -o sweep.xlsx",
		Args:    cobra.ExactArgs(1),
		RunE: func(c *cobra.Command, args []string) error {
			o.survey = args[0]
			o.args = commandLine(c, args)
			return withOutputs(c, []outfile.NamedPath{{Role: "the survey", Path: o.survey}}, o.output, o.json, func(out io.Writer) error { return runSweep(out, o) })
		},
	}
	c.Flags().StringVar(&o.rh, "rh", "10:90:5", "RH range in %: FROM:TO:STEP")
	c.Flags().BoolVar(&o.all, "all-stations", false, "set the swept RH at every station too, overriding a station's own RH")
	c.Flags().IntVar(&o.top, "top", rerun.DefaultSweepTop, "print the N worst stations (by rank at the lowest RH); 0 prints all, the workbook and JSON hold all")
	c.Flags().StringVarP(&o.output, "output", "o", "", "workbook to write (table and line charts); none when not given")
	c.Flags().StringVar(&o.json, "json", "", "also write the steps as JSON to this file (- for standard output, the summary then going to standard error)")
	return c
}

func runSweep(out io.Writer, o sweepOptions) error {
	if o.top < 0 {
		return withCode(exitUsage, fmt.Errorf("--top takes a count of 1 or more, or 0 for all stations (got %d)", o.top))
	}
	steps, err := rerun.ParseRange(o.rh)
	if err != nil {
		return withCode(exitUsage, err)
	}
	s, err := loadSurvey(o.ws, o.survey)
	if err != nil {
		return err
	}
	if err := outfile.RefuseClashes([]outfile.NamedPath{{Role: "the survey", Path: o.survey}}, []outfile.NamedPath{{Role: "-o", Path: o.output}, {Role: "--json", Path: o.json}}); err != nil {
		return err
	}
	if len(s.Objects) == 0 {
		return withCode(exitProblems, fmt.Errorf("no object of %s could be assessed: run 'sparkmargin check %s' for the problems", o.survey, o.survey))
	}
	sw := rerun.RunSweep(s, steps, rerun.SweepOptions{AllStations: o.all})
	tmp, err := o.ws.Dir()
	if err != nil {
		return withCode(exitUsage, err)
	}
	info := rerun.RunInfo{ToolVersion: version, CommandLine: strings.Join(o.args, " "), TmpDir: tmp}
	if err := rerun.WriteLinked(o.ws, version, o.output, o.json,
		func(w io.Writer) error { return rerun.WriteSweepWorkbook(w, sw, info) },
		func(w io.Writer, ji rerun.JSONInfo) error { return rerun.WriteSweepJSONWith(w, sw, ji) }); err != nil {
		return err
	}
	rerun.WriteSweepSummary(out, sw, o.top)
	if o.output != "" {
		fmt.Fprintf(out, "\nSweep workbook: %s\n", o.output)
	}
	if o.json != "" {
		fmt.Fprintf(out, "Sweep JSON:     %s\n", outfile.ShownPath(o.json))
	}
	return rejectedShortfall(s)
}
