package main

import (
	"io"

	"github.com/spf13/cobra"

	"github.com/sparkmargin/sparkmargin/report/audit"
	"github.com/sparkmargin/sparkmargin/report/outfile"
)

type checkOptions struct {
	ws     *outfile.Workspace
	survey string
	json   bool
}

func newCheckCmd(ws *outfile.Workspace) *cobra.Command {
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
		if err := audit.WriteCheckJSON(rawOut(out), s); err != nil {
			return err
		}
	} else {
		audit.WriteCheckText(out, s)
	}
	if len(s.Errors()) > 0 {
		return silentExit(exitProblems)
	}
	return nil
}
