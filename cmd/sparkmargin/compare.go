package main

import (
	"bytes"
	"fmt"
	"io"
	"os"
	"path/filepath"
	"strings"

	"github.com/spf13/cobra"

	"github.com/sparkmargin/sparkmargin/inventory"
	"github.com/sparkmargin/sparkmargin/report"
	"github.com/sparkmargin/sparkmargin/report/assess"
	"github.com/sparkmargin/sparkmargin/report/audit"
	"github.com/sparkmargin/sparkmargin/report/outfile"
	"github.com/sparkmargin/sparkmargin/report/rerun"
)

type compareOptions struct {
	ws       *outfile.Workspace
	old, new string
	output   string
	json     string
	args     []string
}

func newCompareCmd(ws *outfile.Workspace) *cobra.Command {
	o := compareOptions{ws: ws}
	c := &cobra.Command{
		Use:   "compare OLD NEW [-o FILE.xlsx]",
		Short: "Compare two surveys of one site (or two audit JSON files): settings, objects and stations changed",
		Long: "compare assesses two surveys (.xlsx) of one site, OLD the earlier and NEW the later, or reads two audit\n" +
			"JSON files written by 'sparkmargin assess --json'. It shows each side's file, SHA-256, site and survey\n" +
			"date, warns when the sites differ or the dates are in reverse order, and lists the Site items and station\n" +
			"settings changed (RH, zone, MIE, gas group...), the objects added, removed and changed, and every station\n" +
			"whose rank moved or verdict changed. When either side is a JSON file both sides are compared on the\n" +
			"audit's results (the JSON holds no readings).\n" +
			"Exit status: 0 done, 1 an Objects row was rejected on either side (listed apart, never as removed), the\n" +
			"two sides are different sites, or nothing could be assessed (the outputs are written in the first two\n" +
			"cases), 2 usage or unreadable input.",
		Example: "  sparkmargin compare last-year.xlsx this-year.xlsx -o compare.xlsx\n" +
			"  sparkmargin compare old-audit.json new-audit.json --json compare.json",
		Args: cobra.ExactArgs(2),
		RunE: func(c *cobra.Command, args []string) error {
			o.old, o.new = args[0], args[1]
			o.args = commandLine(c, args)
			return withOutputs(c, []outfile.NamedPath{{Role: "OLD", Path: o.old}, {Role: "NEW", Path: o.new}}, o.output, o.json, func(out io.Writer) error { return runCompare(out, o) })
		},
	}
	c.Flags().StringVarP(&o.output, "output", "o", "", "workbook to write; none when not given")
	c.Flags().StringVar(&o.json, "json", "", "also write the comparison as JSON to this file (- for standard output, the summary then going to standard error)")
	return c
}

// compareSide loads one side: an audit JSON as it is, a survey assessed (and,
// when the other side is JSON, turned into the audit JSON so both compare alike).
func compareSide(ws *outfile.Workspace, path string, asJSON bool) (*rerun.Side, *inventory.Survey, error) {
	label := filepath.Base(path)
	if isJSON(path) {
		if err := report.RequireRegular(path); err != nil {
			return nil, nil, err
		}
		data, err := os.ReadFile(path)
		if err != nil {
			return nil, nil, withCode(exitUsage, fmt.Errorf("reading %s: %w", path, err))
		}
		side, err := rerun.SideFromJSON(label, data)
		if err != nil {
			return nil, nil, withCode(exitUsage, err)
		}
		side.Identity.Path = path
		return side, nil, nil
	}
	s, err := loadSurvey(ws, path)
	if err != nil {
		return nil, nil, err
	}
	if len(s.Objects) == 0 {
		return nil, nil, withCode(exitProblems, fmt.Errorf("no object of %s could be assessed: run 'sparkmargin check %s' for the problems", path, path))
	}
	a := assess.Assess(s, assess.Options{Limits: rerun.Limits(s)})
	if !asJSON {
		side := rerun.SideFromAudit(label, a)
		side.Identity.Path = path
		return side, s, nil
	}
	var buf bytes.Buffer
	if err := audit.WriteJSON(&buf, a, audit.RunInfo{ToolVersion: version, SurveyFile: label}); err != nil {
		return nil, nil, withCode(exitUsage, err)
	}
	side, err := rerun.SideFromJSON(label, buf.Bytes())
	if err != nil {
		return nil, nil, err
	}
	// Its own identity (checksum, date, Site ID) and settings: those the
	// other side's JSON holds are compared, the rest named as not compared.
	side.Identity = rerun.SurveyIdentity(path, s)
	side.Identity.Results = true
	full := rerun.SideFromAudit(label, a)
	side.Site, side.StationFields = full.Site, full.StationFields
	return side, s, nil
}

func runCompare(out io.Writer, o compareOptions) error {
	if err := outfile.RefuseClashes([]outfile.NamedPath{{Role: "OLD", Path: o.old}, {Role: "NEW", Path: o.new}}, []outfile.NamedPath{{Role: "-o", Path: o.output}, {Role: "--json", Path: o.json}}); err != nil {
		return err
	}
	asJSON := isJSON(o.old) || isJSON(o.new)
	oldSide, _, err := compareSide(o.ws, o.old, asJSON)
	if err != nil {
		return err
	}
	newSide, newSurvey, err := compareSide(o.ws, o.new, asJSON)
	if err != nil {
		return err
	}
	c := rerun.Compare(oldSide, newSide)
	tmp, err := o.ws.Dir()
	if err != nil {
		return withCode(exitUsage, err)
	}
	info := rerun.RunInfo{ToolVersion: version, CommandLine: strings.Join(o.args, " "), TmpDir: tmp}
	if err := o.ws.WritePair(o.output, o.json,
		func(w io.Writer) error { return rerun.WriteCompareWorkbook(w, c, newSurvey, info) },
		func(w io.Writer) error { return rerun.WriteCompareJSON(w, c) }); err != nil {
		return err
	}
	rerun.WriteCompareSummary(out, c)
	if o.output != "" {
		fmt.Fprintf(out, "\nCompare workbook: %s\n", o.output)
	}
	if o.json != "" {
		fmt.Fprintf(out, "Compare JSON:     %s\n", outfile.ShownPath(o.json))
	}
	return compareShortfall(c)
}
