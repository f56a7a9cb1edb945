package main

import (
	"fmt"
	"io"
	"strings"

	"github.com/spf13/cobra"

	"github.com/sparkmargin/sparkmargin/inventory"
	"github.com/sparkmargin/sparkmargin/report/outfile"
	"github.com/sparkmargin/sparkmargin/report/rerun"
)

type whatifOptions struct {
	ws             *outfile.Workspace
	survey         string
	output         string
	json           string
	noSheetChanges bool
	flags          []rerun.FlagArg // in command-line order
	args           []string
}

func newWhatifCmd(ws *outfile.Workspace) *cobra.Command {
	o := whatifOptions{ws: ws}
	c := &cobra.Command{
		Use:   "whatif SURVEY.xlsx [changes] -o FILE.xlsx",
		Short: "Assess a survey before and after planned changes (humidity, earthing, material, footwear...)",
		Long: "whatif applies changes to a copy of the survey's accepted rows (the survey file is never modified),\n" +
			"assesses before and after, and writes a workbook with each object's and station's verdict and ratio\n" +
			"before and after, what cleared, stayed and appeared, and the changes applied. Changes come from the\n" +
			"survey's Changes sheet (first) and from the flags (then, in their order).\n" +
			"Targets: an object ID, or station:ID for every matching row of a station (a station ID for --station-rh).\n" +
			"A flag and a Changes sheet row read the same way; quote a value with a space (--earth \"X=5 kV\").\n" +
			"Exit status: 0 done, 1 an Objects row was rejected (the outputs are written, its station marked\n" +
			"incomplete, as assess) or nothing could be assessed, 2 usage, unreadable survey or a bad change.",
		Example: "  sparkmargin whatif demo-out/demo-survey.xlsx --rh 55 --earth PWD-DRU1=1e6 -o whatif.xlsx\n" +
			"  sparkmargin whatif survey.xlsx --station-rh ST-LAM=65 --material COAT-WEB=PE --json whatif.json -o whatif.xlsx",
		Args: whatifArgs,
		RunE: func(c *cobra.Command, args []string) error {
			o.survey = args[0]
			o.args = whatifCommandLine(o)
			return withOutputs(c, []outfile.NamedPath{{Role: "the survey", Path: o.survey}}, o.output, o.json, func(out io.Writer) error { return runWhatif(out, o) })
		},
	}
	c.Flags().StringVarP(&o.output, "output", "o", "", "workbook to write (default <survey>-whatif.xlsx beside the survey)")
	c.Flags().StringVar(&o.json, "json", "", "also write the result as JSON to this file (- for standard output, the summary then going to standard error)")
	c.Flags().BoolVar(&o.noSheetChanges, "no-sheet-changes", false, "ignore the survey's Changes sheet")
	for _, k := range inventory.ChangeKinds() {
		c.Flags().Var(rerun.ChangeFlag{Kind: k, List: &o.flags}, k, rerun.FlagHelp(k))
	}
	return c
}

// whatifArgs takes the survey alone; a word left over is most often the unit
// of a change value typed with a space (--earth X=5 kV), so the error says to
// quote it rather than counting arguments.
func whatifArgs(c *cobra.Command, args []string) error {
	switch {
	case len(args) == 0:
		return fmt.Errorf("give the survey: sparkmargin whatif SURVEY.xlsx --rh 55 -o whatif.xlsx")
	case len(args) > 1:
		return fmt.Errorf("%q follows the survey %q: a change value with a space must be quoted, e.g. --earth \"OBJECT-ID=5 kV\" (or written without the space, OBJECT-ID=5kV); whatif takes one survey",
			strings.Join(args[1:], " "), args[0])
	}
	return nil
}

func runWhatif(out io.Writer, o whatifOptions) error {
	s, err := loadSurvey(o.ws, o.survey)
	if err != nil {
		return err
	}
	xlsx := o.output
	if xlsx == "" {
		xlsx = outfile.SiblingPath(o.survey, "-whatif.xlsx")
	}
	if err := outfile.RefuseClashes([]outfile.NamedPath{{Role: "the survey", Path: o.survey}}, []outfile.NamedPath{{Role: "the workbook", Path: xlsx}, {Role: "--json", Path: o.json}}); err != nil {
		return err
	}
	changes, err := rerun.CollectChanges(s, !o.noSheetChanges, o.flags)
	if err != nil {
		return withCode(exitUsage, err)
	}
	if len(changes) == 0 {
		return withCode(exitUsage, fmt.Errorf("no change given: pass e.g. --rh 55 or --earth ID=1e6, or add a Changes sheet to the survey; run 'sparkmargin whatif --help'"))
	}
	x, err := rerun.Run(s, changes)
	if err != nil {
		return withCode(exitUsage, err)
	}
	tmp, err := o.ws.Dir()
	if err != nil {
		return withCode(exitUsage, err)
	}
	info := rerun.RunInfo{ToolVersion: version, CommandLine: strings.Join(o.args, " "), TmpDir: tmp}
	if err := rerun.WriteLinked(o.ws, version, xlsx, o.json,
		func(w io.Writer) error { return rerun.WriteWhatifWorkbook(w, x, info) },
		func(w io.Writer, ji rerun.JSONInfo) error { return rerun.WriteWhatifJSON(w, x, ji) }); err != nil {
		return err
	}
	rerun.WriteWhatifSummary(out, x)
	fmt.Fprintf(out, "\nWhat-if workbook: %s\n", xlsx)
	if o.json != "" {
		fmt.Fprintf(out, "What-if JSON:     %s\n", outfile.ShownPath(o.json))
	}
	if len(x.Before.Objects) == 0 {
		return withCode(exitProblems, fmt.Errorf("no object of %s could be assessed: run 'sparkmargin check %s' for the problems", o.survey, o.survey))
	}
	return rejectedShortfall(s)
}

// whatifCommandLine rebuilds the command for the Method sheet with the changes
// in the order they were given (the order they are applied in).
func whatifCommandLine(o whatifOptions) []string {
	out := []string{"sparkmargin", "whatif", o.survey}
	for _, f := range o.flags {
		out = append(out, "--"+f.Kind, f.Arg)
	}
	if o.noSheetChanges {
		out = append(out, "--no-sheet-changes")
	}
	if o.output != "" {
		out = append(out, "-o", o.output)
	}
	if o.json != "" {
		out = append(out, "--json", o.json)
	}
	return out
}
