package main

import (
	"encoding/json"
	"fmt"
	"io"
	"sort"
	"text/tabwriter"

	"github.com/spf13/cobra"

	"github.com/sparkmargin/sparkmargin/inventory"
	"github.com/sparkmargin/sparkmargin/report"
)

type checkOptions struct {
	ws     *report.Workspace
	survey string
	json   bool
}

func newCheckCmd(ws *report.Workspace) *cobra.Command {
	o := checkOptions{ws: ws}
	c := &cobra.Command{
		Use:   "check SURVEY.xlsx",
		Short: "Read and validate a survey; list every problem with its cell",
		Long: "check reads a line-survey workbook and validates it without running any physics.\n" +
			"It prints the rows read per sheet and per kind, then every problem in sheet and row order.\n" +
			"Exit status: 0 no errors (warnings allowed), 1 the survey has errors, 2 usage or unreadable file.",
		Args: cobra.ExactArgs(1),
		RunE: func(c *cobra.Command, args []string) error {
			o.survey = args[0]
			return runCheck(c.OutOrStdout(), o)
		},
	}
	c.Flags().BoolVar(&o.json, "json", false, "print the counts and problems as JSON instead of text")
	return c
}

func runCheck(out io.Writer, o checkOptions) error {
	s, err := loadSurvey(o.ws, o.survey)
	if err != nil {
		return err
	}
	if o.json {
		if err := writeCheckJSON(out, s); err != nil {
			return err
		}
	} else {
		writeCheckText(out, s)
	}
	if len(s.Errors()) > 0 {
		return silentExit(exitProblems)
	}
	return nil
}

func kindCounts(s *inventory.Survey) map[string]int {
	m := map[string]int{}
	for _, o := range s.Objects {
		m[o.Kind]++
	}
	return m
}

func writeCheckText(out io.Writer, s *inventory.Survey) {
	fmt.Fprintf(out, "Survey %s", s.Path)
	if s.Site.Name != "" {
		fmt.Fprintf(out, " (%s", s.Site.Name)
		if !s.Site.SurveyDate.IsZero() {
			fmt.Fprintf(out, ", %s", s.Site.SurveyDate.Format("2006-01-02"))
		}
		fmt.Fprint(out, ")")
	}
	fmt.Fprintln(out)
	tw := tabwriter.NewWriter(out, 0, 0, 2, ' ', 0)
	fmt.Fprintln(tw, "Sheet\tRows read\tAccepted\tRejected")
	for _, c := range s.Counts {
		fmt.Fprintf(tw, "%s\t%d\t%d\t%d\n", c.Sheet, c.Read, c.Accepted, c.Rejected)
	}
	tw.Flush()
	kc := kindCounts(s)
	if len(kc) > 0 {
		fmt.Fprint(out, "Accepted objects by kind:")
		for _, k := range inventory.Kinds() {
			if n := kc[k]; n > 0 {
				fmt.Fprintf(out, " %s %d", k, n)
			}
		}
		fmt.Fprintln(out)
	}
	errs, warns := len(s.Errors()), len(s.Warnings())
	if errs+warns == 0 {
		fmt.Fprintln(out, "No problems found.")
		return
	}
	fmt.Fprintf(out, "%d error(s), %d warning(s):\n", errs, warns)
	for _, p := range s.Problems {
		fmt.Fprintf(out, "  %-7s %s\n", p.Severity.String(), p.Error())
	}
}

type checkJSON struct {
	Survey   string             `json:"survey"`
	SHA256   string             `json:"sha256"`
	Site     string             `json:"site"`
	Date     string             `json:"survey_date"`
	Sheets   []checkSheetJSON   `json:"sheets"`
	Kinds    []checkKindJSON    `json:"kinds"`
	Errors   int                `json:"errors"`
	Warnings int                `json:"warnings"`
	Problems []checkProblemJSON `json:"problems"`
}

type checkSheetJSON struct {
	Sheet    string `json:"sheet"`
	Read     int    `json:"read"`
	Accepted int    `json:"accepted"`
	Rejected int    `json:"rejected"`
}

type checkKindJSON struct {
	Kind  string `json:"kind"`
	Count int    `json:"count"`
}

type checkProblemJSON struct {
	Severity string `json:"severity"`
	Sheet    string `json:"sheet"`
	Row      int    `json:"row"`
	Column   string `json:"column"`
	Field    string `json:"field"`
	ID       string `json:"id"`
	Message  string `json:"message"`
	Fix      string `json:"fix"`
}

func writeCheckJSON(out io.Writer, s *inventory.Survey) error {
	j := checkJSON{Survey: s.Path, SHA256: s.SHA256, Site: s.Site.Name, Sheets: []checkSheetJSON{}, Kinds: []checkKindJSON{}, Problems: []checkProblemJSON{}}
	if !s.Site.SurveyDate.IsZero() {
		j.Date = s.Site.SurveyDate.Format("2006-01-02")
	}
	for _, c := range s.Counts {
		j.Sheets = append(j.Sheets, checkSheetJSON{c.Sheet, c.Read, c.Accepted, c.Rejected})
	}
	kc := kindCounts(s)
	kinds := make([]string, 0, len(kc))
	for k := range kc {
		kinds = append(kinds, k)
	}
	sort.Strings(kinds)
	for _, k := range kinds {
		j.Kinds = append(j.Kinds, checkKindJSON{k, kc[k]})
	}
	for _, p := range s.Problems {
		if p.Severity == inventory.Error {
			j.Errors++
		} else {
			j.Warnings++
		}
		j.Problems = append(j.Problems, checkProblemJSON{p.Severity.String(), p.Sheet, p.Row, p.Column, p.Field, p.ID, p.Message, p.Fix})
	}
	enc := json.NewEncoder(out)
	enc.SetIndent("", "  ")
	return enc.Encode(j)
}
