package main

import (
	"fmt"
	"io"
	"path/filepath"
	"strings"

	"github.com/spf13/cobra"

	"github.com/sparkmargin/sparkmargin/inventory"
	"github.com/sparkmargin/sparkmargin/report"
	"github.com/sparkmargin/sparkmargin/report/assess"
	"github.com/sparkmargin/sparkmargin/report/rerun"
)

type whatifOptions struct {
	ws             *report.Workspace
	survey         string
	output         string
	json           string
	noSheetChanges bool
	flags          []flagChange // in command-line order
	args           []string
}

// flagChange is one change flag as given.
type flagChange struct{ kind, arg string }

// changeFlag is a repeatable flag that appends to one shared list, so that
// changes of different kinds keep their command-line order.
type changeFlag struct {
	kind string
	list *[]flagChange
}

func (f changeFlag) Set(s string) error { *f.list = append(*f.list, flagChange{f.kind, s}); return nil }
func (f changeFlag) Type() string {
	if f.kind == rerun.ChangeRH || f.kind == rerun.ChangeMargin {
		return "value"
	}
	return "ID=value"
}
func (f changeFlag) String() string {
	var out []string
	if f.list != nil {
		for _, c := range *f.list {
			if c.kind == f.kind {
				out = append(out, c.arg)
			}
		}
	}
	return strings.Join(out, ",")
}

func newWhatifCmd(ws *report.Workspace) *cobra.Command {
	o := whatifOptions{ws: ws}
	c := &cobra.Command{
		Use:   "whatif SURVEY.xlsx [changes] -o FILE.xlsx",
		Short: "Assess a survey before and after planned changes (humidity, earthing, material, footwear...)",
		Long: "whatif applies changes to a copy of the survey's accepted rows (the survey file is never modified),\n" +
			"assesses before and after, and writes a workbook with each object's and station's verdict and ratio\n" +
			"before and after, what cleared, stayed and appeared, and the changes applied. Changes come from the\n" +
			"survey's Changes sheet (first) and from the flags (then, in their order).\n" +
			"Targets: an object ID, or station:ID for every matching row of a station.\n" +
			"Exit status: 0 done, 1 nothing could be assessed, 2 usage, unreadable survey or a bad change.",
		Example: "  sparkmargin whatif demo-out/demo-survey.xlsx --rh 55 --earth PWD-DRU1=1e6 -o whatif.xlsx\n" +
			"  sparkmargin whatif survey.xlsx --station-rh ST-LAM=65 --material COAT-WEB=PE --json whatif.json -o whatif.xlsx",
		Args: cobra.ExactArgs(1),
		RunE: func(c *cobra.Command, args []string) error {
			o.survey = args[0]
			o.args = whatifCommandLine(o)
			return runWhatif(c.OutOrStdout(), o)
		},
	}
	c.Flags().StringVarP(&o.output, "output", "o", "", "workbook to write (default <survey>-whatif.xlsx beside the survey)")
	c.Flags().StringVar(&o.json, "json", "", "also write the result as JSON to this file")
	c.Flags().BoolVar(&o.noSheetChanges, "no-sheet-changes", false, "ignore the survey's Changes sheet")
	help := map[string]string{
		rerun.ChangeRH:             "site relative humidity in %, e.g. 55 (stations without their own RH)",
		rerun.ChangeStationRH:      "a station's relative humidity, e.g. ST-LAM=60",
		rerun.ChangeEarth:          "resistance to earth of an object or of every conductor at a station, e.g. DRM-DRUM=1e6, station:ST-PWD=1MΩ",
		rerun.ChangeMaterial:       "material swap, e.g. COAT-WEB=PE",
		rerun.ChangeFootwear:       "a person's resistance to earth through footwear and floor, e.g. MIX-OP=1e7 or station:ST-MIX=1e7",
		rerun.ChangeMargin:         "required margin (energy below MIE / margin), e.g. 20",
		rerun.ChangeSpeed:          "speed (liquid: flow velocity in the line), e.g. MIX-TOL1=1 or 1 m/s",
		rerun.ChangeConductivity:   "liquid conductivity (e.g. with an additive), e.g. MIX-TOL1=500pS/m",
		rerun.ChangeBagType:        "bulk bag type A, B, C or D, e.g. BAG-A=C",
		rerun.ChangeFilling:        "liquid filling method top, bottom or dip pipe, e.g. MIX-TOL1=\"dip pipe\"",
		rerun.ChangeVesselMaterial: "receiving vessel material metal, insulating, lined or glass, e.g. BAY-IBC=metal",
	}
	for _, k := range inventory.ChangeKinds() {
		c.Flags().Var(changeFlag{kind: k, list: &o.flags}, k, help[k])
	}
	return c
}

// whatifChanges collects the changes: the Changes sheet first (unless ignored),
// then the flags. A rejected Changes row stops the run: a plan must not be
// half applied without notice.
func whatifChanges(s *inventory.Survey, o whatifOptions) ([]rerun.Change, error) {
	var out []rerun.Change
	if !o.noSheetChanges {
		for _, r := range s.Rejected {
			if r.Sheet == inventory.SheetChanges && len(r.Problems) > 0 {
				return nil, withCode(exitUsage, fmt.Errorf("the survey's Changes sheet has a rejected row: %s (fix it or pass --no-sheet-changes)", r.Problems[0].Error()))
			}
		}
		out = append(out, rerun.FromSheet(s)...)
	}
	for _, f := range o.flags {
		c, err := rerun.ParseFlag(f.kind, f.arg)
		if err != nil {
			return nil, withCode(exitUsage, err)
		}
		out = append(out, c)
	}
	return out, nil
}

func runWhatif(out io.Writer, o whatifOptions) error {
	s, err := loadSurvey(o.ws, o.survey)
	if err != nil {
		return err
	}
	xlsx := o.output
	if xlsx == "" {
		xlsx = siblingPath(o.survey, "-whatif.xlsx")
	}
	if err := refuseClashes([]namedPath{{"the survey", o.survey}}, []namedPath{{"the workbook", xlsx}, {"--json", o.json}}); err != nil {
		return err
	}
	changes, err := whatifChanges(s, o)
	if err != nil {
		return err
	}
	if len(changes) == 0 {
		return withCode(exitUsage, fmt.Errorf("no change given: pass e.g. --rh 55 or --earth ID=1e6, or add a Changes sheet to the survey; run 'sparkmargin whatif --help'"))
	}
	_, problems := assess.LimitsFromSite(s.Site, rerun.Limits(s))
	s.Problems = append(s.Problems, problems...)
	x, err := rerun.Run(s, changes)
	if err != nil {
		return withCode(exitUsage, err)
	}
	info := rerun.RunInfo{ToolVersion: version, CommandLine: strings.Join(o.args, " ")}
	if err := writeRerun(o.ws, xlsx, o.json,
		func(w io.Writer) error { return rerun.WriteWhatifWorkbook(w, x, info) },
		func(w io.Writer) error { return rerun.WriteWhatifJSON(w, x) }); err != nil {
		return err
	}
	rerun.WriteWhatifSummary(out, x)
	fmt.Fprintf(out, "\nWhat-if workbook: %s\n", xlsx)
	if o.json != "" {
		fmt.Fprintf(out, "What-if JSON:     %s\n", o.json)
	}
	if len(x.Before.Objects) == 0 {
		return withCode(exitProblems, fmt.Errorf("no object of %s could be assessed: run 'sparkmargin check %s' for the problems", o.survey, o.survey))
	}
	return nil
}

// siblingPath is "<dir>/<name><suffix>" beside the survey.
func siblingPath(survey, suffix string) string {
	dir, base := filepath.Split(survey)
	return filepath.Join(dir, strings.TrimSuffix(base, filepath.Ext(base))+suffix)
}

// writeRerun writes a workbook (when xlsx is set) and a JSON (when jsonPath
// is set), each whole into a temporary file first, then renames both into
// place together.
func writeRerun(ws *report.Workspace, xlsx, jsonPath string, book, doc func(io.Writer) error) error {
	var pw, pj *report.Pending
	var err error
	if xlsx != "" {
		if pw, err = ws.Prepare(xlsx, book); err != nil {
			return withCode(exitUsage, fmt.Errorf("writing the workbook: %w", err))
		}
	}
	if jsonPath != "" {
		if pj, err = ws.Prepare(jsonPath, doc); err != nil {
			ws.Discard(pw)
			return withCode(exitUsage, fmt.Errorf("writing the JSON: %w", err))
		}
	}
	if err := ws.Commit(pw, pj); err != nil {
		return withCode(exitUsage, fmt.Errorf("writing the outputs: %w", err))
	}
	return nil
}

// whatifCommandLine rebuilds the command for the Method sheet with the changes
// in the order they were given (the order they are applied in).
func whatifCommandLine(o whatifOptions) []string {
	out := []string{"sparkmargin", "whatif", o.survey}
	for _, f := range o.flags {
		out = append(out, "--"+f.kind, f.arg)
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
